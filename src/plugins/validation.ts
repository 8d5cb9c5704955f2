/**
 * Schema validation with Ajv, set up for a safety calculation: unknown properties are
 * rejected (not silently removed), JSON bodies are not type-coerced (true never becomes 1),
 * and query strings are coerced only where the schema asks for numbers or booleans.
 */
import { Ajv, type ErrorObject, type ValidateFunction } from 'ajv';
import type { FastifySchemaCompiler } from 'fastify';
import type { TSchema } from 'typebox';
import { FRACTION_PATTERN } from '../schemas/common.js';
import { lazyValidator } from './lazy-compile.js';

// verbose: errors carry the schema they failed against, so that a failed union can say what
// each of its branches accepts (see fieldErrors).
// validateSchema: false: the schemas are ours (the contract tests validate them); checking each
// against the meta-schema only slowed the first request of every kind.
const common = { allErrors: false, removeAdditional: false, useDefaults: false, strict: false, validateFormats: false, verbose: true, validateSchema: false } as const;

export const bodyAjv = new Ajv({ ...common, coerceTypes: false });
const queryAjv = new Ajv({ ...common, coerceTypes: true });

/** Route validators, compiled on first use (plugins/lazy-compile.ts). */
export const validatorCompiler: FastifySchemaCompiler<TSchema> = ({ schema, httpPart }) => {
  const ajv = httpPart === 'body' ? bodyAjv : queryAjv;
  return lazyValidator(() => ajv.compile(schema));
};

/** Validation failure of a request assembled outside the framework's own body path (GET forms, batch items). */
export class RequestValidationError extends Error {
  readonly validation: ErrorObject[];
  readonly validationContext: string;
  constructor(errors: ErrorObject[], context: string) {
    super('request validation failed');
    this.name = 'RequestValidationError';
    this.validation = errors;
    this.validationContext = context;
  }
}

const compiled = new WeakMap<object, ValidateFunction>();

/** The body validator of a schema: one per schema, compiled on first use. */
export function bodyValidator(schema: TSchema): ValidateFunction {
  let v = compiled.get(schema);
  if (!v) {
    v = lazyValidator(() => bodyAjv.compile(schema));
    compiled.set(schema, v);
  }
  return v;
}

export interface FieldError {
  pointer: string;
  detail: string;
}

/** Ajv's error with the fields that `verbose: true` adds (absent when another instance produced it). */
type VerboseError = ErrorObject & { schema?: unknown; parentSchema?: SchemaNode };

interface SchemaNode {
  type?: string | string[];
  enum?: unknown[];
  const?: unknown;
  pattern?: string;
  properties?: Record<string, unknown>;
  required?: string[];
  minimum?: number;
  maximum?: number;
  minItems?: number;
  maxItems?: number;
  exclusiveMinimum?: number;
  exclusiveMaximum?: number;
  description?: string;
}

/** One resolved entry while errors are folded: where, what, and enough of the Ajv error to fold unions. */
interface Entry {
  pointer: string;
  detail: string;
  schemaPath: string;
  instancePath: string;
  keyword: string;
  params: Record<string, unknown>;
}

/** Plain words for the string patterns of the contract. */
const PATTERN_WORDS: Record<string, string> = {
  [FRACTION_PATTERN]: 'an imperial fraction such as "5/16"',
};

const BOUND_KEYWORDS = new Set(['minimum', 'maximum', 'exclusiveMinimum', 'exclusiveMaximum']);
const MAX_LISTED = 40;

