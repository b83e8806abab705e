// The benchmark (`npm run bench`, after `tsc`): generates its own inputs under bench/tmp/ and reports, as a table,
// rows/s, MB/s and peak memory for each reader next to a floor measured in the same run on the same machine:
// a plain readline line count of the CSV, and `unzip -p` of the sheet XML to /dev/null. Each figure is the best of
// RUNS runs, each in a fresh process. Also times `warrant build` of a pack of CLAIMS generated claims of every kind
// (bench/claims.mjs) over a generated respondent table of PACK_ROWS rows, a chart per claim, and `warrant --help`.
//   node bench/run.mjs [rows]        (default 1000000; BENCH_RUNS, BENCH_CLAIMS, BENCH_PACK_ROWS in the environment)
import { execFileSync, spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync, statSync } from 'node:fs';
import { cpus, tmpdir, totalmem } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { performance } from 'node:perf_hooks';
import { generate, writeCsv } from './generate.mjs';
import { writeClaims } from './claims.mjs';

const here = dirname(fileURLToPath(import.meta.url));
const root = join(here, '..');
const ROWS = Number(process.argv[2] ?? 1_000_000);
const RUNS = Number(process.env.BENCH_RUNS ?? 2);
const CLAIMS = Number(process.env.BENCH_CLAIMS ?? 200);
const PACK_ROWS = Number(process.env.BENCH_PACK_ROWS ?? 100_000);

if (!existsSync(join(root, 'dist/data/cube.js'))) {
  console.error('Build first: npm run build');
  process.exit(1);
}
// The command runs dist/bundle/ (warrant's modules joined, scripts/bundle.mjs) when it is up to date with dist/, as an
// installed warrant does: made here, so that a bare tsc build is timed as it would ship.
if (spawnSync(process.execPath, [join(root, 'scripts/bundle.mjs')], { stdio: 'inherit' }).status !== 0) process.exit(1);

const dir = join(here, 'tmp');
const csv = join(dir, `respondents-${ROWS}.csv`);
const xlsx = join(dir, `respondents-${ROWS}.xlsx`);
if (!existsSync(csv) || !existsSync(xlsx)) {
  process.stderr.write(`generating ${ROWS} rows under bench/tmp ...\n`);
  await generate(dir, ROWS);
}

function child(args) {
  const r = spawnSync(process.execPath, [join(here, 'measure.mjs'), ...args], { encoding: 'utf8', maxBuffer: 1 << 20 });
  if (r.status !== 0) throw new Error(`measure ${args.join(' ')} failed:\n${r.stderr}`);
  return JSON.parse(r.stdout.trim().split('\n').pop());
}
function best(f) {
  let b;
  for (let i = 0; i < RUNS; i++) {
    const m = f();
    if (b === undefined || m.seconds < b.seconds) b = { ...m, maxRssMB: Math.max(m.maxRssMB, b?.maxRssMB ?? 0) };
  }
  return b;
}
function unzipFloor() {
  const t0 = performance.now();
  execFileSync('sh', ['-c', `unzip -p "${xlsx}" xl/worksheets/sheet1.xml > /dev/null`]);
  return { seconds: (performance.now() - t0) / 1000, rows: ROWS, maxRssMB: NaN };
}
const sheetBytes = Number(/\s(\d+)\s+\S+\s+\S+\s+xl\/worksheets\/sheet1\.xml/.exec(execFileSync('unzip', ['-l', xlsx], { encoding: 'utf8' }))?.[1] ?? NaN);

const csvMB = statSync(csv).size / 1e6;
const xlsxMB = statSync(xlsx).size / 1e6;
const xmlMB = sheetBytes / 1e6;

/** Best of RUNS runs of a floor and of a reader, run in turn so that both meet the same load on the machine. */
function bestPair(floor, reader) {
  let a;
  let b;
  for (let i = 0; i < RUNS; i++) {
    const fa = floor();
    const fb = reader();
    if (a === undefined || fa.seconds < a.seconds) a = { ...fa, maxRssMB: Math.max(fa.maxRssMB, a?.maxRssMB ?? 0) };
    if (b === undefined || fb.seconds < b.seconds) b = { ...fb, maxRssMB: Math.max(fb.maxRssMB, b?.maxRssMB ?? 0) };
  }
  return [a, b];
}
const [lines, csvRead] = bestPair(() => child(['lines', csv]), () => child(['read', csv]));
const [unzip, xlsxRead] = bestPair(unzipFloor, () => child(['read', xlsx]));

