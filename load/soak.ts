/**
 * Soak: the real server (a child process on a loopback port) under sustained concurrency for a
 * bounded time, with a mix of valid, invalid and oversized requests. Reports transport errors,
 * 5xx answers, answers other than the one each request must get, latency percentiles and the
 * server's memory growth, then stops the server with SIGTERM. Exits 1 when any request failed,
 * got a 5xx or an unexpected status, or the server did not stop cleanly.
 *
 *   npm run soak                       20 s, 32 concurrent clients
 *   npm run soak -- --seconds 5        a short run (CI)
 *   npm run soak -- --concurrency 64 --built   against dist/throatline.js (after npm run build)
 *
 * Traffic goes to 127.0.0.1 only; the loop stops at the deadline.
 */
import { spawn } from 'node:child_process';
import { Agent, request } from 'node:http';
import { createServer } from 'node:net';
import { setTimeout as delay } from 'node:timers/promises';
import { fileURLToPath } from 'node:url';
import { fmt, rssMiB, table } from './lib.js';

const ROOT = fileURLToPath(new URL('../', import.meta.url));

function arg(name: string, fallback: number): number {
  const i = process.argv.indexOf(`--${name}`);
  if (i === -1) return fallback;
  const v = Number(process.argv[i + 1]);
  if (!Number.isFinite(v) || v <= 0) throw new Error(`--${name} needs a positive number`);
  return v;
}
const SECONDS = arg('seconds', 20);
const CONCURRENCY = Math.round(arg('concurrency', 32));
const BUILT = process.argv.includes('--built');
const BODY_LIMIT = 65536;
const JSON_MAX_DEPTH = 32;

// ---------------------------------------------------------------- the request mix (our WS workshop)
const FILLET = { method: 'LRFD', electrode: 'E70', welds: [{ size: '5/16', length: 10, count: 2 }], load: { force: 120 }, parts: [{ thickness: 0.5, steel: 'A572-50', faces: 2 }, { thickness: 0.75, steel: 'A992' }] };
const ECCENTRIC = { method: 'LRFD', electrode: 'E70', size: '1/4', segments: [{ from: [0, 0], to: [0, 10] }, { from: [0, 10], to: [4, 10] }, { from: [0, 0], to: [4, 0] }], load: { fx: 0, fy: -30, at: [8, 5] } };
const GET_FORM =
  '/v1/fillet/check?method=LRFD&electrode=E70&welds.0.size=5/16&welds.0.length=10&welds.0.count=2&load.force=120' +
  '&parts.0.thickness=1/2&parts.0.steel=A572-50&parts.0.faces=2&parts.1.thickness=3/4&parts.1.steel=A992&format=value&field=utilization';

interface Scenario {
  name: string;
  weight: number;
  method: 'GET' | 'POST';
  path: string;
  body?: string;
  expect: number;
}

const SCENARIOS: Scenario[] = [
  { name: 'fillet check', weight: 35, method: 'POST', path: '/v1/fillet/check', body: JSON.stringify(FILLET), expect: 200 },
  { name: 'GET form, one value', weight: 15, method: 'GET', path: GET_FORM, expect: 200 },
  { name: 'eccentric weld group', weight: 10, method: 'POST', path: '/v1/weld-group/eccentric', body: JSON.stringify(ECCENTRIC), expect: 200 },
  { name: 'batch of 50', weight: 5, method: 'POST', path: '/v1/batch', body: JSON.stringify(Array.from({ length: 50 }, (_, i) => ({ kind: 'fillet', id: `WS-B${i}`, ...FILLET }))), expect: 200 },
  { name: 'invalid: schema', weight: 10, method: 'POST', path: '/v1/fillet/check', body: JSON.stringify({ ...FILLET, welds: [{ size: -1, length: 'ten' }], colour: 'red' }), expect: 400 },
  { name: 'invalid: malformed JSON', weight: 5, method: 'POST', path: '/v1/fillet/check', body: '{"method":"LRFD","welds":[', expect: 400 },
  { name: 'invalid: too deep', weight: 5, method: 'POST', path: '/v1/fillet/check', body: `${'['.repeat(JSON_MAX_DEPTH + 8)}${']'.repeat(JSON_MAX_DEPTH + 8)}`, expect: 400 },
  { name: 'unanswerable (422)', weight: 5, method: 'POST', path: '/v1/fillet/check', body: JSON.stringify({ ...FILLET, parts: [{ thickness: 0.5, steel: { fy: 70, fu: 50 } }] }), expect: 422 },
  { name: 'oversized body', weight: 5, method: 'POST', path: '/v1/fillet/check', body: JSON.stringify({ ...FILLET, id: 'x'.repeat(BODY_LIMIT + 4096) }), expect: 413 },
  { name: 'unknown route', weight: 5, method: 'GET', path: '/v1/no/such/thing', expect: 404 },
];
const TOTAL_WEIGHT = SCENARIOS.reduce((a, s) => a + s.weight, 0);

