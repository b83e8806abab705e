// The catalogue of bad and doubtful data inputs (issue 7, data half): each case a file in tests/fixtures/data/bad/,
// written by make-bad.mjs beside it. Errors are InputErrors whose message names the file, the row or sheet, the
// field, what was found and a fix; doubtful files that warrant reads are checked against values worked by hand or
// against exceljs's whole-workbook reader (the reference reader).
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import ExcelJS from 'exceljs';
import { readCube } from '../../src/data/cube.js';
import type { CubeSource } from '../../src/data/cube.js';
import { InputError } from '../../src/errors.js';
import { summarySource } from './sources.js';

const bad = (name: string) => join(import.meta.dirname, '../fixtures/data/bad', name);
const read = (name: string, extra: Partial<CubeSource> = {}, needed: string[] = []) => readCube(summarySource(bad(name), extra), needed, name);

async function failure(p: Promise<unknown>): Promise<InputError> {
  const e = await p.then(
    () => undefined,
    (err: unknown) => err,
  );
  expect(e).toBeInstanceOf(InputError);
  return e as InputError;
}

const pct = { agree: undefined, agreePercent: '% agree' };

// [case, file, source options, problem fields, exact first line of the message (up to "Fix:"), start of the fix]
const errors: Array<[string, string, Partial<CubeSource>, Record<string, unknown>, string, string]> = [
  ['missing required column', 'missing-column.csv', {}, { row: 1, field: 'respondents', found: 'Respondents' }, 'missing-column.csv, row 1: The file has no column with this name in its header row (row 1) (field "respondents", found "Respondents").', 'Did you mean "Respondants"?'],
  ['0-byte CSV', 'empty.csv', {}, { found: '0 bytes' }, 'empty.csv: The file is empty (0 bytes) (found "0 bytes").', 'Check that this is the right file'],
  ['header only', 'header-only.csv', {}, { row: 1 }, 'header-only.csv, row 1: The file has a header row but no data rows below it.', 'Add the data rows'],
  ['percentages in mixed scales', 'percent-mixed.csv', pct, { row: 4, field: '% agree', found: '0.72' }, 'percent-mixed.csv, row 4: The percent column mixes fractions with percentages: row 4 has "0.72" (a fraction of 1?) but row 2 has "72%" (a percentage) (field "% agree", found "0.72").', 'Write every value in the column on one scale'],
  ['agreeing greater than respondents', 'agree-above.csv', {}, { row: 3, field: 'Agreeing', found: '21' }, 'agree-above.csv, row 3: More people agreed than answered (21 agreeing, 20 respondents) (field "Agreeing", found "21").', 'Check the two counts on this row'],
  ['negative count', 'negative.csv', {}, { row: 2, field: 'Agreeing', found: '-3' }, 'negative.csv, row 2: A count is negative (field "Agreeing", found "-3").', 'Write the number of people, zero or more'],
  ['fractional count', 'fractional.csv', {}, { row: 2, field: 'Respondents', found: '50.5' }, 'fractional.csv, row 2: A count is not a whole number (field "Respondents", found "50.5").', 'Write the number of people as a whole number'],
  ['group row with blank counts', 'blank-group.csv', {}, { row: 3, field: 'Respondents', found: '' }, 'blank-group.csv, row 3: This row names a group but has no counts (field "Respondents", found "").', 'Fill in the counts for this row, or delete the row'],
  ['duplicate rows for one group', 'duplicate-group.csv', {}, { row: 4, field: 'Department, Year', found: 'Department = Hanes, Year = 2026' }, 'duplicate-group.csv, row 4: This row repeats the group of row 2 (field "Department, Year", found "Department = Hanes, Year = 2026").', 'Keep one row per group: remove or merge rows 2 and 4'],
  ['text in a numeric column', 'text-numeric.csv', { numeric: ['Staff ratio'] }, { row: 3, field: 'Staff ratio', found: 'see note' }, 'text-numeric.csv, row 3: A value in a numeric column is not a number (field "Staff ratio", found "see note").', 'Write a number such as 4.2'],
  ['quoted value never closed', 'quote-open.csv', {}, { row: 3 }, 'quote-open.csv, row 3: A quoted value is never closed (found "Quoted field unterminated").', 'Put a double quote at the end of the quoted value'],
  ['UTF-16 text', 'utf16.csv', {}, {}, 'utf16.csv: The file is UTF-16 text (often saved as "Unicode text"), which warrant does not read.', 'Save it again as CSV UTF-8'],
  ['CSV that is really XLSX', 'csv-really-xlsx.csv', {}, {}, 'csv-really-xlsx.csv: The file is an XLSX workbook (a zip archive), not CSV text, though its name ends in .csv.', 'Rename the file to end in .xlsx'],
  ['XLSX that is really CSV', 'xlsx-really-csv.xlsx', {}, {}, 'xlsx-really-csv.xlsx: The file is not an XLSX workbook: it is plain text (perhaps CSV), though its name ends in .xlsx.', 'Rename the file to end in .csv'],
  ['PDF renamed .xlsx', 'pdf-renamed.xlsx', {}, {}, 'pdf-renamed.xlsx: The file is a PDF document, not an XLSX workbook, whatever its name says.', 'Get the data as a spreadsheet (.xlsx) or CSV file'],
  ['old .xls renamed .xlsx', 'old-format.xlsx', {}, {}, 'old-format.xlsx: The file is an old-style Excel workbook (.xls), which warrant does not read.', 'Open it in a spreadsheet program and save it as Excel Workbook (.xlsx)'],
  ['0-byte XLSX', 'zero-byte.xlsx', {}, { found: '0 bytes' }, 'zero-byte.xlsx: The file is empty (0 bytes), so it is not an XLSX workbook (found "0 bytes").', 'Check that this is the right file'],
  ['merged header cells', 'merged-header.xlsx', {}, { sheet: 'Results', row: 1, field: 'cell C1', found: '' }, 'merged-header.xlsx, sheet "Results", row 1: The header row has an empty cell between the columns "Counts" and "Year"; merged header cells read as empty (field "cell C1", found "").', 'Unmerge the header cells'],
  ['several sheets, wrong name', 'sheets.xlsx', { sheet: 'Results 2025' }, { field: 'sheet', found: 'Results 2025' }, 'sheets.xlsx: The workbook has no sheet with this name (field "sheet", found "Results 2025").', 'Use one of the sheets in the workbook: "Old" (hidden), "Results 2026", "Notes"'],
];

