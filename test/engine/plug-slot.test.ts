/**
 * Plug and slot welds (AISC 360-22 §J2.3): every geometric limit at its breakpoints, the
 * effective areas, and the strength of the weld metal and of each lapped part against hand
 * arithmetic from the published equations written out beside each assertion.
 *
 * The rules used (from memory of AISC 360-22 §J2.3 and Table J2.5):
 *   least plug diameter / slot width = t + 5/16 in (8 mm), rounded up to the next odd 1/16 in (even mm);
 *   largest plug diameter = larger of (least + 1/8 in (3 mm)) and 2-1/4 × weld thickness (fill);
 *   plug spacing >= 4·d; slot length <= 10 × fill; slot width <= 2-1/4 × fill;
 *   rounded slot corners r >= t; lines of slots >= 4·W apart; slots on a line >= 2·L centre to centre;
 *   fill = t for t <= 5/8 in (16 mm), else >= max(t/2, 5/8 in (16 mm));
 *   weld metal Rn = 0.60·FEXX·Awe, phi 0.75, Omega 2.00.
 * The base metal follows the model stated in src/engine/plug-slot.ts: the part with the holes in
 * shear yielding (phi 1.00, Omega 1.50) and rupture (phi 0.75, Omega 2.00) on perimeter × fill,
 * the other part in shear rupture on the welds' effective area.
 */
import { describe, expect, it } from 'vitest';
import { checkPlugSlot, type HolePattern, type PlugSlotRequest } from '../../src/engine/plug-slot.js';
import {
  AwePlug,
  AweSlot,
  dMaxPlug,
  dMinPlug,
  fillMin,
  lMaxSlot,
  perimeterPlug,
  perimeterSlot,
  roundUpToParity,
  sMinPlug,
  sMinSlotAcross,
  sMinSlotAlong,
  wMaxSlot,
  wMinSlot,
} from '../../src/engine/provisions/plug-slot.js';
import { EngineError } from '../../src/engine/errors.js';
import { codeOf } from '../assert.js';
import type { Limit } from '../../src/engine/result.js';

const plug = (diameter: number, count = 1, spacing: number | null = null, spacingAcross: number | null = null): HolePattern => ({
  shape: 'plug',
  diameter,
  count,
  spacing,
  spacingAcross,
});

function request(over: Partial<PlugSlotRequest> = {}): PlugSlotRequest {
  return {
    method: 'LRFD',
    units: 'imperial',
    electrode: 'E70',
    hole: plug(0.8125),
    fill: null,
    parts: [
      { thickness: 0.5, steel: 'A36', hasHole: true },
      { thickness: 0.625, steel: 'A36', hasHole: false },
    ],
    demand: null,
    tension: null,
    ...over,
  };
}

function limitOf(limits: Limit[], code: string, index = 0): Limit {
  const found = limits.filter((l) => l.code === code)[index];
  if (!found) throw new Error(`no limit ${code} in ${limits.map((l) => l.code).join(', ')}`);
  return found;
}

describe('least plug diameter / slot width: t + 5/16 in rounded up to the next odd 1/16 in', () => {
  it('1/2 in plate: 1/2 + 5/16 = 13/16 in, already an odd sixteenth, kept', () => {
    expect(dMinPlug(0.5, 'imperial')).toBe(0.8125); // 8/16 + 5/16 = 13/16 (odd)
  });
  it('3/8 in plate: 6/16 + 5/16 = 11/16 in, kept', () => {
    expect(dMinPlug(0.375, 'imperial')).toBe(0.6875);
  });
  it('7/16 in plate: 7/16 + 5/16 = 12/16, an even sixteenth, goes up to 13/16 in', () => {
    expect(dMinPlug(0.4375, 'imperial')).toBe(0.8125);
  });
  it('5/16 in plate: 10/16 goes up to 11/16 in', () => {
    expect(dMinPlug(0.3125, 'imperial')).toBe(0.6875);
  });
  it('0.40 in plate: 0.7125 in = 11.4/16, the next larger odd sixteenth is 13/16 in', () => {
    expect(dMinPlug(0.4, 'imperial')).toBe(0.8125);
  });
  it('0.37 in plate: 0.6825 in = 10.92/16 goes up to 11/16 in', () => {
    expect(dMinPlug(0.37, 'imperial')).toBe(0.6875);
  });
  it('1 in plate: 21/16 = 1-5/16 in, kept', () => {
    expect(dMinPlug(1, 'imperial')).toBe(1.3125);
  });
  it('the slot width minimum is the same value', () => {
    expect(wMinSlot(0.4375, 'imperial')).toBe(0.8125);
    expect(wMinSlot(12, 'metric')).toBe(20);
  });
  it('the rounding keeps a value already on an odd step despite float noise', () => {
    expect(roundUpToParity(0.8125 + 1e-14, 0.0625, 'odd')).toBe(0.8125);
    expect(roundUpToParity(0.8125 + 1e-6, 0.0625, 'odd')).toBe(0.9375); // just over 13/16: next odd is 15/16
  });
});

