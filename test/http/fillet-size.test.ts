/**
 * POST and GET /v1/fillet/size over HTTP: the envelope with the recommendation, the GET form,
 * csv and value formats, batch items, 400 and 422 problems, a blocked search answered as an
 * engineering result, and a property: the recommendation POSTed to /v1/fillet/check passes.
 *
 * Sources: AISC 360-22 Table J2.4, Table J2.5 and Eq. J2-4 (from memory); hand arithmetic with
 * 0.75·0.60·70/√2 = 22.2739 kip/in per inch of size (E70, LRFD); "1.392 kip/in per sixteenth" is
 * common practice, no source.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import type { FastifyInstance } from 'fastify';
import { app as build } from '../helpers.js';

let app: FastifyInstance;
beforeAll(async () => {
  app = await build();
});
afterAll(async () => {
  await app.close();
});

const PATH = '/v1/fillet/size';

/** WS-B21: one line fixed at 10 in between two 1/2 in A992 plates, the demand of a 1/4 in E70 weld. */
const imperial = {
  id: 'WS-B21',
  method: 'LRFD',
  units: 'imperial',
  electrode: 'E70',
  load: { force: 55.68 },
  length: { fixed: 10 },
  parts: [
    { thickness: 0.5, steel: 'A992' },
    { thickness: 0.5, steel: 'A992' },
  ],
};
const IMPERIAL_QUERY = 'id=WS-B21&method=LRFD&units=imperial&electrode=E70&load.force=55.68&length.fixed=10&parts.0.thickness=1%2F2&parts.0.steel=A992&parts.1.thickness=0.5&parts.1.steel=A992';

/** WS-C30: metric, up to 200 mm, two 10 mm S355 plates, matching electrode. */
const metric = {
  method: 'LRFD',
  units: 'metric',
  electrode: 'match',
  load: { force: 93.5 },
  length: { max: 200 },
  parts: [
    { thickness: 10, steel: 'S355' },
    { thickness: 10, steel: 'S355' },
  ],
};

type Body = Record<string, unknown>;
const post = (body: unknown, url = PATH) => app.inject({ method: 'POST', url, payload: body as object });
const get = (query: string) => app.inject({ method: 'GET', url: `${PATH}?${query}` });
const edit = (f: (b: any) => void): Body => {
  const b = structuredClone(imperial) as Body;
  f(b);
  return b;
};

