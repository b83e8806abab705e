import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyse } from '../../src/analyse/index.js';
import type { TrendAnalysis } from '../../src/analyse/types.js';
import type { TrendClaim } from '../../src/claims/types.js';
import type { Cell, Cube } from '../../src/data/types.js';
import { InputError } from '../../src/errors.js';
import { composeClaim } from '../../src/verdicts/compose.js';
import { decide } from '../../src/verdicts/decide.js';
import { Templates } from '../../src/verdicts/templates.js';
import { expectClose } from '../helpers/tolerance.js';

// Reference values: tests/fixtures/r/kinds-a.json from tests/fixtures/r/kinds-a.R (GNU R 4.2: prop.trend.test with
// scores 0..k-1; slope and fitted rates from lm(x/n ~ score, weights = n); Wilson bounds by uniroot; detectable
// slope from Armitage's null variance written out in R).
interface TrendRef {
  x: number[]; n: number[]; statistic: number; p_value: number; p_greater: number; p_less: number; slope: number;
  fitted: number[]; detectable_two_sided: number; detectable_one_sided: number; wilson_low: number[]; wilson_high: number[];
}
const R = JSON.parse(readFileSync(resolve(__dirname, '../fixtures/r/kinds-a.json'), 'utf8')) as { trend: TrendRef[] };
const [RISING, FLAT, FALLING] = R.trend as [TrendRef, TrendRef, TrendRef];

const YEARS = ['2022', '2023', '2024', '2025'];
function cube(): Cube {
  const cells: Cell[] = [];
  const add = (unit: string, ref: TrendRef, years: string[]) =>
    ref.x.forEach((x, i) => cells.push({ dims: { Year: years[i] as string, Unit: unit }, n: ref.n[i] as number, agree: x, approximate: false, firstRow: cells.length + 2 }));
  add('Rising', RISING, YEARS);
  add('Flat', FLAT, YEARS);
  add('Falling', FALLING, YEARS.slice(1));
  return {
    sourceId: 'results', file: 'results.csv', sha256: '0', rows: cells.length, dimensions: ['Year', 'Unit'], cells,
    values: { Year: YEARS.slice().reverse(), Unit: ['Rising', 'Flat', 'Falling'] }, approximate: false, hasPopulation: false,
  };
}
const data = cube();

function claim(unit: string, expect: TrendClaim['expect'], over: Partial<TrendClaim> = {}): TrendClaim {
  return {
    kind: 'trend', id: `trend-${unit}`, statement: `Agreement in ${unit} has been ${expect}.`, source: 'results',
    where: { Unit: unit }, periods: { last: 4 }, expect, confidence: 0.95, confidenceWritten: '95%', sided: 'two-sided',
    minRespondents: 10, place: { line: 7, column: 5 }, ...over,
  };
}
const ctx = { minRespondents: 10, claimsFile: 'claims.yaml', periodColumns: { results: 'Year' } };
const words = { templates: new Templates(), claimsTested: 1, adjustName: 'no adjustment (one claim)', adjusted: false, minRespondents: 10, periodColumns: ['Year'] };
function run(c: TrendClaim) {
  const a = analyse(c, data, ctx) as TrendAnalysis;
  const d = decide(a, a.test?.p);
  return { a, d, w: composeClaim(a, d, words) };
}

