/**
 * The layout engine of the PDF: a cursor on the page, text measured before it is drawn, blocks flowed onto pages,
 * and the general blocks (headings, paragraphs, ruled boxes, bulleted lists, figures, space).
 */
import SVGtoPDF from 'svg-to-pdfkit';
import { drawChart } from '../chart-pdf.js';
import { chartDrawing } from '../chart-runtime.js';
import { FONT_NAME, fontFor, type Face } from '../fonts.js';
import { writeLine, type Spacing } from './fragment.js';
import { advancesOf, pdfNumber, spacedWordWidth, widthOfString, wordsOf, wordWidth, wordWidths, wrapWords, type WidthFont, type WrappedLine, type Words } from './wrap.js';
import {
  COLOR, CONTENT_BOTTOM, CONTENT_WIDTH, CONTINUATION_HEIGHT, LINE_GAP, MARGIN, SPACED_CAPS, PARA_GAP, SIZE, SLACK, svgSize,
  type Block, type Doc, type Struct,
} from './style.js';

/**
 * A text measured in one face, size, width and line gap: its height, how many lines it wraps into, and the lines until
 * it is drawn (a text drawn again is wrapped again: the lines come out the same, and most texts are drawn once).
 */
interface Measured {
  face: Face;
  size: number;
  width: number;
  lineGap: number;
  height: number;
  count: number;
  lines: WrappedLine[] | undefined;
}

/** The parts of pdfkit's text machinery that measuring once and drawing from the measurement uses. */
interface TextInternals {
  _font: ({ name: string } & WidthFont) | null;
  page: { maxY(): number };
  _fontSize: number;
  _lineGap: number;
  _initOptions(x: number, y: number, options: Record<string, unknown>): Record<string, unknown>;
  _initOptions(options: Record<string, unknown>): Record<string, unknown>;
  _text(
    text: string,
    x: number,
    y: number,
    options: Record<string, unknown>,
    line: (text: string, options: { textWidth: number; wordCount: number; lineWidth: number }) => void,
  ): void;
  _fragment(text: string, x: number, y: number, options: Record<string, unknown>): void;
}

/** The PostScript name of a face, which pdfkit keeps as the name of the font in use. */
function postscriptName(face: Face): string {
  return (fontFor(face) as unknown as { postscriptName: string }).postscriptName;
}

/** How many measured texts and texts' words Layout keeps before forgetMeasured lets them go. */
const FORGET_AFTER = 4000;

export class Layout {
  readonly doc: Doc;
  /** Measured texts by their text (see measure), with the text's words once it has been wrapped by wrapWords. */
  private readonly measured = new Map<string, Measured[]>();
  private readonly wordsByText = new Map<string, Words>();
  /** Where blocks start on the current page (below a continuation line, when there is one). */
  private pageTop = MARGIN.top;
  /**
   * While set, a page started inside a claim opens with this small line (e.g. "CLAIM X (CONTINUED)"), drawn as page
   * furniture: the claim's heading is already in the structure tree.
   */
  continuation: string | undefined;
  constructor(doc: Doc) {
    this.doc = doc;
  }

  get y(): number {
    return this.doc.y;
  }
  set y(v: number) {
    this.doc.y = v;
  }

  remaining(): number {
    return CONTENT_BOTTOM - SLACK - this.doc.y;
  }

  atTop(): boolean {
    return this.doc.y <= this.pageTop + 0.5;
  }

  newPage(): void {
    this.doc.addPage();
    this.doc.x = MARGIN.left;
    this.doc.y = MARGIN.top;
    this.pageTop = MARGIN.top;
    if (this.continuation) {
      const text = this.continuation;
      this.artifact(() => {
        this.setFont('bold', SIZE.small, COLOR.muted);
        this.textLine(text, 'bold', SIZE.small, MARGIN.left, MARGIN.top, { width: CONTENT_WIDTH, spaced: true, lineBreak: false });
      });
      this.pageTop = MARGIN.top + CONTINUATION_HEIGHT;
      this.doc.y = this.pageTop;
    }
  }

  ensure(height: number): void {
    if (height > this.remaining() && !this.atTop()) this.newPage();
  }

  setFont(face: Face, size: number, color: string = COLOR.ink): void {
    this.doc.font(FONT_NAME[face]).fontSize(size).fillColor(color);
  }

