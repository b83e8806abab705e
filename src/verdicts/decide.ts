/**
 * The verdict for one claim, derived from its analysis, its p-value adjusted for many claims, and its confidence
 * level. Nothing is stored on the analysis: the decision is made here, once, and the words come later.
 *
 * - too-little-data: a selection (or too many units) fell below the minimum number of respondents.
 * - supported: the adjusted p-value is below 1 - confidence and the estimate lies the way the claim said (or the
 *   claim named no direction).
 * - opposite: statistically significant, but the other way from the claim. For a one-sided claim this uses the
 *   one-sided p-value in the opposite direction, adjusted by the same factor as the claim's own.
 * - not-supported: everything else. This is not evidence that the claim is false.
 * - Smallest difference that matters: a result that would be supported but whose estimate is smaller than the
 *   claim's smallestDifference is not-supported, with `belowThreshold` set so the words can say "real but small".
 *   It applies to differences of rates (compare, change: proportion units) and of mean scores (scale points, see
 *   src/analyse/means.ts); equivalence uses its margin instead.
 * - equivalence: supported when both one-sided tests reject (the TOST p-value, adjusted, below alpha); opposite when
 *   the rates are clearly further apart than the margin (analysis.beyondMargin); otherwise not-supported.
 */
import type { Analysis } from '../analyse/types.js';
import type { VerdictKind } from '../render/model.js';
import type { Stability } from './stability.js';
import type { Headline } from './adjusted-interval.js';

export interface Decision {
  verdict: VerdictKind;
  /** The claim's raw p-value (for its own direction or two-sided), if tested. */
  p?: number;
  /** The p-value after adjustment for many claims, if tested. */
  pAdjusted?: number;
  /** 1 - confidence. */
  alpha: number;
  /**
   * The per-claim threshold the adjustment for many claims actually applied to this claim's raw p-value (see
   * src/stats/p-adjust-thresholds.ts): pAdjusted < alpha exactly when p < effectiveAlpha. Equal to alpha when no
   * adjustment was made. Absent when the claim was not tested.
   */
  effectiveAlpha?: number;
  /**
   * The claim's headline interval at confidence 1 - effectiveAlpha (equivalence: 1 - 2 effectiveAlpha), the level that
   * decided the verdict; set by the pipeline when the adjustment changed the threshold (src/verdicts/adjusted-interval.ts).
   */
  adjustedInterval?: Headline;
  /** The verdict at 90, 95 and 99% confidence, with and without adjustment (set by the pipeline, src/verdicts/stability.ts). */
  stability?: Stability;
  /** Set when the result is real and in the claimed direction but smaller than the smallest difference that matters. */
  belowThreshold?: { effect: number; smallest: number; unit: 'points' | 'scale points' };
}

/** The estimate and the smallest difference that matters, in the same units, for the kinds the threshold applies to. */
function thresholdOf(a: Analysis): Decision['belowThreshold'] {
  if (a.threshold) return a.threshold;
  const smallest = a.claim.smallestDifference;
  if (smallest === undefined || a.kind === 'equivalence' || a.kind === 'means') return undefined;
  const d = (a as { difference?: { value: number } }).difference;
  return d !== undefined && (a.kind === 'compare' || (a.kind as string) === 'change') ? { effect: d.value, smallest, unit: 'points' } : undefined;
}

function supportedUnlessSmall(a: Analysis, base: Omit<Decision, 'verdict'>): Decision {
  const t = thresholdOf(a);
  if (t !== undefined && Math.abs(t.effect) < t.smallest) return { verdict: 'not-supported', ...base, belowThreshold: t };
  return { verdict: 'supported', ...base };
}

/** Tests two-sided in level but with a direction: decided as one-sided tests are, with pOpposite for the other way. */
export const DIRECTED_AT_TWO_SIDED_LEVEL: ReadonlySet<string> = new Set(['gap-size-iut', 'rank-iut', 'every-iut']);

/** 1 - confidence, rounded so that 1 - 0.95 is 0.05 exactly, not 0.050000000000000044: p = 0.05 is not below alpha. */
export function alphaOf(confidence: number): number {
  return Number((1 - confidence).toFixed(12));
}

export function decide(analysis: Analysis, pAdjusted: number | undefined, effectiveAlpha?: number): Decision {
  const alpha = alphaOf(analysis.claim.confidence);
  // An estimate tests no hypothesis: its verdict is 'estimate' whenever there were enough respondents.
  if (analysis.kind === 'estimate' && analysis.status === 'tested') return { verdict: 'estimate', alpha };
  if (analysis.status === 'too-little-data' || !analysis.test || pAdjusted === undefined) {
    return { verdict: 'too-little-data', alpha };
  }
  const p = analysis.test.p;
  const base = { p, pAdjusted, alpha, ...(effectiveAlpha !== undefined ? { effectiveAlpha } : {}) };
  const expect = analysis.expectSign;
  const observed = analysis.observedSign;
  if (analysis.kind === 'equivalence') {
    if (pAdjusted < alpha) return { verdict: 'supported', ...base };
    return { verdict: analysis.beyondMargin ? 'opposite' : 'not-supported', ...base };
  }
  // The gap-size test (narrowed, widened) is two-sided in level but directed: its opposite is the other size change.
  // So are the intersection-union tests of rank and every claims held to the two-sided level: their opposite is
  // pOpposite.
  if (analysis.test.alternative === 'two-sided' && !DIRECTED_AT_TWO_SIDED_LEVEL.has(analysis.test.method)) {
    if (pAdjusted >= alpha || observed === 0) return { verdict: 'not-supported', ...base };
    if (expect === 0 || observed === expect) return supportedUnlessSmall(analysis, base);
    return { verdict: 'opposite', ...base };
  }
  if (pAdjusted < alpha) return supportedUnlessSmall(analysis, base);
  if (analysis.pOpposite !== undefined && p > 0) {
    // The same multiplicity factor that turned p into pAdjusted, applied to the other direction's p-value.
    const factor = pAdjusted / p;
    if (Math.min(1, analysis.pOpposite * factor) < alpha) return { verdict: 'opposite', ...base };
  }
  return { verdict: 'not-supported', ...base };
}
