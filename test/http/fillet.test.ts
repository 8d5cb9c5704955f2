/**
 * POST and GET /v1/fillet/check over HTTP: the JSON envelope, both unit systems, the README
 * example, `id` echo, and the spreadsheet formats (format=csv, format=value&field=...).
 */
import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import type { FastifyInstance } from 'fastify';
import { app as build, readCsv } from '../helpers.js';

let app: FastifyInstance;
beforeAll(async () => {
  app = await build();
});
afterAll(async () => {
  await app.close();
});

const PATH = '/v1/fillet/check';

/** WS-B03: one 5/16 in E70 fillet, 10 in long, between two 1 in A992 parts. */
const imperial = {
  method: 'LRFD',
  units: 'imperial',
  electrode: 'E70',
  welds: [{ size: '5/16', length: 10 }],
  load: { force: 60 },
  parts: [
    { thickness: 1, steel: 'A992' },
    { thickness: 1, steel: 'A992' },
  ],
};

/** WS-C21: one 6 mm E49 fillet, 100 mm long, between two 10 mm S355 plates. */
const metric = {
  method: 'LRFD',
  units: 'metric',
  electrode: 'E49',
  welds: [{ size: 6, length: 100 }],
  load: { force: 50 },
  parts: [
    { thickness: 10, steel: 'S355' },
    { thickness: 10, steel: 'S355' },
  ],
};

const IMPERIAL_QUERY = 'method=LRFD&units=imperial&electrode=E70&welds.0.size=5%2F16&welds.0.length=10&load.force=60&parts.0.thickness=1&parts.0.steel=A992&parts.1.thickness=1&parts.1.steel=A992';

async function post(body: unknown, query = '') {
  return app.inject({ method: 'POST', url: `${PATH}${query ? `?${query}` : ''}`, payload: body as object });
}
async function get(query: string) {
  return app.inject({ method: 'GET', url: `${PATH}?${query}` });
}

/** Value at a dotted path of a JSON answer (array items by index). */
function at(value: unknown, path: string): unknown {
  let node = value;
  for (const seg of path.split('.')) {
    if (node === null || typeof node !== 'object') return undefined;
    node = (node as Record<string, unknown>)[seg];
  }
  return node;
}

/** Every scalar leaf of a JSON answer as [dotted path, value]. */
function leaves(value: unknown, prefix = '', out: Array<[string, unknown]> = []): Array<[string, unknown]> {
  if (value !== null && typeof value === 'object') {
    for (const [k, v] of Object.entries(value)) leaves(v, prefix ? `${prefix}.${k}` : k, out);
  } else out.push([prefix, value]);
  return out;
}

function expectEnvelope(body: Record<string, unknown>) {
  expect(['pass', 'fail']).toContain(body.status);
  expect(typeof body.utilization).toBe('number');
  const governing = body.governing as Record<string, unknown>;
  expect(governing.code).toMatch(/^[A-Z][A-Z0-9_]+$/);
  expect(typeof governing.available).toBe('number');
  const checks = body.checks as Array<Record<string, unknown>>;
  expect(checks.length).toBeGreaterThan(0);
  for (const c of checks) {
    expect(c.code).toMatch(/^[A-Z][A-Z0-9_]+$/);
    // The fixed clause and equation formats of the API conventions.
    expect(c.clause).toMatch(/^AISC 360-22 (§J\d(\.\d+[a-z]?)?|Table J\d\.\d)$/);
    expect(c.equation).toMatch(/^Eq\. J\d-\d+[a-z]?(, J\d-\d+[a-z]?)*$/);
    for (const k of ['nominal', 'available', 'demand', 'ratio']) expect(typeof c[k]).toBe('number');
    expect(typeof c.pass).toBe('boolean');
  }
  expect(Array.isArray(body.limits)).toBe(true);
  for (const l of body.limits as Array<Record<string, unknown>>) {
    expect(l.code).toMatch(/^[A-Z][A-Z0-9_]+$/);
    expect(typeof l.required).toBe('number');
    expect(typeof l.provided).toBe('number');
    expect(typeof l.pass).toBe('boolean');
  }
  expect(Array.isArray(body.warnings)).toBe(true);
  for (const w of body.warnings as Array<Record<string, unknown>>) {
    expect(w.code).toMatch(/^[A-Z][A-Z0-9_]+$/);
    expect(typeof w.message).toBe('string');
  }
  expect(typeof body.values).toBe('object');
  expect((body.basis as Record<string, unknown>).standard).toBe('AISC 360-22');
  expect(typeof (body.basis as Record<string, unknown>).engine).toBe('string');
  // weld-rules.md section 6: every response carries the caution.
  expect(body.notice).toMatch(/licensed engineer/);
}

