/**
 * POST and GET /v1/groove/pjp/check and /v1/groove/cjp/check over HTTP: answers (200), field
 * errors (400 pointing at the field), requests the rules cannot answer (422 with a code), the
 * qualified-throat override, the query-string form and the csv/value formats.
 */
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { FastifyInstance } from 'fastify';
import { app as build } from '../helpers.js';
import { cjpCheck, pjpCheck } from '../../src/operations/groove.js';

let app: FastifyInstance;
beforeAll(async () => {
  app = await build();
});
afterAll(async () => {
  await app.close();
});

type Body = Record<string, unknown>;

/** The api.md PJP example: 45-degree bevel, 1/2 in deep, SMAW vertical, tension normal, ASD. */
function pjp(): Body {
  return {
    method: 'ASD',
    units: 'imperial',
    electrode: 'E70',
    groove: { type: 'bevel-45', depth: 0.5, process: 'SMAW', position: 'vertical', sides: 1 },
    length: 12,
    load: { case: 'tension-normal', force: 40 },
    parts: [
      { thickness: 0.75, steel: 'A992' },
      { thickness: 1.0, steel: 'A572-50' },
    ],
  };
}

function cjp(): Body {
  return {
    method: 'LRFD',
    electrode: 'E70',
    length: 10,
    load: { case: 'tension-normal', force: 300 },
    parts: [
      { thickness: 0.75, steel: 'A572-50' },
      { thickness: 1, steel: 'A572-50' },
    ],
  };
}

const post = (url: string, payload: Body) => app.inject({ method: 'POST', url, payload });
const PJP = '/v1/groove/pjp/check';
const CJP = '/v1/groove/cjp/check';

function withGroove(over: Body, drop: string[] = []): Body {
  const b = pjp();
  const g = { ...(b.groove as Body), ...over };
  for (const k of drop) delete g[k];
  b.groove = g;
  return b;
}

describe('PJP: 200', () => {
  it('the api.md example: throat 3/8 in, weld metal 0.60 × 70 × 0.375 × 12 / 1.88 = 100.53 kip governs', async () => {
    const res = await post(PJP, pjp());
    expect(res.statusCode).toBe(200);
    const body = res.json();
    // AISC 360-22 Table J2.1 (from memory): SMAW 45-degree bevel, S - 1/8 = 3/8 in
    expect(body.values.throat).toBeCloseTo(0.375, 12);
    expect(body.governing.code).toBe('PJP_WELD_METAL');
    expect(body.governing.available).toBeCloseTo(100.532, 3);
    expect(body.status).toBe('pass');
    expect(body.basis.method).toBe('ASD');
    expect(body.units).toEqual({ length: 'in', force: 'kip', stress: 'ksi' });
    expect(body.notice).toMatch(/licensed engineer/);
    expect(body.warnings.map((w: { code: string }) => w.code)).toContain('PJP_THROAT_DEDUCTION_AVOIDABLE');
  });

  it('GMAW in the flat position: throat 1/2 in (AISC 360-22 Table J2.1, from memory)', async () => {
    const res = await post(PJP, withGroove({ process: 'GMAW', position: 'flat' }));
    expect(res.statusCode).toBe(200);
    expect(res.json().values.throat).toBe(0.5);
  });

  it('SMAW needs no position for a 45-degree bevel ("any position")', async () => {
    const res = await post(PJP, withGroove({}, ['position']));
    expect(res.statusCode).toBe(200);
    expect(res.json().values.throat).toBeCloseTo(0.375, 12);
  });

  it('fractions and two sides of different depth: depths ["1/2", "3/8"] by SMAW gives 3/8 + 1/4 = 5/8 in', async () => {
    const res = await post(PJP, withGroove({ depths: ['1/2', '3/8'] }, ['depth', 'sides']));
    expect(res.statusCode).toBe(200);
    const v = res.json().values;
    expect(v.sides).toHaveLength(2);
    expect(v.throat).toBeCloseTo(0.625, 12);
  });

  it('a load case the table exempts answers with checks marked applicable false', async () => {
    const b = pjp();
    b.load = { case: 'parallel', force: 40 };
    const res = await post(PJP, b);
    expect(res.statusCode).toBe(200);
    const body = res.json();
    expect(body.checks.map((c: { code: string }) => c.code)).toEqual(['GROOVE_WELD_METAL_EXEMPT', 'GROOVE_BASE_METAL_EXEMPT']);
    expect(body.checks.every((c: { applicable?: boolean; note?: string }) => c.applicable === false && /need not/.test(c.note ?? ''))).toBe(true);
    expect(body.values.governingSide).toBe('none');
    expect(body.utilization).toBe(0);
  });

  it('the qualified-throat override: SAW on a 45-degree bevel with qualifiedThroat answers, flagged', async () => {
    const res = await post(PJP, withGroove({ process: 'SAW', position: 'flat', qualifiedThroat: '7/16' }));
    expect(res.statusCode).toBe(200);
    const body = res.json();
    expect(body.values.throat).toBe(0.4375);
    expect(body.values.throatSource).toBe('qualified');
    expect(body.warnings.map((w: { code: string }) => w.code)).toContain('QUALIFIED_THROAT_USED');
  });

  it('flare bevel on an HSS with no radius: R = 2t assumed and flagged', async () => {
    const b = pjp();
    b.groove = { type: 'flare-bevel', process: 'FCAW-G' };
    b.parts = [{ thickness: 0.25, steel: 'A500-C-rect', hss: true }, { thickness: 0.5, steel: 'A36' }];
    const res = await post(PJP, b);
    expect(res.statusCode).toBe(200);
    const body = res.json();
    // AISC 360-22 Table J2.2 (from memory): 5/8 × 2 × 0.25 = 0.3125 in
    expect(body.values.throat).toBeCloseTo(0.3125, 12);
    expect(body.warnings.map((w: { code: string }) => w.code)).toContain('FLARE_RADIUS_ASSUMED');
  });

  it('metric', async () => {
    const res = await post(PJP, {
      method: 'LRFD',
      units: 'metric',
      electrode: 'E49',
      groove: { type: 'bevel-45', depth: 12, process: 'SMAW' },
      length: 250,
      load: { case: 'shear', force: 100 },
      parts: [{ thickness: 25, steel: 'S355' }],
    });
    expect(res.statusCode).toBe(200);
    const body = res.json();
    expect(body.values.throat).toBe(9); // 12 - 3 mm, Table J2.1 (from memory)
    expect(body.units.force).toBe('kN');
  });

  it('echoes the id and answers every example the contract shows', async () => {
    const b = pjp();
    b.id = 'WS-C07';
    expect((await post(PJP, b)).json().id).toBe('WS-C07');
    for (const op of [pjpCheck, cjpCheck]) {
      for (const [name, ex] of Object.entries(op.examples)) {
        const res = await post(op.path, ex.value as unknown as Body);
        expect(res.statusCode, name).toBe(200);
        expect(res.json().id, name).toBe(ex.value.id);
      }
    }
  });
});

