/**
 * The workshop's batch export (openapi/examples/batch-workshop.json and .ndjson: 32 welded
 * connections of the demo two-storey workshop, every kind of check) gives the expected summary
 * in openapi/examples/batch-workshop.summary.json, through the batch route (JSON and NDJSON) and
 * through the pipeline client src/bin/weld-batch.ts against a listening service.
 *
 * Why the expected summary is what it is (hand arithmetic from the published equations):
 * - WS-C07 fails on weld metal: 3/16 in E70 fillets, 2 × 6 in, 60 kip LRFD;
 *   φRn = 0.75 · 0.60 · 70 · 0.7071 · 0.1875 · 12 = 50.11 kip, 60 / 50.11 = 1.197 (AISC 360-22 §J2.4);
 *   the 1/2 in A572-50 gusset (both faces, one shear plane of 6 in) has
 *   0.75 · 0.60 · 65 · 0.5 · 6 = 87.75 kip, so the weld governs.
 * - WS-C09 fails a detailing limit: 3/16 in fillets on parts of 1 in and 1-1/4 in, where the
 *   minimum is 5/16 in for a thinner part over 3/4 in (AISC 360-22 Table J2.4, from memory);
 *   its strength passes: 40 / (1.392 · 3 · 24) = 0.399.
 * - WS-C18 is refused (422): a 45-degree bevel by SAW in the vertical position has no
 *   prequalified effective throat (AISC 360-22 Table J2.1, from memory).
 * - The other 29 pass; the fillet, base-metal, CJP, PJP and sizing ones are checked below by hand.
 */
import { execFile } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import http from 'node:http';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { FastifyInstance } from 'fastify';
import { OPERATIONS } from '../../src/operations/index.js';
import { runBatch, type Summary } from '../../src/bin/weld-batch.js';
import { buildApp } from '../../src/app.js';
import { app as build } from '../helpers.js';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const JSON_EXPORT = join(ROOT, 'openapi/examples/batch-workshop.json');
const NDJSON_EXPORT = join(ROOT, 'openapi/examples/batch-workshop.ndjson');
const items = JSON.parse(readFileSync(JSON_EXPORT, 'utf8')) as Array<{ kind: string; id: string }>;
const expected = JSON.parse(readFileSync(join(ROOT, 'openapi/examples/batch-workshop.summary.json'), 'utf8')) as {
  items: number;
  pass: number;
  fail: number;
  error: number;
  failures: Array<{ index: number; id: string; outcome: 'fail' | 'error'; code: string }>;
};

interface Result {
  id?: string;
  status: string | number;
  code?: string;
  utilization?: number;
  governing?: { code: string; ratio: number } | null;
  limits?: Array<{ code: string; pass: boolean; required?: number; provided?: number }>;
}

/** The failures as the summary file lists them, read off the results. */
function failuresOf(results: Result[]) {
  return results.flatMap((r, index) => {
    if (r.status === 'pass') return [];
    if (r.status === 'fail') {
      const limit = (r.limits ?? []).find((l) => !l.pass);
      const code = r.governing && r.governing.ratio > 1 ? r.governing.code : limit?.code;
      return [{ index, id: r.id, outcome: 'fail', code }];
    }
    return [{ index, id: r.id, outcome: 'error', code: r.code }];
  });
}

let app: FastifyInstance;
let base: string;
let work: string;
beforeAll(async () => {
  app = await build();
  base = await app.listen({ host: '127.0.0.1', port: 0 });
  work = mkdtempSync(join(tmpdir(), 'workshop-batch-'));
});
afterAll(async () => {
  await app.close();
  rmSync(work, { recursive: true, force: true });
});

describe('the workshop export', () => {
  it('covers every kind of check the service offers, with workshop marks as ids', () => {
    expect(new Set(items.map((i) => i.kind))).toEqual(new Set(OPERATIONS.map((o) => o.kind)));
    for (const i of items) expect(i.id).toMatch(/^WS-[A-Z]+\d+$/);
    expect(new Set(items.map((i) => i.id)).size).toBe(items.length);
  });

  it('the NDJSON export holds the same items as the JSON export, one per line', () => {
    const lines = readFileSync(NDJSON_EXPORT, 'utf8').trimEnd().split('\n');
    expect(lines.map((l) => JSON.parse(l) as unknown)).toEqual(items);
  });
});

