import { createRequire } from 'node:module';

const require = createRequire(import.meta.url);
const pkg = require('../package.json') as { version: string };

/** The engine version reported in every answer's basis. */
export const ENGINE_VERSION: string = `throatline ${pkg.version}`;