/** Deterministic pick (a fixed sequence, so every run sends the same mix). */
function pick(n: number): Scenario {
  let x = (n * 2654435761) % TOTAL_WEIGHT;
  for (const s of SCENARIOS) {
    if (x < s.weight) return s;
    x -= s.weight;
  }
  return SCENARIOS[0]!;
}

// ---------------------------------------------------------------- plumbing
async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = createServer();
    s.once('error', reject);
    s.listen(0, '127.0.0.1', () => {
      const { port } = s.address() as { port: number };
      s.close(() => resolve(port));
    });
  });
}

interface Result {
  scenario: Scenario;
  status?: number;
  error?: string;
  ms: number;
}

function send(agent: Agent, port: number, s: Scenario): Promise<Result> {
  const t = performance.now();
  return new Promise((resolve) => {
    const headers: Record<string, string> = {};
    if (s.body !== undefined) {
      headers['content-type'] = 'application/json';
      headers['content-length'] = String(Buffer.byteLength(s.body));
    }
    const req = request({ host: '127.0.0.1', port, method: s.method, path: s.path, agent, headers }, (res) => {
      res.resume();
      res.on('end', () => resolve({ scenario: s, status: res.statusCode, ms: performance.now() - t }));
      res.on('error', (e: NodeJS.ErrnoException) => resolve({ scenario: s, error: e.code ?? e.message, ms: performance.now() - t }));
    });
    req.on('error', (e: NodeJS.ErrnoException) => resolve({ scenario: s, error: e.code ?? e.message, ms: performance.now() - t }));
    req.end(s.body);
  });
}

async function scrape(port: number, names: string[]): Promise<Record<string, number>> {
  const text = await new Promise<string>((resolve, reject) => {
    request({ host: '127.0.0.1', port, path: '/metrics', agent: false }, (res) => {
      let b = '';
      res.on('data', (c) => (b += String(c)));
      res.on('end', () => resolve(b));
    })
      .on('error', reject)
      .end();
  });
  const out: Record<string, number> = {};
  for (const n of names) {
    const m = new RegExp(`^${n} (\\S+)$`, 'm').exec(text);
    if (m) out[n] = Number(m[1]);
  }
  return out;
}

function percentile(sorted: number[], p: number): number {
  if (sorted.length === 0) return Number.NaN;
  return sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))]!;
}

