/**
 * Fuzzing the service: random JSON values, mutated valid bodies, raw text, random query
 * strings and unknown paths. Whatever arrives, the service never answers 5xx, every refusal
 * is an RFC 9457 problem whose `status` equals the HTTP status, and no answer leaks a stack
 * trace, a file path or an error class name. Bounded: a few thousand requests in all.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import type { FastifyInstance, InjectOptions, LightMyRequestResponse } from 'fastify';
import { app as build } from '../helpers.js';
import { OPERATIONS } from '../../src/operations/index.js';

let app: FastifyInstance;
beforeAll(async () => {
  app = await build();
});
afterAll(async () => {
  await app.close();
});

/** What must never reach a client: stack frames, source or dependency paths, error class names. */
const LEAKS = ['    at ', '/src/', 'node_modules', '.ts:', 'Error:'];

/** Generated input never contains the markers itself, so an echo of the input cannot pass for a leak. */
const clean = (text: string) => !LEAKS.some((m) => text.includes(m));

async function send(options: InjectOptions): Promise<LightMyRequestResponse> {
  const res = await app.inject(options);
  const where = `${String(options.method)} ${String(options.url)}`;
  expect(res.statusCode, where).toBeLessThan(500);
  for (const m of LEAKS) expect(res.body.includes(m), `${where} leaks "${m}": ${res.body.slice(0, 300)}`).toBe(false);
  if (res.statusCode >= 300) {
    expect(res.headers['content-type'], where).toMatch(/^application\/problem\+json/);
    if (options.method !== 'HEAD') {
      const body = JSON.parse(res.body) as Record<string, unknown>;
      expect(body.status, where).toBe(res.statusCode);
      expect(typeof body.type).toBe('string');
      expect(typeof body.title).toBe('string');
      expect(typeof body.detail).toBe('string');
    }
  }
  return res;
}

function postJson(url: string, text: string) {
  return send({ method: 'POST', url, payload: text, headers: { 'content-type': 'application/json' } });
}

const VALID_FILLET = {
  id: 'WS-B12',
  method: 'LRFD',
  units: 'imperial',
  electrode: 'E70',
  welds: [{ size: '5/16', length: 10, angle: 0, count: 2, endLoaded: false, intermittent: { segments: 3, pitch: 12 } }],
  load: { force: 120 },
  lap: 2,
  parts: [
    { thickness: 0.5, steel: 'A572-50', faces: 2, edge: true, loading: 'shear' },
    { thickness: 0.75, steel: { fy: 50, fu: 65 } },
  ],
};

const VALID_BASE_METAL = {
  id: 'WS-B07',
  method: 'ASD',
  units: 'imperial',
  part: { thickness: 0.375, steel: 'A36', faces: 2, loading: 'shear' },
  lines: [{ length: 9, count: 2 }],
  load: { force: 40 },
};

type Json = null | boolean | number | string | Json[] | { [k: string]: Json };

/** Every path into a JSON value (objects by key, arrays by index), the root excluded. */
function paths(value: Json, prefix: Array<string | number> = [], out: Array<Array<string | number>> = []) {
  if (value !== null && typeof value === 'object') {
    for (const [k, v] of Array.isArray(value) ? value.map((v, i) => [i, v] as const) : Object.entries(value)) {
      const p = [...prefix, k];
      out.push(p);
      paths(v as Json, p, out);
    }
  }
  return out;
}

const SENTINEL = '\u0000sentinel\u0000';

/** Numbers and texts that break naive code. Raw JSON literals (1e400 → Infinity on parsing) are spliced in as text. */
const nasty: fc.Arbitrary<Json | { raw: string }> = fc.oneof(
  fc.constantFrom<Json | { raw: string }>(
    0, -0, -1, 1, 1.5, -1e-300, 5e-324, 1e-320, 1e7, 1e7 + 1, 1e9, 1e300, -1e300, Number.MAX_SAFE_INTEGER, Number.MAX_VALUE, 2 ** 53 + 1,
    'NaN', 'Infinity', '-Infinity', '1e400', '', ' ', '0', '-0', '5/0', '0/0', '1/3', '99999999999999999999/1', '1-1/4', '1 1/4', ' 5/16 ',
    'E70', 'A992', 'LRFD', 'imperial', 'metric', 'true', 'null', '__proto__', 'constructor', 'toString',
    true, false, null, [], {}, [[]], { fy: 1e9, fu: 1 }, { fexx: Number.MIN_VALUE },
    { raw: '1e400' }, { raw: '-1e400' }, { raw: '1e-400' }, { raw: '-0.0e-0' }, { raw: '123456789012345678901234567890' },
  ),
  fc.double(),
  fc.integer(),
  fc.string({ maxLength: 40 }),
  fc.string({ maxLength: 40, unit: 'grapheme' }),
  fc.string({ minLength: 2000, maxLength: 4000, unit: 'grapheme-ascii' }),
  fc.jsonValue({ maxDepth: 3 }) as fc.Arbitrary<Json>,
  fc.integer({ min: 20, max: 400 }).map((depth) => {
    let v: Json = 1;
    for (let i = 0; i < depth; i++) v = i % 2 ? [v] : { a: v };
    return v;
  }),
);

