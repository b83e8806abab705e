/**
 * What both file readers (CSV and XLSX) yield: one row at a time, numbered as a spreadsheet program would number it,
 * so that an error message can point the user at the right row.
 */

export interface SheetRow {
  /** 1-based row number as a spreadsheet shows it (the first line or row of the file or sheet is 1). */
  row: number;
  /** Cell texts, left to right; missing cells are empty strings. */
  values: string[];
}

export interface ReadOptions {
  /** Bytes per read from the file (CSV) or per piece of decompressed XML (XLSX). Small values are for tests. */
  chunkSize?: number;
  /** The file as the user wrote it, for messages. Defaults to the path. */
  displayPath?: string;
}

/** True when every value is blank (empty or whitespace only). */
export function isBlankRow(values: readonly string[]): boolean {
  return values.every((v) => v.trim() === '');
}
