/**
 * Strict limits on what a request may cost: body size, JSON nesting depth and time.
 */
import { connect } from 'node:net';
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { FastifyInstance } from 'fastify';
import { buildApp } from '../../src/app.js';
import { batchBodyFault, nestsDeeperThan, type BatchFault } from '../../src/plugins/json-body.js';

let app: FastifyInstance;
beforeAll(async () => {
  app = await buildApp({ config: { DOCS: false, BODY_LIMIT: 4096, JSON_MAX_DEPTH: 8, BATCH_BODY_LIMIT: 65536 } });
});
afterAll(async () => {
  await app.close();
});

const postJson = (url: string, payload: string) => app.inject({ method: 'POST', url, headers: { 'content-type': 'application/json' }, payload });

describe('body size', () => {
  it('a body over BODY_LIMIT is a 413 problem document', async () => {
    const res = await postJson('/v1/fillet/check', JSON.stringify({ method: 'LRFD', id: 'x'.repeat(5000) }));
    expect(res.statusCode).toBe(413);
    expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
    expect(res.json()).toMatchObject({ type: 'urn:throatline:problem:body-too-large', status: 413 });
  });

  it('the batch route has its own, larger limit', async () => {
    const item = { kind: 'fillet', method: 'LRFD', electrode: 'E70', welds: [{ size: 0.25, length: 4 }], load: { force: 10 }, parts: [{ thickness: 0.5, steel: 'A36' }] };
    const body = JSON.stringify(Array.from({ length: 50 }, () => item)); // about 6 kB: over BODY_LIMIT, under BATCH_BODY_LIMIT
    expect(body.length).toBeGreaterThan(4096);
    expect((await postJson('/v1/batch', body)).statusCode).toBe(200);
    expect((await postJson('/v1/batch', JSON.stringify(Array.from({ length: 600 }, () => item)))).statusCode).toBe(413);
  });
});

describe('batch bodies counted before parsing', () => {
  /**
   * Reference, written here: walk the value in the order JSON.stringify writes it and report the
   * first limit broken, as a reader of the text meets it: a container opened deeper than
   * maxDepth; the top-level array reaching item maxItems (0-based); an inner container reaching
   * member maxMembers, with the index of the item it is in.
   */
  function reference(value: unknown, maxDepth: number, maxItems: number, maxMembers: number): BatchFault | null {
    let item = 0;
    const walk = (v: unknown, depth: number): BatchFault | null => {
      if (v === null || typeof v !== 'object') return null;
      const d = depth + 1;
      if (d > maxDepth) return { kind: 'deep' };
      const members = Array.isArray(v) ? v : Object.values(v as Record<string, unknown>);
      for (let k = 0; k < members.length; k++) {
        if (k > 0 && d === 1) {
          item = k;
          if (k >= maxItems) return { kind: 'items' };
        } else if (k > 0 && k >= maxMembers) {
          return { kind: 'wide', item };
        }
        const f = walk(members[k], d);
        if (f) return f;
      }
      return null;
    };
    return walk(value, 0);
  }

  it('the scan finds the same first fault as a walk of the value (property)', () => {
    const tricky = fc.string({ unit: fc.constantFrom('\\', '"', '[', '{', ']', '}', ',', 'a'), maxLength: 8 });
    const leaf = fc.oneof(tricky, fc.integer(), fc.constant(null));
    const value = fc.letrec((tie) => ({
      node: fc.oneof({ depthSize: 'small' }, leaf, fc.array(tie('node'), { maxLength: 6 }), fc.dictionary(tricky, tie('node'), { maxKeys: 6 })),
    })).node;
    fc.assert(
      fc.property(fc.array(value, { maxLength: 8 }), fc.integer({ min: 1, max: 6 }), fc.integer({ min: 1, max: 7 }), fc.integer({ min: 1, max: 5 }), (items, maxDepth, maxItems, maxMembers) => {
        expect(batchBodyFault(JSON.stringify(items), maxDepth, maxItems, maxMembers)).toEqual(reference(items, maxDepth, maxItems, maxMembers));
      }),
      { numRuns: 2000 },
    );
  });

  it('refuses more items than BATCH_MAX_ITEMS, and an inner list of over 1,000 members naming its item, before parsing', async () => {
    const small = await buildApp({ config: { DOCS: false, BATCH_MAX_ITEMS: 3 } });
    const item = { kind: 'fillet', method: 'LRFD', electrode: 'E70', welds: [{ size: 0.25, length: 4 }], load: { force: 10 }, parts: [{ thickness: 0.5, steel: 'A36' }] };
    const many = await small.inject({ method: 'POST', url: '/v1/batch', headers: { 'content-type': 'application/json' }, payload: JSON.stringify([item, item, item, item]) });
    expect(many.statusCode).toBe(413);
    expect(many.json()).toMatchObject({ type: 'urn:throatline:problem:batch-too-large', status: 413 });
    // 1,001 welds in item 1 (the schema allows 50): refused on the text, with the item's pointer.
    const wide = { ...item, welds: Array.from({ length: 1001 }, () => ({ size: 0.25, length: 4 })) };
    const res = await small.inject({ method: 'POST', url: '/v1/batch', headers: { 'content-type': 'application/json' }, payload: JSON.stringify([item, wide]) });
    expect(res.statusCode).toBe(400);
    expect(res.json()).toMatchObject({ type: 'urn:throatline:problem:too-wide', errors: [{ pointer: '/1' }] });
    // 1,000 members is still read (and the item refused by its schema, the others answered).
    const thousand = { ...item, welds: Array.from({ length: 1000 }, () => ({ size: 0.25, length: 4 })) };
    const ok = await small.inject({ method: 'POST', url: '/v1/batch', headers: { 'content-type': 'application/json' }, payload: JSON.stringify([item, thousand]) });
    expect(ok.statusCode).toBe(200);
    expect((ok.json() as { summary: object }).summary).toEqual({ items: 2, pass: 1, fail: 0, error: 1 });
    await small.close();
  });
});

