/**
 * The exceljs writer of results.xlsx that warrant used until its own writer (src/results/xlsx.ts) replaced it, kept
 * here as the reference the new writer is compared with part by part (tests/results/xlsx-same.test.ts).
 */
import type { ClaimResult, ResultsFile } from '../../src/results/results.js';
import { CLAIM_COLUMNS, SELECTION_COLUMNS, neutralise, verdictCells, workbookDate, type Column } from '../../src/results/xlsx.js';

type ExcelModule = typeof import('exceljs');
type Worksheet = import('exceljs').Worksheet;

/** Does the claim's key estimate measure a proportion (shown as a percentage) rather than, say, a correlation? */
function isProportion(c: ClaimResult): boolean {
  return c.estimate !== null && /proportion|rate|share|percentage/i.test(c.estimate.name);
}

function setText(sheet: Worksheet, row: number, col: number, text: string): void {
  const cell = sheet.getCell(row, col);
  // An explicit string value: exceljs writes it as a shared string, never as a formula.
  cell.value = neutralise(text);
}

function setNumber(sheet: Worksheet, row: number, col: number, value: number | null | undefined, format: string): void {
  if (value === null || value === undefined) return;
  if (!Number.isFinite(value)) throw new Error(`results.xlsx: a value in row ${row}, column ${col} is ${value}; a finite number is required.`);
  const cell = sheet.getCell(row, col);
  cell.value = value;
  cell.numFmt = format;
}

// The column lists are the writer's own: this reference checks how they are written, not which columns there are.
function header(sheet: Worksheet, columns: readonly Column[]): void {
  columns.forEach((c, i) => {
    setText(sheet, 1, i + 1, c.header);
    const col = sheet.getColumn(i + 1);
    col.width = c.width;
    if (c.wrap) col.alignment = { wrapText: true, vertical: 'top' };
  });
  const row = sheet.getRow(1);
  row.font = { bold: true };
  row.alignment = { wrapText: true, vertical: 'bottom' };
  sheet.views = [{ state: 'frozen', xSplit: 0, ySplit: 1 }];
}

/** exceljs's Workbook class (the same one its package entry exports as ExcelJS.Workbook). */
const WORKBOOK_MODULE: string = 'exceljs/lib/doc/workbook.js';

/**
 * Build results.xlsx from results.json's content. Returns the bytes; when `path` is given, also writes them there.
 * The same ResultsFile always gives the same bytes.
 */
export async function writeResultsXlsxWithExceljs(results: ResultsFile, path?: string): Promise<Buffer> {
  // Only exceljs's workbook (with its xlsx writer): its package entry also loads the streaming reader and writer,
  // which doubles the load time of the slowest module warrant loads.
  const Workbook = ((await import(WORKBOOK_MODULE)) as { default: ExcelModule['Workbook'] }).default;
  const when = workbookDate(results.date);
  const wb = new Workbook();
  wb.creator = `warrant ${results.tool.version}`;
  wb.lastModifiedBy = 'warrant';
  wb.created = when;
  wb.modified = when;
  wb.title = results.title;
  wb.company = results.organisation;

  const claims = wb.addWorksheet('Claims');
  header(claims, CLAIM_COLUMNS);
  results.claims.forEach((c, i) => {
    const r = i + 2;
    const pct = isProportion(c);
    const fmt = pct ? '0.0%' : '0.000';
    setText(claims, r, 1, c.id);
    setText(claims, r, 2, c.statement);
    setText(claims, r, 3, c.kind);
    const v = verdictCells(c);
    setText(claims, r, 4, v.verdict);
    if (v.detail) setText(claims, r, 5, v.detail);
    if (v.action) setText(claims, r, 6, v.action);
    if (v.reason) setText(claims, r, 7, v.reason);
    if (v.wording) setText(claims, r, 8, v.wording);
    if (c.estimate) setText(claims, r, 9, c.estimate.name);
    setNumber(claims, r, 10, c.estimate?.value, fmt);
    setNumber(claims, r, 11, c.interval?.lower, fmt);
    setNumber(claims, r, 12, c.interval?.upper, fmt);
    setNumber(claims, r, 13, c.interval?.level ?? c.confidence, '0%');
    setNumber(claims, r, 14, c.p, '0.0000');
    setNumber(claims, r, 15, c.pAdjusted, '0.0000');
    if (c.n.length > 0) setText(claims, r, 16, c.n.map((n) => n.toLocaleString('en-GB')).join('; '));
    if (c.cautions.length > 0) setText(claims, r, 17, c.cautions.join('\n'));
  });

  const selections = wb.addWorksheet('Selections');
  header(selections, SELECTION_COLUMNS);
  let r = 2;
  for (const c of results.claims) {
    for (const s of c.selections) {
      setText(selections, r, 1, c.id);
      setText(selections, r, 2, s.label);
      setNumber(selections, r, 3, s.n, '#,##0');
      setNumber(selections, r, 4, s.agree, '#,##0');
      setNumber(selections, r, 5, s.rate, '0.0%');
      setNumber(selections, r, 6, s.interval.lower, '0.0%');
      setNumber(selections, r, 7, s.interval.upper, '0.0%');
      setNumber(selections, r, 8, s.interval.level, '0%');
      setNumber(selections, r, 9, s.population, '#,##0');
      setText(selections, r, 10, s.approximate ? 'yes' : 'no');
      r++;
    }
  }

  const buffer = fixZipDates(Buffer.from(await wb.xlsx.writeBuffer()), when);
  if (path) {
    const { writeFile } = await import('node:fs/promises');
    await writeFile(path, buffer);
  }
  return buffer;
}

/**
 * Overwrite the DOS date and time of every entry of a zip file (local headers and central directory) with `when`,
 * in place. The zip library under exceljs stamps the clock into each entry; this makes the bytes repeatable.
 * Layout from PKWARE APPNOTE.TXT: end-of-central-directory record (4.3.16), central directory headers (4.3.12) and
 * local file headers (4.3.7).
 */
export function fixZipDates(zip: Buffer, when: Date): Buffer {
  const dosTime = (when.getUTCHours() << 11) | (when.getUTCMinutes() << 5) | Math.floor(when.getUTCSeconds() / 2);
  const dosDate = ((when.getUTCFullYear() - 1980) << 9) | ((when.getUTCMonth() + 1) << 5) | when.getUTCDate();
  const eocd = zip.lastIndexOf(Buffer.from([0x50, 0x4b, 0x05, 0x06]));
  if (eocd < 0) throw new Error('results.xlsx: the workbook has no zip end record; it was not written completely.');
  const count = zip.readUInt16LE(eocd + 10);
  let at = zip.readUInt32LE(eocd + 16);
  for (let i = 0; i < count; i++) {
    if (zip.readUInt32LE(at) !== 0x02014b50) throw new Error(`results.xlsx: zip directory entry ${i + 1} is damaged.`);
    zip.writeUInt16LE(dosTime, at + 12);
    zip.writeUInt16LE(dosDate, at + 14);
    const local = zip.readUInt32LE(at + 42);
    if (zip.readUInt32LE(local) !== 0x04034b50) throw new Error(`results.xlsx: zip entry ${i + 1} has no local header.`);
    zip.writeUInt16LE(dosTime, local + 10);
    zip.writeUInt16LE(dosDate, local + 12);
    at += 46 + zip.readUInt16LE(at + 28) + zip.readUInt16LE(at + 30) + zip.readUInt16LE(at + 32);
  }
  return zip;
}
