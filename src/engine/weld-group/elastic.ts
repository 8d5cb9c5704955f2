/**
 * Elastic method for weld groups (AISC Manual Part 8, from memory): the welds act as lines whose
 * stress varies linearly with position; direct and torsional components in the plane, and for
 * loads with components normal to the plane, direct and bending components normal to it, all
 * combined vectorially at the critical point. The weld's strength per unit area is Fnw of
 * Eq. J2-4 (provisions/fillet.ts), with or without the directional increase of Eq. J2-5 at the
 * angle of the in-plane resultant.
 *
 * Stresses are per unit load, in 1/area: the capacity is Fnw·Awe with Awe = 1/max|stress|.
 * Properties are weighted by each segment's effective throat (for one size, by length).
 */
import { EngineError } from '../errors.js';
import { Fnw, RnWeld, kds } from '../provisions/fillet.js';
import type { UnitSystem } from '../units.js';
import { segmentLength, type GroupProperties, type Segment, type Vec2 } from './geometry.js';

const DEG = 180 / Math.PI;
/** Points per segment where the directional capacity is sampled (its minimum is not at an end). */
const SAMPLES = 64;

export interface ElasticResult {
  /** Nominal capacity without the directional increase. */
  readonly capacity: number;
  /** Nominal capacity with the directional increase at the in-plane resultant's angle (null with out-of-plane components). */
  readonly capacityDirectional: number | null;
  /** Where the stress is largest. */
  readonly critical: { readonly segment: number; readonly point: Vec2 };
  /** The largest force per unit length on each segment per unit load (stress × throat). */
  readonly perLength: number[];
  readonly outOfPlane: boolean;
}

/**
 * The load per unit magnitude: force (fx, fy, fz) with |f| = 1, acting at `arm` from the
 * centroid: (ax, ay) in the plane of the welds and az normal to it.
 */
export interface UnitLoad3 {
  readonly f: readonly [number, number, number];
  readonly arm: readonly [number, number, number];
}

export function elasticCapacity(
  segments: readonly Segment[],
  throats: readonly number[],
  props: GroupProperties,
  load: UnitLoad3,
  FEXX: number,
  units: UnitSystem,
): ElasticResult {
  const [fx, fy, fz] = load.f;
  const [ax, ay, az] = load.arm;
  const [cx, cy] = props.centroid;
  // moments about the centroid, M = arm × f
  const mx = ay * fz - az * fy;
  const my = az * fx - ax * fz;
  const mz = ax * fy - ay * fx;
  const A = props.area;
  const Ip = props.polar;
  const outOfPlane = fz !== 0 || mx !== 0 || my !== 0;

  // normal stress sn = fz/A + alpha·x + beta·y with ∫x·sn = -my, ∫y·sn = mx
  let alpha = 0;
  let beta = 0;
  if (mx !== 0 || my !== 0) {
    const { sxx, syy, sxy } = props;
    const det = sxx * syy - sxy * sxy;
    const r1 = -my;
    const r2 = mx;
    if (det > 1e-10 * (sxx + syy) * (sxx + syy)) {
      alpha = (syy * r1 - sxy * r2) / det;
      beta = (sxx * r2 - sxy * r1) / det;
    } else {
      // all welds on one line: it resists bending about the perpendicular axis only
      const s0 = segments[0]!;
      const l0 = segmentLength(s0);
      const tx = (s0.to[0] - s0.from[0]) / l0;
      const ty = (s0.to[1] - s0.from[1]) / l0;
      const along = r1 * tx + r2 * ty;
      const across = -r1 * ty + r2 * tx;
      const scale = Math.max(props.radius, Math.hypot(ax, ay, az));
      if (Math.abs(across) > 1e-9 * scale) {
        throw new EngineError(
          'WELD_GROUP_MOMENT_UNRESISTED',
          'All welds lie on one line and the load bends them about that line, which welds on a single line cannot resist by the elastic method.',
          '/load',
        );
      }
      const k = along / (sxx + syy);
      alpha = k * tx;
      beta = k * ty;
    }
  }

  const stressAt = (x: number, y: number, out: number[]): void => {
    out[0] = fx / A - (mz * y) / Ip;
    out[1] = fy / A + (mz * x) / Ip;
    out[2] = fz / A + alpha * x + beta * y;
  };

  const fnw = Fnw(FEXX);
  let best = Number.POSITIVE_INFINITY;
  let bestSeg = 0;
  let bestPoint: Vec2 = [cx, cy];
  let bestDir = Number.POSITIVE_INFINITY;
  const s = [0, 0, 0];
  const perLength = segments.map((seg, j) => {
    const l = segmentLength(seg);
    const tx = (seg.to[0] - seg.from[0]) / l;
    const ty = (seg.to[1] - seg.from[1]) / l;
    let peak = 0;
    // |stress|² is a convex quadratic along a segment: its largest value is at an end
    for (const p of [seg.from, seg.to]) {
      stressAt(p[0] - cx, p[1] - cy, s);
      const mag = Math.hypot(s[0]!, s[1]!, s[2]!);
      peak = Math.max(peak, mag);
      const cap = mag > 0 ? RnWeld(fnw, 1 / mag, units) : Number.POSITIVE_INFINITY;
      if (cap < best) {
        best = cap;
        bestSeg = j;
        bestPoint = [p[0], p[1]];
      }
    }
    if (!outOfPlane) {
      for (let k = 0; k <= SAMPLES; k++) {
        const t = k / SAMPLES;
        stressAt(seg.from[0] + t * (seg.to[0] - seg.from[0]) - cx, seg.from[1] + t * (seg.to[1] - seg.from[1]) - cy, s);
        const mag = Math.hypot(s[0]!, s[1]!);
        if (!(mag > 0)) continue;
        const theta = Math.atan2(Math.abs(tx * s[1]! - ty * s[0]!), Math.abs(tx * s[0]! + ty * s[1]!)) * DEG;
        bestDir = Math.min(bestDir, RnWeld(Fnw(FEXX, kds(theta)), 1 / mag, units));
      }
    }
    return peak * throats[j]!;
  });
  return {
    capacity: best,
    capacityDirectional: outOfPlane ? null : bestDir,
    critical: { segment: bestSeg, point: bestPoint },
    perLength,
    outOfPlane,
  };
}
