/**
 * Rate limiting: per API key, or per client address without one; a flood gets 429 problem
 * documents with Retry-After, never failures; probes and metrics are never limited; the
 * client address honours TRUST_PROXY.
 */
import { createHash } from 'node:crypto';
import { afterEach, describe, expect, it } from 'vitest';
import type { FastifyInstance } from 'fastify';
import { buildApp } from '../../src/app.js';
import type { Config } from '../../src/config.js';
import { WindowStore } from '../../src/plugins/rate-limit.js';

const KEY_A = 'ws-desk-limit-A1b2C3d4';
const KEY_B = 'ws-desk-limit-E5f6G7h8';
const sha256 = (s: string) => createHash('sha256').update(s, 'utf8').digest('hex');

let app: FastifyInstance | undefined;
afterEach(async () => {
  await app?.close();
  app = undefined;
});

async function limited(config: Partial<Config>): Promise<FastifyInstance> {
  app = await buildApp({ config: { DOCS: false, RATE_LIMIT_MAX: 5, RATE_LIMIT_WINDOW_MS: 60000, ...config } });
  return app;
}

const steels = (a: FastifyInstance, headers: Record<string, string> = {}, remoteAddress = '10.1.1.1') =>
  a.inject({ method: 'GET', url: '/v1/catalog/steels', headers, remoteAddress });

describe('per client address (no keys configured)', () => {
  it('answers RATE_LIMIT_MAX requests, then 429 problem documents with Retry-After', async () => {
    const a = await limited({});
    for (let i = 0; i < 5; i++) {
      const ok = await steels(a);
      expect(ok.statusCode).toBe(200);
      expect(ok.headers['x-ratelimit-limit']).toBe('5');
      expect(ok.headers['x-ratelimit-remaining']).toBe(String(4 - i));
    }
    const res = await steels(a);
    expect(res.statusCode).toBe(429);
    expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
    const retry = Number(res.headers['retry-after']);
    expect(Number.isInteger(retry)).toBe(true);
    expect(retry).toBeGreaterThanOrEqual(1);
    expect(retry).toBeLessThanOrEqual(60);
    expect(res.headers['cache-control']).toBe('no-store');
    const body = res.json();
    expect(body).toMatchObject({ type: 'urn:throatline:problem:rate-limited', title: 'Too many requests', status: 429 });
    expect(body.detail).toMatch(/^At most 5 requests per 60 s for each API key or client address; retry after \d+ s\.$/);
  });

  it('counts each address on its own', async () => {
    const a = await limited({});
    for (let i = 0; i < 5; i++) expect((await steels(a, {}, '10.1.1.1')).statusCode).toBe(200);
    expect((await steels(a, {}, '10.1.1.1')).statusCode).toBe(429);
    expect((await steels(a, {}, '10.1.1.2')).statusCode).toBe(200);
  });

  it('a flood of concurrent requests gets exactly the allowed answers and 429s, nothing else', async () => {
    const a = await limited({ RATE_LIMIT_MAX: 20 });
    const body = { method: 'LRFD', electrode: 'E70', welds: [{ size: 0.25, length: 4 }], load: { force: 10 }, parts: [{ thickness: 0.5, steel: 'A36' }] };
    const all = await Promise.all(Array.from({ length: 200 }, () => a.inject({ method: 'POST', url: '/v1/fillet/check', payload: body, remoteAddress: '10.9.9.9' })));
    const counts = new Map<number, number>();
    for (const r of all) counts.set(r.statusCode, (counts.get(r.statusCode) ?? 0) + 1);
    expect(Object.fromEntries(counts)).toEqual({ 200: 20, 429: 180 });
  });

  it('never limits the probes or /metrics', async () => {
    const a = await limited({ RATE_LIMIT_MAX: 1 });
    for (let i = 0; i < 10; i++) {
      for (const url of ['/healthz', '/readyz', '/metrics']) expect((await a.inject({ method: 'GET', url, remoteAddress: '10.2.2.2' })).statusCode).toBe(200);
    }
    expect((await steels(a, {}, '10.2.2.2')).statusCode).toBe(200);
    expect((await steels(a, {}, '10.2.2.2')).statusCode).toBe(429);
  });
});

