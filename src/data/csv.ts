/**
 * Streaming CSV rows.
 *
 * The file is read as raw bytes, 256 KiB at a time (fewer turns of the read loop than 64 KiB; 1 MiB was no faster).
 * Three ways to split them, all giving the records papaparse gives for the whole text (tests compare them):
 * - bytes (splitByteRows): once the header is read and the consumer has said which columns it needs
 *   (ReadOptions.select), whole lines between line feeds with no double quote, checked to be well-formed UTF-8, are
 *   split straight from the bytes; only the kept columns are made into strings, and a text seen before in a column
 *   is handed over as the same string. A consumer that takes such lines itself (ColumnSelection.lines) is handed the
 *   bytes instead, and no rows are made of them.
 * - text (splitPlainRows): other pieces go through one `TextDecoder` in streaming, fatal mode (a character split
 *   between two reads is carried over; bytes that are not UTF-8 stop the read with an InputError naming the row and
 *   the byte); text without double quotes is split on the newline and the delimiter.
 * - papaparse (loaded only then): text with quotes is fed, piece by piece, to papaparse's incremental parser
 *   (`Papa.Parser.parse(text, base, ignoreLastRow)`), which returns the complete records and where the unfinished one
 *   starts; but a line cut between two reads waits for the rest, and is then split on its own when it is plainly
 *   regular (splitQuotedLine), so that a file with quoted names does not load papaparse for its cut lines.
 * Only the unfinished record is carried over, so memory does not grow with the file.
 *
 * The delimiter (',' ';' or tab) and the line ending are taken from the header line (the first non-empty line with a
 * delimiter, so a title line above the header is passed over), counting delimiters outside quotes. A byte-order mark
 * is dropped.
 */
import { isUtf8 } from 'node:buffer';
import { closeSync, createReadStream, fstatSync, openSync, readSync } from 'node:fs';
import { open } from 'node:fs/promises';
import type Papa from 'papaparse';
import { InputError } from '../errors.js';
import { DATA_PATH_FIX, fsFailure, requireOrdinaryFile } from '../files.js';
import { isTrimmedSpace } from './rows.js';
import type { ReadOptions, SheetRow, SplitTally } from './rows.js';
import { ASCII_TEXT } from './tally.js';

export type Delimiter = ',' | ';' | '\t';
type Newline = '\n' | '\r\n' | '\r';

/** Lines read one at a time at the start, until the consumer has chosen its columns (see readCsvBatches). */
const EARLY_LINES = 16;

/** Bytes per read from the file. */
const READ_SIZE = 1 << 18;

/**
 * The error for a file that is not UTF-8, found by reading it again (only when the decoder has failed) to point at the
 * first bad byte: its line, and the characters it would be in Windows-1252, the usual encoding of such exports.
 */
export async function notUtf8(path: string, file: string): Promise<InputError> {
  const bad = await firstInvalidUtf8(path);
  const found = bad === undefined ? undefined : `byte 0x${bad.byte.toString(16).toUpperCase().padStart(2, '0')}${bad.asWindows1252 !== undefined ? ` ("${bad.asWindows1252}" in Windows-1252)` : ''}`;
  return new InputError({
    file,
    // Counted in lines: the row a spreadsheet shows unless a quoted value above it holds a line break.
    ...(bad !== undefined ? { row: bad.line } : {}),
    problem: 'The file is not UTF-8 text: it was probably saved in another encoding, such as Windows-1252 or Latin-1',
    ...(found !== undefined ? { found } : {}),
    fix: 'Save the file again as "CSV UTF-8" (in a spreadsheet program, or choose UTF-8 as the encoding in a text editor) and point the claims file at that',
  });
}

/** Windows-1252 characters for bytes 0x80-0x9F (WHATWG Encoding Standard, index windows-1252); others are Latin-1. */
const CP1252_HIGH = '€\u0081‚ƒ„…†‡ˆ‰Š‹Œ\u008DŽ\u008F\u0090‘’“”•–—˜™š›œ\u009DžŸ';

/**
 * The first byte (its offset in the file, and its value) that begins no well-formed UTF-8 sequence, or begins one that
 * is cut short (Unicode 15, §3.9, Table 3-7: no overlong forms, no surrogates, nothing above U+10FFFF), with its
 * 1-based line (counting line feeds, or carriage returns when there are none); undefined when the file is well formed.
 */
