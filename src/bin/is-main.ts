import { realpathSync } from 'node:fs';
import { resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

/** True when the module at `metaUrl` is the program being run (not imported by a test). */
export function isMain(metaUrl: string): boolean {
  const arg = process.argv[1];
  if (!arg) return false;
  try {
    return realpathSync(fileURLToPath(metaUrl)) === realpathSync(resolve(arg));
  } catch {
    return false;
  }
}
