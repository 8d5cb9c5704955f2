/**
 * Unit tables for the pure provision functions (src/engine/provisions/*.ts), sitting on the
 * breakpoints of each table in both unit systems.
 *
 * Sources: AISC 360-22 §J2.2a, §J2.2b, Table J2.4, Table J2.5, Eq. J2-1, J2-4, J2-5, J2-6a/b,
 * §J4 (Eq. J4-1 to J4-4), AISC Manual Part 9 — all from memory; expected values not taken from
 * a table are hand arithmetic from those equations, written out beside the assertion.
 * Metric limits are the Specification's own metric values (not conversions).
 */
import { describe, expect, it } from 'vitest';
import { Fnw, RnMixedGroup, RnWeld, endLoadedLength, kds, shortWeldEffectiveSize, te } from '../../src/engine/provisions/fillet.js';
import { RnShearRupture, RnShearYield, RnTensionRupture, RnTensionYield } from '../../src/engine/provisions/base-metal.js';
import { lMin, lMinIntermittent, lapMin, tMatch, wMaxEdge, wMin } from '../../src/engine/provisions/detailing.js';
import { FACTORS, availableStrength } from '../../src/engine/provisions/resistance.js';
import { IMPERIAL, METRIC } from '../../src/engine/units.js';

/** |actual - expected| <= tol·|expected| (tol relative; default tight, for exact hand arithmetic). */
function close(actual: number, expected: number, tol = 1e-9): void {
  const slack = tol * Math.max(Math.abs(expected), 1e-300);
  expect(actual, `expected ${expected} within ${tol} relative, got ${actual}`).toBeGreaterThanOrEqual(expected - slack);
  expect(actual, `expected ${expected} within ${tol} relative, got ${actual}`).toBeLessThanOrEqual(expected + slack);
}

describe('te — effective throat (AISC 360-22 §J2.2a, from memory)', () => {
  it.each([
    // equal legs: te = w / sqrt(2) = 0.70711·w
    [0.25, 0.25, 0.25 / Math.SQRT2],
    [0.3125, 0.3125, 0.3125 * 0.7071067811865476], // 0.22097 in
    [8, 8, 8 * 0.7071067811865476], // 5.65685 mm
    // unequal legs: a·b / sqrt(a² + b²)
    [3, 4, 12 / 5], // 3-4-5 triangle: 12/5 = 2.4 mm
    [0.25, 0.375, 0.09375 / Math.sqrt(0.0625 + 0.140625)], // 0.208013 in
  ])('legs %s × %s → %s', (a, b, expected) => {
    close(te(a, b), expected);
  });

  it('is symmetric in the legs and 0.707·w to three figures (AISC 360-22 §J2.2a, from memory)', () => {
    expect(te(0.375, 0.25)).toBe(te(0.25, 0.375));
    expect(te(1, 1)).toBeCloseTo(0.707, 3);
  });
});

describe('kds — directional factor (AISC 360-22 Eq. J2-5, from memory)', () => {
  it.each([
    [0, 1.0], // sin 0 = 0
    [30, 1 + 0.5 * Math.pow(0.5, 1.5)], // 1 + 0.5·0.35355 = 1.17678
    [45, 1.2973], // 1 + 0.5·(0.70711)^1.5 = 1 + 0.5·0.59460 = 1.29730
    [60, 1 + 0.5 * Math.pow(Math.sqrt(3) / 2, 1.5)], // 1 + 0.5·0.80593 = 1.40296
    [90, 1.5], // AISC 360-22 Eq. J2-5 (from memory): 1 + 0.5·1
  ])('theta = %s degrees → %s', (theta, expected) => {
    close(kds(theta), expected, theta === 45 ? 5e-5 : 1e-12);
  });

  it('increases from 0 to 90 degrees', () => {
    for (let t = 0; t < 90; t += 5) expect(kds(t + 5)).toBeGreaterThan(kds(t));
  });
});

