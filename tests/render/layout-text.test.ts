/**
 * Layout.drawText draws a measured text from the lines kept when it was measured, without wrapping it again, and
 * writes each line's glyph codes from those kept per word (writeLine, src/render/pdf/fragment.ts). The check is pdfkit's
 * own doc.text (pdfkit 0.20, the library that writes the pack): the same texts drawn both ways, in
 * two documents set up alike, give the very same PDF bytes; and textHeight equals pdfkit's heightOfString.
 */
import { describe, it, expect } from 'vitest';
import { FONT_NAME, type Face } from '../../src/render/fonts.js';
import { testDoc } from '../helpers/pdf-doc.js';
import { Layout } from '../../src/render/pdf/layout.js';

const TEXTS = [
  'A short line.',
  'Agreement with "I feel safe" was higher in Pant-yr-ŵyn, Tŷ Łąka than in Ŵern (n = 1,234; 95% interval −6.3 to 28.6 points), and the difference is larger than chance alone would give in 99 of 100 samples.',
  'Two paragraphs:\nthe second starts on its own line,\n\nand a blank line sits between.',
  'Awordfarwiderthanthecolumnsoithastobebrokenbetweenletters-andthenthehyphenatedtail continues as usual.',
  'Naïve office figures: fi fl ff ffi AVA To Ty LT 1/2 – — ‘quoted’ “twice” 12.5%',
  'Marks set on their letters: a\u0328 i\u0308 o\u0302, then plain words after them.',
  '',
];

function newDoc(): { doc: PDFKit.Document; chunks: Buffer[]; done: Promise<Buffer> } {
  const made = testDoc({ margins: { top: 50, bottom: 48, left: 58, right: 58 }, firstPage: false });
  made.doc.addPage();
  return made;
}

/** Draw every text in a few faces, sizes and widths, down the page and near its foot, by `draw`. */
function drawAll(
  doc: PDFKit.Document,
  draw: (text: string, face: Face, size: number, x: number, y: number, width: number, gap: number, again?: boolean) => void,
): void {
  const cases: Array<[Face, number, number, number]> = [
    ['regular', 10.5, 479.28, 2.2],
    ['bold', 13, 300, 1.5],
    ['italic', 9, 120.5, 1],
  ];
  let y = 60;
  for (const [face, size, width, gap] of cases) {
    for (const text of TEXTS) {
      doc.font(FONT_NAME[face]).fontSize(size).fillColor('#1d2733');
      draw(text, face, size, 58, y, width, gap);
      y = doc.y + 4;
      if (y > 700) {
        doc.addPage();
        y = 60;
      }
    }
  }
  // The same texts drawn again (from their kept measurement, wrapped again for drawing), one of them by pdfkit's wrapper.
  doc.addPage();
  for (const y of [100, 250]) {
    for (const text of [TEXTS[1]!, TEXTS[3]!]) {
      doc.font(FONT_NAME.regular).fontSize(10.5).fillColor('#1d2733');
      draw(text, 'regular', 10.5, 58, y + (text === TEXTS[3] ? 70 : 0), 300, 2.2, true);
    }
  }
  // Near the foot of the page, where pdfkit moves the rest of a text to a new page.
  doc.font(FONT_NAME.regular).fontSize(10.5).fillColor('#1d2733');
  draw(TEXTS[1]!, 'regular', 10.5, 58, 770, 400, 2.2);
}

describe('Layout.drawText', () => {
  it('writes the same bytes as doc.text for wrapped, multi-paragraph, broken-word and empty texts', async () => {
    const a = newDoc();
    const L = new Layout(a.doc);
    const heights: number[] = [];
    drawAll(a.doc, (text, face, size, x, y, width, gap, again) => {
      a.doc.y = y;
      // A text measured before keeps its first height (which pdfkit's, from another place on the page, can differ
      // from in the last bits), so only first measurements are compared.
      const height = L.textHeight(text, face, size, width, gap);
      if (!again) heights.push(height);
      a.doc.font(FONT_NAME[face]).fontSize(size);
      L.drawText(text, face, size, x, y, width, gap);
    });
    a.doc.end();

    const b = newDoc();
    const expected: number[] = [];
    drawAll(b.doc, (text, _face, _size, x, y, width, gap, again) => {
      b.doc.y = y;
      if (!again) expected.push(b.doc.heightOfString(text, { width, lineGap: gap }));
      b.doc.text(text, x, y, { width, lineGap: gap });
    });
    b.doc.end();

    expect(heights).toEqual(expected);
    expect(heights.filter((h) => h > 40).length).toBeGreaterThan(3);
    const [bytesA, bytesB] = await Promise.all([a.done, b.done]);
    expect(bytesA.length).toBeGreaterThan(1000);
    expect(bytesA.equals(bytesB)).toBe(true);
  });

  it('hands a text measured in another size to doc.text, with the same result', async () => {
    const a = newDoc();
    const L = new Layout(a.doc);
    L.textHeight(TEXTS[1]!, 'regular', 10, 300, 2.2);
    a.doc.font(FONT_NAME.regular).fontSize(10.5);
    L.drawText(TEXTS[1]!, 'regular', 10.5, 58, 100, 300, 2.2);
    a.doc.end();
    const b = newDoc();
    b.doc.font(FONT_NAME.regular).fontSize(10.5);
    b.doc.text(TEXTS[1]!, 58, 100, { width: 300, lineGap: 2.2 });
    b.doc.end();
    const [bytesA, bytesB] = await Promise.all([a.done, b.done]);
    expect(bytesA.equals(bytesB)).toBe(true);
  });
});

