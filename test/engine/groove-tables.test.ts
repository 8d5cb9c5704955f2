/**
 * Groove weld tables at their breakpoints: every combination of Table J2.1 (process × position ×
 * groove type), every cell of Table J2.2, every row of Table J2.3 exactly at its upper bound and
 * just above it, imperial and metric, and the groove-weld rows of Table J2.5 as data.
 *
 * Expected values are written out below from AISC 360-22 (from memory), independently of the
 * tables in src/engine/provisions/groove.ts.
 */
import { describe, expect, it } from 'vitest';
import {
  FILLER_STRENGTH_LEVEL,
  FnwPjp,
  GROOVE_TYPES,
  RHss,
  RnBaseMetal,
  RnCompressionYield,
  RnGrooveWeld,
  TABLE_J2_5_PJP,
  WELD_POSITIONS,
  WELD_PROCESSES,
  cjpFillerRule,
  positionMatters,
  teCjp,
  teFlare,
  teMin,
  tePjp,
  type GrooveType,
  type WeldPosition,
  type WeldProcess,
} from '../../src/engine/provisions/groove.js';
import { IMPERIAL, METRIC } from '../../src/engine/units.js';

// AISC 360-22 Table J2.1 (from memory), row by row:
//   SMAW, GMAW, FCAW | all positions | J or U groove, 60-degree V          | S
//   SAW              | flat          | J or U groove, 60-degree bevel or V | S
//   GMAW, FCAW       | flat, horiz.  | 45-degree bevel                     | S
//   SMAW             | all positions | 45-degree bevel                     | S - 1/8 in (3 mm)
//   GMAW, FCAW       | vert., overh. | 45-degree bevel                     | S - 1/8 in (3 mm)
// FCAW-G and FCAW-S are FCAW for this table. Everything else: no prequalified throat.
type Expect = 'S' | 'S-ded' | 'none';
function expectedJ21(proc: WeldProcess, pos: WeldPosition, groove: GrooveType): Expect {
  const fcawFamily = proc === 'GMAW' || proc === 'FCAW' || proc === 'FCAW-G' || proc === 'FCAW-S';
  if (groove === 'flare-bevel' || groove === 'flare-V') return 'none';
  if (proc === 'SAW') return pos === 'flat' && groove !== 'bevel-45' ? 'S' : 'none';
  if (groove === 'J' || groove === 'U' || groove === 'V-60') return 'S';
  if (groove === 'bevel-60') return 'none';
  // bevel-45
  if (proc === 'SMAW') return 'S-ded';
  if (fcawFamily) return pos === 'flat' || pos === 'horizontal' ? 'S' : 'S-ded';
  return 'none';
}

describe('Table J2.1: effective throat of PJP groove welds', () => {
  const nonFlare = GROOVE_TYPES.filter((g) => !g.startsWith('flare'));
  for (const proc of WELD_PROCESSES) {
    for (const groove of nonFlare) {
      for (const pos of WELD_POSITIONS) {
        const exp = expectedJ21(proc, pos, groove);
        it(`${proc} ${pos} ${groove}: ${exp}`, () => {
          // Imperial at S = 1/2 in and metric at S = 12 mm.
          const i = tePjp(0.5, proc, pos, groove, 'imperial');
          const m = tePjp(12, proc, pos, groove, 'metric');
          if (exp === 'none') {
            expect(i).toBeUndefined();
            expect(m).toBeUndefined();
          } else if (exp === 'S') {
            expect(i).toBe(0.5);
            expect(m).toBe(12);
          } else {
            expect(i).toBeCloseTo(0.375, 12); // 1/2 - 1/8
            expect(m).toBe(9); // 12 - 3 mm
          }
        });
      }
    }
  }

  it('the deduction is the Specification\'s own metric value (3 mm), not 1/8 in converted (3.175 mm)', () => {
    // AISC 360-22 Table J2.1 (from memory): S - 1/8 in (3 mm)
    expect(tePjp(10, 'SMAW', 'flat', 'bevel-45', 'metric')).toBe(7);
  });

  it('deducted rows at the deduction breakpoint: zero throat exactly at 1/8 in, never negative below it', () => {
    expect(tePjp(0.125, 'SMAW', 'overhead', 'bevel-45', 'imperial')).toBe(0);
    expect(tePjp(0.1, 'SMAW', 'overhead', 'bevel-45', 'imperial')).toBe(0);
    expect(tePjp(0.1875, 'GMAW', 'vertical', 'bevel-45', 'imperial')).toBeCloseTo(0.0625, 12); // 3/16 - 1/8
    expect(tePjp(3, 'FCAW-S', 'vertical', 'bevel-45', 'metric')).toBe(0);
    expect(tePjp(2, 'FCAW-G', 'overhead', 'bevel-45', 'metric')).toBe(0);
  });

  it('with no position given, only rows that cover every position answer', () => {
    expect(tePjp(0.5, 'SMAW', null, 'bevel-45', 'imperial')).toBeCloseTo(0.375, 12);
    expect(tePjp(0.5, 'GMAW', null, 'J', 'imperial')).toBe(0.5);
    expect(tePjp(0.5, 'GMAW', null, 'bevel-45', 'imperial')).toBeUndefined();
    expect(tePjp(0.5, 'SAW', null, 'U', 'imperial')).toBeUndefined();
  });

  it('positionMatters says when the table depends on the position', () => {
    expect(positionMatters('GMAW', 'bevel-45')).toBe(true);
    expect(positionMatters('FCAW-S', 'bevel-45')).toBe(true);
    expect(positionMatters('SAW', 'J')).toBe(true);
    expect(positionMatters('SMAW', 'bevel-45')).toBe(false);
    expect(positionMatters('SMAW', 'V-60')).toBe(false);
    expect(positionMatters('SAW', 'bevel-45')).toBe(false); // no row in any position
  });
});

