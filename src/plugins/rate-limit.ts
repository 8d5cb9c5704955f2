/**
 * Rate limiting with @fastify/rate-limit: at most RATE_LIMIT_MAX requests per RATE_LIMIT_WINDOW_MS
 * for each API key, or for each client address when the request carries no valid key (so a
 * flood of guessed keys is limited too). Past the limit the answer is a 429 problem document
 * with `Retry-After`; every limited answer carries `x-ratelimit-limit`, `-remaining` and
 * `-reset`. Probes and /metrics are never limited. Counts live in each replica's memory: a
 * deployment of N replicas lets a caller through about N times the limit overall, the price of
 * keeping replicas stateless (see the README).
 */
import rateLimit from '@fastify/rate-limit';
import type { FastifyInstance, FastifyRequest } from 'fastify';
import fp from 'fastify-plugin';
import type { KeyRing } from './auth.js';
import { problem, ProblemError } from './problem.js';

const UNLIMITED = new Set(['/healthz', '/readyz', '/metrics']);

/** Most buckets kept; past it the oldest window is forgotten first. */
export const MAX_BUCKETS = 100000;

/**
 * Fixed-window counts in this replica's memory. Each answer is a snapshot of the count at the
 * moment of this request's increment: the library's own in-memory store hands every caller the
 * same live object, so a burst of requests resolved in one turn of the event loop all saw the
 * burst's final count and were all refused.
 */
export class WindowStore {
  private readonly windows = new Map<string, { count: number; start: number }>();
  private readonly now: () => number;
  /** The library constructs a store with its options (unused here); tests pass a clock. */
  constructor(_options?: unknown, now: () => number = Date.now) {
    this.now = now;
  }

  private entry(key: string, windowMs: number, increment: boolean): { count: number; start: number } {
    const t = this.now();
    let w = this.windows.get(key);
    if (!w || w.start + windowMs <= t) {
      if (w) this.windows.delete(key);
      w = { count: 0, start: t };
      if (increment) {
        this.windows.set(key, w);
        if (this.windows.size > MAX_BUCKETS) this.windows.delete(this.windows.keys().next().value!);
      }
    }
    if (increment) w.count++;
    return w;
  }

  incr(key: string, cb: (err: Error | null, res?: { current: number; ttl: number }) => void, windowMs: number): void {
    const w = this.entry(key, windowMs, true);
    cb(null, { current: w.count, ttl: w.start + windowMs - this.now() });
  }

  read(key: string, cb: (err: Error | null, res?: { current: number; ttl: number }) => void, windowMs: number): void {
    const w = this.entry(key, windowMs, false);
    cb(null, { current: w.count, ttl: w.start + windowMs - this.now() });
  }

  child(): WindowStore {
    return new WindowStore(undefined, this.now);
  }
}

/** The bucket a request counts against: its accepted key, else its address. */
export function rateLimitBucket(keys: KeyRing, request: FastifyRequest): string {
  if (keys.enabled) {
    const caller = keys.identify(request);
    if (caller.key !== null) return caller.key;
  }
  return `addr:${request.ip}`;
}

export default fp(
  async function limits(app: FastifyInstance, opts: { max: number; windowMs: number; keys: KeyRing }) {
    if (opts.max <= 0) return;
    const windowS = Math.ceil(opts.windowMs / 1000);
    await app.register(rateLimit, {
      global: true,
      hook: 'onRequest',
      max: opts.max,
      timeWindow: opts.windowMs,
      store: WindowStore,
      keyGenerator: (request) => rateLimitBucket(opts.keys, request),
      allowList: (request) => UNLIMITED.has(request.routeOptions.url ?? ''),
      errorResponseBuilder: (_request, ctx) =>
        new ProblemError(
          problem(429, 'rate-limited', 'Too many requests', `At most ${ctx.max} requests per ${windowS} s for each API key or client address; retry after ${Math.max(1, Math.ceil(ctx.ttl / 1000))} s.`),
        ),
    });
  },
  { name: 'rate-limit' },
);
