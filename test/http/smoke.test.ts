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

describe('smoke', () => {
  it('answers a 5/16 in E70 fillet, 10 in, longitudinal, LRFD with 69.6 kip', async () => {
    const res = await app.inject({
      method: 'POST',
      url: '/v1/fillet/check',
      payload: { method: 'LRFD', electrode: 'E70', welds: [{ size: '5/16', length: 10 }], load: { force: 60 }, parts: [{ thickness: 1, steel: 'A992' }, { thickness: 1, steel: 'A992' }] },
    });
    expect(res.statusCode).toBe(200);
    const body = res.json();
    // common practice, no source: 1.392 kip/in per sixteenth × 5 × 10 in = 69.6 kip
    expect(body.governing.available).toBeCloseTo(69.6, 0);
    expect(body.governing.code).toBe('FILLET_WELD_METAL');
    expect(body.notice).toMatch(/licensed engineer/);
  });
});
