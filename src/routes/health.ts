/** Liveness and readiness for orchestrators and load balancers. */
import type { FastifyInstance } from 'fastify';
import { Type } from 'typebox';

const Health = Type.Object({ status: Type.String() }, { additionalProperties: false });

export interface ReadinessState {
  ready: boolean;
}

export default async function healthRoutes(app: FastifyInstance, opts: { readiness: ReadinessState }): Promise<void> {
  app.get('/healthz', { schema: { operationId: 'health', tags: ['service'], summary: 'Liveness: the process answers', response: { 200: Health } }, logLevel: 'warn' }, async () => ({ status: 'ok' }));
  app.get('/readyz', {
    schema: { operationId: 'ready', tags: ['service'], summary: 'Readiness: 200 while accepting work, 503 while shutting down', response: { 200: Health, 503: Health } },
    logLevel: 'warn',
    handler: async (_req, reply) => (opts.readiness.ready ? { status: 'ready' } : reply.code(503).send({ status: 'shutting-down' })),
  });
}