describe('POST /v1/fillet/check answers the JSON envelope', () => {
  it('imperial LRFD: shape, units, basis and the weld metal strength', async () => {
    const res = await post(imperial);
    expect(res.statusCode).toBe(200);
    expect(res.headers['content-type']).toMatch(/^application\/json/);
    const body = res.json();
    expectEnvelope(body);
    expect(body.units).toEqual({ length: 'in', force: 'kip', stress: 'ksi' });
    expect(body.basis.method).toBe('LRFD');
    expect(body.status).toBe('pass');
    expect(body.governing.code).toBe('FILLET_WELD_METAL');
    // common practice, no source: 1.392 kip/in per sixteenth × 5 sixteenths × 10 in = 69.6 kip
    expect(body.governing.available).toBeCloseTo(69.6, 1);
    // AISC 360-22 Table J2.5 (from memory): phi = 0.75 for fillet weld metal
    expect(body.checks.find((c: { code: string }) => c.code === 'FILLET_WELD_METAL').phi).toBe(0.75);
    // 60 / 69.6 = 0.862
    expect(body.utilization).toBeCloseTo(60 / 69.6, 2);
    expect(body.checks.every((c: Record<string, unknown>) => c.omega === undefined)).toBe(true);
  });

  it('imperial ASD carries omega and the ASD strength', async () => {
    const res = await post({ ...imperial, method: 'ASD' });
    expect(res.statusCode).toBe(200);
    const body = res.json();
    expectEnvelope(body);
    expect(body.basis.method).toBe('ASD');
    const weld = body.checks.find((c: { code: string }) => c.code === 'FILLET_WELD_METAL');
    // AISC 360-22 Table J2.5 (from memory): Omega = 2.00
    expect(weld.omega).toBe(2);
    expect(weld.phi).toBeUndefined();
    // common practice, no source: 0.928 kip/in per sixteenth × 5 × 10 in = 46.4 kip
    expect(weld.available).toBeCloseTo(46.4, 1);
  });

  it('metric: mm, kN, MPa and the metric weld metal strength', async () => {
    const res = await post(metric);
    expect(res.statusCode).toBe(200);
    const body = res.json();
    expectEnvelope(body);
    expect(body.units).toEqual({ length: 'mm', force: 'kN', stress: 'MPa' });
    // hand arithmetic, AISC 360-22 Eq. J2-4: 0.75 × 0.60 × 490 MPa × 0.7071 × 6 mm × 100 mm / 1000 = 93.55 kN
    expect(body.governing.available).toBeCloseTo(93.55, 1);
    expect(body.governing.code).toBe('FILLET_WELD_METAL');
    // AISC 360-22 J2.2a (from memory): throat 0.707 × 6 mm = 4.243 mm
    expect(body.values.throat).toBeCloseTo(4.243, 2);
  });

  it('the README example file answers pass with the weld metal governing', async () => {
    const example = JSON.parse(readFileSync(new URL('../../openapi/examples/fillet-check.json', import.meta.url), 'utf8'));
    const res = await post(example);
    expect(res.statusCode).toBe(200);
    const body = res.json();
    expectEnvelope(body);
    expect(body.status).toBe('pass');
    expect(body.governing.code).toBe('FILLET_WELD_METAL');
    expect(body.id).toBe('WS-B12');
    // common practice, no source: 1.392 × 5 sixteenths × 10 in × 2 lines = 139.2 kip
    expect(body.governing.available).toBeCloseTo(139.2, 1);
  });

  it('a failing joint says fail and names the governing limit state', async () => {
    const res = await post({ ...imperial, load: { force: 100 } });
    expect(res.statusCode).toBe(200);
    const body = res.json();
    // 100 kip > 69.6 kip (common practice, no source): ratio 1.44
    expect(body.status).toBe('fail');
    expect(body.utilization).toBeGreaterThan(1);
    expect(body.governing.ratio).toBe(body.utilization);
  });
});

