/**
 * Methods for rates against GNU R 4.2 (tests/fixtures/r/proportions.R writes tests/fixtures/r/proportions.json):
 * prop.test (one and two samples), power.prop.test, and the published formulas written out in that script for
 * Wilson with FPC, continuity-corrected Wilson, Newcombe's hybrid interval, Cohen's h and TOST.
 * Methods that need the binomial and hypergeometric distributions are in proportions-exact.test.ts.
 */
import { describe, expect, it } from 'vitest';
import { expectClose } from '../helpers/tolerance.js';
import { describeRow, fixture, num, optNum } from './proportions-fixture.js';
import type { Alternative } from '../../src/stats/result.js';
import { wilson, wilsonInterval } from '../../src/stats/wilson.js';
import { wilsonCcInterval } from '../../src/stats/wilson-cc.js';
import { clopperPearsonInterval } from '../../src/stats/clopper-pearson.js';
import { oneSampleScoreTest } from '../../src/stats/one-sample-score.js';
import { twoProportionZTest } from '../../src/stats/two-proportion-z.js';
import { newcombeInterval } from '../../src/stats/newcombe.js';
import { cohensH, cohensHLabel } from '../../src/stats/cohens-h.js';
import { minDetectableDifference, powerTwoProportions, type Sided } from '../../src/stats/power-two-proportions.js';
import { tostTwoProportions } from '../../src/stats/tost-two-proportions.js';

describe('proportions fixture', () => {
  it('was written by R 4.2', () => {
    expect(fixture.r_version).toMatch(/^R version 4\.2/);
  });
});

describe('wilsonInterval against the score-equation roots found in R (uniroot)', () => {
  it.each(fixture.wilson.map((r) => [describeRow(r), r] as const))('%s', (_, r) => {
    const population = optNum(r, 'population');
    const est = wilsonInterval(num(r, 'x'), num(r, 'n'), {
      level: num(r, 'level'),
      ...(population !== undefined ? { populationSize: population } : {}),
    });
    // R 4.2: uniroot of p - phat -/+ sqrt(k p (1 - p)), k = z^2 (N - n)/((N - 1) n).
    expectClose(est.interval.lower, num(r, 'lower'), 'closed', 'lower');
    expectClose(est.interval.upper, num(r, 'upper'), 'closed', 'upper');
    expect(est.interval.method).toBe(population === undefined ? 'wilson' : 'wilson-fpc');
  });
});

describe('wilsonCcInterval against Newcombe (1998) method 4 as written in R', () => {
  const rows = fixture.wilson.filter((r) => r.population === null);
  it.each(rows.map((r) => [describeRow(r), r] as const))('%s', (_, r) => {
    const est = wilsonCcInterval(num(r, 'x'), num(r, 'n'), { level: num(r, 'level') });
    // R 4.2: Newcombe's printed formulas for method 4 (tests/fixtures/r/proportions.R, wilson_cc).
    expectClose(est.interval.lower, num(r, 'cc_lower'), 'closed', 'lower');
    expectClose(est.interval.upper, num(r, 'cc_upper'), 'closed', 'upper');
  });

  it('equals the interval of R prop.test(correct = TRUE) whenever its correction is the full 1/2', () => {
    const rows = fixture.one_sample.filter(
      (r) => r.correct === true && r.alternative === 'two-sided' && Math.abs(num(r, 'x') - num(r, 'n') * num(r, 'p0')) >= 0.5,
    );
    expect(rows.length).toBeGreaterThan(50);
    for (const r of rows) {
      const est = wilsonCcInterval(num(r, 'x'), num(r, 'n'), { level: num(r, 'level') });
      // R 4.2 prop.test(x, n, p0, correct = TRUE)$conf.int
      expectClose(est.interval.lower, num(r, 'conf_low'), 'closed', `lower ${describeRow(r)}`);
      expectClose(est.interval.upper, num(r, 'conf_high'), 'closed', `upper ${describeRow(r)}`);
    }
  });
});

describe('Clopper-Pearson interval against R binom.test()$conf.int (two-sided rows)', () => {
  const rows = fixture.binom.filter((r) => r.alternative === 'two-sided' && r.p0 === 0.5);
  it.each(rows.map((r) => [describeRow(r), r] as const))('%s', (_, r) => {
    const est = clopperPearsonInterval(num(r, 'x'), num(r, 'n'), { level: num(r, 'level') });
    // R 4.2 binom.test(x, n, conf.level = level)$conf.int (qbeta)
    expectClose(est.interval.lower, num(r, 'conf_low'), 'bound', 'lower');
    expectClose(est.interval.upper, num(r, 'conf_high'), 'bound', 'upper');
  });
});

