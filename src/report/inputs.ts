/**
 * The inputs section of a sheet: every field of the request as given, with what it is (from
 * the contract's own descriptions) and its unit. Generic over the operations: it walks the
 * request beside its schema, so a field added to a contract appears on the sheet by itself.
 */
import type { Dimension } from './text.js';

export interface InputRow {
  /** Dotted path as in the request: welds[0].size. */
  path: string;
  /** What the field is: the first sentence of its description in the contract. */
  label: string;
  /** The value as given (fractions kept), with its decimal value where it was a fraction. */
  value: string;
  dim: Dimension;
  /** What the service read the value as (a steel's Fy and Fu), or "". */
  note: string;
  /** Nesting depth, for indentation. */
  depth: number;
  /** A heading row for an object or an array item (no value). */
  heading: boolean;
}

type Schema = Record<string, unknown> & { properties?: Record<string, Schema>; items?: Schema; anyOf?: Schema[]; description?: string };

const LENGTH_FIELDS = new Set([
  'thickness', 'size', 'legs', 'length', 'pitch', 'lap', 'flatBarWidth', 'depth', 'depths', 'radius', 'qualifiedThroat', 'qualifiedThroats',
  'diameter', 'width', 'spacing', 'spacingAcross', 'fill', 'height', 'referenceLength', 'eccentricity', 'standoff', 'from', 'to', 'at', 'origin',
  'maxSize', 'sizeStep', 'lengthStep', 'minSegment',
]);

/** The dimension of a field, by its name and the object it sits in. */
export function fieldDimension(name: string, parent: string): Dimension {
  if (LENGTH_FIELDS.has(name)) return 'length';
  if (parent === 'length' && (name === 'fixed' || name === 'max')) return 'length';
  if (name === 'angle' || name === 'rotation') return 'angle';
  if (name === 'fexx') return 'stress';
  if ((name === 'fy' || name === 'fu') && parent === 'steel') return 'stress';
  if (parent === 'load' && ['force', 'tension', 'fx', 'fy', 'fz', 'magnitude'].includes(name)) return 'force';
  if (name === 'force' || name === 'tension' || name === 'magnitude') return 'force';
  return 'none';
}

function firstSentence(s: string | undefined): string {
  if (!s) return '';
  const m = /^(.*?\.)(\s|$)/.exec(s);
  const out = (m ? m[1]! : s).replace(/\.$/, '');
  return out.length > 160 ? `${out.slice(0, 157)}…` : out;
}

/** The branch of a union that describes an object or an array, for walking into it. */
function structural(schema: Schema | undefined, kind: 'object' | 'array'): Schema | undefined {
  if (!schema) return undefined;
  if (kind === 'object' && schema.properties) return schema;
  if (kind === 'array' && schema.items) return schema;
  for (const b of schema.anyOf ?? []) {
    const s = structural(b, kind);
    if (s) return s;
  }
  return undefined;
}

function scalarText(v: unknown): string {
  if (typeof v === 'string') return v;
  if (typeof v === 'number' || typeof v === 'boolean') return String(v);
  if (v === null) return 'null';
  return JSON.stringify(v);
}

/**
 * Rows for the request, depth first, in the request's own order. `skip` names top-level fields
 * shown elsewhere (the sheet header). `annotate` may add a note to a value (a steel's Fy and Fu).
 */
export function inputRows(body: Record<string, unknown>, schema: Schema, skip: ReadonlySet<string>, annotate: (path: string, value: unknown) => string = () => ''): InputRow[] {
  const rows: InputRow[] = [];
  const walk = (value: unknown, s: Schema | undefined, path: string, name: string, parent: string, depth: number, description: string | undefined): void => {
    const label = firstSentence(description ?? s?.description);
    if (Array.isArray(value)) {
      const arr = structural(s, 'array');
      if (value.every((x) => typeof x === 'number' || typeof x === 'string')) {
        rows.push({ path, label, value: `[${value.map((x) => fractionText(x)).join(', ')}]`, note: '', dim: fieldDimension(name, parent), depth, heading: false });
        return;
      }
      value.forEach((item, i) => walk(item, arr?.items, `${path}[${i}]`, name, parent, depth, arr?.items?.description ?? description));
      return;
    }
    if (value !== null && typeof value === 'object') {
      const obj = structural(s, 'object');
      rows.push({ path, label, value: '', note: annotate(path, value), dim: 'none', depth, heading: true });
      for (const [k, v] of Object.entries(value as Record<string, unknown>)) {
        if (v === undefined) continue;
        walk(v, obj?.properties?.[k], `${path}.${k}`, k, name, depth + 1, undefined);
      }
      return;
    }
    rows.push({ path, label, value: fractionText(value), note: annotate(path, value), dim: fieldDimension(name, parent), depth, heading: false });
  };
  for (const [k, v] of Object.entries(body)) {
    if (v === undefined || skip.has(k)) continue;
    walk(v, schema.properties?.[k], k, k, '', 0, undefined);
  }
  return rows;
}

/** A fraction string with its decimal value: "5/16 (0.3125)". */
function fractionText(v: unknown): string {
  if (typeof v === 'string' && /\//.test(v)) {
    const m = /^\s*(?:(\d+)[ -])?(\d+)\/(\d+)\s*$/.exec(v);
    if (m && Number(m[3]) !== 0) {
      const x = (m[1] ? Number(m[1]) : 0) + Number(m[2]) / Number(m[3]);
      return `${v.trim()} (${Number(x.toPrecision(6))})`;
    }
  }
  return scalarText(v);
}
