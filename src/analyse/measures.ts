/**
 * Measures of a selection beyond the pooled agreement rate: mean scores from answer-code counts and numeric columns
 * (respondent-weighted means), from counts pooled by src/data/select.ts. Used by the means and association kinds.
 */
import type { Measure } from '../claims/types.js';
import type { Cube, Pooled } from '../data/types.js';
import { InputError } from '../errors.js';

/** Lowest and highest answer code anywhere in the cube, or undefined when the cube holds no answer codes. */
export function codeRange(cube: Cube): [number, number] | undefined {
  let lo = Infinity;
  let hi = -Infinity;
  for (const c of cube.cells) {
    for (const [k, v] of Object.entries(c.codes ?? {})) {
      if (v <= 0) continue;
      const code = Number(k);
      if (Number.isFinite(code)) {
        lo = Math.min(lo, code);
        hi = Math.max(hi, code);
      }
    }
  }
  return lo <= hi ? [lo, hi] : undefined;
}

export interface MeasureContext {
  claimsFile: string;
  claimId: string;
  field: string;
  place: { line: number; column: number };
}

/**
 * The value of a measure for pooled counts: the agreement rate, the mean answer code, or the respondent-weighted
 * mean of a numeric column. Throws an InputError when the source cannot give the measure (no answer codes, no such
 * numeric column), and an Error when there is nothing to measure (n or weight 0; callers check the minimum first).
 */
export function measureValue(pooled: Pooled, measure: Measure, ctx: MeasureContext): number {
  const where = { file: ctx.claimsFile, line: ctx.place.line, column: ctx.place.column, field: `claims.${ctx.claimId}.${ctx.field}` };
  if (measure.type === 'agree') {
    if (!(pooled.n > 0)) throw new Error(`internal: no respondents to measure for claim "${ctx.claimId}"`);
    return pooled.agree / pooled.n;
  }
  if (measure.type === 'mean') {
    if (!pooled.codes) {
      throw new InputError({
        ...where,
        found: 'mean',
        problem: `claim "${ctx.claimId}" asks for a mean score, but its source holds no answer codes (only counts per group)`,
        fix: 'use a source with one row per respondent and answers coded as numbers, or measure the agreement rate instead',
      });
    }
    let n = 0;
    let sum = 0;
    for (const [k, v] of Object.entries(pooled.codes)) {
      n += v;
      sum += v * Number(k);
    }
    if (!(n > 0)) throw new Error(`internal: no answers to average for claim "${ctx.claimId}"`);
    return sum / n;
  }
  const col = pooled.numeric?.[measure.column];
  if (!col) {
    throw new InputError({
      ...where,
      found: measure.column,
      problem: `claim "${ctx.claimId}" measures the column "${measure.column}", but its source has no numeric column by that name`,
      fix: `list "${measure.column}" under the source's numeric columns, or check its spelling`,
    });
  }
  if (!(col.weight > 0)) throw new Error(`internal: column "${measure.column}" has no respondents to weight for claim "${ctx.claimId}"`);
  return col.weightedSum / col.weight;
}

/**
 * Throw the InputError measureValue would throw when no cell of the cube can give the measure at all (no answer
 * codes for a mean score, no such numeric column), so that a misnamed measure is not mistaken for too little data.
 */
export function requireMeasure(cube: Cube, measure: Measure, ctx: MeasureContext): void {
  if (measure.type === 'agree') return;
  const has = cube.cells.some((c) => (measure.type === 'mean' ? c.codes !== undefined : c.numeric?.[measure.column] !== undefined));
  if (!has) measureValue({ n: 1, agree: 0, approximate: false, cells: 0 }, measure, ctx);
}
