/**
 * Properties of checkFillet that must hold for every valid input (fast-check).
 *
 * Sources: AISC 360-22 Eq. J2-4, J2-5 (kds = 1.5 at 90 degrees), Table J2.5 and §J4 for phi and
 * Omega (from memory); conversion factors by definition (1 in = 25.4 mm,
 * 1 kip = 4.4482216152605 kN, 1 ksi = 6.894757293168 MPa).
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { checkFillet, type FilletLine, type FilletPart, type FilletRequest } from '../../src/engine/fillet.js';
import type { Check, EngineResult } from '../../src/engine/result.js';
import { line, part, req } from '../fillet-fixtures.js';

const RUNS = { numRuns: 300 };
const MM = 25.4;
const KN = 4.4482216152605;
const MPA = 6.894757293168;

const weldMetal = (r: EngineResult<unknown>): Check => {
  const c = r.checks.find((x) => x.code === 'FILLET_WELD_METAL');
  if (!c) throw new Error('no weld metal check');
  return c;
};

// ---------- arbitraries (imperial units: in, ksi, kip) ----------

const size = fc.double({ min: 0.125, max: 1, noNaN: true });
const fexx = fc.double({ min: 60, max: 110, noNaN: true });
const angle = fc.double({ min: 0, max: 90, noNaN: true });
const steel = fc
  .record({ fy: fc.double({ min: 30, max: 100, noNaN: true }), ratio: fc.double({ min: 1, max: 1.6, noNaN: true }) })
  .map(({ fy, ratio }) => ({ fy, fu: fy * ratio }));
const thickness = fc.double({ min: 0.125, max: 3, noNaN: true });
const method = fc.constantFrom('LRFD' as const, 'ASD' as const);

/** A valid single-line request, with optional end loading, intermittence, edges and faces. */
const anyRequest = fc
  .record({
    method,
    fexx,
    size,
    ratioLegs: fc.double({ min: 1, max: 1.5, noNaN: true }),
    length: fc.double({ min: 0.1, max: 120, noNaN: true }),
    angle,
    count: fc.integer({ min: 1, max: 4 }),
    endLoaded: fc.boolean(),
    builtOut: fc.boolean(),
    intermittent: fc.option(fc.record({ segments: fc.integer({ min: 1, max: 10 }), extra: fc.double({ min: 0, max: 10, noNaN: true }) }), { nil: null }),
    steel0: steel,
    steel1: steel,
    t0: thickness,
    t1: thickness,
    edge: fc.boolean(),
    faces: fc.constantFrom(1 as const, 2 as const),
    loading: fc.constantFrom('shear' as const, 'tension' as const),
    demand: fc.option(fc.double({ min: 0, max: 2000, noNaN: true }), { nil: null }),
    increase: fc.boolean(),
    second: fc.option(fc.record({ angle: fc.constantFrom(0, 45, 90), length: fc.double({ min: 1, max: 30, noNaN: true }) }), { nil: null }),
  })
  .map((g): FilletRequest => {
    const welds: FilletLine[] = [
      {
        legs: [g.size, g.size * g.ratioLegs],
        length: g.length,
        angle: g.angle,
        count: g.count,
        endLoaded: g.endLoaded,
        builtOut: g.builtOut,
        intermittent: g.intermittent ? { segments: g.intermittent.segments, pitch: g.length + g.intermittent.extra } : null,
      },
    ];
    if (g.second) welds.push(line(g.size, g.second.length, { angle: g.second.angle }));
    return req({
      method: g.method,
      electrode: { fexx: g.fexx },
      welds,
      parts: [part(g.t0, g.steel0, { edge: g.edge, faces: g.faces, loading: g.loading }), part(g.t1, g.steel1)],
      demand: g.demand,
      directionalIncrease: g.increase,
    });
  });

function everyNumber(value: unknown, path: string, visit: (n: number, path: string) => void): void {
  if (typeof value === 'number') visit(value, path);
  else if (Array.isArray(value)) value.forEach((v, i) => everyNumber(v, `${path}/${i}`, visit));
  else if (value !== null && typeof value === 'object') for (const [k, v] of Object.entries(value)) everyNumber(v, `${path}/${k}`, visit);
}

