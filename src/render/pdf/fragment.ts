/**
 * One wrapped line of text written into the page as pdfkit's _fragment writes a left-aligned line with no word or
 * character spacing, decoration or link: "q", the flip of the y axis, "BT", the text matrix, the font, one TJ array
 * of glyph codes broken after each kerned glyph, "ET", "Q" — with the same numbers and in the same order, so the bytes
 * are the same. What costs in pdfkit is turning each line back into glyphs: it lays the line out again word by word,
 * joins the words' glyph arrays, and writes four hex digits per glyph. Here each word's glyph codes and kerning are
 * worked out the first time the word is written in a font (adding its glyphs to the font's subset in the order pdfkit
 * would) and reused for every line after. A line set with character spacing and OpenType features (SPACED_CAPS) is
 * shaped whole, as pdfkit shapes it then, and gets pdfkit's "Tc" operator. A word with glyphs moved off their baseline
 * (marks) makes the line go to pdfkit's own _fragment.
 */

interface Glyph {
  id: number;
  advanceWidth: number;
  codePoints: number[];
}
interface Position {
  xAdvance: number;
  xOffset: number;
  yOffset: number;
  advanceWidth: number;
}
interface EmbeddedFont {
  id: string;
  ascender: number;
  scale: number;
  widths: number[];
  unicode: number[][];
  subset: { includeGlyph(id: number): number };
  layoutCache?: unknown;
  layoutCached(text: string): { glyphs: Glyph[]; positions: Position[] };
  layout(text: string, features: unknown): { glyphs: Glyph[]; positions: Position[] };
  ref(): unknown;
}
interface DocInternals {
  _font: EmbeddedFont | null;
  _fontSize: number;
  page: { height: number; fonts: Record<string, unknown> };
  addContent(data: string): unknown;
}

/** A word's glyph codes, cut after each kerned glyph (with its adjustment in thousandths of the font size). */
interface Segment {
  hex: string;
  adjust: number | null;
}

const wordsByFont = new WeakMap<object, Map<string, Segment[] | null>>();

/** pdfkit's number formatting in content streams (PDFObject.number). */
function number(n: number): number {
  if (n > -1e21 && n < 1e21) return Math.round(n * 1e6) / 1e6;
  throw new Error(`unsupported number: ${n}`);
}

/**
 * A run's glyph codes cut after each kerned glyph, its glyphs added to the font's subset (with their widths and code
 * points) in order, as pdfkit's encode adds them; null, having added nothing, when a glyph is moved off the baseline.
 */
function encodeRun(font: EmbeddedFont, run: { glyphs: Glyph[]; positions: Position[] }): Segment[] | null {
  if (run.positions.some((p) => p.xOffset || p.yOffset)) return null;
  const segs: Segment[] = [];
  let hex = '';
  for (let i = 0; i < run.glyphs.length; i++) {
    const glyph = run.glyphs[i]!;
    const gid = font.subset.includeGlyph(glyph.id);
    hex += `0000${gid.toString(16)}`.slice(-4);
    if (font.widths[gid] == null) font.widths[gid] = glyph.advanceWidth * font.scale;
    if (font.unicode[gid] == null) font.unicode[gid] = glyph.codePoints;
    const p = run.positions[i]!;
    if (p.xAdvance - p.advanceWidth !== 0) {
      segs.push({ hex, adjust: p.xAdvance - p.advanceWidth });
      hex = '';
    }
  }
  if (hex) segs.push({ hex, adjust: null });
  return segs;
}

/** A word's segments, or null when one of its glyphs is moved off the baseline. */
function segments(font: EmbeddedFont, words: Map<string, Segment[] | null>, word: string): Segment[] | null {
  let segs = words.get(word);
  if (segs !== undefined) return segs;
  segs = encodeRun(font, font.layoutCached(word));
  words.set(word, segs);
  return segs;
}

/** The TJ operator of runs of segments, '' for none. */
function operator(runs: Segment[][]): string {
  let commands = '';
  let hex = '';
  for (const segs of runs) {
    for (const seg of segs) {
      hex += seg.hex;
      if (seg.adjust !== null) {
        commands += `${commands ? ' ' : ''}<${hex}> ${number(-seg.adjust)}`;
        hex = '';
      }
    }
  }
  if (hex) commands += `${commands ? ' ' : ''}<${hex}> ${number(-0)}`;
  return commands ? `[${commands}] TJ` : '';
}

