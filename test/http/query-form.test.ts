/**
 * The GET (query-string) form of the checks: dotted names, array indexes, comma lists,
 * fractions, booleans; refusal of bad names with a pointer to the field; and a property that
 * the GET form answers exactly what POST answers for the same joint.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import type { FastifyInstance, LightMyRequestResponse } from 'fastify';
import { app as build } from '../helpers.js';

let app: FastifyInstance;
beforeAll(async () => {
  app = await build();
});
afterAll(async () => {
  await app.close();
});

const PATH = '/v1/fillet/check';
/** WS-B14: a 1 in A992 part and a 3/4 in A572-50 part; the weld fields vary per test. */
const JOINT = 'method=LRFD&electrode=E70&parts.0.thickness=1&parts.0.steel=A992&parts.1.thickness=0.75&parts.1.steel=A572-50';

async function get(query: string, path = PATH) {
  return app.inject({ method: 'GET', url: `${path}?${query}` });
}

/** Flattens a JSON body to dotted query parameters (numbers in their shortest round-trip form). */
function toQuery(value: unknown, prefix = '', out: string[] = []): string[] {
  if (value !== null && typeof value === 'object') {
    for (const [k, v] of Object.entries(value)) toQuery(v, prefix ? `${prefix}.${k}` : k, out);
  } else {
    out.push(`${encodeURIComponent(prefix)}=${encodeURIComponent(String(value))}`);
  }
  return out;
}

function expectRefused(res: LightMyRequestResponse, pointer: string) {
  expect(res.statusCode).toBe(400);
  expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
  const body = res.json();
  expect(body.status).toBe(400);
  expect(body.errors[0].pointer).toBe(pointer);
  return body.errors[0].detail as string;
}

describe('names, indexes and lists', () => {
  it('dotted names and array indexes build the same request as the JSON body', async () => {
    const body = {
      method: 'LRFD',
      electrode: 'E70',
      welds: [
        { size: 0.25, length: 6, angle: 0, count: 2 },
        { size: 0.25, length: 4, angle: 90 },
      ],
      load: { force: 40 },
      parts: [
        { thickness: 1, steel: 'A992' },
        { thickness: 0.75, steel: 'A572-50' },
      ],
    };
    const q = 'method=LRFD&electrode=E70&welds.0.size=0.25&welds.0.length=6&welds.0.angle=0&welds.0.count=2&welds.1.size=0.25&welds.1.length=4&welds.1.angle=90&load.force=40&parts.0.thickness=1&parts.0.steel=A992&parts.1.thickness=0.75&parts.1.steel=A572-50';
    const res = await get(q);
    expect(res.statusCode).toBe(200);
    const json = res.json();
    expect(json).toEqual((await app.inject({ method: 'POST', url: PATH, payload: body })).json());
    // AISC 360-22 Eq. J2-6 (from memory): a group of longitudinal and transverse lines uses the mixed rule
    expect(json.values.groupRule).toMatch(/^mixed-J2-6/);
  });

  it('parameter order does not matter', async () => {
    const q = `welds.0.length=10&${JOINT}&welds.0.size=5%2F16`;
    const a = await get(q);
    const b = await get(`${JOINT}&welds.0.size=5%2F16&welds.0.length=10`);
    expect(a.statusCode).toBe(200);
    expect(a.body).toBe(b.body);
  });

  it('a comma list fills an array field: legs=5/16,3/8', async () => {
    const res = await get(`${JOINT}&welds.0.legs=5%2F16,3%2F8&welds.0.length=10`);
    expect(res.statusCode).toBe(200);
    // hand arithmetic: 5/16 = 0.3125, 3/8 = 0.375
    expect(res.json().values.welds[0].legs).toEqual([0.3125, 0.375]);
    // AISC 360-22 J2.2a (from memory): unequal legs a, b: te = a·b / sqrt(a² + b²) = 0.117188 / 0.488133 = 0.24008
    expect(res.json().values.throat).toBeCloseTo(0.24008, 4);
  });

  it('list items by index work as well as a comma list', async () => {
    const a = await get(`${JOINT}&welds.0.legs.0=5%2F16&welds.0.legs.1=3%2F8&welds.0.length=10`);
    const b = await get(`${JOINT}&welds.0.legs=5%2F16,3%2F8&welds.0.length=10`);
    expect(a.statusCode).toBe(200);
    expect(a.body).toBe(b.body);
  });

  it('a list with a bad item names the item', async () => {
    expectRefused(await get(`${JOINT}&welds.0.legs=5%2F16,abc&welds.0.length=10`), '/welds/0/legs/1');
  });
});

