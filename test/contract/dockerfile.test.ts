/**
 * The container recipe, read as text (no Docker engine runs here): multi-stage on node:24,
 * a runtime stage that runs the built server as an unprivileged user with a health check, and
 * every file it copies either in the build context (not excluded by .dockerignore) or produced
 * by an earlier stage (`npm run build` writes dist/ from src/ through tsconfig.build.json).
 */
import { existsSync, readFileSync } from 'node:fs';
import { join, posix } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { BUNDLE_PATH } from '../../src/bin/bundle.js';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const DOCKERFILE = readFileSync(join(ROOT, 'Dockerfile'), 'utf8');
const DOCKERIGNORE = readFileSync(join(ROOT, '.dockerignore'), 'utf8');

interface Instruction {
  op: string;
  args: string;
  line: number;
}
interface Stage {
  from: string;
  name: string | undefined;
  workdir: string;
  instructions: Instruction[];
}

/** Instructions with continuation lines joined and comments dropped. */
function instructions(text: string): Instruction[] {
  const out: Instruction[] = [];
  let buf = '';
  let start = 0;
  text.split('\n').forEach((raw, i) => {
    const line = raw.trim();
    if (buf === '' && (line === '' || line.startsWith('#'))) return;
    if (buf === '') start = i + 1;
    if (line.endsWith('\\')) {
      buf += `${line.slice(0, -1)} `;
      return;
    }
    buf += line;
    const m = /^(\w+)\s+([\s\S]*)$/.exec(buf);
    if (m) out.push({ op: m[1]!.toUpperCase(), args: m[2]!.trim(), line: start });
    buf = '';
  });
  return out;
}

function stages(text: string): Stage[] {
  const out: Stage[] = [];
  for (const ins of instructions(text)) {
    if (ins.op === 'FROM') {
      const m = /^(?:--platform=\S+\s+)?(\S+)(?:\s+AS\s+(\S+))?$/i.exec(ins.args);
      expect(m, `FROM line ${ins.line}`).not.toBeNull();
      out.push({ from: m![1]!, name: m![2], workdir: '/', instructions: [] });
      continue;
    }
    const stage = out[out.length - 1];
    expect(stage, `${ins.op} before any FROM`).toBeDefined();
    if (ins.op === 'WORKDIR') stage!.workdir = posix.resolve(stage!.workdir, ins.args);
    stage!.instructions.push(ins);
  }
  return out;
}

/** COPY's flags, sources and destination (shell form or JSON form). */
function parseCopy(args: string): { from?: string; sources: string[]; dest: string } {
  const words = args.startsWith('[') ? (JSON.parse(args) as string[]) : args.split(/\s+/);
  const flags = words.filter((w) => w.startsWith('--'));
  const rest = words.filter((w) => !w.startsWith('--'));
  const from = flags.find((f) => f.startsWith('--from='))?.slice('--from='.length);
  return { ...(from ? { from } : {}), sources: rest.slice(0, -1), dest: rest[rest.length - 1]! };
}

/** Whether a context path is excluded by .dockerignore (plain names, trailing-slash dirs, * and ** globs, ! exceptions). */
function ignored(path: string): boolean {
  let out = false;
  for (const raw of DOCKERIGNORE.split('\n')) {
    const line = raw.trim();
    if (line === '' || line.startsWith('#')) continue;
    const negate = line.startsWith('!');
    const pattern = (negate ? line.slice(1) : line).replace(/^\/+|\/+$/g, '');
    const re = new RegExp(
      `^${pattern
        .split('**')
        .map((part) => part.replace(/[.+^${}()|[\]\\]/g, '\\$&').replace(/\*/g, '[^/]*').replace(/\?/g, '[^/]'))
        .join('.*')}(/.*)?$`,
    );
    if (re.test(path)) out = !negate;
  }
  return out;
}

const ALL = stages(DOCKERFILE);
const RUNTIME = ALL[ALL.length - 1]!;
const ops = (s: Stage, op: string) => s.instructions.filter((i) => i.op === op);

