/**
 * Detailing limits of fillet welds, with the Specification's own metric values (they are not
 * conversions of the imperial ones). Thicknesses and sizes in the system's length unit.
 */
import type { UnitSystemId } from '../units.js';

interface SystemLimits {
  /** Table J2.4 rows: thinner part up to `upTo` (inclusive) needs at least `size`. */
  readonly minSizeRows: ReadonlyArray<{ readonly upTo: number; readonly size: number }>;
  /** Below this edge thickness the fillet may equal the thickness; from it on, t - edgeDeduction. */
  readonly edgeThin: number;
  readonly edgeDeduction: number;
  readonly intermittentMin: number;
  readonly lapMin: number;
  /** Largest fillet usually made in one pass (common practice, no source). */
  readonly singlePassMax: number;
  /** Standard increment of specified fillet sizes (common practice, no source). */
  readonly sizeStep: number;
}

export const DETAILING: Readonly<Record<UnitSystemId, SystemLimits>> = Object.freeze({
  imperial: {
    minSizeRows: [
      { upTo: 0.25, size: 0.125 },
      { upTo: 0.5, size: 0.1875 },
      { upTo: 0.75, size: 0.25 },
      { upTo: Number.POSITIVE_INFINITY, size: 0.3125 },
    ],
    edgeThin: 0.25,
    edgeDeduction: 0.0625,
    intermittentMin: 1.5,
    lapMin: 1,
    singlePassMax: 0.3125,
    sizeStep: 0.0625,
  },
  metric: {
    minSizeRows: [
      { upTo: 6, size: 3 },
      { upTo: 13, size: 5 },
      { upTo: 19, size: 6 },
      { upTo: Number.POSITIVE_INFINITY, size: 8 },
    ],
    edgeThin: 6,
    edgeDeduction: 2,
    intermittentMin: 38,
    lapMin: 25,
    singlePassMax: 8,
    sizeStep: 1,
  },
});

/**
 * Minimum fillet size by the thinner part joined.
 * @cite AISC 360-22 Table J2.4
 */
export function wMin(tThinner: number, system: UnitSystemId): number {
  const rows = DETAILING[system].minSizeRows;
  for (const row of rows) if (tThinner <= row.upTo) return row.size;
  return rows[rows.length - 1]!.size;
}

/**
 * Maximum fillet size along an edge of thickness t: t when t < 1/4 in (6 mm), otherwise
 * t - 1/16 in (2 mm) unless the weld is designated to be built out to full throat.
 * @cite AISC 360-22 §J2.2b
 */
export function wMaxEdge(t: number, system: UnitSystemId): number {
  const d = DETAILING[system];
  return t < d.edgeThin ? t : t - d.edgeDeduction;
}

/** Minimum length of a fillet designed for strength, 4·w. @cite AISC 360-22 §J2.2b */
export function lMin(w: number): number {
  return 4 * w;
}

/** Minimum length of an intermittent segment, max(4·w, 1-1/2 in (38 mm)). @cite AISC 360-22 §J2.2b */
export function lMinIntermittent(w: number, system: UnitSystemId): number {
  return Math.max(4 * w, DETAILING[system].intermittentMin);
}

/** Minimum lap of a lap joint, max(5·t thinner, 1 in (25 mm)). @cite AISC 360-22 §J2.2b */
export function lapMin(tThinner: number, system: UnitSystemId): number {
  return Math.max(5 * tThinner, DETAILING[system].lapMin);
}

/**
 * Thickness of base metal whose shear rupture strength along a line equals the weld metal
 * strength of the fillets on it: t = faces·FEXX·te/Fu (both limit states share phi = 0.75 and
 * Omega = 2.00, so the ratio is the same for LRFD and ASD). For E70 and w = D/16 in this is
 * the Manual's 3.09·D/Fu (one face) and 6.19·D/Fu (both faces).
 * @cite AISC Manual Part 9
 */
export function tMatch(FEXX: number, throat: number, Fu: number, faces: number): number {
  return (faces * FEXX * throat) / Fu;
}
