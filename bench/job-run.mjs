// The whole job, warrant against a plain base-R script doing the same work (bench/job.R), run in turn in the same
// run on the same machine so that both meet the same load: for each size (default 1,000,000 and 100,000 respondent
// rows), 200 compare claims with a chart each (bench/job.mjs). Prints the median wall time of RUNS runs of each,
// peak memory (the largest maxRSS of the process over its runs, from GNU time), and warrant's ratio to R. Then checks
// that both found the same counts, p-values and Wilson intervals for every claim, so that the two did the same work.
//   node bench/job-run.mjs [rows...]     (BENCH_RUNS, default 3; BENCH_CLAIMS, default 200)
// Without Rscript on the PATH, only warrant is timed (with a message saying so).
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { cpus, loadavg, tmpdir, totalmem } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { performance } from 'node:perf_hooks';
import { generateJob } from './job.mjs';

const here = dirname(fileURLToPath(import.meta.url));
const root = join(here, '..');
const SIZES = process.argv.slice(2).map(Number).filter((n) => n > 0);
if (SIZES.length === 0) SIZES.push(1_000_000, 100_000);
const RUNS = Number(process.env.BENCH_RUNS ?? 3);
const CLAIMS = Number(process.env.BENCH_CLAIMS ?? 200);
const dir = join(here, 'tmp');

if (!existsSync(join(root, 'dist/cli.js'))) {
  console.error('Build first: npm run build');
  process.exit(1);
}
// The command runs dist/bundle/ (warrant's modules joined, scripts/bundle.mjs) when it is up to date with dist/, as an
// installed warrant does: made here, so that a bare tsc build is timed as it would ship.
if (spawnSync(process.execPath, [join(root, 'scripts/bundle.mjs')], { stdio: 'inherit' }).status !== 0) process.exit(1);
const has = (cmd, args) => spawnSync(cmd, args, { stdio: 'ignore' }).status === 0;
const haveR = has('Rscript', ['--version']);
const haveTime = existsSync('/usr/bin/time') && has('/usr/bin/time', ['-f', '%M', 'true']);
if (!haveR) console.log('Rscript not found: timing warrant alone (install R to compare with bench/job.R).');
if (!haveTime) console.log('GNU time (/usr/bin/time) not found: peak memory is not measured.');

/** Run a command; wall seconds and peak memory (maxRSS, MB) of the process. */
function timed(cmd, args) {
  const memFile = join(tmpdir(), `warrant-bench-mem-${process.pid}`);
  const [c, a] = haveTime ? ['/usr/bin/time', ['-f', '%M %U %S', '-o', memFile, cmd, ...args]] : [cmd, args];
  const t0 = performance.now();
  const r = spawnSync(c, a, { encoding: 'utf8', maxBuffer: 1 << 24 });
  const seconds = (performance.now() - t0) / 1000;
  if (r.status !== 0) throw new Error(`${cmd} ${args.join(' ')} failed (${r.status}):\n${r.stderr}`);
  let peakMB = NaN;
  let cpu = NaN;
  if (haveTime) {
    const [kb, user, sys] = readFileSync(memFile, 'utf8').trim().split('\n').pop().split(' ').map(Number);
    peakMB = kb / 1024;
    cpu = user + sys;
    rmSync(memFile, { force: true });
  }
  return { seconds, peakMB, cpu };
}

function runWarrant(job, measureFloor) {
  const out = mkdtempSync(join(tmpdir(), 'warrant-bench-job-'));
  try {
    const m = timed(process.execPath, [join(root, 'bin/warrant.js'), 'build', job.yaml, '--out', out]);
    const pack = readdirSync(out).find((f) => f !== 'latest');
    const charts = readdirSync(join(out, pack, 'charts')).filter((f) => f.endsWith('.svg')).length;
    const results = JSON.parse(readFileSync(join(out, pack, 'results.json'), 'utf8'));
    return { ...m, charts, results, ...(measureFloor ? { floor: vegaFloor(join(out, pack, 'charts')) } : {}) };
  } finally {
    rmSync(out, { recursive: true, force: true });
  }
}

