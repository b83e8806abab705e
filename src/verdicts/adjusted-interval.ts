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
    case 'target':
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
