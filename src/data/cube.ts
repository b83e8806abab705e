/**
 * Read a data source into a cube of counts (see types.ts) in one streaming pass. Rows are added into a Map keyed by
 * the row's dimension values and then dropped, so memory grows with the number of groups, not rows. The file's
 * SHA-256 is computed from the bytes the CSV reader reads (no second read); a workbook is hashed in a second streaming
 * pass run at the same time. Respondent-level CSV lines that are plain (no quote, well-formed UTF-8) are tallied
 * straight from the file's bytes (see respondentsCube), the same counts as their rows would give.
 *
 * Problems in data rows are collected (up to MAX_PROBLEMS) and reported together in one InputError; problems with
 * the file or its header stop the read at once.
 *
 * Decisions on doubtful data, so that a reader of the pack gets the same answer as a reader of this file:
 * - A summary row with 0 respondents is allowed and contributes nothing (its group exists, with no answers); its
 *   agreeing count must then be 0 too.
 * - In a CSV file whose delimiter is ';' a comma inside a number is a decimal comma ("72,4" is 72.4), as in the
 *   locales that write such files; elsewhere "1,204" is read with a thousands separator. Counts must be whole.
 * - A percent column is read on one scale: 72% and 72 both mean seventy-two percent; a column whose values are all
 *   between 0 and 1 (some not whole) is read as fractions and the pack says so. A column that mixes fractions such as
 *   0.72 with percentages such as 72% or 72 is an error naming a row of each, since either reading would be a guess.
 * - Numeric columns (SourceSpec.numeric) are read as numbers; a blank cell leaves that row out of that column's mean,
 *   and any other text is an error naming the row and value.
 * - An empty header cell between named ones is an error: it is almost always a merged header cell, which a file
 *   reader sees as empty.
 */
import { InputError } from '../errors.js';
import { requireOrdinaryFile } from '../files.js';
import type { Problem } from '../errors.js';
import type { SourceSpec } from '../claims/types.js';
import type { Cell, Cube } from './types.js';
import { readCsvBatches } from './csv.js';
import type { Delimiter } from './csv.js';
import { createHash } from 'node:crypto';
import { sha256File } from './hash.js';
import { isBlankRow, rowIsBlank } from './rows.js';
import type { ColumnSelection, SheetRow } from './rows.js';
import { fixFor, nfc } from '../suggest.js';
import { kindMismatch, sniffKind } from './kind.js';
import { isSuppressedMarker, isTitleRow, looksLikeDataRow, markerSet, MAX_NOTE_ROWS, oneRowHeader, quoteRow, secondHeaderRow, splitFootnote, twoRowHeader } from './table.js';
import type { Header } from './table.js';
import type { TableEnd } from './types.js';
import { BLANK_ANSWER, byteLines, codeOfText, codeWrong, dimText, TallyStore } from './tally.js';
import type { RangeTally, TallyPlan } from './tally.js';
import type { SplitTally } from './rows.js';

/** How many row problems are gathered before reading stops. */
export const MAX_PROBLEMS = 25;

export interface ReadCubeOptions {
  /** Bytes per read (for tests that force chunk boundaries). */
  chunkSize?: number;
  /**
   * Respondent CSV files of this many bytes or more are read in two halves at once, the second by a worker thread
   * (PARALLEL_FROM by default; Infinity reads every file in one).
   */
  parallelFrom?: number;
  /** Told whether the second half's tally was taken from its worker (for tests). */
  onSplit?: (taken: boolean) => void;
}

/**
 * The size from which a respondent CSV file is read in two halves at once: none, for now. On the shared 2-core
 * machine the second core is taken during the data phase (the chart worker loads vega then) and a reading worker made
 * the read slower there (1M rows: 1.0-1.4 s against 0.7-0.9 s in one, load average 8); the option is kept for tests
 * and for measuring (bench/measure.mjs read <file> parallel).
 */
export const PARALLEL_FROM = Number.POSITIVE_INFINITY;

/**
 * A range of a respondent file tallied by a worker thread (read-worker.js, beside this module in dist/). `add` puts
 * a taken range's tally into the consumer's; a worker that fails, exits or posts an untaken range leaves the range to
 * the reader. The worker is stopped (terminate) on cancel and once its answer is in, so none outlives the read.
 */
function rangeWorker(
  job: import('./tally.js').RangeJob,
  add: (tally: Extract<RangeTally, { taken: true }>, firstRow: number) => void,
  onSplit?: (taken: boolean) => void,
): SplitTally {
  let worker: import('node:worker_threads').Worker | undefined;
  let stopped = false;
  const answer = import('node:worker_threads').then(
    ({ Worker }) =>
      new Promise<RangeTally>((resolve) => {
        if (stopped) return resolve({ taken: false, why: 'stopped' });
        try {
          worker = new Worker(new URL('./read-worker.js', import.meta.url), { workerData: job });
        } catch (e) {
          return resolve({ taken: false, why: String(e) });
        }
        worker.once('message', (m: RangeTally) => resolve(m));
        worker.once('error', (e) => resolve({ taken: false, why: String(e) }));
        worker.once('exit', () => resolve({ taken: false, why: 'the worker stopped' }));
      }),
    (e: unknown) => ({ taken: false as const, why: String(e) }),
  );
  const cancel = (): void => {
    stopped = true;
    void worker?.terminate();
  };
  return {
    async finish(firstRow) {
      const tally = await answer;
      cancel();
      onSplit?.(tally.taken);
      if (!tally.taken) return false;
      add(tally, firstRow);
      return true;
    },
    cancel,
  };
}

/** A source, optionally naming the header row (1-based); by default the header is the first non-empty row. */
export type CubeSource = SourceSpec & { headerRow?: number };

