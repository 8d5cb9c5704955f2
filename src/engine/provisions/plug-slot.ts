/**
 * Plug and slot weld provisions, one function per rule of AISC 360-22 §J2.3 (effective area,
 * and the geometric limits of §J2.3b), with the Specification's own metric values: 5/16 in is
 * 8 mm, 1/8 in is 3 mm, 5/8 in is 16 mm, and "the next larger odd 1/16 in" is "the next larger
 * even mm" (they are not conversions of each other). Lengths in the system's length unit.
 *
 * Where these functions read the Specification (from memory of §J2.3b):
 * - t is the thickness of the part that contains the hole or slot;
 * - "the thickness of the weld" in the maximum-diameter, maximum-width and maximum-length
 *   rules is the depth of fill of the hole or slot;
 * - the maximum plug diameter "minimum diameter plus 1/8 in (3 mm) or 2-1/4 times the
 *   thickness of the weld" is read as the larger of the two, which is how the structural
 *   welding code states the same rule;
 * - an end of a slot that runs out to the edge of the part needs no rounding.
 */
import type { UnitSystemId } from '../units.js';

/** How one end of a slot is shaped. */
export type SlotEnd = 'semicircular' | 'rounded' | 'to-edge';

interface SystemValues {
  /** Added to t for the least hole diameter or slot width: 5/16 in (8 mm). */
  readonly holeAllowance: number;
  /** Rounding step of the least diameter or width: 1/16 in (1 mm). */
  readonly roundingStep: number;
  /** Whether the rounded value must be an odd (imperial sixteenths) or even (metric mm) count of steps. */
  readonly roundingParity: 'odd' | 'even';
  /** Added to the least diameter for the largest plug hole: 1/8 in (3 mm). */
  readonly diameterTolerance: number;
  /** Thickness up to which the fill must equal the part, and the least fill beyond it: 5/8 in (16 mm). */
  readonly fillThreshold: number;
}

export const PLUG_SLOT_VALUES: Readonly<Record<UnitSystemId, SystemValues>> = Object.freeze({
  imperial: { holeAllowance: 0.3125, roundingStep: 0.0625, roundingParity: 'odd', diameterTolerance: 0.125, fillThreshold: 0.625 },
  metric: { holeAllowance: 8, roundingStep: 1, roundingParity: 'even', diameterTolerance: 3, fillThreshold: 16 },
});

/** Float noise allowed when a value is already on a rounding step or a threshold. */
const SNAP = 1e-9;

/**
 * Rounds x up to the next whole count of `step` whose count is odd (imperial: the next larger
 * odd 1/16 in) or even (metric: the next larger even mm). A value already on such a step is
 * kept: 13/16 in stays 13/16 in, 20 mm stays 20 mm.
 * @cite AISC 360-22 §J2.3b
 */
export function roundUpToParity(x: number, step: number, parity: 'odd' | 'even'): number {
  const n = x / step;
  const nearest = Math.round(n);
  let k = Math.abs(n - nearest) <= SNAP ? nearest : Math.ceil(n);
  const isOdd = Math.abs(k % 2) === 1;
  if ((parity === 'odd') !== isOdd) k += 1;
  return k * step;
}

/**
 * Least diameter of a plug-weld hole in a part of thickness t: t + 5/16 in (8 mm), rounded up
 * to the next larger odd 1/16 in (even mm). The same value is the least width of a slot.
 * @cite AISC 360-22 §J2.3b
 */
export function dMinPlug(t: number, system: UnitSystemId): number {
  const v = PLUG_SLOT_VALUES[system];
  return roundUpToParity(t + v.holeAllowance, v.roundingStep, v.roundingParity);
}

/**
 * Largest diameter of a plug-weld hole: the least diameter plus 1/8 in (3 mm), or 2-1/4 times
 * the thickness of the weld (the depth of fill), whichever is larger.
 * @cite AISC 360-22 §J2.3b
 */
export function dMaxPlug(t: number, fill: number, system: UnitSystemId): number {
  return Math.max(dMinPlug(t, system) + PLUG_SLOT_VALUES[system].diameterTolerance, 2.25 * fill);
}

/** Least centre-to-centre spacing of plug welds, 4 times the hole diameter. @cite AISC 360-22 §J2.3b */
export function sMinPlug(d: number): number {
  return 4 * d;
}

/** Largest length of a slot, 10 times the thickness of the weld (the depth of fill). @cite AISC 360-22 §J2.3b */
export function lMaxSlot(fill: number): number {
  return 10 * fill;
}

