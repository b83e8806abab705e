import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { cochranArmitage } from '../../src/stats/cochran-armitage.js';
import { expectClose } from '../helpers/tolerance.js';

interface TrendCase {
  x: number[];
  n: number[];
  score: number[];
  statistic: number;
  df: number;
  p: number;
  slope: number;
  intercept: number;
  p_greater: number;
  p_less: number;
}
const fixture = JSON.parse(readFileSync(new URL('../fixtures/r/tables.json', import.meta.url), 'utf8')) as {
  trend: TrendCase[];
};

describe('cochranArmitage against R prop.trend.test', () => {
  // Source: GNU R 4.2 stats::prop.trend.test; the slope and intercept from R's lm(freq ~ score, weights = w), the
  // one-sided p-values from pnorm of the signed square root of the statistic (fixture tests/fixtures/r/tables.R).
  fixture.trend.forEach((c, k) => {
    it(`case ${k + 1}: ${c.x.length} groups`, () => {
      const two = cochranArmitage(c.x, c.n, { scores: c.score });
      expectClose(two.statistic.value, c.statistic, 'closed', 'X²');
      expect(two.df).toBe(1);
      expectClose(two.p, c.p, 'p', 'two-sided p');
      expectClose(two.slope, c.slope, 'closed', 'slope');
      expectClose(two.intercept, c.intercept, 'closed', 'intercept');
      expectClose(two.z * two.z, c.statistic, 'closed', 'z²');
      expect(Math.sign(two.z)).toBe(Math.sign(c.slope));
      expectClose(cochranArmitage(c.x, c.n, { scores: c.score, alternative: 'greater' }).p, c.p_greater, 'p', 'p greater');
      expectClose(cochranArmitage(c.x, c.n, { scores: c.score, alternative: 'less' }).p, c.p_less, 'p', 'p less');
    });
  });

  it('a published worked example: maternal alcohol consumption and malformation', () => {
    // Source: Agresti A. (2013) Categorical Data Analysis, 3rd ed., Table 3.7 and §3.4.6 (from memory): scores
    // 0, 0.5, 1.5, 4, 7; the trend statistic is 6.57 with P = 0.010 (Agresti's M² = (N−1)r² differs from the
    // Cochran–Armitage N r² only in the sixth figure here, N = 32574).
    const r = cochranArmitage([48, 38, 5, 1, 1], [17114, 14502, 793, 127, 38], { scores: [0, 0.5, 1.5, 4, 7] });
    expectClose(r.statistic.value, 6.57, 0.001, 'X² (published to 3 figures)');
    // published P = 0.010: half a unit in its last figure is 0.0005, 5% of it
    expectClose(r.p, 0.01, 0.05, 'p (published to 2 figures)');
    expect(r.slope).toBeGreaterThan(0);
  });

  it('default scores are 1..k, and the result does not depend on shifting or scaling the scores (except the slope)', () => {
    const c = fixture.trend[0] as TrendCase; // scores 1:4 in R
    const plain = cochranArmitage(c.x, c.n);
    expectClose(plain.statistic.value, c.statistic, 'closed', 'X² with default scores');
    const scaled = cochranArmitage(c.x, c.n, { scores: [10, 20, 30, 40] });
    expectClose(scaled.statistic.value, c.statistic, 'closed', 'X² with scores 10..40');
    expectClose(scaled.slope * 10, c.slope, 'closed', 'slope per 10 units');
  });

  it('rejects input it cannot test, saying what is wrong', () => {
    expect(() => cochranArmitage([3], [10])).toThrow(/at least 2 ordered groups/);
    expect(() => cochranArmitage([3, 4], [10])).toThrow(/one of each per group/);
    expect(() => cochranArmitage([3, 12], [10, 10])).toThrow(/group 2 has 12 agreeing of 10/);
    expect(() => cochranArmitage([3, 4], [10, 0])).toThrow(/group 2 has 0 respondents/);
    expect(() => cochranArmitage([0, 0], [10, 12])).toThrow(/no one agreed/);
    expect(() => cochranArmitage([10, 12], [10, 12])).toThrow(/everyone agreed/);
    expect(() => cochranArmitage([3, 4], [10, 12], { scores: [2, 2] })).toThrow(/same score/);
    expect(() => cochranArmitage([3, 4], [10, 12], { scores: [1, Number.NaN] })).toThrow(/finite/);
  });
});

describe('interval for the fitted change per period, against R', () => {
  // Source: GNU R 4.2.2, tests/fixtures/r/trend-slope.R: the slope of prop.trend.test's weighted least-squares line
  // with its standard error from summary(glm(freq ~ score, weights = n / (p̄ (1 − p̄))), dispersion = 1), and the
  // normal quantile; (slope / se)² is prop.trend.test's statistic.
  const R = JSON.parse(readFileSync(new URL('../fixtures/r/trend-slope.json', import.meta.url), 'utf8')) as {
    r_version: string;
    cases: Array<{ name: string; x: number[]; n: number[]; level: number; slope: number; se: number; lower: number; upper: number; statistic: number; p: number }>;
  };

  it('was made with R 4.2.2', () => {
    expect(R.r_version).toBe('4.2.2');
  });

  for (const c of R.cases) {
    it(`${c.name}: slope, standard error and interval`, () => {
      const scores = c.x.map((_, i) => i);
      const r = cochranArmitage(c.x, c.n, { scores, level: c.level });
      expectClose(r.slope, c.slope, 'closed', 'slope');
      expectClose(r.se, c.se, 'closed', 'standard error');
      expect(r.interval?.level).toBe(c.level);
      expect(r.interval?.method).toBe('trend-wald');
      expectClose(r.interval!.lower, c.lower, 'bound', 'lower');
      expectClose(r.interval!.upper, c.upper, 'bound', 'upper');
      expectClose(r.statistic.value, c.statistic, 'closed', 'X²');
      // The interval leaves out no change exactly when the two-sided test rejects at the same level.
      expect(r.interval!.lower > 0 || r.interval!.upper < 0).toBe(c.p < 1 - c.level);
    });
  }

  it('gives no interval unless a level is asked for, and refuses a level outside (0, 1)', () => {
    expect(cochranArmitage([110, 125, 140], [200, 200, 200]).interval).toBeUndefined();
    expect(() => cochranArmitage([110, 125, 140], [200, 200, 200], { level: 95 })).toThrow(/level 95/);
  });
});