type Where = Pick<Problem, 'file' | 'sheet'>;

class Problems {
  readonly list: Problem[] = [];
  constructor(private readonly where: Where) {}
  add(p: Omit<Problem, 'file' | 'sheet'>): void {
    this.list.push({ ...this.where, ...p });
    if (this.list.length >= MAX_PROBLEMS) this.throwIfAny();
  }
  throwIfAny(): void {
    if (this.list.length > 0) throw new InputError(this.list);
  }
}

/**
 * The largest count of people a row may hold: more people than live on Earth is no survey's count but a misread cell
 * (an ID, a sum of money, a number in exponent form). Counts above it would also leave whole numbers behind: from
 * 2^53 (about 9 * 10^15) a double cannot hold every whole number, and 1e300 passes as "a whole number".
 */
export const MAX_COUNT = 10_000_000_000;

/**
 * The largest size of a value in a numeric column (a ratio, a spend, a score): beyond it the sums of squares behind
 * a correlation or a line lose every digit or overflow to Infinity (a value of 1e306 stopped a build as a predictor
 * "(almost) a linear combination of the ones before it").
 */
export const MAX_NUMERIC = 1e15;

/** A number written in decimal (optionally with an exponent); hexadecimal, "Infinity" and the like are not numbers here. */
const DECIMAL = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

/** How numbers are written in this file: with a decimal comma (semicolon-delimited CSV) or a decimal point. */
interface NumberStyle {
  decimalComma: boolean;
}

/**
 * A decimal number as written in the file, or NaN: a decimal comma ("72,4") where the file uses one, otherwise
 * thousands separators ("1,204.5") are allowed.
 */
function parseDecimal(text: string, style: NumberStyle): number {
  let cleaned = text;
  if (style.decimalComma) {
    if (/^[+-]?\d*,\d+$/.test(text)) cleaned = text.replace(',', '.');
  } else if (/^[+-]?\d{1,3}(,\d{3})+(\.\d*)?$/.test(text)) {
    cleaned = text.replace(/,/g, '');
  }
  return DECIMAL.test(cleaned) ? Number(cleaned) : NaN;
}

/**
 * Parse a count: a whole number, not negative. Accepts thousands separators written as "1,234" (decimal commas in a
 * semicolon-delimited file). Returns undefined (after recording a problem) when the text is not a count.
 */
function parseCount(text: string, row: number, field: string, problems: Problems, style: NumberStyle): number | undefined {
  const x = parseDecimal(text, style);
  if (!Number.isFinite(x)) {
    // "72%" where a count belongs: a column of percentages named as counts in the claims file.
    const percent = /^[+-]?[\d.,]+\s*%$/.test(text);
    problems.add({
      row,
      field,
      found: text,
      problem: percent ? 'A count is written as a percentage' : 'A count is not a number',
      fix: percent
        ? 'If this column gives the percent agreeing, name it with agree_percent instead of agree in the source (respondents stays the number who answered); otherwise write the number of people as digits'
        : 'Write the number of people as digits, e.g. 42; remove notes or markers from the cell',
    });
    return undefined;
  }
  if (x < 0) {
    problems.add({ row, field, found: text, problem: 'A count is negative', fix: 'Write the number of people, zero or more' });
    return undefined;
  }
  if (!Number.isInteger(x)) {
    problems.add({ row, field, found: text, problem: 'A count is not a whole number', fix: 'Write the number of people as a whole number; if this is a percentage, name the column with agree_percent instead' });
    return undefined;
  }
  if (x > MAX_COUNT) {
    problems.add({ row, field, found: text, problem: 'A count is larger than any survey could hold (more than 10,000,000,000 people, more than live on Earth)', fix: 'Check the cell: it may hold another figure (an ID, a sum of money, a date); write the number of people as digits' });
    return undefined;
  }
  return x;
}

interface PercentValue {
  value: number;
  sign: boolean;
  row: number;
  text: string;
}

/** Parse a percentage: "72%", "72", "72.4" (0-100), or a fraction in [0, 1] (decided for the whole column later). */
function parsePercent(text: string, row: number, field: string, problems: Problems, style: NumberStyle): PercentValue | undefined {
  const sign = text.endsWith('%');
  const body = sign ? text.slice(0, -1).trim() : text;
  const x = parseDecimal(body, style);
  if (!Number.isFinite(x)) {
    problems.add({ row, field, found: text, problem: 'A percentage is not a number', fix: 'Write the percent agreeing as a number such as 72, 72.4 or 72%' });
    return undefined;
  }
  if (x < 0 || x > 100) {
    problems.add({ row, field, found: text, problem: 'A percentage is outside 0 to 100', fix: 'Write the percent agreeing as a number from 0 to 100' });
    return undefined;
  }
  return { value: x, sign, row, text };
}

/** Parse a value of a numeric column; blank is undefined without a problem. */
function parseNumeric(text: string, row: number, field: string, problems: Problems, style: NumberStyle): number | undefined {
  if (text === '') return undefined;
  const x = parseDecimal(text, style);
  if (!Number.isFinite(x)) {
    problems.add({
      row,
      field,
      found: text,
      problem: 'A value in a numeric column is not a number',
      fix: `Write a number such as 4.2${style.decimalComma ? ' or 4,2' : ''}, or leave the cell blank where there is no value; remove notes, units and markers from the cell`,
    });
    return undefined;
  }
  if (Math.abs(x) > MAX_NUMERIC) {
    problems.add({ row, field, found: text, problem: 'A value in a numeric column is too large to compute with (more than 10^15, a thousand million million, in size)', fix: 'Check the cell: it may hold another figure (an ID, a number in the wrong unit); write the value the column measures, or leave the cell blank where there is none' });
    return undefined;
  }
  return x;
}

