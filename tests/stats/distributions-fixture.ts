/**
 * Loader for the R reference fixture tests/fixtures/r/distributions.json (written by distributions.R beside it).
 * Non-finite numbers are stored as strings there; this turns them back into numbers.
 */
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

export type Row = Record<string, number | boolean>;

function revive(v: unknown): number | boolean {
  if (typeof v === 'boolean' || typeof v === 'number') return v;
  if (v === 'Inf') return Infinity;
  if (v === '-Inf') return -Infinity;
  if (v === 'NaN') return NaN;
  throw new Error(`unexpected fixture value ${JSON.stringify(v)}`);
}

function load(relative: string): Record<string, Row[]> & { r_version?: string } {
  const path = fileURLToPath(new URL(relative, import.meta.url));
  const raw = JSON.parse(readFileSync(path, 'utf8')) as Record<string, unknown>;
  const out: Record<string, Row[]> = {};
  for (const [key, value] of Object.entries(raw)) {
    if (!Array.isArray(value)) continue;
    out[key] = value.map((row: Record<string, unknown>) => {
      const r: Row = {};
      for (const [k, v] of Object.entries(row)) r[k] = revive(v);
      return r;
    });
  }
  return out;
}

/** R 4.2 reference values, one array of rows per R function (pnorm, qnorm, pt, ...). */
export const R_REF = load('../fixtures/r/distributions.json');

/**
 * scipy 1.17 and mpmath 1.3 (50-digit) second-opinion values, written by tests/fixtures/scipy/distributions.py:
 * sections pt, pchisq, pf, qf, pbinom, phyper (scipy) and t_sf_quantile, t_sf, chisq_quantile_near_one,
 * f_quantile_closed_form (mpmath).
 */
export const SCIPY_REF = load('../fixtures/scipy/distributions.json');

export function num(row: Row, key: string): number {
  const v = row[key];
  if (typeof v !== 'number') throw new Error(`fixture row has no number ${key}: ${JSON.stringify(row)}`);
  return v;
}

export function flag(row: Row, key: string): boolean {
  const v = row[key];
  if (typeof v !== 'boolean') throw new Error(`fixture row has no boolean ${key}: ${JSON.stringify(row)}`);
  return v;
}

/**
 * Relative tolerance for a reference value: `rel` for normal doubles, widened in the subnormal range (below
 * 2.2e-308) where a double holds fewer significant bits, to a few units of the smallest subnormal.
 */
export function tolFor(expected: number, rel: number): number {
  const a = Math.abs(expected);
  if (a === 0 || a >= 2.2250738585072014e-308) return rel;
  return Math.max(rel, (8 * Number.MIN_VALUE) / a);
}