describe('Dockerfile stages', () => {
  it('is multi-stage, every stage FROM node:24 (slim)', () => {
    expect(ALL.length).toBeGreaterThanOrEqual(2);
    for (const s of ALL) expect(s.from).toMatch(/^node:24(\.\d+)*-slim(@sha256:[0-9a-f]{64})?$/);
    const names = ALL.map((s) => s.name).filter(Boolean);
    expect(new Set(names).size).toBe(names.length);
  });

  it('a build stage runs npm ci and npm run build', () => {
    const build = ALL.find((s) => ops(s, 'RUN').some((r) => /\bnpm run build\b/.test(r.args)));
    expect(build, 'no stage runs npm run build').toBeDefined();
    expect(ops(build!, 'RUN').some((r) => /\bnpm ci\b/.test(r.args) && !/--omit=dev/.test(r.args))).toBe(true);
    expect(build).not.toBe(RUNTIME);
  });

  it('the runtime gets production dependencies only (npm ci --omit=dev)', () => {
    const copies = ops(RUNTIME, 'COPY').map((c) => parseCopy(c.args));
    const nm = copies.find((c) => c.sources.some((s) => /node_modules\/?$/.test(s)));
    const prodRun = (s: Stage) => ops(s, 'RUN').some((r) => /\bnpm ci\b[^&|;]*--omit=dev/.test(r.args));
    if (nm) {
      expect(nm.from, 'node_modules must come from a stage, not the context').toBeDefined();
      const source = ALL.find((s) => s.name === nm.from);
      expect(source && prodRun(source), `stage ${nm.from} must run npm ci --omit=dev`).toBe(true);
    } else {
      expect(prodRun(RUNTIME)).toBe(true);
    }
    // Dev dependencies (the compiler, the test runner) have no business in the image.
    for (const r of ops(RUNTIME, 'RUN')) expect(r.args).not.toMatch(/\bnpm (ci|install)\b(?![^&|;]*--omit=dev)/);
  });

  it('the runtime runs as an unprivileged user', () => {
    const users = ops(RUNTIME, 'USER');
    expect(users.length).toBeGreaterThan(0);
    const last = users[users.length - 1]!.args.split(':')[0]!;
    expect(['root', '0']).not.toContain(last);
    // USER comes before CMD so the process does not start as root.
    expect(users[users.length - 1]!.line).toBeLessThan(ops(RUNTIME, 'CMD')[0]!.line);
  });

  it('the runtime user is numeric and not root, so an orchestrator can verify runAsNonRoot', () => {
    const users = ops(RUNTIME, 'USER');
    const [uid, gid] = users[users.length - 1]!.args.split(':');
    expect(uid).toMatch(/^[1-9]\d*$/);
    if (gid !== undefined) expect(gid).toMatch(/^[1-9]\d*$/);
  });

  it('the runtime cannot rewrite its own code: nothing is copied to, chowned to or chmodded for the runtime user', () => {
    for (const c of ops(RUNTIME, 'COPY')) expect(c.args).not.toMatch(/--chown|--chmod/);
    for (const r of ops(RUNTIME, 'RUN')) expect(r.args).not.toMatch(/\bchown\b|\bchmod\b/);
  });

  it('the runtime has no package manager (npm, npx, corepack removed) and no build tools', () => {
    const removal = ops(RUNTIME, 'RUN').map((r) => r.args).join(' ');
    for (const tool of ['/usr/local/lib/node_modules/npm', '/usr/local/bin/npx', '/usr/local/bin/corepack']) expect(removal).toContain(tool);
    expect(removal).not.toMatch(/apt-get install|\bapk add\b/);
    // Nothing after the removal may need npm.
    const removedAt = ops(RUNTIME, 'RUN').find((r) => r.args.includes('/usr/local/lib/node_modules/npm'))!.line;
    for (const ins of RUNTIME.instructions.filter((i) => i.line > removedAt)) expect(ins.args).not.toMatch(/\bnpm\b|\bnpx\b/);
  });

  it('stops with SIGTERM (the signal the service drains on)', () => {
    const stop = ops(RUNTIME, 'STOPSIGNAL').map((s) => s.args);
    expect(stop.length === 0 || stop[stop.length - 1] === 'SIGTERM').toBe(true);
  });

  it('sets HOST, PORT and NODE_ENV for a container and exposes the port', () => {
    const env = ops(RUNTIME, 'ENV').map((e) => e.args).join(' ');
    expect(env).toMatch(/\bHOST=0\.0\.0\.0\b/);
    expect(env).toMatch(/\bPORT=3000\b/);
    expect(env).toMatch(/\bNODE_ENV=production\b/);
    expect(ops(RUNTIME, 'EXPOSE').map((e) => e.args)).toContain('3000');
  });

  it('has a HEALTHCHECK that asks /healthz with node itself (no curl in slim)', () => {
    const hc = ops(RUNTIME, 'HEALTHCHECK');
    expect(hc).toHaveLength(1);
    const cmd = /\bCMD\s+(\[[\s\S]*\])\s*$/.exec(hc[0]!.args);
    expect(cmd, 'HEALTHCHECK CMD in JSON form').not.toBeNull();
    const argv = JSON.parse(cmd![1]!) as string[];
    expect(argv[0]).toBe('node');
    expect(argv.join(' ')).toContain('/healthz');
    expect(argv.join(' ')).not.toMatch(/\b(curl|wget)\b/);
  });

  it('CMD runs node on the single-file build (exec form, so node receives SIGTERM)', () => {
    const cmds = ops(RUNTIME, 'CMD');
    expect(cmds).toHaveLength(1);
    expect(JSON.parse(cmds[0]!.args)).toEqual(['node', BUNDLE_PATH]);
  });
});

