/**
 * /metrics is scraped and parsed as the Prometheus text format: request counters and latency
 * histograms by route pattern and status, calculations by kind and governing code, event-loop
 * delay, process memory. The expected counts are the requests this test sends.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { FastifyInstance } from 'fastify';
import { buildApp } from '../../src/app.js';
import { FILLET_BODY } from '../fillet-fixtures.js';

interface Sample {
  name: string;
  labels: Record<string, string>;
  value: number;
}

/** The text exposition format 0.0.4, parsed here: `# HELP`, `# TYPE`, then `name{a="b",...} value` lines. */
function parseExposition(text: string): { samples: Sample[]; types: Map<string, string> } {
  const samples: Sample[] = [];
  const types = new Map<string, string>();
  for (const line of text.split('\n')) {
    if (line === '') continue;
    const t = /^# TYPE (\S+) (counter|gauge|histogram|summary|untyped)$/.exec(line);
    if (t) {
      types.set(t[1]!, t[2]!);
      continue;
    }
    if (line.startsWith('#')) continue;
    const m = /^([a-zA-Z_:][a-zA-Z0-9_:]*)(?:\{(.*)\})? (-?(?:\d+(?:\.\d+)?(?:e[+-]?\d+)?|nan|\+inf|-inf))$/i.exec(line);
    expect(m, `exposition line: ${line}`).not.toBeNull();
    const labels: Record<string, string> = {};
    for (const l of (m![2] ?? '').matchAll(/([a-zA-Z_][a-zA-Z0-9_]*)="((?:[^"\\]|\\.)*)"/g)) labels[l[1]!] = l[2]!;
    // Go's ParseFloat rules: NaN and Inf in any letter case.
    const raw = m![3]!.toLowerCase();
    samples.push({ name: m![1]!, labels, value: raw === 'nan' ? Number.NaN : raw.endsWith('inf') ? (raw.startsWith('-') ? -Infinity : Infinity) : Number(raw) });
  }
  return { samples, types };
}

function value(samples: Sample[], name: string, labels: Record<string, string>): number | undefined {
  return samples.find((s) => s.name === name && Object.entries(labels).every(([k, v]) => s.labels[k] === v))?.value;
}

const FILLET = FILLET_BODY;

let app: FastifyInstance;
let scrape: { samples: Sample[]; types: Map<string, string> };
let contentType: string;
let governing: string;
let refusal: string;
beforeAll(async () => {
  app = await buildApp({ config: { DOCS: false } });
  // What this test sends, counted by hand:
  //   POST /v1/fillet/check: 3 × 200, 2 × 400 (one missing field, one unknown steel name),
  //                          1 × 422 (a steel whose fy exceeds its fu)
  //   GET  /v1/fillet/check (query form): 1 × 200
  //   POST /v1/batch: 1 × 200 holding 2 fillet items and 1 bad item
  //   GET  /v1/catalog/steels: 2 × 200; GET /no/such/path: 1 × 404; GET /v1/fillet/check/123: 1 × 404
  const first = await app.inject({ method: 'POST', url: '/v1/fillet/check', payload: FILLET });
  governing = first.json().governing.code;
  for (let i = 0; i < 2; i++) await app.inject({ method: 'POST', url: '/v1/fillet/check', payload: FILLET });
  await app.inject({ method: 'POST', url: '/v1/fillet/check', payload: { ...FILLET, method: undefined } });
  await app.inject({ method: 'POST', url: '/v1/fillet/check', payload: { ...FILLET, parts: [{ thickness: 0.5, steel: 'A000' }] } });
  refusal = (await app.inject({ method: 'POST', url: '/v1/fillet/check', payload: { ...FILLET, parts: [{ thickness: 0.5, steel: { fy: 70, fu: 50 } }] } })).json().code;
  await app.inject({
    method: 'GET',
    url: '/v1/fillet/check?method=LRFD&electrode=E70&welds.0.size=5/16&welds.0.length=10&welds.0.count=2&load.force=120&parts.0.thickness=1/2&parts.0.steel=A572-50&parts.0.faces=2&parts.1.thickness=3/4&parts.1.steel=A992',
  });
  await app.inject({ method: 'POST', url: '/v1/batch', payload: [{ kind: 'fillet', ...FILLET }, { kind: 'fillet', ...FILLET }, { kind: 'nothing' }] });
  for (let i = 0; i < 2; i++) await app.inject({ method: 'GET', url: '/v1/catalog/steels' });
  await app.inject({ method: 'GET', url: '/no/such/path?x=1' });
  await app.inject({ method: 'GET', url: '/v1/fillet/check/123' });
  const res = await app.inject({ method: 'GET', url: '/metrics' });
  expect(res.statusCode).toBe(200);
  contentType = String(res.headers['content-type']);
  scrape = parseExposition(res.body);
});
afterAll(async () => {
  await app.close();
});

