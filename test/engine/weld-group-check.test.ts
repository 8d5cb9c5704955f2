/**
 * The eccentric weld group check as a whole (src/engine/weld-group/check.ts): which rule or
 * method governs, the concentric rules, sizing (the inverse problem), base metal, limits and
 * warnings, and properties over random inputs (fast-check).
 *
 * Sources: AISC 360-22 Eq. J2-4, J2-5, J2-6a/b, §J2.2b, Table J2.4, Table J2.5 and §J4.2 (all from
 * memory); the element law of the AISC Manual Part 8 (from memory). Every expected number is hand
 * arithmetic written beside it; E70, 1/4 in: 0.60 × 70 × 0.7071 × 0.25 = 7.4246 kip/in.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { EngineError } from '../../src/engine/errors.js';
import { KN_PER_KIP, MM_PER_IN, MPA_PER_KSI } from '../../src/engine/units.js';
import { analyseWeldGroup, type WeldGroupRequest } from '../../src/engine/weld-group/check.js';
import type { ShapeName, ShapeSpec } from '../../src/engine/weld-group/geometry.js';
import { rel, codeOf } from '../assert.js';

function req(over: Partial<WeldGroupRequest> = {}): WeldGroupRequest {
  return {
    method: 'LRFD',
    units: 'imperial',
    electrode: 'E70',
    size: 0.25,
    segments: null,
    shape: { shape: 'C', height: 10, width: 4, rotation: 0, origin: [0, 0] },
    load: { direction: [0, -1, 0], magnitude: 30, at: [12, 5], eccentricity: null, standoff: 0 },
    parts: [],
    analysis: 'icr',
    elements: null,
    referenceLength: null,
    estimateError: true,
    ...over,
  };
}
const shape = (name: ShapeName, height: number, width: number, rotation = 0): ShapeSpec => ({ shape: name, height, width, rotation, origin: [0, 0] });
const load = (direction: [number, number, number], magnitude: number, where: { at?: [number, number]; eccentricity?: number; standoff?: number }) => ({
  direction,
  magnitude,
  at: where.at ?? null,
  eccentricity: where.eccentricity ?? null,
  standoff: where.standoff ?? 0,
});

describe('which method governs', () => {
  it('an eccentric in-plane load: the ICR check, with the elastic result beside it', () => {
    const r = analyseWeldGroup(req()).result;
    expect(r.checks[0]!.code).toBe('WELD_GROUP_ICR');
    expect(r.checks[0]!.equation).toBe('Eq. J2-4, J2-5');
    expect(r.values.method).toBe('icr');
    expect(r.values.centre).not.toBeNull();
    expect(r.values.elastic.capacityNominal).toBeGreaterThan(0);
    expect(r.values.icrCapacityNominal).toBe(r.values.capacityNominal);
    // phi = 0.75 (AISC 360-22 Table J2.5)
    expect(r.values.capacityAvailable).toBeCloseTo(0.75 * r.values.capacityNominal, 10);
    expect(r.values.residuals!.relative).toBeLessThan(1e-6);
    // 100 per segment, spread by length: 167 + 67 + 67 after rounding
    expect(Math.abs(r.values.elements - 300)).toBeLessThanOrEqual(3);
  });

  it('analysis = elastic: the elastic check governs, the ICR result is still reported', () => {
    // two vertical lines 10 in long, 6 in apart, vertical load 8 in right of the centroid:
    // Ip = 2·(10³/12 + 10·9) = 346.67; at (3, ±5): |(0.11538, -0.11923)| = 0.16592 /in; 7.4246/0.16592 = 44.748 kip
    const r = analyseWeldGroup(req({ shape: shape('parallel', 10, 6), load: load([0, -1, 0], 30, { at: [11, 5] }), analysis: 'elastic' })).result;
    expect(r.checks[0]!.code).toBe('WELD_GROUP_ELASTIC');
    rel(r.values.capacityNominal, 44.748, 1e-4);
    expect(r.values.icrCapacityNominal!).toBeGreaterThan(44.748);
  });

  it('a load with a normal component: elastic with bending, and a warning', () => {
    // one 10 in line, vertical in-plane load 4 in off the weld plane: |f| = sqrt(0.1² + 0.24²) = 0.26 /in, 28.556 kip
    const r = analyseWeldGroup(req({ shape: shape('line', 10, 0), load: load([0, -1, 0], 10, { at: [0, 5], standoff: 4 }) })).result;
    expect(r.values.method).toBe('elastic-out-of-plane');
    expect(r.checks[0]!.code).toBe('WELD_GROUP_ELASTIC');
    rel(r.values.capacityNominal, 28.556, 1e-4);
    expect(r.warnings.map((w) => w.code)).toContain('WELD_GROUP_OUT_OF_PLANE_ELASTIC');
    expect(r.values.centre).toBeNull();
  });
});

describe('concentric loads follow the Specification, not the element law', () => {
  it('two parallel lines loaded across through the centroid: linear group, kds = 1.5 (Eq. J2-5)', () => {
    // 1.5 × 7.4246 × 20 = 222.74 kip
    const r = analyseWeldGroup(req({ shape: shape('parallel', 10, 5), load: load([1, 0, 0], 50, { eccentricity: 0 }) })).result;
    expect(r.values.method).toBe('concentric-rule');
    expect(r.values.concentricRule).toBe('linear');
    expect(r.checks[0]!.code).toBe('FILLET_WELD_METAL');
    expect(r.checks[0]!.equation).toBe('Eq. J2-4, J2-5');
    rel(r.values.capacityNominal, 222.74, 1e-4);
    expect(r.warnings.map((w) => w.code)).toContain('WELD_GROUP_CONCENTRIC_RULE');
    expect(r.values.centre).toBeNull();
    expect(r.values.icrCapacityNominal).toBeNull();
  });

  it('a C loaded along its back through the centroid: mixed group, Eq. J2-6b', () => {
    // Rnwl = 7.4246 × 10 = 74.246 (back); Rnwt = 7.4246 × 8 = 59.397 (flanges)
    // (a) 133.64; (b) 0.85 × 74.246 + 1.5 × 59.397 = 152.20 kip: (b) governs
    const r = analyseWeldGroup(req({ load: load([0, -1, 0], 50, { at: [16 / 18, 0] }) })).result;
    expect(r.values.concentricRule).toBe('mixed-J2-6b');
    expect(r.checks[0]!.equation).toBe('Eq. J2-6b');
    rel(r.values.capacityNominal, 152.2, 1e-4);
  });

  it('an L loaded at 45 degrees through the centroid: no directional increase', () => {
    // 7.4246 × (10 + 6) = 118.79 kip
    const r = analyseWeldGroup(req({ shape: shape('L', 10, 6), load: load([Math.SQRT1_2, -Math.SQRT1_2, 0], 50, { eccentricity: 0 }) })).result;
    expect(r.values.concentricRule).toBe('no-increase');
    rel(r.values.capacityNominal, 118.79, 1e-4);
    expect(r.warnings.map((w) => w.code)).toContain('DIRECTIONAL_INCREASE_NOT_APPLIED');
  });
});

describe('sizing (the inverse problem)', () => {
  it('the standard size is the smallest 1/16 in step that carries the load', () => {
    const r = analyseWeldGroup(req({ size: null, load: load([0, -1, 0], 45, { at: [12, 5] }) })).result;
    const w = r.values.size;
    expect(r.values.sizing!.standardSize).toBe(w);
    expect(Math.round(w * 16)).toBe(w * 16);
    expect(r.warnings.map((x) => x.code)).toContain('WELD_GROUP_SIZE_CHOSEN');
    expect(r.values.capacityAvailable).toBeGreaterThanOrEqual(45);
    const smaller = analyseWeldGroup(req({ size: w - 1 / 16, load: load([0, -1, 0], 45, { at: [12, 5] }) })).result;
    expect(smaller.values.capacityAvailable).toBeLessThan(45);
  });

  it('the minimum (continuous) size carries exactly the load', () => {
    const r = analyseWeldGroup(req({ load: load([0, -1, 0], 45, { at: [12, 5] }) })).result;
    const wmin = r.values.sizing!.minimumSize;
    const at = analyseWeldGroup(req({ size: wmin, load: load([0, -1, 0], 45, { at: [12, 5] }) })).result;
    rel(at.values.capacityAvailable, 45, 1e-6);
  });

  it('respects the minimum size for the parts (Table J2.4) and reports when nothing fits', () => {
    // a 5 kip load needs a tiny weld, but a 3/4 in part needs at least 1/4 in (t <= 3/4 in row)
    const r = analyseWeldGroup(req({ size: null, load: load([0, -1, 0], 5, { at: [12, 5] }), parts: [{ thickness: 0.75, steel: 'A36', segments: null, edge: false }] })).result;
    expect(r.values.size).toBe(0.25);
    expect(codeOf(() => analyseWeldGroup(req({ size: null, load: load([0, -1, 0], 1e6, { at: [12, 5] }) })))).toBe('WELD_GROUP_SIZE_OUT_OF_RANGE');
    expect(codeOf(() => analyseWeldGroup(req({ size: null, load: load([0, -1, 0], 0, { at: [12, 5] }) })))).toBe('WELD_GROUP_SIZE_OUT_OF_RANGE');
  });
});

describe('base metal along the segments', () => {
  it('concentric two-line case: 0.60·Fy·t and 0.60·Fu·t per inch over the whole length', () => {
    // A36, t = 1/4 in, 20 in of weld: yield 0.6 × 36 × 0.25 × 20 = 108 kip; rupture 0.6 × 58 × 0.25 × 20 = 174 kip (Eq. J4-3, J4-4)
    const r = analyseWeldGroup(req({ shape: shape('parallel', 10, 5), load: load([0, -1, 0], 50, { eccentricity: 0 }), parts: [{ thickness: 0.25, steel: 'A36', segments: null, edge: false }] })).result;
    const y = r.checks.find((c) => c.code === 'BASE_METAL_SHEAR_YIELD')!;
    const u = r.checks.find((c) => c.code === 'BASE_METAL_SHEAR_RUPTURE')!;
    rel(y.nominal, 108, 1e-9);
    rel(u.nominal, 174, 1e-9);
    expect(y.phi).toBe(1);
    expect(u.phi).toBe(0.75);
    // weld: 7.4246 × 20 = 148.49 kip nominal, 111.37 available; base metal yield 108 governs
    expect(r.governing.code).toBe('BASE_METAL_SHEAR_YIELD');
    expect(r.warnings.map((w) => w.code)).toContain('BASE_METAL_GOVERNS');
  });

  it('a thicker part does not govern, and only its segments count', () => {
    const r = analyseWeldGroup(req({ parts: [{ thickness: 1, steel: 'A992', segments: [1], edge: false }] })).result;
    expect(r.governing.code).toBe('WELD_GROUP_ICR');
    expect(r.values.parts[0]!.segments).toEqual([1]);
    expect(r.values.parts[0]!.governingSegment).toBe(1);
  });

  it('a segment index past the group is a 422', () => {
    expect(codeOf(() => analyseWeldGroup(req({ parts: [{ thickness: 1, steel: 'A992', segments: [7], edge: false }] })))).toBe('GEOMETRY_MEANINGLESS');
  });
});

describe('limits and warnings', () => {
  it('a segment shorter than 4w has its size reduced to l/4 and says so', () => {
    // 3/4 in weld: 4w = 3 in > the 2 in flanges; effective size 2/4 = 0.5 in
    const r = analyseWeldGroup(req({ size: 0.75, shape: shape('C', 10, 2) })).result;
    const lim = r.limits.filter((l) => l.code === 'FILLET_MIN_LENGTH');
    expect(lim).toHaveLength(3);
    expect(lim[0]!.note).toMatch(/effective size/);
    expect(r.values.segments[0]!.effectiveSize).toBe(0.5);
    expect(r.warnings.map((w) => w.code)).toEqual(expect.arrayContaining(['FILLET_SHORT_EFFECTIVE_SIZE', 'FILLET_MULTI_PASS']));
  });

  it('minimum size and edge limits with parts', () => {
    // thinner part 5/8 in: minimum 1/4 in (Table J2.4); edge of a 3/8 in part: 3/8 - 1/16 = 5/16 in (§J2.2b)
    const r = analyseWeldGroup(req({ size: 0.375, parts: [{ thickness: 0.625, steel: 'A36', segments: null, edge: false }, { thickness: 0.375, steel: 'A36', segments: null, edge: true }] })).result;
    const min = r.limits.find((l) => l.code === 'FILLET_MIN_SIZE')!;
    expect(min.required).toBe(0.1875); // thinner part is 3/8 in: 3/16 in
    const edge = r.limits.find((l) => l.code === 'FILLET_MAX_SIZE_EDGE')!;
    expect(edge.required).toBeCloseTo(0.3125, 12);
    expect(edge.pass).toBe(false);
    expect(r.status).toBe('fail');
  });

  it('near-concentric loads at small angles to a line: ICR below elastic is reported, not hidden', () => {
    // one line, load 10 degrees off its axis, 0.01 in from the centroid: the element law dips
    // (at theta = 10: p = 0.17/0.09437 = 1.80, f = 0.813, kds = 1.036: 0.84 of the plain strength)
    const a = (80 * Math.PI) / 180;
    const r = analyseWeldGroup(req({ shape: shape('line', 10, 0), load: load([Math.cos(a), Math.sin(a), 0], 10, { eccentricity: 0.01 }) })).result;
    expect(r.values.icrCapacityNominal!).toBeLessThan(r.values.elastic.capacityNominal);
    expect(r.warnings.map((w) => w.code)).toContain('WELD_GROUP_ICR_BELOW_ELASTIC');
  });

  it('errors: no direction, zero length, overlap', () => {
    expect(codeOf(() => analyseWeldGroup(req({ load: load([0, 0, 0], 10, { at: [1, 1] }) })))).toBe('WELD_GROUP_LOAD_WITHOUT_DIRECTION');
    expect(codeOf(() => analyseWeldGroup(req({ shape: null, segments: [{ from: [1, 1], to: [1, 1] }] })))).toBe('WELD_GROUP_GEOMETRY_ZERO_LENGTH');
    expect(codeOf(() => analyseWeldGroup(req({ shape: null, segments: [{ from: [0, 0], to: [0, 5] }, { from: [0, 2], to: [0, 8] }] })))).toBe('WELD_GROUP_GEOMETRY_OVERLAP');
  });

  it('a zero magnitude with a direction reports capacities only', () => {
    const r = analyseWeldGroup(req({ load: load([0, -1, 0], 0, { at: [12, 5] }) })).result;
    expect(r.values.capacityNominal).toBeGreaterThan(0);
    expect(r.warnings.map((w) => w.code)).toContain('NO_DEMAND_GIVEN');
    expect(r.utilization).toBe(0);
  });

  it('reports the discretisation error and the coefficient C', () => {
    const r = analyseWeldGroup(req()).result;
    const d = r.values.discretisation!;
    expect(d.elementsCoarse).toBeLessThan(r.values.elements);
    rel(d.relativeChange, Math.abs(d.capacityCoarse - r.values.capacityNominal) / r.values.capacityNominal, 1e-12);
    expect(d.relativeChange).toBeLessThan(1e-3);
    // C = Pn/(D·l) with D = 4 sixteenths and l = height = 10 in
    rel(r.values.coefficient!.C, r.values.capacityNominal / 40, 1e-12);
    expect(r.values.coefficient!.C1).toBe(1);
  });
});

// ---------------------------------------------------------------- properties

const usualShape = fc.record({
  name: fc.constantFrom<ShapeName>('line', 'parallel', 'C', 'L', 'box'),
  height: fc.double({ min: 3, max: 24, noNaN: true }),
  ratio: fc.double({ min: 0.2, max: 2, noNaN: true }),
  rotation: fc.double({ min: 0, max: 360, noNaN: true }),
});

describe('properties (fast-check)', () => {
  it('ICR capacity >= elastic capacity without directional increase for eccentric loads on the usual shapes (exceptions reported)', () => {
    const exceptions: string[] = [];
    fc.assert(
      fc.property(
        usualShape,
        fc.constantFrom(0, 90, -1),
        fc.double({ min: 0, max: 360, noNaN: true }),
        fc.double({ min: 0.1, max: 3, noNaN: true }),
        fc.boolean(),
        (s, rel0, any, a, flip) => {
          const angle = ((rel0 === -1 ? any : rel0 + 90) + s.rotation) * (Math.PI / 180); // 90: along the unrotated main lines
          const r = analyseWeldGroup(
            req({
              shape: shape(s.name, s.height, s.height * s.ratio, s.rotation),
              load: load([Math.cos(angle), Math.sin(angle), 0], 10, { eccentricity: (flip ? -1 : 1) * a * s.height }),
              elements: 160,
              estimateError: false,
            }),
          ).result;
          const ratio = r.values.icrCapacityNominal! / r.values.elastic.capacityNominal;
          if (ratio < 1) exceptions.push(`${s.name} h=${s.height.toFixed(2)} k=${s.ratio.toFixed(2)} rot=${s.rotation.toFixed(1)} a=${a.toFixed(3)}: ICR/elastic = ${ratio.toFixed(4)}`);
          return true;
        },
      ),
      { numRuns: 150, seed: 20240601 },
    );
    if (exceptions.length) console.info(`ICR below elastic in ${exceptions.length} of 150 cases:\n${exceptions.join('\n')}`);
    // none are expected at these eccentricities (a >= 0.1·l); the list above says which if any
    expect(exceptions).toEqual([]);
  });

  it('near-concentric loads (a < 0.1·l): the exceptions to ICR >= elastic are listed, and none is below the element law\'s deepest dip', () => {
    // The dip: a line translating at theta = 11.36 degrees (where the 0.17·w cap starts):
    // dm = 0.209·13.36^-0.32 = 0.09117, p = 0.17/0.09117 = 1.8647, f = [1.8647·(1.9 - 1.6782)]^0.3 = 0.7673,
    // kds = 1 + 0.5·0.19705^1.5 = 1.0437: ICR/plain = 0.8008 (the smallest over theta from 0 to 90).
    const exceptions: string[] = [];
    let lowest = Number.POSITIVE_INFINITY;
    fc.assert(
      fc.property(usualShape, fc.double({ min: 0, max: 360, noNaN: true }), fc.double({ min: -4, max: -1, noNaN: true }), (s, angleDeg, logA) => {
        const angle = angleDeg * (Math.PI / 180);
        const a = Math.pow(10, logA);
        const r = analyseWeldGroup(
          req({ shape: shape(s.name, s.height, s.height * s.ratio, s.rotation), load: load([Math.cos(angle), Math.sin(angle), 0], 10, { eccentricity: a * s.height }), elements: 160, estimateError: false }),
        ).result;
        const ratio = r.values.icrCapacityNominal! / r.values.elastic.capacityNominal;
        lowest = Math.min(lowest, ratio);
        if (ratio < 1) {
          exceptions.push(`${s.name} k=${s.ratio.toFixed(2)} load ${(angleDeg - s.rotation).toFixed(1)} deg to the unrotated shape, a=${a.toExponential(1)}: ${ratio.toFixed(4)}`);
          expect(r.warnings.map((w) => w.code)).toContain('WELD_GROUP_ICR_BELOW_ELASTIC');
        }
      }),
      { numRuns: 100, seed: 99 },
    );
    if (exceptions.length) console.info(`near-concentric loads, ICR below elastic in ${exceptions.length} of 100 cases:\n${exceptions.join('\n')}`);
    expect(lowest).toBeGreaterThanOrEqual(0.8008 * (1 - 1e-3));
  });

  it('capacity is proportional to the weld size while no segment is shorter than 4w', () => {
    fc.assert(
      fc.property(usualShape, fc.integer({ min: 2, max: 8 }), fc.double({ min: 0.2, max: 2, noNaN: true }), (s, D, a) => {
        fc.pre(s.name === 'line' || s.height * s.ratio >= (4 * D) / 16);
        const base = req({ shape: shape(s.name, s.height, s.height * s.ratio, s.rotation), load: load([0.6, -0.8, 0], 10, { eccentricity: a * s.height }), estimateError: false, elements: 120 });
        const r1 = analyseWeldGroup({ ...base, size: 0.0625 }).result;
        const rD = analyseWeldGroup({ ...base, size: D * 0.0625 }).result;
        rel(rD.values.capacityNominal, D * r1.values.capacityNominal, 1e-8);
      }),
      { numRuns: 30, seed: 7 },
    );
  });

  it('sizing agrees with the forward check: the standard size carries the load and one step smaller does not (short welds included)', () => {
    // The search scales trial capacities with the size where no segment is shorter than 4w
    // (the property above); here each answer is checked by solving again at the sizes themselves.
    fc.assert(
      fc.property(
        usualShape,
        fc.double({ min: 0, max: 2, noNaN: true }),
        fc.constantFrom<[number, number, number]>([0.6, -0.8, 0], [0, -1, 0], [1, 0, 0], [0.3, -0.4, 0.866]),
        fc.double({ min: 2, max: 120, noNaN: true }),
        (s, a, direction, demand) => {
          const base = req({ shape: shape(s.name, s.height, s.height * s.ratio, s.rotation), load: load(direction, demand, { eccentricity: a * s.height }), estimateError: false, elements: 120 });
          let r;
          try {
            r = analyseWeldGroup({ ...base, size: null }).result;
          } catch (err) {
            // nothing fits, or the group cannot carry such a load at any size (the forward check says the same)
            const code = (err as EngineError).code;
            if (code !== 'WELD_GROUP_SIZE_OUT_OF_RANGE') expect(codeOf(() => analyseWeldGroup({ ...base, size: 0.25 }))).toBe(code);
            return;
          }
          const w = r.values.sizing!.standardSize;
          const at = analyseWeldGroup({ ...base, size: w }).result;
          expect(at.values.capacityAvailable).toBeGreaterThanOrEqual(demand * (1 - 1e-9));
          // 1/8 in: Table J2.4's smallest size, where the search starts with no part given
          if (w - 0.0625 >= 0.125 - 1e-12) {
            const below = analyseWeldGroup({ ...base, size: w - 0.0625 }).result;
            expect(below.values.capacityAvailable).toBeLessThan(demand * (1 + 1e-9));
          }
        },
      ),
      { numRuns: 60, seed: 20261202 },
    );
  });

  it('LRFD / ASD available strengths differ by phi·Omega = 1.5 (Table J2.5)', () => {
    const a = analyseWeldGroup(req({ method: 'LRFD' })).result;
    const b = analyseWeldGroup(req({ method: 'ASD' })).result;
    rel(a.values.capacityAvailable / b.values.capacityAvailable, 1.5, 1e-12);
  });

  it('metric and imperial inputs of the same weld group agree', () => {
    fc.assert(
      fc.property(usualShape, fc.double({ min: 0.2, max: 2, noNaN: true }), (s, a) => {
        const imp = analyseWeldGroup(req({ shape: shape(s.name, s.height, s.height * s.ratio, s.rotation), load: load([0.6, -0.8, 0], 10, { eccentricity: a * s.height }), estimateError: false, elements: 120 })).result;
        const met = analyseWeldGroup(
          req({
            units: 'metric',
            electrode: { fexx: 70 * MPA_PER_KSI },
            size: 0.25 * MM_PER_IN,
            shape: { ...shape(s.name, s.height * MM_PER_IN, s.height * s.ratio * MM_PER_IN, s.rotation) },
            load: load([0.6, -0.8, 0], 10 * KN_PER_KIP, { eccentricity: a * s.height * MM_PER_IN }),
            estimateError: false,
            elements: 120,
          }),
        ).result;
        rel(met.values.capacityNominal / KN_PER_KIP, imp.values.capacityNominal, 1e-9);
        rel(met.values.coefficient!.C, imp.values.coefficient!.C, 1e-9);
      }),
      { numRuns: 20, seed: 11 },
    );
  });

  it('any group of up to 50 segments gives a capacity, a centre and residuals, or a 422 code: never another error', () => {
    // coordinates on a 0.1 in grid (so that segments can also touch, cross and overlap), 1 to 50 segments
    const coord = fc.integer({ min: -300, max: 300 }).map((n) => n / 10);
    const point = fc.tuple(coord, coord);
    const segments = fc.integer({ min: 1, max: 50 }).chain((n) => fc.array(fc.record({ from: point, to: point }), { minLength: n, maxLength: n }));
    const eccentricity = fc.oneof(
      fc.constant(0),
      fc.integer({ min: -1000, max: 1000 }).map((n) => n / 10),
      fc.constantFrom(1e-6, -1e-3, 1e4, -1e5),
    );
    fc.assert(
      fc.property(
        segments,
        fc.double({ min: 0, max: 2 * Math.PI, noNaN: true }),
        eccentricity,
        (segments, angle, e) => {
          try {
            const r = analyseWeldGroup(req({ shape: null, segments, load: load([Math.cos(angle), Math.sin(angle), 0], 10, { eccentricity: e }), elements: Math.min(2000, 40 * segments.length), estimateError: false })).result;
            expect(r.values.capacityNominal).toBeGreaterThan(0);
            expect(Number.isFinite(r.values.capacityNominal)).toBe(true);
            if (r.values.method === 'icr') {
              expect(r.values.critical).not.toBeNull();
              expect(r.values.residuals!.relative).toBeLessThan(1e-6);
            }
          } catch (err) {
            if (!(err instanceof EngineError)) throw err;
          }
        },
      ),
      { numRuns: 60, seed: 3 },
    );
  });
});