describe('trend claims: Cochran–Armitage over periods scored 0..k-1', () => {
  it('a steady rise is supported; statistic, p, slope, fitted rates and Wilson bounds match R', () => {
    const { a, d, w } = run(claim('Rising', 'rising'));
    expect(a.periods).toEqual(YEARS);
    expectClose(a.test?.statistic?.value as number, RISING.statistic, 'statistic', 'X-squared'); // R prop.trend.test
    expectClose(a.test?.p as number, RISING.p_value, 'p', 'p'); // R prop.trend.test
    expectClose(a.slope as number, RISING.slope, 'closed', 'slope'); // R lm, weights n
    a.fitted?.forEach((f, i) => expectClose(f, RISING.fitted[i] as number, 'closed', `fitted ${i}`)); // R lm fitted
    a.rates?.forEach((r, i) => {
      expectClose(r.interval.lower, RISING.wilson_low[i] as number, 'bound', `Wilson lower ${i}`); // R uniroot
      expectClose(r.interval.upper, RISING.wilson_high[i] as number, 'bound', `Wilson upper ${i}`); // R uniroot
    });
    expectClose(a.detectable as number, RISING.detectable_two_sided, 'closed', 'detectable slope'); // R formula
    expect(d.verdict).toBe('supported');
    expect(w.section.verdictText).toMatch(/^Supported\. Over 4 periods the agreement rate rose by about 8\.\d points a period/);
    expect(w.section.chart?.data.kind).toBe('periods');
    expect(w.section.cautions.join(' ')).toMatch(/straight-line change/);
    expect(w.section.cautions.join(' ')).toMatch(/may have answered in more than one period, and respondents cannot be linked/);
  });

  it('one-sided: p from the signed z, and the opposite direction (R pnorm of the signed root of X-squared)', () => {
    const { a, d } = run(claim('Rising', 'rising', { sided: 'one-sided' }));
    expectClose(a.test?.p as number, RISING.p_greater, 'p', 'p greater'); // R
    expectClose(a.pOpposite as number, RISING.p_less, 'p', 'p less'); // R
    expectClose(a.detectable as number, RISING.detectable_one_sided, 'closed', 'detectable one-sided'); // R formula
    expect(d.verdict).toBe('supported');
  });

  it('a flat series is not supported and says which steady change could be detected', () => {
    const { a, d, w } = run(claim('Flat', 'rising'));
    expectClose(a.test?.p as number, FLAT.p_value, 'p', 'p'); // R prop.trend.test
    expect(d.verdict).toBe('not-supported');
    expect(w.section.verdictText).toMatch(/steady change of about \d\.\d points a period or more would be detected 80% of the time/);
  });

  it('a fall when a rise was claimed points the other way (three periods named as words)', () => {
    const { a, d, w } = run(claim('Falling', 'rising', { periods: ['latest-2', 'previous', 'latest'] }));
    expect(a.periods).toEqual(['2023', '2024', '2025']);
    expectClose(a.test?.statistic?.value as number, FALLING.statistic, 'statistic', 'X-squared'); // R prop.trend.test
    expectClose(a.test?.p as number, FALLING.p_value, 'p', 'p'); // R prop.trend.test
    expect(d.verdict).toBe('opposite');
    expect(w.section.verdictText).toMatch(/^The data point the other way\./);
    const one = run(claim('Falling', 'rising', { periods: ['2023', '2024', '2025'], sided: 'one-sided' }));
    expectClose(one.a.pOpposite as number, FALLING.p_less, 'p', 'p less'); // R
    expect(one.d.verdict).toBe('opposite');
  });

  it('too little data when one period is below the minimum; fewer than three periods is an input error', () => {
    const { d, w } = run(claim('Rising', 'rising', { minRespondents: 201 }));
    expect(d.verdict).toBe('too-little-data');
    expect(w.section.verdictText).not.toMatch(/\b200\b/);
    expect(() => run(claim('Rising', 'rising', { periods: ['2024', '2025'] }))).toThrow(InputError);
    expect(() => run(claim('Rising', 'rising', { periods: { last: 5 } }))).toThrow(/last 5 periods but the data hold only 4/);
  });

  it('periods listed newest first are an input error giving them oldest first (else a rise would be reported as a fall)', () => {
    expect(() => run(claim('Rising', 'rising', { periods: ['2025', '2024', '2023', '2022'] }))).toThrow(/lists its periods out of order \(2025, 2024, 2023, 2022\).*periods: \[2022, 2023, 2024, 2025\]/);
    expect(() => run(claim('Rising', 'rising', { periods: ['latest', 'previous', 'latest-2'] }))).toThrow(/periods: \[latest-2, previous, latest\]/);
  });

  it('periods named in words as well as numbers (Spring 2025, Autumn 2025) keep the order the claim lists', () => {
    const seasons = ['Spring 2025', 'Autumn 2025', 'Spring 2026'];
    const cells: Cell[] = RISING.x.slice(0, 3).map((x, i) => ({ dims: { Year: seasons[i] as string, Unit: 'Rising' }, n: RISING.n[i] as number, agree: x, approximate: false, firstRow: i + 2 }));
    const c: Cube = { ...data, cells, rows: cells.length, values: { Year: seasons, Unit: ['Rising'] } };
    const a = analyse(claim('Rising', 'rising', { periods: seasons }), c, ctx) as TrendAnalysis;
    expect(a.periods).toEqual(seasons);
  });
});