/** Header row and the rows after it. */
/** Rows one at a time (to find the header), then the rest in batches. */
class BatchReader {
  private left: SheetRow[] = [];
  constructor(private readonly batches: AsyncGenerator<SheetRow[]>) {}
  async next(): Promise<IteratorResult<SheetRow, undefined>> {
    while (this.left.length === 0) {
      const b = await this.batches.next();
      if (b.done === true) return { done: true, value: undefined };
      this.left = b.value;
    }
    return { done: false, value: this.left.shift()! };
  }
  /** Hand a row taken with next() back, to be read again first. */
  unread(r: SheetRow): void {
    this.left.unshift(r);
  }
  async *rest(): AsyncGenerator<SheetRow[]> {
    if (this.left.length > 0) yield this.left.splice(0);
    for (;;) {
      const b = await this.batches.next();
      if (b.done === true) return;
      yield b.value;
    }
  }
}

async function findHeader(
  rows: BatchReader,
  headerRow: number | undefined,
  where: Where,
): Promise<SheetRow> {
  let seenAny = false;
  let title: SheetRow | undefined;
  for (;;) {
    const next = await rows.next();
    if (next.done) {
      // Only single-cell rows: the first of them is the header after all (a notes sheet read by mistake is then
      // reported by its missing columns, with the other sheets named).
      if (title !== undefined) return title;
      if (headerRow !== undefined && seenAny) {
        throw new InputError({ ...where, row: headerRow, field: 'header_row', found: String(headerRow), problem: 'The file has no such row, or it is empty', fix: 'Give the number of the row that holds the column names' });
      }
      throw new InputError({ ...where, problem: seenAny ? 'The file has no rows with any text' : 'The file is empty', fix: 'Check that this is the right file, and that it was saved with its data' });
    }
    seenAny = true;
    const r = next.value;
    if (headerRow !== undefined) {
      if (r.row < headerRow) continue;
      if (r.row > headerRow || isBlankRow(r.values)) {
        throw new InputError({ ...where, row: headerRow, field: 'header_row', found: String(headerRow), problem: 'The header row named is empty', fix: 'Give the number of the row that holds the column names' });
      }
      return r;
    }
    // A title line above the table (one cell of text) is passed over; the header names at least two columns.
    if (!isBlankRow(r.values)) {
      if (!isTitleRow(r.values)) return r;
      title ??= r;
    }
  }
}