describe('CJP: 200', () => {
  it('tension: base metal governs, yield 0.90 × 50 × 0.75 × 10 = 337.5 kip', async () => {
    const res = await post(CJP, cjp());
    expect(res.statusCode).toBe(200);
    const body = res.json();
    expect(body.governing.code).toBe('BASE_METAL_TENSION_YIELD');
    expect(body.governing.available).toBeCloseTo(337.5, 9);
    expect(body.warnings.map((w: { code: string }) => w.code)).toContain('CJP_INSPECTION');
  });

  it('an under-matched electrode in tension is a failed limit', async () => {
    const b = cjp();
    b.electrode = 'E60';
    const res = await post(CJP, b);
    expect(res.statusCode).toBe(200);
    const body = res.json();
    expect(body.status).toBe('fail');
    expect(body.limits.find((l: { code: string }) => l.code === 'CJP_FILLER_MATCHING').pass).toBe(false);
  });
});

describe('GET forms and formats', () => {
  const q =
    'method=ASD&electrode=E70&groove.type=bevel-45&groove.depth=1/2&groove.process=SMAW&groove.position=vertical' +
    '&length=12&load.case=tension-normal&load.force=40&parts.0.thickness=0.75&parts.0.steel=A992&parts.1.thickness=1&parts.1.steel=A572-50';

  it('GET answers the same as POST', async () => {
    const g = await app.inject({ method: 'GET', url: `${PJP}?${q}` });
    const p = await post(PJP, pjp());
    expect(g.statusCode).toBe(200);
    expect(g.json()).toEqual(p.json());
  });

  it('format=value&field=values.throat answers 0.375', async () => {
    const res = await app.inject({ method: 'GET', url: `${PJP}?${q}&format=value&field=values.throat` });
    expect(res.statusCode).toBe(200);
    expect(res.headers['content-type']).toMatch(/text\/plain/);
    expect(res.body).toBe('0.375');
  });

  it('format=value by check code: checks.PJP_WELD_METAL.nominal = 0.60 × 70 × 0.375 × 12 = 189', async () => {
    const res = await app.inject({ method: 'GET', url: `${PJP}?${q}&format=value&field=checks.PJP_WELD_METAL.nominal` });
    expect(Number(res.body)).toBeCloseTo(189, 9);
  });

  it('format=csv answers a header row and a data row', async () => {
    const res = await app.inject({ method: 'GET', url: `${PJP}?${q}&format=csv` });
    expect(res.statusCode).toBe(200);
    expect(res.headers['content-type']).toMatch(/text\/csv/);
    const [head, row] = res.body.trimEnd().split('\r\n');
    const i = head!.split(',').indexOf('values.throat');
    expect(i).toBeGreaterThan(0);
    expect(row!.split(',')[i]).toBe('0.375');
  });

  it('GET depths as a comma list', async () => {
    const url = `${PJP}?${q.replace('groove.depth=1/2', 'groove.depths=0.5,0.375')}&format=value&field=values.throat`;
    const res = await app.inject({ method: 'GET', url });
    expect(res.statusCode).toBe(200);
    expect(Number(res.body)).toBeCloseTo(0.625, 12);
  });

  it('GET on the CJP path, format=value&field=governing.code', async () => {
    const url = `${CJP}?method=LRFD&electrode=E70&length=10&load.case=shear&load.force=100&parts.0.thickness=0.75&parts.0.steel=A572-50&format=value&field=governing.code`;
    const res = await app.inject({ method: 'GET', url });
    expect(res.statusCode).toBe(200);
    expect(res.body).toBe('BASE_METAL_SHEAR_RUPTURE');
  });

  it('GET without the SAW throat answers 422 with the code', async () => {
    const url = `${PJP}?${q.replace('groove.process=SMAW', 'groove.process=SAW').replace('groove.position=vertical', 'groove.position=flat')}`;
    const res = await app.inject({ method: 'GET', url });
    expect(res.statusCode).toBe(422);
    expect(res.json().code).toBe('PJP_NO_PREQUALIFIED_THROAT');
  });
});