describe('bad data inputs: each an InputError with file, place, field, value and fix', () => {
  for (const [what, file, extra, problem, first, fix] of errors) {
    it(what, async () => {
      const e = await failure(read(file, extra));
      expect(e.problems[0]).toMatchObject({ file, ...problem });
      const [head, tail] = e.message.split(' Fix: ');
      expect(head).toBe(first);
      expect(tail?.startsWith(fix), tail).toBe(true);
    });
  }
});

describe('doubtful data inputs that are read, and how', () => {
  it('byte-order mark: dropped, so the first column name matches', async () => {
    const cube = await read('bom.csv', {}, ['Department']);
    expect(cube.cells.map((c) => [c.dims['Department'], c.n, c.agree])).toEqual([
      ['Hanes', 50, 30],
      ['Łacina', 20, 5],
    ]);
  });

  it('semicolon delimiter with decimal commas', async () => {
    const cube = await read('semicolon-decimal-comma.csv', pct);
    // Worked by hand: round(72.4% × 50) = round(36.2) = 36; round(64% × 37) = round(23.68) = 24.
    expect(cube.cells.map((c) => [c.dims['Department'], c.n, c.agree])).toEqual([
      ['Hanes', 50, 36],
      ['Łacina', 37, 24],
    ]);
  });

  it('zero respondents: allowed, the group exists with no answers', async () => {
    const cube = await read('zero-respondents.csv', {}, ['Department']);
    expect(cube.cells.map((c) => [c.dims['Department'], c.n, c.agree])).toEqual([
      ['Hanes', 0, 0],
      ['Łacina', 20, 5],
    ]);
  });

  it("formula cells: the cached result, as exceljs's reader gives it", async () => {
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.readFile(bad('formula-cached.xlsx'));
    const ws = wb.getWorksheet('Results')!;
    const result = (r: number, c: number) => String((ws.getCell(r, c).value as { result: unknown }).result);
    const cube = await read('formula-cached.xlsx', {}, ['Department']);
    expect(cube.cells.map((c) => [c.dims['Department'], String(c.n), String(c.agree)])).toEqual([
      ['Hanes', result(2, 2), result(2, 3)],
      [result(3, 1), '20', '5'],
    ]);
  });

  it('dates in a dimension column: ISO dates from the number format, as exceljs reads them', async () => {
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.readFile(bad('dates.xlsx'));
    const ws = wb.getWorksheet('Results')!;
    const iso = (r: number) => (ws.getCell(r, 1).value as Date).toISOString();
    const cube = await read('dates.xlsx', {}, ['Wave']);
    expect(cube.values['Wave']).toEqual([iso(2).slice(0, 10), iso(3).slice(0, 10), `${iso(4).slice(0, 10)} ${iso(4).slice(11, 19)}`]);
    expect(cube.values['Wave']).toEqual(['2025-03-01', '2026-03-01', '2026-09-15 13:30:00']);
  });

  it('rich text joined; the hidden sheet passed over; a sheet chosen by name', async () => {
    const cube = await read('sheets.xlsx', {}, ['Department']);
    expect(cube.sheet).toBe('Results 2026');
    expect(cube.values['Department']).toEqual(['Łacina', 'Hanes']);
    const hidden = await read('sheets.xlsx', { sheet: 'Old' }, ['Department']);
    expect(hidden.values['Department']).toEqual(['Old']);
  });
});
