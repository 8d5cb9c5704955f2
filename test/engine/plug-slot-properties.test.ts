/**
 * Properties of the plug and slot weld check that must hold for every valid input (fast-check).
 *
 * Sources: AISC 360-22 §J2.3 and Table J2.5 (weld metal 0.60·FEXX, phi 0.75, Omega 2.00) and
 * §J4.2 (shear yielding phi 1.00, Omega 1.50; shear rupture phi 0.75, Omega 2.00), from memory;
 * conversion factors by definition (1 in = 25.4 mm, 1 kip = 4.4482216152605 kN,
 * 1 ksi = 6.894757293168 MPa).
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { checkPlugSlot, type HolePattern, type PlugSlotRequest } from '../../src/engine/plug-slot.js';
import { dMinPlug, fillMin } from '../../src/engine/provisions/plug-slot.js';
import type { Limit } from '../../src/engine/result.js';

const RUNS = { numRuns: 200 };
const MM = 25.4;
const KN = 4.4482216152605;
const MPA = 6.894757293168;

const plug = (diameter: number, count = 1): HolePattern => ({ shape: 'plug', diameter, count, spacing: count > 1 ? 10 * diameter : null, spacingAcross: null });

function req(over: Partial<PlugSlotRequest> = {}): PlugSlotRequest {
  return {
    method: 'LRFD',
    units: 'imperial',
    electrode: 'E70',
    hole: plug(0.8125),
    fill: null,
    parts: [
      { thickness: 0.5, steel: 'A36', hasHole: true },
      { thickness: 0.5, steel: 'A36', hasHole: false },
    ],
    demand: null,
    tension: null,
    ...over,
  };
}

const limitOf = (limits: Limit[], code: string): Limit => limits.find((l) => l.code === code)!;

/** A steel given by numbers, fy <= fu. */
const steel = fc.record({ fy: fc.integer({ min: 30, max: 100 }), extra: fc.integer({ min: 0, max: 40 }) }).map(({ fy, extra }) => ({ fy, fu: fy + extra }));
/** Part thickness in whole sixteenths of an inch, 1/8 to 3 in. */
const sixteenths = fc.integer({ min: 2, max: 48 });

describe('strength grows with the pattern', () => {
  it('more plugs never lower any available strength, and raise the weld metal in proportion', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 40 }), fc.integer({ min: 1, max: 40 }), steel, steel, (n1, dn, s0, s1) => {
        const base = { parts: [{ thickness: 0.5, steel: s0, hasHole: true }, { thickness: 0.5, steel: s1, hasHole: false }] };
        const a = checkPlugSlot(req({ ...base, hole: plug(0.8125, n1) }));
        const b = checkPlugSlot(req({ ...base, hole: plug(0.8125, n1 + dn) }));
        expect(b.governing.available).toBeGreaterThanOrEqual(a.governing.available * (1 - 1e-12));
        // 0.60·FEXX·Awe is linear in the count
        expect(b.checks[0]!.available / a.checks[0]!.available).toBeCloseTo((n1 + dn) / n1, 9);
      }),
      RUNS,
    );
  });

  it('a larger hole never lowers any available strength', () => {
    fc.assert(
      fc.property(fc.double({ min: 0.3, max: 3, noNaN: true }), fc.double({ min: 1e-3, max: 2, noNaN: true }), steel, fc.integer({ min: 1, max: 10 }), (d, dd, s, n) => {
        const base = { parts: [{ thickness: 0.5, steel: s, hasHole: true }, { thickness: 0.75, steel: s, hasHole: false }], fill: 0.5 };
        const a = checkPlugSlot(req({ ...base, hole: plug(d, n) }));
        const b = checkPlugSlot(req({ ...base, hole: plug(d + dd, n) }));
        expect(b.checks[0]!.available).toBeGreaterThan(a.checks[0]!.available);
        expect(b.governing.available).toBeGreaterThanOrEqual(a.governing.available * (1 - 1e-12));
      }),
      RUNS,
    );
  });

  it('a longer slot never lowers the weld metal strength', () => {
    fc.assert(
      fc.property(fc.double({ min: 1, max: 10, noNaN: true }), fc.double({ min: 1e-3, max: 5, noNaN: true }), (L, dL) => {
        const slot = (length: number): HolePattern => ({ shape: 'slot', length, width: 0.8125, ends: ['semicircular', 'semicircular'], radius: null, count: 1, spacing: null, spacingAcross: null });
        const a = checkPlugSlot(req({ hole: slot(L) }));
        const b = checkPlugSlot(req({ hole: slot(L + dL) }));
        expect(b.checks[0]!.available).toBeGreaterThan(a.checks[0]!.available);
      }),
      RUNS,
    );
  });
});

