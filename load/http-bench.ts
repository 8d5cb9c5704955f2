/**
 * HTTP benchmark: the service as shipped (dist/throatline.js, the single-file build, with its own logging) against a bare
 * Fastify baseline (load/baseline-server.mjs), in interleaved rounds on this machine. The
 * servers are pinned to core 0 and this load generator to core 1 (taskset). Prints, per
 * scenario, requests/s, server CPU µs per request, p50/p99 latency, errors, and the ratio to the
 * baseline given the same payload (median of the rounds); then PASS/FAIL per target.
 *
 *   npm run bench                 full run (3 rounds of 5 s per scenario)
 *   npm run bench -- --short      one short round: checks the suite runs (CI), no verdicts
 *   npm run bench -- --rounds 5 --duration 10
 *   npm run bench -- --node "$(npx -y -p node@24 node -p process.execPath)"
 *                                 both servers on another Node (the container's is 24)
 */
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { existsSync, openSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import http from 'node:http';
import autocannon from 'autocannon';
import { cpuMicros, cpuSplit, fmt, median, peakRssMiB, rssMiB, table } from './lib.js';
import { eccentric, fillet, pjp } from './payloads.js';

const args = process.argv.slice(2);
const short = args.includes('--short');
const argNum = (name: string, dflt: number): number => {
  const i = args.indexOf(name);
  return i >= 0 ? Number(args[i + 1]) : dflt;
};
const ROUNDS = short ? 1 : argNum('--rounds', 3);
const DURATION = short ? 1 : argNum('--duration', 5);
const CONNECTIONS = argNum('--connections', 32);
const NDJSON_LINES = short ? 5_000 : 100_000;
/** `--only fillet` runs just the scenarios whose name contains the text (for profiling). */
const onlyIdx = args.indexOf('--only');
const ONLY = onlyIdx >= 0 ? String(args[onlyIdx + 1]).toLowerCase() : undefined;
/** The compact result a pipeline usually needs: the verdict and what governs. */
const COMPACT = 'status,utilization,governing.code';
const BATCH_ITEMS = 1_000;
/**
 * `--work 5,20,50`: µs of arithmetic per request for the baseline's third reference route, a
 * stand-in for a route's own work (how much a route doing that much costs the server here).
 */
const workIdx = args.indexOf('--work');
const WORK_US = (workIdx >= 0 ? String(args[workIdx + 1]) : '5,20,50').split(',').filter(Boolean).map(Number);
const hasTaskset = spawnSync('taskset', ['-V']).status === 0;
/** `--node PATH`: the Node binary both servers run on (default: the one running this bench). */
const nodeIdx = args.indexOf('--node');
const SERVER_NODE = nodeIdx >= 0 ? String(args[nodeIdx + 1]) : process.execPath;
const serverNodeVersion = spawnSync(SERVER_NODE, ['--version'], { encoding: 'utf8' }).stdout?.trim() || `unknown (${SERVER_NODE})`;

// Pin this load generator to core 1 by re-running it under taskset.
if (hasTaskset && process.env.BENCH_PINNED !== '1') {
  const r = spawnSync('taskset', ['-c', '1', process.execPath, ...process.execArgv, process.argv[1]!, ...args], { stdio: 'inherit', env: { ...process.env, BENCH_PINNED: '1' } });
  process.exit(r.status ?? 1);
}

interface Server {
  name: string;
  proc: ChildProcess;
  port: number;
  startupMs: number;
}

async function waitReady(port: number, path: string, timeoutMs = 15_000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const ok = await new Promise<boolean>((resolve) => {
      const req = http.get({ host: '127.0.0.1', port, path }, (res) => {
        res.resume();
        resolve(res.statusCode === 200);
      });
      req.on('error', () => resolve(false));
    });
    if (ok) return;
    if (Date.now() > deadline) throw new Error(`server on ${port} not ready`);
    await new Promise((r) => setTimeout(r, 5));
  }
}

async function start(name: string, script: string, port: number, readyPath: string, env: Record<string, string> = {}): Promise<Server> {
  const cmd = hasTaskset ? 'taskset' : SERVER_NODE;
  const argv = hasTaskset ? ['-c', '0', SERVER_NODE, script] : [script];
  const out = openSync('/dev/null', 'w');
  const t0 = performance.now();
  const proc = spawn(cmd, argv, { env: { ...process.env, PORT: String(port), HOST: '127.0.0.1', ...env }, stdio: ['ignore', out, 'inherit'] });
  await waitReady(port, readyPath);
  return { name, proc, port, startupMs: performance.now() - t0 };
}

