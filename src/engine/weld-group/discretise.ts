/**
 * Discretisation of a weld group for the ICR solver: each segment is cut into equal elements
 * (forces act at element centres, midpoint rule), and the element end points ("nodes", weld
 * ends included) are the points where the critical deformation ratio du/r is sought.
 *
 * Everything lives in flat Float64Arrays built once per solve, so that the solver's iterations
 * touch no allocator. Coordinates are relative to the group's centroid.
 */
import { Fnw, RnWeld } from '../provisions/fillet.js';
import type { UnitSystem } from '../units.js';
import { segmentLength, type GroupProperties, type Segment } from './geometry.js';

/** Bounds on the element count (the schema enforces the same). */
export const MIN_ELEMENTS_PER_SEGMENT = 4;
export const MAX_ELEMENTS = 20000;
/** Default: this many elements per segment on average, spread in proportion to length. */
export const DEFAULT_ELEMENTS_PER_SEGMENT = 100;

export interface Mesh {
  /** Number of elements and of nodes. */
  readonly n: number;
  readonly nodes: number;
  /** Element centres (relative to the centroid), unit axes, effective size, Fnw·Awe (no increase), length, segment. */
  readonly x: Float64Array;
  readonly y: Float64Array;
  readonly tx: Float64Array;
  readonly ty: Float64Array;
  readonly w: Float64Array;
  readonly strength: Float64Array;
  readonly len: Float64Array;
  readonly seg: Int32Array;
  /** Nodes: position, axis of their segment, effective size, segment. */
  readonly nx: Float64Array;
  readonly ny: Float64Array;
  readonly ntx: Float64Array;
  readonly nty: Float64Array;
  readonly nw: Float64Array;
  readonly nseg: Int32Array;
  /** First element of each segment (length segments + 1). */
  readonly segStart: Int32Array;
  /** Centroid (absolute) and characteristic length (polar radius of gyration). */
  readonly cx: number;
  readonly cy: number;
  readonly lc: number;
}

/** Elements per segment for a total count, in proportion to length, at least MIN_ELEMENTS_PER_SEGMENT each. */
export function elementCounts(lengths: readonly number[], total: number): number[] {
  const sum = lengths.reduce((a, b) => a + b, 0);
  return lengths.map((l) => Math.max(MIN_ELEMENTS_PER_SEGMENT, Math.round((total * l) / sum)));
}

/**
 * Builds the mesh. `sizes` and `throats` are the effective size and throat of each segment;
 * `counts` the elements of each segment.
 */
export function discretise(
  segments: readonly Segment[],
  sizes: readonly number[],
  throats: readonly number[],
  counts: readonly number[],
  props: GroupProperties,
  FEXX: number,
  units: UnitSystem,
): Mesh {
  const n = counts.reduce((a, b) => a + b, 0);
  const nodes = n + segments.length;
  const { x, y, tx, ty, w, strength, len, nx, ny, ntx, nty, nw, seg, nseg, segStart } = meshArrays(n, nodes, segments.length);
  const [cx, cy] = props.centroid;
  const fnw = Fnw(FEXX);
  let e = 0;
  let k = 0;
  segments.forEach((s, j) => {
    const l = segmentLength(s);
    const m = counts[j]!;
    const ux = (s.to[0] - s.from[0]) / l;
    const uy = (s.to[1] - s.from[1]) / l;
    const x0 = s.from[0] - cx;
    const y0 = s.from[1] - cy;
    const dx = s.to[0] - s.from[0];
    const dy = s.to[1] - s.from[1];
    const el = l / m;
    const elementStrength = RnWeld(fnw, throats[j]! * el, units);
    segStart[j] = e;
    for (let i = 0; i < m; i++, e++) {
      const t = (i + 0.5) / m;
      x[e] = x0 + t * dx;
      y[e] = y0 + t * dy;
      tx[e] = ux;
      ty[e] = uy;
      w[e] = sizes[j]!;
      strength[e] = elementStrength;
      len[e] = el;
      seg[e] = j;
    }
    for (let i = 0; i <= m; i++, k++) {
      const t = i / m;
      nx[k] = x0 + t * dx;
      ny[k] = y0 + t * dy;
      ntx[k] = ux;
      nty[k] = uy;
      nw[k] = sizes[j]!;
      nseg[k] = j;
    }
  });
  segStart[segments.length] = e;
  return { n, nodes, x, y, tx, ty, w, strength, len, seg, nx, ny, ntx, nty, nw, nseg, segStart, cx, cy, lc: props.radius };
}

