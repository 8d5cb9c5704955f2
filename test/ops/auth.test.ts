/**
 * API-key authentication: keys configured as SHA-256 hashes, presented as a bearer token or in
 * x-throatline-key, compared in constant time; 401 problem documents without a valid key;
 * probes, the contract and /docs open; /metrics optionally protected; credentials never logged.
 */
import { createHash } from 'node:crypto';
import * as crypto from 'node:crypto';
import { Writable } from 'node:stream';
import pino from 'pino';
import { afterAll, beforeAll, beforeEach, describe, expect, it, vi } from 'vitest';
import type { FastifyInstance } from 'fastify';
import { FILLET_BODY } from '../fillet-fixtures.js';

vi.mock('node:crypto', async (importOriginal) => {
  const real = await importOriginal<typeof import('node:crypto')>();
  return { ...real, timingSafeEqual: vi.fn(real.timingSafeEqual) };
});

const { buildApp } = await import('../../src/app.js');
const { REDACT_PATHS } = await import('../../src/plugins/auth.js');

// Keys of our demo scenario's two firm tools; the service is given only their hashes.
const KEY_DESK = 'ws-desk-7Qm2vX9pLr4tZ8nB';
const KEY_PIPELINE = 'ws-pipeline-Hc3Jd8sKw1Ye6Ua5';
const sha256 = (s: string) => createHash('sha256').update(s, 'utf8').digest('hex');
const HASHES = `${sha256(KEY_DESK)},${sha256(KEY_PIPELINE)}`;

const FILLET = FILLET_BODY;

let app: FastifyInstance;
beforeAll(async () => {
  app = await buildApp({ config: { DOCS: true, API_KEY_HASHES: HASHES } });
});
afterAll(async () => {
  await app.close();
});

const post = (headers: Record<string, string>) => app.inject({ method: 'POST', url: '/v1/fillet/check', payload: FILLET, headers });

describe('with API keys configured', () => {
  it('a request without a key gets a 401 problem document with WWW-Authenticate', async () => {
    const res = await post({});
    expect(res.statusCode).toBe(401);
    expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
    expect(res.headers['www-authenticate']).toBe('Bearer realm="throatline"');
    const body = res.json();
    expect(body).toMatchObject({ type: 'urn:throatline:problem:unauthorized', title: 'Unauthorized', status: 401 });
    expect(body.detail).toMatch(/Authorization: Bearer/);
  });

  it('a wrong key, a changed key, an overlong key and the hash itself get 401', async () => {
    const tries: Array<Record<string, string>> = [
      { authorization: 'Bearer ws-desk-wrong' },
      { 'x-throatline-key': `${KEY_DESK}x` },
      { 'x-throatline-key': 'k'.repeat(5000) },
      // The hash itself is not the key.
      { authorization: `Bearer ${sha256(KEY_DESK)}` },
    ];
    for (const headers of tries) {
      const res = await post(headers);
      expect(res.statusCode, JSON.stringify(headers).slice(0, 80)).toBe(401);
      expect(res.json().detail).toBe('The API key is not valid.');
    }
  });

  it('an empty bearer token, or another scheme, counts as no key and says how to send one', async () => {
    for (const authorization of ['Bearer ', `Basic ${Buffer.from(`u:${KEY_DESK}`).toString('base64')}`]) {
      const res = await post({ authorization });
      expect(res.statusCode).toBe(401);
      expect(res.json().detail).toMatch(/needs an API key: send it as "Authorization: Bearer <key>"/);
    }
  });

  it('a valid key succeeds as a bearer token and in x-throatline-key, for either configured key', async () => {
    const valid: Array<Record<string, string>> = [
      { authorization: `Bearer ${KEY_DESK}` },
      { authorization: `bearer ${KEY_PIPELINE}` },
      { 'x-throatline-key': KEY_DESK },
      { 'x-throatline-key': KEY_PIPELINE },
    ];
    for (const headers of valid) {
      const res = await post(headers);
      expect(res.statusCode).toBe(200);
      expect(res.json().status).toBe('pass');
    }
  });

  it('covers the GET form, HEAD, the catalogue and batch', async () => {
    const q = '/v1/fillet/check?method=LRFD&electrode=E70&welds.0.size=5/16&welds.0.length=10&load.force=10&parts.0.thickness=0.5&parts.0.steel=A36';
    expect((await app.inject({ method: 'GET', url: q })).statusCode).toBe(401);
    expect((await app.inject({ method: 'HEAD', url: q })).statusCode).toBe(401);
    expect((await app.inject({ method: 'GET', url: q, headers: { 'x-throatline-key': KEY_DESK } })).statusCode).toBe(200);
    expect((await app.inject({ method: 'GET', url: '/v1/catalog/electrodes' })).statusCode).toBe(401);
    expect((await app.inject({ method: 'POST', url: '/v1/batch', payload: [{ kind: 'fillet', ...FILLET }] })).statusCode).toBe(401);
    const ok = await app.inject({ method: 'POST', url: '/v1/batch', payload: [{ kind: 'fillet', ...FILLET }], headers: { authorization: `Bearer ${KEY_PIPELINE}` } });
    expect(ok.statusCode).toBe(200);
  });

  it('refuses before reading the body: an unauthenticated oversized or malformed body is a 401, not a 413 or 400', async () => {
    const big = await app.inject({ method: 'POST', url: '/v1/fillet/check', headers: { 'content-type': 'application/json' }, payload: `{"x":"${'y'.repeat(2 * 1024 * 1024)}"}` });
    expect(big.statusCode).toBe(401);
    const broken = await app.inject({ method: 'POST', url: '/v1/fillet/check', headers: { 'content-type': 'application/json' }, payload: '{"method":' });
    expect(broken.statusCode).toBe(401);
  });

  it('leaves probes, the contract, the reference page, metrics and OPTIONS open', async () => {
    for (const url of ['/healthz', '/readyz', '/openapi.json', '/openapi.yaml', '/docs', '/metrics']) {
      const res = await app.inject({ method: 'GET', url });
      expect([200, 302], url).toContain(res.statusCode);
    }
    expect((await app.inject({ method: 'OPTIONS', url: '/v1/fillet/check' })).statusCode).toBe(204);
  });

  it('marks cacheable GET answers private, so a shared cache never gives them to a caller without a key', async () => {
    const res = await app.inject({ method: 'GET', url: '/v1/catalog/steels', headers: { 'x-throatline-key': KEY_DESK } });
    expect(res.statusCode).toBe(200);
    const q = '/v1/fillet/check?method=LRFD&electrode=E70&welds.0.size=5/16&welds.0.length=10&load.force=10&parts.0.thickness=0.5&parts.0.steel=A36';
    const check = await app.inject({ method: 'GET', url: q, headers: { 'x-throatline-key': KEY_DESK } });
    expect(check.headers['cache-control']).toMatch(/^private\b/);
  });
});