interface Scenario {
  name: string;
  method: 'GET' | 'POST';
  path: string;
  contentType?: string;
  body?: string;
  /** Items per request, for items/s. */
  items: number;
}

async function routeExists(port: number, path: string, body: object): Promise<boolean> {
  const res = await fetch(`http://127.0.0.1:${port}${path}`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) });
  await res.arrayBuffer();
  return res.status === 200;
}

function batchBody(kinds: Array<[string, object]>, n: number): string {
  const items = [];
  for (let i = 0; i < n; i++) {
    const [kind, body] = kinds[i % kinds.length]!;
    items.push({ kind, id: `WS-${i}`, ...body });
  }
  return JSON.stringify(items);
}

interface Run {
  rps: number;
  itemsPerSec: number;
  cpuPerReq: number;
  /** The part of cpuPerReq spent in the kernel (for a loopback socket that includes waking the load generator). */
  sysPerReq: number;
  p50: number;
  p99: number;
  errors: number;
}

async function cannon(server: Server, s: Scenario, seconds = DURATION): Promise<Run> {
  const cpu0 = cpuSplit(server.proc.pid!);
  const r = await autocannon({
    url: `http://127.0.0.1:${server.port}${s.path}`,
    method: s.method,
    headers: s.contentType ? { 'content-type': s.contentType } : {},
    body: s.body,
    connections: s.items > 1 ? 4 : CONNECTIONS,
    duration: seconds,
  });
  const cpu1 = cpuSplit(server.proc.pid!);
  const total = r.requests.total || 1;
  return {
    rps: r.requests.average,
    itemsPerSec: r.requests.average * s.items,
    cpuPerReq: (cpu1.user + cpu1.system - cpu0.user - cpu0.system) / total,
    sysPerReq: (cpu1.system - cpu0.system) / total,
    p50: r.latency.p50,
    p99: r.latency.p99,
    errors: r.errors + r.timeouts + r.non2xx,
  };
}

/** Streams NDJSON_LINES fillet items to the server and reads the results as they come. */
async function ndjson(server: Server, path: string): Promise<Run & { peakRssGrowth: number }> {
  const line = JSON.stringify({ kind: 'fillet', ...fillet }) + '\n';
  const chunkLines = 500;
  const chunk = Buffer.from(line.repeat(chunkLines));
  const rss0 = rssMiB(server.proc.pid!);
  let peak = rss0;
  const sampler = setInterval(() => {
    peak = Math.max(peak, rssMiB(server.proc.pid!));
  }, 20);
  const cpu0 = cpuMicros(server.proc.pid!);
  const t0 = performance.now();
  let firstByteMs = Number.NaN;
  let lines = 0;
  let status = 0;
  await new Promise<void>((resolve, reject) => {
    const req = http.request({ host: '127.0.0.1', port: server.port, path, method: 'POST', headers: { 'content-type': 'application/x-ndjson' } }, (res) => {
      status = res.statusCode ?? 0;
      res.on('data', (b: Buffer) => {
        if (Number.isNaN(firstByteMs)) firstByteMs = performance.now() - t0;
        for (let i = b.indexOf(10); i !== -1; i = b.indexOf(10, i + 1)) lines++;
      });
      res.on('end', resolve);
      res.on('error', reject);
    });
    req.on('error', reject);
    let sent = 0;
    const pump = (): void => {
      while (sent < NDJSON_LINES) {
        sent += chunkLines;
        if (!req.write(chunk)) {
          req.once('drain', pump);
          return;
        }
      }
      req.end();
    };
    pump();
  });
  const secs = (performance.now() - t0) / 1000;
  clearInterval(sampler);
  const cpu1 = cpuMicros(server.proc.pid!);
  return {
    rps: 1 / secs,
    itemsPerSec: NDJSON_LINES / secs,
    cpuPerReq: cpu1 - cpu0,
    sysPerReq: Number.NaN,
    p50: firstByteMs,
    p99: secs * 1000,
    errors: status === 200 && (server.name === 'baseline' || lines >= NDJSON_LINES) ? 0 : 1,
    peakRssGrowth: peak - rss0,
  };
}

