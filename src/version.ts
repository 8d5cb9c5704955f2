import { createRequire } from 'node:module';

/** Set by the single-file build (src/bin/bundle.ts) from package.json; absent when run from the sources. */
declare const __THROATLINE_VERSION__: string | undefined;

function packageVersion(): string {
  if (typeof __THROATLINE_VERSION__ === 'string') return __THROATLINE_VERSION__;
  const require = createRequire(import.meta.url);
  return (require('../package.json') as { version: string }).version;
}

/** The engine version reported in every answer's basis. */
export const ENGINE_VERSION: string = `throatline ${packageVersion()}`;
