/**
 * Test helpers: parse a sheet with parse5 (the WHATWG HTML parser, foreign MathML and SVG
 * content included), collect its parse errors, and query the tree without a browser.
 */
import { createHash } from 'node:crypto';
import { parse, type DefaultTreeAdapterTypes as T } from 'parse5';

export type El = T.Element;
type Node = T.ChildNode | T.Document;

export interface Parsed {
  doc: T.Document;
  errors: string[];
}

export function parseHtml(html: string): Parsed {
  const errors: string[] = [];
  const doc = parse(html, { onParseError: (e) => errors.push(`${e.code} at line ${e.startLine}:${e.startCol}`) });
  return { doc, errors };
}

function children(n: Node): T.ChildNode[] {
  return 'childNodes' in n ? n.childNodes : [];
}

function isEl(n: T.ChildNode): n is El {
  return 'tagName' in n;
}

/** Every element under `root`, depth first (templates' contents are not walked: sheets have none). */
export function all(root: Node): El[] {
  const out: El[] = [];
  const walk = (n: Node): void => {
    for (const c of children(n)) {
      if (isEl(c)) {
        out.push(c);
        walk(c);
      }
    }
  };
  walk(root);
  return out;
}

export function attr(el: El, name: string): string | undefined {
  return el.attrs.find((a) => a.name === name)?.value;
}

export function hasClass(el: El, cls: string): boolean {
  return (attr(el, 'class') ?? '').split(/\s+/).includes(cls);
}

export function byTag(root: Node, tag: string): El[] {
  return all(root).filter((e) => e.tagName === tag);
}

export function byClass(root: Node, cls: string): El[] {
  return all(root).filter((e) => hasClass(e, cls));
}

export function byAttr(root: Node, name: string, value?: string): El[] {
  return all(root).filter((e) => (value === undefined ? attr(e, name) !== undefined : attr(e, name) === value));
}

export function text(n: Node): string {
  let s = '';
  const walk = (x: Node): void => {
    for (const c of children(x)) {
      if (c.nodeName === '#text') s += (c as T.TextNode).value;
      else walk(c as El);
    }
  };
  walk(n);
  return s;
}

/** A number as the sheet prints it (four significant figures, a minus sign, maybe an exponent). */
export function shown(s: string): number {
  const m = /[−-]?\d+(?:\.\d+)?(?:e[+-]?\d+)?/.exec(s.replace(/\u00a0/g, ' '));
  if (!m) return Number.NaN;
  return Number(m[0].replace('−', '-'));
}

/** True when `printed` is `exact` rounded to four significant figures (half a unit in the fourth digit). */
export function roundsTo(printed: number, exact: number): boolean {
  if (exact === 0) return printed === 0;
  return Math.abs(printed - exact) <= 5.01e-4 * Math.abs(exact);
}

/** SHA-256 of JSON with keys sorted at every level and no whitespace: what the sheet says it prints. */
export function sortedHash(value: unknown): string {
  const sorted = (v: unknown): unknown => {
    if (Array.isArray(v)) return v.map(sorted);
    if (v !== null && typeof v === 'object') return Object.fromEntries(Object.keys(v as object).sort().map((k) => [k, sorted((v as Record<string, unknown>)[k])]));
    return v;
  };
  return createHash('sha256').update(JSON.stringify(sorted(value))).digest('hex');
}