describe('Table J2.2: effective throat of flare groove welds', () => {
  // AISC 360-22 Table J2.2 (from memory): flare bevel / flare V
  //   GMAW and FCAW-G  5/8 R / 3/4 R;  SMAW and FCAW-S  5/16 R / 5/8 R;  SAW  5/16 R / 1/2 R
  const cases: Array<[WeldProcess, number, number]> = [
    ['GMAW', 0.625, 0.75],
    ['FCAW-G', 0.625, 0.75],
    ['SMAW', 0.3125, 0.625],
    ['FCAW-S', 0.3125, 0.625],
    ['SAW', 0.3125, 0.5],
  ];
  for (const [proc, bevel, vee] of cases) {
    it(`${proc}: ${bevel}·R bevel, ${vee}·R V`, () => {
      expect(teFlare(1, proc, 'flare-bevel')).toBeCloseTo(bevel, 12);
      expect(teFlare(1, proc, 'flare-V')).toBeCloseTo(vee, 12);
      expect(teFlare(16, proc, 'flare-bevel')).toBeCloseTo(16 * bevel, 9); // linear in R (mm)
    });
  }

  it('plain FCAW has no row: the table needs the shielding (FCAW-G or FCAW-S)', () => {
    expect(teFlare(1, 'FCAW', 'flare-bevel')).toBeUndefined();
    expect(teFlare(1, 'FCAW', 'flare-V')).toBeUndefined();
  });

  it('R = 2t may be assumed for HSS (Table J2.2 general note, from memory)', () => {
    expect(RHss(0.25)).toBe(0.5);
    expect(RHss(6)).toBe(12);
  });
});

describe('Table J2.3: minimum effective throat of PJP groove welds', () => {
  // AISC 360-22 Table J2.3 (from memory), thinner part joined:
  //   to 1/4 (6) incl.: 1/8 (3); over 1/4 to 1/2 (13): 3/16 (5); over 1/2 to 3/4 (19): 1/4 (6);
  //   over 3/4 to 1-1/2 (38): 5/16 (8); over 1-1/2 to 2-1/4 (57): 3/8 (10);
  //   over 2-1/4 to 6 (150): 1/2 (13); over 6 (150): 5/8 (16)
  const imperial: Array<[number, number]> = [
    [0.25, 0.125],
    [0.5, 0.1875],
    [0.75, 0.25],
    [1.5, 0.3125],
    [2.25, 0.375],
    [6, 0.5],
  ];
  const above = [0.1875, 0.25, 0.3125, 0.375, 0.5, 0.625];
  imperial.forEach(([t, w], i) => {
    it(`imperial: t = ${t} in gives ${w} in; just above gives ${above[i]} in`, () => {
      expect(teMin(t, 'imperial')).toBe(w);
      expect(teMin(t + 1e-6, 'imperial')).toBe(above[i]);
    });
  });
  const metric: Array<[number, number]> = [
    [6, 3],
    [13, 5],
    [19, 6],
    [38, 8],
    [57, 10],
    [150, 13],
  ];
  const aboveMm = [5, 6, 8, 10, 13, 16];
  metric.forEach(([t, w], i) => {
    it(`metric: t = ${t} mm gives ${w} mm; just above gives ${aboveMm[i]} mm`, () => {
      expect(teMin(t, 'metric')).toBe(w);
      expect(teMin(t + 1e-6, 'metric')).toBe(aboveMm[i]);
    });
  });
  it('thin and very thick parts', () => {
    expect(teMin(0.0625, 'imperial')).toBe(0.125);
    expect(teMin(20, 'imperial')).toBe(0.625);
    expect(teMin(1, 'metric')).toBe(3);
    expect(teMin(500, 'metric')).toBe(16);
  });
});

