/**
 * Amounts as people write them in a claims file, besides confidence levels (confidence.ts):
 * - shares (a target value, a minimum response rate): 0.8, 80 or "80%"; a number above 1 is read as a percent;
 * - differences in percentage points (a margin, the smallest difference that matters): 5 or "5 points" -> 0.05.
 *   A bare number below 1 is refused as ambiguous (0.05 could mean 5 points or a twentieth of a point); written
 *   "0.5 points" it is read as half a point.
 */

export const SHARE_FORMS = '0.8, 80 or "80%"';
export const POINTS_FORMS = '5 or "5 points" (percentage points)';

export type AmountReading = { ok: true; value: number; written: string } | { ok: false; written: string; reason: string };

function writtenOf(raw: unknown): string | undefined {
  if (typeof raw === 'number') return String(raw);
  if (typeof raw === 'string') return raw.trim();
  return undefined;
}

/** Remove the last-bit noise of dividing by 100 (80.1 / 100 is not exactly 0.801 in binary). */
function percentToFraction(n: number): number {
  return Number((n / 100).toPrecision(12));
}

/**
 * A share of people: 0.8, 80 or "80%". `allowZero` admits 0 (a target of 0% is legal, a minimum rate of 0 is not).
 * Accepted range: (0, 1], or [0, 1] with allowZero.
 */
export function readShare(raw: unknown, allowZero = false): AmountReading {
  const written = writtenOf(raw);
  if (written === undefined) return { ok: false, written: JSON.stringify(raw) ?? String(raw), reason: 'is not a number or a percent' };
  const m = /^([0-9]+(?:\.[0-9]+)?)\s*(%?)$/.exec(written);
  if (m === null) return { ok: false, written, reason: 'is not a number or a percent' };
  const n = Number(m[1]);
  const value = m[2] === '%' || n > 1 ? percentToFraction(n) : n;
  const low = allowZero ? value >= 0 : value > 0;
  if (!(low && value <= 1)) {
    return { ok: false, written, reason: `is read as ${Number((value * 100).toPrecision(12))}%, outside the accepted range (${allowZero ? 'from 0%' : 'above 0%'} up to 100%)` };
  }
  return { ok: true, value, written };
}

/** A difference in percentage points: 5, "5 points", "0.5 points" -> 0.05, 0.005. Accepted range: above 0, below 100. */
export function readPoints(raw: unknown): AmountReading {
  const written = writtenOf(raw);
  if (written === undefined) return { ok: false, written: JSON.stringify(raw) ?? String(raw), reason: 'is not a number of percentage points' };
  const m = /^([0-9]+(?:\.[0-9]+)?)\s*(points?|pts?|percentage points?)?$/i.exec(written);
  if (m === null) return { ok: false, written, reason: 'is not a number of percentage points' };
  const n = Number(m[1]);
  const unit = m[2] !== undefined;
  if (!unit && n > 0 && n < 1) {
    return { ok: false, written, reason: `is ambiguous: it could mean ${n * 100} points or ${n} of a point` };
  }
  if (!(n > 0 && n < 100)) return { ok: false, written, reason: 'is outside the accepted range (above 0 and below 100 points)' };
  return { ok: true, value: percentToFraction(n), written };
}

/** The words for periods relative to the newest in the data: latest, previous, latest-N (any case, spaces allowed around the minus). */
export const RELATIVE_PERIOD = /^(latest|previous|latest\s*-\s*([1-9][0-9]*))$/i;

/** How many periods before the newest a relative word names (latest 0, previous 1, latest-2 2), or undefined. */
export function periodsBack(value: unknown): number | undefined {
  if (typeof value !== 'string') return undefined;
  const m = RELATIVE_PERIOD.exec(value.trim());
  if (m === null) return undefined;
  const word = m[1]!.toLowerCase();
  if (word === 'latest') return 0;
  if (word === 'previous') return 1;
  return Number(m[2]);
}

/**
 * The three measures a "difference worth reporting" is set for (`worth_reporting`), each in its own unit: rates in
 * percentage points (as `smallest_difference`), mean scores in standard deviations (Cohen's d), correlations as r.
 */
export type WorthMeasure = 'rates' | 'mean_scores' | 'correlations';

/** Which measure a claim kind's "not supported" is split on; undefined for kinds that are not split. */
export function worthMeasureOf(kind: unknown): WorthMeasure | undefined {
  if (kind === 'compare' || kind === 'change' || kind === 'target') return 'rates';
  if (kind === 'means') return 'mean_scores';
  if (kind === 'association') return 'correlations';
  return undefined;
}

/** How each measure's size is written, for messages and the schema's descriptions. */
export const WORTH_FORMS: Record<WorthMeasure, string> = {
  rates: '5 or "5 points" (percentage points, above 0 and below 100)',
  mean_scores: '0.2 or "0.2 SD" (standard deviations, above 0 and at most 2)',
  correlations: '0.3 (a correlation, above 0 and below 1)',
};

/**
 * A difference worth reporting in a measure's unit: points (as readPoints, 5 -> 0.05), standard deviations
 * (0.2, "0.2 SD", "0.2 standard deviations"; above 0, at most 2: Cohen's "large" d is 0.8) or a correlation (0.3,
 * "r 0.3", "r = 0.3"; above 0 and below 1). A size is a distance from no difference: a sign is refused.
 */
export function readWorth(raw: unknown, measure: WorthMeasure): AmountReading {
  const written = writtenOf(raw);
  if (written !== undefined && /^[-−]/.test(written)) {
    return { ok: false, written, reason: 'is negative; a difference worth reporting is a distance from no difference, the same in either direction' };
  }
  if (measure === 'rates') return readPoints(raw);
  if (written === undefined) return { ok: false, written: JSON.stringify(raw) ?? String(raw), reason: `is not ${measure === 'mean_scores' ? 'a number of standard deviations' : 'a correlation'}` };
  if (measure === 'mean_scores') {
    const m = /^([0-9]+(?:\.[0-9]+)?)\s*(sd|sds|standard deviations?)?$/i.exec(written);
    if (m === null) return { ok: false, written, reason: 'is not a number of standard deviations' };
    const n = Number(m[1]);
    if (!(n > 0 && n <= 2)) return { ok: false, written, reason: 'is outside the accepted range (above 0 and at most 2 standard deviations; 0.2 is a small difference, 0.8 a large one)' };
    return { ok: true, value: n, written };
  }
  const m = /^(?:r\s*=?\s*)?([0-9]+(?:\.[0-9]+)?)$/i.exec(written);
  if (m === null) return { ok: false, written, reason: 'is not a correlation' };
  const n = Number(m[1]);
  if (!(n > 0 && n < 1)) return { ok: false, written, reason: 'is outside the accepted range (a correlation above 0 and below 1)' };
  return { ok: true, value: n, written };
}
