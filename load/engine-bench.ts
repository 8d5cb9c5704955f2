/**
 * Engine micro-benchmarks: nanoseconds per call of the pure checks, each printed with its
 * ratio to a trivial arithmetic loop timed in the same run (so the figures travel between
 * machines as ratios). Prints PASS/FAIL against the targets; never used by tests.
 *
 * It runs compiled by tsc (tsconfig.bench.json into .bench/), as the service ships: under a
 * just-in-time TypeScript loader the module bindings became getter calls and the fillet check
 * measured about twice as slow.
 *
 *   npm run bench:engine            full run
 *   npm run bench:engine -- --short quick run (CI): checks it runs
 */
import { checkFillet, type FilletRequest } from '../src/engine/fillet.js';
import { benches as extraBenches } from './engine-bench-extra.js';
import { benchSink, fmt, median, nsPerCall, table } from './lib.js';

const short = process.argv.includes('--short');
const ROUNDS = short ? 1 : 5;
const TARGET_MS = short ? 20 : 300;


const trivial = (() => {
  let x = 1.0001;
  return () => {
    x = x * 1.0000001 + 0.5 / x;
    return x;
  };
})();

const fillet: FilletRequest = {
  method: 'LRFD', units: 'imperial', electrode: 'E70',
  welds: [{ legs: [0.3125, 0.3125], length: 10, angle: 0, count: 2, endLoaded: false, builtOut: false, intermittent: null }],
  parts: [
    { thickness: 0.5, steel: 'A572-50', edge: false, faces: 2, loading: 'shear' },
    { thickness: 0.75, steel: 'A992', edge: false, faces: 1, loading: 'shear' },
  ],
  demand: 120, directionalIncrease: true, lap: null, flatBarWidth: null,
};

interface Bench {
  name: string;
  fn: () => unknown;
  targetNs?: number;
}

const benches: Bench[] = [
  { name: 'trivial arithmetic (baseline)', fn: trivial },
  { name: 'fillet check (1 line, 2 parts)', fn: () => checkFillet(fillet), targetNs: 1000 },
];

// Families that land later register their own benchmarks here.
benches.push(...extraBenches);

const samples = new Map<string, number[]>();
for (let r = 0; r < ROUNDS; r++) {
  for (const b of benches) samples.set(b.name, [...(samples.get(b.name) ?? []), nsPerCall(b.fn, TARGET_MS)]);
}
const base = median(samples.get(benches[0]!.name)!);
const rows = [['benchmark', 'ns/call', 'ratio to trivial loop', 'target']];
const verdicts: string[] = [];
for (const b of benches) {
  const ns = median(samples.get(b.name)!);
  rows.push([b.name, fmt(ns), fmt(ns / base), b.targetNs ? `< ${fmt(b.targetNs)} ns` : '']);
  if (b.targetNs) verdicts.push(`${short ? 'INFO' : ns < b.targetNs ? 'PASS' : 'FAIL'}  ${b.name}: ${fmt(ns)} ns (target < ${fmt(b.targetNs)} ns)`);
}
console.log(`\nThroatline engine micro-benchmarks, median of ${ROUNDS} round(s)\n`);
console.log(table(rows));
console.log('');
for (const v of verdicts) console.log(v);
if (benchSink() === -1) console.log('');
