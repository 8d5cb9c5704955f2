/**
 * Refusals over HTTP: 400 problem documents that point at the offending field for every field
 * type and range of the fillet and base-metal contracts, malformed bodies, media types, body
 * size, unknown routes, and 422 answers with a code for requests the rules cannot answer.
 * Also the catalogue, health and contract routes.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { FastifyInstance, LightMyRequestResponse } from 'fastify';
import { Type } from 'typebox';
import { buildApp } from '../../src/app.js';
import { bodyAjv, fieldErrors } from '../../src/plugins/validation.js';
import { app as build } from '../helpers.js';

let app: FastifyInstance;
beforeAll(async () => {
  app = await build();
});
afterAll(async () => {
  await app.close();
});

type Body = Record<string, unknown>;

/** WS-B12-like valid fillet body; each case below breaks one field of a fresh copy. */
function fillet(): Body {
  return {
    method: 'LRFD',
    units: 'imperial',
    electrode: 'E70',
    welds: [{ size: '5/16', length: 10, angle: 0, count: 2 }],
    load: { force: 60 },
    parts: [
      { thickness: 0.5, steel: 'A572-50', faces: 2 },
      { thickness: 0.75, steel: 'A992' },
    ],
  };
}

/** WS-B07: 3/8 in A36 shear tab, both faces, two 9 in lines. */
function baseMetal(): Body {
  return { method: 'LRFD', units: 'imperial', part: { thickness: 0.375, steel: 'A36', faces: 2 }, lines: [{ length: 9, count: 2 }], load: { force: 60 } };
}

function edit(body: Body, f: (b: any) => void): Body {
  f(body);
  return body;
}

async function post(body: unknown, url = '/v1/fillet/check') {
  return app.inject({ method: 'POST', url, payload: body as object });
}

function expectProblem(res: LightMyRequestResponse, status: number) {
  expect(res.statusCode).toBe(status);
  expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
  const body = res.json();
  expect(typeof body.type).toBe('string');
  expect(body.type.length).toBeGreaterThan(0);
  expect(typeof body.title).toBe('string');
  expect(body.status).toBe(status);
  expect(typeof body.detail).toBe('string');
  expect(body.detail.length).toBeGreaterThan(0);
  return body;
}

/** A 400 whose first error points exactly at `pointer`, with the detail echoing it. */
function expectField(res: LightMyRequestResponse, pointer: string) {
  const body = expectProblem(res, 400);
  expect(Array.isArray(body.errors)).toBe(true);
  expect(body.errors.length).toBeGreaterThan(0);
  for (const e of body.errors) {
    expect(typeof e.pointer).toBe('string');
    expect(typeof e.detail).toBe('string');
  }
  expect(body.errors[0].pointer).toBe(pointer);
  expect(body.detail).toContain(pointer);
  return body.errors[0].detail as string;
}

const LENGTH_DETAIL = 'must be a number >= 0.001, or an imperial fraction such as "5/16"';

