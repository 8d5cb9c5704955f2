/**
 * The service's counter and histogram families keep plain numbers and let prom-client's registry
 * write them. The reference is prom-client itself (a general-purpose library from the registry):
 * the same observations given to its own Counter and Histogram (and a Counter counting the
 * observations, for ObservationCount) must produce the same exposition text, byte for byte, for
 * any label values (quotes, backslashes, line breaks, non-ASCII) and any observations (on a
 * bucket bound, between bounds, beyond the last one, zero).
 */
import fc from 'fast-check';
import { Counter, Histogram, Registry } from 'prom-client';
import { describe, expect, it } from 'vitest';
import { CounterFamily, HistogramFamily, ObservationCount } from '../../src/plugins/metrics.js';

const BOUNDS = [0.001, 0.0025, 0.005, 0.01, 0.025, 0.05, 0.1, 0.25, 0.5, 1, 2.5, 5, 10, 30, 60];
const LABELS = ['method', 'route', 'status'] as const;

const labelValue = fc.oneof(fc.constantFrom('POST', 'GET', '/v1/fillet/check', 'unmatched', '200', '404'), fc.string({ maxLength: 12 }), fc.string({ unit: fc.constantFrom('"', '\\', '\n', 'a', '§', '😀') }));
const triple = fc.tuple(labelValue, labelValue, fc.oneof(labelValue, fc.integer({ min: 100, max: 599 })));
const observation = fc.oneof(fc.constantFrom(...BOUNDS, 0, 61, 1e6), fc.double({ min: 0, max: 100, noNaN: true }));

async function ours(events: [[string, string, string | number], number][]): Promise<string> {
  const registry = new Registry();
  const c = new CounterFamily('t_total', 'Help with a \\ and a\nline break.', LABELS, registry);
  const h = new HistogramFamily('t_seconds', 'Latency.', LABELS, BOUNDS, registry);
  new ObservationCount('t_answers_total', 'Observations.', h, registry);
  for (const [[a, b, s], v] of events) {
    c.inc(a, b, s);
    h.observe(a, b, s, v);
  }
  return registry.metrics();
}

async function reference(events: [[string, string, string | number], number][]): Promise<string> {
  const registry = new Registry();
  const c = new Counter({ name: 't_total', help: 'Help with a \\ and a\nline break.', labelNames: LABELS, registers: [registry] });
  const h = new Histogram({ name: 't_seconds', help: 'Latency.', labelNames: LABELS, buckets: BOUNDS, registers: [registry] });
  const n = new Counter({ name: 't_answers_total', help: 'Observations.', labelNames: LABELS, registers: [registry] });
  for (const [[a, b, s], v] of events) {
    c.labels({ method: a, route: b, status: s }).inc();
    h.labels({ method: a, route: b, status: s }).observe(v);
    n.labels({ method: a, route: b, status: s }).inc();
  }
  return registry.metrics();
}

describe('metric families', () => {
  it('write what prom-client writes for the same observations', async () => {
    await fc.assert(
      fc.asyncProperty(fc.array(fc.tuple(triple, observation), { maxLength: 40 }), async (events) => {
        expect(await ours(events)).toBe(await reference(events));
      }),
      { numRuns: 300 },
    );
  });

  it('a value on a bound falls in that bucket; beyond the last bound only in +Inf (hand count)', async () => {
    const text = await ours([
      [['POST', '/a', 200], 0.005],
      [['POST', '/a', 200], 0.0051],
      [['POST', '/a', 200], 75],
    ]);
    const line = (le: string) => new RegExp(`^t_seconds_bucket\\{le="${le.replace('+', '\\+')}",method="POST",route="/a",status="200"\\} (\\d+)$`, 'm').exec(text)?.[1];
    expect(line('0.0025')).toBe('0');
    expect(line('0.005')).toBe('1');
    expect(line('0.01')).toBe('2');
    expect(line('60')).toBe('2');
    expect(line('+Inf')).toBe('3');
    expect(text).toMatch(/^t_seconds_count\{method="POST",route="\/a",status="200"\} 3$/m);
    // 0.005 + 0.0051 + 75, added in that order.
    expect(text).toMatch(/^t_seconds_sum\{method="POST",route="\/a",status="200"\} 75\.0101$/m);
    expect(text).toMatch(/^t_total\{method="POST",route="\/a",status="200"\} 3$/m);
  });

  it('reset() zeroes every series and keeps its labels', async () => {
    const registry = new Registry();
    const c = new CounterFamily('r_total', 'r', LABELS, registry);
    c.inc('GET', '/x', 200);
    c.reset();
    expect(await registry.metrics()).toMatch(/^r_total\{method="GET",route="\/x",status="200"\} 0$/m);
  });
});
