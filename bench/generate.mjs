// Writes the benchmark inputs under bench/tmp/ (git-ignored): a respondent-level table of ROWS rows × 12 columns as
// CSV and as XLSX, from a seeded generator so every run reads the same data. The XLSX is written by a small streaming
// zip writer (PKWARE APPNOTE 6.3: deflate, data descriptors, a central directory), sheet XML deflated as it is made.
import { createWriteStream, mkdirSync } from 'node:fs';
import { once } from 'node:events';
import { createDeflateRaw, crc32 } from 'node:zlib';
import { join } from 'node:path';
import { mulberry32 } from '../scripts/seeded-random.mjs';


export const DEPARTMENTS = Array.from({ length: 40 }, (_, i) => ['Hanes', 'Cerddoriaeth', 'Łacina', 'Gŵyddoniaeth', 'Naïve Studies', 'Mathemateg', 'Ffiseg', 'Szkoła Łąkowa'][i % 8] + ` ${Math.floor(i / 8) + 1}`);
export const CAMPUSES = ['Central', 'Tŷ Gwyn', 'North', 'Riverside', 'Łąka'];
const YEARS = ['2024', '2025', '2026'];
export const HEADER = ['ID', 'Department', 'Campus', 'Year', 'Q01', 'Q02', 'Q03', 'Q04', 'Q05', 'Q06', 'Q07', 'Q08'];
export const QUESTIONS = HEADER.slice(4);

function* people(rows) {
  const rand = mulberry32(20260401);
  for (let i = 0; i < rows; i++) {
    const answers = QUESTIONS.map(() => {
      const u = rand();
      return u < 0.05 ? '' : u < 0.08 ? '9' : String(1 + Math.floor(rand() * 5));
    });
    yield [String(100000 + i), DEPARTMENTS[Math.floor(rand() * DEPARTMENTS.length)], CAMPUSES[Math.floor(rand() * CAMPUSES.length)], YEARS[Math.floor(rand() * 3)], ...answers];
  }
}

async function writeChunks(stream, gen) {
  for (const piece of gen) {
    if (!stream.write(piece)) await once(stream, 'drain');
  }
}

export async function writeCsv(path, rows) {
  const out = createWriteStream(path);
  await writeChunks(
    out,
    (function* () {
      let buf = HEADER.join(',') + '\n';
      for (const p of people(rows)) {
        buf += p.join(',') + '\n';
        if (buf.length > 1 << 16) {
          yield buf;
          buf = '';
        }
      }
      yield buf;
    })(),
  );
  out.end();
  await once(out, 'finish');
}

const esc = (s) => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');
const letters = (i) => String.fromCharCode(65 + i);