describe('400: every field of the fillet contract', () => {
  const cases: Array<[string, (b: any) => void, string, RegExp?]> = [
    ['method missing', (b) => delete b.method, '/method', /required/],
    ['method lower case', (b) => (b.method = 'lrfd'), '/method', /LRFD, ASD/],
    ['method a number', (b) => (b.method = 1), '/method', /LRFD, ASD/],
    ['units unknown', (b) => (b.units = 'SI'), '/units', /imperial, metric/],
    ['electrode unknown name', (b) => (b.electrode = 'E71'), '/electrode', /E70.*fexx/],
    ['electrode fexx zero', (b) => (b.electrode = { fexx: 0 }), '/electrode/fexx', />= 1/],
    ['electrode fexx negative', (b) => (b.electrode = { fexx: -70 }), '/electrode/fexx', />= 1/],
    ['electrode fexx as text', (b) => (b.electrode = { fexx: '70' }), '/electrode/fexx', /number/],
    ['electrode fexx missing', (b) => (b.electrode = {}), '/electrode/fexx', /required/],
    ['welds missing', (b) => delete b.welds, '/welds', /required/],
    ['welds empty', (b) => (b.welds = []), '/welds', /at least 1/],
    ['welds too many', (b) => (b.welds = Array.from({ length: 51 }, () => ({ size: 0.25, length: 4 }))), '/welds', /at most 50/],
    ['welds an object', (b) => (b.welds = { size: 0.25, length: 4 }), '/welds', /list/],
    ['size negative', (b) => (b.welds[0].size = -0.25), '/welds/0/size'],
    ['size zero', (b) => (b.welds[0].size = 0), '/welds/0/size'],
    ['size "NaN"', (b) => (b.welds[0].size = 'NaN'), '/welds/0/size'],
    ['size "abc"', (b) => (b.welds[0].size = 'abc'), '/welds/0/size'],
    ['size negative fraction', (b) => (b.welds[0].size = '-5/16'), '/welds/0/size'],
    ['size null', (b) => (b.welds[0].size = null), '/welds/0/size'],
    ['size "0/16"', (b) => (b.welds[0].size = '0/16'), '/welds/0/size', /positive length/],
    ['size "5/0"', (b) => (b.welds[0].size = '5/0'), '/welds/0/size', /positive length/],
    ['size fraction in metric', (b) => Object.assign(b, { units: 'metric', electrode: 'E49', parts: [{ thickness: 12, steel: 'S355' }] }, { welds: [{ size: '5/16', length: 100 }] }), '/welds/0/size', /imperial only/],
    ['both size and legs', (b) => (b.welds[0].legs = [0.25, 0.375]), '/welds/0/legs', /either size or legs/],
    ['neither size nor legs', (b) => delete b.welds[0].size, '/welds/0/size', /size/],
    ['legs of one item', (b) => (b.welds[0] = { legs: [0.25], length: 10 }), '/welds/0/legs', /at least 2/],
    ['legs of three items', (b) => (b.welds[0] = { legs: [0.25, 0.25, 0.25], length: 10 }), '/welds/0/legs', /at most 2/],
    ['a leg negative', (b) => (b.welds[0] = { legs: [0.25, -1], length: 10 }), '/welds/0/legs/1'],
    ['length zero', (b) => (b.welds[0].length = 0), '/welds/0/length'],
    ['length missing', (b) => delete b.welds[0].length, '/welds/0/length', /required/],
    ['angle -1', (b) => (b.welds[0].angle = -1), '/welds/0/angle', />= 0/],
    ['angle 91', (b) => (b.welds[0].angle = 91), '/welds/0/angle', /<= 90/],
    ['count 0', (b) => (b.welds[0].count = 0), '/welds/0/count', />= 1/],
    ['count 1.5', (b) => (b.welds[0].count = 1.5), '/welds/0/count', /whole number/],
    ['endLoaded "yes"', (b) => (b.welds[0].endLoaded = 'yes'), '/welds/0/endLoaded', /true or false/],
    ['intermittent segments 0', (b) => (b.welds[0].intermittent = { segments: 0, pitch: 12 }), '/welds/0/intermittent/segments'],
    ['unknown property at the top', (b) => (b.bogus = 1), '/bogus', /not a field/],
    ['unknown property in a weld', (b) => (b.welds[0].bogus = 1), '/welds/0/bogus', /not a field/],
    ['unknown property in a part', (b) => (b.parts[1].colour = 'red'), '/parts/1/colour', /not a field/],
    ['unknown property in the load', (b) => (b.load.moment = 5), '/load/moment', /not a field/],
    ['unknown property in a steel object', (b) => (b.parts[0].steel = { fy: 50, fu: 65, grade: 'x' }), '/parts/0/steel/grade', /not a field/],
    ['parts missing', (b) => delete b.parts, '/parts', /required/],
    ['parts empty', (b) => (b.parts = []), '/parts', /at least 1/],
    ['parts too many', (b) => (b.parts = Array.from({ length: 5 }, () => ({ thickness: 0.5, steel: 'A36' }))), '/parts', /at most 4/],
    ['thickness missing', (b) => delete b.parts[0].thickness, '/parts/0/thickness', /required/],
    ['thickness negative', (b) => (b.parts[1].thickness = -0.5), '/parts/1/thickness'],
    ['steel unknown', (b) => (b.parts[1].steel = 'A9999'), '/parts/1/steel', /A992.*fy and fu/],
    ['steel missing', (b) => delete b.parts[1].steel, '/parts/1/steel', /required/],
    ['fy zero', (b) => (b.parts[0].steel = { fy: 0, fu: 65 }), '/parts/0/steel/fy', />= 1/],
    ['fu negative', (b) => (b.parts[0].steel = { fy: 50, fu: -65 }), '/parts/0/steel/fu', />= 1/],
    ['fu missing', (b) => (b.parts[0].steel = { fy: 50 }), '/parts/0/steel/fu', /required/],
    ['faces 3', (b) => (b.parts[0].faces = 3), '/parts/0/faces', /<= 2/],
    ['loading unknown', (b) => (b.parts[0].loading = 'bending'), '/parts/0/loading', /shear, tension/],
    ['edge "no"', (b) => (b.parts[0].edge = 'no'), '/parts/0/edge', /true or false/],
    ['load.force negative', (b) => (b.load.force = -1), '/load/force', />= 0/],
    ['load.force as text', (b) => (b.load.force = '60'), '/load/force', /number/],
    ['load.force missing', (b) => (b.load = {}), '/load/force', /required/],
    ['lap 0', (b) => (b.lap = 0), '/lap'],
    ['directionalIncrease 1', (b) => (b.directionalIncrease = 1), '/directionalIncrease', /true or false/],
    ['id empty', (b) => (b.id = ''), '/id', /empty/],
    ['id too long', (b) => (b.id = 'x'.repeat(129)), '/id', /128/],
    ['body an empty object', (b) => Object.keys(b).forEach((k) => delete b[k]), '/method', /required/],
  ];
  for (const [name, f, pointer, detail] of cases) {
    it(`${name} → 400 at ${pointer}`, async () => {
      const res = await post(edit(fillet(), f));
      const got = expectField(res, pointer);
      if (detail) expect(got).toMatch(detail);
    });
  }

  it('a bad length in any place reads as one sentence naming both accepted forms', async () => {
    for (const [f, pointer] of [
      [(b: any) => (b.welds[0].size = -1), '/welds/0/size'],
      [(b: any) => (b.welds[0].size = 'abc'), '/welds/0/size'],
      [(b: any) => (b.welds[0].length = 0), '/welds/0/length'],
      [(b: any) => (b.parts[0].thickness = {}), '/parts/0/thickness'],
      [(b: any) => (b.lap = true), '/lap'],
    ] as const) {
      expect(expectField(await post(edit(fillet(), f)), pointer)).toBe(LENGTH_DETAIL);
    }
  });

  it('a length above the contract maximum names that bound', async () => {
    const detail = expectField(await post(edit(fillet(), (b) => (b.welds[0].length = 1e8))), '/welds/0/length');
    expect(detail).toMatch(/<= 10000000/);
    expect(detail).toMatch(/fraction/);
  });

  it('a body that is not an object is refused at the root', async () => {
    for (const payload of ['[]', '5', '"x"', 'null']) {
      const res = await app.inject({ method: 'POST', url: '/v1/fillet/check', payload, headers: { 'content-type': 'application/json' } });
      const body = expectProblem(res, 400);
      expect(body.errors[0].pointer).toBe('');
    }
  });
});

