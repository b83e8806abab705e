import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { studentT, studentTRaw, summarize } from '../../src/stats/student-t.js';
import { welchT, welchTRaw } from '../../src/stats/welch-t.js';
import { mannWhitney } from '../../src/stats/mann-whitney.js';
import type { Alternative } from '../../src/stats/result.js';
import { expectClose } from '../helpers/tolerance.js';

type RAlternative = 'two.sided' | 'less' | 'greater';
interface TCase {
  x: number[];
  y: number[];
  var_equal: boolean;
  alternative: RAlternative;
  mu: number;
  conf_level: number;
  mean_x: number;
  mean_y: number;
  sd_x: number;
  sd_y: number;
  statistic: number;
  df: number;
  p: number;
  conf_int: Array<number | 'Inf' | '-Inf'>;
  stderr: number;
}
interface WCase {
  x: number[];
  y: number[];
  alternative: RAlternative;
  mu: number;
  statistic: number;
  p: number;
}
const fixture = JSON.parse(readFileSync(new URL('../fixtures/r/tables.json', import.meta.url), 'utf8')) as {
  ttest: TCase[];
  wilcox: WCase[];
};
const alt = (a: RAlternative): Alternative => (a === 'two.sided' ? 'two-sided' : a);
const bound = (v: number | 'Inf' | '-Inf'): number => (v === 'Inf' ? Infinity : v === '-Inf' ? -Infinity : v);

function checkBound(actual: number, expected: number, what: string): void {
  if (!Number.isFinite(expected)) expect(actual).toBe(expected);
  else expectClose(actual, expected, 'bound', what);
}

describe('t tests against R t.test', () => {
  // Source: GNU R 4.2 stats::t.test (var.equal TRUE and FALSE), fixture tests/fixtures/r/tables.R -> tables.json.
  fixture.ttest.forEach((c, k) => {
    const name = `case ${k + 1}: ${c.var_equal ? 'pooled' : 'Welch'}, ${c.alternative}, mu ${c.mu}, level ${c.conf_level}`;
    it(name, () => {
      const options = { alternative: alt(c.alternative), mu: c.mu, level: c.conf_level };
      const fromRaw = c.var_equal ? studentTRaw(c.x, c.y, options) : welchTRaw(c.x, c.y, options);
      const fromSummary = (c.var_equal ? studentT : welchT)(
        { mean: c.mean_x, sd: c.sd_x, n: c.x.length },
        { mean: c.mean_y, sd: c.sd_y, n: c.y.length },
        options,
      );
      for (const [label, r] of [['raw', fromRaw], ['summary', fromSummary]] as const) {
        expectClose(r.statistic.value, c.statistic, 'closed', `${label} t`);
        expectClose(r.df, c.df, 'closed', `${label} df`);
        expectClose(r.p, c.p, 'p', `${label} p`);
        expectClose(r.standardError, c.stderr, 'closed', `${label} standard error`);
        expectClose(r.estimate.value, c.mean_x - c.mean_y, 'closed', `${label} difference`);
        checkBound(r.interval.lower, bound(c.conf_int[0] as number), `${label} lower`);
        checkBound(r.interval.upper, bound(c.conf_int[1] as number), `${label} upper`);
        expect(r.interval.level).toBe(c.conf_level);
        expect(r.nullValue).toBe(c.mu);
      }
    });
  });

  it('summarize gives the mean and sample standard deviation R gives', () => {
    for (const c of fixture.ttest.slice(0, 1)) {
      const s = summarize(c.x, 'first', 'test');
      // Source: R mean() and sd() in the same fixture.
      expectClose(s.mean, c.mean_x, 'closed', 'mean');
      expectClose(s.sd, c.sd_x, 'closed', 'sd');
    }
  });

  it('rejects input it cannot test, saying what is wrong', () => {
    expect(() => welchT({ mean: 1, sd: 1, n: 1 }, { mean: 2, sd: 1, n: 5 })).toThrow(/first group has n = 1/);
    expect(() => studentT({ mean: 1, sd: 0, n: 1 }, { mean: 2, sd: 1, n: 1 })).toThrow(/at least 3/);
    expect(() => welchT({ mean: 1, sd: -1, n: 4 }, { mean: 2, sd: 1, n: 5 })).toThrow(/standard deviation is -1/);
    expect(() => welchTRaw([1, 1, 1], [1, 1])).toThrow(/standard error is zero/);
    expect(() => studentTRaw([1, Number.NaN], [1, 2])).toThrow(/value 2 of the first group is NaN/);
    expect(() => welchTRaw([1, 2], [1, 3], { level: 95 })).toThrow(/confidence level 95/);
    expect(() => welchTRaw([], [1, 3])).toThrow(/first group has no values/);
  });
});