  /**
   * doc.widthOfString(text) in a face and size, which it leaves set as the current font, as doc.font and fontSize do;
   * each text's advance is kept (wrap.ts), as labels and values are measured for every layout of a claim.
   */
  widthOfString(text: string, face: Face, size: number): number {
    const doc = this.doc.font(FONT_NAME[face]).fontSize(size);
    return widthOfString((doc as unknown as TextInternals)._font!, size, text);
  }

  textHeight(text: string, face: Face, size: number, width: number, lineGap = LINE_GAP): number {
    return this.measure(text, face, size, width, lineGap).height;
  }

  /**
   * A text wrapped to `width` in a face and size: its height and its lines. Blocks are measured several times (to
   * fit, to break, to draw) and then drawn: the same text in the same face, size, width and line gap always wraps the
   * same way, so each is wrapped once, by pdfkit's own line wrapper (as heightOfString does it), and the lines it
   * gives are kept for drawing (see drawText).
   */
  private measure(text: string, face: Face, size: number, width: number, lineGap: number): Measured {
    const known = this.measurement(text, face, size, width, lineGap);
    if (known !== undefined) return known;
    const doc = this.doc;
    doc.font(FONT_NAME[face]).fontSize(size);
    const internals = doc as unknown as TextInternals;
    // What heightOfString does, keeping each line and its measures as the wrapper hands them over.
    const { x, y } = doc;
    const gap = lineGap || internals._lineGap || 0;
    const lines = this.linesOf(text, size, width);
    for (let i = 0; i < lines.length; i++) doc.y += doc.currentLineHeight(true) + gap;
    const m: Measured = { face, size, width, lineGap, height: doc.y - y, count: lines.length, lines };
    doc.x = x;
    doc.y = y;
    const list = this.measured.get(text);
    if (list === undefined) this.measured.set(text, [m]);
    else list.push(m);
    return m;
  }

  /**
   * The lines pdfkit's wrapper makes of `text` in the current font at `size` in a line `width` wide: from wrap.ts, or
   * from pdfkit's wrapper itself for a text only it wraps as it does (as heightOfString runs it).
   */
  private linesOf(text: string, size: number, width: number): WrappedLine[] {
    const lines = this.wrap(text, size, width);
    if (lines !== undefined) return lines;
    const doc = this.doc;
    const internals = doc as unknown as TextInternals;
    const { x, y } = doc;
    const options = internals._initOptions({ width });
    options.height = Infinity;
    const out: WrappedLine[] = [];
    internals._text(text, x, y, options, (line, o) => {
      out.push({ text: line, textWidth: o.textWidth, wordCount: o.wordCount, lineWidth: o.lineWidth });
    });
    doc.x = x;
    doc.y = y;
    return out;
  }

  /** A text's words (wordsOf), found once whatever width, face or spacing it is wrapped in. */
  private wordsOfText(text: string): Words {
    let words = this.wordsByText.get(text);
    if (words === undefined) {
      words = wordsOf(text);
      this.wordsByText.set(text, words);
    }
    return words;
  }

  /**
   * The lines pdfkit's wrapper would make of `text` in the current font at `size` in a line `width` wide (wrap.ts), or
   * undefined for a text only pdfkit's wrapper wraps as it does.
   */
  private wrap(text: string, size: number, width: number): WrappedLine[] | undefined {
    const font = (this.doc as unknown as TextInternals)._font;
    if (!font) return undefined;
    const words = this.wordsOfText(text);
    const known = advancesOf(font);
    return wrapWords(words, width, wordWidths(words, font, size, false, (word) => wordWidth(font, size, word, known)));
  }

  /**
   * Forget the texts measured so far, once there are many: called between claims, when every block measured has been
   * drawn. Kept for the whole pack, the measurements of every claim's texts grew with the number of claims (and the
   * collector's work on them with it); a text measured again wraps into the same lines.
   */
  forgetMeasured(): void {
    if (this.measured.size + this.wordsByText.size < FORGET_AFTER) return;
    this.measured.clear();
    this.wordsByText.clear();
  }

  /** The measurement of this text in this face, size, width and line gap, if it has been measured. */
  private measurement(text: string, face: Face, size: number, width: number, lineGap: number): Measured | undefined {
    return this.measured.get(text)?.find((m) => m.face === face && m.size === size && m.width === width && m.lineGap === lineGap);
  }

