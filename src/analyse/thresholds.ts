/**
 * The thresholds below which a selection is not tested and its numbers are not shown: too few respondents (common
 * practice: 10), or, where the number eligible is known, too small a share of them answering (a setting; 50% is a
 * common choice). Every claim kind uses this one rule, so suppression is the same everywhere in a pack.
 */
import type { Claim } from '../claims/types.js';
import type { Pooled } from '../data/types.js';
import { percent } from '../format/numbers.js';

export interface Selected {
  label: string;
  pooled: Pooled;
}

/**
 * Why the selections cannot be tested, as a phrase for "Too little data: ...", or undefined when they all can.
 * The phrase never contains the suppressed counts.
 */
export function shortfall(claim: Claim, selections: Selected[]): string | undefined {
  const few = selections.filter((s) => s.pooled.n < claim.minRespondents);
  if (few.length > 0) {
    return `fewer than ${claim.minRespondents} people answered in ${few.map((s) => s.label).join(' and ')}`;
  }
  const minRate = claim.minResponseRate;
  if (minRate !== undefined) {
    const low = selections.filter(
      (s) => s.pooled.population !== undefined && s.pooled.population > 0 && s.pooled.n / s.pooled.population < minRate,
    );
    if (low.length > 0) {
      return `fewer than ${percent(minRate)} of those eligible answered in ${low.map((s) => s.label).join(' and ')}`;
    }
  }
  return undefined;
}
