/**
 * The quick shaper gives the glyphs and positions fontkit's own layout gives (fontkit 2, the shaper pdfkit uses),
 * checked against fontkit for every pair of characters of a wide set and for mixed text with ligatures ("fi", "ffl"),
 * kerning pairs ("AV", "To") and letters such as ŵ, ŷ, Ł, ą, ï, in each face; with kerning switched off as pdfkit asks
 * for letter-spaced capitals; and a PDF drawn with it is byte-identical to one drawn with pdfkit's own shaping.
 */
import { describe, it, expect } from 'vitest';
import PDFDocument from 'pdfkit';
import { FONT_NAME, fontFor, quickShaper, shapeQuickly, type Face } from '../../src/render/fonts.js';
import { withoutKerning, type QuickRun } from '../../src/render/shaping.js';

const FACES: Face[] = ['regular', 'bold', 'italic'];

const CHARS = [
  ...Array.from({ length: 95 }, (_, i) => String.fromCharCode(0x20 + i)),
  ...'ŵŷŴŶŁłąĄïÏéèêëöüßçñÅåøØæœ€£¥§°±×÷¼½¾«»¿¡ĳğışŞžčřůőűŭİ–—‘’“”„…•‰′″−≤≥→ '.split(''),
];

const MIXED = [
  'office',
  'ffi ffl fluffy affluent',
  'Confidence; significant difference.',
  'Pant-yr-ŵyn, Tŷ Łąka 003 (n = 1,234)',
  'Naïve AVA To Ty LT WA Yo P. F. \u201cquoted\u201d',
  '−6.3 to +28.6 points (95% interval)',
  'ŴERN Ŷ ĄŁ fjord fi-fl',
];

/** The same glyphs (the very objects fontkit hands out) and positions as fontkit's layout. */
function expectSame(run: QuickRun, text: string, face: Face, features?: Record<string, boolean>): void {
  const ref = fontFor(face).layout(text, features);
  expect(run.glyphs.map((g) => g.id), `${face} ${JSON.stringify(text)}`).toEqual(ref.glyphs.map((g) => g.id));
  run.glyphs.forEach((g, i) => expect(g).toBe(ref.glyphs[i]));
  expect(run.positions.map((p) => [p.xAdvance, p.yAdvance, p.xOffset, p.yOffset])).toEqual(
    ref.positions.map((p) => [p.xAdvance, p.yAdvance, p.xOffset, p.yOffset]),
  );
}

describe('QuickShaper', () => {
  it('reads every face of the pack', () => {
    for (const face of FACES) expect(quickShaper(face).reason, face).toBe('');
  });

  it('shapes every pair of characters of a wide set as fontkit does, and nearly all of them itself', () => {
    for (const face of FACES) {
      const shaper = quickShaper(face);
      const font = fontFor(face);
      const bad: string[] = [];
      let quick = 0;
      let total = 0;
      for (const a of CHARS) {
        for (const b of CHARS) {
          const text = a + b;
          total++;
          const run = shaper.layout(text);
          if (!run) continue;
          quick++;
          const ref = font.layout(text);
          const same =
            run.glyphs.length === ref.glyphs.length &&
            run.glyphs.every((g, i) => g === ref.glyphs[i]) &&
            run.positions.every((p, i) => {
              const r = ref.positions[i]!;
              return p.xAdvance === r.xAdvance && p.yAdvance === r.yAdvance && p.xOffset === r.xOffset && p.yOffset === r.yOffset;
            });
          if (!same) bad.push(JSON.stringify(text));
        }
      }
      expect(bad, face).toEqual([]);
      expect(quick / total, face).toBeGreaterThan(0.95);
    }
  });

  it('shapes mixed text with ligatures, kerning pairs and accented letters as fontkit does', () => {
    for (const face of FACES) {
      for (const text of MIXED) {
        for (const word of [text, ...text.split(/(?<= )/)]) {
          const run = quickShaper(face).layout(word);
          expect(run, `${face} ${JSON.stringify(word)}`).toBeDefined();
          expectSame(run!, word, face);
        }
      }
      // The ligatures and kerning are there: "fi" is one glyph, and "AV" is set closer than its two glyphs' widths.
      expect(quickShaper(face).layout('fi')!.glyphs).toHaveLength(1);
      const av = quickShaper(face).layout('AV')!;
      expect(av.positions[0]!.xAdvance).toBeLessThan(av.glyphs[0]!.advanceWidth);
    }
  });

  it('shapes without kerning as fontkit does with the features { kern: false }, fresh or reused', () => {
    const reused = { kern: false };
    for (const face of FACES) {
      for (const text of ['CLAIM ', 'C12 (CONTINUED)', 'NOTE', 'AVATAR WAY', 'TŶ ŁĄKA']) {
        const run = quickShaper(face).layout(text, false)!;
        expectSame(run, text, face, { kern: false });
        expectSame(run, text, face, reused);
        expect(withoutKerning(reused)).toBe(true);
      }
    }
    expect(withoutKerning({ kern: false, smcp: true })).toBe(false);
    expect(withoutKerning({ kern: true })).toBe(false);
    expect(withoutKerning(['kern'])).toBe(false);
  });

  it('leaves text with combining marks, other scripts and soft hyphens to fontkit', () => {
    for (const text of ['i\u0308', 'a\u0328', 'Ωmega', 'co\u00adop', 'x\u2044y']) expect(quickShaper('regular').layout(text), text).toBeUndefined();
  });

  it('draws the very same PDF bytes as pdfkit with its own shaping', async () => {
    const draw = async (quick: boolean): Promise<Buffer> => {
      const doc = new PDFDocument({ size: 'A4', autoFirstPage: false, font: null, info: { CreationDate: new Date(0), ModDate: new Date(0) } } as PDFKit.DocumentOptions);
      for (const face of FACES) doc.registerFont(FONT_NAME[face], fontFor(face));
      if (quick) shapeQuickly(doc);
      const chunks: Buffer[] = [];
      doc.on('data', (c: Buffer) => chunks.push(c));
      const done = new Promise<Buffer>((resolve) => doc.on('end', () => resolve(Buffer.concat(chunks))));
      doc.addPage();
      let y = 60;
      for (const face of FACES) {
        for (const text of [...MIXED, 'i\u0308 a\u0328 Ωmega']) {
          doc.font(FONT_NAME[face]).fontSize(10.5).text(text, 58, y, { width: 300, lineGap: 2 });
          y += 30;
        }
        doc.font(FONT_NAME[face]).fontSize(8.5).text('CLAIM C12 ŴERN', 58, y, { width: 300, characterSpacing: 0.8, features: { kern: false } });
        y += 20;
      }
      doc.end();
      return done;
    };
    const [a, b] = [await draw(true), await draw(false)];
    expect(a.length).toBeGreaterThan(5000);
    expect(a.equals(b)).toBe(true);
  });
});
