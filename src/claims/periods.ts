/**
 * Periods relative to the newest one in the data: `latest`, `previous` and `latest-N` name the newest period, the
 * one before it, and the one N before it, in the order of the source's period column. Periods are ordered as
 * numbers when every value is a number (2024, 2025), otherwise as text with digit runs compared by value
 * ("2024-25" before "2025-26", "Wave 9" before "Wave 10").
 */
import { periodsBack } from './amounts.js';

export { periodsBack, RELATIVE_PERIOD } from './amounts.js';

/**
 * Column names that hold survey periods when a source does not name its period column (common practice in survey
 * exports). One list for every place that guesses: `warrant init`, the analyses' fallback, and the cohort caution.
 */
export const PERIOD_NAME = /^(year|period|wave|session|cycle|round|academic[ _-]?year|survey[ _-]?year)$/i;

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)$/;
/** Made on first use: a collator's first making loads the locale's collation data (about 10 ms), which periods that
 * are all numbers never need. */
let collator: Intl.Collator | undefined;

/** The distinct periods in the data, oldest first. */
export function orderPeriods(values: readonly string[]): string[] {
  const distinct = [...new Set(values.map((v) => v.trim()))].filter((v) => v !== '');
  if (distinct.every((v) => NUMBER.test(v))) return distinct.sort((a, b) => Number(a) - Number(b));
  collator ??= new Intl.Collator('en', { numeric: true, sensitivity: 'base' });
  const c = collator;
  return distinct.sort((a, b) => c.compare(a, b));
}

export type PeriodResolution = { ok: true; period: string } | { ok: false; reason: string };

/**
 * The period a value names: a relative word resolved against `ordered` (oldest first), anything else as written.
 * Fails when the word reaches back further than the data go.
 */
export function resolvePeriod(value: string | number, ordered: readonly string[]): PeriodResolution {
  const back = periodsBack(value);
  if (back === undefined) return { ok: true, period: String(value).trim() };
  const index = ordered.length - 1 - back;
  if (index < 0) {
    const have = ordered.length === 1 ? 'only one period' : `${ordered.length} periods`;
    return { ok: false, reason: `"${String(value)}" reaches ${back} period${back === 1 ? '' : 's'} back from the newest, but the data hold ${have}` };
  }
  return { ok: true, period: ordered[index]! };
}

/**
 * True when the order above is surely the order in time for these periods: they differ only in their digit runs
 * (2024 and 2025, "2024-25" and "2025-26", "Wave 9" and "Wave 10"). Names that differ in words ("Spring 2025",
 * "Autumn 2025") are ordered as text, which need not be their order in time, so a claim's own order is trusted there.
 */
export function orderIsInTime(values: readonly string[]): boolean {
  return new Set(values.map((v) => v.trim().replace(/\d+/g, '0'))).size <= 1;
}
