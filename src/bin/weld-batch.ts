/**
 * weld-batch: sends a file of weld checks to a running Throatline service as one NDJSON stream
 * and writes the results as they come back, then prints a summary of failures. For BIM export
 * pipelines and scripts.
 *
 *   node dist/bin/weld-batch.js --in export.ndjson --out results.ndjson [--url http://127.0.0.1:3000] [--ids ifc]
 *
 * The input is NDJSON (one item per line) or a JSON array of items; each item is
 * { "kind": "fillet" | ..., "id": "...", ...the inputs of that kind }. Exit code: 0 when every
 * item passes, 1 when any item fails or is refused, 2 when the service cannot be reached.
 */
import { createReadStream, createWriteStream, readFileSync } from 'node:fs';
import http from 'node:http';
import https from 'node:https';
import { Readable } from 'node:stream';

interface Options {
  input: string;
  output: string;
  url: string;
  ids: 'any' | 'ifc';
}

function parseArgs(argv: string[]): Options {
  const get = (name: string): string | undefined => {
    const i = argv.indexOf(name);
    return i >= 0 ? argv[i + 1] : undefined;
  };
  const input = get('--in');
  const output = get('--out');
  if (!input || !output) {
    process.stderr.write('usage: weld-batch --in <export.ndjson|export.json> --out <results.ndjson> [--url http://127.0.0.1:3000] [--ids ifc]\n');
    process.exit(2);
  }
  return { input, output, url: get('--url') ?? 'http://127.0.0.1:3000', ids: get('--ids') === 'ifc' ? 'ifc' : 'any' };
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

export interface Summary {
  items: number;
  pass: number;
  fail: number;
  refused: number;
  failures: Array<{ index: number; id: string | null; why: string }>;
}

/** Streams the file to the service and the answers to the output file; resolves with a summary. */
export async function runBatch(opts: Options): Promise<Summary> {
  const target = new URL('/v1/batch', opts.url);
  if (opts.ids === 'ifc') target.searchParams.set('ids', 'ifc');
  const client = target.protocol === 'https:' ? https : http;
  const out = createWriteStream(opts.output);
  const summary: Summary = { items: 0, pass: 0, fail: 0, refused: 0, failures: [] };
  const note = (line: string): void => {
    if (line.trim() === '') return;
    const r = JSON.parse(line) as { id?: string; status?: unknown; type?: string; detail?: string; governing?: { code: string; ratio: number }; problem?: { detail: string } };
    if (r.problem) {
      summary.failures.push({ index: summary.items, id: null, why: `stream stopped: ${r.problem.detail}` });
      summary.refused++;
      return;
    }
    const index = summary.items++;
    if (r.status === 'pass') summary.pass++;
    else if (r.status === 'fail') {
      summary.fail++;
      summary.failures.push({ index, id: r.id ?? null, why: `fails: ${r.governing ? `${r.governing.code} at ${r.governing.ratio.toFixed(3)}` : 'a detailing limit'}` });
    } else {
      summary.refused++;
      summary.failures.push({ index, id: r.id ?? null, why: `refused: ${r.detail ?? r.type ?? 'unknown'}` });
    }
  };
  await new Promise<void>((resolve, reject) => {
    const req = client.request(target, { method: 'POST', headers: { 'content-type': 'application/x-ndjson' } }, (res) => {
      if (res.statusCode !== 200) {
        reject(new Error(`service answered ${res.statusCode}`));
        res.resume();
        return;
      }
      let rest = '';
      res.setEncoding('utf8');
      res.on('data', (text: string) => {
        out.write(text);
        const lines = (rest + text).split('\n');
        rest = lines.pop() ?? '';
        for (const l of lines) note(l);
      });
      res.on('end', () => {
        note(rest);
        out.end(resolve);
      });
      res.on('error', reject);
    });
    req.on('error', reject);
    inputStream(opts.input).on('error', reject).pipe(req);
  });
  return summary;
}

async function main(): Promise<void> {
  const opts = parseArgs(process.argv.slice(2));
  let s: Summary;
  try {
    s = await runBatch(opts);
  } catch (err) {
    process.stderr.write(`weld-batch: ${err instanceof Error ? err.message : String(err)}\n`);
    process.exit(2);
  }
  process.stdout.write(`${s.items} items: ${s.pass} pass, ${s.fail} fail, ${s.refused} refused; results in ${opts.output}\n`);
  for (const f of s.failures.slice(0, 50)) process.stdout.write(`  #${f.index} ${f.id ?? '(no id)'}: ${f.why}\n`);
  if (s.failures.length > 50) process.stdout.write(`  ... and ${s.failures.length - 50} more\n`);
  process.exit(s.fail + s.refused > 0 ? 1 : 0);
}

if (process.argv[1] && import.meta.url === new URL(`file://${process.argv[1]}`).href) void main();
