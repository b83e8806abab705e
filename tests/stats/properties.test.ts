/**
 * Properties required of every family that the other files of tests/stats do not already cover (fast-check, seeded
 * so failures reproduce): p-values in [0, 1]; the interval contains the estimate; swapping the two groups (or the
 * order of the periods) flips the sign of the estimate and keeps the two-sided p-value; intervals narrow as n grows.
 * These are mathematical facts of the methods (common practice as checks), not reference values.
 * Covered elsewhere: rates in proportions-properties.test.ts, adjusted p monotone in adjust.test.ts, t and rank-sum
 * swaps in means.test.ts, correlation ranges in correlation.test.ts, Fisher r×c in tables.test.ts.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { welchTRaw } from '../../src/stats/welch-t.js';
import { studentTRaw } from '../../src/stats/student-t.js';
import { pearson } from '../../src/stats/pearson.js';
import { spearman } from '../../src/stats/spearman.js';
import { kendall } from '../../src/stats/kendall.js';
import { chiSquareIndependence } from '../../src/stats/chi-square-independence.js';
import { cochranArmitage } from '../../src/stats/cochran-armitage.js';
import { tostTwoProportions } from '../../src/stats/tost-two-proportions.js';
import { binomialExactTest } from '../../src/stats/binomial-exact.js';
import { wilsonCcInterval } from '../../src/stats/wilson-cc.js';
import { newcombeInterval } from '../../src/stats/newcombe.js';
import { mannWhitneyCounts } from '../../src/stats/mann-whitney-counts.js';
import { fisherExact2x2 } from '../../src/stats/fisher-exact-2x2.js';

const params = { seed: 20260601, numRuns: 200 };
const close = (a: number, b: number, rel = 1e-12): boolean => Math.abs(a - b) <= rel * Math.max(Math.abs(a), Math.abs(b), 1e-300);
const answers = fc.array(fc.integer({ min: 1, max: 5 }), { minLength: 3, maxLength: 40 }).filter((v) => new Set(v).size > 1);

describe('mean scores', () => {
  it('the t interval contains the difference and narrows when every answer is seen twice', () => {
    fc.assert(
      fc.property(answers, answers, (x, y) => {
        for (const test of [welchTRaw, studentTRaw]) {
          const r = test(x, y);
          if (!(r.interval.lower <= r.estimate.value && r.estimate.value <= r.interval.upper)) return false;
          const twice = test([...x, ...x], [...y, ...y]);
          if (!(twice.interval.upper - twice.interval.lower < r.interval.upper - r.interval.lower)) return false;
        }
        return true;
      }),
      params,
    );
  });

  it('rank-sum test from counts: p in [0, 1], swapping groups keeps the two-sided p and mirrors the estimate', () => {
    const counts = fc.array(fc.nat({ max: 30 }), { minLength: 5, maxLength: 5 }).filter((c) => c.reduce((a, b) => a + b, 0) > 0);
    fc.assert(
      fc.property(counts, counts, (a, b) => {
        fc.pre(a.filter((v) => v > 0).length + b.filter((v) => v > 0).length > 2);
        const rec = (c: number[]): Record<string, number> => Object.fromEntries(c.map((v, i) => [String(i + 1), v]));
        const ab = mannWhitneyCounts(rec(a), rec(b));
        const ba = mannWhitneyCounts(rec(b), rec(a));
        return ab.p >= 0 && ab.p <= 1 && close(ab.p, ba.p) && close(ab.estimate.value, 1 - ba.estimate.value);
      }),
      params,
    );
  });
});

describe('correlation', () => {
  const pairs = fc
    .integer({ min: 5, max: 30 })
    .chain((n) => fc.tuple(fc.array(fc.integer({ min: 0, max: 100 }), { minLength: n, maxLength: n }), fc.array(fc.integer({ min: 0, max: 100 }), { minLength: n, maxLength: n })))
    .filter(([x, y]) => new Set(x).size > 2 && new Set(y).size > 2);

  it('reversing one measure flips r, rho and tau and keeps their two-sided p-values', () => {
    fc.assert(
      fc.property(pairs, ([x, y]) => {
        const neg = y.map((v) => -v);
        for (const f of [pearson, spearman, kendall]) {
          const a = f(x, y);
          const b = f(x, neg);
          if (!close(a.estimate.value, -b.estimate.value, 1e-12) && Math.abs(a.estimate.value + b.estimate.value) > 1e-15) return false;
          if (!close(a.p, b.p, 1e-9) || a.p < 0 || a.p > 1) return false;
        }
        return true;
      }),
      params,
    );
  });

  it('the Fisher z interval narrows when every unit is seen twice (same r, more units)', () => {
    fc.assert(
      fc.property(pairs, ([x, y]) => {
        const a = pearson(x, y).interval!;
        const b = pearson([...x, ...x], [...y, ...y]).interval!;
        fc.pre(Math.abs(pearson(x, y).estimate.value) < 0.999999);
        return b.upper - b.lower < a.upper - a.lower;
      }),
      params,
    );
  });
});

describe('contingency tables', () => {
  const table = fc
    .tuple(fc.integer({ min: 2, max: 4 }), fc.integer({ min: 2, max: 4 }))
    .chain(([r, c]) => fc.array(fc.array(fc.integer({ min: 1, max: 40 }), { minLength: c, maxLength: c }), { minLength: r, maxLength: r }));

  it('chi-square: p in [0, 1]; swapping rows or transposing keeps X² and p, and moves the residuals with the cells', () => {
    fc.assert(
      fc.property(table, (t) => {
        const a = chiSquareIndependence(t, { yates: false });
        const swapped = chiSquareIndependence([t[1]!, t[0]!, ...t.slice(2)], { yates: false });
        const transposed = chiSquareIndependence(t[0]!.map((_, j) => t.map((row) => row[j]!)), { yates: false });
        return (
          a.p >= 0 &&
          a.p <= 1 &&
          close(a.statistic.value, swapped.statistic.value, 1e-12) &&
          close(a.p, swapped.p, 1e-9) &&
          close(a.statistic.value, transposed.statistic.value, 1e-12) &&
          close(a.adjustedResiduals[0]![0]!, swapped.adjustedResiduals[1]![0]!, 1e-12) &&
          close(a.adjustedResiduals[0]![1]!, transposed.adjustedResiduals[1]![0]!, 1e-12)
        );
      }),
      params,
    );
  });

  it("Fisher 2×2: swapping the groups flips the difference and keeps the two-sided p", () => {
    fc.assert(
      fc.property(fc.nat({ max: 20 }), fc.nat({ max: 20 }), fc.nat({ max: 20 }), fc.nat({ max: 20 }), (a, b, c, d) => {
        fc.pre(a + b > 0 && c + d > 0);
        const x = fisherExact2x2(a, b, c, d);
        const y = fisherExact2x2(c, d, a, b);
        return x.p >= 0 && x.p <= 1 && close(x.p, y.p, 1e-12) && x.estimate.value === -y.estimate.value;
      }),
      params,
    );
  });
});

describe('trend over periods', () => {
  const periods = fc
    .integer({ min: 3, max: 6 })
    .chain((k) => fc.array(fc.integer({ min: 20, max: 400 }).chain((n) => fc.tuple(fc.integer({ min: 0, max: n }), fc.constant(n))), { minLength: k, maxLength: k }));

  it('reversing the order of the periods flips the slope and z and keeps the two-sided p; p in [0, 1]', () => {
    fc.assert(
      fc.property(periods, (g) => {
        const x = g.map(([a]) => a);
        const n = g.map(([, m]) => m);
        const agree = x.reduce((s, v) => s + v, 0);
        fc.pre(agree > 0 && agree < n.reduce((s, v) => s + v, 0));
        const fwd = cochranArmitage(x, n);
        const back = cochranArmitage([...x].reverse(), [...n].reverse());
        return fwd.p >= 0 && fwd.p <= 1 && close(fwd.slope, -back.slope, 1e-9) && close(fwd.z, -back.z, 1e-9) && close(fwd.p, back.p, 1e-9);
      }),
      params,
    );
  });
});

describe('rates: the families not covered in proportions-properties.test.ts', () => {
  const rate = fc.integer({ min: 2, max: 2000 }).chain((n) => fc.tuple(fc.integer({ min: 1, max: n - 1 }), fc.constant(n)));

  it('TOST: swapping the groups keeps p and mirrors the interval', () => {
    fc.assert(
      fc.property(rate, rate, fc.double({ min: 0.01, max: 0.3, noNaN: true }), ([x1, n1], [x2, n2], margin) => {
        const a = tostTwoProportions(x1, n1, x2, n2, margin);
        const b = tostTwoProportions(x2, n2, x1, n1, margin);
        return close(a.p, b.p, 1e-12) && close(a.interval!.lower, -b.interval!.upper, 1e-12) && a.interval!.lower <= a.estimate.value && a.estimate.value <= a.interval!.upper;
      }),
      params,
    );
  });

  it('exact binomial test: p in [0, 1] and its interval contains the rate', () => {
    fc.assert(
      fc.property(rate, fc.double({ min: 0.01, max: 0.99, noNaN: true }), fc.constantFrom('two-sided' as const, 'less' as const, 'greater' as const), ([x, n], p0, alt) => {
        fc.pre(n <= 300);
        const r = binomialExactTest(x, n, p0, { alternative: alt });
        return r.p >= 0 && r.p <= 1 && r.interval!.lower <= x / n && x / n <= r.interval!.upper;
      }),
      params,
    );
  });

  it('Wilson with continuity correction and Newcombe narrow as n grows at a fixed rate', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 200 }), fc.integer({ min: 0, max: 10 }), fc.integer({ min: 0, max: 10 }), (m, k, j) => {
        const cc1 = wilsonCcInterval(k * m, 10 * m).interval;
        const cc2 = wilsonCcInterval(2 * k * m, 20 * m).interval;
        const n1 = newcombeInterval(k * m, 10 * m, j * m, 10 * m);
        const n2 = newcombeInterval(2 * k * m, 20 * m, 2 * j * m, 20 * m);
        expect(cc2.upper - cc2.lower).toBeLessThan(cc1.upper - cc1.lower);
        expect(n2.upper - n2.lower).toBeLessThan(n1.upper - n1.lower);
      }),
      params,
    );
  });
});
