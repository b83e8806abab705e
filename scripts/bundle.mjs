// node scripts/bundle.mjs: warrant's own compiled code (dist/, from tsc) joined into a few files in dist/bundle/, which
// bin/warrant.js runs when it was made from the dist/ there now.
//
// Node loads each ES module on its own (resolve, stat, read, compile, link): a build loads about 150 of warrant's
// modules, and that alone took a tenth of a second or more of every run. The bundle holds the same code in one file
// per entry (the command line, the chart thread, the reading worker) and a few shared pieces; what is loaded lazily
// (the PDF renderer, the charts, results.xlsx, the other commands) stays in pieces of its own, loaded when it is
// needed as before. Packages stay outside (imported from node_modules as before), so that each keeps its own files
// and paths, except Vega, Vega-Lite and the d3 modules under them (INLINE): the chart thread loaded about 280 modules
// of theirs, pure code that reads no file of its own, and they go into the bundle, each package's licence copied into
// dist/bundle/THIRD-PARTY-LICENSES.txt. `npm run build`, `npm test`, `npm run demo` and `npm pack` make it after tsc.
import { existsSync, readdirSync, readFileSync, rmSync, utimesSync, writeFileSync } from 'node:fs';
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
// Packages whose code goes into the bundle. fontkit, linebreak and the rest under pdfkit stay outside: pdfkit imports
// them itself, and one copy of each is loaded.
const INLINE = /^(vega|vega-[a-z-]+|d3-[a-z-]+|internmap|delaunator|robust-predicates|topojson-client|json-stringify-pretty-compact)(\/|$)/;
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
  external: (id, importer) => importer !== undefined && !id.startsWith('.') && !id.startsWith('/') && !INLINE.test(id),
  logLevel: 'warn',
});
const NOTICE = '/* This file includes code of packages listed, with their licences, in THIRD-PARTY-LICENSES.txt beside it. */';
const written = await bundle.write({
  dir: out,
  format: 'esm',
  entryFileNames: '[name].js',
  // Plain ASCII (non-ASCII characters in strings escaped, doc comments left out): Node then decodes each file on its
  // fast path and V8 keeps its source in one byte per character rather than two.
  charset: 'ascii',
  comments: { legal: true, annotation: false, jsdoc: false },
  chunkFileNames: '[name]-[hash].js',
  banner: (chunk) => (chunk.moduleIds.some((id) => id.includes('/node_modules/')) ? NOTICE : ''),
});
await bundle.close();

// Each package the bundle holds code of, with its licence as the package ships it.
const packages = new Map();
for (const chunk of written.output) {
  for (const id of chunk.type === 'chunk' ? chunk.moduleIds : []) {
    const m = /^(.*\/node_modules\/(?:@[^/]+\/)?[^/]+)\//.exec(id.replace(/\\/g, '/'));
    if (m && !packages.has(m[1])) packages.set(m[1], JSON.parse(readFileSync(join(m[1], 'package.json'), 'utf8')));
  }
}
const notices = [...packages]
  .sort(([, a], [, b]) => (a.name < b.name ? -1 : a.name > b.name ? 1 : 0))
  .map(([dir, pkg]) => {
    const file = readdirSync(dir).find((f) => /^(licen[cs]e|copying)(\.|$)/i.test(f));
    if (file === undefined) throw new Error(`scripts/bundle.mjs: ${pkg.name} ships no licence file; leave it out of INLINE`);
    return `${pkg.name} ${pkg.version} (${pkg.license})\n\n${readFileSync(join(dir, file), 'utf8').trim()}\n`;
  });
writeFileSync(
  join(out, 'THIRD-PARTY-LICENSES.txt'),
  `The files in this folder include code of the following packages, under their own licences.\n\n${notices.join(`\n${'-'.repeat(78)}\n\n`)}`,
);
// bin/warrant.js takes the bundle only when it is not older than dist/cli.js (tsc rewrites every file it emits), so a
// later tsc run without this script is never shadowed by an old bundle.
const now = new Date();
utimesSync(join(out, 'cli.js'), now, now);
