/**
 * checkPjp and checkCjp: every strength row of Table J2.5 for PJP and CJP groove welds, the
 * detailing limits, the advice and the refusals.
 *
 * Expected numbers are hand calculations from AISC 360-22 Table J2.5 (phi, Omega and nominal
 * stresses from memory), written out beside each assertion. Imperial in/kip/ksi unless stated.
 */
import { describe, expect, it } from 'vitest';
import { checkCjp, checkPjp, type CjpRequest, type PjpRequest } from '../../src/engine/groove.js';
import { EngineError } from '../../src/engine/errors.js';
import { thrown } from '../assert.js';
import type { EngineResult, Check } from '../../src/engine/result.js';

/** 1/2 in 60-degree V by SMAW (te = S = 0.5 in), 10 in long: Awe = 5 in². Two 1 in A992 parts (Fy 50, Fu 65). */
function pjp(over: Partial<PjpRequest> = {}, groove: Partial<PjpRequest['groove']> = {}): PjpRequest {
  return {
    method: 'LRFD',
    units: 'imperial',
    electrode: 'E70',
    groove: { type: 'V-60', process: 'SMAW', position: 'flat', sides: 1, depths: [0.5], radius: null, qualifiedThroats: null, part: null, ...groove },
    length: 10,
    load: { case: 'tension-normal', cyclic: false },
    demand: 50,
    parts: [
      { thickness: 1, steel: 'A992' },
      { thickness: 1, steel: 'A992' },
    ],
    ...over,
  };
}

function cjp(over: Partial<CjpRequest> = {}): CjpRequest {
  return {
    method: 'LRFD',
    units: 'imperial',
    electrode: 'E70',
    length: 10,
    load: { case: 'tension-normal' },
    demand: 100,
    parts: [
      { thickness: 0.75, steel: 'A572-50' },
      { thickness: 1, steel: 'A572-50' },
    ],
    joint: 'butt',
    backingLeftInPlace: false,
    ...over,
  };
}

const find = (r: EngineResult<unknown>, code: string, part?: number): Check => {
  const c = r.checks.find((x) => x.code === code && (part === undefined || x.part === part));
  if (!c) throw new Error(`no ${code} in ${r.checks.map((x) => x.code).join(', ')}`);
  return c;
};
const codes = (xs: Array<{ code: string }>): string[] => xs.map((x) => x.code);