describe('POST /v1/fillet/size', () => {
  it('imperial LRFD: 55.68 kip over a fixed 10 in gives 1/4 in, with its full check', async () => {
    const res = await post(imperial);
    expect(res.statusCode).toBe(200);
    expect(res.headers['content-type']).toMatch(/^application\/json/);
    const body = res.json();
    expect(body.id).toBe('WS-B21');
    expect(body.status).toBe('pass');
    expect(body.units).toEqual({ length: 'in', force: 'kip', stress: 'ksi' });
    expect(body.basis.standard).toBe('AISC 360-22');
    expect(body.notice).toMatch(/licensed engineer/);
    // common practice, no source: 1.392 × 4 sixteenths × 10 in = 55.68 kip, carried by 1/4 in (55.685 kip by hand).
    expect(body.values.recommended.size).toBe(0.25);
    expect(body.values.recommended.length).toBe(10);
    expect(body.governing.code).toBe('FILLET_WELD_METAL');
    expect(body.governing.available).toBeCloseTo(55.685, 2);
    // the envelope is the recommendation's fillet check
    expect(body.checks.map((c: { code: string }) => c.code)).toEqual(expect.arrayContaining(['FILLET_WELD_METAL', 'BASE_METAL_SHEAR_YIELD', 'BASE_METAL_SHEAR_RUPTURE']));
    expect(body.limits.map((l: { code: string }) => l.code)).toContain('FILLET_MIN_SIZE');
    // hand: AISC 360-22 J2.2a (from memory): throat 0.7071 × 0.25 = 0.17678 in
    expect(body.values.check.throat).toBeCloseTo(0.17678, 4);
    expect(body.values.blocking).toBeNull();
    expect(body.values.closest).toBeNull();
    expect(Array.isArray(body.values.alternatives)).toBe(true);
  });

  it('imperial fractions are accepted for lengths and preferences', async () => {
    const res = await post(edit((b) => (b.length = { max: '24' }, (b.preferences = { maxSize: '3/8', lengthStep: '1/4' }))));
    expect(res.statusCode).toBe(200);
    // hand: 55.68 / (22.2739 × 3/16) = 13.33 in → 13.5 in
    expect(res.json().values.recommended).toMatchObject({ size: 0.1875, length: 13.5 });
    expect(res.json().values.search.sizeMaxRule).toBe(0.375);
  });

  it('metric with the matching electrode: 6 mm E49 over 100 mm, hence up to 200 mm: 5 mm × 120 mm', async () => {
    const res = await post(metric);
    expect(res.statusCode).toBe(200);
    const body = res.json();
    expect(body.units).toEqual({ length: 'mm', force: 'kN', stress: 'MPa' });
    expect(body.values.recommended.electrode).toEqual({ name: 'E49', fexx: 490, chosen: true });
    // hand: 5 mm E49 LRFD: 0.75 × 0.60 × 490 / √2 × 5 = 779.6 N/mm; 93.5 kN / 0.7796 kN/mm = 119.9 mm → 120 mm on the 5 mm step.
    // Table J2.4 (from memory): 5 mm for 10 mm parts. Volume 5²/2 × 120 = 1500 mm³ (6 mm × 100 mm: 1800 mm³).
    expect(body.values.recommended).toMatchObject({ size: 5, length: 120, volume: 1500 });
    expect(body.warnings.map((w: { code: string }) => w.code)).toContain('SIZING_ELECTRODE_CHOSEN');
  });

  it('a blocked search answers 200, status fail, with the blocking reason and the way out', async () => {
    // hand: 1/8 in A36 part, shear yielding 1.00 × 0.60 × 36 × 0.125 × 10 = 27 kip < 30 kip.
    const res = await post(edit((b) => ((b.load = { force: 30 }), (b.parts[0] = { thickness: 0.125, steel: 'A36' }))));
    expect(res.statusCode).toBe(200);
    const body = res.json();
    expect(body.status).toBe('fail');
    expect(body.values.recommended).toBeNull();
    expect(body.values.blocking.code).toBe('SIZING_BASE_METAL_TOO_THIN');
    expect(body.values.blocking.unblock.map((u: { change: string }) => u.change)).toEqual(expect.arrayContaining(['thicker-part', 'longer-weld']));
    expect(body.warnings.map((w: { code: string }) => w.code)).toEqual(expect.arrayContaining(['SIZING_NO_COMPLIANT_WELD', 'SIZING_BASE_METAL_TOO_THIN']));
  });

  it('the declared examples answer 200', async () => {
    const { filletSize } = await import('../../src/operations/fillet-size.js');
    for (const [name, e] of Object.entries(filletSize.examples)) {
      const res = await post(e.value);
      expect(res.statusCode, name).toBe(200);
      expect(res.json().values.recommended, name).not.toBeNull();
    }
  });
});

describe('GET form and spreadsheet formats', () => {
  it('the query string gives the same answer as the POST body', async () => {
    const [a, b] = await Promise.all([get(IMPERIAL_QUERY), post(imperial)]);
    expect(a.statusCode).toBe(200);
    expect(a.json()).toEqual(b.json());
  });

  it('format=value picks one field of the answer', async () => {
    const size = await get(`${IMPERIAL_QUERY}&format=value&field=values.recommended.size`);
    expect(size.statusCode).toBe(200);
    expect(size.headers['content-type']).toMatch(/^text\/plain/);
    expect(size.body).toBe('0.25');
    const status = await get(`${IMPERIAL_QUERY}&format=value&field=status`);
    expect(status.body).toBe('pass');
  });

  it('format=csv answers a header row and a data row with the recommendation', async () => {
    const res = await get(`${IMPERIAL_QUERY}&format=csv`);
    expect(res.statusCode).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/csv/);
    const [header, row] = res.body.split('\r\n').map((l) => l.split(','));
    const at = header!.indexOf('values.recommended.size');
    expect(at).toBeGreaterThanOrEqual(0);
    expect(row![at]).toBe('0.25');
    expect(row![header!.indexOf('values.recommended.length')]).toBe('10');
  });

  it('preferences and the matching electrode work from the query string', async () => {
    const res = await get('method=LRFD&electrode=match&load.force=20&length.fixed=10&parts.0.thickness=0.5&parts.0.steel=A992&preferences.intermittent=true&format=value&field=values.recommended.layout');
    expect(res.statusCode).toBe(200);
    // hand (see the engine tests): 2 × 2.5 in of 3/16 in beats 10 in continuous
    expect(res.body).toBe('intermittent');
  });
});

