/**
 * How numbers are written for people in the pack. One place, so every page says "61%" and "6.2 points" the same way.
 * The minus sign is U+2212 so that negative numbers read clearly in the PDF.
 */

const MINUS = '\u2212';

function signed(text: string, value: number): string {
  return value < 0 ? MINUS + text : text;
}

/** The decimals a rate needs on its own: none, or one below 1% or above 99% so that 0.4% is not shown as 0%. */
function percentBase(rate: number): number {
  const pct = rate * 100;
  return pct > 0 && (pct < 1 || pct > 99) && pct !== 100 ? 1 : 0;
}

/**
 * A rate as a whole percentage ("61%"); one decimal below 1% or above 99% so that 0.4% is not shown as 0%. `digits`
 * (from `percentDigits`) asks for more, so that an interval's ends never print alike.
 */
export function percent(rate: number, digits?: number): string {
  return `${(rate * 100).toFixed(Math.max(digits ?? 0, percentBase(rate)))}%`;
}

/** A difference of two rates in percentage points, one decimal (or `digits`), signed ("−6.2"). */
export function points(diff: number, options: { sign?: boolean; digits?: number } = {}): string {
  const digits = options.digits ?? 1;
  const text = pointsSize(diff, digits);
  if (Number(text) === 0) return (0).toFixed(digits);
  if (diff < 0) return MINUS + text;
  return options.sign ? `+${text}` : text;
}

/** Size of a difference in points without sign ("6.2"), one decimal (or `digits`). */
export function pointsSize(diff: number, digits = 1): string {
  return (Math.round(Math.abs(diff) * 10 ** (digits + 2)) / 10 ** digits).toFixed(digits);
}

/**
 * A size in points that is not zero, never written as zero: one decimal, or as many more (up to four) as it takes
 * ("0.04" rather than "0.0"). For a detectable difference, "about 0.0 points" would say any gap, however small, is
 * found (common practice: a non-zero figure keeps a significant digit).
 */
export function pointsSizeNonZero(diff: number): string {
  let digits = 1;
  while (digits < 4 && diff !== 0 && Number(pointsSize(diff, digits)) === 0) digits++;
  return pointsSize(diff, digits);
}

/**
 * The fewest decimals (at least `base`, at most `max`) at which every two of `values` that differ also print
 * differently: an interval's two ends never collapse ("80% to 80%"), nor does an estimate onto an end it differs from
 * ("75% (75% to 76%)"). Values closer than the finest step allowed may still print alike.
 */
export function distinctDigits(values: readonly number[], write: (v: number, digits: number) => string, base: number, max: number): number {
  const finite = values.filter((v) => Number.isFinite(v));
  for (let digits = base; digits < max; digits++) {
    const texts = finite.map((v) => write(v, digits));
    let clash = false;
    for (let i = 0; i < finite.length && !clash; i++) {
      for (let j = i + 1; j < finite.length; j++) {
        if (finite[i] !== finite[j] && texts[i] === texts[j]) {
          clash = true;
          break;
        }
      }
    }
    if (!clash) return digits;
  }
  return max;
}

/**
 * Decimals for rates printed together (a rate and its interval's ends): see `distinctDigits`, and never fewer than
 * any of them needs on its own (one below 1% or above 99%), so that all are written alike ("0.4% to 2.1%", not
 * "0.4% to 2%"). At most two.
 */
export function percentDigits(...rates: number[]): number {
  return Math.max(distinctDigits(rates, percent, 0, 2), ...rates.filter((r) => Number.isFinite(r)).map(percentBase));
}

/**
 * One precision for rates compared with one another in a sentence, a table or a key figure (two groups, two
 * periods, every period of a trend, a rate and the value it is held to): each group is a rate followed by the
 * figures printed with it (its interval's ends). The decimals are the finest any group needs (`percentDigits`), and
 * enough (up to one) that two different rates do not print alike ("80.0% vs 79.5%", not "80% vs 80%"), so that
 * "60% against 72.2%" is written "60.3% against 72.2%".
 */
export function comparedPercentDigits(...groups: ReadonlyArray<readonly number[]>): number {
  const own = groups.map((g) => percentDigits(...g));
  const heads = groups.map((g) => g[0]).filter((v): v is number => v !== undefined && Number.isFinite(v));
  return Math.max(0, ...own, distinctDigits(heads, percent, 0, 1));
}

/**
 * One precision for coefficients or mean scores compared in a sentence or table (two groups' means with their
 * intervals, and the difference between them): the finest any group needs (`coefficientDigits`).
 */
export function comparedCoefficientDigits(...groups: ReadonlyArray<readonly number[]>): number {
  return Math.max(2, ...groups.map((g) => coefficientDigits(...g)));
}

/** Decimals for differences in points printed together: one, or more (at most three) where ends would collapse. */
export function pointsDigits(...diffs: number[]): number {
  return distinctDigits(diffs, (v, d) => points(v, { sign: true, digits: d }), 1, 3);
}

/** Decimals for coefficients printed together (r, a mean score): two, or more (at most four) where ends would collapse. */
export function coefficientDigits(...values: number[]): number {
  return distinctDigits(values, (v, d) => coefficient(v, d), 2, 4);
}

/** A p-value: three significant figures, "< 0.001" below a thousandth (with the exact value kept in results.json). */
export function pValue(p: number): string {
  if (!Number.isFinite(p)) return 'not computed';
  if (p < 0.001) return '< 0.001';
  if (p >= 0.9995) return '1.000';
  return p < 0.01 ? p.toFixed(4) : p.toFixed(3);
}

/** "p = 0.012" or "p < 0.001". */
export function pPhrase(p: number): string {
  const text = pValue(p);
  return text.startsWith('<') ? `p ${text}` : `p = ${text}`;
}

/** A correlation or similar coefficient, two decimals, proper minus sign. */
export function coefficient(r: number, digits = 2): string {
  const text = Math.abs(r).toFixed(digits);
  return Number(text) === 0 ? (0).toFixed(digits) : signed(text, r);
}

/** A test statistic, two decimals. */
export function statistic(value: number): string {
  return coefficient(value, 2);
}

/** A whole count with thousands separators ("18,500"). */
export function count(n: number): string {
  return grouped(Math.round(n));
}

/**
 * A number as toLocaleString('en-GB') writes it ("18,500"). Safe whole numbers are grouped here, the same text
 * without loading the locale's number-format data (about 20 ms on a process's first use, on each thread); anything
 * else (fractions, minus zero, beyond 2^53, not finite) is left to toLocaleString.
 */
export function grouped(n: number): string {
  if (!Number.isSafeInteger(n) || Object.is(n, -0)) return n.toLocaleString('en-GB');
  const digits = String(Math.abs(n));
  let out = digits.slice(0, ((digits.length - 1) % 3) + 1);
  for (let i = out.length; i < digits.length; i += 3) out += `,${digits.slice(i, i + 3)}`;
  return n < 0 ? `-${out}` : out;
}

/** A confidence level as people say it: 0.95 -> "95%", 0.975 -> "97.5%". */
export function level(confidence: number): string {
  const pct = Math.round(confidence * 1000) / 10;
  return `${Number.isInteger(pct) ? pct.toFixed(0) : pct.toFixed(1)}%`;
}

/** A number as plain text with up to `digits` decimals and no trailing zeros. */
export function plain(value: number, digits = 3): string {
  return signed(String(Number(Math.abs(value).toFixed(digits))), value);
}