/**
 * The arrays of a mesh of `n` elements, `nodes` nodes and `segments` segments, all views of one
 * buffer: one allocation instead of fifteen (a typed array's own buffer is a separate native
 * allocation, and an eccentric answer builds several meshes).
 */
function meshArrays(n: number, nodes: number, segments: number) {
  const buffer = new ArrayBuffer(8 * (7 * n + 5 * nodes) + 4 * (n + nodes + segments + 1));
  let at = 0;
  const f64 = (length: number): Float64Array => {
    const a = new Float64Array(buffer, at, length);
    at += 8 * length;
    return a;
  };
  const i32 = (length: number): Int32Array => {
    const a = new Int32Array(buffer, at, length);
    at += 4 * length;
    return a;
  };
  return {
    x: f64(n), y: f64(n), tx: f64(n), ty: f64(n), w: f64(n), strength: f64(n), len: f64(n),
    nx: f64(nodes), ny: f64(nodes), ntx: f64(nodes), nty: f64(nodes), nw: f64(nodes),
    seg: i32(n), nseg: i32(nodes), segStart: i32(segments + 1),
  };
}

/**
 * A coarser mesh of the same welds: each segment's elements merged in consecutive runs of about
 * `factor` (at least MIN_ELEMENTS_PER_SEGMENT elements per segment are kept). A merged element
 * sits at the centroid of its run, with the run's length and strength; the nodes are the runs'
 * end points. The solver uses it to find a starting motion cheaply.
 */
export function coarsen(mesh: Mesh, factor: number): Mesh {
  const segments = mesh.segStart.length - 1;
  const counts: number[] = [];
  for (let j = 0; j < segments; j++) {
    const m = mesh.segStart[j + 1]! - mesh.segStart[j]!;
    counts.push(Math.min(m, Math.max(MIN_ELEMENTS_PER_SEGMENT, Math.ceil(m / factor))));
  }
  const n = counts.reduce((a, b) => a + b, 0);
  const nodes = n + segments;
  const { x, y, tx, ty, w, strength, len, nx, ny, ntx, nty, nw, seg, nseg, segStart } = meshArrays(n, nodes, segments);
  let e = 0;
  let k = 0;
  /** Coarse node k is fine node `from` (on segment j). */
  const copyNode = (from: number, j: number): void => {
    nx[k] = mesh.nx[from]!;
    ny[k] = mesh.ny[from]!;
    ntx[k] = mesh.ntx[from]!;
    nty[k] = mesh.nty[from]!;
    nw[k] = mesh.nw[from]!;
    nseg[k] = j;
    k++;
  };
  for (let j = 0; j < segments; j++) {
    const first = mesh.segStart[j]!;
    const m = mesh.segStart[j + 1]! - first;
    const mc = counts[j]!;
    const firstNode = first + j;
    segStart[j] = e;
    for (let g = 0; g < mc; g++, e++) {
      // fine elements [a, b) of the segment make coarse element g
      const a = Math.round((g * m) / mc);
      const b = Math.round(((g + 1) * m) / mc);
      let sl = 0;
      let sx = 0;
      let sy = 0;
      let ss = 0;
      for (let i = first + a; i < first + b; i++) {
        sl += mesh.len[i]!;
        sx += mesh.len[i]! * mesh.x[i]!;
        sy += mesh.len[i]! * mesh.y[i]!;
        ss += mesh.strength[i]!;
      }
      x[e] = sx / sl;
      y[e] = sy / sl;
      tx[e] = mesh.tx[first]!;
      ty[e] = mesh.ty[first]!;
      w[e] = mesh.w[first]!;
      strength[e] = ss;
      len[e] = sl;
      seg[e] = j;
      copyNode(firstNode + a, j);
    }
    // the segment's far end
    copyNode(firstNode + m, j);
  }
  segStart[segments] = e;
  return { n, nodes, x, y, tx, ty, w, strength, len, seg, nx, ny, ntx, nty, nw, nseg, segStart, cx: mesh.cx, cy: mesh.cy, lc: mesh.lc };
}