describe('Layout.textLine', () => {
  type Opts = { width: number; lineGap?: number; lineBreak?: false; align?: 'right'; spaced?: boolean };
  const SPACED = { characterSpacing: 0.8, features: { kern: false } };
  const LINES: Array<[string, Face, number, Opts]> = [
    ['CLAIM FEEDBACK-BELOW-REGION', 'bold', 8.5, { width: 300, spaced: true, lineGap: 1 }],
    ['NOTES', 'bold', 8.5, { width: 200, spaced: true, lineBreak: false }],
    ['CLAIM TŶ ŁĄKA AVA TO (CONTINUED)', 'bold', 8.5, { width: 479.28, spaced: true, lineBreak: false }],
    ['Supported', 'bold', 11, { width: 80, lineBreak: false }],
    ['Not supported', 'regular', 9.5, { width: 90.5, lineBreak: false }],
    ['Student voice review 2026 — Pant-yr-ŵyn, naïve office figures', 'regular', 8, { width: 479.28, lineBreak: false }],
    ['Page 12 of 225', 'regular', 8, { width: 239.64, align: 'right', lineBreak: false }],
    ['Page 3 of 9  ', 'regular', 8, { width: 239.64, align: 'right', lineBreak: false }],
    // Handed to doc.text: two lines, a mark off the baseline, nothing to draw, letter-spaced text at the right.
    ['A label long enough to wrap onto a second line in this narrow width', 'bold', 8.5, { width: 90, spaced: true, lineGap: 1 }],
    ['Two lines\nof badge', 'regular', 9.5, { width: 200, lineBreak: false }],
    ['Marks a\u0328 i\u0308', 'regular', 9.5, { width: 200, lineBreak: false }],
    ['', 'regular', 9.5, { width: 200, lineBreak: false }],
    ['SPACED RIGHT', 'bold', 8.5, { width: 200, spaced: true, align: 'right' }],
  ];

  /** Each line at a few places, the last near the foot of the page (where doc.text moves to a new page). */
  function drawLines(doc: PDFKit.Document, draw: (text: string, face: Face, size: number, x: number, y: number, opts: Opts) => void): void {
    let y = 60;
    for (const [text, face, size, opts] of LINES) {
      for (const at of [y, y + 0.3]) {
        doc.font(FONT_NAME[face]).fontSize(size).fillColor('#5b6673');
        draw(text, face, size, 58, at, opts);
        doc.moveTo(58, doc.y).lineTo(60, doc.x).stroke();
      }
      y += 30;
    }
    doc.font(FONT_NAME.bold).fontSize(8.5);
    draw('CLAIM C1', 'bold', 8.5, 58, 790, { width: 300, spaced: true, lineGap: 1 });
    doc.font(FONT_NAME.regular).fontSize(9.5);
    draw('Supported', 'regular', 9.5, 58, 786, { width: 80, lineBreak: false });
  }

  it('writes the same bytes as doc.text and leaves the cursor where doc.text does', async () => {
    const a = newDoc();
    const L = new Layout(a.doc);
    let handed = 0;
    const text = a.doc.text.bind(a.doc);
    a.doc.text = ((...args: Parameters<typeof text>) => {
      handed++;
      return text(...args);
    }) as typeof text;
    drawLines(a.doc, (t, face, size, x, y, opts) => L.textLine(t, face, size, x, y, opts));
    a.doc.end();
    const b = newDoc();
    drawLines(b.doc, (t, _face, _size, x, y, { spaced, ...opts }) => b.doc.text(t, x, y, { ...opts, ...(spaced ? SPACED : {}) }));
    b.doc.end();
    const [bytesA, bytesB] = await Promise.all([a.done, b.done]);
    expect(bytesA.length).toBeGreaterThan(1000);
    expect(bytesA.equals(bytesB)).toBe(true);
    // The first eight lines, twice each, are written here; the other five (twice) and the two near the foot go to doc.text.
    expect(handed).toBe(12);
  });
});