describe('POST /v1/batch with the JSON export', () => {
  let results: Result[];
  let summary: { items: number; pass: number; fail: number; error: number };
  beforeAll(async () => {
    const res = await app.inject({ method: 'POST', url: '/v1/batch', payload: items });
    expect(res.statusCode).toBe(200);
    ({ results, summary } = res.json() as { results: Result[]; summary: typeof summary });
  });

  it('gives the expected summary', () => {
    expect(summary).toEqual({ items: expected.items, pass: expected.pass, fail: expected.fail, error: expected.error });
  });

  it('fails and refuses exactly the expected connections, for the expected reasons', () => {
    expect(failuresOf(results)).toEqual(expected.failures);
  });

  it('keeps the order and the ids of the export', () => {
    expect(results.map((r) => r.id)).toEqual(items.map((i) => i.id));
  });

  it('WS-C07: weld metal at 60 / 50.11 = 1.197 (hand arithmetic above)', () => {
    const r = results[items.findIndex((i) => i.id === 'WS-C07')]!;
    expect(r.governing!.code).toBe('FILLET_WELD_METAL');
    expect(r.governing!.ratio).toBeCloseTo(60 / (0.75 * 0.6 * 70 * Math.SQRT1_2 * 0.1875 * 12), 3);
  });

  it('WS-C09: minimum size 5/16 in against 3/16 in provided', () => {
    const r = results[items.findIndex((i) => i.id === 'WS-C09')]!;
    const limit = r.limits!.find((l) => l.code === 'FILLET_MIN_SIZE')!;
    expect(limit.pass).toBe(false);
    expect(limit.required).toBeCloseTo(5 / 16, 6); // AISC 360-22 Table J2.4, thinner part over 3/4 in (from memory)
    expect(limit.provided).toBeCloseTo(3 / 16, 6);
  });

  // Hand arithmetic, E70 LRFD 1.392 kip/in and ASD 0.928 kip/in per sixteenth (common practice,
  // no source); metric E49: 0.60 · 490 · 0.7071 · w N/mm nominal; base metal per AISC 360-22 §J4.2.
  const hand: Record<string, [number, string]> = {
    'WS-B12': [120 / (1.392 * 5 * 20), '5/16 in, 2 × 10 in'],
    'WS-B14': [60 / (1.0 * 0.6 * 36 * 0.375 * 8), 'A36 3/8 in gusset shear yield, one plane of 8 in: 64.8 kip'],
    'WS-B21': [25 / (1.392 * 3 * 12), '3/16 in, 2 × 6 in'],
    'WS-B30': [20 / (0.928 * 4 * 10), 'ASD 1/4 in, 2 × 5 in'],
    'WS-B33': [150 / (1.392 * 4 * 60 * (1.2 - 0.002 * 120)), 'end-loaded, l/w = 120, Eq. J2-1 beta = 0.96'],
    'WS-C02': [90 / (0.75 * 0.6 * 65 * 0.625 * 12), 'A992 5/8 in flange shear rupture, one plane of 12 in: 219.4 kip'],
    'WS-C20': [150 / (1.392 * 5 * 28 * (1 + 0.5 * Math.sin(Math.PI / 4) ** 1.5)), '45 degrees, Eq. J2-5 factor 1.2973'],
    'WS-G10': [8 / (1.392 * 3 * 6), '3/16 in, 2 × 3 in'],
    'WS-S05': [10 / (0.928 * 3 * 8), 'ASD 3/16 in, 2 × 4 in'],
    'WS-P03': [40 / ((0.75 * 0.6 * 490 * Math.SQRT1_2 * 5 * 160) / 1000), 'metric 5 mm, 2 × 80 mm: 124.7 kN'],
    'WS-S12': [50 / ((0.6 * 490 * Math.SQRT1_2 * 6 * 200) / 2 / 1000), 'metric ASD 6 mm, 2 × 100 mm: 124.7 kN'],
    // Eq. J2-6b governs: 0.85 · 299.3 + 1.5 · 124.7 = 441.5 kN nominal, / 2.00
    'WS-T06': [180 / ((0.85 * 0.6 * 490 * Math.SQRT1_2 * 6 * 240 + 1.5 * 0.6 * 490 * Math.SQRT1_2 * 6 * 100) / 2 / 1000), 'mixed group J2-6b'],
    'WS-B07': [60 / (1.0 * 0.6 * 36 * 0.375 * 9), 'shear yield 72.9 kip'],
    'WS-B08': [90 / ((0.6 * 65 * 0.5 * 12) / 2.0), 'ASD shear rupture 117 kip'],
    'WS-M05': [200 / ((1.0 * 0.6 * 355 * 10 * 150) / 1000), 'shear yield 319.5 kN'],
    'WS-C15': [40 / ((0.6 * 70 * (0.5 - 0.125) * 12) / 1.88), 'ASD PJP, throat S - 1/8 (Table J2.1), 100.5 kip'],
    'WS-G04': [300 / (0.9 * 50 * 0.75 * 10), 'CJP tension yield of the 3/4 in part, 337.5 kip'],
  };
  it('WS-B15 (sizing): the cheapest fillet is the 3/16 in minimum, 90 / (1.392 · 3 · 2) = 10.78 in long or more', () => {
    const r = results[items.findIndex((i) => i.id === 'WS-B15')]! as Result & { values: { recommended: { size: number; length: number } } };
    expect(r.status).toBe('pass');
    const { size, length } = r.values.recommended;
    expect(size).toBeCloseTo(3 / 16, 6); // AISC 360-22 Table J2.4, thinner part 3/8 in (from memory)
    expect(length).toBeGreaterThanOrEqual(90 / (1.392 * 3 * 2));
    expect(length).toBeLessThanOrEqual(12);
    expect(r.utilization! / (90 / (1.392 * 3 * 2 * length))).toBeCloseTo(1, 3);
  });

  for (const [id, [ratio, why]] of Object.entries(hand)) {
    it(`${id} utilization ${ratio.toFixed(3)} (${why})`, () => {
      const r = results[items.findIndex((i) => i.id === id)]!;
      expect(r.status).toBe('pass');
      expect(r.utilization! / ratio).toBeCloseTo(1, 3);
    });
  }
});

