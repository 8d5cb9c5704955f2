/**
 * The ICR element law and solver (src/engine/provisions/icr.ts, src/engine/weld-group/icr-solver.ts).
 *
 * Sources: the element law of the AISC Manual Part 8 / AISC 360-22 §J2.4 (from memory):
 * du = 1.087·(theta + 6)^-0.65·w <= 0.17·w, dm = 0.209·(theta + 2)^-0.32·w,
 * f(p) = [p·(1.9 - 0.9·p)]^0.3, R = 0.60·FEXX·Awe·(1 + 0.5·sin^1.5 theta)·f(p); Eq. J2-4 and J2-5
 * (from memory). Expected numbers are hand arithmetic from those expressions, written out beside
 * each assertion; none is computed by the code under test.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { EngineError } from '../../src/engine/errors.js';
import { kds } from '../../src/engine/provisions/fillet.js';
import { DU_CAP_ANGLE, deltaM, deltaMLogSlope, deltaU, deltaUSlope, fOfP, fOfPSlope, kdsOfSin } from '../../src/engine/provisions/icr.js';
import { IMPERIAL } from '../../src/engine/units.js';
import { discretise, elementCounts } from '../../src/engine/weld-group/discretise.js';
import { groupProperties, segmentLength, shapeSegments, type Segment, type ShapeSpec } from '../../src/engine/weld-group/geometry.js';
import { evaluateMotion, solveIcr, type IcrLoad, type IcrOptions } from '../../src/engine/weld-group/icr-solver.js';
import { rel } from '../assert.js';

const W = 0.25; // in
const TE = W * Math.SQRT1_2;
/** 0.60·70 ksi × 0.7071 × 1/4 in = 7.4246 kip/in: the E70 strength per inch of a 1/4 in fillet (Eq. J2-4). */
const RN = 0.6 * 70 * TE;

function meshOf(segments: Segment[], total = 300) {
  const props = groupProperties(segments, segments.map(() => TE));
  const counts = elementCounts(segments.map(segmentLength), total);
  return discretise(segments, segments.map(() => W), segments.map(() => TE), counts, props, 70, IMPERIAL);
}
function shape(spec: Partial<ShapeSpec> & Pick<ShapeSpec, 'shape' | 'height'>): Segment[] {
  return shapeSegments({ width: 0, rotation: 0, origin: [0, 0], ...spec });
}
function solve(segments: Segment[], load: IcrLoad, total = 300, options: IcrOptions = {}) {
  return solveIcr(meshOf(segments, total), load, options);
}

