/**
 * The only file that listens, reads the environment and picks logger options.
 *
 * Shutdown, the way an orchestrator expects it. On SIGTERM (or SIGINT):
 *   1. readiness turns off at once: /readyz answers 503, and every answer carries
 *      `connection: close` so keep-alive clients reconnect elsewhere;
 *   2. for DRAIN_DELAY_MS the service keeps answering everything as usual: this is the time the
 *      orchestrator takes to stop routing new connections to this replica;
 *   3. the listener closes. Connections already accepted stay open: one with a request in
 *      flight gets its answer (then closes); one that has not sent a request yet gets
 *      IDLE_GRACE_MS to send it, after which idle connections are closed;
 *   4. once every connection has ended the app closes and the process exits 0, or exits 1 when
 *      SHUTDOWN_TIMEOUT_MS after the drain some connection is still open.
 * So the process is gone within DRAIN_DELAY_MS + SHUTDOWN_TIMEOUT_MS of the signal. A second
 * signal skips the rest of the drain delay.
 */
import { Server as NetServer, type Socket } from 'node:net';
import pino from 'pino';
import { buildApp } from './app.js';
import { ConfigError, loadConfig } from './config.js';
import { REDACT_PATHS } from './plugins/auth.js';

/** After the listener closes, how long an accepted connection may stay idle before it is closed. */
const IDLE_GRACE_MS = 1000;

const sleep = (ms: number, signal: AbortSignal): Promise<void> =>
  new Promise((resolve) => {
    const t = setTimeout(resolve, ms);
    signal.addEventListener('abort', () => {
      clearTimeout(t);
      resolve();
    });
  });

async function main(): Promise<void> {
  let config;
  try {
    config = loadConfig(process.env);
  } catch (err) {
    if (err instanceof ConfigError) {
      process.stderr.write(`Throatline cannot start. ${err.message}\n`);
      process.exit(78);
    }
    throw err;
  }
  const readiness = { ready: true };
  // Asynchronous, buffered log destination: request logging must not block the event loop.
  const destination = pino.destination({ sync: false, minLength: 4096 });
  const logger = pino({ level: config.LOG_LEVEL, redact: REDACT_PATHS }, destination);
  const flushAndExit = (code: number): never => {
    try {
      destination.flushSync();
    } catch {
      // nothing more can be done about a log that cannot be written
    }
    process.exit(code);
  };
  const app = await buildApp({ config, readiness, loggerInstance: logger });
  // Which accepted connections have a request in flight: at shutdown, the others are closed
  // once they have had IDLE_GRACE_MS to send one.
  const inFlight = new Map<Socket, number>();
  app.server.on('connection', (socket: Socket) => {
    inFlight.set(socket, 0);
    socket.once('close', () => inFlight.delete(socket));
  });
  app.server.on('request', (req, res) => {
    const socket = req.socket as Socket;
    inFlight.set(socket, (inFlight.get(socket) ?? 0) + 1);
    res.once('close', () => {
      if (inFlight.has(socket)) inFlight.set(socket, inFlight.get(socket)! - 1);
    });
  });
  const closeIdle = (): void => {
    for (const [socket, n] of inFlight) if (n === 0) socket.destroy();
  };
  // Buffered lines reach the log at least once a second, so a quiet service's log is not empty.
  setInterval(() => destination.flush(), 1000).unref();

  const skipDrain = new AbortController();
  let stopping = false;
  const stop = async (signal: string): Promise<void> => {
    if (stopping) {
      app.log.warn({ signal }, 'second signal: closing without waiting for the rest of the drain delay');
      skipDrain.abort();
      return;
    }
    stopping = true;
    readiness.ready = false;
    app.log.info({ signal, drainMs: config.DRAIN_DELAY_MS, timeoutMs: config.SHUTDOWN_TIMEOUT_MS }, 'shutting down: readiness off, draining');
    await sleep(config.DRAIN_DELAY_MS, skipDrain.signal);
    const timer = setTimeout(() => {
      app.log.error('shutdown timed out with connections still open; exiting');
      flushAndExit(1);
    }, config.SHUTDOWN_TIMEOUT_MS);
    timer.unref();
    const server = app.server;
    // net.Server's own close: stop accepting, keep the accepted connections (http.Server's
    // close would drop idle ones at once, including one whose request is still on its way).
    const allEnded = new Promise<void>((resolve) => NetServer.prototype.close.call(server, () => resolve()));
    app.log.info('listener closed; finishing in-flight requests');
    const idle = setTimeout(closeIdle, IDLE_GRACE_MS);
    idle.unref();
    await allEnded;
    clearTimeout(idle);
    try {
      await app.close();
    } catch (err) {
      app.log.error({ err }, 'error while closing');
      flushAndExit(1);
    }
    app.log.info('stopped');
    flushAndExit(0);
  };
  process.on('SIGTERM', () => void stop('SIGTERM'));
  process.on('SIGINT', () => void stop('SIGINT'));
  await app.listen({ host: config.HOST, port: config.PORT });
}

main().catch((err: unknown) => {
  process.stderr.write(`Throatline failed to start: ${err instanceof Error ? err.message : String(err)}\n`);
  process.exit(1);
});