describe('mannWhitney against R wilcox.test(exact = FALSE, correct = TRUE)', () => {
  // Source: GNU R 4.2 stats::wilcox.test, fixture tests/fixtures/r/tables.R -> tables.json.
  fixture.wilcox.forEach((c, k) => {
    it(`case ${k + 1}: ${c.alternative}, mu ${c.mu}`, () => {
      const r = mannWhitney(c.x, c.y, { alternative: alt(c.alternative), mu: c.mu });
      expectClose(r.statistic.value, c.statistic, 'closed', 'W');
      expectClose(r.p, c.p, 'p', 'p');
      expectClose(r.estimate.value, c.statistic / (c.x.length * c.y.length), 'closed', 'W / (n1 n2)');
    });
  });

  it('rejects input it cannot test', () => {
    expect(() => mannWhitney([], [1])).toThrow(/first group has no values/);
    expect(() => mannWhitney([3, 3], [3, 3, 3])).toThrow(/every value is the same/);
    expect(() => mannWhitney([1, Infinity], [2])).toThrow(/value 2 of the first group/);
  });
});

describe('two-sample properties', () => {
  const sample = fc.array(fc.integer({ min: 1, max: 5 }), { minLength: 3, maxLength: 30 });
  const alternative = fc.constantFrom<Alternative>('two-sided', 'less', 'greater');
  const nonConstant = (x: number[], y: number[]): boolean => new Set([...x, ...y]).size > 1 && new Set(x).size + new Set(y).size > 2;

  it('swapping the groups flips the sign of the difference and keeps the two-sided p (Welch, pooled)', () => {
    fc.assert(
      fc.property(sample, sample, (x, y) => {
        fc.pre(new Set(x).size > 1 && new Set(y).size > 1);
        for (const test of [welchTRaw, studentTRaw]) {
          const a = test(x, y);
          const b = test(y, x);
          if (Math.abs(a.estimate.value + b.estimate.value) > 1e-12) return false;
          if (Math.abs(a.p - b.p) > 1e-12 * Math.max(1, a.p)) return false;
          if (!(a.p >= 0 && a.p <= 1)) return false;
        }
        return true;
      }),
      { seed: 20260117, numRuns: 200 },
    );
  });

  it('swapping the groups keeps the two-sided rank-sum p and exchanges the one-sided ones', () => {
    fc.assert(
      fc.property(sample, sample, alternative, (x, y, a) => {
        fc.pre(nonConstant(x, y));
        const forward = mannWhitney(x, y, { alternative: a });
        const mirrored: Alternative = a === 'less' ? 'greater' : a === 'greater' ? 'less' : 'two-sided';
        const back = mannWhitney(y, x, { alternative: mirrored });
        return (
          forward.p >= 0 &&
          forward.p <= 1 &&
          Math.abs(forward.p - back.p) <= 1e-12 &&
          forward.statistic.value + back.statistic.value === x.length * y.length
        );
      }),
      { seed: 20260118, numRuns: 300 },
    );
  });

  it('one-sided t p-values of opposite alternatives add to 1', () => {
    fc.assert(
      fc.property(sample, sample, (x, y) => {
        fc.pre(new Set(x).size > 1 && new Set(y).size > 1);
        const less = welchTRaw(x, y, { alternative: 'less' }).p;
        const greater = welchTRaw(x, y, { alternative: 'greater' }).p;
        return Math.abs(less + greater - 1) < 1e-12;
      }),
      { seed: 20260119, numRuns: 200 },
    );
  });
});
