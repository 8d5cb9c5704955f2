/**
 * weld-batch: sends a file of weld checks to a running Throatline service as one NDJSON stream
 * and writes the results as they come back, then prints a summary of failures. For BIM export
 * pipelines and scripts.
 *
 *   npm run -s weld-batch -- --in export.ndjson --out results.ndjson [--summary summary.json]
 *                            [--url http://127.0.0.1:3000] [--ids ifc]
 *   node dist/bin/weld-batch.js ...the same options (after npm run build)
 *
 * The input is NDJSON (one item per line) or, for a file ending in .json, a JSON array of items;
 * each item is { "kind": "fillet" | ..., "id": "...", ...the inputs of that kind }. The output
 * holds one result per line, in item order (the answer, or a problem document with its index).
 * --summary also writes the summary as JSON: { items, pass, fail, error, failures: [...] }.
 * Exit code: 0 when every item passes, 1 when any item fails or is refused, 2 when the run could
 * not be made (bad options, unreadable file, service unreachable or refusing the batch).
 */
import { createReadStream, createWriteStream, readFileSync, writeFileSync } from 'node:fs';
import http from 'node:http';
import https from 'node:https';
import { Readable } from 'node:stream';
import { isMain } from './is-main.js';

export interface Options {
  input: string;
  output: string;
  url: string;
  ids: 'any' | 'ifc';
  summary?: string | undefined;
}

export class UsageError extends Error {}

const USAGE = 'usage: weld-batch --in <export.ndjson|export.json> --out <results.ndjson> [--summary <summary.json>] [--url http://127.0.0.1:3000] [--ids ifc]';

export function parseArgs(argv: string[]): Options {
  const known = new Set(['--in', '--out', '--summary', '--url', '--ids']);
  const got = new Map<string, string>();
  for (let i = 0; i < argv.length; i += 2) {
    const name = argv[i]!;
    const value = argv[i + 1];
    if (!known.has(name)) throw new UsageError(`unknown option ${name}\n${USAGE}`);
    if (value === undefined || value.startsWith('--')) throw new UsageError(`${name} needs a value\n${USAGE}`);
    got.set(name, value);
  }
  const input = got.get('--in');
  const output = got.get('--out');
  if (!input || !output) throw new UsageError(USAGE);
  const ids = got.get('--ids') ?? 'any';
  if (ids !== 'any' && ids !== 'ifc') throw new UsageError(`--ids is any or ifc\n${USAGE}`);
  return { input, output, url: got.get('--url') ?? 'http://127.0.0.1:3000', ids, summary: got.get('--summary') };
}

/** The input as a stream of NDJSON bytes: files ending in .json are read as one array. */
function inputStream(path: string): Readable {
  if (path.endsWith('.json')) {
    const items = JSON.parse(readFileSync(path, 'utf8')) as unknown;
    if (!Array.isArray(items)) throw new Error(`${path}: a .json export must hold an array of items`);
    return Readable.from(items.map((x) => JSON.stringify(x) + '\n'));
  }
  return createReadStream(path);
}

export interface Failure {
  /** Position of the item in the export, from 0. */
  index: number;
  id: string | null;
  /** fail: the check answered and does not pass; error: the service refused the item. */
  outcome: 'fail' | 'error';
  /** The governing check over 1, else the first failing limit; for an error, the problem's code. */
  code: string | null;
  detail: string;
}

export interface Summary {
  items: number;
  pass: number;
  fail: number;
  error: number;
  failures: Failure[];
  /** Set when the service cut the stream short (a batch limit): its reason. */
  stopped: string | null;
}

interface ResultLine {
  id?: string;
  status?: unknown;
  index?: number;
  code?: string;
  type?: string;
  title?: string;
  detail?: string;
  governing?: { code: string; ratio: number } | null;
  limits?: Array<{ code: string; pass: boolean }>;
  problem?: { detail?: string; title?: string };
  summary?: unknown;
}

/** Why a failing answer fails: a strength ratio over 1, else the detailing limits it breaks. */
function failureOf(r: ResultLine): { code: string | null; detail: string } {
  const broken = (r.limits ?? []).filter((l) => !l.pass).map((l) => l.code);
  const g = r.governing;
  if (g && g.ratio > 1) {
    const more = broken.length > 0 ? `; limits not met: ${broken.join(', ')}` : '';
    return { code: g.code, detail: `${g.code} at ${g.ratio.toFixed(3)}${more}` };
  }
  if (broken.length > 0) return { code: broken[0]!, detail: `limits not met: ${broken.join(', ')}` };
  return { code: null, detail: 'fails' };
}

