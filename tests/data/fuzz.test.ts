// Fuzzing both readers with fast-check: random and mutated inputs (random bytes in a zip entry's XML, truncated and
// corrupted zips, random CSV text) give a cube or an InputError, never any other exception. The CSV reader's fast path
// (text without quotes) is checked against papaparse's whole-string parse, the reference.
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import fc from 'fast-check';
import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { readCube } from '../../src/data/cube.js';
import { readCsvRows } from '../../src/data/csv.js';
import { InputError } from '../../src/errors.js';
import { zip } from '../helpers/zip.js';
import { summarySource } from './sources.js';

const fx = (name: string) => join(import.meta.dirname, '../fixtures/data', name);
const tmp = mkdtempSync(join(tmpdir(), 'warrant-fuzz-'));
let counter = 0;
const file = (ext: string, bytes: Uint8Array | string) => {
  const path = join(tmp, `f${counter++}.${ext}`);
  writeFileSync(path, bytes);
  return path;
};

/** A cube, or 'input-error'; any other exception is rethrown and fails the property. */
async function outcome(p: Promise<unknown>): Promise<'cube' | 'input-error'> {
  try {
    await p;
    return 'cube';
  } catch (e) {
    if (e instanceof InputError) return 'input-error';
    throw e;
  }
}

const NS = 'http://schemas.openxmlformats.org/spreadsheetml/2006/main';
const RNS = 'http://schemas.openxmlformats.org/officeDocument/2006/relationships';
const parts = (sheet: string, strings: string, styles: string): Record<string, Buffer> => ({
  '_rels/.rels': Buffer.from(`<?xml version="1.0"?><Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships"><Relationship Id="rId1" Type="${RNS}/officeDocument" Target="xl/workbook.xml"/></Relationships>`),
  'xl/workbook.xml': Buffer.from(`<?xml version="1.0"?><workbook xmlns="${NS}" xmlns:r="${RNS}"><sheets><sheet name="S" sheetId="1" r:id="rId1"/></sheets></workbook>`),
  'xl/_rels/workbook.xml.rels': Buffer.from(
    `<?xml version="1.0"?><Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships"><Relationship Id="rId1" Type="${RNS}/worksheet" Target="worksheets/sheet1.xml"/><Relationship Id="rId2" Type="${RNS}/sharedStrings" Target="sharedStrings.xml"/><Relationship Id="rId3" Type="${RNS}/styles" Target="styles.xml"/></Relationships>`,
  ),
  'xl/sharedStrings.xml': Buffer.from(strings),
  'xl/styles.xml': Buffer.from(styles),
  'xl/worksheets/sheet1.xml': Buffer.from(sheet),
});
const SHEET =
  `<?xml version="1.0"?><worksheet xmlns="${NS}"><sheetData>` +
  '<row r="1"><c r="A1" t="s"><v>0</v></c><c r="B1" t="inlineStr"><is><t>Respondents</t></is></c><c r="C1" t="s"><v>1</v></c></row>' +
  '<row r="2"><c r="A2" t="s"><v>2</v></c><c r="B2"><v>50</v></c><c r="C2"><f>B2-20</f><v>30</v></c></row>' +
  '<row r="3"><c r="A3" s="1"><v>45717</v></c><c r="B3"><v>20</v></c><c r="C3"><v>5</v></c></row>' +
  '</sheetData></worksheet>';
const STRINGS = `<?xml version="1.0"?><sst xmlns="${NS}"><si><t>Group</t></si><si><t>Agreeing</t></si><si><r><t>Ł</t></r><r><t>ąka &amp; Brithŵyr</t></r></si></sst>`;
const STYLES = `<?xml version="1.0"?><styleSheet xmlns="${NS}"><cellXfs count="2"><xf numFmtId="0"/><xf numFmtId="14"/></cellXfs></styleSheet>`;
const source = (path: string) => summarySource(path, {});

describe('XLSX reader under fuzzing', () => {
  it('the unmutated workbook reads (the mutations start from a good file)', async () => {
    const cube = await readCube(source(file('xlsx', zip(parts(SHEET, STRINGS, STYLES)))), ['Group'], 'w.xlsx');
    // Serial 45717 with a built-in date format (id 14) is 2025-03-01 (1900 date system; worked by hand: 45717 days
    // after 1899-12-30).
    expect(cube.values['Group']).toEqual(['Łąka & Brithŵyr', '2025-03-01']);
  });

  it('random bytes written into an entry\'s XML: a cube or an InputError', async () => {
    const which = fc.constantFrom<'sheet' | 'strings' | 'styles'>('sheet', 'strings', 'styles');
    const edit = fc.record({ at: fc.nat(), bytes: fc.uint8Array({ minLength: 1, maxLength: 6 }), remove: fc.nat({ max: 6 }) });
    await fc.assert(
      fc.asyncProperty(which, fc.array(edit, { minLength: 1, maxLength: 4 }), fc.integer({ min: 1, max: 9 }), async (part, edits, chunkSize) => {
        const texts = { sheet: Buffer.from(SHEET), strings: Buffer.from(STRINGS), styles: Buffer.from(STYLES) };
        let b = texts[part];
        for (const e of edits) {
          const at = e.at % (b.length + 1);
          b = Buffer.concat([b.subarray(0, at), Buffer.from(e.bytes), b.subarray(Math.min(b.length, at + e.remove))]);
        }
        texts[part] = b;
        const path = file('xlsx', zip({ ...parts(SHEET, STRINGS, STYLES), 'xl/worksheets/sheet1.xml': texts.sheet, 'xl/sharedStrings.xml': texts.strings, 'xl/styles.xml': texts.styles }));
        expect(['cube', 'input-error']).toContain(await outcome(readCube(source(path), ['Group'], 'w.xlsx', { chunkSize })));
      }),
      { numRuns: 150, seed: 20260401 },
    );
  });

  it('truncated or corrupted zips: an InputError or a cube', async () => {
    const good = readFileSync(fx('summary.xlsx'));
    await fc.assert(
      fc.asyncProperty(fc.nat(), fc.array(fc.record({ at: fc.nat(), byte: fc.integer({ min: 0, max: 255 }) }), { maxLength: 8 }), fc.boolean(), async (cut, flips, truncate) => {
        const b = Buffer.from(good);
        for (const f of flips) b[f.at % b.length] = f.byte;
        const bytes = truncate ? b.subarray(0, cut % b.length) : b;
        expect(['cube', 'input-error']).toContain(await outcome(readCube(summarySource(file('xlsx', bytes), { population: 'Population' }), [], 's.xlsx')));
      }),
      { numRuns: 120, seed: 20260402 },
    );
  });
});

