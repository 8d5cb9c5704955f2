/**
 * POST /v1/batch as a BIM export pipeline uses it: thousands of mixed items, answered in order
 * under their ids, bad items answered on their own; NDJSON streamed both ways with limits.
 */
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { FastifyInstance } from 'fastify';
import { buildApp } from '../../src/app.js';

let app: FastifyInstance;
let port: number;
beforeAll(async () => {
  app = await buildApp({ config: { DOCS: false, BATCH_MAX_ITEMS: 20_000, BATCH_MAX_LINE: 4096, BATCH_BODY_LIMIT: 8 * 1024 * 1024 } });
  await app.listen({ host: '127.0.0.1', port: 0 });
  port = (app.server.address() as AddressInfo).port;
});
afterAll(async () => {
  await app.close();
});

const fillet = { kind: 'fillet', method: 'LRFD', electrode: 'E70', welds: [{ size: '5/16', length: 10 }], load: { force: 60 }, parts: [{ thickness: 1, steel: 'A992' }] };
const baseMetal = { kind: 'base-metal', method: 'ASD', part: { thickness: 0.5, steel: 'A36' }, lines: [{ length: 10 }], load: { force: 50 } };
const pjp = { kind: 'groove-pjp', method: 'LRFD', electrode: 'E70', groove: { type: 'bevel-45', depth: 0.5, process: 'SMAW', position: 'flat' }, length: 12, load: { case: 'shear', force: 20 }, parts: [{ thickness: 0.75, steel: 'A992' }, { thickness: 1, steel: 'A572-50' }] };
const plug = { kind: 'plug-slot', method: 'LRFD', electrode: 'E70', hole: { shape: 'plug', diameter: 0.8125, count: 2, spacing: 4 }, fill: 0.5, load: { force: 10 }, parts: [{ thickness: 0.5, steel: 'A36', hasHole: true }, { thickness: 0.625, steel: 'A36' }] };

/** 10,000 items of four kinds; every 97th is planted bad in one of three ways. */
function mixed(n: number): Array<Record<string, unknown>> {
  const kinds = [fillet, baseMetal, pjp, plug];
  const items: Array<Record<string, unknown>> = [];
  for (let i = 0; i < n; i++) {
    const item: Record<string, unknown> = { ...kinds[i % kinds.length]!, id: `WS-${i}` };
    if (i % 97 === 13) item.method = 'LSD'; // 400: not a method
    if (i % 97 === 47) item.kind = 'rivet'; // 400: not a kind
    if (i % 97 === 71) item.bogus = true; // 400: unknown field
    items.push(item);
  }
  return items;
}
const planted = (i: number): boolean => i % 97 === 13 || i % 97 === 47 || i % 97 === 71;

