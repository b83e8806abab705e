/**
 * What a data file really is, from its first bytes, so that a workbook saved with a .csv name, a PDF renamed .xlsx
 * or a UTF-16 text file gets a plain answer instead of a parse error. Signatures: zip local file header "PK\x03\x04"
 * (APPNOTE.TXT 4.3.7), OLE2 compound file D0 CF 11 E0 A1 B1 1A E1 (MS-CFB 2.2), "%PDF-" (ISO 32000-1 7.5.2), and the
 * UTF-16 byte-order marks FF FE / FE FF (Unicode 15, 23.8).
 */
import { open } from 'node:fs/promises';
import { InputError } from '../errors.js';

export type FileKind = 'empty' | 'zip' | 'ole2' | 'pdf' | 'utf16' | 'text' | 'unknown';

/** Sniff the first bytes of a file; undefined when it cannot be opened (the reader then reports why). */
export async function sniffKind(path: string): Promise<FileKind | undefined> {
  let handle;
  try {
    handle = await open(path, 'r');
  } catch {
    return undefined;
  }
  try {
    const head = Buffer.alloc(8);
    const { bytesRead } = await handle.read(head, 0, 8, 0);
    return kindOf(head.subarray(0, bytesRead));
  } catch {
    return undefined;
  } finally {
    await handle.close();
  }
}

export function kindOf(head: Uint8Array): FileKind {
  if (head.length === 0) return 'empty';
  const b = (i: number) => head[i] ?? -1;
  if (b(0) === 0x50 && b(1) === 0x4b && b(2) === 0x03 && b(3) === 0x04) return 'zip';
  if (b(0) === 0xd0 && b(1) === 0xcf && b(2) === 0x11 && b(3) === 0xe0) return 'ole2';
  if (b(0) === 0x25 && b(1) === 0x50 && b(2) === 0x44 && b(3) === 0x46 && b(4) === 0x2d) return 'pdf';
  if ((b(0) === 0xff && b(1) === 0xfe) || (b(0) === 0xfe && b(1) === 0xff)) return 'utf16';
  for (const x of head) if (x === 0) return 'unknown';
  return 'text';
}

/** An InputError when the file's content does not fit the format its name gives; undefined when it fits. */
export function kindMismatch(kind: FileKind | undefined, format: 'csv' | 'xlsx', file: string): InputError | undefined {
  if (kind === undefined) return undefined;
  if (kind === 'empty') {
    return new InputError({ file, found: '0 bytes', problem: format === 'xlsx' ? 'The file is empty (0 bytes), so it is not an XLSX workbook' : 'The file is empty (0 bytes)', fix: 'Check that this is the right file, and that it was saved with its data' });
  }
  if (kind === 'pdf') {
    return new InputError({ file, problem: `The file is a PDF document, not ${format === 'xlsx' ? 'an XLSX workbook' : 'CSV text'}, whatever its name says`, fix: 'Get the data as a spreadsheet (.xlsx) or CSV file; a PDF table cannot be read as data' });
  }
  if (kind === 'ole2') {
    return new InputError({ file, problem: 'The file is an old-style Excel workbook (.xls), which warrant does not read', fix: 'Open it in a spreadsheet program and save it as Excel Workbook (.xlsx) or CSV UTF-8' });
  }
  if (kind === 'utf16') {
    return new InputError({ file, problem: 'The file is UTF-16 text (often saved as "Unicode text"), which warrant does not read', fix: 'Save it again as CSV UTF-8' });
  }
  if (format === 'csv' && kind === 'zip') {
    return new InputError({ file, problem: 'The file is an XLSX workbook (a zip archive), not CSV text, though its name ends in .csv', fix: 'Rename the file to end in .xlsx (and change the path in the claims file), or export the sheet as CSV UTF-8' });
  }
  if (format === 'xlsx' && kind === 'text') {
    return new InputError({ file, problem: 'The file is not an XLSX workbook: it is plain text (perhaps CSV), though its name ends in .xlsx', fix: 'Rename the file to end in .csv (and change the path in the claims file), or save it from a spreadsheet program as .xlsx' });
  }
  return undefined;
}