describe('element law (provisions/icr.ts)', () => {
  it('du is capped at 0.17·w below about 11.4 degrees', () => {
    // 1.087·(theta + 6)^-0.65 = 0.17  =>  theta + 6 = (1.087/0.17)^(1/0.65) = 17.3645  =>  theta = 11.3645
    expect(DU_CAP_ANGLE).toBeCloseTo(11.3645, 3);
    expect(deltaU(0, 1)).toBe(0.17); // 1.087·6^-0.65 = 0.339 > 0.17: capped
    expect(deltaU(11, 0.5)).toBe(0.085);
    expect(deltaU(12, 1)).toBeLessThan(0.17);
  });

  it('du and dm at 90 and 45 degrees', () => {
    // 1.087·96^-0.65 = 1.087 × 0.051466 = 0.055944
    expect(deltaU(90, 1)).toBeCloseTo(0.055944, 5);
    // 0.209·92^-0.32 = 0.209 × 0.235282 = 0.049174
    expect(deltaM(90, 1)).toBeCloseTo(0.049174, 5);
    // 1.087·51^-0.65 = 0.084393; 0.209·47^-0.32 = 0.060964
    expect(deltaU(45, 1)).toBeCloseTo(0.084393, 5);
    expect(deltaM(45, 1)).toBeCloseTo(0.060964, 5);
    // linear in w
    expect(deltaU(45, 0.3125)).toBeCloseTo(0.3125 * 0.084393, 6);
    // 0.209·2^-0.32 = 0.209 × 0.80107 = 0.167424
    expect(deltaM(0, 1)).toBeCloseTo(0.167424, 5);
  });

  it('f(p) is 1 at p = 1, peaks at p = 1.9/1.8 and vanishes at p = 0', () => {
    expect(fOfP(1)).toBeCloseTo(1, 14); // [1·(1.9 - 0.9)]^0.3 = 1
    // p = 1.0556: [1.0556·(1.9 - 0.95)]^0.3 = 1.002778^0.3 = 1.000833
    expect(fOfP(1.9 / 1.8)).toBeCloseTo(1.000833, 5);
    expect(fOfP(0)).toBe(0);
    expect(fOfP(-1)).toBe(0);
    expect(fOfP(3)).toBe(0); // past the root of 1.9 - 0.9·p
    expect(fOfP(1.9 / 1.8 + 0.1)).toBeLessThan(fOfP(1.9 / 1.8));
  });

  it('kdsOfSin equals kds of Eq. J2-5 in provisions/fillet.ts at every angle', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 90, noNaN: true }), (theta) => {
        const s = Math.sin((theta * Math.PI) / 180);
        expect(Math.abs(kdsOfSin(s) - kds(theta))).toBeLessThan(1e-14);
      }),
      { numRuns: 300 },
    );
  });

  it('the slopes are the derivatives of the functions (central differences)', () => {
    const h = 1e-6;
    for (const t of [15, 30, 60, 89]) {
      expect(deltaUSlope(t, 1)).toBeCloseTo((deltaU(t + h, 1) - deltaU(t - h, 1)) / (2 * h), 6);
      expect(deltaMLogSlope(t)).toBeCloseTo((Math.log(deltaM(t + h, 1)) - Math.log(deltaM(t - h, 1))) / (2 * h), 6);
    }
    expect(deltaUSlope(5, 1)).toBe(0); // capped region
    for (const p of [0.3, 0.9, 1.2]) expect(fOfPSlope(p)).toBeCloseTo((fOfP(p + h) - fOfP(p - h)) / (2 * h), 6);
  });
});

describe('ICR solver: analytical Jacobian', () => {
  it('matches central differences of the element resultant away from creases', () => {
    const mesh = meshOf(shape({ shape: 'C', height: 10, width: 5 }));
    for (const raw of [
      [0.3, -0.8, 0.5],
      [0.9, 0.1, -0.2],
      [-0.2, 0.4, 0.9],
    ] as const) {
      const n = Math.hypot(...raw);
      const m = raw.map((x) => x / n) as [number, number, number];
      const { J } = evaluateMotion(mesh, m);
      const h = 1e-7;
      for (let c = 0; c < 3; c++) {
        const p = [...m] as [number, number, number];
        const q = [...m] as [number, number, number];
        p[c] = p[c]! + h;
        q[c] = q[c]! - h;
        const gp = evaluateMotion(mesh, p).G;
        const gq = evaluateMotion(mesh, q).G;
        for (let r = 0; r < 3; r++) {
          const fd = (gp[r]! - gq[r]!) / (2 * h);
          expect(Math.abs(J[r * 3 + c]! - fd), `J[${r}][${c}]`).toBeLessThan(1e-5 * (1 + Math.abs(fd)));
        }
      }
    }
  });
});

