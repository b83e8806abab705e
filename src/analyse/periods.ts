/**
 * Relative periods: the words `latest`, `previous` and `latest-N` (N periods before the newest) in a claim, replaced
 * by the period values the data actually hold, so that the same claims file works next year.
 *
 * Periods are ordered numerically when every value in the period column is a number (2024 < 2025), otherwise as
 * text with runs of digits compared as numbers ("2024-25" < "2025-26"), as src/data/periods.ts orders them.
 * `previous` is `latest-1`. A word that names no period, or a
 * claim that needs more periods than the data hold, is an InputError naming the claim and listing the periods found.
 */
import type { ChangeClaim, Claim, Filter, FilterScalar, FilterValue, TrendClaim } from '../claims/types.js';
import type { Cube } from '../data/types.js';
import { InputError } from '../errors.js';
import { periodsBack, periodsOf } from '../data/periods.js';
import { PERIOD_NAME } from '../claims/periods.js';


/** The period column: the one the source names, else the single dimension whose name says it holds periods. */
export function periodColumnOf(cube: Cube, named: string | undefined): string | undefined {
  if (named !== undefined) return named;
  const guesses = cube.dimensions.filter((d) => PERIOD_NAME.test(d));
  return guesses.length === 1 ? guesses[0] : undefined;
}

/** The distinct values of the period column, oldest first (ordering as in src/data/periods.ts). */
export function orderedPeriods(cube: Cube, periodColumn: string): string[] {
  return periodsOf(cube, periodColumn);
}

/** True when the value is one of the relative period words (latest, previous, latest-N). */
export function isPeriodWord(value: FilterScalar): boolean {
  return periodsBack(value) !== undefined;
}

interface Resolver {
  claim: Claim;
  periods: string[];
  column: string | undefined;
  claimsFile: string;
  resolved: Record<string, string>;
}

function problem(r: Resolver, field: string, found: string, what: string, fix: string): InputError {
  const list = r.periods.length > 0 ? r.periods.join(', ') : 'none';
  return new InputError({
    file: r.claimsFile,
    line: r.claim.place.line,
    column: r.claim.place.column,
    field: `claims.${r.claim.id}.${field}`,
    found,
    problem: `claim "${r.claim.id}" ${what}; the periods in the data of source "${r.claim.source}"${r.column ? ` (column "${r.column}")` : ''} are: ${list}`,
    fix,
  });
}

function needColumn(r: Resolver, field: string, found: string): string {
  if (r.column !== undefined) return r.column;
  throw problem(r, field, found, 'names a period but its source has no period column', `add \`period: <column>\` to source "${r.claim.source}" naming the column that holds the survey periods`);
}

/** One scalar: a period word becomes the value it names; anything else is kept. */
function resolveScalar(r: Resolver, value: FilterScalar, field: string): FilterScalar {
  const back = periodsBack(value);
  if (back === undefined || typeof value !== 'string') return value;
  // A period whose own value is spelt like a word is taken as written.
  if (r.periods.includes(value.trim())) return value;
  needColumn(r, field, value);
  const index = r.periods.length - 1 - back;
  if (index < 0) {
    throw problem(r, field, value, `asks for "${value}", ${back} period${back === 1 ? '' : 's'} before the latest, but the data hold only ${r.periods.length}`, `choose a period the data hold, or add the earlier data`);
  }
  const actual = r.periods[index] as string;
  r.resolved[value.trim()] = actual;
  return actual;
}

function resolveValue(r: Resolver, value: FilterValue, field: string): FilterValue {
  if (Array.isArray(value)) return value.map((v) => resolveScalar(r, v, field));
  if (typeof value === 'object' && value !== null) {
    const inner = value.not;
    return { not: Array.isArray(inner) ? inner.map((v) => resolveScalar(r, v, field)) : resolveScalar(r, inner, field) };
  }
  return resolveScalar(r, value, field);
}

function resolveFilter(r: Resolver, filter: Filter, field: string): Filter {
  const out: Filter = {};
  for (const [col, value] of Object.entries(filter)) {
    out[col] = col === r.column ? resolveValue(r, value, `${field}.${col}`) : value;
  }
  return out;
}

/**
 * Replace the relative period words in every filter of the claim that is on the period column (and in a change's
 * `from`/`to`, a trend's `periods`, including `{ last: N }`) with the period values of the data. Returns the new
 * claim (the given one is not changed) and what each word was taken to mean, e.g. { latest: "2026" }.
 *
 * @param claimsFile the claims file as shown to the user, for error messages.
 * @throws InputError when a word names a period the data do not hold, when `last` asks for more periods than there
 *   are, or when a claim needs a period column and its source has none.
 */
export function resolvePeriods(claim: Claim, cube: Cube, periodColumn: string | undefined, claimsFile = 'the claims file'): { claim: Claim; resolved: Record<string, string> } {
  const column = periodColumnOf(cube, periodColumn);
  const r: Resolver = { claim, periods: column !== undefined ? orderedPeriods(cube, column) : [], column, claimsFile, resolved: {} };
  const c = claim as Claim & Record<string, unknown>;
  const next: Record<string, unknown> = { ...claim, where: resolveFilter(r, claim.where, 'where') };
  for (const key of ['focus', 'against', 'select', 'x', 'y'] as const) {
    const f = c[key];
    if (f !== undefined && typeof f === 'object') next[key] = resolveFilter(r, f as Filter, key);
  }
  if (claim.kind === 'association') {
    next.controls = claim.controls.map((ctl, i) => ({ ...ctl, filter: resolveFilter(r, ctl.filter, `controls.${i}`) }));
  }
  if (claim.kind === 'change' || claim.kind === 'gap-change') {
    next.from = resolveScalar(r, claim.from, 'from');
    next.to = resolveScalar(r, claim.to, 'to');
  }
  if (claim.kind === 'trend') {
    next.periods = resolveTrendPeriods(r, claim);
  }
  return { claim: next as unknown as Claim, resolved: r.resolved };
}

function resolveTrendPeriods(r: Resolver, claim: TrendClaim): FilterScalar[] {
  if (Array.isArray(claim.periods)) return claim.periods.map((p, i) => resolveScalar(r, p, `periods.${i}`));
  const n = claim.periods.last;
  const found = `last: ${n}`;
  needColumn(r, 'periods', found);
  if (!Number.isInteger(n) || n < 2) {
    throw problem(r, 'periods', found, `asks for the last ${n} periods`, 'give a whole number of periods, 3 or more for a trend');
  }
  if (n > r.periods.length) {
    throw problem(r, 'periods', found, `asks for the last ${n} periods but the data hold only ${r.periods.length}`, `ask for at most ${r.periods.length} periods, or add the earlier data`);
  }
  const chosen = r.periods.slice(r.periods.length - n);
  r.resolved[`last ${n}`] = chosen.join(', ');
  return chosen;
}

/** The change claim's two periods after resolution, as text; for the analysis. */
export function changePeriods(claim: ChangeClaim): { from: string; to: string } {
  return { from: String(claim.from).trim(), to: String(claim.to).trim() };
}
