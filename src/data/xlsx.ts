/**
 * A focused streaming reader for one worksheet of an XLSX workbook (Office Open XML, ECMA-376 Part 1, §18 SpreadsheetML).
 *
 * yauzl reads the zip's central directory and inflates only the parts needed: the package relationships
 * (`_rels/.rels`), the workbook (`xl/workbook.xml`) and its relationships (to find a sheet's part by name), the shared
 * strings table, and the sheet itself. Each part's bytes are decoded with one `TextDecoder` in streaming mode, so a
 * character split between two inflated pieces is carried over intact, and the text is fed to saxes, a SAX parser.
 * Rows are handed out as they close; only the shared strings are held in memory (cells refer to them by index).
 *
 * Cell values (ECMA-376 §18.3.1.4 `c`, §18.18.11 ST_CellType): `s` shared string (rich-text runs joined), `str`
 * formula text, `inlineStr` (`is` element), `n` number, `b` boolean (TRUE/FALSE), `e` error (#N/A...), `d` ISO date.
 * A formula cell is read from its cached value `v`; formulas are never evaluated, and a formula with no cached value
 * is an error naming the cell. Numbers are written as JavaScript's shortest text after rounding to 15 significant
 * digits, the precision a spreadsheet program displays (so a stored 0.30000000000000004 reads "0.3", as the user sees
 * it). The styles part is read for its number formats only: a number cell whose format shows a date or time reads
 * as an ISO 8601 date ("2026-01-15"), date and time, or time, as the user sees a date rather than its serial number.
 *
 * The sheet part itself, the only large one, is read by a focused scanner (sheet-scan.ts) rather than saxes.
 */
import yauzl from 'yauzl';
import type { Entry, ZipFile } from 'yauzl';
import { SaxesParser } from 'saxes';
import { createInflateRaw } from 'node:zlib';
import { Transform, pipeline } from 'node:stream';
import type { SaxesTagPlain } from 'saxes';
import { InputError } from '../errors.js';
import { DATA_PATH_FIX, fsFailure, fsReason, requireOrdinaryFile } from '../files.js';
import type { ReadOptions, SheetRow } from './rows.js';
import { SheetScanner, isBuiltInDateFormat, isDateFormatCode } from './sheet-scan.js';

export interface XlsxOptions extends ReadOptions {
  /** Worksheet name; default the first visible sheet. */
  sheet?: string;
}

export interface SheetInfo {
  name: string;
  hidden: boolean;
  /** Path of the sheet's part inside the zip, e.g. "xl/worksheets/sheet1.xml". */
  part: string;
}

export interface OpenedSheet {
  /** The sheet read (the one named, or the first visible one). */
  sheet: string;
  sheets: SheetInfo[];
  rows: AsyncGenerator<SheetRow>;
  /** The same rows, those completed by each piece of the sheet together (use one of `rows` and `batches`, not both). */
  batches: AsyncGenerator<SheetRow[]>;
  /** Close the workbook without reading the rows (reading them to the end, or stopping early, closes it too). */
  close(): void;
}

/** Spreadsheet column letters to a 0-based index: A -> 0, Z -> 25, AA -> 26. Throws on anything but letters. */
export function columnIndex(letters: string): number {
  if (!/^[A-Za-z]{1,3}$/.test(letters)) throw new Error(`Not a column reference: "${letters}"`);
  let n = 0;
  for (const ch of letters.toUpperCase()) n = n * 26 + (ch.charCodeAt(0) - 64);
  return n - 1;
}

/** 0-based column index to letters: 0 -> A, 26 -> AA. */
export function columnLetters(index: number): string {
  let s = '';
  let n = index + 1;
  while (n > 0) {
    const r = (n - 1) % 26;
    s = String.fromCharCode(65 + r) + s;
    n = Math.floor((n - 1) / 26);
  }
  return s;
}

