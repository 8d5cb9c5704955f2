/**
 * Plug and slot welds against values from outside the project: row 20 of
 * shared/domain/check-values.md, and the rules of AISC 360-22 §J2.3 and Table J2.5 as
 * published (from memory: not re-read from the document while writing this file), each test
 * naming its source.
 *
 * Units: imperial (in, kip, ksi) unless a test says metric (mm, kN, MPa); the metric values
 * are the Specification's own parenthetical values (8 mm, 3 mm, 16 mm, even mm), not
 * conversions. Rounding: hole sizes are exact sixteenths or whole mm; stresses to 0.1 ksi.
 */
import { describe, expect, it } from 'vitest';
import { checkPlugSlot, type PlugSlotRequest } from '../../src/engine/plug-slot.js';
import { dMaxPlug, dMinPlug, fillMin, lMaxSlot, sMinPlug, sMinSlotAcross, sMinSlotAlong, wMaxSlot, wMinSlot } from '../../src/engine/provisions/plug-slot.js';

function req(over: Partial<PlugSlotRequest> = {}): PlugSlotRequest {
  return {
    method: 'LRFD',
    units: 'imperial',
    electrode: 'E70',
    hole: { shape: 'plug', diameter: 0.8125, count: 1, spacing: null, spacingAcross: null },
    fill: 0.5,
    parts: [
      // steel strong enough that the weld metal governs, to read the weld stress alone
      { thickness: 0.5, steel: { fy: 70, fu: 90 }, hasHole: true },
      { thickness: 0.5, steel: { fy: 70, fu: 90 }, hasHole: false },
    ],
    demand: null,
    tension: null,
    ...over,
  };
}

describe('shared/domain/check-values.md row 20', () => {
  it('row 20: plug hole in a 1/2 in plate, minimum diameter 1/2 + 5/16 = 13/16 in (AISC 360-22 J2.3b, from memory)', () => {
    expect(dMinPlug(0.5, 'imperial')).toBe(13 / 16);
    const r = checkPlugSlot(req());
    expect(r.limits.find((l) => l.code === 'PLUG_HOLE_DIAMETER_MIN')!.required).toBe(13 / 16);
  });
});

describe('AISC 360-22 §J2.3b geometric limits (from memory)', () => {
  it('least plug hole = t + 5/16 in rounded up to the next larger odd 1/16 in: 3/8 in plate 11/16 in; 7/16 in plate 13/16 in', () => {
    expect(dMinPlug(3 / 8, 'imperial')).toBe(11 / 16); // 6/16 + 5/16 = 11/16, odd
    expect(dMinPlug(7 / 16, 'imperial')).toBe(13 / 16); // 7/16 + 5/16 = 12/16, even: next odd is 13/16
  });

  it('metric: t + 8 mm rounded up to the next larger even mm: 12 mm plate 20 mm; 13 mm plate 22 mm', () => {
    expect(dMinPlug(12, 'metric')).toBe(20);
    expect(dMinPlug(13, 'metric')).toBe(22);
  });

  it('largest plug hole = least + 1/8 in (3 mm) or 2-1/4 × weld thickness, read as the larger', () => {
    expect(dMaxPlug(0.5, 0.5, 'imperial')).toBe(1.125); // 2.25 × 1/2 = 1-1/8 in > 13/16 + 1/8 = 15/16 in
    expect(dMaxPlug(0.25, 0.25, 'imperial')).toBe(11 / 16); // 9/16 + 1/8 = 11/16 in > 2.25 × 1/4 = 9/16 in
    expect(dMaxPlug(10, 10, 'metric')).toBe(22.5); // 2.25 × 10 = 22.5 mm > 18 + 3 = 21 mm
  });

  it('plug welds at least 4 × the hole diameter apart, centre to centre', () => {
    expect(sMinPlug(1)).toBe(4);
  });

  it('slot length at most 10 × the weld thickness; width from t + 5/16 in (rounded) to 2-1/4 × the weld thickness', () => {
    expect(lMaxSlot(0.5)).toBe(5);
    expect(wMinSlot(0.5, 'imperial')).toBe(13 / 16);
    expect(wMaxSlot(0.5)).toBe(1.125);
  });

  it('lines of slots at least 4 × the slot width apart; slots on a line at least 2 × the slot length centre to centre', () => {
    expect(sMinSlotAcross(1)).toBe(4);
    expect(sMinSlotAlong(3)).toBe(6);
  });

  it('depth of fill: equal to t up to 5/8 in (16 mm); beyond, at least t/2 and at least 5/8 in (16 mm)', () => {
    expect(fillMin(0.5, 'imperial').depth).toBe(0.5);
    expect(fillMin(0.625, 'imperial').depth).toBe(0.625);
    expect(fillMin(1, 'imperial').depth).toBe(0.625); // max(1/2, 5/8)
    expect(fillMin(2, 'imperial').depth).toBe(1); // max(1, 5/8)
    expect(fillMin(25, 'metric').depth).toBe(16); // max(12.5, 16)
  });
});

describe('AISC 360-22 Table J2.5, plug and slot welds in shear parallel to the faying surface (from memory)', () => {
  it('weld metal 0.60·FEXX with phi = 0.75: E70 design stress 0.75 × 0.60 × 70 = 31.5 ksi on the hole area', () => {
    const r = checkPlugSlot(req());
    const weld = r.checks.find((c) => c.code === 'PLUG_SLOT_WELD_METAL')!;
    expect(weld.phi).toBe(0.75);
    expect(weld.available / r.values.effectiveArea).toBeCloseTo(31.5, 10);
  });

  it('Omega = 2.00: E70 allowable stress 0.60 × 70 / 2.00 = 21.0 ksi on the hole area', () => {
    const r = checkPlugSlot(req({ method: 'ASD' }));
    const weld = r.checks.find((c) => c.code === 'PLUG_SLOT_WELD_METAL')!;
    expect(weld.omega).toBe(2);
    expect(weld.available / r.values.effectiveArea).toBeCloseTo(21.0, 10);
  });

  it('effective area = nominal area of the hole in the faying plane (§J2.3a): a 1 in plug has pi/4 = 0.7854 in²', () => {
    const r = checkPlugSlot(req({ hole: { shape: 'plug', diameter: 1, count: 1, spacing: null, spacingAcross: null } }));
    expect(r.values.area).toBeCloseTo(0.7854, 4);
  });

  it('metric: E49 weld metal, 0.75 × 0.60 × 490 = 220.5 MPa on the hole area', () => {
    const r = checkPlugSlot({
      ...req(),
      units: 'metric',
      electrode: 'E49',
      hole: { shape: 'plug', diameter: 20, count: 1, spacing: null, spacingAcross: null },
      fill: 12,
      parts: [
        { thickness: 12, steel: { fy: 500, fu: 700 }, hasHole: true },
        { thickness: 12, steel: { fy: 500, fu: 700 }, hasHole: false },
      ],
    });
    const weld = r.checks.find((c) => c.code === 'PLUG_SLOT_WELD_METAL')!;
    // kN per mm² × 1000 = MPa
    expect((weld.available / r.values.effectiveArea) * 1000).toBeCloseTo(220.5, 9);
  });
});