describe('XLSX reader on a damaged local header', () => {
  // Each part of a zip starts with a local file header whose signature is the bytes 50 4B 03 04 (PKWARE APPNOTE.TXT
  // 4.3.7). A damaged signature is found only when that part is opened, after the directory has been read.
  it('every part: an InputError naming the damage, never a bare zip error', async () => {
    const good = readFileSync(fx('summary.xlsx'));
    const headers: number[] = [];
    for (let at = good.indexOf('PK\u0003\u0004', 0, 'latin1'); at >= 0; at = good.indexOf('PK\u0003\u0004', at + 1, 'latin1')) headers.push(at);
    expect(headers.length).toBeGreaterThan(3);
    const found: string[] = [];
    for (const at of headers) {
      const b = Buffer.from(good);
      b[at] = 0;
      try {
        await readCube(summarySource(file('xlsx', b), { population: 'Population' }), [], 's.xlsx');
        found.push('cube');
      } catch (e) {
        if (!(e instanceof InputError)) throw e;
        found.push(e.message);
      }
    }
    // A part warrant never opens (e.g. document properties) reads on as a cube; every part it opens says damaged.
    expect(found.filter((m) => /The workbook is damaged/.test(m) && /invalid local file header signature/.test(m)).length).toBeGreaterThan(2);
    expect(found.some((m) => /sheet cannot be unpacked/.test(m))).toBe(true);
    expect(found.every((m) => m === 'cube' || /The workbook is damaged/.test(m))).toBe(true);
  });
});

describe('CSV reader under fuzzing', () => {
  const piece = fc.constantFrom('a', 'Ł', 'ŵ', '🌱', ',', ';', '\t', '\n', '\r\n', '\r', ' ', '1', '72%', '"', '""', '0.5');
  it('random text: a cube or an InputError', async () => {
    await fc.assert(
      fc.asyncProperty(fc.array(piece, { maxLength: 60 }), fc.boolean(), fc.integer({ min: 1, max: 9 }), async (pieces, bom, chunkSize) => {
        const text = (bom ? '\uFEFF' : '') + 'G,Respondents,Agreeing\n' + pieces.join('');
        const path = file('csv', text);
        expect(['cube', 'input-error']).toContain(await outcome(readCube(summarySource(path), [], 'r.csv', { chunkSize })));
        expect(['cube', 'input-error']).toContain(await outcome(readCube(summarySource(path, { shape: 'respondents', questions: ['Agreeing'] }), ['G'], 'r.csv', { chunkSize })));
      }),
      { numRuns: 200, seed: 20260403 },
    );
  });

  it('text without quotes: the fast path gives the records of a whole-string papaparse parse', async () => {
    const plain = fc.constantFrom('a', 'Ł', 'ŵ', '🌱', ',', ' ', '1', '', '\t', ';');
    await fc.assert(
      fc.asyncProperty(fc.array(fc.array(plain, { maxLength: 8 }), { minLength: 1, maxLength: 12 }), fc.constantFrom('\n', '\r\n'), fc.boolean(), fc.integer({ min: 1, max: 16 }), async (lines, nl, endNl, chunkSize) => {
        const header = 'x,y';
        const text = [header, ...lines.map((l) => l.join(''))].join(nl) + (endNl ? nl : '');
        const path = file('csv', text);
        const rows: string[][] = [];
        for await (const r of readCsvRows(path, { chunkSize })) rows.push(r.values);
        // Reference: papaparse, whole string, the dialect given; a final empty record after the last newline dropped.
        const ref = Papa.parse<string[]>(text, { delimiter: ',', newline: nl }).data;
        if (text.endsWith(nl) && ref.length > 0 && ref[ref.length - 1]!.length === 1 && ref[ref.length - 1]![0] === '') ref.pop();
        expect(rows).toEqual(ref);
      }),
      { numRuns: 200, seed: 20260404 },
    );
  });
});

describe('XLSX sheet XML written with a namespace prefix', () => {
  it('reads the same values as the unprefixed sheet', async () => {
    const prefixed = SHEET.replace(`<worksheet xmlns="${NS}">`, `<x:worksheet xmlns:x="${NS}">`)
      .replace('</worksheet>', '</x:worksheet>')
      .replace(/<(\/?)(sheetData|row|c|v|f|is|t)([ >/])/g, '<$1x:$2$3');
    expect(prefixed).toContain('<x:c r="A3" s="1"><x:v>45717</x:v></x:c>');
    const plain = await readCube(source(file('xlsx', zip(parts(SHEET, STRINGS, STYLES)))), ['Group'], 'w.xlsx');
    const cube = await readCube(source(file('xlsx', zip(parts(prefixed, STRINGS, STYLES)))), ['Group'], 'w.xlsx');
    expect(cube.cells).toEqual(plain.cells);
  });
});