describe('metric: t + 8 mm rounded up to the next even mm', () => {
  it('12 mm plate: 20 mm, even, kept', () => expect(dMinPlug(12, 'metric')).toBe(20));
  it('13 mm plate: 21 mm goes up to 22 mm', () => expect(dMinPlug(13, 'metric')).toBe(22));
  it('12.5 mm plate: 20.5 mm goes up to 22 mm', () => expect(dMinPlug(12.5, 'metric')).toBe(22));
  it('10 mm plate: 18 mm', () => expect(dMinPlug(10, 'metric')).toBe(18));
  it('largest plug hole in 13 mm: max(22 + 3, 2.25 × 13 = 29.25) = 29.25 mm', () => expect(dMaxPlug(13, 13, 'metric')).toBe(29.25));
  it('largest plug hole in 6 mm: max(14 + 3 = 17, 2.25 × 6 = 13.5) = 17 mm', () => expect(dMaxPlug(6, 6, 'metric')).toBe(17));
});

describe('largest plug diameter: the larger of least + 1/8 in and 2-1/4 × fill', () => {
  it('1/2 in plate filled 1/2 in: max(13/16 + 1/8 = 15/16, 2.25 × 0.5 = 1.125) = 1.125 in', () => {
    expect(dMaxPlug(0.5, 0.5, 'imperial')).toBe(1.125);
  });
  it('3/8 in plate: max(11/16 + 1/8 = 0.8125, 2.25 × 0.375 = 0.84375) = 0.84375 in (2-1/4 × fill side)', () => {
    expect(dMaxPlug(0.375, 0.375, 'imperial')).toBe(0.84375);
  });
  it('5/16 in plate: max(11/16 + 1/8 = 0.8125, 2.25 × 0.3125 = 0.703125) = 0.8125 in (least + 1/8 side)', () => {
    expect(dMaxPlug(0.3125, 0.3125, 'imperial')).toBe(0.8125);
  });
  it('1 in plate filled 5/8 in: max(21/16 + 1/8 = 1.4375, 2.25 × 0.625 = 1.40625) = 1.4375 in', () => {
    expect(dMaxPlug(1, 0.625, 'imperial')).toBe(1.4375);
  });
  it('1 in plate filled 3/4 in: max(1.4375, 2.25 × 0.75 = 1.6875) = 1.6875 in', () => {
    expect(dMaxPlug(1, 0.75, 'imperial')).toBe(1.6875);
  });
});

describe('depth of fill: t up to 5/8 in, beyond it max(t/2, 5/8 in)', () => {
  it('t = 5/8 in exactly: the full 5/8 in', () => expect(fillMin(0.625, 'imperial')).toEqual({ depth: 0.625, full: true }));
  it('t = 1/2 in: the full 1/2 in', () => expect(fillMin(0.5, 'imperial')).toEqual({ depth: 0.5, full: true }));
  it('t = 11/16 in, just over: max(11/32, 5/8) = 5/8 in', () => expect(fillMin(0.6875, 'imperial')).toEqual({ depth: 0.625, full: false }));
  it('t = 1-1/4 in: t/2 = 5/8 in, both rules agree', () => expect(fillMin(1.25, 'imperial').depth).toBe(0.625));
  it('t = 1-1/2 in: t/2 = 3/4 in governs', () => expect(fillMin(1.5, 'imperial').depth).toBe(0.75));
  it('metric 16 mm: the full 16 mm; 20 mm: 16 mm; 40 mm: 20 mm', () => {
    expect(fillMin(16, 'metric')).toEqual({ depth: 16, full: true });
    expect(fillMin(20, 'metric').depth).toBe(16);
    expect(fillMin(40, 'metric').depth).toBe(20);
  });
});