function escapePointer(segment: string): string {
  return segment.replace(/~/g, '~0').replace(/\//g, '~1');
}

function listOf(values: readonly unknown[]): string {
  const names = values.map(String);
  return `${names.slice(0, MAX_LISTED).join(', ')}${names.length > MAX_LISTED ? ', ...' : ''}`;
}

function typeWords(type: string): string {
  switch (type) {
    case 'number':
      return 'a number';
    case 'integer':
      return 'a whole number';
    case 'string':
      return 'text';
    case 'boolean':
      return 'true or false';
    case 'object':
      return 'an object';
    case 'array':
      return 'a list';
    case 'null':
      return 'null';
    default:
      return type;
  }
}

function joinAnd(items: readonly string[]): string {
  return items.length <= 1 ? (items[0] ?? '') : `${items.slice(0, -1).join(', ')} and ${items[items.length - 1]}`;
}

/** The message of one Ajv error, in the words of this service. */
function message(e: ErrorObject, pointer: string): string {
  const p = e.params as Record<string, unknown>;
  switch (e.keyword) {
    case 'required':
      return 'is required';
    case 'additionalProperties':
      return 'is not a field of this request';
    case 'enum':
      return `must be one of: ${listOf(p.allowedValues as unknown[])}`;
    case 'const':
      return `must be ${JSON.stringify(p.allowedValue)}`;
    case 'type': {
      // A wrong type for an enum still lists the allowed values.
      const allowed = (e as VerboseError).parentSchema?.enum;
      if (Array.isArray(allowed)) return `must be one of: ${listOf(allowed)}`;
      const types = String(p.type).split(',').map(typeWords);
      return pointer === '' && String(p.type) === 'object' ? 'must be a JSON object' : `must be ${types.join(' or ')}`;
    }
    case 'pattern': {
      const words = PATTERN_WORDS[String(p.pattern)];
      return words ? `must be ${words}` : 'is not in the expected form';
    }
    case 'minItems':
      return `must have at least ${String(p.limit)} item${p.limit === 1 ? '' : 's'}`;
    case 'maxItems':
      return `must have at most ${String(p.limit)} item${p.limit === 1 ? '' : 's'}`;
    case 'minLength':
      return p.limit === 1 ? 'must not be empty' : `must have at least ${String(p.limit)} characters`;
    case 'maxLength':
      return `must have at most ${String(p.limit)} characters`;
    case 'minimum':
    case 'maximum':
    case 'exclusiveMinimum':
    case 'exclusiveMaximum':
      return `must be ${String(p.comparison)} ${String(p.limit)}`;
    default:
      return e.message ?? 'is not valid';
  }
}

/** What one branch of a union accepts, in words; the failing error of that branch sharpens a numeric bound. */
function describeBranch(schema: SchemaNode, failing: Entry | undefined): string {
  if (Array.isArray(schema.enum)) return `one of: ${listOf(schema.enum)}`;
  if (schema.const !== undefined) return JSON.stringify(schema.const);
  const type = Array.isArray(schema.type) ? schema.type[0] : schema.type;
  switch (type) {
    case 'number':
    case 'integer': {
      const noun = typeWords(type);
      if (failing && BOUND_KEYWORDS.has(failing.keyword)) return `${noun} ${String(failing.params.comparison)} ${String(failing.params.limit)}`;
      if (schema.exclusiveMinimum !== undefined) return `${noun} > ${schema.exclusiveMinimum}`;
      if (schema.minimum !== undefined) return `${noun} >= ${schema.minimum}`;
      if (schema.exclusiveMaximum !== undefined) return `${noun} < ${schema.exclusiveMaximum}`;
      if (schema.maximum !== undefined) return `${noun} <= ${schema.maximum}`;
      return noun;
    }
    case 'string':
      if (schema.pattern !== undefined) return PATTERN_WORDS[schema.pattern] ?? 'text in the expected form';
      return 'text';
    case 'object': {
      const names = schema.required ?? Object.keys(schema.properties ?? {});
      return names.length > 0 ? `an object with ${joinAnd(names)}` : 'an object';
    }
    case 'array':
      if (schema.minItems !== undefined && schema.minItems === schema.maxItems) return `a list of ${schema.minItems} item${schema.minItems === 1 ? '' : 's'}`;
      return 'a list';
    case undefined:
      return schema.description ?? 'another accepted form';
    default:
      return typeWords(type);
  }
}

/**
 * Folds the errors of a failed union (anyOf/oneOf) into one entry. When the value has the
 * type of exactly one branch and that branch is an object or a list (or failed only inside
 * the value), the caller clearly meant that branch: its own errors are kept, e.g.
 * '/electrode/fexx: must be > 0'. Otherwise one sentence lists what each branch accepts,
 * e.g. 'must be a number > 0, or an imperial fraction such as "5/16"'.
 */
function foldUnion(e: VerboseError, group: Entry[]): Entry[] {
  const fold = (detail: string): Entry[] => [{ pointer: e.instancePath, detail, schemaPath: e.schemaPath, instancePath: e.instancePath, keyword: e.keyword, params: {} }];
  // oneOf matched by more than one branch: nothing failed, the value is ambiguous.
  if (group.length === 0 && e.keyword === 'oneOf') return fold('matches more than one of the accepted forms');
  const prefix = `${e.schemaPath}/`;
  const branches = new Map<number, Entry[]>();
  for (const g of group) {
    const i = Number(g.schemaPath.slice(prefix.length).split('/')[0]);
    branches.set(i, [...(branches.get(i) ?? []), g]);
  }
  const wrongType = (entries: Entry[]) => entries.some((g) => g.keyword === 'type' && g.instancePath === e.instancePath);
  const meant = [...branches].filter(([, entries]) => !wrongType(entries));
  if (meant.length === 1) {
    const [index, entries] = meant[0]!;
    const branch = Array.isArray(e.schema) ? (e.schema[index] as SchemaNode | undefined) : undefined;
    const container = branch?.type === 'object' || branch?.type === 'array';
    if (container || entries.every((g) => g.pointer.startsWith(`${e.instancePath}/`))) return entries;
  }
  const schemas = Array.isArray(e.schema) ? (e.schema as SchemaNode[]) : undefined;
  if (!schemas) {
    const details = [...new Set(group.map((g) => g.detail))];
    return fold(details.length > 0 ? details.join('; or ') : (e.message ?? 'is not valid'));
  }
  const words = schemas.map((s, i) => {
    const own = (branches.get(i) ?? []).find((g) => g.instancePath === e.instancePath && g.keyword !== 'type');
    return describeBranch(s, own);
  });
  const unique = [...new Set(words)];
  const separator = unique.some((w) => w.includes(',')) ? '; or ' : ', or ';
  return fold(`must be ${unique.join(separator)}`);
}

/** Turns Ajv errors into one clear entry per offending field, pointing at the field itself. */
export function fieldErrors(errors: readonly ErrorObject[], prefix = ''): FieldError[] {
  const entries: Entry[] = [];
  for (const raw of errors) {
    const e = raw as VerboseError;
    if (e.keyword === 'anyOf' || e.keyword === 'oneOf') {
      const groupPrefix = `${e.schemaPath}/`;
      let start = entries.length;
      while (start > 0 && entries[start - 1]!.schemaPath.startsWith(groupPrefix)) start--;
      const group = entries.splice(start);
      entries.push(...foldUnion(e, group));
      continue;
    }
    const p = e.params as Record<string, unknown>;
    let pointer = e.instancePath;
    if (e.keyword === 'required') pointer += `/${escapePointer(String(p.missingProperty))}`;
    else if (e.keyword === 'additionalProperties') pointer += `/${escapePointer(String(p.additionalProperty))}`;
    entries.push({ pointer, detail: message(e, e.instancePath), schemaPath: e.schemaPath, instancePath: e.instancePath, keyword: e.keyword, params: p });
  }
  const byPointer = new Map<string, string[]>();
  for (const entry of entries) {
    const list = byPointer.get(prefix + entry.pointer) ?? [];
    if (!list.includes(entry.detail)) list.push(entry.detail);
    byPointer.set(prefix + entry.pointer, list);
  }
  return [...byPointer].map(([pointer, list]) => ({ pointer, detail: list.join('; ') }));
}