describe('PJP strength, Table J2.5 rows (imperial, Awe = 0.5 in × 10 in = 5 in²)', () => {
  it('tension normal to the axis: weld 0.80 × 0.60 × 70 × 5 = 168 kip; base 0.75 × 65 × 5 = 243.75 kip per part; weld governs', () => {
    const r = checkPjp(pjp());
    expect(find(r, 'PJP_WELD_METAL').nominal).toBeCloseTo(210, 9); // 0.60 × 70 × 5
    expect(find(r, 'PJP_WELD_METAL').available).toBeCloseTo(168, 9);
    expect(find(r, 'PJP_WELD_METAL').phi).toBe(0.8);
    expect(find(r, 'PJP_BASE_METAL_TENSION', 0).available).toBeCloseTo(243.75, 9);
    expect(find(r, 'PJP_BASE_METAL_TENSION', 1).available).toBeCloseTo(243.75, 9);
    expect(r.governing.code).toBe('PJP_WELD_METAL');
    expect(r.values.governingSide).toBe('weld-metal');
    expect(r.utilization).toBeCloseTo(50 / 168, 9);
  });

  it('tension normal, ASD: weld 210 / 1.88 = 111.70 kip; base 325 / 2.00 = 162.5 kip', () => {
    const r = checkPjp(pjp({ method: 'ASD' }));
    expect(find(r, 'PJP_WELD_METAL').available).toBeCloseTo(111.702, 3);
    expect(find(r, 'PJP_WELD_METAL').omega).toBe(1.88);
    expect(find(r, 'PJP_BASE_METAL_TENSION', 0).available).toBeCloseTo(162.5, 9);
  });

  it('compression, column splice finished to bear: both sides listed as not applicable, with a warning', () => {
    const r = checkPjp(pjp({ load: { case: 'compression-column-bearing', cyclic: false } }));
    expect(codes(r.checks)).toEqual(['GROOVE_WELD_METAL_EXEMPT', 'GROOVE_BASE_METAL_EXEMPT']);
    for (const c of r.checks) {
      expect(c.applicable).toBe(false);
      expect(c.note).toMatch(/Table J2.5.*need not be considered/);
      expect(c.ratio).toBe(0);
      expect(c.pass).toBe(true);
    }
    expect(codes(r.warnings)).toContain('GROOVE_LOAD_CASE_EXEMPT');
    expect(r.utilization).toBe(0);
    expect(r.values.governingSide).toBe('none');
    expect(r.values.weldStress).toBeNull();
    // the detailing limits are still checked
    expect(codes(r.limits)).toEqual(['PJP_MIN_THROAT', 'PJP_THROAT_MAX', 'GROOVE_DEPTH_MAX']);
  });

  it('compression, other members finished to bear: weld 0.80 × 0.60 × 70 × 5 = 168; base 0.90 × 50 × 5 = 225; weld governs', () => {
    const r = checkPjp(pjp({ load: { case: 'compression-member-bearing', cyclic: false } }));
    expect(find(r, 'PJP_WELD_METAL').available).toBeCloseTo(168, 9);
    expect(find(r, 'PJP_BASE_METAL_COMPRESSION', 0).available).toBeCloseTo(225, 9);
    expect(find(r, 'PJP_BASE_METAL_COMPRESSION', 0).phi).toBe(0.9);
    expect(r.values.governingSide).toBe('weld-metal');
  });

  it('compression, other members finished to bear, A36: base 0.90 × 36 × 5 = 162 < weld 168; base governs', () => {
    const r = checkPjp(pjp({ load: { case: 'compression-member-bearing', cyclic: false }, parts: [{ thickness: 1, steel: 'A36' }, { thickness: 1, steel: 'A36' }] }));
    expect(find(r, 'PJP_BASE_METAL_COMPRESSION', 0).available).toBeCloseTo(162, 9);
    expect(r.governing.code).toBe('PJP_BASE_METAL_COMPRESSION');
    expect(r.values.governingSide).toBe('base-metal');
    expect(codes(r.warnings)).toContain('BASE_METAL_GOVERNS');
  });

  it('compression not finished to bear: weld 0.80 × 0.90 × 70 × 5 = 252; base 0.90 × 50 × 5 = 225; base governs', () => {
    const r = checkPjp(pjp({ load: { case: 'compression-not-bearing', cyclic: false } }));
    expect(r.values.weldStress).toBeCloseTo(63, 9);
    expect(find(r, 'PJP_WELD_METAL').available).toBeCloseTo(252, 9);
    expect(find(r, 'PJP_BASE_METAL_COMPRESSION', 1).available).toBeCloseTo(225, 9);
    expect(r.values.governingSide).toBe('base-metal');
  });

  it('tension or compression parallel to the axis: listed as not applicable', () => {
    const r = checkPjp(pjp({ load: { case: 'parallel', cyclic: false } }));
    expect(codes(r.checks)).toEqual(['GROOVE_WELD_METAL_EXEMPT', 'GROOVE_BASE_METAL_EXEMPT']);
    expect(r.checks.every((c) => c.applicable === false && c.nominal === 0)).toBe(true);
    expect(r.status).toBe('pass');
  });

  it('shear: weld 0.75 × 0.60 × 70 × 5 = 157.5; base yield 1.00 × 0.60 × 50 × 5 = 150; rupture 0.75 × 0.60 × 65 × 5 = 146.25 governs', () => {
    const r = checkPjp(pjp({ load: { case: 'shear', cyclic: false } }));
    expect(find(r, 'PJP_WELD_METAL').available).toBeCloseTo(157.5, 9);
    expect(find(r, 'PJP_WELD_METAL').phi).toBe(0.75);
    expect(find(r, 'BASE_METAL_SHEAR_YIELD', 0).available).toBeCloseTo(150, 9);
    expect(find(r, 'BASE_METAL_SHEAR_RUPTURE', 0).available).toBeCloseTo(146.25, 9);
    expect(r.governing.code).toBe('BASE_METAL_SHEAR_RUPTURE');
  });

  it('shear, ASD: weld 210 / 2 = 105; yield 150 / 1.5 = 100; rupture 195 / 2 = 97.5', () => {
    const r = checkPjp(pjp({ method: 'ASD', load: { case: 'shear', cyclic: false } }));
    expect(find(r, 'PJP_WELD_METAL').available).toBeCloseTo(105, 9);
    expect(find(r, 'BASE_METAL_SHEAR_YIELD', 0).available).toBeCloseTo(100, 9);
    expect(find(r, 'BASE_METAL_SHEAR_RUPTURE', 0).available).toBeCloseTo(97.5, 9);
  });

  it('each part is checked with its own steel: an A36 part (Fu 58) under tension gives 0.75 × 58 × 5 = 217.5', () => {
    const r = checkPjp(pjp({ parts: [{ thickness: 1, steel: 'A992' }, { thickness: 1, steel: 'A36' }] }));
    expect(find(r, 'PJP_BASE_METAL_TENSION', 0).available).toBeCloseTo(243.75, 9);
    expect(find(r, 'PJP_BASE_METAL_TENSION', 1).available).toBeCloseTo(217.5, 9);
  });

  it('no demand: available strengths only, the lowest governs, with a warning', () => {
    const r = checkPjp(pjp({ demand: null, load: { case: 'shear', cyclic: false } }));
    expect(r.governing.code).toBe('BASE_METAL_SHEAR_RUPTURE');
    expect(r.utilization).toBe(0);
    expect(codes(r.warnings)).toContain('NO_DEMAND_GIVEN');
  });
});

