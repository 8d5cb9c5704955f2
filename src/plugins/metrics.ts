/**
 * Prometheus metrics at GET /metrics (text exposition format), with prom-client.
 *
 * Per app (a registry of its own, so tests can build many apps in one process):
 * - throatline_http_requests_total{method,route,status}: answers, by route pattern (never the
 *   raw URL, so query strings and unknown paths cannot blow up the series count; an unmatched
 *   path is route="unmatched") and status code;
 * - throatline_http_request_duration_seconds{method,route,status}: latency histogram;
 * - throatline_calculations_total{kind,status,governing}: calculations answered, single or in a
 *   batch or a range table, by weld family, pass/fail/refused and the governing code (for a
 *   refused one, the error code; "none" when nothing governs, e.g. no load given);
 * - throatline_event_loop_delay_seconds and throatline_overloaded: what load shedding sees;
 * - throatline_ready: 1 while /readyz answers 200;
 * - throatline_batches_answering and throatline_batches_waiting: JSON-array batches holding a
 *   lane and waiting for one (routes/v1/lanes.ts);
 * - throatline_body_bytes_held: request bodies' bytes against BODY_HOLD_BYTES (plugins/body-hold.ts).
 * Per process (registered once): prom-client's default metrics: process CPU and memory
 * (process_resident_memory_bytes, nodejs_heap_size_used_bytes, ...), event-loop delay
 * (nodejs_eventloop_lag_seconds, nodejs_eventloop_lag_p99_seconds, ...) and GC.
 */
import type { FastifyInstance } from 'fastify';
import fp from 'fastify-plugin';
import { Gauge, Registry, collectDefaultMetrics } from 'prom-client';
import { Type } from 'typebox';
import { EngineError } from '../engine/errors.js';
import type { Envelope, Operation } from '../operations/shared.js';

export const METRICS_CONTENT_TYPE = 'text/plain; version=0.0.4; charset=utf-8';
const LATENCY_BUCKETS = [0.001, 0.0025, 0.005, 0.01, 0.025, 0.05, 0.1, 0.25, 0.5, 1, 2.5, 5, 10, 30, 60];

let processRegistry: Registry | undefined;

/** Process-wide metrics, collected on each scrape; set up once however many apps are built. */
function processMetrics(): Registry {
  if (!processRegistry) {
    processRegistry = new Registry();
    collectDefaultMetrics({ register: processRegistry, eventLoopMonitoringPrecision: 10 });
  }
  return processRegistry;
}

/**
 * Label children of a three-label metric, made once per combination and found again by three
 * Map lookups.
 */
class LabelChildren<T> {
  private readonly root = new Map<string, Map<string, Map<string | number, T>>>();
  constructor(private readonly make: (a: string, b: string, c: string) => T) {}

  get(a: string, b: string, c: string | number): T {
    let m1 = this.root.get(a);
    if (m1 === undefined) this.root.set(a, (m1 = new Map()));
    let m2 = m1.get(b);
    if (m2 === undefined) m1.set(b, (m2 = new Map()));
    let child = m2.get(c);
    if (child === undefined) m2.set(c, (child = this.make(a, b, String(c))));
    return child;
  }
}

type LabelNames = readonly [string, string, string];
/** One value of a metric as prom-client's registry writes it (the shape its own metrics give). */
interface ExportedValue {
  labels: Record<string, string | number>;
  sharedLabels?: Record<string, string>;
  value: number;
  metricName?: string;
}

/**
 * A counter family with three labels, counted in plain numbers and written out by prom-client's
 * registry at scrape time: the registry calls get() on every metric registered with it, ours as
 * its own. prom-client's label children hash their label object on every inc(), which cost
 * about 3 % of a fillet request's CPU and was paid again for every batch item.
 */
export class CounterFamily {
  readonly type = 'counter';
  readonly aggregator = 'sum';
  private readonly series: { labels: Record<string, string>; value: number }[] = [];
  private readonly children: LabelChildren<{ value: number }>;

  constructor(readonly name: string, readonly help: string, labelNames: LabelNames, registry: Registry) {
    this.children = new LabelChildren((a, b, c) => {
      const s = { labels: { [labelNames[0]]: a, [labelNames[1]]: b, [labelNames[2]]: c }, value: 0 };
      this.series.push(s);
      return s;
    });
    registry.registerMetric(this as never);
  }

  inc(a: string, b: string, c: string | number): void {
    this.children.get(a, b, c).value++;
  }