describe('monotonic weld metal strength (AISC 360-22 Eq. J2-4, from memory)', () => {
  it('strictly increases with size (length >= 4·w, not end-loaded)', () => {
    fc.assert(
      fc.property(method, fexx, angle, size, fc.double({ min: 1.001, max: 2, noNaN: true }), fc.double({ min: 0, max: 40, noNaN: true }), (m, f, a, w, k, extra) => {
        const w2 = w * k;
        const l = 4 * w2 + extra;
        const small = weldMetal(checkFillet(req({ method: m, electrode: { fexx: f }, welds: [line(w, l, { angle: a })] }))).available;
        const large = weldMetal(checkFillet(req({ method: m, electrode: { fexx: f }, welds: [line(w2, l, { angle: a })] }))).available;
        expect(large).toBeGreaterThan(small);
      }),
      RUNS,
    );
  });

  it('strictly increases with length (not end-loaded)', () => {
    fc.assert(
      fc.property(method, fexx, angle, size, fc.double({ min: 0.05, max: 100, noNaN: true }), fc.double({ min: 0.01, max: 50, noNaN: true }), (m, f, a, w, l, dl) => {
        const short = weldMetal(checkFillet(req({ method: m, electrode: { fexx: f }, welds: [line(w, l, { angle: a })] }))).available;
        const long = weldMetal(checkFillet(req({ method: m, electrode: { fexx: f }, welds: [line(w, l + dl, { angle: a })] }))).available;
        expect(long).toBeGreaterThan(short);
      }),
      RUNS,
    );
  });
});

describe('LRFD / ASD ratio = phi·Omega (AISC 360-22 Table J2.5 and §J4, from memory)', () => {
  // weld metal 0.75·2.00 = 1.5; shear yield 1.00·1.50 = 1.5; shear rupture 0.75·2.00 = 1.5;
  // tension yield 0.90·1.67 = 1.503; tension rupture 0.75·2.00 = 1.5
  const expected: Record<string, number> = {
    FILLET_WELD_METAL: 1.5,
    BASE_METAL_SHEAR_YIELD: 1.5,
    BASE_METAL_SHEAR_RUPTURE: 1.5,
    BASE_METAL_TENSION_YIELD: 0.9 * 1.67,
    BASE_METAL_TENSION_RUPTURE: 1.5,
  };
  it('holds for every check of any valid joint', () => {
    fc.assert(
      fc.property(anyRequest, (r) => {
        const lrfd = checkFillet({ ...r, method: 'LRFD' });
        const asd = checkFillet({ ...r, method: 'ASD' });
        expect(asd.checks.map((c) => c.code)).toEqual(lrfd.checks.map((c) => c.code));
        lrfd.checks.forEach((c, i) => {
          const a = asd.checks[i]!;
          expect(Math.abs(c.available / a.available - expected[c.code]!)).toBeLessThan(1e-9);
          expect(c.nominal).toBe(a.nominal);
        });
      }),
      RUNS,
    );
  });
});

describe('transverse / longitudinal = 1.5 with the increase (AISC 360-22 Eq. J2-5, from memory)', () => {
  it('holds for any size, length, count and electrode', () => {
    fc.assert(
      fc.property(method, fexx, size, fc.double({ min: 0, max: 60, noNaN: true }), fc.integer({ min: 1, max: 6 }), (m, f, w, extra, n) => {
        const l = 4 * w + extra;
        const long = weldMetal(checkFillet(req({ method: m, electrode: { fexx: f }, welds: [line(w, l, { count: n })] }))).available;
        const trans = weldMetal(checkFillet(req({ method: m, electrode: { fexx: f }, welds: [line(w, l, { count: n, angle: 90 })] }))).available;
        expect(Math.abs(trans / long - 1.5)).toBeLessThan(1e-12);
      }),
      RUNS,
    );
  });
});