describe('PJP throat', () => {
  it('double-sided: the throats of the two sides add (1/2 + 3/8 in, SMAW 45-degree bevel: 3/8 + 1/4 = 5/8 in)', () => {
    const r = checkPjp(pjp({}, { type: 'bevel-45', sides: 2, depths: [0.5, 0.375] }));
    // AISC 360-22 Table J2.1 (from memory): S - 1/8 each side
    expect(r.values.sides.map((s) => s.throat)).toEqual([0.375, 0.25]);
    expect(r.values.throat).toBeCloseTo(0.625, 12);
    expect(r.values.area).toBeCloseTo(6.25, 12);
    expect(r.limits.filter((l) => l.code === 'PJP_MIN_THROAT').map((l) => l.weld)).toEqual([0, 1]);
    // groove depth 0.875 in both sides together, 1 in part
    expect(r.limits.find((l) => l.code === 'GROOVE_DEPTH_MAX')!.provided).toBeCloseTo(0.875, 12);
  });

  it('flare bevel with no radius: R = 2t of the HSS, flagged; GMAW 5/8 R', () => {
    const r = checkPjp(
      pjp({ parts: [{ thickness: 0.25, steel: 'A500-C-rect', hss: true }, { thickness: 0.5, steel: 'A36' }] }, { type: 'flare-bevel', process: 'GMAW', depths: null }),
    );
    // AISC 360-22 Table J2.2 (from memory): R = 2 × 0.25 = 0.5 in; te = 5/8 × 0.5 = 0.3125 in
    expect(r.values.radius).toBe(0.5);
    expect(r.values.radiusAssumed).toBe(true);
    expect(r.values.throat).toBeCloseTo(0.3125, 12);
    expect(r.values.throatSource).toBe('Table J2.2');
    expect(codes(r.warnings)).toContain('FLARE_RADIUS_ASSUMED');
    // no groove-depth or throat-vs-part limits for flare grooves; the minimum throat still applies
    expect(codes(r.limits)).toEqual(['PJP_MIN_THROAT']);
    // base-metal area capped at the HSS wall: min(0.3125, 0.25) × 10 = 2.5 in²
    expect(r.values.parts[0]!.fusionArea).toBeCloseTo(2.5, 12);
    expect(r.values.parts[1]!.fusionArea).toBeCloseTo(3.125, 12);
  });

  it('two flare bevels on an HSS: the throat of each side is capped at the wall for the base-metal area', () => {
    const r = checkPjp(
      pjp({ parts: [{ thickness: 0.25, steel: 'A500-C-rect', hss: true }, { thickness: 0.5, steel: 'A36' }] }, { type: 'flare-bevel', process: 'GMAW', sides: 2, depths: null }),
    );
    // te = 5/8 × 0.5 = 0.3125 in per side, 0.625 in together (Table J2.2, from memory)
    expect(r.values.throat).toBeCloseTo(0.625, 12);
    // HSS wall: 2 × min(0.3125, 0.25) × 10 = 5 in²; plate: 2 × 0.3125 × 10 = 6.25 in²
    expect(r.values.parts[0]!.fusionArea).toBeCloseTo(5, 12);
    expect(r.values.parts[1]!.fusionArea).toBeCloseTo(6.25, 12);
  });

  it('flare V with a given radius: SMAW 5/8 R; flare bevel below 3/8 in radius warns', () => {
    const r = checkPjp(pjp({}, { type: 'flare-V', process: 'SMAW', depths: null, radius: 0.8 }));
    expect(r.values.throat).toBeCloseTo(0.5, 12); // 5/8 × 0.8
    expect(r.values.radiusAssumed).toBe(false);
    const small = checkPjp(pjp({}, { type: 'flare-bevel', process: 'SMAW', depths: null, radius: 0.3125 }));
    expect(codes(small.warnings)).toContain('FLARE_BEVEL_RADIUS_SMALL');
    const ok = checkPjp(pjp({}, { type: 'flare-bevel', process: 'SMAW', depths: null, radius: 0.375 }));
    expect(codes(ok.warnings)).not.toContain('FLARE_BEVEL_RADIUS_SMALL');
  });

  it('flare by plain FCAW has no prequalified throat (Table J2.2 needs FCAW-G or FCAW-S)', () => {
    const e = thrown(() => checkPjp(pjp({}, { type: 'flare-bevel', process: 'FCAW', depths: null, radius: 1 })), EngineError);
    expect(e.code).toBe('PJP_NO_PREQUALIFIED_THROAT');
    expect(e.message).toMatch(/FCAW-G or FCAW-S/);
  });

  it('SAW 45-degree bevel: no prequalified throat, the answer asks for a qualified throat', () => {
    const e = thrown(() => checkPjp(pjp({}, { type: 'bevel-45', process: 'SAW', position: 'flat' })), EngineError);
    expect(e.code).toBe('PJP_NO_PREQUALIFIED_THROAT');
    expect(e.message).toMatch(/qualifiedThroat/);
  });

  it('a qualified throat is used where the table gives none, and flagged', () => {
    const r = checkPjp(pjp({}, { type: 'bevel-45', process: 'SAW', position: 'flat', qualifiedThroats: [0.45] }));
    expect(r.values.throat).toBe(0.45);
    expect(r.values.throatSource).toBe('qualified');
    expect(r.values.sides[0]!.prequalifiedThroat).toBeNull();
    expect(codes(r.warnings)).toContain('QUALIFIED_THROAT_USED');
    expect(find(r, 'PJP_WELD_METAL').nominal).toBeCloseTo(0.6 * 70 * 0.45 * 10, 9); // 189 kip
  });

  it('a qualified throat also replaces a prequalified one, which is reported beside it', () => {
    const r = checkPjp(pjp({}, { type: 'bevel-45', process: 'SMAW', qualifiedThroats: [0.5] }));
    expect(r.values.throat).toBe(0.5);
    expect(r.values.sides[0]!.prequalifiedThroat).toBeCloseTo(0.375, 12);
    expect(codes(r.warnings)).not.toContain('PJP_THROAT_DEDUCTION_AVOIDABLE');
  });

  it('a groove no deeper than the deduction leaves no throat: 422 PJP_GROOVE_TOO_SHALLOW', () => {
    const e = thrown(() => checkPjp(pjp({}, { type: 'bevel-45', process: 'SMAW', depths: [0.125] })), EngineError);
    expect(e.code).toBe('PJP_GROOVE_TOO_SHALLOW');
  });

  it('the deduction warning names the process and position that avoid it', () => {
    const r = checkPjp(pjp({}, { type: 'bevel-45', process: 'GMAW', position: 'overhead' }));
    const w = r.warnings.find((x) => x.code === 'PJP_THROAT_DEDUCTION_AVOIDABLE');
    expect(w?.message).toMatch(/GMAW or FCAW in the flat or horizontal position/);
    const none = checkPjp(pjp({}, { type: 'bevel-45', process: 'GMAW', position: 'flat' }));
    expect(codes(none.warnings)).not.toContain('PJP_THROAT_DEDUCTION_AVOIDABLE');
  });
});

