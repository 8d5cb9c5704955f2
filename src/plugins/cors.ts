/**
 * CORS for browser-based firm tools: an allow-list of exact origins (CORS_ORIGINS). An allowed
 * origin gets `access-control-allow-origin` with itself (never `*`) on every answer, refusals
 * included, so that a tool can read a 401, 429 or 400 problem; a preflight from it is answered
 * here, before authentication (browsers send no credentials on a preflight). Any other origin
 * gets no CORS headers, so its browser withholds the answer. No cookies are used, so
 * credentials are never allowed.
 */
import type { FastifyInstance } from 'fastify';
import fp from 'fastify-plugin';
import { REQUEST_ID_HEADER, appendHeaderToken } from './security.js';

export const CORS_ALLOWED_METHODS = 'GET, HEAD, POST';
export const CORS_ALLOWED_HEADERS = `authorization, content-type, if-none-match, ${REQUEST_ID_HEADER}, x-throatline-key`;
export const CORS_EXPOSED_HEADERS = `content-disposition, etag, retry-after, ${REQUEST_ID_HEADER}, x-ratelimit-limit, x-ratelimit-remaining, x-ratelimit-reset`;
/** How long a browser may reuse a preflight answer, seconds. */
export const CORS_MAX_AGE = 600;

export default fp(
  async function cors(app: FastifyInstance, opts: { origins: readonly string[] }) {
    if (opts.origins.length === 0) return;
    const allowed = new Set(opts.origins);
    app.addHook('onRequest', (request, reply, done) => {
      const origin = request.headers.origin;
      if (origin === undefined || !allowed.has(origin)) {
        done();
        return;
      }
      reply.header('access-control-allow-origin', origin);
      reply.header('access-control-expose-headers', CORS_EXPOSED_HEADERS);
      if (request.method === 'OPTIONS' && request.headers['access-control-request-method'] !== undefined) {
        reply
          .code(204)
          .header('access-control-allow-methods', CORS_ALLOWED_METHODS)
          .header('access-control-allow-headers', CORS_ALLOWED_HEADERS)
          .header('access-control-max-age', String(CORS_MAX_AGE))
          .header('content-length', '0')
          .send();
        return;
      }
      done();
    });
    // The answer depends on Origin: say so to caches (appended, whatever else Vary holds).
    app.addHook('onSend', (_request, reply, payload, done) => {
      reply.header('vary', appendHeaderToken(reply.getHeader('vary'), 'origin'));
      done(null, payload);
    });
  },
  { name: 'cors' },
);