describe('fieldErrors words any union from its errors, not from one known schema', () => {
  const schema = Type.Object(
    {
      a: Type.Union([Type.Integer({ minimum: 1 }), Type.Boolean()]),
      b: Type.Union([Type.Unsafe<string>({ type: 'string', enum: ['x', 'y'] }), Type.Array(Type.String(), { minItems: 2, maxItems: 2 })]),
      c: Type.Union([Type.Number({ maximum: 5 }), Type.Object({ p: Type.Number(), q: Type.Number() }, { additionalProperties: false })]),
      d: Type.Union([Type.Number(), Type.Null()]),
    },
    { additionalProperties: false },
  );
  const validate = bodyAjv.compile(schema);
  const errorsOf = (value: unknown) => {
    expect(validate(value)).toBe(false);
    return fieldErrors(validate.errors ?? []);
  };
  const ok = { a: 2, b: 'x', c: 1, d: null };

  it('scalars: one sentence naming every accepted form, the violated bound first', () => {
    expect(errorsOf({ ...ok, a: 0 })).toEqual([{ pointer: '/a', detail: 'must be a whole number >= 1, or true or false' }]);
    expect(errorsOf({ ...ok, a: 'z' })).toEqual([{ pointer: '/a', detail: 'must be a whole number >= 1, or true or false' }]);
    expect(errorsOf({ ...ok, b: 'z' })).toEqual([{ pointer: '/b', detail: 'must be one of: x, y; or a list of 2 items' }]);
    expect(errorsOf({ ...ok, c: 9 })).toEqual([{ pointer: '/c', detail: 'must be a number <= 5, or an object with p and q' }]);
    expect(errorsOf({ ...ok, d: 'z' })).toEqual([{ pointer: '/d', detail: 'must be a number, or null' }]);
  });

  it('an object or list the caller clearly meant keeps its own, deeper errors', () => {
    expect(errorsOf({ ...ok, c: { p: 1 } })).toEqual([{ pointer: '/c/q', detail: 'is required' }]);
    expect(errorsOf({ ...ok, c: { p: 1, q: 2, r: 3 } })).toEqual([{ pointer: '/c/r', detail: 'is not a field of this request' }]);
    expect(errorsOf({ ...ok, b: ['x'] })).toEqual([{ pointer: '/b', detail: 'must have at least 2 items' }]);
    expect(errorsOf({ ...ok, b: ['x', 3] })).toEqual([{ pointer: '/b/1', detail: 'must be text' }]);
  });

  it('property names with / or ~ are escaped in the pointer (RFC 6901)', () => {
    expect(errorsOf({ ...ok, 'x/y~z': 1 })).toEqual([{ pointer: '/x~1y~0z', detail: 'is not a field of this request' }]);
  });
});