describe('PJP limits', () => {
  it('minimum throat by the thinner part: 3/16 in V on a 1 in part fails 5/16 in (Table J2.3, from memory)', () => {
    const r = checkPjp(pjp({}, { depths: [0.1875] }));
    const l = r.limits.find((x) => x.code === 'PJP_MIN_THROAT')!;
    expect(l.required).toBe(0.3125);
    expect(l.pass).toBe(false);
    expect(r.status).toBe('fail');
  });

  it('throat not more than the thinner part; groove depth not more than the prepared part', () => {
    const r = checkPjp(pjp({ parts: [{ thickness: 0.5, steel: 'A992' }, { thickness: 1, steel: 'A992' }] }, { sides: 2, depths: [0.375, 0.375] }));
    const tmax = r.limits.find((x) => x.code === 'PJP_THROAT_MAX')!;
    expect(tmax.required).toBe(0.5);
    expect(tmax.provided).toBe(0.75);
    expect(tmax.pass).toBe(false);
    const dmax = r.limits.find((x) => x.code === 'GROOVE_DEPTH_MAX')!;
    expect(dmax.part).toBe(0); // the thinner part by default
    expect(dmax.pass).toBe(false);
    const named = checkPjp(pjp({ parts: [{ thickness: 0.5, steel: 'A992' }, { thickness: 1, steel: 'A992' }] }, { sides: 2, depths: [0.375, 0.375], part: 1 }));
    const d1 = named.limits.find((x) => x.code === 'GROOVE_DEPTH_MAX')!;
    expect(d1.part).toBe(1);
    expect(d1.required).toBe(1);
    expect(d1.pass).toBe(true);
  });

  it('a groove exactly as deep as the part passes (limits are inclusive)', () => {
    const r = checkPjp(pjp({ parts: [{ thickness: 0.5, steel: 'A992' }] }, { depths: [0.5] }));
    expect(r.limits.every((l) => l.pass)).toBe(true);
  });
});

