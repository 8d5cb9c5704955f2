/**
 * Request ids and security headers on every answer.
 *
 * - Request id: taken from an incoming `x-request-id` when it is a short token of safe
 *   characters (so a caller's or a proxy's id follows the request through our logs), otherwise
 *   a fresh UUID; echoed in the `x-request-id` response header and logged as `reqId`.
 * - Headers for an API that browsers may call: no MIME sniffing, no framing, no referrer, a
 *   content security policy that forbids scripts (answers are data; HTML sheets and SVG figures
 *   may use inline styles and data: images), HSTS when the request came over HTTPS, and
 *   `cache-control: no-store` on refusals so that no cache keeps a 401 or a 429.
 */
import { randomUUID } from 'node:crypto';
import type { IncomingMessage } from 'node:http';
import type { FastifyInstance } from 'fastify';
import fp from 'fastify-plugin';

export const REQUEST_ID_HEADER = 'x-request-id';
const SAFE_ID = /^[A-Za-z0-9._:@/+=-]{1,128}$/;

/** Fastify's genReqId: the caller's id when it is safe to log and echo, else a new UUID. */
export function requestId(req: IncomingMessage): string {
  const given = req.headers[REQUEST_ID_HEADER];
  return typeof given === 'string' && SAFE_ID.test(given) ? given : randomUUID();
}

/** Applied when a route did not set a policy of its own (the /docs page sets its own). */
export const CONTENT_SECURITY_POLICY = "default-src 'none'; style-src 'unsafe-inline'; img-src data:; base-uri 'none'; form-action 'none'; frame-ancestors 'none'";
export const HSTS = 'max-age=31536000';

/** Adds `value` to a comma-separated response header such as Vary without repeating it. */
export function appendHeaderToken(current: unknown, value: string): string {
  const tokens = (Array.isArray(current) ? current.join(',') : typeof current === 'string' ? current : '')
    .split(',')
    .map((t) => t.trim())
    .filter((t) => t !== '');
  if (!tokens.some((t) => t.toLowerCase() === value.toLowerCase())) tokens.push(value);
  return tokens.join(', ');
}

export default fp(
  async function security(app: FastifyInstance) {
    // Callback-style hooks (no promise per request): they run on every answer.
    app.addHook('onRequest', (request, reply, done) => {
      reply.header(REQUEST_ID_HEADER, request.id);
      done();
    });
    app.addHook('onSend', (request, reply, payload, done) => {
      reply.header('x-content-type-options', 'nosniff');
      reply.header('x-frame-options', 'DENY');
      reply.header('referrer-policy', 'no-referrer');
      if (!reply.hasHeader('content-security-policy')) reply.header('content-security-policy', CONTENT_SECURITY_POLICY);
      if (request.protocol === 'https') reply.header('strict-transport-security', HSTS);
      if (reply.statusCode >= 400 && !reply.hasHeader('cache-control')) reply.header('cache-control', 'no-store');
      done(null, payload);
    });
  },
  { name: 'security-headers' },
);
