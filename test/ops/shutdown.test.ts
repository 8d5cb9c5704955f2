/**
 * Graceful shutdown of the real server process under load, the way an orchestrator drives it:
 * SIGTERM; /readyz answers 503 at once; the service keeps answering through the drain delay
 * while the "orchestrator" (here: the load generator, which stops opening new work a moment
 * after it sees /readyz fail) routes traffic away; then the listener closes, in-flight requests
 * finish, and the process exits 0. Every request that was sent gets a complete answer: no
 * reset, no hang-up, no 5xx. A request that began before SIGTERM and is still uploading when
 * the listener closes, and a connection accepted during the drain that sends its request only
 * after the listener closed, are both answered in full.
 */
import { Agent, request } from 'node:http';
import { connect, type Socket } from 'node:net';
import { setTimeout as delay } from 'node:timers/promises';
import { afterEach, describe, expect, it } from 'vitest';
import { send, startServer, type Outcome, type ServerProcess } from './server-process.js';

const FILLET = { method: 'LRFD', electrode: 'E70', welds: [{ size: '5/16', length: 10, count: 2 }], load: { force: 120 }, parts: [{ thickness: 0.5, steel: 'A572-50', faces: 2 }, { thickness: 0.75, steel: 'A992' }] };
const FILLET_JSON = JSON.stringify(FILLET);
const BATCH_ITEMS = 200;
const BATCH_JSON = JSON.stringify(Array.from({ length: BATCH_ITEMS }, (_, i) => ({ kind: 'fillet', id: `WS-B${i}`, ...FILLET })));

let server: ServerProcess | undefined;
afterEach(() => {
  if (server && server.proc.exitCode === null) server.proc.kill('SIGKILL');
  server = undefined;
});

/** A complete, well-formed answer to what was asked. */
function complete(o: Outcome, kind: 'fillet' | 'batch'): boolean {
  if (o.status !== 200 || o.body === undefined) return false;
  try {
    const body = JSON.parse(o.body) as { status?: string; summary?: { items: number } };
    return kind === 'fillet' ? body.status === 'pass' : body.summary?.items === BATCH_ITEMS;
  } catch {
    return false;
  }
}

