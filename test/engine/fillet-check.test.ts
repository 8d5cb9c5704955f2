/**
 * checkFillet (and checkBaseMetal) end to end: weld metal strength, group rules, length and
 * size reductions, base metal, detailing limits, warnings and the status.
 *
 * Sources: AISC 360-22 §J2.2a, §J2.2b, Table J2.4, Table J2.5, Eq. J2-1, J2-4, J2-5, J2-6a/b and
 * §J4 (from memory); expected values are hand arithmetic from those equations, written out beside
 * each assertion. "1.392 kip/in (0.928 ASD) per sixteenth" is common practice, no source; it is
 * rounded to 4 significant figures (exact: 0.75·0.60·70·0.70711/16 = 1.39211), hence the 0.1 %
 * tolerance wherever it is used.
 */
import { describe, expect, it } from 'vitest';
import { checkFillet, type FilletLine, type FilletPart, type FilletRequest } from '../../src/engine/fillet.js';
import { checkBaseMetal } from '../../src/engine/base-metal.js';
import { EngineError } from '../../src/engine/errors.js';
import type { Check, EngineResult, Limit } from '../../src/engine/result.js';
import { line, part, req } from '../fillet-fixtures.js';

// ---------- local request builders ----------

/** Default: 5/16 in E70 fillet, 10 in, longitudinal, LRFD, between two 1 in A992 parts. */

function close(actual: number, expected: number, tol = 1e-9): void {
  const slack = tol * Math.abs(expected);
  expect(actual, `expected ${expected} within ${tol} relative, got ${actual}`).toBeGreaterThanOrEqual(expected - slack);
  expect(actual, `expected ${expected} within ${tol} relative, got ${actual}`).toBeLessThanOrEqual(expected + slack);
}

function check(r: EngineResult<unknown>, code: Check['code'], partIndex?: number): Check {
  const c = r.checks.find((x) => x.code === code && (partIndex === undefined || x.part === partIndex));
  if (!c) throw new Error(`no check ${code}${partIndex === undefined ? '' : ` for part ${partIndex}`}`);
  return c;
}

function limits(r: EngineResult<unknown>, code: Limit['code']): Limit[] {
  return r.limits.filter((l) => l.code === code);
}

function onlyLimit(r: EngineResult<unknown>, code: Limit['code']): Limit {
  const ls = limits(r, code);
  expect(ls, `exactly one ${code}`).toHaveLength(1);
  return ls[0]!;
}

function warningCodes(r: EngineResult<unknown>): string[] {
  return r.warnings.map((w) => w.code);
}

const weldMetal = (r: EngineResult<unknown>): number => check(r, 'FILLET_WELD_METAL').available;

// Exact per-inch weld metal strengths of an E70 fillet of D sixteenths (hand arithmetic):
// rn = 0.60·70·(D/16)/sqrt(2) = 1.856155·D kip/in nominal; LRFD 0.75·rn = 1.392116·D; ASD rn/2 = 0.928078·D.
const RN_PER_D = (0.6 * 70) / 16 / Math.SQRT2;

// ---------- weld metal ----------

describe('weld metal of a linear group', () => {
  it('5/16 in E70, 10 in longitudinal, LRFD: 1.392 × 5 × 10 = 69.6 kip (common practice, no source)', () => {
    const r = checkFillet(req());
    close(weldMetal(r), 69.6, 1e-3);
    expect(r.values.groupRule).toBe('linear');
    expect(r.values.welds[0]!.kds).toBe(1);
    close(r.values.throat, 0.3125 * Math.SQRT1_2); // 0.22097 in, AISC 360-22 §J2.2a (from memory)
    close(r.values.area, 0.3125 * Math.SQRT1_2 * 10); // Awe = te·l = 2.2097 in²
  });

  it('ASD: 0.928 × 5 × 10 = 46.4 kip (common practice, no source)', () => {
    const r = checkFillet(req({ method: 'ASD' }));
    close(weldMetal(r), 46.4, 1e-3);
    const c = check(r, 'FILLET_WELD_METAL');
    expect(c.omega).toBe(2.0); // AISC 360-22 Table J2.5 (from memory)
    expect(c.phi).toBeUndefined();
  });

  it('transverse with the increase: 1.5 × 69.6 = 104.4 kip (AISC 360-22 Eq. J2-5, from memory)', () => {
    const r = checkFillet(req({ welds: [line(0.3125, 10, { angle: 90 })] }));
    close(weldMetal(r), 1.5 * 69.6, 1e-3);
    expect(r.values.welds[0]!.kds).toBe(1.5);
  });

  it('transverse with the increase off: 1.0 × 69.6 kip', () => {
    const r = checkFillet(req({ welds: [line(0.3125, 10, { angle: 90 })], directionalIncrease: false }));
    close(weldMetal(r), 69.6, 1e-3);
    expect(r.values.welds[0]!.kds).toBe(1);
  });

  it('45 degrees: kds = 1.2973, 69.6 × 1.2973 = 90.29 kip (hand arithmetic from Eq. J2-5)', () => {
    const r = checkFillet(req({ welds: [line(0.3125, 10, { angle: 45 })] }));
    close(weldMetal(r), 69.6 * 1.2973, 1e-3);
  });

  it('count multiplies identical lines: 2 × 69.6 = 139.2 kip', () => {
    const r = checkFillet(req({ welds: [line(0.3125, 10, { count: 2 })] }));
    close(weldMetal(r), 139.2, 1e-3);
    close(r.values.effectiveLength, 20);
  });

  it('reports the nominal strength: 0.60·70·0.22097·10 = 92.81 kip', () => {
    const r = checkFillet(req());
    close(check(r, 'FILLET_WELD_METAL').nominal, RN_PER_D * 5 * 10, 1e-12);
    close(r.values.weldMetalNominal, 92.808, 1e-4);
  });
});