describe('oneSampleScoreTest against R prop.test(x, n, p0)', () => {
  it.each(fixture.one_sample.map((r) => [describeRow(r), r] as const))('%s', (_, r) => {
    const res = oneSampleScoreTest(num(r, 'x'), num(r, 'n'), num(r, 'p0'), {
      alternative: r.alternative as Alternative,
      correct: r.correct as boolean,
      level: num(r, 'level'),
    });
    const z = res.statistic!.value;
    // R 4.2 prop.test: statistic X-squared = z^2, p.value, conf.int, estimate
    expectClose(z * z, num(r, 'statistic'), 'closed', 'z^2');
    expectClose(res.p, num(r, 'p_value'), 'p', 'p');
    expectClose(res.interval!.lower, num(r, 'conf_low'), 'closed', 'lower');
    expectClose(res.interval!.upper, num(r, 'conf_high'), 'closed', 'upper');
    expectClose(res.estimate.value, num(r, 'estimate'), 'closed', 'estimate');
  });
});

describe('twoProportionZTest against R prop.test(c(x1, x2), c(n1, n2))', () => {
  it.each(fixture.two_sample.map((r) => [describeRow(r), r] as const))('%s', (_, r) => {
    const res = twoProportionZTest(num(r, 'x1'), num(r, 'n1'), num(r, 'x2'), num(r, 'n2'), {
      alternative: r.alternative as Alternative,
      correct: r.correct as boolean,
      level: num(r, 'level'),
      interval: 'wald',
    });
    const z = res.statistic!.value;
    // R 4.2 prop.test: X-squared = z^2, p.value, and its Wald conf.int
    expectClose(z * z, num(r, 'statistic'), 'closed', 'z^2');
    expectClose(res.p, num(r, 'p_value'), 'p', 'p');
    expectClose(res.interval!.lower, num(r, 'conf_low'), 'closed', 'lower');
    expectClose(res.interval!.upper, num(r, 'conf_high'), 'closed', 'upper');
  });

  it('reports the Newcombe interval by default, matching newcombeInterval at the same level', () => {
    const res = twoProportionZTest(56, 70, 48, 80);
    const r = fixture.newcombe.find((row) => row.x1 === 56 && row.level === 0.95 && row.population1 === null)!;
    // R 4.2: Newcombe (1998) method 10 as written in tests/fixtures/r/proportions.R
    expectClose(res.interval!.lower, num(r, 'lower'), 'closed', 'lower');
    expectClose(res.interval!.upper, num(r, 'upper'), 'closed', 'upper');
    expect(res.interval!.method).toBe('newcombe-hybrid');
  });

  it('one-sided Newcombe bound equals the two-sided bound at level 2c - 1', () => {
    const r = fixture.newcombe.find((row) => row.x1 === 61 && row.level === 0.9 && row.population1 === null)!;
    const res = twoProportionZTest(61, 85, 62, 92, { alternative: 'less', level: 0.95 });
    // R 4.2: Newcombe (1998) method 10 at 90%, upper bound
    expectClose(res.interval!.upper, num(r, 'upper'), 'closed', 'upper');
    expect(res.interval!.lower).toBe(-1);
  });

  it('throws a clear error when the pooled rate is 0 or 1', () => {
    expect(() => twoProportionZTest(0, 10, 0, 20)).toThrow(/every answer in both groups is the same/);
  });
});

describe('newcombeInterval against Newcombe (1998) method 10 as written in R', () => {
  it.each(fixture.newcombe.map((r) => [describeRow(r), r] as const))('%s', (_, r) => {
    const p1 = optNum(r, 'population1');
    const p2 = optNum(r, 'population2');
    const iv = newcombeInterval(num(r, 'x1'), num(r, 'n1'), num(r, 'x2'), num(r, 'n2'), {
      level: num(r, 'level'),
      populationSize1: p1,
      populationSize2: p2,
    });
    expectClose(iv.lower, num(r, 'lower'), 'closed', 'lower');
    expectClose(iv.upper, num(r, 'upper'), 'closed', 'upper');
    expect(iv.method).toBe(p1 === undefined ? 'newcombe-hybrid' : 'newcombe-hybrid-fpc');
  });
});

describe('powerTwoProportions against R power.prop.test(n, p1, p2)$power', () => {
  it.each(fixture.power.map((r) => [describeRow(r), r] as const))('%s', (_, r) => {
    const n = num(r, 'n');
    const pw = powerTwoProportions(n, n, num(r, 'p1'), num(r, 'p2'), {
      alpha: num(r, 'alpha'),
      sided: r.sided as Sided,
      strict: r.strict as boolean,
    });
    expectClose(pw, num(r, 'power'), 'closed', 'power');
  });
});

