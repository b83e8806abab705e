#!/usr/bin/env node
// Turn a PDF into one PNG per page for looking at (not a test):
//   node scripts/render-pages.mjs out/demo/pack.pdf [dpi]  ->  out/demo/pages/page-N.png
// Uses pdftoppm from poppler-utils.
import { execFileSync } from 'node:child_process';
import { mkdirSync, readdirSync, renameSync, existsSync, rmSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';

const [pdfArg, dpiArg] = process.argv.slice(2);
if (!pdfArg) {
  console.error('Usage: node scripts/render-pages.mjs FILE.pdf [dpi]  (writes FILE-folder/pages/page-N.png)');
  process.exit(2);
}
const pdf = resolve(pdfArg);
if (!existsSync(pdf)) {
  console.error(`No such file: ${pdf}`);
  process.exit(2);
}
const dpi = Number(dpiArg ?? 70);
if (!(dpi > 0)) {
  console.error(`The resolution must be a positive number of dots per inch; found "${dpiArg}".`);
  process.exit(2);
}
const outDir = join(dirname(pdf), 'pages');
mkdirSync(outDir, { recursive: true });
for (const f of readdirSync(outDir)) if (/^page-\d+\.png$/.test(f)) rmSync(join(outDir, f));
try {
  execFileSync('pdftoppm', ['-r', String(dpi), '-png', pdf, join(outDir, 'raw')], { stdio: 'inherit' });
} catch (e) {
  console.error(`pdftoppm failed (${e.message}); install poppler-utils.`);
  process.exit(1);
}
// pdftoppm pads page numbers (raw-01.png); rename to page-N.png.
const pages = readdirSync(outDir)
  .filter((f) => /^raw-\d+\.png$/.test(f))
  .sort((a, b) => Number(a.match(/\d+/)[0]) - Number(b.match(/\d+/)[0]));
for (const f of pages) renameSync(join(outDir, f), join(outDir, `page-${Number(f.match(/\d+/)[0])}.png`));
console.log(`${pages.length} page(s) written to ${outDir}`);
