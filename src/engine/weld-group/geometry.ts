/**
 * Geometry of a weld group: straight segments of one fillet size in the plane of the faying
 * surface, the shape shortcuts, the checks that make a list of segments a weld that can exist,
 * and the section properties of the group (lines weighted by their effective throat).
 * Pure; lengths in the request's unit.
 */
import { EngineError } from '../errors.js';

export type Vec2 = readonly [number, number];

export interface Segment {
  readonly from: Vec2;
  readonly to: Vec2;
}

/** The shape shortcuts. Unrotated, the main lines are vertical, `height` long, from y = 0 up. */
export type ShapeName = 'line' | 'parallel' | 'C' | 'L' | 'box';

export const SHAPE_NAMES: readonly ShapeName[] = ['line', 'parallel', 'C', 'L', 'box'];

export interface ShapeSpec {
  readonly shape: ShapeName;
  /** Length of the main (unrotated: vertical) lines. */
  readonly height: number;
  /** Spacing of parallel lines, or length of the flanges / horizontal lines. Ignored for a line. */
  readonly width: number;
  /** Rotation of the whole shape about the origin, degrees counter-clockwise. */
  readonly rotation: number;
  /** Where the shape's origin (its lower-left corner unrotated) is placed. */
  readonly origin: Vec2;
}

/** cos/sin of an angle in degrees, exact at multiples of 90 degrees. */
export function cosSinDeg(deg: number): [number, number] {
  const r = (((deg % 360) + 360) % 360) / 90;
  if (Number.isInteger(r)) return [[1, 0, -1, 0][r]!, [0, 1, 0, -1][r]!];
  const a = (deg * Math.PI) / 180;
  return [Math.cos(a), Math.sin(a)];
}

/**
 * Segments of a shape shortcut. Unrotated, with the origin at (0, 0):
 * line: x = 0 from y = 0 to height; parallel: lines at x = 0 and x = width; C: the back at x = 0
 * with flanges along y = 0 and y = height running to x = width (open towards +x); L: the back at
 * x = 0 and one flange along y = 0; box: the rectangle width × height.
 */
export function shapeSegments(spec: ShapeSpec): Segment[] {
  const h = spec.height;
  const b = spec.width;
  const raw: Array<[number, number, number, number]> = [];
  switch (spec.shape) {
    case 'line':
      raw.push([0, 0, 0, h]);
      break;
    case 'parallel':
      raw.push([0, 0, 0, h], [b, 0, b, h]);
      break;
    case 'C':
      raw.push([b, 0, 0, 0], [0, 0, 0, h], [0, h, b, h]);
      break;
    case 'L':
      raw.push([0, h, 0, 0], [0, 0, b, 0]);
      break;
    case 'box':
      raw.push([0, 0, b, 0], [b, 0, b, h], [b, h, 0, h], [0, h, 0, 0]);
      break;
  }
  const [c, s] = cosSinDeg(spec.rotation);
  const [ox, oy] = spec.origin;
  const place = (x: number, y: number): Vec2 => [ox + c * x - s * y, oy + s * x + c * y];
  return raw.map(([x0, y0, x1, y1]) => ({ from: place(x0, y0), to: place(x1, y1) }));
}

/** The length the Manual's tables call l for a shape: its main lines' length. */
export function shapeReferenceLength(spec: ShapeSpec): number {
  return spec.height;
}

export function segmentLength(s: Segment): number {
  return Math.hypot(s.to[0] - s.from[0], s.to[1] - s.from[1]);
}

/** Shortest segment taken as a weld: the contract's smallest length (0.001 in or mm). */
export const MIN_SEGMENT_LENGTH = 0.001;

/** Largest coordinate magnitude and extent of the segments: the scale for tolerances. */
export function geometryScale(segments: readonly Segment[]): number {
  let m = 0;
  for (const s of segments) m = Math.max(m, Math.abs(s.from[0]), Math.abs(s.from[1]), Math.abs(s.to[0]), Math.abs(s.to[1]), segmentLength(s));
  return m;
}

/**
 * Checks that the segments describe welds that can exist: every segment has a length, and no two
 * segments lie on one line over a common length (one weld counted twice). Segments that cross or
 * meet at a point are fine. Throws EngineError (422) with the pointer of the later segment.
 */