/** A stored number as the text a reader expects: 15 significant digits, then JavaScript's shortest form. */
export function formatNumber(stored: string): string {
  // Fast path: a plain whole number of at most 15 digits without leading zeros is already in its shortest form.
  const len = stored.length;
  if (len > 0 && len <= 15) {
    let i = stored.charCodeAt(0) === 45 ? 1 : 0;
    const first = stored.charCodeAt(i);
    if (i < len && first >= 49 && first <= 57) {
      for (i += 1; i < len; i++) {
        const ch = stored.charCodeAt(i);
        if (ch < 48 || ch > 57) break;
      }
      if (i === len) return stored;
    } else if (len === 1 && first === 48) return stored;
  }
  const text = stored.trim();
  const x = Number(text);
  if (text === '' || !Number.isFinite(x)) return text;
  const shown = Number(x.toPrecision(15));
  return String(Object.is(shown, -0) ? 0 : shown);
}

function localName(name: string): string {
  const i = name.indexOf(':');
  return i < 0 ? name : name.slice(i + 1);
}

function attr(tag: SaxesTagPlain, local: string, prefixed = false): string | undefined {
  for (const [k, v] of Object.entries(tag.attributes)) {
    const i = k.indexOf(':');
    if ((prefixed ? i >= 0 : i < 0) && localName(k) === local) return v;
  }
  return undefined;
}

function openZip(path: string, file: string): Promise<ZipFile> {
  return new Promise((resolve, reject) => {
    yauzl.open(path, { lazyEntries: true, autoClose: false }, (err, zip) => {
      if (err) {
        const code = (err as { code?: string }).code;
        if (code === 'ENOENT') {
          reject(new InputError({ file, problem: 'The data file was not found', fix: DATA_PATH_FIX }));
        } else if (code !== 'EISDIR' && fsReason(err) !== undefined) {
          // A loop of links, a file where a folder should be, permission denied: the file system's failure, not a bad zip.
          reject(fsFailure(err, { file }, 'opening the data file'));
        } else if (code === 'EISDIR') {
          reject(new InputError({ file, problem: 'The data path is a folder, not a file', fix: 'Name the workbook file itself in the claims file' }));
        } else {
          reject(
            new InputError({
              file,
              problem: 'The file is not an XLSX workbook (it is not a zip archive)',
              found: err.message,
              fix: 'Save the sheet as an Excel Workbook (.xlsx) or as CSV, and point the claims file at that',
            }),
          );
        }
        return;
      }
      resolve(zip);
    });
  });
}

/**
 * Limits on what a workbook may unpack to, so that time and memory stay bounded whatever the file holds (a zip bomb
 * inflates a few kilobytes to gigabytes). Every part read is checked against the size its kind may reach and against
 * an inflation ratio, both on the sizes the zip's directory records and again on the bytes as they are inflated (a
 * directory can lie). The ratio follows common practice (Apache POI refuses parts that inflate more than 100-fold);
 * sheet XML of real survey data inflates 5 to 20-fold. Parts under a megabyte are not held to the ratio.
 */
export const ZIP_LIMITS = {
  /** The most inflated bytes per compressed byte. */
  ratio: 100,
  /** Inflated bytes allowed before the ratio applies. */
  ratioGrace: 1 << 20,
  /** The sheet part, streamed row by row: Excel's 1,048,576 rows of a few dozen columns fit well within it. */
  sheet: 2 * 1024 ** 3,
  /** The shared strings part, held in memory while the sheet is read. */
  strings: 256 * 1024 ** 2,
  /** Relationships, workbook and styles parts: a few kilobytes in real workbooks. */
  small: 32 * 1024 ** 2,
  /** Parts listed in the zip's directory: real workbooks have tens, or hundreds with many sheets and images. */
  entries: 10_000,
};

type PartKind = 'sheet' | 'strings' | 'small';

const mb = (n: number): string => (n >= 1024 ** 3 ? `${(n / 1024 ** 3).toFixed(0)} GB` : `${Math.round(n / 1024 ** 2)} MB`);

