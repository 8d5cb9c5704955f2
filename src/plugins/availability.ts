/**
 * When the service should take no new work, and what it answers then.
 *
 * - Overload: a LoadMonitor samples the mean event-loop delay every SAMPLE_INTERVAL_MS while the
 *   server listens. Above OVERLOAD_EVENT_LOOP_DELAY_MS the service is overloaded for at least
 *   HOLD_MS: /readyz answers 503 (the orchestrator stops routing to this replica) and new
 *   requests other than probes and /metrics get a 503 problem with `Retry-After`, which costs
 *   far less than queueing work the loop cannot keep up with.
 * - Shutdown: once the server turns readiness off (SIGTERM), every answer carries
 *   `connection: close`, so keep-alive clients reconnect, through the cluster's service, to a
 *   replica that stays.
 */
import { monitorEventLoopDelay, type IntervalHistogram } from 'node:perf_hooks';
import type { FastifyInstance } from 'fastify';
import fp from 'fastify-plugin';
import type { ReadinessState } from '../routes/health.js';
import { problem, sendProblem } from './problem.js';

export const SAMPLE_INTERVAL_MS = 500;
export const HOLD_MS = 2000;
const RESOLUTION_MS = 10;

/**
 * Mean event-loop delay since the last call, milliseconds (0 when the loop keeps time), from
 * Node's event-loop delay histogram. A sustained lag (the loop busy in one chunk after another)
 * shows at once; the histogram does measure a single long block, except one that begins within
 * a timer tick of a reading.
 */
export function eventLoopDelayProbe(): { read(): number; stop(): void } {
  let h: IntervalHistogram | undefined;
  const histogram = (): IntervalHistogram => {
    if (!h) {
      h = monitorEventLoopDelay({ resolution: RESOLUTION_MS });
      h.enable();
    }
    return h;
  };
  histogram();
  return {
    read() {
      const x = histogram();
      const mean = x.count > 0 ? x.mean / 1e6 : 0;
      x.reset();
      return Math.max(0, mean - RESOLUTION_MS);
    },
    stop() {
      h?.disable();
      h = undefined;
    },
  };
}

export interface LoadMonitorOptions {
  /** Delay above which the service is overloaded, ms; 0 never. */
  limitMs: number;
  holdMs?: number;
  /** Where the delay comes from (tests simulate lag with their own). */
  probe?: () => number;
  now?: () => number;
}

export class LoadMonitor {
  overloaded = false;
  delayMs = 0;
  readonly limitMs: number;
  readonly holdMs: number;
  private until = 0;
  private timer: NodeJS.Timeout | undefined;
  private readonly probe: () => number;
  private readonly stopProbe: () => void;
  private readonly now: () => number;

  constructor(opts: LoadMonitorOptions) {
    this.limitMs = opts.limitMs;
    this.holdMs = opts.holdMs ?? HOLD_MS;
    this.now = opts.now ?? Date.now;
    if (opts.probe) {
      this.probe = opts.probe;
      this.stopProbe = () => {};
    } else {
      let p: ReturnType<typeof eventLoopDelayProbe> | undefined;
      this.probe = () => (p ??= eventLoopDelayProbe()).read();
      this.stopProbe = () => {
        p?.stop();
        p = undefined;
      };
    }
  }

  /** Seconds a shed client should wait before trying again. */
  get retryAfterS(): number {
    return Math.max(1, Math.ceil(this.holdMs / 1000));
  }

  /** Takes one reading and updates the state. */
  sample(): void {
    this.delayMs = this.probe();
    if (this.limitMs > 0 && this.delayMs > this.limitMs) {
      this.overloaded = true;
      this.until = this.now() + this.holdMs;
    } else if (this.overloaded && this.now() >= this.until) {
      this.overloaded = false;
    }
  }

  start(intervalMs = SAMPLE_INTERVAL_MS): void {
    if (this.timer) return;
    this.probe(); // starts the histogram; the first window begins now
    this.timer = setInterval(() => this.sample(), intervalMs);
    this.timer.unref();
  }

  stop(): void {
    if (this.timer) clearInterval(this.timer);
    this.timer = undefined;
    this.stopProbe();
  }
}

/** Probes and metrics still answer under overload: they are how the orchestrator finds out. */
const NEVER_SHED = new Set(['/healthz', '/readyz', '/metrics']);

export default fp(
  async function availability(app: FastifyInstance, opts: { monitor: LoadMonitor; readiness: ReadinessState }) {
    const { monitor, readiness } = opts;
    app.addHook('onListen', async () => monitor.start());
    app.addHook('onClose', async () => monitor.stop());
    // Callback-style hooks (no promise per request): they run on every answer.
    app.addHook('onRequest', (request, reply, done) => {
      if (!monitor.overloaded || NEVER_SHED.has(request.routeOptions.url ?? '')) {
        done();
        return;
      }
      reply.header('retry-after', String(monitor.retryAfterS));
      sendProblem(reply, problem(503, 'overloaded', 'Overloaded', `This replica is busier than it can answer promptly; retry in ${monitor.retryAfterS} s (another replica may take it sooner).`));
    });
    app.addHook('onSend', (_request, reply, payload, done) => {
      // Shutting down, or a request that timed out mid-upload: this connection has served its turn.
      if (!readiness.ready || reply.statusCode === 408) reply.header('connection', 'close');
      done(null, payload);
    });
  },
  { name: 'availability' },
);
