/**
 * wrapWords (src/render/pdf/wrap.ts) wraps a text into the lines pdfkit's own line wrapper makes of it (pdfkit 0.20,
 * the library that writes the pack, run here through its _text as heightOfString runs it): the same line texts, and
 * the same textWidth, wordCount and lineWidth to the last bit, for random texts of words, spaces, tabs, hyphens,
 * slashes, new lines, long words, non-Latin scripts and marks, in each face, at random sizes and widths; and for
 * every text the renderer measures while drawing the demo pack.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import fc from 'fast-check';
import PDFDocument from 'pdfkit';
import { afterAll, describe, expect, it } from 'vitest';
import { FONT_NAME, fontFor, shapeQuickly, type Face } from '../../src/render/fonts.js';
import { Layout } from '../../src/render/pdf/layout.js';
import { pdfNumber, spacedWordWidth, widthOfString, wordsOf, wordWidth, wordWidths, wrapWords, type WidthFont, type WrappedLine } from '../../src/render/pdf/wrap.js';
import { build } from '../../src/pipeline.js';

interface Internals {
  _font: WidthFont;
  _initOptions(options: Record<string, unknown>): Record<string, unknown>;
  _text(text: string, x: number, y: number, options: Record<string, unknown>, line: (text: string, o: Omit<WrappedLine, 'text'>) => void): void;
}

function newDoc(): PDFKit.Document {
  const doc = new PDFDocument({ size: 'A4', autoFirstPage: false, font: null } as PDFKit.DocumentOptions);
  for (const face of ['regular', 'bold', 'italic'] as const) doc.registerFont(FONT_NAME[face], fontFor(face));
  shapeQuickly(doc);
  doc.addPage();
  return doc;
}

/**
 * The lines pdfkit's wrapper hands over for `text` in the current font, `width` wide (as heightOfString wraps);
 * `spaced`: letter-spaced without kerning, as SPACED_CAPS texts are set.
 */
function pdfkitLines(doc: PDFKit.Document, text: string, width: number, spaced = false): WrappedLine[] {
  const d = doc as unknown as Internals;
  const lines: WrappedLine[] = [];
  const { x, y } = doc;
  const options = d._initOptions(spaced ? { width, characterSpacing: 0.8, features: { kern: false } } : { width });
  options.height = Infinity;
  d._text(text, x, y, options, (line, o) => {
    lines.push({ text: line, textWidth: o.textWidth, wordCount: o.wordCount, lineWidth: o.lineWidth });
  });
  doc.x = x;
  doc.y = y;
  return lines;
}

function ours(doc: PDFKit.Document, text: string, size: number, width: number): WrappedLine[] | undefined {
  const font = (doc as unknown as Internals)._font;
  const words = wordsOf(text);
  return wrapWords(words, width, wordWidths(words, font, size, false, (word) => wordWidth(font, size, word)));
}

const WORDS = [
  'the', 'claim', 'holds', 'Agreement', 'Pant-yr-ŵyn,', 'Tŷ', 'Łąka', 'ïaith', '95%', '(n = 1,234;', '−6.3', 'to', '+28.6',
  'points.', 'office', 'ffi', 'fluffy', 'AVA', 'To', '1/2', '–', '—', '“quoted”', '‘single’', 'e.g.', 'C1–C12',
  'https://example.org/a/b?c=1', 'p = 0.031', '£3,000', '12.5%', 'a\u0328', 'i\u0308', '日本語のテキスト', 'مرحبا بالعالم',
  'Привет', 'Ελληνικά', '😀', 'x\u00ADy', 'Awordfarwiderthanthecolumnsoithastobebrokenbetweenletters',
  'sha256:3b647f7a1562b1304119581e681399e7ba0f', '"', '(', ')', ';', ':', '...', '…', '\u00A0', '\u2009',
];
const SEPARATORS = [' ', ' ', ' ', '  ', '', '\n', '\n\n', '\t', '-', '/', ' - ', '\r\n', '\u2028'];

