/**
 * The single-file build: src/server.ts and the packages it imports, bundled by esbuild into one
 * ES module, dist/throatline.js, which `npm start`, the container and the benchmarks run.
 *
 * Why: loading the service as a few hundred separate modules (the schema library alone is
 * several hundred small files) took 0.8-1.1 s of a cold start on a 2-core machine; one file
 * starts in about half that and holds ~15 MiB less resident memory. The behaviour is the same
 * code: `npm test` runs the sources, and test/ops/bundle.test.ts runs the bundle itself.
 *
 * Two packages stay outside the bundle and are loaded from node_modules as usual:
 *   - playwright-core: large, optional (format=pdf only), imported on the first PDF;
 *   - @fastify/swagger-ui: serves its own static files from its package directory.
 *
 *   tsx src/bin/bundle.ts [outfile]     default dist/throatline.js (npm run build calls this)
 *
 * The version every answer reports is written into the bundle from package.json, so the file
 * runs from any directory.
 */
import { readFileSync } from 'node:fs';
import { build } from 'esbuild';
import { isMain } from './is-main.js';

export const BUNDLE_PATH = 'dist/throatline.js';
export const EXTERNAL_PACKAGES = ['playwright-core', '@fastify/swagger-ui'];

/**
 * CommonJS packages inside an ES module bundle call require() for Node's own modules, and some
 * read __dirname; both are defined at the top of the bundle from its own location.
 */
const PRELUDE = [
  "import { createRequire as __throatlineRequire } from 'node:module';",
  "import { fileURLToPath as __throatlinePath } from 'node:url';",
  "import { dirname as __throatlineDir } from 'node:path';",
  'const require = __throatlineRequire(import.meta.url);',
  'const __filename = __throatlinePath(import.meta.url);',
  'const __dirname = __throatlineDir(__filename);',
].join('\n');

export async function bundle(outfile = BUNDLE_PATH): Promise<void> {
  const { version } = JSON.parse(readFileSync(new URL('../../package.json', import.meta.url), 'utf8')) as { version: string };
  await build({
    entryPoints: ['src/server.ts'],
    bundle: true,
    platform: 'node',
    format: 'esm',
    target: 'node20',
    outfile,
    external: EXTERNAL_PACKAGES,
    banner: { js: PRELUDE },
    define: { __THROATLINE_VERSION__: JSON.stringify(version) },
    // The bundled packages' licence notices stay with the code, at the end of the file.
    legalComments: 'eof',
    sourcemap: 'linked',
    logLevel: 'warning',
  });
}

if (isMain(import.meta.url)) {
  await bundle(process.argv[2]);
}
