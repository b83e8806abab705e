/**
 * Chi-square for departure from a straight-line trend, against GNU R 4.2.2: prop.test(x, n, correct = FALSE) minus
 * prop.trend.test(x, n, score), on k - 2 df (tests/fixtures/r/language-periods.R -> language-periods.json; the
 * first case is R's own ?prop.trend.test example, its values printed by R and written here).
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { departureFromTrend } from '../../src/stats/departure-from-trend.js';
import { expectClose } from '../helpers/tolerance.js';

const R = JSON.parse(readFileSync(join(__dirname, '../fixtures/r/language-periods.json'), 'utf8'));

describe('departure from a straight-line trend', () => {
  it("R's prop.trend.test example: 12.600411 - 8.2249223 = 4.375489 on 2 df, p = 0.11216946 (R 4.2.2)", () => {
    const d = departureFromTrend([83, 90, 129, 70], [86, 93, 136, 82]);
    expectClose(d.overall, 12.600411297127639, 'statistic', 'R prop.test X-squared');
    expectClose(d.trend, 8.2249222851977102, 'statistic', 'R prop.trend.test X-squared');
    expectClose(d.statistic.value, 4.375489011929929, 'statistic', 'difference');
    expect(d.df).toBe(2);
    expectClose(d.p, 0.11216946106483044, 'p', 'R pchisq upper tail');
  });

  it('a rise then a fall over five periods is a large departure; a steady rise is none (R prop.test - prop.trend.test)', () => {
    const bent = departureFromTrend([186, 225, 232, 223, 181], [310, 322, 305, 318, 296], [0, 1, 2, 3, 4]);
    expectClose(bent.statistic.value, R.bent.statistic, 'statistic', 'R overall minus trend');
    expectClose(bent.p, R.bent.p, 'p', 'R pchisq');
    expect(bent.df).toBe(R.bent.df);
    const steady = departureFromTrend([142, 155, 151, 164, 167], [240, 251, 236, 248, 244], [0, 1, 2, 3, 4]);
    expectClose(steady.statistic.value, R.steady.statistic, 1e-7, 'R overall minus trend (a small difference of two larger numbers)');
    expectClose(steady.p, R.steady.p, 'p', 'R pchisq');
  });

  it('needs three periods', () => {
    expect(() => departureFromTrend([10, 20], [30, 40])).toThrow(/at least 3/);
  });
});