/** A valid body with one place replaced, deleted, or given an extra key; serialised to JSON text. */
function mutated(valid: Json): fc.Arbitrary<string> {
  const all = paths(valid);
  return fc.tuple(fc.constantFrom(...all), fc.constantFrom('replace', 'replace', 'replace', 'delete', 'extra'), nasty, fc.string({ maxLength: 12 })).map(([path, how, value, key]) => {
    const body = structuredClone(valid) as Json;
    let parent = body as Record<string | number, Json>;
    for (const seg of path.slice(0, -1)) parent = parent[seg] as Record<string | number, Json>;
    const last = path[path.length - 1]!;
    const raw = value !== null && typeof value === 'object' && !Array.isArray(value) && typeof (value as { raw?: unknown }).raw === 'string' ? (value as { raw: string }).raw : null;
    const put = raw === null ? (value as Json) : SENTINEL;
    if (how === 'delete') {
      if (Array.isArray(parent)) parent.splice(Number(last), 1);
      else delete parent[last];
    } else if (how === 'extra' && parent[last] !== null && typeof parent[last] === 'object' && !Array.isArray(parent[last])) {
      (parent[last] as Record<string, Json>)[key] = put;
    } else {
      parent[last] = put;
    }
    const text = JSON.stringify(body);
    return raw === null ? text : text.replace(JSON.stringify(SENTINEL), raw);
  });
}