describe('ICR solver: near-concentric limits (issue: within 0.5 % of the concentric strength)', () => {
  const line = shape({ shape: 'line', height: 10 });
  // concentric strength of the line, Eq. J2-4: 0.60·70·0.17678·10 = 74.246 kip
  const Rn = RN * 10;

  it.each([1e-6, 1e-4, 1e-2])('load along the line at e = %s in: about 1.0 × Rn', (e) => {
    const s = solve(line, { dx: 0, dy: -1, e });
    // all elements at theta ~ 0: p = 0.17/0.16742 = 1.0154, f = 1.0004, kds = 1
    rel(s.capacity, Rn, 0.005);
    expect(s.residual.relative).toBeLessThan(1e-6);
  });

  it.each([1e-6, 1e-4, 1e-2])('load across the line at e = %s in: about 1.5 × Rn', (e) => {
    const s = solve(line, { dx: 1, dy: 0, e });
    // all elements at theta ~ 90: p = 0.055944/0.049174 = 1.1377, f = 0.99901, kds = 1.5: 1.4985·Rn
    rel(s.capacity, 1.5 * Rn, 0.005);
    expect(s.residual.relative).toBeLessThan(1e-6);
  });

  it('at exactly zero eccentricity the answer is a pure translation with the centre at infinity', () => {
    const s = solve(line, { dx: 0, dy: -1, e: 0 });
    expect(s.centre).toBeNull();
    expect(s.critical.radius).toBeNull();
    // 1.000398·Rn: f(1.01539) = [1.01539·0.98615]^0.3 = 1.000398
    rel(s.capacity, 1.000398 * Rn, 1e-6);
  });

  it('a nearly concentric load keeps its accuracy: the centre goes to infinity as e -> 0', () => {
    const a = solve(line, { dx: 1, dy: 0, e: 1e-3 });
    const b = solve(line, { dx: 1, dy: 0, e: 1e-6 });
    expect(b.centreDistance!).toBeGreaterThan(100 * a.centreDistance!);
    rel(b.capacity, 1.4985 * Rn, 1e-3);
  });
});

describe('ICR solver: pure moment on one line (e -> infinity)', () => {
  it('P·e tends to the moment of the element law integrated along the line', () => {
    // Centre at the middle of a 10 in line, every element transverse (theta = 90): du_crit at the
    // ends r = 5 in, p(s) = 1.13768·s/5, R per inch = 1.5·7.4246·f(p).
    // M = 2·∫0..5 R(s)·s ds = 2·25·1.5·7.4246·I with I = ∫0..1 f(1.13768·x)·x dx = 0.47396
    // (midpoint rule with 200 000 steps on the published f(p)), so M = 263.92 kip·in.
    const e = 1e4;
    const s = solve(shape({ shape: 'line', height: 10 }), { dx: 1, dy: 0, e }, 600);
    rel(s.capacity * e, 263.92, 0.005);
    expect(s.centre![1]).toBeCloseTo(5, 2);
  });
});

describe('ICR solver: two parallel lines with no eccentricity (check-values row 19)', () => {
  it.each([0.2, 0.5, 1, 2])('C = Pn/(D·l) = 3.71 for spacing k·l, k = %s', (k) => {
    const l = 10;
    const s = solve(shape({ shape: 'parallel', height: l, width: k * l }), { dx: 0, dy: -1, e: 1e-6 });
    const D = W * 16;
    // AISC Manual Part 8 eccentric weld tables, two parallel lines, a = 0 (from memory): C = 3.71
    rel(s.capacity / (D * l), 3.71, 0.01);
  });
});

