/**
 * Partial rank correlations against GNU R 4.2.2 in base R (tests/fixtures/r/partial-rank.R -> partial-rank.json):
 * partial Spearman as the correlation of lm() residuals of the ranks, its t and p from summary(lm()) of rank(y) on
 * rank(x) and the controls' ranks (one-sided p by pt()); partial Kendall from three cor(method = "kendall") values
 * and Kendall's (1942) formula.
 */
import { readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { partialSpearman } from '../../src/stats/partial-spearman.js';
import { partialKendall } from '../../src/stats/partial-kendall.js';
import { partialCorrelation } from '../../src/stats/partial-correlation.js';
import type { Alternative } from '../../src/stats/result.js';
import { expectClose } from '../helpers/tolerance.js';

interface Fixture {
  r_version: string;
  sets: Record<string, { x: number[]; y: number[]; z: Record<string, number[]> }>;
  spearman: Array<{ set: string; controls: string[]; alternative: Alternative; estimate: number; t: number; df: number; p: number }>;
  kendall: Array<{ set: string; control: string; txy: number; txz: number; tyz: number; estimate: number }>;
}
const R: Fixture = JSON.parse(readFileSync(join(resolve(__dirname, '../..'), 'tests/fixtures/r/partial-rank.json'), 'utf8'));

describe('partial Spearman rho (R 4.2.2: lm residuals of ranks, summary.lm t)', () => {
  it('the fixture came from R 4.2.2 and covers 1 to 3 controls, ties and a small set', () => {
    expect(R.r_version).toMatch(/^R version 4\.2\.2/);
    expect(new Set(R.spearman.map((r) => r.controls.length))).toEqual(new Set([1, 2, 3]));
    expect(R.spearman.length).toBe(21);
  });
  for (const row of R.spearman) {
    it(`${row.set}, controls ${row.controls.join('+')}, ${row.alternative}`, () => {
      const s = R.sets[row.set]!;
      const res = partialSpearman(s.x, s.y, row.controls.map((c) => s.z[c]!), { alternative: row.alternative });
      expect(res.method).toBe('partial-spearman');
      expect(res.df).toBe(row.df);
      expectClose(res.estimate.value, row.estimate, 'closed', 'partial rho');
      expectClose(res.statistic?.value ?? NaN, row.t, 'statistic', 't');
      expectClose(res.p, row.p, 'p', 'p');
      expect(res.interval).toBeUndefined();
    });
  }
  it('differs from the partial correlation of the values when the relation is not straight', () => {
    const s = R.sets.rates!;
    const values = partialCorrelation(s.x, s.y, [s.z.z1!]).estimate.value;
    const ranks = partialSpearman(s.x, s.y, [s.z.z1!]).estimate.value;
    expect(Math.abs(values - ranks)).toBeGreaterThan(1e-3);
  });
  it('warns that the p-value is rough with few units, and refuses bad input', () => {
    const s = R.sets.small!;
    expect(partialSpearman(s.x, s.y, [s.z.z1!]).warnings.join(' ')).toMatch(/rough/);
    expect(() => partialSpearman([1, 2, 3, 4], [2, 1, 4, 3], [])).toThrow(/at least one control/);
    expect(() => partialSpearman([1, 2, NaN, 4, 5], [2, 1, 4, 3, 5], [[1, 2, 3, 4, 5]])).toThrow(/not a finite number/);
    expect(() => partialSpearman([1, 2, 3, 4, 5], [2, 1, 4, 3, 5], [[1, 2, 3]])).toThrow(/3 values for 5 pairs/);
    // y's ranks are exactly the control's: nothing left to correlate.
    expect(() => partialSpearman([1, 3, 2, 5, 4], [10, 20, 30, 40, 50], [[1, 2, 3, 4, 5]])).toThrow(/fully explained|exactly 0/);
  });
});

describe("partial Kendall tau (R 4.2.2 cor(method = 'kendall') and Kendall's 1942 formula)", () => {
  for (const row of R.kendall) {
    it(`${row.set}, control ${row.control}`, () => {
      const s = R.sets[row.set]!;
      const res = partialKendall(s.x, s.y, s.z[row.control]!);
      expect(res.method).toBe('partial-kendall');
      expectClose(res.taus.xy, row.txy, 'closed', 'tau xy');
      expectClose(res.taus.xz, row.txz, 'closed', 'tau xz');
      expectClose(res.taus.yz, row.tyz, 'closed', 'tau yz');
      expectClose(res.estimate.value, row.estimate, 'closed', 'partial tau');
    });
  }
  it('has no p-value, and refuses a control in the same order as x', () => {
    const s = R.sets.continuous!;
    expect(Object.keys(partialKendall(s.x, s.y, s.z.z1!))).not.toContain('p');
    expect(() => partialKendall([1, 2, 3, 4, 5], [2, 1, 4, 3, 5], [10, 20, 30, 40, 50])).toThrow(/x is in the same order as the control/);
    expect(() => partialKendall([1, 2, 3], [2, 1, 3], [1, 2])).toThrow(/2 values for 3 pairs/);
  });
});