  /**
   * Draw `text` at (x, y) wrapped to `width`, in the face and size already set (with setFont), as doc.text does with
   * { width, lineGap }: from the lines kept when it was measured, without wrapping it again. A text not measured in
   * this face, size, width and gap, or one whose lines would reach the foot of the page (where pdfkit would move on
   * to a new page), is handed to doc.text.
   */
  drawText(text: string, face: Face, size: number, x: number, y: number, width: number, lineGap: number): void {
    const doc = this.doc;
    const internals = doc as unknown as TextInternals;
    const m = this.measurement(text, face, size, width, lineGap);
    const step = doc.currentLineHeight(true) + ((lineGap || internals._lineGap) || 0);
    const lineHeight = doc.currentLineHeight(true);
    const bottom = doc.page.height - doc.page.margins.bottom - 1;
    let fits = m !== undefined && internals._fontSize === size && internals._font?.name === postscriptName(face);
    if (fits && m) {
      // pdfkit checks before the first line and after each line whether the next would pass the foot of the page.
      let at = y;
      if (at + lineHeight > bottom) fits = false;
      for (let i = 0; fits && i < m.count; i++) {
        at += step;
        if (at + lineHeight > bottom) fits = false;
      }
    }
    if (!fits || !m) {
      doc.text(text, x, y, { width, lineGap });
      return;
    }
    // Where doc.text starts (its _initOptions moves the cursor there); a line writeLine cannot write goes to pdfkit's
    // _fragment with the options doc.text would give it.
    doc.x = x;
    doc.y = y;
    let options: Record<string, unknown> | undefined;
    const lines = m.lines ?? this.linesOf(text, size, width);
    m.lines = undefined;
    for (const line of lines) {
      if (!writeLine(doc, line.text, doc.x, doc.y)) {
        options ??= internals._initOptions({ width, lineGap });
        options.textWidth = line.textWidth;
        options.wordCount = line.wordCount;
        options.lineWidth = line.lineWidth;
        internals._fragment(line.text, doc.x, doc.y, options);
      }
      doc.y += step;
    }
    doc.x = x;
  }

  /**
   * Draw a text that fits on one line, in the face and size already set (with setFont), as doc.text(text, x, y, {
   * width, lineGap, lineBreak, align, ...SPACED_CAPS }) draws it: wrapped as pdfkit's wrapper wraps it (into one line,
   * or it goes to doc.text), the line written by writeLine (at the right edge for align 'right', as pdfkit's
   * _fragment places it), the cursor left where doc.text leaves it. A text of several lines or none, one whose line
   * would pass the foot of the page (where doc.text moves on to a new page), a letter-spaced text set at the right,
   * and a line writeLine cannot write go to doc.text.
   */
  textLine(
    text: string,
    face: Face,
    size: number,
    x: number,
    y: number,
    opts: { width: number; lineGap?: number; lineBreak?: false; align?: 'right'; spaced?: boolean },
  ): void {
    const doc = this.doc;
    const internals = doc as unknown as TextInternals;
    const spacing: Spacing | undefined = opts.spaced ? SPACED_CAPS : undefined;
    const font = internals._font;
    const fallback = (): void => {
      doc.text(text, x, y, {
        width: opts.width,
        ...(spacing ?? {}),
        ...(opts.lineGap !== undefined ? { lineGap: opts.lineGap } : {}),
        ...(opts.lineBreak === false ? { lineBreak: false } : {}),
        ...(opts.align ? { align: opts.align } : {}),
      });
    };
    if (!font || internals._fontSize !== size || font.name !== postscriptName(face) || (spacing && opts.align)) return fallback();
    let lines: WrappedLine[] | undefined;
    if (spacing) {
      const words = this.wordsOfText(text);
      const { characterSpacing, features } = spacing;
      const widths = wordWidths(words, font, size, true, (word) => spacedWordWidth(font, size, word, characterSpacing, features));
      lines = wrapWords(words, opts.width, widths);
    } else lines = this.wrap(text, size, opts.width);
    const lineHeight = doc.currentLineHeight(true);
    const maxY = pdfNumber(internals.page.maxY());
    if (lines?.length !== 1 || y > maxY || y + lineHeight > maxY) return fallback();
    const line = lines[0]!;
    let at = x;
    if (opts.align === 'right') {
      const shown = line.text.replace(/\n/g, '').replace(/\s+$/, '');
      at += line.lineWidth - widthOfString(font, size, shown);
    }
    if (!writeLine(doc, line.text, at, y, 'top', spacing)) return fallback();
    doc.x = x;
    doc.y = y + (lineHeight + ((opts.lineGap || internals._lineGap) || 0));
  }

