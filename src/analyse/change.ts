/**
 * Claim kind "change": the same selection's agreement rate in an earlier and a later period ("this fell since last
 * year"). The later period (`to`) plays the part of the focus and the earlier one (`from`) the comparison, so a
 * claim that the rate fell expects the later rate to be lower.
 *
 * The two periods are answered by different people (cohorts), so the two rates are treated as independent samples:
 * pooled two-proportion z test, or Fisher's exact test when an expected count is below 5 (Agresti 2013, Categorical
 * Data Analysis, 3rd ed., §3.1 and §3.5); Wilson intervals per period; Newcombe's hybrid score interval for the
 * change (Newcombe 1998, Statistics in Medicine 17, 873–890, method 10). Building blocks shared with "compare" are in
 * rates.ts.
 */
import type { ChangeClaim, Claim, FilterScalar, GapChangeClaim } from '../claims/types.js';
import type { Cube } from '../data/types.js';
import { pool } from '../data/select.js';
import { InputError } from '../errors.js';
import type { CompareContext } from './compare.js';
import { filterLabel, sign } from './labels.js';
import { orderedPeriods, periodColumnOf, resolvePeriods } from './periods.js';
import { orderIsInTime } from '../claims/periods.js';
import { compareRates, expectSignOf, fpcWanted, rateSummary } from './rates.js';
import { shortfall } from './thresholds.js';
import type { ChangeAnalysis } from './types.js';

/** The period column for a claim, or an InputError saying the source must name one. */
export function requirePeriodColumn(claim: Pick<Claim, 'id' | 'source' | 'place' | 'kind'>, cube: Cube, ctx: CompareContext): string {
  const column = periodColumnOf(cube, ctx.periodColumns?.[claim.source]);
  if (column === undefined) {
    throw new InputError({
      file: ctx.claimsFile,
      line: claim.place.line,
      column: claim.place.column,
      field: `claims.${claim.id}.kind`,
      found: claim.kind,
      problem: `claim "${claim.id}" compares periods, but source "${claim.source}" has no period column`,
      fix: `add \`period: <column>\` to source "${claim.source}" naming the column that holds the survey periods (columns: ${cube.dimensions.join(', ')})`,
    });
  }
  return column;
}

/**
 * A change (of one selection, or of a gap between two) runs from the earlier period to the later: the other way
 * round, a fall would be reported as a rise. An InputError naming the swap when `from` comes after `to`.
 */
export function refuseBackwards(written: Pick<Claim, 'id' | 'place'> & { from: FilterScalar; to: FilterScalar }, from: string, to: string, cube: Cube, column: string, ctx: CompareContext): void {
  const claim = written;
  const order = orderedPeriods(cube, column);
  if (order.indexOf(from) > order.indexOf(to) && order.indexOf(to) >= 0 && orderIsInTime([from, to])) {
    throw new InputError({
      file: ctx.claimsFile,
      line: claim.place.line,
      column: claim.place.column,
      field: `claims.${claim.id}.from`,
      found: String(written.from),
      problem: `claim "${claim.id}" runs from ${from} to ${to}, but ${from} comes after ${to}: a change is measured from the earlier period to the later, so this one would report a fall as a rise`,
      fix: `swap them: from: ${String(written.to)}, to: ${String(written.from)}`,
    });
  }
}

/**
 * The two periods a change claim compares, resolved against the data (latest, previous, latest-N), with the claim as
 * resolved: refused when the source has no period column, when both are one period, or when from comes after to.
 * `what` names what is compared in the message ("period", "the gap in period").
 */
export function twoPeriods<C extends ChangeClaim | GapChangeClaim>(written: C, cube: Cube, ctx: CompareContext, what: string): { claim: C; column: string; from: string; to: string } {
  const column = requirePeriodColumn(written, cube, ctx);
  const claim = resolvePeriods(written, cube, column, ctx.claimsFile).claim as C;
  const from = String(claim.from).trim();
  const to = String(claim.to).trim();
  if (from === to) {
    throw new InputError({
      file: ctx.claimsFile,
      line: claim.place.line,
      column: claim.place.column,
      field: `claims.${claim.id}.from`,
      found: String(written.from),
      problem: `claim "${claim.id}" compares ${what} ${to} with itself`,
      fix: 'give `from` an earlier period than `to` (e.g. `from: previous`, `to: latest`)',
    });
  }
  refuseBackwards(written, from, to, cube, column, ctx);
  return { claim, column, from, to };
}

export function analyseChange(written: ChangeClaim, cube: Cube, ctx: CompareContext): ChangeAnalysis {
  const { claim, column, from, to } = twoPeriods(written, cube, ctx, 'period');
  const scope = Object.entries(claim.where).filter(([k]) => k !== column);
  const scopeLabel = scope.length > 0 ? `${filterLabel(Object.fromEntries(scope))}, ` : '';
  const laterPooled = pool(cube, { ...claim.where, [column]: to });
  const earlierPooled = pool(cube, { ...claim.where, [column]: from });
  const base = {
    kind: 'change' as const,
    claim,
    periodColumn: column,
    periods: { from, to },
    expectSign: expectSignOf(claim.expect),
    methods: [] as string[],
  };
  const naming = { ...claim.naming, period: column };
  const laterLabel = claim.naming !== undefined ? filterLabel({ ...Object.fromEntries(scope), [column]: to }, naming) : `${scopeLabel}${to}`;
  const earlierLabel = claim.naming !== undefined ? filterLabel({ ...Object.fromEntries(scope), [column]: from }, naming) : `${scopeLabel}${from}`;
  const why = shortfall(claim, [
    { label: to, pooled: laterPooled },
    { label: from, pooled: earlierPooled },
  ]);
  if (why !== undefined) return { ...base, status: 'too-little-data', shortfall: why, observedSign: 0 };
  const wanted = fpcWanted(claim, cube);
  const r = compareRates(
    rateSummary(laterLabel, laterPooled, claim.confidence, wanted?.used === true),
    rateSummary(earlierLabel, earlierPooled, claim.confidence, wanted?.used === true),
    claim.expect,
    claim.sided,
    claim.confidence,
    wanted,
    { detectable: ctx.detectable !== false },
  );
  return {
    ...base,
    status: 'tested',
    later: r.first,
    earlier: r.second,
    ...(r.fpc !== undefined ? { fpc: r.fpc } : {}),
    test: r.test,
    ...(r.pOpposite !== undefined ? { pOpposite: r.pOpposite } : {}),
    observedSign: sign(r.difference.value),
    difference: r.difference,
    cohensH: r.cohensH,
    ...(r.detectable !== undefined ? { detectable: r.detectable } : {}),
    ...(r.responseRate !== undefined ? { responseRate: r.responseRate } : {}),
    methods: r.methods,
  };
}