describe('metric and imperial inputs of the same physical weld agree', () => {
  it('every available strength within 0.5 % (25.4 mm/in, 4.4482216152605 kN/kip, 6.894757293168 MPa/ksi)', () => {
    fc.assert(
      fc.property(
        fc.record({
          method,
          fexx,
          size: fc.double({ min: 0.13, max: 0.95, noNaN: true }),
          length: fc.double({ min: 0.2, max: 100, noNaN: true }),
          angle,
          count: fc.integer({ min: 1, max: 4 }),
          endLoaded: fc.boolean(),
          steel0: steel,
          steel1: steel,
          t0: fc.double({ min: 0.13, max: 2.9, noNaN: true }),
          t1: fc.double({ min: 0.13, max: 2.9, noNaN: true }),
          faces: fc.constantFrom(1 as const, 2 as const),
          loading: fc.constantFrom('shear' as const, 'tension' as const),
          demand: fc.double({ min: 1, max: 500, noNaN: true }),
          transverse: fc.option(fc.double({ min: 1, max: 20, noNaN: true }), { nil: null }),
        }),
        (g) => {
          const welds = (k: number): FilletLine[] => {
            const ws = [line(g.size * k, g.length * k, { angle: g.transverse === null ? g.angle : 0, count: g.count, endLoaded: g.endLoaded })];
            if (g.transverse !== null) ws.push(line(g.size * k, g.transverse * k, { angle: 90 }));
            return ws;
          };
          const imp = checkFillet(
            req({
              method: g.method,
              electrode: { fexx: g.fexx },
              welds: welds(1),
              parts: [part(g.t0, g.steel0, { faces: g.faces, loading: g.loading }), part(g.t1, g.steel1)],
              demand: g.demand,
            }),
          );
          const met = checkFillet(
            req({
              method: g.method,
              units: 'metric',
              electrode: { fexx: g.fexx * MPA },
              welds: welds(MM),
              parts: [
                part(g.t0 * MM, { fy: g.steel0.fy * MPA, fu: g.steel0.fu * MPA }, { faces: g.faces, loading: g.loading }),
                part(g.t1 * MM, { fy: g.steel1.fy * MPA, fu: g.steel1.fu * MPA }),
              ],
              demand: g.demand * KN,
            }),
          );
          expect(met.checks.map((c) => c.code)).toEqual(imp.checks.map((c) => c.code));
          imp.checks.forEach((c, i) => {
            const m = met.checks[i]!;
            expect(Math.abs(m.available / KN / c.available - 1)).toBeLessThan(0.005);
          });
          expect(Math.abs(met.utilization / imp.utilization - 1)).toBeLessThan(0.005);
          expect(met.values.groupRule).toBe(imp.values.groupRule);
        },
      ),
      RUNS,
    );
  });
});

describe('result consistency for any valid joint', () => {
  it('utilization >= 0, equals the largest ratio with a demand, and the status follows checks and limits', () => {
    fc.assert(
      fc.property(anyRequest, (r) => {
        const res = checkFillet(r);
        expect(res.utilization).toBeGreaterThanOrEqual(0);
        const allPass = res.checks.every((c) => c.pass) && res.limits.every((l) => l.pass);
        expect(res.status).toBe(allPass ? 'pass' : 'fail');
        for (const c of res.checks) expect(c.pass).toBe(c.ratio <= 1 + 1e-9);
        if (r.demand !== null && r.demand > 0) {
          expect(res.utilization).toBe(Math.max(...res.checks.map((c) => c.ratio)));
          expect(res.utilization > 1 + 1e-9).toBe(res.checks.some((c) => !c.pass));
        } else {
          expect(res.utilization).toBe(0);
        }
        expect(res.governing.ratio).toBe(res.utilization);
      }),
      RUNS,
    );
  });

  it('is deterministic: the same input twice gives deep-equal output', () => {
    fc.assert(
      fc.property(anyRequest, (r) => {
        const copy = structuredClone(r);
        expect(checkFillet(copy)).toEqual(checkFillet(r));
        expect(copy).toEqual(r); // and the input is not mutated
      }),
      RUNS,
    );
  });

  it('has no NaN or Infinity anywhere in the result', () => {
    fc.assert(
      fc.property(anyRequest, (r) => {
        everyNumber(checkFillet(r), '', (n, path) => {
          expect(Number.isFinite(n), `non-finite ${n} at ${path}`).toBe(true);
        });
      }),
      RUNS,
    );
  });
});
