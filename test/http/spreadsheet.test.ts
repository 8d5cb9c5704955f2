/**
 * How spreadsheet clients use the service: short GET URLs, OPTIONS then HEAD then GET,
 * cacheable answers, one-value cells and range tables that fill a design table.
 */
import { createHash } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { FastifyInstance } from 'fastify';
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
const HOST = 'http://throatline.internal:3000';

describe('URLs of the common cases fit a spreadsheet web query (2,048 characters)', () => {
  const cases = {
    'fillet cell': `${BASE}&welds.0.size=5/16&format=value&field=utilization`,
    'fillet group of three lines with all options': `${BASE}&welds.0.size=5/16&welds.0.count=2&welds.0.endLoaded=true&welds.1.size=5/16&welds.1.length=6&welds.1.angle=90&lap=4&directionalIncrease=true&units=imperial&id=WS-B12&format=csv`,
    'fillet range table': `${BASE}&vary=welds.0.size&values=1/8,3/16,1/4,5/16,3/8,7/16,1/2,9/16,5/8&columns=status,utilization,governing.code,governing.available`,
    'PJP cell': '/v1/groove/pjp/check?method=LRFD&electrode=E70&groove.type=bevel-45&groove.depth=1/2&groove.process=SMAW&groove.position=vertical&length=12&load.case=tension-normal&load.force=40&parts.0.thickness=3/4&parts.0.steel=A992&parts.1.thickness=1&parts.1.steel=A572-50&format=value&field=utilization',
  };
  for (const [name, path] of Object.entries(cases)) {
    it(`${name}: ${(HOST + path).length} characters, and it answers 200`, async () => {
      expect((HOST + path).length).toBeLessThanOrEqual(2048); // the desktop spreadsheet's web-query limit (common practice, no source)
      const res = await app.inject({ url: path });
      expect(res.statusCode).toBe(200);
      expect(res.body.length).toBeLessThan(32767); // one cell holds at most 32,767 characters (common practice, no source)
    });
  }
});

describe('the probe sequence some spreadsheets send: OPTIONS, HEAD, GET', () => {
  const path = `${BASE}&welds.0.size=5/16&format=value&field=utilization`;
  it('OPTIONS answers 2xx with the allowed methods', async () => {
    const res = await app.inject({ method: 'OPTIONS', url: path });
    expect(res.statusCode).toBeGreaterThanOrEqual(200);
    expect(res.statusCode).toBeLessThan(300);
    expect(res.headers.allow).toContain('GET');
  });
  it('HEAD answers 200 with the headers of the GET and no body', async () => {
    const head = await app.inject({ method: 'HEAD', url: path });
    const get = await app.inject({ method: 'GET', url: path });
    expect(head.statusCode).toBe(200);
    expect(head.body).toBe('');
    expect(head.headers.etag).toBe(get.headers.etag);
    expect(head.headers['content-type']).toBe(get.headers['content-type']);
  });
  it('GET answers one bare number: 0.75·0.6·70·(5/16)·0.7071·10 = 69.6 kip available, so 30/69.6 = 0.431', async () => {
    const res = await app.inject({ url: path });
    expect(res.headers['content-type']).toMatch(/^text\/plain/);
    expect(Number(res.body)).toBeCloseTo(30 / 69.6, 3); // 1.392 kip/in per sixteenth (common practice) × 5 × 10 in
  });
});

describe('caching', () => {
  const path = `${BASE}&welds.0.size=1/4`;
  it('identical queries get the same strong ETag and a Cache-Control lifetime', async () => {
    const a = await app.inject({ url: path });
    const b = await app.inject({ url: path });
    expect(a.headers.etag).toMatch(/^"[A-Za-z0-9_-]+"$/);
    expect(a.headers.etag).toBe(b.headers.etag);
    // the SHA-1 of the body's bytes in base64url (RFC 4648 §5), by the incremental hash API
    expect(a.headers.etag).toBe(`"${createHash('sha1').update(a.rawPayload).digest('base64url')}"`);
    expect(a.headers['cache-control']).toMatch(/max-age=\d+/);
  });
  it('a matching If-None-Match answers 304 with no body; another query has another ETag', async () => {
    const a = await app.inject({ url: path });
    const again = await app.inject({ url: path, headers: { 'if-none-match': String(a.headers.etag) } });
    expect(again.statusCode).toBe(304);
    expect(again.body).toBe('');
    const other = await app.inject({ url: `${BASE}&welds.0.size=5/16` });
    expect(other.headers.etag).not.toBe(a.headers.etag);
  });
  it('errors are not cached', async () => {
    const res = await app.inject({ url: '/v1/fillet/check?method=LRFD' });
    expect(res.statusCode).toBe(400);
    expect(res.headers.etag).toBeUndefined();
  });
});

