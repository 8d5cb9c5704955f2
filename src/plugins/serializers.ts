/**
 * Response serializers, built once per distinct schema. Every check route declares the same
 * answer schema for its POST and GET forms, and plain-text schemas for csv and value answers;
 * building a fast-json-stringify serializer for each of them made start-up cost about a second.
 * This factory wraps the framework's own and returns the same serializer for the same schema, and
 * a pass-through for text answers (which are sent as strings and never serialized). Each is
 * compiled on first use (plugins/lazy-compile.ts).
 *
 * The serializer compiles a copy of each schema in which "X or null" (`anyOf: [X, null]`, how
 * the schemas say a value may be absent) is written `X` with `nullable: true`. Both mean the same
 * to the serializer's output, but for `anyOf` it generates code that validates each such value
 * against X at run time to pick the branch: for the eccentric group's answer (14 such values,
 * some of them objects) that validation was a fifth of the serializer's time. The contract and
 * the validators keep the schemas as written.
 */
import { SerializerSelector } from '@fastify/fast-json-stringify-compiler';
import { lazyFunction } from './lazy-compile.js';

type Serializer = (data: unknown) => string;
type RouteSchema = { schema: { type?: unknown; $ref?: unknown } & Record<string, unknown> } & Record<string, unknown>;

const passThrough: Serializer = (data) => (typeof data === 'string' ? data : JSON.stringify(data));

const isNullSchema = (x: unknown): boolean => typeof x === 'object' && x !== null && (x as { type?: unknown }).type === 'null' && Object.keys(x).length === 1;

/** A copy of a JSON schema with every `anyOf: [X, {type: 'null'}]` (either order, X of one named type) written as X with `nullable: true`. */
export function withNullable(schema: unknown): unknown {
  if (Array.isArray(schema)) return schema.map(withNullable);
  if (typeof schema !== 'object' || schema === null) return schema;
  const out: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(schema)) out[k] = withNullable(v);
  const options = out.anyOf;
  if (Array.isArray(options) && options.length === 2) {
    const nullAt = options.findIndex(isNullSchema);
    const other = options[1 - nullAt] as Record<string, unknown> | undefined;
    if (nullAt !== -1 && other && typeof other.type === 'string' && other.type !== 'null' && other.anyOf === undefined && other.oneOf === undefined && other.$ref === undefined) {
      const { anyOf: _dropped, ...siblings } = out;
      return { ...other, ...siblings, nullable: true };
    }
  }
  return out;
}

/** withNullable once per schema object: the framework asks for a serializer factory in every plugin context (26 here), each with the same shared schemas. */
const nullableCopies = new WeakMap<object, unknown>();
function nullableCopy(schema: unknown): unknown {
  if (typeof schema !== 'object' || schema === null) return schema;
  let copy = nullableCopies.get(schema);
  if (copy === undefined) nullableCopies.set(schema, (copy = withNullable(schema)));
  return copy;
}

export function cachingSerializerFactory(externalSchemas: unknown, options: unknown): (route: RouteSchema) => Serializer {
  // Built on the first compile, not when the framework makes the factory (most contexts compile nothing).
  let compile: ((r: RouteSchema) => Serializer) | undefined;
  const compiler = (): ((r: RouteSchema) => Serializer) =>
    (compile ??= (SerializerSelector() as unknown as (e: unknown, o: unknown) => (r: RouteSchema) => Serializer)(
      Object.fromEntries(Object.entries((externalSchemas ?? {}) as Record<string, unknown>).map(([k, v]) => [k, nullableCopy(v)])),
      options,
    ));
  const cache = new Map<string, Serializer>();
  return (route) => {
    const schema = route.schema;
    if (schema.type === 'string' && schema.$ref === undefined) return passThrough;
    const key = JSON.stringify(schema);
    let fn = cache.get(key);
    if (!fn) {
      fn = lazyFunction(() => compiler()({ ...route, schema: nullableCopy(route.schema) as RouteSchema['schema'] }));
      cache.set(key, fn);
    }
    return fn;
  };
}
