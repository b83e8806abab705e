// The readers' fast paths against outside references:
// - CSV: the streaming reader (one-pass splitter where a piece has no quotes, papaparse's incremental parser where it
//   has) gives the records of papaparse's whole-string parse, for random tables with quotes, delimiters and line
//   breaks inside quoted values, multi-byte text and every chunk size; with columns left out, the kept ones still
//   match and each row's blank flag matches the whole row.
// - The blank test agrees with the JavaScript engine's own String.prototype.trim on every UTF-16 code unit.
// - XLSX: a sheet whose cells are in the plain forms the scanner reads in one step (from the bytes, or from the text)
//   gives the values written, and the same rows as the same sheet written so that every cell takes the general path;
//   inline strings with multi-byte text among them send some rows through the text path, at every chunk size.
// - Non-UTF-8 CSV: the first bad byte, its offset and line agree with CPython's UTF-8 decoder (fixture
//   tests/data/fixtures/utf8-invalid.json, written by utf8-invalid.py beside it), and readCube stops with an InputError
//   naming the file, the row and the byte.
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import fc from 'fast-check';
import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { firstInvalidUtf8, readCsvRows } from '../../src/data/csv.js';
import { readCube } from '../../src/data/cube.js';
import { isBlankRow, isTrimmedSpace, rowIsBlank } from '../../src/data/rows.js';
import type { SheetRow } from '../../src/data/rows.js';
import { readXlsxRows } from '../../src/data/xlsx.js';
import { InputError } from '../../src/errors.js';
import { zip } from '../helpers/zip.js';
import { respondentsSource, summarySource } from './sources.js';

const tmp = mkdtempSync(join(tmpdir(), 'warrant-fast-'));
let counter = 0;
const file = (ext: string, bytes: Uint8Array | string) => {
  const path = join(tmp, `f${counter++}.${ext}`);
  writeFileSync(path, bytes);
  return path;
};

async function all(gen: AsyncGenerator<SheetRow>): Promise<SheetRow[]> {
  const out: SheetRow[] = [];
  for await (const r of gen) out.push(r);
  return out;
}

