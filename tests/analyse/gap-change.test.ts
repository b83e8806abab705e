/**
 * A change claim with focus and against: the gap between two selections in two periods (src/analyse/gap-change.ts),
 * through the claims reader, the analysis, the verdict and the words.
 *
 * Reference values: tests/fixtures/r/gap-change.json, written by tests/fixtures/r/gap-change.R (GNU R 4.2.2, the
 * difference of differences, its interval and the gap-size test by formulas written out).
 */
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyse } from '../../src/analyse/index.js';
import type { GapChangeAnalysis } from '../../src/analyse/types.js';
import type { GapChangeClaim } from '../../src/claims/types.js';
import type { Cell, Cube } from '../../src/data/types.js';
import { composeClaim } from '../../src/verdicts/compose.js';
import { decide } from '../../src/verdicts/decide.js';
import { notSupportedAs } from '../../src/verdicts/advice.js';
import { Templates } from '../../src/verdicts/templates.js';
import { parseClaimsText } from '../../src/claims/read.js';
import { expectClose } from '../helpers/tolerance.js';

const R = JSON.parse(readFileSync(resolve(__dirname, '../fixtures/r/gap-change.json'), 'utf8')) as {
  cases: Array<{ earlier: number[]; later: number[]; level: number; d: number; lower: number; upper: number; p_two: number; p_less: number; p_greater: number; p_narrowed: number; p_widened: number }>;
};
const ref = (earlier: number[]) => {
  const row = R.cases.find((c) => c.earlier.join() === earlier.join() && c.level === 0.95);
  if (!row) throw new Error(`no R case for ${earlier.join()}`);
  return row;
};

/** Rows: Year, Faculty, Mode, n, agree. */
function cube(rows: Array<[string, string, string, number, number]>): Cube {
  const cells: Cell[] = rows.map(([Year, Faculty, Mode, n, agree], i) => ({ dims: { Year, Faculty, Mode }, n, agree, approximate: false, firstRow: i + 2 }));
  const values = (k: 0 | 1 | 2) => [...new Set(rows.map((r) => r[k]))];
  return {
    sourceId: 'results', file: 'results.csv', sha256: '0', rows: rows.length, dimensions: ['Year', 'Faculty', 'Mode'], cells,
    values: { Year: values(0), Faculty: values(1), Mode: values(2) }, approximate: false, hasPopulation: false,
  };
}
// Invented faculties of an invented college. Arts: R case 1 (the part-time gap narrowed from -22 to -9.2 points);
// Music: R case 2 (no clear change); Law: a gap that crossed sides (+5 to -10: the change is large, but the gap's size
// grew); Dance: a part-time group of 8 in 2026.
const data = cube([
  ['2024', 'Arts', 'Part-time', 400, 120], ['2024', 'Arts', 'Full-time', 500, 260],
  ['2026', 'Arts', 'Part-time', 420, 180], ['2026', 'Arts', 'Full-time', 480, 250],
  ['2024', 'Music', 'Part-time', 100, 40], ['2024', 'Music', 'Full-time', 100, 60],
  ['2026', 'Music', 'Part-time', 100, 55], ['2026', 'Music', 'Full-time', 100, 62],
  ['2024', 'Law', 'Part-time', 1000, 550], ['2024', 'Law', 'Full-time', 1000, 500],
  ['2026', 'Law', 'Part-time', 1000, 400], ['2026', 'Law', 'Full-time', 1000, 500],
  ['2024', 'Dance', 'Part-time', 100, 50], ['2024', 'Dance', 'Full-time', 100, 60],
  ['2026', 'Dance', 'Part-time', 8, 4], ['2026', 'Dance', 'Full-time', 100, 60],
  ['2024', 'Drama', 'Part-time', 30, 2], ['2024', 'Drama', 'Full-time', 100, 60],
  ['2026', 'Drama', 'Part-time', 30, 12], ['2026', 'Drama', 'Full-time', 100, 62],
  ['2024', 'Drama', 'Evening', 20, 5], ['2026', 'Drama', 'Evening', 20, 8],
]);