describe('POST bodies', () => {
  for (const [url, valid] of [
    ['/v1/fillet/check', VALID_FILLET],
    ['/v1/base-metal/check', VALID_BASE_METAL],
  ] as const) {
    it(`${url}: the valid body is answered (the fuzz starts from a good request)`, async () => {
      expect((await postJson(url, JSON.stringify(valid))).statusCode).toBe(200);
    });

    it(`${url}: random JSON values`, async () => {
      await fc.assert(
        fc.asyncProperty(fc.jsonValue({ maxDepth: 4 }), async (v) => {
          const text = JSON.stringify(v) ?? 'null';
          fc.pre(clean(text));
          await postJson(url, text);
        }),
        { numRuns: 300 },
      );
    });

    it(`${url}: anything() values with valid-looking keys`, async () => {
      const keys = Object.keys(valid);
      await fc.assert(
        fc.asyncProperty(fc.dictionary(fc.constantFrom(...keys, 'bogus'), fc.anything({ maxDepth: 3, withNullPrototype: true, withBoxedValues: true })), async (v) => {
          const text = JSON.stringify(v) ?? 'null';
          fc.pre(clean(text));
          await postJson(url, text);
        }),
        { numRuns: 300 },
      );
    });

    it(`${url}: one field of a valid body mutated`, async () => {
      await fc.assert(
        fc.asyncProperty(mutated(valid as unknown as Json), async (text) => {
          fc.pre(clean(text));
          await postJson(url, text);
        }),
        { numRuns: 700 },
      );
    });

    it(`${url}: two fields mutated, with ?format=csv or value`, async () => {
      const fmt = fc.constantFrom('', '?format=csv', '?format=value&field=utilization', '?format=value&field=checks.0.ratio', '?format=value', '?format=value&field=values');
      await fc.assert(
        fc.asyncProperty(mutated(valid as unknown as Json).chain((first) => mutated(JSON.parse(first) as Json)), fmt, async (text, q) => {
          fc.pre(clean(text));
          await postJson(`${url}${q}`, text);
        }),
        { numRuns: 150 },
      );
    });

    it(`${url}: raw text that is mostly not JSON`, async () => {
      await fc.assert(
        fc.asyncProperty(
          fc.oneof(fc.string({ maxLength: 200 }), fc.string({ maxLength: 200, unit: 'binary' }), fc.constantFrom('{', '[', '{"method":', '{"method":"LRFD"', '\u0000', '\uFEFF{}', '{"a":1}{"b":2}', 'NaN', 'Infinity')),
          async (text) => {
            fc.pre(clean(text));
            await postJson(url, text);
          },
        ),
        { numRuns: 150 },
      );
    });
  }

  // Every other operation registered, fuzzed from its own first example: new weld families are
  // covered as soon as they are registered.
  for (const op of OPERATIONS.filter((o) => o.path !== '/v1/fillet/check' && o.path !== '/v1/base-metal/check')) {
    const example = Object.values(op.examples)[0]?.value as unknown as Json | undefined;
    if (!example) continue;
    it(`${op.path}: one or two fields of its example mutated`, async () => {
      await fc.assert(
        fc.asyncProperty(fc.oneof(mutated(example), mutated(example).chain((first) => mutated(JSON.parse(first) as Json))), async (text) => {
          fc.pre(clean(text));
          await postJson(op.path, text);
        }),
        { numRuns: 250 },
      );
    });
  }

  it('schema-valid fillet bodies at the edges of every range are answered 200 or 422, never 400 or 5xx', async () => {
    // The contract's range: lengths 0.001 to 1e7 (MIN_LENGTH, MAX_MAGNITUDE in src/schemas/common.ts), stresses 1 to 1e4.
    const len = fc.oneof(fc.constantFrom(0.001, 0.0010000001, 1e7), fc.double({ min: 0.001, max: 1e7, noNaN: true }));
    const weld = fc.record(
      {
        size: len,
        length: len,
        angle: fc.oneof(fc.constantFrom(0, 90, 1e-300, 89.999999), fc.double({ min: 0, max: 90, noNaN: true })),
        count: fc.constantFrom(1, 2, 1000),
        endLoaded: fc.boolean(),
        builtOut: fc.boolean(),
        intermittent: fc.record({ segments: fc.constantFrom(1, 2, 10000), pitch: len }),
      },
      { requiredKeys: ['size', 'length'] },
    );
    const steel = fc.oneof(fc.constantFrom('A36', 'A992', 'A514', 'S355', 'A572-65'), fc.record({ fy: fc.double({ min: 1, max: 1e4, noNaN: true }), fu: fc.constant(1e4) }));
    const part = fc.record({ thickness: len, steel, edge: fc.boolean(), faces: fc.constantFrom(1, 2), loading: fc.constantFrom('shear', 'tension') }, { requiredKeys: ['thickness', 'steel'] });
    const body = fc.record(
      {
        method: fc.constantFrom('LRFD', 'ASD'),
        units: fc.constantFrom('imperial', 'metric'),
        electrode: fc.oneof(fc.constantFrom('E60', 'E110', 'E43', 'E76'), fc.record({ fexx: fc.double({ min: 1, max: 1e4, noNaN: true }) })),
        welds: fc.array(weld, { minLength: 1, maxLength: 50 }),
        parts: fc.array(part, { minLength: 1, maxLength: 4 }),
        load: fc.record({ force: fc.oneof(fc.constantFrom(0, 1e9, 5e-324), fc.double({ min: 0, max: 1e9, noNaN: true })) }),
        directionalIncrease: fc.boolean(),
        lap: len,
        flatBarWidth: len,
      },
      { requiredKeys: ['method', 'electrode', 'welds', 'parts'] },
    );
    await fc.assert(
      fc.asyncProperty(body, async (b) => {
        const res = await postJson('/v1/fillet/check', JSON.stringify(b));
        expect([200, 422], res.body.slice(0, 300)).toContain(res.statusCode);
        if (res.statusCode === 200) expect(['pass', 'fail']).toContain(res.json().status);
      }),
      { numRuns: 300 },
    );
  });

  it('odd content types and methods on the check paths', async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.constantFrom('/v1/fillet/check', '/v1/base-metal/check'),
        fc.constantFrom('POST', 'PUT', 'PATCH', 'DELETE', 'OPTIONS', 'GET') as fc.Arbitrary<InjectOptions['method']>,
        fc.option(fc.constantFrom('application/json', 'application/json; charset=utf-8', 'text/plain', 'application/xml', 'application/x-www-form-urlencoded', 'multipart/form-data', 'application/octet-stream', '*/*', ';;;', 'application/json; charset=utf-16')),
        fc.constantFrom(JSON.stringify(VALID_FILLET), JSON.stringify(VALID_BASE_METAL), '', 'a=1&b=2', '{'),
        async (url, method, type, payload) => {
          const headers: Record<string, string> = type === null ? {} : { 'content-type': type };
          await send({ method, url, payload: method === 'GET' ? undefined : payload, headers });
        },
      ),
      { numRuns: 150 },
    );
  });
});

