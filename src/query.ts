/**
 * Spreadsheet-friendly query strings: dotted names for nested fields and array items
 * (welds.0.size=5/16), comma lists where the schema expects a list, and string-to-number or
 * boolean coercion guided by the request schema, so that the GET form of a check validates
 * against exactly the same schema as its JSON body.
 */
import { RequestFieldError } from './operations/shared.js';

const NAME = /^[A-Za-z][A-Za-z0-9_-]{0,63}$/;
const INDEX = /^\d+$/;
const FORBIDDEN = new Set(['__proto__', 'constructor', 'prototype']);
const MAX_INDEX = 999;

type Json = null | boolean | number | string | Json[] | { [k: string]: Json };

const own = (o: object, k: string | number): boolean => Object.prototype.hasOwnProperty.call(o, k);
const escapePointer = (segment: string): string => segment.replace(/~/g, '~0').replace(/\//g, '~1');

/** Builds the nested request object from flat query entries. Throws RequestFieldError on bad names. */
export function unflatten(query: Record<string, string | string[] | undefined>): Record<string, Json> {
  const root: Record<string, Json> = {};
  for (const [key, raw] of Object.entries(query)) {
    if (raw === undefined) continue;
    const parts = key.split('.');
    // The JSON pointer an error names, made only when there is an error.
    const pointerOf = (): string => '/' + parts.map(escapePointer).join('/');
    for (const p of parts) {
      if (FORBIDDEN.has(p) || !(NAME.test(p) || INDEX.test(p))) throw new RequestFieldError(pointerOf(), `"${key}" is not a field name (dotted names and array indexes only).`);
    }
    if (Array.isArray(raw) && raw.length !== 1) {
      throw new RequestFieldError(pointerOf(), `"${key}" is given more than once; give it once (a list as one comma-separated value).`);
    }
    const value: Json = Array.isArray(raw) ? raw[0]! : raw;
    let node: Record<string, Json> | Json[] = root;
    for (let i = 0; i < parts.length; i++) {
      const seg = parts[i]!;
      const last = i === parts.length - 1;
      const isIndex = INDEX.test(seg);
      if (Array.isArray(node) !== isIndex) throw new RequestFieldError(pointerOf(), `"${key}": ${isIndex ? 'an index where a field name was expected' : 'a field name where an index was expected'}.`);
      if (isIndex && seg.length > 1 && seg.startsWith('0')) throw new RequestFieldError(pointerOf(), `"${key}": an index with a leading zero.`);
      if (isIndex && Number(seg) > MAX_INDEX) throw new RequestFieldError(pointerOf(), `"${key}": index above ${MAX_INDEX}.`);
      const k: string | number = isIndex ? Number(seg) : seg;
      const container = node as Record<string | number, Json>;
      const existing: Json | undefined = own(container, k) ? container[k] : undefined;
      if (last) {
        if (existing !== undefined) {
          throw new RequestFieldError(pointerOf(), existing !== null && typeof existing === 'object'
            ? `"${key}" is given both as one value and as a group of fields.`
            : `"${key}" is given more than once.`);
        }
        container[k] = value;
      } else {
        let child = existing;
        if (child === undefined) {
          child = INDEX.test(parts[i + 1]!) ? [] : {};
          container[k] = child;
        }
        if (child === null || typeof child !== 'object') throw new RequestFieldError(pointerOf(), `"${key}" nests under a field that has a value.`);
        node = child as Record<string, Json> | Json[];
      }
    }
  }
  fillHoles(root, []);
  return root;
}

function fillHoles(node: Json, path: Array<string | number>): void {
  if (Array.isArray(node)) {
    for (let i = 0; i < node.length; i++) {
      path.push(i);
      // The pointer is spelled out only for the error.
      if (node[i] === undefined) throw new RequestFieldError(`/${path.map((seg) => escapePointer(String(seg))).join('/')}`, `item ${i} is missing (indexes must run from 0 without gaps).`);
      fillHoles(node[i]!, path);
      path.pop();
    }
  } else if (node !== null && typeof node === 'object') {
    for (const k in node) {
      path.push(k);
      fillHoles(node[k]!, path);
      path.pop();
    }
  }
}

interface SchemaLike {
  type?: string | string[];
  anyOf?: SchemaLike[];
  properties?: Record<string, SchemaLike>;
  items?: SchemaLike;
  pattern?: string;
}

const NUMBER = /^\s*[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?\s*$/;

function accepts(schema: SchemaLike, type: string): boolean {
  if (schema.type === type || (Array.isArray(schema.type) && schema.type.includes(type))) return true;
  return (schema.anyOf ?? []).some((s) => accepts(s, type));
}

interface Wanted {
  list: boolean;
  number: boolean;
  boolean: boolean;
}

/** What a schema node accepts, worked out once per node (every GET request walks the same schema). */
const wantedBySchema = new WeakMap<SchemaLike, Wanted>();
function wanted(schema: SchemaLike): Wanted {
  let w = wantedBySchema.get(schema);
  if (w === undefined) {
    w = {
      list: accepts(schema, 'array') && !accepts(schema, 'string'),
      number: accepts(schema, 'number') || accepts(schema, 'integer'),
      boolean: accepts(schema, 'boolean'),
    };
    wantedBySchema.set(schema, w);
  }
  return w;
}

/** Coerces query-string text to the types the schema expects. Leaves anything else for the validator to report. */
export function coerce(schema: SchemaLike, value: Json): Json {
  if (typeof value === 'string') {
    const w = wanted(schema);
    if (w.list) {
      const items = schema.items ?? (schema.anyOf ?? []).find((s) => s.items)?.items ?? {};
      return value.split(',').map((v) => coerce(items, v.trim()));
    }
    if (w.number && NUMBER.test(value)) return Number(value);
    if (w.boolean) {
      // Spreadsheets write TRUE/FALSE; links often 1/0.
      const word = value.trim().toLowerCase();
      if (word === 'true' || word === '1') return true;
      if (word === 'false' || word === '0') return false;
    }
    return value;
  }
  if (Array.isArray(value)) {
    const items = schema.items ?? (schema.anyOf ?? []).find((s) => s.items)?.items ?? {};
    return value.map((v) => coerce(items, v));
  }
  if (value !== null && typeof value === 'object') {
    const props = schema.properties ?? (schema.anyOf ?? []).find((s) => s.properties)?.properties ?? {};
    const out: Record<string, Json> = {};
    for (const [k, v] of Object.entries(value)) out[k] = own(props, k) ? coerce(props[k]!, v) : v;
    return out;
  }
  return value;
}
