/**
 * JSON batches are answered a slice of results at a time (routes/v1/batch.ts, 256 items per
 * slice, each slice encoded to UTF-8 as its results are made): whatever the item count, the
 * answer is one valid JSON document with every result in item order and the summary counts of
 * the items (hand-counted below), and text outside ASCII arrives intact whichever slice holds it.
 */
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

// A 1/4 in E70 fillet 4 in long on 1/2 in A36 carries about 22 kip in LRFD (0.75 × 0.6 × 70 ×
// 0.177 × 4 = 22.3 kip, hand arithmetic): 10 kip passes, 40 kip fails. Every third item has a
// negative force, which the schema refuses (a problem document in its slot).
const ok = { kind: 'fillet', method: 'LRFD', electrode: 'E70', welds: [{ size: '1/4', length: 4 }], load: { force: 10 }, parts: [{ thickness: 0.5, steel: 'A36' }] };
const over = { ...ok, load: { force: 40 } };
const bad = { ...ok, load: { force: -1 } };
const itemAt = (i: number) => ({ ...(i % 3 === 0 ? ok : i % 3 === 1 ? over : bad), id: `WS-${i}` });

describe('JSON batch slices', () => {
  for (const n of [0, 1, 255, 256, 257, 511, 512, 513, 1000]) {
    it(`${n} items: one JSON document, results in order, summary counted`, async () => {
      const items = Array.from({ length: n }, (_, i) => itemAt(i));
      const res = await app.inject({ method: 'POST', url: '/v1/batch', headers: { 'content-type': 'application/json' }, payload: items });
      expect(res.statusCode).toBe(200);
      const body = res.json() as { results: Array<{ id?: string; status?: string; index?: number }>; summary: Record<string, number> };
      expect(body.results).toHaveLength(n);
      body.results.forEach((r, i) => expect(r.id).toBe(`WS-${i}`));
      const pass = Math.ceil(n / 3);
      const fail = Math.max(0, Math.ceil((n - 1) / 3));
      expect(body.summary).toEqual({ items: n, pass, fail, error: n - pass - fail });
      body.results.forEach((r, i) => {
        if (i % 3 === 0) expect(r.status).toBe('pass');
        if (i % 3 === 1) expect(r.status).toBe('fail');
        if (i % 3 === 2) expect(r.index).toBe(i);
      });
    });
  }

  it('ids outside ASCII (accents, CJK, an astral-plane character) come back byte for byte, in NDJSON too', async () => {
    const ids = ['Träger-Ø12', '梁-3F-07', 'WS-\u{1F529}', 'plain'];
    const items = Array.from({ length: 600 }, (_, i) => ({ ...ok, id: `${ids[i % ids.length]}-${i}` }));
    const res = await app.inject({ method: 'POST', url: '/v1/batch', headers: { 'content-type': 'application/json' }, payload: items });
    expect(res.statusCode).toBe(200);
    const body = res.json() as { results: Array<{ id: string }> };
    expect(body.results.map((r) => r.id)).toEqual(items.map((it) => it.id));
    // The same through NDJSON, and compact results, which are serialized another way.
    const nd = await app.inject({ method: 'POST', url: '/v1/batch?fields=status', headers: { 'content-type': 'application/x-ndjson' }, payload: items.map((it) => JSON.stringify(it)).join('\n') });
    expect(nd.statusCode).toBe(200);
    const lines = nd.body.trim().split('\n').map((l) => JSON.parse(l) as { id: string; status: string });
    expect(lines.map((l) => l.id)).toEqual(items.map((it) => it.id));
    expect(new Set(lines.map((l) => l.status))).toEqual(new Set(['pass']));
  });
});
