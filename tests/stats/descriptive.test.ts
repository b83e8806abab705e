/**
 * Mean, variance, standard deviation, quantiles (Hyndman & Fan types 4-9) and median against GNU R (fixture
 * tests/fixtures/r/correlation.json, written by tests/fixtures/r/correlation.R). The NIST StRD univariate files are
 * checked in nist.test.ts.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { expectClose } from '../helpers/tolerance.js';
import { compensatedSum, mean } from '../../src/stats/mean.js';
import { standardDeviation, variance } from '../../src/stats/variance.js';
import { median, quantile, quantiles, type QuantileType } from '../../src/stats/quantile.js';
import { lag1Autocorrelation } from '../../src/stats/autocorrelation.js';

const R = JSON.parse(readFileSync(new URL('../fixtures/r/correlation.json', import.meta.url), 'utf8')) as {
  r_version: string;
  descriptive: {
    x: number[];
    mean: number;
    var: number;
    sd: number;
    median: number;
    probs: number[];
    quantiles: Record<string, number[]>;
    small: { x: number[]; q25_type7: number };
  };
};
const D = R.descriptive;

describe(`descriptive statistics against ${R.r_version}`, () => {
  it('mean, variance, standard deviation and median', () => {
    // source: R mean(), var(), sd(), median()
    expectClose(mean(D.x), D.mean, 'closed', 'mean');
    expectClose(variance(D.x), D.var, 'closed', 'variance');
    expectClose(standardDeviation(D.x), D.sd, 'closed', 'sd');
    expect(median(D.x)).toBe(D.median);
  });

  it('quantiles of types 4 to 9 at 10 probabilities, ties included', () => {
    for (const type of [4, 5, 6, 7, 8, 9] as QuantileType[]) {
      const expected = D.quantiles[`type${type}`]!;
      const got = quantiles(D.x, D.probs, type);
      // source: R quantile(x, probs, type = 4..9)
      expected.forEach((q, i) => expectClose(got[i]!, q, 'closed', `type ${type} p=${D.probs[i]}`));
    }
    expect(quantile(D.small.x, 0.25)).toBe(D.small.q25_type7);
  });
});

describe('descriptive statistics: published values and degenerate input', () => {
  it('reproduces textbook values', () => {
    // Hyndman & Fan (1996) and R's default: quantile(1:4, 0.25) = 1.75 (common practice)
    expect(quantile([1, 2, 3, 4], 0.25)).toBe(1.75);
    // NIST/SEMATECH e-Handbook of Statistical Methods, section 1.3.5.6 example set 2,4,4,4,5,5,7,9: population
    // SD 2 (from memory), so the sample variance is 32/7
    expect(variance([2, 4, 4, 4, 5, 5, 7, 9])).toBe(32 / 7);
  });

  it('sums with compensation where naive summation loses the small terms', () => {
    // exact sum is 2 (1e16 + 1 + 1 - 1e16); naive left-to-right summation gives 0 (common practice)
    expect(compensatedSum([1e16, 1, 1, -1e16])).toBe(2);
  });

  it('throws clear errors instead of returning NaN', () => {
    expect(() => mean([])).toThrow(/at least 1 value/);
    expect(() => variance([3])).toThrow(/at least 2 values/);
    expect(() => mean([1, NaN])).toThrow(/value 2 is NaN/);
    expect(() => quantile([1, 2], 1.5)).toThrow(/outside \[0, 1\]/);
    expect(() => lag1Autocorrelation([2, 2, 2])).toThrow(/all values are equal/);
  });

  it('variance is shift-invariant and non-negative (property)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.integer({ min: -1000, max: 1000 }), { minLength: 2, maxLength: 50 }),
        fc.integer({ min: -1e6, max: 1e6 }),
        (xs, shift) => {
          const v = variance(xs);
          expect(v).toBeGreaterThanOrEqual(0);
          // integers: the shifted data are exact, so the variances agree to rounding
          expectClose(variance(xs.map((a) => a + shift)), v, 1e-9, 'shifted variance');
          const q = quantiles(xs, [0, 0.5, 1]);
          expect(q[0]).toBe(Math.min(...xs));
          expect(q[2]).toBe(Math.max(...xs));
        },
      ),
      { seed: 20240517, numRuns: 200 },
    );
  });
});