export async function readCube(source: CubeSource, needed: string[], displayPath: string, options: ReadCubeOptions = {}): Promise<Cube> {
  const file = displayPath;
  // Before anything opens it: a pipe or a device would make every read below wait for ever.
  requireOrdinaryFile(source.path, { file }, 'data file');
  // A workbook is hashed in its own read, at the same time; a CSV file from the bytes its reader reads.
  const shaPromise =
    source.format === 'xlsx'
      ? sha256File(source.path).then(
          (h) => h,
          () => '',
        )
      : undefined;
  const mismatch = kindMismatch(await sniffKind(source.path), source.format, file);
  if (mismatch !== undefined) {
    await shaPromise;
    throw mismatch;
  }
  const csvHash = source.format === 'xlsx' ? undefined : createHash('sha256');
  let sheet: string | undefined;
  let columnLetters = (i: number): string => String(i + 1);
  let otherSheets: string[] = [];
  let rows: AsyncGenerator<SheetRow[]>;
  let close = (): void => {};
  const style: NumberStyle = { decimalComma: false };
  // Filled in by respondentsCube once it knows the columns it reads: the readers then leave the others out.
  const select: ColumnSelection = {};
  const readOptions = { displayPath: file, select, ...(options.chunkSize !== undefined ? { chunkSize: options.chunkSize } : {}) };
  if (source.format === 'xlsx') {
    // Loaded here, not at start-up: the zip and XML libraries are needed only for workbooks.
    const xlsx = await import('./xlsx.js');
    columnLetters = xlsx.columnLetters;
    const opened = await xlsx.openXlsxSheet(source.path, { ...readOptions, ...(source.sheet !== undefined ? { sheet: source.sheet } : {}) });
    sheet = opened.sheet;
    // Read by default (no sheet named): the other sheets, named when a column is missing, as the data may be there.
    if (source.sheet === undefined) otherSheets = opened.sheets.filter((s) => s.name !== opened.sheet).map((s) => `"${s.name}"${s.hidden ? ' (hidden)' : ''}`);
    rows = opened.batches;
    close = opened.close;
  } else {
    rows = readCsvBatches(source.path, {
      ...readOptions,
      onBytes: (bytes: Buffer) => {
        csvHash!.update(bytes);
      },
      onDelimiter: (d: Delimiter) => {
        style.decimalComma = d === ';';
      },
    });
  }
  const where: Where = sheet !== undefined ? { file, sheet } : { file };
  try {
    const reader = new BatchReader(rows);
    const header = await findHeader(reader, source.headerRow, where);
    const markers = markerSet(source.suppressed);
    // A second header row: when the source says so, or detected in the very next row (see src/data/table.ts).
    let shape: Header = oneRowHeader(header.values);
    if (source.headerRows !== 1) {
      const next = await reader.next();
      if (!next.done) {
        const adjacent = next.value.row === header.row + 1 && !isBlankRow(next.value.values);
        if (source.headerRows === 2 ? adjacent : adjacent && secondHeaderRow(header.values, next.value.values, markers)) shape = twoRowHeader(header.values, next.value.values);
        else reader.unread(next.value);
      }
      if (source.headerRows === 2 && shape.rows === 1) {
        throw new InputError({ ...where, row: header.row + 1, field: 'header_rows', found: '2', problem: `The source says its header spans two rows, but row ${header.row + 1} is blank or missing`, fix: 'Remove header_rows: 2 from the source, or name the first header row with header_row' });
      }
    }
    const raw = shape.names;
    // Column names match the claims file's under Unicode normalization form C, and are then known by its spelling.
    const spelled = claimsSpellings(source, needed);
    const names = raw.map((n) => spelled.get(nfc(n)) ?? n);
    const seen = new Map<string, number>();
    const seenForm = new Map<string, number>();
    names.forEach((n, i) => {
      if (n === '') return;
      const before = seen.get(n) ?? seenForm.get(nfc(n));
      if (before !== undefined) {
        const forms = raw[before] !== raw[i] ? ', written in different Unicode forms (one with accents as separate combining marks)' : '';
        throw new InputError({ ...where, row: header.row, field: n, found: raw[i], problem: `Two columns have the same name (columns ${before + 1} and ${i + 1})${forms}`, fix: 'Give each column a different name in the header row' });
      }
      seen.set(n, i);
      seenForm.set(nfc(n), i);
    });
    const known = names.filter((n) => n !== '');
    const firstNamed = names.findIndex((n) => n !== '');
    let lastNamed = names.length - 1;
    while (lastNamed >= 0 && names[lastNamed] === '') lastNamed -= 1;
    for (let i = firstNamed + 1; i < lastNamed; i++) {
      if (names[i] !== '') continue;
      const cell = sheet !== undefined ? `cell ${columnLetters(i)}${header.row}` : `column ${i + 1}`;
      throw new InputError({
        ...where,
        row: header.row,
        field: cell,
        found: '',
        problem: `The header row has an empty cell between the columns "${names[i - 1] === '' ? names.slice(0, i).filter((n) => n !== '').pop() : names[i - 1]}" and "${names.slice(i + 1).find((n) => n !== '')}"; merged header cells read as empty`,
        fix: 'Unmerge the header cells and give every column its own name in one header row (or name the row that has them with header_row)',
      });
    }
    for (const [alias, i] of shape.aliases) if (!seen.has(alias)) seen.set(alias, i);
    const column = (name: string, role: string): number => {
      const i = seen.get(name.trim());
      if (i === undefined) {
        const elsewhere = otherSheets.length > 0 ? `; warrant read sheet "${sheet}", the first visible one: if the data are on another sheet (${otherSheets.join(', ')}), name it with sheet: in the source` : '';
        const title = elsewhere === '' && known.length === 1 ? `; row ${header.row} looks like a title rather than the column names, so remove the rows above the header` : '';
        throw new InputError({ ...where, row: header.row, field: role, found: name, problem: `The file has no column with this name in its header row (row ${header.row})`, fix: fixFor(name, known, 'columns') + elsewhere + title });
      }
      return i;
    };
    const body = { [Symbol.asyncIterator]: () => reader.rest() };
    const common = { sourceId: source.id, file: source.file, ...(sheet !== undefined ? { sheet } : {}) };
    const cube =
      source.shape === 'summary'
        ? await summaryCube(source, needed, body, header.row, names, column, where, style, markers)
        : await respondentsCube(source, needed, body, header.row, names, column, where, select, options.parallelFrom ?? PARALLEL_FROM, options.onSplit);
    // The body has been read to its end, so the CSV reader has handed every byte to the hash.
    const sha256 = csvHash !== undefined ? csvHash.digest('hex') : await shaPromise!;
    const labels = Object.keys(shape.labels).length > 0 ? { labels: shape.labels } : {};
    return { ...common, sha256, ...cube, ...(shape.rows === 2 ? { headerRows: 2 as const } : {}), ...labels };
  } finally {
    await rows.return(undefined);
    close();
  }
}

/** Column names as the claims file spells them (the source's own fields and the columns its claims use), by their NFC form. */
export function claimsSpellings(source: CubeSource, needed: string[]): Map<string, string> {
  const out = new Map<string, string>();
  const add = (v: unknown): void => {
    if (typeof v === 'string' && v.trim() !== '') out.set(nfc(v.trim()), v.trim());
    else if (Array.isArray(v)) v.forEach(add);
  };
  Object.values(source).forEach(add);
  needed.forEach(add);
  return out;
}

type CubeBody = Omit<Cube, 'sourceId' | 'file' | 'sha256'>;
type ColumnOf = (name: string, role: string) => number;

function distinctValues(dimensions: string[], cells: Cell[]): Record<string, string[]> {
  const values: Record<string, string[]> = {};
  for (const d of dimensions) {
    const set = new Set<string>();
    for (const c of cells) set.add(c.dims[d] ?? '');
    values[d] = [...set];
  }
  return values;
}

function noDataRows(where: Where, headerRow: number): InputError {
  return new InputError({ ...where, row: headerRow, problem: 'The file has a header row but no data rows below it', fix: 'Add the data rows, or point the claims file at the file that has them' });
}