/** The refusal of a part that unpacks to too much: which part, how much, and why. */
function tooLarge(file: string, part: string, kind: PartKind, inflated: number, compressed: number, declared: boolean): InputError | undefined {
  const cap = ZIP_LIMITS[kind];
  const what = `the workbook's part ${part}`;
  const amount = declared ? `is recorded as unpacking to ${inflated} bytes` : `unpacked to more than ${inflated} bytes`;
  if (inflated > cap) {
    return new InputError({
      file,
      field: part,
      found: `${inflated} bytes`,
      problem: `${what} ${amount}, more than the ${mb(cap)} warrant allows for ${kind === 'sheet' ? 'a sheet' : kind === 'strings' ? 'the shared text of a workbook' : 'a part of this kind'}, so it was not read (it may be a zip bomb, built to exhaust memory or time)`,
      fix: 'Check that this is the right workbook; save the data again from a spreadsheet program, or export the sheet as CSV',
    });
  }
  if (inflated > ZIP_LIMITS.ratioGrace && inflated > ZIP_LIMITS.ratio * Math.max(compressed, 1)) {
    return new InputError({
      file,
      field: part,
      found: `${compressed} bytes unpacking to ${declared ? '' : 'more than '}${inflated}`,
      problem: `${what} ${amount} from ${compressed} compressed bytes, more than ${ZIP_LIMITS.ratio} times its size, which real workbooks never need, so it was not read (it is probably a zip bomb, built to exhaust memory or time)`,
      fix: 'Check where the workbook came from; save the data again from a spreadsheet program, or export the sheet as CSV',
    });
  }
  return undefined;
}

/** A counter for the bytes of one part as they inflate, throwing as soon as they pass a limit. */
function inflateCounter(file: string, entry: Entry, kind: PartKind): (bytes: number) => void {
  const declared = tooLarge(file, entry.fileName, kind, entry.uncompressedSize, entry.compressedSize, true);
  if (declared !== undefined) throw declared;
  let total = 0;
  return (bytes: number) => {
    total += bytes;
    const e = tooLarge(file, entry.fileName, kind, total, entry.compressedSize, false);
    if (e !== undefined) throw e;
  };
}

function listEntries(zip: ZipFile, file: string): Promise<Map<string, Entry>> {
  return new Promise((resolve, reject) => {
    const entries = new Map<string, Entry>();
    if (zip.entryCount > ZIP_LIMITS.entries) {
      reject(
        new InputError({
          file,
          found: `${zip.entryCount} parts`,
          problem: `the workbook's zip directory lists ${zip.entryCount} parts, more than the ${ZIP_LIMITS.entries} warrant reads through (real workbooks hold tens or hundreds)`,
          fix: 'Check that this is the right workbook; save the data again from a spreadsheet program, or export the sheet as CSV',
        }),
      );
      return;
    }
    zip.on('entry', (e: Entry) => {
      entries.set(e.fileName.replace(/\\/g, '/'), e);
      zip.readEntry();
    });
    zip.once('end', () => resolve(entries));
    zip.once('error', reject);
    zip.readEntry();
  });
}

function openEntry(zip: ZipFile, entry: Entry): Promise<NodeJS.ReadableStream & { destroy(): void }> {
  return new Promise((resolve, reject) => {
    zip.openReadStream(entry, (err, stream) => (err ? reject(err) : resolve(stream)));
  });
}

/** Pieces of inflated sheet XML handed to the scanner: larger than zlib's 16 KiB default, fewer steps per sheet. */
const INFLATE_CHUNK = 1 << 18;

/**
 * The sheet part's bytes. A deflated part (the usual case) is read raw from the zip and inflated here with larger
 * pieces than yauzl's own inflater uses; its length is then checked against the size the zip's directory records,
 * as yauzl would.
 */
