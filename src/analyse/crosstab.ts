/**
 * Claim kind "crosstab": whether two categorical variables are related, e.g. campus by agreeing / not agreeing, or
 * campus by mode of study.
 *
 * Table rows are the values of `rows` within the claim's `where`; columns are agreeing / not agreeing (from each
 * row's pooled counts) or the values of another column (each cell's count is the respondents there). Rows with
 * fewer respondents than the minimum are left out and named, without their counts.
 *
 * Test: Pearson's chi-square test of independence without continuity correction (Yates only when asked, and only
 * for a 2 × 2 table); Fisher's exact test (2 × 2, or r × c by the network algorithm) when any expected count is
 * below 5 (Cochran (1954), Biometrics 10, 417–451), falling back to chi-square with a caution when the r × c table
 * is too large to enumerate. Effect size: Cramér's V. Cells whose adjusted standardized residual lies beyond ±1.96
 * (Agresti (2013), Categorical Data Analysis, 3rd ed., §2.4.5) are named as the ones that drive the result.
 * The claim expects a relation, so the verdict is supported (related) or not supported; there is no "other way".
 */
import type { CrosstabClaim } from '../claims/types.js';
import type { Cube } from '../data/types.js';
import { chiSquareIndependence } from '../stats/chi-square-independence.js';
import { fisherExact2x2 } from '../stats/fisher-exact-2x2.js';
import { FisherTooLargeError, fisherExactRxc } from '../stats/fisher-exact-rxc.js';
import type { TestResult } from '../stats/result.js';
import type { CompareContext } from './compare.js';
import { InputError } from '../errors.js';
import { cellsByUnit, poolCells } from '../data/select.js';
import { unitNamer } from './labels.js';
import { shortfall } from './thresholds.js';
import type { CrosstabAnalysis } from './types.js';
import { normalSfQuantile } from '../stats/distributions/normal.js';

/** Adjusted residuals beyond this are named at 95% confidence (two-sided 5% point of the standard normal; common practice). */
export const RESIDUAL_CUTOFF = 1.96;

/** The cutoff at a claim's confidence level: the two-sided normal critical value (1.96 at 95%, 2.58 at 99%). */
export function residualCutoff(confidence: number): number {
  return Math.abs(confidence - 0.95) < 1e-12 ? RESIDUAL_CUTOFF : normalSfQuantile((1 - confidence) / 2);
}

export interface CrosstabOptions {
  /** Yates' continuity correction for a 2 × 2 table (default false). */
  yates?: boolean;
}