describe('per API key', () => {
  it('each key has its own budget, whatever address it comes from', async () => {
    const a = await limited({ API_KEY_HASHES: `${sha256(KEY_A)},${sha256(KEY_B)}` });
    for (let i = 0; i < 5; i++) expect((await steels(a, { 'x-throatline-key': KEY_A }, `10.3.3.${i}`)).statusCode).toBe(200);
    expect((await steels(a, { authorization: `Bearer ${KEY_A}` }, '10.3.3.99')).statusCode).toBe(429);
    expect((await steels(a, { 'x-throatline-key': KEY_B }, '10.3.3.0')).statusCode).toBe(200);
  });

  it('guesses without a valid key are limited per address, so a key cannot be brute-forced at full speed', async () => {
    const a = await limited({ API_KEY_HASHES: sha256(KEY_A) });
    const statuses: number[] = [];
    for (let i = 0; i < 8; i++) statuses.push((await steels(a, { 'x-throatline-key': `guess-${i}` }, '10.4.4.4')).statusCode);
    expect(statuses).toEqual([401, 401, 401, 401, 401, 429, 429, 429]);
    // The valid key still has its own budget.
    expect((await steels(a, { 'x-throatline-key': KEY_A }, '10.4.4.4')).statusCode).toBe(200);
  });
});

describe('TRUST_PROXY', () => {
  it('false: X-Forwarded-For is ignored, all requests from the proxy share one budget', async () => {
    const a = await limited({ RATE_LIMIT_MAX: 2 });
    const codes = [];
    for (let i = 0; i < 3; i++) codes.push((await steels(a, { 'x-forwarded-for': `203.0.113.${i}` }, '10.0.0.5')).statusCode);
    expect(codes).toEqual([200, 200, 429]);
  });

  it('true: each forwarded client has its own budget', async () => {
    const a = await limited({ RATE_LIMIT_MAX: 2, TRUST_PROXY: 'true' });
    const codes = [];
    for (let i = 0; i < 3; i++) codes.push((await steels(a, { 'x-forwarded-for': `203.0.113.${i}` }, '10.0.0.5')).statusCode);
    expect(codes).toEqual([200, 200, 200]);
  });

  it('a list of proxies: X-Forwarded-For is believed only from them', async () => {
    const a = await limited({ RATE_LIMIT_MAX: 1, TRUST_PROXY: '10.0.0.0/8' });
    expect((await steels(a, { 'x-forwarded-for': '203.0.113.1' }, '10.0.0.5')).statusCode).toBe(200);
    expect((await steels(a, { 'x-forwarded-for': '203.0.113.2' }, '10.0.0.5')).statusCode).toBe(200);
    // From outside the trusted range the header is ignored: both count as 198.51.100.7.
    expect((await steels(a, { 'x-forwarded-for': '203.0.113.3' }, '198.51.100.7')).statusCode).toBe(200);
    expect((await steels(a, { 'x-forwarded-for': '203.0.113.4' }, '198.51.100.7')).statusCode).toBe(429);
  });
});

describe('the window store', () => {
  const counts = (store: WindowStore, key: string, windowMs: number, read = false) => {
    let out: { current: number; ttl: number } | undefined;
    (read ? store.read : store.incr).call(store, key, (_e, r) => (out = r), windowMs);
    return out!;
  };

  it('counts within a window, starts again after it, and reports the time left', () => {
    let now = 1_000_000;
    const store = new WindowStore(undefined, () => now);
    expect(counts(store, 'k', 60000)).toEqual({ current: 1, ttl: 60000 });
    now += 15000;
    expect(counts(store, 'k', 60000)).toEqual({ current: 2, ttl: 45000 });
    expect(counts(store, 'k', 60000, true)).toEqual({ current: 2, ttl: 45000 }); // reading does not count
    expect(counts(store, 'other', 60000)).toEqual({ current: 1, ttl: 60000 });
    now += 45000; // the window of 'k' has ended
    expect(counts(store, 'k', 60000)).toEqual({ current: 1, ttl: 60000 });
  });

  it('hands each caller its own snapshot, so a burst in one turn of the event loop is counted one by one', () => {
    const store = new WindowStore();
    const seen: number[] = [];
    for (let i = 0; i < 5; i++) store.incr('burst', (_e, r) => seen.push(r!.current), 60000);
    expect(seen).toEqual([1, 2, 3, 4, 5]);
    const kept: Array<{ current: number }> = [];
    for (let i = 0; i < 3; i++) store.incr('kept', (_e, r) => kept.push(r!), 60000);
    expect(kept.map((r) => r.current)).toEqual([1, 2, 3]);
  });
});
