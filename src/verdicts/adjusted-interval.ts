/**
 * Intervals beside adjusted verdicts. A verdict adjusted for many claims compares the raw p-value with the claim's
 * effective threshold t (src/stats/p-adjust-thresholds.ts), not with 1 − confidence; an interval at the claim's own
 * level can then exclude "no difference" while the verdict says "not supported". So wherever adjustment applies, the
 * pack prints, beside the interval at the claim's own level (not adjusted), the same interval at the level that
 * decided the verdict: confidence 1 − t (for equivalence, whose interval is 1 − 2 alpha, it is 1 − 2t). Each claim is
 * analysed again at that level; nothing else changes.
 *
 * `headline` names, for each claim kind, the interval the pack reports as its result (the same one results.json
 * calls `interval`) and how its bounds are written.
 */
import type { Analysis } from '../analyse/types.js';
import type { Interval } from '../stats/result.js';

export type HeadlineUnit = 'points' | 'coefficient' | 'scale points';

export interface Headline {
  interval: Interval;
  unit: HeadlineUnit;
}

/** The interval a claim's result is reported with (trend: the fitted change per period's), or undefined for kinds without one (crosstab, estimate). */
export function headline(a: Analysis): Headline | undefined {
  if (a.status !== 'tested') return undefined;
  switch (a.kind) {
    case 'compare':
    case 'change':
    case 'gap-change':
    case 'target':
    case 'rank':
    case 'every':
      return a.difference ? { interval: a.difference.interval, unit: 'points' } : undefined;
    case 'equivalence':
      return a.equivalenceInterval ? { interval: a.equivalenceInterval, unit: 'points' } : undefined;
    case 'means':
      return a.difference ? { interval: a.difference.interval, unit: 'scale points' } : undefined;
    case 'association':
      return a.test?.interval ? { interval: a.test.interval, unit: 'coefficient' } : undefined;
    case 'trend':
      return a.test?.interval ? { interval: a.test.interval, unit: 'points' } : undefined;
    default:
      return undefined;
  }
}

/** The confidence level to analyse a claim at so that its headline interval matches the effective threshold. */
export function adjustedConfidence(effectiveAlpha: number): number {
  return Number((1 - effectiveAlpha).toFixed(12));
}

/** True for a claim tested one-sided (its direction stated in advance): not an equivalence claim, whose TOST is its own. */
export function testedOneSided(a: Analysis): boolean {
  return a.kind !== 'equivalence' && a.test !== undefined && a.test.alternative !== 'two-sided';
}

/**
 * The confidence level at which a claim's headline interval agrees with the test that decided its verdict, or
 * undefined where the interval at the claim's own level already does. A two-sided test at threshold t agrees with the
 * two-sided interval at 1 − t: so wherever the adjustment for many claims lowered t below 1 − confidence. A one-sided
 * test at threshold t agrees with the two-sided interval at 1 − 2t (its end on the claimed side is the one-sided
 * 1 − t bound; Schuirmann's (1987) correspondence, as for equivalence): so for every one-sided claim, adjusted or not,
 * since the claim's own two-sided interval at 1 − alpha matches a one-sided test at alpha / 2, and a one-sided claim
 * supported at p = 0.03 would otherwise be shown with a 95% interval that holds no difference.
 */
export function decidingConfidence(a: Analysis, effectiveAlpha: number | undefined, alpha: number): number | undefined {
  if (effectiveAlpha === undefined || a.status !== 'tested') return undefined;
  if (testedOneSided(a)) return 2 * effectiveAlpha < 1 ? adjustedConfidence(2 * effectiveAlpha) : undefined;
  return effectiveAlpha < alpha ? adjustedConfidence(effectiveAlpha) : undefined;
}