export async function firstInvalidUtf8(path: string): Promise<{ offset: number; line: number; byte: number; asWindows1252: string | undefined } | undefined> {
  let lf = 0;
  let cr = 0;
  let base = 0; // offset of the current chunk in the file
  let startAt = 0; // offset of the byte that began the open sequence
  const at = (offset: number, byte: number) => ({ offset, line: (lf > 0 ? lf : cr) + 1, byte, asWindows1252: windows1252(byte) });
  let need = 0; // continuation bytes still expected
  let lo = 0x80;
  let hi = 0xbf;
  let start = -1; // byte that began the open sequence
  for await (const chunk of createReadStream(path, { highWaterMark: READ_SIZE }) as AsyncIterable<Buffer>) {
    for (let i = 0; i < chunk.length; i++) {
      const b = chunk[i]!;
      if (need > 0) {
        if (b >= lo && b <= hi) {
          need -= 1;
          lo = 0x80;
          hi = 0xbf;
          continue;
        }
        return at(startAt, start);
      }
      if (b < 0x80) {
        if (b === 10) lf += 1;
        else if (b === 13) cr += 1;
        continue;
      }
      start = b;
      startAt = base + i;
      if (b >= 0xc2 && b <= 0xdf) need = 1;
      else if (b >= 0xe0 && b <= 0xef) {
        need = 2;
        if (b === 0xe0) lo = 0xa0;
        if (b === 0xed) hi = 0x9f;
      } else if (b >= 0xf0 && b <= 0xf4) {
        need = 3;
        if (b === 0xf0) lo = 0x90;
        if (b === 0xf4) hi = 0x8f;
      } else return at(base + i, b);
    }
    base += chunk.length;
  }
  return need > 0 ? at(startAt, start) : undefined;
}

function windows1252(b: number): string | undefined {
  if (b < 0x80 || b > 0xff) return undefined;
  if (b >= 0xa0) return String.fromCharCode(b);
  const ch = CP1252_HIGH[b - 0x80]!;
  return ch.charCodeAt(0) >= 0x80 && ch.charCodeAt(0) <= 0x9f ? undefined : ch;
}

/** Largest amount of text looked at to find the header line before giving up and guessing from what was read. */
const PEEK_LIMIT = 1 << 20;

/** Count each candidate delimiter outside double quotes in one line; the most frequent wins, ',' on a tie or none. */
export function detectDelimiter(line: string): Delimiter {
  const counts: Record<Delimiter, number> = { ',': 0, ';': 0, '\t': 0 };
  let quoted = false;
  for (const ch of line) {
    if (ch === '"') quoted = !quoted;
    else if (!quoted && (ch === ',' || ch === ';' || ch === '\t')) counts[ch] += 1;
  }
  let best: Delimiter = ',';
  for (const d of [';', '\t'] as const) if (counts[d] > counts[best]) best = d;
  return best;
}

function countDelimiters(line: string): number {
  let quoted = false;
  let n = 0;
  for (const ch of line) {
    if (ch === '"') quoted = !quoted;
    else if (!quoted && (ch === ',' || ch === ';' || ch === '\t')) n += 1;
  }
  return n;
}

/** Lines looked at past a title line (one with no delimiter) before settling on ','. */
const SNIFF_LINES = 10;

/**
 * Delimiter and line ending from the header line: the first non-empty line that has a delimiter (a title line above
 * the header, with no delimiter, is passed over). Undefined while more text is needed; `final` means no more is coming.
 */
export function sniff(text: string, final: boolean): { delimiter: Delimiter; newline: Newline } | undefined {
  let start = 0;
  let newline: Newline | undefined;
  let lines = 0;
  for (;;) {
    const lf = text.indexOf('\n', start);
    const cr = text.indexOf('\r', start);
    let end: number;
    let nl: Newline | undefined;
    if (lf < 0 && cr < 0) {
      if (!final) return undefined;
      end = text.length;
    } else if (cr >= 0 && (lf < 0 || cr < lf)) {
      // A '\r' at the very end of the text may be the first half of '\r\n': wait for more.
      if (cr === text.length - 1 && !final) return undefined;
      end = cr;
      nl = text[cr + 1] === '\n' ? '\r\n' : '\r';
    } else {
      end = lf;
      nl = '\n';
    }
    newline ??= nl;
    const line = text.slice(start, end);
    if (line.trim() !== '') {
      lines += 1;
      if (countDelimiters(line) > 0) return { delimiter: detectDelimiter(line), newline: newline ?? '\n' };
      if (lines >= SNIFF_LINES) return { delimiter: ',', newline: newline ?? '\n' };
    }
    if (nl === undefined) return { delimiter: ',', newline: newline ?? '\n' };
    start = end + nl.length;
  }
}

