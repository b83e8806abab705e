/**
 * Wrapping a text into lines as pdfkit's line wrapper (LineWrapper, pdfkit 0.20) wraps it for doc.text with
 * { width, lineGap } and nothing else: the same break opportunities (the linebreak package's UAX #14 breaker, the one
 * pdfkit uses), the same word widths to the last bit (pdfkit's sums, scalings and float32 rounding, done in the same
 * order) and the same decisions, so the lines and their measures are the ones pdfkit's wrapper hands over. What costs in
 * pdfkit is not the arithmetic but its machinery: an event emitter and listeners per line, the break finder run for
 * every measurement, and every word's width worked out again on each call. Here a text's words are found once, whatever
 * width or face it is measured in, and each word's advance is kept per font.
 *
 * A text this does not wrap exactly as pdfkit does is left to pdfkit (wrapWords returns undefined): a word wider than
 * the line (pdfkit cuts it between letters), a soft hyphen (pdfkit may draw a hyphen for it), a width of zero or less.
 */
import LineBreaker from 'linebreak';

/** One wrapped line as pdfkit's wrapper hands it to be drawn. */
export interface WrappedLine {
  text: string;
  textWidth: number;
  wordCount: number;
  lineWidth: number;
}

/**
 * A text cut at its break opportunities: where each word ends (a word holds the spaces after it) and whether a line
 * must end after it. Kept as positions, not as strings, as every text measured is kept for the whole pack.
 */
export interface Words {
  text: string;
  ends: number[];
  required: boolean[];
  /** False when the text holds a soft hyphen, which pdfkit's wrapper treats specially. */
  plain: boolean;
  /** The words' widths in the font, size and spacing the text was last wrapped in (texts are re-wrapped at other widths). */
  widths?: { font: object; size: number; spaced: boolean; values: Float64Array };
}

/**
 * The widths of a text's words in `font` at `size` (spaced: letter-spaced as SPACED_CAPS), each from `widthOf`, kept
 * with the words for the next wrap of the same text in the same font, size and spacing.
 */
export function wordWidths(words: Words, font: object, size: number, spaced: boolean, widthOf: (word: string) => number): Float64Array {
  const kept = words.widths;
  if (kept && kept.font === font && kept.size === size && kept.spaced === spaced) return kept.values;
  const { text, ends } = words;
  const values = new Float64Array(ends.length);
  for (let i = 0; i < ends.length; i++) values[i] = widthOf(text.slice(i === 0 ? 0 : ends[i - 1], ends[i]));
  words.widths = { font, size, spaced, values };
  return values;
}

/** The words of a text as pdfkit's wrapper takes them (LineWrapper.eachWord). */
export function wordsOf(text: string): Words {
  const ends: number[] = [];
  const required: boolean[] = [];
  const breaker = new LineBreaker(text);
  for (let bk = breaker.nextBreak(); bk; bk = breaker.nextBreak()) {
    ends.push(bk.position);
    required.push(bk.required);
  }
  return { text, ends, required, plain: !text.includes('\u00AD') };
}

const float = new Float32Array(1);
const floatBits = new Uint32Array(float.buffer);

/** pdfkit's PDFNumber: the nearest float32 at or below n's magnitude (widths are kept as float32 values). */
export function pdfNumber(n: number): number {
  const rounded = Math.fround(n);
  if (rounded <= n) return rounded;
  float[0] = n;
  floatBits[0] = n <= 0 ? floatBits[0]! + 1 : floatBits[0]! - 1;
  return float[0]!;
}

/** The part of pdfkit's embedded font that widths come from. */
export interface WidthFont {
  layout(text: string, features: unknown, onlyWidth: true): { advanceWidth: number };
}

/** Each font's word advances (in thousandths of the size), as pdfkit's font layout sums them. */
const advances = new WeakMap<object, Map<string, number>>();

/** The advances kept for a font. */
export function advancesOf(font: WidthFont): Map<string, number> {
  let known = advances.get(font);
  if (known === undefined) {
    known = new Map();
    advances.set(font, known);
  }
  return known;
}

/**
 * What pdfkit's doc.widthOfString(text) gives in `font` at `size` with no options (no character spacing, horizontal
 * scaling 100), the text's advance kept per font.
 */