describe('slot limits and spacings', () => {
  it('slot length at most 10 × fill: 10 × 0.5 = 5 in', () => expect(lMaxSlot(0.5)).toBe(5));
  it('slot width at most 2-1/4 × fill: 2.25 × 0.5 = 1.125 in', () => expect(wMaxSlot(0.5)).toBe(1.125));
  it('plug spacing at least 4·d: 4 × 13/16 = 3.25 in', () => expect(sMinPlug(0.8125)).toBe(3.25));
  it('slot lines at least 4·W apart: 4 × 13/16 = 3.25 in', () => expect(sMinSlotAcross(0.8125)).toBe(3.25));
  it('slots on a line at least 2·L centre to centre: 2 × 4 = 8 in', () => expect(sMinSlotAlong(4)).toBe(8));
});

describe('effective areas in the faying plane', () => {
  it('plug: pi·d²/4; 13/16 in: pi × 0.66015625 / 4 = 0.518486 in²', () => {
    expect(AwePlug(0.8125)).toBeCloseTo(0.518486, 6);
  });
  it('slot with semicircular ends: (L - W)·W + pi·W²/4; 3 × 13/16 in: 2.1875 × 0.8125 + 0.518486 = 2.295830 in²', () => {
    expect(AweSlot(3, 0.8125, ['semicircular', 'semicircular'])).toBeCloseTo(2.29583, 5);
  });
  it('slot with corners rounded to r: L·W - 2·(4 - pi)·r²/2; 4 × 1 in, r = 1/2: 4 - (4 - pi)·0.25 = 3.785398 in²', () => {
    expect(AweSlot(4, 1, ['rounded', 'rounded'], 0.5)).toBeCloseTo(3.785398, 6);
  });
  it('rounded corners with r = W/2 give the semicircular area', () => {
    expect(AweSlot(4, 1, ['rounded', 'rounded'], 0.5)).toBeCloseTo(AweSlot(4, 1, ['semicircular', 'semicircular']), 12);
  });
  it('slot run out to the edge at both ends: L·W = 3 × 0.8125 = 2.4375 in²', () => {
    expect(AweSlot(3, 0.8125, ['to-edge', 'to-edge'])).toBe(2.4375);
  });
  it('one end to the edge, one semicircular: 2.4375 - (4 - pi)·0.8125²/8 = 2.4375 - 0.070838 = 2.366662 in²', () => {
    expect(AweSlot(3, 0.8125, ['to-edge', 'semicircular'])).toBeCloseTo(2.366662, 5);
  });
  it('perimeters: plug pi·d = 2.552544 in; semicircular slot 2·(L - W) + pi·W = 4.375 + 2.552544 = 6.927544 in', () => {
    expect(perimeterPlug(0.8125)).toBeCloseTo(2.552544, 6);
    expect(perimeterSlot(3, 0.8125, ['semicircular', 'semicircular'])).toBeCloseTo(6.927544, 6);
    // to-edge at one end: 2 × (3 - 0.40625) + pi × 0.8125 / 2 = 5.1875 + 1.276272 = 6.463772 in
    expect(perimeterSlot(3, 0.8125, ['to-edge', 'semicircular'])).toBeCloseTo(6.463772, 6);
  });
});

