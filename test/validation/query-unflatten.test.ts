/**
 * The query-string form's builder (src/query.ts): dotted names become the nested request, and
 * each refusal names the field by its JSON pointer (RFC 6901: "~" as "~0", "/" as "~1").
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { RequestFieldError } from '../../src/operations/shared.js';
import { coerce, unflatten } from '../../src/query.js';
import { thrown } from '../assert.js';

describe('unflatten', () => {
  it('builds nested objects and arrays from dotted names', () => {
    expect(unflatten({ method: 'LRFD', 'welds.0.size': '5/16', 'welds.1.size': '1/4', 'load.force': '120' })).toEqual({
      method: 'LRFD',
      welds: [{ size: '5/16' }, { size: '1/4' }],
      load: { force: '120' },
    });
  });

  it('a gap in the indexes names the missing item', () => {
    const e = thrown(() => unflatten({ 'welds.1.size': '1/4' }), RequestFieldError);
    expect(e.pointer).toBe('/welds/0');
    const deep = thrown(() => unflatten({ 'parts.0.steel': 'A36', 'welds.0.size': '1/4', 'welds.2.size': '1/4' }), RequestFieldError);
    expect(deep.pointer).toBe('/welds/1');
  });

  it('a bad name is refused with its pointer', () => {
    expect(thrown(() => unflatten({ 'welds.0.__proto__': 'x' }), RequestFieldError).pointer).toBe('/welds/0/__proto__');
    expect(thrown(() => unflatten({ 'load.force.x': '1', 'load.force': '2' }), RequestFieldError).pointer).toBe('/load/force');
    expect(thrown(() => unflatten({ 'welds.01.size': '1' }), RequestFieldError).pointer).toBe('/welds/01/size');
  });

  it('never throws anything but a RequestFieldError, whatever the names (property)', () => {
    fc.assert(
      fc.property(fc.dictionary(fc.string({ maxLength: 12 }), fc.string({ maxLength: 6 }), { maxKeys: 6 }), (query) => {
        try {
          unflatten(query);
        } catch (err) {
          expect(err).toBeInstanceOf(RequestFieldError);
        }
      }),
      { numRuns: 300 },
    );
  });
});

describe('unflatten against flattening', () => {
  // Any nested request of objects and arrays (none empty: an empty one has no query name) with
  // text leaves, flattened here to dotted names, is built back exactly.
  type Tree = string | Tree[] | { [k: string]: Tree };
  const name = fc.stringMatching(/^[A-Za-z][A-Za-z0-9_-]{0,8}$/).filter((n) => !['constructor', 'prototype'].includes(n));
  const { tree } = fc.letrec<{ tree: Tree }>((tie) => ({
    tree: fc.oneof(
      { depthSize: 'small', withCrossShrink: true },
      fc.string({ maxLength: 6 }),
      fc.array(tie('tree'), { minLength: 1, maxLength: 4 }),
      fc.dictionary(name, tie('tree'), { minKeys: 1, maxKeys: 4 }),
    ),
  }));
  const root = fc.dictionary(name, tree, { minKeys: 1, maxKeys: 5 });

  function flatten(node: Tree, prefix: string, out: Record<string, string>): void {
    if (typeof node === 'string') out[prefix] = node;
    else if (Array.isArray(node)) node.forEach((v, i) => flatten(v, `${prefix}.${i}`, out));
    else for (const [k, v] of Object.entries(node)) flatten(v, `${prefix}.${k}`, out);
  }

  it('rebuilds any nested request from its dotted names (property)', () => {
    fc.assert(
      fc.property(root, (request) => {
        const query: Record<string, string> = {};
        for (const [k, v] of Object.entries(request)) flatten(v, k, query);
        expect(unflatten(query)).toEqual(request);
      }),
      { numRuns: 500 },
    );
  });

  it('refuses names outside the rules, each by its pointer (hand-listed cases)', () => {
    const cases: Array<[Record<string, string>, string]> = [
      [{ '1abc': 'x' }, '/1abc'],
      [{ 'a.b c': 'x' }, '/a/b c'],
      [{ [`a${'b'.repeat(64)}`]: 'x' }, `/a${'b'.repeat(64)}`],
      [{ 'welds.': 'x' }, '/welds/'],
      [{ 'welds.1000.size': 'x' }, '/welds/1000/size'],
      [{ 'a/b.c~d': 'x' }, '/a~1b/c~0d'],
      [{ 'welds.0': 'x', 'welds.a': 'y' }, '/welds/a'],
    ];
    for (const [query, pointer] of cases) expect(thrown(() => unflatten(query), RequestFieldError).pointer, JSON.stringify(query)).toBe(pointer);
    // 64 characters is the longest name; "_" and "-" are allowed after the first letter.
    expect(unflatten({ [`a${'b'.repeat(63)}`]: 'x', 'x_y-z': 'w' })).toEqual({ [`a${'b'.repeat(63)}`]: 'x', 'x_y-z': 'w' });
  });
});

describe('coerce', () => {
  const schema = {
    type: 'object',
    properties: {
      n: { type: 'number' },
      i: { anyOf: [{ type: 'integer' }, { type: 'string' }] },
      b: { type: 'boolean' },
      list: { type: 'array', items: { type: 'number' } },
      s: { type: 'string' },
    },
  };

  it('turns text into the types the schema asks for, and leaves the rest', () => {
    expect(coerce(schema, { n: '2.5', i: '3', b: 'TRUE', list: '1, 2,3', s: '4', other: '5' })).toEqual({ n: 2.5, i: 3, b: true, list: [1, 2, 3], s: '4', other: '5' });
    expect(coerce(schema, { n: 'abc', b: '0' })).toEqual({ n: 'abc', b: false });
  });
});