describe('400: fields', () => {
  const cases: Array<[string, () => Body, string]> = [
    ['an unknown groove field', () => withGroove({ angle: 45 }), '/groove/angle'],
    ['an unknown groove type', () => withGroove({ type: 'bevel-30' }), '/groove/type'],
    ['an unknown load case', () => ({ ...pjp(), load: { case: 'torsion', force: 1 } }), '/load/case'],
    ['a missing load', () => { const b = pjp(); delete b.load; return b; }, '/load'],
    ['no depth for a bevel', () => withGroove({}, ['depth']), '/groove/depth'],
    ['depth and depths together', () => withGroove({ depths: [0.5, 0.5], sides: 2 }), '/groove/depths'],
    ['two depths with sides 1', () => withGroove({ depths: [0.5, 0.5] }, ['depth']), '/groove/depths'],
    ['a radius for a bevel', () => withGroove({ radius: 1 }), '/groove/radius'],
    ['a depth for a flare groove', () => withGroove({ type: 'flare-V', radius: 1 }), '/groove/depth'],
    ['a flare groove with no radius and no HSS part', () => withGroove({ type: 'flare-V' }, ['depth']), '/groove/radius'],
    ['GMAW on a 45-degree bevel with no position', () => withGroove({ process: 'GMAW' }, ['position']), '/groove/position'],
    ['a negative depth', () => withGroove({ depth: -0.5 }), '/groove/depth'],
    ['a fraction in metric', () => ({ ...withGroove({ depth: '1/2' }), units: 'metric', electrode: 'E49', parts: [{ thickness: 20, steel: 'S355' }] }), '/groove/depth'],
    ['a prepared part that does not exist', () => ({ ...withGroove({ part: 1 }), parts: [{ thickness: 1, steel: 'A992' }] }), '/groove/part'],
    ['three parts', () => ({ ...pjp(), parts: [{ thickness: 1, steel: 'A992' }, { thickness: 1, steel: 'A992' }, { thickness: 1, steel: 'A992' }] }), '/parts'],
    ['a missing method', () => { const b = pjp(); delete b.method; return b; }, '/method'],
  ];
  for (const [name, body, pointer] of cases) {
    it(`${name} → 400 at ${pointer}`, async () => {
      const res = await post(PJP, body());
      expect(res.statusCode).toBe(400);
      expect(res.headers['content-type']).toMatch(/application\/problem\+json/);
      expect(res.json().errors.map((e: { pointer: string }) => e.pointer)).toContain(pointer);
    });
  }

  it('CJP: an unknown field, a groove object (CJP takes none), a bad joint → 400', async () => {
    for (const [extra, pointer] of [
      [{ groove: { type: 'V-60' } }, '/groove'],
      [{ joint: 'lap' }, '/joint'],
      [{ cyclic: true }, '/cyclic'],
    ] as Array<[Body, string]>) {
      const res = await post(CJP, { ...cjp(), ...extra });
      expect(res.statusCode).toBe(400);
      expect(res.json().errors.map((e: { pointer: string }) => e.pointer)).toContain(pointer);
    }
  });
});

