/**
 * Groove welds against values from outside the project.
 *
 * Sources:
 * - shared/domain/check-values.md rows 17 and 18 (AISC 360-22 Tables J2.1 and J2.3, from memory);
 * - AISC 360-22 Table J2.1 for the single-bevel cases of the issue (from memory);
 * - hand calculations from AISC 360-22 Table J2.5 (nominal stresses, phi and Omega from memory)
 *   and §J4 (Eq. J4-3, J4-4), written out beside each assertion, for the governing side of every
 *   load case, LRFD and ASD, imperial and metric.
 *
 * Units: imperial in/kip/ksi, metric mm/kN/MPa (MPa × mm² / 1000 = kN). The hand results are
 * exact decimal arithmetic except the ASD divisions by 1.88 and 1.67, given to 0.01 kip or kN.
 */
import { describe, expect, it } from 'vitest';
import { checkCjp, checkPjp, type PjpRequest } from '../../src/engine/groove.js';
import { EngineError } from '../../src/engine/errors.js';
import type { Method } from '../../src/engine/provisions/resistance.js';
import type { GrooveLoadCase } from '../../src/engine/provisions/groove.js';
import type { SteelSpec } from '../../src/engine/materials.js';

function pjp(over: Partial<PjpRequest> = {}, g: Partial<PjpRequest['groove']> = {}): PjpRequest {
  return {
    method: 'LRFD',
    units: 'imperial',
    electrode: 'E70',
    groove: { type: 'bevel-45', process: 'SMAW', position: 'flat', sides: 1, depths: [0.5], radius: null, qualifiedThroats: null, part: null, ...g },
    length: 12,
    load: { case: 'tension-normal', cyclic: false },
    demand: 20,
    parts: [
      { thickness: 1, steel: 'A992' },
      { thickness: 1, steel: 'A992' },
    ],
    ...over,
  };
}

describe('check-values.md rows 17 and 18', () => {
  it('row 17: PJP, SMAW, 45-degree bevel, groove depth 1/2 in: effective throat 3/8 in (AISC 360-22 Table J2.1, from memory)', () => {
    for (const position of ['flat', 'horizontal', 'vertical', 'overhead'] as const) {
      const r = checkPjp(pjp({}, { position }));
      expect(r.values.throat).toBeCloseTo(0.375, 12);
    }
    // "any position": with no position given the SMAW row still answers
    expect(checkPjp(pjp({}, { position: null })).values.throat).toBeCloseTo(0.375, 12);
  });

  it('row 18: minimum PJP throat for a thinner part of 1 in is 5/16 in (AISC 360-22 Table J2.3, from memory)', () => {
    const r = checkPjp(pjp({ parts: [{ thickness: 1, steel: 'A992' }, { thickness: 1.5, steel: 'A992' }] }));
    const l = r.limits.find((x) => x.code === 'PJP_MIN_THROAT')!;
    expect(l.required).toBe(0.3125);
    expect(r.values.minThroat).toBe(0.3125);
  });
});

