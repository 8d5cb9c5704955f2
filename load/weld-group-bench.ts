/**
 * Eccentric weld group micro-benchmark: nanoseconds per ICR solve for a three-segment group
 * (a C, 3 × 100 elements) and a fifty-segment group (a 50-sided ring, 50 × 100 elements), the
 * elements per second, the ratio of the ICR solve to the elastic method on the same group, and
 * the ratio to a trivial arithmetic loop timed in the same run (so the figures travel between
 * machines as ratios). Prints only; no assertions.
 *
 * The solver makes its work arrays once per solve (a few Float64Arrays of the element count) and
 * allocates nothing inside its iterations: `node --trace-gc` over a loop of solves shows the
 * scavenges growing with the element count times the number of solves, not with the iterations.
 *
 *   npm run bench:weld-group            full run
 *   npm run bench:weld-group -- --short quick run
 */
import { benchSink, fmt, median, nsPerCall, table } from './lib.js';
import { IMPERIAL } from '../src/engine/units.js';
import { discretise } from '../src/engine/weld-group/discretise.js';
import { elasticCapacity } from '../src/engine/weld-group/elastic.js';
import { groupProperties, shapeSegments, type Segment } from '../src/engine/weld-group/geometry.js';
import { solveIcr, type IcrLoad } from '../src/engine/weld-group/icr-solver.js';
import { analyseWeldGroup } from '../src/engine/weld-group/check.js';

const short = process.argv.includes('--short');
const ROUNDS = short ? 1 : 5;
const TARGET_MS = short ? 30 : 400;

const trivial = (() => {
  let x = 1.0001;
  return () => {
    for (let i = 0; i < 100; i++) x = x * 1.0000001 + 0.5 / x;
    return x;
  };
})();

const W = 0.25;
const TE = W * Math.SQRT1_2;

interface Case {
  name: string;
  segments: Segment[];
  perSegment: number;
  load: IcrLoad;
}

const ring: Segment[] = Array.from({ length: 50 }, (_, i) => {
  const a0 = (2 * Math.PI * i) / 50;
  const a1 = (2 * Math.PI * (i + 1)) / 50;
  return { from: [10 * Math.cos(a0), 10 * Math.sin(a0)], to: [10 * Math.cos(a1), 10 * Math.sin(a1)] };
});

const cases: Case[] = [
  { name: 'C 10 × 4 in, 3 × 100 elements', segments: shapeSegments({ shape: 'C', height: 10, width: 4, rotation: 0, origin: [0, 0] }), perSegment: 100, load: { dx: 0, dy: -1, e: -11.1 } },
  { name: '50-sided ring, 50 × 100 elements', segments: ring, perSegment: 100, load: { dx: 0.6, dy: -0.8, e: 25 } },
];

const rows = [['case', 'ns per ICR solve', 'elements/s', 'ns per element per solve', 'ICR / elastic', 'ICR / trivial loop', 'iterations']];
const base = median(Array.from({ length: ROUNDS }, () => nsPerCall(trivial, TARGET_MS, 20, 8)));
for (const c of cases) {
  const throats = c.segments.map(() => TE);
  const props = groupProperties(c.segments, throats);
  const mesh = discretise(c.segments, c.segments.map(() => W), throats, c.segments.map(() => c.perSegment), props, 70, IMPERIAL);
  const icr = () => solveIcr(mesh, c.load).capacity;
  const arm: [number, number, number] = [c.load.e * c.load.dy, -c.load.e * c.load.dx, 0];
  const elastic = () => elasticCapacity(c.segments, throats, props, { f: [c.load.dx, c.load.dy, 0], arm }, 70, IMPERIAL).capacity;
  const icrNs = median(Array.from({ length: ROUNDS }, () => nsPerCall(icr, TARGET_MS, 20, 8)));
  const elasticNs = median(Array.from({ length: ROUNDS }, () => nsPerCall(elastic, TARGET_MS, 20, 8)));
  const iterations = solveIcr(mesh, c.load).iterations;
  rows.push([c.name, fmt(icrNs), fmt((mesh.n / icrNs) * 1e9), fmt(icrNs / mesh.n), fmt(icrNs / elasticNs), fmt(icrNs / base), String(iterations)]);
}

// the whole answer (ICR, elastic, sizing check, the half-element error estimate, values)
const fullNs = median(
  Array.from({ length: ROUNDS }, () =>
    nsPerCall(
      () =>
        analyseWeldGroup({
          method: 'LRFD', units: 'imperial', electrode: 'E70', size: 0.25, segments: null,
          shape: { shape: 'C', height: 10, width: 4, rotation: 0, origin: [0, 0] },
          load: { direction: [0, -1, 0], magnitude: 30, at: [12, 5], eccentricity: null, standoff: 0 },
          parts: [], analysis: 'icr', elements: null, referenceLength: null, estimateError: true,
        }).result.utilization,
      TARGET_MS,
      20,
      8,
    ),
  ),
);

console.log(`\nThroatline eccentric weld group benchmark, median of ${ROUNDS} round(s); trivial loop (100 steps): ${fmt(base)} ns\n`);
console.log(table(rows));
console.log(`\nwhole answer for the C (ICR + half-element estimate + elastic + sizing): ${fmt(fullNs)} ns (${fmt(fullNs / base)} × trivial loop)`);
if (benchSink() === -1) console.log('');
