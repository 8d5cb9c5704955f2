/**
 * The only file that listens, reads the environment and picks logger options. On SIGTERM or
 * SIGINT it turns readiness off, stops accepting connections, lets in-flight requests finish,
 * and exits within SHUTDOWN_TIMEOUT_MS.
 */
import pino from 'pino';
import { buildApp } from './app.js';
import { ConfigError, loadConfig } from './config.js';

async function main(): Promise<void> {
  let config;
  try {
    config = loadConfig(process.env);
  } catch (err) {
    if (err instanceof ConfigError) {
      process.stderr.write(`${err.message}\n`);
      process.exit(78);
    }
    throw err;
  }
  const readiness = { ready: true };
  // Asynchronous, buffered log destination: request logging must not block the event loop.
  const destination = pino.destination({ sync: false, minLength: 4096 });
  const logger = pino({ level: config.LOG_LEVEL, redact: ['req.headers.authorization', 'req.headers["x-api-key"]'] }, destination);
  const flushAndExit = (code: number): never => {
    try {
      destination.flushSync();
    } catch {
      // nothing more can be done about a log that cannot be written
    }
    process.exit(code);
  };
  const app = await buildApp({ config, readiness, loggerInstance: logger });
  // Buffered lines reach the log at least once a second, so a quiet service's log is not empty.
  setInterval(() => destination.flush(), 1000).unref();
  let stopping = false;
  const stop = (signal: string): void => {
    if (stopping) return;
    stopping = true;
    readiness.ready = false;
    app.log.info({ signal }, 'shutting down');
    const timer = setTimeout(() => {
      app.log.error('shutdown timed out; exiting');
      flushAndExit(1);
    }, config.SHUTDOWN_TIMEOUT_MS);
    timer.unref();
    app.close().then(
      () => flushAndExit(0),
      (err: unknown) => {
        app.log.error({ err }, 'error while closing');
        flushAndExit(1);
      },
    );
  };
  process.on('SIGTERM', () => stop('SIGTERM'));
  process.on('SIGINT', () => stop('SIGINT'));
  await app.listen({ host: config.HOST, port: config.PORT });
}

main().catch((err: unknown) => {
  process.stderr.write(`Throatline failed to start: ${err instanceof Error ? err.message : String(err)}\n`);
  process.exit(1);
});