const textArb = fc.oneof(
  fc
    .array(fc.tuple(fc.constantFrom(...WORDS), fc.constantFrom(...SEPARATORS)), { minLength: 0, maxLength: 40 })
    .map((parts) => parts.map(([w, s]) => w + s).join('')),
  fc.string({ unit: 'grapheme', maxLength: 60 }),
  fc.string({ unit: fc.constantFrom('a', 'b', ' ', '-', '\n', 'ŵ', 'f', 'i', 'l', '.', ',', '\t'), maxLength: 120 }),
);

describe('wrapWords', () => {
  it('gives pdfkit’s own lines and measures for random texts, faces, sizes and widths', () => {
    const doc = newDoc();
    let handled = 0;
    let total = 0;
    fc.assert(
      fc.property(
        textArb,
        fc.constantFrom<Face>('regular', 'bold', 'italic'),
        fc.oneof(fc.constantFrom(8, 8.5, 9, 9.5, 10, 10.5, 13, 16, 24), fc.double({ min: 4, max: 40, noNaN: true })),
        fc.oneof(fc.constantFrom(479.28, 315.33567451820124, 130, 120.5, 60), fc.double({ min: 1, max: 600, noNaN: true })),
        (text, face, size, width) => {
          doc.font(FONT_NAME[face]).fontSize(size);
          total++;
          const mine = ours(doc, text, size, width);
          if (mine === undefined) return;
          handled++;
          expect(mine).toEqual(pdfkitLines(doc, text, width));
        },
      ),
      { numRuns: 3000, seed: 1204 },
    );
    // Nearly every text is wrapped here rather than handed to pdfkit (only over-long words and soft hyphens are).
    expect(handled / total).toBeGreaterThan(0.6);
  });

  it('gives pdfkit’s own lines for letter-spaced text without kerning (SPACED_CAPS)', () => {
    const doc = newDoc();
    let handled = 0;
    fc.assert(
      fc.property(
        textArb.map((t) => t.toUpperCase()),
        fc.constantFrom<Face>('regular', 'bold', 'italic'),
        fc.constantFrom(8, 8.5, 9.5, 11),
        fc.oneof(fc.constantFrom(479.28, 300, 120), fc.double({ min: 1, max: 600, noNaN: true })),
        (text, face, size, width) => {
          doc.font(FONT_NAME[face]).fontSize(size);
          const font = (doc as unknown as Internals)._font;
          const words = wordsOf(text);
          const mine = wrapWords(words, width, wordWidths(words, font, size, true, (w) => spacedWordWidth(font, size, w, 0.8, { kern: false })));
          if (mine === undefined) return;
          handled++;
          expect(mine).toEqual(pdfkitLines(doc, text, width, true));
        },
      ),
      { numRuns: 1500, seed: 808 },
    );
    expect(handled).toBeGreaterThan(900);
  });

  it('measures a text as doc.widthOfString does, to the last bit', () => {
    const doc = newDoc();
    fc.assert(
      fc.property(
        textArb,
        fc.constantFrom<Face>('regular', 'bold', 'italic'),
        fc.oneof(fc.constantFrom(8, 9.5, 10.5, 11, 13), fc.double({ min: 4, max: 40, noNaN: true })),
        (text, face, size) => {
          doc.font(FONT_NAME[face]).fontSize(size);
          const font = (doc as unknown as Internals)._font;
          // Twice: the second time from the advance kept for the text.
          expect(widthOfString(font, size, text)).toBe(doc.widthOfString(text));
          expect(widthOfString(font, size, text)).toBe(doc.widthOfString(text));
        },
      ),
      { numRuns: 1500, seed: 77 },
    );
  });

  it('breaks as pdfkit does where words fill the line exactly', () => {
    const doc = newDoc();
    let exact = 0;
    fc.assert(
      fc.property(
        fc.array(fc.constantFrom(...WORDS.slice(0, 30)), { minLength: 2, maxLength: 12 }),
        fc.constantFrom<Face>('regular', 'bold', 'italic'),
        fc.constantFrom(8.5, 9.5, 10.5, 13),
        fc.nat(),
        (words, face, size, cut) => {
          doc.font(FONT_NAME[face]).fontSize(size);
          const font = (doc as unknown as Internals)._font;
          const text = words.join(' ');
          const { ends } = wordsOf(text);
          const pieces = ends.map((end, i) => text.slice(i === 0 ? 0 : ends[i - 1], end));
          const k = 1 + (cut % pieces.length);
          // The line as wide as its first k words, added up as the wrapper adds them.
          const width = pieces.slice(0, k).reduce((a, w) => a + wordWidth(font, size, w), 0);
          const mine = ours(doc, text, size, width);
          if (mine === undefined) return;
          const theirs = pdfkitLines(doc, text, width);
          expect(mine).toEqual(theirs);
          if (theirs[0]?.text === pieces.slice(0, k).join('')) exact++;
        },
      ),
      { numRuns: 1500, seed: 412 },
    );
    expect(exact).toBeGreaterThan(100);
  });

  it('hands pdfkit the texts it cuts inside a word or hyphenates at a soft hyphen', () => {
    const doc = newDoc();
    doc.font(FONT_NAME.regular).fontSize(10);
    expect(ours(doc, 'Awordfarwiderthanthecolumnsoithastobebroken and more', 10, 60)).toBeUndefined();
    expect(ours(doc, 'co\u00ADoperate', 10, 300)).toBeUndefined();
    expect(ours(doc, 'short words', 10, 0)).toBeUndefined();
    expect(ours(doc, 'short words', 10, 300)).toEqual(pdfkitLines(doc, 'short words', 300));
  });

  it('rounds widths as pdfkit does: to the greatest float32 at or below the value', () => {
    const f = new Float32Array(1);
    const bits = new Uint32Array(f.buffer);
    /** The float32 just above r. */
    const above = (r: number): number => {
      if (r === 0) return 2 ** -149;
      f[0] = r;
      bits[0] = r > 0 ? bits[0]! + 1 : bits[0]! - 1;
      return f[0]!;
    };
    fc.assert(
      fc.property(fc.double({ min: -1e6, max: 1e6, noNaN: true }), (n) => {
        const r = pdfNumber(n);
        expect(Math.fround(r)).toBe(r);
        expect(r).toBeLessThanOrEqual(n);
        expect(above(r)).toBeGreaterThan(n);
      }),
      { numRuns: 2000, seed: 1204 },
    );
  });
});

