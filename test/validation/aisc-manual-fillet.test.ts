/**
 * Validation against the AISC Steel Construction Manual (Parts 8 and 9) and a lap splice laid
 * out after AISC Design Example J.1.
 *
 * Sources (none re-read while writing; all "from memory"):
 * - AISC Manual Part 8, Eq. 8-2a / 8-2b: for E70 electrodes, phi·Rn = 1.392·D·l (LRFD) and
 *   Rn/Omega = 0.928·D·l (ASD), D = fillet size in sixteenths of an inch, l in inches, kip.
 * - AISC Manual Part 9: minimum base-metal thickness whose shear rupture matches an E70 fillet,
 *   tmin = 3.09·D/Fu (weld on one face) and 6.19·D/Fu (welds on both faces), Fu in ksi, t in in.
 * - AISC Design Examples, Example J.1 (fillet weld in longitudinal shear): a 1/4 in plate lapped
 *   on a 3/8 in plate, A572 Grade 50, E70 electrodes, PD = 33 kip and PL = 100 kip, welded along
 *   both edges; the largest fillet without special notation along the 1/4 in edge is 3/16 in.
 *   Only that set-up is taken from the example; every strength below is hand arithmetic from
 *   AISC 360-22 Eq. J2-1 and J2-4 (from memory), not the example's printed answer.
 *
 * Units and rounding: the Manual works in in, kip, ksi; its coefficients 1.392 / 0.928 are
 * rounded to 4 significant figures (exact 1.392116 / 0.928078) and 3.09 / 6.19 to 3 significant
 * figures (exact 3.0936 / 6.1872), so those comparisons use 0.1 % and 0.2 % relative tolerances.
 */
import { describe, expect, it } from 'vitest';
import { checkFillet, type FilletLine, type FilletPart, type FilletRequest } from '../../src/engine/fillet.js';
import type { Check, EngineResult } from '../../src/engine/result.js';
import { line, part, req } from '../fillet-fixtures.js';
import { rel } from '../assert.js';

function check(r: EngineResult<unknown>, code: Check['code'], partIndex?: number): Check {
  const c = r.checks.find((x) => x.code === code && (partIndex === undefined || x.part === partIndex));
  if (!c) throw new Error(`no check ${code}`);
  return c;
}

describe('AISC Manual Part 8, Eq. 8-2a/8-2b (from memory): E70 fillet strength 1.392·D·l, 0.928·D·l', () => {
  const sizes = [2, 3, 4, 5, 6, 7, 8, 10, 12, 16];
  it.each(sizes)('D = %s sixteenths, l = 12 in, LRFD', (D) => {
    const r = checkFillet(req({ welds: [line(D / 16, 12)] }));
    rel(check(r, 'FILLET_WELD_METAL').available, 1.392 * D * 12, 1e-3);
  });
  it.each(sizes)('D = %s sixteenths, l = 12 in, ASD', (D) => {
    const r = checkFillet(req({ method: 'ASD', welds: [line(D / 16, 12)] }));
    rel(check(r, 'FILLET_WELD_METAL').available, 0.928 * D * 12, 1e-3);
  });

  it('other electrodes scale linearly with FEXX in the Specification: E80, D = 5, l = 10 → 1.392·(80/70)·50 = 79.54 kip', () => {
    // AISC 360-22 Table J2.5 (from memory): Fnw = 0.60·FEXX, so the strength is proportional to FEXX
    const r = checkFillet(req({ electrode: 'E80', parts: [part(1, 'A572-65'), part(1, 'A572-65')] }));
    rel(check(r, 'FILLET_WELD_METAL').available, (1.392 * 80) / 70 * 50, 1e-3);
  });
});

describe('AISC Manual Part 9 (from memory): base metal to match an E70 fillet', () => {
  it('one face: tmin = 3.09·D/Fu; 1/4 in on A572-50 → 3.09·4/65 = 0.190 in', () => {
    const r = checkFillet(req({ welds: [line(0.25, 10)], parts: [part(0.1875, 'A572-50'), part(1, 'A572-50')] }));
    rel(r.values.parts[0]!.tMatch, (3.09 * 4) / 65, 2e-3);
  });

  it('both faces: tmin = 6.19·D/Fu; 5/16 in on A572-50 → 6.19·5/65 = 0.476 in; on A36 → 6.19·5/58 = 0.534 in', () => {
    const gusset = (steel: string) =>
      checkFillet(req({ welds: [line(0.3125, 10, { count: 2 })], parts: [part(0.5, steel, { faces: 2 }), part(1, 'A992')] }));
    rel(gusset('A572-50').values.parts[0]!.tMatch, (6.19 * 5) / 65, 2e-3);
    rel(gusset('A36').values.parts[0]!.tMatch, (6.19 * 5) / 58, 2e-3);
  });

  it('a part thicker than tmin leaves the weld metal governing; a thinner one lets shear rupture govern', () => {
    // two 5/16 in × 10 in E70 fillets, one on each face of an A572-50 gusset (tmin = 0.476 in):
    // weld 2·1.392·5·10 = 139.2 kip
    // t = 1/2 in: rupture 0.75·0.60·65·0.5·10 = 146.25 kip, yield 1.0·0.60·50·0.5·10 = 150 kip → weld governs
    // t = 7/16 in: rupture 0.75·0.60·65·0.4375·10 = 127.97 kip < 139.2 → rupture governs
    const g = (t: number) =>
      checkFillet(req({ welds: [line(0.3125, 10, { count: 2 })], parts: [part(t, 'A572-50', { faces: 2 }), part(1, 'A992')], demand: 100 }));
    const thick = g(0.5);
    expect(thick.governing.code).toBe('FILLET_WELD_METAL');
    rel(check(thick, 'BASE_METAL_SHEAR_RUPTURE', 0).available, 146.25, 1e-9);
    rel(check(thick, 'FILLET_WELD_METAL').available, 139.2, 1e-3);
    const thin = g(0.4375);
    expect(thin.governing.code).toBe('BASE_METAL_SHEAR_RUPTURE');
    expect(thin.governing.part).toBe(0);
    rel(check(thin, 'BASE_METAL_SHEAR_RUPTURE', 0).available, 127.96875, 1e-9);
  });
});

