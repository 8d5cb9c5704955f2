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
