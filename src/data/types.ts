/**
 * The data model every source reduces to: a cube of counts. One streaming pass over a file adds each row into the
 * cell for its combination of dimension values; rows are never kept, so memory grows with the number of distinct
 * groups, not the number of rows.
 *
 * - summary sources: each row is already a group (respondents, agreeing, optional population). Dimensions are every
 *   column that is not a measure column. Two rows with the same dimension values are a duplicate error.
 * - respondents sources: each row is a person; each answer column (question) contributes to the cell for
 *   (the row's dimension values, question code). A valid answer adds 1 to n, and 1 to agree when it is an agree code.
 *   Dimensions are only the columns the claims refer to (so a respondent id column does not explode the cube), plus
 *   the question column.
 */

export interface Cell {
  /** Dimension values, as text exactly as in the file (numbers written without trailing zeros). */
  dims: Record<string, string>;
  /** Number who answered (the base). */
  n: number;
  /** Number who agreed. */
  agree: number;
  /** Number eligible, when the source has a population column (summed over rows). */
  population?: number;
  /** True when agree was derived from a rounded percentage. */
  approximate: boolean;
  /** First data row (1-based, as numbered in the file) that contributed to this cell. */
  firstRow: number;
  /** respondents sources: how many valid answers had each code (code as text -> count), for mean scores and ranks. */
  codes?: Record<string, number>;
  /** respondents sources: answers coded "not applicable" (left out of n), where any. */
  notApplicable?: number;
  /** respondents sources: blank answers in rows that answered something else (left out of n), where any. */
  blank?: number;
  /** summary sources: per numeric column, the sum of value × respondents and the sum of respondents weighted. */
  numeric?: Record<string, { weightedSum: number; weight: number }>;
}

export interface Cube {
  sourceId: string;
  /** File as written in the claims file. */
  file: string;
  /** SHA-256 of the file's bytes, hex. */
  sha256: string;
  /** Data rows read (not counting header and blank rows). */
  rows: number;
  /** Dimension column names in the cube. */
  dimensions: string[];
  cells: Cell[];
  /** Distinct values seen per dimension (for checks and suggestions). */
  values: Record<string, string[]>;
  /** True when any cell's agree count came from a rounded percentage. */
  approximate: boolean;
  /** True when the source has a population column. */
  hasPopulation: boolean;
  /** Worksheet read, for XLSX sources. */
  sheet?: string;
  /** Plain-words notes on how the data were read (e.g. a percent column read as fractions), for the pack. */
  notes?: string[];
  /** summary sources: the numeric columns read (SourceSpec.numeric), each present in every cell's `numeric`. */
  numericColumns?: string[];
  /** respondents sources: true, and every cell carries `codes`. */
  hasCodes?: boolean;
  /** respondents sources: the name the question codes appear under (SourceSpec.questionColumn). */
  questionColumn?: string;
}

/** Counts pooled over the cells a selection matches (respondent-weighted, never an average of percentages). */
export interface Pooled {
  n: number;
  agree: number;
  population?: number;
  approximate: boolean;
  /** Number of cells pooled. */
  cells: number;
  /** Pooled answer-code counts (respondents sources). */
  codes?: Record<string, number>;
  /** Pooled not-applicable and blank answers (respondents sources). */
  notApplicable?: number;
  blank?: number;
  /** Pooled numeric-column sums (summary sources). */
  numeric?: Record<string, { weightedSum: number; weight: number }>;
}
