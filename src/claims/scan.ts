/**
 * A quick look at a data file for writing and checking claims: its column names and, for each column, its distinct
 * values (up to a limit), whether every value is a number, and whether the values look like answer codes 1-5.
 * Rows are streamed and dropped; only the distinct values kept per column grow with the file.
 */
import { readCsvRows } from '../data/csv.js';
import { openXlsxSheet } from '../data/xlsx.js';
import { isBlankRow, type SheetRow } from '../data/rows.js';
import { InputError } from '../errors.js';
import { isSuppressedMarker, isTitleRow, looksLikeDataRow, markerSet, MAX_NOTE_ROWS, oneRowHeader, quoteRow, secondHeaderRow, splitFootnote, twoRowHeader, type Header } from '../data/table.js';

/** Columns with at most this many distinct values have them listed. */
export const LIST_LIMIT = 50;
/** Distinct values are counted up to this many; beyond it the count is "more than". */
export const COUNT_LIMIT = 10_000;

export interface ColumnScan {
  name: string;
  /** Distinct non-blank values in order of first appearance (all of them when `distinct` <= LIST_LIMIT). */
  values: string[];
  /** Rows holding each of `values`, in the same order. */
  counts: number[];
  /** Number of distinct non-blank values, up to COUNT_LIMIT (then `more` is true). */
  distinct: number;
  more: boolean;
  /** Non-blank cells. */
  filled: number;
  /** Every non-blank value is a number (thousands separators, a % sign or a footnote marker allowed), or a suppression marker. */
  numeric: boolean;
  /** Every non-blank value is a whole number (or a suppression marker). */
  integer: boolean;
  /** Cells holding a suppression marker, by marker (only for a column otherwise of numbers). */
  markers: Record<string, number>;
  /** Cells holding a number with a footnote marker ("120*"). */
  footnoted: number;
  /** Cells holding a number (footnoted or not). */
  numbers: number;
  /** Every cell holding a number holds a whole number. */
  wholeNumbers: boolean;
  /** Up to five other short texts (neither numbers nor known markers) with how many cells held each. */
  otherTexts: Record<string, number>;
  /** Wording from a second header row (codes above wording). */
  label?: string;
  /** The other header row's text, which also names this column. */
  alias?: string;
}

export interface TableScan {
  /** The sheet read (XLSX). */
  sheet?: string;
  /** 1-based row of the column names. */
  headerRow: number;
  /** Rows the header spans. */
  headerRows: 1 | 2;
  /** Data rows read (not blank rows, not notes). */
  rows: number;
  columns: ColumnScan[];
  /** Rows below the table taken as notes: the table's last row, how many notes, the first one. */
  tableEnd?: { lastRow: number; noteRows: number; firstNoteRow: number; firstNote: string };
}

/** A number as a published table writes it: thousands separators, a decimal point or comma, a % sign. */
const NUMBER = /^[+-]?(\d{1,3}(,\d{3})+|\d+)?([.,]\d+)?%?$/;

async function openRows(path: string, format: 'csv' | 'xlsx', displayPath: string, sheet?: string): Promise<{ rows: AsyncGenerator<SheetRow>; sheet?: string; close: () => void }> {
  if (format === 'xlsx') {
    const opened = await openXlsxSheet(path, { displayPath, ...(sheet !== undefined ? { sheet } : {}) });
    return { rows: opened.rows, sheet: opened.sheet, close: opened.close };
  }
  return { rows: readCsvRows(path, { displayPath }), close: () => {} };
}

/**
 * Read the file's header (one or two rows, see src/data/table.ts) and (unless `headerOnly`) every value, up to
 * `maxRows` data rows when given. Rows after a blank row that do not look like data are notes, not values.
 * @throws InputError when the file cannot be read or has no header row
 */