/**
 * A zero byte never occurs in CSV text (RFC 4180 allows printable characters only): the file is damaged, binary, or
 * a sparse file of zeros. Refused at the first piece that holds one, so such a file is not read to its end.
 */
function nulInText(file: string, rowsRead: number): InputError {
  return new InputError({
    file,
    ...(rowsRead > 0 ? { row: rowsRead + 1 } : {}),
    found: 'a zero byte (NUL)',
    problem: `The file holds a zero byte ${rowsRead > 0 ? `at or after row ${rowsRead + 1}` : 'near its start'}, which CSV text never does: it is damaged, or a binary file with a .csv name`,
    fix: 'Open it in a spreadsheet program and save it again as CSV UTF-8, or point the claims file at the right file',
  });
}

/**
 * The longest record (one row, with any quoted line breaks) read: four million characters, far beyond any survey row
 * even with long comments (a spreadsheet cell holds at most 32,767).
 * A file with no line breaks where rows should end would otherwise be carried whole, in time and memory that grow
 * with the square of its size.
 */
const MAX_RECORD_CHARS = 4 * 1024 * 1024;

/** A row over the limit with this many separators is said to be too wide rather than unending. */
const WIDE_ROW = 100_000;

function recordTooLong(file: string, rowsRead: number, headerRead: boolean, carried = ''): InputError {
  // A row cut into a great many values by commas, semicolons or tabs is a table far too wide, not a missing line break.
  const first = carried.indexOf('\n');
  const row = first >= 0 ? carried.slice(0, first) : carried;
  let separators = 0;
  for (let i = 0; i < row.length; i++) {
    const c = row.charCodeAt(i);
    if (c === 44 || c === 59 || c === 9) separators++;
  }
  if (separators >= WIDE_ROW) {
    return new InputError({
      file,
      row: rowsRead + 1,
      found: `more than ${Math.floor(separators / 1000)} thousand columns`,
      problem: `Row ${rowsRead + 1} of the file has more than ${Math.floor(separators / 1000)} thousand columns in its first 4 million characters, and runs on beyond them; warrant reads rows of at most 4 million characters`,
      fix: 'Save the table with only the columns the claims use and the columns that describe each row (a survey table has at most a few thousand columns)',
    });
  }
  return new InputError({
    file,
    row: rowsRead + 1,
    found: `more than ${MAX_RECORD_CHARS} characters`,
    problem: `Row ${rowsRead + 1} of the file runs on for more than 4 million characters without ending: the file has no line breaks where rows should end${headerRead ? ', or a quote is never closed' : ''}`,
    fix: 'Check that this is a CSV file with one row per line; if a value opens a quote, close it with a double quote',
  });
}

function openFailure(e: unknown, file: string): InputError | undefined {
  const code = (e as { code?: string } | null)?.code;
  if (code === 'ENOENT') return new InputError({ file, problem: 'The data file was not found', fix: DATA_PATH_FIX });
  if (code === 'EISDIR') {
    return new InputError({ file, problem: 'The data path is a folder, not a file', fix: 'Name the CSV file itself in the claims file' });
  }
  if (code === 'EACCES' || code === 'EPERM') {
    return new InputError({ file, problem: 'The data file cannot be read (permission denied)', fix: 'Allow reading the file, or copy it somewhere readable' });
  }
  // A loop of links, a file where a folder should be, a name too long: said as the file system's failure.
  return fsFailure(e, { file }, 'opening the data file');
}

/**
 * Yield every record of a CSV file in order, blank lines included (as a record of one empty value), so that `row`
 * matches the row number a spreadsheet program shows for the same file. A record with a quoted line break counts as
 * one row. Throws InputError for a missing file or a quote that is never closed.
 */
/** Records of text[0, end) with no quotes: lines split on `newline`, fields on `delimiter`. */
export function splitPlain(text: string, end: number, newline: string, delimiter: string): string[][] {
  const out: string[][] = [];
  let at = 0;
  while (at <= end) {
    let next = text.indexOf(newline, at);
    if (next < 0 || next > end) next = end;
    out.push(text.slice(at, next).split(delimiter));
    at = next + newline.length;
    if (next === end) break;
  }
  return out;
}

/** Distinct texts remembered per column for `splitPlainRows`; past this a column's new texts are not remembered. */
const INTERN_LIMIT = 4096;

/**
 * Per kept column, texts already made into strings, by a hash of their characters: a text seen before is handed over
 * as the same string, so a consumer's Map lookup finds its hash already computed and compares by identity.
 */
export type InternTables = Array<Map<number, string> | undefined>;