describe('fractions', () => {
  const cases: Array<[string, number, string]> = [
    // hand arithmetic for each
    ['5%2F16', 0.3125, '"5/16" URL-encoded'],
    ['5/16', 0.3125, '"5/16" with a bare slash'],
    ['1-1%2F4', 1.25, '"1-1/4"'],
    ['1%201%2F4', 1.25, '"1 1/4" with %20'],
    ['1+1%2F4', 1.25, '"1 1/4" with + for the space'],
    ['0.3125', 0.3125, 'a decimal'],
    ['3', 3, 'a whole number'],
  ];
  for (const [text, inches, name] of cases) {
    it(`${name} is ${inches} in`, async () => {
      const res = await get(`${JOINT}&welds.0.size=${text}&welds.0.length=20`);
      expect(res.statusCode).toBe(200);
      expect(res.json().values.welds[0].size).toBe(inches);
    });
  }

  it('a length field accepts a fraction too (thickness 3/4)', async () => {
    const res = await get('method=LRFD&electrode=E70&welds.0.size=1%2F4&welds.0.length=8&parts.0.thickness=3%2F4&parts.0.steel=A36');
    expect(res.statusCode).toBe(200);
    expect(res.json().values.parts[0].thickness).toBe(0.75);
  });

  for (const bad of ['5%2F0', 'abc', '-5%2F16', '5%2F16%2F2', '', 'NaN', 'Infinity', '0x10']) {
    it(`"${decodeURIComponent(bad)}" is a 400 at /welds/0/size`, async () => {
      expectRefused(await get(`${JOINT}&welds.0.size=${bad}&welds.0.length=10`), '/welds/0/size');
    });
  }

  it('a fraction in metric is a 400 at the field', async () => {
    const detail = expectRefused(await get('method=LRFD&units=metric&electrode=E49&welds.0.size=5%2F16&welds.0.length=100&parts.0.thickness=12&parts.0.steel=S355'), '/welds/0/size');
    expect(detail).toMatch(/imperial only/);
  });
});

describe('booleans', () => {
  // AISC 360-22 Eq. J2-1 (from memory): l/w = 40 / 0.25 = 160 > 100, beta = 1.2 - 0.002 × 160 = 0.88
  const LONG = `${JOINT}&welds.0.size=0.25&welds.0.length=40&load.force=10`;
  for (const word of ['true', 'TRUE', '1']) {
    it(`endLoaded=${word} applies the end-loaded reduction`, async () => {
      const res = await get(`${LONG}&welds.0.endLoaded=${word}`);
      expect(res.statusCode).toBe(200);
      expect(res.json().values.welds[0].beta).toBeCloseTo(0.88, 12);
    });
  }
  for (const word of ['false', 'False', '0']) {
    it(`endLoaded=${word} leaves the full length`, async () => {
      const res = await get(`${LONG}&welds.0.endLoaded=${word}`);
      expect(res.statusCode).toBe(200);
      expect(res.json().values.welds[0].beta).toBe(1);
    });
  }
  for (const word of ['yes', 'on', '2', '']) {
    it(`endLoaded=${word} is a 400 at the field`, async () => {
      const detail = expectRefused(await get(`${LONG}&welds.0.endLoaded=${word}`), '/welds/0/endLoaded');
      expect(detail).toMatch(/true or false/);
    });
  }
});

describe('bad names are refused with the field named', () => {
  const base = `${JOINT}&welds.0.size=5%2F16&welds.0.length=10`;
  const cases: Array<[string, string, RegExp]> = [
    ['__proto__=1', '/__proto__', /not a field name/],
    ['__proto__.method=ASD', '/__proto__/method', /not a field name/],
    ['constructor.x=1', '/constructor/x', /not a field name/],
    ['welds.0.constructor.prototype=1', '/welds/0/constructor/prototype', /not a field name/],
    ['welds.x.size=1', '/welds/x/size', /index was expected/],
    ['welds.0.0=1', '/welds/0/0', /field name was expected/],
    ['welds.2.size=1', '/welds/1', /item 1 is missing/],
    ['welds.1000.size=1', '/welds/1000/size', /index above 999/],
    ['welds.99999999999999999999.size=1', '/welds/99999999999999999999/size', /index above 999/],
    ['welds.01.size=1', '/welds/01/size', /leading zero/],
    ['welds.0.size=3%2F8', '/welds/0/size', /more than once/],
    ['method=ASD', '/method', /more than once/],
    ['welds=1', '/welds', /both as one value and as a group/],
    ['welds.0=1', '/welds/0', /both as one value and as a group/],
    ['toString=1', '/toString', /not a field of this request/],
    ['hasOwnProperty=1', '/hasOwnProperty', /not a field of this request/],
    ['welds..size=1', '/welds//size', /not a field name/],
    ['a%5Bb%5D=1', '/a[b]', /not a field name/],
    ['=5', '/', /not a field name/],
    ['welds.0.bogus=1', '/welds/0/bogus', /not a field of this request/],
  ];
  for (const [extra, pointer, detail] of cases) {
    it(`${decodeURIComponent(extra)} → 400 at ${pointer}`, async () => {
      expect(expectRefused(await get(`${base}&${extra}`), pointer)).toMatch(detail);
    });
  }

  it('welds.1 without welds.0 is refused at /welds/0', async () => {
    const detail = expectRefused(await get(`${JOINT}&welds.1.size=5%2F16&welds.1.length=10`), '/welds/0');
    expect(detail).toMatch(/without gaps/);
  });

  it('a value given before the fields nested under it is refused as well', async () => {
    expectRefused(await get(`${JOINT}&welds.0=1&welds.0.size=5%2F16&welds.0.length=10`), '/welds/0/size');
  });

  it('the base-metal GET form refuses bad names the same way', async () => {
    expectRefused(await get('method=LRFD&part.thickness=0.5&part.steel=A36&lines.0.length=4&__proto__.x=1', '/v1/base-metal/check'), '/__proto__/x');
    expectRefused(await get('method=LRFD&part.thickness=0.5&part.steel=A36&lines.1.length=4', '/v1/base-metal/check'), '/lines/0');
  });
});

