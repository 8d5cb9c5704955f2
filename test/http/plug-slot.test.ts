/**
 * POST and GET /v1/plug-slot/check over HTTP: the JSON envelope in both unit systems, the 400
 * answers for fields the schema or the mapping rejects, the 422 answers for geometry the rules
 * cannot answer, the spreadsheet formats, and the contract (the answer matches the declared
 * response schema; the OpenAPI document lists the route, its examples and its codes).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { FastifyInstance } from 'fastify';
import { Ajv } from 'ajv';
import { app as build, readCsv } from '../helpers.js';
import { PlugSlotCheckResponse } from '../../src/operations/plug-slot.js';

let app: FastifyInstance;
beforeAll(async () => {
  app = await build();
});
afterAll(async () => {
  await app.close();
});

const PATH = '/v1/plug-slot/check';

/** WS-CP2: four 13/16 in E70 plugs through a 1/2 in A36 cover plate onto a 5/8 in A36 plate. */
const plugs = {
  id: 'WS-CP2',
  method: 'LRFD',
  units: 'imperial',
  electrode: 'E70',
  hole: { shape: 'plug', diameter: '13/16', count: 4, spacing: 4 },
  fill: 0.5,
  load: { force: 30 },
  parts: [
    { thickness: 0.5, steel: 'A36', hasHole: true },
    { thickness: 0.625, steel: 'A36' },
  ],
};

/** WS-R08: two 80 × 20 mm slots in a 12 mm S355 stiffener on a 15 mm plate, ASD. */
const slots = {
  method: 'ASD',
  units: 'metric',
  electrode: 'E49',
  hole: { shape: 'slot', length: 80, width: 20, ends: 'semicircular', count: 2, spacing: 200 },
  fill: 12,
  load: { force: 150 },
  parts: [
    { thickness: 12, steel: 'S355', hasHole: true },
    { thickness: 15, steel: 'S355' },
  ],
};

const QUERY =
  'method=LRFD&units=imperial&electrode=E70&hole.shape=plug&hole.diameter=13%2F16&hole.count=4&hole.spacing=4&fill=1%2F2&load.force=30' +
  '&parts.0.thickness=1%2F2&parts.0.steel=A36&parts.0.hasHole=true&parts.1.thickness=5%2F8&parts.1.steel=A36';

const post = (body: unknown, query = '') => app.inject({ method: 'POST', url: `${PATH}${query ? `?${query}` : ''}`, payload: body as object });
const get = (query: string) => app.inject({ method: 'GET', url: `${PATH}?${query}` });

const validateAnswer = new Ajv({ strict: false }).compile(PlugSlotCheckResponse);


function problemOf(res: { statusCode: number; headers: Record<string, unknown>; json: () => unknown }) {
  expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
  return res.json() as { status: number; code?: string; pointer?: string; errors?: Array<{ pointer: string; detail: string }> };
}

