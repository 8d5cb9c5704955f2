/**
 * Range tables as XML (vary=...&format=xml): one <row> per value and one element per column,
 * so a spreadsheet's FILTERXML(WEBSERVICE(url), "//row/utilization") fills a column with one
 * formula (test/e2e/libreoffice.test.ts does that in a real spreadsheet engine).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { FastifyInstance } from 'fastify';
import { RequestFieldError } from '../../src/operations/shared.js';
import { rangeXml } from '../../src/range.js';
import { app as build } from '../helpers.js';

let app: FastifyInstance;
beforeAll(async () => {
  app = await build();
});
afterAll(async () => {
  await app.close();
});

const BASE =
  '/v1/fillet/check?method=LRFD&electrode=E70&welds.0.length=10&load.force=30' +
  '&parts.0.thickness=1/2&parts.0.steel=A36&parts.1.thickness=3/4&parts.1.steel=A36';

/** The rows of the table as arrays of [element name, text] pairs (a strict reading of our own layout). */
function rowsOf(xml: string): Array<Array<[string, string]>> {
  const body = xml.match(/^<\?xml version="1\.0" encoding="UTF-8"\?>\n<table vary="[^"]*">\n([\s\S]*)\n<\/table>\n$/);
  if (!body) throw new Error(`not the table layout: ${xml.slice(0, 200)}`);
  return body[1]!.split('\n').map((line) => {
    const row = line.match(/^<row>(.*)<\/row>$/);
    if (!row) throw new Error(`not a row: ${line}`);
    return [...row[1]!.matchAll(/<([A-Za-z_][\w.-]*)>([^<]*)<\/\1>|<([A-Za-z_][\w.-]*)\/>/g)].map((m) => (m[3] ? [m[3], ''] : [m[1]!, m[2]!]) as [string, string]);
  });
}

describe('GET range table, format=xml', () => {
  it('answers application/xml with one row per value in order, one element per column', async () => {
    const res = await app.inject({ url: `${BASE}&vary=welds.0.size&values=1/8,3/16,1/4,5/16&columns=status,utilization,governing.code&format=xml` });
    expect(res.statusCode).toBe(200);
    expect(res.headers['content-type']).toMatch(/^application\/xml/);
    expect(res.body).toMatch(/<table vary="welds\.0\.size">/);
    const rows = rowsOf(res.body);
    expect(rows.map((r) => r.map(([name]) => name))).toEqual(Array(4).fill(['welds.0.size', 'status', 'utilization', 'governing.code']));
    expect(rows.map((r) => r[0]![1])).toEqual(['1/8', '3/16', '1/4', '5/16']);
    // LRFD E70, 10 in: 1.392 kip/in per sixteenth × D × 10 (common practice, no source); 30 kip demand
    rows.forEach((r, i) => expect(Number(r[2]![1]) / (30 / (1.392 * (i + 2) * 10))).toBeCloseTo(1, 3));
    // 1/8 in: under the 3/16 in minimum for a 1/2 in part (Table J2.4, from memory) and 30 > 27.84 kip
    expect(rows.map((r) => r[1]![1])).toEqual(['fail', 'pass', 'pass', 'pass']);
    expect(rows.every((r) => r[3]![1] === 'FILLET_WELD_METAL')).toBe(true);
  });

  it('holds the same cells as the CSV form of the same table', async () => {
    const q = `${BASE}&vary=welds.0.size&values=3/16,1/4,3/8&columns=status,utilization,governing.available,checks.FILLET_WELD_METAL.ratio`;
    const csv = (await app.inject({ url: q })).body.trim().split('\r\n').map((l) => l.split(','));
    const xml = rowsOf((await app.inject({ url: `${q}&format=xml` })).body);
    expect(xml.map((r) => r.map(([, text]) => text))).toEqual(csv.slice(1));
    expect(xml[0]!.map(([name]) => name)).toEqual(csv[0]);
  });

  it('a row the rules cannot answer has its code in status and empty number elements', async () => {
    const res = await app.inject({ url: '/v1/fillet/check?method=LRFD&electrode=E49&welds.0.size=6&welds.0.length=100&parts.0.steel=S355&vary=parts.0.thickness&values=20,100&units=metric&columns=status,utilization&format=xml' });
    expect(res.statusCode).toBe(200);
    const rows = rowsOf(res.body);
    expect(rows[1]).toEqual([['parts.0.thickness', '100'], ['status', 'error:MATERIAL_THICKNESS_OUT_OF_RANGE'], ['utilization', '']]); // S355 bands stop at 80 mm (EN 1993-1-1 Table 3.1, from memory)
    expect(res.body).toContain('<utilization/>');
  });

  it('escapes text: an echoed id with markup characters stays text', async () => {
    const res = await app.inject({ url: `${BASE}&id=${encodeURIComponent('WS-B12 <gusset> & "flange"')}&vary=welds.0.size&values=1/4&columns=id,status&format=xml` });
    expect(res.statusCode).toBe(200);
    expect(res.body).toContain('<id>WS-B12 &lt;gusset&gt; &amp; &quot;flange&quot;</id>');
  });

  it('format=xml is for range tables only: without vary= it is a 400 pointing at /format', async () => {
    const res = await app.inject({ url: `${BASE}&welds.0.size=1/4&format=xml` });
    expect(res.statusCode).toBe(400);
    expect(res.json().errors[0].pointer).toBe('/format');
  });

  it('the contract lists xml among the GET formats and application/xml among its answers', () => {
    const doc = app.swagger() as unknown as { paths: Record<string, { get: { parameters: Array<{ name: string; schema: { enum?: string[] } }>; responses: Record<string, { content: Record<string, unknown> }> } }> };
    const get = doc.paths['/v1/fillet/check']!.get;
    expect(get.parameters.find((p) => p.name === 'format')!.schema.enum).toContain('xml');
    expect(Object.keys(get.responses['200']!.content)).toContain('application/xml');
  });
});

describe('rangeXml', () => {
  it('refuses a column name that cannot name an XML element', () => {
    expect(() => rangeXml({ vary: 'welds.0.size', columns: ['1st'], rows: [] })).toThrow(RequestFieldError);
    expect(() => rangeXml({ vary: 'welds.0.size', columns: ['a b'], rows: [] })).toThrow(RequestFieldError);
  });
  it('an empty table is a table element with no rows', () => {
    expect(rangeXml({ vary: 'welds.0.size', columns: ['status'], rows: [] })).toBe('<?xml version="1.0" encoding="UTF-8"?>\n<table vary="welds.0.size">\n</table>\n');
  });
});
