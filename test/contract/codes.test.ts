/**
 * The code catalogue (src/engine/codes.ts), the README table and the citations in the code all
 * follow one format each, so that a reader can find every provision the same way.
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { FastifyInstance } from 'fastify';
import { CODES, codesOfKind, type Code, type CodeKind } from '../../src/engine/codes.js';
import { OPERATIONS } from '../../src/operations/index.js';
import { END_MARKER, START_MARKER, renderCodeTable, spliceTable, tableBetweenMarkers } from '../../src/bin/code-table.js';
import { app as build } from '../helpers.js';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const README = readFileSync(join(ROOT, 'README.md'), 'utf8');
const ALL = Object.keys(CODES) as Code[];

/** The one clause format: a section or table of AISC 360-22, a Part of the AISC Manual, or nothing. */
const CLAUSE = /^AISC 360-22 (§[A-N]\d+(\.\d+)?[a-z]?|Table [A-N]\d+\.\d+)$|^AISC Manual Part \d+$|^$/;
/** The one equation format: "Eq. J2-4", several of one family as "Eq. J2-4, J2-5". */
const EQUATION = /^Eq\. [A-N]\d+-\d+[a-z]?(, [A-N]\d+-\d+[a-z]?)*$/;
/** The one doc-comment citation format under src/engine/provisions/. */
const CITE =
  /^@cite AISC 360-22 (Eq\. [A-N]\d+-\d+[a-z]?(, [A-N]\d+-\d+[a-z]?)*|Table [A-N]\d+\.\d+|§[A-N]\d+(\.\d+)?[a-z]?)( and §[A-N]\d+(\.\d+)?[a-z]?)?$|^@cite AISC Manual Part \d+$/;

function tsFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const p = join(dir, name);
    if (statSync(p).isDirectory()) return tsFiles(p);
    return name.endsWith('.ts') ? [p] : [];
  });
}

/** Every `@cite ...` in a file: the text from @cite to the end of its line, less a closing comment. */
function citesOf(text: string): Array<{ line: number; cite: string }> {
  const out: Array<{ line: number; cite: string }> = [];
  text.split('\n').forEach((l, i) => {
    const at = l.indexOf('@cite');
    if (at >= 0) out.push({ line: i + 1, cite: l.slice(at).replace(/\s*\*\/\s*$/, '').trimEnd() });
  });
  return out;
}

describe('README code table', () => {
  it('has the markers, in order', () => {
    expect(README.indexOf(START_MARKER)).toBeGreaterThan(0);
    expect(README.indexOf(END_MARKER)).toBeGreaterThan(README.indexOf(START_MARKER));
  });

  it('equals the rendered catalogue (run `npm run codes` when it does not)', () => {
    expect(tableBetweenMarkers(README)).toBe(`\n${renderCodeTable()}`);
  });

  it('has one row per code, in catalogue order, with its kind and clause', () => {
    const rows = tableBetweenMarkers(README)!
      .split('\n')
      .filter((l) => l.startsWith('| `'));
    expect(rows.map((r) => /^\| `([A-Z0-9_]+)` \|/.exec(r)?.[1])).toEqual(ALL);
    for (const [i, code] of ALL.entries()) {
      const cells = rows[i]!.split(' | ');
      expect(cells[1], code).toBe(CODES[code].kind);
      expect(cells[3], code).toBe(CODES[code].clause === '' ? '—' : CODES[code].clause);
    }
  });

  it('spliceTable replaces only the text between the markers', () => {
    const text = `intro\n${START_MARKER}\nold table\n${END_MARKER}\noutro\n`;
    expect(spliceTable(text, '| a |\n')).toBe(`intro\n${START_MARKER}\n| a |\n${END_MARKER}\noutro\n`);
    expect(() => spliceTable('no markers', '| a |\n')).toThrow(/markers/);
  });
});