describe('POST /v1/plug-slot/check: 200', () => {
  it('four plugs, LRFD: the faying surface of the A36 plate governs, with the hand-computed strength', async () => {
    const res = await post(plugs);
    expect(res.statusCode).toBe(200);
    const body = res.json();
    expect(validateAnswer(body), JSON.stringify(validateAnswer.errors)).toBe(true);
    expect(body.id).toBe('WS-CP2');
    expect(body.units).toEqual({ length: 'in', force: 'kip', stress: 'ksi' });
    // Awe = 4 × pi × 0.8125² / 4 = 2.073942 in²; weld 0.75 × 0.60 × 70 × 2.073942 = 65.329 kip
    expect(body.checks[0]).toMatchObject({ code: 'PLUG_SLOT_WELD_METAL', clause: 'AISC 360-22 Table J2.5', phi: 0.75 });
    expect(body.checks[0].available).toBeCloseTo(65.329, 2);
    // solid part, shear rupture on the faying surface: 0.75 × 0.60 × 58 × 2.073942 = 54.130 kip
    expect(body.governing).toMatchObject({ code: 'BASE_METAL_SHEAR_RUPTURE', part: 1 });
    expect(body.governing.available).toBeCloseTo(54.13, 2);
    expect(body.utilization).toBeCloseTo(30 / 54.13, 3);
    expect(body.status).toBe('pass');
    // AISC 360-22 §J2.3b (from memory): 13/16 in to max(15/16, 2.25 × 1/2) = 1-1/8 in
    expect(body.values.allowed).toEqual({ dimension: 'diameter', min: 0.8125, max: 1.125 });
    expect(body.notice).toMatch(/licensed engineer/);
  });

  it('two slots, metric ASD: the weld metal governs at 0.60 × 490 × 3028.32 / 1000 / 2 = 445.16 kN', async () => {
    const res = await post(slots);
    expect(res.statusCode).toBe(200);
    const body = res.json();
    expect(validateAnswer(body), JSON.stringify(validateAnswer.errors)).toBe(true);
    expect(body.units).toEqual({ length: 'mm', force: 'kN', stress: 'MPa' });
    expect(body.governing.code).toBe('PLUG_SLOT_WELD_METAL');
    expect(body.governing.available).toBeCloseTo(445.16, 1);
    expect(body.checks[0].omega).toBe(2);
    expect(body.values.allowed).toEqual({ dimension: 'width', min: 20, max: 27, lengthMax: 120 });
  });

  it('ends as a pair and rounded corners with a radius are accepted', async () => {
    const res = await post({ ...slots, hole: { shape: 'slot', length: 80, width: 24, ends: ['to-edge', 'rounded'], radius: 12 } });
    expect(res.statusCode).toBe(200);
    const body = res.json();
    // AISC 360-22 §J2.3b (from memory): rounded corners need r >= t = 12 mm
    expect(body.limits.find((l: { code: string }) => l.code === 'SLOT_END_RADIUS')).toMatchObject({ required: 12, provided: 12, pass: true });
  });

  it('a slot longer than 10 × its fill fails with SLOT_LENGTH_MAX (status fail, still 200)', async () => {
    const res = await post({ ...slots, hole: { ...slots.hole, length: 130 } });
    expect(res.statusCode).toBe(200);
    const body = res.json();
    expect(body.status).toBe('fail');
    // 10 × 12 mm = 120 mm
    expect(body.limits.find((l: { code: string }) => l.code === 'SLOT_LENGTH_MAX')).toMatchObject({ required: 120, provided: 130, pass: false });
  });

  it('tension normal to the faying surface brings the PLUG_SLOT_TENSION warning', async () => {
    const res = await post({ ...plugs, load: { force: 30, tension: 5 } });
    expect(res.statusCode).toBe(200);
    expect(res.json().warnings.map((w: { code: string }) => w.code)).toContain('PLUG_SLOT_TENSION');
  });
});

describe('POST /v1/plug-slot/check: 400', () => {
  const cases: Array<[string, unknown, string]> = [
    ['an unknown property', { ...plugs, extra: 1 }, '/extra'],
    ['an unknown hole property', { ...plugs, hole: { ...plugs.hole, depth: 1 } }, '/hole/depth'],
    ['a missing method', { ...plugs, method: undefined }, '/method'],
    ['a bad shape', { ...plugs, hole: { ...plugs.hole, shape: 'round' } }, '/hole/shape'],
    ['a negative diameter', { ...plugs, hole: { ...plugs.hole, diameter: -1 } }, '/hole/diameter'],
    ['one part only', { ...plugs, parts: [plugs.parts[0]] }, '/parts'],
    ['a plug without a diameter', { ...plugs, hole: { shape: 'plug', count: 1 } }, '/hole/diameter'],
    ['a plug with a width', { ...plugs, hole: { ...plugs.hole, width: 1 } }, '/hole/width'],
    ['a slot without a width', { ...slots, hole: { shape: 'slot', length: 80 } }, '/hole/width'],
    ['a slot with a diameter', { ...slots, hole: { ...slots.hole, diameter: 20 } }, '/hole/diameter'],
    ['rounded ends without a radius', { ...slots, hole: { ...slots.hole, ends: 'rounded' } }, '/hole/radius'],
    ['a radius with semicircular ends', { ...slots, hole: { ...slots.hole, radius: 12 } }, '/hole/radius'],
    ['a pattern without spacing', { ...plugs, hole: { shape: 'plug', diameter: 0.8125, count: 4 } }, '/hole/spacing'],
    ['no part with the hole', { ...plugs, parts: [{ thickness: 0.5, steel: 'A36' }, { thickness: 0.625, steel: 'A36' }] }, '/parts/0/hasHole'],
    ['both parts with the hole', { ...plugs, parts: [{ thickness: 0.5, steel: 'A36', hasHole: true }, { thickness: 0.625, steel: 'A36', hasHole: true }] }, '/parts/1/hasHole'],
    ['a fraction in metric', { ...slots, fill: '1/2' }, '/fill'],
  ];
  for (const [what, body, pointer] of cases) {
    it(`${what} answers 400 pointing at ${pointer}`, async () => {
      const res = await post(body);
      expect(res.statusCode, res.body).toBe(400);
      const p = problemOf(res);
      expect(p.errors?.map((e) => e.pointer)).toContain(pointer);
    });
  }
});

