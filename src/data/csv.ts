/**
 * Streaming CSV rows.
 *
 * The file is opened with `{ encoding: 'utf8' }`, so Node's string decoder carries a multi-byte character that is split
 * between two reads over to the next read; the text is then fed, piece by piece, to papaparse's incremental parser
 * (`Papa.Parser.parse(text, base, ignoreLastRow)`), which returns the complete records and where the unfinished one
 * starts. Only the unfinished record is carried over, so memory does not grow with the file.
 *
 * The delimiter (',' ';' or tab) and the line ending are taken from the header line (the first non-empty line with a
 * delimiter, so a title line above the header is passed over), counting delimiters outside quotes. A byte-order mark is dropped.
 */
import { createReadStream } from 'node:fs';
import Papa from 'papaparse';
import { InputError } from '../errors.js';
import type { ReadOptions, SheetRow } from './rows.js';

export type Delimiter = ',' | ';' | '\t';
type Newline = '\n' | '\r\n' | '\r';

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

function openFailure(e: unknown, file: string): InputError | undefined {
  const code = (e as { code?: string } | null)?.code;
  if (code === 'ENOENT') {
    return new InputError({ file, problem: 'The data file was not found', fix: 'Check the file path in the claims file; it is relative to the claims file' });
  }
  if (code === 'EISDIR') {
    return new InputError({ file, problem: 'The data path is a folder, not a file', fix: 'Name the CSV file itself in the claims file' });
  }
  if (code === 'EACCES' || code === 'EPERM') {
    return new InputError({ file, problem: 'The data file cannot be read (permission denied)', fix: 'Allow reading the file, or copy it somewhere readable' });
  }
  return undefined;
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

export interface CsvOptions extends ReadOptions {
  /** Called once with the delimiter found, before the first row is yielded. */
  onDelimiter?: (delimiter: Delimiter) => void;
}

export async function* readCsvRows(path: string, options: CsvOptions = {}): AsyncGenerator<SheetRow> {
  for await (const batch of readCsvBatches(path, options)) yield* batch;
}

/** As readCsvRows, the rows of each piece of the file together (one await per piece, not per row). */
export async function* readCsvBatches(path: string, options: CsvOptions = {}): AsyncGenerator<SheetRow[]> {
  const file = options.displayPath ?? path;
  const stream = createReadStream(path, {
    encoding: 'utf8',
    ...(options.chunkSize !== undefined ? { highWaterMark: Math.max(1, options.chunkSize) } : {}),
  });
  let parser: Papa.Parser | undefined;
  let dialect: { delimiter: Delimiter; newline: Newline } | undefined;
  let pending = '';
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
    for await (const chunk of stream as AsyncIterable<string>) {
      let text = chunk;
      if (first) {
        if (text.length === 0) continue;
        if (text.charCodeAt(0) === 0xfeff) text = text.slice(1);
        first = false;
      }
      pending += text;
      if (parser === undefined) {
        const found = sniff(pending, pending.length >= PEEK_LIMIT);
        if (found === undefined) continue;
        options.onDelimiter?.(found.delimiter);
        parser = new Papa.Parser(found);
        dialect = found;
      }
      // Fast path: text with no double quote at all is split on the newline and the delimiter, records exactly as
      // papaparse would return them (tests compare the two); the last, maybe unfinished, line is carried over.
      if (pending.indexOf('"') < 0) {
        const nl = dialect!.newline;
        const last = pending.lastIndexOf(nl);
        if (last < 0) continue;
        const records = splitPlain(pending, last, nl, dialect!.delimiter);
        pending = pending.slice(last + nl.length);
        yield* emit(records);
        continue;
      }
      const result = parser.parse(pending, 0, true) as Papa.ParseResult<string[]>;
      checkErrors(result.errors, result.data.length);
      pending = pending.slice(result.meta.cursor);
      yield* emit(result.data);
    }
    if (pending !== '') {
      if (parser === undefined) {
        const found = sniff(pending, true)!;
        options.onDelimiter?.(found.delimiter);
        parser = new Papa.Parser(found);
        dialect = found;
      }
      if (pending.indexOf('"') < 0) {
        yield* emit([pending.split(dialect!.delimiter)]);
        return;
      }
      const result = parser.parse(pending, 0, false) as Papa.ParseResult<string[]>;
      checkErrors(result.errors, Number.POSITIVE_INFINITY);
      yield* emit(result.data);
    }
  } catch (e) {
    throw openFailure(e, file) ?? e;
  } finally {
    stream.destroy();
  }
}
