/**
 * Exact permutation p-values of Spearman's rho and Kendall's tau for a few untied units (src/stats/rank-exact.ts),
 * against GNU R's cor.test with its default exact p-values (tests/fixtures/r/rank-exact.R -> rank-exact.json:
 * AS 89's exact evaluation for Spearman with n <= 9, the exact concordance distribution for Kendall).
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { EXACT_MAX_UNITS, exactRankPValues } from '../../src/stats/rank-exact.js';
import type { Alternative } from '../../src/stats/result.js';
import { expectClose } from '../helpers/tolerance.js';

interface Row {
  n: number;
  x: number[];
  y: number[];
  alternative: Alternative;
  rho: number;
  spearman_p: number;
  tau: number;
  kendall_p: number;
}
const R = JSON.parse(readFileSync(join(__dirname, '../fixtures/r/rank-exact.json'), 'utf8')) as { rows: Row[] };

describe('exact rank-correlation p-values against R cor.test (exact)', () => {
  it.each(R.rows.map((r, i) => [`${i}: n = ${r.n}, ${r.alternative}, rho = ${r.rho.toFixed(3)}`, r] as const))('%s', (_, r) => {
    const got = exactRankPValues(r.x, r.y, r.alternative);
    expect(got).toBeDefined();
    expectClose(got!.spearman, r.spearman_p, 'p', 'Spearman exact p (R cor.test, AS 89)');
    expectClose(got!.kendall, r.kendall_p, 'p', 'Kendall exact p (R cor.test)');
  });

  it('four units in perfect order: two-sided p = 2/24 for both (R cor.test gives 0.08333)', () => {
    const got = exactRankPValues([1, 2, 3, 4], [10, 20, 30, 40], 'two-sided');
    expect(got?.spearman).toBeCloseTo(2 / 24, 15);
    expect(got?.kendall).toBeCloseTo(2 / 24, 15);
  });

  it('leaves ties and more than nine units to the approximations', () => {
    expect(exactRankPValues([1, 2, 2, 4], [1, 2, 3, 4], 'two-sided')).toBeUndefined();
    const ten = Array.from({ length: EXACT_MAX_UNITS + 1 }, (_, i) => i);
    expect(exactRankPValues(ten, ten, 'two-sided')).toBeUndefined();
  });
});