// The pack: a fresh history folder each run, so that no earlier pack is reused.
const packCsv = join(dir, `pack-${PACK_ROWS}.csv`);
if (!existsSync(packCsv)) await writeCsv(packCsv, PACK_ROWS);
const claimsFile = writeClaims(dir, packCsv, CLAIMS);
function buildPack() {
  const out = mkdtempSync(join(tmpdir(), 'warrant-bench-pack-'));
  try {
    const t0 = performance.now();
    const r = spawnSync(process.execPath, [join(root, 'bin/warrant.js'), 'build', claimsFile, '--out', out], { encoding: 'utf8', maxBuffer: 1 << 24 });
    const seconds = (performance.now() - t0) / 1000;
    if (r.status !== 0) throw new Error(`warrant build of the benchmark pack failed:\n${r.stderr}`);
    const charts = Number(execFileSync('sh', ['-c', `ls "${out}"/*/charts/*.svg | grep -vc /latest/`], { encoding: 'utf8' }).trim());
    return { seconds, rows: CLAIMS, charts, maxRssMB: NaN };
  } finally {
    rmSync(out, { recursive: true, force: true });
  }
}
const pack = best(buildPack);

const helpTimes = [];
for (let i = 0; i < 3; i++) {
  const t0 = performance.now();
  spawnSync(process.execPath, [join(root, 'bin/warrant.js'), '--help'], { encoding: 'utf8' });
  helpTimes.push((performance.now() - t0) / 1000);
}
const help = Math.min(...helpTimes);

const f = (x, d = 2) => (Number.isFinite(x) ? x.toFixed(d) : '-');
const k = (x) => (Number.isFinite(x) ? Math.round(x).toLocaleString('en-GB') : '-');
const table = [
  ['measure', 'seconds', 'rows/s', 'MB/s', 'peak MB', 'x floor', 'target'],
  ['CSV floor: readline line count', f(lines.seconds), k(ROWS / lines.seconds), f(csvMB / lines.seconds, 1), f(lines.maxRssMB, 0), '1.00', ''],
  ['CSV: readCube (respondents)', f(csvRead.seconds), k(ROWS / csvRead.seconds), f(csvMB / csvRead.seconds, 1), f(csvRead.maxRssMB, 0), f(csvRead.seconds / lines.seconds), '<= 2x, < 250 MB'],
  ['XLSX floor: unzip -p sheet XML', f(unzip.seconds), k(ROWS / unzip.seconds), f(xmlMB / unzip.seconds, 1), '-', '1.00', ''],
  ['XLSX: readCube (respondents)', f(xlsxRead.seconds), k(ROWS / xlsxRead.seconds), f(xmlMB / xlsxRead.seconds, 1), f(xlsxRead.maxRssMB, 0), f(xlsxRead.seconds / unzip.seconds), '<= 2x, < 250 MB'],
  [`pack: warrant build, ${CLAIMS} claims, ${pack.charts} charts`, f(pack.seconds), `${f(CLAIMS / pack.seconds, 1)} claims/s`, '', '', '', '< 6 s'],
  ['warrant --help', f(help, 3), '', '', '', '', '< 0.3 s'],
];
const widths = table[0].map((_, c) => Math.max(...table.map((r) => r[c].length)));
const line = (r) => `| ${r.map((v, c) => (c === 0 ? v.padEnd(widths[c]) : v.padStart(widths[c]))).join(' | ')} |`;
console.log(`warrant benchmark: ${ROWS.toLocaleString('en-GB')} rows x 12 columns; CSV ${f(csvMB, 0)} MB, XLSX ${f(xlsxMB, 0)} MB (sheet XML ${f(xmlMB, 0)} MB)`);
console.log(`machine: ${cpus().length} x ${cpus()[0]?.model ?? 'cpu'}, ${f(totalmem() / 2 ** 30, 1)} GiB, Node ${process.version}; best of ${RUNS} runs, each in its own process`);
console.log(line(table[0]));
console.log(`|${widths.map((w, c) => (c === 0 ? '-'.repeat(w + 2) : '-'.repeat(w + 1) + ':')).join('|')}|`);
for (const r of table.slice(1)) console.log(line(r));
if (csvRead.rows !== ROWS || xlsxRead.rows !== ROWS) {
  console.error(`row counts differ: CSV ${csvRead.rows}, XLSX ${xlsxRead.rows}, expected ${ROWS}`);
  process.exitCode = 1;
}
if (csvRead.cells !== xlsxRead.cells) {
  console.error(`cube sizes differ: CSV ${csvRead.cells} cells, XLSX ${xlsxRead.cells}`);
  process.exitCode = 1;
}
