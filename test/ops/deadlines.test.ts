/**
 * Deadlines for routes with a body (plugins/deadlines.ts): a stalled upload gets a 408 problem
 * within its route's time plus one sweep, the batch route has its own, longer time, and nothing
 * is left behind in the watch once requests end, however they end.
 */
import { connect } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { FastifyInstance } from 'fastify';
import { buildApp } from '../../src/app.js';
import { DeadlineWatch } from '../../src/plugins/deadlines.js';

/** An ordinary fillet check (its answer is not what these tests look at). */
const FILLET_BODY = { method: 'LRFD', electrode: 'E70', welds: [{ size: '5/16', length: 10 }], load: { force: 50 }, parts: [{ thickness: 0.5, steel: 'A36' }] };

/** Sends the head of a POST and part of its body, then stalls; resolves with what came back and when. */
function stalledPost(port: number, path: string, waitMs: number): Promise<{ text: string; ms: number }> {
  return new Promise((resolve, reject) => {
    const t0 = Date.now();
    let text = '';
    const socket = connect(port, '127.0.0.1', () => {
      socket.write(`POST ${path} HTTP/1.1\r\nhost: x\r\ncontent-type: application/json\r\ncontent-length: 500\r\n\r\n{"method":`);
    });
    socket.on('data', (d) => (text += d.toString('utf8')));
    const done = () => resolve({ text, ms: Date.now() - t0 });
    socket.on('close', done);
    socket.on('error', reject);
    setTimeout(() => socket.destroy(), waitMs).unref();
  });
}

describe('deadline watch (unit)', () => {
  it('sweeps on a quarter of the shortest deadline, between 25 ms and 1 s', () => {
    expect(new DeadlineWatch(300).sweepMs).toBe(75);
    expect(new DeadlineWatch(40).sweepMs).toBe(25);
    expect(new DeadlineWatch(300000).sweepMs).toBe(1000);
  });
});

describe('deadlines over HTTP', () => {
  let app: FastifyInstance;
  let port: number;
  beforeAll(async () => {
    app = await buildApp({ config: { DOCS: false, REQUEST_TIMEOUT_MS: 300, BATCH_TIMEOUT_MS: 1500 } });
    await app.listen({ host: '127.0.0.1', port: 0 });
    port = (app.server.address() as { port: number }).port;
  });
  afterAll(async () => {
    await app.close();
  });

  it('a stalled check body gets a 408 after 300 ms and before 300 ms plus a sweep and some slack', async () => {
    const { text, ms } = await stalledPost(port, '/v1/fillet/check', 5000);
    expect(text).toMatch(/^HTTP\/1\.1 408 /);
    expect(text).toMatch(/\r\nconnection: close\r\n/i);
    expect(ms).toBeGreaterThanOrEqual(300);
    // 300 ms + one 75 ms sweep; the rest is slack for a busy test machine.
    expect(ms).toBeLessThan(1200);
  });

  it('a stalled batch body is still waiting at 800 ms (its deadline is 1.5 s), then gets a 408', async () => {
    const early = await stalledPost(port, '/v1/batch', 800);
    expect(early.text).toBe('');
    const late = await stalledPost(port, '/v1/batch', 6000);
    expect(late.text).toMatch(/^HTTP\/1\.1 408 /);
    expect(late.ms).toBeGreaterThanOrEqual(1500);
    expect(late.ms).toBeLessThan(3500);
  });

  it('answered requests leave nothing in the watch; an abandoned upload is dropped at its deadline', async () => {
    for (let i = 0; i < 20; i++) {
      const res = await fetch(`http://127.0.0.1:${port}/v1/fillet/check`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(FILLET_BODY) });
      expect(res.status).toBe(200);
      await res.arrayBuffer();
    }
    expect(app.deadlines.pending).toBe(0);
    // The client goes away mid-body: no answer is sent, and the sweep forgets the request.
    await stalledPost(port, '/v1/fillet/check', 50);
    await new Promise((r) => setTimeout(r, 600));
    expect(app.deadlines.pending).toBe(0);
  });

  it('GET routes get no deadline hooks (nothing is registered for them)', async () => {
    const res = await fetch(`http://127.0.0.1:${port}/v1/catalog/electrodes`);
    await res.arrayBuffer();
    expect(app.deadlines.pending).toBe(0);
  });
});

describe('abandoned requests', () => {
  it('a request whose client goes away is dropped at the next sweep, long before its deadline', async () => {
    // Deadlines of 4 s: sweeps every second.
    const app = await buildApp({ config: { DOCS: false, REQUEST_TIMEOUT_MS: 4000, BATCH_TIMEOUT_MS: 4000 } });
    try {
      await app.listen({ host: '127.0.0.1', port: 0 });
      const port = (app.server.address() as { port: number }).port;
      const t0 = Date.now();
      const gone = stalledPost(port, '/v1/batch', 300);
      await new Promise((r) => setTimeout(r, 150));
      expect(app.deadlines.pending).toBe(1);
      await gone;
      for (let i = 0; i < 100 && app.deadlines.pending > 0; i++) await new Promise((r) => setTimeout(r, 50));
      expect(app.deadlines.pending).toBe(0);
      expect(Date.now() - t0).toBeLessThan(3500);
    } finally {
      await app.close();
    }
  });
});