describe('JSON batch', () => {
  it('10,000 mixed items come back complete, in order, under their ids, planted bad items answered on their own', async () => {
    const items = mixed(10_000);
    const res = await app.inject({ method: 'POST', url: '/v1/batch', payload: items });
    expect(res.statusCode).toBe(200);
    const { results, summary } = res.json() as { results: Array<{ id?: string; status: unknown; index?: number; pointer?: string }>; summary: { items: number; pass: number; fail: number; error: number } };
    expect(results).toHaveLength(10_000);
    results.forEach((r, i) => {
      expect(r.id).toBe(`WS-${i}`);
      if (planted(i)) {
        expect(r.status).toBe(400);
        expect(r.index).toBe(i);
      } else {
        expect(['pass', 'fail']).toContain(r.status);
      }
    });
    const bad = items.filter((_, i) => planted(i)).length;
    expect(summary).toEqual({ items: 10_000, pass: summary.pass, fail: summary.fail, error: bad });
    expect(summary.pass + summary.fail).toBe(10_000 - bad);
  });

  it('each item answers exactly what its own route answers', async () => {
    const res = await app.inject({ method: 'POST', url: '/v1/batch', payload: [{ ...fillet, id: 'WS-B12' }] });
    const { kind: _k, ...body } = { ...fillet, id: 'WS-B12' };
    const single = await app.inject({ method: 'POST', url: '/v1/fillet/check', payload: body });
    expect(res.json().results[0]).toEqual(single.json());
  });

  it('ids=ifc validates ids as IFC GlobalIds', async () => {
    const res = await app.inject({ method: 'POST', url: '/v1/batch?ids=ifc', payload: [{ ...fillet, id: '3vB2YO$MX4xv5uCqZZG05x' }, { ...fillet, id: 'WS-B12' }, { ...fillet, id: '4vB2YO$MX4xv5uCqZZG05x' }] });
    const r = res.json().results;
    expect(r[0].status).toBe('pass'); // 22 characters of 0-9A-Za-z_$, first 0-3 (ISO 16739 GlobalId encoding, from memory)
    expect(r[1].status).toBe(400);
    expect(r[1].pointer ?? r[1].errors?.[0]?.pointer).toBe('/id');
    expect(r[2].status).toBe(400); // first character above 3 encodes more than 128 bits
  });

  it('a batch that is not an array, or has too many items, is refused whole', async () => {
    expect((await app.inject({ method: 'POST', url: '/v1/batch', payload: { items: [] } })).statusCode).toBe(400);
    const small = await buildApp({ config: { DOCS: false, BATCH_MAX_ITEMS: 3 } });
    const res = await small.inject({ method: 'POST', url: '/v1/batch', payload: [fillet, fillet, fillet, fillet] });
    expect(res.statusCode).toBe(413);
    expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
    await small.close();
  });
});

/** Sends NDJSON in pieces; resolves with the response lines and when the first one arrived. */
function streamBatch(pieces: string[], path = '/v1/batch', waitForFirst = false): Promise<{ status: number; lines: string[]; firstBeforeEnd: boolean }> {
  return new Promise((resolve, reject) => {
    let ended = false;
    let firstBeforeEnd = false;
    let text = '';
    let next = 0;
    const req = http.request({ host: '127.0.0.1', port, path, method: 'POST', headers: { 'content-type': 'application/x-ndjson' } }, (res) => {
      res.setEncoding('utf8');
      res.on('data', (chunk: string) => {
        if (text === '' && !ended) firstBeforeEnd = true;
        text += chunk;
        if (waitForFirst && next < pieces.length) send();
      });
      res.on('end', () => resolve({ status: res.statusCode ?? 0, lines: text.split('\n').filter((l) => l !== ''), firstBeforeEnd }));
    });
    req.on('error', reject);
    const send = (): void => {
      while (next < pieces.length) {
        req.write(pieces[next++]);
        if (waitForFirst && next === 1) return; // hold the rest until the first answer arrives
      }
      ended = true;
      req.end();
    };
    send();
  });
}