describe('Fnw — nominal weld metal stress (AISC 360-22 Table J2.5, from memory)', () => {
  it.each([
    [70, 1, 42], // 0.60·70 ksi
    [60, 1, 36], // 0.60·60 ksi
    [70, 1.5, 63], // 0.60·70·1.5 ksi
    [490, 1, 294], // 0.60·490 MPa
    [430, 1.5, 387], // 0.60·430·1.5 MPa
  ])('FEXX %s, kds %s → %s', (FEXX, k, expected) => {
    close(Fnw(FEXX, k), expected);
  });

  it('defaults kds to 1.0', () => {
    close(Fnw(80), 48); // 0.60·80 ksi
  });
});

describe('RnWeld — Eq. J2-4 in both unit systems (AISC 360-22, from memory)', () => {
  it('imperial: ksi × in² = kip', () => {
    // 42 ksi × (0.22097 in × 10 in) = 92.808 kip
    close(RnWeld(42, 0.3125 * Math.SQRT1_2 * 10, IMPERIAL), 92.80776, 1e-6);
  });
  it('metric: MPa × mm² = N, reported in kN', () => {
    // 294 MPa × 1000 mm² = 294 000 N = 294 kN
    close(RnWeld(294, 1000, METRIC), 294);
  });
});

describe('RnMixedGroup — Eq. J2-6a / J2-6b (AISC 360-22, from memory)', () => {
  it('option a governs when Rnwt / Rnwl < 0.3', () => {
    // a = 100 + 20 = 120; b = 0.85·100 + 1.5·20 = 115
    const r = RnMixedGroup(100, 20);
    close(r.Rn, 120);
    expect(r.option).toBe('a');
  });
  it('option b governs when Rnwt / Rnwl > 0.3', () => {
    // a = 100 + 40 = 140; b = 0.85·100 + 1.5·40 = 145
    const r = RnMixedGroup(100, 40);
    close(r.Rn, 145);
    expect(r.option).toBe('b');
  });
  it('both options meet at Rnwt / Rnwl = 0.3', () => {
    // a = 100 + 30 = 130; b = 85 + 45 = 130
    close(RnMixedGroup(100, 30).Rn, 130);
  });
  it('transverse only: b = 1.5·Rnwt; longitudinal only: a = Rnwl', () => {
    close(RnMixedGroup(0, 10).Rn, 15);
    close(RnMixedGroup(10, 0).Rn, 10);
  });
});

describe('endLoadedLength — Eq. J2-1 and the 180·w cap (AISC 360-22 §J2.2b, from memory)', () => {
  // beta = 1.2 - 0.002·(l/w) for 100 < l/w <= 300; 180·w beyond 300·w
  const rows: Array<[string, number, number, number]> = [
    // [label, l/w, expected beta, expected effective length / w]
    ['l = 100·w: full length', 100, 1, 100],
    ['l = 100.5·w: beta = 1.2 - 0.201 = 0.999', 100.5, 0.999, 0.999 * 100.5],
    ['l = 200·w: beta = 1.2 - 0.4 = 0.80', 200, 0.8, 160],
    ['l = 300·w: beta = 1.2 - 0.6 = 0.60, 0.6·300·w = 180·w', 300, 0.6, 180],
    ['l = 301·w: 180·w', 301, 180 / 301, 180],
    ['l = 400·w: 180·w', 400, 180 / 400, 180],
  ];
  it.each(rows)('imperial, w = 1/4 in, %s', (_label, ratio, beta, effOverW) => {
    const w = 0.25;
    const r = endLoadedLength(ratio * w, w);
    close(r.beta, beta, 1e-9);
    close(r.effective, effOverW * w, 1e-9);
  });
  it.each(rows)('metric, w = 6 mm, %s', (_label, ratio, beta, effOverW) => {
    const w = 6;
    const r = endLoadedLength(ratio * w, w);
    close(r.beta, beta, 1e-9);
    close(r.effective, effOverW * w, 1e-9);
  });
  it('short of 100·w the length is not reduced', () => {
    const r = endLoadedLength(10, 0.3125); // l/w = 32
    expect(r.beta).toBe(1);
    expect(r.effective).toBe(10);
  });
});