/** A field as a spreadsheet program writes it: quoted when it holds a quote, the delimiter or a line break. */
function csvField(v: string, delimiter: string, quoteAnyway: boolean): string {
  return quoteAnyway || /["\r\n]/.test(v) || v.includes(delimiter) ? `"${v.replace(/"/g, '""')}"` : v;
}

describe('CSV reader: fast path against papaparse', () => {
  const ch = fc.constantFrom('a', 'Z', '7', ' ', 'Ł', 'ŵ', 'é', '🌱', ',', ';', '"', '\n', '\r\n', '\t', '\u00a0', '\u3000');
  const value = fc.array(ch, { maxLength: 6 }).map((a) => a.join(''));

  it('random tables with quotes and multi-byte text: the records of a whole-string parse, at every chunk size', async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.array(fc.array(value, { minLength: 3, maxLength: 3 }), { minLength: 1, maxLength: 10 }),
        fc.constantFrom(',', ';'),
        fc.constantFrom('\n', '\r\n'),
        fc.boolean(),
        fc.double({ min: 0, max: 1, noNaN: true }),
        fc.integer({ min: 1, max: 40 }),
        async (table, delimiter, nl, endNl, quoteShare, chunkSize) => {
          const header = ['x', 'y', 'z'].join(delimiter);
          let k = 0;
          const lines = table.map((r) => r.map((v) => csvField(v, delimiter, ((k += 1) * 0.37) % 1 < quoteShare)).join(delimiter));
          const text = [header, ...lines].join(nl) + (endNl ? nl : '');
          const path = file('csv', text);
          const rows = await all(readCsvRows(path, { chunkSize }));
          // Reference: papaparse 5.7 on the whole string, the dialect given; a final empty record after the last
          // line break dropped (a spreadsheet shows no row there).
          const ref = Papa.parse<string[]>(text, { delimiter, newline: nl }).data;
          if (text.endsWith(nl) && ref.length > 0 && ref[ref.length - 1]!.length === 1 && ref[ref.length - 1]![0] === '') ref.pop();
          expect(rows.map((r) => r.values)).toEqual(ref);
          expect(rows.map((r) => r.row)).toEqual(ref.map((_, i) => i + 1));
          // The table written is the table read (header aside), an outside check on both.
          expect(rows.slice(1).map((r) => r.values)).toEqual(table);
        },
      ),
      { numRuns: 250, seed: 20261201 },
    );
  });

  it('columns left out: kept columns as papaparse reads them, the others empty, blank rows as the whole row says', async () => {
    const plain = fc.constantFrom('a', 'Ł', '🌱', ' ', '\t', '\u00a0', '\u2003', '\ufeff', '1', '');
    const cell = fc.array(plain, { maxLength: 4 }).map((a) => a.join(''));
    await fc.assert(
      fc.asyncProperty(
        fc.array(fc.array(cell, { minLength: 1, maxLength: 5 }), { minLength: 1, maxLength: 12 }),
        fc.array(fc.boolean(), { minLength: 5, maxLength: 5 }),
        fc.constantFrom('\n', '\r\n'),
        fc.integer({ min: 1, max: 24 }),
        async (table, keep, nl, chunkSize) => {
          const text = ['a,b,c,d,e', ...table.map((r) => r.join(','))].join(nl) + nl;
          const path = file('csv', text);
          const select: { keep?: readonly boolean[] } = {};
          const rows: SheetRow[] = [];
          for await (const r of readCsvRows(path, { chunkSize, select })) {
            rows.push(r);
            select.keep = keep; // set once the header is read, as readCube does
          }
          const ref = Papa.parse<string[]>(text, { delimiter: ',', newline: nl }).data;
          ref.pop();
          expect(rows.length).toBe(ref.length);
          rows.forEach((r, i) => {
            const want = ref[i]!;
            expect(rowIsBlank(r)).toBe(isBlankRow(want));
            expect(r.values.length).toBe(want.length);
            r.values.forEach((v, c) => {
              if (i === 0 || r.blank === undefined || keep[c] === true) expect(v).toBe(want[c]);
              else expect(v).toBe('');
            });
          });
        },
      ),
      { numRuns: 250, seed: 20261202 },
    );
  });

  it('the blank test is String.prototype.trim on every UTF-16 code unit', () => {
    // Reference: the engine's trim (ECMAScript 2023 §22.1.3.32), one code unit at a time.
    const differ: number[] = [];
    for (let c = 0; c <= 0xffff; c++) if (isTrimmedSpace(c) !== (String.fromCharCode(c).trim() === '')) differ.push(c);
    expect(differ).toEqual([]);
  });

  it('respondent tallies with columns left out equal those with every column read', async () => {
    // Reference: the same file with its answers in quotes, so that every piece goes through papaparse with every
    // column read; the tallies must be the same whichever way the rows were split.
    const rows = ['ID,Department,Q01,Note,Q02'];
    for (let i = 0; i < 400; i++) rows.push(`${i},${['Łąka', 'Brithŵyr', 'Hanes'][i % 3]},${(i * 7) % 6},${i % 5 === 0 ? 'x' : ''},${[1, 2, 3, 4, 5, 9, 0][i % 7]}`);
    rows.push(',,,only a note,'); // text only in a column left out: still a row
    const plain = file('csv', rows.join('\n') + '\n');
    const quoted = file('csv', rows.map((r, i) => (i === 0 ? r : r.split(',').map((v) => `"${v}"`).join(','))).join('\n') + '\n');
    const src = (path: string) => respondentsSource(path, { questions: ['Q01', 'Q02'], notApplicableCodes: [0, 9] });
    for (const chunkSize of [7, 64, 1 << 16]) {
      const a = await readCube(src(plain), ['Department'], 'a.csv', { chunkSize });
      const b = await readCube(src(quoted), ['Department'], 'b.csv', { chunkSize });
      expect(a.rows).toBe(401);
      expect(b.rows).toBe(401);
      expect(a.cells).toEqual(b.cells);
    }
  });

  it('lines with quotes among plain lines, columns left out: the kept columns as papaparse reads them, at every chunk size', async () => {
    // Quoted values with delimiters, doubled quotes and multi-byte letters, and some irregular lines (a quote inside an
    // unquoted value, a quoted line break) that must go to papaparse; reference: papaparse 5.7 on the whole string.
    const plain = fc.constantFrom('a', 'Ł', 'ŵ', '🌱', ' ', '1', '');
    const quoted = fc.array(fc.constantFrom('a', 'ï', ',', '""', ' ', 'ŷ', ';'), { maxLength: 5 }).map((a) => `"${a.join('')}"`);
    const odd = fc.constantFrom('x"y', '"a\nb"', '"a\r\nb"');
    const cell = fc.oneof({ weight: 6, arbitrary: fc.array(plain, { maxLength: 3 }).map((a) => a.join('')) }, { weight: 3, arbitrary: quoted }, { weight: 1, arbitrary: odd });
    await fc.assert(
      fc.asyncProperty(
        fc.array(fc.array(cell, { minLength: 4, maxLength: 4 }), { minLength: 1, maxLength: 14 }),
        fc.array(fc.boolean(), { minLength: 4, maxLength: 4 }),
        fc.constantFrom('\n', '\r\n'),
        fc.integer({ min: 1, max: 48 }),
        async (table, keep, nl, chunkSize) => {
          const text = ['a,b,c,d', ...table.map((r) => r.join(','))].join(nl) + nl;
          const path = file('csv', text);
          const select: { keep?: readonly boolean[] } = {};
          const rows: SheetRow[] = [];
          for await (const r of readCsvRows(path, { chunkSize, select })) {
            rows.push(r);
            select.keep = keep;
          }
          const ref = Papa.parse<string[]>(text, { delimiter: ',', newline: nl }).data;
          ref.pop();
          expect(rows.map((r) => r.row)).toEqual(ref.map((_, i) => i + 1));
          rows.forEach((r, i) => {
            const want = ref[i]!;
            expect(r.values.length).toBe(want.length);
            r.values.forEach((v, c) => {
              if (i === 0 || r.blank === undefined || keep[c] === true) expect(v).toBe(want[c]);
              else expect(v).toBe('');
            });
          });
        },
      ),
      { numRuns: 300, seed: 20261203 },
    );
  });

  it('respondent tallies of a file where one name in three is quoted equal those of the same file read wholly by papaparse', async () => {
    const names = ['Ashmere', '"Łąka, Tŷ"', 'Brockwell', '"Naïf ""Ŵ"", Cwm"'];
    const rows = ['ID,Unit,Q01,Q02'];
    for (let i = 0; i < 500; i++) rows.push(`${i},${names[i % 4]},${1 + ((i * 7) % 5)},${[1, 2, 3, 4, 5, 9, ''][i % 7]}`);
    const mixed = file('csv', rows.join('\n') + '\n');
    const allQuoted = file('csv', rows.map((r, i) => (i === 0 ? r : r.replace(/^(\d+),/, '"$1",'))).join('\n') + '\n');
    const src = (path: string) => respondentsSource(path, { questions: ['Q01', 'Q02'], notApplicableCodes: [9] });
    for (const chunkSize of [5, 100, 1 << 16]) {
      const a = await readCube(src(mixed), ['Unit'], 'a.csv', { chunkSize });
      const b = await readCube(src(allQuoted), ['Unit'], 'b.csv', { chunkSize });
      expect(a.rows).toBe(500);
      expect(a.cells).toEqual(b.cells);
      expect(a.values.Unit).toEqual(['Ashmere', 'Łąka, Tŷ', 'Brockwell', 'Naïf "Ŵ", Cwm']);
    }
  });
});

// ---------------------------------------------------------------------------------------------------------------
// XLSX: plain cells (one step) against the general path.

const NS = 'http://schemas.openxmlformats.org/spreadsheetml/2006/main';
const RNS = 'http://schemas.openxmlformats.org/officeDocument/2006/relationships';

function workbook(sheet: string, strings: string[]): Buffer {
  const esc = (s: string) => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');
  return zip({
    '[Content_Types].xml': '<?xml version="1.0"?><Types xmlns="http://schemas.openxmlformats.org/package/2006/content-types"/>',
    '_rels/.rels': `<?xml version="1.0"?><Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships"><Relationship Id="rId1" Type="${RNS}/officeDocument" Target="xl/workbook.xml"/></Relationships>`,
    'xl/workbook.xml': `<?xml version="1.0"?><workbook xmlns="${NS}" xmlns:r="${RNS}"><sheets><sheet name="Data" sheetId="1" r:id="rId1"/></sheets></workbook>`,
    'xl/_rels/workbook.xml.rels': `<?xml version="1.0"?><Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships"><Relationship Id="rId1" Type="${RNS}/worksheet" Target="worksheets/sheet1.xml"/><Relationship Id="rId2" Type="${RNS}/sharedStrings" Target="sharedStrings.xml"/><Relationship Id="rId3" Type="${RNS}/styles" Target="styles.xml"/></Relationships>`,
    'xl/sharedStrings.xml': `<?xml version="1.0"?><sst xmlns="${NS}">${strings.map((s) => `<si><t xml:space="preserve">${esc(s)}</t></si>`).join('')}</sst>`,
    'xl/styles.xml': `<?xml version="1.0"?><styleSheet xmlns="${NS}"><cellXfs count="3"><xf numFmtId="0"/><xf numFmtId="2"/><xf numFmtId="14"/></cellXfs></styleSheet>`,
    'xl/worksheets/sheet1.xml': `<?xml version="1.0"?><worksheet xmlns="${NS}"><sheetData>${sheet}</sheetData></worksheet>`,
  });
}

type XCell = { kind: 's'; index: number } | { kind: 'n'; text: string; style: 0 | 1 } | { kind: 'date' } | { kind: 'b'; v: 0 | 1 } | { kind: 'str'; text: string } | { kind: 'inl'; text: string };

describe('XLSX scanner: plain cells against the general path', () => {
  const strings = ['Łąka', 'Brithŵyr & Tŷ', ' padded ', '🌱', 'x<y'];
  const cellArb: fc.Arbitrary<XCell | null> = fc.oneof(
    fc.constant(null),
    fc.integer({ min: 0, max: strings.length - 1 }).map((index) => ({ kind: 's' as const, index })),
    fc.constantFrom('0', '7', '42', '123456789', '1234567890', '-3', '2.5', '0.1', '1e3', '007').chain((text) => fc.constantFrom<0 | 1>(0, 1).map((style) => ({ kind: 'n' as const, text, style }))),
    fc.constant({ kind: 'date' as const }),
    fc.constantFrom<0 | 1>(0, 1).map((v) => ({ kind: 'b' as const, v })),
    fc.constantFrom('formula text', '12', 'Ż').map((text) => ({ kind: 'str' as const, text })),
    fc.constantFrom('Łąka', 'Brithŵyr 🌱', 'ab').map((text) => ({ kind: 'inl' as const, text })),
  );
  // The value a spreadsheet program shows, worked by hand: shared strings as stored; numbers in their shortest form
  // (2.5, 0.1, 1000 for 1e3, 7 for 007); serial 45717 with built-in format 14 is 2025-03-01; booleans TRUE/FALSE.
  const shown = (c: XCell | null): string => {
    if (c === null) return '';
    switch (c.kind) {
      case 's':
        return strings[c.index]!;
      case 'n':
        return c.text === '1e3' ? '1000' : c.text === '007' ? '7' : c.text;
      case 'date':
        return '2025-03-01';
      case 'b':
        return c.v === 1 ? 'TRUE' : 'FALSE';
      case 'str':
      case 'inl':
        return c.text;
    }
  };
  const letters = (i: number) => String.fromCharCode(65 + i);
  const cellXml = (c: XCell, ref: string, general: boolean): string => {
    const q = general ? "'" : '"'; // single quotes are valid XML that the one-step path leaves to the general path
    const a = (name: string, v: string) => ` ${name}=${q}${v}${q}`;
    switch (c.kind) {
      case 's':
        return `<c${a('r', ref)}${a('t', 's')}><v>${c.index}</v></c>`;
      case 'n':
        return `<c${a('r', ref)}${c.style === 1 ? a('s', '1') : ''}><v>${c.text}</v></c>`;
      case 'date':
        return `<c${a('r', ref)}${a('s', '2')}><v>45717</v></c>`;
      case 'b':
        return `<c${a('r', ref)}${a('t', 'b')}><v>${c.v}</v></c>`;
      case 'str':
        return `<c${a('r', ref)}${a('t', 'str')}><f>A1</f><v>${c.text}</v></c>`;
      case 'inl':
        return `<c${a('r', ref)}${a('t', 'inlineStr')}><is><t>${c.text}</t></is></c>`;
    }
  };

  it('random sheets: the values written, and the same rows both ways, at every chunk size', async () => {
    await fc.assert(
      fc.asyncProperty(fc.array(fc.array(cellArb, { minLength: 1, maxLength: 6 }), { minLength: 1, maxLength: 8 }), fc.integer({ min: 1, max: 50 }), async (table, chunkSize) => {
        const sheet = (general: boolean) =>
          table
            .map((r, i) => `<row r="${i + 1}"${i % 2 === 1 ? ' spans="1:6" x14ac:dyDescent="0.25"' : ''}>${r.map((c, j) => (c === null ? '' : cellXml(c, `${letters(j)}${i + 1}`, general))).join('')}</row>`)
            .join('');
        const fast = await all(readXlsxRows(file('xlsx', workbook(sheet(false), strings)), { chunkSize }));
        const slow = await all(readXlsxRows(file('xlsx', workbook(sheet(true), strings)), { chunkSize }));
        expect(fast).toEqual(slow);
        const want = table.map((r) => {
          const vals = r.map(shown);
          let last = r.length - 1;
          while (last >= 0 && r[last] === null) last -= 1;
          return vals.slice(0, last + 1);
        });
        expect(fast.map((r) => r.values)).toEqual(want);
      }),
      { numRuns: 200, seed: 20261203 },
    );
  });

  it('a formula with no cached value is still an error naming the cell on the plain path', async () => {
    const sheet = '<row r="1"><c r="A1" t="s"><v>0</v></c><c r="B1"><v>3</v></c></row><row r="2"><c r="A2" t="s"><v>1</v></c><c r="B2"><f>1+1</f></c></row>';
    const path = file('xlsx', workbook(sheet, strings));
    await expect(all(readXlsxRows(path, { displayPath: 'w.xlsx' }))).rejects.toThrow(/cell B2/);
  });
});

// ---------------------------------------------------------------------------------------------------------------
// Non-UTF-8 CSV.

interface Utf8Case {
  name: string;
  hex: string;
  bad: { offset: number; byte: number; asWindows1252: string | null; line: number } | null;
}
const utf8 = JSON.parse(readFileSync(join(import.meta.dirname, 'fixtures/utf8-invalid.json'), 'utf8')) as { python: string; cases: Utf8Case[] };

describe('CSV files that are not UTF-8', () => {
  it(`first bad byte, offset and line as CPython ${utf8.python}'s decoder finds them (${utf8.cases.length} cases)`, async () => {
    expect(utf8.cases.length).toBeGreaterThan(100);
    for (const c of utf8.cases) {
      const found = await firstInvalidUtf8(file('csv', Buffer.from(c.hex, 'hex')));
      if (c.bad === null) expect(found, c.name).toBeUndefined();
      else expect({ ...found, asWindows1252: found?.asWindows1252 ?? null }, c.name).toEqual(c.bad);
    }
  });

  it('readCube stops with an InputError naming the file, the row and the byte, whatever the chunk size', async () => {
    // "Département" with é written as the single Windows-1252 byte 0xE9 (WHATWG index windows-1252: é is 0xE9).
    const lines = ['Group,Respondents,Agreeing', 'Hanes,10,4', 'Łąka,12,5', 'D\u00e9partement,8,3', 'Brithŵyr,9,2'];
    const bytes = Buffer.concat(lines.map((l, i) => Buffer.from(l + '\n', i === 3 ? 'latin1' : 'utf8')));
    const path = file('csv', bytes);
    for (const chunkSize of [1, 2, 3, 5, 17, 1 << 16]) {
      let error: unknown;
      try {
        await readCube(summarySource(path), ['Group'], 'exports/results.csv', { chunkSize });
      } catch (e) {
        error = e;
      }
      expect(error).toBeInstanceOf(InputError);
      const p = (error as InputError).problems[0]!;
      expect(p.file).toBe('exports/results.csv');
      expect(p.row).toBe(4);
      expect(p.found).toBe('byte 0xE9 ("é" in Windows-1252)');
      expect((error as InputError).message).toBe(
        'exports/results.csv, row 4: The file is not UTF-8 text: it was probably saved in another encoding, such as Windows-1252 or Latin-1 (found "byte 0xE9 (\\"é\\" in Windows-1252)"). ' +
          'Fix: Save the file again as "CSV UTF-8" (in a spreadsheet program, or choose UTF-8 as the encoding in a text editor) and point the claims file at that.',
      );
    }
  });

  it('the same file saved as UTF-8 reads', async () => {
    const lines = ['Group,Respondents,Agreeing', 'Hanes,10,4', 'Łąka,12,5', 'Département,8,3', 'Brithŵyr,9,2'];
    const cube = await readCube(summarySource(file('csv', lines.join('\n') + '\n')), ['Group'], 'r.csv', { chunkSize: 3 });
    expect(cube.values['Group']).toEqual(['Hanes', 'Łąka', 'Département', 'Brithŵyr']);
  });
});
