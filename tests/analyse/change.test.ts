import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyse } from '../../src/analyse/index.js';
import type { ChangeAnalysis } from '../../src/analyse/types.js';
import type { ChangeClaim } from '../../src/claims/types.js';
import type { Cell, Cube } from '../../src/data/types.js';
import { InputError } from '../../src/errors.js';
import { composeClaim } from '../../src/verdicts/compose.js';
import { decide } from '../../src/verdicts/decide.js';
import { Templates } from '../../src/verdicts/templates.js';
import { expectClose } from '../helpers/tolerance.js';

// Reference values: tests/fixtures/r/kinds-a.json, written by tests/fixtures/r/kinds-a.R (GNU R 4.2: prop.test with
// correct = FALSE, fisher.test).
const R = JSON.parse(readFileSync(resolve(__dirname, '../fixtures/r/kinds-a.json'), 'utf8')) as {
  change: Array<{ x1: number; n1: number; x2: number; n2: number; alternative: string; fisher: boolean; statistic: number | null; p_value: number }>;
};
function ref(x1: number, x2: number, alternative: string) {
  const row = R.change.find((r) => r.x1 === x1 && r.x2 === x2 && r.alternative === alternative);
  if (!row) throw new Error(`no R row for ${x1}, ${x2}, ${alternative}`);
  return row;
}

function cube(rows: Array<[string, string, number, number]>): Cube {
  const cells: Cell[] = rows.map(([Year, Dept, n, agree], i) => ({ dims: { Year, Dept }, n, agree, approximate: false, firstRow: i + 2 }));
  return {
    sourceId: 'results', file: 'results.csv', sha256: '0', rows: rows.length, dimensions: ['Year', 'Dept'], cells,
    values: { Year: [...new Set(rows.map((r) => r[0]))], Dept: [...new Set(rows.map((r) => r[1]))] },
    approximate: false, hasPopulation: false,
  };
}

// Later period first in each R case: x1/n1 is the later period, x2/n2 the earlier one.
const data = cube([
  ['2025', 'A', 200, 150], ['2026', 'A', 200, 120], // fell 15 points
  ['2025', 'B', 200, 145], ['2026', 'B', 200, 140], // about the same
  ['2025', 'C', 200, 140], ['2026', 'C', 200, 170], // rose 15 points
  ['2025', 'D', 12, 7], ['2026', 'D', 12, 1], // small: Fisher's exact test
  ['2024', 'A', 100, 70],
]);

function claim(dept: string, expect: ChangeClaim['expect'], over: Partial<ChangeClaim> = {}): ChangeClaim {
  return {
    kind: 'change', id: `change-${dept}`, statement: `Agreement in ${dept} fell since last year.`, source: 'results',
    where: { Dept: dept }, from: 'previous', to: 'latest', expect, confidence: 0.95, confidenceWritten: '95%',
    sided: 'two-sided', minRespondents: 10, place: { line: 3, column: 5 }, ...over,
  };
}
const ctx = { minRespondents: 10, claimsFile: 'claims.yaml', periodColumns: { results: 'Year' } };
const templates = new Templates();
const words = { templates, claimsTested: 1, adjustName: 'no adjustment (one claim)', adjusted: false, minRespondents: 10, periodColumns: ['Year'] };

function run(c: ChangeClaim) {
  const a = analyse(c, data, ctx) as ChangeAnalysis;
  const d = decide(a, a.test?.p);
  return { a, d, words: composeClaim(a, d, words) };
}