describe('§J2.1a: effective throat of a CJP groove weld', () => {
  it('is the thinner part joined (AISC 360-22 §J2.1a, from memory)', () => {
    expect(teCjp([0.75, 1])).toBe(0.75);
    expect(teCjp([20])).toBe(20);
  });
});

describe('Table J2.5: groove-weld rows as data', () => {
  // AISC 360-22 Table J2.5, PJP rows (from memory)
  it('tension normal: weld 0.60·FEXX phi 0.80 / Omega 1.88; base Fu phi 0.75 / Omega 2.00', () => {
    const r = TABLE_J2_5_PJP['tension-normal'];
    expect(r.weld).toEqual({ fexxFactor: 0.6, factors: { phi: 0.8, omega: 1.88 } });
    expect(r.base?.rule).toBe('Fu');
    expect(r.base?.factors).toEqual({ phi: 0.75, omega: 2.0 });
  });
  it('compression, column or column splice finished to bear: neither side checked', () => {
    const r = TABLE_J2_5_PJP['compression-column-bearing'];
    expect(r.weld).toBeNull();
    expect(r.base).toBeNull();
    expect(r.exemptReason).toMatch(/need not be considered/);
  });
  it('compression, other members finished to bear: weld 0.60·FEXX phi 0.80 / 1.88; base Fy phi 0.90 / 1.67', () => {
    const r = TABLE_J2_5_PJP['compression-member-bearing'];
    expect(r.weld).toEqual({ fexxFactor: 0.6, factors: { phi: 0.8, omega: 1.88 } });
    expect(r.base).toEqual({ rule: 'Fy', factors: { phi: 0.9, omega: 1.67 } });
  });
  it('compression not finished to bear: weld 0.90·FEXX phi 0.80 / 1.88; base Fy phi 0.90 / 1.67', () => {
    const r = TABLE_J2_5_PJP['compression-not-bearing'];
    expect(r.weld).toEqual({ fexxFactor: 0.9, factors: { phi: 0.8, omega: 1.88 } });
    expect(r.base).toEqual({ rule: 'Fy', factors: { phi: 0.9, omega: 1.67 } });
  });
  it('tension or compression parallel to the axis: neither side checked', () => {
    const r = TABLE_J2_5_PJP.parallel;
    expect(r.weld).toBeNull();
    expect(r.base).toBeNull();
  });
  it('shear: weld 0.60·FEXX phi 0.75 / Omega 2.00; base per §J4', () => {
    const r = TABLE_J2_5_PJP.shear;
    expect(r.weld).toEqual({ fexxFactor: 0.6, factors: { phi: 0.75, omega: 2.0 } });
    expect(r.base?.rule).toBe('J4-shear');
  });
  it('FnwPjp: 0.60·70 = 42 ksi, 0.90·70 = 63 ksi, none where exempt', () => {
    expect(FnwPjp(70, 'tension-normal')).toBeCloseTo(42, 12);
    expect(FnwPjp(70, 'compression-not-bearing')).toBeCloseTo(63, 12);
    expect(FnwPjp(490, 'shear')).toBeCloseTo(294, 12);
    expect(FnwPjp(70, 'parallel')).toBeUndefined();
    expect(FnwPjp(70, 'compression-column-bearing')).toBeUndefined();
  });
  it('Eq. J2-2, J2-3 and J4-6 are stress × area in the system force unit', () => {
    expect(RnGrooveWeld(42, 5, IMPERIAL)).toBeCloseTo(210, 12); // 42 ksi × 5 in²
    expect(RnBaseMetal(65, 5, IMPERIAL)).toBeCloseTo(325, 12); // 65 ksi × 5 in²
    expect(RnCompressionYield(355, 3000, METRIC)).toBeCloseTo(1065, 9); // 355 MPa × 3000 mm² = 1065 kN
  });
  it('CJP filler rules: matching for tension normal and shear, one level below for compression, below matching for parallel', () => {
    // AISC 360-22 Table J2.5, CJP rows (from memory)
    expect(cjpFillerRule('tension-normal')).toBe('matching');
    expect(cjpFillerRule('shear')).toBe('matching');
    expect(cjpFillerRule('compression-not-bearing')).toBe('one-level-below-permitted');
    expect(cjpFillerRule('compression-member-bearing')).toBe('one-level-below-permitted');
    expect(cjpFillerRule('compression-column-bearing')).toBe('one-level-below-permitted');
    expect(cjpFillerRule('parallel')).toBe('below-matching-permitted');
    // one strength level: 10 ksi (70 MPa)
    expect(FILLER_STRENGTH_LEVEL).toEqual({ imperial: 10, metric: 70 });
  });
});