describe('PJP advice', () => {
  it('cyclic tension normal to the axis warns; cyclic shear does not', () => {
    expect(codes(checkPjp(pjp({ load: { case: 'tension-normal', cyclic: true } })).warnings)).toContain('PJP_CYCLIC_TENSION');
    expect(codes(checkPjp(pjp({ load: { case: 'shear', cyclic: true } })).warnings)).not.toContain('PJP_CYCLIC_TENSION');
    expect(codes(checkPjp(pjp({ load: { case: 'tension-normal', cyclic: false } })).warnings)).not.toContain('PJP_CYCLIC_TENSION');
  });

  it('an over-matched electrode warns (E110 on A36)', () => {
    expect(codes(checkPjp(pjp({ electrode: 'E110', parts: [{ thickness: 1, steel: 'A36' }] })).warnings)).toContain('ELECTRODE_OVERMATCHED');
  });
});

describe('CJP, Table J2.5 rows (0.75 in and 1 in A572-50, 10 in: effective area 0.75 × 10 = 7.5 in²)', () => {
  it('tension normal: yield 0.90 × 50 × 7.5 = 337.5 governs over rupture 0.75 × 65 × 7.5 = 365.6', () => {
    const r = checkCjp(cjp());
    expect(r.values.throat).toBe(0.75);
    expect(find(r, 'BASE_METAL_TENSION_YIELD', 0).available).toBeCloseTo(337.5, 9);
    expect(find(r, 'BASE_METAL_TENSION_RUPTURE', 0).available).toBeCloseTo(365.625, 9);
    expect(r.governing.code).toBe('BASE_METAL_TENSION_YIELD');
    expect(r.values.governingSide).toBe('base-metal');
    expect(r.checks.some((c) => c.code === 'PJP_WELD_METAL')).toBe(false);
  });

  it('compression normal: 0.90 × 50 × 7.5 = 337.5 (LRFD), 375 / 1.67 = 224.55 (ASD)', () => {
    const l = checkCjp(cjp({ load: { case: 'compression-not-bearing' } }));
    expect(find(l, 'BASE_METAL_COMPRESSION_YIELD', 0).available).toBeCloseTo(337.5, 9);
    const a = checkCjp(cjp({ method: 'ASD', load: { case: 'compression-member-bearing' } }));
    expect(find(a, 'BASE_METAL_COMPRESSION_YIELD', 1).available).toBeCloseTo(224.551, 3);
  });

  it('shear: yield 1.00 × 0.60 × 50 × 7.5 = 225; rupture 0.75 × 0.60 × 65 × 7.5 = 219.375 governs', () => {
    const r = checkCjp(cjp({ load: { case: 'shear' } }));
    expect(find(r, 'BASE_METAL_SHEAR_YIELD', 0).available).toBeCloseTo(225, 9);
    expect(find(r, 'BASE_METAL_SHEAR_RUPTURE', 0).available).toBeCloseTo(219.375, 9);
    expect(r.governing.code).toBe('BASE_METAL_SHEAR_RUPTURE');
  });

  it('parallel to the axis: listed as not applicable', () => {
    const r = checkCjp(cjp({ load: { case: 'parallel' } }));
    expect(codes(r.checks)).toEqual(['GROOVE_BASE_METAL_EXEMPT']);
    expect(r.checks[0]!.applicable).toBe(false);
    expect(r.values.governingSide).toBe('none');
    expect(codes(r.warnings)).toContain('GROOVE_LOAD_CASE_EXEMPT');
  });

  it('always carries the inspection note', () => {
    expect(codes(checkCjp(cjp()).warnings)).toContain('CJP_INSPECTION');
  });

  it('notch-tough filler: T-joint with backing left in place in tension warns; a butt joint does not', () => {
    expect(codes(checkCjp(cjp({ joint: 'T', backingLeftInPlace: true })).warnings)).toContain('CJP_NOTCH_TOUGH_FILLER');
    expect(codes(checkCjp(cjp({ joint: 'butt', backingLeftInPlace: true })).warnings)).not.toContain('CJP_NOTCH_TOUGH_FILLER');
    expect(codes(checkCjp(cjp({ joint: 'corner', backingLeftInPlace: true, load: { case: 'shear' } })).warnings)).not.toContain('CJP_NOTCH_TOUGH_FILLER');
  });
});