describe('POST /v1/plug-slot/check: 422', () => {
  const cases: Array<[string, unknown, string]> = [
    ['a fill deeper than the part', { ...plugs, fill: 0.75 }, '/fill'],
    ['overlapping plugs', { ...plugs, hole: { ...plugs.hole, spacing: 0.5 } }, '/hole/spacing'],
    ['a corner radius over half the width', { ...slots, hole: { ...slots.hole, ends: 'rounded', radius: 11 } }, '/hole/radius'],
    ['a slot too short for its ends', { ...slots, hole: { ...slots.hole, length: 15 } }, '/hole/length'],
    ['a steel with fy above fu', { ...plugs, parts: [{ thickness: 0.5, steel: { fy: 70, fu: 60 }, hasHole: true }, plugs.parts[1]] }, '/parts/0/steel'],
  ];
  for (const [what, body, pointer] of cases) {
    it(`${what} answers 422 with a code, pointing at ${pointer}`, async () => {
      const res = await post(body);
      expect(res.statusCode, res.body).toBe(422);
      const p = problemOf(res);
      expect(p.code).toMatch(/^[A-Z][A-Z0-9_]+$/);
      expect(p.pointer).toBe(pointer);
    });
  }
});

describe('GET /v1/plug-slot/check and the spreadsheet formats', () => {
  it('the query form answers what the body form answers', async () => {
    const [a, b] = await Promise.all([get(QUERY), post({ ...plugs, id: undefined })]);
    expect(a.statusCode).toBe(200);
    expect(a.json()).toEqual(b.json());
  });

  it('a slot pattern by query, ends given per end', async () => {
    const q =
      'method=ASD&units=metric&electrode=E49&hole.shape=slot&hole.length=80&hole.width=20&hole.ends.0=to-edge&hole.ends.1=semicircular' +
      '&fill=12&parts.0.thickness=12&parts.0.steel=S355&parts.0.hasHole=true&parts.1.thickness=15&parts.1.steel=S355';
    const res = await get(q);
    expect(res.statusCode, res.body).toBe(200);
    // (80 × 20) - (4 - pi) × 20² / 8 = 1600 - 42.920 = 1557.080 mm²
    expect(res.json().values.area).toBeCloseTo(1557.08, 2);
  });

  it('format=value answers one bare value', async () => {
    const res = await get(`${QUERY}&format=value&field=limits.PLUG_HOLE_DIAMETER_MIN.required`);
    expect(res.statusCode).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/plain/);
    expect(res.body).toBe('0.8125'); // 13/16 in, AISC 360-22 §J2.3b (from memory)
    const gov = await get(`${QUERY}&format=value&field=governing.code`);
    expect(gov.body).toBe('BASE_METAL_SHEAR_RUPTURE');
  });

  it('format=csv answers a header row and a data row', async () => {
    const res = await get(`${QUERY}&format=csv`);
    expect(res.statusCode).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/csv/);
    const rows = readCsv(res.body);
    expect(rows.length).toBe(2);
    const [h, d] = rows as [string[], string[]];
    expect(h.length).toBe(d.length);
    expect(d[h.indexOf('values.allowed.min')]).toBe('0.8125');
    expect(d[h.indexOf('status')]).toBe('pass');
  });

  it('a bad query answers 400 pointing at the field', async () => {
    const res = await get(QUERY.replace('hole.count=4', 'hole.count=four'));
    expect(res.statusCode).toBe(400);
    expect(problemOf(res).errors?.map((e) => e.pointer)).toContain('/hole/count');
  });

  it('a query form with fill deeper than the part answers 422', async () => {
    const res = await get(QUERY.replace('fill=1%2F2', 'fill=3%2F4'));
    expect(res.statusCode).toBe(422);
    expect(problemOf(res).code).toBe('GEOMETRY_MEANINGLESS');
  });
});

describe('contract', () => {
  it('the OpenAPI document lists POST and GET, the request examples, and the plug and slot codes', async () => {
    const doc = (await app.inject({ method: 'GET', url: '/openapi.json' })).json();
    const path = doc.paths[PATH];
    expect(path.post).toBeDefined();
    expect(path.get).toBeDefined();
    const text = JSON.stringify(doc);
    for (const code of ['PLUG_SLOT_WELD_METAL', 'PLUG_HOLE_DIAMETER_MIN', 'PLUG_HOLE_DIAMETER_MAX', 'PLUG_SPACING', 'SLOT_LENGTH_MAX', 'SLOT_WIDTH_MIN', 'SLOT_WIDTH_MAX', 'SLOT_END_RADIUS', 'SLOT_SPACING_ACROSS', 'SLOT_SPACING_ALONG', 'PLUG_SLOT_FILL_DEPTH', 'PLUG_SLOT_TENSION']) {
      expect(text).toContain(`"${code}"`);
    }
    expect(text).toContain('WS-CP2');
  });
});
