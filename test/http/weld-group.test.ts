/**
 * POST/GET /v1/weld-group/eccentric over HTTP (app.inject): answers, the GET form with shape
 * shortcuts and dotted segments, the svg figure, 400 and 422 problems, and a bounded fuzz that
 * nothing a client sends gives a 500.
 *
 * Expected numbers: E70, 1/4 in fillets, 0.60 × 70 × 0.7071 × 0.25 = 7.4246 kip/in (AISC 360-22
 * Eq. J2-4, from memory); the rest are relations between answers, not values.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { FastifyInstance } from 'fastify';
import fc from 'fast-check';
import { app as build } from '../helpers.js';

let app: FastifyInstance;
beforeAll(async () => {
  app = await build();
});
afterAll(async () => {
  await app.close();
});

const URL = '/v1/weld-group/eccentric';
const bracket = {
  id: 'WS-C03',
  method: 'LRFD',
  units: 'imperial',
  electrode: 'E70',
  size: '1/4',
  segments: [
    { from: [4, 0], to: [0, 0] },
    { from: [0, 0], to: [0, 10] },
    { from: [0, 10], to: [4, 10] },
  ],
  load: { fx: 0, fy: -30, at: [12, 5] },
};

async function post(payload: object, query = '') {
  return app.inject({ method: 'POST', url: `${URL}${query}`, payload });
}

/** A small well-formedness check: every tag closes in order, attributes are quoted. */
function wellFormed(xml: string): boolean {
  const stack: string[] = [];
  const body = xml.replace(/<\?xml[^>]*\?>/, '');
  for (const m of body.matchAll(/<(\/?)([A-Za-z][\w:-]*)((?:\s+[\w:-]+="[^"<]*")*)\s*(\/?)>/g)) {
    const [, close, name, , self] = m;
    if (self) continue;
    if (close) {
      if (stack.pop() !== name) return false;
    } else stack.push(name!);
  }
  // nothing that looks like a tag was left unmatched by the pattern
  const tags = (body.match(/</g) ?? []).length;
  const matched = [...body.matchAll(/<(\/?)([A-Za-z][\w:-]*)((?:\s+[\w:-]+="[^"<]*")*)\s*(\/?)>/g)].length;
  // and every ampersand starts an entity
  const bareAmpersand = /&(?!amp;|lt;|gt;|quot;|#39;)/.test(body);
  return stack.length === 0 && tags === matched && !bareAmpersand;
}

describe('POST answers', () => {
  it('the bracket answers 200 with the ICR check, the centre, the elastic result and a figure link', async () => {
    const res = await post(bracket);
    expect(res.statusCode).toBe(200);
    const a = res.json();
    expect(a.id).toBe('WS-C03');
    expect(a.checks[0].code).toBe('WELD_GROUP_ICR');
    expect(a.values.method).toBe('icr');
    expect(a.values.capacityNominal).toBeGreaterThan(a.values.elastic.capacityNominal);
    expect(a.values.centre).toHaveLength(2);
    expect(a.values.residuals.relative).toBeLessThan(1e-6);
    expect(a.values.figure).toMatch(/^\/v1\/weld-group\/eccentric\?.*format=svg$/);
    expect(a.notice).toMatch(/licensed engineer/);
    expect(a.units).toEqual({ length: 'in', force: 'kip', stress: 'ksi' });
  });

  it('a load through the centroid answers by the Specification rule, with the centre null', async () => {
    // two lines 10 in, loaded across through the centroid: 1.5 × 7.4246 × 20 = 222.74 kip (Eq. J2-5)
    const res = await post({ method: 'LRFD', electrode: 'E70', size: 0.25, shape: 'parallel', height: 10, width: 5, load: { magnitude: 50, angle: 0, eccentricity: 0 } });
    expect(res.statusCode).toBe(200);
    const a = res.json();
    expect(a.values.method).toBe('concentric-rule');
    expect(a.values.centre).toBeNull();
    expect(a.values.capacityNominal).toBeCloseTo(222.74, 1);
    expect(a.warnings.map((w: { code: string }) => w.code)).toContain('WELD_GROUP_CONCENTRIC_RULE');
  });

  it('without a size, the answer sizes the weld', async () => {
    const { size: _size, ...rest } = bracket;
    const res = await post({ ...rest, load: { fx: 0, fy: -45, at: [12, 5] } });
    expect(res.statusCode).toBe(200);
    const a = res.json();
    expect(a.values.sizing.standardSize).toBe(a.values.size);
    expect(a.status).toBe('pass');
  });
});

describe('GET form', () => {
  it('shape=C with flat fields gives the same answer as the POST body', async () => {
    const get = await app.inject({ method: 'GET', url: `${URL}?method=LRFD&electrode=E70&shape=C&height=10&width=4&size=1/4&load.fy=-30&load.at=12,5` });
    expect(get.statusCode).toBe(200);
    const post1 = await post({ method: 'LRFD', electrode: 'E70', shape: 'C', height: 10, width: 4, size: '1/4', load: { fy: -30, at: [12, 5] } });
    expect(get.json().values.capacityNominal).toBe(post1.json().values.capacityNominal);
    // the C shortcut is the bracket's three segments
    expect(get.json().values.capacityNominal).toBe((await post(bracket)).json().values.capacityNominal);
  });

  it('dotted segments with comma lists, and one value for a spreadsheet cell', async () => {
    const q = 'method=LRFD&electrode=E70&size=0.25&segments.0.from=0,0&segments.0.to=0,10&segments.1.from=0,10&segments.1.to=4,10&load.fy=-30&load.at=8,5';
    const res = await app.inject({ method: 'GET', url: `${URL}?${q}&format=value&field=values.capacityNominal` });
    expect(res.statusCode).toBe(200);
    expect(res.headers['content-type']).toMatch(/text\/plain/);
    expect(Number(res.body)).toBeGreaterThan(0);
    const csv = await app.inject({ method: 'GET', url: `${URL}?${q}&format=csv` });
    expect(csv.statusCode).toBe(200);
    expect(csv.body.split('\r\n')[0]).toContain('values.capacityNominal');
  });

  it('the figure link of a JSON answer opens the figure', async () => {
    const link = (await post(bracket)).json().values.figure as string;
    const res = await app.inject({ method: 'GET', url: link });
    expect(res.statusCode).toBe(200);
    expect(res.headers['content-type']).toMatch(/^image\/svg\+xml/);
  });
});

describe('format=svg', () => {
  it('draws the group, the load, the centroid and the centre, well formed', async () => {
    const res = await post(bracket, '?format=svg');
    expect(res.statusCode).toBe(200);
    expect(res.headers['content-type']).toBe('image/svg+xml; charset=utf-8');
    const svg = res.body;
    expect(svg.startsWith('<svg xmlns="http://www.w3.org/2000/svg"')).toBe(true);
    expect(wellFormed(svg)).toBe(true);
    // three welds as thick lines, the load arrow, labels
    expect(svg.match(/stroke-width="5"/g)!.length).toBeGreaterThanOrEqual(3);
    expect(svg).toContain('marker-end="url(#wg-head)"');
    expect(svg).toMatch(/>centroid</);
    expect(svg).toMatch(/>IC</);
    expect(svg).toMatch(/P = 30 kip/);
    expect(svg).toMatch(/10 in/); // the height dimension
    expect(svg).toMatch(/>4 in</); // the width dimension
  });

  it('the centre is drawn where the answer puts it, to the same scale as the welds', async () => {
    const a = (await post(bracket)).json();
    const svg = (await post(bracket, '?format=svg')).body;
    // the welds' ends (0, 0) and (0, 10) map to x0 and to y0, y10; the centre maps by the same rule
    const welds = [...svg.matchAll(/<line x1="([\d.]+)" y1="([\d.]+)" x2="([\d.]+)" y2="([\d.]+)" stroke="#1d1d1f" stroke-width="5"\/>/g)].map((m) => m.slice(1).map(Number));
    const back = welds[1]!; // segments[1]: (0, 0) -> (0, 10)
    const scale = (back[1]! - back[3]!) / 10;
    const xOf = (x: number) => back[0]! + x * scale;
    const yOf = (y: number) => back[1]! - y * scale;
    const ic = /<circle cx="([\d.]+)" cy="([\d.]+)" r="3.5"/.exec(svg)!;
    expect(Math.abs(Number(ic[1]) - xOf(a.values.centre[0]))).toBeLessThan(0.2);
    expect(Math.abs(Number(ic[2]) - yOf(a.values.centre[1]))).toBeLessThan(0.2);
  });

  it('escapes text it did not write itself', async () => {
    const res = await post({ ...bracket, id: 'WS-<B12>&"x"' }, '?format=svg');
    expect(res.statusCode).toBe(200);
    expect(res.body).toContain('WS-&lt;B12&gt;&amp;&quot;x&quot;');
    expect(wellFormed(res.body)).toBe(true);
  });

  it('a normal load and a concentric load draw too', async () => {
    for (const load of [{ fz: 10, at: [6, 5] }, { fx: 10, at: [6, 5] }]) {
      const res = await post({ ...bracket, load }, '?format=svg');
      expect(res.statusCode).toBe(200);
      expect(wellFormed(res.body)).toBe(true);
    }
  });
});

describe('400 and 422 problems', () => {
  const bad: Array<[string, object, string]> = [
    ['both segments and shape', { ...bracket, shape: 'C', height: 10, width: 4 }, '/shape'],
    ['neither segments nor shape', { ...bracket, segments: undefined }, '/segments'],
    ['a shape without its height', { method: 'LRFD', electrode: 'E70', size: 0.25, shape: 'C', width: 4, load: { fy: -10, at: [5, 5] } }, '/height'],
    ['a line with a width', { method: 'LRFD', electrode: 'E70', size: 0.25, shape: 'line', height: 10, width: 4, load: { fy: -10, at: [5, 5] } }, '/width'],
    ['a load without its point', { ...bracket, load: { fy: -10 } }, '/load/at'],
    ['a load with both point and eccentricity', { ...bracket, load: { fy: -10, at: [1, 1], eccentricity: 2 } }, '/load/eccentricity'],
    ['a magnitude without its angle', { ...bracket, load: { magnitude: 10, at: [1, 1] } }, '/load/angle'],
    ['components and a magnitude', { ...bracket, load: { fy: -10, magnitude: 10, angle: 0, at: [1, 1] } }, '/load/magnitude'],
    ['no size and no load to size for', { ...bracket, size: undefined, load: { magnitude: 0, angle: -90, at: [1, 1] } }, '/size'],
    ['a fraction in metric', { ...bracket, units: 'metric', electrode: 'E49' }, '/size'],
    ['an unknown field', { ...bracket, colour: 'red' }, '/colour'],
    ['a point with three numbers', { ...bracket, load: { fy: -10, at: [1, 1, 1] } }, '/load/at'],
    ['51 segments', { ...bracket, segments: Array.from({ length: 51 }, (_, i) => ({ from: [i, 0], to: [i, 1] })) }, '/segments'],
    ['too many elements', { ...bracket, elements: 20001 }, '/elements'],
  ];
  it.each(bad)('400: %s', async (_name, payload, pointer) => {
    const res = await post(payload);
    expect(res.statusCode, res.body).toBe(400);
    expect(res.headers['content-type']).toMatch(/application\/problem\+json/);
    expect(res.json().errors.map((e: { pointer: string }) => e.pointer)).toContain(pointer);
  });

  const unanswerable: Array<[string, object, string]> = [
    ['a segment without length', { ...bracket, segments: [{ from: [1, 1], to: [1, 1] }] }, 'WELD_GROUP_GEOMETRY_ZERO_LENGTH'],
    ['overlapping segments', { ...bracket, segments: [{ from: [0, 0], to: [0, 10] }, { from: [0, 5], to: [0, 12] }] }, 'WELD_GROUP_GEOMETRY_OVERLAP'],
    ['a load without a direction', { ...bracket, load: { fx: 0, fy: 0, at: [1, 1] } }, 'WELD_GROUP_LOAD_WITHOUT_DIRECTION'],
    ['a moment about the line of a single weld', { ...bracket, segments: [{ from: [0, 0], to: [0, 10] }], load: { fz: 5, at: [3, 5] } }, 'WELD_GROUP_MOMENT_UNRESISTED'],
    ['a steel with fy above fu', { ...bracket, parts: [{ thickness: 0.5, steel: { fy: 70, fu: 60 } }] }, 'MATERIAL_FY_EXCEEDS_FU'],
  ];
  it.each(unanswerable)('422: %s', async (_name, payload, code) => {
    const res = await post(payload);
    expect(res.statusCode, res.body).toBe(422);
    expect(res.json().code).toBe(code);
  });
});

describe('fuzz: never a 500', () => {
  it('random well-typed and ill-typed bodies answer 200, 400 or 422', async () => {
    const num = fc.oneof(fc.integer({ min: -100, max: 100 }), fc.double({ min: -1e3, max: 1e3, noNaN: true }), fc.constant(0));
    const pt = fc.tuple(num, num);
    const body = fc.record(
      {
        method: fc.constantFrom('LRFD', 'ASD', 'lrfd'),
        units: fc.constantFrom('imperial', 'metric'),
        electrode: fc.constantFrom('E70', 'E49', 'E999'),
        size: fc.oneof(fc.constant('1/4'), fc.double({ min: 0.01, max: 30, noNaN: true }), fc.constant(-1)),
        segments: fc.array(fc.record({ from: pt, to: pt }), { minLength: 0, maxLength: 8 }),
        load: fc.record({ fx: num, fy: num, at: pt }, { requiredKeys: [] }),
        elements: fc.integer({ min: 0, max: 400 }),
        analysis: fc.constantFrom('icr', 'elastic'),
      },
      { requiredKeys: ['method', 'electrode', 'load'] },
    );
    await fc.assert(
      fc.asyncProperty(body, async (b) => {
        const res = await post(b);
        expect([200, 400, 422], res.body.slice(0, 300)).toContain(res.statusCode);
      }),
      { numRuns: 80, seed: 5 },
    );
  });
});
