/**
 * Spreadsheet-friendly query strings: dotted names for nested fields and array items
 * (welds.0.size=5/16), comma lists where the schema expects a list, and string-to-number or
 * boolean coercion guided by the request schema, so that the GET form of a check validates
 * against exactly the same schema as its JSON body.
 */
import { RequestFieldError } from './operations/shared.js';

const SEGMENT = /^[A-Za-z][A-Za-z0-9_-]{0,63}$|^\d{1,4}$/;
const FORBIDDEN = new Set(['__proto__', 'constructor', 'prototype']);
const MAX_INDEX = 999;

type Json = null | boolean | number | string | Json[] | { [k: string]: Json };

/** Builds the nested request object from flat query entries. Throws RequestFieldError on bad names. */
export function unflatten(query: Record<string, string | string[] | undefined>): Record<string, Json> {
  const root: Record<string, Json> = {};
  for (const [key, raw] of Object.entries(query)) {
    if (raw === undefined) continue;
    const value: Json = Array.isArray(raw) ? (raw.length === 1 ? raw[0]! : raw) : raw;
    const parts = key.split('.');
    const pointer = '/' + parts.join('/');
    for (const p of parts) {
      if (!SEGMENT.test(p) || FORBIDDEN.has(p)) throw new RequestFieldError(pointer, `"${key}" is not a field name (dotted names and array indexes only).`);
    }
    let node: Record<string, Json> | Json[] = root;
    for (let i = 0; i < parts.length; i++) {
      const seg = parts[i]!;
      const last = i === parts.length - 1;
      const isIndex = /^\d+$/.test(seg);
      if (Array.isArray(node) !== isIndex) throw new RequestFieldError(pointer, `"${key}": ${isIndex ? 'an index where a field name was expected' : 'a field name where an index was expected'}.`);
      if (isIndex && Number(seg) > MAX_INDEX) throw new RequestFieldError(pointer, `"${key}": index above ${MAX_INDEX}.`);
      const k: string | number = isIndex ? Number(seg) : seg;
      const container = node as Record<string | number, Json>;
      if (last) {
        if (container[k] !== undefined) throw new RequestFieldError(pointer, `"${key}" is given twice.`);
        container[k] = value;
      } else {
        const nextIsIndex = /^\d+$/.test(parts[i + 1]!);
        let child: Json | undefined = Object.prototype.hasOwnProperty.call(container, k) ? container[k] : undefined;
        if (child === undefined) {
          child = nextIsIndex ? [] : {};
          container[k] = child;
        }
        if (child === null || typeof child !== 'object') throw new RequestFieldError(pointer, `"${key}" nests under a field that has a value.`);
        node = child as Record<string, Json> | Json[];
      }
    }
  }
  fillHoles(root, '');
  return root;
}

function fillHoles(node: Json, pointer: string): void {
  if (Array.isArray(node)) {
    for (let i = 0; i < node.length; i++) {
      if (node[i] === undefined) throw new RequestFieldError(`${pointer}/${i}`, `item ${i} is missing (indexes must run from 0 without gaps).`);
      fillHoles(node[i]!, `${pointer}/${i}`);
    }
  } else if (node !== null && typeof node === 'object') {
    for (const [k, v] of Object.entries(node)) fillHoles(v, `${pointer}/${k}`);
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

function wants(schema: SchemaLike, type: string): boolean {
  if (schema.type === type || (Array.isArray(schema.type) && schema.type.includes(type))) return true;
  return (schema.anyOf ?? []).some((s) => wants(s, type));
}

/** Coerces query-string text to the types the schema expects. Leaves anything else for the validator to report. */
export function coerce(schema: SchemaLike, value: Json): Json {
  if (typeof value === 'string') {
    if (wants(schema, 'array') && !wants(schema, 'string')) {
      const items = schema.items ?? (schema.anyOf ?? []).find((s) => s.items)?.items ?? {};
      return value.split(',').map((v) => coerce(items, v.trim()));
    }
    if ((wants(schema, 'number') || wants(schema, 'integer')) && NUMBER.test(value)) return Number(value);
    if (wants(schema, 'boolean')) {
      if (value === 'true' || value === '1') return true;
      if (value === 'false' || value === '0') return false;
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
    for (const [k, v] of Object.entries(value)) out[k] = props[k] ? coerce(props[k], v) : v;
    return out;
  }
  return value;
}