describe('mixed longitudinal + transverse groups (AISC 360-22 Eq. J2-6a/b, from memory)', () => {
  it('J2-6a governs when the transverse share is small', () => {
    // 5/16 in E70: rn = 9.2808 kip/in nominal. Two 10 in longitudinal, one 4 in transverse:
    // Rnwl = 20·9.2808 = 185.62; Rnwt = 4·9.2808 = 37.12
    // a = 185.62 + 37.12 = 222.74; b = 0.85·185.62 + 1.5·37.12 = 157.77 + 55.69 = 213.46 → a
    // LRFD: 0.75·222.74 = 167.05 kip (= 1.392·5·24 = 167.04)
    const r = checkFillet(req({ welds: [line(0.3125, 10, { count: 2 }), line(0.3125, 4, { angle: 90 })] }));
    expect(r.values.groupRule).toBe('mixed-J2-6a');
    close(check(r, 'FILLET_WELD_METAL').nominal, 222.74, 1e-4);
    close(weldMetal(r), 1.392 * 5 * 24, 1e-3);
    expect(check(r, 'FILLET_WELD_METAL').equation).toBe('Eq. J2-6a');
    expect(warningCodes(r)).not.toContain('DIRECTIONAL_INCREASE_NOT_APPLIED');
  });

  it('J2-6b governs when the transverse share is large', () => {
    // Two 5 in longitudinal, one 5 in transverse: Rnwl = 10·9.2808 = 92.81; Rnwt = 5·9.2808 = 46.40
    // a = 139.21; b = 0.85·92.81 + 1.5·46.40 = 78.89 + 69.61 = 148.50 → b
    // LRFD: 1.392·5·(0.85·10 + 1.5·5) = 6.96·16 = 111.36 kip
    const r = checkFillet(req({ welds: [line(0.3125, 5, { count: 2 }), line(0.3125, 5, { angle: 90 })] }));
    expect(r.values.groupRule).toBe('mixed-J2-6b');
    close(check(r, 'FILLET_WELD_METAL').nominal, 148.5, 1e-4);
    close(weldMetal(r), 111.36, 1e-3);
    expect(check(r, 'FILLET_WELD_METAL').equation).toBe('Eq. J2-6b');
  });

  it('ASD of the J2-6b group: 0.928·5·16 = 74.25 kip', () => {
    const r = checkFillet(req({ method: 'ASD', welds: [line(0.3125, 5, { count: 2 }), line(0.3125, 5, { angle: 90 })] }));
    close(weldMetal(r), 0.928 * 5 * 16, 1e-3);
  });

  it('with the increase off, the lines simply add (no increase, no warning)', () => {
    // 1.392·5·(10 + 5) = 104.4 kip
    const r = checkFillet(req({ directionalIncrease: false, welds: [line(0.3125, 5, { count: 2 }), line(0.3125, 5, { angle: 90 })] }));
    close(weldMetal(r), 104.4, 1e-3);
    expect(warningCodes(r)).not.toContain('DIRECTIONAL_INCREASE_NOT_APPLIED');
  });
});

describe('groups where the directional increase does not apply (AISC 360-22 §J2.4, from memory)', () => {
  it('angles 0 and 45 in one group: no increase, warning', () => {
    // two lines of 10 in, kds = 1 on both: 2·69.6 = 139.2 kip
    const r = checkFillet(req({ welds: [line(0.3125, 10), line(0.3125, 10, { angle: 45 })] }));
    close(weldMetal(r), 139.2, 1e-3);
    expect(r.values.groupRule).toBe('no-increase');
    expect(warningCodes(r)).toContain('DIRECTIONAL_INCREASE_NOT_APPLIED');
    expect(r.values.welds.map((w) => w.kds)).toEqual([1, 1]);
  });

  it('two transverse lines of different sizes: no increase, warning', () => {
    // 1.392·(4·10 + 5·10) = 125.28 kip (1.5 would give 187.9)
    const r = checkFillet(req({ welds: [line(0.25, 10, { angle: 90 }), line(0.3125, 10, { angle: 90 })] }));
    close(weldMetal(r), 1.392 * 90, 1e-3);
    expect(warningCodes(r)).toContain('DIRECTIONAL_INCREASE_NOT_APPLIED');
  });

  it('longitudinal + transverse of different sizes: no J2-6, warning', () => {
    // 1.392·(4·10 + 5·10) = 125.28 kip
    const r = checkFillet(req({ welds: [line(0.25, 10), line(0.3125, 10, { angle: 90 })] }));
    close(weldMetal(r), 125.28, 1e-3);
    expect(r.values.groupRule).toBe('no-increase');
    expect(warningCodes(r)).toContain('DIRECTIONAL_INCREASE_NOT_APPLIED');
  });

  it('a uniform group at one angle is not warned', () => {
    const r = checkFillet(req({ welds: [line(0.3125, 10, { angle: 90, count: 3 })] }));
    expect(warningCodes(r)).not.toContain('DIRECTIONAL_INCREASE_NOT_APPLIED');
  });
});