describe('400 and other refusals of the transport', () => {
  it('malformed JSON is a 400 problem', async () => {
    for (const payload of ['{', '{"method": "LRFD",}', '', '{"a": 1e}']) {
      const res = await app.inject({ method: 'POST', url: '/v1/fillet/check', payload, headers: { 'content-type': 'application/json' } });
      expectProblem(res, 400);
    }
  });

  it('a forbidden prototype key in JSON is a 400 problem', async () => {
    const res = await app.inject({ method: 'POST', url: '/v1/fillet/check', payload: '{"__proto__": {"method": "LRFD"}}', headers: { 'content-type': 'application/json' } });
    expectProblem(res, 400);
  });

  it('JSON nested far too deep is a 400, not a crash', async () => {
    const payload = `{"welds": ${'['.repeat(100_000)}${']'.repeat(100_000)}}`;
    const res = await app.inject({ method: 'POST', url: '/v1/fillet/check', payload, headers: { 'content-type': 'application/json' } });
    expectProblem(res, 400);
  });

  it('a content type other than JSON is a 415 problem', async () => {
    for (const type of ['application/xml', 'application/x-www-form-urlencoded', 'multipart/form-data; boundary=x']) {
      const res = await app.inject({ method: 'POST', url: '/v1/fillet/check', payload: JSON.stringify(fillet()), headers: { 'content-type': type } });
      expectProblem(res, 415);
    }
  });

  // Known bug (src/app.ts, not ours): Fastify's built-in text/plain parser hands the text to the
  // validator, which answers 400 "must be a JSON object" instead of 415. Remove .fails once
  // app.ts removes that parser (app.removeContentTypeParser('text/plain')).
  it('text/plain is a 415 problem too', async () => {
    const res = await app.inject({ method: 'POST', url: '/v1/fillet/check', payload: JSON.stringify(fillet()), headers: { 'content-type': 'text/plain' } });
    expectProblem(res, 415);
  });

  it('a body over BODY_LIMIT is a 413 problem', async () => {
    const small = await buildApp({ config: { BODY_LIMIT: 2048, DOCS: false } });
    try {
      const body = { ...fillet(), id: 'x'.repeat(100) };
      const padded = JSON.stringify(body).replace('{', `{${' '.repeat(3000)}`);
      const res = await small.inject({ method: 'POST', url: '/v1/fillet/check', payload: padded, headers: { 'content-type': 'application/json' } });
      expectProblem(res, 413);
      // The same joint under the limit is answered.
      expect((await small.inject({ method: 'POST', url: '/v1/fillet/check', payload: fillet() })).statusCode).toBe(200);
    } finally {
      await small.close();
    }
  });

  it('an unknown route or method is a 404 problem', async () => {
    for (const [method, url] of [
      ['GET', '/v1/nothing'],
      ['POST', '/v1/fillet'],
      ['PUT', '/v1/fillet/check'],
      ['DELETE', '/v1/base-metal/check'],
      ['GET', '/v2/fillet/check'],
    ] as const) {
      const body = expectProblem(await app.inject({ method, url }), 404);
      expect(body.detail).toContain(url);
    }
  });

  // Known bug (src/app.ts, not ours): a path with a broken % escape is refused by Fastify's router
  // before the error handler, as Fastify's own application/json. Fix: pass
  // `frameworkErrors` (exported by src/plugins/problem.ts) to Fastify() in buildApp. Remove .fails then.
  it('a path with a broken % escape is a 400 problem', async () => {
    expectProblem(await app.inject({ method: 'GET', url: '/v1/%zz' }), 400);
  });

  it('an unknown query parameter on POST is a 400 at its name', async () => {
    expectField(await post(fillet(), '/v1/fillet/check?bogus=1'), '/bogus');
  });
});