describe('ICR solver: equilibrium, symmetry, rotation, discretisation', () => {
  const cShape = shape({ shape: 'C', height: 10, width: 4 });

  it('residuals are below 1e-6 of the load for eccentric loads on the usual shapes', () => {
    for (const name of ['line', 'parallel', 'C', 'L', 'box'] as const) {
      for (const e of [0.5, 3, 12, 60]) {
        const s = solve(shape({ shape: name, height: 8, width: 5 }), { dx: 0.6, dy: -0.8, e });
        expect(s.residual.relative, `${name} e=${e}`).toBeLessThan(1e-6);
        expect(Math.hypot(s.residual.fx, s.residual.fy)).toBeLessThan(1e-6 * s.capacity);
      }
    }
  });

  it('a symmetric group gives the mirrored centre for the mirrored load', () => {
    // C symmetric about y = 5: mirror the load (dx, dy) at height 5 + a to (dx, -dy) at 5 - a
    const props = groupProperties(cShape, cShape.map(() => TE));
    const [cx, cy] = props.centroid;
    const arm = (px: number, py: number, dx: number, dy: number) => (px - cx) * dy - (py - cy) * dx;
    const a = solve(cShape, { dx: 0.6, dy: -0.8, e: arm(12, 7, 0.6, -0.8) });
    const b = solve(cShape, { dx: 0.6, dy: 0.8, e: arm(12, 3, 0.6, 0.8) });
    rel(b.capacity, a.capacity, 1e-9);
    expect(b.centre![0]).toBeCloseTo(a.centre![0], 8);
    expect(b.centre![1]).toBeCloseTo(2 * cy - a.centre![1], 8);
  });

  it('rotating the whole problem leaves the capacity unchanged and rotates the centre', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 360, noNaN: true }), fc.double({ min: 0.3, max: 20, noNaN: true }), (deg, e) => {
        const base = shape({ shape: 'L', height: 8, width: 5 });
        const turned = shape({ shape: 'L', height: 8, width: 5, rotation: deg });
        const a = (deg * Math.PI) / 180;
        const c = Math.cos(a);
        const s = Math.sin(a);
        const r0 = solve(base, { dx: 0.28, dy: -0.96, e }, 200);
        const r1 = solve(turned, { dx: c * 0.28 + s * 0.96, dy: s * 0.28 - c * 0.96, e }, 200);
        rel(r1.capacity, r0.capacity, 1e-7);
        const [x0, y0] = r0.centre!;
        expect(r1.centre![0]).toBeCloseTo(c * x0 - s * y0, 5);
        expect(r1.centre![1]).toBeCloseTo(s * x0 + c * y0, 5);
      }),
      { numRuns: 25 },
    );
  });

  it('converges as the element count doubles (the discretisation error falls at least as 1/n)', () => {
    const load = { dx: 0, dy: -1, e: -9 };
    const counts = [40, 80, 160, 320, 640, 1280];
    const fine = solve(cShape, load, 5120).capacity;
    const errors = counts.map((n) => Math.abs(solve(cShape, load, n).capacity - fine) / fine);
    // first order at worst (end points as critical points make it about second order when smooth)
    counts.forEach((n, i) => expect(errors[i]!, `n = ${n}`).toBeLessThanOrEqual(2 * errors[0]! * (counts[0]! / n) + 1e-12));
    // 300 elements (the default for three segments) are within 0.01 % of the fine answer
    expect(Math.abs(solve(cShape, load, 300).capacity - fine) / fine).toBeLessThan(1e-4);
  });
});

describe('ICR solver: bounds', () => {
  it('stops at its iteration bound with WELD_GROUP_ICR_NOT_CONVERGED, never runs on', () => {
    const run = () => solve(shape({ shape: 'C', height: 10, width: 4 }), { dx: 0, dy: -1, e: -7 }, 300, { maxIterations: 1, tolerance: 1e-16 });
    expect(run).toThrow(EngineError);
    try {
      run();
    } catch (err) {
      expect((err as EngineError).code).toBe('WELD_GROUP_ICR_NOT_CONVERGED');
    }
  });

  it('stops at its work bound', () => {
    const run = () => solve(shape({ shape: 'box', height: 10, width: 4 }), { dx: 0.3, dy: -0.7, e: 5 }, 300, { workBudget: 1000 });
    expect(run).toThrow(/could not be found/);
  });

  it('stops at the caller\'s time bound', () => {
    let t = 0;
    const now = () => (t += 1000); // every reading a second later
    const run = () => solve(shape({ shape: 'box', height: 10, width: 4 }), { dx: 0.3, dy: -0.7, e: 5 }, 300, { now, timeLimitMs: 500 });
    expect(run).toThrow(/could not be found/);
  });
});
