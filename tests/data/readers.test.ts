// Streaming CSV and XLSX readers, checked against non-streaming references: exceljs's `readFile` (whole workbook in
// memory), papaparse's whole-string parse, and the values the fixture generator wrote (make-fixtures.mjs).
// Small chunk sizes force every byte offset of the files to fall on a chunk boundary, so multi-byte characters
// (ŵ ŷ Ł ą ï, and a four-byte one) are split between reads in every possible way.
import { readFileSync, writeFileSync, mkdtempSync } from 'node:fs';
import { join } from 'node:path';
import { tmpdir } from 'node:os';
import { describe, expect, it } from 'vitest';
import ExcelJS from 'exceljs';
import Papa from 'papaparse';
import { readCsvRows, detectDelimiter, sniff } from '../../src/data/csv.js';
import { openXlsxSheet, readXlsxRows, formatNumber, columnIndex, columnLetters } from '../../src/data/xlsx.js';
import type { SheetRow } from '../../src/data/rows.js';
import { InputError } from '../../src/errors.js';

const fx = (name: string) => join(import.meta.dirname, '../fixtures/data', name);
const tmp = mkdtempSync(join(tmpdir(), 'warrant-readers-'));

async function all(gen: AsyncGenerator<SheetRow>): Promise<SheetRow[]> {
  const out: SheetRow[] = [];
  for await (const r of gen) out.push(r);
  return out;
}

/** The text of a cell as exceljs reads it (the reference reader): numbers, strings, rich text, formula results. */
function excelText(value: ExcelJS.CellValue): string {
  if (value === null || value === undefined) return '';
  if (typeof value === 'number') return String(value);
  if (typeof value === 'string') return value;
  if (typeof value === 'boolean') return value ? 'TRUE' : 'FALSE';
  if (value instanceof Date) return value.toISOString();
  if ('richText' in value) return value.richText.map((r) => r.text).join('');
  if ('formula' in value || 'sharedFormula' in value) return excelText((value as { result?: ExcelJS.CellValue }).result ?? null);
  if ('error' in value) return value.error;
  if ('text' in value) return String(value.text);
  throw new Error('unexpected exceljs value');
}

/** Every row of a sheet as exceljs reads it, trailing empty cells dropped. */
async function excelRows(path: string, sheet: string): Promise<SheetRow[]> {
  const wb = new ExcelJS.Workbook();
  await wb.xlsx.readFile(path);
  const ws = wb.getWorksheet(sheet);
  if (ws === undefined) throw new Error(`no sheet ${sheet}`);
  const out: SheetRow[] = [];
  ws.eachRow({ includeEmpty: false }, (row, rowNumber) => {
    const values: string[] = [];
    row.eachCell({ includeEmpty: false }, (cell, col) => {
      while (values.length < col - 1) values.push('');
      values[col - 1] = excelText(cell.value);
    });
    out.push({ row: rowNumber, values });
  });
  return out;
}

const trimTrailing = (rows: SheetRow[]) =>
  rows.map((r) => {
    const v = [...r.values];
    while (v.length > 0 && v[v.length - 1] === '') v.pop();
    return { row: r.row, values: v };
  });

interface SummaryRow {
  provider: string;
  region: string;
  year: number;
  question: string;
  respondents: number;
  agreeing: number;
  population: number;
}
const summary = JSON.parse(readFileSync(fx('summary.expected.json'), 'utf8')) as SummaryRow[];
const HEADER = ['Provider', 'Region', 'Year', 'Question', 'Respondents', 'Agreeing', 'Population'];

