/**
 * Pearson's chi-square test of independence for an r × c table of counts (rows: groups, columns: answer
 * categories, or the other way round).
 *
 * Sources:
 * - Pearson K. (1900) "On the criterion that a given system of deviations...", Philosophical Magazine 50, 157–175.
 * - Yates F. (1934) "Contingency tables involving small numbers and the χ² test", Suppl. JRSS 1, 217–235: the
 *   continuity correction for 2 × 2 tables, applied as in R's chisq.test: each |O − E| is reduced by
 *   min(0.5, |O − E|).
 * - Agresti A. (2013) Categorical Data Analysis, 3rd ed., §2.4.5: adjusted (standardized) residuals
 *   (O − E) / sqrt(E (1 − row share)(1 − column share)), approximately standard normal under independence.
 * - Cramér H. (1946) Mathematical Methods of Statistics, §21.9: V = sqrt(X² / (N (min(r, c) − 1))), computed from
 *   the uncorrected statistic.
 *
 * The p-value is the upper tail of chi-square with (r − 1)(c − 1) degrees of freedom. A warning is added when any
 * expected count is below 5 (Cochran W. G. (1954) "Some methods for strengthening the common χ² tests",
 * Biometrics 10, 417–451), when the approximation may be poor and Fisher's exact test is the better choice.
 *
 * Rows and columns with no observations are left out, with a warning saying so; expected counts and residuals
 * then refer to the reduced table.
 *
 * @throws Error when the table is not rectangular, holds a negative or non-finite count, or has fewer than 2 rows
 *   or columns with observations.
 * @example chiSquareIndependence([[762, 327, 468], [484, 239, 477]]).statistic.value // 30.07 (Agresti 2007, §2.4)
 */
import { chisqSf } from './distributions/chisq.js';
import type { TestResult } from './result.js';

export interface ChiSquareOptions {
  /** Apply Yates' continuity correction; only ever applied to a 2 × 2 table (R's `correct`). Default true. */
  yates?: boolean;
}

export interface ChiSquareResult extends TestResult {
  statistic: { symbol: string; value: number };
  df: number;
  /** Expected counts under independence, same shape as the table. */
  expected: number[][];
  /** Pearson residuals (O − E) / sqrt(E). */
  residuals: number[][];
  /** Adjusted standardized residuals (Agresti); |value| > 2 marks a cell that departs from independence. */
  adjustedResiduals: number[][];
  /** Cramér's V from the uncorrected statistic, in [0, 1]. */
  cramersV: number;
  /** True when Yates' correction was applied. */
  yates: boolean;
  /** Smallest expected count. */
  minExpected: number;
}

export function chiSquareIndependence(table0: readonly (readonly number[])[], options: ChiSquareOptions = {}): ChiSquareResult {
  const checked = checkTable(table0, 'chiSquareIndependence');
  const { table, rows, cols, rowSums, colSums, total } = checked;
  const yates = (options.yates ?? true) && rows === 2 && cols === 2;

  const expected: number[][] = [];
  const residuals: number[][] = [];
  const adjusted: number[][] = [];
  let statistic = 0;
  let uncorrected = 0;
  let minExpected = Infinity;
  for (let i = 0; i < rows; i++) {
    const eRow: number[] = [];
    const rRow: number[] = [];
    const aRow: number[] = [];
    const ri = rowSums[i] as number;
    for (let j = 0; j < cols; j++) {
      const cj = colSums[j] as number;
      const e = (ri * cj) / total;
      const o = (table[i] as number[])[j] as number;
      const d = o - e;
      uncorrected += (d * d) / e;
      const shrink = yates ? Math.min(0.5, Math.abs(d)) : 0;
      const dc = Math.abs(d) - shrink;
      statistic += (dc * dc) / e;
      minExpected = Math.min(minExpected, e);
      eRow.push(e);
      rRow.push(d / Math.sqrt(e));
      aRow.push(d / Math.sqrt(e * (1 - ri / total) * (1 - cj / total)));
    }
    expected.push(eRow);
    residuals.push(rRow);
    adjusted.push(aRow);
  }
  const df = (rows - 1) * (cols - 1);
  const warnings: string[] = checked.dropped.slice();
  if (minExpected < 5) {
    let small = 0;
    for (const row of expected) for (const e of row) if (e < 5) small++;
    warnings.push(
      `${small} of ${rows * cols} expected counts ${small === 1 ? 'is' : 'are'} below 5 (smallest ${round2(minExpected)}), ` +
        'so the chi-square p-value may be inaccurate; Fisher’s exact test is safer here.',
    );
  }
  const cramersV = Math.sqrt(uncorrected / (total * (Math.min(rows, cols) - 1)));
  return {
    method: yates ? 'chi-square-independence-yates' : 'chi-square-independence',
    statistic: { symbol: 'X²', value: statistic },
    df,
    p: chisqSf(statistic, df),
    alternative: 'two-sided',
    nullValue: 0,
    estimate: { name: 'Cramér’s V', value: Math.min(1, cramersV) },
    n: rowSums.slice(),
    warnings,
    expected,
    residuals,
    adjustedResiduals: adjusted,
    cramersV: Math.min(1, cramersV),
    yates,
    minExpected,
  };
}

