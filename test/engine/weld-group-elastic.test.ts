/**
 * Elastic method for weld groups (src/engine/weld-group/elastic.ts).
 *
 * Source: the elastic (vector) method of the AISC Manual Part 8 (from memory): welds as lines,
 * direct stress P/A, torsional stress M·r/Ip, bending stress M·c/I for loads out of the plane,
 * combined vectorially; strength Fnw = 0.60·FEXX on the effective throat (AISC 360-22 Eq. J2-4,
 * from memory). Every expected value is hand arithmetic written beside it.
 */
import { describe, expect, it } from 'vitest';
import { EngineError } from '../../src/engine/errors.js';
import { IMPERIAL } from '../../src/engine/units.js';
import { elasticCapacity } from '../../src/engine/weld-group/elastic.js';
import { groupProperties, shapeSegments, type Segment } from '../../src/engine/weld-group/geometry.js';
import { rel } from '../assert.js';

const W = 0.25;
const TE = W * Math.SQRT1_2;
/** 0.60 × 70 ksi × 0.17678 in = 7.4246 kip/in (Eq. J2-4 per inch of a 1/4 in E70 fillet), the numerator of every capacity below. */
const RN = 0.6 * 70 * TE;

function run(segments: Segment[], f: [number, number, number], arm: [number, number, number]) {
  const props = groupProperties(segments, segments.map(() => TE));
  return elasticCapacity(segments, segments.map(() => TE), props, { f, arm }, 70, IMPERIAL);
}

// two vertical lines 10 in long, 6 in apart: centroid at the middle
const twoLines: Segment[] = [
  { from: [-3, -5], to: [-3, 5] },
  { from: [3, -5], to: [3, 5] },
];

describe('elastic method in the plane', () => {
  it('two parallel lines, vertical load 8 in from the centroid', () => {
    // L = 20 in; Ip = 2·(10³/12 + 10·3²) = 346.67 in³ (per unit throat)
    // per unit load, at (3, ±5): direct (0, -1/20); torsion (M/Ip)·(-y, x) with M = -8:
    //   (-8/346.67)·(-5, 3) = (0.11538, -0.06923); sum (0.11538, -0.11923), |f| = 0.16592 /in
    // Pn = 7.4246 / 0.16592 = 44.748 kip
    const r = run(twoLines, [0, -1, 0], [8, 0, 0]);
    rel(r.capacity, 44.748, 1e-4);
    expect(RN).toBeCloseTo(7.4246, 4);
    expect(r.critical.point[0]).toBe(3);
    expect(Math.abs(r.critical.point[1])).toBe(5);
    expect(r.outOfPlane).toBe(false);
    // with the directional increase it is larger, and at most the corner value:
    // resultant at (3, 5) is 44.06 degrees from the weld axis, kds = 1.2900, 44.748 × 1.2900 = 57.72 kip
    expect(r.capacityDirectional!).toBeGreaterThan(r.capacity);
    expect(r.capacityDirectional!).toBeLessThanOrEqual(57.73);
  });

  it('a concentric load gives the plain strength of the whole length', () => {
    // uniform 1/L: Pn = 7.4246 × 20 = 148.49 kip
    const r = run(twoLines, [0, -1, 0], [0, 0, 0]);
    rel(r.capacity, 148.49, 1e-4);
    // load along both lines: no increase anywhere
    rel(r.capacityDirectional!, 148.49, 1e-4);
  });
});

describe('elastic method out of the plane (shear and bending combined)', () => {
  it('one vertical line, in-plane vertical load at 4 in from the weld plane', () => {
    // direct P/L = 0.1 /in along the line; bending M = 4·P about the line's normal axis,
    // I = 10³/12 = 83.333 in³, c = 5: 4·5/83.333 = 0.24 /in; |f| = sqrt(0.1² + 0.24²) = 0.26 /in
    // Pn = 7.4246 / 0.26 = 28.556 kip
    const line: Segment[] = [{ from: [0, -5], to: [0, 5] }];
    const r = run(line, [0, -1, 0], [0, 0, 4]);
    rel(r.capacity, 28.556, 1e-4);
    expect(r.outOfPlane).toBe(true);
    expect(r.capacityDirectional).toBeNull();
  });

  it('two lines, load normal to the plane 4 in above the centroid', () => {
    // direct 1/20 = 0.05 /in; M = 4·P about x, Iyy = 2·10³/12 = 166.67 in³: 4·5/166.67 = 0.12 /in
    // the two add at y = +5: 0.17 /in; Pn = 7.4246 / 0.17 = 43.674 kip
    const r = run(twoLines, [0, 0, 1], [0, 4, 0]);
    rel(r.capacity, 43.674, 1e-4);
    expect(r.critical.point[1]).toBe(5);
  });

  it('welds on one line cannot resist a moment about that line', () => {
    const line: Segment[] = [{ from: [0, -5], to: [0, 5] }];
    // normal load 2 in beside the line: a moment about the line's own axis
    expect(() => run(line, [0, 0, 1], [2, 0, 0])).toThrow(EngineError);
    try {
      run(line, [0, 0, 1], [2, 0, 0]);
    } catch (err) {
      expect((err as EngineError).code).toBe('WELD_GROUP_MOMENT_UNRESISTED');
    }
    // ... but a normal load on the line itself is fine: bending about the perpendicular axis
    // direct 0.1; M = 3 about x: 3·5/83.333 = 0.18; sum 0.28 /in: Pn = 7.4246/0.28 = 26.516 kip
    rel(run(line, [0, 0, 1], [0, 3, 0]).capacity, 26.516, 1e-4);
  });

  it('a shape rotated by any angle gives the same out-of-plane capacity', () => {
    const a = shapeSegments({ shape: 'C', height: 10, width: 4, rotation: 0, origin: [0, 0] });
    const b = shapeSegments({ shape: 'C', height: 10, width: 4, rotation: 37, origin: [0, 0] });
    const ra = run(a, [0, 0, 1], [2, 1, 0]);
    const c = Math.cos((37 * Math.PI) / 180);
    const s = Math.sin((37 * Math.PI) / 180);
    const rb = run(b, [0, 0, 1], [c * 2 - s * 1, s * 2 + c * 1, 0]);
    rel(rb.capacity, ra.capacity, 1e-9);
  });
});
