/**
 * The shipped artefact: `npm run build` bundles the service into one file (src/bin/bundle.ts),
 * and that file, not the sources, is what the container and `npm start` run. The rest of the
 * suite runs the sources; this file builds the bundle into .tmp/ and drives it as a process:
 * readiness, a calculation (hand-checked figures below), the contract, the docs page (whose
 * package stays outside the bundle), a calculation sheet (the formula typesetter is inside),
 * a problem answer, metrics, and a clean exit on SIGTERM.
 */
import { mkdirSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { bundle } from '../../src/bin/bundle.js';
import { ROOT, get, send, startServer, type ServerProcess } from './server-process.js';

const OUT_DIR = join(ROOT, '.tmp', 'bundle-test');
const OUT = join(OUT_DIR, 'throatline.js');

let server: ServerProcess;

beforeAll(async () => {
  mkdirSync(OUT_DIR, { recursive: true });
  await bundle(OUT);
  server = await startServer({ DRAIN_DELAY_MS: '0', SHUTDOWN_TIMEOUT_MS: '2000' }, [OUT]);
}, 60_000);

afterAll(() => {
  if (server && server.proc.exitCode === null) server.proc.kill('SIGKILL');
  rmSync(OUT_DIR, { recursive: true, force: true });
});

describe('the single-file build', () => {
  it('starts and reports ready', async () => {
    expect(await get(server.port, '/readyz')).toEqual({ status: 200, body: '{"status":"ready"}' });
  });

  it('answers a fillet check with the same figures as the sources', async () => {
    // Two 5/16 in. E70 fillets, 10 in. each, loaded along their axis (angle 0, no directional
    // increase); hand arithmetic with AISC 360-22 Eq. J2-4 (from memory):
    // Rn = 0.60 × 70 × (0.3125 × 0.7071) × 20 = 185.6 kips; φRn = 0.75 × 185.6 = 139.2 kips.
    const r = await send({
      port: server.port,
      method: 'POST',
      path: '/v1/fillet/check',
      body: JSON.stringify({ method: 'LRFD', electrode: 'E70', welds: [{ size: '5/16', length: 10, count: 2 }], load: { force: 120 }, parts: [{ thickness: 0.5, steel: 'A572-50', faces: 2 }, { thickness: 0.75, steel: 'A992' }] }),
    });
    expect(r.status).toBe(200);
    const a = JSON.parse(r.body!) as { status: string; governing: { code: string; available: number }; basis: { engine: string }; notice: string };
    expect(a.status).toBe('pass');
    expect(a.governing.code).toBe('FILLET_WELD_METAL');
    expect(a.governing.available).toBeCloseTo(139.2, 1);
    expect(a.basis.engine).toMatch(/^throatline \d+\.\d+\.\d+/);
    expect(a.notice).toMatch(/licensed engineer/);
  });

  it('answers bad input with a problem naming the field', async () => {
    const r = await send({ port: server.port, method: 'POST', path: '/v1/fillet/check', body: JSON.stringify({ method: 'LRFD', electrode: 'E70', welds: [{ size: -1, length: 10 }], load: { force: 1 }, parts: [{ thickness: 0.5, steel: 'A36' }] }) });
    expect(r.status).toBe(400);
    expect(r.headers!['content-type']).toMatch(/^application\/problem\+json/);
    expect(r.body).toContain('/welds/0/size');
  });

  it('serves the contract and the docs page (the docs package is loaded from node_modules)', async () => {
    const spec = await get(server.port, '/openapi.json');
    expect(spec.status).toBe(200);
    expect((JSON.parse(spec.body) as { openapi: string }).openapi).toMatch(/^3\.1/);
    const docs = await send({ port: server.port, path: '/docs/' });
    expect(docs.status).toBe(200);
    expect(docs.body).toMatch(/<html/i);
  });

  it('renders a calculation sheet with typeset equations', async () => {
    const r = await send({ port: server.port, path: '/v1/fillet/check?method=LRFD&electrode=E70&welds.0.size=5/16&welds.0.length=10&welds.0.count=2&load.force=120&parts.0.thickness=1/2&parts.0.steel=A572-50&parts.1.thickness=3/4&parts.1.steel=A992&format=html' });
    expect(r.status).toBe(200);
    expect(r.headers!['content-type']).toMatch(/^text\/html/);
    expect(r.body).toContain('<math');
  });

  it('counts calculations in /metrics and exits 0 on SIGTERM', async () => {
    const m = await get(server.port, '/metrics');
    expect(m.status).toBe(200);
    expect(m.body).toMatch(/^throatline_calculations_total\{kind="fillet",status="pass",governing="FILLET_WELD_METAL"\} [1-9]/m);
    server.proc.kill('SIGTERM');
    expect(await server.exited).toBe(0);
  });
});
