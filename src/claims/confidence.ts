/**
 * Confidence levels as people write them: 0.95, 95, "95%" or "95 %". A number above 1 is read as a percent.
 * The accepted range is above 50% and at most 99.9%.
 */

export const CONFIDENCE_FORMS = '0.95, 95 or "95%"';

export type ConfidenceReading =
  | { ok: true; value: number; written: string }
  | { ok: false; written: string; reason: string };

export function readConfidence(raw: unknown): ConfidenceReading {
  let written: string;
  let n: number;
  let percent = false;
  if (typeof raw === 'number') {
    written = String(raw);
    n = raw;
  } else if (typeof raw === 'string') {
    written = raw.trim();
    const m = /^([0-9]+(?:\.[0-9]+)?)\s*(%?)$/.exec(written);
    if (m === null) {
      return { ok: false, written, reason: 'is not a number or a percent' };
    }
    n = Number(m[1]);
    percent = m[2] === '%';
  } else {
    return { ok: false, written: JSON.stringify(raw) ?? String(raw), reason: 'is not a number or a percent' };
  }
  if (!Number.isFinite(n)) return { ok: false, written, reason: 'is not a finite number' };
  // Round away the last-bit noise of dividing by 100 (99.9 / 100 is not exactly 0.999 in binary).
  const value = percent || n > 1 ? Number((n / 100).toPrecision(12)) : n;
  if (!(value > 0.5 && value <= 0.999)) {
    const understood = `${Number((value * 100).toPrecision(12))}%`;
    return {
      ok: false,
      written,
      reason: `is read as ${understood}, outside the accepted range (above 50% and at most 99.9%)`,
    };
  }
  return { ok: true, value, written };
}
