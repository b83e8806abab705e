/**
 * What both file readers (CSV and XLSX) yield: one row at a time, numbered as a spreadsheet program would number it,
 * so that an error message can point the user at the right row.
 */

export interface SheetRow {
  /** 1-based row number as a spreadsheet shows it (the first line or row of the file or sheet is 1). */
  row: number;
  /** Cell texts, left to right; missing cells are empty strings. */
  values: string[];
  /**
   * Set by a reader that knows it: true when every cell of the row is blank. A reader told to leave columns out
   * (`ReadOptions.select`) sets it from the whole row, so that a row with text only in a column left out is still a
   * row. When absent, use `isBlankRow(values)`.
   */
  blank?: boolean;
}

/**
 * Which columns a reader should hand over. `keep` is filled in by the consumer once it has read the header row (the
 * reader looks at it for each later piece of the file): cells of columns not kept read as empty strings and are never
 * made into strings. Until then, and when `keep` is left undefined, every cell is read.
 */
export interface ColumnSelection {
  keep?: readonly boolean[];
  /**
   * Set with `keep` by a consumer that takes plain lines straight from the bytes (a CSV reader hands them over instead
   * of making rows of them, in the same order as the rows it yields around them).
   */
  lines?: ByteLineSink;
}

/**
 * Takes lines straight from a CSV file's bytes: `lines` reads b[from, end), well-formed UTF-8 with no double quote,
 * where `end` is just past a line feed; fields end at the delimiter byte `d`, lines at a line feed (for `crlf`, a
 * carriage return then a line feed; a line feed alone stops the read there). Lines are numbered from `firstRow`.
 * Returns where it stopped (`end`, or the start of a line it leaves to the reader's other paths) and how many lines
 * it took.
 */
export interface ByteLineSink {
  lines(b: Uint8Array, from: number, end: number, crlf: boolean, d: number, firstRow: number): { at: number; rows: number };
  /**
   * Set by a consumer that can tally a range of the file elsewhere (a worker thread): the bytes [start, end) of the
   * file at `path`, where `start` is a line's start (that of a record, if the reader gets there with nothing carried
   * over). Offered for files of `splitFrom` bytes or more.
   */
  split?: (path: string, start: number, end: number, crlf: boolean, d: number) => SplitTally;
  splitFrom?: number;
}

/** A range of a file being tallied elsewhere (see ByteLineSink.split). */
export interface SplitTally {
  /**
   * The reader has read every line before the range's start, the first of the range being row `firstRow`: true once
   * the range's tally has been added to the consumer's, false when the reader must read the range itself.
   */
  finish(firstRow: number): Promise<boolean>;
  /** Stop the work; nothing of it is added. Safe to call more than once, and after finish. */
  cancel(): void;
}

export interface ReadOptions {
  /** Bytes per read from the file (CSV) or per piece of decompressed XML (XLSX). Small values are for tests. */
  chunkSize?: number;
  /** The file as the user wrote it, for messages. Defaults to the path. */
  displayPath?: string;
  /** Columns to hand over (see ColumnSelection); all when absent. */
  select?: ColumnSelection;
}

/** True when every value is blank (empty or whitespace only). */
export function isBlankRow(values: readonly string[]): boolean {
  return values.every((v) => v.trim() === '');
}

/** True when the row is blank: the reader's `blank` when it set one, else from the values. */
export function rowIsBlank(r: SheetRow): boolean {
  return r.blank ?? isBlankRow(r.values);
}

/**
 * True for the characters String.prototype.trim removes (ECMAScript 2023 §22.1.3.32: WhiteSpace and LineTerminator):
 * tab, line feed, vertical tab, form feed, carriage return, space, no-break space, the Unicode space separators
 * (category Zs), line and paragraph separators, and the byte-order mark.
 */
export function isTrimmedSpace(c: number): boolean {
  if (c <= 32) return c === 32 || (c >= 9 && c <= 13);
  if (c < 0xa0) return false;
  return c === 0xa0 || c === 0x1680 || (c >= 0x2000 && c <= 0x200a) || c === 0x2028 || c === 0x2029 || c === 0x202f || c === 0x205f || c === 0x3000 || c === 0xfeff;
}