  /** Draw decoration (rules, shading, marks) as an Artifact so that assistive technology skips it. */
  artifact(draw: () => void): void {
    this.doc.markContent('Artifact');
    this.doc.save();
    draw();
    this.doc.restore();
    this.doc.endMarkedContent();
  }

  /** Lay blocks out in order under `parent`, moving to a new page where a block (with any kept heading) does not fit. */
  flow(blocks: Block[], parent: Struct): void {
    blocks.forEach((block, i) => {
      // A block kept with the next must fit whole (when its turn comes, it is checked as the head of its own chain);
      // the last block of the chain needs only its least height. So a heading over a paragraph kept with its source
      // line moves on with both, rather than staying alone at the foot of a page.
      let need = 0;
      let j = i;
      while (blocks[j]!.keepWithNext && blocks[j + 1]) {
        need += blocks[j]!.height();
        j++;
      }
      need += blocks[j]!.minHeight();
      this.ensure(need - (blocks[j]!.after ?? 0));
      block.draw(parent);
    });
  }

  // ---- Blocks ----

  heading(level: 'H1' | 'H2' | 'H3', text: string, opts: { size?: number; spaceAfter?: number; color?: string } = {}): Block {
    const size = opts.size ?? (level === 'H1' ? SIZE.title : level === 'H2' ? SIZE.h2 : SIZE.sub);
    const after = opts.spaceAfter ?? (level === 'H3' ? 4 : 10);
    const color = opts.color ?? (level === 'H3' ? COLOR.accent : COLOR.ink);
    const h = (): number => this.textHeight(text, 'bold', size, CONTENT_WIDTH, 1);
    return {
      keepWithNext: true,
      after,
      height: () => h() + after,
      minHeight: () => h() + after,
      draw: (parent) => {
        const top = this.y;
        parent.add(
          this.doc.struct(level, {}, () => {
            this.setFont('bold', size, color);
            this.drawText(text, 'bold', size, MARGIN.left, top, CONTENT_WIDTH, 1);
          }),
        );
        this.y = top + h() + after;
      },
    };
  }

  paragraph(
    text: string,
    opts: {
      face?: Face;
      size?: number;
      color?: string;
      spaceAfter?: number;
      indent?: number;
      tag?: string;
      /** Keep on the same page as the start of the next block (e.g. a method's text with its source line). */
      keepWithNext?: boolean;
    } = {},
  ): Block {
    const face = opts.face ?? 'regular';
    const size = opts.size ?? SIZE.body;
    const after = opts.spaceAfter ?? PARA_GAP;
    const indent = opts.indent ?? 0;
    const width = CONTENT_WIDTH - indent;
    const h = (): number => this.textHeight(text, face, size, width);
    return {
      ...(opts.keepWithNext ? { keepWithNext: true } : {}),
      after,
      height: () => h() + after,
      minHeight: () => Math.min(h(), 3 * (size * 1.4)) + after,
      draw: (parent) => {
        const top = this.y;
        parent.add(
          this.doc.struct(opts.tag ?? 'P', {}, () => {
            this.setFont(face, size, opts.color ?? COLOR.ink);
            this.drawText(text, face, size, MARGIN.left + indent, top, width, LINE_GAP);
          }),
        );
        this.y = Math.max(this.y, top + h()) + after;
      },
    };
  }

