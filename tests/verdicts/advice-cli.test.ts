/**
 * Through the command line: the demo pack's verdict words, their definitions, the split of "not supported", the
 * advice for each claim and the links between claims on the same data, read back from results.json.
 *
 * The intervals the split is judged by are the pack's own (Newcombe, Fisher z), checked against R elsewhere
 * (tests/stats); here each expected detail is worked by hand from the printed interval and the worth-reporting size.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

const root = resolve(__dirname, '../..');
const bin = join(root, 'bin/warrant.js');
const work = mkdtempSync(join(tmpdir(), 'warrant-advice-'));

interface Claim {
  id: string;
  verdict: string;
  verdictLabel: string;
  verdictDetail: string | null;
  worthReporting: { value: number; basis: string } | null;
  interval: { lower: number; upper: number } | null;
  adjustedInterval: { lower: number; upper: number; level: number } | null;
  advice: { action: string; label: string; reason: string; wording?: string };
  linkedClaims: string[];
  responseRate: number | null;
  cautions: string[];
  verdictText: string;
  check: { method: string; estimate: number | null; p: number } | null;
  notableCells?: Array<{ row: string; column: string; residual: number }>;
}
let claims: Claim[];
let packText = '';
let folder = '';
const byId = (id: string) => claims.find((c) => c.id === id) as Claim;

beforeAll(() => {
  const run = spawnSync(process.execPath, [bin, 'build', join(root, 'demo/claims.yaml'), '--out', join(work, 'out'), '--json'], { encoding: 'utf8', cwd: root });
  expect(run.status).toBe(0);
  const summary = JSON.parse(run.stdout) as { folder: string };
  folder = summary.folder;
  claims = JSON.parse(readFileSync(join(summary.folder, 'results.json'), 'utf8')).claims;
  const text = spawnSync('pdftotext', [join(summary.folder, 'pack.pdf'), '-'], { encoding: 'utf8' });
  expect(text.status).toBe(0);
  packText = text.stdout.replace(/\s+/g, ' ');
}, 120_000);

afterAll(() => rmSync(work, { recursive: true, force: true }));

describe('verdict words and what to do with each claim', () => {
  it('defines every verdict word the pack can print', () => {
    const defs = readFileSync(join(root, 'templates/verdict-definitions.mustache'), 'utf8')
      .trim()
      .split('\n')
      .map((l) => l.split('|')[0]!.trim());
    const words = ['supported', 'opposite', 'not-supported', 'too-little-data', 'estimate'].map((v) => readFileSync(join(root, `templates/verdict.${v}.mustache`), 'utf8').trim());
    const details = ['inconclusive', 'ruled-out', 'too-small'].map((d) => readFileSync(join(root, `templates/verdict.not-supported.${d}.mustache`), 'utf8').trim());
    expect(defs.sort()).toEqual([...words, ...details].sort());
    for (const c of claims) expect(defs).toContain(c.verdictLabel);
  });

  it('splits "not supported": the campuses gap is ruled out by the 6-point margin of the linked claim, ceramics is inconclusive', () => {
    const campuses = byId('campuses-reach-staff-differently');
    // The interval at the level that decided the verdict (a Holm step threshold such as 0.05/7: 99.3%), about −6 to +5 points, lies
    // inside ±6 points (the margin of campuses-equally-reachable): ruled out.
    expect(campuses.verdictDetail).toBe('ruled-out');
    expect(campuses.worthReporting).toEqual({ value: 0.06, basis: 'linked-margin' });
    expect(campuses.adjustedInterval!.lower).toBeGreaterThan(-0.06);
    expect(campuses.adjustedInterval!.upper).toBeLessThan(0.06);
    expect(campuses.verdictLabel).toBe('Not supported: ruled out');
    expect(campuses.advice.action).toBe('reword');
    // The wording quotes that same interval (read from results.json, not fixed here: the Holm step depends on the demo).
    const ai = campuses.adjustedInterval!;
    const pts = (x: number) => `${x < 0 ? '−' : '+'}${Math.abs(x * 100).toFixed(1)}`;
    const widest = Math.max(-ai.lower, ai.upper);
    const level = `${(ai.level * 100).toFixed(1)}%`;
    expect(campuses.advice.wording).toContain(
      `differ by less than ${(widest * 100).toFixed(1)} points (${level} interval for the difference ${pts(ai.lower)} to ${pts(ai.upper)} points)`,
    );
    expect(campuses.linkedClaims).toEqual(['campuses-equally-reachable']);
    expect(byId('campuses-equally-reachable').linkedClaims).toEqual(['campuses-reach-staff-differently']);

    const ceramics = byId('ceramics-clearer-than-music');
    // Its 99.2% interval (−14.6 to +26.4 points) holds 0 and the default 5 points worth reporting in the claimed direction.
    expect(ceramics.verdictDetail).toBe('inconclusive');
    expect(ceramics.worthReporting).toEqual({ value: 0.05, basis: 'default' });
    expect(ceramics.adjustedInterval!.lower).toBeLessThan(0);
    expect(ceramics.adjustedInterval!.upper).toBeGreaterThan(ceramics.worthReporting!.value);
    expect(ceramics.advice.action).toBe('drop');
  });

  it('advises quoting supported claims, dropping untestable ones and never making claims that point the other way', () => {
    for (const c of claims) {
      const expected = { supported: 'quote', opposite: 'must-not-make', 'too-little-data': 'drop', estimate: 'quote-with-interval' }[c.verdict as 'supported'];
      if (expected) expect(c.advice.action, c.id).toBe(expected);
      if (c.verdict !== 'not-supported') expect(c.verdictDetail, c.id).toBeNull();
    }
    expect(byId('library-fell').advice.reason).toContain('The data point the other way: 68% in 2025 to 77% in 2026');
  });

  it('says an inconclusive correlation across departments needs more departments, and an inconclusive comparison more respondents', () => {
    // Fisher's z interval for r has standard error 1 / sqrt(units - 3) (Fisher 1921): more respondents in the same
    // 12 departments leave it as wide as it is.
    const across = byId('challenge-goes-with-arrangements');
    expect(across.verdictDetail).toBe('inconclusive');
    expect(across.advice.reason).toContain('More departments would be needed to settle it: more respondents in the same departments would not narrow the interval for the correlation');
    expect(across.advice.reason).not.toContain('More respondents would be needed');
    const ceramics = byId('ceramics-clearer-than-music');
    expect(ceramics.verdictDetail).toBe('inconclusive');
    expect(ceramics.advice.reason).toMatch(/More respondents would be needed to settle it\.$/);
  });

  it('gives each claim its response rate, or null where the data hold no number eligible', () => {
    // lanternfield holds Eligible: Quarrendell's 2,025 respondents of 3,269 eligible on Q08 (its Ceramics and Glass row,
    // withheld in the 2026 release, counts on neither side), as the estimate page prints.
    expect(byId('overall-contentment-estimate').responseRate).toBeCloseTo(2025 / 3269, 12);
    // pulse (the union's own survey) has no eligible column.
    expect(byId('library-fell').responseRate).toBeNull();
  });
});

describe('cautions follow the result', () => {
  it('says "tend to have" only where an association was shown', () => {
    const shown = byId('resources-go-with-contentment');
    const none = byId('challenge-goes-with-arrangements');
    expect(shown.verdict).toBe('supported');
    expect(shown.cautions.join(' ')).toMatch(/tend to have a higher overall contentment/);
    expect(none.verdict).toBe('not-supported');
    expect(none.cautions.join(' ')).not.toMatch(/tend to have/);
    expect(none.cautions.join(' ')).toMatch(/No association was shown/);
    // Same respondents answer both questions: the caution names the inflation of a unit-level correlation.
    for (const c of [shown, none]) expect(c.cautions.join(' ')).toMatch(/same respondents in each department/);
  });

  it('says cohorts may overlap and that treating years as independent is conservative, not that different people answered', () => {
    const change = byId('wellbeing-up-this-year');
    const text = change.cautions.join(' ');
    expect(text).toMatch(/may have answered both surveys, and respondents cannot be linked/);
    expect(text).toMatch(/makes the test conservative/);
    expect(text).not.toMatch(/Different people answered/);
  });

  it('gives the estimate page its non-response caution: 38% of those eligible did not answer (2,025 of 3,269)', () => {
    const est = byId('overall-contentment-estimate');
    // 1 - 2025/3269 = 0.3805, printed as a whole percentage.
    expect(est.cautions.join(' ')).toContain('38% of those eligible did not answer (2,025 of 3,269 answered)');
  });

  it('names crosstab cells beyond ±1.96, or says none passed', () => {
    const table = byId('arrangements-by-campus');
    expect(table.notableCells).toEqual([]);
    expect(table.verdictText).toContain("No cell's adjusted residual lies beyond ±1.96.");
    expect(table.verdictText).toMatch(/would detect a relation of Cramér's V = 0\.08 or stronger 80% of the time/);
  });

  it('quotes an interval in the advice exactly as the claim\'s numbers table prints it (same signs, same decimals)', () => {
    let quoted = 0;
    for (const c of claims) {
      for (const m of c.advice.reason.matchAll(/interval \(([^()]+?) to ([^()]+?)(?: points| scale points)?\)/g)) {
        const ends = `${m[1]} to ${m[2]}`;
        // Once in the advice, at least once more in the numbers table or the verdict paragraph.
        expect(packText.split(ends).length - 1, `${c.id}: "${ends}"`).toBeGreaterThanOrEqual(2);
        // A correlation is printed without a plus sign everywhere (common practice for r).
        if (c.check?.method !== undefined && /correlation/i.test(c.advice.reason)) expect(ends).not.toMatch(/\+/);
        quoted++;
      }
    }
    expect(quoted).toBeGreaterThanOrEqual(3);
  });

  it('names the answer codes of an answer-spread chart in the scale\'s wording (the source\'s answer_wording)', () => {
    const spec = JSON.parse(readFileSync(join(folder, 'charts/library-answers-shifted.vl.json'), 'utf8')) as { data: { values: Array<{ part: string }> } };
    const parts = [...new Set(spec.data.values.map((v) => v.part))];
    // demo/claims.yaml words the scale 1 Strongly disagree ... 5 Strongly agree.
    expect(parts).toEqual(['1 Strongly disagree', '2 Disagree', '3 Neither agree nor disagree', '4 Agree', '5 Strongly agree']);
  });

  it('labels each rate on a chart at the precision its claim prints the rate (80.0% beside 79.5%, never 80% and 80%)', () => {
    let labelled = 0;
    for (const c of claims) {
      const file = join(folder, `charts/${c.id}.vl.json`);
      if (!existsSync(file)) continue; // a claim with too little data has no chart
      const spec = JSON.parse(readFileSync(file, 'utf8')) as { data?: { values?: Array<{ rateText?: string }> } };
      const texts = (spec.data?.values ?? []).flatMap((v) => (v.rateText?.endsWith('%') ? [v.rateText] : []));
      for (const t of texts) {
        // The same figure is printed in the claim's numbers table, e.g. "80.0% agreed of 60" or "60.3% of 2,052".
        expect(new RegExp(`${t.replace('.', '\\.')} (agreed )?of [0-9,]+`).test(packText), `${c.id}: chart label ${t}`).toBe(true);
        labelled++;
      }
    }
    expect(labelled).toBeGreaterThanOrEqual(8);
  });

  it('prints the fitted line\'s ends so that their gap agrees with the change printed beside them', () => {
    const m = packText.match(/Fitted rate, \d{4} to \d{4} (\d+(?:\.\d+)?)% to (\d+(?:\.\d+)?)% \(([+−]\d+\.\d) points\)/);
    expect(m, 'the trend claim\'s fitted-rate row').not.toBeNull();
    const [, first, last, change] = m as RegExpMatchArray;
    const gap = Number(last) - Number(first);
    // The printed change is the exact change to one decimal; the printed ends must give the same to one decimal.
    expect((gap >= 0 ? '+' : '−') + Math.abs(gap).toFixed(1)).toBe(change);
  });

  it('says in the method notes that differences are worked from unrounded counts, so printed rates and gaps can disagree', () => {
    expect(packText).toContain('How the figures are rounded');
    expect(packText).toContain('Every difference, interval and test is worked out from the unrounded counts');
  });
});
