/**
 * Every figure the pack prints in a claim's numbers table is in results.json. The demo pack is built through the
 * command line (`node bin/warrant.js build`), its pages are read back with poppler's `pdftotext -layout` (a tool
 * outside the project), each numbers table is parsed as labelled rows (tests/helpers/pdf-figures.ts), and every
 * number in a row's label or value is looked up in that claim's results.json entry at the precision it was printed
 * with: nothing printed that the JSON lacks.
 *
 * The same build checks the trend claim's fitted change per period and its interval (results.json and the numbers
 * table) against R 4.2.2 (tests/fixtures/r/trend-slope.R: prop.trend.test's weighted least-squares slope with its
 * standard error at known dispersion, summary(glm(...), dispersion = 1)).
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { checkFigures, figureIn, numbersTables, rowFigures, tableRows } from '../helpers/pdf-figures.js';
import { expectClose } from '../helpers/tolerance.js';

const root = resolve(__dirname, '../..');
const work = mkdtempSync(join(tmpdir(), 'warrant-figures-'));
let layout: string;
/** The PDF's text in reading order (no -layout), white space folded: for sentences that wrap inside a cell. */
let flat: string;
let results: { settings: Record<string, unknown>; claims: Array<Record<string, any> & { id: string }> };

beforeAll(() => {
  const run = spawnSync(process.execPath, [join(root, 'bin/warrant.js'), 'build', join(root, 'demo/claims.yaml'), '--out', join(work, 'out'), '--json'], { encoding: 'utf8', cwd: root });
  expect(run.stderr).toBe('');
  expect(run.status).toBe(0);
  const folder = (JSON.parse(run.stdout) as { folder: string }).folder;
  results = JSON.parse(readFileSync(join(folder, 'results.json'), 'utf8'));
  layout = execFileSync('pdftotext', ['-enc', 'UTF-8', '-layout', join(folder, 'pack.pdf'), '-'], { encoding: 'utf8' });
  flat = execFileSync('pdftotext', ['-enc', 'UTF-8', join(folder, 'pack.pdf'), '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ');
}, 180_000);

afterAll(() => rmSync(work, { recursive: true, force: true }));

describe('every figure in a numbers table is in results.json', () => {
  it('finds a numbers table for every claim in the demo', () => {
    const tables = numbersTables(layout);
    expect([...tables.keys()].sort()).toEqual(results.claims.map((c) => c.id).sort());
  });

  it('finds each printed figure in the claim’s results.json entry at the printed precision', () => {
    const { rows, figures } = checkFigures(layout, results);
    const missing = figures.filter((f) => !f.found).map((f) => `${f.claim} | ${f.label} | ${f.text}`);
    expect(missing).toEqual([]);
    // Every claim's table has rows, and the demo prints a good number of figures (printed for the closing note).
    expect(rows.length).toBeGreaterThan(results.claims.length * 3);
    expect(figures.length).toBeGreaterThan(200);
    console.info(`figures checked against results.json: ${figures.length} in ${rows.length} rows of ${new Set(rows.map((r) => r.claim)).size} numbers tables`);
  });

  it('can fail: each field taken out of results.json leaves figures of the table unfound', () => {
    const before = checkFigures(layout, results).figures.filter((f) => !f.found).length;
    expect(before).toBe(0);
    // Each of these fields is the only place its figures live; without it the check must miss some. (Not
    // comparisonValue: the demo's 80% target is also the 80% power every detectable figure is computed at.)
    const fields = ['selections', 'means', 'statistic', 'df', 'detectable', 'adjustedInterval', 'cohensH', 'cohensD', 'check', 'margin', 'marginOfError', 'scale', 'fitted', 'departure', 'line', 'rankChecks', 'table', 'unitCounts'];
    for (const field of fields) {
      const cut = { ...results, claims: results.claims.map(({ [field]: _gone, ...rest }) => ({ ...rest, id: rest.id as string })) };
      const missing = checkFigures(layout, cut).figures.filter((f) => !f.found);
      expect(missing.length, `without ${field}`).toBeGreaterThan(0);
    }
    const noCount = { ...results, settings: { ...results.settings, claimsTested: undefined } };
    expect(checkFigures(layout, noCount).figures.filter((f) => !f.found && f.text === String(results.settings.claimsTested)).length).toBeGreaterThan(10);
  });
});

describe('the trend claim: fitted change per period with its interval', () => {
  const R = JSON.parse(readFileSync(join(root, 'tests/fixtures/r/trend-slope.json'), 'utf8')) as {
    cases: Array<{ name: string; x: number[]; n: number[]; level: number; slope: number; lower: number; upper: number }>;
  };
  const own = R.cases.find((c) => c.name === 'demo feedback-trend')!;
  const adjusted = R.cases.find((c) => c.name === 'demo feedback-trend adjusted')!;

  it('gives the slope and its interval in results.json as R computes them, unadjusted and at the adjusted level', () => {
    const c = results.claims.find((x) => x.id === 'feedback-trend')!;
    expect(c.selections.map((s: { agree: number; n: number }) => [s.agree, s.n])).toEqual(own.x.map((x, i) => [x, own.n[i]]));
    expectClose(c.slope, own.slope, 'closed', 'slope');
    expect(c.estimate.value).toBe(c.slope);
    expect(c.interval.method).toBe('trend-wald');
    expect(c.interval.level).toBe(own.level);
    expectClose(c.interval.lower, own.lower, 'bound', 'lower');
    expectClose(c.interval.upper, own.upper, 'bound', 'upper');
    // When the demo gains claims and its Holm step moves, set the new level in trend-slope.R and rerun it.
    expectClose(c.effectiveAlpha, 1 - adjusted.level, 'closed', 'the demo trend claim\'s Holm threshold, as in tests/fixtures/r/trend-slope.R');
    expectClose(c.adjustedInterval.lower, adjusted.lower, 1e-9, 'adjusted lower');
    expectClose(c.adjustedInterval.upper, adjusted.upper, 1e-9, 'adjusted upper');
  });

  it('prints them in the numbers table, the verdict and the summary, and names the method', () => {
    const row = tableRows('feedback-trend', numbersTables(layout).get('feedback-trend')!).find((r) => r.label === 'Fitted change per period')!;
    const pts = (v: number) => `${v < 0 ? '\u2212' : '+'}${Math.abs(v * 100).toFixed(1)}`;
    const level = `${(adjusted.level * 100).toFixed(1)}%`;
    expect(row.value).toBe(`${pts(own.slope)} points (95% interval ${pts(own.lower)} to ${pts(own.upper)}, unadjusted; ${level} interval ${pts(adjusted.lower)} to ${pts(adjusted.upper)}, adjusted for ${results.settings.claimsTested} claims)`);
    for (const sentence of [
      `changes by ${pts(own.slope)} points a period (95% interval ${pts(own.lower)} to ${pts(own.upper)})`,
      `fitted ${pts(own.slope)} points a period (${pts(own.lower)} to ${pts(own.upper)})`,
      'test-based (Wald) interval for the change per period',
    ]) {
      expect(flat.includes(sentence), sentence).toBe(true);
    }
  });
});

/**
 * The rates in a text, with their decimals, leaving out confidence levels and the like ("95% interval", "99.3%
 * confidence", "(90%)", "80% of the time") and names ("the university's 80% target" is how the claim names it).
 */
function rateDecimals(text: string): Array<{ text: string; decimals: number }> {
  const out: Array<{ text: string; decimals: number }> = [];
  const re = /(\d+(?:\.(\d+))?)%/g;
  let m: RegExpExecArray | null;
  while ((m = re.exec(text))) {
    const after = text.slice(m.index + m[0].length);
    const before = text.slice(0, m.index);
    if (/^\s*(interval|confidence|of the time|level|\)|target)/.test(after) || /\($/.test(before)) continue;
    out.push({ text: m[0], decimals: m[2]?.length ?? 0 });
  }
  return out;
}

function mixed(text: string): boolean {
  return new Set(rateDecimals(text).map((r) => r.decimals)).size > 1;
}

describe('one precision per sentence', () => {
  it('writes the rates of each verdict sentence at one number of decimals', () => {
    const sentences = results.claims.flatMap((c) => (c.verdictText as string).split(/(?<=\.) (?=[A-Z])/).map((s) => `${c.id}: ${s}`));
    expect(sentences.filter((s) => rateDecimals(s).length > 1).length).toBeGreaterThan(5);
    expect(sentences.filter(mixed)).toEqual([]);
    // The demo's regional comparison needs a decimal for one rate's interval, so both rates carry it.
    expect(flat).toMatch(/60\.3% of the 2,052 respondents in Quarrendell University agreed, against 72\.2%/);
  });

  it('writes the rates of each numbers-table row, and of the rows a claim compares, at one number of decimals', () => {
    const tables = numbersTables(layout);
    for (const [claim, lines] of tables) {
      const rows = tableRows(claim, lines);
      for (const row of rows) expect(mixed(row.value), `${claim} | ${row.label} | ${row.value}`).toBe(false);
      // Rows of rates ("60.3% agreed of 2,052 ...") are compared with one another.
      const rateRows = rows.filter((r) => /% agreed of/.test(r.value));
      expect(mixed(rateRows.map((r) => r.value).join(' ')), `${claim}: ${rateRows.map((r) => r.value).join(' / ')}`).toBe(false);
    }
  });

  it('writes the two figures of each summary comparison at one number of decimals, and never two different rates alike', () => {
    const pairs = [...flat.matchAll(/(\d+(?:\.\d+)?)% (?:vs|against|in \d{4} to) (\d+(?:\.\d+)?)%/g)];
    expect(pairs.length).toBeGreaterThan(10);
    const dec = (t: string) => t.split('.')[1]?.length ?? 0;
    expect(pairs.filter((p) => dec(p[1]!) !== dec(p[2]!)).map((p) => p[0])).toEqual([]);
    const means = [...flat.matchAll(/mean (\d+\.\d+) vs (\d+\.\d+)/g)];
    expect(means.length).toBeGreaterThan(0);
    expect(means.filter((p) => dec(p[1]!) !== dec(p[2]!)).map((p) => p[0])).toEqual([]);
    // Rates that differ are not written alike: "80.0% vs 79.5%", not "80% vs 80%".
    for (const c of results.claims.filter((x) => x.kind === 'compare' && x.selections.length === 2)) {
      const [a, b] = c.selections as Array<{ rate: number }>;
      if (a!.rate !== b!.rate) expect(flat, c.id).not.toMatch(new RegExp(`(\\d+(?:\\.\\d+)?)% vs \\1%, difference [+\u2212]`));
    }
  });
});

describe('the gap-change claim that the gap narrowed: both tests of the intersection–union test', () => {
  it('prints each of the two tests with its z and p-value, as results.json gives them, and the claim\'s p-value as the larger', () => {
    const c = results.claims.find((x) => x.id === 'part-time-gap-narrowed')!;
    const tests = c.gaps.sizeTests as Array<{ of: string; alternative: string; z: number; p: number }>;
    expect(tests.map((t) => t.of)).toEqual(['change', 'sum']);
    // The claim's statistic is the first test's z, and its p-value the larger of the two (Berger 1982).
    expect(c.statistic.value).toBe(tests[0]!.z);
    expect(c.p).toBe(Math.max(tests[0]!.p, tests[1]!.p));
    const rows = tableRows('part-time-gap-narrowed', numbersTables(layout).get('part-time-gap-narrowed')!);
    const z = (v: number) => `${v < 0 ? '\u2212' : ''}${Math.abs(v).toFixed(2)}`;
    const p = (v: number) => (v >= 0.001 ? v.toFixed(3) : '< 0.001');
    const first = rows.find((r) => r.label === 'First test: the gap moved back towards zero')!;
    const second = rows.find((r) => r.label === 'Second test: it did not cross to the other side by as much')!;
    expect(first.value).toContain(`z = ${z(tests[0]!.z)}, p = ${p(tests[0]!.p)}`);
    expect(second.value).toContain(`z = ${z(tests[1]!.z)}, p = ${p(tests[1]!.p)}`);
    expect(rows.some((r) => r.label === 'Test statistic')).toBe(false);
  });
});

describe('reading a numbers table as labelled rows', () => {
  // The same table laid out two ways: other column widths, a second pair on a line, wrapped labels and values.
  const wide = [
    ' Quarrendell University             60% agreed of 2,052 (interval 59% to 62%)',
    ' Difference                         −11.9 points (95% interval −13.4 to −10.4, unadjusted; 99.6% interval',
    '                                    −14.1 to −9.7, adjusted for 14 claims)',
    ' Test statistic                     z = −16.31                  p-value (two-sided)                 < 0.001',
    ' p-value adjusted for 14            < 0.001                     Confidence level                    95%',
    ' claims',
    ' Interval set against the           −3.7 to +2.7 points (unadjusted; 98.8% interval, adjusted for 14 claims:',
    ' margin (90%)                       −5.4 to +4.4)',
  ];
  const narrow = [
    '   Quarrendell           60% agreed of 2,052 (interval 59% to',
    '   University            62%)',
    '   Difference            −11.9 points (95% interval −13.4 to',
    '                         −10.4, unadjusted; 99.6% interval −14.1',
    '                         to −9.7, adjusted for 14 claims)',
    '   Test statistic        z = −16.31',
    '   p-value (two-sided)   < 0.001',
    '   p-value adjusted      < 0.001',
    '   for 14 claims',
    '   Confidence level      95%',
    '   Interval set          −3.7 to +2.7 points (unadjusted; 98.8%',
    '   against the margin    interval, adjusted for 14 claims: −5.4 to',
    '   (90%)                 +4.4)',
  ];
  const norm = (rows: Array<{ label: string; value: string }>) => rows.map((r) => ({ label: r.label, value: r.value })).sort((a, b) => a.label.localeCompare(b.label));

  it('finds the same labelled rows whatever the column widths', () => {
    const a = norm(tableRows('x', wide));
    const b = norm(tableRows('x', narrow));
    expect(a.map((r) => r.label)).toEqual(['Confidence level', 'Difference', 'Interval set against the margin (90%)', 'p-value (two-sided)', 'p-value adjusted for 14 claims', 'Quarrendell University', 'Test statistic']);
    expect(b).toEqual(a);
    expect(a.find((r) => r.label === 'Difference')!.value).toBe('−11.9 points (95% interval −13.4 to −10.4, unadjusted; 99.6% interval −14.1 to −9.7, adjusted for 14 claims)');
  });

  it('reads each figure with its precision and scale, and a name as a name', () => {
    const figs = rowFigures({ claim: 'x', label: 'Difference', value: '−11.9 points (95% interval −13.4 to −10.4, adjusted for 14 claims)' }, new Set());
    expect(figs.map((f) => [f.text, f.scales])).toEqual([
      ['−11.9', [100]],
      ['95%', [100]],
      ['−13.4', [100]],
      ['−10.4', [100]],
      ['14', [1]],
    ]);
    expect(rowFigures({ claim: 'x', label: '2025', value: '66% agreed of 1,939' }, new Set(['2025'])).map((f) => f.text)).toEqual(['66%', '1,939']);
  });

  it('matches at the printed precision only', () => {
    expect(figureIn('72.2%', [100], [0.7219445706497046])).toBe(true);
    expect(figureIn('72.3%', [100], [0.7219445706497046])).toBe(false);
    expect(figureIn('72%', [100], [0.7219445706497046])).toBe(true);
    expect(figureIn('−11.9', [100], [-0.11863073049375916])).toBe(true);
    expect(figureIn('+11.9', [100], [-0.11863073049375916])).toBe(false);
    expect(figureIn('11.9', [100], [-0.11863073049375916])).toBe(true);
    expect(figureIn('< 0.001', [1], [8.5e-60])).toBe(true);
    expect(figureIn('< 0.001', [1], [0.0012])).toBe(false);
    expect(figureIn('2,052', [1], [2052])).toBe(true);
    expect(figureIn('2,052', [1], [2051])).toBe(false);
  });
});