describe('XLSX reader', () => {
  it('matches exceljs readFile on summary.xlsx, and the generated names, at every chunk boundary', async () => {
    const reference = await excelRows(fx('summary.xlsx'), 'Results');
    expect(reference.length).toBe(summary.length + 1);
    const expected = [
      { row: 3, values: HEADER },
      ...summary.map((r, i) => ({ row: i + 4, values: [r.provider, r.region, String(r.year), r.question, String(r.respondents), String(r.agreeing), String(r.population)] })),
    ];
    // exceljs (reference) agrees with what the generator wrote: the fixture itself is sound.
    expect(reference).toEqual(expected);
    for (const chunkSize of [undefined, 1, 2, 3, 4, 5, 6, 7, 11, 64]) {
      const opened = await openXlsxSheet(fx('summary.xlsx'), chunkSize === undefined ? {} : { chunkSize });
      // The first sheet ("Lookup") is hidden, so the default is the first visible one.
      expect(opened.sheet).toBe('Results');
      const rows = await all(opened.rows);
      expect(rows, `chunk size ${chunkSize}`).toEqual(expected);
    }
  });

  it('matches exceljs readFile on respondents.xlsx (blank cells skipped)', async () => {
    const reference = await excelRows(fx('respondents.xlsx'), 'Responses');
    for (const chunkSize of [undefined, 3]) {
      const rows = await all(readXlsxRows(fx('respondents.xlsx'), chunkSize === undefined ? {} : { chunkSize }));
      expect(trimTrailing(rows)).toEqual(reference);
    }
  });

  // exceljs does not read this hand-written workbook (its relationship prefix is not "r:"), so the reference here is
  // the values written by the generator beside the XML.
  it('reads inline strings, str formulas, booleans, errors, phonetic runs and cells without references', async () => {
    const expected = JSON.parse(readFileSync(fx('handmade.expected.json'), 'utf8')) as { sheet: string; sheets: Array<{ name: string; hidden: boolean }>; rows: SheetRow[] };
    for (let chunkSize = 1; chunkSize <= 13; chunkSize++) {
      const opened = await openXlsxSheet(fx('handmade.xlsx'), { chunkSize });
      expect(opened.sheet).toBe(expected.sheet);
      expect(opened.sheets.map((s) => ({ name: s.name, hidden: s.hidden }))).toEqual(expected.sheets);
      expect(await all(opened.rows), `chunk size ${chunkSize}`).toEqual(expected.rows);
    }
  });

  it('can be closed without reading, more than once', async () => {
    const opened = await openXlsxSheet(fx('summary.xlsx'));
    opened.close();
    expect(() => opened.close()).not.toThrow();
  });

  it('reads a hidden sheet when it is named', async () => {
    const rows = await all(readXlsxRows(fx('handmade.xlsx'), { sheet: 'Hidden notes' }));
    expect(rows).toEqual([{ row: 1, values: ['Notes only'] }]);
  });

  it('lists the sheets when the named sheet does not exist', async () => {
    const err = await openXlsxSheet(fx('summary.xlsx'), { sheet: 'Resluts', displayPath: 'data/summary.xlsx' }).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(InputError);
    const e = err as InputError;
    expect(e.message).toContain('data/summary.xlsx');
    expect(e.message).toContain('"Resluts"');
    expect(e.message).toContain('"Results"');
    expect(e.message).toContain('"Lookup" (hidden)');
  });

  it('names the cell of a formula with no cached value', async () => {
    const err = await all(readXlsxRows(fx('formula-no-cache.xlsx'), { displayPath: 'f.xlsx' })).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(InputError);
    const p = (err as InputError).problems[0]!;
    expect(p).toMatchObject({ file: 'f.xlsx', sheet: 'Results', row: 3, field: 'cell C3' });
    expect((err as InputError).message).toContain('row 3');
  });

  it('says a file that is not a zip is not a workbook', async () => {
    for (const name of ['not-a-zip.xlsx', 'empty.csv']) {
      const err = await openXlsxSheet(fx(name), { displayPath: name }).catch((e: unknown) => e);
      expect(err).toBeInstanceOf(InputError);
      expect((err as InputError).message).toMatch(/not an XLSX workbook/);
      expect((err as InputError).message).toContain(name);
    }
    const missing = await openXlsxSheet(join(tmp, 'nope.xlsx'), { displayPath: 'nope.xlsx' }).catch((e: unknown) => e);
    expect((missing as InputError).message).toMatch(/nope\.xlsx: The data file was not found/);
  });

  it('formats numbers as a spreadsheet shows them', () => {
    // Shortest round-trip text (ECMAScript Number::toString) after rounding to 15 significant digits, the display
    // precision of spreadsheet programs (Microsoft, "Excel specifications and limits": number precision 15 digits;
    // from memory).
    expect(formatNumber('2026')).toBe('2026');
    expect(formatNumber('0.72')).toBe('0.72');
    expect(formatNumber('0.30000000000000004')).toBe('0.3');
    expect(formatNumber('42.000000000000007')).toBe('42');
    expect(formatNumber('1.5E-3')).toBe('0.0015');
    expect(formatNumber('-0')).toBe('0');
    // Column letters (ECMA-376 §18.3.1.4 cell references): A..Z, AA.., XFD is the last of 16384 columns.
    expect(columnIndex('A')).toBe(0);
    expect(columnIndex('Z')).toBe(25);
    expect(columnIndex('AA')).toBe(26);
    expect(columnIndex('XFD')).toBe(16383);
    for (const i of [0, 25, 26, 701, 702, 16383]) expect(columnIndex(columnLetters(i))).toBe(i);
  });
});

