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
