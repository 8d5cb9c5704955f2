/**
 * Optional API-key authentication. The environment holds only SHA-256 hashes of the accepted
 * keys (API_KEY_HASHES), never the keys. A caller sends its key as `Authorization: Bearer <key>`
 * or in the `x-throatline-key` header; the service hashes what it got and compares the hash with
 * every accepted hash through crypto.timingSafeEqual, always all of them, so neither the time
 * taken nor an early exit tells how close a guess came or which key matched.
 *
 * Open without a key: /healthz and /readyz (probes), the contract (/openapi.json,
 * /openapi.yaml) and the reference page (/docs), which describe the API and hold no data, and
 * CORS preflights. /metrics is open unless METRICS_REQUIRE_KEY=true. Everything else answers
 * 401 (a problem document with `WWW-Authenticate: Bearer`) without a valid key. With no hashes
 * configured, authentication is off.
 */
import { createHash, timingSafeEqual } from 'node:crypto';
import type { FastifyInstance, FastifyReply, FastifyRequest, RouteOptions } from 'fastify';
import fp from 'fastify-plugin';
import { problem, sendProblem } from './problem.js';

export const KEY_HEADER = 'x-throatline-key';

/** Paths of headers that carry credentials, for pino's redact option. */
export const REDACT_PATHS = [
  'req.headers.authorization',
  `req.headers["${KEY_HEADER}"]`,
  'req.headers.cookie',
  'headers.authorization',
  `headers["${KEY_HEADER}"]`,
  'headers.cookie',
  'request.headers.authorization',
  `request.headers["${KEY_HEADER}"]`,
];

/** Longest key the service will hash; anything longer cannot be one of ours. */
const MAX_KEY_LENGTH = 512;

/** Who is calling: an accepted key (named by a short prefix of its hash, safe to log) or nobody. */
export type Caller = { key: string } | { key: null; reason: 'missing' | 'invalid' };

const callers = new WeakMap<FastifyRequest, Caller>();

/** The key a request presents, from either header; undefined when it presents none. */
export function presentedKey(request: FastifyRequest): string | undefined {
  const auth = request.headers.authorization;
  if (typeof auth === 'string') {
    const m = /^Bearer[ \t]+(\S+)[ \t]*$/i.exec(auth);
    return m ? m[1]! : '';
  }
  const header = request.headers[KEY_HEADER];
  if (typeof header === 'string') return header.trim();
  return undefined;
}

export class KeyRing {
  private readonly hashes: Buffer[];
  private readonly ids: string[];

  constructor(hexHashes: readonly string[]) {
    this.hashes = hexHashes.map((h) => Buffer.from(h, 'hex'));
    this.ids = hexHashes.map((h) => `key-${h.slice(0, 8)}`);
  }

  get enabled(): boolean {
    return this.hashes.length > 0;
  }

  /** The id of the accepted key `key` hashes to, or null. Compares with every hash, in constant time each. */
  match(key: string): string | null {
    const digest = createHash('sha256').update(key, 'utf8').digest();
    let found = -1;
    for (let i = 0; i < this.hashes.length; i++) {
      if (timingSafeEqual(digest, this.hashes[i]!) && found === -1) found = i;
    }
    return found === -1 ? null : this.ids[found]!;
  }

  /** Who the request's caller is; computed once per request (the rate limiter asks first). */
  identify(request: FastifyRequest): Caller {
    let c = callers.get(request);
    if (c) return c;
    const key = presentedKey(request);
    if (key === undefined || key === '') c = { key: null, reason: 'missing' };
    else if (key.length > MAX_KEY_LENGTH) c = { key: null, reason: 'invalid' };
    else {
      const id = this.match(key);
      c = id === null ? { key: null, reason: 'invalid' } : { key: id };
    }
    callers.set(request, c);
    return c;
  }
}

/** Routes that answer without a key: probes, the contract and its reference page. */
export function isOpenRoute(url: string | undefined, metricsOpen: boolean): boolean {
  if (url === undefined) return false;
  if (url === '/healthz' || url === '/readyz' || url === '/openapi.json' || url === '/openapi.yaml') return true;
  if (url === '/docs' || url.startsWith('/docs/')) return true;
  return url === '/metrics' && metricsOpen;
}

export function unauthorized(reply: FastifyReply, reason: 'missing' | 'invalid'): FastifyReply {
  const detail =
    reason === 'missing'
      ? `This service needs an API key: send it as "Authorization: Bearer <key>" or in the ${KEY_HEADER} header.`
      : 'The API key is not valid.';
  reply.header('www-authenticate', 'Bearer realm="throatline"');
  return sendProblem(reply, problem(401, 'unauthorized', 'Unauthorized', detail));
}

/**
 * Adds the key check to every route registered after it (as a route-level onRequest hook, so
 * that it runs after the rate limiter: floods of bad keys are limited per address too).
 */
export default fp(
  async function auth(app: FastifyInstance, opts: { keys: KeyRing; metricsRequireKey: boolean }) {
    const { keys } = opts;
    if (!keys.enabled) return;
    const check = async (request: FastifyRequest, reply: FastifyReply) => {
      if (request.method === 'OPTIONS') return;
      const caller = keys.identify(request);
      if (caller.key === null) return unauthorized(reply, caller.reason);
      return;
    };
    app.addHook('onRoute', (route: RouteOptions) => {
      if (isOpenRoute(route.url, !opts.metricsRequireKey)) return;
      const existing = route.onRequest;
      route.onRequest = existing === undefined ? [check] : Array.isArray(existing) ? [...existing, check] : [existing, check];
    });
  },
  { name: 'auth' },
);