describe('end-loaded welds (AISC 360-22 §J2.2b, Eq. J2-1, from memory)', () => {
  it('l = 100·w: full length, no warning', () => {
    // 1/4 in, 25 in: 1.392·4·25 = 139.2 kip
    const r = checkFillet(req({ welds: [line(0.25, 25, { endLoaded: true })] }));
    close(weldMetal(r), 139.2, 1e-3);
    expect(warningCodes(r)).not.toContain('END_LOADED_LENGTH_REDUCED');
  });

  it('l = 200·w: beta = 0.80, effective 40 in of 50', () => {
    // 1.392·4·(0.80·50) = 222.72 kip
    const r = checkFillet(req({ welds: [line(0.25, 50, { endLoaded: true })] }));
    close(r.values.welds[0]!.beta, 0.8, 1e-12);
    close(r.values.effectiveLength, 40, 1e-12);
    close(weldMetal(r), 222.72, 1e-3);
    expect(warningCodes(r)).toContain('END_LOADED_LENGTH_REDUCED');
  });

  it('l = 400·w: effective length 180·w = 45 in', () => {
    // 1.392·4·45 = 250.56 kip
    const r = checkFillet(req({ welds: [line(0.25, 100, { endLoaded: true })] }));
    close(r.values.effectiveLength, 45, 1e-12);
    close(weldMetal(r), 250.56, 1e-3);
    expect(warningCodes(r)).toContain('END_LOADED_LENGTH_REDUCED');
  });

  it('the same long weld not end-loaded keeps its full length', () => {
    // 1.392·4·100 = 556.8 kip
    const r = checkFillet(req({ welds: [line(0.25, 100)] }));
    close(weldMetal(r), 556.8, 1e-3);
    expect(warningCodes(r)).not.toContain('END_LOADED_LENGTH_REDUCED');
  });

  it('metric: 6 mm, l = 2400 mm = 400·w → 1080 mm effective', () => {
    // 0.75·0.60·490·(6/√2)·1080 / 1000 = 0.75·294·4.24264·1080/1000 = 1010.3 kN
    const r = checkFillet(req({ units: 'metric', electrode: 'E49', welds: [line(6, 2400, { endLoaded: true })], parts: [part(25, 'S355'), part(25, 'S355')] }));
    close(r.values.effectiveLength, 1080, 1e-12);
    close(weldMetal(r), 0.75 * 294 * (6 / Math.SQRT2) * 1080 / 1000, 1e-9);
  });
});

describe('short welds: l < 4·w uses an effective size of l/4 (AISC 360-22 §J2.2b, from memory)', () => {
  it('1/2 in fillet, 1-1/2 in long: effective size 3/8 in', () => {
    // 1.392 · 6 (sixteenths) · 1.5 in = 12.528 kip
    const r = checkFillet(req({ welds: [line(0.5, 1.5)] }));
    close(r.values.welds[0]!.effectiveSize, 0.375, 1e-12);
    close(weldMetal(r), 12.528, 1e-3);
    expect(warningCodes(r)).toContain('FILLET_SHORT_EFFECTIVE_SIZE');
    const ml = onlyLimit(r, 'FILLET_MIN_LENGTH');
    expect(ml.required).toBe(2);
    expect(ml.pass).toBe(true); // permitted with the reduced size
    expect(ml.note).toBeTruthy();
  });

  it('at exactly 4·w the full size counts and nothing is said', () => {
    // 1.392·8·2 = 22.272 kip
    const r = checkFillet(req({ welds: [line(0.5, 2)] }));
    close(r.values.welds[0]!.effectiveSize, 0.5, 1e-12);
    close(weldMetal(r), 22.272, 1e-3);
    expect(warningCodes(r)).not.toContain('FILLET_SHORT_EFFECTIVE_SIZE');
  });
});

describe('unequal legs: te = a·b / sqrt(a² + b²) (AISC 360-22 §J2.2a, from memory)', () => {
  it('1/4 × 3/8 in E70, 10 in, LRFD', () => {
    // te = 0.09375 / sqrt(0.0625 + 0.140625) = 0.09375 / 0.450694 = 0.208013 in
    // 0.75·0.60·70·0.208013·10 = 65.524 kip
    const r = checkFillet(req({ welds: [{ ...line(0.25, 10), legs: [0.25, 0.375] }] }));
    close(r.values.throat, 0.208013, 1e-5);
    close(weldMetal(r), 65.524, 1e-4);
    // the size for Table J2.4 is the smaller leg
    expect(onlyLimit(r, 'FILLET_MIN_SIZE').provided).toBe(0.25);
  });
});