async function summaryCube(
  source: CubeSource,
  needed: string[],
  body: AsyncIterable<SheetRow[]>,
  headerRow: number,
  names: string[],
  column: ColumnOf,
  where: Where,
  style: NumberStyle,
  markers: ReadonlySet<string> = markerSet(undefined),
): Promise<CubeBody> {
  if (source.respondents === undefined) {
    throw new InputError({ ...where, field: 'respondents', problem: `Source "${source.id}" does not name the column with the number who answered`, fix: 'Add "respondents: <column name>" to the source in the claims file' });
  }
  if (source.agree === undefined && source.agreePercent === undefined) {
    throw new InputError({ ...where, field: 'agree', problem: `Source "${source.id}" names neither a count nor a percent agreeing column`, fix: 'Add "agree: <column name>" or "agree_percent: <column name>" to the source in the claims file' });
  }
  const nCol = column(source.respondents, 'respondents');
  const agreeCol = source.agree !== undefined ? column(source.agree, 'agree') : undefined;
  const pctCol = agreeCol === undefined && source.agreePercent !== undefined ? column(source.agreePercent, 'agree_percent') : undefined;
  const popCol = source.population !== undefined ? column(source.population, 'population') : undefined;
  const numericNames = [...new Set(source.numeric ?? [])];
  const numericIdx = numericNames.map((c) => column(c, 'numeric'));
  const measures = new Set([nCol, agreeCol, pctCol, popCol, ...numericIdx].filter((i): i is number => i !== undefined));
  const dimIdx: number[] = [];
  names.forEach((n, i) => {
    if (n !== '' && !measures.has(i)) dimIdx.push(i);
  });
  const dimensions = dimIdx.map((i) => names[i]!);
  for (const d of needed) {
    if (!dimensions.includes(d)) {
      const isMeasure = [source.respondents, source.agree, source.agreePercent, source.population, ...numericNames].includes(d);
      throw new InputError({
        ...where,
        row: headerRow,
        field: d,
        found: d,
        problem: isMeasure ? 'A claim selects on a column that holds counts, not groups' : 'A claim selects on a column the file does not have',
        fix: fixFor(d, dimensions, 'group columns'),
      });
    }
  }
  const nName = names[nCol]!;
  const agreeName = agreeCol !== undefined ? names[agreeCol]! : undefined;
  const pctName = pctCol !== undefined ? names[pctCol]! : undefined;
  const popName = popCol !== undefined ? names[popCol]! : undefined;

  const problems = new Problems(where);
  const cells = new Map<string, Cell>();
  const percents = new Map<Cell, PercentValue>();
  let rows = 0;
  let lastRow = headerRow;
  let suppressedRows = 0;
  const markerCounts = new Map<string, number>();
  const footnotes = new Map<string, { marker: string; cells: number; example: string; row: number }>();
  const countColumns = [nCol, agreeCol ?? pctCol].filter((i): i is number => i !== undefined);
  /** A measure cell's text: trimmed, with a footnote marker after a number taken off (and noted once per marker). */
  const measureText = (r: SheetRow, i: number | undefined): string => {
    if (i === undefined) return '';
    const t = (r.values[i] ?? '').trim();
    const f = splitFootnote(t);
    if (f === undefined) return t;
    const seen = footnotes.get(f.marker);
    if (seen === undefined) footnotes.set(f.marker, { marker: f.marker, cells: 1, example: t, row: r.row });
    else seen.cells += 1;
    return f.number;
  };
  const handle = (r: SheetRow): void => {
    rows += 1;
    lastRow = r.row;
    const text = (i: number | undefined) => (i === undefined ? '' : (r.values[i] ?? '').trim());
    const dims: Record<string, string> = {};
    dimIdx.forEach((i, k) => {
      dims[dimensions[k]!] = text(i);
    });
    /** This row's group key, or undefined (with the problem noted) when an earlier row already gave the group. */
    const newGroupKey = (): string | undefined => {
      const key = JSON.stringify(dimIdx.map((i) => text(i)));
      const earlier = cells.get(key);
      if (earlier === undefined) return key;
      const label = dimensions.map((d) => `${d} = ${dims[d]}`).join(', ');
      problems.add({ row: r.row, field: dimensions.join(', '), found: label, problem: `This row repeats the group of row ${earlier.firstRow}`, fix: `Keep one row per group: remove or merge rows ${earlier.firstRow} and ${r.row}, or add the column that tells them apart` });
      return undefined;
    };
    const measureTexts = [nCol, agreeCol ?? pctCol, popCol].filter((i): i is number => i !== undefined).map(text);
    if (measureTexts.every((t) => t === '')) {
      problems.add({
        row: r.row,
        field: nName,
        found: '',
        problem: 'This row names a group but has no counts',
        fix: `Fill in the counts for this row, or delete the row; if the table ends above it and the rows from here on are notes, set the table's last row with "last_row: ${r.row - 1}" in the source`,
      });
      return;
    }
    // A count withheld in the release: the row is kept as a suppressed group (no number guessed) and counted.
    const withheld = countColumns.map(text).filter((t) => isSuppressedMarker(t, markers));
    if (withheld.length > 0) {
      for (const m of withheld) markerCounts.set(m, (markerCounts.get(m) ?? 0) + 1);
      const key = newGroupKey();
      if (key === undefined) return;
      const cell: Cell = { dims, n: 0, agree: 0, approximate: false, firstRow: r.row, suppressed: true };
      if (numericNames.length > 0) cell.numeric = Object.fromEntries(numericNames.map((name) => [name, { weightedSum: 0, weight: 0 }]));
      cells.set(key, cell);
      suppressedRows += 1;
      return;
    }
    const blank = (name: string) => problems.add({ row: r.row, field: name, found: '', problem: 'A count is blank in a row that has other counts', fix: 'Fill in the missing number, or delete the row' });
    let ok = true;
    const nText = measureText(r, nCol);
    const n = nText === '' ? (blank(nName), undefined) : parseCount(nText, r.row, nName, problems, style);
    let agree: number | undefined;
    let pct: PercentValue | undefined;
    if (agreeCol !== undefined) {
      const t = measureText(r, agreeCol);
      agree = t === '' ? (blank(agreeName!), undefined) : parseCount(t, r.row, agreeName!, problems, style);
      ok &&= agree !== undefined;
    } else {
      const t = measureText(r, pctCol);
      pct = t === '' ? (blank(pctName!), undefined) : parsePercent(t, r.row, pctName!, problems, style);
      ok &&= pct !== undefined;
    }
    let population: number | undefined;
    let populationWithheld = false;
    if (popCol !== undefined) {
      const t = measureText(r, popCol);
      if (isSuppressedMarker(t, markers)) {
        populationWithheld = true;
        markerCounts.set(t, (markerCounts.get(t) ?? 0) + 1);
      } else {
        population = t === '' ? (blank(popName!), undefined) : parseCount(t, r.row, popName!, problems, style);
        ok &&= population !== undefined;
      }
    }
    const numericValues = numericIdx.map((i) => {
      const before = problems.list.length;
      const t = measureText(r, i);
      const x = isSuppressedMarker(t, markers) ? undefined : parseNumeric(t, r.row, names[i]!, problems, style);
      if (problems.list.length > before) ok = false;
      return x;
    });
    if (n === undefined || !ok) return;
    if (agree !== undefined && agree > n) {
      problems.add({ row: r.row, field: agreeName!, found: String(agree), problem: `More people agreed than answered (${agree} agreeing, ${n} respondents)`, fix: 'Check the two counts on this row; the agreeing count cannot exceed the number who answered' });
      return;
    }
    if (population !== undefined && n > population) {
      problems.add({ row: r.row, field: popName!, found: String(population), problem: `More people answered than were eligible (${n} respondents, population ${population})`, fix: 'Check the population column: it should hold the number eligible to answer' });
      return;
    }
    const key = newGroupKey();
    if (key === undefined) return;
    const cell: Cell = { dims, n, agree: agree ?? 0, approximate: pct !== undefined, firstRow: r.row };
    if (population !== undefined) cell.population = population;
    if (populationWithheld) cell.populationSuppressed = true;
    if (numericNames.length > 0) {
      const numeric: Record<string, { weightedSum: number; weight: number }> = {};
      numericNames.forEach((name, k) => {
        const x = numericValues[k];
        numeric[name] = x === undefined ? { weightedSum: 0, weight: 0 } : { weightedSum: x * n, weight: n };
      });
      cell.numeric = numeric;
    }
    cells.set(key, cell);
    if (pct !== undefined) percents.set(cell, pct);
  };
  // The table ends at the last row the source names, or at a blank row after which no row looks like data: rows
  // after a blank row are held until one looks like data (then they were table rows after all) or the file ends
  // (then they are notes).
  let afterBlank = false;
  let seenRow = headerRow;
  let held: SheetRow[] = [];
  const notes: SheetRow[] = [];
  const flush = (): void => {
    for (const h of held) handle(h);
    held = [];
  };
  for await (const batch of body) for (const r of batch) {
    const blankRow = isBlankRow(r.values);
    if (source.lastRow !== undefined && r.row > source.lastRow) {
      if (!blankRow) notes.push(r);
      continue;
    }
    // A workbook leaves empty rows out: a gap in the row numbers is a blank row too.
    if (rows > 0 && source.lastRow === undefined && r.row > seenRow + 1) afterBlank = true;
    seenRow = r.row;
    if (blankRow) {
      if (rows > 0 && source.lastRow === undefined) afterBlank = true;
      continue;
    }
    if (afterBlank) {
      if (looksLikeDataRow(r.values, countColumns, markers)) {
        flush();
        afterBlank = false;
        handle(r);
      } else {
        held.push(r);
        if (held.length > MAX_NOTE_ROWS) {
          flush();
          afterBlank = false;
        }
      }
      continue;
    }
    handle(r);
  }
  notes.push(...held);
  problems.throwIfAny();
  if (rows === 0) throw noDataRows(where, headerRow);
  const tableEnd: TableEnd | undefined =
    notes.length > 0
      ? { lastRow: source.lastRow ?? lastRow, noteRows: notes.length, firstNoteRow: notes[0]!.row, firstNote: quoteRow(notes[0]!.values), by: source.lastRow !== undefined ? 'source' : 'detected' }
      : undefined;
  const readNotes = {
    ...(suppressedRows > 0 ? { suppressedRows } : {}),
    ...(markerCounts.size > 0 ? { suppressedMarkers: Object.fromEntries(markerCounts) } : {}),
    ...(footnotes.size > 0 ? { footnotes: [...footnotes.values()] } : {}),
    ...(tableEnd !== undefined ? { tableEnd } : {}),
  };

  const notesText: string[] = [];
  if (pctName !== undefined) {
    const all = [...percents.values()];
    const fractionLike = all.find((p) => !p.sign && p.value < 1 && !Number.isInteger(p.value));
    const percentLike = all.find((p) => p.sign || p.value > 1);
    if (fractionLike !== undefined && percentLike !== undefined) {
      throw new InputError({
        ...where,
        row: fractionLike.row,
        field: pctName,
        found: fractionLike.text,
        problem: `The percent column mixes fractions with percentages: row ${fractionLike.row} has "${fractionLike.text}" (a fraction of 1?) but row ${percentLike.row} has "${percentLike.text}" (a percentage)`,
        fix: 'Write every value in the column on one scale: 72% or 72 for seventy-two percent throughout, or 0.72 throughout; a percentage below 1 needs its % sign, e.g. 0.5%',
      });
    }
    const fractions = fractionLike !== undefined;
    if (fractions) {
      notesText.push(`The values in "${pctName}" are all between 0 and 1, so they were read as fractions (0.72 means 72%).`);
    }
    notesText.push(`Agreeing counts were worked out from the rounded percentages in "${pctName}", so they are approximate.`);
    for (const [cell, p] of percents) {
      const share = fractions ? p.value : p.value / 100;
      cell.agree = Math.min(cell.n, Math.round(share * cell.n));
    }
  }
  const list = [...cells.values()];
  return {
    rows,
    dimensions,
    cells: list,
    values: distinctValues(dimensions, list),
    approximate: pctName !== undefined && list.length > 0,
    hasPopulation: popCol !== undefined,
    ...(notesText.length > 0 ? { notes: notesText } : {}),
    ...(numericNames.length > 0 ? { numericColumns: numericNames } : {}),
    ...readNotes,
  };
}