describe('422: requests the rules cannot answer', () => {
  function expectCode(res: LightMyRequestResponse, code: string, pointer: string) {
    const body = expectProblem(res, 422);
    expect(body.code).toBe(code);
    expect(body.pointer).toBe(pointer);
  }

  it('fy above fu → MATERIAL_FY_EXCEEDS_FU at the steel', async () => {
    expectCode(await post(edit(fillet(), (b) => (b.parts[1].steel = { fy: 70, fu: 65 }))), 'MATERIAL_FY_EXCEEDS_FU', '/parts/1/steel');
  });

  it('A36 thicker than 8 in by catalogue name is answered (the catalogue has a band past 8 in)', async () => {
    // AISC Manual Part 2 (from memory): A36 plate over 8 in has Fy = 32 ksi, Fu = 58 ksi.
    const res = await post(edit(fillet(), (b) => (b.parts = [{ thickness: 0.5, steel: 'A36' }, { thickness: 9, steel: 'A36' }])));
    expect(res.statusCode).toBe(200);
    expect(res.json().values.parts[1].fy).toBe(32);
  });

  it('S355 at 100 mm → MATERIAL_THICKNESS_OUT_OF_RANGE', async () => {
    // EN 10025-2 (from memory): the catalogue bands of S355 stop at 80 mm.
    const body = { method: 'LRFD', units: 'metric', electrode: 'E49', welds: [{ size: 8, length: 200 }], parts: [{ thickness: 20, steel: 'S355' }, { thickness: 100, steel: 'S355' }] };
    expectCode(await post(body), 'MATERIAL_THICKNESS_OUT_OF_RANGE', '/parts/1/steel');
  });

  it('intermittent pitch shorter than the segment → INTERMITTENT_PITCH_TOO_SHORT', async () => {
    const body = edit(fillet(), (b) => (b.welds = [{ size: 0.25, length: 4, intermittent: { segments: 3, pitch: 3 } }]));
    expectCode(await post(body), 'INTERMITTENT_PITCH_TOO_SHORT', '/welds/0/intermittent/pitch');
  });

  it('a weld too small to exist is refused at the field, and the smallest accepted one answers finite numbers', async () => {
    expectField(await post(edit(fillet(), (b) => (b.welds[0].size = 1e-320))), '/welds/0/size');
    const res = await post(edit(fillet(), (b) => (b.welds[0].size = 0.001)));
    expect(res.statusCode).toBe(200);
    expect(typeof res.json().utilization).toBe('number');
  });
});

