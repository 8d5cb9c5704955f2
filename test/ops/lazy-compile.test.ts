/**
 * Compilation on first use (plugins/lazy-compile.ts): nothing is compiled until needed, each
 * schema once, the errors of a failed validation are those of the compiled validator, and a
 * listening app compiles whatever is left in the background.
 */
import { Ajv } from 'ajv';
import { describe, expect, it } from 'vitest';
import { buildApp } from '../../src/app.js';
import { lazyFunction, lazyValidator, pendingCompilations, warmUp } from '../../src/plugins/lazy-compile.js';

describe('lazy compilation', () => {
  it('compiles a validator once, on first use, and mirrors its errors', () => {
    let compiles = 0;
    const v = lazyValidator(() => {
      compiles++;
      return new Ajv().compile({ type: 'object', properties: { n: { type: 'number' } }, required: ['n'] });
    });
    expect(compiles).toBe(0);
    expect(v({ n: 1 })).toBe(true);
    expect(v.errors).toBeNull();
    expect(v({ n: 'x' })).toBe(false);
    expect(v.errors?.[0]).toMatchObject({ instancePath: '/n', keyword: 'type' });
    expect(v({ n: 2 })).toBe(true);
    expect(v.errors).toBeNull();
    expect(compiles).toBe(1);
  });

  it('warmUp compiles what is still waiting, and a function compiled there is not compiled again', async () => {
    let compiles = 0;
    const f = lazyFunction(() => {
      compiles++;
      return (x: number) => x * 2;
    });
    expect(pendingCompilations()).toBeGreaterThan(0);
    await warmUp();
    expect(compiles).toBe(1);
    expect(f(21)).toBe(42);
    expect(compiles).toBe(1);
  });

  it('a listening app leaves nothing to compile shortly after it starts', async () => {
    const app = await buildApp({ config: { DOCS: false } });
    try {
      expect(pendingCompilations()).toBeGreaterThan(0);
      await app.listen({ host: '127.0.0.1', port: 0 });
      for (let i = 0; i < 200 && pendingCompilations() > 0; i++) await new Promise((r) => setTimeout(r, 25));
      expect(pendingCompilations()).toBe(0);
    } finally {
      await app.close();
    }
  });
});
