/**
 * Properties of the rate methods that hold for every input (fast-check, seeded so failures reproduce):
 * p-values lie in [0, 1]; intervals contain their estimate; swapping the groups flips the sign of the estimate
 * and keeps the two-sided p-value; intervals narrow as n grows at a fixed rate. These are mathematical facts of
 * the methods (common practice as checks), not reference values; the reference checks are in proportions.test.ts.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { wilsonInterval } from '../../src/stats/wilson.js';
import { wilsonCcInterval } from '../../src/stats/wilson-cc.js';
import { clopperPearsonInterval } from '../../src/stats/clopper-pearson.js';
import { oneSampleScoreTest } from '../../src/stats/one-sample-score.js';
import { twoProportionZTest } from '../../src/stats/two-proportion-z.js';
import { newcombeInterval } from '../../src/stats/newcombe.js';
import { cohensH } from '../../src/stats/cohens-h.js';
import { tostTwoProportions } from '../../src/stats/tost-two-proportions.js';
import { powerTwoProportions } from '../../src/stats/power-two-proportions.js';

const params = { seed: 20260513, numRuns: 300 };

/** A count x of n with 1 <= n <= 5000. */
const rate = fc.integer({ min: 1, max: 5000 }).chain((n) => fc.tuple(fc.integer({ min: 0, max: n }), fc.constant(n)));
const level = fc.constantFrom(0.8, 0.9, 0.95, 0.99);
const alternative = fc.constantFrom('two-sided' as const, 'less' as const, 'greater' as const);

describe('single-rate intervals', () => {
  it('lie in [0, 1] and contain the observed rate (Wilson, Wilson with FPC, Wilson CC, Clopper-Pearson)', () => {
    fc.assert(
      fc.property(rate, level, fc.integer({ min: 0, max: 10000 }), ([x, n], lv, extra) => {
        const p = x / n;
        const ests = [
          wilsonInterval(x, n, { level: lv }),
          wilsonInterval(x, n, { level: lv, populationSize: Math.max(n + extra, 2) }),
          wilsonCcInterval(x, n, { level: lv }),
          clopperPearsonInterval(x, n, { level: lv }),
        ];
        for (const e of ests) {
          expect(e.interval.lower).toBeGreaterThanOrEqual(0);
          expect(e.interval.upper).toBeLessThanOrEqual(1);
          expect(e.interval.lower).toBeLessThanOrEqual(p);
          expect(e.interval.upper).toBeGreaterThanOrEqual(p);
        }
      }),
      params,
    );
  });

  it('narrow as n grows at a fixed rate, and the FPC interval is never wider than the plain one', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 200 }), fc.integer({ min: 0, max: 10 }), level, (m, k, lv) => {
        // rate k/10 with n = 10 m and n = 20 m
        const small = wilsonInterval(k * m, 10 * m, { level: lv }).interval;
        const large = wilsonInterval(2 * k * m, 20 * m, { level: lv }).interval;
        expect(large.upper - large.lower).toBeLessThan(small.upper - small.lower);
        const cpSmall = clopperPearsonInterval(k * m, 10 * m, { level: lv }).interval;
        const cpLarge = clopperPearsonInterval(2 * k * m, 20 * m, { level: lv }).interval;
        expect(cpLarge.upper - cpLarge.lower).toBeLessThan(cpSmall.upper - cpSmall.lower);
        const fpc = wilsonInterval(k * m, 10 * m, { level: lv, populationSize: 15 * m }).interval;
        expect(fpc.upper - fpc.lower).toBeLessThanOrEqual(small.upper - small.lower);
      }),
      params,
    );
  });

  it('score test p-values lie in [0, 1] and its interval contains the observed rate', () => {
    fc.assert(
      fc.property(rate, fc.double({ min: 0.01, max: 0.99, noNaN: true }), alternative, fc.boolean(), ([x, n], p0, alt, correct) => {
        const r = oneSampleScoreTest(x, n, p0, { alternative: alt, correct });
        expect(r.p).toBeGreaterThanOrEqual(0);
        expect(r.p).toBeLessThanOrEqual(1);
        expect(r.interval!.lower).toBeLessThanOrEqual(x / n);
        expect(r.interval!.upper).toBeGreaterThanOrEqual(x / n);
      }),
      params,
    );
  });
});