/**
 * Rows of text[from, end) with no quotes, as `splitPlain` splits them, numbered from `firstRow` and added to `out`,
 * in one pass over the characters. With `keep` undefined every field is sliced. Otherwise a field is made into a string only when its
 * column is kept (others read as ''), kept texts longer than one character are shared through `intern`, and each row's
 * `blank` says whether all of its fields, kept or not, are blank (as `isBlankRow` would on the whole row).
 */
export function splitPlainRows(
  text: string,
  from: number,
  end: number,
  newline: string,
  delimiter: string,
  keep: readonly boolean[] | undefined,
  firstRow: number,
  intern: InternTables = [],
  out: SheetRow[] = [],
): SheetRow[] {
  const d = delimiter.charCodeAt(0);
  const nl0 = newline.charCodeAt(0);
  const pair = newline.length === 2;
  let row = firstRow;
  let at = from;
  if (keep === undefined) {
    for (;;) {
      let next = text.indexOf(newline, at);
      if (next < 0 || next > end) next = end;
      out.push({ row, values: text.slice(at, next).split(delimiter) });
      row += 1;
      if (next >= end) break;
      at = next + newline.length;
    }
    return out;
  }
  const field = (column: number, from: number, to: number, hash: number): string => {
    if (keep[column] !== true) return '';
    if (to - from < 2) return text.slice(from, to);
    let table = intern[column];
    if (table === undefined) {
      table = new Map<number, string>();
      intern[column] = table;
    }
    const known = table.get(hash);
    if (known !== undefined && known.length === to - from && text.startsWith(known, from)) return known;
    const made = text.slice(from, to);
    if (known === undefined && table.size < INTERN_LIMIT) table.set(hash, made);
    return made;
  };
  for (;;) {
    const values: string[] = [];
    let start = at;
    let column = 0;
    let hash = 0;
    let blank = true;
    let i = at;
    for (; i < end; i++) {
      const c = text.charCodeAt(i);
      if (c === d) {
        values.push(field(column, start, i, hash));
        column += 1;
        start = i + 1;
        hash = 0;
      } else if (c === nl0 && (!pair || text.charCodeAt(i + 1) === 10)) break;
      else {
        hash = (Math.imul(hash, 31) + c) | 0;
        if (blank && !isTrimmedSpace(c)) blank = false;
      }
    }
    values.push(field(column, start, i, hash));
    out.push({ row, values, blank });
    row += 1;
    if (i >= end) break;
    at = i + newline.length;
  }
  return out;
}

/** Per kept column, texts already made into strings, by a hash of their bytes (see InternTables). */
export type ByteInternTables = Array<Map<number, { text: string; bytes: Uint8Array }> | undefined>;


/**
 * Rows of bytes[from, end), well-formed UTF-8 with no quote, where `end` is just past a line feed: as `splitPlainRows`
 * would split the decoded text, with columns left out and the blank flag as there. Lines end at a line feed (for
 * `crlf`, a carriage return then a line feed; a line feed alone stops the read there). Returns where it stopped: `end`,
 * or the start of a line it leaves to the text path.
 */
export function splitByteRows(
  b: Uint8Array,
  from: number,
  end: number,
  crlf: boolean,
  d: number,
  keep: readonly boolean[],
  firstRow: number,
  intern: ByteInternTables,
  out: SheetRow[],
): number {
  let row = firstRow;
  let at = from;
  const field = (column: number, s: number, e: number, hash: number): string => {
    if (keep[column] !== true || e === s) return '';
    if (e - s === 1 && b[s]! < 128) return ASCII_TEXT[b[s]!]!;
    let table = intern[column];
    if (table === undefined) {
      table = new Map();
      intern[column] = table;
    }
    const known = table.get(hash);
    if (known !== undefined && known.bytes.length === e - s) {
      const kb = known.bytes;
      let k = 0;
      while (k < kb.length && kb[k] === b[s + k]) k++;
      if (k === kb.length) return known.text;
    }
    const text = Buffer.from(b.buffer, b.byteOffset + s, e - s).toString('utf8');
    if (known === undefined && table.size < INTERN_LIMIT) table.set(hash, { text, bytes: Uint8Array.prototype.slice.call(b, s, e) });
    return text;
  };
  while (at < end) {
    // One pass over the line: fields at the delimiter, the line's end at its line feed (or carriage return then
    // line feed, for crlf; a line feed alone is left to the text path).
    const values: string[] = [];
    let start = at;
    let column = 0;
    let hash = 0;
    let blank = true;
    let wide = false;
    let stop = -1;
    let lf = -1;
    for (let i = at; i < end; i++) {
      const c = b[i]!;
      if (c === d) {
        values.push(field(column, start, i, hash));
        column += 1;
        start = i + 1;
        hash = 0;
        continue;
      }
      if (c === 10) {
        if (crlf) return at;
        stop = i;
        lf = i;
        break;
      }
      if (c === 13 && crlf && b[i + 1] === 10) {
        stop = i;
        lf = i + 1;
        break;
      }
      hash = (Math.imul(hash, 31) + c) | 0;
      if (blank) {
        if (c >= 128) wide = true;
        else if (c !== 32 && (c < 9 || c > 13)) blank = false;
      }
    }
    if (lf < 0) return at;
    values.push(field(column, start, stop, hash));
    if (blank && wide) {
      // Non-ASCII text in an otherwise blank line: decide on the decoded text, as isBlankRow would.
      blank = Buffer.from(b.buffer, b.byteOffset + at, stop - at).toString('utf8').split(String.fromCharCode(d)).every((v) => v.trim() === '');
    }
    out.push({ row, values, blank });
    row += 1;
    at = lf + 1;
  }
  return at;
}

