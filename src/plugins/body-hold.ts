/**
 * The bytes of request bodies a replica holds at once: arriving, waiting (a JSON batch waits for
 * a lane as text, routes/v1/lanes.ts) or being answered. Each body takes its bytes before it is
 * kept: all of them when its length is declared, otherwise chunk by chunk as they arrive. One
 * that does not fit is read to its end and dropped (nothing of it kept), then answered 503 with
 * Retry-After; answered while the client still sends, the refusal could reach it as a broken
 * pipe instead of an answer it can retry (a client that sent Expect: 100-continue is refused
 * before it sends anything). One body always fits when none is held, so a body of
 * any size a route allows can be answered. The bytes are given back when the response closes,
 * or sooner when a route is done with its body (a batch, once computed). NDJSON streams hold no
 * body and take nothing.
 *
 * Why: nothing else bounded the sum. Sixteen 25 MB batches sent together ended the process with
 * "JavaScript heap out of memory" under the Kubernetes manifest's 384 MB heap, eight took the
 * resident size past its 512 MiB memory limit, and 400 connections each holding all but the
 * last byte of a 1 MB check body took it to 547 MiB.
 */

import { pipeline, Transform } from 'node:stream';
import type { FastifyInstance, FastifyReply, FastifyRequest } from 'fastify';
import fp from 'fastify-plugin';
import { problem, ProblemError } from './problem.js';

export class ByteAllowance {
  private inUse = 0;

  constructor(readonly limit: number) {}

  /** Bytes held now. */
  get held(): number {
    return this.inUse;
  }

  /** Takes `n` bytes when they fit under the limit, or when none are held; false otherwise. */
  take(n: number): boolean {
    if (this.inUse > 0 && this.inUse + n > this.limit) return false;
    this.inUse += n;
    return true;
  }

  give(n: number): void {
    this.inUse -= n;
  }
}

/** One request's bytes, given back once; after that it takes nothing more. */
export class Holding {
  private bytes = 0;
  private over = false;

  constructor(private readonly allowance: ByteAllowance) {}

  get held(): number {
    return this.bytes;
  }

  /** Adds `n` bytes to this request's share; false when they do not fit, or it was released. */
  take(n: number): boolean {
    if (this.over || !this.allowance.take(n)) return false;
    this.bytes += n;
    return true;
  }

  release(): void {
    if (this.over) return;
    this.over = true;
    this.allowance.give(this.bytes);
    this.bytes = 0;
  }
}

declare module 'fastify' {
  interface FastifyRequest {
    /** This request's share of the body allowance (null: it holds no body). */
    holding: Holding | null;
  }
  interface FastifyContextConfig {
    /** Seconds a request of this route refused for want of room is told to wait (default 2). */
    holdRetryS?: number;
  }
}

const STREAMED = /^\s*application\/x-ndjson/i;
const CONTINUE = /^\s*100-continue\s*$/i;

/**
 * Bodies of at most this many bytes, declared, are not counted: a connection's own socket
 * buffers are of this size, and a check's body is well under 1 kB. Counting them cost the fillet
 * route 2.5-3 µs per request (+3.5 %, alternating runs); 400 connections holding 64 KiB each are
 * 25 MiB.
 */
export const SMALL_BODY = 65536;

export default fp(
  async function bodyHold(app: FastifyInstance, opts: { allowance: ByteAllowance }) {
    const { allowance } = opts;
    app.decorateRequest('holding', null);
    const busy = (request: FastifyRequest, reply: FastifyReply): ProblemError => {
      const retry = request.routeOptions.config.holdRetryS ?? 2;
      reply.header('retry-after', String(retry));
      return new ProblemError(
        problem(503, 'bodies-busy', 'Busy receiving other requests', `This replica already holds ${(allowance.held / 1048576).toFixed(1)} MiB of request bodies, the most it takes at once; retry in ${retry} s (large batches: send smaller ones, or stream the items as NDJSON).`),
      );
    };
    // A client that asks before sending its body (Expect: 100-continue, as some HTTP libraries
    // do for large uploads) is told to go ahead here, once its body has room, rather than by
    // Node at once: without room it gets the 503 before sending anything, and a request refused
    // earlier (key, rate limit, overload) never sends its body either.
    app.server.on('checkContinue', (req, res) => app.server.emit('request', req, res));
    const asksFirst = (request: FastifyRequest): boolean => request.headers.expect !== undefined && CONTINUE.test(request.headers.expect);
    const goAhead = (request: FastifyRequest, reply: FastifyReply): void => {
      if (asksFirst(request) && !reply.raw.headersSent) reply.raw.writeContinue();
    };
    // Callback style (no promise per request): it runs on every request with a body.
    app.addHook('preParsing', (request, reply, payload, done) => {
      const declared = request.headers['content-length'];
      // No body, a small one or a stream: not counted (see SMALL_BODY; a length of six digits or
      // more is over it without reading the number).
      if (
        (declared === undefined ? request.headers['transfer-encoding'] === undefined : declared.length < 6 && Number(declared) <= SMALL_BODY) ||
        STREAMED.test(request.headers['content-type'] ?? '')
      ) {
        goAhead(request, reply);
        return done(null, payload);
      }
      const holding = new Holding(allowance);
      request.holding = holding;
      reply.raw.once('close', () => holding.release());
      if (declared !== undefined) {
        const n = Number(declared);
        // Over the route's body limit: the framework refuses it (413) without reading it.
        if (n > request.routeOptions.bodyLimit!) return done(null, payload);
        if (holding.take(n)) {
          goAhead(request, reply);
          return done(null, payload);
        }
        // Not sent yet: refuse at once.
        if (asksFirst(request)) return done(busy(request, reply));
        payload.on('error', () => {}); // the client left: there is no one to answer
        payload.once('end', () => done(busy(request, reply)));
        payload.resume();
        return;
      }
      goAhead(request, reply);
      let refused = false;
      done(
        null,
        pipeline(
          payload,
          new Transform({
            transform(chunk: Buffer, _encoding, next) {
              if (!refused && !holding.take(chunk.length)) refused = true;
              next(null, refused ? undefined : chunk);
            },
            flush(next) {
              next(refused ? busy(request, reply) : null);
            },
          }),
          () => {}, // an error reaches the framework through the returned stream
        ),
      );
    });
  },
  { name: 'body-hold' },
);
