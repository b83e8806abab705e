/**
 * A date written as year-month-day (2026-03-14) must be a day that exists: the month 1-12 and the day within that
 * month, with 29 February only in leap years (Gregorian calendar, as in ISO 8601). Other text ("spring 2026") is
 * left alone, as data_date and --date also accept free text.
 */

/** Why `text` is an impossible date ("February 2026 has 28 days"), or undefined when it is a real date or not date-like. */
export function impossibleDate(text: string): string | undefined {
  const m = /^\s*(\d{4})-(\d{1,2})-(\d{1,2})\s*$/.exec(text);
  if (!m) return undefined;
  const [year, month, day] = [Number(m[1]), Number(m[2]), Number(m[3])];
  if (month < 1 || month > 12) return `there is no month ${month}`;
  const leap = (year % 4 === 0 && year % 100 !== 0) || year % 400 === 0;
  const days = [31, leap ? 29 : 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31][month - 1] as number;
  if (day >= 1 && day <= days) return undefined;
  // The month's name only for the message: a date formatter is slow to make, and most dates are real.
  const name = new Date(Date.UTC(2000, month - 1, 1)).toLocaleDateString('en-GB', { month: 'long', timeZone: 'UTC' });
  return `${name} ${year} has ${days} days`;
}
