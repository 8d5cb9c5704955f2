/**
 * buildApp: registers plugins, then routes. Used by the server and by tests (which build the
 * app without a port and close it after each test).
 *
 * Order matters for the hooks that every request meets, in this order: request id and security
 * headers; CORS (a preflight is answered here, and refusals below still carry the CORS headers a
 * browser needs to read them); metrics; load shedding; then, per route, the rate limit and the
 * API-key check; then body parsing (size and depth limits) and the route itself.
 */
import type { Server as HttpServer } from 'node:http';
import { getHeapStatistics } from 'node:v8';
import Fastify, { type FastifyBaseLogger, type FastifyInstance, type FastifyServerOptions } from 'fastify';
import { lazyChildLogger, OneLineLog } from './plugins/request-log.js';
import type { TypeBoxTypeProvider } from '@fastify/type-provider-typebox';
import { apiKeyHashes, corsOrigins, resolveConfig, trustProxy, type Config } from './config.js';
import auth, { KeyRing, REDACT_PATHS } from './plugins/auth.js';
import availability, { LoadMonitor } from './plugins/availability.js';
import caching from './plugins/caching.js';
import deadlines from './plugins/deadlines.js';
import { warmUp } from './plugins/lazy-compile.js';
import { clientErrorHandler } from './plugins/client-errors.js';
import cors from './plugins/cors.js';
import jsonBody from './plugins/json-body.js';
import metricsPlugin, { instrument, metricsRoute, ServiceMetrics } from './plugins/metrics.js';
import openapi from './plugins/openapi.js';
import { cachingSerializerFactory } from './plugins/serializers.js';
import problemDetails, { frameworkErrors } from './plugins/problem.js';
import rateLimits from './plugins/rate-limit.js';
import security, { requestId } from './plugins/security.js';
import { validatorCompiler } from './plugins/validation.js';
import { OPERATIONS } from './operations/index.js';
import { registerCheck } from './routes/v1/checks.js';
import catalogRoutes from './routes/v1/catalog.js';
import healthRoutes, { type ReadinessState } from './routes/health.js';
import batchRoutes from './routes/v1/batch.js';
import { Lanes } from './routes/v1/lanes.js';
import bodyHold, { ByteAllowance } from './plugins/body-hold.js';

export interface AppOptions {
  /** Settings over the defaults; validated like the environment (a bad one throws ConfigError). */
  config?: Partial<Config>;
  logger?: FastifyServerOptions['logger'];
  /** A ready-made pino logger (the server passes one with an asynchronous destination). */
  loggerInstance?: FastifyBaseLogger;
  /** Shared with the server so that shutdown can turn readiness off. */
  readiness?: ReadinessState;
  /** Load shedding's view of the event loop (tests pass one with a simulated delay). */
  loadMonitor?: LoadMonitor;
}

/** Adds credential redaction to a logger configuration given as options. */
function withRedaction(logger: FastifyServerOptions['logger']): FastifyServerOptions['logger'] {
  if (logger === true) return { redact: REDACT_PATHS };
  if (logger && typeof logger === 'object' && !('child' in logger)) return { redact: REDACT_PATHS, ...logger };
  return logger ?? false;
}

/** TRUST_PROXY for Fastify: a hop count becomes "trust the nearest n hops". */
function fastifyTrustProxy(value: boolean | number | string[]): boolean | string[] | ((address: string, hop: number) => boolean) {
  return typeof value === 'number' ? (_address: string, hop: number) => hop < value : value;
}