  get(): { name: string; help: string; type: string; aggregator: string; values: ExportedValue[] } {
    return { name: this.name, help: this.help, type: this.type, aggregator: this.aggregator, values: this.series.map((s) => ({ labels: s.labels, value: s.value })) };
  }

  reset(): void {
    for (const s of this.series) s.value = 0;
  }
}

/**
 * A histogram family with three labels, counted in plain numbers (a count per bucket, the sum
 * and the count) and written out by prom-client's registry like its own histograms: cumulative
 * `_bucket` lines by upper bound `le` (an observation equal to a bound falls in that bucket),
 * then `+Inf`, `_sum` and `_count`.
 */
export class HistogramFamily {
  readonly type = 'histogram';
  readonly aggregator = 'sum';
  private readonly series: { labels: Record<string, string>; buckets: number[]; sum: number; count: number }[] = [];
  private readonly children: LabelChildren<{ buckets: number[]; sum: number; count: number }>;

  constructor(readonly name: string, readonly help: string, labelNames: LabelNames, private readonly upperBounds: readonly number[], registry: Registry) {
    this.children = new LabelChildren((a, b, c) => {
      const s = { labels: { [labelNames[0]]: a, [labelNames[1]]: b, [labelNames[2]]: c }, buckets: upperBounds.map(() => 0), sum: 0, count: 0 };
      this.series.push(s);
      return s;
    });
    registry.registerMetric(this as never);
  }

  observe(a: string, b: string, c: string | number, value: number): void {
    const s = this.children.get(a, b, c);
    const bounds = this.upperBounds;
    for (let i = 0; i < bounds.length; i++) {
      if (value <= bounds[i]!) {
        s.buckets[i]!++;
        break;
      }
    }
    s.sum += value;
    s.count++;
  }

  get(): { name: string; help: string; type: string; aggregator: string; values: ExportedValue[] } {
    const values: ExportedValue[] = [];
    const bucket = `${this.name}_bucket`;
    for (const s of this.series) {
      let acc = 0;
      this.upperBounds.forEach((le, i) => {
        acc += s.buckets[i]!;
        values.push({ labels: { le }, sharedLabels: s.labels, value: acc, metricName: bucket });
      });
      values.push(
        { labels: { le: '+Inf' }, sharedLabels: s.labels, value: s.count, metricName: bucket },
        { labels: {}, sharedLabels: s.labels, value: s.sum, metricName: `${this.name}_sum` },
        { labels: {}, sharedLabels: s.labels, value: s.count, metricName: `${this.name}_count` },
      );
    }
    return { name: this.name, help: this.help, type: this.type, aggregator: this.aggregator, values };
  }

  reset(): void {
    for (const s of this.series) {
      s.buckets.fill(0);
      s.sum = 0;
      s.count = 0;
    }
  }

  /** The number of observations per label combination, in a counter's shape. */
  counts(): ExportedValue[] {
    return this.series.map((s) => ({ labels: s.labels, value: s.count }));
  }
}

/**
 * A counter whose value per label combination is a histogram family's number of observations:
 * the answers counter is the latency histogram's `_count`, so it is kept once and written twice
 * (one label lookup per answer, not two).
 */
export class ObservationCount {
  readonly type = 'counter';
  readonly aggregator = 'sum';

  constructor(readonly name: string, readonly help: string, private readonly of: HistogramFamily, registry: Registry) {
    registry.registerMetric(this as never);
  }

  get(): { name: string; help: string; type: string; aggregator: string; values: ExportedValue[] } {
    return { name: this.name, help: this.help, type: this.type, aggregator: this.aggregator, values: this.of.counts() };
  }

  /** Nothing of its own to reset: the histogram's reset() zeroes it. */
  reset(): void {}
}

