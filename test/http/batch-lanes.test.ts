/**
 * Batch lanes (routes/v1/lanes.ts): JSON-array batches are answered BATCH_CONCURRENCY at a time
 * in arrival order; a request whose response closes while it waits leaves the queue; a lane is
 * given back whenever its response closes. Checked on the class against a model written here,
 * and through a listening server (concurrent batches, a client that leaves while waiting, the
 * body errors that are now found at the request's turn).
 */
import { EventEmitter } from 'node:events';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import fc from 'fast-check';
import type { FastifyInstance } from 'fastify';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildApp } from '../../src/app.js';
import { Lanes, type Lease } from '../../src/routes/v1/lanes.js';
import { FILLET_BODY } from '../fillet-fixtures.js';

class FakeResponse extends EventEmitter {
  destroyed = false;
  writableEnded = false;
  close(): void {
    this.destroyed = true;
    this.emit('close');
  }
}

const flush = () => new Promise((r) => setImmediate(r));

describe('Lanes', () => {
  it('grants at most `size` at once, in arrival order, and a closed response gives its lane back', async () => {
    const lanes = new Lanes(2);
    const res = Array.from({ length: 5 }, () => new FakeResponse());
    const granted: number[] = [];
    res.forEach((r, i) => void lanes.enter(r).then((lease) => lease && granted.push(i)));
    await flush();
    expect(granted).toEqual([0, 1]);
    expect([lanes.busy, lanes.waiting]).toEqual([2, 3]);
    res[1]!.close();
    await flush();
    expect(granted).toEqual([0, 1, 2]);
    res[3]!.close(); // leaves while waiting: never granted
    res[0]!.close();
    await flush();
    expect(granted).toEqual([0, 1, 2, 4]);
    res[2]!.close();
    res[4]!.close();
    await flush();
    expect([lanes.busy, lanes.waiting]).toEqual([0, 0]);
  });

  it('a response already over, or answered (ended) while it waited, takes no lane', async () => {
    const lanes = new Lanes(1);
    const done = new FakeResponse();
    done.writableEnded = true;
    expect(await lanes.enter(done)).toBeNull();
    const first = new FakeResponse();
    const second = new FakeResponse();
    const third = new FakeResponse();
    expect(await lanes.enter(first)).not.toBeNull();
    const p2 = lanes.enter(second);
    const p3 = lanes.enter(third);
    second.writableEnded = true; // e.g. the deadline sweep answered it; its 'close' comes later
    first.close();
    expect(await p2).toBeNull();
    expect(await p3).not.toBeNull();
    expect(lanes.busy).toBe(1);
    second.close(); // a late close of a request that never held a lane changes nothing
    expect(lanes.busy).toBe(1);
  });

  it('a holder that gives its lane back queues again at the back; giving back twice counts once', async () => {
    const lanes = new Lanes(1);
    const a = new FakeResponse();
    const b = new FakeResponse();
    const leaseA = (await lanes.enter(a))!;
    const pb = lanes.enter(b);
    leaseA.release();
    leaseA.release();
    const leaseB = (await pb)!;
    expect([leaseA.held, leaseB.held, lanes.busy]).toEqual([false, true, 1]);
    const again = leaseA.reenter();
    await flush();
    expect([lanes.busy, lanes.waiting]).toEqual([1, 1]);
    b.close();
    expect(await again).toBe(true);
    expect([leaseA.held, lanes.busy, lanes.waiting]).toEqual([true, 1, 0]);
    a.close();
    expect([leaseA.held, lanes.busy]).toEqual([false, 0]);
    expect(await leaseA.reenter()).toBe(false);
  });

  it('refuses a size that is not a positive integer', () => {
    for (const bad of [0, -1, 1.5, Number.NaN]) expect(() => new Lanes(bad)).toThrow(RangeError);
  });

  it('against a model: any arrivals, closes, give-backs and re-entries keep busy <= size, grant in queue order, and lose no lane', async () => {
    type Step = { kind: 'arrive' } | { kind: 'close' | 'release' | 'reenter'; pick: number };
    const step = fc.oneof(
      fc.constant<Step>({ kind: 'arrive' }),
      fc.record({ kind: fc.constantFrom('close' as const, 'release' as const, 'reenter' as const), pick: fc.nat(50) }),
    );
    await fc.assert(
      fc.asyncProperty(fc.integer({ min: 1, max: 4 }), fc.array(step, { maxLength: 50 }), async (size, steps) => {
        const lanes = new Lanes(size);
        const res: FakeResponse[] = [];
        const leases: Array<Lease | null | undefined> = [];
        const grantOrder: number[] = [];
        // The model: a FIFO of waiting requests, a set of holders, and the order of grants.
        const queue: number[] = [];
        const holding = new Set<number>();
        const grants: number[] = [];
        const advance = () => {
          while (holding.size < size && queue.length > 0) {
            const i = queue.shift()!;
            holding.add(i);
            grants.push(i);
          }
        };
        const watch = (i: number, p: Promise<boolean>) => void p.then((ok) => ok && grantOrder.push(i));
        for (const s of steps) {
          const open = res.map((r, i) => (r.destroyed ? -1 : i)).filter((i) => i >= 0);
          if (s.kind === 'arrive') {
            const i = res.length;
            res.push(new FakeResponse());
            leases.push(undefined);
            watch(i, lanes.enter(res[i]!).then((lease) => ((leases[i] = lease), lease !== null)));
            queue.push(i);
            advance();
          } else if (s.kind === 'close') {
            if (open.length === 0) continue;
            const i = open[s.pick % open.length]!;
            res[i]!.close();
            const q = queue.indexOf(i);
            if (q !== -1) queue.splice(q, 1);
            holding.delete(i);
            advance();
          } else {
            // Only leases already granted can give back or re-enter.
            const known = open.filter((i) => leases[i]);
            if (known.length === 0) continue;
            const i = known[s.pick % known.length]!;
            if (s.kind === 'release') {
              leases[i]!.release();
              holding.delete(i);
              advance();
            } else if (!holding.has(i) && !queue.includes(i)) {
              watch(i, leases[i]!.reenter());
              queue.push(i);
              advance();
            }
          }
          await flush();
          expect(lanes.busy).toBe(holding.size);
          expect(lanes.busy).toBeLessThanOrEqual(size);
          expect(lanes.waiting).toBe(queue.length);
          expect(grantOrder).toEqual(grants);
        }
        for (const r of res) if (!r.destroyed) r.close();
        await flush();
        expect([lanes.busy, lanes.waiting]).toEqual([0, 0]);
        expect(leases.every((l) => l !== undefined)).toBe(true);
      }),
      { numRuns: 300 },
    );
  });
});