async function openSheetEntry(zip: ZipFile, entry: Entry, file: string): Promise<NodeJS.ReadableStream & { destroy(): void }> {
  const count = inflateCounter(file, entry, 'sheet');
  if (entry.compressionMethod !== 8) return openEntry(zip, entry);
  const raw = await new Promise<NodeJS.ReadableStream & { destroy(): void }>((resolve, reject) => {
    zip.openReadStream(entry, { decompress: false }, (err, stream) => (err ? reject(err) : resolve(stream)));
  });
  const inflate = createInflateRaw({ chunkSize: INFLATE_CHUNK });
  let size = 0;
  const expected = entry.uncompressedSize;
  const checked = new Transform({
    transform(piece: Buffer, _enc, done) {
      size += piece.length;
      try {
        count(piece.length);
      } catch (e) {
        done(e as Error);
        return;
      }
      if (size > expected) done(new Error(`too many bytes in the stream: more than the expected ${expected}`));
      else done(null, piece);
    },
    flush(done) {
      done(size === expected ? null : new Error(`not enough bytes in the stream: expected ${expected}, got ${size}`));
    },
  });
  const out = pipeline(raw, inflate, checked, () => {});
  const destroy = out.destroy.bind(out);
  out.destroy = (e?: Error) => {
    raw.destroy();
    return destroy(e);
  };
  return out;
}

/**
 * Feed one zip part through a streaming UTF-8 decoder into a fresh SAX parser; after each piece, `drain` hands out
 * whatever the handlers produced. `chunkSize` cuts the inflated bytes into pieces of that size (for tests).
 */
async function* parsePart<T>(
  zip: ZipFile,
  entry: Entry,
  chunkSize: number | undefined,
  setup: (parser: SaxesParser) => () => T[],
  damaged: (message: string) => InputError,
  file: string,
  kind: PartKind = 'small',
): AsyncGenerator<T> {
  const count = inflateCounter(file, entry, kind);
  let stream: (NodeJS.ReadableStream & { destroy(): void }) | undefined;
  const decoder = new TextDecoder('utf-8');
  const parser = new SaxesParser({ xmlns: false });
  let failure: Error | undefined;
  parser.on('error', (e) => {
    failure ??= e;
  });
  const drain = setup(parser);
  const write = (text: string): T[] => {
    if (text !== '') parser.write(text);
    if (failure !== undefined) throw damaged(failure.message);
    return drain();
  };
  try {
    // Opening checks the part's local header, which a damaged zip can fail like any later step.
    stream = await openEntry(zip, entry);
    for await (const raw of stream as AsyncIterable<Buffer>) {
      count(raw.length);
      const step = chunkSize !== undefined && chunkSize > 0 ? chunkSize : raw.length;
      for (let at = 0; at < raw.length; at += step) {
        yield* write(decoder.decode(raw.subarray(at, at + step), { stream: true }));
      }
    }
    yield* write(decoder.decode());
    parser.close();
    if (failure !== undefined) throw damaged(failure.message);
    yield* drain();
  } catch (e) {
    if (e instanceof InputError) throw e;
    // A zip-level failure while inflating (bad data, or more bytes than the directory records), named by its part.
    throw new InputError({
      file,
      field: entry.fileName,
      problem: `The workbook is damaged: its part ${entry.fileName} cannot be unpacked${/too many bytes/.test(String(e)) ? ', as it unpacks to more bytes than the zip\'s directory records (a damaged file, or a zip bomb)' : ''}`,
      found: e instanceof Error ? e.message : String(e),
      fix: 'Open the workbook in a spreadsheet program and save it again as .xlsx',
    });
  } finally {
    stream?.destroy();
  }
}

/** Read a small part (relationships, workbook) whole. */
async function collect<T>(gen: AsyncGenerator<T>): Promise<T[]> {
  const out: T[] = [];
  for await (const x of gen) out.push(x);
  return out;
}

function resolvePart(base: string, target: string): string {
  if (target.startsWith('/')) return target.slice(1);
  const parts = base.split('/').slice(0, -1);
  for (const seg of target.split('/')) {
    if (seg === '..') parts.pop();
    else if (seg !== '.' && seg !== '') parts.push(seg);
  }
  return parts.join('/');
}

function relsPath(part: string): string {
  const i = part.lastIndexOf('/');
  return `${part.slice(0, i + 1)}_rels/${part.slice(i + 1)}.rels`;
}