describe('what the stages copy exists', () => {
  const build = JSON.parse(readFileSync(join(ROOT, 'tsconfig.build.json'), 'utf8')) as { compilerOptions: { rootDir: string; outDir: string } };

  it('every COPY from the build context exists and is not excluded by .dockerignore', () => {
    for (const s of ALL) {
      for (const c of ops(s, 'COPY').map((x) => parseCopy(x.args))) {
        if (c.from) continue;
        for (const src of c.sources) {
          const rel = src.replace(/^\.\//, '').replace(/\/$/, '');
          expect(existsSync(join(ROOT, rel)), `${src} in the build context`).toBe(true);
          expect(ignored(rel), `${src} is excluded by .dockerignore`).toBe(false);
        }
      }
    }
  });

  it('every COPY --from names an earlier stage and a path that stage has', () => {
    for (const [i, s] of ALL.entries()) {
      for (const c of ops(s, 'COPY').map((x) => parseCopy(x.args))) {
        if (!c.from) continue;
        const source = ALL.slice(0, i).find((x) => x.name === c.from);
        expect(source, `stage ${c.from} before stage ${i}`).toBeDefined();
        for (const src of c.sources) {
          const inStage = posix.relative(source!.workdir, posix.resolve(source!.workdir, src));
          const top = inStage.split('/')[0]!;
          if (top === 'node_modules') {
            expect(ops(source!, 'RUN').some((r) => /\bnpm ci\b/.test(r.args)), `${c.from} installs node_modules`).toBe(true);
          } else if (top === build.compilerOptions.outDir) {
            // dist/ is produced by `npm run build` from the sources the stage copied in.
            expect(ops(source!, 'RUN').some((r) => /\bnpm run build\b/.test(r.args))).toBe(true);
            const copied = ops(source!, 'COPY').flatMap((x) => parseCopy(x.args).sources.map((p) => p.replace(/^\.\//, '').replace(/\/$/, '')));
            expect(copied).toEqual(expect.arrayContaining([build.compilerOptions.rootDir, 'tsconfig.build.json', 'tsconfig.json', 'package.json', 'package-lock.json']));
          } else {
            expect(existsSync(join(ROOT, inStage)), `${src} of stage ${c.from}`).toBe(true);
          }
        }
      }
    }
  });

  it('the file CMD starts is what the build writes for src/server.ts', () => {
    expect(build.compilerOptions.outDir).toBe('dist');
    expect(build.compilerOptions.rootDir).toBe('src');
    expect(existsSync(join(ROOT, 'src', 'server.ts'))).toBe(true);
    // `npm run build` compiles, then bundles src/server.ts into BUNDLE_PATH under dist/.
    const pkg = JSON.parse(readFileSync(join(ROOT, 'package.json'), 'utf8')) as { scripts: Record<string, string> };
    expect(pkg.scripts.build).toMatch(/^tsc -p tsconfig\.build\.json && tsx src\/bin\/bundle\.ts$/);
    expect(BUNDLE_PATH.startsWith(`${build.compilerOptions.outDir}/`)).toBe(true);
  });

  it('package.json is in the runtime and its start script matches CMD', () => {
    const copies = ops(RUNTIME, 'COPY').map((x) => parseCopy(x.args));
    expect(copies.some((c) => !c.from && c.sources.includes('package.json'))).toBe(true);
    const pkg = JSON.parse(readFileSync(join(ROOT, 'package.json'), 'utf8')) as { scripts: Record<string, string> };
    expect(pkg.scripts.start).toBe(`node ${BUNDLE_PATH}`);
  });

  it('.dockerignore keeps local build output, dependencies and VCS data out of the context', () => {
    for (const p of ['node_modules', 'dist', '.git', 'node_modules/fastify/package.json']) expect(ignored(p), p).toBe(true);
    for (const p of ['src', 'src/server.ts', 'package.json', 'package-lock.json', 'tsconfig.json', 'tsconfig.build.json']) expect(ignored(p), p).toBe(false);
  });
});