export async function scanTable(
  path: string,
  format: 'csv' | 'xlsx',
  opts: { displayPath: string; sheet?: string; headerRow?: number; headerRows?: 1 | 2; lastRow?: number; suppressed?: string[]; headerOnly?: boolean; maxRows?: number },
): Promise<TableScan> {
  const opened = await openRows(path, format, opts.displayPath, opts.sheet);
  const where = { file: opts.displayPath, ...(opened.sheet !== undefined ? { sheet: opened.sheet } : {}) };
  const markers = markerSet(opts.suppressed);
  try {
    let top: SheetRow | undefined;
    let header: Header | undefined;
    const sets: Array<Map<string, number>> = [];
    const columns: ColumnScan[] = [];
    const text: boolean[] = []; // a column holds text other than numbers and markers
    let rows = 0;
    let lastRow = 0;
    let afterBlank = false;
    let seenRow = 0;
    let held: SheetRow[] = [];
    const notes: SheetRow[] = [];
    const start = (h: Header): void => {
      header = h;
      h.names.forEach((name, i) => {
        const other = [...h.aliases].find(([, k]) => k === i)?.[0];
        columns.push({ name, values: [], counts: [], distinct: 0, more: false, filled: 0, numeric: true, integer: true, markers: {}, footnoted: 0, numbers: 0, wholeNumbers: true, otherTexts: {}, ...(h.labels[name] !== undefined ? { label: h.labels[name] } : {}), ...(other !== undefined ? { alias: other } : {}) });
        sets.push(new Map());
        text.push(false);
      });
    };
    const add = (r: SheetRow): void => {
      rows += 1;
      lastRow = r.row;
      columns.forEach((col, i) => {
        const v = (r.values[i] ?? '').trim();
        if (v === '') return;
        col.filled += 1;
        if (isSuppressedMarker(v, markers)) col.markers[v] = (col.markers[v] ?? 0) + 1;
        else {
          const f = splitFootnote(v);
          const bare = f !== undefined ? f.number : v;
          if (f !== undefined) col.footnoted += 1;
          const whole = /^[+-]?(\d{1,3}(,\d{3})+|\d+)$/.test(bare);
          if (!(NUMBER.test(bare) && /\d/.test(bare))) {
            col.numeric = false;
            text[i] = true;
            if (v.length <= 12 && (col.otherTexts[v] !== undefined || Object.keys(col.otherTexts).length < 5)) col.otherTexts[v] = (col.otherTexts[v] ?? 0) + 1;
          } else {
            col.numbers += 1;
            if (!whole) col.wholeNumbers = false;
          }
          if (!whole) col.integer = false;
        }
        const set = sets[i]!;
        const seen = set.get(v);
        if (seen !== undefined) set.set(v, seen + 1);
        else if (!col.more) {
          if (set.size >= COUNT_LIMIT) col.more = true;
          else set.set(v, 1);
        }
      });
    };
    const numberColumns = (): number[] => columns.flatMap((c, i) => (c.filled > 0 && c.numeric && !text[i] ? [i] : []));
    let pendingTop = false;
    let sawText = false;
    for await (const r of opened.rows) {
      if (header === undefined) {
        if (!pendingTop) {
          if (!sawText && !isBlankRow(r.values)) sawText = true;
          if (opts.headerRow !== undefined ? r.row !== opts.headerRow : isBlankRow(r.values) || isTitleRow(r.values)) continue;
          top = r;
          if (opts.headerRows === 1) {
            start(oneRowHeader(r.values));
            if (opts.headerOnly) break;
          } else pendingTop = true;
          continue;
        }
        pendingTop = false;
        const adjacent = r.row === top!.row + 1 && !isBlankRow(r.values);
        if (adjacent && (opts.headerRows === 2 || secondHeaderRow(top!.values, r.values, markers))) {
          start(twoRowHeader(top!.values, r.values));
          if (opts.headerOnly) break;
          continue;
        }
        start(oneRowHeader(top!.values));
        if (opts.headerOnly) break;
      }
      const blank = isBlankRow(r.values);
      if (opts.lastRow !== undefined && r.row > opts.lastRow) {
        if (!blank) notes.push(r);
        continue;
      }
      // A workbook leaves empty rows out: a gap in the row numbers is a blank row too.
      if (rows > 0 && opts.lastRow === undefined && r.row > seenRow + 1) afterBlank = true;
      seenRow = r.row;
      if (blank) {
        if (rows > 0 && opts.lastRow === undefined) afterBlank = true;
        continue;
      }
      if (afterBlank) {
        if (looksLikeDataRow(r.values, numberColumns(), markers)) {
          for (const h of held) add(h);
          held = [];
          afterBlank = false;
        } else {
          held.push(r);
          if (held.length > MAX_NOTE_ROWS) {
            for (const h of held) add(h);
            held = [];
            afterBlank = false;
          }
          continue;
        }
      }
      add(r);
      if (opts.maxRows !== undefined && rows >= opts.maxRows) break;
    }
    if (header === undefined && top !== undefined) start(oneRowHeader(top.values));
    notes.push(...held);
    if (header === undefined) {
      throw new InputError({
        ...where,
        ...(opts.headerRow !== undefined ? { row: opts.headerRow } : {}),
        problem: opts.headerRow !== undefined ? 'The file has no such row' : sawText ? 'The file has text only in single cells (a title or notes), no header row naming two or more columns' : 'The file has no rows with any text',
        fix: 'Check that this is the right file, and that it was saved with its data',
      });
    }
    const h: Header = header;
    columns.forEach((col, i) => {
      const set = sets[i]!;
      col.distinct = set.size;
      const entries = [...set].slice(0, LIST_LIMIT + 1);
      col.values = entries.map(([v]) => v);
      col.counts = entries.map(([, k]) => k);
      if (col.filled === 0) {
        col.numeric = false;
        col.integer = false;
      }
      if (text[i] && col.numbers < 0.8 * col.filled) col.markers = {};
      // A column of markers only is not a column of numbers.
      if (Object.values(col.markers).reduce((a, b) => a + b, 0) === col.filled) {
        col.numeric = false;
        col.integer = false;
      }
    });
    return {
      ...(opened.sheet !== undefined ? { sheet: opened.sheet } : {}),
      headerRow: top!.row,
      headerRows: h.rows,
      rows,
      columns: columns.filter((c) => c.name !== ''),
      ...(notes.length > 0 ? { tableEnd: { lastRow: opts.lastRow ?? lastRow, noteRows: notes.length, firstNoteRow: notes[0]!.row, firstNote: quoteRow(notes[0]!.values) } } : {}),
    };
  } finally {
    await opened.rows.return(undefined);
    opened.close();
  }
}
