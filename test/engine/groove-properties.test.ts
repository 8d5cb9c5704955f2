/**
 * Properties of the groove weld checks that must hold for every input (fast-check, bounded runs):
 * the effective throat is never negative and never more than the groove depth; capacity never
 * falls as the groove deepens; LRFD and ASD available strengths differ by phi·Omega; metric and
 * imperial inputs of the same physical weld agree; and nothing but an EngineError is thrown.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { checkCjp, checkPjp, type PjpRequest } from '../../src/engine/groove.js';
import { EngineError } from '../../src/engine/errors.js';
import {
  GROOVE_LOAD_CASES,
  GROOVE_TYPES,
  WELD_POSITIONS,
  WELD_PROCESSES,
  teFlare,
  tePjp,
  type GrooveLoadCase,
} from '../../src/engine/provisions/groove.js';
import { KN_PER_KIP, MM_PER_IN, MPA_PER_KSI } from '../../src/engine/units.js';

const RUNS = { numRuns: 200, seed: 20240601 };
const nonFlare = GROOVE_TYPES.filter((g) => !g.startsWith('flare'));
const process = fc.constantFrom(...WELD_PROCESSES);
const position = fc.constantFrom(...WELD_POSITIONS);
const groove = fc.constantFrom(...nonFlare);
const depth = fc.double({ min: 0.01, max: 10, noNaN: true });

function req(S: number, over: Partial<PjpRequest> = {}, g: Partial<PjpRequest['groove']> = {}): PjpRequest {
  return {
    method: 'LRFD',
    units: 'imperial',
    electrode: 'E70',
    groove: { type: 'V-60', process: 'GMAW', position: 'flat', sides: 1, depths: [S], radius: null, qualifiedThroats: null, part: null, ...g },
    length: 10,
    load: { case: 'tension-normal', cyclic: false },
    demand: 10,
    parts: [{ thickness: 12, steel: { fy: 50, fu: 65 } }],
    ...over,
  };
}

describe('effective throat', () => {
  it('is never negative and never more than the groove depth (Table J2.1)', () => {
    fc.assert(
      fc.property(process, position, groove, depth, fc.constantFrom('imperial' as const, 'metric' as const), (p, pos, g, S, sys) => {
        const t = tePjp(S, p, pos, g, sys);
        if (t === undefined) return;
        expect(t).toBeGreaterThanOrEqual(0);
        expect(t).toBeLessThanOrEqual(S);
      }),
      RUNS,
    );
  });

  it('flare throat is non-negative and proportional to R (Table J2.2)', () => {
    fc.assert(
      fc.property(process, fc.constantFrom('flare-bevel' as const, 'flare-V' as const), fc.double({ min: 0.01, max: 100, noNaN: true }), (p, g, R) => {
        const t = teFlare(R, p, g);
        const t2 = teFlare(2 * R, p, g);
        if (t === undefined) return;
        expect(t).toBeGreaterThan(0);
        expect(t2!).toBeCloseTo(2 * t, 9);
      }),
      RUNS,
    );
  });
});

describe('capacity', () => {
  it('does not fall as the groove deepens, for every load case and side', () => {
    fc.assert(
      fc.property(
        fc.constantFrom('SMAW' as const, 'GMAW' as const, 'FCAW' as const),
        position,
        fc.constantFrom('J' as const, 'U' as const, 'V-60' as const, 'bevel-45' as const),
        fc.constantFrom(...GROOVE_LOAD_CASES),
        fc.double({ min: 0.2, max: 5, noNaN: true }),
        fc.double({ min: 0, max: 3, noNaN: true }),
        (p, pos, g, lc, S1, extra) => {
          const S2 = S1 + extra;
          const a = checkPjp(req(S1, { load: { case: lc, cyclic: false } }, { process: p, position: pos, type: g }));
          const b = checkPjp(req(S2, { load: { case: lc, cyclic: false } }, { process: p, position: pos, type: g }));
          expect(b.values.throat).toBeGreaterThanOrEqual(a.values.throat);
          // the governing available strength (a lower bound of the joint) never falls
          expect(b.governing.available).toBeGreaterThanOrEqual(a.governing.available - 1e-9);
          b.checks.forEach((c, i) => expect(c.available).toBeGreaterThanOrEqual(a.checks[i]!.available - 1e-9));
        },
      ),
      RUNS,
    );
  });

  it('LRFD / ASD available strength = phi·Omega for each check (1.504 for 0.80/1.88, 1.5 for 0.75/2.00, 1.503 for 0.90/1.67)', () => {
    fc.assert(
      fc.property(fc.constantFrom(...GROOVE_LOAD_CASES), depth, (lc: GrooveLoadCase, S) => {
        const l = checkPjp(req(S + 0.2, { load: { case: lc, cyclic: false } }));
        const a = checkPjp(req(S + 0.2, { method: 'ASD', load: { case: lc, cyclic: false } }));
        l.checks.forEach((c, i) => {
          if (c.applicable === false) return;
          const asd = a.checks[i]!;
          expect(c.available / asd.available).toBeCloseTo(c.phi! * asd.omega!, 9);
        });
      }),
      RUNS,
    );
  });

  it('metric and imperial inputs of the same weld agree (rows with no deduction)', () => {
    fc.assert(
      fc.property(
        fc.constantFrom('J' as const, 'U' as const, 'V-60' as const),
        fc.constantFrom(...GROOVE_LOAD_CASES),
        fc.double({ min: 0.2, max: 2, noNaN: true }),
        fc.double({ min: 1, max: 40, noNaN: true }),
        (g, lc, S, L) => {
          const imp = checkPjp(req(S, { length: L, load: { case: lc, cyclic: false }, electrode: { fexx: 70 }, parts: [{ thickness: 12, steel: { fy: 50, fu: 65 } }] }, { type: g }));
          const met = checkPjp(
            req(S * MM_PER_IN, {
              units: 'metric',
              length: L * MM_PER_IN,
              load: { case: lc, cyclic: false },
              demand: 10 * KN_PER_KIP,
              electrode: { fexx: 70 * MPA_PER_KSI },
              parts: [{ thickness: 12 * MM_PER_IN, steel: { fy: 50 * MPA_PER_KSI, fu: 65 * MPA_PER_KSI } }],
            }, { type: g }),
          );
          imp.checks.forEach((c, i) => {
            expect(met.checks[i]!.code).toBe(c.code);
            expect(met.checks[i]!.available / KN_PER_KIP).toBeCloseTo(c.available, 6);
          });
          expect(met.utilization).toBeCloseTo(imp.utilization, 9);
        },
      ),
      RUNS,
    );
  });
});

describe('robustness', () => {
  it('any well-typed PJP or CJP request answers or throws an EngineError, never anything else', () => {
    const steel = fc.oneof(fc.constantFrom('A36', 'A992', 'A572-50', 'S355', 'A514'), fc.record({ fy: fc.double({ min: 1, max: 1000, noNaN: true }), fu: fc.double({ min: 1, max: 1000, noNaN: true }) }));
    const part = fc.record({ thickness: fc.double({ min: 1e-3, max: 1e4, noNaN: true }), steel, hss: fc.boolean() });
    fc.assert(
      fc.property(
        fc.record({
          method: fc.constantFrom('LRFD' as const, 'ASD' as const),
          units: fc.constantFrom('imperial' as const, 'metric' as const),
          type: fc.constantFrom(...GROOVE_TYPES),
          process,
          position: fc.option(position, { nil: null }),
          sides: fc.constantFrom(1 as const, 2 as const),
          d: fc.double({ min: 1e-3, max: 1e4, noNaN: true }),
          radius: fc.option(fc.double({ min: 1e-3, max: 1e4, noNaN: true }), { nil: null }),
          q: fc.option(fc.double({ min: 1e-3, max: 100, noNaN: true }), { nil: null }),
          L: fc.double({ min: 1e-3, max: 1e6, noNaN: true }),
          lc: fc.constantFrom(...GROOVE_LOAD_CASES),
          demand: fc.option(fc.double({ min: 0, max: 1e9, noNaN: true }), { nil: null }),
          parts: fc.array(part, { minLength: 1, maxLength: 2 }),
          cyclic: fc.boolean(),
        }),
        (x) => {
          const flare = x.type.startsWith('flare');
          const run = [
            () =>
              checkPjp({
                method: x.method,
                units: x.units,
                electrode: x.units === 'metric' ? 'E49' : 'E70',
                groove: {
                  type: x.type,
                  process: x.process,
                  position: x.position,
                  sides: x.sides,
                  depths: flare ? null : Array(x.sides).fill(x.d),
                  radius: flare ? x.radius : null,
                  qualifiedThroats: x.q === null ? null : Array(x.sides).fill(x.q),
                  part: null,
                },
                length: x.L,
                load: { case: x.lc, cyclic: x.cyclic },
                demand: x.demand,
                parts: x.parts,
              }),
            () =>
              checkCjp({ method: x.method, units: x.units, electrode: 'E70', length: x.L, load: { case: x.lc }, demand: x.demand, parts: x.parts, joint: 'T', backingLeftInPlace: x.cyclic }),
          ];
          for (const f of run) {
            try {
              const r = f();
              expect(Number.isFinite(r.utilization)).toBe(true);
              for (const c of r.checks) expect(Number.isFinite(c.available) && Number.isFinite(c.ratio)).toBe(true);
            } catch (e) {
              expect(e).toBeInstanceOf(EngineError);
            }
          }
        },
      ),
      { numRuns: 300, seed: 7 },
    );
  });
});
