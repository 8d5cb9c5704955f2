/**
 * Caching for GET answers: the same query always gives the same bytes from the same engine
 * version, so spreadsheets and proxies may reuse them. Adds a strong ETag (a hash of the body),
 * answers 304 to a matching If-None-Match, and a Cache-Control lifetime. With API keys on, the
 * lifetime is `private`: a shared cache must not hand one caller's answer to another who has
 * no key.
 */
import { hash } from 'node:crypto';
import type { FastifyInstance } from 'fastify';
import fp from 'fastify-plugin';
import { appendHeaderToken } from './security.js';

export const CACHE_CONTROL = 'public, max-age=3600';
export const CACHE_CONTROL_PRIVATE = 'private, max-age=3600';

export default fp(
  async function caching(app: FastifyInstance, opts: { private?: boolean }) {
    const cacheControl = opts.private ? CACHE_CONTROL_PRIVATE : CACHE_CONTROL;
    app.addHook('onSend', (request, reply, payload, done) => {
      if (request.method !== 'GET' && request.method !== 'HEAD') return done(null, payload);
      if (reply.statusCode !== 200 || !request.url.startsWith('/v1/')) return done(null, payload);
      if (typeof payload !== 'string' && !Buffer.isBuffer(payload)) return done(null, payload);
      const etag = `"${hash('sha1', payload, 'base64url')}"`;
      reply.header('etag', etag);
      reply.header('cache-control', cacheControl);
      reply.header('vary', appendHeaderToken(reply.getHeader('vary'), 'accept'));
      const match = request.headers['if-none-match'];
      if (match !== undefined && match.split(',').some((t) => t.trim() === etag || t.trim() === '*')) {
        reply.code(304);
        return done(null, '');
      }
      return done(null, payload);
    });
  },
  { name: 'caching' },
);
