/**
 * Browser-facing headers: the CORS allow-list, security headers on every answer, and request
 * ids taken from the caller or made here.
 */
import { createHash } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { FastifyInstance } from 'fastify';
import { buildApp } from '../../src/app.js';

const TOOL = 'https://estimating.ws-workshop.example';
const LOCAL_TOOL = 'http://localhost:5173';
const KEY = 'ws-browser-tool-key-9Tq';
const sha256 = (s: string) => createHash('sha256').update(s, 'utf8').digest('hex');

let app: FastifyInstance;
let plain: FastifyInstance;
beforeAll(async () => {
  app = await buildApp({ config: { DOCS: false, CORS_ORIGINS: `${TOOL},${LOCAL_TOOL}`, API_KEY_HASHES: sha256(KEY) } });
  plain = await buildApp({ config: { DOCS: false } });
});
afterAll(async () => {
  await app.close();
  await plain.close();
});

const vary = (h: unknown) => String(h ?? '').toLowerCase().split(/\s*,\s*/);

describe('CORS', () => {
  it('an allowed origin gets its own origin back, never *, with the headers a tool must read exposed', async () => {
    for (const origin of [TOOL, LOCAL_TOOL]) {
      const res = await app.inject({ method: 'GET', url: '/v1/catalog/steels', headers: { origin, 'x-throatline-key': KEY } });
      expect(res.statusCode).toBe(200);
      expect(res.headers['access-control-allow-origin']).toBe(origin);
      expect(res.headers['access-control-allow-credentials']).toBeUndefined();
      expect(String(res.headers['access-control-expose-headers'])).toMatch(/\bretry-after\b/);
      expect(String(res.headers['access-control-expose-headers'])).toMatch(/\bx-request-id\b/);
      expect(vary(res.headers.vary)).toContain('origin');
    }
  });

  it('a preflight from an allowed origin is answered before authentication, with the methods and headers the API uses', async () => {
    const res = await app.inject({
      method: 'OPTIONS',
      url: '/v1/fillet/check',
      headers: { origin: TOOL, 'access-control-request-method': 'POST', 'access-control-request-headers': 'authorization, content-type' },
    });
    expect(res.statusCode).toBe(204);
    expect(res.headers['access-control-allow-origin']).toBe(TOOL);
    expect(String(res.headers['access-control-allow-methods'])).toMatch(/\bPOST\b/);
    const allowed = String(res.headers['access-control-allow-headers']).split(/\s*,\s*/);
    expect(allowed).toEqual(expect.arrayContaining(['authorization', 'content-type', 'x-throatline-key']));
    expect(Number(res.headers['access-control-max-age'])).toBeGreaterThan(0);
  });

  it('a refusal to an allowed origin still carries the CORS headers, so the tool can read the 401', async () => {
    const res = await app.inject({ method: 'POST', url: '/v1/fillet/check', headers: { origin: TOOL }, payload: {} });
    expect(res.statusCode).toBe(401);
    expect(res.headers['access-control-allow-origin']).toBe(TOOL);
  });

  it('any other origin gets no CORS headers, preflight or not (its browser withholds the answer)', async () => {
    for (const origin of ['https://evil.example', `${TOOL}.evil.example`, 'https://ws-workshop.example', 'null', TOOL.replace('https', 'http')]) {
      const pre = await app.inject({ method: 'OPTIONS', url: '/v1/fillet/check', headers: { origin, 'access-control-request-method': 'POST' } });
      expect(pre.headers['access-control-allow-origin'], origin).toBeUndefined();
      expect(pre.headers['access-control-allow-methods'], origin).toBeUndefined();
      const res = await app.inject({ method: 'GET', url: '/v1/catalog/steels', headers: { origin, 'x-throatline-key': KEY } });
      expect(res.headers['access-control-allow-origin'], origin).toBeUndefined();
      expect(vary(res.headers.vary)).toContain('origin');
    }
  });

  it('with CORS_ORIGINS empty there are no CORS headers at all, and the spreadsheet OPTIONS probe still answers', async () => {
    const res = await plain.inject({ method: 'GET', url: '/v1/catalog/steels', headers: { origin: TOOL } });
    expect(res.headers['access-control-allow-origin']).toBeUndefined();
    const probe = await plain.inject({ method: 'OPTIONS', url: '/v1/fillet/check' });
    expect(probe.statusCode).toBe(204);
    expect(probe.headers.allow).toBe('GET, HEAD, POST, OPTIONS');
  });

  it('Vary keeps both origin and accept on cacheable GET answers', async () => {
    const q = '/v1/fillet/check?method=LRFD&electrode=E70&welds.0.size=5/16&welds.0.length=10&load.force=10&parts.0.thickness=0.5&parts.0.steel=A36';
    const res = await app.inject({ method: 'GET', url: q, headers: { origin: TOOL, 'x-throatline-key': KEY } });
    expect(res.statusCode).toBe(200);
    expect(vary(res.headers.vary)).toEqual(expect.arrayContaining(['origin', 'accept']));
  });
});

