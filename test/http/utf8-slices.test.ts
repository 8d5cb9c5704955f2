/**
 * Utf8Slices (routes/v1/batch.ts) gathers a batch's result texts as UTF-8 bytes and hands them
 * out a slice at a time. Whatever the texts and however small the buffer it starts with, the
 * slices put together are exactly the UTF-8 encoding of the texts in order, as Node's own
 * encoder (Buffer.from) makes it; lone surrogates become U+FFFD there as here.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { Utf8Slices } from '../../src/routes/v1/batch.js';

function gather(texts: readonly string[], capacity: number, takeEvery: number): Buffer {
  const slices = new Utf8Slices(capacity);
  const out: Buffer[] = [];
  texts.forEach((t, i) => {
    slices.add(t);
    if ((i + 1) % takeEvery === 0 && !slices.empty) out.push(slices.take());
  });
  if (!slices.empty) out.push(slices.take());
  return Buffer.concat(out);
}

describe('Utf8Slices', () => {
  it('starts empty and is empty again after take()', () => {
    const s = new Utf8Slices(4);
    expect(s.empty).toBe(true);
    s.add('é');
    expect(s.empty).toBe(false);
    expect(s.take()).toEqual(Buffer.from([0xc3, 0xa9]));
    expect(s.empty).toBe(true);
    expect(s.take()).toEqual(Buffer.alloc(0));
  });

  it('grows past its starting room without losing a byte (3-byte and 4-byte characters at the edge)', () => {
    // '梁' is E6 A2 81 in UTF-8 and U+1F529 is F0 9F 94 A9 (Unicode code charts; by hand).
    const s = new Utf8Slices(1);
    for (const t of ['a', '梁', '\u{1F529}', 'b']) s.add(t);
    expect([...s.take()]).toEqual([0x61, 0xe6, 0xa2, 0x81, 0xf0, 0x9f, 0x94, 0xa9, 0x62]);
  });

  it('slices put together equal Buffer.from of the joined texts (property)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.string({ unit: 'grapheme', maxLength: 40 }), { maxLength: 60 }),
        fc.integer({ min: 1, max: 64 }),
        fc.integer({ min: 1, max: 10 }),
        (texts, capacity, takeEvery) => {
          expect(gather(texts, capacity, takeEvery).equals(Buffer.from(texts.join(''), 'utf8'))).toBe(true);
        },
      ),
      { numRuns: 300 },
    );
  });

  it('any UTF-16 text, lone surrogates included, encodes as Node encodes it (property)', () => {
    fc.assert(
      fc.property(fc.array(fc.string({ unit: 'binary', maxLength: 30 }), { maxLength: 30 }), fc.integer({ min: 1, max: 32 }), (texts, capacity) => {
        const expected = Buffer.concat(texts.map((t) => Buffer.from(t, 'utf8')));
        expect(gather(texts, capacity, 3).equals(expected)).toBe(true);
      }),
      { numRuns: 300 },
    );
  });
});
