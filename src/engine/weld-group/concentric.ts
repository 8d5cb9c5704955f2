/**
 * Concentric loads on a weld group: the Specification's own rules, not the ICR element law.
 *
 * AISC 360-22 §J2.4 (from memory): a linear group of one leg size (all lines parallel) loaded
 * through its centroid may use the directional increase of Eq. J2-5; a group of one size with
 * lines only longitudinal and transverse to the load takes the larger of Eq. J2-6a and J2-6b.
 * Any other concentric group is taken without the directional increase (Eq. J2-4), which the
 * Specification always permits. The ICR element law is not used here: at intermediate angles it
 * gives less than Eq. J2-5 (the 0.17·w cap on du puts small-angle elements past their peak), and
 * for mixed groups about 0.85·Rnwl + 1.5·Rnwt (weld-rules.md §4).
 *
 * Every strength here comes from the fillet provisions (provisions/fillet.ts); nothing is restated.
 */
import { Fnw, RnMixedGroup, RnWeld, kds } from '../provisions/fillet.js';
import type { UnitSystem } from '../units.js';
import { segmentLength, type Segment } from './geometry.js';

export type ConcentricRule = 'linear' | 'mixed-J2-6a' | 'mixed-J2-6b' | 'no-increase';

export interface ConcentricStrength {
  readonly nominal: number;
  readonly rule: ConcentricRule;
  readonly equation: string;
  /** Angle between the load and each segment, degrees (0 to 90). */
  readonly angles: number[];
  /** Force per unit length each segment carries at the nominal strength, under the rule used. */
  readonly perLength: number[];
  /** Why the directional increase was not used, when it was not. */
  readonly note: string | null;
}

const ANGLE_TOL = 1e-7; // degrees

/** Angle between a direction (unit) and a segment's axis, degrees, 0 to 90. */
export function loadAngle(s: Segment, dx: number, dy: number): number {
  const l = segmentLength(s);
  const tx = (s.to[0] - s.from[0]) / l;
  const ty = (s.to[1] - s.from[1]) / l;
  return (Math.atan2(Math.abs(tx * dy - ty * dx), Math.abs(tx * dx + ty * dy)) * 180) / Math.PI;
}

export function concentricStrength(
  segments: readonly Segment[],
  sizes: readonly number[],
  throats: readonly number[],
  dx: number,
  dy: number,
  FEXX: number,
  units: UnitSystem,
): ConcentricStrength {
  const angles = segments.map((s) => loadAngle(s, dx, dy));
  const areas = segments.map((s, i) => throats[i]! * segmentLength(s));
  const uniform = sizes.every((w) => Math.abs(w - sizes[0]!) <= 1e-12 * sizes[0]!);
  const parallel = segments.every((s) => Math.abs(loadAngle(s, ...axisOf(segments[0]!)) - 0) <= ANGLE_TOL);
  const onlyLongTrans = angles.every((a) => a <= ANGLE_TOL || a >= 90 - ANGLE_TOL);
  const plain = Fnw(FEXX);
  const perUnit = (i: number, factor: number) => RnWeld(Fnw(FEXX, factor), throats[i]!, units);

  if (uniform && parallel) {
    const factors = angles.map((a) => kds(a));
    const nominal = areas.reduce((sum, a, i) => sum + RnWeld(Fnw(FEXX, factors[i]), a, units), 0);
    const increase = factors.some((f) => f > 1);
    return { nominal, rule: 'linear', equation: increase ? 'Eq. J2-4, J2-5' : 'Eq. J2-4', angles, perLength: factors.map((f, i) => perUnit(i, f)), note: null };
  }
  if (uniform && onlyLongTrans) {
    let Rnwl = 0;
    let Rnwt = 0;
    areas.forEach((a, i) => {
      if (angles[i]! <= ANGLE_TOL) Rnwl += RnWeld(plain, a, units);
      else Rnwt += RnWeld(plain, a, units);
    });
    const mixed = RnMixedGroup(Rnwl, Rnwt);
    const perLength = angles.map((a, i) => (mixed.option === 'a' ? perUnit(i, 1) : perUnit(i, a <= ANGLE_TOL ? 0.85 : 1.5)));
    return {
      nominal: mixed.Rn,
      rule: mixed.option === 'a' ? 'mixed-J2-6a' : 'mixed-J2-6b',
      equation: mixed.option === 'a' ? 'Eq. J2-6a' : 'Eq. J2-6b',
      angles,
      perLength,
      note: null,
    };
  }
  const nominal = areas.reduce((sum, a) => sum + RnWeld(plain, a, units), 0);
  return {
    nominal,
    rule: 'no-increase',
    equation: 'Eq. J2-4',
    angles,
    perLength: angles.map((_, i) => perUnit(i, 1)),
    note: uniform
      ? 'the lines are neither all parallel nor all longitudinal or transverse to the load'
      : 'the lines do not all have one effective size (a short segment has its size reduced to length/4)',
  };
}

function axisOf(s: Segment): [number, number] {
  const l = segmentLength(s);
  return [(s.to[0] - s.from[0]) / l, (s.to[1] - s.from[1]) / l];
}
