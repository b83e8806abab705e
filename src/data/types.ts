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
  /** summary sources: true when the row's counts were withheld in the release (a marker such as "*" or "[c]"); n and agree are 0. */
  suppressed?: true;
  /** summary sources: true when the row's number eligible was withheld (its counts are used, its population is not known). */
  populationSuppressed?: true;
}

/** Where a source's table ended and what followed it (see src/data/table.ts). */
export interface TableEnd {
  /** Last row of the table (1-based, as numbered in the file). */
  lastRow: number;
  /** Non-blank rows below the table, read as notes. */
  noteRows: number;
  /** Row number of the first note. */
  firstNoteRow: number;
  /** The first note's text, shortened. */
  firstNote: string;
  /** 'detected' when found after a blank row, 'source' when set by last_row. */
  by: 'detected' | 'source';
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
  /** summary sources: rows whose counts were withheld in the release (cells with `suppressed`), when any. */
  suppressedRows?: number;
  /** The markers read as suppressed in this source, with how many cells held each, when any. */
  suppressedMarkers?: Record<string, number>;
  /** Footnote markers read after numbers ("120*"), each with how many cells and the first cell's text and row. */
  footnotes?: Array<{ marker: string; cells: number; example: string; row: number }>;
  /** Set when rows below the table were read as notes (or the source set the table's last row). */
  tableEnd?: TableEnd;
  /** 2 when the header spans two rows. */
  headerRows?: 2;
  /** Wording for columns from a second header row (codes above wording), by column name. */
  labels?: Record<string, string>;
}

/** Counts pooled over the cells a selection matches (respondent-weighted, never an average of percentages). */
export interface Pooled {
  n: number;
  agree: number;
  population?: number;
  approximate: boolean;
  /** Number of cells pooled (suppressed ones included). */
  cells: number;
  /** How many of the cells pooled were suppressed in the release (summary sources; absent when none). */
  suppressed?: number;
  /** Pooled answer-code counts (respondents sources). */
  codes?: Record<string, number>;
  /** Pooled not-applicable and blank answers (respondents sources). */
  notApplicable?: number;
  blank?: number;
  /** Pooled numeric-column sums (summary sources). */
  numeric?: Record<string, { weightedSum: number; weight: number }>;
}