describe('shortWeldEffectiveSize — l < 4·w uses l/4 (AISC 360-22 §J2.2b, from memory)', () => {
  it.each([
    [0.5, 1.5, 0.375], // 1.5 / 4
    [0.5, 2, 0.5], // l = 4·w exactly: full size
    [0.5, 3, 0.5],
    [8, 20, 5], // metric: 20 / 4 = 5 mm
    [8, 32, 8], // metric: l = 4·w
  ])('w %s, l %s → %s', (w, l, expected) => {
    close(shortWeldEffectiveSize(w, l), expected);
  });
});

describe('J4 base-metal equations in both unit systems (AISC 360-22 §J4, from memory)', () => {
  it('shear yielding Rn = 0.60·Fy·Agv (Eq. J4-3)', () => {
    close(RnShearYield(36, 2.5, IMPERIAL), 54); // 0.6·36·2.5 = 54 kip
    close(RnShearYield(355, 1000, METRIC), 213); // 0.6·355·1000 N = 213 kN
  });
  it('shear rupture Rn = 0.60·Fu·Anv (Eq. J4-4)', () => {
    close(RnShearRupture(58, 2.5, IMPERIAL), 87); // 0.6·58·2.5 = 87 kip
    close(RnShearRupture(510, 1000, METRIC), 306); // 0.6·510·1000 N = 306 kN
  });
  it('tension yielding Rn = Fy·Ag (Eq. J4-1)', () => {
    close(RnTensionYield(36, 2.5, IMPERIAL), 90); // 36·2.5
    close(RnTensionYield(355, 1000, METRIC), 355); // 355·1000 N
  });
  it('tension rupture Rn = Fu·Ae (Eq. J4-2)', () => {
    close(RnTensionRupture(58, 2.5, IMPERIAL), 145); // 58·2.5
    close(RnTensionRupture(510, 1000, METRIC), 510); // 510·1000 N
  });
});

describe('resistance and safety factors (AISC 360-22 Table J2.5 and §J4, from memory)', () => {
  it.each([
    ['weldShear', 0.75, 2.0],
    ['shearYield', 1.0, 1.5],
    ['shearRupture', 0.75, 2.0],
    ['tensionYield', 0.9, 1.67],
    ['tensionRupture', 0.75, 2.0],
  ] as const)('%s: phi = %s, Omega = %s', (name, phi, omega) => {
    expect(FACTORS[name].phi).toBe(phi);
    expect(FACTORS[name].omega).toBe(omega);
  });
  it('LRFD phi·Rn, ASD Rn/Omega (AISC 360-22 §B3.1, from memory)', () => {
    close(availableStrength('LRFD', 100, FACTORS.weldShear), 75);
    close(availableStrength('ASD', 100, FACTORS.weldShear), 50);
    close(availableStrength('ASD', 100, FACTORS.tensionYield), 100 / 1.67);
  });
});

describe('wMin — Table J2.4 (AISC 360-22, from memory)', () => {
  it.each([
    [0.125, 0.125],
    [0.25, 0.125], // exactly 1/4 in: 1/8 in
    [0.25 + 1e-9, 0.1875], // just above 1/4 in: 3/16 in
    [0.2501, 0.1875],
    [0.5, 0.1875], // exactly 1/2 in: 3/16 in
    [0.5 + 1e-9, 0.25],
    [0.5001, 0.25],
    [0.625, 0.25], // 5/8 in: 1/4 in
    [0.75, 0.25], // exactly 3/4 in: 1/4 in
    [0.75 + 1e-9, 0.3125],
    [0.7501, 0.3125],
    [4, 0.3125],
  ])('imperial: thinner part %s in → %s in', (t, w) => {
    expect(wMin(t, 'imperial')).toBe(w);
  });
  it.each([
    [3, 3],
    [6, 3], // exactly 6 mm: 3 mm
    [6 + 1e-9, 5],
    [6.01, 5],
    [10, 5],
    [13, 5], // exactly 13 mm: 5 mm
    [13 + 1e-9, 6],
    [13.5, 6],
    [19, 6], // exactly 19 mm: 6 mm
    [19 + 1e-9, 8],
    [19.01, 8],
    [100, 8],
  ])('metric: thinner part %s mm → %s mm', (t, w) => {
    expect(wMin(t, 'metric')).toBe(w);
  });
});