export async function buildApp(options: AppOptions = {}): Promise<FastifyInstance> {
  const config = resolveConfig(options.config);
  const readiness = options.readiness ?? { ready: true };
  const monitor = options.loadMonitor ?? new LoadMonitor({ limitMs: config.OVERLOAD_EVENT_LOOP_DELAY_MS });
  const keys = new KeyRing(apiKeyHashes(config));
  const metrics = new ServiceMetrics();
  const operations = OPERATIONS.map((op) => instrument(op, metrics));
  const lanes = new Lanes(config.BATCH_CONCURRENCY);
  // An eighth of the heap: with a 384 MB old generation, sixteen 25 MB batches sent at once
  // peaked at 376 MiB resident on Node 20, and at 445 MiB on Node 24 with the manifest's 16 MB
  // semi-spaces (two taken at a time); a quarter let four in and peaked at 478-510 MiB on Node 20.
  const held = new ByteAllowance(config.BODY_HOLD_BYTES || Math.floor(getHeapStatistics().heap_size_limit / 8));

  const app = Fastify({
    ...(options.loggerInstance ? { loggerInstance: options.loggerInstance } : { logger: withRedaction(options.logger) }),
    logController: new OneLineLog(),
    childLoggerFactory: lazyChildLogger,
    bodyLimit: config.BODY_LIMIT,
    genReqId: requestId,
    trustProxy: fastifyTrustProxy(trustProxy(config)),
    // Whole request received within the longest any route allows; each route that takes a body
    // has its own, shorter deadline (plugins/deadlines.ts).
    requestTimeout: config.BATCH_TIMEOUT_MS,
    // Requests that arrive on an open connection while the app closes are still answered.
    return503OnClosing: false,
    routerOptions: { maxParamLength: 200, ignoreTrailingSlash: true },
    frameworkErrors,
    clientErrorHandler,
    schemaController: { compilersFactory: { buildSerializer: cachingSerializerFactory as never } },
  }).withTypeProvider<TypeBoxTypeProvider>();
  (app.server as HttpServer).headersTimeout = Math.min(config.REQUEST_TIMEOUT_MS, 60000);
  app.setValidatorCompiler(validatorCompiler);
  // Only JSON (and NDJSON on the batch route) is accepted: a text body is a 415, not a parse attempt.
  app.removeContentTypeParser('text/plain');
  // Shared schemas go on the root before any plugin compiles a route against them.
  for (const op of OPERATIONS) app.addSchema(op.response);

  await app.register(problemDetails);
  await app.register(jsonBody, { maxDepth: config.JSON_MAX_DEPTH });
  await app.register(bodyHold, { allowance: held });
  await app.register(security);
  await app.register(cors, { origins: corsOrigins(config) });
  await app.register(metricsPlugin, { metrics });
  await app.register(availability, { monitor, readiness });
  await app.register(rateLimits, { max: config.RATE_LIMIT_MAX, windowMs: config.RATE_LIMIT_WINDOW_MS, keys });
  await app.register(auth, { keys, metricsRequireKey: config.METRICS_REQUIRE_KEY });
  await app.register(caching, { private: keys.enabled });
  // Routes with a body get a deadline (a stalled upload is a 408), watched by one sweep per app.
  await app.register(deadlines, { requestMs: config.REQUEST_TIMEOUT_MS, batchMs: config.BATCH_TIMEOUT_MS });
  await app.register(openapi, { docs: config.DOCS });
  await app.register(healthRoutes, { readiness, overloaded: () => monitor.overloaded });
  if (config.METRICS) {
    metricsRoute(app, metrics, () => ({
      ready: readiness.ready && !monitor.overloaded,
      overloaded: monitor.overloaded,
      eventLoopDelayMs: monitor.delayMs,
      batchesAnswering: lanes.busy,
      batchesWaiting: lanes.waiting,
      bodyBytesHeld: held.held,
    }));
  }
  await app.register(catalogRoutes);
  for (const op of operations) registerCheck(app, op, { chromiumPath: config.CHROMIUM_PATH });
  await app.register(batchRoutes, { config, operations, lanes });
  // Some spreadsheet web functions probe a URL with OPTIONS, then HEAD, then GET, and give up
  // when OPTIONS fails: answer it on every path with the methods the service uses.
  app.options('*', { schema: { hide: true }, logLevel: 'warn' }, async (_request, reply) =>
    reply.code(204).header('allow', 'GET, HEAD, POST, OPTIONS').send(),
  );
  // Validators and serializers compile on first use; once listening, the rest compile in the
  // background, a schema per turn of the event loop.
  app.addHook('onListen', (done) => {
    void warmUp();
    done();
  });
  await app.ready();
  return app;
}