describe('intermittent fillets (AISC 360-22 §J2.2b, from memory)', () => {
  const seg = (size: number, length: number, segments: number, pitch: number): FilletLine => line(size, length, { intermittent: { segments, pitch } });

  it('strength counts the segments: 4 × 2 in of 1/4 in = 8 in → 1.392·4·8 = 44.54 kip', () => {
    const r = checkFillet(req({ welds: [seg(0.25, 2, 4, 6)] }));
    close(r.values.effectiveLength, 8, 1e-12);
    close(weldMetal(r), 44.544, 1e-3);
    const l = onlyLimit(r, 'FILLET_INTERMITTENT_SEGMENT');
    expect(l.required).toBe(1.5);
    expect(l.pass).toBe(true);
  });

  it('1/4 in: segment of 1-1/2 in passes, 1.49 in fails (1-1/2 in governs over 4w = 1 in)', () => {
    expect(onlyLimit(checkFillet(req({ welds: [seg(0.25, 1.5, 4, 6)] })), 'FILLET_INTERMITTENT_SEGMENT').pass).toBe(true);
    const r = checkFillet(req({ welds: [seg(0.25, 1.49, 4, 6)] }));
    expect(onlyLimit(r, 'FILLET_INTERMITTENT_SEGMENT').pass).toBe(false);
    expect(r.status).toBe('fail');
  });

  it('1/2 in: 4w = 2 in governs; 2 in passes, 1.75 in fails', () => {
    const ok = onlyLimit(checkFillet(req({ welds: [seg(0.5, 2, 3, 6)] })), 'FILLET_INTERMITTENT_SEGMENT');
    expect(ok.required).toBe(2);
    expect(ok.pass).toBe(true);
    expect(onlyLimit(checkFillet(req({ welds: [seg(0.5, 1.75, 3, 6)] })), 'FILLET_INTERMITTENT_SEGMENT').pass).toBe(false);
  });

  it('metric: 6 mm segments need 38 mm; 38 passes, 37 fails', () => {
    const m = (l: number) => checkFillet(req({ units: 'metric', electrode: 'E49', welds: [seg(6, l, 4, 150)], parts: [part(12, 'S355'), part(12, 'S355')] }));
    const ok = onlyLimit(m(38), 'FILLET_INTERMITTENT_SEGMENT');
    expect(ok.required).toBe(38);
    expect(ok.pass).toBe(true);
    expect(onlyLimit(m(37), 'FILLET_INTERMITTENT_SEGMENT').pass).toBe(false);
  });

  it('a pitch shorter than the segment is an EngineError INTERMITTENT_PITCH_TOO_SHORT', () => {
    let caught: unknown;
    try {
      checkFillet(req({ welds: [seg(0.25, 2, 4, 1.5)] }));
    } catch (e) {
      caught = e;
    }
    expect(caught).toBeInstanceOf(EngineError);
    expect((caught as EngineError).code).toBe('INTERMITTENT_PITCH_TOO_SHORT');
    expect((caught as EngineError).pointer).toBe('/welds/0/intermittent/pitch');
  });

  it('a pitch equal to the segment length is accepted', () => {
    expect(() => checkFillet(req({ welds: [seg(0.25, 2, 4, 2)] }))).not.toThrow();
  });

  it('the base metal plane uses the welded length of all segments: 8 in', () => {
    const r = checkFillet(req({ welds: [seg(0.25, 2, 4, 6)] }));
    close(r.values.parts[0]!.planeLength, 8, 1e-12);
  });
});

describe('lap joints and flat bars (AISC 360-22 §J2.2b, from memory)', () => {
  const lapReq = (lap: number, t0 = 0.25) => req({ welds: [line(0.1875, 4, { count: 2 })], parts: [part(t0, 'A36'), part(0.375, 'A36')], lap });

  it('thinner part 1/4 in: lap at least 5·t = 1.25 in', () => {
    const ok = onlyLimit(checkFillet(lapReq(1.25)), 'FILLET_LAP_LENGTH');
    expect(ok.required).toBe(1.25);
    expect(ok.pass).toBe(true);
    const bad = checkFillet(lapReq(1.2));
    expect(onlyLimit(bad, 'FILLET_LAP_LENGTH').pass).toBe(false);
    expect(bad.status).toBe('fail');
  });

  it('thinner part 1/8 in: 1 in governs over 5·t = 0.625 in', () => {
    expect(onlyLimit(checkFillet(lapReq(1, 0.125)), 'FILLET_LAP_LENGTH').required).toBe(1);
    expect(onlyLimit(checkFillet(lapReq(0.99, 0.125)), 'FILLET_LAP_LENGTH').pass).toBe(false);
  });

  it('no lap given: no lap limit', () => {
    expect(limits(checkFillet(req()), 'FILLET_LAP_LENGTH')).toHaveLength(0);
  });

  it('metric: 10 mm part needs a 50 mm lap; 4 mm part needs 25 mm', () => {
    const m = (t: number, lap: number) =>
      checkFillet(req({ units: 'metric', electrode: 'E49', welds: [line(3, 60, { count: 2 })], parts: [part(t, 'S355'), part(12, 'S355')], lap }));
    expect(onlyLimit(m(10, 50), 'FILLET_LAP_LENGTH').required).toBe(50);
    expect(onlyLimit(m(10, 49), 'FILLET_LAP_LENGTH').pass).toBe(false);
    expect(onlyLimit(m(4, 25), 'FILLET_LAP_LENGTH').required).toBe(25);
  });

  it('longitudinal welds alone at the end of a flat bar: each at least the distance between them', () => {
    const bar = (l: number) => req({ welds: [line(0.25, l, { count: 2 })], parts: [part(0.5, 'A36'), part(0.75, 'A36')], flatBarWidth: 4 });
    const ok = onlyLimit(checkFillet(bar(4)), 'FILLET_FLAT_BAR_WELD_LENGTH');
    expect(ok.required).toBe(4);
    expect(ok.pass).toBe(true);
    expect(onlyLimit(checkFillet(bar(3.9)), 'FILLET_FLAT_BAR_WELD_LENGTH').pass).toBe(false);
  });

  it('the flat-bar rule is about the longitudinal lines only', () => {
    const r = checkFillet(req({ welds: [line(0.25, 4, { count: 2 }), line(0.25, 3, { angle: 90 })], parts: [part(0.5, 'A36'), part(0.75, 'A36')], flatBarWidth: 3.5 }));
    const ls = limits(r, 'FILLET_FLAT_BAR_WELD_LENGTH');
    expect(ls).toHaveLength(1);
    expect(ls[0]!.weld).toBe(0);
  });
});