  /**
   * A box shaded across the text width with a coloured rule down its left edge, its content inset by `pad` on every
   * side (and by the rule on the left). `content` is given the width left for it and returns its height (up to the
   * gap below its last line, which the box leaves out) and how to draw it from its top-left corner. The shading is
   * drawn as an Artifact; the content's structure goes under the parent passed to the block.
   */
  ruledBox(
    style: { pad: number; rule: number; shade: string; ruleColor: string; after: number },
    content: (width: number) => { height: () => number; draw: (parent: Struct, x: number, y: number) => void },
  ): Block {
    const { pad, rule, after } = style;
    const inner = content(CONTENT_WIDTH - 2 * pad - rule);
    const h = (): number => inner.height() + 2 * pad - LINE_GAP;
    return {
      after,
      height: () => h() + after,
      minHeight: () => h() + after,
      draw: (parent) => {
        const top = this.y;
        const height = h();
        this.artifact(() => {
          this.doc.rect(MARGIN.left, top, CONTENT_WIDTH, height).fill(style.shade);
          this.doc.rect(MARGIN.left, top, rule, height).fill(style.ruleColor);
        });
        inner.draw(parent, MARGIN.left + rule + pad, top + pad);
        this.y = top + height + after;
      },
    };
  }

  /**
   * A bulleted list (L > LI > Lbl + LBody); the bullet glyph is drawn as a small vector dot. A list of up to three
   * items is kept whole on one page; a longer one may break after its second item, never leaving one item alone.
   */
  bullets(items: string[], opts: { size?: number } = {}): Block {
    const size = opts.size ?? SIZE.body;
    const indent = 14;
    const width = CONTENT_WIDTH - indent;
    const itemHeights = (): number[] => items.map((t) => this.textHeight(t, 'regular', size, width) + 3);
    return {
      after: 9,
      height: () => itemHeights().reduce((a, b) => a + b, 0) + 6,
      minHeight: () =>
        itemHeights()
          .slice(0, items.length <= 3 ? items.length : 2)
          .reduce((a, b) => a + b, 0) + 6,
      draw: (parent) => {
        const list = this.doc.struct('L');
        parent.add(list);
        const heights = itemHeights();
        items.forEach((text, i) => {
          const h = heights[i]!;
          // The last item never starts a page alone: the one before it moves with it.
          this.ensure(h + (i === items.length - 2 ? heights[i + 1]! : 0) - 3);
          const top = this.y;
          const li = this.doc.struct('LI');
          list.add(li);
          this.artifact(() => {
            this.doc.circle(MARGIN.left + 4, top + size * 0.72, 1.9).fill(COLOR.accent);
          });
          li.add(
            this.doc.struct('LBody', {}, () => {
              this.setFont('regular', size);
              this.drawText(text, 'regular', size, MARGIN.left + indent, top, width, LINE_GAP);
            }),
          );
          this.y = top + h;
        });
        list.end();
        this.y += 6;
      },
    };
  }

  /** A chart drawn as vectors from SVG, tagged as a Figure with its alt text and bounding box. */
  figure(svg: string, alt: string, opts: { spaceAfter?: number } = {}): Block {
    const { width, height } = svgSize(svg);
    const scale = Math.min(1, CONTENT_WIDTH / width);
    const w = width * scale;
    const h = height * scale;
    const after = opts.spaceAfter ?? 14;
    return {
      after,
      height: () => h + after,
      minHeight: () => h + after,
      draw: (parent) => {
        const top = this.y;
        const x = MARGIN.left + (CONTENT_WIDTH - w) / 2;
        parent.add(
          this.doc.struct('Figure', { alt, bbox: [x, top, x + w, top + h], placement: 'Block' }, () => {
            const drawing = chartDrawing(svg);
            if (drawing) return drawChart(this.doc, drawing, x, top, scale);
            SVGtoPDF(this.doc, svg, x, top, {
              width: w,
              height: h,
              assumePt: true,
              fontCallback: (_family, bold, italic) =>
                bold ? FONT_NAME.bold : italic ? FONT_NAME.italic : FONT_NAME.regular,
              warningCallback: (message) => {
                throw new Error(`Chart SVG could not be drawn: ${message}`);
              },
            });
          }),
        );
        this.y = top + h + after;
      },
    };
  }

  /** Vertical space. */
  space(points: number): Block {
    return {
      height: () => points,
      minHeight: () => 0,
      draw: () => {
        this.y = Math.min(this.y + points, CONTENT_BOTTOM);
      },
    };
  }
}

/** Height of a run of blocks, less the blank space after the last one. */
export function blocksHeight(blocks: Block[]): number {
  return blocks.reduce((a, b) => a + b.height(), 0) - (blocks.at(-1)?.after ?? 0);
}