export interface CsvOptions extends ReadOptions {
  /** Called once with the delimiter found, before the first row is yielded. */
  onDelimiter?: (delimiter: Delimiter) => void;
  /**
   * Called with each piece of the file's bytes as read, in order, before it is split (e.g. to hash the file in the
   * same read). Every byte has been handed over once the last row has been yielded. The buffer is reused for the next
   * piece: copy what must be kept.
   */
  onBytes?: (bytes: Buffer) => void;
}

/**
 * One line holding quotes, without its line break, split as papaparse splits it, or undefined when the line is not
 * plainly regular (a quote inside an unquoted value, text after a closing quote, a carriage return): papaparse then
 * reads it, and reports it if it is wrong. A quoted value ends at a quote not followed by another; "" stands for ".
 */
export function splitQuotedLine(text: string, delimiter: string): string[] | undefined {
  if (text.indexOf('\r') >= 0) return undefined;
  const d = delimiter.charCodeAt(0);
  const out: string[] = [];
  let i = 0;
  const n = text.length;
  for (;;) {
    if (text.charCodeAt(i) === 34) {
      let value = '';
      let from = i + 1;
      for (;;) {
        const q = text.indexOf('"', from);
        if (q < 0) return undefined;
        if (text.charCodeAt(q + 1) === 34) {
          value += text.slice(from, q + 1);
          from = q + 2;
          continue;
        }
        value += text.slice(from, q);
        i = q + 1;
        break;
      }
      out.push(value);
      if (i === n) return out;
      if (text.charCodeAt(i) !== d) return undefined;
      i += 1;
    } else {
      let j = text.indexOf(delimiter, i);
      if (j < 0) j = n;
      const value = text.slice(i, j);
      if (value.indexOf('"') >= 0) return undefined;
      out.push(value);
      if (j === n) return out;
      i = j + 1;
    }
  }
}

/**
 * The file's bytes from `start`, `size` at a time, each read into the same buffer (so the reading makes no garbage):
 * a piece is valid only until the next is asked for, and whatever keeps bytes copies them.
 */
async function* pieces(path: string, size: number, start: number): AsyncGenerator<Buffer, void, undefined> {
  const file = await open(path, 'r');
  try {
    const buf = Buffer.allocUnsafe(size);
    let at = start;
    for (;;) {
      const { bytesRead } = await file.read(buf, 0, size, at);
      if (bytesRead === 0) return;
      at += bytesRead;
      yield bytesRead === size ? buf : buf.subarray(0, bytesRead);
    }
  } finally {
    await file.close();
  }
}

/**
 * Where to split a file for a second reader: the start of the first line past the middle (found in a small read
 * there), with the file's size; undefined for a file smaller than `from` bytes, or when the point would lie at or
 * before `past` (the bytes read already) or in the last line.
 */
export function splitPoint(path: string, past: number, from: number): { at: number; size: number } | undefined {
  const fd = openSync(path, 'r');
  try {
    const size = fstatSync(fd).size;
    if (size < from) return undefined;
    const mid = Math.floor(size / 2);
    if (mid <= past) return undefined;
    const look = Buffer.allocUnsafe(1 << 16);
    const got = readSync(fd, look, 0, look.length, mid);
    const lf = look.subarray(0, got).indexOf(10);
    if (lf < 0 || mid + lf + 1 >= size) return undefined;
    return { at: mid + lf + 1, size };
  } finally {
    closeSync(fd);
  }
}

export async function* readCsvRows(path: string, options: CsvOptions = {}): AsyncGenerator<SheetRow> {
  for await (const batch of readCsvBatches(path, options)) yield* batch;
}

