/**
 * Verdict stability: each claim's verdict at 90%, 95% and 99% confidence, with and without the adjustment for many
 * claims. A sceptical reader's first question is whether the verdict hangs on the level chosen; this answers it for
 * every claim. Each level is a re-run of the claim's analysis at that level (intervals, detectable differences and
 * margins that depend on it change too; a compare claim, whose verdict depends on the level only through alpha, is
 * decided on the same figures: compareAtLevel in src/analyse/compare.ts), then the same adjustment across the same
 * claims, then `decide`.
 * Nothing here chooses words: src/verdicts/words/stability.ts does.
 */
import type { Analysis } from '../analyse/types.js';
import type { ClaimsFile } from '../claims/types.js';
import type { VerdictKind } from '../render/model.js';
import { adjustP } from '../stats/p-adjust.js';
import { decide } from './decide.js';

/** The confidence levels every claim's verdict is shown at. */
export const STABILITY_LEVELS = [0.9, 0.95, 0.99] as const;

export interface StabilityCell {
  /** The confidence level, a fraction (0.9, 0.95, 0.99). */
  level: number;
  /** The verdict with the pack's adjustment for many claims (the same as `unadjusted` when none applies). */
  adjusted: VerdictKind;
  /** The verdict on the claim's own p-value, with no adjustment. */
  unadjusted: VerdictKind;
}

export interface Stability {
  cells: StabilityCell[];
  /** False when no adjustment applies (adjust: none, or a single claim tested): the two verdicts are the same. */
  adjustmentApplies: boolean;
  /** True when the verdict with the pack's adjustment differs between the levels. */
  dependsOnLevel: boolean;
  /** True when, at some level, adjusting for many claims changes the verdict. */
  dependsOnAdjustment: boolean;
}

/**
 * Stability for every claim, in the claims' order; undefined for a claim that tests no hypothesis (an estimate) or
 * was not tested (too little data: that does not depend on the level).
 *
 * @param analyses each claim's analysis at its own level.
 * @param reanalyse the same claim's analysis at another confidence level.
 */
export function verdictStability(
  claims: ClaimsFile,
  analyses: readonly Analysis[],
  reanalyse: (index: number, confidence: number) => Analysis,
): Array<Stability | undefined> {
  const tested = (a: Analysis) => a.status === 'tested' && a.test !== undefined && a.kind !== 'estimate';
  const byLevel = STABILITY_LEVELS.map((level) => {
    const at = analyses.map((a, i) => (!tested(a) ? a : a.claim.confidence === level ? a : reanalyse(i, level)));
    // The family is the same as the pack's: every claim with a test (estimates test nothing).
    const idx = at.flatMap((a, i) => (a.status === 'tested' && a.test ? [i] : []));
    const adjusted = adjustP(idx.map((i) => at[i]?.test?.p as number), claims.adjust);
    const pAdj = new Map(idx.map((i, k) => [i, adjusted[k] as number]));
    return { at, pAdj, family: idx.length };
  });
  const adjustmentApplies = claims.adjust !== 'none' && (byLevel[0]?.family ?? 0) > 1;
  return analyses.map((a, i) => {
    if (!tested(a)) return undefined;
    const cells = STABILITY_LEVELS.map((level, k) => {
      const { at, pAdj } = byLevel[k]!;
      const ak = at[i] as Analysis;
      return { level, adjusted: decide(ak, pAdj.get(i)).verdict, unadjusted: decide(ak, ak.test?.p).verdict };
    });
    const first = cells[0]!.adjusted;
    return {
      cells,
      adjustmentApplies,
      dependsOnLevel: cells.some((c) => c.adjusted !== first),
      dependsOnAdjustment: cells.some((c) => c.adjusted !== c.unadjusted),
    };
  });
}
