/**
 * A quick look at a data file for writing and checking claims: its column names and, for each column, its distinct
 * values (up to a limit), whether every value is a number, and whether the values look like answer codes 1-5.
 * Rows are streamed and dropped; only the distinct values kept per column grow with the file.
 */
import { readCsvRows } from '../data/csv.js';
import { openXlsxSheet } from '../data/xlsx.js';
import { isBlankRow, type SheetRow } from '../data/rows.js';
import { InputError } from '../errors.js';

/** Columns with at most this many distinct values have them listed. */
export const LIST_LIMIT = 50;
/** Distinct values are counted up to this many; beyond it the count is "more than". */
export const COUNT_LIMIT = 10_000;

export interface ColumnScan {
  name: string;
  /** Distinct non-blank values in order of first appearance (all of them when `distinct` <= LIST_LIMIT). */
  values: string[];
  /** Number of distinct non-blank values, up to COUNT_LIMIT (then `more` is true). */
  distinct: number;
  more: boolean;
  /** Non-blank cells. */
  filled: number;
  /** Every non-blank value is a decimal number. */
  numeric: boolean;
  /** Every non-blank value is a whole number. */
  integer: boolean;
}

export interface TableScan {
  /** The sheet read (XLSX). */
  sheet?: string;
  /** 1-based row of the column names. */
  headerRow: number;
  /** Data rows read (not blank rows). */
  rows: number;
  columns: ColumnScan[];
}

const DECIMAL = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

async function openRows(path: string, format: 'csv' | 'xlsx', displayPath: string, sheet?: string): Promise<{ rows: AsyncGenerator<SheetRow>; sheet?: string; close: () => void }> {
  if (format === 'xlsx') {
    const opened = await openXlsxSheet(path, { displayPath, ...(sheet !== undefined ? { sheet } : {}) });
    return { rows: opened.rows, sheet: opened.sheet, close: opened.close };
  }
  return { rows: readCsvRows(path, { displayPath }), close: () => {} };
}

/**
 * Read the file's header and (unless `headerOnly`) every value.
 * @throws InputError when the file cannot be read or has no header row
 */
export async function scanTable(
  path: string,
  format: 'csv' | 'xlsx',
  opts: { displayPath: string; sheet?: string; headerRow?: number; headerOnly?: boolean },
): Promise<TableScan> {
  const opened = await openRows(path, format, opts.displayPath, opts.sheet);
  const where = { file: opts.displayPath, ...(opened.sheet !== undefined ? { sheet: opened.sheet } : {}) };
  try {
    let header: SheetRow | undefined;
    const sets: Array<Set<string>> = [];
    const columns: ColumnScan[] = [];
    let rows = 0;
    for await (const r of opened.rows) {
      if (header === undefined) {
        if (opts.headerRow !== undefined ? r.row !== opts.headerRow : isBlankRow(r.values)) continue;
        header = r;
        for (const name of r.values.map((v) => v.trim())) {
          columns.push({ name, values: [], distinct: 0, more: false, filled: 0, numeric: true, integer: true });
          sets.push(new Set());
        }
        if (opts.headerOnly) break;
        continue;
      }
      if (isBlankRow(r.values)) continue;
      rows += 1;
      columns.forEach((col, i) => {
        const v = (r.values[i] ?? '').trim();
        if (v === '') return;
        col.filled += 1;
        if (!DECIMAL.test(v)) col.numeric = false;
        if (!/^[+-]?\d+$/.test(v)) col.integer = false;
        const set = sets[i]!;
        if (!col.more && !set.has(v)) {
          if (set.size >= COUNT_LIMIT) col.more = true;
          else set.add(v);
        }
      });
    }
    if (header === undefined) {
      throw new InputError({
        ...where,
        ...(opts.headerRow !== undefined ? { row: opts.headerRow } : {}),
        problem: opts.headerRow !== undefined ? 'The file has no such row' : 'The file has no rows with any text',
        fix: 'Check that this is the right file, and that it was saved with its data',
      });
    }
    columns.forEach((col, i) => {
      const set = sets[i]!;
      col.distinct = set.size;
      col.values = [...set].slice(0, LIST_LIMIT + 1);
      if (col.filled === 0) {
        col.numeric = false;
        col.integer = false;
      }
    });
    return { ...(opened.sheet !== undefined ? { sheet: opened.sheet } : {}), headerRow: header.row, rows, columns: columns.filter((c) => c.name !== '') };
  } finally {
    await opened.rows.return(undefined);
    opened.close();
  }
}
