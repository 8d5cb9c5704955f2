/**
 * Spreadsheet output formats: one bare value (format=value&field=...) and a two-row CSV
 * (format=csv). Both are views of the JSON answer; numbers print in JavaScript's shortest
 * round-trip form with a "." decimal point, so they parse back to the same numbers; text that a
 * spreadsheet would take for a formula is neutralised (see scalar).
 */
import { RequestFieldError } from './operations/shared.js';

type Json = null | boolean | number | string | Json[] | { [k: string]: Json } | undefined;

/** Flattens an answer to dotted paths: checks.0.ratio, values.throat, ... */
export function flatten(value: Json, prefix = '', out: Array<[string, string]> = []): Array<[string, string]> {
  if (value === undefined) return out;
  if (value === null || typeof value !== 'object') {
    out.push([prefix, scalar(value)]);
    return out;
  }
  const entries = Array.isArray(value) ? value.map((v, i) => [String(i), v] as const) : Object.entries(value);
  for (const [k, v] of entries) flatten(v, prefix ? `${prefix}.${k}` : k, out);
  return out;
}

/**
 * Text that a spreadsheet would read as a formula (=, +, -, @, tab, CR first) gets a leading
 * apostrophe, so an echoed id can never run as a formula in the cell it lands in. Numbers
 * and booleans print as they are.
 */
const FORMULA_START = /^[=+\-@\t\r]/;

export function scalar(v: null | boolean | number | string): string {
  if (v === null) return '';
  if (typeof v === 'string') return FORMULA_START.test(v) ? `'${v}` : v;
  return String(v);
}

export function csvCell(s: string): string {
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

export function toCsv(answer: object): string {
  const rows = flatten(answer as Json);
  return `${rows.map(([k]) => csvCell(k)).join(',')}\r\n${rows.map(([, v]) => csvCell(v)).join(',')}\r\n`;
}

/**
 * Resolves a dotted field in an answer. An array segment may be an index or, for arrays of
 * coded items (checks, limits, warnings), a code: checks.FILLET_WELD_METAL.available.
 */
export function pickField(answer: object, field: string): string {
  return scalar(pickValue(answer, field));
}

const DIGITS = /^\d+$/;

/** The raw value of a dotted field (see pickField); `segments` is the field already split at dots. */
export function pickValue(answer: object, field: string, segments: readonly string[] = field.split('.')): null | boolean | number | string {
  let node: Json = answer as Json;
  for (const seg of segments) {
    if (Array.isArray(node)) {
      node = DIGITS.test(seg) ? node[Number(seg)] : node.find((x) => x !== null && typeof x === 'object' && !Array.isArray(x) && x.code === seg);
    } else if (node !== null && typeof node === 'object' && Object.prototype.hasOwnProperty.call(node, seg)) {
      node = node[seg];
    } else {
      node = undefined;
    }
    if (node === undefined) break;
    // A group that is null in this answer (no recommendation, no centre) reads as an empty value.
    if (node === null) return null;
  }
  if (node === undefined) throw new RequestFieldError('/field', `"${field}" is not a field of this answer (try utilization, status, governing.code, governing.available).`);
  if (node !== null && typeof node === 'object') throw new RequestFieldError('/field', `"${field}" is a group of values, not one value; name one of its members.`);
  return node;
}
