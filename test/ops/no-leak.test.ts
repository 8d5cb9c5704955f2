/**
 * No answer ever carries a stack trace, a file path or a library's own error body: a sweep over
 * every refusal and failure path the service has, an internal error included, with and
 * without authentication, rate limiting and CORS on.
 */
import { createHash } from 'node:crypto';
import { connect } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { FastifyInstance, InjectOptions } from 'fastify';
import { buildApp } from '../../src/app.js';
import { LoadMonitor } from '../../src/plugins/availability.js';

const KEY = 'ws-leak-sweep-key-4Fv';
const sha256 = (s: string) => createHash('sha256').update(s, 'utf8').digest('hex');

const LEAKS: Array<[string, RegExp]> = [
  ['stack frame', /\bat (?:async )?\S+ \(|\n\s+at \S/],
  ['source file with line', /\.(?:[cm]?[jt]s|json):\d+/],
  ['file path', /(?:\/work\/|\/home\/|\/usr\/|\/app\/|\/tmp\/|file:\/\/|[A-Z]:\\)/],
  ['dependency path', /node_modules/],
  ['source tree path', /(?:^|[\s"'(])\/?(?:src|dist)\/\w/],
  ['error class name', /\b(?:TypeError|ReferenceError|RangeError|SyntaxError|Error):/],
  ['framework error code', /\bFST_[A-Z_]+|\bERR_[A-Z_]+/],
  ['framework error body', /"statusCode"\s*:/],
];

function assertClean(where: string, res: { statusCode: number; body: string; headers: Record<string, unknown> }): void {
  const text = `${JSON.stringify(res.headers)}\n${res.body}`;
  for (const [what, re] of LEAKS) expect(re.test(text), `${where} (${res.statusCode}) leaks a ${what}: ${text.slice(0, 400)}`).toBe(false);
  if (res.statusCode >= 400 && res.body !== '') {
    expect(String(res.headers['content-type']), where).toMatch(/^application\/problem\+json/);
    const body = JSON.parse(res.body) as { type: string; title: string; status: number; detail: string };
    expect(body.type, where).toMatch(/^urn:throatline:problem:[a-z-]+$/);
    expect(body.status, where).toBe(res.statusCode);
  }
}

const FILLET = { method: 'LRFD', electrode: 'E70', welds: [{ size: 0.25, length: 4 }], load: { force: 10 }, parts: [{ thickness: 0.5, steel: 'A36' }] };
const GET_FORM = '/v1/fillet/check?method=LRFD&electrode=E70&welds.0.size=5/16&welds.0.length=10&load.force=10&parts.0.thickness=0.5&parts.0.steel=A36';

const SWEEP: Array<[string, InjectOptions]> = [
  ['malformed JSON', { method: 'POST', url: '/v1/fillet/check', headers: { 'content-type': 'application/json' }, payload: '{"method": LRFD}' }],
  ['truncated JSON', { method: 'POST', url: '/v1/fillet/check', headers: { 'content-type': 'application/json' }, payload: '{"method":"LRFD","welds":[' }],
  ['empty JSON body', { method: 'POST', url: '/v1/fillet/check', headers: { 'content-type': 'application/json' }, payload: '' }],
  ['bad content-length', { method: 'POST', url: '/v1/fillet/check', headers: { 'content-type': 'application/json', 'content-length': '5' }, payload: '{"a":1,"b":2}' }],
  ['text body', { method: 'POST', url: '/v1/fillet/check', headers: { 'content-type': 'text/plain' }, payload: 'hello' }],
  ['xml body', { method: 'POST', url: '/v1/fillet/check', headers: { 'content-type': 'application/xml' }, payload: '<a/>' }],
  ['broken content type', { method: 'POST', url: '/v1/fillet/check', headers: { 'content-type': 'application/json; charset=' }, payload: '{}' }],
  ['too large', { method: 'POST', url: '/v1/fillet/check', headers: { 'content-type': 'application/json' }, payload: `{"id":"${'x'.repeat(1_100_000)}"}` }],
  ['too deep', { method: 'POST', url: '/v1/fillet/check', headers: { 'content-type': 'application/json' }, payload: `${'['.repeat(200)}${']'.repeat(200)}` }],
  ['prototype poisoning', { method: 'POST', url: '/v1/fillet/check', headers: { 'content-type': 'application/json' }, payload: '{"__proto__":{"x":1},"method":"LRFD"}' }],
  ['constructor poisoning', { method: 'POST', url: '/v1/fillet/check', headers: { 'content-type': 'application/json' }, payload: '{"constructor":{"prototype":{"x":1}}}' }],
  ['schema violation', { method: 'POST', url: '/v1/fillet/check', payload: { ...FILLET, welds: [{ size: -1, length: 'ten' }], extra: true } }],
  ['wrong types everywhere', { method: 'POST', url: '/v1/fillet/check', payload: { method: 1, units: [], electrode: null, welds: 'x', parts: {} } }],
  ['array body', { method: 'POST', url: '/v1/fillet/check', payload: [1, 2, 3] }],
  ['unanswerable (422)', { method: 'POST', url: '/v1/fillet/check', payload: { ...FILLET, parts: [{ thickness: 0.5, steel: { fy: 70, fu: 50 } }] } }],
  ['metric fraction (400 from mapping)', { method: 'POST', url: '/v1/fillet/check', payload: { ...FILLET, units: 'metric', welds: [{ size: '5/16', length: 100 }] } }],
  ['query form garbage', { method: 'GET', url: '/v1/fillet/check?method=LRFD&welds.x.0=1&__proto__.polluted=1' }],
  ['query form repeated field', { method: 'GET', url: `${GET_FORM}&method=ASD` }],
  ['format=value without field', { method: 'GET', url: `${GET_FORM}&format=value` }],
  ['format=value unknown field', { method: 'GET', url: `${GET_FORM}&format=value&field=constructor.prototype` }],
  ['unknown format', { method: 'GET', url: `${GET_FORM}&format=pdfx` }],
  ['range table errors', { method: 'GET', url: `${GET_FORM}&vary=welds.0.nothing&values=1,2` }],
  ['range table without vary', { method: 'GET', url: `${GET_FORM}&values=1,2` }],
  ['broken % escape in path', { method: 'GET', url: '/v1/fillet/%E0%A4%A' }],
  ['broken % escape in query', { method: 'GET', url: '/v1/fillet/check?method=%E0%A4%A' }],
  ['unknown route', { method: 'GET', url: '/v2/everything' }],
  ['unknown method', { method: 'DELETE', url: '/v1/fillet/check' }],
  ['path traversal', { method: 'GET', url: '/docs/static/../../../../etc/passwd' }],
  ['batch not an array', { method: 'POST', url: '/v1/batch', payload: { kind: 'fillet' } }],
  ['batch of bad items', { method: 'POST', url: '/v1/batch', payload: [null, 1, 'x', [], { kind: 'nothing' }, { kind: 'fillet' }, { kind: 'fillet', ...FILLET, parts: [{ thickness: 0.5, steel: { fy: 70, fu: 50 } }] }] }],
  ['batch bad query', { method: 'POST', url: '/v1/batch?ids=maybe', payload: [] }],
  ['ndjson garbage', { method: 'POST', url: '/v1/batch', headers: { 'content-type': 'application/x-ndjson' }, payload: '{"kind":"fillet"\nnot json\n[]\n{"kind":"fillet","method":"LRFD","__proto__":{}}\n' }],
  ['catalog bad query', { method: 'GET', url: '/v1/catalog/steels?units=martian' }],
  ['weld group nonsense', { method: 'POST', url: '/v1/weld-group/eccentric', payload: { method: 'LRFD', electrode: 'E70', size: '1/4', segments: [{ from: [0, 0], to: [0, 0] }], load: { fx: 0, fy: 0, at: [0, 0] } } }],
  ['groove nonsense', { method: 'POST', url: '/v1/groove/pjp/check', payload: { method: 'ASD', electrode: 'E70', groove: { type: 'flare-V', depth: 99, process: 'SAW', position: 'overhead', sides: 3 }, length: 0, load: { case: 'shear', force: -1 }, parts: [] } }],
];

describe('no stack trace, file path or library body in any answer', () => {
  let open: FastifyInstance;
  let guarded: FastifyInstance;
  beforeAll(async () => {
    open = await buildApp({ config: { DOCS: false } });
    guarded = await buildApp({ config: { DOCS: false, API_KEY_HASHES: sha256(KEY), RATE_LIMIT_MAX: 3, CORS_ORIGINS: 'https://tools.ws-workshop.example' } });
  });
  afterAll(async () => {
    await open.close();
    await guarded.close();
  });

  for (const [name, req] of SWEEP) {
    it(name, async () => {
      const res = await open.inject(req);
      expect(res.statusCode, name).toBeLessThan(500);
      assertClean(name, res);
    });
  }

  it('authentication, rate-limit and CORS refusals', async () => {
    const origin = { origin: 'https://tools.ws-workshop.example' };
    for (let i = 0; i < 6; i++) assertClean(`no key ${i}`, await guarded.inject({ method: 'POST', url: '/v1/fillet/check', headers: origin, payload: FILLET }));
    for (let i = 0; i < 6; i++) {
      assertClean(`bad key ${i}`, await guarded.inject({ method: 'POST', url: '/v1/fillet/check', headers: { ...origin, authorization: `Bearer nope-${i}` }, payload: FILLET, remoteAddress: '10.7.7.7' }));
    }
    assertClean('preflight', await guarded.inject({ method: 'OPTIONS', url: '/v1/fillet/check', headers: { ...origin, 'access-control-request-method': 'POST' } }));
    assertClean('preflight, other origin', await guarded.inject({ method: 'OPTIONS', url: '/v1/batch', headers: { origin: 'https://elsewhere.example', 'access-control-request-method': 'POST' } }));
  });

  it('an internal failure is a bare 500 problem, its message and stack only in the log', async () => {
    const monitor = new LoadMonitor({ limitMs: 0 });
    let fail = false;
    Object.defineProperty(monitor, 'overloaded', {
      get() {
        if (!fail) return false;
        const err = new TypeError('cannot read properties of undefined at /work/main/src/plugins/availability.ts:120:7');
        err.stack = `${err.message}\n    at Object.<anonymous> (/work/main/node_modules/fastify/lib/hooks.js:1:1)`;
        throw err;
      },
    });
    const logged: string[] = [];
    const app = await buildApp({
      config: { DOCS: false },
      loadMonitor: monitor,
      logger: { level: 'error', stream: { write: (line: string) => void logged.push(line) } },
    });
    try {
      fail = true;
      const res = await app.inject({ method: 'POST', url: '/v1/fillet/check', payload: FILLET });
      expect(res.statusCode).toBe(500);
      assertClean('internal error', res);
      expect(res.json()).toMatchObject({ type: 'urn:throatline:problem:internal', status: 500 });
      expect(logged.join('')).toContain('availability.ts:120:7');
    } finally {
      fail = false;
      await app.close();
    }
  });

  it('HTTP errors below the framework (bad request line, oversized headers) are problem documents too', async () => {
    await open.listen({ host: '127.0.0.1', port: 0 });
    const { port } = open.server.address() as { port: number };
    const raw = (text: string) =>
      new Promise<string>((resolve, reject) => {
        const s = connect(port, '127.0.0.1', () => s.write(text));
        let out = '';
        s.on('data', (d) => (out += d.toString('latin1')));
        s.on('close', () => resolve(out));
        s.on('error', reject);
        setTimeout(() => s.destroy(), 5000).unref();
      });
    for (const text of ['NOT HTTP AT ALL\r\n\r\n', `GET / HTTP/1.1\r\nhost: x\r\nx-big: ${'a'.repeat(20000)}\r\n\r\n`, 'GET /\u0000 HTTP/1.1\r\n\r\n']) {
      const out = await raw(text);
      const status = /^HTTP\/1\.1 (4\d\d) /.exec(out);
      expect(status, out.slice(0, 100)).not.toBeNull();
      const head = out.slice(0, out.indexOf('\r\n\r\n'));
      const body = out.slice(head.length + 4);
      const headers = Object.fromEntries(head.split('\r\n').slice(1).map((l) => [l.slice(0, l.indexOf(':')).toLowerCase(), l.slice(l.indexOf(':') + 1).trim()]));
      assertClean(`raw ${JSON.stringify(text.slice(0, 20))}`, { statusCode: Number(status![1]), body, headers });
    }
  });
});