describe('SIGTERM under load', () => {
  it('turns /readyz 503 first, keeps answering through the drain, loses no accepted request and exits 0', async () => {
    const DRAIN_MS = 2000;
    server = await startServer({ DRAIN_DELAY_MS: String(DRAIN_MS), SHUTDOWN_TIMEOUT_MS: '10000' });
    const { port } = server;
    const agent = new Agent({ keepAlive: true, maxSockets: 16 });
    const t0 = performance.now();
    const at = () => performance.now() - t0;

    // ---- the orchestrator's view: readiness, and whether the listener still accepts
    let routing = true;
    let sigtermAt = Number.POSITIVE_INFINITY;
    let unreadyAt = Number.POSITIVE_INFINITY;
    let refusedAt = Number.POSITIVE_INFINITY;
    let watching = true;
    const watcher = (async () => {
      while (watching) {
        const r = await send({ port, path: '/readyz' });
        if (r.status === 503 && unreadyAt === Number.POSITIVE_INFINITY) {
          unreadyAt = at();
          // The orchestrator takes a moment (well under the drain delay) to stop routing here.
          setTimeout(() => (routing = false), 500);
        }
        if (r.error === 'ECONNREFUSED' && !r.connected) {
          refusedAt = at();
          return;
        }
        await delay(20);
      }
    })();

    // ---- steady load: 16 clients on keep-alive connections, single checks and batches
    const results: Array<{ kind: 'fillet' | 'batch'; outcome: Outcome; startedAt: number }> = [];
    const workers = Array.from({ length: 16 }, async (_, w) => {
      for (let i = 0; routing; i++) {
        const kind = (i + w) % 5 === 0 ? 'batch' : 'fillet';
        const startedAt = at();
        const outcome = await send({ port, method: 'POST', path: kind === 'batch' ? '/v1/batch' : '/v1/fillet/check', body: kind === 'batch' ? BATCH_JSON : FILLET_JSON, agent });
        results.push({ kind, outcome, startedAt });
      }
    });

    // ---- a slow NDJSON upload that begins before SIGTERM and ends after the listener closed
    const slowLines = 40;
    const slow = new Promise<Outcome>((resolve) => {
      const req = request({ host: '127.0.0.1', port, method: 'POST', path: '/v1/batch?summary=true', headers: { 'content-type': 'application/x-ndjson' }, agent: false }, (res) => {
        let body = '';
        res.on('data', (c) => (body += String(c)));
        res.on('end', () => resolve({ status: res.statusCode, body, headers: res.headers, connected: true }));
        res.on('error', (e: NodeJS.ErrnoException) => resolve({ error: e.code, connected: true }));
      });
      req.on('error', (e: NodeJS.ErrnoException) => resolve({ error: e.code, connected: true }));
      let n = 0;
      const tick = setInterval(() => {
        req.write(`${JSON.stringify({ kind: 'fillet', id: `WS-S${n}`, ...FILLET })}\n`);
        if (++n === slowLines) {
          clearInterval(tick);
          req.end();
        }
      }, 100);
    });

    await delay(400);
    sigtermAt = at();
    server.proc.kill('SIGTERM');

    // ---- a connection accepted during the drain whose request comes after the listener closed
    await delay(DRAIN_MS - 300);
    const late = await new Promise<Socket>((resolve, reject) => {
      const s = connect(port, '127.0.0.1', () => resolve(s));
      s.once('error', reject);
    });
    let lateAnswer = '';
    let lateError = '';
    const lateDone = new Promise<void>((resolve) => {
      late.on('data', (d) => (lateAnswer += String(d)));
      late.on('error', (e: NodeJS.ErrnoException) => (lateError = e.code ?? e.message));
      late.on('close', () => resolve());
    });
    while (refusedAt === Number.POSITIVE_INFINITY && at() < sigtermAt + DRAIN_MS + 5000) await delay(10);
    await delay(150);
    const lateSentAt = at();
    late.write('GET /v1/catalog/steels HTTP/1.1\r\nhost: 127.0.0.1\r\n\r\n');
    await lateDone;

    await Promise.all(workers);
    const slowOutcome = await slow;
    watching = false;
    await watcher;
    const code = await server.exited;
    agent.destroy();

    // ---- what happened
    const failed = results.filter((r) => !complete(r.outcome, r.kind));
    expect(failed.map((r) => ({ kind: r.kind, status: r.outcome.status, error: r.outcome.error })), 'requests without a complete answer').toEqual([]);
    expect(results.length).toBeGreaterThan(50);
    const duringDrain = results.filter((r) => r.startedAt > sigtermAt);
    expect(duringDrain.length, 'requests answered after SIGTERM').toBeGreaterThan(0);
    // Once readiness is seen off the signal has been handled: every answer from then on closes its connection.
    const afterUnready = results.filter((r) => r.startedAt > unreadyAt);
    expect(afterUnready.length).toBeGreaterThan(0);
    expect(afterUnready.filter((r) => r.outcome.headers?.connection !== 'close'), 'answers after readiness went off keep their connection').toEqual([]);

    // Readiness turned off at once, well before the listener closed.
    expect(unreadyAt).toBeGreaterThan(sigtermAt);
    expect(refusedAt).toBeLessThan(Number.POSITIVE_INFINITY);
    expect(unreadyAt).toBeLessThan(refusedAt);
    expect(lateSentAt).toBeGreaterThan(refusedAt);

    // The upload that spanned the listener's close got every result and the summary.
    expect(slowOutcome.status).toBe(200);
    const lines = slowOutcome.body!.trim().split('\n').map((l) => JSON.parse(l) as { status?: string; summary?: { items: number; pass: number } });
    expect(lines).toHaveLength(slowLines + 1);
    expect(lines.at(-1)!.summary).toMatchObject({ items: slowLines, pass: slowLines });

    // The late connection's request was answered in full, not reset.
    expect(lateError).toBe('');
    expect(lateAnswer).toMatch(/^HTTP\/1\.1 200 OK\r\n/);
    expect(lateAnswer).toMatch(/\r\nconnection: close\r\n/i);
    const lateBody = lateAnswer.slice(lateAnswer.indexOf('\r\n\r\n') + 4);
    const length = /\r\ncontent-length: (\d+)\r\n/i.exec(lateAnswer);
    expect(length).not.toBeNull();
    expect(Buffer.byteLength(lateBody)).toBe(Number(length![1]));
    expect(typeof JSON.parse(lateBody)).toBe('object');

    expect(code).toBe(0);
    const log = server.output();
    const order = ['shutting down: readiness off, draining', 'listener closed; finishing in-flight requests', 'stopped'].map((m) => log.indexOf(m));
    expect(order.every((i) => i >= 0), log).toBe(true);
    expect([...order].sort((a, b) => a - b)).toEqual(order);
  });
});

describe('shutdown bounds', () => {
  it('exits 1 once SHUTDOWN_TIMEOUT_MS has passed with a request still open', async () => {
    server = await startServer({ DRAIN_DELAY_MS: '0', SHUTDOWN_TIMEOUT_MS: '500' });
    const req = request({ host: '127.0.0.1', port: server.port, method: 'POST', path: '/v1/batch', headers: { 'content-type': 'application/x-ndjson' }, agent: false });
    req.on('error', () => {});
    req.write(`${FILLET_JSON.replace('{', '{"kind":"fillet",')}\n`);
    await delay(200);
    server.proc.kill('SIGTERM');
    expect(await server.exited).toBe(1);
    expect(server.output()).toContain('shutdown timed out with connections still open; exiting');
    req.destroy();
  });

  it('a second signal cuts the drain delay short', async () => {
    server = await startServer({ DRAIN_DELAY_MS: '600000', SHUTDOWN_TIMEOUT_MS: '5000' });
    server.proc.kill('SIGTERM');
    await delay(300);
    expect((await send({ port: server.port, path: '/readyz' })).status).toBe(503);
    server.proc.kill('SIGINT');
    expect(await server.exited).toBe(0);
    expect(server.output()).toContain('second signal');
  });
});
