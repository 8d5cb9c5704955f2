/**
 * Many large batches at once must not end the process. The real server runs as a child with a
 * small JavaScript heap (128 MB) and receives 48 batches of 18,000 fillets (about 4 MB each,
 * 192 MB in all) at the same moment. Before the body allowance (BODY_HOLD_BYTES,
 * plugins/body-hold.ts) every body was taken and held as text while it waited for a lane, and
 * this run ended the process with "JavaScript heap out of memory". Now each batch is either
 * answered in full or refused with 503 bodies-busy and Retry-After, and the process
 * answers afterwards.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { FILLET_BODY } from '../fillet-fixtures.js';
import { get, send, startServer, type ServerProcess } from './server-process.js';

let server: ServerProcess;

beforeAll(async () => {
  server = await startServer({ NODE_OPTIONS: '--max-old-space-size=128', DRAIN_DELAY_MS: '0', LOG_LEVEL: 'warn' });
}, 60_000);

afterAll(() => {
  if (server && server.proc.exitCode === null) server.proc.kill('SIGKILL');
});

describe('48 batches of 4 MB at once under a 128 MB heap', () => {
  it('answers each in full or refuses it with 503 bodies-busy, and the process lives on', async () => {
    const ITEMS = 18_000;
    const body = JSON.stringify(Array.from({ length: ITEMS }, (_, i) => ({ kind: 'fillet', id: `WS-${i}`, ...FILLET_BODY })));
    expect(body.length).toBeGreaterThan(4_000_000);
    const outcomes = await Promise.all(Array.from({ length: 48 }, () => send({ port: server.port, method: 'POST', path: '/v1/batch?fields=status', body })));
    let answered = 0;
    for (const o of outcomes) {
      expect(o.error, server.output().slice(-2000)).toBeUndefined();
      if (o.status === 200) {
        answered++;
        expect((JSON.parse(o.body!) as { summary: { items: number } }).summary.items).toBe(ITEMS);
      } else {
        expect(o.status).toBe(503);
        expect(o.headers?.['retry-after']).toBe('5');
        expect((JSON.parse(o.body!) as { type: string }).type).toBe('urn:throatline:problem:bodies-busy');
      }
    }
    expect(answered).toBeGreaterThan(0);
    expect(server.proc.exitCode).toBeNull();
    expect((await get(server.port, '/readyz')).status).toBe(200);
  }, 120_000);
});
