/**
 * Schema validation with Ajv, set up for a safety calculation: unknown properties are
 * rejected (not silently removed), JSON bodies are not type-coerced (true never becomes 1),
 * and query strings are coerced only where the schema asks for numbers or booleans.
 */
import { Ajv, type ErrorObject, type ValidateFunction } from 'ajv';
import type { FastifySchemaCompiler } from 'fastify';
import type { TSchema } from 'typebox';

const common = { allErrors: false, removeAdditional: false, useDefaults: false, strict: false, validateFormats: false } as const;

export const bodyAjv = new Ajv({ ...common, coerceTypes: false });
const queryAjv = new Ajv({ ...common, coerceTypes: true });

export const validatorCompiler: FastifySchemaCompiler<TSchema> = ({ schema, httpPart }) => {
  const ajv = httpPart === 'body' ? bodyAjv : queryAjv;
  return ajv.compile(schema) as ValidateFunction;
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

/** The compiled body validator of a schema, compiled once. */
export function bodyValidator(schema: TSchema): ValidateFunction {
  let v = compiled.get(schema);
  if (!v) {
    v = bodyAjv.compile(schema);
    compiled.set(schema, v);
  }
  return v;
}

export interface FieldError {
  pointer: string;
  detail: string;
}

/** Turns Ajv errors into one clear entry per offending field, pointing at the field itself. */
export function fieldErrors(errors: readonly ErrorObject[], prefix = ''): FieldError[] {
  const byPointer = new Map<string, string[]>();
  for (const e of errors) {
    let pointer = e.instancePath;
    let detail = e.message ?? 'is not valid';
    const p = e.params as Record<string, unknown>;
    if (e.keyword === 'required') {
      pointer += `/${String(p.missingProperty)}`;
      detail = 'is required';
    } else if (e.keyword === 'additionalProperties') {
      pointer += `/${String(p.additionalProperty)}`;
      detail = 'is not a field of this request';
    } else if (e.keyword === 'enum') {
      const allowed = (p.allowedValues as unknown[]).map(String);
      detail = `must be one of: ${allowed.slice(0, 40).join(', ')}${allowed.length > 40 ? ', ...' : ''}`;
    } else if (e.keyword === 'anyOf') {
      continue;
    } else if (e.keyword === 'pattern') {
      detail = 'must be a number or an imperial fraction such as "5/16" or "1-1/4"';
    }
    const list = byPointer.get(prefix + pointer) ?? [];
    if (!list.includes(detail)) list.push(detail);
    byPointer.set(prefix + pointer, list);
  }
  if (byPointer.size === 0 && errors.length > 0) {
    const e = errors[0]!;
    byPointer.set(prefix + e.instancePath, [e.message ?? 'is not valid']);
  }
  return [...byPointer].map(([pointer, list]) => ({ pointer, detail: list.join('; or ') }));
}
