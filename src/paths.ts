import { existsSync } from 'node:fs';
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