describe('change claims: later period against the earlier one', () => {
  it('resolves previous and latest and finds a fall: supported (R prop.test, correct = FALSE)', () => {
    const { a, d, words: w } = run(claim('A', 'lower'));
    expect(a.periods).toEqual({ from: '2025', to: '2026' });
    const r = ref(120, 150, 'two-sided');
    expectClose(a.test?.p as number, r.p_value, 'p', 'p two-sided'); // R prop.test
    expectClose((a.test?.statistic?.value as number) ** 2, r.statistic as number, 'statistic', 'z squared = X-squared'); // R prop.test
    expect(a.difference?.value).toBeCloseTo(-0.15, 12);
    expect(d.verdict).toBe('supported');
    expect(w.section.verdictText).toMatch(/^Supported\. The agreement rate fell from 75% in 2025 .* to 60% in 2026/);
    expect(w.section.cautions.join(' ')).toMatch(/may have answered both surveys, and respondents cannot be linked/);
    expect(w.section.chart?.data.kind).toBe('rates');
    expect(w.section.chart?.alt).toMatch(/2025 75%.*2026 60%/);
  });

  it('one-sided: p in the claimed direction and the opposite one (R prop.test alternative less / greater)', () => {
    const { a, d } = run(claim('A', 'lower', { sided: 'one-sided' }));
    expect(a.test?.alternative).toBe('less');
    expectClose(a.test?.p as number, ref(120, 150, 'less').p_value, 'p', 'p less'); // R prop.test
    expectClose(a.pOpposite as number, ref(120, 150, 'greater').p_value, 'p', 'p greater'); // R prop.test
    expect(d.verdict).toBe('supported');
  });

  it('a small change is not supported and the words say what could be detected', () => {
    const { a, d, words: w } = run(claim('B', 'lower'));
    expectClose(a.test?.p as number, ref(140, 145, 'two-sided').p_value, 'p', 'p two-sided'); // R prop.test
    expect(d.verdict).toBe('not-supported');
    expect(a.detectable).toBeGreaterThan(0.1);
    expect(w.section.verdictText).toMatch(/^Not supported\..*a change of about \d+\.\d points or more would be detected 80% of the time/);
  });

  it('a rise when a fall was claimed points the other way, two-sided and one-sided (R prop.test)', () => {
    const two = run(claim('C', 'lower'));
    expectClose(two.a.test?.p as number, ref(170, 140, 'two-sided').p_value, 'p', 'p two-sided'); // R prop.test
    expect(two.d.verdict).toBe('opposite');
    expect(two.words.section.verdictText).toMatch(/^The data point the other way\..* but it rose/);
    const one = run(claim('C', 'lower', { sided: 'one-sided' }));
    expectClose(one.a.pOpposite as number, ref(170, 140, 'greater').p_value, 'p', 'p greater'); // R prop.test
    expect(one.d.verdict).toBe('opposite');
  });

  it("uses Fisher's exact test when an expected count is below 5 (R fisher.test)", () => {
    const { a, words: w } = run(claim('D', 'lower'));
    const r = ref(1, 7, 'two-sided');
    expect(r.fisher).toBe(true);
    expect(a.test?.method).toBe('fisher-exact-2x2');
    expectClose(a.test?.p as number, r.p_value, 'p', 'Fisher p'); // R fisher.test
    expect(w.section.cautions.join(' ')).toMatch(/Fisher's exact test/);
  });

  it('too little data when a period has fewer respondents than the minimum, with no counts shown', () => {
    const { a, d, words: w } = run(claim('A', 'lower', { minRespondents: 500 }));
    expect(a.status).toBe('too-little-data');
    expect(d.verdict).toBe('too-little-data');
    expect(w.section.verdictText).not.toMatch(/200|150|120/);
  });

  it('latest-2 names 2024; a period compared with itself is an input error', () => {
    const { a } = run(claim('A', 'lower', { from: 'latest-2' }));
    expect(a.periods.from).toBe('2024');
    expect(() => run(claim('A', 'lower', { from: 'latest' }))).toThrow(InputError);
  });

  it('from after to is an input error naming the swap (else a fall would be reported as a rise)', () => {
    // Data: A fell 15 points from 2025 to 2026; written the wrong way round it used to be "Points the other way".
    expect(() => run(claim('A', 'lower', { from: 'latest', to: 'previous' }))).toThrow(/runs from 2026 to 2025, but 2026 comes after 2025.*swap them: from: previous, to: latest/);
    expect(() => run(claim('A', 'lower', { from: 2026, to: 2024 }))).toThrow(/swap them: from: 2024, to: 2026/);
    expect(run(claim('A', 'lower', { from: 2024, to: 2026 })).a.periods).toEqual({ from: '2024', to: '2026' });
  });

  it('a source with no period column is an input error that says how to name one', () => {
    const noPeriod = { ...data, dimensions: ['Dept', 'Cohort'], values: { ...data.values, Cohort: ['x'] } };
    expect(() => analyse(claim('A', 'lower'), noPeriod, { minRespondents: 10, claimsFile: 'claims.yaml' })).toThrow(/period: <column>/);
  });
});