/**
 * Open a workbook and start reading one sheet. The returned `rows` yields each `<row>` present in the sheet (rows a
 * spreadsheet program leaves out of the file, because they are empty, are not yielded), numbered by its `r`.
 */
export async function openXlsxSheet(path: string, options: XlsxOptions = {}): Promise<OpenedSheet> {
  const file = options.displayPath ?? path;
  requireOrdinaryFile(path, { file }, 'data file');
  const zip = await openZip(path, file);
  let closed = false;
  const close = (): void => {
    if (!closed) {
      closed = true;
      zip.close();
    }
  };
  let handedOver = false;
  try {
    const entries = await listEntries(zip, file);
    const damaged = (part: string) => (message: string) =>
      new InputError({
        file,
        problem: `The workbook is damaged: its part ${part} is not well-formed XML`,
        found: message,
        fix: 'Open the workbook in a spreadsheet program and save it again as .xlsx',
      });
    const notWorkbook = (what: string) =>
      new InputError({
        file,
        problem: `The file is a zip archive but not an XLSX workbook (${what} is missing)`,
        fix: 'Save the sheet as an Excel Workbook (.xlsx) or as CSV, and point the claims file at that',
      });

    const relations = async (part: string): Promise<Map<string, { type: string; target: string }>> => {
      const map = new Map<string, { type: string; target: string }>();
      const entry = entries.get(relsPath(part));
      if (entry === undefined) return map;
      const rels = await collect(
        parsePart(zip, entry, options.chunkSize, (p) => {
          const out: Array<{ id: string; type: string; target: string }> = [];
          p.on('opentag', (tag) => {
            if (localName(tag.name) !== 'Relationship') return;
            const id = attr(tag as SaxesTagPlain, 'Id');
            const target = attr(tag as SaxesTagPlain, 'Target');
            if (id !== undefined && target !== undefined) {
              out.push({ id, type: attr(tag as SaxesTagPlain, 'Type') ?? '', target });
            }
          });
          return () => out.splice(0);
        }, damaged(relsPath(part)), file),
      );
      for (const r of rels) map.set(r.id, { type: r.type, target: resolvePart(part, r.target) });
      return map;
    };

    // The workbook part: named by the package relationships, usually xl/workbook.xml.
    let workbookPart = 'xl/workbook.xml';
    for (const r of (await relations('')).values()) {
      if (r.type.endsWith('/officeDocument')) workbookPart = r.target;
    }
    const workbookEntry = entries.get(workbookPart);
    if (workbookEntry === undefined) throw notWorkbook(workbookPart);
    const workbookRels = await relations(workbookPart);

    let date1904 = false;
    const sheetTags = await collect(
      parsePart(zip, workbookEntry, options.chunkSize, (p) => {
        const out: Array<{ name: string; hidden: boolean; rid: string }> = [];
        p.on('opentag', (tag) => {
          if (localName(tag.name) === 'workbookPr') {
            const v = attr(tag as SaxesTagPlain, 'date1904');
            date1904 = v === '1' || v === 'true';
          }
          if (localName(tag.name) !== 'sheet') return;
          const t = tag as SaxesTagPlain;
          out.push({ name: attr(t, 'name') ?? '', hidden: (attr(t, 'state') ?? 'visible') !== 'visible', rid: attr(t, 'id', true) ?? '' });
        });
        return () => out.splice(0);
      }, damaged(workbookPart), file),
    );
    const sheets: SheetInfo[] = sheetTags.map((s) => ({
      name: s.name,
      hidden: s.hidden,
      part: workbookRels.get(s.rid)?.target ?? '',
    }));
    const listed = sheets.map((s) => `"${s.name}"${s.hidden ? ' (hidden)' : ''}`).join(', ');

    let chosen: SheetInfo | undefined;
    if (options.sheet !== undefined) {
      chosen = sheets.find((s) => s.name === options.sheet) ?? sheets.find((s) => s.name.trim().toLowerCase() === options.sheet!.trim().toLowerCase());
      if (chosen === undefined) {
        throw new InputError({
          file,
          field: 'sheet',
          found: options.sheet,
          problem: 'The workbook has no sheet with this name',
          fix: sheets.length > 0 ? `Use one of the sheets in the workbook: ${listed}` : 'Add a sheet with data to the workbook',
        });
      }
    } else {
      chosen = sheets.find((s) => !s.hidden);
      if (chosen === undefined) {
        throw new InputError({
          file,
          problem: sheets.length > 0 ? 'The workbook has no visible sheet' : 'The workbook has no sheets',
          fix: sheets.length > 0 ? `Name the sheet to read with "sheet:" in the claims file; the workbook has ${listed}` : 'Add a sheet with data to the workbook',
        });
      }
    }
    const sheetEntry = entries.get(chosen.part);
    if (sheetEntry === undefined) throw notWorkbook(`the part for sheet "${chosen.name}"`);

    // Shared strings: the workbook relationship of type sharedStrings, usually xl/sharedStrings.xml.
    let stringsPart: string | undefined;
    for (const r of workbookRels.values()) if (r.type.endsWith('/sharedStrings')) stringsPart = r.target;
    const stringsEntry = entries.get(stringsPart ?? 'xl/sharedStrings.xml');
    const shared = stringsEntry === undefined ? [] : await collect(parsePart(zip, stringsEntry, options.chunkSize, sharedStringsHandler, damaged(stringsPart ?? 'xl/sharedStrings.xml'), file, 'strings'));

    // Styles: which cell formats show dates (the workbook relationship of type styles, usually xl/styles.xml).
    let stylesPart: string | undefined;
    for (const r of workbookRels.values()) if (r.type.endsWith('/styles')) stylesPart = r.target;
    const stylesEntry = entries.get(stylesPart ?? 'xl/styles.xml');
    const dateStyles = stylesEntry === undefined ? [] : (await collect(parsePart(zip, stylesEntry, options.chunkSize, stylesHandler, damaged(stylesPart ?? 'xl/styles.xml'), file)))[0] ?? [];

    const batches = sheetRows(zip, sheetEntry, options.chunkSize, { file, sheet: chosen.name, shared, dateStyles, date1904, damaged: damaged(chosen.part) }, close);
    const rows = (async function* () {
      for await (const batch of batches) yield* batch;
    })();
    handedOver = true;
    return { sheet: chosen.name, sheets, rows, batches, close };
  } catch (e) {
    if (e instanceof InputError) throw e;
    // A zip-level failure (bad central directory, checksum, truncated data) while reading the small parts.
    throw new InputError({
      file,
      problem: 'The workbook is damaged: a part of it cannot be unpacked',
      found: e instanceof Error ? e.message : String(e),
      fix: 'Open the workbook in a spreadsheet program and save it again as .xlsx',
    });
  } finally {
    if (!handedOver) close();
  }
}

