/**
 * Power of the Pearson chi-square test of independence in an r × c table, and the smallest Cramér's V it would
 * detect.
 *
 * With N respondents and a true Cramér's V of v, Cohen's effect size is w = v · sqrt(min(r, c) − 1) and the test
 * statistic is approximately noncentral chi-square with (r − 1)(c − 1) degrees of freedom and noncentrality N w²:
 *
 *     power = P(X' > crit),   X' ~ χ²'((r−1)(c−1), N w²),   crit = upper alpha quantile of χ²((r−1)(c−1))
 *
 * Source: J. Cohen (1988), Statistical Power Analysis for the Behavioral Sciences, 2nd ed., Erlbaum, ch. 7 (w and
 * its relation to Cramér's phi, section 7.2); the same computation as the pwr.chisq.test function of R's pwr package.
 */
import { chisqSfQuantile } from './distributions/chisq.js';
import { ncChisqSf } from './distributions/ncchisq.js';
import { smallestGapReaching } from './smallest-gap.js';

export interface ChiSquarePowerTable {
  /** Respondents in the table. */
  n: number;
  rows: number;
  columns: number;
  alpha: number;
}

function check(o: ChiSquarePowerTable, fn: string): void {
  if (!(o.n > 0 && Number.isFinite(o.n))) throw new Error(`${fn}: the table needs respondents, got n = ${o.n}`);
  if (!(Number.isInteger(o.rows) && o.rows >= 2 && Number.isInteger(o.columns) && o.columns >= 2)) {
    throw new Error(`${fn}: the table needs at least 2 rows and 2 columns, got ${o.rows} × ${o.columns}`);
  }
  if (!(o.alpha > 0 && o.alpha < 1)) throw new Error(`${fn}: alpha must be between 0 and 1, got ${o.alpha}`);
}

/** Power at a true Cramér's V of v. */
export function chiSquarePower(v: number, o: ChiSquarePowerTable): number {
  check(o, 'chiSquarePower');
  if (!(v >= 0 && v <= 1)) throw new Error(`chiSquarePower: Cramér's V must lie in [0, 1], got ${v}`);
  const df = (o.rows - 1) * (o.columns - 1);
  const w2 = v * v * (Math.min(o.rows, o.columns) - 1);
  return ncChisqSf(chisqSfQuantile(o.alpha, df), df, o.n * w2);
}

/** Smallest Cramér's V detected with the given power; null when even V = 1 falls short. */
export function minDetectableCramersV(o: ChiSquarePowerTable & { power: number }): number | null {
  check(o, 'minDetectableCramersV');
  if (!(o.power > o.alpha && o.power < 1)) throw new Error(`minDetectableCramersV: power must lie between alpha and 1, got ${o.power}`);
  return smallestGapReaching((v) => chiSquarePower(v, o), 1, o.power);
}
