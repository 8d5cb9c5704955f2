/**
 * POST /v1/batch with format=html: one page, a summary row per item (id, status, utilization,
 * governing code), failing items first, each row linking to that item's sheet on the page.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { FastifyInstance } from 'fastify';
import { app as build } from '../helpers.js';
import { OPERATIONS } from '../../src/operations/index.js';
import { MAX_HTML_BATCH_ITEMS } from '../../src/report/batch-sheet.js';
import { all, attr, byAttr, byClass, byTag, parseHtml, sortedHash, text } from './html.js';

let app: FastifyInstance;
beforeAll(async () => {
  app = await build();
});
afterAll(async () => {
  await app.close();
});

const items: Array<Record<string, unknown>> = [
  ...OPERATIONS.flatMap((op) => Object.values(op.examples).map((ex) => ({ kind: op.kind, ...(ex.value as object) }))),
  // a 3/16 in fillet 4 in long cannot carry 80 kip: it fails
  { kind: 'fillet', id: 'WS-X99', method: 'LRFD', electrode: 'E70', welds: [{ size: '3/16', length: 4 }], parts: [{ thickness: 0.5, steel: 'A36' }], load: { force: 80 } },
  // no welds: not answered (400 in its slot)
  { kind: 'fillet', id: 'WS-BAD', method: 'LRFD' },
];

describe('batch as one HTML page', () => {
  let html: string;
  let json: { results: Array<Record<string, unknown>>; summary: { pass: number; fail: number; error: number } };

  beforeAll(async () => {
    const [h, j] = await Promise.all([
      app.inject({ method: 'POST', url: '/v1/batch?format=html', payload: items }),
      app.inject({ method: 'POST', url: '/v1/batch', payload: items }),
    ]);
    expect(h.statusCode).toBe(200);
    expect(h.headers['content-type']).toMatch(/^text\/html/);
    html = h.body;
    json = j.json();
  });

  it('parses without errors and has unique ids', () => {
    const { doc, errors } = parseHtml(html);
    expect(errors).toEqual([]);
    const ids = all(doc).map((e) => attr(e, 'id')).filter((x): x is string => x !== undefined);
    expect(new Set(ids).size).toBe(ids.length);
    expect(byTag(doc, 'script')).toEqual([]);
  });

  it('has one summary row per item, failing first, then the unanswered, then passing by utilization', () => {
    const { doc } = parseHtml(html);
    const rows = byTag(byClass(doc, 'batch')[0]!, 'tr').filter((r) => attr(r, 'data-index') !== undefined);
    expect(rows).toHaveLength(items.length);
    const outcomes = rows.map((r) => attr(r, 'data-outcome'));
    const rank = { fail: 0, error: 1, pass: 2 } as Record<string, number>;
    for (let i = 1; i < outcomes.length; i++) expect(rank[outcomes[i]!]).toBeGreaterThanOrEqual(rank[outcomes[i - 1]!]!);
    expect(outcomes.filter((o) => o === 'fail')).toHaveLength(json.summary.fail);
    expect(outcomes.filter((o) => o === 'error')).toHaveLength(json.summary.error);
    // each row agrees with the JSON result of the same item
    for (const r of rows) {
      const i = Number(attr(r, 'data-index'));
      const res = json.results[i]!;
      if (attr(r, 'data-outcome') === 'error') {
        expect(res.status).toBe(400);
        continue;
      }
      expect(text(byAttr(r, 'data-field', 'utilization')[0]!)).toBe((res.utilization as number).toFixed(3));
      expect(text(byAttr(r, 'data-field', 'governing')[0]!)).toBe((res.governing as { code: string }).code);
      if (res.id !== undefined) expect(text(r)).toContain(res.id as string);
    }
    // the failing fillet is the first row
    expect(text(rows[0]!)).toContain('WS-X99');
  });

  it('links every row to its own sheet on the page, and each sheet carries its own request hash', () => {
    const { doc } = parseHtml(html);
    const rows = byTag(byClass(doc, 'batch')[0]!, 'tr').filter((r) => attr(r, 'data-index') !== undefined);
    for (const r of rows) {
      const href = attr(byTag(r, 'a')[0]!, 'href')!;
      expect(href).toMatch(/^#item-\d+$/);
      const target = byAttr(doc, 'id', href.slice(1))[0];
      expect(target, href).toBeDefined();
      const i = Number(attr(r, 'data-index'));
      if (attr(r, 'data-outcome') !== 'error') {
        const { kind: _kind, ...body } = items[i]!;
        expect(attr(target!, 'data-request-sha256')).toBe(sortedHash(body));
        expect(byClass(target!, 'check').length).toBeGreaterThan(0);
      } else {
        expect(text(target!)).toContain('ERROR');
      }
    }
  });

  it('refuses more items than one page holds (413), and NDJSON (400)', async () => {
    const many = Array.from({ length: MAX_HTML_BATCH_ITEMS + 1 }, () => items[0]!);
    const r = await app.inject({ method: 'POST', url: '/v1/batch?format=html', payload: many });
    expect(r.statusCode).toBe(413);
    const nd = await app.inject({ method: 'POST', url: '/v1/batch?format=html', payload: `${JSON.stringify(items[0])}\n`, headers: { 'content-type': 'application/x-ndjson' } });
    expect(nd.statusCode).toBe(400);
  });
});