describe('NDJSON batch', () => {
  it('answers the first item before the upload has ended, then every line in order', async () => {
    const first = JSON.stringify({ ...fillet, id: 'WS-0' }) + '\n';
    const rest = Array.from({ length: 200 }, (_, i) => JSON.stringify({ ...fillet, id: `WS-${i + 1}` })).join('\n') + '\n';
    const r = await streamBatch([first, rest], '/v1/batch', true);
    expect(r.status).toBe(200);
    expect(r.firstBeforeEnd).toBe(true);
    expect(r.lines).toHaveLength(201);
    r.lines.forEach((l, i) => expect(JSON.parse(l).id).toBe(`WS-${i}`));
  });

  it('10,000 mixed lines come back complete and in order, with a malformed line answered on its own', async () => {
    const items = mixed(10_000).map((x) => JSON.stringify(x));
    items[5000] = '{"kind": "fillet", broken';
    const body = items.join('\n') + '\n';
    const pieces: string[] = [];
    for (let i = 0; i < body.length; i += 65_536) pieces.push(body.slice(i, i + 65_536)); // lines split across chunks
    const r = await streamBatch(pieces, '/v1/batch?summary=true');
    expect(r.lines).toHaveLength(10_001);
    const results = r.lines.slice(0, 10_000).map((l) => JSON.parse(l));
    results.forEach((x, i) => {
      if (i === 5000) expect(x.status).toBe(400);
      else expect(x.id).toBe(`WS-${i}`);
    });
    expect(JSON.parse(r.lines[10_000]!).summary.items).toBe(10_000);
  });

  it('a line longer than the limit is refused in its slot and the stream goes on', async () => {
    const long = JSON.stringify({ ...fillet, id: 'x'.repeat(5000) });
    const r = await streamBatch([JSON.stringify(fillet) + '\n' + long + '\n' + JSON.stringify(fillet) + '\n']);
    expect(r.lines).toHaveLength(3);
    expect(JSON.parse(r.lines[1]!).status).toBe(413);
    expect(JSON.parse(r.lines[2]!).status).toBe('pass');
  });

  it('a stream past the item limit ends with a problem line, cleanly', async () => {
    const small = await buildApp({ config: { DOCS: false, BATCH_MAX_ITEMS: 5 } });
    await small.listen({ host: '127.0.0.1', port: 0 });
    const smallPort = (small.server.address() as AddressInfo).port;
    const body = Array.from({ length: 50 }, () => JSON.stringify(fillet)).join('\n') + '\n';
    const r = await new Promise<{ status: number; lines: string[] }>((resolve, reject) => {
      const req = http.request({ host: '127.0.0.1', port: smallPort, path: '/v1/batch', method: 'POST', headers: { 'content-type': 'application/x-ndjson' } }, (res) => {
        let text = '';
        res.setEncoding('utf8');
        res.on('data', (c: string) => (text += c));
        res.on('end', () => resolve({ status: res.statusCode ?? 0, lines: text.split('\n').filter((l) => l !== '') }));
      });
      req.on('error', reject);
      req.end(body);
    });
    expect(r.status).toBe(200);
    expect(r.lines).toHaveLength(6);
    expect(JSON.parse(r.lines[5]!).problem.status).toBe(413);
    await small.close();
  });
});

describe('compact results (fields=)', () => {
  it('keeps only the named answer fields, in item order, with null where an answer has no such field', async () => {
    const res = await app.inject({ method: 'POST', url: '/v1/batch?fields=status,utilization,governing.code,values.throat', payload: [{ ...fillet, id: 'WS-1' }, { ...baseMetal, id: 'WS-2' }, { kind: 'nope', id: 'WS-3' }] });
    expect(res.statusCode).toBe(200);
    const [a, b, c] = res.json().results;
    const full = (await app.inject({ method: 'POST', url: '/v1/fillet/check', payload: { ...fillet, kind: undefined, id: 'WS-1' } })).json();
    expect(a).toEqual({ id: 'WS-1', kind: 'fillet', status: full.status, utilization: full.utilization, 'governing.code': full.governing.code, 'values.throat': full.values.throat });
    expect(b['values.throat']).toBeNull(); // the base-metal answer has no throat
    expect(c.status).toBe(400); // problems are unchanged
  });
  it('works on the NDJSON stream too, and refuses a malformed field list', async () => {
    const r = await streamBatch([JSON.stringify({ ...fillet, id: 'WS-9' }) + '\n'], '/v1/batch?fields=status');
    expect(JSON.parse(r.lines[0]!)).toEqual({ id: 'WS-9', kind: 'fillet', status: 'pass' });
    const bad = await app.inject({ method: 'POST', url: '/v1/batch?fields=status,(x)', payload: [fillet] });
    expect(bad.statusCode).toBe(400);
    expect(bad.json().errors[0].pointer).toBe('/fields');
  });
});

describe('a large JSON batch shares the event loop', () => {
  it('a health check sent while a 10,000-item batch is being answered returns first', async () => {
    const order: string[] = [];
    const batch = app.inject({ method: 'POST', url: '/v1/batch', payload: mixed(10_000) }).then(() => order.push('batch'));
    await new Promise((r) => setTimeout(r, 20)); // let the batch start
    const health = app.inject({ url: '/healthz' }).then(() => order.push('health'));
    await Promise.all([batch, health]);
    expect(order).toEqual(['health', 'batch']);
  });
});