describe('the check: plug diameter limits (issue acceptance)', () => {
  it('a plug in a 1/2 in plate reports a least diameter of 13/16 in and the largest allowed, 1-1/8 in', () => {
    const r = checkPlugSlot(request());
    const min = limitOf(r.limits, 'PLUG_HOLE_DIAMETER_MIN');
    const max = limitOf(r.limits, 'PLUG_HOLE_DIAMETER_MAX');
    expect(min.required).toBe(0.8125); // AISC 360-22 §J2.3b (from memory): 1/2 + 5/16 = 13/16
    expect(max.required).toBe(1.125); // max(13/16 + 1/8, 2.25 × 1/2) = 1.125
    expect(min.pass && max.pass).toBe(true);
    expect(r.values.allowed).toEqual({ dimension: 'diameter', min: 0.8125, max: 1.125 });
    expect(r.status).toBe('pass');
  });
  it('a 3/4 in hole in a 1/2 in plate fails PLUG_HOLE_DIAMETER_MIN', () => {
    const r = checkPlugSlot(request({ hole: plug(0.75) }));
    const min = limitOf(r.limits, 'PLUG_HOLE_DIAMETER_MIN');
    expect(min).toMatchObject({ required: 0.8125, provided: 0.75, pass: false, sense: 'min', part: 0 });
    expect(r.status).toBe('fail');
  });
  it('1-1/8 in passes the maximum exactly; 1-3/16 in fails PLUG_HOLE_DIAMETER_MAX', () => {
    expect(limitOf(checkPlugSlot(request({ hole: plug(1.125) })).limits, 'PLUG_HOLE_DIAMETER_MAX').pass).toBe(true);
    const over = limitOf(checkPlugSlot(request({ hole: plug(1.1875) })).limits, 'PLUG_HOLE_DIAMETER_MAX');
    expect(over).toMatchObject({ required: 1.125, provided: 1.1875, pass: false });
  });
  it('with a shallower fill in a thick plate the 2-1/4 × fill side of the maximum moves', () => {
    const thick = request({ parts: [{ thickness: 1, steel: 'A36', hasHole: true }, { thickness: 1, steel: 'A36', hasHole: false }] });
    // 1 in plate, fill 3/4 in: max(21/16 + 1/8 = 1.4375, 2.25 × 0.75 = 1.6875) = 1.6875
    const r = checkPlugSlot({ ...thick, hole: plug(1.5), fill: 0.75 });
    expect(limitOf(r.limits, 'PLUG_HOLE_DIAMETER_MAX').required).toBe(1.6875);
    expect(limitOf(r.limits, 'PLUG_HOLE_DIAMETER_MIN').required).toBe(1.3125);
  });
  it('the t of the limits is that of the part with the hole, whichever index it has', () => {
    const r = checkPlugSlot(request({ parts: [{ thickness: 0.625, steel: 'A36', hasHole: false }, { thickness: 0.375, steel: 'A36', hasHole: true }], hole: plug(0.6875) }));
    expect(limitOf(r.limits, 'PLUG_HOLE_DIAMETER_MIN')).toMatchObject({ required: 0.6875, part: 1 }); // 3/8 + 5/16 = 11/16
    expect(r.values.holePart).toBe(1);
    expect(r.values.thickness).toBe(0.375);
  });
});

describe('the check: spacing of a pattern', () => {
  it('plugs at exactly 4·d = 3.25 in pass; at 3 in fail PLUG_SPACING', () => {
    expect(limitOf(checkPlugSlot(request({ hole: plug(0.8125, 4, 3.25) })).limits, 'PLUG_SPACING').pass).toBe(true);
    const r = checkPlugSlot(request({ hole: plug(0.8125, 4, 3) }));
    expect(limitOf(r.limits, 'PLUG_SPACING')).toMatchObject({ required: 3.25, provided: 3, pass: false });
    expect(r.status).toBe('fail');
  });
  it('plugs in rows: the spacing across is held to 4·d as well', () => {
    const r = checkPlugSlot(request({ hole: plug(0.8125, 4, 4, 3) }));
    expect(limitOf(r.limits, 'PLUG_SPACING', 0).pass).toBe(true);
    expect(limitOf(r.limits, 'PLUG_SPACING', 1)).toMatchObject({ required: 3.25, provided: 3, pass: false });
  });
  it('a single plug has no spacing limit', () => {
    expect(checkPlugSlot(request({ hole: plug(0.8125, 1, 1) })).limits.some((l) => l.code === 'PLUG_SPACING')).toBe(false);
  });
  it('a pattern without any spacing, or with overlapping holes, cannot be answered', () => {
    expect(codeOf(() => checkPlugSlot(request({ hole: plug(0.8125, 4) })))).toBe('GEOMETRY_MEANINGLESS');
    expect(codeOf(() => checkPlugSlot(request({ hole: plug(0.8125, 4, 0.5) })))).toBe('GEOMETRY_MEANINGLESS');
  });
});

function slot(length: number, width: number, over: Partial<Extract<HolePattern, { shape: 'slot' }>> = {}): HolePattern {
  return { shape: 'slot', length, width, ends: ['semicircular', 'semicircular'], radius: null, count: 1, spacing: null, spacingAcross: null, ...over };
}

