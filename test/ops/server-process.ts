/**
 * Test helper: the real server (src/server.ts through tsx, or a built file) as a child process on a free
 * loopback port, and small HTTP clients that report exactly how each request ended.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { request, type Agent } from 'node:http';
import { createServer } from 'node:net';
import { setTimeout as delay } from 'node:timers/promises';
import { fileURLToPath } from 'node:url';

export const ROOT = fileURLToPath(new URL('../../', import.meta.url));

export interface ServerProcess {
  proc: ChildProcess;
  port: number;
  output: () => string;
  exited: Promise<number | null>;
}

export async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = createServer();
    s.once('error', reject);
    s.listen(0, '127.0.0.1', () => {
      const { port } = s.address() as { port: number };
      s.close(() => resolve(port));
    });
  });
}

/** The sources through tsx, unless `argv` names another entry (the bundle, say). */
export async function startServer(env: Record<string, string>, argv: readonly string[] = ['--import', 'tsx', 'src/server.ts']): Promise<ServerProcess> {
  const port = await freePort();
  const proc = spawn(process.execPath, [...argv], {
    cwd: ROOT,
    env: { ...process.env, HOST: '127.0.0.1', PORT: String(port), LOG_LEVEL: 'info', NODE_ENV: 'production', ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let out = '';
  proc.stdout!.on('data', (d) => (out += String(d)));
  proc.stderr!.on('data', (d) => (out += String(d)));
  const exited = new Promise<number | null>((resolve) => proc.once('exit', (code) => resolve(code)));
  let gone = false;
  void exited.then(() => (gone = true));
  for (let i = 0; i < 300; i++) {
    if (gone) throw new Error(`server exited before listening:\n${out}`);
    const r = await get(port, '/healthz').catch(() => undefined);
    if (r?.status === 200) return { proc, port, output: () => out, exited };
    await delay(100);
  }
  proc.kill('SIGKILL');
  throw new Error(`server did not answer within 30 s:\n${out}`);
}

export interface Outcome {
  /** Set when an HTTP answer arrived in full. */
  status?: number;
  body?: string;
  headers?: Record<string, string | string[] | undefined>;
  /** Set when the request failed: the error code, and whether the TCP connection had been made. */
  error?: string;
  connected: boolean;
}

/** One request; resolves with how it ended, never rejects. */
export function send(opts: { port: number; method?: string; path: string; body?: string; contentType?: string; agent?: Agent | false; headers?: Record<string, string> }): Promise<Outcome> {
  return new Promise((resolve) => {
    let connected = false;
    const headers: Record<string, string> = { ...opts.headers };
    if (opts.body !== undefined) {
      headers['content-type'] = opts.contentType ?? 'application/json';
      headers['content-length'] = String(Buffer.byteLength(opts.body));
    }
    const req = request({ host: '127.0.0.1', port: opts.port, method: opts.method ?? 'GET', path: opts.path, agent: opts.agent ?? false, headers }, (res) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => resolve({ status: res.statusCode, body: Buffer.concat(chunks).toString('utf8'), headers: res.headers, connected: true }));
      res.on('error', (e: NodeJS.ErrnoException) => resolve({ error: e.code ?? e.message, connected: true }));
    });
    req.on('socket', (s) => {
      if (s.connecting) s.once('connect', () => (connected = true));
      else connected = true; // a reused keep-alive socket
    });
    req.on('error', (e: NodeJS.ErrnoException) => resolve({ error: e.code ?? e.message, connected }));
    req.end(opts.body);
  });
}

export const get = async (port: number, path: string): Promise<{ status: number; body: string }> => {
  const r = await send({ port, path });
  if (r.status === undefined) throw new Error(r.error);
  return { status: r.status, body: r.body! };
};
