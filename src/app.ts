/**
 * buildApp: registers plugins, then routes. Used by the server and by tests (which build the
 * app without a port and close it after each test).
 */
import Fastify, { type FastifyBaseLogger, type FastifyInstance, type FastifyServerOptions } from 'fastify';
import { OneLineLog } from './plugins/request-log.js';
import type { TypeBoxTypeProvider } from '@fastify/type-provider-typebox';
import { CONFIG_DEFAULTS, type Config } from './config.js';
import caching from './plugins/caching.js';
import openapi from './plugins/openapi.js';
import problemDetails, { frameworkErrors } from './plugins/problem.js';
import { validatorCompiler } from './plugins/validation.js';
import { OPERATIONS } from './operations/index.js';
import { registerCheck } from './routes/v1/checks.js';
import catalogRoutes from './routes/v1/catalog.js';
import healthRoutes, { type ReadinessState } from './routes/health.js';
import batchRoutes from './routes/v1/batch.js';

export interface AppOptions {
  config?: Partial<Config>;
  logger?: FastifyServerOptions['logger'];
  /** A ready-made pino logger (the server passes one with an asynchronous destination). */
  loggerInstance?: FastifyBaseLogger;
  /** Shared with the server so that shutdown can turn readiness off. */
  readiness?: ReadinessState;
}

export async function buildApp(options: AppOptions = {}): Promise<FastifyInstance> {
  const config = { ...CONFIG_DEFAULTS, ...options.config };
  const app = Fastify({
    ...(options.loggerInstance ? { loggerInstance: options.loggerInstance } : { logger: options.logger ?? false }),
    logController: new OneLineLog(),
    bodyLimit: config.BODY_LIMIT,
    requestIdHeader: 'x-request-id',
    routerOptions: { maxParamLength: 200, ignoreTrailingSlash: true },
    frameworkErrors,
  }).withTypeProvider<TypeBoxTypeProvider>();
  app.setValidatorCompiler(validatorCompiler);
  // Only JSON (and NDJSON on the batch route) is accepted: a text body is a 415, not a parse attempt.
  app.removeContentTypeParser('text/plain');
  // Shared schemas go on the root before any plugin compiles a route against them.
  for (const op of OPERATIONS) app.addSchema(op.response);
  app.addHook('onSend', async (_request, reply, payload) => {
    reply.header('x-content-type-options', 'nosniff');
    return payload;
  });

  await app.register(problemDetails);
  await app.register(caching);
  await app.register(openapi, { docs: config.DOCS });
  await app.register(healthRoutes, { readiness: options.readiness ?? { ready: true } });
  await app.register(catalogRoutes);
  for (const op of OPERATIONS) registerCheck(app, op);
  await app.register(batchRoutes, { config, operations: OPERATIONS });
  // Some spreadsheet web functions probe a URL with OPTIONS, then HEAD, then GET, and give up
  // when OPTIONS fails: answer it on every path with the methods the service uses.
  app.options('*', { schema: { hide: true }, logLevel: 'warn' }, async (_request, reply) =>
    reply.code(204).header('allow', 'GET, HEAD, POST, OPTIONS').send(),
  );
  await app.ready();
  return app;
}