describe('422: the rules cannot answer', () => {
  it('SAW on a 45-degree bevel: PJP_NO_PREQUALIFIED_THROAT, asking for a qualified throat', async () => {
    const res = await post(PJP, withGroove({ process: 'SAW', position: 'flat' }));
    expect(res.statusCode).toBe(422);
    const body = res.json();
    expect(body.code).toBe('PJP_NO_PREQUALIFIED_THROAT');
    expect(body.detail).toMatch(/qualifiedThroat/);
    expect(res.headers['content-type']).toMatch(/application\/problem\+json/);
  });

  it('SMAW on a 60-degree bevel: no prequalified throat either (Table J2.1 lists that bevel for SAW only)', async () => {
    const res = await post(PJP, withGroove({ type: 'bevel-60' }));
    expect(res.statusCode).toBe(422);
    expect(res.json().code).toBe('PJP_NO_PREQUALIFIED_THROAT');
  });

  it('a flare groove by plain FCAW: the table needs FCAW-G or FCAW-S', async () => {
    const res = await post(PJP, withGroove({ type: 'flare-bevel', process: 'FCAW', radius: 1 }, ['depth']));
    expect(res.statusCode).toBe(422);
    expect(res.json().code).toBe('PJP_NO_PREQUALIFIED_THROAT');
  });

  it('a groove of 1/8 in by SMAW on a 45-degree bevel leaves no throat: PJP_GROOVE_TOO_SHALLOW at /groove/depth', async () => {
    const res = await post(PJP, withGroove({ depth: '1/8' }));
    expect(res.statusCode).toBe(422);
    expect(res.json().code).toBe('PJP_GROOVE_TOO_SHALLOW');
    expect(res.json().pointer).toBe('/groove/depth');
  });

  it('a catalogue steel beyond its thickness range', async () => {
    const b = cjp();
    b.parts = [{ thickness: 3, steel: 'A572-60' }];
    const res = await post(CJP, b);
    expect(res.statusCode).toBe(422);
    expect(res.json().code).toBe('MATERIAL_THICKNESS_OUT_OF_RANGE');
  });
});

describe('fuzz', () => {
  it('no PJP body built from the vocabulary answers anything but 200, 400 or 422', async () => {
    const len = fc.oneof(fc.double({ min: -1, max: 1e8, noNaN: true }), fc.constantFrom('1/2', '3/8', '0', 'x'));
    await fc.assert(
      fc.asyncProperty(
        fc.record(
          {
            method: fc.constantFrom('LRFD', 'ASD', 'X'),
            units: fc.constantFrom('imperial', 'metric'),
            electrode: fc.constantFrom('E70', 'E49', 'E110'),
            groove: fc.record(
              {
                type: fc.constantFrom('J', 'U', 'V-60', 'bevel-60', 'bevel-45', 'flare-bevel', 'flare-V'),
                process: fc.constantFrom('SMAW', 'GMAW', 'FCAW', 'FCAW-G', 'FCAW-S', 'SAW'),
                position: fc.constantFrom('flat', 'horizontal', 'vertical', 'overhead'),
                sides: fc.constantFrom(1, 2, 3),
                depth: len,
                radius: len,
                qualifiedThroat: len,
                part: fc.constantFrom(0, 1),
              },
              { requiredKeys: ['type', 'process'] },
            ),
            length: len,
            load: fc.record({ case: fc.constantFrom('tension-normal', 'shear', 'parallel', 'compression-not-bearing', 'compression-column-bearing'), force: fc.double({ min: -1, max: 1e10, noNaN: true }), cyclic: fc.boolean() }, { requiredKeys: ['case'] }),
            parts: fc.array(fc.record({ thickness: len, steel: fc.constantFrom('A992', 'S355', 'A36'), hss: fc.boolean() }), { minLength: 0, maxLength: 3 }),
          },
          { requiredKeys: ['method', 'groove', 'length', 'load', 'parts'] },
        ),
        async (body) => {
          const res = await post(PJP, body as Body);
          expect([200, 400, 422]).toContain(res.statusCode);
        },
      ),
      { numRuns: 120, seed: 11 },
    );
  });
});
