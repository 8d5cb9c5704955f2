/**
 * Memory over repeated rounds of work, measured where it can be measured without noise: the
 * V8 heap in use right after a full garbage collection. Resident memory (what `npm run bench`
 * reports) also holds whatever the heap and the allocator keep from their high-water mark, and
 * moves by ±20 % between two samples of an idle process; a leak shows as heap in use that
 * grows from round to round. The app is built in this process (the routes, hooks, logging off)
 * and driven with in-process requests: full and compact batches (JSON and NDJSON), fillet and
 * eccentric-group checks and the GET value form, every round the same.
 *
 *   npm run bench:memory                 8 rounds, PASS/FAIL: heap after GC grows < 5 % from round 2 to the last
 *   npm run bench:memory -- --short      2 small rounds: checks the script runs (CI), no verdict
 */
import type { FastifyInstance } from 'fastify';
import { buildApp } from '../src/app.js';
import { fmt, table } from './lib.js';
import { eccentric, fillet } from './payloads.js';

const args = process.argv.slice(2);
const short = args.includes('--short');
const ROUNDS = short ? 2 : 8;
const SCALE = short ? 0.1 : 1;

const gc = (globalThis as { gc?: () => void }).gc;
if (!gc) {
  console.error('bench:memory needs node --expose-gc (npm run bench:memory passes it).');
  process.exit(2);
}

const items = Array.from({ length: 1000 }, (_, i) => ({ kind: 'fillet', id: `WS-M${i}`, ...fillet }));
const batchJson = JSON.stringify(items);
const batchNdjson = items.map((it) => JSON.stringify(it)).join('\n');
const filletJson = JSON.stringify(fillet);
const eccentricJson = JSON.stringify(eccentric);
const valueForm =
  '/v1/fillet/check?method=LRFD&electrode=E70&welds.0.size=5/16&welds.0.length=10&welds.0.count=2&load.force=120' +
  '&parts.0.thickness=1/2&parts.0.steel=A572-50&parts.0.faces=2&parts.1.thickness=3/4&parts.1.steel=A992&format=value&field=utilization';

async function post(app: FastifyInstance, url: string, payload: string, contentType = 'application/json'): Promise<void> {
  const res = await app.inject({ method: 'POST', url, headers: { 'content-type': contentType }, payload });
  if (res.statusCode !== 200) throw new Error(`${url}: ${res.statusCode} ${res.body.slice(0, 200)}`);
}

async function round(app: FastifyInstance): Promise<void> {
  const times = (n: number): number => Math.max(1, Math.round(n * SCALE));
  for (let i = 0; i < times(20); i++) await post(app, '/v1/batch', batchJson);
  for (let i = 0; i < times(10); i++) await post(app, '/v1/batch?fields=status,utilization,governing.code', batchNdjson, 'application/x-ndjson');
  for (let i = 0; i < times(500); i++) await post(app, '/v1/fillet/check', filletJson);
  for (let i = 0; i < times(100); i++) await post(app, '/v1/weld-group/eccentric', eccentricJson);
  for (let i = 0; i < times(200); i++) {
    const res = await app.inject({ url: valueForm });
    if (res.statusCode !== 200) throw new Error(`GET value form: ${res.statusCode}`);
  }
}

async function main(): Promise<void> {
  const app = await buildApp({ config: { DOCS: false } });
  const rows = [['round', 'heap in use after GC, MiB', 'external, MiB', 'resident, MiB']];
  const heap: number[] = [];
  for (let r = 1; r <= ROUNDS; r++) {
    await round(app);
    gc!();
    gc!();
    const m = process.memoryUsage();
    heap.push(m.heapUsed / 1048576);
    rows.push([String(r), fmt(m.heapUsed / 1048576), fmt(m.external / 1048576), fmt(m.rss / 1048576)]);
  }
  await app.close();
  console.log(`\nThroatline memory over ${ROUNDS} rounds (each: ${Math.round(20 * SCALE) * 1000} full and ${Math.round(10 * SCALE) * 1000} compact batch items, ` +
    `${Math.round(500 * SCALE)} fillet, ${Math.round(100 * SCALE)} eccentric and ${Math.round(200 * SCALE)} GET value answers), in process:\n`);
  console.log(table(rows));
  console.log('');
  const growth = heap[heap.length - 1]! / heap[Math.min(1, heap.length - 1)]! - 1;
  const ok = growth < 0.05;
  console.log(`${short ? 'INFO' : ok ? 'PASS' : 'FAIL'}  heap in use after GC, round 2 to round ${ROUNDS}: ${fmt(growth * 100)} % (no growth: < 5 %)`);
}

main().catch((err: unknown) => {
  console.error(err);
  process.exit(1);
});