/** Read the rows of one sheet (see openXlsxSheet). */
export async function* readXlsxRows(path: string, options: XlsxOptions = {}): AsyncGenerator<SheetRow> {
  const opened = await openXlsxSheet(path, options);
  yield* opened.rows;
}

/** `<si>` items of the shared strings table; text of `t` elements, runs joined, phonetic runs (`rPh`) left out. */
function sharedStringsHandler(p: SaxesParser): () => string[] {
  const out: string[] = [];
  let inItem = false;
  let phonetic = 0;
  let inText = false;
  let text = '';
  p.on('opentag', (tag) => {
    const n = localName(tag.name);
    if (n === 'si') {
      inItem = true;
      text = '';
    } else if (n === 'rPh') phonetic += 1;
    else if (n === 't' && inItem && phonetic === 0) inText = true;
  });
  p.on('text', (t) => {
    if (inText) text += t;
  });
  p.on('cdata', (t) => {
    if (inText) text += t;
  });
  p.on('closetag', (tag) => {
    const n = localName(tag.name);
    if (n === 't') inText = false;
    else if (n === 'rPh') phonetic -= 1;
    else if (n === 'si') {
      inItem = false;
      out.push(text);
    }
  });
  return () => out.splice(0);
}

/**
 * `cellXfs` of the styles part (ECMA-376 Part 1, §18.8.10): for each cell format, in order, whether its number format
 * (built in, or one of `numFmts`) shows a date or time. Yields one array, once the part is read.
 */
