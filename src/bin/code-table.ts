/**
 * Renders the code catalogue of src/engine/codes.ts as a Markdown table and writes it into
 * README.md between the markers `<!-- codes:start -->` and `<!-- codes:end -->`.
 *
 *   npm run codes          rewrite the README table
 *   npm run codes:check    write nothing; exit 1 when the README table differs
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { CODES, type Code } from '../engine/codes.js';
import { isMain } from './is-main.js';

export const README_PATH = fileURLToPath(new URL('../../README.md', import.meta.url));
export const START_MARKER = '<!-- codes:start -->';
export const END_MARKER = '<!-- codes:end -->';

/** One table cell: pipes escaped, line breaks folded, empty shown as a dash. */
function cell(text: string, code = false): string {
  const t = text.replace(/\s+/g, ' ').trim().replace(/\|/g, '\\|');
  if (t === '') return '—';
  return code ? `\`${t}\`` : t;
}

/** The catalogue as a Markdown table, in catalogue order, ending with a newline. */
export function renderCodeTable(): string {
  const rows = [
    '| code | kind | title | clause | meaning | what to do |',
    '|---|---|---|---|---|---|',
    ...(Object.keys(CODES) as Code[]).map((code) => {
      const c = CODES[code];
      return `| ${cell(code, true)} | ${cell(c.kind)} | ${cell(c.title)} | ${cell(c.clause)} | ${cell(c.meaning)} | ${cell(c.fix)} |`;
    }),
  ];
  return `${rows.join('\n')}\n`;
}

/** The text between the markers (exclusive), or null when the markers are missing or out of order. */
export function tableBetweenMarkers(readme: string): string | null {
  const start = readme.indexOf(START_MARKER);
  const end = readme.indexOf(END_MARKER);
  if (start < 0 || end < 0 || end < start) return null;
  return readme.slice(start + START_MARKER.length, end);
}

/** The README with `table` placed between the markers, everything else left as it was. */
export function spliceTable(readme: string, table: string): string {
  const start = readme.indexOf(START_MARKER);
  const end = readme.indexOf(END_MARKER);
  if (start < 0 || end < 0 || end < start) throw new Error(`README.md needs the markers ${START_MARKER} and ${END_MARKER}, in that order.`);
  return `${readme.slice(0, start + START_MARKER.length)}\n${table}${readme.slice(end)}`;
}

function main(argv: readonly string[]): number {
  const readme = readFileSync(README_PATH, 'utf8');
  const wanted = spliceTable(readme, renderCodeTable());
  if (argv.includes('--check')) {
    if (wanted !== readme) {
      process.stderr.write('The README code table differs from src/engine/codes.ts; run `npm run codes` and commit README.md.\n');
      return 1;
    }
    process.stdout.write(`README code table is up to date (${Object.keys(CODES).length} codes).\n`);
    return 0;
  }
  if (wanted === readme) {
    process.stdout.write('README.md unchanged\n');
  } else {
    writeFileSync(README_PATH, wanted);
    process.stdout.write(`README.md code table written (${Object.keys(CODES).length} codes)\n`);
  }
  return 0;
}


if (isMain(import.meta.url)) {
  try {
    process.exit(main(process.argv.slice(2)));
  } catch (err) {
    process.stderr.write(`code-table failed: ${err instanceof Error ? err.message : String(err)}\n`);
    process.exit(2);
  }
}