function round2(x: number): string {
  return (Math.round(x * 100) / 100).toString();
}

export interface CheckedTable {
  /** The table with empty rows and columns left out. */
  table: number[][];
  rows: number;
  cols: number;
  rowSums: number[];
  colSums: number[];
  total: number;
  /** Sentences naming rows and columns left out because they had no observations. */
  dropped: string[];
}

/**
 * Validate a table of counts: rectangular, finite non-negative entries (whole numbers when `integers`). Rows and
 * columns with no observations are left out (an answer nobody chose adds nothing to either test), and at least
 * 2 × 2 must remain. Shared by the contingency-table methods.
 */
export function checkTable(
  table: readonly (readonly number[])[],
  who: string,
  integers = false,
): CheckedTable {
  const rows0 = table.length;
  const cols0 = rows0 > 0 ? (table[0] as readonly number[]).length : 0;
  const rowSums0 = new Array<number>(rows0).fill(0);
  const colSums0 = new Array<number>(cols0).fill(0);
  table.forEach((row, i) => {
    if (row.length !== cols0) {
      throw new Error(`${who}: row ${i + 1} has ${row.length} counts but row 1 has ${cols0}; the table must be rectangular`);
    }
    row.forEach((v, j) => {
      if (!Number.isFinite(v) || v < 0 || (integers && !Number.isInteger(v))) {
        throw new Error(
          `${who}: the count in row ${i + 1}, column ${j + 1} is ${v}; counts must be ` +
            (integers ? 'whole numbers >= 0' : 'finite numbers >= 0'),
        );
      }
      rowSums0[i] = (rowSums0[i] as number) + v;
      colSums0[j] = (colSums0[j] as number) + v;
    });
  });
  const keepRows = rowSums0.map((s, i) => (s > 0 ? i : -1)).filter((i) => i >= 0);
  const keepCols = colSums0.map((s, j) => (s > 0 ? j : -1)).filter((j) => j >= 0);
  const dropped: string[] = [];
  const emptyRows = rowSums0.map((s, i) => (s > 0 ? 0 : i + 1)).filter((i) => i > 0);
  const emptyCols = colSums0.map((s, j) => (s > 0 ? 0 : j + 1)).filter((j) => j > 0);
  if (emptyRows.length > 0) {
    dropped.push(`Row${emptyRows.length > 1 ? 's' : ''} ${emptyRows.join(', ')} had no observations and ${emptyRows.length > 1 ? 'were' : 'was'} left out.`);
  }
  if (emptyCols.length > 0) {
    dropped.push(`Column${emptyCols.length > 1 ? 's' : ''} ${emptyCols.join(', ')} had no observations and ${emptyCols.length > 1 ? 'were' : 'was'} left out.`);
  }
  if (keepRows.length < 2) {
    throw new Error(`${who}: the table has ${keepRows.length} row(s) with observations; at least 2 are needed`);
  }
  if (keepCols.length < 2) {
    throw new Error(`${who}: the table has ${keepCols.length} column(s) with observations; at least 2 are needed`);
  }
  const reduced = keepRows.map((i) => keepCols.map((j) => (table[i] as readonly number[])[j] as number));
  const rowSums = keepRows.map((i) => rowSums0[i] as number);
  const colSums = keepCols.map((j) => colSums0[j] as number);
  const total = rowSums.reduce((a, b) => a + b, 0);
  return { table: reduced, rows: keepRows.length, cols: keepCols.length, rowSums, colSums, total, dropped };
}
