/**
 * Compact batch results (`fields=`): for any list of fields, each result is exactly the object
 * `{ id?, kind, <field>: value }` that the full answer gives, with null where the answer has no
 * such field or the field names a group; a repeated field, or one named id or kind, keeps the
 * object's rule (one key, in its first place, holding the last value). The reference below is
 * written here from the full answers, not with the service's projection.
 */
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { FastifyInstance } from 'fastify';
import { buildApp } from '../../src/app.js';

let app: FastifyInstance;
beforeAll(async () => {
  app = await buildApp({ config: { DOCS: false } });
});
afterAll(async () => {
  await app.close();
});

const fillet = { method: 'LRFD', electrode: 'E70', welds: [{ size: '1/4', length: 4 }], load: { force: 10 }, parts: [{ thickness: 0.5, steel: 'A36' }] };
const items = [
  { kind: 'fillet', id: 'WS-F1', ...fillet },
  { kind: 'fillet', ...fillet, load: { force: 40 } },
  { kind: 'weld-group', id: 'WS-G\u00e9', method: 'LRFD', electrode: 'E70', size: '1/4', segments: [{ from: [0, 0], to: [0, 10] }], load: { fx: 0, fy: -10, at: [3, 5] } },
];

/** Reference: the value at a dotted path of a full answer, the way the API documents it. */
function valueAt(answer: unknown, field: string): unknown {
  let node: unknown = answer;
  for (const seg of field.split('.')) {
    if (Array.isArray(node)) node = /^\d+$/.test(seg) ? node[Number(seg)] : node.find((x) => x && typeof x === 'object' && (x as { code?: string }).code === seg);
    else if (node !== null && typeof node === 'object' && Object.prototype.hasOwnProperty.call(node, seg)) node = (node as Record<string, unknown>)[seg];
    else return null;
    if (node === undefined) return null;
    if (node === null) return null;
  }
  return node !== null && typeof node === 'object' ? null : node;
}

const FIELD_POOL = ['status', 'utilization', 'governing.code', 'governing.ratio', 'checks.0.code', 'checks.FILLET_WELD_METAL.available', 'values.size', 'values.fexx', 'values', 'nothing.here', 'id', 'kind', 'units.force'];

describe('compact batch results', () => {
  it('equal the object made from the full answer, for any list of fields (property)', async () => {
    const full = await app.inject({ method: 'POST', url: '/v1/batch', headers: { 'content-type': 'application/json' }, payload: items });
    const answers = (full.json() as { results: unknown[] }).results;
    await fc.assert(
      fc.asyncProperty(fc.array(fc.constantFrom(...FIELD_POOL), { minLength: 1, maxLength: 6 }), async (fields) => {
        const res = await app.inject({ method: 'POST', url: `/v1/batch?fields=${fields.join(',')}`, headers: { 'content-type': 'application/json' }, payload: items });
        expect(res.statusCode).toBe(200);
        const results = (res.json() as { results: unknown[] }).results;
        const text = res.body;
        results.forEach((r, i) => {
          const expected: Record<string, unknown> = {};
          const item = items[i] as { id?: string; kind: string };
          if (item.id !== undefined) expected.id = item.id;
          expected.kind = item.kind;
          for (const f of fields) expected[f] = valueAt(answers[i], f);
          expect(r).toEqual(expected);
          expect(Object.keys(r as object)).toEqual(Object.keys(expected));
        });
        // one key per name in the text as well (JSON.parse would hide a repeated key)
        for (const f of new Set([...fields, 'kind', 'id'])) {
          const withKey = results.filter((r) => Object.prototype.hasOwnProperty.call(r, f)).length;
          expect(text.split(`"${f}":`).length - 1, f).toBe(withKey);
        }
      }),
      { numRuns: 60, seed: 20261202 },
    );
  });
});