/**
 * Lines up to this long are kept once written: labels, badge words and numbers recur from claim to claim, while a
 * longer line is nearly always written once, and keeping it would only keep its glyph codes alive to the end.
 */
const KEPT_LINE = 40;

/** Each font's lines already written: the line's TJ operator ('' for none), or null when it needs pdfkit's own. */
const linesByFont = new WeakMap<object, Map<string, string | null>>();
/** The same for lines written with spacing and features, by the features and the line. */
const spacedByFont = new WeakMap<object, Map<string, string | null>>();

/** Character spacing and OpenType features a line is written with, as pdfkit's text options give them. */
export interface Spacing {
  characterSpacing: number;
  features: Readonly<Record<string, boolean>>;
}

/** The TJ operator that writes `text` (no line breaks) in `font`, '' for none, or null when a glyph is off the baseline. */
function showText(font: EmbeddedFont, text: string): string | null {
  let words = wordsByFont.get(font);
  if (words === undefined) {
    words = new Map();
    wordsByFont.set(font, words);
  }
  // The line cut into words as pdfkit's font layout cuts it: after each space or tab.
  const runs: Segment[][] = [];
  let last = 0;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c !== 32 && c !== 9) continue;
    const segs = segments(font, words, text.slice(last, i + 1));
    if (segs === null) return null;
    runs.push(segs);
    last = i + 1;
  }
  if (last < text.length) {
    const segs = segments(font, words, text.slice(last));
    if (segs === null) return null;
    runs.push(segs);
  }
  return operator(runs);
}

/**
 * Write `line` at (x, y) in the current font and size as pdfkit's _fragment would with plain options (and the
 * baseline given: 'top', pdfkit's default, or 'alphabetic', as charts' labels are placed). Returns false,
 * having written nothing, when the line needs pdfkit's own (a font without a layout cache, or glyphs off the baseline).
 * A short line's TJ operator is kept per font (labels such as "Compared" recur on every claim's page), and the operators
 * from "q" to "Q" are handed over as one piece of content, each ending with the line break pdfkit ends it with; the
 * graphics state pdfkit's save, transform and restore would keep is the same after "Q" as before "q".
 */
export function writeLine(
  doc: PDFKit.Document,
  line: string,
  x: number,
  y: number,
  baseline: 'top' | 'alphabetic' = 'top',
  spacing?: Spacing,
): boolean {
  const d = doc as unknown as DocInternals;
  const font = d._font;
  if (!font || !font.layoutCache || !font.subset) return false;
  const text = line.includes('\n') ? line.replace(/\n/g, '') : line;
  if (text.length === 0) return true;
  const byFont = spacing ? spacedByFont : linesByFont;
  let lines = byFont.get(font);
  if (lines === undefined) {
    lines = new Map();
    byFont.set(font, lines);
  }
  const key = spacing ? `${JSON.stringify(spacing.features)}\u0000${text}` : text;
  let shown = text.length <= KEPT_LINE ? lines.get(key) : undefined;
  if (shown === undefined) {
    // With OpenType features pdfkit shapes the line whole (EmbeddedFont.layout), not word by word.
    if (spacing) {
      const segs = encodeRun(font, font.layout(text, spacing.features));
      shown = segs === null ? null : operator([segs]);
    } else shown = showText(font, text);
    if (text.length <= KEPT_LINE) lines.set(key, shown);
  }
  if (shown === null) return false;
  const size = d._fontSize;
  const height = d.page.height;
  // pdfkit's _fragment: y is the top of the line, or with baseline 'alphabetic' the baseline itself (dy 0).
  const dy = ((baseline === 'alphabetic' ? 0 : font.ascender) / 1000) * size;
  const top = height - y - dy;
  if (d.page.fonts[font.id] == null) d.page.fonts[font.id] = font.ref();
  d.addContent(
    `q\n1 0 0 -1 0 ${number(height)} cm\nBT\n1 0 0 1 ${number(x)} ${number(top)} Tm\n/${font.id} ${number(size)} Tf\n` +
      `${spacing?.characterSpacing ? `${number(spacing.characterSpacing)} Tc\n` : ''}` +
      `${shown ? `${shown}\n` : ''}ET\nQ`,
  );
  return true;
}
