/**
 * Periods of a source, oldest first, and the relative words a claims file may use for them (`latest`, `previous`,
 * `latest-N`), resolved from the data so that the same claims file works when next year's rows are added.
 *
 * Order: when every period reads as a number (2025, 2026) they are ordered as numbers; otherwise as text with runs of
 * digits compared as numbers ("2024-25" before "2025-26", "Wave 9" before "Wave 10").
 */
import { InputError } from '../errors.js';
import type { FilterScalar } from '../claims/types.js';
import type { Cube } from './types.js';
import { fixFor } from '../suggest.js';
import { orderPeriods, periodsBack } from '../claims/periods.js';

/** The distinct values of the period column, oldest first (ordering in src/claims/periods.ts). */
export function periodsOf(cube: Cube, column: string): string[] {
  const where = { file: cube.file, ...(cube.sheet !== undefined ? { sheet: cube.sheet } : {}) };
  const values = cube.values[column];
  if (values === undefined) {
    throw new InputError({ ...where, field: column, found: column, problem: `The data of source "${cube.sourceId}" have no period column with this name`, fix: fixFor(column, cube.dimensions, 'columns') });
  }
  return orderPeriods(values);
}

export { periodsBack };

/**
 * The period a value names: a relative word resolved against the data, or the value itself (as text) when it is a
 * period in the data. Anything else is an InputError listing the periods the data hold.
 */
export function resolvePeriod(cube: Cube, column: string, value: FilterScalar): string {
  const periods = periodsOf(cube, column);
  const where = { file: cube.file, ...(cube.sheet !== undefined ? { sheet: cube.sheet } : {}) };
  const back = periodsBack(value);
  if (back !== undefined) {
    const i = periods.length - 1 - back;
    if (i < 0) {
      throw new InputError({
        ...where,
        field: column,
        found: String(value),
        problem: `The data have ${periods.length} period${periods.length === 1 ? '' : 's'} in "${column}", so "${String(value)}" names none`,
        fix: `Use a period the data have: ${periods.map((p) => `"${p}"`).join(', ')}`,
      });
    }
    return periods[i]!;
  }
  const text = String(value).trim();
  if (!periods.includes(text)) {
    throw new InputError({ ...where, field: column, found: text, problem: `No row of source "${cube.sourceId}" has this period in column "${column}"`, fix: fixFor(text, periods, 'periods') });
  }
  return text;
}

/** The last `count` periods, oldest first; an InputError when the data have fewer. */
export function lastPeriods(cube: Cube, column: string, count: number): string[] {
  const periods = periodsOf(cube, column);
  if (count > periods.length) {
    const where = { file: cube.file, ...(cube.sheet !== undefined ? { sheet: cube.sheet } : {}) };
    throw new InputError({
      ...where,
      field: column,
      found: String(count),
      problem: `The claim asks for the last ${count} periods but the data have ${periods.length} in "${column}"`,
      fix: `Ask for at most ${periods.length} periods, or add the earlier periods to the data`,
    });
  }
  return periods.slice(periods.length - count);
}