describe('POST /v1/base-metal/check', () => {
  it('answers 200 with the shear checks of the part', async () => {
    const res = await post(baseMetal(), '/v1/base-metal/check');
    expect(res.statusCode).toBe(200);
    const body = res.json();
    expect(body.notice).toMatch(/licensed engineer/);
    // hand arithmetic, AISC 360-22 Eq. J4-3: plane 2 × 9 in / 2 faces = 9 in; Agv = 0.375 × 9 = 3.375 in²;
    // phi·Rn = 1.00 × 0.60 × 36 ksi × 3.375 in² = 72.9 kip
    expect(body.governing.code).toBe('BASE_METAL_SHEAR_YIELD');
    expect(body.governing.available).toBeCloseTo(72.9, 6);
    // hand arithmetic, Eq. J4-4: 0.75 × 0.60 × 58 × 3.375 = 88.09 kip
    expect(body.checks.find((c: { code: string }) => c.code === 'BASE_METAL_SHEAR_RUPTURE').available).toBeCloseTo(88.0875, 6);
    expect(body.status).toBe('pass');
  });

  it('answers the GET form too', async () => {
    const res = await app.inject({ method: 'GET', url: '/v1/base-metal/check?method=LRFD&part.thickness=3%2F8&part.steel=A36&part.faces=2&lines.0.length=9&lines.0.count=2&load.force=60' });
    expect(res.statusCode).toBe(200);
    expect(res.json()).toEqual((await post(baseMetal(), '/v1/base-metal/check')).json());
  });

  const cases: Array<[string, (b: any) => void, string]> = [
    ['method missing', (b) => delete b.method, '/method'],
    ['part missing', (b) => delete b.part, '/part'],
    ['thickness missing', (b) => delete b.part.thickness, '/part/thickness'],
    ['thickness zero', (b) => (b.part.thickness = 0), '/part/thickness'],
    ['steel unknown', (b) => (b.part.steel = 'S999'), '/part/steel'],
    ['fy negative', (b) => (b.part.steel = { fy: -1, fu: 58 }), '/part/steel/fy'],
    ['faces 3', (b) => (b.part.faces = 3), '/part/faces'],
    ['loading unknown', (b) => (b.part.loading = 'torsion'), '/part/loading'],
    ['lines empty', (b) => (b.lines = []), '/lines'],
    ['line length negative', (b) => (b.lines[0].length = -9), '/lines/0/length'],
    ['line count 0', (b) => (b.lines[0].count = 0), '/lines/0/count'],
    ['unknown property in part', (b) => (b.part.bogus = true), '/part/bogus'],
    ['load.force negative', (b) => (b.load.force = -1), '/load/force'],
  ];
  for (const [name, f, pointer] of cases) {
    it(`${name} → 400 at ${pointer}`, async () => {
      expectField(await post(edit(baseMetal(), f), '/v1/base-metal/check'), pointer);
    });
  }

  it('a thickness outside the grade catalogue is a 422 with a code', async () => {
    const body = { method: 'ASD', units: 'metric', part: { thickness: 100, steel: 'S355' }, lines: [{ length: 200 }] };
    const res = await post(body, '/v1/base-metal/check');
    expect(expectProblem(res, 422).code).toBe('MATERIAL_THICKNESS_OUT_OF_RANGE');
  });
});

