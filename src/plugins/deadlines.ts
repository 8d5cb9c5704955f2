/**
 * Deadlines for routes that take a body: a request whose body stalls (a slow or stopped upload)
 * or whose answer takes too long gets a 408 problem once its route's time has passed, and its
 * connection is closed after the answer.
 *
 * One watch per app replaces the framework's per-request handler timeout: that one arms a timer
 * and an AbortController for every request and aborts the controller when the request ends,
 * which built a DOMException with a stack trace each time and cost more CPU than the whole fillet
 * calculation, its validation and its serialization together (measured with `npm run bench`,
 * see the README's performance section). Here a request with a deadline costs a clock reading,
 * one Map insert and one delete; a periodic sweep finds the late ones, so a deadline fires
 * between its time and its time plus one sweep interval (a quarter of the shortest deadline,
 * from 25 ms to a second).
 */
import type { FastifyInstance, FastifyReply, FastifyRequest, onRequestHookHandler, onResponseHookHandler, RouteOptions } from 'fastify';
import fp from 'fastify-plugin';
import { problem, ProblemError } from './problem.js';

/** Sweep interval bounds, ms. */
const MIN_SWEEP_MS = 25;
const MAX_SWEEP_MS = 1000;

export const REQUEST_TIMEOUT_PROBLEM = () =>
  problem(408, 'request-timeout', 'Request timeout', 'The request was not received and answered within the time this service allows; send the body without pauses, or split a large batch.');

export class DeadlineWatch {
  /** Requests in flight with a deadline, the time it falls due (ms since the epoch), and their reply. */
  private readonly due = new Map<FastifyRequest, { at: number; reply: FastifyReply }>();
  private timer: NodeJS.Timeout | undefined;
  readonly sweepMs: number;

  constructor(shortestDeadlineMs: number) {
    this.sweepMs = Math.min(MAX_SWEEP_MS, Math.max(MIN_SWEEP_MS, Math.floor(shortestDeadlineMs / 4)));
  }

  /** The hooks a route with a deadline of `ms` gets (route-level, so other routes pay nothing). */
  hooks(ms: number): { onRequest: onRequestHookHandler; onResponse: onResponseHookHandler } {
    const due = this.due;
    return {
      onRequest: (request, reply, done) => {
        due.set(request, { at: Date.now() + ms, reply });
        done();
      },
      onResponse: (request, _reply, done) => {
        due.delete(request);
        done();
      },
    };
  }

  start(): void {
    if (this.timer) return;
    this.timer = setInterval(() => this.sweep(Date.now()), this.sweepMs);
    this.timer.unref();
  }

  stop(): void {
    if (this.timer) clearInterval(this.timer);
    this.timer = undefined;
  }

  /** Answers (or, when the answer has begun, cuts off) every request past its deadline. */
  sweep(now: number): void {
    for (const [request, { at, reply }] of this.due) {
      // A request whose client went away ends without an answer (so without onResponse): drop
      // it at the next sweep rather than holding it, and its body, until its deadline.
      if (reply.raw.destroyed || request.raw.destroyed) {
        this.due.delete(request);
        continue;
      }
      if (at > now) continue;
      this.due.delete(request);
      if (reply.sent) continue;
      if (reply.raw.headersSent) {
        reply.raw.destroy(new ProblemError(REQUEST_TIMEOUT_PROBLEM()));
        continue;
      }
      reply.send(new ProblemError(REQUEST_TIMEOUT_PROBLEM()));
    }
  }

  get pending(): number {
    return this.due.size;
  }
}

/**
 * Gives every route with a body a deadline: `batchMs` on /v1/batch, `requestMs` on the other
 * POST routes. Routes without a body need none: their headers are bounded by the server's
 * headersTimeout and their handlers do bounded work.
 */
export default fp(
  async function deadlines(app: FastifyInstance, opts: { requestMs: number; batchMs: number }) {
    const watch = new DeadlineWatch(Math.min(opts.requestMs, opts.batchMs));
    const request = watch.hooks(opts.requestMs);
    const batch = watch.hooks(opts.batchMs);
    app.addHook('onRoute', (route: RouteOptions) => {
      const methods = Array.isArray(route.method) ? route.method : [route.method];
      if (!methods.some((m) => m === 'POST' || m === 'PUT' || m === 'PATCH')) return;
      const h = route.url === '/v1/batch' ? batch : request;
      route.onRequest = appendHook(route.onRequest, h.onRequest);
      route.onResponse = appendHook(route.onResponse, h.onResponse);
    });
    app.addHook('onListen', async () => watch.start());
    app.addHook('onClose', async () => watch.stop());
    app.decorate('deadlines', watch);
  },
  { name: 'deadlines' },
);

function appendHook<H>(existing: H | H[] | undefined, hook: H): H[] {
  return existing === undefined ? [hook] : Array.isArray(existing) ? [...existing, hook] : [existing, hook];
}

declare module 'fastify' {
  interface FastifyInstance {
    deadlines: DeadlineWatch;
  }
}