describe('code catalogue', () => {
  it('every code is UPPER_SNAKE_CASE', () => {
    for (const code of ALL) expect(code).toMatch(/^[A-Z][A-Z0-9]*(_[A-Z0-9]+)+$/);
  });

  it('every code has a known kind and says what it means and what to do', () => {
    const kinds: CodeKind[] = ['check', 'limit', 'warning', 'error'];
    for (const code of ALL) {
      const c = CODES[code];
      expect(kinds, code).toContain(c.kind);
      for (const field of ['title', 'meaning', 'fix'] as const) expect(c[field].trim().length, `${code}.${field}`).toBeGreaterThan(0);
    }
    expect(kinds.flatMap((k) => codesOfKind(k)).sort()).toEqual([...ALL].sort());
  });

  it('titles are unique, so the table reads without ambiguity', () => {
    const titles = ALL.map((c) => CODES[c].title);
    expect(new Set(titles).size).toBe(titles.length);
  });

  it('every check and limit code rests on a clause', () => {
    for (const code of ALL) {
      if (CODES[code].kind === 'check' || CODES[code].kind === 'limit') expect(CODES[code].clause, code).not.toBe('');
    }
  });

  it('every clause has the one citation format', () => {
    for (const code of ALL) expect(CODES[code].clause, code).toMatch(CLAUSE);
  });

  it('the formats reject near misses (the checks can fail)', () => {
    for (const bad of ['AISC 360-22 J2.4', 'AISC 360-16 §J2.4', 'AISC360-22 §J2.4', 'AISC 360-22 table J2.5', 'AISC 360-22 §J2.4 ', 'Manual Part 8', 'AISC 360-22 Eq. J2-4']) {
      expect(bad).not.toMatch(CLAUSE);
    }
    for (const bad of ['Eq J2-4', 'Eq. J2.4', 'Eq. J2-4,J2-5', 'Eq. J2-4 and J2-5', 'eq. J2-4', 'Eq. J2-4, 2-5']) expect(bad).not.toMatch(EQUATION);
    for (const bad of ['@cite AISC 360-22 J2.4', '@cite AISC 360-22 Eq J2-4', '@cite AISC 360-16 Eq. J2-4', '@cite AISC 360-22 Table J2.5 & §J4', '@cite Manual Part 9']) {
      expect(bad).not.toMatch(CITE);
    }
    // ... and accept the forms in use.
    for (const good of ['AISC 360-22 §J2.2b', 'AISC 360-22 Table J2.4', 'AISC Manual Part 8', '']) expect(good).toMatch(CLAUSE);
    for (const good of ['Eq. J2-4', 'Eq. J2-6a', 'Eq. J2-4, J2-5']) expect(good).toMatch(EQUATION);
  });
});

describe('citations in the code', () => {
  const provisionFiles = tsFiles(join(ROOT, 'src', 'engine', 'provisions'));

  it('every @cite line under src/engine/provisions/ has the one format', () => {
    const bad: string[] = [];
    let count = 0;
    for (const file of provisionFiles) {
      for (const { line, cite } of citesOf(readFileSync(file, 'utf8'))) {
        count++;
        if (!CITE.test(cite)) bad.push(`${relative(ROOT, file)}:${line}: ${cite}`);
      }
    }
    expect(count).toBeGreaterThan(0);
    expect(bad).toEqual([]);
  });

  it('every equation string written in src/ has the one format', () => {
    const bad: string[] = [];
    for (const file of tsFiles(join(ROOT, 'src'))) {
      const text = readFileSync(file, 'utf8');
      for (const m of text.matchAll(/(['"`])(Eq\.[^'"`]*)\1/g)) if (!EQUATION.test(m[2]!)) bad.push(`${relative(ROOT, file)}: ${m[2]}`);
    }
    expect(bad).toEqual([]);
  });
});

describe('equations and clauses in answers', () => {
  let app: FastifyInstance;
  beforeAll(async () => {
    app = await build();
  });
  afterAll(async () => {
    await app.close();
  });

  /** The operations' own examples, plus fillet cases that reach the other strength rules. */
  function requests(): Array<{ path: string; body: unknown }> {
    const out = OPERATIONS.flatMap((op) => Object.values(op.examples).map((e) => ({ path: op.path, body: e.value as unknown })));
    const fillet = { method: 'LRFD', electrode: 'E70', parts: [{ thickness: 0.5, steel: 'A36', loading: 'tension' }, { thickness: 0.5, steel: 'A36' }], load: { force: 10 } };
    out.push(
      { path: '/v1/fillet/check', body: { ...fillet, welds: [{ size: 0.25, length: 6, angle: 90 }] } },
      { path: '/v1/fillet/check', body: { ...fillet, welds: [{ size: 0.25, length: 6, angle: 0 }, { size: 0.25, length: 4, angle: 90 }] } },
      { path: '/v1/fillet/check', body: { ...fillet, welds: [{ size: 0.25, length: 6, angle: 0 }, { size: 0.3125, length: 4, angle: 45 }] } },
    );
    return out;
  }

  it('every check answered carries a catalogued clause and an equation of the one format', async () => {
    let seen = 0;
    for (const { path, body } of requests()) {
      const res = await app.inject({ method: 'POST', url: path, payload: body as object });
      expect(res.statusCode, `${path} ${JSON.stringify(body)}`).toBe(200);
      const answer = res.json() as { checks: Array<{ code: Code; clause: string; equation: string }>; limits: Array<{ code: Code; clause: string }> };
      for (const c of answer.checks) {
        seen++;
        expect(c.equation, c.code).toMatch(EQUATION);
        expect(c.clause, c.code).toBe(CODES[c.code].clause);
      }
      for (const l of answer.limits) expect(l.clause, l.code).toBe(CODES[l.code].clause);
    }
    expect(seen).toBeGreaterThan(0);
  });
});