describe('range tables', () => {
  it('vary one input over a list: one CSV row per value, in order', async () => {
    const res = await app.inject({ url: `${BASE}&vary=welds.0.size&values=1/8,3/16,1/4,5/16` });
    expect(res.statusCode).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/csv/);
    const lines = res.body.trim().split('\r\n').map((l) => l.split(','));
    expect(lines[0]).toEqual(['welds.0.size', 'status', 'utilization', 'governing.code', 'governing.available', 'governing.demand']);
    expect(lines.slice(1).map((l) => l[0])).toEqual(['1/8', '3/16', '1/4', '5/16']);
    // LRFD E70, 10 in: 1.392 kip/in per sixteenth × D × 10 (common practice, no source)
    const expected = [2, 3, 4, 5].map((d) => 1.392 * d * 10);
    lines.slice(1).forEach((l, i) => expect(Number(l[4]) / expected[i]!).toBeCloseTo(1, 3));
    // 1/8 in is below the 3/16 in minimum for a 1/2 in part (Table J2.4, from memory) and 30 > 27.84: fail
    expect(lines[1]![1]).toBe('fail');
    expect(lines[2]![1]).toBe('pass');
  });
  it('columns= picks the columns; format=json gives numbers', async () => {
    const res = await app.inject({ url: `${BASE.replace('&welds.0.length=10', '')}&vary=welds.0.length&values=4,8&columns=checks.FILLET_WELD_METAL.available&format=json&welds.0.size=1/4` });
    expect(res.statusCode).toBe(200);
    const t = res.json() as { rows: Array<{ value: string; cells: number[] }> };
    expect(t.rows.map((r) => r.value)).toEqual(['4', '8']);
    expect(t.rows[0]!.cells[0]).toBeCloseTo(1.392 * 4 * 4, 1); // 22.27 kip
    expect(t.rows[1]!.cells[0]).toBeCloseTo(1.392 * 4 * 8, 1); // 44.54 kip
  });
  it('a value the schema refuses fails the table with a pointer at that value', async () => {
    const res = await app.inject({ url: `${BASE}&vary=welds.0.size&values=1/4,abc` });
    expect(res.statusCode).toBe(400);
    expect(res.json().errors[0].pointer).toBe('/values/1');
  });
  it('a value the rules cannot answer marks its row and keeps the others', async () => {
    const res = await app.inject({ url: '/v1/fillet/check?method=LRFD&electrode=E49&welds.0.size=6&welds.0.length=100&parts.0.steel=S355&vary=parts.0.thickness&values=20,100&units=metric' });
    expect(res.statusCode).toBe(200);
    const rows = res.body.trim().split('\r\n').slice(1).map((l) => l.split(','));
    expect(rows[0]![1]).not.toMatch(/^error/);
    expect(rows[1]![1]).toBe('error:MATERIAL_THICKNESS_OUT_OF_RANGE'); // S355 bands stop at 80 mm (EN 1993-1-1 Table 3.1, from memory)
  });
  it('the varied input may not also be given on its own, and values need vary', async () => {
    expect((await app.inject({ url: `${BASE}&welds.0.size=1/4&vary=welds.0.size&values=1/4` })).statusCode).toBe(400);
    expect((await app.inject({ url: `${BASE}&welds.0.size=1/4&values=1/4` })).statusCode).toBe(400);
  });
});

describe('value cells through a group that is null in this answer', () => {
  it('read as an empty value, not as an unknown field', async () => {
    // A load through the centroid has no instantaneous centre: values.centre is null.
    const url = '/v1/weld-group/eccentric?method=LRFD&electrode=E70&size=1/4&segments.0.from=0,0&segments.0.to=0,10&segments.1.from=5,0&segments.1.to=5,10&load.fx=0&load.fy=-30&load.at=2.5,5&format=value&field=values.centre.0';
    const res = await app.inject({ url });
    expect(res.statusCode).toBe(200);
    expect(res.body).toBe('');
  });
});
