import type { Filter } from '../claims/types.js';

/** A selection's name for people, built from its filter values: { Institution: "Tarnquill", Year: 2026 } -> "Tarnquill, 2026". */
export function filterLabel(filter: Filter): string {
  const parts = Object.values(filter).map((v) => (Array.isArray(v) ? v.join(' or ') : String(v)));
  return parts.length > 0 ? parts.join(', ') : 'all respondents';
}

/**
 * What a focus inside its comparison group is compared with: "the rest of <against>", or for `against: rest`
 * "everyone else" (or "the rest of <against_label>" when a label names the whole, such as "the college"). A label
 * that already says "the rest of ..." or "everyone else" is kept as written.
 */
export function restLabel(claim: { against: Filter; againstLabel?: string; againstRest?: boolean }): string {
  const label = claim.againstLabel;
  if (label !== undefined && /^(the rest of|everyone else|all other)\b/i.test(label.trim())) return label;
  if (claim.againstRest === true) return label !== undefined ? `the rest of ${label}` : 'everyone else';
  return `the rest of ${label ?? filterLabel(claim.against)}`;
}

/** Sign of a number as -1, 0 or +1. */
export function sign(value: number): 1 | -1 | 0 {
  return value > 0 ? 1 : value < 0 ? -1 : 0;
}