function claim(faculty: string, expect: GapChangeClaim['expect'], over: Partial<GapChangeClaim> = {}): GapChangeClaim {
  return {
    kind: 'gap-change', id: `gap-${faculty.toLowerCase()}`, statement: `The gap in ${faculty} changed.`, source: 'results',
    where: { Faculty: faculty }, from: '2024', to: 'latest', focus: { Mode: 'Part-time' }, against: { Mode: 'Full-time' }, expect,
    confidence: 0.95, confidenceWritten: '95%', sided: 'two-sided', minRespondents: 10, place: { line: 3, column: 5 }, ...over,
  };
}
const ctx = { minRespondents: 10, claimsFile: 'claims.yaml', periodColumns: { results: 'Year' } };
const words = { templates: new Templates(), claimsTested: 1, adjustName: 'no adjustment (one claim)', adjusted: false, minRespondents: 10, periodColumns: ['Year'] };

function run(c: GapChangeClaim) {
  const a = analyse(c, data, ctx) as GapChangeAnalysis;
  const d = decide(a, a.test?.p);
  return { a, d, words: composeClaim(a, d, words) };
}

describe('a gap between two groups in two periods, against R 4.2.2', () => {
  it('narrowed: supported, with the change in the gap, its interval and the gap-size p-value of R', () => {
    const r = ref([120, 400, 260, 500]);
    const { a, d, words: w } = run(claim('Arts', 'narrowed'));
    expect(a.kind).toBe('gap-change');
    expect(a.periods).toEqual({ from: '2024', to: '2026' });
    expectClose(a.difference!.value, r.d, 'closed', 'D');
    expectClose(a.difference!.interval.lower, r.lower, 'bound', 'lower');
    expectClose(a.difference!.interval.upper, r.upper, 'bound', 'upper');
    expectClose(a.test!.p, r.p_narrowed, 'p', 'narrowed p');
    expectClose(a.pOpposite!, r.p_widened, 'p', 'widened p');
    expectClose(a.sizeChange!, Math.abs(180 / 420 - 250 / 480) - Math.abs(120 / 400 - 260 / 500), 'closed', 'size change');
    expect(a.test!.method).toBe('gap-size-iut');
    expect(d.verdict).toBe('supported');
    expect(w.section.verdictText).toContain('so its size narrowed');
    expect(w.section.hypotheses.null).toContain('did not narrow from 2024 to 2026');
    expect(w.section.numbers.map((n) => n.label)).toEqual(expect.arrayContaining(['Part-time, 2024', 'Full-time, 2026', 'Gap in 2024', 'Gap in 2026', 'Change in the gap', 'Change in the gap’s size']));
    // The cohorts caution: each period is answered by different people.
    expect(w.section.cautions.join(' ')).toContain('treated as separate samples');
  });

  it('widened on the same data points the other way', () => {
    const { a, d, words: w } = run(claim('Arts', 'widened'));
    expect(d.verdict).toBe('opposite');
    expect(w.section.verdictText).toContain('expected that the gap widened from 2024 to 2026, but it narrowed');
    expect(a.expectSign).toBe(1);
    expect(a.observedSign).toBe(-1);
  });

  it('higher and lower are focus minus against, one-sided when asked (R p-values)', () => {
    const r = ref([120, 400, 260, 500]);
    expectClose(run(claim('Arts', 'higher', { sided: 'one-sided' })).a.test!.p, r.p_greater, 'p', 'greater');
    expectClose(run(claim('Arts', 'lower', { sided: 'one-sided' })).a.test!.p, r.p_less, 'p', 'less');
    expect(run(claim('Arts', 'lower', { sided: 'one-sided' })).d.verdict).toBe('opposite');
    expectClose(run(claim('Arts', 'different')).a.test!.p, r.p_two, 'p', 'two-sided');
    expect(run(claim('Arts', 'different')).a.test!.method).toBe('difference-of-differences-z');
  });

  it('no clear change: not supported, with the detectable change and the R figures', () => {
    const r = ref([40, 100, 60, 100]);
    const { a, d, words: w } = run(claim('Music', 'narrowed'));
    expectClose(a.test!.p, r.p_narrowed, 'p', 'narrowed');
    expect(d.verdict).toBe('not-supported');
    // (qnorm(0.975) + qnorm(0.8)) x se in R 4.2.2, se from the four observed rates.
    const se = Math.sqrt([0.4, 0.6, 0.55, 0.62].reduce((s, p) => s + (p * (1 - p)) / 100, 0));
    expectClose(a.detectable!, (1.959963984540054 + 0.8416212335729143) * se, 1e-12, 'detectable');
    expect(w.section.verdictText).toContain('a change in the gap of about');
  });

  it('narrowed and widened are about the gap’s size: a gap that crossed sides and grew did not narrow', () => {
    // Law: +5 points in 2024, -10 in 2026. The gap fell by 15 points (clearly, as focus minus against), yet its
    // size grew from 5 to 10, so a claim that it narrowed must not be supported.
    const lower = run(claim('Law', 'lower'));
    expect(lower.d.verdict).toBe('supported');
    const narrowed = run(claim('Law', 'narrowed'));
    expect(narrowed.d.verdict).not.toBe('supported');
    expect(narrowed.a.sizeChange).toBeCloseTo(0.05, 12);
    expect(narrowed.a.test!.p).toBeGreaterThan(0.05);
  });

  it('a gap followed backwards (from the later period to the earlier) is refused with the swap', () => {
    expect(() => run(claim('Arts', 'narrowed', { from: 'latest', to: '2024' }))).toThrow(/runs from 2026 to 2024, but 2026 comes after 2024[\s\S]*swap them: from: 2024, to: latest/);
  });

  it('a gap compared with itself (from and to one period once resolved) is refused', () => {
    expect(() => run(claim('Arts', 'narrowed', { from: 'latest', to: '2026' }))).toThrow(/compares the gap in period 2026 with itself/);
  });

  it('a group under the minimum withholds the claim', () => {
    const { a, d, words: w } = run(claim('Dance', 'narrowed'));
    expect(a.status).toBe('too-little-data');
    expect(a.shortfall).toContain('fewer than 10 people answered in Part-time, 2026');
    expect(d.verdict).toBe('too-little-data');
    expect(w.section.numbers).toEqual([{ label: 'Result', value: 'Withheld: too few respondents' }]);
  });

  it('a group with fewer than 5 agreeing carries the caution that the z test is approximate', () => {
    const { words: w } = run(claim('Drama', 'narrowed'));
    expect(w.section.cautions.join(' ')).toContain('fewer than 5 agreeing or 5 not agreeing');
    expect(run(claim('Arts', 'narrowed')).words.section.cautions.join(' ')).not.toContain('fewer than 5 agreeing');
  });

  it('pooled selections: a list of values is one group in each period', () => {
    const { a } = run(claim('Drama', 'different', { focus: { Mode: ['Part-time', 'Evening'] } }));
    expect([a.earlier!.focus.agree, a.earlier!.focus.n, a.later!.focus.agree, a.later!.focus.n]).toEqual([7, 50, 20, 50]);
  });

  it('against: rest takes everyone else under where in each period', () => {
    const { a } = run(claim('Arts', 'narrowed', { against: {}, againstRest: true }));
    // In Arts everyone else is the full-time group, so the figures are case 1's.
    expectClose(a.difference!.value, ref([120, 400, 260, 500]).d, 'closed', 'D');
    expect(a.earlier!.against.label).toBe('everyone else, 2024');
  });

  it('a not-supported narrowed claim is ruled out or inconclusive on the change towards zero', () => {
    const { a, d } = run(claim('Music', 'narrowed'));
    // The earlier gap is negative (-20 points), so narrowing is a rise of the gap: the interval reaches far above 5.
    expect(notSupportedAs(a, d, { value: 0.05, basis: 'default' })).toBe('inconclusive');
  });
});

describe('the claims file: a change claim with focus and against', () => {
  const head = `title: T\norganisation: O\nsources:\n  results:\n    file: data/kinds-summary.csv\n    shape: summary\n    respondents: Respondents\n    agree: Agreeing\n    period: year\nclaims:\n`;
  const read = (claim: string) => parseClaimsText(head + claim + '\n', { absPath: resolve(__dirname, '../fixtures/claims/inline.yaml'), file: 'claims.yaml', sha256: '' });
  it('reads as a gap-change claim with both selections and its direction', () => {
    const c = read('  - { id: a, claim: c, kind: change, where: { question: Q01 }, from: previous, focus: { provider: A }, against: rest, expect: narrowed }').claims[0] as GapChangeClaim;
    expect(c.kind).toBe('gap-change');
    expect(c).toMatchObject({ from: 'previous', to: 'latest', focus: { provider: 'A' }, against: {}, againstRest: true, expect: 'narrowed' });
  });
  it('a change claim without focus stays a change of one selection', () => {
    expect(read('  - { id: a, claim: c, kind: change, where: { question: Q01 }, from: previous, expect: lower }').claims[0]!.kind).toBe('change');
  });
});
