import { existsSync, readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

let root: string | undefined;

/** The folder holding warrant's package.json, found by walking up from this file (works from src/ and dist/). */
export function packageRoot(): string {
  if (root) return root;
  let dir = dirname(fileURLToPath(import.meta.url));
  for (;;) {
    if (existsSync(join(dir, 'package.json')) && existsSync(join(dir, 'templates'))) {
      root = dir;
      return dir;
    }
    const parent = dirname(dir);
    if (parent === dir) throw new Error('warrant: cannot find the package folder (package.json with templates/)');
    dir = parent;
  }
}

let version: string | undefined;

/**
 * warrant's own version, from the package.json beside its code. Never left to the argument parser: yargs reads the
 * package.json above the node_modules folder it is installed in, which in another project is that project's own.
 */
export function packageVersion(): string {
  if (version) return version;
  const pkg = JSON.parse(readFileSync(join(packageRoot(), 'package.json'), 'utf8')) as { version?: unknown };
  if (typeof pkg.version !== 'string') throw new Error(`warrant: no version in ${join(packageRoot(), 'package.json')}`);
  version = pkg.version;
  return version;
}