describe('POST /v1/batch with the NDJSON export', () => {
  it('streams one result per item and ends with the expected summary', async () => {
    const body = await new Promise<string>((resolve, reject) => {
      const url = new URL('/v1/batch?summary=true', base);
      const req = http.request(url, { method: 'POST', headers: { 'content-type': 'application/x-ndjson' } }, (res) => {
        let text = '';
        res.setEncoding('utf8');
        res.on('data', (t: string) => (text += t));
        res.on('end', () => resolve(text));
        res.on('error', reject);
      });
      req.on('error', reject);
      req.end(readFileSync(NDJSON_EXPORT));
    });
    const lines = body.trimEnd().split('\n').map((l) => JSON.parse(l) as Result & { summary?: unknown });
    const last = lines.pop()!;
    expect(last.summary).toEqual({ items: expected.items, pass: expected.pass, fail: expected.fail, error: expected.error });
    expect(lines.map((r) => r.id)).toEqual(items.map((i) => i.id));
    expect(failuresOf(lines)).toEqual(expected.failures);
  });
});

describe('the pipeline client src/bin/weld-batch.ts against a listening service', () => {
  const strip = (s: Summary) => ({ ...s, failures: s.failures.map(({ detail: _detail, ...f }) => f) });

  for (const file of [NDJSON_EXPORT, JSON_EXPORT]) {
    const name = file.endsWith('.json') ? 'JSON' : 'NDJSON';
    it(`runBatch with the ${name} export writes every result and the expected summary`, async () => {
      const out = join(work, `results-${name}.ndjson`);
      const summaryFile = join(work, `summary-${name}.json`);
      const s = await runBatch({ input: file, output: out, url: base, ids: 'any', summary: summaryFile });
      expect(strip(s)).toEqual({ ...expected, stopped: null });
      expect(strip(JSON.parse(readFileSync(summaryFile, 'utf8')) as Summary)).toEqual({ ...expected, stopped: null });
      const results = readFileSync(out, 'utf8').trimEnd().split('\n').map((l) => JSON.parse(l) as Result);
      expect(results.map((r) => r.id)).toEqual(items.map((i) => i.id));
      expect(failuresOf(results)).toEqual(expected.failures);
      // The weld-metal failure names its ratio, 60 / 50.11 = 1.197 (hand arithmetic above).
      expect(s.failures[0]!.detail).toContain('1.197');
    });
  }

  it('--ids ifc passes through: workshop marks are not IFC GlobalIds, so every item is refused', async () => {
    const s = await runBatch({ input: NDJSON_EXPORT, output: join(work, 'ifc.ndjson'), url: base, ids: 'ifc' });
    expect(s).toMatchObject({ items: 32, pass: 0, fail: 0, error: 32, stopped: null });
    expect(s.failures.every((f) => f.outcome === 'error')).toBe(true);
  });

  it('a stream the service cuts at its item limit is reported as stopped, with the items answered before', async () => {
    const small = await buildApp({ config: { DOCS: false, BATCH_MAX_ITEMS: 5 } });
    try {
      const url = await small.listen({ host: '127.0.0.1', port: 0 });
      const s = await runBatch({ input: NDJSON_EXPORT, output: join(work, 'cut.ndjson'), url, ids: 'any' });
      expect(s.items).toBe(5);
      expect(s.stopped).toMatch(/At most 5 items/);
    } finally {
      await small.close();
    }
  });

  it('the command prints the summary of failures and exits 1 when any item fails', async () => {
    const out = join(work, 'cli-results.ndjson');
    const { code, stdout, stderr } = await new Promise<{ code: number | null; stdout: string; stderr: string }>((resolve) => {
      execFile(
        process.execPath,
        ['--import', 'tsx', join(ROOT, 'src/bin/weld-batch.ts'), '--in', NDJSON_EXPORT, '--out', out, '--url', base],
        { cwd: ROOT, timeout: 30_000 },
        (err, stdout, stderr) => resolve({ code: err ? ((err as { code?: number }).code ?? null) : 0, stdout, stderr }),
      );
    });
    expect(stderr).not.toMatch(/weld-batch:/);
    expect(code).toBe(1);
    const lines = stdout.trimEnd().split('\n');
    expect(lines[0]).toBe(`32 items: 29 pass, 2 fail, 1 error; results in ${out}`);
    expect(lines.slice(1).map((l) => l.trim().split(' ').slice(0, 4).join(' '))).toEqual([
      '#6 WS-C07: fail FILLET_WELD_METAL',
      '#7 WS-C09: fail FILLET_MIN_SIZE',
      '#18 WS-C18: error PJP_NO_PREQUALIFIED_THROAT',
    ]);
    expect(readFileSync(out, 'utf8').trimEnd().split('\n')).toHaveLength(32);
  });

  it('the command exits 2 and says why when the service cannot be reached', async () => {
    // A port that was just free: listen on it, note it, close it.
    const closed = await new Promise<number>((resolve) => {
      const s = http.createServer();
      s.listen(0, '127.0.0.1', () => {
        const port = (s.address() as { port: number }).port;
        s.close(() => resolve(port));
      });
    });
    const { code, stderr } = await new Promise<{ code: number | null; stderr: string }>((resolve) => {
      execFile(
        process.execPath,
        ['--import', 'tsx', join(ROOT, 'src/bin/weld-batch.ts'), '--in', NDJSON_EXPORT, '--out', join(work, 'none.ndjson'), '--url', `http://127.0.0.1:${closed}`],
        { cwd: ROOT, timeout: 30_000 },
        (err, _stdout, stderr) => resolve({ code: err ? ((err as { code?: number }).code ?? null) : 0, stderr }),
      );
    });
    expect(code).toBe(2);
    expect(stderr).toMatch(/^weld-batch: .*ECONNREFUSED/);
  });
});
