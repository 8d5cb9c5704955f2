/**
 * The substituted lines of the sheet against the engine: every check of every family gets
 * lines of its own (not only the general nominal/available/ratio lines), and where a builder
 * works the nominal strength out from the numbers it prints, that number is the engine's.
 * Requests cover each rule a line can take: directional increase, the mixed-group rules,
 * end-loaded and short welds, unequal legs, tension across the weld, deducted, flare and
 * qualified PJP throats, compression not finished to bear, slots, and the weld-group methods.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { OPERATIONS } from '../../src/operations/index.js';
import type { Operation } from '../../src/operations/shared.js';
import { derive, type DerivationContext } from '../../src/report/derivations.js';
import { renderSheet } from '../../src/report/sheet.js';
import type { SheetAnswer } from '../../src/report/sheet-types.js';
import { parseHtml } from './html.js';

const op = (kind: string): Operation => OPERATIONS.find((o) => o.kind === kind)!;

function context(o: Operation, body: Record<string, unknown>): { ctx: DerivationContext; answer: SheetAnswer } {
  const answer = o.run(body as never) as unknown as SheetAnswer;
  return { answer, ctx: { kind: o.kind, body, answer, u: answer.units, metric: answer.units.length === 'mm' } };
}

const P = [{ thickness: 0.75, steel: 'A572-50' }, { thickness: 1, steel: 'A992' }];

const variants: Array<[string, string, Record<string, unknown>]> = [
  ['fillet', 'one transverse line: Eq. J2-5', { method: 'LRFD', electrode: 'E70', welds: [{ size: 0.25, length: 6, angle: 90 }], load: { force: 20 }, parts: P }],
  ['fillet', 'a line at 45 degrees', { method: 'ASD', electrode: 'E70', welds: [{ size: 0.3125, length: 8, angle: 45, count: 2 }], load: { force: 40 }, parts: P }],
  ['fillet', 'mixed group, Eq. J2-6', { method: 'LRFD', electrode: 'E70', welds: [{ size: 0.25, length: 6, count: 2 }, { size: 0.25, length: 4, angle: 90 }], load: { force: 60 }, parts: P }],
  ['fillet', 'end-loaded, l = 160 w', { method: 'LRFD', electrode: 'E70', welds: [{ size: 0.25, length: 40, endLoaded: true, count: 2 }], load: { force: 100 }, parts: P }],
  ['fillet', 'end-loaded, l = 400 w', { method: 'LRFD', electrode: 'E70', welds: [{ size: 0.25, length: 100, endLoaded: true }], load: { force: 100 }, parts: P }],
  ['fillet', 'unequal legs', { method: 'LRFD', electrode: 'E70', welds: [{ legs: ['1/4', '3/8'], length: 10 }], load: { force: 50 }, parts: P }],
  ['fillet', 'short weld, l < 4w', { method: 'LRFD', electrode: 'E70', welds: [{ size: 0.5, length: 1.5 }], load: { force: 10 }, parts: P }],
  ['fillet', 'intermittent, tension across the part', { method: 'ASD', electrode: 'E70', welds: [{ size: 0.25, length: 2, intermittent: { segments: 4, pitch: 6 } }], load: { force: 20 }, parts: [{ thickness: 0.5, steel: 'A36', loading: 'tension' }, { thickness: 0.5, steel: 'A36' }] }],
  ['fillet', 'no directional increase asked', { method: 'LRFD', electrode: 'E70', directionalIncrease: false, welds: [{ size: 0.25, length: 6, angle: 90 }], load: { force: 20 }, parts: P }],
  ['fillet', 'metric, no load', { method: 'LRFD', units: 'metric', electrode: 'E49', welds: [{ size: 8, length: 200, angle: 30 }], parts: [{ thickness: 12, steel: 'S355' }] }],
  ['base-metal', 'tension across the part', { method: 'ASD', part: { thickness: 0.5, steel: 'A36', loading: 'tension' }, lines: [{ length: 8 }], load: { force: 50 } }],
  ['groove-pjp', 'two sides, deducted', { method: 'LRFD', electrode: 'E70', groove: { type: 'bevel-45', depths: [0.5, 0.375], process: 'SMAW', position: 'vertical' }, length: 10, load: { case: 'tension-normal', force: 100 }, parts: P }],
  ['groove-pjp', 'compression not finished to bear: 0.90 FEXX', { method: 'LRFD', electrode: 'E70', groove: { type: 'V-60', depth: 0.5, process: 'GMAW', position: 'flat' }, length: 10, load: { case: 'compression-not-bearing', force: 100 }, parts: P }],
  ['groove-pjp', 'shear, qualified throat', { method: 'ASD', electrode: 'E70', groove: { type: 'bevel-45', depth: 0.5, process: 'SMAW', position: 'overhead', qualifiedThroat: 0.45 }, length: 10, load: { case: 'shear', force: 60 }, parts: P }],
  ['groove-pjp', 'flare V with a radius', { method: 'LRFD', electrode: 'E70', groove: { type: 'flare-V', process: 'FCAW-G', radius: 0.5 }, length: 8, load: { case: 'shear', force: 30 }, parts: [{ thickness: 0.375, steel: 'A36' }, { thickness: 0.375, steel: 'A36' }] }],
  ['groove-pjp', 'parallel load: exempt', { method: 'LRFD', electrode: 'E70', groove: { type: 'J', depth: 0.5, process: 'SAW', position: 'flat' }, length: 10, load: { case: 'parallel', force: 60 }, parts: P }],
  ['groove-cjp', 'shear', { method: 'LRFD', electrode: 'E70', length: 10, load: { case: 'shear', force: 150 }, parts: P }],
  ['plug-slot', 'slots with rounded ends', { method: 'LRFD', electrode: 'E70', hole: { shape: 'slot', length: 3, width: 1, ends: 'rounded', radius: 0.5, count: 2, spacing: 8 }, fill: 0.5, load: { force: 40 }, parts: [{ thickness: 0.5, steel: 'A36', hasHole: true }, { thickness: 0.5, steel: 'A36' }] }],
  ['weld-group', 'elastic method asked', { method: 'LRFD', electrode: 'E70', size: 0.25, shape: 'C', height: 10, width: 4, load: { fx: 8, fy: -20, at: [12, 7] }, analysis: 'elastic', parts: [{ thickness: 0.5, steel: 'A36' }] }],
  ['weld-group', 'load through the centroid: mixed rule', { method: 'LRFD', electrode: 'E70', size: 0.25, shape: 'box', height: 8, width: 6, load: { fx: 0, fy: -50, at: [3, 4] } }],
  ['weld-group', 'load through the centroid of two lines: linear rule', { method: 'ASD', electrode: 'E70', size: 0.25, shape: 'parallel', height: 8, width: 6, load: { fx: 30, fy: 0, at: [3, 4] } }],
  ['weld-group', 'out-of-plane load', { method: 'LRFD', electrode: 'E70', size: 0.3125, shape: 'parallel', height: 10, width: 6, load: { fx: 0, fy: -10, fz: 5, at: [3, 5], standoff: 4 } }],
];

const examples: Array<[string, string, Record<string, unknown>]> = OPERATIONS.flatMap((o) => Object.entries(o.examples).map(([n, ex]) => [o.kind, `example ${n}`, ex.value as unknown as Record<string, unknown>] as [string, string, Record<string, unknown>]));

describe.each([...examples, ...variants])('%s: %s', (kind, _name, body) => {
  it('every applicable check has lines of its own, whose worked-out numbers are the engine\'s', () => {
    const { ctx, answer } = context(op(kind), body);
    for (const c of answer.checks) {
      const d = derive(ctx, c);
      if (c.applicable === false) {
        expect(d).toBeNull();
        continue;
      }
      expect(d, `${c.code} has its own lines`).not.toBeNull();
      expect(d!.steps.length).toBeGreaterThan(0);
      if (d!.nominal !== null) expect(d!.nominal, c.code).toBeCloseTo(c.nominal, Math.max(0, 9 - Math.ceil(Math.log10(Math.abs(c.nominal) + 1))));
      for (const [what, mine, engine] of d!.agreements ?? []) expect(Math.abs(mine - engine), what).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(engine)));
      // each line is a chain of equalities ending in a result
      for (const s of d!.steps) expect(s.tex).toContain('=');
    }
  });

  it('renders as a sheet without parse errors', () => {
    const o = op(kind);
    const { answer } = context(o, body);
    const { errors } = parseHtml(renderSheet({ op: o, answer, body }));
    expect(errors).toEqual([]);
  });
});

describe('random fillet requests', () => {
  it('always give a valid sheet whose fillet lines reproduce the engine (fast-check)', () => {
    const o = op('fillet');
    const line = fc.record({
      size: fc.integer({ min: 2, max: 16 }).map((n) => n / 16),
      length: fc.integer({ min: 1, max: 120 }).map((n) => n / 2),
      angle: fc.constantFrom(0, 30, 45, 60, 90),
      count: fc.integer({ min: 1, max: 3 }),
      endLoaded: fc.boolean(),
    });
    fc.assert(
      fc.property(fc.array(line, { minLength: 1, maxLength: 3 }), fc.constantFrom('LRFD', 'ASD'), fc.integer({ min: 0, max: 400 }), (welds, method, force) => {
        const body = { method, electrode: 'E70', welds, load: { force }, parts: [{ thickness: 0.5, steel: 'A36', faces: 2 }, { thickness: 0.75, steel: 'A992' }] };
        const { ctx, answer } = context(o, body);
        for (const c of answer.checks) {
          const d = derive(ctx, c)!;
          expect(d).not.toBeNull();
          expect(Math.abs(d.nominal! - c.nominal)).toBeLessThanOrEqual(1e-9 * c.nominal);
        }
        expect(parseHtml(renderSheet({ op: o, answer, body })).errors).toEqual([]);
      }),
      { numRuns: 40, seed: 20250314 },
    );
  });
});