describe('the check: slot limits', () => {
  it('a 1/2 in plate: width from 13/16 in to 2.25 × 1/2 = 1-1/8 in, length up to 10 × 1/2 = 5 in', () => {
    const r = checkPlugSlot(request({ hole: slot(4, 0.8125) }));
    expect(r.values.allowed).toEqual({ dimension: 'width', min: 0.8125, max: 1.125, lengthMax: 5 });
    expect(r.limits.every((l) => l.pass)).toBe(true);
  });
  it('a slot 5 in long passes; 5-1/16 in, longer than 10 × its weld thickness, fails SLOT_LENGTH_MAX', () => {
    expect(limitOf(checkPlugSlot(request({ hole: slot(5, 0.8125) })).limits, 'SLOT_LENGTH_MAX').pass).toBe(true);
    const r = checkPlugSlot(request({ hole: slot(5.0625, 0.8125) }));
    expect(limitOf(r.limits, 'SLOT_LENGTH_MAX')).toMatchObject({ required: 5, provided: 5.0625, pass: false, sense: 'max' });
    expect(r.status).toBe('fail');
  });
  it('width 3/4 in fails SLOT_WIDTH_MIN; 1-3/16 in fails SLOT_WIDTH_MAX; 1-1/8 in passes', () => {
    expect(limitOf(checkPlugSlot(request({ hole: slot(4, 0.75) })).limits, 'SLOT_WIDTH_MIN')).toMatchObject({ required: 0.8125, pass: false });
    expect(limitOf(checkPlugSlot(request({ hole: slot(4, 1.1875) })).limits, 'SLOT_WIDTH_MAX')).toMatchObject({ required: 1.125, pass: false });
    expect(limitOf(checkPlugSlot(request({ hole: slot(4, 1.125) })).limits, 'SLOT_WIDTH_MAX').pass).toBe(true);
  });
  it('a 1/4 in part: the least width 9/16 in equals 2.25 × 1/4 = 9/16 in; both limits pass at 9/16', () => {
    const parts = [{ thickness: 0.25, steel: 'A36', hasHole: true }, { thickness: 0.5, steel: 'A36', hasHole: false }];
    const r = checkPlugSlot(request({ parts, hole: slot(2, 0.5625) }));
    expect(limitOf(r.limits, 'SLOT_WIDTH_MIN')).toMatchObject({ required: 0.5625, pass: true });
    expect(limitOf(r.limits, 'SLOT_WIDTH_MAX')).toMatchObject({ required: 0.5625, pass: true });
    expect(r.warnings.some((w) => w.code === 'SLOT_NO_COMPLIANT_WIDTH')).toBe(false);
  });
  it('a 3/16 in part: least width 9/16 in exceeds 2.25 × 3/16 = 0.421875 in, so no width complies (warning)', () => {
    const parts = [{ thickness: 0.1875, steel: 'A36', hasHole: true }, { thickness: 0.5, steel: 'A36', hasHole: false }];
    const r = checkPlugSlot(request({ parts, hole: slot(1.5, 0.5625) }));
    expect(r.warnings.map((w) => w.code)).toContain('SLOT_NO_COMPLIANT_WIDTH');
    expect(limitOf(r.limits, 'SLOT_WIDTH_MAX').pass).toBe(false);
  });
  it('rounded corners: radius t = 1/2 in passes, 7/16 in fails SLOT_END_RADIUS', () => {
    expect(limitOf(checkPlugSlot(request({ hole: slot(4, 1, { ends: ['rounded', 'rounded'], radius: 0.5 }) })).limits, 'SLOT_END_RADIUS').pass).toBe(true);
    const r = checkPlugSlot(request({ hole: slot(4, 1, { ends: ['rounded', 'rounded'], radius: 0.4375 }) }));
    expect(limitOf(r.limits, 'SLOT_END_RADIUS')).toMatchObject({ required: 0.5, provided: 0.4375, pass: false });
  });
  it('semicircular ends and ends to the edge carry no radius limit', () => {
    expect(checkPlugSlot(request({ hole: slot(4, 1) })).limits.some((l) => l.code === 'SLOT_END_RADIUS')).toBe(false);
    expect(checkPlugSlot(request({ hole: slot(4, 1, { ends: ['to-edge', 'semicircular'] }) })).limits.some((l) => l.code === 'SLOT_END_RADIUS')).toBe(false);
  });
  it('a corner radius over half the width, or ends that do not fit the length, cannot be answered', () => {
    expect(codeOf(() => checkPlugSlot(request({ hole: slot(4, 1, { ends: ['rounded', 'rounded'], radius: 0.6 }) })))).toBe('GEOMETRY_MEANINGLESS');
    expect(codeOf(() => checkPlugSlot(request({ hole: slot(0.75, 1) })))).toBe('GEOMETRY_MEANINGLESS');
  });
  it('slots on a line: 2·L = 8 in centre to centre passes, 7-1/2 in fails SLOT_SPACING_ALONG', () => {
    expect(limitOf(checkPlugSlot(request({ hole: slot(4, 0.8125, { count: 3, spacing: 8 }) })).limits, 'SLOT_SPACING_ALONG').pass).toBe(true);
    const r = checkPlugSlot(request({ hole: slot(4, 0.8125, { count: 3, spacing: 7.5 }) }));
    expect(limitOf(r.limits, 'SLOT_SPACING_ALONG')).toMatchObject({ required: 8, provided: 7.5, pass: false });
  });
  it('lines of slots: 4·W = 3.25 in apart passes, 3 in fails SLOT_SPACING_ACROSS', () => {
    expect(limitOf(checkPlugSlot(request({ hole: slot(4, 0.8125, { count: 2, spacingAcross: 3.25 }) })).limits, 'SLOT_SPACING_ACROSS').pass).toBe(true);
    const r = checkPlugSlot(request({ hole: slot(4, 0.8125, { count: 2, spacingAcross: 3 }) }));
    expect(limitOf(r.limits, 'SLOT_SPACING_ACROSS')).toMatchObject({ required: 3.25, provided: 3, pass: false });
  });
});