describe('JSON depth', () => {
  const nested = (depth: number) => `${'['.repeat(depth)}${']'.repeat(depth)}`;

  it('deeper than JSON_MAX_DEPTH is a 400 problem naming the limit', async () => {
    for (const body of [nested(9), `{"method":"LRFD","welds":${nested(20)}}`, nested(2000)]) {
      const res = await postJson('/v1/fillet/check', body);
      expect(res.statusCode).toBe(400);
      expect(res.json()).toMatchObject({ type: 'urn:throatline:problem:too-deep', status: 400 });
      expect(res.json().detail).toMatch(/deeper than 8 levels/);
    }
  });

  it('exactly JSON_MAX_DEPTH passes the depth check (and meets the schema, a plain 400)', async () => {
    const res = await postJson('/v1/fillet/check', nested(8));
    expect(res.statusCode).toBe(400);
    expect(res.json().type).toBe('urn:throatline:problem:invalid-request');
  });

  it('brackets inside strings do not count, escaped quotes included', async () => {
    const id = `${'['.repeat(50)}\\"${'{'.repeat(50)}`;
    const res = await postJson('/v1/fillet/check', `{"method":"LRFD","id":"${id}"}`);
    expect(res.json().type).not.toBe('urn:throatline:problem:too-deep');
  });

  it('applies to batch bodies too', async () => {
    const res = await postJson('/v1/batch', `[${nested(8)}]`);
    expect(res.json().type).toBe('urn:throatline:problem:too-deep');
  });

  it('the scan agrees with the depth of any JSON value (property)', () => {
    // Reference depth, written here: arrays and objects count one level each.
    const depthOf = (v: unknown): number =>
      v !== null && typeof v === 'object' ? 1 + Math.max(0, ...Object.values(v as Record<string, unknown>).map(depthOf)) : 0;
    fc.assert(
      fc.property(fc.jsonValue({ maxDepth: 12 }), fc.integer({ min: 0, max: 14 }), (value, max) => {
        const text = JSON.stringify(value);
        expect(nestsDeeperThan(text, max)).toBe(depthOf(value) > max);
      }),
      { numRuns: 500 },
    );
  });

  it('strings made of brackets, quotes and runs of backslashes never count (property)', () => {
    const depthOf = (v: unknown): number =>
      v !== null && typeof v === 'object' ? 1 + Math.max(0, ...Object.values(v as Record<string, unknown>).map(depthOf)) : 0;
    const tricky = fc.string({ unit: fc.constantFrom('\\', '"', '[', '{', ']', '}', 'a'), maxLength: 12 });
    const value = fc.letrec((tie) => ({
      node: fc.oneof({ depthSize: 'small' }, tricky, fc.array(tie('node'), { maxLength: 3 }), fc.dictionary(tricky, tie('node'), { maxKeys: 3 })),
    })).node;
    fc.assert(
      fc.property(value, fc.integer({ min: 0, max: 8 }), (v, max) => {
        expect(nestsDeeperThan(JSON.stringify(v), max)).toBe(depthOf(v) > max);
      }),
      { numRuns: 1000 },
    );
    // Unterminated strings (refused by the parser afterwards) are not deeper than anything.
    expect(nestsDeeperThan('[[["\\\\\\"[[[[[[[[[[', 3)).toBe(false);
    expect(nestsDeeperThan('[[[[["ab', 3)).toBe(true);
  });

  it('prototype poisoning is still refused by the framework parser behind the depth check', async () => {
    const res = await postJson('/v1/fillet/check', '{"method":"LRFD","__proto__":{"polluted":true}}');
    expect(res.statusCode).toBe(400);
    expect(({} as Record<string, unknown>).polluted).toBeUndefined();
  });
});

describe('request timeout', () => {
  it('a body that stops arriving gets a 408 problem document once REQUEST_TIMEOUT_MS has passed', async () => {
    const slow = await buildApp({ config: { DOCS: false, REQUEST_TIMEOUT_MS: 300, BATCH_TIMEOUT_MS: 600 } });
    try {
      await slow.listen({ host: '127.0.0.1', port: 0 });
      const { port } = slow.server.address() as { port: number };
      const answer = await new Promise<string>((resolve, reject) => {
        const socket = connect(port, '127.0.0.1', () => {
          socket.write('POST /v1/fillet/check HTTP/1.1\r\nhost: x\r\ncontent-type: application/json\r\ncontent-length: 200\r\n\r\n{"method":');
        });
        let text = '';
        socket.on('data', (d) => (text += d.toString('utf8')));
        socket.on('end', () => resolve(text));
        socket.on('close', () => resolve(text));
        socket.on('error', reject);
        setTimeout(() => socket.destroy(), 20000).unref();
      });
      expect(answer).toMatch(/^HTTP\/1\.1 408 /);
      expect(answer).toMatch(/\r\nconnection: close\r\n/i);
      expect(answer).toMatch(/content-type: application\/problem\+json/i);
      const body = JSON.parse(answer.slice(answer.indexOf('\r\n\r\n') + 4)) as { type: string; status: number };
      expect(body).toMatchObject({ type: 'urn:throatline:problem:request-timeout', status: 408 });
    } finally {
      await slow.close();
    }
  });
});