describe('GET /v1/fillet/check answers the same envelope from query parameters', () => {
  it('imperial with a fraction size', async () => {
    const res = await get(IMPERIAL_QUERY);
    expect(res.statusCode).toBe(200);
    const body = res.json();
    expectEnvelope(body);
    expect(body).toEqual((await post(imperial)).json());
  });

  it('metric', async () => {
    const res = await get('method=LRFD&units=metric&electrode=E49&welds.0.size=6&welds.0.length=100&load.force=50&parts.0.thickness=10&parts.0.steel=S355&parts.1.thickness=10&parts.1.steel=S355');
    expect(res.statusCode).toBe(200);
    const body = res.json();
    expectEnvelope(body);
    expect(body.units.length).toBe('mm');
    expect(body).toEqual((await post(metric)).json());
  });
});

describe('id', () => {
  it('is echoed unchanged by POST and GET', async () => {
    const id = 'WS-B12 row 7 · ü';
    expect((await post({ ...imperial, id })).json().id).toBe(id);
    expect((await get(`${IMPERIAL_QUERY}&id=${encodeURIComponent(id)}`)).json().id).toBe(id);
  });

  it('is absent when not given', async () => {
    expect('id' in (await post(imperial)).json()).toBe(false);
  });
});

describe('format=csv', () => {
  for (const [name, send] of [
    ['POST', () => post(imperial, 'format=csv')],
    ['GET', () => get(`${IMPERIAL_QUERY}&format=csv`)],
  ] as const) {
    it(`${name}: text/csv, two rows, dotted headers, numbers that parse back exactly`, async () => {
      const json = (await post(imperial)).json();
      const res = await send();
      expect(res.statusCode).toBe(200);
      expect(res.headers['content-type']).toMatch(/^text\/csv/);
      const rows = readCsv(res.body);
      expect(rows).toHaveLength(2);
      const [header, data] = rows as [string[], string[]];
      expect(header).toHaveLength(data.length);
      expect(header).toContain('checks.0.ratio');
      expect(header).toContain('governing.available');
      expect(header).toContain('status');
      expect(new Set(header).size).toBe(header.length);
      // Every scalar of the JSON answer appears, and numbers come back bit for bit.
      const expected = leaves(json);
      expect(header).toEqual(expected.map(([k]) => k));
      header.forEach((key, i) => {
        const want = at(json, key);
        const cell = data[i]!;
        if (typeof want === 'number') expect(Object.is(Number(cell), want)).toBe(true);
        else if (typeof want === 'boolean') expect(cell).toBe(String(want));
        else expect(cell).toBe(want);
      });
    });
  }

  it('quotes cells holding commas or quotes, and neutralises formula-like text', async () => {
    const res = await post({ ...imperial, id: '=HYPERLINK("x", 1)' }, 'format=csv');
    const [header, data] = readCsv(res.body) as [string[], string[]];
    // A leading apostrophe makes a spreadsheet show the text instead of running it (common practice, no source).
    expect(data[header.indexOf('id')]).toBe(`'=HYPERLINK("x", 1)`);
    expect(res.body).toContain(`"'=HYPERLINK(""x"", 1)"`);
    expect(data[header.indexOf('notice')]).toMatch(/licensed engineer/);
  });
});