// ---------------------------------------------------------------- run
async function main(): Promise<void> {
  const port = await freePort();
  const argv = BUILT ? ['dist/throatline.js'] : ['--import', 'tsx', 'src/server.ts'];
  const server = spawn(process.execPath, argv, {
    cwd: ROOT,
    env: { ...process.env, HOST: '127.0.0.1', PORT: String(port), LOG_LEVEL: 'info', NODE_ENV: 'production', BODY_LIMIT: String(BODY_LIMIT), JSON_MAX_DEPTH: String(JSON_MAX_DEPTH), DRAIN_DELAY_MS: '0', DOCS: 'false' },
    stdio: ['ignore', 'ignore', 'inherit'],
  });
  const exited = new Promise<number | null>((resolve) => server.once('exit', (c) => resolve(c)));
  const agent = new Agent({ keepAlive: true, maxSockets: CONCURRENCY });
  let up = false;
  for (let i = 0; i < 300 && !up; i++) {
    up = (await send(agent, port, { name: 'ready', weight: 0, method: 'GET', path: '/readyz', expect: 200 })).status === 200;
    if (!up) await delay(100);
  }
  if (!up) throw new Error('server did not become ready within 30 s');
  console.log(`soak: ${SECONDS} s, ${CONCURRENCY} concurrent clients, ${BUILT ? 'dist/throatline.js' : 'src/server.ts (tsx)'} on 127.0.0.1:${port}`);

  // Warm-up (a tenth of the run, at most 3 s) before the memory baseline.
  let n = 0;
  const runFor = async (ms: number, keep: Result[] | null) => {
    const until = performance.now() + ms;
    await Promise.all(
      Array.from({ length: CONCURRENCY }, async () => {
        while (performance.now() < until) {
          const r = await send(agent, port, pick(n++));
          keep?.push(r);
        }
      }),
    );
  };
  const warmMs = Math.min(3000, SECONDS * 100);
  await runFor(warmMs, null);
  const pid = server.pid!;
  const rss0 = rssMiB(pid);
  const heap0 = (await scrape(port, ['nodejs_heap_size_used_bytes'])).nodejs_heap_size_used_bytes ?? Number.NaN;

  const results: Result[] = [];
  const t0 = performance.now();
  let peak = rss0;
  const sampler = setInterval(() => (peak = Math.max(peak, rssMiB(pid))), 250);
  await runFor(SECONDS * 1000 - warmMs, results);
  clearInterval(sampler);
  const elapsed = (performance.now() - t0) / 1000;
  // Let the collector catch up before the final reading, as a long-running service would.
  await delay(500);
  const rss1 = rssMiB(pid);
  const end = await scrape(port, ['nodejs_heap_size_used_bytes', 'throatline_overloaded', 'nodejs_eventloop_lag_p99_seconds']);
  const heap1 = end.nodejs_heap_size_used_bytes ?? Number.NaN;
  agent.destroy();

  // ---- report
  const errors = results.filter((r) => r.error !== undefined);
  const fivexx = results.filter((r) => r.status !== undefined && r.status >= 500);
  const unexpected = results.filter((r) => r.status !== undefined && r.status !== r.scenario.expect);
  const all = results.map((r) => r.ms).sort((a, b) => a - b);
  const rows: string[][] = [['scenario', 'expect', 'count', 'wrong', 'p50 ms', 'p99 ms']];
  for (const s of SCENARIOS) {
    const mine = results.filter((r) => r.scenario === s);
    const ms = mine.map((r) => r.ms).sort((a, b) => a - b);
    rows.push([s.name, String(s.expect), String(mine.length), String(mine.filter((r) => r.status !== s.expect).length), fmt(percentile(ms, 50)), fmt(percentile(ms, 99))]);
  }
  console.log(`\n${table(rows)}\n`);
  console.log(`requests        ${results.length} in ${elapsed.toFixed(1)} s (${fmt(results.length / elapsed)} per s)`);
  console.log(`latency         p50 ${fmt(percentile(all, 50))} ms, p90 ${fmt(percentile(all, 90))} ms, p99 ${fmt(percentile(all, 99))} ms, max ${fmt(all.at(-1) ?? Number.NaN)} ms`);
  console.log(`errors          ${errors.length}${errors.length ? ` (${[...new Set(errors.map((e) => e.error))].join(', ')})` : ''}`);
  console.log(`5xx             ${fivexx.length}`);
  console.log(`unexpected      ${unexpected.length}${unexpected.length ? ` (${[...new Set(unexpected.map((u) => `${u.scenario.name}: ${u.status}`))].slice(0, 5).join('; ')})` : ''}`);
  console.log(`server RSS      ${fmt(rss0)} MiB after warm-up, ${fmt(rss1)} MiB at the end (growth ${fmt(rss1 - rss0)} MiB, peak ${fmt(peak)} MiB)`);
  console.log(`server heap     ${fmt(heap0 / 2 ** 20)} MiB after warm-up, ${fmt(heap1 / 2 ** 20)} MiB at the end (growth ${fmt((heap1 - heap0) / 2 ** 20)} MiB)`);
  console.log(`event loop      p99 lag ${fmt((end.nodejs_eventloop_lag_p99_seconds ?? Number.NaN) * 1000)} ms; overloaded at the end: ${end.throatline_overloaded === 1 ? 'yes' : 'no'}`);

  server.kill('SIGTERM');
  const code = await Promise.race([exited, delay(15000).then(() => 'timeout' as const)]);
  console.log(`SIGTERM         server exited ${code === 'timeout' ? 'late (killed)' : `with status ${code}`}`);
  if (code === 'timeout') server.kill('SIGKILL');

  const ok = results.length > 0 && errors.length === 0 && fivexx.length === 0 && unexpected.length === 0 && code === 0;
  console.log(`\nsoak: ${ok ? 'passed' : 'FAILED'}`);
  process.exit(ok ? 0 : 1);
}

main().catch((err: unknown) => {
  console.error(err);
  process.exit(1);
});
