// A pack of many claims: time and peak memory of `warrant build` as the number of claims grows, over the same data
// (bench/job.mjs: 100,000 respondent rows by default), so that growth with claims can be seen and kept near linear.
// Each size runs in its own process, with the chart thread as `warrant build` starts it; that process reports the
// time and resident memory at each stage of the build (the stages the build announces) and its peak (maxRSS).
//   node bench/many-claims.mjs [claims...]        (default 500 1000 2000 3000; BENCH_ROWS, default 100000)
// A size's line: claims, seconds, peak MB, seconds per 1,000 claims, then each stage's start time and memory.
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { generateJob, writeJobClaims } from './job.mjs';

const here = dirname(fileURLToPath(import.meta.url));
const root = join(here, '..');

if (process.argv[2] === '--one') {
  // The child: one build, reporting each stage.
  const [claims, out] = process.argv.slice(3);
  const { setFlagsFromString } = await import('node:v8');
  setFlagsFromString('--heap-growing-percent=40'); // as src/cli.ts sets it
  (await import(join(root, 'dist/render/chart-thread.js'))).startChartThread();
  const { build } = await import(join(root, 'dist/pipeline.js'));
  const t0 = performance.now();
  const stages = [];
  const mark = (what) => {
    const m = process.memoryUsage();
    stages.push({ what, s: (performance.now() - t0) / 1000, mb: m.rss / 2 ** 20, heapMB: m.heapUsed / 2 ** 20, heapTotalMB: m.heapTotal / 2 ** 20, externalMB: m.external / 2 ** 20 });
  };
  // With BENCH_SAMPLE set, memory every second as well (where the peak comes).
  const sampler = process.env.BENCH_SAMPLE ? setInterval(() => mark('sample'), 1000) : undefined;
  await build({ claimsPath: claims, outDir: out, progress: mark });
  clearInterval(sampler);
  mark('done');
  const peakMB = process.resourceUsage().maxRSS / 1024;
  process.stdout.write(`${JSON.stringify({ seconds: (performance.now() - t0) / 1000, peakMB, stages })}\n`);
  process.exit(0);
}

if (!existsSync(join(root, 'dist/pipeline.js'))) {
  console.error('Build first: npm run build');
  process.exit(1);
}
const SIZES = process.argv.slice(2).map(Number).filter((n) => n > 0);
if (SIZES.length === 0) SIZES.push(500, 1000, 2000, 3000);
const ROWS = Number(process.env.BENCH_ROWS ?? 100_000);
const dir = join(here, 'tmp');
const dataName = `job-${ROWS}.csv`;
if (!existsSync(join(dir, dataName))) await generateJob(dir, ROWS, 1);
for (const n of SIZES) {
  const { yaml } = writeJobClaims(dir, dataName, n);
  const out = mkdtempSync(join(tmpdir(), 'warrant-many-'));
  const r = spawnSync(process.execPath, [fileURLToPath(import.meta.url), '--one', yaml, join(out, 'packs')], { encoding: 'utf8', maxBuffer: 1 << 24 });
  rmSync(out, { recursive: true, force: true });
  if (r.status !== 0) {
    console.error(`${n} claims: failed (${r.status})\n${r.stderr}`);
    process.exit(1);
  }
  const { seconds, peakMB, stages } = JSON.parse(r.stdout.trim().split('\n').pop());
  const said = stages.map((s) => `${s.what.replace(/ \(.*\)$/, '').replace(/^(\w+).*/, '$1')} ${s.s.toFixed(1)}s/${s.mb.toFixed(0)}MB`).join(', ');
  console.log(`${String(n).padStart(5)} claims: ${seconds.toFixed(1).padStart(6)} s, peak ${peakMB.toFixed(0).padStart(4)} MB, ${((seconds / n) * 1000).toFixed(1)} s per 1,000 claims | ${said}`);
}
