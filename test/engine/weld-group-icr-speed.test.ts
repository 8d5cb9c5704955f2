/**
 * Helpers of the ICR solver's fast path (src/engine/weld-group/powers.ts, coarsen() in
 * src/engine/weld-group/discretise.ts).
 *
 * The powers and the angle are held against the library functions they replace (Math.pow,
 * Math.atan2), which the helpers do not use: agreement to a few units in the last place. The
 * coarse mesh is held against the fine mesh it is made from: same welds, same total strength.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { IMPERIAL } from '../../src/engine/units.js';
import { coarsen, discretise, elementCounts } from '../../src/engine/weld-group/discretise.js';
import { groupProperties, segmentLength, shapeSegments, type Segment } from '../../src/engine/weld-group/geometry.js';
import { angleOf, power03, thetaPower } from '../../src/engine/weld-group/powers.js';

/** |a - b| in units of the last place of b (relative 2^-52). */
const ulps = (a: number, b: number): number => Math.abs(a - b) / (Math.abs(b) * 2 ** -52);

describe('powers of the element law', () => {
  it('(theta + 2)^0.32 within 4 units in the last place of Math.pow over 0 to 90 degrees', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 90, noNaN: true }), (th) => {
        expect(ulps(thetaPower(th), Math.pow(th + 2, 0.32))).toBeLessThanOrEqual(4);
      }),
      { numRuns: 2000 },
    );
    // grid points, half-way points and the ends: 2^0.32 = 1.24833, 92^0.32 = 4.25020
    for (const th of [0, 1 / 128, 1 / 64, 0.5, 11.3645, 45, 89.99, 90]) expect(ulps(thetaPower(th), Math.pow(th + 2, 0.32))).toBeLessThanOrEqual(4);
    expect(thetaPower(0)).toBeCloseTo(1.24833, 5);
    expect(thetaPower(90)).toBeCloseTo(4.2502, 4);
  });

  it('g^0.3 within 4 units in the last place of Math.pow, tiny g and g near 1 included', () => {
    // in the table's range, 2^-29 <= g < 2 (g = p·(1.9 - 0.9·p) is at most 1.9²/3.6 = 1.0028)
    fc.assert(
      fc.property(fc.double({ min: 2 ** -29, max: 1.9 / 1.8 * (1.9 - 0.9 * (1.9 / 1.8)), noNaN: true }), (g) => {
        expect(ulps(power03(g), Math.pow(g, 0.3))).toBeLessThanOrEqual(4);
      }),
      { numRuns: 2000 },
    );
    for (const g of [2 ** -29, 1e-6, 0.25, 0.5, 0.5 - 1e-16, 1, 1 - 1e-16, 1.0027, 1.999]) {
      expect(ulps(power03(g), Math.pow(g, 0.3)), `g = ${g}`).toBeLessThanOrEqual(4);
    }
    // outside it, exp(0.3·ln g), itself within a few units of Math.pow
    for (const g of [1e-300, 1e-14, 2 ** -29 * 0.999, 2, 5]) expect(ulps(power03(g), Math.pow(g, 0.3)), `g = ${g}`).toBeLessThanOrEqual(8);
    expect(power03(1)).toBe(1);
  });

  it('the angle from sine and cosine within 2 units in the last place of π/2 of Math.atan2', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: Math.PI / 2, noNaN: true }), fc.double({ min: 1e-6, max: 1e3, noNaN: true }), (a, r) => {
        const c = Math.abs(r * Math.sin(a));
        const d = Math.abs(r * Math.cos(a));
        const rho = Math.sqrt(c * c + d * d);
        const got = angleOf(c / rho, d / rho);
        expect(Math.abs(got - Math.atan2(c, d)) / ((Math.PI / 2) * 2 ** -52)).toBeLessThanOrEqual(2);
      }),
      { numRuns: 2000 },
    );
    expect(angleOf(0, 1)).toBe(0);
    expect(angleOf(1, 0)).toBe(Math.PI / 2);
    expect(angleOf(Math.SQRT1_2, Math.SQRT1_2)).toBeCloseTo(Math.PI / 4, 15);
  });
});

describe('coarse mesh for the solver start', () => {
  const W = 0.25;
  const TE = W * Math.SQRT1_2;
  const meshOf = (segments: Segment[], counts: number[]) => {
    const props = groupProperties(segments, segments.map(() => TE));
    return discretise(segments, segments.map(() => W), segments.map(() => TE), counts, props, 70, IMPERIAL);
  };
  const sum = (a: Float64Array) => a.reduce((s, x) => s + x, 0);

  it('keeps the welds: lengths, strengths, first moments, segment ends and at least 4 elements a segment', () => {
    const segments = [...shapeSegments({ shape: 'C', height: 10, width: 4, rotation: 30, origin: [1, 2] }), { from: [6, -3], to: [7, -1] } as Segment];
    const fine = meshOf(segments, elementCounts(segments.map(segmentLength), 600));
    for (const factor of [2, 8, 25, 1000]) {
      const coarse = coarsen(fine, factor);
      expect(coarse.n).toBeLessThanOrEqual(fine.n);
      expect(coarse.nodes).toBe(coarse.n + segments.length);
      expect(Math.abs(sum(coarse.len) - sum(fine.len))).toBeLessThan(1e-12 * sum(fine.len));
      expect(Math.abs(sum(coarse.strength) - sum(fine.strength))).toBeLessThan(1e-12 * sum(fine.strength));
      // first moments of length about the centroid: zero on both (the centroid is shared)
      let mx = 0;
      let my = 0;
      for (let i = 0; i < coarse.n; i++) {
        mx += coarse.len[i]! * coarse.x[i]!;
        my += coarse.len[i]! * coarse.y[i]!;
      }
      expect(Math.abs(mx) + Math.abs(my)).toBeLessThan(1e-9 * sum(fine.len));
      for (let j = 0; j < segments.length; j++) {
        const count = coarse.segStart[j + 1]! - coarse.segStart[j]!;
        expect(count).toBeGreaterThanOrEqual(Math.min(4, fine.segStart[j + 1]! - fine.segStart[j]!));
        // the segment's end points are nodes of both meshes
        const c0 = coarse.segStart[j]! + j;
        const f0 = fine.segStart[j]! + j;
        const fLast = fine.segStart[j + 1]! + j;
        expect([coarse.nx[c0], coarse.ny[c0]]).toEqual([fine.nx[f0], fine.ny[f0]]);
        expect([coarse.nx[c0 + count], coarse.ny[c0 + count]]).toEqual([fine.nx[fLast], fine.ny[fLast]]);
        // every element on its segment's line, between its end nodes
        for (let i = coarse.segStart[j]!; i < coarse.segStart[j + 1]!; i++) {
          const k = i + j;
          const ax = coarse.nx[k + 1]! - coarse.nx[k]!;
          const ay = coarse.ny[k + 1]! - coarse.ny[k]!;
          const t = ((coarse.x[i]! - coarse.nx[k]!) * ax + (coarse.y[i]! - coarse.ny[k]!) * ay) / (ax * ax + ay * ay);
          expect(t).toBeCloseTo(0.5, 9);
          expect(Math.abs((coarse.x[i]! - coarse.nx[k]!) * ay - (coarse.y[i]! - coarse.ny[k]!) * ax)).toBeLessThan(1e-9);
          expect(coarse.seg[i]).toBe(j);
        }
      }
    }
  });
});