export function analyseCrosstab(claim: CrosstabClaim, cube: Cube, ctx: CompareContext, options: CrosstabOptions = {}): CrosstabAnalysis {
  const name = unitNamer(claim.naming);
  const byRow = periodOrder(cellsByUnit(cube, claim.where, claim.rows, name), claim);
  const agreement = claim.columns === 'agreement';
  const answers = claim.columns === 'answers' ? answerColumns(claim, cube, ctx) : undefined;
  const splitBy = Array.isArray(claim.columns) ? claim.columns : undefined;
  let columnLabels: string[];
  if (agreement) columnLabels = ['agreeing', 'not agreeing'];
  else if (answers !== undefined) columnLabels = answers.scale.map(String);
  else columnLabels = [...cellsByUnit(cube, claim.where, splitBy as string[], name).keys()];
  const rowLabels: string[] = [];
  const counts: number[][] = [];
  const suppressedRows: string[] = [];
  const leftOut = { notApplicable: 0, blank: 0, offScale: 0 };
  for (const [row, cells] of byRow) {
    const pooled = poolCells(cube, cells);
    const inTable = answers !== undefined ? answers.scale.reduce((s, code) => s + (pooled.codes?.[String(code)] ?? 0), 0) : pooled.n;
    if (inTable <= 0 || shortfall(claim, [{ label: row, pooled: { ...pooled, n: inTable } }]) !== undefined) {
      suppressedRows.push(row);
      continue;
    }
    rowLabels.push(row);
    if (agreement) {
      const agree = Math.round(pooled.agree);
      counts.push([agree, Math.round(pooled.n) - agree]);
    } else if (answers !== undefined) {
      counts.push(answers.scale.map((code) => pooled.codes?.[String(code)] ?? 0));
      leftOut.notApplicable += pooled.notApplicable ?? 0;
      leftOut.blank += pooled.blank ?? 0;
      leftOut.offScale += pooled.n - inTable;
    } else {
      const byColumn = cellsByUnit({ ...cube, cells }, {}, splitBy as string[], name);
      counts.push(columnLabels.map((col) => Math.round((byColumn.get(col) ?? []).reduce((s, c) => s + c.n, 0))));
    }
  }
  // Columns nobody fell into add nothing to either test; leave them out so residuals line up with labels.
  const keep = columnLabels.map((_, j) => counts.some((r) => (r[j] as number) > 0));
  const cols = columnLabels.filter((_, j) => keep[j]);
  const table = counts.map((r) => r.filter((_, j) => keep[j]));
  const base = {
    kind: 'crosstab' as const,
    claim,
    rowLabels,
    columnLabels: cols,
    counts: table,
    suppressedRows,
    notable: [] as CrosstabAnalysis['notable'],
    ...(answers !== undefined ? { answers: { question: answers.question, scale: answers.scale, ...leftOut } } : {}),
    expectSign: 0 as const,
    methods: [] as string[],
  };
  if (rowLabels.length < 2 || cols.length < 2) {
    const why =
      rowLabels.length < 2
        ? `only ${rowLabels.length} of the ${[claim.rows].flat().join(' and ').toLowerCase()} values ${rowLabels.length === 1 ? 'has' : 'have'} at least ${claim.minRespondents} respondents, and at least 2 are needed`
        : `every respondent falls in the same column (${cols[0] ?? 'none'}), so there is nothing to relate`;
    return { ...base, rowLabels: [], counts: [], columnLabels: [], status: 'too-little-data', shortfall: why, observedSign: 0 };
  }
  const chi = chiSquareIndependence(table, { yates: options.yates ?? false });
  let test: TestResult = chi;
  let method = chi.method;
  let fisherTooLarge = false;
  if (chi.minExpected < 5) {
    const is2x2 = table.length === 2 && cols.length === 2;
    try {
      if (is2x2) {
        const [[a, b], [c, d]] = table as [[number, number], [number, number]];
        test = fisherExact2x2(a, b, c, d, { alternative: 'two-sided', level: claim.confidence });
      } else {
        test = fisherExactRxc(table);
      }
      method = test.method;
    } catch (e) {
      if (!(e instanceof FisherTooLargeError)) throw e;
      fisherTooLarge = true;
    }
  }
  const notable: CrosstabAnalysis['notable'] = [];
  const cutoff = residualCutoff(claim.confidence);
  chi.adjustedResiduals.forEach((r, i) =>
    r.forEach((res, j) => {
      // With agreeing / not agreeing the two cells of a row mirror each other: name the agreeing one only.
      if (agreement && j > 0) return;
      if (Math.abs(res) > cutoff) notable.push({ row: rowLabels[i] as string, column: cols[j] as string, residual: res });
    }),
  );
  notable.sort((a, b) => Math.abs(b.residual) - Math.abs(a.residual));
  return {
    ...base,
    status: 'tested',
    test,
    observedSign: chi.cramersV > 0 ? 1 : 0,
    cramersV: chi.cramersV,
    minExpected: chi.minExpected,
    notable,
    residualCutoff: cutoff,
    ...(fisherTooLarge ? { fisherTooLarge } : {}),
    methods: [...(method === chi.method ? [chi.method] : [method, chi.method]), 'power-chi-square'],
  };
}

/**
 * Rows that are the source's periods go in time order (2025 before 2026), whatever order the file holds them in, so
 * the table reads forward and a table of two periods names the later one. Other rows keep the file's order.
 */
function periodOrder<T>(byRow: Map<string, T>, claim: CrosstabClaim): Map<string, T> {
  const rows = [claim.rows].flat();
  if (rows.length !== 1 || claim.naming?.period === undefined || rows[0] !== claim.naming.period) return byRow;
  return new Map([...byRow].sort(([x], [y]) => x.localeCompare(y, 'en', { numeric: true })));
}

/** The answer scale when none is written: the five points of the usual agreement scale. */
export const DEFAULT_SCALE = [1, 2, 3, 4, 5];

/**
 * For `columns: answers`: the one question whose answers make the columns (the claim's `where` must select exactly
 * one on the question column) and the codes shown. Only a respondent-level source has answers to spread.
 */
function answerColumns(claim: CrosstabClaim, cube: Cube, ctx: CompareContext): { question: string; scale: number[] } {
  const refuse = (problem: string, fix: string, found?: string): never => {
    throw new InputError({
      file: ctx.claimsFile,
      line: claim.place.line,
      column: claim.place.column,
      field: `claims.${claim.id}.columns`,
      ...(found !== undefined ? { found } : {}),
      problem,
      fix,
    });
  };
  if (cube.hasCodes !== true || cube.questionColumn === undefined) {
    refuse(
      `claim "${claim.id}" spreads the answers across the table's columns, but source "${cube.sourceId}" holds counts per group, not each respondent's answer`,
      'use a source of shape respondents, or write columns: agreement to split by agreeing / not agreeing',
    );
  }
  const qCol = cube.questionColumn as string;
  const written = claim.where[qCol];
  const picked = written === undefined || (typeof written === 'object' && !Array.isArray(written)) ? [] : Array.isArray(written) ? written : [written];
  if (picked.length !== 1) {
    refuse(
      `claim "${claim.id}" spreads the answers to one question across the table's columns, but its where ${picked.length === 0 ? 'selects no single question' : `selects ${picked.length} questions`}`,
      `name one question in where, e.g. where: { ${qCol}: ${cube.values[qCol]?.[0] ?? 'Q01'} }; to compare questions, write one claim per question`,
      picked.length > 0 ? picked.join(', ') : undefined,
    );
  }
  return { question: String(picked[0]).trim(), scale: claim.scale ?? DEFAULT_SCALE };
}