async function main(): Promise<void> {
  if (!existsSync('dist/throatline.js') || !short) {
    const b = spawnSync('npm', ['run', '-s', 'build'], { stdio: 'inherit' });
    if (b.status !== 0) throw new Error('build failed');
  }
  const service = await start('service', 'dist/throatline.js', 3902, '/readyz', { LOG_LEVEL: 'info' });
  const startupMs = service.startupMs;
  // The service's fillet answer, for the baseline's second reference route (same bytes, constant).
  const answerFile = join(tmpdir(), `throatline-bench-answer-${process.pid}.json`);
  const answerRes = await fetch(`http://127.0.0.1:${service.port}/v1/fillet/check`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(fillet) });
  const answerText = await answerRes.text();
  writeFileSync(answerFile, answerText);
  const baseline = await start('baseline', 'load/baseline-server.mjs', 3901, '/bench', { BENCH_ANSWER_FILE: answerFile, BENCH_WORK_US: WORK_US.join(',') });

  const filletQuery =
    '/v1/fillet/check?method=LRFD&electrode=E70&welds.0.size=5/16&welds.0.length=10&welds.0.count=2&load.force=120' +
    '&parts.0.thickness=1/2&parts.0.steel=A572-50&parts.0.faces=2&parts.1.thickness=3/4&parts.1.steel=A992&format=value&field=utilization';
  const mixKinds: Array<[string, object]> = [['fillet', fillet]];
  const scenarios: Array<Scenario & { target?: string }> = [
    { name: 'fillet check', method: 'POST', path: '/v1/fillet/check', contentType: 'application/json', body: JSON.stringify(fillet), items: 1 },
    { name: 'GET value form', method: 'GET', path: filletQuery, items: 1 },
  ];
  if (await routeExists(service.port, '/v1/groove/pjp/check', pjp)) {
    scenarios.push({ name: 'PJP check', method: 'POST', path: '/v1/groove/pjp/check', contentType: 'application/json', body: JSON.stringify(pjp), items: 1 });
    mixKinds.push(['groove-pjp', pjp]);
  }
  if (await routeExists(service.port, '/v1/weld-group/eccentric', eccentric)) {
    scenarios.push({ name: 'eccentric group (3 segments)', method: 'POST', path: '/v1/weld-group/eccentric', contentType: 'application/json', body: JSON.stringify(eccentric), items: 1 });
  }
  const filletBatch = batchBody([['fillet', fillet]], BATCH_ITEMS);
  scenarios.push({ name: `JSON batch ${BATCH_ITEMS} fillet`, method: 'POST', path: '/v1/batch', contentType: 'application/json', body: filletBatch, items: BATCH_ITEMS });
  scenarios.push({ name: `JSON batch ${BATCH_ITEMS} fillet, compact`, method: 'POST', path: `/v1/batch?fields=${COMPACT}`, contentType: 'application/json', body: filletBatch, items: BATCH_ITEMS });
  if (mixKinds.length > 1) {
    scenarios.push({ name: `JSON batch ${BATCH_ITEMS} mixed`, method: 'POST', path: '/v1/batch', contentType: 'application/json', body: batchBody(mixKinds, BATCH_ITEMS), items: BATCH_ITEMS });
  }

  if (ONLY !== undefined) scenarios.splice(0, scenarios.length, ...scenarios.filter((s) => s.name.toLowerCase().includes(ONLY)));
  const runNdjson = ONLY === undefined || 'ndjson'.includes(ONLY) || ONLY.includes('ndjson');
  const results = new Map<string, { base: Run[]; svc: Run[] }>();
  /** The fillet scenario against the baseline sending the same answer as a constant. */
  const sameAnswer: Run[] = [];
  /** The bare route plus a fixed amount of arithmetic, by µs of arithmetic. */
  const withWork = new Map<number, Run[]>(WORK_US.map((us) => [us, []]));
  const rssByRound: number[] = [];
  /** The resident high-water mark at the end of each round: a round that needs more memory than any before raises it. */
  const peakByRound: number[] = [];
  const ndjsonRuns: Array<Run & { peakRssGrowth: number }> = [];
  const ndjsonCompact: Array<Run & { peakRssGrowth: number }> = [];
  // Warm-up, not recorded: the service compiles validators and serializers on first use and the
  // rest in the background after it starts, and both servers' code needs the JIT's attention.
  if (!short) {
    for (const s of scenarios) {
      await cannon(service, { ...s, name: 'warm-up' }, 1);
      await cannon(baseline, { ...s, path: '/bench' }, 1);
    }
    await new Promise((r) => setTimeout(r, 1000));
  }
  for (let round = 1; round <= ROUNDS; round++) {
    for (const s of scenarios) {
      const entry = results.get(s.name) ?? { base: [], svc: [] };
      const baseScenario = { ...s, path: s.method === 'GET' ? '/bench' : '/bench' };
      entry.base.push(await cannon(baseline, baseScenario));
      if (s.name === 'fillet check') {
        sameAnswer.push(await cannon(baseline, { ...s, path: '/bench-answer' }));
        for (const [us, runs] of withWork) runs.push(await cannon(baseline, { ...s, path: `/bench-work-${us}` }));
      }
      entry.svc.push(await cannon(service, s));
      results.set(s.name, entry);
    }
    if (runNdjson) {
      ndjsonRuns.push(await ndjson(service, '/v1/batch'));
      ndjsonCompact.push(await ndjson(service, `/v1/batch?fields=${COMPACT}`));
    }
    rssByRound.push(rssMiB(service.proc.pid!));
    peakByRound.push(peakRssMiB(service.proc.pid!));
    process.stderr.write(`round ${round}/${ROUNDS} done\n`);
  }

  const rows = [['scenario', 'svc req/s', 'base req/s', 'ratio', 'svc µs CPU/req', '(kernel)', 'base µs CPU/req', '(kernel)', 'CPU ratio', 'p50 ms', 'p99 ms', 'errors', 'items/s']];
  /** What, whether it passes (null: a figure for information, no target), and the figure. */
  const verdicts: Array<[string, boolean | null, string]> = [];
  for (const [name, { base, svc }] of results) {
    const ratio = median(svc.map((r, i) => r.rps / base[i]!.rps));
    const cpuRatio = median(svc.map((r, i) => r.cpuPerReq / base[i]!.cpuPerReq));
    rows.push([
      name, fmt(median(svc.map((r) => r.rps))), fmt(median(base.map((r) => r.rps))), fmt(ratio),
      fmt(median(svc.map((r) => r.cpuPerReq))), fmt(median(svc.map((r) => r.sysPerReq))), fmt(median(base.map((r) => r.cpuPerReq))), fmt(median(base.map((r) => r.sysPerReq))), fmt(cpuRatio),
      fmt(median(svc.map((r) => r.p50))), fmt(median(svc.map((r) => r.p99))), String(svc.reduce((a, r) => a + r.errors, 0)),
      fmt(median(svc.map((r) => r.itemsPerSec))),
    ]);
    if (name === 'fillet check') {
      verdicts.push(['fillet route throughput >= 0.85 × baseline', ratio >= 0.85, fmt(ratio)]);
      verdicts.push(['fillet route CPU/request <= 1.25 × baseline', cpuRatio <= 1.25, fmt(cpuRatio)]);
    }
    if (name.startsWith('eccentric')) verdicts.push(['eccentric route throughput >= 0.7 × baseline', ratio >= 0.7, fmt(ratio)]);
    if (name === `JSON batch ${BATCH_ITEMS} fillet`) {
      const ips = median(svc.map((r) => r.itemsPerSec));
      verdicts.push(['JSON batch, full answers, >= 400,000 fillet items/s', ips >= 400_000, fmt(ips)]);
      // What a server that only parses the same body (and answers a constant) reaches here.
      verdicts.push([`the bare baseline parsing the same ${BATCH_ITEMS}-item body and answering a constant, items/s`, null, fmt(median(base.map((r) => r.itemsPerSec)))]);
    }
    if (name === `JSON batch ${BATCH_ITEMS} fillet, compact`) {
      const ips = median(svc.map((r) => r.itemsPerSec));
      verdicts.push([`JSON batch, compact answers (fields=${COMPACT}), >= 400,000 fillet items/s`, ips >= 400_000, fmt(ips)]);
    }
  }
  if (runNdjson) {
    const ndLines = median(ndjsonRuns.map((r) => r.itemsPerSec));
    rows.push([`NDJSON ${NDJSON_LINES} lines`, '-', '-', '-', fmt(median(ndjsonRuns.map((r) => r.cpuPerReq / NDJSON_LINES))) + '/line', '-', '-', '-', '-',
      `${fmt(median(ndjsonRuns.map((r) => r.p50)))} (first)`, `${fmt(median(ndjsonRuns.map((r) => r.p99)))} (all)`, String(ndjsonRuns.reduce((a, r) => a + r.errors, 0)), fmt(ndLines)]);
    const ndCompact = median(ndjsonCompact.map((r) => r.itemsPerSec));
    rows.push([`NDJSON ${NDJSON_LINES} lines, compact`, '-', '-', '-', fmt(median(ndjsonCompact.map((r) => r.cpuPerReq / NDJSON_LINES))) + '/line', '-', '-', '-', '-',
      `${fmt(median(ndjsonCompact.map((r) => r.p50)))} (first)`, `${fmt(median(ndjsonCompact.map((r) => r.p99)))} (all)`, String(ndjsonCompact.reduce((a, r) => a + r.errors, 0)), fmt(ndCompact)]);
    const growth = Math.max(...ndjsonRuns.map((r) => r.peakRssGrowth), ...ndjsonCompact.map((r) => r.peakRssGrowth));
    verdicts.push(['NDJSON, full answers, >= 300,000 lines/s', ndLines >= 300_000, fmt(ndLines)]);
    verdicts.push([`NDJSON, compact answers, >= 300,000 lines/s`, ndCompact >= 300_000, fmt(ndCompact)]);
    verdicts.push(['NDJSON memory flat (peak RSS growth < 64 MiB)', growth < 64, `${fmt(growth)} MiB`]);
  }
  verdicts.push(['start-up to ready < 1 s', startupMs < 1000, `${fmt(startupMs)} ms`]);
  const rssEnd = rssByRound[rssByRound.length - 1]!;
  verdicts.push(['resident memory < 150 MB after the run', rssEnd < 150, `${fmt(rssEnd)} MiB`]);
  if (rssByRound.length >= 3) {
    // Read on the high-water mark: one sample of the resident figure at the end of a round moves
    // by ±20 % with garbage-collection timing (it read -23 %, +1.8 % and +9.8 % for the same code),
    // while a leak makes each round need more memory than the one before. The end-of-round
    // samples are printed too, and `npm run bench:memory` reads the heap after a full collection.
    const g = peakByRound[2]! / peakByRound[1]! - 1;
    verdicts.push(['no resident memory growth between rounds 2 and 3 (high-water mark, < 5 %)', g < 0.05, `${fmt(peakByRound[1]!)} -> ${fmt(peakByRound[2]!)} MiB, ${fmt(g * 100)} %`]);
    verdicts.push(['resident memory at the end of each round', null, rssByRound.map((x) => `${fmt(x)} MiB`).join(', ')]);
  }

  console.log(`\nThroatline HTTP benchmark: servers on Node ${serverNodeVersion}, ${ROUNDS} round(s) × ${DURATION} s per scenario, ${CONNECTIONS} connections, ` +
    `${hasTaskset ? 'server on core 0, load on core 1' : 'no taskset: cores not pinned'}; medians over rounds; ratios against the bare Fastify baseline given the same payload.\n`);
  console.log(table(rows));
  console.log('(kernel): the part of the CPU per request spent in the kernel. Over loopback the server\'s socket write also wakes the load generator when it sleeps, which it does while waiting for a slower server: on a virtual machine such a wake-up costs a server tens of µs that a faster one, whose client is still busy, mostly does not pay. The lines "plus N µs of arithmetic" show what that does to a route with N µs of its own work.');
  console.log('');
  for (const [what, ok, figure] of verdicts) console.log(`${short || ok === null ? 'INFO' : ok ? 'PASS' : 'FAIL'}  ${what}: ${figure}`);
  const filletRuns = results.get('fillet check');
  if (filletRuns && sameAnswer.length === filletRuns.svc.length && sameAnswer.length > 0) {
    const r = median(filletRuns.svc.map((x, i) => x.rps / sameAnswer[i]!.rps));
    const c = median(filletRuns.svc.map((x, i) => x.cpuPerReq / sameAnswer[i]!.cpuPerReq));
    console.log(
      `INFO  fillet route against the baseline sending the same ${answerText.length}-byte answer as a constant ` +
        `(${fmt(median(sameAnswer.map((x) => x.rps)))} req/s, ${fmt(median(sameAnswer.map((x) => x.cpuPerReq)))} µs CPU/req): ${fmt(r)} × throughput, ${fmt(c)} × CPU per request`,
    );
  }
  if (filletRuns) {
    const bare = median(filletRuns.base.map((x) => x.cpuPerReq));
    for (const [us, runs] of withWork) {
      if (runs.length === 0) continue;
      const cpu = median(runs.map((x) => x.cpuPerReq));
      console.log(
        `INFO  the baseline route plus ${us} µs of arithmetic per request: ${fmt(median(runs.map((x) => x.rps)))} req/s, ` +
          `${fmt(cpu)} µs CPU/req (${fmt(median(runs.map((x) => x.sysPerReq)))} in the kernel), ${fmt(cpu / bare)} × the bare route's CPU`,
      );
    }
  }
  rmSync(answerFile, { force: true });

  for (const s of [baseline, service]) s.proc.kill('SIGTERM');
}

main().catch((err: unknown) => {
  console.error(err);
  process.exit(1);
});