describe('the check: depth of fill', () => {
  const at = (t: number) => [{ thickness: t, steel: 'A36', hasHole: true }, { thickness: 1, steel: 'A36', hasHole: false }];
  it('t = 5/8 in exactly: a 5/8 in fill passes, a 1/2 in fill fails PLUG_SLOT_FILL_DEPTH (must equal t)', () => {
    expect(limitOf(checkPlugSlot(request({ parts: at(0.625), hole: plug(0.9375), fill: 0.625 })).limits, 'PLUG_SLOT_FILL_DEPTH').pass).toBe(true);
    const r = checkPlugSlot(request({ parts: at(0.625), hole: plug(0.9375), fill: 0.5 }));
    expect(limitOf(r.limits, 'PLUG_SLOT_FILL_DEPTH')).toMatchObject({ required: 0.625, provided: 0.5, pass: false });
  });
  it('t = 11/16 in: 5/8 in of fill is enough, 0.6 in is not', () => {
    // least plug hole: 11/16 + 5/16 = 16/16, even, so 17/16 in
    expect(limitOf(checkPlugSlot(request({ parts: at(0.6875), hole: plug(1.0625), fill: 0.625 })).limits, 'PLUG_SLOT_FILL_DEPTH').pass).toBe(true);
    expect(limitOf(checkPlugSlot(request({ parts: at(0.6875), hole: plug(1.0625), fill: 0.6 })).limits, 'PLUG_SLOT_FILL_DEPTH').pass).toBe(false);
  });
  it('t = 1-1/2 in: at least t/2 = 3/4 in', () => {
    const r = checkPlugSlot(request({ parts: at(1.5), hole: plug(1.8125), fill: 0.7 }));
    expect(limitOf(r.limits, 'PLUG_SLOT_FILL_DEPTH')).toMatchObject({ required: 0.75, pass: false });
  });
  it('no fill given: the least allowed is used and said', () => {
    const r = checkPlugSlot(request({ parts: at(1.5), hole: plug(1.8125) }));
    expect(r.values.fill).toBe(0.75);
    expect(r.values.fillGiven).toBe(false);
    expect(r.warnings.map((w) => w.code)).toContain('PLUG_SLOT_FILL_ASSUMED');
  });
  it('a fill deeper than the part cannot be answered', () => {
    expect(codeOf(() => checkPlugSlot(request({ fill: 0.6 })))).toBe('GEOMETRY_MEANINGLESS');
  });
});

