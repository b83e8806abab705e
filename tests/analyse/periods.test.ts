import { describe, expect, it } from 'vitest';
import { orderedPeriods, resolvePeriods } from '../../src/analyse/periods.js';
import type { ChangeClaim, CompareClaim, TrendClaim } from '../../src/claims/types.js';
import type { Cube } from '../../src/data/types.js';
import { InputError } from '../../src/errors.js';

// Resolution of relative period words is this project's own rule (issue 4): latest is the newest period in the data,
// previous the one before, latest-N the Nth before; numbers order as numbers, other labels as text with digit runs
// compared as numbers. No outside reference applies; the expected periods are read off the inputs by hand.

function cube(column: string, periods: string[]): Cube {
  return {
    sourceId: 'results', file: 'results.csv', sha256: '0', rows: periods.length, dimensions: [column, 'Unit'],
    cells: periods.map((p, i) => ({ dims: { [column]: p, Unit: 'A' }, n: 100, agree: 50, approximate: false, firstRow: i + 2 })),
    values: { [column]: periods, Unit: ['A'] }, approximate: false, hasPopulation: false,
  };
}
const base = { statement: 's', source: 'results', confidence: 0.95, confidenceWritten: '95%', sided: 'two-sided' as const, minRespondents: 10, place: { line: 4, column: 3 } };
const change = (from: string | number, to: string | number, where = {}): ChangeClaim => ({ ...base, kind: 'change', id: 'c1', where, from, to, expect: 'lower' });
const trend = (periods: TrendClaim['periods']): TrendClaim => ({ ...base, kind: 'trend', id: 't1', where: {}, periods, expect: 'rising' });

describe('relative periods', () => {
  it('orders numeric periods as numbers, not as text (9 before 10)', () => {
    const c = cube('Wave', ['10', '9', '11']);
    expect(orderedPeriods(c, 'Wave')).toEqual(['9', '10', '11']);
    const r = resolvePeriods(change('previous', 'latest'), c, 'Wave');
    expect(r.claim).toMatchObject({ from: '10', to: '11' });
    expect(r.resolved).toEqual({ previous: '10', latest: '11' });
  });

  it('orders academic years as text: "2024-25" before "2025-26"; latest-2 counts back two', () => {
    const c = cube('Session', ['2025-26', '2023-24', '2024-25']);
    const r = resolvePeriods(change('latest-2', 'latest'), c, 'Session');
    expect(r.claim).toMatchObject({ from: '2023-24', to: '2025-26' });
  });

  it('replaces words in every filter on the period column, including lists and `not`, and leaves other columns alone', () => {
    const c = cube('Year', ['2024', '2025', '2026']);
    const claim: CompareClaim = {
      ...base, kind: 'compare', id: 'k', where: { Year: 'latest', Unit: 'latest' }, focus: { Year: ['previous', 'latest'] },
      against: { Year: { not: 'latest-2' } }, expect: 'higher',
    };
    const r = resolvePeriods(claim, c, 'Year').claim as CompareClaim;
    expect(r.where).toEqual({ Year: '2026', Unit: 'latest' });
    expect(r.focus).toEqual({ Year: ['2025', '2026'] });
    expect(r.against).toEqual({ Year: { not: '2024' } });
    expect(claim.where.Year).toBe('latest'); // the claim given is not changed
  });

  it('a trend over { last: 3 } takes the three newest periods, oldest first', () => {
    const c = cube('Year', ['2026', '2022', '2024', '2023', '2025']);
    const r = resolvePeriods(trend({ last: 3 }), c, 'Year');
    expect((r.claim as TrendClaim).periods).toEqual(['2024', '2025', '2026']);
    expect(r.resolved).toEqual({ 'last 3': '2024, 2025, 2026' });
  });

  it('finds a column named Year when the source names none', () => {
    const r = resolvePeriods(change('previous', 'latest'), cube('Year', ['2025', '2026']), undefined);
    expect(r.claim).toMatchObject({ from: '2025', to: '2026' });
  });

  it('too few periods: an InputError naming the claim and listing the periods found', () => {
    const c = cube('Year', ['2025', '2026']);
    try {
      resolvePeriods(change('latest-3', 'latest'), c, 'Year', 'claims.yaml');
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(InputError);
      const msg = (e as Error).message;
      expect(msg).toMatch(/^claims\.yaml:4:3: claim "c1"/);
      expect(msg).toMatch(/are: 2025, 2026/);
    }
    expect(() => resolvePeriods(trend({ last: 4 }), c, 'Year')).toThrow(/last 4 periods but the data hold only 2/);
  });

  it('a word with no period column in the source is an InputError that says how to name one', () => {
    const c = cube('Cohort', ['x', 'y']);
    expect(() => resolvePeriods(change('previous', 'latest'), c, undefined)).toThrow(/add `period: <column>`/);
  });

  it('values that are not words pass through unchanged', () => {
    const c = cube('Year', ['2025', '2026']);
    expect(resolvePeriods(change(2025, '2026'), c, 'Year').claim).toMatchObject({ from: 2025, to: '2026' });
  });
});
