/** Engine micro-benchmarks of the weld families beyond fillets, run by engine-bench.ts. */
import { IMPERIAL } from '../src/engine/units.js';
import { discretise } from '../src/engine/weld-group/discretise.js';
import { groupProperties, shapeSegments, type Segment } from '../src/engine/weld-group/geometry.js';
import { solveIcr, type IcrLoad } from '../src/engine/weld-group/icr-solver.js';
import { pjpCheck } from '../src/operations/groove.js';

const W = 0.25;
const TE = W * Math.SQRT1_2;

/** An ICR solve of a group meshed with `perSegment` elements per segment (the mesh is built once). */
function icrSolve(segments: Segment[], perSegment: number, load: IcrLoad): () => unknown {
  const throats = segments.map(() => TE);
  const props = groupProperties(segments, throats);
  const mesh = discretise(segments, segments.map(() => W), throats, segments.map(() => perSegment), props, 70, IMPERIAL);
  return () => solveIcr(mesh, load).capacity;
}

const ring: Segment[] = Array.from({ length: 50 }, (_, i) => {
  const a0 = (2 * Math.PI * i) / 50;
  const a1 = (2 * Math.PI * (i + 1)) / 50;
  return { from: [10 * Math.cos(a0), 10 * Math.sin(a0)], to: [10 * Math.cos(a1), 10 * Math.sin(a1)] };
});

const pjpBody = Object.values(pjpCheck.examples)[0]!.value;

export const benches: Array<{ name: string; fn: () => unknown; targetNs?: number }> = [
  { name: 'PJP check (mapping + engine + envelope)', fn: () => pjpCheck.run(pjpBody) },
  { name: 'ICR solve, C shape, 3 × 100 elements', fn: icrSolve(shapeSegments({ shape: 'C', height: 10, width: 4, rotation: 0, origin: [0, 0] }), 100, { dx: 0, dy: -1, e: -11.1 }), targetNs: 100_000 },
  { name: 'ICR solve, 50-sided ring, 50 × 100 elements', fn: icrSolve(ring, 100, { dx: 0.6, dy: -0.8, e: 25 }), targetNs: 2_000_000 },
];