describe('lap splice after AISC Design Example J.1 (set-up from memory, strengths by hand arithmetic)', () => {
  // 1/4 in × 18 in A572-50 plate lapped on a 3/8 in A572-50 plate, two 3/16 in E70 fillets of
  // length L along the edges of the 1/4 in plate (end-loaded, longitudinal welds alone at the end
  // of a flat bar 18 in wide). Loads: Pu = 1.2·33 + 1.6·100 = 199.6 kip; Pa = 33 + 100 = 133 kip.
  const splice = (L: number, method: 'LRFD' | 'ASD', demand: number) =>
    checkFillet(
      req({
        method,
        welds: [line(0.1875, L, { count: 2, endLoaded: true })],
        parts: [part(0.25, 'A572-50', { edge: true }), part(0.375, 'A572-50')],
        demand,
        flatBarWidth: 18,
      }),
    );

  it('the 1/4 in edge allows at most 3/16 in, and Table J2.4 asks at least 1/8 in', () => {
    const r = splice(26, 'LRFD', 199.6);
    const edge = r.limits.find((l) => l.code === 'FILLET_MAX_SIZE_EDGE')!;
    expect(edge.required).toBe(0.1875); // 1/4 - 1/16, AISC 360-22 §J2.2b (from memory)
    expect(edge.pass).toBe(true);
    expect(r.limits.find((l) => l.code === 'FILLET_MIN_SIZE')!.required).toBe(0.125); // AISC 360-22 Table J2.4 (from memory)
  });

  it('L = 26 in, LRFD: l/w = 138.67, beta = 0.9227, φRn = 200.4 kip >= 199.6 kip', () => {
    // beta = 1.2 - 0.002·(26/0.1875) = 1.2 - 0.27733 = 0.92267; effective 2·0.92267·26 = 47.979 in
    // φRn = 1.392116·3·47.979 = 200.38 kip
    const r = splice(26, 'LRFD', 199.6);
    rel(r.values.welds[0]!.beta, 0.92267, 1e-4);
    rel(r.values.effectiveLength, 47.979, 1e-4);
    rel(check(r, 'FILLET_WELD_METAL').available, 200.38, 1e-3);
    expect(r.governing.code).toBe('FILLET_WELD_METAL');
    expect(r.status).toBe('pass');
    expect(r.warnings.map((w) => w.code)).toContain('END_LOADED_LENGTH_REDUCED');
  });

  it('L = 25 in, LRFD: beta = 0.9333, φRn = 194.9 kip < 199.6 kip → fail', () => {
    // beta = 1.2 - 0.002·133.33 = 0.93333; effective 2·0.93333·25 = 46.667 in; 4.176348·46.667 = 194.90 kip
    const r = splice(25, 'LRFD', 199.6);
    rel(check(r, 'FILLET_WELD_METAL').available, 194.9, 1e-3);
    expect(r.status).toBe('fail');
  });

  it('L = 26 in, ASD: Rn/Ω = 0.928078·3·47.979 = 133.6 kip >= 133 kip', () => {
    const r = splice(26, 'ASD', 133);
    rel(check(r, 'FILLET_WELD_METAL').available, 133.58, 1e-3);
    expect(r.status).toBe('pass');
    expect(r.utilization).toBeGreaterThan(0.99);
  });

  it('each weld is longer than the 18 in between them (flat-bar rule, AISC 360-22 §J2.2b, from memory)', () => {
    const r = splice(26, 'LRFD', 199.6);
    const fb = r.limits.find((l) => l.code === 'FILLET_FLAT_BAR_WELD_LENGTH')!;
    expect(fb.required).toBe(18);
    expect(fb.pass).toBe(true);
  });

  it('the base metal of the 1/4 in plate along the 52 in of weld does not govern', () => {
    // plane 52 in × 0.25 in = 13 in²: yield 1.0·0.60·50·13 = 390 kip; rupture 0.75·0.60·65·13 = 380.25 kip
    const r = splice(26, 'LRFD', 199.6);
    rel(check(r, 'BASE_METAL_SHEAR_YIELD', 0).available, 390, 1e-9);
    rel(check(r, 'BASE_METAL_SHEAR_RUPTURE', 0).available, 380.25, 1e-9);
  });
});

describe('fillet loaded at an angle (hand arithmetic from AISC 360-22 Eq. J2-5, from memory)', () => {
  it('60 degrees: kds = 1 + 0.5·(0.86603)^1.5 = 1.4030; 1/4 in × 10 in → 1.392·4·10·1.4030 = 78.12 kip', () => {
    const r = checkFillet(req({ welds: [line(0.25, 10, { angle: 60 })] }));
    rel(r.values.welds[0]!.kds, 1.40296, 1e-5);
    rel(check(r, 'FILLET_WELD_METAL').available, 1.392 * 4 * 10 * 1.40296, 1e-3);
  });
});
