/**
 * Request logging that costs little per request and keeps what an operator needs.
 *
 * - One line per request, written when the response has gone: request id, method, path (no
 *   query string, no body), status and milliseconds, in the same JSON line shape as every other
 *   log line of the service (level, time, pid, hostname, reqId, ..., msg). On the success path
 *   the line is formatted here and handed to the logger's own destination (asynchronous and
 *   buffered in the server), which costs a fraction of a general log call with an object; a
 *   request that failed is logged at error level through the logger, with the error.
 * - Per-request child loggers are made only when something logs for that request: the
 *   framework asks for one per request, and making it eagerly cost more than the whole log line.
 *   Lines written through `request.log` still carry `reqId`.
 */
import { LogController, type FastifyBaseLogger, type FastifyReply, type FastifyRequest } from 'fastify';
import pino from 'pino';
import type { Bindings, ChildLoggerOptions } from 'pino';

/** A request's logger: the real child logger is made on the first call. */
export class LazyChildLogger {
  private real: FastifyBaseLogger | undefined;
  constructor(
    private readonly parent: FastifyBaseLogger,
    private readonly bindings: Bindings,
    private readonly options: ChildLoggerOptions,
  ) {}

  get log(): FastifyBaseLogger {
    return (this.real ??= this.parent.child(this.bindings, this.options));
  }

  get level(): string {
    return this.options.level ?? this.parent.level;
  }

  set level(level: string) {
    this.log.level = level;
  }

  declare fatal: LogMethod;
  declare error: LogMethod;
  declare warn: LogMethod;
  declare info: LogMethod;
  declare debug: LogMethod;
  declare trace: LogMethod;
  silent(): void {}

  child(bindings: Bindings, options?: ChildLoggerOptions): FastifyBaseLogger {
    return this.log.child(bindings, options);
  }
}

type LogMethod = (...args: unknown[]) => void;

// The level methods pass the call on to the real child logger, made on the first of them.
for (const level of ['fatal', 'error', 'warn', 'info', 'debug', 'trace'] as const) {
  Object.defineProperty(LazyChildLogger.prototype, level, {
    value: function (this: { log: Record<string, LogMethod> }, ...args: unknown[]): void {
      this.log[level]!(...args);
    },
    writable: true,
    configurable: true,
  });
}

/** For the framework's `childLoggerFactory` option. */
export function lazyChildLogger(this: unknown, logger: FastifyBaseLogger, bindings: Bindings, options: ChildLoggerOptions): FastifyBaseLogger {
  return new LazyChildLogger(logger, bindings, options) as unknown as FastifyBaseLogger;
}

const DEFAULT_FORMATTERS = (pino({ enabled: false }) as unknown as Record<symbol, { level?: unknown; log?: unknown }>)[pino.symbols.formattersSym] ?? {};

/** Where a pino logger writes, and the bindings it writes on every line (pid, hostname). */
interface PinoSink {
  stream: { write(line: string): unknown };
  chindings: string;
}

function pinoSink(log: FastifyBaseLogger): PinoSink | null {
  const stream = (log as unknown as Record<symbol, unknown>)[pino.symbols.streamSym] as PinoSink['stream'] | undefined;
  const chindings = (log as unknown as Record<symbol, unknown>)[pino.symbols.chindingsSym];
  if (!stream || typeof stream.write !== 'function' || typeof chindings !== 'string') return null;
  // Our own line only where pino would write the same: epoch time, "msg", no mixin, no log-method
  // hook, no message prefix, and the default level and log formatters (compared with those of
  // a plain pino logger). Otherwise every line goes through the logger.
  const l = log as unknown as Record<symbol, unknown>;
  const hooks = l[pino.symbols.hooksSym] as { logMethod?: unknown } | undefined;
  const formatters = l[pino.symbols.formattersSym] as { level?: unknown; log?: unknown } | undefined;
  if (l[pino.symbols.mixinSym] || hooks?.logMethod || l[(pino.symbols as unknown as Record<string, symbol>).msgPrefixSym!]) return null;
  if (l[pino.symbols.messageKeySym] !== 'msg' || l[pino.symbols.timeSym] !== pino.stdTimeFunctions.epochTime) return null;
  if (formatters?.level !== DEFAULT_FORMATTERS.level || formatters?.log !== DEFAULT_FORMATTERS.log) return null;
  return { stream, chindings };
}

export class OneLineLog extends LogController {
  private sink: PinoSink | null | undefined;

  constructor() {
    super({ requestIdLogLabel: 'reqId' });
  }

  override incomingRequest(): void {
    // nothing: the single line is written on completion
  }

  override requestCompleted(error: Error | null, request: FastifyRequest, reply: FastifyReply): void {
    const q = request.url.indexOf('?');
    const path = q === -1 ? request.url : request.url.slice(0, q);
    const ms = Math.round(reply.elapsedTime * 100) / 100;
    if (!error) {
      if (this.sink === undefined) this.sink = pinoSink(request.server.log);
      const sink = this.sink;
      if (sink !== null) {
        // The request's level (a route may log at warn only); reading it makes no child logger.
        const level = request.log.level;
        if (level !== 'info' && level !== 'debug' && level !== 'trace') return;
        sink.stream.write(
          `{"level":30,"time":${Date.now()}${sink.chindings},"reqId":${JSON.stringify(request.id)},"method":"${request.method}","path":${JSON.stringify(path)},"status":${reply.statusCode},"ms":${ms},"msg":"request"}\n`,
        );
        return;
      }
    }
    const line = { method: request.method, path, status: reply.statusCode, ms };
    if (error) reply.log.error({ ...line, err: error }, 'request failed');
    else reply.log.info(line, 'request');
  }
}
