/**
 * The fillet-related rows (1 to 16) of shared/domain/check-values.md, one test per row, each
 * quoting the row number and its source as the list gives it.
 *
 * Units: imperial (in, kip, ksi) as in the list. Rounding: rows 2-4 are per-inch values rounded
 * to 3 decimals (exact 1.39211 and 0.92808 per sixteenth), row 6 to 4 decimals, rows 14-15 to
 * 3 significant figures; the tolerances below follow that rounding.
 */
import { describe, expect, it } from 'vitest';
import { checkFillet, type FilletLine, type FilletRequest } from '../../src/engine/fillet.js';
import { endLoadedLength, kds, te } from '../../src/engine/provisions/fillet.js';
import { lMin, tMatch, wMaxEdge, wMin } from '../../src/engine/provisions/detailing.js';
import type { EngineResult } from '../../src/engine/result.js';
import { line, req } from '../fillet-fixtures.js';

const weldAvailable = (r: EngineResult<unknown>): number => r.checks.find((c) => c.code === 'FILLET_WELD_METAL')!.available;

describe('shared/domain/check-values.md, fillet rows', () => {
  it('row 1: effective throat of an equal-leg fillet = 0.707·w (AISC 360-22 J2.2a, from memory)', () => {
    for (const w of [0.1875, 0.3125, 0.5, 8]) expect(te(w, w) / w).toBeCloseTo(0.707, 3);
    expect(checkFillet(req()).values.throat / 0.3125).toBeCloseTo(0.707, 3);
  });

  it('row 2: E70 fillet, LRFD, per inch, per 1/16 in = 1.392 kip/in (common practice, no source)', () => {
    // 10 in of D sixteenths: available / (D·10) = 1.392 to 3 decimals
    for (let D = 2; D <= 12; D++) {
      const per = weldAvailable(checkFillet(req({ welds: [line(D / 16, 10)] }))) / (D * 10);
      expect(per).toBeCloseTo(1.392, 3);
    }
  });

  it('row 3: E70 fillet, ASD, per inch, per 1/16 in = 0.928 kip/in (common practice, no source)', () => {
    for (let D = 2; D <= 12; D++) {
      const per = weldAvailable(checkFillet(req({ method: 'ASD', welds: [line(D / 16, 10)] }))) / (D * 10);
      expect(per).toBeCloseTo(0.928, 3);
    }
  });

  it('row 4: 3/16 in E70 fillet, LRFD, per inch = 1.392 × 3 = 4.176 kip/in (common practice, no source)', () => {
    expect(weldAvailable(checkFillet(req({ welds: [line(0.1875, 1)] })))).toBeCloseTo(4.176, 3);
  });

  it('row 5: directional factor at 90 degrees = 1.50 (AISC 360-22 J2.4, Eq. J2-5, from memory)', () => {
    expect(kds(90)).toBeCloseTo(1.5, 12);
    const long = weldAvailable(checkFillet(req()));
    const trans = weldAvailable(checkFillet(req({ welds: [line(0.3125, 10, { angle: 90 })] })));
    expect(trans / long).toBeCloseTo(1.5, 12);
  });

  it('row 6: directional factor at 45 degrees = 1 + 0.5·(sin 45°)^1.5 = 1.2973 (hand calculation from Eq. J2-5)', () => {
    expect(kds(45)).toBeCloseTo(1.2973, 4);
    expect(checkFillet(req({ welds: [line(0.3125, 10, { angle: 45 })] })).values.welds[0]!.kds).toBeCloseTo(1.2973, 4);
  });

  it('row 7: fillet weld phi = 0.75, Omega = 2.00 (AISC 360-22 Table J2.5, from memory)', () => {
    const lrfd = checkFillet(req()).checks.find((c) => c.code === 'FILLET_WELD_METAL')!;
    const asd = checkFillet(req({ method: 'ASD' })).checks.find((c) => c.code === 'FILLET_WELD_METAL')!;
    expect(lrfd.phi).toBe(0.75);
    expect(asd.omega).toBe(2.0);
    expect(lrfd.available / lrfd.nominal).toBeCloseTo(0.75, 12);
    expect(asd.nominal / asd.available).toBeCloseTo(2.0, 12);
  });

  it('row 8: minimum fillet size for a thinner part of 5/8 in = 1/4 in (AISC 360-22 Table J2.4, from memory)', () => {
    expect(wMin(0.625, 'imperial')).toBe(0.25);
    const r = checkFillet(req({ welds: [line(0.25, 10)], parts: [req().parts[0]!, { thickness: 0.625, steel: 'A992', edge: false, faces: 1, loading: 'shear' }] }));
    expect(r.limits.find((l) => l.code === 'FILLET_MIN_SIZE')!.required).toBe(0.25);
  });

  it('row 9: maximum fillet along a 1/2 in edge = 7/16 in (AISC 360-22 J2.2b, from memory)', () => {
    expect(wMaxEdge(0.5, 'imperial')).toBeCloseTo(0.4375, 12);
  });

  it('row 10: maximum fillet along a 3/16 in edge = 3/16 in (AISC 360-22 J2.2b, from memory)', () => {
    expect(wMaxEdge(0.1875, 'imperial')).toBeCloseTo(0.1875, 12);
  });

  it('row 11: minimum length of a 1/4 in fillet = 1 in (AISC 360-22 J2.2b, 4·w, from memory)', () => {
    expect(lMin(0.25)).toBe(1);
  });

  it('row 12: end-loaded reduction at l = 200·w: beta = 0.80 (AISC 360-22 Eq. J2-1, from memory)', () => {
    expect(endLoadedLength(50, 0.25).beta).toBeCloseTo(0.8, 12);
  });

  it('row 13: effective length of an end-loaded weld with l = 400·w = 180·w (AISC 360-22 J2.2b, from memory)', () => {
    expect(endLoadedLength(100, 0.25).effective).toBeCloseTo(45, 12);
  });

  it('row 14: base metal to match an E70 fillet of D sixteenths, one face = 3.09·D/Fu (AISC Manual Part 9, from memory)', () => {
    // 3 significant figures in the source: exact 70·0.70711/16 = 3.0936
    for (const D of [3, 4, 5, 6, 8]) {
      for (const Fu of [58, 65, 70]) {
        const t = tMatch(70, te(D / 16, D / 16), Fu, 1);
        expect(Math.abs(t / ((3.09 * D) / Fu) - 1)).toBeLessThan(2e-3);
      }
    }
  });

  it('row 15: the same with welds on both faces = 6.19·D/Fu (AISC Manual Part 9, from memory)', () => {
    // exact 2·70·0.70711/16 = 6.1872
    for (const D of [3, 4, 5, 6, 8]) {
      for (const Fu of [58, 65, 70]) {
        const t = tMatch(70, te(D / 16, D / 16), Fu, 2);
        expect(Math.abs(t / ((6.19 * D) / Fu) - 1)).toBeLessThan(2e-3);
      }
    }
  });

  it('row 16: largest fillet usually made in one pass = about 5/16 in (common practice, no source)', () => {
    const codes = (w: number) => checkFillet(req({ welds: [line(w, 10)] })).warnings.map((x) => x.code);
    expect(codes(0.3125)).not.toContain('FILLET_MULTI_PASS');
    expect(codes(0.375)).toContain('FILLET_MULTI_PASS');
  });
});