describe('POST /v1/batch through the lanes (BATCH_CONCURRENCY=1, listening)', () => {
  const FILLET = { kind: 'fillet', ...FILLET_BODY };
  let app: FastifyInstance;
  let port: number;

  beforeAll(async () => {
    app = await buildApp({ config: { DOCS: false, BATCH_CONCURRENCY: 1 } });
    await app.listen({ host: '127.0.0.1', port: 0 });
    port = (app.server.address() as AddressInfo).port;
  });
  afterAll(async () => {
    await app.close();
  });

  const post = (body: string, path = '/v1/batch?fields=status') =>
    fetch(`http://127.0.0.1:${port}${path}`, { method: 'POST', headers: { 'content-type': 'application/json' }, body });
  const batch = (tag: string, n: number) => JSON.stringify(Array.from({ length: n }, (_, i) => ({ ...FILLET, id: `${tag}-${i}` })));

  it('answers concurrent batches each with its own items, in its own order', async () => {
    const tags = ['a', 'b', 'c', 'd', 'e', 'f'];
    const answers = await Promise.all(tags.map(async (t, k) => (await post(batch(t, 50 + 40 * k))).json() as Promise<{ results: { id: string; status: string }[]; summary: { items: number } }>));
    answers.forEach((a, k) => {
      expect(a.summary.items).toBe(50 + 40 * k);
      expect(a.results.map((r) => r.id)).toEqual(Array.from({ length: 50 + 40 * k }, (_, i) => `${tags[k]}-${i}`));
      // FILLET_BODY passes (hand arithmetic in test/fillet-fixtures.ts).
      expect(new Set(a.results.map((r) => r.status))).toEqual(new Set(['pass']));
    });
  });

  it('a client that leaves while waiting holds no lane: the next batch is answered, and the gauges return to 0', async () => {
    const slow = post(batch('long', 4000), '/v1/batch').then((r) => r.text().then(() => r)); // full answers: the lane is busy for a while
    // A second batch sent whole, then its connection dropped while it waits its turn.
    await new Promise<void>((resolve) => {
      const body = batch('gone', 100);
      const req = http.request({ host: '127.0.0.1', port, path: '/v1/batch', method: 'POST', headers: { 'content-type': 'application/json', 'content-length': Buffer.byteLength(body) } });
      req.on('error', () => resolve());
      req.end(body, () => setTimeout(() => {
        req.destroy();
        resolve();
      }, 20));
    });
    const after = post(batch('after', 10));
    expect((await slow).status).toBe(200);
    const a = (await (await after).json()) as { summary: { items: number } };
    expect(a.summary.items).toBe(10);
    const text = await (await fetch(`http://127.0.0.1:${port}/metrics`)).text();
    expect(text).toMatch(/^throatline_batches_answering 0$/m);
    expect(text).toMatch(/^throatline_batches_waiting 0$/m);
  });

  it('a client that does not read its answer holds no lane: the next batch is answered', async () => {
    // 8,000 full answers (about 24 MB) that nobody reads: the socket's buffers fill and the
    // batch stops at a slice boundary; after STALL_MS it gives its lane back.
    const body = batch('unread', 8000);
    const req = http.request({ host: '127.0.0.1', port, path: '/v1/batch', method: 'POST', headers: { 'content-type': 'application/json', 'content-length': Buffer.byteLength(body) } });
    const started = new Promise<http.IncomingMessage>((resolve) => req.on('response', (res) => {
      res.pause();
      resolve(res);
    }));
    req.on('error', () => {});
    req.end(body);
    const unread = await started;
    const a = (await (await post(batch('next', 20))).json()) as { summary: { items: number } };
    expect(a.summary.items).toBe(20);
    unread.destroy();
  }, 20_000);

  it('a body that is not JSON, is empty, or carries __proto__ is still a 400 malformed-body', async () => {
    for (const body of ['[{"kind":', '', '[{"kind":"fillet","__proto__":{"x":1}}]']) {
      const res = await post(body);
      expect(res.status, body).toBe(400);
      expect(((await res.json()) as { type: string }).type, body).toBe('urn:throatline:problem:malformed-body');
    }
  });

  it('NDJSON streams take no lane', async () => {
    const slow = post(batch('long2', 4000), '/v1/batch').then((r) => r.text().then(() => r));
    const nd = await fetch(`http://127.0.0.1:${port}/v1/batch?fields=status`, { method: 'POST', headers: { 'content-type': 'application/x-ndjson' }, body: `${JSON.stringify({ ...FILLET, id: 'n' })}\n` });
    // Answered while the JSON batch may still hold the only lane.
    expect((await nd.text()).trim()).toBe('{"id":"n","kind":"fillet","status":"pass"}');
    expect((await slow).status).toBe(200);
  });
});
