/**
 * Weld group geometry: shape shortcuts, segment validation, section properties, discretisation.
 * Expected values are hand arithmetic from the definitions (line properties: ∫x² ds of a line of
 * length l about an axis at distance d, l·d² + l·(l·cos a)²/12), common practice, no source.
 */
import { describe, expect, it } from 'vitest';
import { EngineError } from '../../src/engine/errors.js';
import { IMPERIAL } from '../../src/engine/units.js';
import { discretise, elementCounts } from '../../src/engine/weld-group/discretise.js';
import { cosSinDeg, groupProperties, segmentLength, shapeSegments, validateSegments, type Segment } from '../../src/engine/weld-group/geometry.js';
import { codeOf } from '../assert.js';

const at = (i: number) => `/segments/${i}`;

describe('shape shortcuts', () => {
  it('C: back at x = 0, flanges to x = width, open towards +x', () => {
    const s = shapeSegments({ shape: 'C', height: 10, width: 4, rotation: 0, origin: [0, 0] });
    expect(s).toEqual([
      { from: [4, 0], to: [0, 0] },
      { from: [0, 0], to: [0, 10] },
      { from: [0, 10], to: [4, 10] },
    ]);
  });

  it('each shape has its segments and total length', () => {
    const total = (name: 'line' | 'parallel' | 'C' | 'L' | 'box') =>
      shapeSegments({ shape: name, height: 10, width: 4, rotation: 0, origin: [0, 0] }).reduce((a, x) => a + segmentLength(x), 0);
    expect(total('line')).toBe(10);
    expect(total('parallel')).toBe(20);
    expect(total('C')).toBe(18);
    expect(total('L')).toBe(14);
    expect(total('box')).toBe(28);
  });

  it('a rotation of 90 degrees is exact, and the origin moves the shape', () => {
    const s = shapeSegments({ shape: 'L', height: 10, width: 4, rotation: 90, origin: [1, 2] });
    // (0, 10) -> (-10, 0); (4, 0) -> (0, 4); then shifted by (1, 2)
    expect(s).toEqual([
      { from: [-9, 2], to: [1, 2] },
      { from: [1, 2], to: [1, 6] },
    ]);
    expect(cosSinDeg(-270)).toEqual([0, 1]);
    expect(cosSinDeg(180)).toEqual([-1, 0]);
  });
});

describe('segment validation (422 codes)', () => {
  it('a segment without length', () => {
    expect(codeOf(() => validateSegments([{ from: [0, 0], to: [0, 10] }, { from: [2, 2], to: [2, 2] }], at))).toBe('WELD_GROUP_GEOMETRY_ZERO_LENGTH');
    // shorter than the contract's smallest length, 0.001 (in or mm): no weld either
    expect(codeOf(() => validateSegments([{ from: [0, 0], to: [0, 0.0005] }], at))).toBe('WELD_GROUP_GEOMETRY_ZERO_LENGTH');
    expect(codeOf(() => validateSegments([{ from: [0, 0], to: [0, 5e-324] }], at))).toBe('WELD_GROUP_GEOMETRY_ZERO_LENGTH');
    expect(codeOf(() => validateSegments([{ from: [0, 0], to: [0, 0.001] }], at))).toBeUndefined();
  });

  it('collinear segments sharing a length overlap; touching or crossing ones do not', () => {
    expect(codeOf(() => validateSegments([{ from: [0, 0], to: [0, 10] }, { from: [0, 9], to: [0, 12] }], at))).toBe('WELD_GROUP_GEOMETRY_OVERLAP');
    expect(codeOf(() => validateSegments([{ from: [0, 0], to: [0, 10] }, { from: [0, 10], to: [0, 0] }], at))).toBe('WELD_GROUP_GEOMETRY_OVERLAP');
    expect(codeOf(() => validateSegments([{ from: [0, 0], to: [0, 10] }, { from: [0, 10], to: [0, 12] }], at))).toBeUndefined();
    expect(codeOf(() => validateSegments([{ from: [-1, 0], to: [1, 0] }, { from: [0, -1], to: [0, 1] }], at))).toBeUndefined();
    expect(codeOf(() => validateSegments([{ from: [0, 0], to: [0, 10] }, { from: [1, 0], to: [1, 10] }], at))).toBeUndefined();
  });
});

describe('section properties', () => {
  it('C 10 × 4 (per unit throat)', () => {
    const s = shapeSegments({ shape: 'C', height: 10, width: 4, rotation: 0, origin: [0, 0] });
    const p = groupProperties(s, [1, 1, 1]);
    // centroid: x = 2 flanges × 4 × 2 / 18 = 0.8889; y = 5
    expect(p.centroid[0]).toBeCloseTo(16 / 18, 12);
    expect(p.centroid[1]).toBeCloseTo(5, 12);
    // ∫x² = 10·(8/9)² + 2·4·[(10/9)² + 4²/12] = 7.9012 + 20.5432 = 28.4444 (= 256/9)
    expect(p.sxx).toBeCloseTo(256 / 9, 10);
    // ∫y² = 10³/12 + 2·4·5² = 83.333 + 200 = 283.333
    expect(p.syy).toBeCloseTo(850 / 3, 10);
    expect(p.sxy).toBeCloseTo(0, 10);
    expect(p.polar).toBeCloseTo(256 / 9 + 850 / 3, 10);
    expect(p.area).toBe(18);
  });

  it('weights each line by its throat', () => {
    const s: Segment[] = [
      { from: [0, 0], to: [0, 10] },
      { from: [4, 0], to: [4, 10] },
    ];
    // throats 1 and 3: centroid x = (0·10 + 4·30)/40 = 3
    expect(groupProperties(s, [1, 3]).centroid[0]).toBeCloseTo(3, 12);
  });
});

describe('discretisation', () => {
  it('spreads the elements by length, at least 4 per segment', () => {
    expect(elementCounts([10, 4, 4], 180)).toEqual([100, 40, 40]);
    expect(elementCounts([100, 0.1], 50)).toEqual([50, 4]);
  });

  it('places element centres and end points, relative to the centroid', () => {
    const s: Segment[] = [{ from: [0, 0], to: [0, 10] }];
    const props = groupProperties(s, [1]);
    const m = discretise(s, [0.25], [1], [5], props, 70, IMPERIAL);
    expect(m.n).toBe(5);
    expect(m.nodes).toBe(6);
    // centres at y = 1, 3, 5, 7, 9, i.e. -4 ... 4 about the centroid at y = 5
    expect(Array.from(m.y)).toEqual([-4, -2, 0, 2, 4]);
    expect(Array.from(m.ny)).toEqual([-5, -3, -1, 1, 3, 5]);
    // element strength: 0.60 × 70 ksi × throat 1 in × 2 in = 84 kip (Eq. J2-4)
    expect(m.strength[0]).toBeCloseTo(84, 12);
  });
});