/** Streams the file to the service and the answers to the output file; resolves with a summary. */
export async function runBatch(opts: Options): Promise<Summary> {
  const target = new URL('/v1/batch', opts.url);
  if (opts.ids === 'ifc') target.searchParams.set('ids', 'ifc');
  const client = target.protocol === 'https:' ? https : http;
  const input = inputStream(opts.input);
  const summary: Summary = { items: 0, pass: 0, fail: 0, error: 0, failures: [], stopped: null };
  const note = (line: string): void => {
    if (line.trim() === '') return;
    let r: ResultLine;
    try {
      r = JSON.parse(line) as ResultLine;
    } catch {
      throw new Error(`the service sent a line that is not JSON: ${line.slice(0, 120)}`);
    }
    if (r.problem) {
      summary.stopped = r.problem.detail ?? r.problem.title ?? 'the service stopped the stream';
      return;
    }
    if (r.summary !== undefined) return;
    const index = summary.items++;
    if (r.status === 'pass') {
      summary.pass++;
    } else if (r.status === 'fail') {
      summary.fail++;
      summary.failures.push({ index, id: r.id ?? null, outcome: 'fail', ...failureOf(r) });
    } else {
      summary.error++;
      summary.failures.push({ index: typeof r.index === 'number' ? r.index : index, id: r.id ?? null, outcome: 'error', code: r.code ?? null, detail: r.detail ?? r.title ?? r.type ?? 'refused' });
    }
  };
  await new Promise<void>((resolve, reject) => {
    const out = createWriteStream(opts.output);
    const fail = (err: Error): void => {
      input.destroy();
      out.destroy();
      reject(err);
    };
    out.on('error', fail);
    const req = client.request(target, { method: 'POST', headers: { 'content-type': 'application/x-ndjson' } }, (res) => {
      res.setEncoding('utf8');
      if (res.statusCode !== 200) {
        let body = '';
        res.on('data', (t: string) => {
          if (body.length < 4000) body += t;
        });
        res.on('end', () => {
          let why = body.slice(0, 300);
          try {
            const p = JSON.parse(body) as { detail?: string };
            if (p.detail) why = p.detail;
          } catch {
            // not a problem document: show the start of the body as it is
          }
          fail(new Error(`the service answered ${res.statusCode}: ${why}`));
        });
        return;
      }
      let rest = '';
      res.on('data', (text: string) => {
        out.write(text);
        const lines = (rest + text).split('\n');
        rest = lines.pop() ?? '';
        try {
          for (const l of lines) note(l);
        } catch (err) {
          req.destroy();
          fail(err as Error);
        }
      });
      res.on('end', () => {
        try {
          note(rest);
        } catch (err) {
          fail(err as Error);
          return;
        }
        out.end(() => resolve());
      });
      res.on('error', fail);
    });
    req.on('error', fail);
    input.on('error', fail).pipe(req);
  });
  if (opts.summary) writeFileSync(opts.summary, JSON.stringify(summary, null, 2) + '\n');
  return summary;
}

/** The summary as the lines the command prints. */
export function summaryText(s: Summary, output: string): string {
  const lines = [`${s.items} items: ${s.pass} pass, ${s.fail} fail, ${s.error} error; results in ${output}`];
  for (const f of s.failures.slice(0, 50)) lines.push(`  #${f.index} ${f.id ?? '(no id)'}: ${f.outcome} ${f.code ?? ''} - ${f.detail}`);
  if (s.failures.length > 50) lines.push(`  ... and ${s.failures.length - 50} more`);
  if (s.stopped) lines.push(`  the service stopped the stream: ${s.stopped}`);
  return lines.join('\n') + '\n';
}

async function main(): Promise<void> {
  let opts: Options;
  let s: Summary;
  try {
    opts = parseArgs(process.argv.slice(2));
    s = await runBatch(opts);
  } catch (err) {
    process.stderr.write(`weld-batch: ${err instanceof Error ? err.message : String(err)}\n`);
    process.exit(2);
  }
  process.stdout.write(summaryText(s, opts.output));
  process.exitCode = s.fail + s.error > 0 || s.stopped ? 1 : 0;
}

if (isMain(import.meta.url)) void main();
