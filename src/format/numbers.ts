/**
 * How numbers are written for people in the pack. One place, so every page says "61%" and "6.2 points" the same way.
 * The minus sign is U+2212 so that negative numbers read clearly in the PDF.
 */

const MINUS = '\u2212';

function signed(text: string, value: number): string {
  return value < 0 ? MINUS + text : text;
}

/** A rate as a whole percentage ("61%"); one decimal below 1% or above 99% so that 0.4% is not shown as 0%. */
export function percent(rate: number): string {
  const pct = rate * 100;
  const digits = pct > 0 && (pct < 1 || pct > 99) && pct !== 100 ? 1 : 0;
  return `${pct.toFixed(digits)}%`;
}

/** A difference of two rates in percentage points, one decimal, signed ("−6.2"). */
export function points(diff: number, options: { sign?: boolean } = {}): string {
  const rounded = Math.round(Math.abs(diff) * 1000) / 10;
  const text = rounded.toFixed(1);
  if (rounded === 0) return '0.0';
  if (diff < 0) return MINUS + text;
  return options.sign ? `+${text}` : text;
}

/** Size of a difference in points without sign ("6.2"). */
export function pointsSize(diff: number): string {
  return (Math.round(Math.abs(diff) * 1000) / 10).toFixed(1);
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
  return Math.round(n).toLocaleString('en-GB');
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
