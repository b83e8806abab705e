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
/** How a shortfall for a low response rate begins, so that the words can tell it from one of too few respondents. */
const LOW_RESPONSE_LEAD = 'fewer than ';
const LOW_RESPONSE = / of those eligible answered in /;

/** True when a claim's shortfall is a response rate below min_response_rate (not too few respondents). */
export function isLowResponse(shortfallText: string | undefined): boolean {
  return shortfallText !== undefined && shortfallText.startsWith(LOW_RESPONSE_LEAD) && LOW_RESPONSE.test(shortfallText);
}

export function shortfall(claim: Claim, selections: Selected[]): string | undefined {
  const few = selections.filter((s) => s.pooled.n < claim.minRespondents);
  // A selection every row of which was withheld in the release has no figures at all: say so, not "fewer answered".
  const withheld = few.filter((s) => s.pooled.cells > 0 && s.pooled.suppressed === s.pooled.cells);
  if (withheld.length > 0) {
    const rows = (s: Selected) => (s.pooled.cells === 1 ? 'its only row' : s.pooled.cells === 2 ? 'both of its rows' : `all ${s.pooled.cells} of its rows`);
    return `the release suppressed ${withheld.map((s) => `${rows(s)} for ${s.label}`).join(' and ')} (withheld as too small to publish), so there are no figures to test`;
  }
  if (few.length > 0) {
    const partly = few.filter((s) => (s.pooled.suppressed ?? 0) > 0);
    const why = partly.length > 0 ? ` (${partly.map((s) => `${s.pooled.suppressed} of the ${s.pooled.cells} rows of ${s.label} were suppressed in the release`).join('; ')})` : '';
    return `fewer than ${claim.minRespondents} people answered in ${few.map((s) => s.label).join(' and ')}${why}`;
  }
  const minRate = claim.minResponseRate;
  if (minRate !== undefined) {
    const low = selections.filter(
      (s) => s.pooled.population !== undefined && s.pooled.population > 0 && s.pooled.n / s.pooled.population < minRate,
    );
    if (low.length > 0) {
      return `${LOW_RESPONSE_LEAD}${percent(minRate)} of those eligible answered in ${low.map((s) => s.label).join(' and ')}`;
    }
  }
  return undefined;
}
