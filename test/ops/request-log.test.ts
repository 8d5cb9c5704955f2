/**
 * The request log (plugins/request-log.ts): one JSON line per request with the fields an
 * operator follows traffic by, no query string and no body; routes that log at warn write
 * nothing on success; errors go through the logger with the request id; a request's child
 * logger exists only once something logs through it.
 */
import { Writable } from 'node:stream';
import pino from 'pino';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { FastifyInstance } from 'fastify';
import { buildApp } from '../../src/app.js';
import { LazyChildLogger } from '../../src/plugins/request-log.js';

const lines: Array<Record<string, unknown>> = [];
const sink = new Writable({
  write(chunk: Buffer, _enc, done) {
    for (const l of chunk.toString('utf8').split('\n')) if (l.trim() !== '') lines.push(JSON.parse(l) as Record<string, unknown>);
    done();
  },
});

let app: FastifyInstance;
beforeAll(async () => {
  app = await buildApp({ config: { DOCS: false }, loggerInstance: pino({ level: 'info' }, sink) });
});
afterAll(async () => {
  await app.close();
});

const FILLET = { method: 'LRFD', electrode: 'E70', welds: [{ size: '5/16', length: 10 }], load: { force: 50 }, parts: [{ thickness: 0.5, steel: 'A36' }] };

describe('request log', () => {
  it('writes one line per answered request: reqId, method, path without query, status, ms', async () => {
    lines.length = 0;
    const res = await app.inject({ method: 'POST', url: '/v1/fillet/check?format=json', headers: { 'content-type': 'application/json', 'x-request-id': 'ws-0042' }, payload: FILLET });
    expect(res.statusCode).toBe(200);
    const requestLines = lines.filter((l) => l.msg === 'request');
    expect(requestLines).toHaveLength(1);
    const l = requestLines[0]!;
    expect(l).toMatchObject({ level: 30, reqId: 'ws-0042', method: 'POST', path: '/v1/fillet/check', status: 200, msg: 'request' });
    expect(typeof l.time).toBe('number');
    expect(typeof l.pid).toBe('number');
    expect(typeof l.ms).toBe('number');
    // Nothing of the body or the query reaches the log.
    expect(JSON.stringify(lines)).not.toContain('A36');
    expect(JSON.stringify(lines)).not.toContain('format=json');
  });

  it('an odd path still gives a valid JSON line (the sink parses every line)', async () => {
    lines.length = 0;
    await app.inject({ method: 'GET', url: '/v1/"quoted"\\path/\u00e9' });
    const l = lines.find((x) => x.msg === 'request');
    expect(l).toMatchObject({ method: 'GET', status: 404 });
    expect(String(l?.path)).toMatch(/^\/v1\/%22quoted%22/);
  });

  it('routes that log at warn (metrics, OPTIONS probes) write no line when they succeed', async () => {
    lines.length = 0;
    expect((await app.inject({ method: 'GET', url: '/metrics' })).statusCode).toBe(200);
    expect((await app.inject({ method: 'OPTIONS', url: '/v1/fillet/check' })).statusCode).toBe(204);
    expect(lines.filter((l) => l.msg === 'request')).toHaveLength(0);
  });

  it('at LOG_LEVEL warn no request lines are written', async () => {
    const quiet: string[] = [];
    const q = await buildApp({
      config: { DOCS: false },
      loggerInstance: pino({ level: 'warn' }, new Writable({ write: (c: Buffer, _e, d) => (quiet.push(c.toString()), d()) })),
    });
    try {
      await q.inject({ method: 'POST', url: '/v1/fillet/check', headers: { 'content-type': 'application/json' }, payload: FILLET });
      expect(quiet.join('')).not.toContain('"msg":"request"');
    } finally {
      await q.close();
    }
  });
});

describe('lazy per-request logger', () => {
  it('makes the child logger on first use only, with its bindings', () => {
    const out: string[] = [];
    const parent = pino({ level: 'info' }, new Writable({ write: (c: Buffer, _e, d) => (out.push(c.toString()), d()) }));
    let children = 0;
    const counting = new Proxy(parent, {
      get(target, prop, receiver) {
        if (prop === 'child') return (...a: Parameters<typeof parent.child>) => (children++, target.child(...a));
        return Reflect.get(target, prop, receiver) as unknown;
      },
    });
    const lazy = new LazyChildLogger(counting, { reqId: 'r-1' }, {});
    expect(lazy.level).toBe('info');
    expect(children).toBe(0);
    lazy.warn({ a: 1 }, 'hello');
    lazy.info('again');
    expect(children).toBe(1);
    const logged = out.join('').trim().split('\n').map((l) => JSON.parse(l) as Record<string, unknown>);
    expect(logged[0]).toMatchObject({ level: 40, reqId: 'r-1', a: 1, msg: 'hello' });
    expect(logged[1]).toMatchObject({ level: 30, reqId: 'r-1', msg: 'again' });
  });
});

describe('a logger configured otherwise', () => {
  it('with ISO times and level labels, the request line goes through the logger and keeps its format', async () => {
    const out: string[] = [];
    const custom = pino(
      { level: 'info', timestamp: pino.stdTimeFunctions.isoTime, formatters: { level: (label) => ({ level: label }) } },
      new Writable({ write: (c: Buffer, _e, d) => (out.push(c.toString()), d()) }),
    );
    const a = await buildApp({ config: { DOCS: false }, loggerInstance: custom });
    try {
      await a.inject({ method: 'POST', url: '/v1/fillet/check', headers: { 'content-type': 'application/json', 'x-request-id': 'iso-1' }, payload: FILLET });
      const line = out.join('').trim().split('\n').map((l) => JSON.parse(l) as Record<string, unknown>).find((l) => l.msg === 'request');
      expect(line).toMatchObject({ level: 'info', reqId: 'iso-1', method: 'POST', path: '/v1/fillet/check', status: 200 });
      expect(String(line?.time)).toMatch(/^\d{4}-\d{2}-\d{2}T/);
    } finally {
      await a.close();
    }
  });
});