export function validateSegments(segments: readonly Segment[], pointerOf: (i: number) => string): void {
  const scale = geometryScale(segments);
  const tol = 1e-9 * Math.max(scale, Number.MIN_VALUE);
  segments.forEach((s, i) => {
    const l = segmentLength(s);
    if (!(l > tol) || !(l >= MIN_SEGMENT_LENGTH)) {
      throw new EngineError(
        'WELD_GROUP_GEOMETRY_ZERO_LENGTH',
        `segments[${i}] from (${s.from.join(', ')}) to (${s.to.join(', ')}) is ${l === 0 ? 'a point' : `${Number(l.toPrecision(3))} long, less than ${MIN_SEGMENT_LENGTH}`}, so it is no weld.`,
        pointerOf(i),
      );
    }
  });
  for (let j = 1; j < segments.length; j++) {
    const b = segments[j]!;
    const lb = segmentLength(b);
    const ux = (b.to[0] - b.from[0]) / lb;
    const uy = (b.to[1] - b.from[1]) / lb;
    for (let i = 0; i < j; i++) {
      const a = segments[i]!;
      // distance of both ends of a from the line of b
      const d0 = (a.from[0] - b.from[0]) * uy - (a.from[1] - b.from[1]) * ux;
      const d1 = (a.to[0] - b.from[0]) * uy - (a.to[1] - b.from[1]) * ux;
      if (Math.abs(d0) > tol || Math.abs(d1) > tol) continue;
      // collinear: overlap of the projections on b's axis
      const s0 = (a.from[0] - b.from[0]) * ux + (a.from[1] - b.from[1]) * uy;
      const s1 = (a.to[0] - b.from[0]) * ux + (a.to[1] - b.from[1]) * uy;
      const overlap = Math.min(Math.max(s0, s1), lb) - Math.max(Math.min(s0, s1), 0);
      if (overlap > tol) {
        throw new EngineError(
          'WELD_GROUP_GEOMETRY_OVERLAP',
          `segments[${j}] and segments[${i}] lie on one line and overlap over ${Number(overlap.toPrecision(4))}: one weld would be counted twice.`,
          pointerOf(j),
        );
      }
    }
  }
}

/** Section properties of a group of lines, each weighted by its effective throat. */
export interface GroupProperties {
  /** Total length of the lines. */
  readonly length: number;
  /** Total effective area, sum of throat × length. */
  readonly area: number;
  /** Centroid of the effective areas (of the lines, for one size). */
  readonly centroid: Vec2;
  /** Second moments of the effective area about the centroid: ∫x², ∫y², ∫xy. */
  readonly sxx: number;
  readonly syy: number;
  readonly sxy: number;
  /** Polar moment about the centroid, sxx + syy. */
  readonly polar: number;
  /** Polar radius of gyration, sqrt(polar / area): the group's characteristic length. */
  readonly radius: number;
}

export function groupProperties(segments: readonly Segment[], throats: readonly number[]): GroupProperties {
  let length = 0;
  let area = 0;
  let mx = 0;
  let my = 0;
  segments.forEach((s, i) => {
    const l = segmentLength(s);
    const a = throats[i]! * l;
    length += l;
    area += a;
    mx += a * (s.from[0] + s.to[0]) * 0.5;
    my += a * (s.from[1] + s.to[1]) * 0.5;
  });
  const cx = mx / area;
  const cy = my / area;
  let sxx = 0;
  let syy = 0;
  let sxy = 0;
  segments.forEach((s, i) => {
    const l = segmentLength(s);
    const a = throats[i]! * l;
    const mxs = (s.from[0] + s.to[0]) * 0.5 - cx;
    const mys = (s.from[1] + s.to[1]) * 0.5 - cy;
    const dx = s.to[0] - s.from[0];
    const dy = s.to[1] - s.from[1];
    // a line from m - d/2 to m + d/2: ∫x² = a·(mx² + dx²/12), and likewise
    sxx += a * (mxs * mxs + (dx * dx) / 12);
    syy += a * (mys * mys + (dy * dy) / 12);
    sxy += a * (mxs * mys + (dx * dy) / 12);
  });
  const polar = sxx + syy;
  return { length, area, centroid: [cx, cy], sxx, syy, sxy, polar, radius: Math.sqrt(polar / area) };
}
