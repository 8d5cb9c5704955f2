/**
 * Liveness and readiness for orchestrators and load balancers.
 *
 * /healthz answers 200 while the process can answer at all (an orchestrator restarts a replica
 * whose liveness fails, so overload never fails it). /readyz answers 200 while the replica wants
 * new work, and 503 from the moment it is told to stop (`shutting-down`) or while its event
 * loop lags (`overloaded`), so that traffic goes to other replicas.
 */
import type { FastifyInstance } from 'fastify';
import { Type } from 'typebox';

const Health = Type.Object({ status: Type.String() }, { additionalProperties: false });

export interface ReadinessState {
  ready: boolean;
}

export default async function healthRoutes(app: FastifyInstance, opts: { readiness: ReadinessState; overloaded?: () => boolean }): Promise<void> {
  const overloaded = opts.overloaded ?? (() => false);
  app.get('/healthz', { schema: { operationId: 'health', tags: ['service'], summary: 'Liveness: the process answers', response: { 200: Health } }, logLevel: 'warn' }, async () => ({ status: 'ok' }));
  app.get('/readyz', {
    schema: { operationId: 'ready', tags: ['service'], summary: 'Readiness: 200 while accepting work, 503 while shutting down or overloaded', response: { 200: Health, 503: Health } },
    logLevel: 'warn',
    handler: async (_req, reply) => {
      reply.header('cache-control', 'no-store');
      if (!opts.readiness.ready) return reply.code(503).send({ status: 'shutting-down' });
      if (overloaded()) return reply.code(503).send({ status: 'overloaded' });
      return { status: 'ready' };
    },
  });
}