describe('two-rate methods', () => {
  it('swapping the groups flips the estimate, the interval and Cohen\'s h, and keeps the two-sided p-value', () => {
    fc.assert(
      fc.property(rate, rate, level, ([x1, n1], [x2, n2], lv) => {
        fc.pre(x1 + x2 > 0 && x1 + x2 < n1 + n2);
        const ab = twoProportionZTest(x1, n1, x2, n2, { level: lv });
        const ba = twoProportionZTest(x2, n2, x1, n1, { level: lv });
        expect(ba.estimate.value).toBe(-ab.estimate.value);
        expect(ba.statistic!.value).toBeCloseTo(-ab.statistic!.value, 12);
        expect(Math.abs(ba.p - ab.p)).toBeLessThanOrEqual(1e-12 * Math.max(ab.p, 1e-300));
        expect(ba.interval!.lower).toBeCloseTo(-ab.interval!.upper, 14);
        expect(ba.interval!.upper).toBeCloseTo(-ab.interval!.lower, 14);
        expect(cohensH(x2 / n2, x1 / n1)).toBe(-cohensH(x1 / n1, x2 / n2));
        // one-sided p-values of opposite alternatives swap
        const less = twoProportionZTest(x1, n1, x2, n2, { alternative: 'less' });
        const greaterSwapped = twoProportionZTest(x2, n2, x1, n1, { alternative: 'greater' });
        expect(greaterSwapped.p).toBeCloseTo(less.p, 12);
      }),
      params,
    );
  });

  it('p-values lie in [0, 1], the Newcombe interval contains the difference and lies in [-1, 1]', () => {
    fc.assert(
      fc.property(rate, rate, alternative, fc.boolean(), ([x1, n1], [x2, n2], alt, correct) => {
        fc.pre(x1 + x2 > 0 && x1 + x2 < n1 + n2);
        const r = twoProportionZTest(x1, n1, x2, n2, { alternative: alt, correct });
        expect(r.p).toBeGreaterThanOrEqual(0);
        expect(r.p).toBeLessThanOrEqual(1);
        const d = x1 / n1 - x2 / n2;
        const iv = newcombeInterval(x1, n1, x2, n2);
        expect(iv.lower).toBeGreaterThanOrEqual(-1);
        expect(iv.upper).toBeLessThanOrEqual(1);
        expect(iv.lower).toBeLessThanOrEqual(d + 1e-15);
        expect(iv.upper).toBeGreaterThanOrEqual(d - 1e-15);
      }),
      params,
    );
  });

  it('TOST p is the larger one-sided p, in [0, 1], and below alpha exactly when the 1 - 2 alpha interval is inside the margin', () => {
    fc.assert(
      fc.property(rate, rate, fc.double({ min: 0.005, max: 0.3, noNaN: true }), ([x1, n1], [x2, n2], margin) => {
        fc.pre(x1 > 0 && x1 < n1 && x2 > 0 && x2 < n2);
        const r = tostTwoProportions(x1, n1, x2, n2, margin);
        expect(r.p).toBe(Math.max(r.lowerTest.p, r.upperTest.p));
        expect(r.p).toBeGreaterThanOrEqual(0);
        expect(r.p).toBeLessThanOrEqual(1);
        const inside = r.interval!.lower > -margin && r.interval!.upper < margin;
        // skip the knife edge where rounding decides
        fc.pre(Math.abs(r.p - 0.05) > 1e-9);
        expect(r.p < 0.05).toBe(inside);
      }),
      params,
    );
  });

  it('power grows with the group size and with the gap', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 5, max: 2000 }),
        fc.double({ min: 0.05, max: 0.75, noNaN: true }),
        fc.double({ min: 0.01, max: 0.1, noNaN: true }),
        (n, p2, gap) => {
          const a = powerTwoProportions(n, n, p2 + gap, p2);
          expect(powerTwoProportions(2 * n, 2 * n, p2 + gap, p2)).toBeGreaterThan(a);
          expect(powerTwoProportions(n, n, p2 + 2 * gap, p2)).toBeGreaterThan(a);
        },
      ),
      params,
    );
  });
});
