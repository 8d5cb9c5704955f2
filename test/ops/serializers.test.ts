/**
 * The response serializers compile a copy of each schema with "X or null" written as a nullable
 * X (plugins/serializers.ts). The copy must serialize every answer exactly as the schema as
 * written does: checked here with the serializer library itself on both, over the answers to
 * every operation's contract examples, and on hand-written schemas.
 */
import fastJson from 'fast-json-stringify';
import { describe, expect, it } from 'vitest';
import { OPERATIONS } from '../../src/operations/index.js';
import { withNullable } from '../../src/plugins/serializers.js';

describe('withNullable', () => {
  it('rewrites anyOf [X, null] in either order, keeping the siblings, and leaves the rest alone', () => {
    const input = {
      type: 'object',
      properties: {
        a: { anyOf: [{ type: 'number' }, { type: 'null' }], description: 'a number or null' },
        b: { anyOf: [{ type: 'null' }, { type: 'object', properties: { x: { type: 'integer' } } }] },
        c: { anyOf: [{ type: 'string' }, { type: 'number' }] },
        d: { anyOf: [{ $ref: 'Other' }, { type: 'null' }] },
        e: { anyOf: [{ type: 'null', description: 'not a bare null' }, { type: 'number' }] },
        f: { type: 'array', items: { anyOf: [{ type: 'array', items: { type: 'number' } }, { type: 'null' }] } },
      },
    };
    expect(withNullable(input)).toEqual({
      type: 'object',
      properties: {
        a: { type: 'number', description: 'a number or null', nullable: true },
        b: { type: 'object', properties: { x: { type: 'integer' } }, nullable: true },
        c: { anyOf: [{ type: 'string' }, { type: 'number' }] },
        d: { anyOf: [{ $ref: 'Other' }, { type: 'null' }] },
        e: { anyOf: [{ type: 'null', description: 'not a bare null' }, { type: 'number' }] },
        f: { type: 'array', items: { type: 'array', items: { type: 'number' }, nullable: true } },
      },
    });
    // the schema given is not changed
    expect(input.properties.a).toEqual({ anyOf: [{ type: 'number' }, { type: 'null' }], description: 'a number or null' });
  });

  it('the rewritten schema serializes null and non-null values as the original does', () => {
    const original = { type: 'object', properties: { v: { anyOf: [{ type: 'object', properties: { x: { type: 'number' } } }, { type: 'null' }] }, n: { anyOf: [{ type: 'null' }, { type: 'integer' }] } } };
    const a = fastJson(original as object);
    const b = fastJson(withNullable(original) as object);
    for (const value of [{ v: null, n: null }, { v: { x: 1.5 }, n: 3 }, { v: { x: -0 }, n: 0 }, {}]) expect(b(value)).toBe(a(value));
  });
});

describe('every operation\'s answers serialize the same through the rewritten schema', () => {
  for (const op of OPERATIONS) {
    for (const [name, example] of Object.entries(op.examples ?? {})) {
      it(`${op.kind} ${name}`, () => {
        const answer = op.run(structuredClone((example as { value: unknown }).value) as never);
        const expected = fastJson(op.response as object)(answer);
        expect(fastJson(withNullable(op.response) as object)(answer)).toBe(expected);
        // and the text is the answer itself, nothing lost or added
        expect(JSON.parse(expected)).toEqual(JSON.parse(JSON.stringify(answer)));
      });
    }
  }
});
