// node scripts/bundle.mjs: warrant's own compiled code (dist/, from tsc) joined into a few files in dist/bundle/, which
// bin/warrant.js runs when it was made from the dist/ there now.
//
// Node loads each ES module on its own (resolve, stat, read, compile, link): a build loads about 150 of warrant's
// modules, and that alone took a tenth of a second or more of every run. The bundle holds the same code in one file
// per entry (the command line, the chart thread, the reading worker) and a few shared pieces; what is loaded lazily
// (the PDF renderer, the charts, results.xlsx, the other commands) stays in pieces of its own, loaded when it is
// needed as before. Packages stay outside (imported from node_modules as before), so that each keeps its own files,
// paths and licence. `npm run build`, `npm test`, `npm run demo` and `npm pack` make it after tsc.
import { existsSync, rmSync, utimesSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { rolldown } from 'rolldown';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const dist = join(root, 'dist');
const out = join(dist, 'bundle');

if (!existsSync(join(dist, 'cli.js'))) {
  console.error('scripts/bundle.mjs: dist/cli.js is missing; run tsc -p tsconfig.json first');
  process.exit(1);
}
rmSync(out, { recursive: true, force: true });
const bundle = await rolldown({
  // The entry files keep their names: chart-thread.ts and cube.ts start their workers from the file beside them
  // (new URL('./chart-worker.js', import.meta.url)), which in the bundle is dist/bundle/chart-worker.js.
  input: {
    cli: join(dist, 'cli.js'),
    'chart-worker': join(dist, 'render', 'chart-worker.js'),
    'read-worker': join(dist, 'data', 'read-worker.js'),
  },
  platform: 'node',
  // Only warrant's own files (relative imports) go in; every package and Node's own modules are imported as before.
  external: (id, importer) => importer !== undefined && !id.startsWith('.') && !id.startsWith('/'),
  logLevel: 'warn',
});
await bundle.write({ dir: out, format: 'esm', entryFileNames: '[name].js', chunkFileNames: '[name]-[hash].js' });
await bundle.close();
// bin/warrant.js takes the bundle only when it is not older than dist/cli.js (tsc rewrites every file it emits), so a
// later tsc run without this script is never shadowed by an old bundle.
const now = new Date();
utimesSync(join(out, 'cli.js'), now, now);