function runR(job) {
  const out = mkdtempSync(join(tmpdir(), 'warrant-bench-r-'));
  try {
    const m = timed('Rscript', [join(here, 'job.R'), job.data, job.csv, out]);
    const pdf = readFileSync(join(out, 'charts.pdf'), 'latin1');
    const charts = (pdf.match(/\/Type\s*\/Page\b(?!s)/g) ?? []).length;
    return { ...m, charts, results: readFileSync(join(out, 'results.csv'), 'utf8') };
  } finally {
    rmSync(out, { recursive: true, force: true });
  }
}

/** Vega alone on the pack's charts (bench/vega-floor.mjs, a fresh process): seconds of wall and CPU. */
function vegaFloor(chartsDir) {
  const r = spawnSync(process.execPath, [join(here, 'vega-floor.mjs'), chartsDir], { encoding: 'utf8' });
  if (r.status !== 0) throw new Error(`bench/vega-floor.mjs failed (${r.status}):\n${r.stderr}`);
  const m = JSON.parse(r.stdout);
  return { wall: (m.load.wall + m.draw.wall) / 1000, cpu: (m.load.cpu + m.draw.cpu) / 1000, charts: m.charts };
}

const median = (xs) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

/** Differences between warrant's results.json and R's results.csv, as messages (none when they agree). */
function disagreements(results, csv) {
  const lines = csv.trim().split('\n');
  const head = lines[0].split(',').map((h) => h.replace(/"/g, ''));
  const byId = new Map(
    lines.slice(1).map((l) => {
      const v = l.split(',').map((x) => x.replace(/"/g, ''));
      return [v[0], Object.fromEntries(head.map((h, i) => [h, i <= 1 ? v[i] : Number(v[i])]))];
    }),
  );
  const close = (a, b) => Math.abs(a - b) <= 1e-9 * Math.max(Math.abs(a), Math.abs(b)) + 1e-300;
  const problems = [];
  if (byId.size !== results.claims.length) problems.push(`R has ${byId.size} claims, warrant ${results.claims.length}`);
  for (const c of results.claims) {
    const r = byId.get(c.id);
    if (!r) {
      problems.push(`${c.id}: not in R's results`);
      continue;
    }
    const [f, a] = c.selections ?? [];
    const method = { 'two-proportion-z': 'prop.test', 'fisher-exact-2x2': 'fisher' }[c.method] ?? c.method;
    if (method !== r.method) problems.push(`${c.id}: warrant used ${c.method}, R ${r.method}`);
    const pairs = [
      ['focus n', f?.n, r.focus_n],
      ['focus agreeing', f?.agree, r.focus_agree],
      ['against n', a?.n, r.against_n],
      ['against agreeing', a?.agree, r.against_agree],
    ];
    for (const [what, w, x] of pairs) if (w !== x) problems.push(`${c.id}: ${what} ${w} (warrant) vs ${x} (R)`);
    const near = [
      ['p-value', c.p, r.p],
      ['focus Wilson lower', f?.interval?.lower, r.focus_lower],
      ['focus Wilson upper', f?.interval?.upper, r.focus_upper],
      ['against Wilson lower', a?.interval?.lower, r.against_lower],
      ['against Wilson upper', a?.interval?.upper, r.against_upper],
    ];
    for (const [what, w, x] of near) if (!close(w, x)) problems.push(`${c.id}: ${what} ${w} (warrant) vs ${x} (R)`);
  }
  return problems;
}

const f = (x, d = 2) => (Number.isFinite(x) ? x.toFixed(d) : '-');
console.log(`machine: ${cpus().length} x ${cpus()[0]?.model ?? 'cpu'}, ${f(totalmem() / 2 ** 30, 1)} GiB, Node ${process.version}; load average at start ${loadavg().map((x) => x.toFixed(1)).join(' ')}`);
console.log(`whole job: ${CLAIMS} compare claims with a chart each; median of ${RUNS} runs, warrant and R in turn; peak memory = largest maxRSS`);
const rows = [['whole job', 'wall s', 'CPU s', 'peak MB', 'ratio to R', 'runs (s)']];
const floors = [];
let failed = false;
for (const size of SIZES) {
  const data = join(dir, `job-${size}.csv`);
  const job = existsSync(data)
    ? { data, yaml: join(dir, `job-claims-${size}-${CLAIMS}.yaml`), csv: join(dir, `job-claims-${size}-${CLAIMS}.csv`) }
    : undefined;
  const made = job && existsSync(job.yaml) && existsSync(job.csv) ? job : await generateJob(dir, size, CLAIMS);
  const w = [];
  const r = [];
  for (let i = 0; i < RUNS; i++) {
    // Alternate which goes first, so that neither always meets the other's leftovers (page cache, load).
    const order = i % 2 === 0 ? ['R', 'w'] : ['w', 'R'];
    for (const who of order) {
      // The floor is measured once per size, after warrant's second run, when the machine is as warm as for the others.
      if (who === 'w') w.push(runWarrant(made, w.length === 1 || RUNS === 1));
      else if (haveR) r.push(runR(made));
    }
  }
  const label = `${size.toLocaleString('en-GB')} rows`;
  const ws = median(w.map((x) => x.seconds));
  const wm = Math.max(...w.map((x) => x.peakMB));
  const rs = haveR ? median(r.map((x) => x.seconds)) : NaN;
  const rm = haveR ? Math.max(...r.map((x) => x.peakMB)) : NaN;
  const wc = median(w.map((x) => x.cpu));
  const rc = haveR ? median(r.map((x) => x.cpu)) : NaN;
  rows.push([`warrant build, ${label}`, f(ws), f(wc), f(wm, 0), f(ws / rs), w.map((x) => f(x.seconds, 1)).join(' ')]);
  if (haveR) rows.push([`base R script (bench/job.R), ${label}`, f(rs), f(rc), f(rm, 0), '1.00', r.map((x) => f(x.seconds, 1)).join(' ')]);
  const fl = w.find((x) => x.floor)?.floor;
  if (fl) {
    rows.push([`Vega alone, the pack's ${fl.charts} charts (bench/vega-floor.mjs)`, f(fl.wall), f(fl.cpu), '-', f(fl.wall / rs), '']);
    floors.push({ label, fl, rs });
  }
  for (const x of w) {
    if (x.charts !== CLAIMS) {
      console.error(`warrant drew ${x.charts} charts for ${CLAIMS} claims (${label})`);
      failed = true;
    }
  }
  if (haveR) {
    for (const x of r) {
      if (x.charts !== CLAIMS) {
        console.error(`R drew ${x.charts} chart pages for ${CLAIMS} claims (${label})`);
        failed = true;
      }
    }
    const problems = disagreements(w[0].results, r[0].results);
    if (problems.length > 0) {
      console.error(`warrant and R disagree (${label}), ${problems.length} differences:\n  ${problems.slice(0, 20).join('\n  ')}`);
      failed = true;
    } else {
      console.log(`${label}: warrant and R agree on every count, p-value and Wilson interval of the ${CLAIMS} claims (relative difference <= 1e-9)`);
    }
  }
}
const widths = rows[0].map((_, c) => Math.max(...rows.map((r) => r[c].length)));
const left = (c) => c === 0 || c === 5;
const line = (r) => `| ${r.map((v, c) => (left(c) ? v.padEnd(widths[c]) : v.padStart(widths[c]))).join(' | ')} |`;
console.log(line(rows[0]));
console.log(`|${widths.map((w, c) => (left(c) ? '-'.repeat(w + 2) : '-'.repeat(w + 1) + ':')).join('|')}|`);
for (const r of rows.slice(1)) console.log(line(r));
// The floor row: Vega's own cost for the same charts, with nothing else. Two cores can at best halve its CPU time.
for (const { label, fl, rs } of floors) {
  const best = fl.cpu / cpus().length;
  console.log(
    `${label}: Vega alone needs ${f(fl.cpu)} s of CPU for the charts; spread perfectly over ${cpus().length} cores that is ${f(best)} s, ` +
      `${best > rs ? 'more' : 'less'} than the R script's whole job (${f(rs)} s), before any data is read or page laid out.`,
  );
}
console.log(`load average at end ${loadavg().map((x) => x.toFixed(1)).join(' ')}`);
if (failed) process.exitCode = 1;
