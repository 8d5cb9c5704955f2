/**
 * The canonical form of a request and its SHA-256, printed on every sheet: the same request
 * gives the same hash, whatever order its keys came in, so a sheet can be matched to the
 * request that reproduces it.
 */
import { createHash } from 'node:crypto';

/** JSON with object keys sorted at every level, no whitespace; undefined members left out. */
export function canonicalJson(value: unknown): string {
  if (value === null || typeof value !== 'object') {
    if (typeof value === 'number' && !Number.isFinite(value)) return 'null';
    return JSON.stringify(value) ?? 'null';
  }
  if (Array.isArray(value)) return `[${value.map((v) => (v === undefined ? 'null' : canonicalJson(v))).join(',')}]`;
  const keys = Object.keys(value as Record<string, unknown>)
    .filter((k) => (value as Record<string, unknown>)[k] !== undefined)
    .sort();
  return `{${keys.map((k) => `${JSON.stringify(k)}:${canonicalJson((value as Record<string, unknown>)[k])}`).join(',')}}`;
}

/** SHA-256 of the canonical request, lowercase hex. */
export function requestHash(body: unknown): string {
  return createHash('sha256').update(canonicalJson(body), 'utf8').digest('hex');
}