export class ServiceMetrics {
  readonly registry = new Registry();
  readonly duration = new HistogramFamily(
    'throatline_http_request_duration_seconds',
    'Time from request to the end of the answer, by method, route pattern and status.',
    ['method', 'route', 'status'],
    LATENCY_BUCKETS,
    this.registry,
  );
  readonly requests = new ObservationCount('throatline_http_requests_total', 'HTTP answers by method, route pattern and status.', this.duration, this.registry);
  readonly calculations = new CounterFamily(
    'throatline_calculations_total',
    'Calculations answered (single, batch items, range-table rows) by kind, status (pass, fail, refused) and governing code (error code when refused).',
    ['kind', 'status', 'governing'],
    this.registry,
  );
  readonly eventLoopDelay = new Gauge({ name: 'throatline_event_loop_delay_seconds', help: 'Mean event-loop delay over the last sampling window, as load shedding sees it.', registers: [this.registry] });
  readonly overloaded = new Gauge({ name: 'throatline_overloaded', help: '1 while new work is shed because the event loop lags.', registers: [this.registry] });
  readonly ready = new Gauge({ name: 'throatline_ready', help: '1 while /readyz answers 200.', registers: [this.registry] });
  readonly batchesAnswering = new Gauge({ name: 'throatline_batches_answering', help: 'JSON-array batches being computed (at most BATCH_CONCURRENCY).', registers: [this.registry] });
  readonly batchesWaiting = new Gauge({ name: 'throatline_batches_waiting', help: 'JSON-array batches received and waiting for their turn.', registers: [this.registry] });
  readonly bodyBytesHeld = new Gauge({ name: 'throatline_body_bytes_held', help: 'Bytes of request bodies held (arriving, waiting or being answered), at most BODY_HOLD_BYTES but for one body.', registers: [this.registry] });

  /** Counts one answered calculation. */
  calculation(kind: string, answer: Pick<Envelope<unknown>, 'status' | 'governing'>): void {
    const governing = (answer.governing as { code?: string } | null | undefined)?.code ?? 'none';
    this.calculations.inc(kind, answer.status, governing);
  }

  refused(kind: string, code: string): void {
    this.calculations.inc(kind, 'refused', code);
  }

  /** Counts one HTTP answer and its latency. */
  answered(method: string, route: string, status: number, seconds: number): void {
    this.duration.observe(method, route, status, seconds);
  }

  /** The exposition text: process metrics, then this app's. */
  async text(): Promise<string> {
    const [a, b] = await Promise.all([processMetrics().metrics(), this.registry.metrics()]);
    return `${a.trimEnd()}\n${b}`;
  }
}

/**
 * The same operation with its run counted: wraps where every answer is produced, so the check
 * routes (both forms, range tables) and batch items are all counted without touching them.
 */
export function instrument<O extends Operation>(op: O, metrics: ServiceMetrics): O {
  return {
    ...op,
    run(body: never) {
      try {
        const answer = op.run(body);
        metrics.calculation(op.kind, answer);
        return answer;
      } catch (err) {
        if (err instanceof EngineError) metrics.refused(op.kind, err.code);
        throw err;
      }
    },
  };
}

export interface MetricGauges {
  ready: boolean;
  overloaded: boolean;
  eventLoopDelayMs: number;
  batchesAnswering: number;
  batchesWaiting: number;
  bodyBytesHeld: number;
}

/** Registers GET /metrics; `gauges` is read at each scrape. */
export function metricsRoute(app: FastifyInstance, metrics: ServiceMetrics, gauges: () => MetricGauges): void {
  app.get('/metrics', {
    schema: {
      operationId: 'metrics',
      tags: ['service'],
      summary: 'Prometheus metrics (text exposition format)',
      description: 'Request counts and latency histograms by route pattern and status, calculations by kind and governing code, event-loop delay, process memory and CPU.',
      response: { 200: { description: 'Metrics in the Prometheus text format 0.0.4.', content: { 'text/plain': { schema: Type.String() } } } },
    },
    logLevel: 'warn',
    handler: async (_request, reply) => {
      const g = gauges();
      metrics.ready.set(g.ready ? 1 : 0);
      metrics.overloaded.set(g.overloaded ? 1 : 0);
      metrics.eventLoopDelay.set(g.eventLoopDelayMs / 1000);
      metrics.batchesAnswering.set(g.batchesAnswering);
      metrics.batchesWaiting.set(g.batchesWaiting);
      metrics.bodyBytesHeld.set(g.bodyBytesHeld);
      return reply.type(METRICS_CONTENT_TYPE).send(await metrics.text());
    },
  });
}

/** Counts every answer (route pattern, method, status, latency); the route comes separately. */
export default fp(
  async function metricsPlugin(app: FastifyInstance, opts: { metrics: ServiceMetrics }) {
    const { metrics } = opts;
    processMetrics();
    app.addHook('onResponse', (request, reply, done) => {
      metrics.answered(request.method, request.routeOptions.url ?? 'unmatched', reply.statusCode, reply.elapsedTime / 1000);
      done();
    });
  },
  { name: 'metrics' },
);