/**
 * Least width of a slot in a part of thickness t: t + 5/16 in (8 mm), rounded up to the next
 * larger odd 1/16 in (even mm), as for a plug hole.
 * @cite AISC 360-22 §J2.3b
 */
export function wMinSlot(t: number, system: UnitSystemId): number {
  return dMinPlug(t, system);
}

/** Largest width of a slot, 2-1/4 times the thickness of the weld (the depth of fill). @cite AISC 360-22 §J2.3b */
export function wMaxSlot(fill: number): number {
  return 2.25 * fill;
}

/**
 * Least corner radius of a slot end that is neither semicircular nor run out to the edge of
 * the part: the thickness t of the part containing the slot.
 * @cite AISC 360-22 §J2.3b
 */
export function rMinSlotEnd(t: number): number {
  return t;
}

/** Least spacing of lines of slot welds, transverse to their length: 4 times the slot width. @cite AISC 360-22 §J2.3b */
export function sMinSlotAcross(W: number): number {
  return 4 * W;
}

/** Least centre-to-centre spacing of slots along one line: 2 times the slot length. @cite AISC 360-22 §J2.3b */
export function sMinSlotAlong(L: number): number {
  return 2 * L;
}

/**
 * Least depth of fill of a plug or slot weld in a part of thickness t: in material up to
 * 5/8 in (16 mm) the fill equals t; in thicker material at least t/2 and at least 5/8 in (16 mm).
 * Returns the least depth and whether the rule asks for the full thickness.
 * @cite AISC 360-22 §J2.3b
 */
export function fillMin(t: number, system: UnitSystemId): { depth: number; full: boolean } {
  const threshold = PLUG_SLOT_VALUES[system].fillThreshold;
  if (t <= threshold * (1 + SNAP)) return { depth: t, full: true };
  return { depth: Math.max(t / 2, threshold), full: false };
}

/**
 * Effective shearing area of a plug weld: the nominal area of the hole in the plane of the
 * faying surface, pi·d²/4.
 * @cite AISC 360-22 §J2.3a
 */
export function AwePlug(d: number): number {
  return (Math.PI * d * d) / 4;
}

/** How far an end's shape reaches into the slot from its end, and the area it cuts from the L × W rectangle. */
function endShape(end: SlotEnd, W: number, r: number): { depth: number; cut: number } {
  if (end === 'semicircular') return { depth: W / 2, cut: ((4 - Math.PI) * W * W) / 8 };
  if (end === 'rounded') return { depth: r, cut: ((4 - Math.PI) * r * r) / 2 };
  return { depth: 0, cut: 0 };
}

/**
 * Effective shearing area of a slot weld of overall length L and width W: the nominal area of
 * the slot in the plane of the faying surface. The L × W rectangle less what each end's shape
 * cuts away: a semicircular end (4 - pi)·W²/8, an end with corners rounded to radius r
 * (4 - pi)·r²/2, an end run out to the edge of the part nothing. Both ends semicircular give
 * (L - W)·W + pi·W²/4.
 * @cite AISC 360-22 §J2.3a
 */
export function AweSlot(L: number, W: number, ends: readonly [SlotEnd, SlotEnd], r = 0): number {
  return L * W - endShape(ends[0], W, r).cut - endShape(ends[1], W, r).cut;
}

/**
 * Length of the straight sides of a slot between its end shapes, L - (depth of each end);
 * negative when the ends' shapes do not fit in the given length.
 */
export function slotStraightLength(L: number, W: number, ends: readonly [SlotEnd, SlotEnd], r = 0): number {
  return L - endShape(ends[0], W, r).depth - endShape(ends[1], W, r).depth;
}

/**
 * Perimeter of the wall of a plug hole, pi·d: the line along which the weld fuses to the
 * part that contains the hole. With the depth of fill it gives the shear plane this service
 * checks in that part under the base-metal limit states of §J4.2.
 * @cite AISC 360-22 §J4.2
 */
export function perimeterPlug(d: number): number {
  return Math.PI * d;
}

/**
 * Perimeter of the wall of a slot (the fused line in the part that contains it): both
 * straight sides, plus pi·W/2 for a semicircular end, (W - 2r) + pi·r for an end with rounded
 * corners, and nothing for an end that runs out to the edge (no wall there).
 * @cite AISC 360-22 §J4.2
 */
export function perimeterSlot(L: number, W: number, ends: readonly [SlotEnd, SlotEnd], r = 0): number {
  const endWall = (end: SlotEnd): number => (end === 'semicircular' ? (Math.PI * W) / 2 : end === 'rounded' ? W - 2 * r + Math.PI * r : 0);
  return 2 * slotStraightLength(L, W, ends, r) + endWall(ends[0]) + endWall(ends[1]);
}