export function widthOfString(font: WidthFont, size: number, text: string, known: Map<string, number> = advancesOf(font)): number {
  let advance = known.get(text);
  if (advance === undefined) {
    advance = font.layout(text, undefined, true).advanceWidth;
    known.set(text, advance);
  }
  // EmbeddedFont.widthOfString, then doc.widthOfString's spacing and scaling, in pdfkit's order.
  const fontWidth = advance * (size / 1000);
  return ((fontWidth + 0 * (text.length - 1)) * 100) / 100;
}

/**
 * The width pdfkit's wrapper gives a word in `font` at `size` (LineWrapper.wordWidth with no character or word
 * spacing and horizontal scaling 100: doc.widthOfString, then PDFNumber).
 */
export function wordWidth(font: WidthFont, size: number, word: string, known: Map<string, number> = advancesOf(font)): number {
  return pdfNumber(widthOfString(font, size, word, known) + 0 + 0);
}

/**
 * The lines pdfkit's wrapper makes of `words` in a line `width` wide, the words' widths given; undefined
 * when the text needs what only pdfkit's wrapper does (a word wider than the line, a soft hyphen, no width).
 */
export function wrapWords(words: Words, width: number, widths: ArrayLike<number>): WrappedLine[] | undefined {
  if (!words.plain || !(width > 0)) return undefined;
  // LineWrapper's line width: horizontal scaling 100, one column, the column gap of 18 times no other column.
  const lineWidth = ((width * 100) / 100 - 18 * (1 - 1)) / 1;
  const lines: WrappedLine[] = [];
  const { text, ends, required } = words;
  // The line so far (pdfkit's buffer) is always a run of whole words: text.slice(from, to).
  let from = 0;
  let to = 0;
  let textWidth = 0;
  let wc = 0;
  let spaceLeft = lineWidth;
  const emitLine = (): void => {
    lines.push({ text: text.slice(from, to), textWidth: textWidth + 0 * (wc - 1), wordCount: wc, lineWidth });
  };
  for (let i = 0; i < ends.length; i++) {
    const start = i === 0 ? 0 : ends[i - 1]!;
    const end = ends[i]!;
    const w = widths[i]!;
    if (w > lineWidth + 0) return undefined;
    if (i === 0 || required[i - 1]) spaceLeft = lineWidth;
    const fits = w <= spaceLeft;
    if (fits) {
      if (from === to) from = start;
      to = end;
      textWidth += w;
      wc++;
    }
    if (required[i] || !fits) {
      if (required[i] && w > spaceLeft) {
        emitLine();
        from = start;
        to = end;
        textWidth = w;
        wc = 1;
      }
      emitLine();
      if (required[i]) {
        spaceLeft = lineWidth;
        from = to = end;
        textWidth = 0;
        wc = 0;
      } else {
        spaceLeft = lineWidth - w;
        from = start;
        to = end;
        textWidth = w;
        wc = 1;
      }
    } else {
      spaceLeft -= w;
    }
  }
  if (wc > 0) emitLine();
  return lines;
}

/** Each font's advances with OpenType features set, by the features and the text. */
const featuredAdvances = new WeakMap<object, Map<string, number>>();

/**
 * The width pdfkit's wrapper gives a word set with character spacing and OpenType features (as SPACED_CAPS sets it),
 * horizontal scaling 100: pdfkit shapes the word whole with the features (EmbeddedFont.layout), adds the spacing
 * between its characters (doc.widthOfString) and once more after it (LineWrapper.wordWidth), then rounds (PDFNumber).
 */
export function spacedWordWidth(font: WidthFont, size: number, word: string, characterSpacing: number, features: object): number {
  let known = featuredAdvances.get(font);
  if (known === undefined) {
    known = new Map();
    featuredAdvances.set(font, known);
  }
  const key = `${JSON.stringify(features)}\u0000${word}`;
  let advance = known.get(key);
  if (advance === undefined) {
    advance = font.layout(word, features, true).advanceWidth;
    known.set(key, advance);
  }
  const spacing = (characterSpacing * 100) / 100;
  const fontWidth = advance * (size / 1000);
  return pdfNumber(((fontWidth + spacing * (word.length - 1)) * 100) / 100 + spacing + 0);
}