describe('maximum size along an edge (AISC 360-22 §J2.2b, from memory)', () => {
  const edgeReq = (t: number, size: number, builtOut = false) =>
    req({ welds: [line(size, 10, { builtOut })], parts: [part(t, 'A36', { edge: true }), part(1, 'A36')] });

  it('1/2 in edge: 7/16 in passes, 1/2 in fails', () => {
    const ok = onlyLimit(checkFillet(edgeReq(0.5, 0.4375)), 'FILLET_MAX_SIZE_EDGE');
    expect(ok.required).toBe(0.4375);
    expect(ok.pass).toBe(true);
    expect(ok.part).toBe(0);
    expect(onlyLimit(checkFillet(edgeReq(0.5, 0.5)), 'FILLET_MAX_SIZE_EDGE').pass).toBe(false);
  });

  it('1/2 in fillet on a 1/2 in edge built out to full throat passes with a note', () => {
    const l = onlyLimit(checkFillet(edgeReq(0.5, 0.5, true)), 'FILLET_MAX_SIZE_EDGE');
    expect(l.pass).toBe(true);
    expect(l.note).toBeTruthy();
  });

  it('exactly 1/4 in edge: 3/16 in passes, 1/4 in fails; just below 1/4 in: w = t passes', () => {
    expect(onlyLimit(checkFillet(edgeReq(0.25, 0.1875)), 'FILLET_MAX_SIZE_EDGE').pass).toBe(true);
    expect(onlyLimit(checkFillet(edgeReq(0.25, 0.25)), 'FILLET_MAX_SIZE_EDGE').pass).toBe(false);
    expect(onlyLimit(checkFillet(edgeReq(0.1875, 0.1875)), 'FILLET_MAX_SIZE_EDGE').pass).toBe(true);
  });

  it('the rule reads the leg on the edge part', () => {
    // legs [3/16 on the 1/4 in edge part, 5/16 on the other]: 3/16 <= 1/4 - 1/16
    const r = checkFillet(req({ welds: [{ ...line(0.1875, 10), legs: [0.1875, 0.3125] }], parts: [part(0.25, 'A36', { edge: true }), part(1, 'A36')] }));
    const l = onlyLimit(r, 'FILLET_MAX_SIZE_EDGE');
    expect(l.provided).toBe(0.1875);
    expect(l.pass).toBe(true);
  });

  it('no edge part: no edge limit', () => {
    expect(limits(checkFillet(req()), 'FILLET_MAX_SIZE_EDGE')).toHaveLength(0);
  });

  it('metric: 10 mm edge → 8 mm; 5 mm edge → 5 mm', () => {
    const m = (t: number, size: number) =>
      checkFillet(req({ units: 'metric', electrode: 'E49', welds: [line(size, 100)], parts: [part(t, 'S355', { edge: true }), part(20, 'S355')] }));
    expect(onlyLimit(m(10, 8), 'FILLET_MAX_SIZE_EDGE').pass).toBe(true);
    expect(onlyLimit(m(10, 9), 'FILLET_MAX_SIZE_EDGE').pass).toBe(false);
    expect(onlyLimit(m(5, 5), 'FILLET_MAX_SIZE_EDGE').pass).toBe(true);
    expect(onlyLimit(m(6, 5), 'FILLET_MAX_SIZE_EDGE').pass).toBe(false); // 6 mm edge: 6 - 2 = 4 mm
  });
});