describe('wMaxEdge — maximum size along an edge (AISC 360-22 §J2.2b, from memory)', () => {
  it.each([
    [0.1875, 0.1875], // under 1/4 in: w <= t
    [0.25 - 1e-9, 0.25 - 1e-9], // just below 1/4 in: still t
    [0.2499, 0.2499],
    [0.25, 0.1875], // exactly 1/4 in: t - 1/16 = 3/16
    [0.5, 0.4375], // 1/2 - 1/16 = 7/16
    [1, 0.9375],
  ])('imperial: edge %s in → %s in', (t, w) => {
    close(wMaxEdge(t, 'imperial'), w, 1e-12);
  });
  it.each([
    [5, 5], // under 6 mm: w <= t
    [6 - 1e-9, 6 - 1e-9],
    [5.9, 5.9],
    [6, 4], // exactly 6 mm: 6 - 2
    [10, 8],
    [20, 18],
  ])('metric: edge %s mm → %s mm', (t, w) => {
    close(wMaxEdge(t, 'metric'), w, 1e-12);
  });
});

describe('lMin and lMinIntermittent (AISC 360-22 §J2.2b, from memory)', () => {
  it('minimum length is 4·w', () => {
    expect(lMin(0.25)).toBe(1); // 4 × 1/4 in
    expect(lMin(8)).toBe(32); // 4 × 8 mm
  });
  it.each([
    [0.25, 1.5], // 4w = 1 in < 1-1/2 in
    [0.3125, 1.5], // 4w = 1.25 in < 1-1/2 in
    [0.375, 1.5], // 4w = 1.5 in: both equal
    [0.4375, 1.75], // 4w = 1.75 in > 1-1/2 in
    [0.5, 2],
  ])('imperial intermittent segment, w = %s in → %s in', (w, l) => {
    close(lMinIntermittent(w, 'imperial'), l, 1e-12);
  });
  it.each([
    [6, 38], // 4w = 24 mm < 38 mm
    [9, 38], // 36 < 38
    [9.5, 38], // 4w = 38 mm: both equal
    [10, 40], // 4w = 40 mm > 38 mm
    [12, 48],
  ])('metric intermittent segment, w = %s mm → %s mm', (w, l) => {
    close(lMinIntermittent(w, 'metric'), l, 1e-12);
  });
});

describe('lapMin — max(5·t, 1 in (25 mm)) (AISC 360-22 §J2.2b, from memory)', () => {
  it.each([
    [0.125, 1], // 5t = 0.625 in < 1 in
    [0.2, 1], // 5t = 1 in: both equal
    [0.25, 1.25], // 5t = 1.25 in
    [0.5, 2.5],
  ])('imperial: thinner part %s in → %s in', (t, lap) => {
    close(lapMin(t, 'imperial'), lap, 1e-12);
  });
  it.each([
    [4, 25], // 5t = 20 mm < 25 mm
    [5, 25], // 5t = 25 mm: both equal
    [6, 30],
    [10, 50],
  ])('metric: thinner part %s mm → %s mm', (t, lap) => {
    close(lapMin(t, 'metric'), lap, 1e-12);
  });
});

describe('tMatch — base metal matching the weld (AISC Manual Part 9, from memory)', () => {
  it('hand arithmetic: faces·FEXX·te/Fu', () => {
    close(tMatch(70, 0.25, 58, 1), (70 * 0.25) / 58); // 0.30172 in
    close(tMatch(70, 0.25, 58, 2), (2 * 70 * 0.25) / 58); // 0.60345 in
    close(tMatch(490, 5.65685, 510, 1), (490 * 5.65685) / 510); // 5.4350 mm
  });
  it('E70, w = D/16 in: 3.09·D/Fu on one face and 6.19·D/Fu on both (AISC Manual Part 9, from memory; 3 significant figures)', () => {
    for (const D of [3, 4, 5, 8]) {
      const throat = te(D / 16, D / 16);
      close(tMatch(70, throat, 58, 1), (3.09 * D) / 58, 2e-3);
      close(tMatch(70, throat, 65, 2), (6.19 * D) / 65, 2e-3);
    }
  });
});