describe('GET answers exactly what POST answers (property)', () => {
  const imperialSize = fc.oneof(
    fc.integer({ min: 2, max: 16 }).map((d) => d / 16),
    fc.constantFrom('1/8', '3/16', '1/4', '5/16', '3/8', '1/2', '5/8', '3/4', '1', '1-1/4', '1 1/4', '0.3125'),
  );
  const positive = (max: number) => fc.double({ min: max / 1000, max, noNaN: true, noDefaultInfinity: true });

  const weld = (units: 'imperial' | 'metric') =>
    fc.record(
      {
        size: units === 'imperial' ? imperialSize : fc.integer({ min: 3, max: 20 }),
        length: units === 'imperial' ? fc.oneof(positive(60), fc.constantFrom('10', '6-1/2')) : positive(1500),
        angle: fc.oneof(fc.constantFrom(0, 90), fc.double({ min: 0, max: 90, noNaN: true })),
        count: fc.integer({ min: 1, max: 4 }),
        endLoaded: fc.boolean(),
        builtOut: fc.boolean(),
      },
      { requiredKeys: ['size', 'length'] },
    );

  const part = (units: 'imperial' | 'metric') =>
    fc.record(
      {
        thickness: units === 'imperial' ? positive(3) : positive(60),
        steel: fc.oneof(
          fc.constantFrom(...(units === 'imperial' ? ['A36', 'A992', 'A572-50', 'A588'] : ['S235', 'S275', 'S355'])),
          fc.record({ fy: fc.integer({ min: 30, max: 60 }), fu: fc.integer({ min: 60, max: 90 }) }),
        ),
        edge: fc.boolean(),
        faces: fc.constantFrom(1, 2),
        loading: fc.constantFrom('shear', 'tension'),
      },
      { requiredKeys: ['thickness', 'steel'] },
    );

  const body = fc.constantFrom('imperial' as const, 'metric' as const).chain((units) =>
    fc.record(
      {
        id: fc.string({ minLength: 1, maxLength: 24, unit: 'grapheme' }),
        method: fc.constantFrom('LRFD', 'ASD'),
        units: fc.constant(units),
        electrode: fc.oneof(fc.constantFrom(...(units === 'imperial' ? ['E60', 'E70', 'E80'] : ['E43', 'E49'])), fc.record({ fexx: fc.integer({ min: 40, max: 800 }) })),
        welds: fc.array(weld(units), { minLength: 1, maxLength: 3 }),
        parts: fc.array(part(units), { minLength: 1, maxLength: 2 }),
        load: fc.record({ force: fc.double({ min: 0, max: 1000, noNaN: true }) }),
        directionalIncrease: fc.boolean(),
        lap: units === 'imperial' ? positive(10) : positive(250),
      },
      { requiredKeys: ['method', 'electrode', 'welds', 'parts'] },
    ),
  );

  it('for random valid fillet bodies, flattened to dotted parameters', async () => {
    let answered = 0;
    await fc.assert(
      fc.asyncProperty(body, async (b) => {
        const viaPost = await app.inject({ method: 'POST', url: PATH, payload: b });
        const viaGet = await get(toQuery(b).join('&'));
        expect(viaGet.statusCode).toBe(viaPost.statusCode);
        expect(viaGet.headers['content-type']).toBe(viaPost.headers['content-type']);
        expect(viaGet.json()).toEqual(viaPost.json());
        if (viaPost.statusCode === 200) answered++;
      }),
      { numRuns: 150 },
    );
    // The generator is meant to make answerable joints; most of them must be answered.
    expect(answered).toBeGreaterThan(100);
  });
});