describe('constant-time comparison', () => {
  const tse = vi.mocked(crypto.timingSafeEqual);
  beforeEach(() => {
    tse.mockClear();
  });

  it('compares the presented key hash with every configured hash through timingSafeEqual, matching or not', async () => {
    expect((await post({ authorization: `Bearer ${KEY_DESK}` })).statusCode).toBe(200); // matches the first hash
    expect(tse).toHaveBeenCalledTimes(2);
    tse.mockClear();
    expect((await post({ authorization: 'Bearer nobody' })).statusCode).toBe(401);
    expect(tse).toHaveBeenCalledTimes(2);
    for (const [a, b] of tse.mock.calls) {
      // Both sides are 32-byte SHA-256 digests, so the comparison never depends on the key's length.
      expect((a as Buffer).length).toBe(32);
      expect((b as Buffer).length).toBe(32);
    }
  });
});

describe('/metrics with METRICS_REQUIRE_KEY', () => {
  it('needs a key when asked to, and the probes stay open', async () => {
    const locked = await buildApp({ config: { DOCS: false, API_KEY_HASHES: HASHES, METRICS_REQUIRE_KEY: true } });
    try {
      expect((await locked.inject({ method: 'GET', url: '/metrics' })).statusCode).toBe(401);
      const ok = await locked.inject({ method: 'GET', url: '/metrics', headers: { authorization: `Bearer ${KEY_DESK}` } });
      expect(ok.statusCode).toBe(200);
      expect(ok.body).toContain('throatline_http_requests_total');
      expect((await locked.inject({ method: 'GET', url: '/readyz' })).statusCode).toBe(200);
    } finally {
      await locked.close();
    }
  });
});

describe('credentials never reach the log', () => {
  it('pino redaction paths cover both headers', () => {
    const lines: string[] = [];
    const log = pino({ redact: REDACT_PATHS }, new Writable({ write: (c, _e, cb) => (lines.push(String(c)), cb()) }));
    log.info({ req: { headers: { authorization: `Bearer ${KEY_DESK}`, 'x-throatline-key': KEY_PIPELINE, host: 'x' } } }, 'in');
    log.info({ headers: { authorization: `Bearer ${KEY_DESK}`, 'x-throatline-key': KEY_PIPELINE } }, 'out');
    const text = lines.join('');
    expect(text).not.toContain(KEY_DESK);
    expect(text).not.toContain(KEY_PIPELINE);
    expect(text.match(/\[Redacted\]/g)).toHaveLength(4);
  });

  it('a trace-level app log of accepted and refused requests holds no key', async () => {
    const lines: string[] = [];
    const stream = new Writable({ write: (c, _e, cb) => (lines.push(String(c)), cb()) });
    const traced = await buildApp({ config: { DOCS: false, API_KEY_HASHES: HASHES }, logger: { level: 'trace', stream } });
    try {
      await traced.inject({ method: 'POST', url: '/v1/fillet/check', payload: FILLET, headers: { authorization: `Bearer ${KEY_DESK}` } });
      await traced.inject({ method: 'POST', url: '/v1/fillet/check', payload: FILLET, headers: { 'x-throatline-key': KEY_PIPELINE } });
      await traced.inject({ method: 'POST', url: '/v1/fillet/check', payload: FILLET, headers: { authorization: 'Bearer guessed-key-123' } });
      await traced.inject({ method: 'POST', url: '/v1/fillet/check', payload: '{', headers: { 'content-type': 'application/json', 'x-throatline-key': KEY_DESK } });
    } finally {
      await traced.close();
    }
    const text = lines.join('');
    expect(lines.length).toBeGreaterThan(3);
    for (const secret of [KEY_DESK, KEY_PIPELINE, 'guessed-key-123']) expect(text).not.toContain(secret);
  });
});