describe('base metal (AISC 360-22 §J2.4 with §J4, from memory)', () => {
  it('thin A572-50 part: shear rupture governs over the weld metal', () => {
    // 1/4 in E70 × 10 in: weld 0.75·0.60·70·0.17678·10 = 55.685 kip
    // part 0: 3/16 in A572-50 (Fy 50, Fu 65), plane 10 in, Agv = 1.875 in²
    //   yield   1.00·0.60·50·1.875 = 56.25 kip
    //   rupture 0.75·0.60·65·1.875 = 54.84 kip  ← lowest
    // demand 50 → ratio 50/54.84375 = 0.91168
    const r = checkFillet(req({ welds: [line(0.25, 10)], parts: [part(0.1875, 'A572-50'), part(1, 'A572-50')], demand: 50 }));
    close(check(r, 'BASE_METAL_SHEAR_YIELD', 0).available, 56.25, 1e-9);
    close(check(r, 'BASE_METAL_SHEAR_RUPTURE', 0).available, 54.84375, 1e-9);
    close(weldMetal(r), 55.685, 1e-4);
    expect(r.governing.code).toBe('BASE_METAL_SHEAR_RUPTURE');
    expect(r.governing.part).toBe(0);
    close(r.utilization, 50 / 54.84375, 1e-9);
    expect(warningCodes(r)).toContain('BASE_METAL_GOVERNS');
    expect(r.status).toBe('pass');
  });

  it('the same joint in ASD', () => {
    // rupture 0.60·65·1.875/2.00 = 36.5625; yield 0.60·50·1.875/1.50 = 37.5; weld 0.60·70·1.7678/2 = 37.123
    const r = checkFillet(req({ method: 'ASD', welds: [line(0.25, 10)], parts: [part(0.1875, 'A572-50'), part(1, 'A572-50')], demand: 30 }));
    close(check(r, 'BASE_METAL_SHEAR_RUPTURE', 0).available, 36.5625, 1e-9);
    close(check(r, 'BASE_METAL_SHEAR_YIELD', 0).available, 37.5, 1e-9);
    expect(r.governing.code).toBe('BASE_METAL_SHEAR_RUPTURE');
  });

  it('thin A36 part: shear yield governs (0.60·36 < 0.75·0.60·58)', () => {
    // 5/16 in E70 × 10 in = 69.6 kip; 1/4 in A36: yield 0.60·36·2.5 = 54 kip; rupture 0.45·58·2.5 = 65.25 kip
    const r = checkFillet(req({ parts: [part(0.25, 'A36'), part(1, 'A36')], demand: 50 }));
    close(check(r, 'BASE_METAL_SHEAR_YIELD', 0).available, 54, 1e-9);
    close(check(r, 'BASE_METAL_SHEAR_RUPTURE', 0).available, 65.25, 1e-9);
    expect(r.governing.code).toBe('BASE_METAL_SHEAR_YIELD');
    close(r.utilization, 50 / 54, 1e-9);
    expect(warningCodes(r)).toContain('BASE_METAL_GOVERNS');
  });

  it('thick parts: the weld metal governs and no BASE_METAL_GOVERNS warning', () => {
    const r = checkFillet(req({ demand: 60 }));
    expect(r.governing.code).toBe('FILLET_WELD_METAL');
    expect(warningCodes(r)).not.toContain('BASE_METAL_GOVERNS');
  });

  it('faces = 2 halves the failure plane', () => {
    // two 5/16 in lines of 10 in on either face of a 3/8 in A36 plate
    // faces 1: plane 20 in, Agv = 7.5 in², yield 0.60·36·7.5 = 162 kip
    // faces 2: plane 10 in, Agv = 3.75 in², yield 0.60·36·3.75 = 81 kip, rupture 0.45·58·3.75 = 97.875 kip
    const one = checkFillet(req({ welds: [line(0.3125, 10, { count: 2 })], parts: [part(0.375, 'A36'), part(1, 'A36')] }));
    const two = checkFillet(req({ welds: [line(0.3125, 10, { count: 2 })], parts: [part(0.375, 'A36', { faces: 2 }), part(1, 'A36')] }));
    close(one.values.parts[0]!.planeLength, 20, 1e-12);
    close(two.values.parts[0]!.planeLength, 10, 1e-12);
    close(check(one, 'BASE_METAL_SHEAR_YIELD', 0).available, 162, 1e-9);
    close(check(two, 'BASE_METAL_SHEAR_YIELD', 0).available, 81, 1e-9);
    close(check(two, 'BASE_METAL_SHEAR_RUPTURE', 0).available, 97.875, 1e-9);
  });

  it('tension loading across the weld switches that part to J4.1 checks', () => {
    // transverse 5/16 in × 10 in on a 3/8 in A36 plate pulled across the weld: Ag = 3.75 in²
    // LRFD: yield 0.90·36·3.75 = 121.5 kip; rupture 0.75·58·3.75 = 163.125 kip
    const r = checkFillet(req({ welds: [line(0.3125, 10, { angle: 90 })], parts: [part(0.375, 'A36', { loading: 'tension' }), part(1, 'A36')] }));
    const codes0 = r.checks.filter((c) => c.part === 0).map((c) => c.code);
    expect(codes0).toEqual(['BASE_METAL_TENSION_YIELD', 'BASE_METAL_TENSION_RUPTURE']);
    close(check(r, 'BASE_METAL_TENSION_YIELD', 0).available, 121.5, 1e-9);
    close(check(r, 'BASE_METAL_TENSION_RUPTURE', 0).available, 163.125, 1e-9);
    expect(check(r, 'BASE_METAL_TENSION_YIELD', 0).equation).toBe('Eq. J4-1');
    // part 1 stays in shear
    expect(r.checks.filter((c) => c.part === 1).map((c) => c.code)).toEqual(['BASE_METAL_SHEAR_YIELD', 'BASE_METAL_SHEAR_RUPTURE']);
  });

  it('tension loading in ASD: 36·3.75/1.67 = 80.84 kip; 58·3.75/2.00 = 108.75 kip', () => {
    const r = checkFillet(req({ method: 'ASD', welds: [line(0.3125, 10, { angle: 90 })], parts: [part(0.375, 'A36', { loading: 'tension' }), part(1, 'A36')] }));
    close(check(r, 'BASE_METAL_TENSION_YIELD', 0).available, (36 * 3.75) / 1.67, 1e-9);
    close(check(r, 'BASE_METAL_TENSION_RUPTURE', 0).available, 108.75, 1e-9);
  });

  it('end-loaded reduction does not shorten the base-metal plane', () => {
    // 1/4 in × 50 in end-loaded: weld effective 40 in, plane of the part still 50 in
    const r = checkFillet(req({ welds: [line(0.25, 50, { endLoaded: true })] }));
    close(r.values.parts[0]!.planeLength, 50, 1e-12);
  });
});

