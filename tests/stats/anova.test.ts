/**
 * One-way ANOVA against GNU R's anova(lm(y ~ factor(g))) (fixture tests/fixtures/r/correlation.json, written by
 * tests/fixtures/r/correlation.R). NIST StRD certified values are checked in nist.test.ts.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { expectClose } from '../helpers/tolerance.js';
import { oneWayAnova } from '../../src/stats/anova-oneway.js';

interface AnovaRef {
  group: number[];
  y: number[];
  df_between: number;
  df_within: number;
  ss_between: number;
  ss_within: number;
  ms_between?: number;
  ms_within?: number;
  f: number;
  p: number;
}
const R = JSON.parse(readFileSync(new URL('../fixtures/r/correlation.json', import.meta.url), 'utf8')) as {
  r_version: string;
  anova: AnovaRef;
  anova_small: AnovaRef;
};

function groupsOf(ref: AnovaRef): number[][] {
  const groups: number[][] = [];
  ref.group.forEach((g, i) => (groups[g - 1] ??= []).push(ref.y[i]!));
  return groups;
}

describe(`one-way ANOVA against ${R.r_version} anova(lm())`, () => {
  for (const [name, ref] of [
    ['four unequal groups', R.anova],
    ['three groups of four', R.anova_small],
  ] as const) {
    it(name, () => {
      const res = oneWayAnova(groupsOf(ref));
      const t = res.table;
      // source: R anova(lm(y ~ factor(g)))
      expect(res.df).toEqual([ref.df_between, ref.df_within]);
      expectClose(t.between.ss, ref.ss_between, 'closed', 'between SS');
      expectClose(t.within.ss, ref.ss_within, 'closed', 'within SS');
      if (ref.ms_between !== undefined) expectClose(t.between.ms, ref.ms_between, 'closed', 'between MS');
      if (ref.ms_within !== undefined) expectClose(t.within.ms, ref.ms_within, 'closed', 'within MS');
      expectClose(res.statistic!.value, ref.f, 'closed', 'F');
      expectClose(res.p, ref.p, 'p', 'p');
      expect(res.n).toEqual(groupsOf(ref).map((g) => g.length));
      expectClose(res.estimate.value, ref.ss_between / (ref.ss_between + ref.ss_within), 'closed', 'R squared from R sums of squares');
    });
  }

  it('is unchanged by a large common offset (centred on group means)', () => {
    const groups = groupsOf(R.anova).map((g) => g.map((v) => v + 1e6));
    const res = oneWayAnova(groups);
    // source: R anova(lm()) on the unshifted data; the shift 1e6 is exact in binary for these 2-decimal values up to
    // the rounding of each sum, so 1e-9 relative is the bound here
    expectClose(res.statistic!.value, R.anova.f, 1e-9, 'F after offset');
  });
});

describe('one-way ANOVA: degenerate input', () => {
  it('throws clear errors', () => {
    expect(() => oneWayAnova([[1, 2, 3]])).toThrow(/at least 2 groups/);
    expect(() => oneWayAnova([[1, 2], []])).toThrow(/at least 1 value/);
    expect(() => oneWayAnova([[1], [2]])).toThrow(/more observations \(2\) than groups \(2\)/);
    expect(() => oneWayAnova([[4, 4], [4, 4]])).toThrow(/all values are equal/);
  });

  it('gives an infinite F with a warning when every group is constant', () => {
    const res = oneWayAnova([
      [1, 1],
      [2, 2],
    ]);
    expect(res.statistic!.value).toBe(Infinity);
    expect(res.p).toBe(0);
    expect(res.warnings).toHaveLength(1);
  });
});