describe('CJP filler metal (Table J2.5 with AWS D1.1 matching filler, from memory)', () => {
  const filler = (r: EngineResult<unknown>) => r.limits.find((l) => l.code === 'CJP_FILLER_MATCHING')!;

  it('E70 matches A572-50 in tension: passes', () => {
    expect(filler(checkCjp(cjp())).pass).toBe(true);
  });

  it('E60 under A572-50 in tension is a failed limit, not a warning', () => {
    const r = checkCjp(cjp({ electrode: 'E60' }));
    expect(filler(r).pass).toBe(false);
    expect(r.status).toBe('fail');
    expect(codes(r.warnings)).not.toContain('ELECTRODE_UNDERMATCHED');
  });

  it('E60 under A572-50 in shear fails (matching required)', () => {
    expect(filler(checkCjp(cjp({ electrode: 'E60', load: { case: 'shear' } }))).pass).toBe(false);
  });

  it('compression: one level below matching (E60 on A572-50) passes; two levels (E60 on A572-60, matching E80) fail', () => {
    expect(filler(checkCjp(cjp({ electrode: 'E60', load: { case: 'compression-not-bearing' } }))).pass).toBe(true);
    const two = checkCjp(cjp({ electrode: 'E60', load: { case: 'compression-not-bearing' }, parts: [{ thickness: 0.75, steel: 'A572-60' }] }));
    expect(filler(two).pass).toBe(false);
    const one = checkCjp(cjp({ electrode: 'E70', load: { case: 'compression-not-bearing' }, parts: [{ thickness: 0.75, steel: 'A572-60' }] }));
    expect(filler(one).pass).toBe(true);
  });

  it('parallel: filler equal to or below matching is permitted, the limit says so and passes', () => {
    const l = filler(checkCjp(cjp({ electrode: 'E60', load: { case: 'parallel' } })));
    expect(l.pass).toBe(true);
    expect(l.note).toMatch(/permitted/);
  });

  it('metric: E43 under S355 fails in tension, passes in compression (one level = 70 MPa)', () => {
    const base: Partial<CjpRequest> = { units: 'metric', electrode: 'E43', length: 250, parts: [{ thickness: 20, steel: 'S355' }] };
    expect(filler(checkCjp(cjp({ ...base }))).pass).toBe(false);
    expect(filler(checkCjp(cjp({ ...base, load: { case: 'compression-not-bearing' } }))).pass).toBe(true);
    expect(filler(checkCjp(cjp({ ...base, electrode: 'E49' }))).pass).toBe(true);
  });

  it('matching is judged against the weaker part joined (A36 to A572-60: E70 matches A36)', () => {
    const r = checkCjp(cjp({ parts: [{ thickness: 0.75, steel: 'A36' }, { thickness: 0.75, steel: 'A572-60' }] }));
    expect(filler(r).pass).toBe(true);
  });
});