describe('catalogue, health and contract routes', () => {
  it('steels in imperial and metric', async () => {
    const imp = await app.inject({ method: 'GET', url: '/v1/catalog/steels' });
    expect(imp.statusCode).toBe(200);
    const a36 = imp.json().steels.find((s: { name: string }) => s.name === 'A36');
    expect(imp.json().units.stress).toBe('ksi');
    // AISC Manual Part 2 (from memory): A36 Fy = 36 ksi, Fu = 58 ksi
    expect(a36.bands[0]).toMatchObject({ upTo: 8, fy: 36, fu: 58 });
    const met = await app.inject({ method: 'GET', url: '/v1/catalog/steels?units=metric' });
    expect(met.statusCode).toBe(200);
    expect(met.json().units).toEqual({ length: 'mm', stress: 'MPa' });
    const s355 = met.json().steels.find((s: { name: string }) => s.name === 'S355');
    // EN 1993-1-1 Table 3.1 (from memory): S355, t <= 40 mm: fy = 355 MPa, fu = 510 MPa
    expect(s355.bands[0]).toMatchObject({ upTo: 40, fy: 355, fu: 510 });
    const a36m = met.json().steels.find((s: { name: string }) => s.name === 'A36');
    // hand arithmetic: 36 ksi × 6.894757 MPa/ksi = 248.21 MPa; 8 in × 25.4 = 203.2 mm
    expect(a36m.bands[0].fy).toBeCloseTo(248.21, 2);
    expect(a36m.bands[0].upTo).toBeCloseTo(203.2, 9);
  });

  it('electrodes in imperial and metric', async () => {
    const imp = (await app.inject({ method: 'GET', url: '/v1/catalog/electrodes?units=imperial' })).json();
    // AWS A5.1 classification (from memory): E70 = 70 ksi
    expect(imp.electrodes.find((e: { name: string }) => e.name === 'E70').fexx).toBe(70);
    const met = (await app.inject({ method: 'GET', url: '/v1/catalog/electrodes?units=metric' })).json();
    expect(met.units.stress).toBe('MPa');
    // ISO 2560 classification (from memory): E49 = 490 MPa
    expect(met.electrodes.find((e: { name: string }) => e.name === 'E49').fexx).toBe(490);
    // hand arithmetic: 70 ksi × 6.894757 = 482.63 MPa
    expect(met.electrodes.find((e: { name: string }) => e.name === 'E70').fexx).toBeCloseTo(482.63, 2);
  });

  it('a bad catalogue unit system is a 400 problem at /units', async () => {
    expectField(await app.inject({ method: 'GET', url: '/v1/catalog/steels?units=SI' }), '/units');
    expectField(await app.inject({ method: 'GET', url: '/v1/catalog/electrodes?units=1' }), '/units');
  });

  // Known bug (src/routes/v1/checks.ts + src/app.ts, not ours): registerCheck calls app.addSchema on
  // the root after the catalogue plugin is registered; Fastify then compiles the catalogue's
  // query schema with its default Ajv (removeAdditional: true) instead of ours, so unknown
  // parameters are silently dropped. Remove .fails once the schemas are added before the
  // encapsulated route plugins are registered.
  it('an unknown catalogue parameter is a 400 problem at its name', async () => {
    expectField(await app.inject({ method: 'GET', url: '/v1/catalog/electrodes?colour=red' }), '/colour');
  });

  it('/healthz, /readyz, /openapi.json and /openapi.yaml answer 200', async () => {
    expect((await app.inject({ method: 'GET', url: '/healthz' })).statusCode).toBe(200);
    expect((await app.inject({ method: 'GET', url: '/readyz' })).statusCode).toBe(200);
    const json = await app.inject({ method: 'GET', url: '/openapi.json' });
    expect(json.statusCode).toBe(200);
    expect(json.json().openapi).toBe('3.1.0');
    expect(Object.keys(json.json().paths)).toContain('/v1/fillet/check');
    const yaml = await app.inject({ method: 'GET', url: '/openapi.yaml' });
    expect(yaml.statusCode).toBe(200);
    expect(yaml.body).toMatch(/^openapi: 3\.1\.0/);
  });
});

describe('lengths given as text', () => {
  const metric = (size: unknown) => ({ method: 'LRFD', units: 'metric', electrode: 'E49', welds: [{ size, length: 100 }], parts: [{ thickness: 12, steel: 'S355' }] });
  it('a plain number written as text is a length in metric too', async () => {
    const text = await post(metric('8'));
    const num = await post(metric(8));
    expect(text.statusCode).toBe(200);
    expect(text.json().governing).toEqual(num.json().governing);
  });
  it('text below the smallest length is refused at the field like a number would be', async () => {
    expectField(await post(metric('0.0001')), '/welds/0/size');
    expectField(await post(edit(fillet(), (b) => (b.welds[0].size = '0.0000001'))), '/welds/0/size');
  });
});