describe('LRFD and ASD', () => {
  it('every check\'s LRFD / ASD available strength is phi·Omega (0.75 × 2.00 = 1.00 × 1.50 = 1.5), check by check', () => {
    fc.assert(
      fc.property(fc.double({ min: 0.3, max: 3, noNaN: true }), fc.integer({ min: 1, max: 20 }), steel, steel, (d, n, s0, s1) => {
        const base = req({ hole: plug(d, n), fill: 0.5, parts: [{ thickness: 0.5, steel: s0, hasHole: true }, { thickness: 0.5, steel: s1, hasHole: false }] });
        const lrfd = checkPlugSlot(base);
        const asd = checkPlugSlot({ ...base, method: 'ASD' });
        expect(asd.checks.map((c) => c.code)).toEqual(lrfd.checks.map((c) => c.code));
        lrfd.checks.forEach((c, i) => {
          const a = asd.checks[i]!;
          expect(c.nominal).toBe(a.nominal);
          expect(c.available / a.available).toBeCloseTo(c.phi! * a.omega!, 12);
          expect(c.phi! * a.omega!).toBeCloseTo(1.5, 12);
        });
      }),
      RUNS,
    );
  });
});

describe('the allowed range is consistent with the limits', () => {
  /** t in sixteenths; fill anywhere from the least allowed up to t. */
  const plate = sixteenths.chain((n) => {
    const t = n / 16;
    const lo = fillMin(t, 'imperial').depth;
    return fc.record({ t: fc.constant(t), fill: lo >= t ? fc.constant(t) : fc.double({ min: lo, max: t, noNaN: true }) });
  });

  it('a plug diameter inside [min, max] passes both diameter limits; below fails only the minimum; above only the maximum', () => {
    fc.assert(
      fc.property(plate, fc.double({ min: 0, max: 1, noNaN: true }), ({ t, fill }, f) => {
        const parts = [{ thickness: t, steel: 'A36', hasHole: true }, { thickness: t, steel: 'A36', hasHole: false }];
        const probe = checkPlugSlot(req({ parts, fill, hole: plug(1) }));
        const { min, max } = probe.values.allowed;
        expect(min).toBeLessThan(max);
        const inside = checkPlugSlot(req({ parts, fill, hole: plug(min + f * (max - min)) }));
        expect(limitOf(inside.limits, 'PLUG_HOLE_DIAMETER_MIN').pass).toBe(true);
        expect(limitOf(inside.limits, 'PLUG_HOLE_DIAMETER_MAX').pass).toBe(true);
        const below = checkPlugSlot(req({ parts, fill, hole: plug(min * 0.99) }));
        expect(limitOf(below.limits, 'PLUG_HOLE_DIAMETER_MIN').pass).toBe(false);
        expect(limitOf(below.limits, 'PLUG_HOLE_DIAMETER_MAX').pass).toBe(true);
        const above = checkPlugSlot(req({ parts, fill, hole: plug(max * 1.01) }));
        expect(limitOf(above.limits, 'PLUG_HOLE_DIAMETER_MIN').pass).toBe(true);
        expect(limitOf(above.limits, 'PLUG_HOLE_DIAMETER_MAX').pass).toBe(false);
      }),
      RUNS,
    );
  });

  it('a slot width inside a non-empty [min, max] passes both width limits, and a length up to lengthMax passes', () => {
    fc.assert(
      fc.property(plate, fc.double({ min: 0, max: 1, noNaN: true }), ({ t, fill }, f) => {
        const parts = [{ thickness: t, steel: 'A36', hasHole: true }, { thickness: t, steel: 'A36', hasHole: false }];
        const slot = (width: number, length: number): HolePattern => ({ shape: 'slot', length, width, ends: ['to-edge', 'to-edge'], radius: null, count: 1, spacing: null, spacingAcross: null });
        const probe = checkPlugSlot(req({ parts, fill, hole: slot(1, 2) }));
        const { min, max, lengthMax } = probe.values.allowed;
        const empty = probe.warnings.some((w) => w.code === 'SLOT_NO_COMPLIANT_WIDTH');
        expect(empty).toBe(min > max);
        if (empty) return;
        const r = checkPlugSlot(req({ parts, fill, hole: slot(min + f * (max - min), lengthMax!) }));
        expect(limitOf(r.limits, 'SLOT_WIDTH_MIN').pass).toBe(true);
        expect(limitOf(r.limits, 'SLOT_WIDTH_MAX').pass).toBe(true);
        expect(limitOf(r.limits, 'SLOT_LENGTH_MAX').pass).toBe(true);
      }),
      RUNS,
    );
  });

  it('the least diameter is an odd sixteenth at or above t + 5/16, less than two sixteenths above it (imperial)', () => {
    fc.assert(
      fc.property(fc.double({ min: 0.05, max: 4, noNaN: true }), (t) => {
        const d = dMinPlug(t, 'imperial');
        const n = d * 16;
        expect(Number.isInteger(n) && n % 2 === 1).toBe(true);
        expect(d).toBeGreaterThanOrEqual(t + 0.3125 - 1e-9);
        expect(d).toBeLessThan(t + 0.3125 + 0.125 + 1e-9);
      }),
      RUNS,
    );
  });

  it('the least diameter is an even mm at or above t + 8 mm, less than 2 mm above it (metric)', () => {
    fc.assert(
      fc.property(fc.double({ min: 1, max: 100, noNaN: true }), (t) => {
        const d = dMinPlug(t, 'metric');
        expect(Number.isInteger(d) && d % 2 === 0).toBe(true);
        expect(d).toBeGreaterThanOrEqual(t + 8 - 1e-9);
        expect(d).toBeLessThan(t + 8 + 2 + 1e-9);
      }),
      RUNS,
    );
  });

  it('the least fill never decreases with t, and never exceeds t', () => {
    fc.assert(
      fc.property(fc.double({ min: 0.05, max: 6, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true }), (t, dt) => {
        expect(fillMin(t + dt, 'imperial').depth).toBeGreaterThanOrEqual(fillMin(t, 'imperial').depth);
        expect(fillMin(t, 'imperial').depth).toBeLessThanOrEqual(t);
      }),
      RUNS,
    );
  });
});