describe('the check: strength by hand arithmetic', () => {
  // Four 13/16 in plugs: Awe = 4 × pi × 0.8125² / 4 = 4 × 0.518486 = 2.073942 in².
  // Hole wall of the 1/2 in part, fill 1/2 in: 4 × pi × 0.8125 × 0.5 = 5.105088 in².
  const four = request({ hole: plug(0.8125, 4, 4), fill: 0.5, demand: 30 });

  it('LRFD, A36 parts: the faying surface of the solid part governs; weld and wall as computed', () => {
    const r = checkPlugSlot(four);
    const weld = r.checks.find((c) => c.code === 'PLUG_SLOT_WELD_METAL')!;
    // weld metal: 0.75 × 0.60 × 70 × 2.073942 = 65.3292 kip
    expect(weld.available).toBeCloseTo(65.3292, 3);
    expect(weld.nominal).toBeCloseTo(87.1056, 3); // 0.60 × 70 × 2.073942
    expect(weld.phi).toBe(0.75);
    // part 1 (faying surface) rupture: 0.75 × 0.60 × 58 × 2.073942 = 54.1299 kip
    const face = r.checks.find((c) => c.code === 'BASE_METAL_SHEAR_RUPTURE' && c.part === 1)!;
    expect(face.available).toBeCloseTo(54.1299, 3);
    // part 0 (hole wall) yield: 1.00 × 0.60 × 36 × 5.105088 = 110.2699 kip; rupture 0.75 × 0.60 × 58 × 5.105088 = 133.2428 kip
    expect(r.checks.find((c) => c.code === 'BASE_METAL_SHEAR_YIELD' && c.part === 0)!.available).toBeCloseTo(110.2699, 3);
    expect(r.checks.find((c) => c.code === 'BASE_METAL_SHEAR_RUPTURE' && c.part === 0)!.available).toBeCloseTo(133.2428, 3);
    // no shear yielding is checked on the fused face of the solid part
    expect(r.checks.some((c) => c.code === 'BASE_METAL_SHEAR_YIELD' && c.part === 1)).toBe(false);
    expect(r.governing).toMatchObject({ code: 'BASE_METAL_SHEAR_RUPTURE', part: 1 });
    expect(r.utilization).toBeCloseTo(30 / 54.1299, 5);
    expect(r.warnings.map((w) => w.code)).toContain('BASE_METAL_GOVERNS');
    expect(r.values.effectiveArea).toBeCloseTo(2.073942, 6);
    expect(r.values.parts[0]).toMatchObject({ plane: 'hole-wall' });
    expect(r.values.parts[0]!.area).toBeCloseTo(5.105088, 6);
    expect(r.values.parts[1]).toMatchObject({ plane: 'faying-surface' });
  });

  it('ASD, A36 parts: weld 0.60 × 70 × 2.073942 / 2.00 = 43.5528 kip; face 0.60 × 58 × 2.073942 / 2.00 = 36.0866 kip', () => {
    const r = checkPlugSlot({ ...four, method: 'ASD' });
    const weld = r.checks.find((c) => c.code === 'PLUG_SLOT_WELD_METAL')!;
    expect(weld.available).toBeCloseTo(43.5528, 3);
    expect(weld.omega).toBe(2);
    expect(r.governing.code).toBe('BASE_METAL_SHEAR_RUPTURE');
    expect(r.governing.available).toBeCloseTo(36.0866, 3);
    // hole wall yield: 0.60 × 36 × 5.105088 / 1.50 = 73.5133 kip
    expect(r.checks.find((c) => c.code === 'BASE_METAL_SHEAR_YIELD')!.available).toBeCloseTo(73.5133, 3);
  });

  it('with base metal stronger than the electrode the weld metal governs: count × area × 0.60·FEXX × phi', () => {
    const strong = { ...four, parts: [{ thickness: 0.5, steel: { fy: 65, fu: 80 }, hasHole: true }, { thickness: 0.625, steel: { fy: 65, fu: 80 }, hasHole: false }] };
    const r = checkPlugSlot(strong);
    // 4 × 0.518486 × 0.60 × 70 × 0.75 = 65.3292 kip
    expect(r.governing.code).toBe('PLUG_SLOT_WELD_METAL');
    expect(r.governing.available).toBeCloseTo(65.3292, 3);
    expect(r.warnings.some((w) => w.code === 'BASE_METAL_GOVERNS')).toBe(false);
    const asd = checkPlugSlot({ ...strong, method: 'ASD' });
    // 4 × 0.518486 × 0.60 × 70 / 2.00 = 43.5528 kip
    expect(asd.governing.available).toBeCloseTo(43.5528, 3);
  });

  it('a slot with semicircular ends, 3 × 13/16 in: Awe = 2.295830 in², weld 0.75 × 42 × 2.295830 = 72.3186 kip', () => {
    const r = checkPlugSlot(request({ hole: slot(3, 0.8125), fill: 0.5, electrode: { fexx: 70 }, parts: [{ thickness: 0.5, steel: { fy: 65, fu: 80 }, hasHole: true }, { thickness: 0.5, steel: { fy: 65, fu: 80 }, hasHole: false }] }));
    expect(r.values.area).toBeCloseTo(2.29583, 5);
    expect(r.checks[0]!.available).toBeCloseTo(72.3186, 3);
    // wall: 6.927544 in × 0.5 in = 3.463772 in²; yield 1.00 × 0.60 × 65 × 3.463772 = 135.0871 kip
    expect(r.checks.find((c) => c.code === 'BASE_METAL_SHEAR_YIELD')!.available).toBeCloseTo(135.0871, 3);
  });

  it('metric, ASD: two 80 × 20 mm slots in 12 mm S355, E49 (WS-R08)', () => {
    const r = checkPlugSlot({
      method: 'ASD',
      units: 'metric',
      electrode: 'E49',
      hole: slot(80, 20, { count: 2, spacing: 200 }),
      fill: 12,
      parts: [{ thickness: 12, steel: 'S355', hasHole: true }, { thickness: 15, steel: 'S355', hasHole: false }],
      demand: 150,
      tension: null,
    });
    // Awe = 2 × ((80 - 20) × 20 + pi × 20² / 4) = 2 × 1514.159 = 3028.319 mm²
    expect(r.values.effectiveArea).toBeCloseTo(3028.319, 2);
    // weld: 0.60 × 490 × 3028.319 / 1000 / 2.00 = 445.163 kN (governs)
    expect(r.governing.code).toBe('PLUG_SLOT_WELD_METAL');
    expect(r.governing.available).toBeCloseTo(445.163, 2);
    // face rupture: 0.60 × 510 × 3028.319 / 1000 / 2.00 = 463.333 kN
    expect(r.checks.find((c) => c.code === 'BASE_METAL_SHEAR_RUPTURE' && c.part === 1)!.available).toBeCloseTo(463.333, 2);
    // wall: 2 × (2 × 60 + pi × 20) × 12 = 4387.964 mm²; yield 0.60 × 355 × 4387.964 / 1000 / 1.50 = 623.091 kN
    expect(r.checks.find((c) => c.code === 'BASE_METAL_SHEAR_YIELD')!.available).toBeCloseTo(623.091, 2);
    // limits: width 12 + 8 = 20 mm (even) to 2.25 × 12 = 27 mm; length up to 120 mm; along 2 × 80 = 160 mm
    expect(r.values.allowed).toEqual({ dimension: 'width', min: 20, max: 27, lengthMax: 120 });
    expect(limitOf(r.limits, 'SLOT_SPACING_ALONG')).toMatchObject({ required: 160, provided: 200, pass: true });
    expect(r.status).toBe('pass');
  });

  it('metric plug in a 13 mm plate: least hole 21 mm rounds to 22 mm; a 21 mm hole fails', () => {
    const r = checkPlugSlot({
      method: 'LRFD',
      units: 'metric',
      electrode: 'E49',
      hole: plug(21),
      fill: null,
      parts: [{ thickness: 13, steel: 'S355', hasHole: true }, { thickness: 13, steel: 'S355', hasHole: false }],
      demand: null,
      tension: null,
    });
    expect(limitOf(r.limits, 'PLUG_HOLE_DIAMETER_MIN')).toMatchObject({ required: 22, provided: 21, pass: false });
    // weld: 0.75 × 0.60 × 490 × (pi × 21² / 4 = 346.361 mm²) / 1000 = 220.5 × 346.361 / 1000 = 76.373 kN
    expect(r.checks[0]!.available).toBeCloseTo(76.373, 2);
  });
});