describe('format=value', () => {
  const BARE_NUMBER = /^-?\d+(\.\d+)?(e[+-]\d+)?$/;

  it('utilization: text/plain, one bare token with a "." decimal, equal to the JSON number', async () => {
    const json = (await post(imperial)).json();
    const res = await post(imperial, 'format=value&field=utilization');
    expect(res.statusCode).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/plain/);
    expect(res.body).toMatch(BARE_NUMBER);
    expect(Object.is(Number(res.body), json.utilization)).toBe(true);
  });

  it('governing.available by GET, and a check by its code', async () => {
    const json = (await post(imperial)).json();
    const a = await get(`${IMPERIAL_QUERY}&format=value&field=governing.available`);
    expect(a.body).toMatch(BARE_NUMBER);
    expect(Object.is(Number(a.body), json.governing.available)).toBe(true);
    const b = await get(`${IMPERIAL_QUERY}&format=value&field=checks.FILLET_WELD_METAL.available`);
    expect(b.statusCode).toBe(200);
    const weld = json.checks.find((c: { code: string }) => c.code === 'FILLET_WELD_METAL');
    expect(Object.is(Number(b.body), weld.available)).toBe(true);
    const c = await post(imperial, 'format=value&field=checks.0.ratio');
    expect(Object.is(Number(c.body), json.checks[0].ratio)).toBe(true);
  });

  it('words come out bare too', async () => {
    expect((await post(imperial, 'format=value&field=status')).body).toBe('pass');
    expect((await post(imperial, 'format=value&field=governing.code')).body).toBe('FILLET_WELD_METAL');
    expect((await post(metric, 'format=value&field=units.force')).body).toBe('kN');
  });

  it('an unknown field is a 400 pointing at /field', async () => {
    for (const field of ['nope', 'checks.NOT_A_CODE.available', 'checks.99.ratio', 'governing.__proto__', 'checks.length', '']) {
      const res = await post(imperial, `format=value&field=${encodeURIComponent(field)}`);
      expect(res.statusCode, field).toBe(400);
      expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
      expect(res.json().errors[0].pointer).toBe('/field');
    }
  });

  it('a group rather than one value is a 400 pointing at /field', async () => {
    const res = await post(imperial, 'format=value&field=governing');
    expect(res.statusCode).toBe(400);
    expect(res.json().errors[0].pointer).toBe('/field');
  });

  it('format=value without field is a 400 pointing at /field', async () => {
    for (const res of [await post(imperial, 'format=value'), await get(`${IMPERIAL_QUERY}&format=value`)]) {
      expect(res.statusCode).toBe(400);
      expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
      expect(res.json().errors[0].pointer).toBe('/field');
    }
  });

  it('an unknown format is a 400 naming /format and the formats offered', async () => {
    const res = await post(imperial, 'format=xml');
    expect(res.statusCode).toBe(400);
    const body = res.json();
    expect(body.errors[0].pointer).toBe('/format');
    expect(body.errors[0].detail).toContain('csv');
  });
});

describe('formats agree with the JSON for random joints (property)', () => {
  const body = fc.record({
    method: fc.constantFrom('LRFD', 'ASD'),
    electrode: fc.constantFrom('E60', 'E70', 'E80'),
    size: fc.integer({ min: 2, max: 16 }).map((d) => d / 16),
    length: fc.double({ min: 0.5, max: 60, noNaN: true }),
    angle: fc.double({ min: 0, max: 90, noNaN: true }),
    force: fc.double({ min: 0, max: 500, noNaN: true }),
    thickness: fc.double({ min: 0.125, max: 3, noNaN: true }),
  });

  it('csv cells and value tokens parse back to the JSON numbers', async () => {
    await fc.assert(
      fc.asyncProperty(body, async (b) => {
        const req = {
          method: b.method,
          electrode: b.electrode,
          welds: [{ size: b.size, length: b.length, angle: b.angle }],
          load: { force: b.force },
          parts: [{ thickness: b.thickness, steel: 'A36' }],
        };
        const json = (await post(req)).json();
        const [header, data] = readCsv((await post(req, 'format=csv')).body) as [string[], string[]];
        header.forEach((key, i) => {
          const want = at(json, key);
          if (typeof want === 'number') expect(Object.is(Number(data[i]), want)).toBe(true);
        });
        for (const field of ['utilization', 'governing.available', 'values.throat', 'checks.FILLET_WELD_METAL.nominal']) {
          const token = (await post(req, `format=value&field=${field}`)).body;
          expect(token).toMatch(/^[^\s,;]+$/);
          expect(Object.is(Number(token), at(json, field.replace('FILLET_WELD_METAL', '0')))).toBe(true);
        }
      }),
      { numRuns: 40 },
    );
  });
});
