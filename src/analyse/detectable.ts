/**
 * The smallest effect a claim's test would detect 80% of the time, at the threshold that actually decided its verdict.
 *
 * Each kind's analysis first computes its detectable effect at alpha = 1 − confidence. Once the p-values have been
 * adjusted for many claims, the threshold a claim's raw p-value was held to is smaller (Holm: alpha / (m − k + 1) at
 * the step that settled it; src/stats/p-adjust-thresholds.ts), so the sample could detect less than the unadjusted
 * figure suggests. `atThreshold` recomputes the detectable effect from the analysis's own counts at that threshold,
 * with the same power functions:
 * - compare, change: pooled two-proportion z test power (src/stats/power-two-proportions.ts), the second group's rate
 *   as the base, in the claimed direction (the larger of the two for an undirected claim);
 * - gap-change: the z test of a change in a gap (src/stats/power-gap-change.ts), the standard error from the four
 *   groups' rates; two-sided for narrowed and widened, whose two z tests are each held to the two-sided level;
 * - target: the one-sample score test (src/stats/power-one-proportion.ts), with the finite-population correction
 *   where the number eligible is known;
 * - trend: the Cochran–Armitage slope (detectableSlope in src/analyse/trend.ts);
 * - association: Fisher's z (src/stats/power-correlation.ts), units less controls;
 * - means: the difference in mean scores by the normal approximation to the t test with the groups' own spreads
 *   (src/stats/power-two-means.ts);
 * - crosstab: Cramér's V, by the noncentral chi-square power of the Pearson test (src/stats/power-chi-square.ts),
 *   also when Fisher's exact test was used for a table with small expected counts.
 */
import type { Analysis } from './types.js';
import { minDetectableDifference } from '../stats/power-two-proportions.js';
import { minDetectableGap } from '../stats/power-one-proportion.js';
import { minDetectableCorrelation } from '../stats/power-correlation.js';
import { minDetectableMeanDifference } from '../stats/power-two-means.js';
import { detectableSlope } from './trend.js';
import { effectiveSize } from '../stats/finite-population.js';
import { minDetectableCramersV } from '../stats/power-chi-square.js';
import { minDetectableGapChange } from '../stats/power-gap-change.js';
import { rankDetectable } from './rank.js';
import { everyDetectable } from './every.js';

/** The power every smallest detectable effect is computed at ("detected 80% of the time"). */
export const POWER = 0.8;

function pick(expect: string | undefined, both: { increase: number | null; decrease: number | null }): number | undefined {
  const candidates = expect === 'lower' ? [both.decrease] : expect === 'higher' ? [both.increase] : [both.increase, both.decrease];
  const found = candidates.filter((d): d is number => d !== null);
  return found.length > 0 ? Math.max(...found) : undefined;
}

/** The detectable effect for this analysis at significance level `alpha`; undefined when none is within reach. */
export function detectableAt(a: Analysis, alpha: number): number | undefined {
  if (a.status !== 'tested' || !a.test) return undefined;
  const sided = a.test.alternative === 'two-sided' ? 'two-sided' : 'one-sided';
  switch (a.kind) {
    case 'compare':
    case 'change': {
      const [first, second] = a.kind === 'compare' ? [a.focus, a.against] : [a.later, a.earlier];
      if (!first || !second || !(second.rate >= 0 && second.rate <= 1)) return undefined;
      // As src/analyse/rates.ts: with the finite-population correction each group counts as its effective size n / f.
      const corrected = a.fpc?.used === true && first.population !== undefined && second.population !== undefined;
      const m1 = corrected ? effectiveSize(first.n, first.population as number) : first.n;
      const m2 = corrected ? effectiveSize(second.n, second.population as number) : second.n;
      return pick(a.claim.expect, minDetectableDifference(m1, m2, second.rate, { alpha, power: POWER, sided }));
    }
    case 'gap-change': {
      if (!a.earlier || !a.later) return undefined;
      const four = [a.earlier.focus, a.earlier.against, a.later.focus, a.later.against];
      const se = Math.sqrt(four.reduce((s, r) => s + (r.rate * (1 - r.rate)) / r.n, 0));
      // The gap-size test holds each of its two z tests at the two-sided level.
      return se > 0 ? minDetectableGapChange(se, { alpha, power: POWER, sided: a.test.method === 'gap-size-iut' ? 'two-sided' : sided }) : undefined;
    }
    case 'target': {
      if (!a.rate) return undefined;
      const corrected = a.rate.fpc === true && a.rate.population !== undefined;
      return pick(a.claim.expect, minDetectableGap(a.rate.n, a.claim.value, { alpha, power: POWER, sided, ...(corrected && a.rate.population !== undefined ? { populationSize: a.rate.population } : {}) }));
    }
    case 'rank':
      // The lead over the closest rival that its pair would detect; being shown ahead of every rival asks at least this.
      return a.focus && a.closest ? rankDetectable(a.focus, a.closest.rival, a.claim.expect, alpha, sided) : undefined;
    case 'every':
      // The smallest unit's gap from the value; every unit must be shown, so the claim asks at least this.
      return a.tests ? everyDetectable(a.tests.map((u) => u.rate), a.claim.value, a.claim.expect, alpha, sided)?.value : undefined;
    case 'trend': {
      if (!a.rates) return undefined;
      const n = a.rates.map((r) => r.n);
      const pooled = a.rates.reduce((s, r) => s + r.agree, 0) / n.reduce((s, x) => s + x, 0);
      return pooled > 0 && pooled < 1 ? detectableSlope(n, pooled, alpha, sided) : undefined;
    }
    case 'association': {
      const units = a.points.length - (a.controlled?.length ?? 0);
      return units >= 4 ? minDetectableCorrelation(units, { alpha, power: POWER, sided }) : undefined;
    }
    case 'crosstab': {
      const n = a.counts.reduce((s, r) => s + r.reduce((u, v) => u + v, 0), 0);
      if (a.counts.length < 2 || a.columnLabels.length < 2) return undefined;
      return minDetectableCramersV({ n, rows: a.counts.length, columns: a.columnLabels.length, alpha, power: POWER }) ?? undefined;
    }
    case 'means': {
      if (!a.focus || !a.against) return undefined;
      return minDetectableMeanDifference({ sd1: a.focus.sd, n1: a.focus.n, sd2: a.against.sd, n2: a.against.n, alpha, power: POWER, sided });
    }
    default:
      return undefined;
  }
}

/**
 * The analysis with its detectable effect recomputed at the threshold that decided its verdict (`effectiveAlpha`),
 * and that threshold recorded. Unchanged when the claim was not tested or has no detectable effect.
 */
export function atThreshold<A extends Analysis>(a: A, effectiveAlpha: number | undefined): A {
  if (effectiveAlpha === undefined || a.status !== 'tested') return a;
  if (!['compare', 'change', 'gap-change', 'target', 'trend', 'association', 'means', 'crosstab', 'rank', 'every'].includes(a.kind)) return a;
  const detectable = detectableAt(a, effectiveAlpha);
  const rest = { ...a } as A & { detectable?: number };
  delete rest.detectable;
  return { ...rest, ...(detectable !== undefined ? { detectable } : {}), detectableAlpha: effectiveAlpha };
}
