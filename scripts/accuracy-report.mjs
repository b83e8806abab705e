#!/usr/bin/env node
/**
 * Prints the accuracy report: the worst relative error per method family against every stored reference value
 * (tests/fixtures/r/*.json from GNU R 4.2, tests/fixtures/scipy/distributions.json from scipy 1.17 and mpmath 1.3),
 * and the lowest log relative error (LRE, digits correct) per NIST StRD group.
 *
 * The comparisons live in tests/stats/accuracy.test.ts, which also asserts each value against the tolerance policy;
 * this script runs that file with vitest, asks it to write its findings to a temporary JSON file, and prints them as
 * two Markdown tables. Deterministic: the same sources give the same output.
 *
 * Usage: npm run accuracy            (or: node scripts/accuracy-report.mjs [--json])
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '..');
const dir = mkdtempSync(join(tmpdir(), 'warrant-accuracy-'));
const out = join(dir, 'accuracy.json');
const vitest = join(root, 'node_modules', 'vitest', 'vitest.mjs');

const run = spawnSync(process.execPath, [vitest, 'run', 'tests/stats/accuracy.test.ts', '--reporter=dot'], {
  cwd: root,
  env: { ...process.env, WARRANT_ACCURACY_JSON: out },
  encoding: 'utf8',
});

let report;
try {
  report = JSON.parse(readFileSync(out, 'utf8'));
} catch {
  process.stderr.write(run.stdout + run.stderr);
  process.stderr.write('\nThe accuracy tests did not write a report (see the vitest output above).\n');
  rmSync(dir, { recursive: true, force: true });
  process.exit(1);
}
rmSync(dir, { recursive: true, force: true });

if (process.argv.includes('--json')) {
  process.stdout.write(JSON.stringify(report, null, 1) + '\n');
} else {
  const sci = (v) => (v === 0 ? '0' : v.toExponential(1));
  const lines = [];
  lines.push('Worst relative error per method family, against R 4.2, scipy 1.17 and mpmath 1.3', '');
  lines.push('| family | values | left out | worst relative error | share of tolerance | where |');
  lines.push('|---|---:|---:|---:|---:|---|');
  for (const f of report.families) {
    lines.push(`| ${f.family} | ${f.values} | ${f.excluded} | ${sci(f.worst)} | ${f.worstShareOfTolerance.toFixed(3)} | ${f.worstCase} |`);
  }
  lines.push('', 'Lowest log relative error (digits correct) per NIST StRD group', '');
  lines.push('| group | values | lowest LRE | required | where |');
  lines.push('|---|---:|---:|---:|---|');
  for (const g of report.nist) lines.push(`| ${g.group} | ${g.values} | ${g.lowestLre.toFixed(2)} | ${g.required} | ${g.where} |`);
  if (report.excludedReasons.length > 0) {
    lines.push('', 'Reference values left out of the figures above:');
    for (const r of report.excludedReasons) lines.push(`- ${r}`);
  }
  process.stdout.write(lines.join('\n') + '\n');
}
if (run.status !== 0) {
  process.stderr.write(run.stdout + run.stderr);
  process.stderr.write('\nSome accuracy checks failed: the figures above include values outside the tolerance policy.\n');
  process.exit(1);
}
