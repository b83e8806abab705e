import type { Filter } from '../claims/types.js';

/** A selection's name for people, built from its filter values: { Institution: "Tarnquill", Year: 2026 } -> "Tarnquill, 2026". */
export function filterLabel(filter: Filter): string {
  const parts = Object.values(filter).map((v) => (Array.isArray(v) ? v.join(' or ') : String(v)));
  return parts.length > 0 ? parts.join(', ') : 'all respondents';
}

/** Sign of a number as -1, 0 or +1. */
export function sign(value: number): 1 | -1 | 0 {
  return value > 0 ? 1 : value < 0 ? -1 : 0;
}