describe('minDetectableDifference against R power.prop.test(n, p1, power, tol = 1e-14)$p2 - p1', () => {
  it.each(fixture.detectable.map((r) => [describeRow(r), r] as const))('%s', (_, r) => {
    const n = num(r, 'n');
    const dd = minDetectableDifference(n, n, num(r, 'base'), { alpha: num(r, 'alpha'), power: num(r, 'power'), sided: r.sided as Sided });
    for (const side of ['increase', 'decrease'] as const) {
      const expected = optNum(r, side);
      if (expected === undefined) expect(dd[side]).toBeNull();
      else expectClose(dd[side]!, expected, 'bound', side);
    }
  });
});

describe("cohensH against 2 asin(sqrt p1) - 2 asin(sqrt p2) evaluated in R (Cohen 1988, ch. 6)", () => {
  it.each(fixture.cohens_h.map((r) => [describeRow(r), r] as const))('%s', (_, r) => {
    expectClose(cohensH(num(r, 'p1'), num(r, 'p2')), num(r, 'h'), 'closed', 'h');
  });
  it("labels |h| by Cohen's (1988) conventions 0.2, 0.5, 0.8 (from memory)", () => {
    expect(cohensHLabel(0.1)).toBe('negligible');
    expect(cohensHLabel(-0.3)).toBe('small');
    expect(cohensHLabel(0.5)).toBe('medium');
    expect(cohensHLabel(-0.81)).toBe('large');
  });
  it('rejects a rate outside [0, 1]', () => {
    expect(() => cohensH(1.2, 0.5)).toThrow(/p1 must be a proportion/);
  });
});

describe('tostTwoProportions against the Schuirmann (1987) TOST with unpooled z, with and without the finite-population correction (Cochran 1977, §3.3), written in R', () => {
  it.each(fixture.tost.map((r) => [describeRow(r), r] as const))('%s', (_, r) => {
    const res = tostTwoProportions(num(r, 'x1'), num(r, 'n1'), num(r, 'x2'), num(r, 'n2'), num(r, 'margin'), {
      alpha: num(r, 'alpha'),
      ...(r.population1 !== null ? { populationSize1: num(r, 'population1'), populationSize2: num(r, 'population2') } : {}),
    });
    expectClose(res.lowerTest.z, num(r, 'z_lower'), 'closed', 'z lower');
    expectClose(res.upperTest.z, num(r, 'z_upper'), 'closed', 'z upper');
    expectClose(res.lowerTest.p, num(r, 'p_lower'), 'p', 'p lower');
    expectClose(res.upperTest.p, num(r, 'p_upper'), 'p', 'p upper');
    expectClose(res.p, num(r, 'p_value'), 'p', 'p');
    expectClose(res.interval!.lower, num(r, 'conf_low'), 'closed', 'lower');
    expectClose(res.interval!.upper, num(r, 'conf_high'), 'closed', 'upper');
    expectClose(res.interval!.level, 1 - 2 * num(r, 'alpha'), 'closed', 'level');
  });
});

describe('degenerate input', () => {
  it('throws clear errors instead of returning NaN', () => {
    expect(() => wilson(3, 0)).toThrow(/number who answered \(n\) must be above 0/);
    expect(() => wilson(11, 10)).toThrow(/between 0 and n = 10/);
    expect(() => wilson(3, 10, 1)).toThrow(/confidence level/);
    expect(() => wilson(3, 10, 0.95, 8)).toThrow(/population size must be at least/);
    expect(() => clopperPearsonInterval(2.5, 10)).toThrow(/whole numbers/);
    expect(() => oneSampleScoreTest(3, 10, 1)).toThrow(/strictly between 0 and 1/);
    expect(() => tostTwoProportions(0, 10, 0, 12, 0.05)).toThrow(/standard error is 0/);
    expect(() => tostTwoProportions(3, 10, 4, 12, 0.05, { populationSize1: 9 })).toThrow(/number eligible must be at least/);
    expect(() => powerTwoProportions(10, 10, 0, 0)).toThrow(/power is undefined/);
    expect(() => minDetectableDifference(10, 10, 1.2)).toThrow(/base rate/);
  });

  it('TOST on two censuses: the difference is known exactly, so each one-sided test is decided outright', () => {
    // Everyone eligible answered in both groups (f = 0, Cochran 1977, §3.3): 30/40 against 28/40, a gap of 5 points.
    const inside = tostTwoProportions(30, 40, 28, 40, 0.06, { populationSize1: 40, populationSize2: 40 });
    expect(inside.p).toBe(0);
    expect(inside.interval!.lower).toBeCloseTo(0.05, 12);
    expect(inside.interval!.upper).toBeCloseTo(0.05, 12);
    const beyond = tostTwoProportions(30, 40, 28, 40, 0.04, { populationSize1: 40, populationSize2: 40 });
    expect(beyond.p).toBe(1);
  });

  it('collapses the FPC interval to the observed rate when everyone answered (census)', () => {
    const est = wilson(30, 40, 0.95, 40);
    expect(est.interval.lower).toBe(0.75);
    expect(est.interval.upper).toBe(0.75);
  });
});