describe('the texts of the demo pack', () => {
  const work = mkdtempSync(join(tmpdir(), 'warrant-wrap-'));
  afterAll(() => rmSync(work, { recursive: true, force: true }));

  it('are each wrapped as pdfkit wraps them, in every face, size and width the renderer measures them in', async () => {
    // Every wrap the renderer asks for while building the demo pack is checked against pdfkit's wrapper on the spot.
    const proto = Layout.prototype as unknown as { wrap(text: string, size: number, width: number): WrappedLine[] | undefined; doc: PDFKit.Document };
    const wrap = proto.wrap;
    let checked = 0;
    const wrong: string[] = [];
    proto.wrap = function (this: typeof proto, text: string, size: number, width: number) {
      const mine = wrap.call(this, text, size, width);
      if (mine !== undefined) {
        checked++;
        try {
          expect(mine).toEqual(pdfkitLines(this.doc, text, width));
        } catch {
          wrong.push(text);
        }
      }
      return mine;
    };
    try {
      await build({ claimsPath: resolve(__dirname, '../../demo/claims.yaml'), outDir: join(work, 'out'), cwd: resolve(__dirname, '../..') });
    } finally {
      proto.wrap = wrap;
    }
    expect(wrong).toEqual([]);
    expect(checked).toBeGreaterThan(500);
  }, 120_000);
});