/** As readCsvRows, the rows of each piece of the file together (one await per piece, not per row). */
export async function* readCsvBatches(path: string, options: CsvOptions = {}): AsyncGenerator<SheetRow[]> {
  const file = options.displayPath ?? path;
  requireOrdinaryFile(path, { file }, 'data file');
  const readSize = options.chunkSize !== undefined ? Math.max(1, options.chunkSize) : READ_SIZE;
  const stream = pieces(path, readSize, 0);
  // Raw bytes through one streaming decoder: a character split between two reads is carried over, and bytes that are
  // not UTF-8 stop the read (the BOM is kept here and dropped below, once).
  const decoder = new TextDecoder('utf-8', { fatal: true, ignoreBOM: true });
  const decode = async (bytes: Buffer | undefined): Promise<string> => {
    try {
      return bytes === undefined ? decoder.decode() : decoder.decode(bytes, { stream: true });
    } catch (e) {
      if (!(e instanceof TypeError)) throw e;
      throw await notUtf8(path, file);
    }
  };
  // papaparse is loaded only when a piece of the file has a quote (the one-pass splitter reads the rest).
  let papa: typeof Papa | undefined;
  let parser: Papa.Parser | undefined;
  let dialectSet = false;
  const quotedParser = async (): Promise<Papa.Parser> => {
    papa ??= (await import('papaparse')).default;
    parser ??= new papa.Parser(dialect!);
    return parser;
  };
  let dialect: { delimiter: Delimiter; newline: Newline } | undefined;
  let pending = '';
  const intern: InternTables = [];
  const byteIntern: ByteInternTables = [];
  let first = true;
  let row = 0;

  function* emit(records: string[][]): Generator<SheetRow[]> {
    if (records.length === 0) return;
    const out: SheetRow[] = new Array<SheetRow>(records.length);
    for (let i = 0; i < records.length; i++) {
      row += 1;
      out[i] = { row, values: records[i]! };
    }
    yield out;
  }

  /** Quote errors in the records returned; an error in the unfinished last record is re-checked when it is complete. */
  function checkErrors(errors: Papa.ParseError[], complete: number): void {
    const quote = errors.find((e) => e.type === 'Quotes' && (e.row ?? 0) < complete);
    if (quote !== undefined) {
      throw new InputError({
        file,
        row: row + (quote.row ?? 0) + 1,
        problem: quote.code === 'MissingQuotes' ? 'A quoted value is never closed' : 'A quoted value has text after its closing quote',
        found: quote.message,
        fix: 'Put a double quote at the end of the quoted value, and write any quote inside it twice ("")',
      });
    }
  }

  try {
    /** One piece of the file as text: decoded, then split by the fast paths or papaparse. */
    async function* textPiece(bytes: Buffer): AsyncGenerator<SheetRow[]> {
      let text = await decode(bytes);
      if (first) {
        if (text.length === 0) return;
        if (text.charCodeAt(0) === 0xfeff) text = text.slice(1);
        first = false;
      }
      // Fastest path: the unfinished line carried over is finished by this piece's first line, and the rest of the
      // piece is split where it lies, without joining it to the carried text (a joined string is slower to scan).
      if (dialect !== undefined && pending.indexOf('"') < 0 && text.indexOf('"') < 0) {
        const nl = dialect.newline;
        const firstNl = text.indexOf(nl);
        const straddles = nl.length === 2 && text.charCodeAt(0) === 10 && pending.charCodeAt(pending.length - 1) === 13;
        if (firstNl >= 0 && !straddles && pending.indexOf(nl) < 0) {
          const keep = options.select?.keep;
          const head = pending + text.slice(0, firstNl);
          const rows = splitPlainRows(head, 0, head.length, nl, dialect.delimiter, keep, row + 1, intern);
          const last = text.lastIndexOf(nl);
          if (last > firstNl) splitPlainRows(text, firstNl + nl.length, last, nl, dialect.delimiter, keep, row + 2, intern, rows);
          row += rows.length;
          pending = text.slice(last + nl.length);
          yield rows;
          return;
        }
      }
      pending += text;
      if (pending.length > MAX_RECORD_CHARS) throw recordTooLong(file, row, dialectSet, pending);
      if (!dialectSet) {
        const found = sniff(pending, pending.length >= PEEK_LIMIT);
        if (found === undefined) return;
        options.onDelimiter?.(found.delimiter);
        dialect = found;
        dialectSet = true;
      }
      // Fast path: text with no double quote at all is split on the newline and the delimiter, records exactly as
      // papaparse would return them (tests compare the two); the last, maybe unfinished, line is carried over.
      if (pending.indexOf('"') < 0) {
        const nl = dialect!.newline;
        const last = pending.lastIndexOf(nl);
        if (last < 0) return;
        const rows = splitPlainRows(pending, 0, last, nl, dialect!.delimiter, options.select?.keep, row + 1, intern);
        row += rows.length;
        pending = pending.slice(last + nl.length);
        yield rows;
        return;
      }
      // With quotes, no line feed means no whole record yet (a read that ended inside a line): it waits for the next
      // piece, where papaparse would return nothing and leave it. One whole line is split on its own, as on the byte
      // path (splitQuotedLine), so that lines cut between two reads do not load papaparse.
      if (dialect!.newline !== '\r') {
        const lf = pending.indexOf('\n');
        if (lf < 0) return;
        const crlf = dialect!.newline === '\r\n';
        if (lf === pending.length - 1 && (!crlf || pending.charCodeAt(lf - 1) === 13)) {
          const record = splitQuotedLine(pending.slice(0, lf - (crlf ? 1 : 0)), dialect!.delimiter);
          if (record !== undefined) {
            pending = '';
            yield* emit([record]);
            return;
          }
        }
      }
      const result = (await quotedParser()).parse(pending, 0, true) as Papa.ParseResult<string[]>;
      checkErrors(result.errors, result.data.length);
      pending = pending.slice(result.meta.cursor);
      yield* emit(result.data);
    }

    // Between lines, with the decoder holding no part of a character, plain lines are split straight from the
    // bytes (splitByteRows); the rest of a piece, and any piece with a quote, goes through textPiece.
    const decoderClean = { now: true };
    const onBytes = options.onBytes;
    let early = 0;
    /** One piece of the file's bytes, in order, split by whichever path fits (see above). */
    async function* piece(whole: Buffer): AsyncGenerator<SheetRow[]> {
      if (whole.indexOf(0) >= 0) throw nulInText(file, row);
      let raw = whole;
      // Until the consumer has read the header and chosen its columns (select.keep), the first lines are read one at
      // a time, so that the rest of the first piece can take the byte path below.
      while (options.select !== undefined && options.select.keep === undefined && early < EARLY_LINES) {
        const lf = raw.indexOf(10);
        if (lf < 0 || lf === raw.length - 1) break;
        early += 1;
        const line = raw.subarray(0, lf + 1);
        raw = raw.subarray(lf + 1);
        const crlf = dialect?.newline === '\r\n' && lf > 0 && line[lf - 1] === 13;
        // A line with quotes, once the dialect is known, split on its own as on the byte path (papaparse stays unloaded).
        const record =
          dialect !== undefined && !first && pending === '' && decoderClean.now && dialect.newline !== '\r' && line.indexOf(34) >= 0 && isUtf8(line)
            ? splitQuotedLine(line.toString('utf8', 0, lf - (crlf ? 1 : 0)), dialect.delimiter)
            : undefined;
        if (record !== undefined) yield* emit([record]);
        else yield* textPiece(line);
        decoderClean.now = true;
      }
      const keep = options.select?.keep;
      let from = 0;
      if (keep !== undefined && dialect !== undefined && !first && dialect.newline !== '\r') {
        if (pending !== '' || !decoderClean.now) {
          const lf = raw.indexOf(10);
          if (lf < 0) from = -1;
          else {
            yield* textPiece(raw.subarray(0, lf + 1));
            decoderClean.now = true;
            from = lf + 1;
          }
        }
        if (from >= 0 && pending === '') {
          const last = raw.lastIndexOf(10);
          // Runs of plain lines are split straight from the bytes; a line with a quote between them is split on its
          // own (splitQuotedLine, or papaparse for anything unusual), so that a file where some names are quoted
          // stays on this path. A quote count that is odd (a quoted line break) leaves the rest to textPiece.
          let at = from;
          // Valid UTF-8 as a whole, so valid in every part split at a line feed (never inside a character).
          const valid = last >= from && isUtf8(raw.subarray(from, last + 1));
          const sink = options.select?.lines;
          while (valid && at <= last) {
            if (sink !== undefined) {
              // The consumer takes the lines itself, in order (the rows before them have been yielded), quoted values
              // included; a line it leaves is read below, on its own.
              const taken = sink.lines(raw, at, last + 1, dialect.newline === '\r\n', dialect.delimiter.charCodeAt(0), row + 1);
              row += taken.rows;
              at = taken.at;
              if (at > last) break;
              const lf = raw.indexOf(10, at);
              const q = raw.indexOf(34, at);
              if (q < 0 || q > lf) break;
            } else {
              const q = raw.indexOf(34, at);
              const runEnd = q < 0 || q > last ? last + 1 : Math.max(at, raw.lastIndexOf(10, q) + 1);
              if (runEnd > at) {
                const rows: SheetRow[] = [];
                const end = splitByteRows(raw, at, runEnd, dialect.newline === '\r\n', dialect.delimiter.charCodeAt(0), keep, row + 1, byteIntern, rows);
                row += rows.length;
                if (rows.length > 0) yield rows;
                if (end < runEnd) {
                  at = end;
                  break;
                }
                at = runEnd;
              }
            }
            if (at > last) break;
            const lineEnd = raw.indexOf(10, at) + 1;
            let quotes = 0;
            for (let i = at; i < lineEnd; i++) if (raw[i] === 34) quotes += 1;
            if (quotes % 2 === 1) break;
            const crlf = dialect.newline === '\r\n' && lineEnd - 2 >= at && raw[lineEnd - 2] === 13;
            const record = splitQuotedLine(raw.toString('utf8', at, lineEnd - (crlf ? 2 : 1)), dialect.delimiter);
            if (record !== undefined) yield* emit([record]);
            else {
              yield* textPiece(raw.subarray(at, lineEnd));
              if (pending !== '') {
                at = lineEnd;
                break;
              }
            }
            at = lineEnd;
          }
          from = at;
        }
        if (from < 0) from = 0;
      }
      if (from < raw.length) {
        yield* textPiece(from === 0 ? raw : raw.subarray(from));
        decoderClean.now = raw[raw.length - 1]! < 0x80;
      }
    }

    // A large file whose consumer can tally a range elsewhere (ByteLineSink.split) is read in two: the bytes from a
    // line start near the middle to the end are handed over at once, and the reading here stops there if it arrives
    // at a line's start (nothing carried over): the rest is then only hashed (onBytes). If the range is not taken
    // (a line or an answer only this reader handles, say), it is read here after all, from that point, so rows,
    // messages and counts are those of a read in one.
    let base = 0;
    let split: { at: number; size: number; tally: SplitTally } | undefined;
    let splitTried = false;
    let skipping = false;
    try {
      for await (const whole of stream) {
        onBytes?.(whole);
        const wholeStart = base;
        base += whole.length;
        if (skipping) continue;
        if (split === undefined && !splitTried) {
          const sink = options.select?.lines;
          if (sink?.split !== undefined && options.select?.keep !== undefined && dialect !== undefined && !first && dialect.newline !== '\r') {
            splitTried = true;
            const at = splitPoint(path, base, sink.splitFrom ?? Number.POSITIVE_INFINITY);
            if (at !== undefined) split = { ...at, tally: sink.split(path, at.at, at.size, dialect.newline === '\r\n', dialect.delimiter.charCodeAt(0)) };
          }
        }
        if (split !== undefined && base >= split.at) {
          const cut = split.at - wholeStart;
          yield* piece(whole.subarray(0, cut));
          if (pending === '' && decoderClean.now) {
            skipping = true;
            continue;
          }
          split.tally.cancel();
          split = undefined;
          if (cut < whole.length) yield* piece(whole.subarray(cut));
          continue;
        }
        yield* piece(whole);
      }
      if (skipping && split !== undefined) {
        const taken = base === split.size && (await split.tally.finish(row + 1));
        if (!taken) {
          split.tally.cancel();
          for await (const raw of pieces(path, readSize, split.at)) yield* piece(raw);
        }
        split = undefined;
      }
    } finally {
      split?.tally.cancel();
    }
    const tail = await decode(undefined);
    if (tail !== '') pending += first && tail.charCodeAt(0) === 0xfeff ? tail.slice(1) : tail;
    if (pending !== '') {
      if (!dialectSet) {
        const found = sniff(pending, true)!;
        options.onDelimiter?.(found.delimiter);
        dialect = found;
        dialectSet = true;
      }
      if (pending.indexOf('"') < 0) {
        const rows = splitPlainRows(pending, 0, pending.length, dialect!.newline, dialect!.delimiter, options.select?.keep, row + 1, intern);
        row += rows.length;
        yield rows;
        return;
      }
      const result = (await quotedParser()).parse(pending, 0, false) as Papa.ParseResult<string[]>;
      checkErrors(result.errors, Number.POSITIVE_INFINITY);
      yield* emit(result.data);
    }
  } catch (e) {
    throw openFailure(e, file) ?? e;
  } finally {
    await stream.return(undefined);
  }
}
