/**
 * Selections on a cube: which cells a filter matches, and their counts pooled by respondents (sum of agreeing over
 * sum of answering, never an average of percentages).
 *
 * Filter values compare as text after trimming ("2026" equals 2026); a list matches any of its values, and
 * `{ not: value | list }` matches every value but those. A column the
 * cube does not have, or a value that appears nowhere in its column (almost always a misspelling), is an InputError
 * naming the column or value and listing what the data hold.
 */
import { InputError } from '../errors.js';
import type { Filter, FilterScalar, FilterValue } from '../claims/types.js';
import type { Cell, Cube, Pooled } from './types.js';
import { findName, fixFor, nfc } from '../suggest.js';

function isNot(value: FilterValue): value is { not: FilterScalar | FilterScalar[] } {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

/** The values a filter names (for `{ not: ... }`, the values it leaves out), as trimmed text. */
function wantedTexts(value: FilterValue): string[] {
  const list = isNot(value) ? value.not : value;
  return (Array.isArray(list) ? list : [list]).map((v) => String(v).trim());
}

/** A filter turned into lookups once, so matching a cube's cells does not rebuild the wanted values per cell. */
type Compiled = Array<{ col: string; wanted: Set<string>; not: boolean }>;
const compiled = new WeakMap<Filter, Compiled>();

function compile(filter: Filter): Compiled {
  let c = compiled.get(filter);
  if (c === undefined) {
    c = Object.entries(filter).map(([col, value]) => ({ col, wanted: new Set(wantedTexts(value).map(nfc)), not: isNot(value) }));
    compiled.set(filter, c);
  }
  return c;
}

/**
 * True when the cell's value in every filtered column is (any of) the filter's value(s), or, for `{ not: ... }`,
 * none of them. A cell without the column matches no filter on it, `not` included.
 */
export function matches(cell: Cell, filter: Filter): boolean {
  for (const { col, wanted, not } of compile(filter)) {
    const have = cell.dims[col];
    if (have === undefined) return false;
    if (wanted.has(nfc(have)) === not) return false;
  }
  return true;
}

/** Per cube's cell list: for each column, the indices (ascending) of the cells holding each value (in NFC). */
const indexes = new WeakMap<readonly Cell[], Map<string, Map<string, number[]>>>();

function columnIndex(cells: readonly Cell[], col: string): Map<string, number[]> {
  let byCol = indexes.get(cells);
  if (byCol === undefined) {
    byCol = new Map();
    indexes.set(cells, byCol);
  }
  let index = byCol.get(col);
  if (index === undefined) {
    // By the values as written, then each distinct value put in NFC once (values written in two forms joined).
    const written = new Map<string, number[]>();
    for (let i = 0; i < cells.length; i++) {
      const have = (cells[i] as Cell).dims[col];
      if (have === undefined) continue;
      const list = written.get(have);
      if (list === undefined) written.set(have, [i]);
      else list.push(i);
    }
    index = new Map();
    for (const [have, list] of written) {
      const key = nfc(have);
      const before = index.get(key);
      index.set(key, before === undefined ? list : [...before, ...list].sort((x, y) => x - y));
    }
    byCol.set(col, index);
  }
  return index;
}

/**
 * The cells the filter matches, in the cube's order: the same as `cube.cells.filter((c) => matches(c, filter))`, but
 * looked up through an index of the filter's most selective column (built once per column) rather than by testing
 * every cell, so that 200 claims over a cube of 27,000 cells do not make 200 scans.
 */
export function matching(cube: Cube, filter: Filter): Cell[] {
  const cells = cube.cells;
  // The index lists (ascending) of the filter's columns that name values: the cells in all of them, then the columns
  // that leave values out checked cell by cell.
  const lists: number[][] = [];
  const nots: Compiled = [];
  for (const entry of compile(filter)) {
    const { col, wanted, not } = entry;
    if (not) {
      nots.push(entry);
      continue;
    }
    const index = columnIndex(cells, col);
    let found: number[];
    if (wanted.size === 1) found = index.get(wanted.values().next().value as string) ?? [];
    else {
      found = [];
      for (const w of wanted) found.push(...(index.get(w) ?? []));
      found.sort((x, y) => x - y);
    }
    if (found.length === 0) return [];
    lists.push(found);
  }
  if (lists.length === 0) return cells.filter((c) => matches(c, filter));
  lists.sort((x, y) => x.length - y.length);
  const out: Cell[] = [];
  // The shortest list's cells, each looked up in the others by bisection (a claim's shortest list is usually a few
  // dozen cells, the others thousands).
  next: for (const i of lists[0]!) {
    for (let l = 1; l < lists.length; l++) {
      const other = lists[l]!;
      let lo = 0;
      let hi = other.length;
      while (lo < hi) {
        const mid = (lo + hi) >>> 1;
        if (other[mid]! < i) lo = mid + 1;
        else hi = mid;
      }
      if (other[lo] !== i) continue next;
    }
    const c = cells[i] as Cell;
    for (const { col, wanted } of nots) {
      const have = c.dims[col];
      if (have === undefined || wanted.has(nfc(have))) continue next;
    }
    out.push(c);
  }
  return out;
}

/** Throw an InputError when the filter names a column the cube does not have or a value no cell has. */
export function checkFilter(cube: Cube, filter: Filter): void {
  const where = { file: cube.file, ...(cube.sheet !== undefined ? { sheet: cube.sheet } : {}) };
  for (const [col, value] of Object.entries(filter)) {
    if (!cube.dimensions.includes(col)) {
      throw new InputError({ ...where, field: col, found: col, problem: `The data of source "${cube.sourceId}" have no column with this name to select on`, fix: fixFor(col, cube.dimensions, 'columns') });
    }
    const known = cube.values[col] ?? [];
    // A value named under `not` must exist too: leaving out a misspelt value would silently leave out nothing.
    for (const v of wantedTexts(value)) {
      if (findName(v, known) === undefined) {
        throw new InputError({ ...where, field: col, found: v, problem: `No row of source "${cube.sourceId}" has this value in column "${col}"`, fix: fixFor(v, known, `values of "${col}"`) });
      }
    }
  }
}

/**
 * Sum the cells' counts. Answer-code counts (respondents sources) and numeric-column sums (summary sources) are
 * summed too, and are present whenever the cube has them, even for an empty selection, so that a measure can tell
 * "no answers" from "not a respondent-level source".
 */
/**
 * Counts, answer codes and numeric sums added up over the given cells of a cube. Answer codes are present when the
 * cube says it has them or any cell carries them (so an empty selection of a respondent-level source still says it
 * has codes); numeric sums likewise, one entry per numeric column.
 */
export function poolCells(cube: Cube, cells: Iterable<Cell>): Pooled {
  let n = 0;
  let agree = 0;
  let population = 0;
  let approximate = false;
  let count = 0;
  let notApplicable = 0;
  let blank = 0;
  let suppressed = 0;
  let populationKnown = true;
  let codes: Record<string, number> | undefined = cube.hasCodes === true ? {} : undefined;
  let numeric: Record<string, { weightedSum: number; weight: number }> | undefined;
  if (cube.numericColumns !== undefined && cube.numericColumns.length > 0) {
    numeric = {};
    for (const col of cube.numericColumns) numeric[col] = { weightedSum: 0, weight: 0 };
  }
  for (const c of cells) {
    n += c.n;
    agree += c.agree;
    population += c.population ?? 0;
    approximate ||= c.approximate;
    count += 1;
    notApplicable += c.notApplicable ?? 0;
    blank += c.blank ?? 0;
    if (c.suppressed === true) suppressed += 1;
    else if (c.populationSuppressed === true) populationKnown = false;
    if (c.codes !== undefined) {
      codes ??= {};
      for (const [code, k] of Object.entries(c.codes)) codes[code] = (codes[code] ?? 0) + k;
    }
    if (c.numeric !== undefined) {
      numeric ??= {};
      for (const [col, v] of Object.entries(c.numeric)) {
        const sum = (numeric[col] ??= { weightedSum: 0, weight: 0 });
        sum.weightedSum += v.weightedSum;
        sum.weight += v.weight;
      }
    }
  }
  const pooled: Pooled = { n, agree, approximate, cells: count };
  // A number eligible withheld for any row pooled leaves the selection's number eligible unknown (never a partial sum).
  if (cube.hasPopulation && populationKnown) pooled.population = population;
  if (suppressed > 0) pooled.suppressed = suppressed;
  if (codes !== undefined) pooled.codes = codes;
  if (notApplicable > 0) pooled.notApplicable = notApplicable;
  if (blank > 0) pooled.blank = blank;
  if (numeric !== undefined) pooled.numeric = numeric;
  return pooled;
}

/** Counts summed over the cells the filter matches. */
export function pool(cube: Cube, filter: Filter): Pooled {
  checkFilter(cube, filter);
  return poolCells(cube, matching(cube, filter));
}

/** Names a column's value for people (its wording with the code beside it, where the source words it). */
export type UnitNamer = (column: string, value: string) => string;

/** The name of a unit made of one or more columns: its values joined in the columns' order ("Computing, Quarrendell"). */
export function unitLabel(values: readonly string[]): string {
  return values.join(', ');
}

/**
 * Counts per unit over the cells the filter matches. A unit is a value of `unitColumns` or, with several columns, a
 * combination of their values (each institution's departments, not departments pooled across institutions). Units
 * with no matching cell are left out.
 */
export function poolByUnit(cube: Cube, filter: Filter, unitColumns: string | readonly string[], name?: UnitNamer): Map<string, Pooled> {
  const out = new Map<string, Pooled>();
  for (const [u, cells] of cellsByUnit(cube, filter, unitColumns, name)) out.set(u, poolCells(cube, cells));
  return out;
}

/**
 * The cells the filter matches, grouped by their unit: the value of one column, or the combination of the values of
 * several (labelled by unitLabel). Units come in the order of the columns' values (first column first); combinations
 * that no matching cell has are left out.
 */
export function cellsByUnit(cube: Cube, filter: Filter, unitColumns: string | readonly string[], name?: UnitNamer): Map<string, Cell[]> {
  const cols = typeof unitColumns === 'string' ? [unitColumns] : [...unitColumns];
  checkFilter(cube, filter);
  for (const col of cols) checkFilter(cube, { [col]: [] });
  const rank = cols.map((col) => new Map((cube.values[col] ?? []).map((v, i) => [v, i] as const)));
  const groups = new Map<string, { order: number[]; cells: Cell[] }>();
  for (const c of matching(cube, filter)) {
    const values = cols.map((col) => c.dims[col] ?? '');
    const key = values.length === 1 ? (values[0] as string) : JSON.stringify(values);
    const group = groups.get(key);
    if (group === undefined) groups.set(key, { order: values.map((v, j) => (rank[j] as Map<string, number>).get(v) ?? Number.MAX_SAFE_INTEGER), cells: [c] });
    else group.cells.push(c);
  }
  const sorted = [...groups.entries()].sort(([ka, a], [kb, b]) => {
    for (let j = 0; j < a.order.length; j++) if (a.order[j] !== b.order[j]) return (a.order[j] as number) - (b.order[j] as number);
    return ka < kb ? -1 : ka > kb ? 1 : 0;
  });
  const out = new Map<string, Cell[]>();
  for (const [key, g] of sorted) {
    const values = cols.length === 1 ? [key] : (JSON.parse(key) as string[]);
    const label = unitLabel(name !== undefined ? values.map((v, j) => name(cols[j] as string, v)) : values);
    const same = out.get(label);
    // Two combinations whose values join to the same words (a value holding ", "): kept apart by the column order.
    if (same !== undefined) out.set(`${label} (${cols.join(', ')})`, g.cells);
    else out.set(label, g.cells);
  }
  return out;
}

export type Relation = 'separate' | 'focus-inside' | 'against-inside' | 'overlap' | 'same';

export interface Related {
  focus: Pooled;
  against: Pooled;
  relation: Relation;
  /** When one selection contains the other: the larger one without the cells of the smaller. */
  rest?: Pooled;
}

/**
 * Pool two selections and say how they relate, cell by cell: no shared cell ('separate', also when either is empty),
 * the same cells ('same'), one inside the other, or a partial overlap. When one contains the other, `rest` pools the
 * larger selection's cells that the smaller does not match (a unit against a group that includes it is compared
 * with the rest of the group).
 */
export function relate(cube: Cube, focus: Filter, against: Filter): Related {
  // A claim is analysed again at other confidence levels (verdict stability): its two selections are related once.
  let known = relatedOf.get(cube);
  if (known === undefined) {
    known = new Map();
    relatedOf.set(cube, known);
  }
  const key = `${filterKey(focus)}\n${filterKey(against)}`;
  let r = known.get(key);
  if (r === undefined) {
    r = relateNow(cube, focus, against);
    known.set(key, r);
  }
  return r;
}

/** Per cube: relate's answer by the two filters' texts (filterKey). Only answers are kept: a filter the cube cannot meet throws each time. */
const relatedOf = new WeakMap<Cube, Map<string, Related>>();

/** A filter as text: two filters with the same text select alike (JSON, with undefined kept apart from null). */
function filterKey(filter: Filter): string {
  return JSON.stringify(filter, (_, v: unknown) => (v === undefined ? UNDEFINED_KEY : v));
}
const UNDEFINED_KEY = { '\u0000undefined': true };

function relateNow(cube: Cube, focus: Filter, against: Filter): Related {
  checkFilter(cube, focus);
  checkFilter(cube, against);
  const f = new Set(matching(cube, focus));
  const a = new Set(matching(cube, against));
  let shared = 0;
  for (const c of f) if (a.has(c)) shared += 1;
  const pooledF = poolCells(cube, f);
  const pooledA = poolCells(cube, a);
  const base = { focus: pooledF, against: pooledA };
  if (shared === 0) return { ...base, relation: 'separate' };
  if (shared === f.size && shared === a.size) return { ...base, relation: 'same' };
  if (shared === f.size) return { ...base, relation: 'focus-inside', rest: poolCells(cube, [...a].filter((c) => !f.has(c))) };
  if (shared === a.size) return { ...base, relation: 'against-inside', rest: poolCells(cube, [...f].filter((c) => !a.has(c))) };
  return { ...base, relation: 'overlap' };
}