export async function writeXlsx(path, rows) {
  const strings = [...HEADER, ...DEPARTMENTS, ...CAMPUSES];
  const index = new Map(strings.map((s, i) => [s, i]));
  const NS = 'http://schemas.openxmlformats.org/spreadsheetml/2006/main';
  const RNS = 'http://schemas.openxmlformats.org/officeDocument/2006/relationships';
  const small = {
    '[Content_Types].xml':
      '<?xml version="1.0" encoding="UTF-8" standalone="yes"?><Types xmlns="http://schemas.openxmlformats.org/package/2006/content-types">' +
      '<Default Extension="rels" ContentType="application/vnd.openxmlformats-package.relationships+xml"/><Default Extension="xml" ContentType="application/xml"/>' +
      '<Override PartName="/xl/workbook.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.sheet.main+xml"/>' +
      '<Override PartName="/xl/worksheets/sheet1.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.worksheet+xml"/>' +
      '<Override PartName="/xl/sharedStrings.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.sharedStrings+xml"/></Types>',
    '_rels/.rels': `<?xml version="1.0" encoding="UTF-8" standalone="yes"?><Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships"><Relationship Id="rId1" Type="${RNS}/officeDocument" Target="xl/workbook.xml"/></Relationships>`,
    'xl/workbook.xml': `<?xml version="1.0" encoding="UTF-8" standalone="yes"?><workbook xmlns="${NS}" xmlns:r="${RNS}"><sheets><sheet name="Responses" sheetId="1" r:id="rId1"/></sheets></workbook>`,
    'xl/_rels/workbook.xml.rels':
      `<?xml version="1.0" encoding="UTF-8" standalone="yes"?><Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships">` +
      `<Relationship Id="rId1" Type="${RNS}/worksheet" Target="worksheets/sheet1.xml"/><Relationship Id="rId2" Type="${RNS}/sharedStrings" Target="sharedStrings.xml"/></Relationships>`,
    'xl/sharedStrings.xml': `<?xml version="1.0" encoding="UTF-8" standalone="yes"?><sst xmlns="${NS}" count="${strings.length}" uniqueCount="${strings.length}">${strings.map((s) => `<si><t>${esc(s)}</t></si>`).join('')}</sst>`,
  };
  function* sheet() {
    let buf = `<?xml version="1.0" encoding="UTF-8" standalone="yes"?><worksheet xmlns="${NS}"><sheetData>`;
    buf += `<row r="1">${HEADER.map((h, c) => `<c r="${letters(c)}1" t="s"><v>${index.get(h)}</v></c>`).join('')}</row>`;
    let r = 1;
    for (const p of people(rows)) {
      r += 1;
      let line = `<row r="${r}">`;
      for (let c = 0; c < p.length; c++) {
        const v = p[c];
        if (v === '') continue;
        line += c === 1 || c === 2 ? `<c r="${letters(c)}${r}" t="s"><v>${index.get(v)}</v></c>` : `<c r="${letters(c)}${r}"><v>${v}</v></c>`;
      }
      buf += line + '</row>';
      if (buf.length > 1 << 16) {
        yield buf;
        buf = '';
      }
    }
    yield buf + '</sheetData></worksheet>';
  }
  const out = createWriteStream(path);
  const central = [];
  let offset = 0;
  const write = async (b) => {
    offset += b.length;
    if (!out.write(b)) await once(out, 'drain');
  };
  async function entry(name, gen) {
    const nameBuf = Buffer.from(name, 'utf8');
    const head = Buffer.alloc(30);
    head.writeUInt32LE(0x04034b50, 0);
    head.writeUInt16LE(20, 4);
    head.writeUInt16LE(0x0808, 6); // data descriptor follows; names in UTF-8
    head.writeUInt16LE(8, 8);
    head.writeUInt16LE(0, 10);
    head.writeUInt16LE(0x5c21, 12);
    head.writeUInt16LE(nameBuf.length, 26);
    const start = offset;
    await write(head);
    await write(nameBuf);
    let crc = 0;
    let size = 0;
    let packed = 0;
    const deflate = createDeflateRaw({ level: 6 });
    const pumped = (async () => {
      for await (const piece of deflate) {
        packed += piece.length;
        await write(piece);
      }
    })();
    for (const text of gen) {
      const b = Buffer.from(text, 'utf8');
      crc = crc32(b, crc);
      size += b.length;
      if (!deflate.write(b)) await once(deflate, 'drain');
    }
    deflate.end();
    await pumped;
    const desc = Buffer.alloc(16);
    desc.writeUInt32LE(0x08074b50, 0);
    desc.writeUInt32LE(crc >>> 0, 4);
    desc.writeUInt32LE(packed, 8);
    desc.writeUInt32LE(size, 12);
    await write(desc);
    central.push({ nameBuf, crc, packed, size, start });
  }
  for (const [name, text] of Object.entries(small)) await entry(name, [text]);
  await entry('xl/worksheets/sheet1.xml', sheet());
  const cdStart = offset;
  for (const e of central) {
    const c = Buffer.alloc(46);
    c.writeUInt32LE(0x02014b50, 0);
    c.writeUInt16LE(20, 4);
    c.writeUInt16LE(20, 6);
    c.writeUInt16LE(0x0808, 8);
    c.writeUInt16LE(8, 10);
    c.writeUInt16LE(0x5c21, 14);
    c.writeUInt32LE(e.crc >>> 0, 16);
    c.writeUInt32LE(e.packed, 20);
    c.writeUInt32LE(e.size, 24);
    c.writeUInt16LE(e.nameBuf.length, 28);
    c.writeUInt32LE(e.start, 42);
    await write(c);
    await write(e.nameBuf);
  }
  const end = Buffer.alloc(22);
  end.writeUInt32LE(0x06054b50, 0);
  end.writeUInt16LE(central.length, 8);
  end.writeUInt16LE(central.length, 10);
  end.writeUInt32LE(offset - cdStart, 12);
  end.writeUInt32LE(cdStart, 16);
  await write(end);
  out.end();
  await once(out, 'finish');
}

export async function generate(dir, rows) {
  mkdirSync(dir, { recursive: true });
  const csv = join(dir, `respondents-${rows}.csv`);
  const xlsx = join(dir, `respondents-${rows}.xlsx`);
  await writeCsv(csv, rows);
  await writeXlsx(xlsx, rows);
  return { csv, xlsx };
}
