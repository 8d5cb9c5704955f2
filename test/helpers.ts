/** Shared test helpers: building the app without a port, and a default fillet body. */
import { buildApp } from '../src/app.js';

export async function app() {
  return buildApp({ config: { DOCS: false } });
}

/** Relative closeness: |a - b| <= tol · |b|. */
export function near(actual: number, expected: number, tol = 1e-3): boolean {
  return Math.abs(actual - expected) <= tol * Math.abs(expected);
}
