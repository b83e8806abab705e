import type { Filter, FilterValue, Naming } from '../claims/types.js';

/** A question code in its wording, with the code once beside it: “Feedback arrives in time to help” (Q03). */
export function questionWords(code: string, naming?: Naming): string {
  const w = naming?.wording?.[code];
  return w !== undefined ? `“${w}” (${code})` : code;
}

/**
 * A value of a column in its wording, with the code once beside it, when the source words that column's values
 * (`wording: { Campus: { GQ: Gleddrith Quay } }` -> "Gleddrith Quay (GQ)"); otherwise the value as it is.
 */
export function valueWords(column: string, value: string, naming?: Naming): string {
  const w = naming?.values?.[column]?.[value.trim()];
  return w !== undefined ? `${w} (${value.trim()})` : value;
}

/** The namer of a unit's values for cellsByUnit: each column's value in its wording, where the source gives one. */
export function unitNamer(naming?: Naming): ((column: string, value: string) => string) | undefined {
  return naming?.values !== undefined ? (column, value) => valueWords(column, value, naming) : undefined;
}

/**
 * A selection's name for people, built from its filter values: the group first, then the question, then the
 * period, in a phrase, never glued into one name: { Institution: "Tarnquill", Question: "Q09", Year: 2026 } ->
 * "Tarnquill on Q09 in 2026" (with wording: "Tarnquill on “Marking is fair” (Q09) in 2026"). Without `naming` the
 * values are listed in order: "Tarnquill, Q09, 2026".
 */
export function filterLabel(filter: Filter, naming?: Naming): string {
  const text = (v: FilterValue, each: (x: string) => string = (x) => x): string => {
    if (Array.isArray(v)) return v.map((x) => each(String(x))).join(' or ');
    if (typeof v === 'object') return `all but ${(Array.isArray(v.not) ? v.not : [v.not]).map((x) => each(String(x))).join(' and ')}`;
    return each(String(v));
  };
  if (naming === undefined) {
    const parts = Object.values(filter).map((v) => text(v));
    return parts.length > 0 ? parts.join(', ') : 'all respondents';
  }
  const isQuestion = (col: string, v: FilterValue): boolean => {
    if (col === naming.question || /^question( ?code)?$/i.test(col)) return true;
    // A column whose values the source words is a group, not a question.
    if (naming.values?.[col] !== undefined) return false;
    const values = Array.isArray(v) ? v : typeof v === 'object' ? [] : [v];
    return values.length > 0 && values.every((x) => naming.wording?.[String(x).trim()] !== undefined);
  };
  const groups: string[] = [];
  const questions: string[] = [];
  const periods: string[] = [];
  for (const [col, v] of Object.entries(filter)) {
    if (col === naming.period) periods.push(text(v));
    else if (isQuestion(col, v)) questions.push(text(v, (x) => questionWords(x.trim(), naming)));
    else groups.push(text(v, (x) => valueWords(col, x, naming)));
  }
  let label = groups.join(', ');
  if (questions.length > 0) label += `${label ? ' on ' : ''}${questions.join(' and ')}`;
  // A period alone is named as it is ("for 2026"); after a group or a question it comes last ("… in 2026").
  if (periods.length > 0) label += label ? ` in ${periods.join(' and ')}` : periods.join(' and ');
  return label !== '' ? label : 'all respondents';
}

/**
 * What a focus inside its comparison group is compared with: "the rest of <against>", or for `against: rest`
 * "everyone else" (or "the rest of <against_label>" when a label names the whole, such as "the college"). A label
 * that already says "the rest of ..." or "everyone else" is kept as written.
 */
export function restLabel(claim: { against: Filter; againstLabel?: string; againstRest?: boolean; naming?: Naming }): string {
  const label = claim.againstLabel;
  if (label !== undefined && /^(the rest of|everyone else|all other)\b/i.test(label.trim())) return label;
  if (claim.againstRest === true) return label !== undefined ? `the rest of ${label}` : 'everyone else';
  return `the rest of ${label ?? filterLabel(claim.against, claim.naming)}`;
}

/** Sign of a number as -1, 0 or +1. */
export function sign(value: number): 1 | -1 | 0 {
  return value > 0 ? 1 : value < 0 ? -1 : 0;
}