describe('GET /metrics', () => {
  it('answers the Prometheus text format', () => {
    expect(contentType).toBe('text/plain; version=0.0.4; charset=utf-8');
    expect(scrape.samples.length).toBeGreaterThan(20);
  });

  it('counts requests by method, route pattern and status', () => {
    const { samples, types } = scrape;
    expect(types.get('throatline_http_requests_total')).toBe('counter');
    const n = (method: string, route: string, status: string) => value(samples, 'throatline_http_requests_total', { method, route, status });
    expect(n('POST', '/v1/fillet/check', '200')).toBe(3);
    expect(n('POST', '/v1/fillet/check', '400')).toBe(2);
    expect(n('GET', '/v1/fillet/check', '200')).toBe(1);
    expect(n('POST', '/v1/batch', '200')).toBe(1);
    expect(n('GET', '/v1/catalog/steels', '200')).toBe(2);
    // Unknown paths share one series: the raw URL never becomes a label.
    expect(n('GET', 'unmatched', '404')).toBe(2);
    expect(samples.some((s) => Object.values(s.labels).some((v) => v.includes('/no/such') || v.includes('?')))).toBe(false);
  });

  it('has a latency histogram per route and status whose count matches the counter', () => {
    const { samples, types } = scrape;
    expect(types.get('throatline_http_request_duration_seconds')).toBe('histogram');
    const labels = { method: 'POST', route: '/v1/fillet/check', status: '200' };
    const buckets = samples.filter((s) => s.name === 'throatline_http_request_duration_seconds_bucket' && s.labels.route === labels.route && s.labels.method === 'POST' && s.labels.status === '200');
    expect(buckets.length).toBeGreaterThan(5);
    // Cumulative buckets: never decreasing, ending at +Inf with every observation.
    const counts = buckets.map((b) => b.value);
    for (let i = 1; i < counts.length; i++) expect(counts[i]!).toBeGreaterThanOrEqual(counts[i - 1]!);
    expect(buckets.at(-1)!.labels.le).toBe('+Inf');
    expect(buckets.at(-1)!.value).toBe(3);
    expect(value(samples, 'throatline_http_request_duration_seconds_count', labels)).toBe(3);
    expect(value(samples, 'throatline_http_request_duration_seconds_sum', labels)).toBeGreaterThan(0);
  });

  it('counts calculations by kind, status and governing code, batch items and query forms included', () => {
    const { samples, types } = scrape;
    expect(types.get('throatline_calculations_total')).toBe('counter');
    // 3 POST + 1 GET form + 2 batch items, all the same passing joint.
    expect(value(samples, 'throatline_calculations_total', { kind: 'fillet', status: 'pass', governing })).toBe(6);
    // A request the rules refuse (422) counts with its error code; a 400 from the schema is no calculation.
    const refused = samples.filter((s) => s.name === 'throatline_calculations_total' && s.labels.status === 'refused');
    expect(refused.map((s) => [s.labels.kind, s.labels.governing, s.value])).toEqual([['fillet', refusal, 1]]);
    expect(refusal).toMatch(/^[A-Z][A-Z0-9_]+$/);
    expect(value(samples, 'throatline_http_requests_total', { method: 'POST', route: '/v1/fillet/check', status: '422' })).toBe(1);
  });

  it('reports event-loop delay, process memory and CPU', () => {
    const { samples, types } = scrape;
    for (const name of ['nodejs_eventloop_lag_seconds', 'nodejs_eventloop_lag_p99_seconds', 'throatline_event_loop_delay_seconds']) {
      expect(types.get(name), name).toBe('gauge');
      expect(value(samples, name, {})).toBeGreaterThanOrEqual(0);
    }
    expect(value(samples, 'process_resident_memory_bytes', {})).toBeGreaterThan(1e6);
    expect(value(samples, 'nodejs_heap_size_used_bytes', {})).toBeGreaterThan(1e6);
    expect(types.get('process_cpu_seconds_total')).toBe('counter');
    expect(value(samples, 'throatline_ready', {})).toBe(1);
    expect(value(samples, 'throatline_overloaded', {})).toBe(0);
  });

  it('a second scrape counts the first', async () => {
    const again = parseExposition((await app.inject({ method: 'GET', url: '/metrics' })).body);
    expect(value(again.samples, 'throatline_http_requests_total', { method: 'GET', route: '/metrics', status: '200' })).toBe(1);
  });

  it('METRICS=false: no /metrics route', async () => {
    const quiet = await buildApp({ config: { DOCS: false, METRICS: false } });
    try {
      expect((await quiet.inject({ method: 'GET', url: '/metrics' })).statusCode).toBe(404);
    } finally {
      await quiet.close();
    }
  });
});