describe('CSV reader', () => {
  it('reads a semicolon file with a BOM and CRLF, like a whole-string parse, at every chunk boundary', async () => {
    const text = readFileSync(fx('summary-semicolon.csv'), 'utf8');
    expect(text.charCodeAt(0)).toBe(0xfeff);
    // Reference: papaparse on the whole decoded string (no streaming), BOM removed by hand.
    const reference = Papa.parse<string[]>(text.slice(1), { delimiter: ';', newline: '\r\n', skipEmptyLines: true }).data;
    const expected = [
      HEADER,
      ...summary.map((r) => [r.provider === 'Szkoła Łąkowa' ? 'Szkoła; Łąkowa' : r.provider, r.region, String(r.year), r.question, String(r.respondents), String(r.agreeing), String(r.population)]),
    ];
    expect(reference).toEqual(expected);
    for (const chunkSize of [undefined, 1, 2, 3, 4, 5, 6, 7, 13, 100]) {
      const rows = await all(readCsvRows(fx('summary-semicolon.csv'), chunkSize === undefined ? {} : { chunkSize }));
      expect(rows.map((r) => r.values), `chunk size ${chunkSize}`).toEqual(expected);
      expect(rows.map((r) => r.row)).toEqual(expected.map((_, i) => i + 1));
    }
  });

  it('detects comma, semicolon and tab from the header line, ignoring quoted text', () => {
    // common practice: the delimiter is the separator that occurs most often in the header line
    expect(detectDelimiter('a,b,c')).toBe(',');
    expect(detectDelimiter('a;b;c')).toBe(';');
    expect(detectDelimiter('a\tb\tc')).toBe('\t');
    expect(detectDelimiter('"a,b,c";d;e')).toBe(';');
    expect(detectDelimiter('single')).toBe(',');
    // A title line with no delimiter is passed over; the line ending comes from the first line.
    expect(sniff('Title\r\n\r\na;b\r\n', false)).toEqual({ delimiter: ';', newline: '\r\n' });
    expect(sniff('Title\n', false)).toBeUndefined();
    expect(sniff('Title\n', true)).toEqual({ delimiter: ',', newline: '\n' });
    expect(sniff('a\tb\r', false)).toBeUndefined();
    expect(sniff('a\tb\r', true)).toEqual({ delimiter: '\t', newline: '\r' });
  });

  it('numbers rows as a spreadsheet would: blank lines count, a quoted line break stays in one row', async () => {
    const path = join(tmp, 'rows.csv');
    writeFileSync(path, '\n\nName\tNote\n"Brithŵyr\tCollege"\t"two\r\nlines"\n\nŁąka\t"say ""hi"""');
    for (const chunkSize of [undefined, 1, 2, 5]) {
      const rows = await all(readCsvRows(path, chunkSize === undefined ? {} : { chunkSize }));
      expect(rows).toEqual([
        { row: 1, values: [''] },
        { row: 2, values: [''] },
        { row: 3, values: ['Name', 'Note'] },
        { row: 4, values: ['Brithŵyr\tCollege', 'two\r\nlines'] },
        { row: 5, values: [''] },
        { row: 6, values: ['Łąka', 'say "hi"'] },
      ]);
    }
  });

  it('reports a quote that is never closed, with its row', async () => {
    const path = join(tmp, 'quote.csv');
    writeFileSync(path, 'Name,Count\nA,1\n"B,2\nC,3\n');
    for (const chunkSize of [undefined, 1, 4]) {
      const err = await all(readCsvRows(path, { displayPath: 'quote.csv', ...(chunkSize === undefined ? {} : { chunkSize }) })).catch((e: unknown) => e);
      expect(err).toBeInstanceOf(InputError);
      expect((err as InputError).problems[0]).toMatchObject({ file: 'quote.csv', row: 3 });
    }
  });

  it('reports a missing file plainly', async () => {
    const err = await all(readCsvRows(join(tmp, 'none.csv'), { displayPath: 'none.csv' })).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(InputError);
    expect((err as InputError).message).toMatch(/^none\.csv: The data file was not found/);
  });

  it('reads a 0-byte file as no rows', async () => {
    expect(await all(readCsvRows(fx('empty.csv')))).toEqual([]);
  });
});