describe('units', () => {
  it('the same physical plugs give the same weld metal and base-metal strengths in imperial and metric', () => {
    fc.assert(
      fc.property(fc.double({ min: 0.5, max: 2, noNaN: true }), fc.integer({ min: 1, max: 8 }), steel, (dIn, n, s) => {
        const imperial = req({ hole: plug(dIn, n), fill: 0.5, electrode: { fexx: 70 }, parts: [{ thickness: 0.5, steel: s, hasHole: true }, { thickness: 0.5, steel: s, hasHole: false }] });
        const metricSteel = { fy: s.fy * MPA, fu: s.fu * MPA };
        const metric: PlugSlotRequest = {
          ...imperial,
          units: 'metric',
          electrode: { fexx: 70 * MPA },
          hole: { ...plug(dIn * MM, n), spacing: 10 * dIn * MM },
          fill: 0.5 * MM,
          parts: [{ thickness: 0.5 * MM, steel: metricSteel, hasHole: true }, { thickness: 0.5 * MM, steel: metricSteel, hasHole: false }],
        };
        const a = checkPlugSlot(imperial);
        const b = checkPlugSlot(metric);
        a.checks.forEach((c, i) => expect(b.checks[i]!.available / KN).toBeCloseTo(c.available, 6));
      }),
      RUNS,
    );
  });
});
