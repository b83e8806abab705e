/**
 * The fonts of the evidence pack: Noto Sans (SIL Open Font License) static TrueType faces from the
 * @expo-google-fonts/noto-sans package, located through Node's module resolution rather than a fixed path.
 * Only TTF is used: pdfkit embeds and subsets it, accented glyphs included, and the same bytes feed the
 * width measurement below, so what is measured for layout is what gets drawn.
 */
import { createRequire } from 'node:module';
import { readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import * as fontkit from 'fontkit';
import { QuickShaper, withoutKerning } from './shaping.js';

export type Face = 'regular' | 'bold' | 'italic';

/** Family name used in chart specs; the SVG font callback maps it back to one of our faces. */
export const CHART_FONT_FAMILY = 'Noto Sans';

const FACE_FILES: Record<Face, string> = {
  regular: '400Regular/NotoSans_400Regular.ttf',
  bold: '700Bold/NotoSans_700Bold.ttf',
  italic: '400Regular_Italic/NotoSans_400Regular_Italic.ttf',
};

/** The pdfkit names under which the faces are registered. */
export const FONT_NAME: Record<Face, string> = {
  regular: 'Warrant-Regular',
  bold: 'Warrant-Bold',
  italic: 'Warrant-Italic',
};

let packageDir: string | undefined;

function fontPackageDir(): string {
  if (packageDir === undefined) {
    const require = createRequire(import.meta.url);
    packageDir = dirname(require.resolve('@expo-google-fonts/noto-sans/package.json'));
  }
  return packageDir;
}

/** Absolute path of the TTF file for a face. */
export function fontPath(face: Face): string {
  return join(fontPackageDir(), FACE_FILES[face]);
}

const bytesCache = new Map<Face, Buffer>();
const fontCache = new Map<Face, fontkit.Font>();

/** The TTF bytes of a face (read once). */
export function fontBytes(face: Face): Buffer {
  let bytes = bytesCache.get(face);
  if (bytes === undefined) {
    const path = fontPath(face);
    try {
      bytes = readFileSync(path);
    } catch (e) {
      throw new Error(
        `The font file ${path} could not be read (${(e as Error).message}); ` +
          'reinstall the @expo-google-fonts/noto-sans package.',
      );
    }
    bytesCache.set(face, bytes);
  }
  return bytes;
}

/**
 * The parsed face (fontkit). pdfkit is given this same object (registerFont takes a parsed font), so the font's
 * tables are read once, and its glyph and shaping caches, warmed by measuring chart labels, serve the PDF too.
 */
export function fontFor(face: Face): fontkit.Font {
  let font = fontCache.get(face);
  if (font === undefined) {
    font = fontkit.create(fontBytes(face));
    fontCache.set(face, font);
  }
  return font;
}

const shaperCache = new Map<Face, QuickShaper>();

/** The quick shaper of a face (see shaping.ts): fontkit's glyphs and positions for plain words, without its shaper. */
export function quickShaper(face: Face): QuickShaper {
  let shaper = shaperCache.get(face);
  if (shaper === undefined) {
    shaper = new QuickShaper(fontFor(face), fontBytes(face));
    shaperCache.set(face, shaper);
  }
  return shaper;
}

/** Advance of `word` in font units, as fontkit's layout gives it (the sum of its glyphs' advances). */
function wordUnits(face: Face, word: string): number {
  const run = quickShaper(face).layout(word);
  if (run === undefined) return fontFor(face).layout(word).advanceWidth;
  let units = 0;
  for (const p of run.positions) units += p.xAdvance;
  return units;
}

/** The parts of pdfkit's embedded font that quick shaping replaces. */
interface EmbeddedFont {
  font: unknown;
  scale: number;
  layoutRun(text: string, features?: unknown): { glyphs: unknown[]; positions: unknown[]; advanceWidth: number };
}

/**
 * Let pdfkit shape plain words with the quick shaper: each face's embedded font, when the document first uses it, gets
 * a layoutRun that returns what pdfkit's own (fontkit's layout, positions scaled to 1000 units per em, each with its
 * glyph's advance) would, for words the quick shaper knows, with kerning or with kerning switched off (SPACED_CAPS);
 * other words, and text set with other OpenType features, go to pdfkit's own.
 */
export function shapeQuickly(doc: PDFKit.Document): void {
  const d = doc as unknown as { font: (...args: unknown[]) => unknown; _font: EmbeddedFont | null };
  const font = d.font.bind(doc);
  const seen = new WeakSet<object>();
  d.font = (...args: unknown[]): unknown => {
    const result = font(...args);
    const embedded = d._font;
    if (embedded && !seen.has(embedded)) {
      seen.add(embedded);
      const face = (['regular', 'bold', 'italic'] as const).find((f) => fontCache.get(f) === embedded.font);
      if (face !== undefined && quickShaper(face).supported) {
        const shaper = quickShaper(face);
        const own = embedded.layoutRun.bind(embedded);
        embedded.layoutRun = (text: string, features?: unknown) => {
          const run =
            features === undefined ? shaper.layout(text) : withoutKerning(features) ? shaper.layout(text, false) : undefined;
          if (run === undefined) return own(text, features);
          const scale = embedded.scale;
          let advanceWidth = 0;
          const positions = run.positions.map((p, i) => {
            const q = {
              xAdvance: p.xAdvance * scale,
              yAdvance: p.yAdvance * scale,
              xOffset: p.xOffset * scale,
              yOffset: p.yOffset * scale,
              advanceWidth: run.glyphs[i]!.advanceWidth * scale,
            };
            advanceWidth += q.xAdvance;
            return q;
          });
          return { glyphs: run.glyphs, positions, advanceWidth };
        };
      }
    }
    return result;
  };
}

/** Widths remembered per face and word before a table is emptied. */
const WORDS_KEPT = 50_000;
const wordWidths: Record<Face, Map<string, number>> = { regular: new Map(), bold: new Map(), italic: new Map() };

/**
 * Width in points of `text` set in `face` at `size` points, with the font's own advances and kerning. Measured word by
 * word (each word with the spaces or tabs after it), as pdfkit lays out what it draws, and each word's width in font
 * units remembered: shaping a new string is slow, and a pack's labels repeat their words. The sum is exact: these
 * faces have no kerning or substitution across a space (checked pair by pair in tests/render/fonts.test.ts).
 */
export function textWidth(text: string, size: number, face: Face = 'regular'): number {
  if (text.length === 0 || size <= 0) return 0;
  const font = fontFor(face);
  const widths = wordWidths[face];
  let units = 0;
  let from = 0;
  for (let i = 0; i <= text.length; i++) {
    const c = text.charCodeAt(i);
    if (i < text.length && c !== 32 && c !== 9) continue;
    if (i === text.length && from === i) break;
    const word = text.slice(from, i + 1);
    let w = widths.get(word);
    if (w === undefined) {
      w = wordUnits(face, word);
      if (widths.size >= WORDS_KEPT) widths.clear();
      widths.set(word, w);
    }
    units += w;
    from = i + 1;
  }
  return (units / font.unitsPerEm) * size;
}

/** The face that a CSS-like weight and style select: bold for weights of 600 and over or "bold", else italic or regular. */
export function faceFor(weight: unknown, style: unknown): Face {
  const w = typeof weight === 'number' ? weight : typeof weight === 'string' ? weight.trim().toLowerCase() : '';
  const bold = w === 'bold' || w === 'bolder' || (typeof w === 'number' ? w >= 600 : Number(w) >= 600);
  if (bold) return 'bold';
  return style === 'italic' || style === 'oblique' ? 'italic' : 'regular';
}

/** True when every character of `text` has a glyph in the regular face (whitespace aside). */
export function hasGlyphs(text: string, face: Face = 'regular'): boolean {
  const font = fontFor(face);
  for (const ch of text) {
    const cp = ch.codePointAt(0)!;
    if (/\s/.test(ch)) continue;
    if (!font.hasGlyphForCodePoint(cp)) return false;
  }
  return true;
}