describe('checkBaseMetal on its own', () => {
  it('1/2 in A36 plate, two 8 in lines, welds on both faces, LRFD', () => {
    // plane = 16/2 = 8 in, Agv = 4 in²: yield 0.60·36·4 = 86.4 kip; rupture 0.45·58·4 = 104.4 kip
    const r = checkBaseMetal({ method: 'LRFD', units: 'imperial', part: { thickness: 0.5, steel: 'A36', faces: 2, loading: 'shear' }, lines: [{ length: 8, count: 2 }], demand: 80 });
    close(r.values.weldLength, 16, 1e-12);
    close(r.values.area, 4, 1e-12);
    close(check(r, 'BASE_METAL_SHEAR_YIELD').available, 86.4, 1e-9);
    close(check(r, 'BASE_METAL_SHEAR_RUPTURE').available, 104.4, 1e-9);
    expect(r.governing.code).toBe('BASE_METAL_SHEAR_YIELD');
    close(r.utilization, 80 / 86.4, 1e-9);
  });

  it('metric S355, 10 mm, one 200 mm line, ASD, no demand', () => {
    // Agv = 2000 mm²: yield 0.60·355·2000/1.5 = 284 kN; rupture 0.60·510·2000/2.0 = 306 kN
    const r = checkBaseMetal({ method: 'ASD', units: 'metric', part: { thickness: 10, steel: 'S355', faces: 1, loading: 'shear' }, lines: [{ length: 200, count: 1 }], demand: null });
    close(check(r, 'BASE_METAL_SHEAR_YIELD').available, 284, 1e-9);
    close(check(r, 'BASE_METAL_SHEAR_RUPTURE').available, 306, 1e-9);
    expect(r.warnings.map((w) => w.code)).toContain('NO_DEMAND_GIVEN');
    expect(r.utilization).toBe(0);
  });
});

describe('warnings', () => {
  it('FILLET_MULTI_PASS above 5/16 in, not at it (common practice, no source)', () => {
    expect(warningCodes(checkFillet(req({ welds: [line(0.3125, 10)] })))).not.toContain('FILLET_MULTI_PASS');
    expect(warningCodes(checkFillet(req({ welds: [line(0.375, 10)] })))).toContain('FILLET_MULTI_PASS');
  });

  it('FILLET_MULTI_PASS above 8 mm, not at it (common practice, no source)', () => {
    const m = (w: number) => checkFillet(req({ units: 'metric', electrode: 'E49', welds: [line(w, 150)], parts: [part(25, 'S355'), part(25, 'S355')] }));
    expect(warningCodes(m(8))).not.toContain('FILLET_MULTI_PASS');
    expect(warningCodes(m(9))).toContain('FILLET_MULTI_PASS');
  });

  it('FILLET_SIZE_NOT_STANDARD for a leg off the 1/16 in (1 mm) step (common practice, no source)', () => {
    expect(warningCodes(checkFillet(req({ welds: [line(0.3, 10)] })))).toContain('FILLET_SIZE_NOT_STANDARD');
    expect(warningCodes(checkFillet(req({ welds: [line(0.3125, 10)] })))).not.toContain('FILLET_SIZE_NOT_STANDARD');
    const m = (w: number) => checkFillet(req({ units: 'metric', electrode: 'E49', welds: [line(w, 150)], parts: [part(25, 'S355'), part(25, 'S355')] }));
    expect(warningCodes(m(6.5))).toContain('FILLET_SIZE_NOT_STANDARD');
    expect(warningCodes(m(6))).not.toContain('FILLET_SIZE_NOT_STANDARD');
  });

  it('ELECTRODE_UNDERMATCHED: E60 on A572 Grade 65 (Fu 80 ksi) (common practice, no source)', () => {
    const r = checkFillet(req({ electrode: 'E60', parts: [part(1, 'A572-65'), part(1, 'A572-65')] }));
    expect(warningCodes(r)).toContain('ELECTRODE_UNDERMATCHED');
    expect(warningCodes(r)).not.toContain('ELECTRODE_OVERMATCHED');
  });

  it('ELECTRODE_OVERMATCHED: E90 on A36 (Fu 58 ksi) (common practice, no source)', () => {
    const r = checkFillet(req({ electrode: 'E90', parts: [part(1, 'A36'), part(1, 'A36')] }));
    expect(warningCodes(r)).toContain('ELECTRODE_OVERMATCHED');
    expect(warningCodes(r)).not.toContain('ELECTRODE_UNDERMATCHED');
  });

  it('E70 on A36 and on A992 is matching: no electrode warning (common practice, no source)', () => {
    for (const steel of ['A36', 'A992']) {
      const codes = warningCodes(checkFillet(req({ parts: [part(1, steel), part(1, steel)] })));
      expect(codes).not.toContain('ELECTRODE_UNDERMATCHED');
      expect(codes).not.toContain('ELECTRODE_OVERMATCHED');
    }
  });

  it('NO_DEMAND_GIVEN without a demand; utilization 0 and the status from the limits', () => {
    const r = checkFillet(req({ demand: null }));
    expect(warningCodes(r)).toContain('NO_DEMAND_GIVEN');
    expect(r.utilization).toBe(0);
    expect(r.status).toBe('pass');
    // governing is the lowest available strength: the weld metal here
    expect(r.governing.code).toBe('FILLET_WELD_METAL');
    expect(warningCodes(checkFillet(req({ demand: 10 })))).not.toContain('NO_DEMAND_GIVEN');
  });
});

