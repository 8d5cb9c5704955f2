/**
 * Writes the OpenAPI document the service serves to openapi/openapi.json and openapi/openapi.yaml.
 *
 *   npm run openapi          regenerate both files
 *   npm run openapi:check    write nothing; exit 1 with a short diff summary when a committed
 *                            file differs from what the app generates now
 *
 * The document is built from the route schemas only (no clock, no host name, no file path), so
 * the same source gives the same bytes on every machine.
 */
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { buildApp } from '../app.js';
import { isMain } from './is-main.js';

/** The folder the committed contract lives in (two levels up from src/bin or dist/bin). */
export const OPENAPI_DIR = fileURLToPath(new URL('../../openapi/', import.meta.url));

export interface ContractFile {
  /** Path relative to the repository root, for messages. */
  name: string;
  path: string;
  text: string;
}

/** The contract as the app generates it now: JSON (2-space, trailing newline) and YAML. */
export async function generateContract(): Promise<ContractFile[]> {
  const app = await buildApp({ config: { DOCS: false } });
  try {
    const json = `${JSON.stringify(app.swagger(), null, 2)}\n`;
    const yamlText = app.swagger({ yaml: true }) as unknown as string;
    const yaml = yamlText.endsWith('\n') ? yamlText : `${yamlText}\n`;
    return [
      { name: 'openapi/openapi.json', path: `${OPENAPI_DIR}openapi.json`, text: json },
      { name: 'openapi/openapi.yaml', path: `${OPENAPI_DIR}openapi.yaml`, text: yaml },
    ];
  } finally {
    await app.close();
  }
}

function readOrNull(path: string): string | null {
  try {
    return readFileSync(path, 'utf8');
  } catch {
    return null;
  }
}

/** A few lines saying where two texts part: line counts and the first differing lines. */
export function diffSummary(name: string, committed: string | null, generated: string, maxLines = 5): string {
  if (committed === null) return `${name}: missing (the app generates ${generated.split('\n').length - 1} lines)`;
  const a = committed.split('\n');
  const b = generated.split('\n');
  const out: string[] = [`${name}: differs (committed ${a.length - 1} lines, generated ${b.length - 1} lines)`];
  let shown = 0;
  let differing = 0;
  for (let i = 0; i < Math.max(a.length, b.length); i++) {
    if (a[i] === b[i]) continue;
    differing++;
    if (shown < maxLines) {
      shown++;
      const cut = (s: string | undefined) => (s === undefined ? '(none)' : s.length > 120 ? `${s.slice(0, 117)}...` : s);
      out.push(`  line ${i + 1}:`, `    - ${cut(a[i])}`, `    + ${cut(b[i])}`);
    }
  }
  if (differing > shown) out.push(`  ... ${differing - shown} more differing lines`);
  return out.join('\n');
}

async function main(argv: readonly string[]): Promise<number> {
  const check = argv.includes('--check');
  const files = await generateContract();
  if (check) {
    const problems = files
      .map((f) => ({ f, committed: readOrNull(f.path) }))
      .filter(({ f, committed }) => committed !== f.text)
      .map(({ f, committed }) => diffSummary(f.name, committed, f.text));
    if (problems.length > 0) {
      process.stderr.write(`The committed contract is out of date; run \`npm run openapi\` and commit openapi/.\n${problems.join('\n')}\n`);
      return 1;
    }
    process.stdout.write(`openapi/ is up to date (${files.map((f) => f.name).join(', ')}).\n`);
    return 0;
  }
  mkdirSync(OPENAPI_DIR, { recursive: true });
  for (const f of files) {
    if (readOrNull(f.path) === f.text) {
      process.stdout.write(`${f.name} unchanged\n`);
    } else {
      writeFileSync(f.path, f.text);
      process.stdout.write(`${f.name} written\n`);
    }
  }
  return 0;
}


if (isMain(import.meta.url)) {
  main(process.argv.slice(2)).then(
    (code) => process.exit(code),
    (err: unknown) => {
      process.stderr.write(`export-openapi failed: ${err instanceof Error ? err.message : String(err)}\n`);
      process.exit(2);
    },
  );
}