describe('the issue\'s acceptance cases (AISC 360-22 Table J2.1, from memory)', () => {
  it('single 45-degree bevel, 1/2 in deep, GMAW in the flat position: effective throat 1/2 in', () => {
    expect(checkPjp(pjp({}, { process: 'GMAW', position: 'flat' })).values.throat).toBe(0.5);
  });

  it('SAW on a 45-degree bevel has no prequalified throat: PJP_NO_PREQUALIFIED_THROAT, asking for a qualified throat', () => {
    let err: unknown;
    try {
      checkPjp(pjp({}, { process: 'SAW', position: 'flat' }));
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(EngineError);
    expect((err as EngineError).code).toBe('PJP_NO_PREQUALIFIED_THROAT');
    expect((err as EngineError).message).toMatch(/qualifiedThroat/);
  });

  it('metric: SMAW 45-degree bevel 12 mm deep gives 12 - 3 = 9 mm; GMAW flat gives 12 mm', () => {
    const base: Partial<PjpRequest> = { units: 'metric', electrode: 'E49', length: 300, parts: [{ thickness: 25, steel: 'S355' }] };
    expect(checkPjp(pjp(base, { depths: [12] })).values.throat).toBe(9);
    expect(checkPjp(pjp(base, { depths: [12], process: 'GMAW' })).values.throat).toBe(12);
  });
});

/**
 * The governing side for each load case. Geometry: 60-degree V by GMAW, flat (te = S).
 * Imperial: S = 1/2 in, L = 10 in, Awe = ABM = 5 in². Metric: S = 12 mm, L = 250 mm,
 * Awe = ABM = 3000 mm².
 */
interface Case {
  name: string;
  method: Method;
  units: 'imperial' | 'metric';
  electrode: string;
  steel: SteelSpec;
  loadCase: GrooveLoadCase;
  /** Hand-calculated available strengths by code. */
  expected: Record<string, number>;
  governing: string;
  side: 'weld-metal' | 'base-metal' | 'none';
}

const CASES: Case[] = [
  // ---- tension normal to the axis: weld 0.60·FEXX (0.80 / 1.88), base Fu (0.75 / 2.00)
  { name: 'tension, E70 on A992, LRFD: weld 0.80×0.60×70×5 = 168 < base 0.75×65×5 = 243.75', method: 'LRFD', units: 'imperial', electrode: 'E70', steel: 'A992', loadCase: 'tension-normal', expected: { PJP_WELD_METAL: 168, PJP_BASE_METAL_TENSION: 243.75 }, governing: 'PJP_WELD_METAL', side: 'weld-metal' },
  { name: 'tension, E70 on A992, ASD: weld 210/1.88 = 111.70 < base 325/2.00 = 162.5', method: 'ASD', units: 'imperial', electrode: 'E70', steel: 'A992', loadCase: 'tension-normal', expected: { PJP_WELD_METAL: 111.7021, PJP_BASE_METAL_TENSION: 162.5 }, governing: 'PJP_WELD_METAL', side: 'weld-metal' },
  { name: 'tension, E110 on A36, LRFD: base 0.75×58×5 = 217.5 < weld 0.80×0.60×110×5 = 264', method: 'LRFD', units: 'imperial', electrode: 'E110', steel: 'A36', loadCase: 'tension-normal', expected: { PJP_WELD_METAL: 264, PJP_BASE_METAL_TENSION: 217.5 }, governing: 'PJP_BASE_METAL_TENSION', side: 'base-metal' },
  { name: 'tension, E110 on A36, ASD: base 290/2.00 = 145 < weld 330/1.88 = 175.53', method: 'ASD', units: 'imperial', electrode: 'E110', steel: 'A36', loadCase: 'tension-normal', expected: { PJP_WELD_METAL: 175.5319, PJP_BASE_METAL_TENSION: 145 }, governing: 'PJP_BASE_METAL_TENSION', side: 'base-metal' },
  { name: 'tension, metric E49 on S355, LRFD: weld 0.80×0.60×490×3000/1000 = 705.6 < base 0.75×510×3 = 1147.5', method: 'LRFD', units: 'metric', electrode: 'E49', steel: 'S355', loadCase: 'tension-normal', expected: { PJP_WELD_METAL: 705.6, PJP_BASE_METAL_TENSION: 1147.5 }, governing: 'PJP_WELD_METAL', side: 'weld-metal' },
  { name: 'tension, metric E76 on S235, ASD: base 360×3/2.00 = 540 < weld 0.60×760×3/1.88 = 727.66', method: 'ASD', units: 'metric', electrode: 'E76', steel: 'S235', loadCase: 'tension-normal', expected: { PJP_WELD_METAL: 727.6596, PJP_BASE_METAL_TENSION: 540 }, governing: 'PJP_BASE_METAL_TENSION', side: 'base-metal' },

  // ---- compression, column splice finished to bear: need not be checked
  { name: 'column splice finished to bear, LRFD: not applicable', method: 'LRFD', units: 'imperial', electrode: 'E70', steel: 'A992', loadCase: 'compression-column-bearing', expected: { GROOVE_WELD_METAL_EXEMPT: 0, GROOVE_BASE_METAL_EXEMPT: 0 }, governing: 'GROOVE_WELD_METAL_EXEMPT', side: 'none' },
  { name: 'column splice finished to bear, metric ASD: not applicable', method: 'ASD', units: 'metric', electrode: 'E49', steel: 'S355', loadCase: 'compression-column-bearing', expected: { GROOVE_WELD_METAL_EXEMPT: 0, GROOVE_BASE_METAL_EXEMPT: 0 }, governing: 'GROOVE_WELD_METAL_EXEMPT', side: 'none' },

  // ---- compression, other members finished to bear: weld 0.60·FEXX (0.80 / 1.88), base Fy (0.90 / 1.67)
  { name: 'member bearing, E70 on A992, LRFD: weld 168 < base 0.90×50×5 = 225', method: 'LRFD', units: 'imperial', electrode: 'E70', steel: 'A992', loadCase: 'compression-member-bearing', expected: { PJP_WELD_METAL: 168, PJP_BASE_METAL_COMPRESSION: 225 }, governing: 'PJP_WELD_METAL', side: 'weld-metal' },
  { name: 'member bearing, E70 on A36, ASD: base 36×5/1.67 = 107.78 < weld 210/1.88 = 111.70', method: 'ASD', units: 'imperial', electrode: 'E70', steel: 'A36', loadCase: 'compression-member-bearing', expected: { PJP_WELD_METAL: 111.7021, PJP_BASE_METAL_COMPRESSION: 107.7844 }, governing: 'PJP_BASE_METAL_COMPRESSION', side: 'base-metal' },
  { name: 'member bearing, metric E49 on S355, ASD: weld 0.60×490×3/1.88 = 469.15 < base 355×3/1.67 = 637.72', method: 'ASD', units: 'metric', electrode: 'E49', steel: 'S355', loadCase: 'compression-member-bearing', expected: { PJP_WELD_METAL: 469.1489, PJP_BASE_METAL_COMPRESSION: 637.7246 }, governing: 'PJP_WELD_METAL', side: 'weld-metal' },
  { name: 'member bearing, metric E49 on S235, LRFD: base 0.90×235×3 = 634.5 < weld 705.6', method: 'LRFD', units: 'metric', electrode: 'E49', steel: 'S235', loadCase: 'compression-member-bearing', expected: { PJP_WELD_METAL: 705.6, PJP_BASE_METAL_COMPRESSION: 634.5 }, governing: 'PJP_BASE_METAL_COMPRESSION', side: 'base-metal' },

  // ---- compression not finished to bear: weld 0.90·FEXX (0.80 / 1.88), base Fy (0.90 / 1.67)
  { name: 'not bearing, E70 on A992, LRFD: base 225 < weld 0.80×0.90×70×5 = 252', method: 'LRFD', units: 'imperial', electrode: 'E70', steel: 'A992', loadCase: 'compression-not-bearing', expected: { PJP_WELD_METAL: 252, PJP_BASE_METAL_COMPRESSION: 225 }, governing: 'PJP_BASE_METAL_COMPRESSION', side: 'base-metal' },
  { name: 'not bearing, E70 on A992, ASD: base 250/1.67 = 149.70 < weld 315/1.88 = 167.55', method: 'ASD', units: 'imperial', electrode: 'E70', steel: 'A992', loadCase: 'compression-not-bearing', expected: { PJP_WELD_METAL: 167.5532, PJP_BASE_METAL_COMPRESSION: 149.7006 }, governing: 'PJP_BASE_METAL_COMPRESSION', side: 'base-metal' },
  { name: 'not bearing, E60 on A514 (Fy 100), LRFD: weld 0.80×0.90×60×5 = 216 < base 0.90×100×5 = 450', method: 'LRFD', units: 'imperial', electrode: 'E60', steel: 'A514', loadCase: 'compression-not-bearing', expected: { PJP_WELD_METAL: 216, PJP_BASE_METAL_COMPRESSION: 450 }, governing: 'PJP_WELD_METAL', side: 'weld-metal' },
  { name: 'not bearing, metric E49 on S355, LRFD: base 0.90×355×3 = 958.5 < weld 0.80×0.90×490×3 = 1058.4', method: 'LRFD', units: 'metric', electrode: 'E49', steel: 'S355', loadCase: 'compression-not-bearing', expected: { PJP_WELD_METAL: 1058.4, PJP_BASE_METAL_COMPRESSION: 958.5 }, governing: 'PJP_BASE_METAL_COMPRESSION', side: 'base-metal' },

  // ---- parallel to the axis: need not be checked
  { name: 'parallel, ASD: not applicable', method: 'ASD', units: 'imperial', electrode: 'E70', steel: 'A992', loadCase: 'parallel', expected: { GROOVE_WELD_METAL_EXEMPT: 0, GROOVE_BASE_METAL_EXEMPT: 0 }, governing: 'GROOVE_WELD_METAL_EXEMPT', side: 'none' },
  { name: 'parallel, metric LRFD: not applicable', method: 'LRFD', units: 'metric', electrode: 'E49', steel: 'S355', loadCase: 'parallel', expected: { GROOVE_WELD_METAL_EXEMPT: 0, GROOVE_BASE_METAL_EXEMPT: 0 }, governing: 'GROOVE_WELD_METAL_EXEMPT', side: 'none' },

  // ---- shear: weld 0.60·FEXX (0.75 / 2.00); base §J4.2 yield 0.60·Fy (1.00 / 1.50), rupture 0.60·Fu (0.75 / 2.00)
  { name: 'shear, E70 on A992, LRFD: rupture 0.75×0.60×65×5 = 146.25 < yield 150 < weld 0.75×0.60×70×5 = 157.5', method: 'LRFD', units: 'imperial', electrode: 'E70', steel: 'A992', loadCase: 'shear', expected: { PJP_WELD_METAL: 157.5, BASE_METAL_SHEAR_YIELD: 150, BASE_METAL_SHEAR_RUPTURE: 146.25 }, governing: 'BASE_METAL_SHEAR_RUPTURE', side: 'base-metal' },
  { name: 'shear, E60 on A572-50, ASD: weld 0.60×60×5/2 = 90 < rupture 195/2 = 97.5 < yield 150/1.5 = 100', method: 'ASD', units: 'imperial', electrode: 'E60', steel: 'A572-50', loadCase: 'shear', expected: { PJP_WELD_METAL: 90, BASE_METAL_SHEAR_YIELD: 100, BASE_METAL_SHEAR_RUPTURE: 97.5 }, governing: 'PJP_WELD_METAL', side: 'weld-metal' },
  { name: 'shear, metric E49 on S355, LRFD: yield 1.00×0.60×355×3 = 639 < weld 0.75×0.60×490×3 = 661.5 < rupture 688.5', method: 'LRFD', units: 'metric', electrode: 'E49', steel: 'S355', loadCase: 'shear', expected: { PJP_WELD_METAL: 661.5, BASE_METAL_SHEAR_YIELD: 639, BASE_METAL_SHEAR_RUPTURE: 688.5 }, governing: 'BASE_METAL_SHEAR_YIELD', side: 'base-metal' },
  { name: 'shear, metric E43 on S355, ASD: weld 0.60×430×3/2 = 387 < yield 639/1.5 = 426 < rupture 918/2 = 459', method: 'ASD', units: 'metric', electrode: 'E43', steel: 'S355', loadCase: 'shear', expected: { PJP_WELD_METAL: 387, BASE_METAL_SHEAR_YIELD: 426, BASE_METAL_SHEAR_RUPTURE: 459 }, governing: 'PJP_WELD_METAL', side: 'weld-metal' },
];

describe('governing side for every Table J2.5 PJP row (hand calculations, AISC 360-22 Table J2.5 and §J4, from memory)', () => {
  for (const c of CASES) {
    it(c.name, () => {
      const metric = c.units === 'metric';
      const r = checkPjp(
        pjp(
          {
            method: c.method,
            units: c.units,
            electrode: c.electrode,
            length: metric ? 250 : 10,
            demand: metric ? 100 : 20,
            load: { case: c.loadCase, cyclic: false },
            parts: [
              { thickness: metric ? 25 : 1, steel: c.steel },
              { thickness: metric ? 25 : 1, steel: c.steel },
            ],
          },
          { type: 'V-60', process: 'GMAW', position: 'flat', depths: [metric ? 12 : 0.5] },
        ),
      );
      for (const [code, available] of Object.entries(c.expected)) {
        const found = r.checks.filter((x) => x.code === code);
        expect(found.length, code).toBeGreaterThan(0);
        for (const f of found) expect(f.available, code).toBeCloseTo(available, 2);
      }
      expect(r.governing.code).toBe(c.governing);
      expect(r.values.governingSide).toBe(c.side);
    });
  }
});

describe('CJP: the base metal governs on the thinner part (hand calculations, AISC 360-22 Table J2.5 and §J4, from memory)', () => {
  it('imperial LRFD tension: 5/8 in A36 to 1 in A572-50, 8 in: yield 0.90 × 36 × 0.625 × 8 = 162 on the A36 part governs', () => {
    const r = checkCjp({
      method: 'LRFD', units: 'imperial', electrode: 'E70', length: 8, load: { case: 'tension-normal' }, demand: 150,
      parts: [{ thickness: 0.625, steel: 'A36' }, { thickness: 1, steel: 'A572-50' }], joint: 'butt', backingLeftInPlace: false,
    });
    expect(r.values.throat).toBe(0.625);
    expect(r.governing.code).toBe('BASE_METAL_TENSION_YIELD');
    expect(r.governing.part).toBe(0);
    expect(r.governing.available).toBeCloseTo(162, 9);
    // the A572-50 part on the same area: 0.90 × 50 × 5 = 225
    expect(r.checks.find((c) => c.code === 'BASE_METAL_TENSION_YIELD' && c.part === 1)!.available).toBeCloseTo(225, 9);
  });

  it('metric ASD shear: 20 mm S355, 300 mm: yield 0.60 × 355 × 6000 / 1000 / 1.50 = 852 kN; rupture 0.60 × 510 × 6 / 2.00 = 918 kN; yield governs', () => {
    const r = checkCjp({
      method: 'ASD', units: 'metric', electrode: 'E49', length: 300, load: { case: 'shear' }, demand: 500,
      parts: [{ thickness: 20, steel: 'S355' }, { thickness: 30, steel: 'S355' }], joint: 'butt', backingLeftInPlace: false,
    });
    expect(r.governing.code).toBe('BASE_METAL_SHEAR_YIELD');
    expect(r.governing.available).toBeCloseTo(852, 6);
    expect(r.checks.find((c) => c.code === 'BASE_METAL_SHEAR_RUPTURE')!.available).toBeCloseTo(918, 6);
  });
});
