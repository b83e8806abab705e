/**
 * Exact methods for rates against GNU R 4.2 (tests/fixtures/r/proportions.R writes proportions.json):
 * binom.test (p-value by R's two-sided rule, Clopper-Pearson interval, all alternatives) and fisher.test on 2x2
 * tables (all alternatives).
 */
import { describe, expect, it } from 'vitest';
import { expectClose } from '../helpers/tolerance.js';
import { describeRow, fixture, num } from './proportions-fixture.js';
import type { Alternative } from '../../src/stats/result.js';
import { binomialExactTest } from '../../src/stats/binomial-exact.js';
import { fisherExact2x2 } from '../../src/stats/fisher-exact-2x2.js';
import { newcombeInterval } from '../../src/stats/newcombe.js';

describe('binomialExactTest against R binom.test(x, n, p0)', () => {
  it.each(fixture.binom.map((r) => [describeRow(r), r] as const))('%s', (_, r) => {
    const res = binomialExactTest(num(r, 'x'), num(r, 'n'), num(r, 'p0'), {
      alternative: r.alternative as Alternative,
      level: num(r, 'level'),
    });
    // R 4.2 binom.test: p.value and conf.int (qbeta)
    expectClose(res.p, num(r, 'p_value'), 'p', 'p');
    expectClose(res.interval!.lower, num(r, 'conf_low'), 'bound', 'lower');
    expectClose(res.interval!.upper, num(r, 'conf_high'), 'bound', 'upper');
  });

  it('rejects fractional counts', () => {
    expect(() => binomialExactTest(2.5, 10, 0.5)).toThrow(/whole numbers/);
  });
});

describe('fisherExact2x2 against R fisher.test(matrix(c(x1, x2, n1 - x1, n2 - x2), 2))', () => {
  it.each(fixture.fisher.map((r) => [describeRow(r), r] as const))('%s', (_, r) => {
    const x1 = num(r, 'x1');
    const n1 = num(r, 'n1');
    const x2 = num(r, 'x2');
    const n2 = num(r, 'n2');
    const res = fisherExact2x2(x1, n1 - x1, x2, n2 - x2, r.alternative as Alternative);
    // R 4.2 fisher.test(...)$p.value
    expectClose(res.p, num(r, 'p_value'), 'p', 'p');
    expect(res.estimate.value).toBe(x1 / n1 - x2 / n2);
    expect(res.n).toEqual([n1, n2]);
  });

  it('reports the Newcombe interval for the difference (R 4.2 formula in proportions.R)', () => {
    const r = fixture.newcombe.find((row) => row.x1 === 9 && row.level === 0.95 && row.population1 === null)!;
    const res = fisherExact2x2(9, 1, 3, 7);
    expectClose(res.interval!.lower, num(r, 'lower'), 'closed', 'lower');
    expectClose(res.interval!.upper, num(r, 'upper'), 'closed', 'upper');
    expect(newcombeInterval(9, 10, 3, 10).lower).toBe(res.interval!.lower);
  });

  it('swapping the groups keeps the two-sided p and swaps the one-sided ones (R 4.2 fixture rows)', () => {
    for (const r of fixture.fisher.filter((row) => row.alternative === 'less')) {
      const x1 = num(r, 'x1');
      const n1 = num(r, 'n1');
      const x2 = num(r, 'x2');
      const n2 = num(r, 'n2');
      const swapped = fisherExact2x2(x2, n2 - x2, x1, n1 - x1, 'greater');
      expectClose(swapped.p, num(r, 'p_value'), 'p', describeRow(r));
    }
  });

  it('rejects negative or fractional cells', () => {
    expect(() => fisherExact2x2(-1, 3, 2, 2)).toThrow(/cell a must be a whole number/);
    expect(() => fisherExact2x2(1, 3, 2.5, 2)).toThrow(/cell c must be a whole number/);
  });
});