/** One combination of dimension values: its values and its number in the TallyStore. */
interface Leaf {
  values: string[];
  g: number;
}

async function respondentsCube(
  source: CubeSource,
  needed: string[],
  body: AsyncIterable<SheetRow[]>,
  headerRow: number,
  names: string[],
  column: ColumnOf,
  where: Where,
  select: ColumnSelection,
  parallelFrom: number | undefined,
  onSplit?: (taken: boolean) => void,
): Promise<CubeBody> {
  const questions = source.questions ?? [];
  if (questions.length === 0) {
    throw new InputError({ ...where, field: 'questions', problem: `Source "${source.id}" lists no question columns`, fix: 'Add "questions: [<column>, ...]" to the source in the claims file, naming the answer columns' });
  }
  const qColName = source.questionColumn;
  const existing = names.indexOf(qColName);
  if (existing >= 0) {
    throw new InputError({ ...where, row: headerRow, field: 'question_column', found: qColName, problem: 'The name chosen for the question column is already a column in the file', fix: 'Choose another name with "question_column:" in the source' });
  }
  const qIdx = questions.map((q) => column(q, 'questions'));
  const qSet = new Set(qIdx);
  const dimensionsWanted = [...new Set(needed.filter((d) => d !== qColName))];
  const dimIdx = dimensionsWanted.map((d) => {
    const i = column(d, d);
    if (qSet.has(i)) {
      throw new InputError({ ...where, row: headerRow, field: d, found: d, problem: 'A claim selects on an answer column as if it held groups', fix: `Select answers through "${qColName}" (e.g. ${qColName}: ${d}) instead` });
    }
    return i;
  });
  const dimensions = [...dimensionsWanted, qColName];
  const keep = new Array<boolean>(names.length).fill(false);
  for (const i of [...qIdx, ...dimIdx]) keep[i] = true;
  const na = new Set(source.notApplicableCodes);
  const agreeCodes = new Set(source.agreeCodes);
  const maxCode = Math.max(5, ...source.agreeCodes);

  const problems = new Problems(where);
  // A tree of Maps, one level per dimension, ending in a cell per question (created on the first answer): each row
  // costs one lookup per dimension and no new key string. Code counts are kept in arrays and written out at the end.
  const root = new Map<string, unknown>();
  const leaves: Leaf[] = [];
  const nq = qIdx.length;
  const store = new TallyStore(maxCode, nq);
  const nd = dimIdx.length;
  const codeTexts = Array.from({ length: maxCode + 1 }, (_, c) => String(c));
  const isAgree = codeTexts.map((_, c) => agreeCodes.has(c));
  // Not-applicable codes as flags for small codes (the usual case), the Set for any other.
  const naSmall = Array.from({ length: 16 }, (_, c) => na.has(c));
  const isNa = (c: number) => (c >= 0 && c < 16 ? naSmall[c] === true : na.has(c));
  // What a single-digit answer does: 1 counted, 0 not applicable (left out), -1 out of range (a problem, see codeOf).
  const digitDoes = Int8Array.from({ length: 10 }, (_, c) => (isNa(c) ? 0 : c >= 1 && c <= maxCode ? 1 : -1));
  const dimValues: string[] = new Array<string>(nd).fill('');
  let rows = 0;

  /** The group of the values in dimValues (trimmed as below), made on first sight. */
  const leafOf = (): Leaf => {
    let node: Map<string, unknown> = root;
    if (nd === 0) {
      let leaf = root.get('') as Leaf | undefined;
      if (leaf === undefined) {
        leaf = { values: [], g: store.newGroup() };
        leaves.push(leaf);
        root.set('', leaf);
      }
      return leaf;
    }
    for (let j = 0; j < nd; j++) {
      const v = dimValues[j]!;
      if (j === nd - 1) {
        let leaf = node.get(v) as Leaf | undefined;
        if (leaf === undefined) {
          leaf = { values: dimValues.slice(), g: store.newGroup() };
          leaves.push(leaf);
          node.set(v, leaf);
        }
        return leaf;
      }
      let next = node.get(v) as Map<string, unknown> | undefined;
      if (next === undefined) {
        next = new Map<string, unknown>();
        node.set(v, next);
      }
      node = next;
    }
    throw new Error('unreachable');
  };
  /** The code to count for an answer's text; NA_ANSWER, BLANK_ANSWER, or -1 (a problem recorded). */
  const codeOf = (raw0: string, row: number, k: number): number => {
    const code = codeOfText(raw0, maxCode, isNa);
    if (code !== -1) return code;
    const raw = codeWrong.raw;
    if (codeWrong.why === 'not-code') {
      problems.add({ row, field: names[qIdx[k]!]!, found: raw, problem: 'An answer is not a whole-number code', fix: `Code answers as whole numbers (1 to ${maxCode}); list any code meaning "not applicable" under not_applicable in the source` });
    } else {
      problems.add({ row, field: names[qIdx[k]!]!, found: raw, problem: `An answer code is outside 1 to ${maxCode}`, fix: 'Correct the answer, or list the code under not_applicable in the source if it means "not applicable"' });
    }
    return code;
  };

  // Past the codes, each tally (TallyStore) holds the not-applicable and blank answers, the order in which its cell got
  // its first valid answer (1 and up; 0 for none yet) and that answer's row: cells are listed in that order, as when
  // only valid answers made cells.
  // One batch at a time in its own function, which the engine compiles as a whole rather than mid-loop.
  const tallyBatch = (batch: SheetRow[]): void => {
    for (const r of batch) {
      const rv = r.values;
      if (rowIsBlank(r)) continue;
      rows += 1;
      let group: Leaf | undefined;
      for (let k = 0; k < nq; k++) {
        const raw0 = rv[qIdx[k]!];
        const code = raw0 === undefined ? BLANK_ANSWER : codeOf(raw0, r.row, k);
        if (code === -1) continue;
        if (group === undefined) {
          for (let j = 0; j < nd; j++) dimValues[j] = dimText(rv[dimIdx[j]!] ?? '');
          group = leafOf();
        }
        store.count(group.g, k, code, r.row);
      }
    }
  };

  // Plain lines straight from a CSV file's bytes (see ByteLineSink and tally.ts), tallied as tallyBatch would tally
  // their rows.
  const plan: TallyPlan = { columns: names.length, qIdx, dimIdx, digitDoes: [...digitDoes] };
  const byRow = byteLines(
    plan,
    {
      group: (values) => {
        for (let j = 0; j < nd; j++) dimValues[j] = values[j]!;
        return leafOf().g;
      },
      code: codeOf,
    },
    store,
  );
  const lines = (b: Uint8Array, from: number, end: number, crlf: boolean, d: number, firstRow: number): { at: number; rows: number } => {
    const before = byRow.dataRows;
    const taken = byRow.lines(b, from, end, crlf, d, firstRow);
    rows += byRow.dataRows - before;
    return taken;
  };

  select.keep = keep;
  // Taken only when each answer column is read once (a question listed twice is tallied row by row).
  if (qSet.size === nq) {
    select.lines = { lines };
    if (parallelFrom !== undefined && Number.isFinite(parallelFrom)) {
      select.lines.splitFrom = parallelFrom;
      select.lines.split = (path, start, end, crlf, d) =>
        rangeWorker({ path, start, end, crlf, d, plan, maxCode, notApplicable: [...na] }, (tally, firstRow) => {
          // The range's tallies added to these, as if its lines had been read here after those before it: its cells
          // that got a first valid answer in the range get it in the range's order, after every one before.
          rows += tally.rows;
          const { stride, seq } = store;
          const theirs = (g: number, k: number): number => (g * nq + k) * stride;
          const order: Array<{ g: number; k: number }> = [];
          for (let g = 0; g < tally.values.length; g++) for (let k = 0; k < nq; k++) order.push({ g, k });
          const rank = (o: { g: number; k: number }): number => tally.data[theirs(o.g, o.k) + seq] || 2 ** 31;
          order.sort((a, b) => rank(a) - rank(b));
          const groups = tally.values.map((values) => {
            for (let j = 0; j < nd; j++) dimValues[j] = values[j]!;
            return leafOf().g;
          });
          for (const { g, k } of order) {
            const from = theirs(g, k);
            const to = store.at(groups[g]!, k);
            const data = store.block(groups[g]!);
            for (let c = 0; c <= store.blank; c++) data[to + c]! += tally.data[from + c]!;
            if (data[to + seq] === 0 && tally.data[from + seq]! > 0) {
              data[to + seq] = ++store.validSeen;
              data[to + store.firstRow] = firstRow + tally.data[from + store.firstRow]!;
            }
          }
        }, onSplit);
    }
  }
  for await (const batch of body) tallyBatch(batch);
  // Cells with valid answers, in the order each got its first; a group with only blank or not-applicable answers to a
  // question has no cell for it, as no one answered it.
  // Each kept cell has its own order number, 1 to validSeen (given as its first valid answer was counted): each goes
  // straight to its place.
  const list = new Array<Cell>(store.validSeen);
  const nDims = dimensionsWanted.length;
  for (const leaf of leaves) {
    const data = store.block(leaf.g);
    for (let k = 0; k < nq; k++) {
      const at = store.at(leaf.g, k);
      const seq = data[at + store.seq]!;
      if (seq === 0) continue;
      const dims: Record<string, string> = {};
      for (let j = 0; j < nDims; j++) dims[dimensionsWanted[j]!] = leaf.values[j]!;
      dims[qColName] = questions[k]!;
      const codes: Record<string, number> = {};
      let n = 0;
      let agree = 0;
      for (let c = 0; c <= maxCode; c++) {
        const x = data[at + c]!;
        if (x > 0) {
          codes[codeTexts[c]!] = x;
          n += x;
          if (isAgree[c] === true) agree += x;
        }
      }
      const cell: Cell = { dims, n, agree, approximate: false, firstRow: data[at + store.firstRow]!, codes };
      if (data[at + store.na]! > 0) cell.notApplicable = data[at + store.na]!;
      if (data[at + store.blank]! > 0) cell.blank = data[at + store.blank]!;
      list[seq - 1] = cell;
    }
  }
  problems.throwIfAny();
  if (rows === 0) throw noDataRows(where, headerRow);
  const values = distinctValues(dimensionsWanted, list);
  values[qColName] = [...questions];
  return { rows, dimensions, cells: list, values, approximate: false, hasPopulation: false, hasCodes: true, questionColumn: qColName };
}
