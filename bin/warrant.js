#!/usr/bin/env node
import { statSync } from 'node:fs';

// dist/bundle/ holds the same code as dist/ in a few files, which load far faster than dist/'s many modules
// (scripts/bundle.mjs); it is used only when it was made after the dist/ there now (tsc rewrites dist/cli.js), and not
// with --debug, whose stack traces then name warrant's own files (src/claims/read.ts as dist/claims/read.js).
const dist = new URL('../dist/', import.meta.url);
let entry = '../dist/cli.js';
try {
  if (!process.argv.includes('--debug') && statSync(new URL('bundle/cli.js', dist)).mtimeMs >= statSync(new URL('cli.js', dist)).mtimeMs) entry = '../dist/bundle/cli.js';
} catch {
  // No bundle: dist/ as tsc made it.
}
const { main } = await import(entry);

main(process.argv.slice(2)).then((code) => {
  process.exitCode = code;
});
