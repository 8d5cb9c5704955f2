/** Small assertions shared by the engine and validation tests (no app import, so they stay fast). */
import { expect } from 'vitest';
import { EngineError } from '../src/engine/errors.js';

/** Asserts |actual/expected - 1| <= tol, naming both numbers when it fails. */
export function rel(actual: number, expected: number, tol: number): void {
  expect(Math.abs(actual / expected - 1), `expected ${expected} within ${tol} relative, got ${actual}`).toBeLessThanOrEqual(tol);
}

/** The engine's 422 code thrown by fn, or undefined when it answers. */
export function codeOf(fn: () => unknown): string | undefined {
  try {
    fn();
  } catch (err) {
    if (err instanceof EngineError) return err.code;
    throw err;
  }
  return undefined;
}

/** The error of class `type` that fn throws; fails when fn throws nothing, rethrows any other error. */
export function thrown<E extends Error>(fn: () => unknown, type: new (...args: never[]) => E): E {
  try {
    fn();
  } catch (err) {
    if (err instanceof type) return err;
    throw err;
  }
  throw new Error(`expected a ${type.name}, nothing was thrown`);
}
