/**
 * One-way analysis of variance: between- and within-group sums of squares, mean squares and the F test of equal group
 * means (R. A. Fisher, "Statistical Methods for Research Workers", 1925, ch. 7; Scheffé, "The Analysis of Variance",
 * 1959, section 3.1).
 *
 * Numerical care: all values are first shifted by the first observation (exact for data that share leading digits),
 * each group's mean is the corrected two-pass mean, the within sum of squares is the sum of each group's corrected
 * two-pass sum of squared deviations about its own mean (Chan, Golub & LeVeque, The American Statistician 37 (1983)
 * 242-247), and the between sum of squares is sum n_g (m_g - m)^2 with m the grand mean. This keeps the NIST StRD
 * one-way ANOVA files to 12 or more digits.
 */
import { fSf } from './distributions/f.js';
import { compensatedSum, requireFinite } from './mean.js';
import { sumOfSquaredDeviations } from './variance.js';
import type { TestResult } from './result.js';

export interface AnovaTable {
  between: { df: number; ss: number; ms: number };
  within: { df: number; ss: number; ms: number };
  f: number;
  /** Between SS / total SS (eta squared). */
  rSquared: number;
  /** sqrt(within MS). */
  residualSd: number;
  groupMeans: number[];
  groupSizes: number[];
}

/**
 * @param groups the observations of each group (at least two groups, each non-empty, more observations than groups)
 * @throws Error on fewer than two groups, an empty group, a non-finite value, no more observations than groups, or
 *   data with no variation at all.
 */
export function oneWayAnova(groups: readonly (readonly number[])[]): TestResult & { table: AnovaTable } {
  const k = groups.length;
  if (k < 2) throw new Error(`one-way ANOVA needs at least 2 groups; got ${k}.`);
  groups.forEach((g, i) => requireFinite(g, `one-way ANOVA: group ${i + 1}`));
  const sizes = groups.map((g) => g.length);
  const total = sizes.reduce((a, b) => a + b, 0);
  if (total <= k) throw new Error(`one-way ANOVA needs more observations (${total}) than groups (${k}).`);
  const shift = groups[0]![0]!;
  const shiftedStats = groups.map((g) => sumOfSquaredDeviations(g.map((v) => v - shift)));
  const ssWithin = compensatedSum(shiftedStats.map((s) => s.ss));
  const means = shiftedStats.map((s) => s.mean);
  const grand0 = compensatedSum(means.map((m, i) => m * sizes[i]!)) / total;
  const grand = grand0 + compensatedSum(means.map((m, i) => (m - grand0) * sizes[i]!)) / total;
  const ssBetween = compensatedSum(means.map((m, i) => sizes[i]! * (m - grand) * (m - grand)));
  if (ssWithin + ssBetween === 0) throw new Error('one-way ANOVA is undefined: all values are equal.');
  const dfB = k - 1;
  const dfW = total - k;
  const msB = ssBetween / dfB;
  const msW = ssWithin / dfW;
  const warnings: string[] = [];
  let f: number;
  let p: number;
  if (msW === 0) {
    f = Infinity;
    p = 0;
    warnings.push('Every group is constant, so the F ratio is infinite.');
  } else {
    f = msB / msW;
    p = fSf(f, dfB, dfW);
  }
  const table: AnovaTable = {
    between: { df: dfB, ss: ssBetween, ms: msB },
    within: { df: dfW, ss: ssWithin, ms: msW },
    f,
    rSquared: ssBetween / (ssBetween + ssWithin),
    residualSd: Math.sqrt(msW),
    groupMeans: means.map((m) => m + shift),
    groupSizes: sizes,
  };
  return {
    method: 'one-way-anova',
    statistic: { symbol: 'F', value: f },
    df: [dfB, dfW],
    p,
    alternative: 'two-sided',
    nullValue: 0,
    estimate: { name: 'eta squared', value: table.rSquared },
    n: sizes,
    warnings,
    table,
  };
}