describe('batch', () => {
  it('a fillet-size item answers exactly what its own route answers', async () => {
    const res = await post([{ kind: 'fillet-size', ...imperial }], '/v1/batch');
    expect(res.statusCode).toBe(200);
    const single = await post(imperial);
    expect(res.json().results[0]).toEqual(single.json());
  });
});

describe('problems', () => {
  async function expect400(body: Body, pointer: string) {
    const res = await post(body);
    expect(res.statusCode, res.body).toBe(400);
    expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
    const pointers = (res.json().errors ?? []).map((e: { pointer: string }) => e.pointer);
    expect(pointers, res.body).toContain(pointer);
  }

  it('400 for length given both ways, or not at all', async () => {
    await expect400(edit((b) => (b.length = { fixed: 10, max: 12 })), '/length/max');
    await expect400(edit((b) => (b.length = {})), '/length');
  });

  it('400 for a zero demand, a missing method, an unknown field, an angle past 90', async () => {
    await expect400(edit((b) => (b.load = { force: 0 })), '/load/force');
    await expect400(edit((b) => delete b.method), '/method');
    await expect400(edit((b) => (b.lenght = 3)), '/lenght');
    await expect400(edit((b) => (b.load = { force: 10, angle: 120 })), '/load/angle');
  });

  it('400 for a fraction string in metric, and an unknown electrode word', async () => {
    await expect400({ ...metric, length: { max: '1/2' } }, '/length/max');
    await expect400(edit((b) => (b.electrode = 'matching')), '/electrode');
  });

  it('422 SIZING_SEARCH_TOO_LARGE for a grid past the bound', async () => {
    const res = await post(edit((b) => (b.length = { max: 100000 })));
    expect(res.statusCode).toBe(422);
    expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
    expect(res.json().code).toBe('SIZING_SEARCH_TOO_LARGE');
  });

  it('422 for a part thicker than its grade\'s catalogue range', async () => {
    const res = await post(edit((b) => (b.parts[1] = { thickness: 5, steel: 'A572-50' })));
    expect(res.statusCode).toBe(422);
    expect(res.json().code).toBe('MATERIAL_THICKNESS_OUT_OF_RANGE');
    expect(res.json().pointer).toBe('/parts/1/steel');
  });
});

describe('property: the recommendation passes POST /v1/fillet/check', () => {
  it('for random demands, lengths, parts and preferences', async () => {
    const arb = fc.record({
      method: fc.constantFrom('LRFD', 'ASD'),
      force: fc.double({ min: 1, max: 150, noNaN: true }),
      lines: fc.integer({ min: 1, max: 2 }),
      angle: fc.constantFrom(0, 45, 90),
      length: fc.oneof(fc.record({ fixed: fc.integer({ min: 8, max: 48 }).map((k) => k / 4) }), fc.record({ max: fc.integer({ min: 8, max: 48 }).map((k) => k / 4) })),
      t0: fc.constantFrom(0.25, 0.375, 0.5, 0.75),
      t1: fc.constantFrom(0.375, 0.5, 1),
      edge: fc.boolean(),
      electrode: fc.constantFrom('E70', 'match'),
      intermittent: fc.boolean(),
    });
    await fc.assert(
      fc.asyncProperty(arb, async (a) => {
        const parts = [
          { thickness: a.t0, steel: 'A572-50', edge: a.edge },
          { thickness: a.t1, steel: 'A992' },
        ];
        const sizing = await post({
          method: a.method,
          electrode: a.electrode,
          load: { force: a.force, angle: a.angle },
          lines: a.lines,
          length: a.length,
          parts,
          preferences: { intermittent: a.intermittent },
        });
        expect(sizing.statusCode, sizing.body).toBe(200);
        const s = sizing.json();
        if (!s.values.recommended) {
          expect(s.status).toBe('fail');
          expect(s.values.blocking).not.toBeNull();
          return;
        }
        const rec = s.values.recommended;
        const check = await post(
          { method: a.method, electrode: rec.electrode.name ?? { fexx: rec.electrode.fexx }, welds: rec.welds, load: { force: a.force }, parts },
          '/v1/fillet/check',
        );
        expect(check.statusCode, check.body).toBe(200);
        expect(check.json().status).toBe('pass');
        expect(check.json().utilization).toBeCloseTo(s.utilization, 12);
      }),
      { numRuns: 25 },
    );
  });
});