describe('security headers', () => {
  const urls: Array<[string, string, unknown?]> = [
    ['GET', '/v1/catalog/steels'],
    ['GET', '/healthz'],
    ['GET', '/openapi.json'],
    ['GET', '/metrics'],
    ['GET', '/no/such/route'],
    ['POST', '/v1/fillet/check', { method: 'LRFD' }],
  ];
  for (const [method, url, payload] of urls) {
    it(`${method} ${url}: nosniff, no framing, no referrer, a script-free CSP`, async () => {
      const res = await plain.inject({ method: method as 'GET', url, ...(payload ? { payload: payload as object } : {}) });
      expect(res.headers['x-content-type-options']).toBe('nosniff');
      expect(res.headers['x-frame-options']).toBe('DENY');
      expect(res.headers['referrer-policy']).toBe('no-referrer');
      const csp = String(res.headers['content-security-policy']);
      expect(csp).toMatch(/default-src 'none'/);
      expect(csp).toMatch(/frame-ancestors 'none'/);
      expect(csp).not.toMatch(/script-src/);
      expect(res.headers['x-powered-by']).toBeUndefined();
      expect(res.headers['strict-transport-security']).toBeUndefined();
      if (res.statusCode >= 400) expect(res.headers['cache-control']).toBe('no-store');
    });
  }

  it('HSTS only when the request came over HTTPS (as a trusted proxy says)', async () => {
    const proxied = await buildApp({ config: { DOCS: false, TRUST_PROXY: 'true' } });
    try {
      const https = await proxied.inject({ method: 'GET', url: '/healthz', headers: { 'x-forwarded-proto': 'https' } });
      expect(https.headers['strict-transport-security']).toMatch(/^max-age=\d+/);
      const http = await proxied.inject({ method: 'GET', url: '/healthz', headers: { 'x-forwarded-proto': 'http' } });
      expect(http.headers['strict-transport-security']).toBeUndefined();
    } finally {
      await proxied.close();
    }
    // Without trust, a client cannot claim HTTPS for itself.
    const spoofed = await plain.inject({ method: 'GET', url: '/healthz', headers: { 'x-forwarded-proto': 'https' } });
    expect(spoofed.headers['strict-transport-security']).toBeUndefined();
  });
});

describe('request ids', () => {
  it('a safe incoming x-request-id is kept and echoed', async () => {
    const res = await plain.inject({ method: 'GET', url: '/healthz', headers: { 'x-request-id': 'ws-b12-export-0042' } });
    expect(res.headers['x-request-id']).toBe('ws-b12-export-0042');
  });

  it('without one, or with one unsafe to log, a fresh UUID is used', async () => {
    const uuid = /^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/;
    const none = await plain.inject({ method: 'GET', url: '/healthz' });
    expect(none.headers['x-request-id']).toMatch(uuid);
    for (const bad of ['x'.repeat(200), 'a b', 'line\\nbreak', '"quoted"', '<script>']) {
      const res = await plain.inject({ method: 'GET', url: '/healthz', headers: { 'x-request-id': bad } });
      expect(res.headers['x-request-id'], bad).toMatch(uuid);
    }
    const two = await Promise.all([plain.inject({ url: '/healthz' }), plain.inject({ url: '/healthz' })]);
    expect(two[0].headers['x-request-id']).not.toBe(two[1].headers['x-request-id']);
  });
});
