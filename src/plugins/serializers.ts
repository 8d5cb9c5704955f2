/**
 * Response serializers, built once per distinct schema. Every check route declares the same
 * answer schema for its POST and GET forms, and plain-text schemas for csv and value answers;
 * building a fast-json-stringify serializer for each of them made start-up cost about a second.
 * This factory wraps the framework's own and returns the same serializer for the same schema, and
 * a pass-through for text answers (which are sent as strings and never serialized). Each is
 * compiled on first use (plugins/lazy-compile.ts).
 */
import { SerializerSelector } from '@fastify/fast-json-stringify-compiler';
import { lazyFunction } from './lazy-compile.js';

type Serializer = (data: unknown) => string;
type RouteSchema = { schema: { type?: unknown; $ref?: unknown } & Record<string, unknown> } & Record<string, unknown>;

const passThrough: Serializer = (data) => (typeof data === 'string' ? data : JSON.stringify(data));

export function cachingSerializerFactory(externalSchemas: unknown, options: unknown): (route: RouteSchema) => Serializer {
  const compile = (SerializerSelector() as unknown as (e: unknown, o: unknown) => (r: RouteSchema) => Serializer)(externalSchemas, options);
  const cache = new Map<string, Serializer>();
  return (route) => {
    const schema = route.schema;
    if (schema.type === 'string' && schema.$ref === undefined) return passThrough;
    const key = JSON.stringify(schema);
    let fn = cache.get(key);
    if (!fn) {
      fn = lazyFunction(() => compile(route));
      cache.set(key, fn);
    }
    return fn;
  };
}