describe('the check: advice', () => {
  it('tension normal to the faying surface brings PLUG_SLOT_TENSION and no tension strength', () => {
    const r = checkPlugSlot(request({ demand: 10, tension: 5 }));
    expect(r.warnings.map((w) => w.code)).toContain('PLUG_SLOT_TENSION');
    expect(r.checks.every((c) => !c.code.startsWith('BASE_METAL_TENSION'))).toBe(true);
  });
  it('no tension, no warning; no demand, NO_DEMAND_GIVEN', () => {
    const r = checkPlugSlot(request({ tension: 0 }));
    expect(r.warnings.map((w) => w.code)).not.toContain('PLUG_SLOT_TENSION');
    expect(r.warnings.map((w) => w.code)).toContain('NO_DEMAND_GIVEN');
  });
  it('two parts are needed, exactly one with the hole', () => {
    const none = request({ parts: [{ thickness: 0.5, steel: 'A36', hasHole: false }, { thickness: 0.5, steel: 'A36', hasHole: false }] });
    const both = request({ parts: [{ thickness: 0.5, steel: 'A36', hasHole: true }, { thickness: 0.5, steel: 'A36', hasHole: true }] });
    expect(codeOf(() => checkPlugSlot(none))).toBe('GEOMETRY_MEANINGLESS');
    expect(codeOf(() => checkPlugSlot(both))).toBe('GEOMETRY_MEANINGLESS');
  });
});