describe('status and utilization', () => {
  it('utilization is the governing ratio: 60 / 69.61 = 0.862', () => {
    const r = checkFillet(req({ demand: 60 }));
    close(r.utilization, 60 / (RN_PER_D * 0.75 * 50), 1e-9);
    expect(r.utilization).toBe(Math.max(...r.checks.map((c) => c.ratio)));
    expect(r.governing.ratio).toBe(r.utilization);
    expect(r.status).toBe('pass');
  });

  it('fails on strength above 69.6 kip', () => {
    const r = checkFillet(req({ demand: 70 }));
    expect(r.status).toBe('fail');
    expect(check(r, 'FILLET_WELD_METAL').pass).toBe(false);
    close(r.utilization, 70 / (RN_PER_D * 0.75 * 50), 1e-9);
  });

  it('fails when a limit fails even though the strength passes', () => {
    // 3/16 in fillet between 1 in parts: Table J2.4 needs 5/16 in (AISC 360-22 Table J2.4, from memory)
    const r = checkFillet(req({ welds: [line(0.1875, 10)], demand: 5 }));
    expect(r.checks.every((c) => c.pass)).toBe(true);
    const l = onlyLimit(r, 'FILLET_MIN_SIZE');
    expect(l.required).toBe(0.3125);
    expect(l.pass).toBe(false);
    expect(r.status).toBe('fail');
  });
});

describe('metric runs (E49, S355) with metric limits (AISC 360-22, metric values from memory)', () => {
  const m = (over: Partial<FilletRequest> = {}) =>
    checkFillet(req({ units: 'metric', electrode: 'E49', welds: [line(8, 100)], parts: [part(20, 'S355'), part(20, 'S355')], ...over }));

  it('8 mm E49 × 100 mm, LRFD: 0.75·0.60·490·5.6569·100 /1000 = 124.73 kN', () => {
    const r = m();
    close(weldMetal(r), (0.75 * 0.6 * 490 * (8 / Math.SQRT2) * 100) / 1000, 1e-9);
    close(weldMetal(r), 124.73, 1e-4);
    close(r.values.fexx, 490, 1e-12);
  });

  it('ASD: 0.60·490·5.6569·100 /2.00 /1000 = 83.15 kN; transverse 1.5 ×', () => {
    close(weldMetal(m({ method: 'ASD' })), 83.1522, 1e-4);
    close(weldMetal(m({ method: 'ASD', welds: [line(8, 100, { angle: 90 })] })), 1.5 * 83.1522, 1e-4);
  });

  it('S355 base metal, 10 mm part: rupture 0.75·0.60·510·10·100 /1000 = 229.5 kN; yield 1.0·0.60·355·1000/1000 = 213 kN', () => {
    const r = m({ welds: [line(5, 100)], parts: [part(10, 'S355'), part(20, 'S355')] });
    close(check(r, 'BASE_METAL_SHEAR_RUPTURE', 0).available, 229.5, 1e-9);
    close(check(r, 'BASE_METAL_SHEAR_YIELD', 0).available, 213, 1e-9);
  });

  it.each([
    [6, 3],
    [10, 5],
    [13, 5],
    [13.5, 6],
    [19, 6],
    [20, 8],
  ])('thinner part %s mm → minimum fillet %s mm (Table J2.4)', (t, w) => {
    const r = m({ welds: [line(w, 100)], parts: [part(t, 'S355'), part(30, 'S355')] });
    const l = onlyLimit(r, 'FILLET_MIN_SIZE');
    expect(l.required).toBe(w);
    expect(l.pass).toBe(true);
  });

  it('5 mm on a 13.5 mm part fails the 6 mm minimum', () => {
    const r = m({ welds: [line(5, 100)], parts: [part(13.5, 'S355'), part(30, 'S355')] });
    expect(onlyLimit(r, 'FILLET_MIN_SIZE').pass).toBe(false);
    expect(r.status).toBe('fail');
  });

  it('minimum length 4·w: 8 mm needs 32 mm', () => {
    expect(onlyLimit(m(), 'FILLET_MIN_LENGTH').required).toBe(32);
  });

  it('E49 on S355 is matching: no electrode warning', () => {
    const codes = warningCodes(m());
    expect(codes).not.toContain('ELECTRODE_UNDERMATCHED');
    expect(codes).not.toContain('ELECTRODE_OVERMATCHED');
  });
});