describe('GET forms and unknown paths', () => {
  const keyPart = fc.oneof(
    fc.constantFrom('method', 'units', 'electrode', 'fexx', 'welds', 'size', 'legs', 'length', 'angle', 'count', 'endLoaded', 'intermittent', 'segments', 'pitch', 'parts', 'thickness', 'steel', 'fy', 'fu', 'faces', 'loading', 'load', 'force', 'lap', 'part', 'lines', 'id', 'format', 'field'),
    fc.constantFrom('0', '1', '2', '00', '999', '1000', '-1', '1.5', '__proto__', 'constructor', 'prototype', 'toString', '', ' ', '[]', '[0]', '%', '%zz'),
    fc.string({ maxLength: 8 }),
  );
  const key = fc.array(keyPart, { minLength: 1, maxLength: 4 }).map((parts) => parts.join('.'));
  const value = fc.oneof(
    fc.constantFrom('LRFD', 'ASD', 'imperial', 'metric', 'E70', 'E49', 'A992', 'S355', '5/16', '1-1/4', '1 1/4', '10', '0', '-1', '1e400', 'NaN', 'true', 'false', '', ',', '5/16,3/8', 'csv', 'value', 'json', 'utilization'),
    fc.double().map(String),
    fc.string({ maxLength: 20 }),
    fc.string({ maxLength: 20, unit: 'grapheme' }),
  );
  const encode = (s: string) => {
    try {
      return encodeURIComponent(s);
    } catch {
      return 'x'; // lone surrogates cannot be encoded; a real client could not send them either
    }
  };
  const pairs = fc.array(fc.tuple(key, value, fc.boolean()), { maxLength: 12 }).map((list) =>
    list.map(([k, v, raw]) => (raw ? `${k.replace(/[#&=\s]/g, '')}=${v.replace(/[#&\s]/g, '')}` : `${encode(k)}=${encode(v)}`)).join('&'),
  );

  const others = OPERATIONS.filter((o) => o.path !== '/v1/fillet/check' && o.path !== '/v1/base-metal/check').map((o) => [o.path, toQuery(Object.values(o.examples)[0]?.value ?? {}).join('&'), 200] as const);
  for (const [url, base, expected] of [
    ['/v1/fillet/check', 'method=LRFD&electrode=E70&welds.0.size=5%2F16&welds.0.length=10&parts.0.thickness=0.5&parts.0.steel=A36', 200],
    ['/v1/base-metal/check', 'method=LRFD&part.thickness=0.5&part.steel=A36&lines.0.length=4', 200],
    ...others,
  ] as const) {
    it(`${url}: the valid query is answered`, async () => {
      expect((await send({ method: 'GET', url: `${url}?${base}` })).statusCode).toBe(expected);
    });

    it(`${url}: random query strings, alone and added to a valid one`, async () => {
      await fc.assert(
        fc.asyncProperty(pairs, fc.boolean(), async (q, withBase) => {
          const query = withBase ? `${base}&${q}` : q;
          fc.pre(clean(query) && clean(decodeURIComponentSafe(query)));
          await send({ method: 'GET', url: `${url}?${query}` });
        }),
        { numRuns: 400 },
      );
    });
  }

  it('unknown paths with random query strings', async () => {
    const segment = fc.oneof(fc.constantFrom('v1', 'v2', 'fillet', 'check', 'catalog', 'steels', 'docs', '..', '.', 'openapi.json', 'metrics'), fc.string({ minLength: 1, maxLength: 12 }));
    await fc.assert(
      fc.asyncProperty(
        fc.array(segment, { minLength: 1, maxLength: 5 }),
        pairs,
        fc.constantFrom('GET', 'POST', 'PUT', 'DELETE', 'PATCH') as fc.Arbitrary<InjectOptions['method']>,
        async (segments, q, method) => {
          const path = `/${segments.map((s) => encode(s)).join('/')}`;
          fc.pre(clean(decodeURIComponentSafe(path + q)) && clean(path + q));
          await send({ method, url: `${path}?${q}`, ...(method === 'GET' ? {} : { payload: '{}', headers: { 'content-type': 'application/json' } }) });
        },
      ),
      { numRuns: 300 },
    );
  });
});

/** Flattens a JSON body to dotted query parameters. */
function toQuery(value: unknown, prefix = '', out: string[] = []): string[] {
  if (value !== null && typeof value === 'object') {
    for (const [k, v] of Object.entries(value)) toQuery(v, prefix ? `${prefix}.${k}` : k, out);
  } else {
    out.push(`${encodeURIComponent(prefix)}=${encodeURIComponent(String(value))}`);
  }
  return out;
}

function decodeURIComponentSafe(s: string): string {
  try {
    return decodeURIComponent(s.replace(/\+/g, ' '));
  } catch {
    return s;
  }
}
