/**
 * Pearson, Spearman, Kendall, partial correlation and correlation power against GNU R (fixture
 * tests/fixtures/r/correlation.json, written by correlation.R beside it: cor.test, cov.wt, lm residuals and the Fisher z
 * power formula), plus property tests.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { expectClose } from '../helpers/tolerance.js';
import { pearson } from '../../src/stats/pearson.js';
import { spearman } from '../../src/stats/spearman.js';
import { kendall } from '../../src/stats/kendall.js';
import { partialCorrelation } from '../../src/stats/partial-correlation.js';
import { correlationPower, minDetectableCorrelation, type Sided } from '../../src/stats/power-correlation.js';
import type { Alternative } from '../../src/stats/result.js';

interface CorRow {
  set: string;
  method: 'pearson' | 'spearman' | 'kendall';
  alternative: Alternative;
  level?: number;
  estimate: number;
  statistic?: number;
  df?: number;
  t?: number;
  S?: number;
  p: number;
  lower?: number;
  upper?: number;
}

const R = JSON.parse(readFileSync(new URL('../fixtures/r/correlation.json', import.meta.url), 'utf8')) as {
  r_version: string;
  correlation: { sets: Record<string, { x: number[]; y: number[] }>; rows: CorRow[] };
  weighted_pearson: { x: number[]; y: number[]; w: number[]; estimate: number; t: number; df: number; p: number; lower: number; upper: number };
  partial: {
    x: number[];
    y: number[];
    z1: number[];
    z2: number[];
    z3: number[];
    rows: { controls: string[]; alternative: Alternative; estimate: number; t: number; df: number; p: number; lower: number; upper: number }[];
  };
  power: { kind: 'power' | 'detectable'; n: number; alpha: number; sided: Sided; r?: number; power?: number; value: number }[];
};

describe(`correlation against ${R.r_version}`, () => {
  const byMethod = (m: CorRow['method']): CorRow[] => R.correlation.rows.filter((r) => r.method === m);

  it('Pearson r, t, p and Fisher z interval match cor.test for every alternative and level', () => {
    const rows = byMethod('pearson');
    expect(rows.length).toBe(30);
    for (const row of rows) {
      const { x, y } = R.correlation.sets[row.set]!;
      const what = `${row.set} ${row.alternative} ${row.level}`;
      const res = pearson(x, y, { alternative: row.alternative, level: row.level! });
      // source: R cor.test(method = "pearson")
      expectClose(res.estimate.value, row.estimate, 'closed', `${what} r`);
      expectClose(res.statistic!.value, row.statistic!, 'closed', `${what} t`);
      expect(res.df).toBe(row.df);
      expectClose(res.p, row.p, 'p', `${what} p`);
      expectClose(res.interval!.lower, row.lower!, 'bound', `${what} lower`);
      expectClose(res.interval!.upper, row.upper!, 'bound', `${what} upper`);
      expect(res.interval!.method).toBe('fisher-z');
    }
  });

  it('Spearman rho and its t-approximation p match cor.test(exact = FALSE), ties included', () => {
    const rows = byMethod('spearman');
    expect(rows.length).toBe(15);
    for (const row of rows) {
      const { x, y } = R.correlation.sets[row.set]!;
      const res = spearman(x, y, { alternative: row.alternative });
      const what = `${row.set} ${row.alternative}`;
      // source: R cor.test(method = "spearman", exact = FALSE); t recomputed in R from rho
      expectClose(res.estimate.value, row.estimate, 'closed', `${what} rho`);
      expectClose(res.statistic!.value, row.t!, 'statistic', `${what} t`);
      expectClose(res.p, row.p, 'p', `${what} p`);
    }
  });

  it('Kendall tau-b, tie-corrected z and p match cor.test(exact = FALSE)', () => {
    const rows = byMethod('kendall');
    expect(rows.length).toBe(15);
    for (const row of rows) {
      const { x, y } = R.correlation.sets[row.set]!;
      const res = kendall(x, y, { alternative: row.alternative });
      const what = `${row.set} ${row.alternative}`;
      // source: R cor.test(method = "kendall", exact = FALSE)
      expectClose(res.estimate.value, row.estimate, 'closed', `${what} tau`);
      expectClose(res.statistic!.value, row.statistic!, 'closed', `${what} z`);
      expectClose(res.p, row.p, 'p', `${what} p`);
    }
  });

  it('weighted Pearson r matches cov.wt, with the test on the number of pairs', () => {
    const w = R.weighted_pearson;
    const res = pearson(w.x, w.y, { weights: w.w });
    // source: R cov.wt(cor = TRUE); t, p and interval computed in R from that r with n = 60 pairs
    expectClose(res.estimate.value, w.estimate, 'closed', 'weighted r');
    expectClose(res.statistic!.value, w.t, 'closed', 'weighted t');
    expect(res.df).toBe(w.df);
    expectClose(res.p, w.p, 'p', 'weighted p');
    expectClose(res.interval!.lower, w.lower, 'bound', 'weighted lower');
    expectClose(res.interval!.upper, w.upper, 'bound', 'weighted upper');
    expect(res.warnings.length).toBe(1);
  });

  it('partial correlation matches the correlation of lm residuals, with n - 2 - k df and n - 3 - k interval', () => {
    const P = R.partial;
    const cols: Record<string, number[]> = { z1: P.z1, z2: P.z2, z3: P.z3 };
    expect(P.rows.length).toBe(9);
    for (const row of P.rows) {
      const res = partialCorrelation(P.x, P.y, row.controls.map((c) => cols[c]!), { alternative: row.alternative });
      const what = `${row.controls.join('+')} ${row.alternative}`;
      // source: R cor(residuals(lm(x ~ Z)), residuals(lm(y ~ Z))), pt and qnorm
      expectClose(res.estimate.value, row.estimate, 'closed', `${what} r`);
      expectClose(res.statistic!.value, row.t, 'closed', `${what} t`);
      expect(res.df).toBe(row.df);
      expectClose(res.p, row.p, 'p', `${what} p`);
      expectClose(res.interval!.lower, row.lower, 'bound', `${what} lower`);
      expectClose(res.interval!.upper, row.upper, 'bound', `${what} upper`);
    }
  });

  it('power and smallest detectable correlation match the Fisher z formula evaluated in R', () => {
    expect(R.power.length).toBeGreaterThan(100);
    for (const row of R.power) {
      const what = `${row.kind} n=${row.n} alpha=${row.alpha} ${row.sided} ${row.r ?? row.power}`;
      // source: R pnorm/qnorm with uniroot(tol = 1e-15), Cohen (1988) ch. 3 formula
      if (row.kind === 'power') {
        expectClose(correlationPower(row.r!, row.n, { alpha: row.alpha, sided: row.sided }), row.value, 'p', what);
      } else {
        expectClose(minDetectableCorrelation(row.n, { alpha: row.alpha, power: row.power!, sided: row.sided }), row.value, 'bound', what);
      }
    }
  });
});

describe('correlation: published example and degenerate input', () => {
  it('reproduces a textbook Pearson r', () => {
    // Anscombe (1973), "Graphs in statistical analysis", The American Statistician 27, 17-21: data set I has
    // r = 0.816 (printed to 3 decimals).
    const x = [10, 8, 13, 9, 11, 14, 6, 4, 12, 7, 5];
    const y = [8.04, 6.95, 7.58, 8.81, 8.33, 9.96, 7.24, 4.26, 10.84, 4.82, 5.68];
    // printed to 3 decimals: half a unit in the last place, 0.0005, relative to 0.816
    expectClose(pearson(x, y).estimate.value, 0.816, 0.0005 / 0.816, 'r (published to 3 decimals)');
  });

  it('throws clear errors instead of returning NaN', () => {
    expect(() => pearson([1, 2, 3], [1, 2])).toThrow(/3 values but y has 2/);
    expect(() => pearson([1, 1, 1, 1], [1, 2, 3, 4])).toThrow(/x does not vary/);
    expect(() => pearson([1, 2], [1, 2])).toThrow(/at least 3 pairs/);
    expect(() => pearson([1, 2, NaN, 4], [1, 2, 3, 4])).toThrow(/not a finite number/);
    expect(() => kendall([1, 2, 3, 4], [2, 2, 2, 2])).toThrow(/y does not vary/);
    expect(() => spearman([1, 2, 3, 4], [5, 5, 5, 5])).toThrow(/y does not vary/);
    expect(() => partialCorrelation([1, 2, 3, 4], [2, 1, 4, 3], [[1, 2, 3, 4], [4, 1, 3, 2]])).toThrow(/at least 5 pairs/);
    expect(() => minDetectableCorrelation(3)).toThrow(/at least 4 units/);
  });

  it('gives p = 0 and no NaN for a perfect correlation', () => {
    const res = pearson([1, 2, 3, 4, 5], [2, 4, 6, 8, 10]);
    expect(res.estimate.value).toBe(1);
    expect(res.p).toBe(0);
    expect(res.statistic!.value).toBe(Infinity);
    expect(res.interval!.upper).toBe(1);
  });
});

describe('correlation properties', () => {
  const pairs = fc
    .integer({ min: 4, max: 40 })
    .chain((n) =>
      fc.tuple(
        fc.array(fc.double({ min: -1e6, max: 1e6, noNaN: true }), { minLength: n, maxLength: n }),
        fc.array(fc.double({ min: -1e6, max: 1e6, noNaN: true }), { minLength: n, maxLength: n }),
      ),
    )
    .filter(([x, y]) => new Set(x).size > 1 && new Set(y).size > 1);
  const alternative = fc.constantFrom<Alternative>('two-sided', 'less', 'greater');

  it('r lies in [-1, 1], is symmetric in x and y, lies in its interval, and p lies in [0, 1]', () => {
    fc.assert(
      fc.property(pairs, alternative, ([x, y], alt) => {
        const a = pearson(x, y, { alternative: alt });
        const b = pearson(y, x, { alternative: alt });
        const r = a.estimate.value;
        expect(r).toBeGreaterThanOrEqual(-1);
        expect(r).toBeLessThanOrEqual(1);
        expect(b.estimate.value).toBe(r);
        expect(a.interval!.lower).toBeLessThanOrEqual(r);
        expect(a.interval!.upper).toBeGreaterThanOrEqual(r);
        expect(a.p).toBeGreaterThanOrEqual(0);
        expect(a.p).toBeLessThanOrEqual(1);
        for (const res of [spearman(x, y, { alternative: alt }), kendall(x, y, { alternative: alt })]) {
          expect(Math.abs(res.estimate.value)).toBeLessThanOrEqual(1);
          expect(res.p).toBeGreaterThanOrEqual(0);
          expect(res.p).toBeLessThanOrEqual(1);
        }
        expect(spearman(y, x).estimate.value).toBe(spearman(x, y).estimate.value);
        expect(kendall(y, x).estimate.value).toBe(kendall(x, y).estimate.value);
      }),
      { seed: 20240517, numRuns: 300 },
    );
  });

  it('does not change its inputs', () => {
    const x = Object.freeze([3, 1, 4, 1, 5, 9, 2, 6]);
    const y = Object.freeze([2, 7, 1, 8, 2, 8, 1, 8]);
    expect(() => [pearson(x, y), spearman(x, y), kendall(x, y)]).not.toThrow();
  });
});