function stylesHandler(p: SaxesParser): () => boolean[][] {
  const custom = new Map<number, string>();
  const formats: number[] = [];
  let inCellXfs = false;
  let done = false;
  p.on('opentag', (tag) => {
    const t = tag as SaxesTagPlain;
    const n = localName(tag.name);
    if (n === 'numFmt') {
      const id = Number(attr(t, 'numFmtId'));
      if (Number.isInteger(id)) custom.set(id, attr(t, 'formatCode') ?? '');
    } else if (n === 'cellXfs') inCellXfs = true;
    else if (n === 'xf' && inCellXfs) formats.push(Number(attr(t, 'numFmtId') ?? '0'));
  });
  p.on('closetag', (tag) => {
    const n = localName(tag.name);
    if (n === 'cellXfs') inCellXfs = false;
    else if (n === 'styleSheet') done = true;
  });
  return () => {
    if (!done) return [];
    done = false;
    return [formats.map((id) => (custom.has(id) ? isDateFormatCode(custom.get(id)!) : isBuiltInDateFormat(id)))];
  };
}

async function* sheetRows(
  zip: ZipFile,
  entry: Entry,
  chunkSize: number | undefined,
  ctx: ConstructorParameters<typeof SheetScanner>[0],
  close: () => void,
): AsyncGenerator<SheetRow[]> {
  try {
    let stream: (NodeJS.ReadableStream & { destroy(): void }) | undefined;
    try {
      // Opening checks the part's local header, which a damaged zip can fail like any later step.
      stream = await openSheetEntry(zip, entry, ctx.file);
      const decoder = new TextDecoder('utf-8');
      const scanner = new SheetScanner(ctx);
      // Plain rows are read from the bytes (feedBytes); the rest is decoded and scanned as text. The decoder may only
      // be passed by when it holds no part of a character: after an ASCII byte.
      let decoderClean = true;
      for await (const raw of stream as AsyncIterable<Buffer>) {
        const step = chunkSize !== undefined && chunkSize > 0 ? chunkSize : raw.length;
        for (let at = 0; at < raw.length; at += step) {
          const piece = raw.subarray(at, at + step);
          let from = 0;
          if (!scanner.idle() || !decoderClean) {
            // Finish the row under way as text, up to and including its '</row>', then go back to the bytes.
            const close = piece.indexOf('</row>');
            if (close >= 0) {
              from = close + 6;
              const rows = scanner.feed(decoder.decode(piece.subarray(0, from), { stream: true }));
              decoderClean = true;
              if (rows.length > 0) yield rows;
            } else from = -1;
          }
          if (from >= 0 && scanner.idle()) from = scanner.feedBytes(piece, from, piece.length);
          if (from < 0) from = 0;
          const rows = from < piece.length ? scanner.feed(decoder.decode(piece.subarray(from), { stream: true })) : scanner.takeRows();
          if (from < piece.length) decoderClean = piece[piece.length - 1]! < 0x80;
          if (rows.length > 0) yield rows;
        }
      }
      const tail = [...scanner.feed(decoder.decode()), ...scanner.finish()];
      if (tail.length > 0) yield tail;
    } catch (e) {
      if (e instanceof InputError) throw e;
      // A zip-level failure (bad checksum, truncated data) from the inflating stream.
      throw new InputError({
        file: ctx.file,
        sheet: ctx.sheet,
        field: entry.fileName,
        problem: `The workbook is damaged: the sheet cannot be unpacked${/too many bytes/.test(String(e)) ? `, as its part ${entry.fileName} unpacks to more bytes than the zip's directory records (a damaged file, or a zip bomb)` : ''}`,
        found: e instanceof Error ? e.message : String(e),
        fix: 'Open the workbook in a spreadsheet program and save it again as .xlsx',
      });
    } finally {
      stream?.destroy();
    }
  } finally {
    close();
  }
}
