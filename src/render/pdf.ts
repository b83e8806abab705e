/**
 * The evidence pack as a PDF: layout only. Every sentence and number comes ready-made in the PackModel.
 *
 * Properties the committee (and anyone checking the pack) can rely on:
 * - Deterministic: the info dates are fixed (from options or a fixed epoch), so two builds are byte-identical.
 * - Tagged PDF 1.7 (ISO 32000-1, section 14.8): a structure tree in reading order (H1/H2/H3, P, Table/TR/TH/TD,
 *   L/LI/LBody, Figure with alt text), page furniture (header, footer, rules, shading, verdict marks) marked as
 *   Artifact, document language en-GB and the title shown in the viewer's title bar.
 * - Bookmarks for every main section and every claim.
 * - Nothing overflows: every block is measured with the same font before it is drawn, moved to a new page when it
 *   does not fit, and tables repeat their header row on each page they continue on.
 */
import { createHash } from 'node:crypto';
import PDFDocument from 'pdfkit';
import SVGtoPDF from 'svg-to-pdfkit';
import type { ChartData, ClaimSection, PackModel, VerdictKind } from './model.js';
import { FONT_NAME, fontBytes, type Face } from './fonts.js';
import { chartSvg, MIN_CHART_HEIGHT } from './charts.js';

type Doc = PDFKit.Document;
type Struct = PDFKit.StructureElement;

export interface RenderOptions {
  /** Date written into the PDF info dictionary; defaults to a fixed epoch so that builds repeat byte for byte. */
  createdAt?: Date;
}

/** The fixed date used when no creation date is given (a build must not depend on the clock). */
export const FIXED_EPOCH = new Date(Date.UTC(2000, 0, 1, 0, 0, 0));

// ---- Page geometry (points; A4 is 595.28 x 841.89) ----
const PAGE = { width: 595.28, height: 841.89 };
const MARGIN = { top: 58, bottom: 56, left: 66, right: 66 };
const CONTENT_WIDTH = PAGE.width - MARGIN.left - MARGIN.right;
const CONTENT_BOTTOM = PAGE.height - MARGIN.bottom;
/** Slack kept under every block so that rounding in line heights can never push text past the margin. */
const SLACK = 2;
/** Room taken at the top of a page by the line naming the claim that continues there. */
const CONTINUATION_HEIGHT = 22;
/** Height available for blocks on an empty page. */
const PAGE_ROOM = CONTENT_BOTTOM - SLACK - MARGIN.top;

// ---- Typography: one accent colour, body 10.5 pt, headings 16 / 13 pt ----
const COLOR = {
  ink: '#1d2733',
  muted: '#5b6673',
  accent: '#1f4e8c',
  rule: '#cfd5dc',
  shade: '#f1f4f8',
  /** Notices: an amber rule and a warm shade, with dark ink for the label (contrast above 7:1 on the shade). */
  notice: '#c4620f',
  noticeShade: '#fbf1e6',
  noticeInk: '#7a3a05',
} as const;
const SIZE = { title: 24, h2: 16, h3: 13, sub: 10.5, body: 10.5, table: 9.5, small: 8.5, furniture: 8 } as const;
const LINE_GAP = 2.2;
const PARA_GAP = 8;
/** The verdict badge: bold word beside a verdict mark in an outlined box. */
const BADGE = { size: 11, padX: 9, height: 22 } as const;
/** Width of the label column in a claim's tables ("Null hypothesis", "Test statistic"). */
const NUMBER_LABEL_WIDTH = 130;
/** Space between two claims that share a page (a rule is drawn in it). */
const CLAIM_GAP = 24;

/** Verdict marks: a shape for each verdict, so the verdict never rests on colour alone. */
export const MARK_DESCRIPTION: Record<VerdictKind, string> = {
  supported: 'filled circle',
  'not-supported': 'hollow circle',
  opposite: 'downward triangle',
  'too-little-data': 'dash',
  estimate: 'diamond',
};

interface Cell {
  text: string;
  /** A second, small muted line under the text (e.g. a claim's id under its statement). */
  sub?: string;
  face?: Face;
  mark?: VerdictKind;
}

interface Column {
  header: string;
  width: number;
  face?: Face;
}

/** A unit of layout: measured first, then drawn where it fits. */
interface Block {
  /** Full height including the space after it. */
  height(): number;
  /** Height that must fit on the current page before the block may start (tables: header plus first row). */
  minHeight(): number;
  /** Blank space at the end of height(), which may fall below the last line of a page. */
  after?: number;
  /** Keep this block on the same page as the start of the next one (headings). */
  keepWithNext?: boolean;
  draw(parent: Struct): void;
}

class Layout {
  readonly doc: Doc;
  /** Measured text heights (see textHeight). */
  private readonly heights = new Map<string, number>();
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
        this.doc.text(text, MARGIN.left, MARGIN.top, { width: CONTENT_WIDTH, characterSpacing: 0.8, lineBreak: false });
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

  textHeight(text: string, face: Face, size: number, width: number, lineGap = LINE_GAP): number {
    this.doc.font(FONT_NAME[face]).fontSize(size);
    // Blocks are measured several times (to fit, to break, to draw): the same text in the same face, size and width
    // always has the same height, so each is measured once.
    const key = `${face}\u0000${size}\u0000${width}\u0000${lineGap}\u0000${text}`;
    let h = this.heights.get(key);
    if (h === undefined) {
      h = this.doc.heightOfString(text, { width, lineGap });
      this.heights.set(key, h);
    }
    return h;
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
      let need = block.minHeight();
      let j = i;
      while (blocks[j]?.keepWithNext && blocks[j + 1]) {
        need += blocks[j + 1]!.minHeight();
        j++;
      }
      if (j > i) need = need - block.minHeight() + block.height();
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
            this.doc.text(text, MARGIN.left, top, { width: CONTENT_WIDTH, lineGap: 1 });
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
            this.doc.text(text, MARGIN.left + indent, top, { width, lineGap: LINE_GAP });
          }),
        );
        this.y = Math.max(this.y, top + h()) + after;
      },
    };
  }

  /** The verdict paragraph on a shaded panel with an accent bar at its left edge. */
  panel(text: string, opts: { pad?: number; spaceAfter?: number } = {}): Block {
    return this.ruledBox(
      { pad: opts.pad ?? 9, rule: 3, shade: COLOR.shade, ruleColor: COLOR.accent, after: opts.spaceAfter ?? 12 },
      (width) => ({
        height: () => this.textHeight(text, 'regular', SIZE.body, width),
        draw: (parent, x, y) => {
          parent.add(
            this.doc.struct('P', {}, () => {
              this.setFont('regular', SIZE.body);
              this.doc.text(text, x, y, { width, lineGap: LINE_GAP });
            }),
          );
        },
      }),
    );
  }

  /**
   * A box shaded across the text width with a coloured rule down its left edge, its content inset by `pad` on every
   * side (and by the rule on the left). `content` is given the width left for it and returns its height (up to the
   * gap below its last line, which the box leaves out) and how to draw it from its top-left corner. The shading is
   * drawn as an Artifact; the content's structure goes under the parent passed to the block.
   */
  private ruledBox(
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
              this.doc.text(text, MARGIN.left + indent, top, { width, lineGap: LINE_GAP });
            }),
          );
          this.y = top + h;
        });
        list.end();
        this.y += 6;
      },
    };
  }

  /** A small vector mark for a verdict, centred at (cx, cy), radius about r. */
  drawMark(kind: VerdictKind, cx: number, cy: number, r = 4): void {
    const d = this.doc;
    d.lineWidth(1.3);
    switch (kind) {
      case 'supported':
        d.circle(cx, cy, r).fill(COLOR.accent);
        break;
      case 'not-supported':
        d.circle(cx, cy, r - 0.6).stroke(COLOR.accent);
        break;
      case 'opposite':
        d.polygon([cx - r - 0.4, cy - r + 0.8], [cx + r + 0.4, cy - r + 0.8], [cx, cy + r + 0.6]).fill(COLOR.accent);
        break;
      case 'too-little-data':
        d.rect(cx - r, cy - 1.2, 2 * r, 2.4).fill(COLOR.accent);
        break;
      case 'estimate':
        d.polygon([cx, cy - r - 0.6], [cx + r + 0.6, cy], [cx, cy + r + 0.6], [cx - r - 0.6, cy]).stroke(COLOR.accent);
        break;
    }
  }

  /** The verdict badge of a claim: outlined box with the mark and the verdict word. */
  badge(kind: VerdictKind, label: string): Block {
    return {
      height: () => BADGE.height + 12,
      minHeight: () => BADGE.height + 12,
      draw: (parent) => {
        const top = this.y;
        this.drawBadge(kind, label, MARGIN.left, top, parent);
        this.y = top + BADGE.height + 12;
      },
    };
  }

  badgeWidth(label: string): number {
    this.doc.font(FONT_NAME.bold).fontSize(BADGE.size);
    return Math.min(CONTENT_WIDTH, this.doc.widthOfString(label) + 2 * BADGE.padX + 16);
  }

  /** Draw a verdict badge with its top-left corner at (x, top); the word is a P under `parent`. */
  drawBadge(kind: VerdictKind, label: string, x: number, top: number, parent: Struct): void {
    const { size, padX, height } = BADGE;
    const w = this.badgeWidth(label);
    this.artifact(() => {
      this.doc.lineWidth(1).roundedRect(x, top, w, height, 3).stroke(COLOR.accent);
      this.drawMark(kind, x + padX + 4, top + height / 2, 4.2);
    });
    parent.add(
      this.doc.struct('P', {}, () => {
        this.setFont('bold', size, COLOR.accent);
        this.doc.text(label, x + padX + 14, top + (height - size * 1.36) / 2, { width: w - padX - 14, lineBreak: false });
      }),
    );
  }

  /**
   * A table with a header row repeated on each page it continues on. Rows never split across pages and cell text
   * always wraps inside its column.
   */
  table(
    columns: Column[],
    rows: Cell[][],
    opts: {
      header?: boolean;
      size?: number;
      spaceAfter?: number;
      padY?: number;
      /** Move the whole table to the next page rather than split it, when it fits on one page. */
      keepTogether?: boolean;
    } = {},
  ): Block {
    const showHeader = opts.header ?? true;
    const size = opts.size ?? SIZE.table;
    const padX = 5;
    const padY = opts.padY ?? 3.6;
    const after = opts.spaceAfter ?? 12;
    const total = columns.reduce((a, c) => a + c.width, 0);
    const scale = CONTENT_WIDTH / total;
    const widths = columns.map((c) => c.width * scale);
    const markRoom = 13;
    const cellTextWidth = (i: number, cell?: Cell): number => widths[i]! - 2 * padX - (cell?.mark ? markRoom : 0);
    const subHeight = (cell: Cell, i: number): number =>
      cell.sub ? 1.5 + this.textHeight(cell.sub, 'regular', SIZE.small, cellTextWidth(i, cell), 1.5) : 0;
    const rowHeight = (cells: Cell[], face?: Face): number =>
      Math.max(
        ...cells.map(
          (cell, i) =>
            this.textHeight(cell.text, face ?? cell.face ?? columns[i]!.face ?? 'regular', size, cellTextWidth(i, cell), 1.5) +
            subHeight(cell, i),
        ),
      ) +
      2 * padY -
      1.5;
    const headerCells: Cell[] = columns.map((c) => ({ text: c.header, face: 'bold' }));
    const headerHeight = (): number => (showHeader ? rowHeight(headerCells, 'bold') : 0);

    const drawRow = (cells: Cell[], top: number, height: number, tag: 'TH' | 'TD' | null, parent: Struct | null): void => {
      let x = MARGIN.left;
      cells.forEach((cell, i) => {
        const face = tag === 'TH' || tag === null ? 'bold' : (cell.face ?? columns[i]!.face ?? 'regular');
        let textX = x + padX;
        if (cell.mark) {
          const mark = cell.mark;
          const mx = x + padX + 4.5;
          this.artifact(() => this.drawMark(mark, mx, top + padY + size * 0.68, 3.8));
          textX += markRoom;
        }
        const drawMain = (): void => {
          this.setFont(face, size, tag === 'TH' || tag === null ? COLOR.muted : COLOR.ink);
          this.doc.text(cell.text, textX, top + padY, { width: cellTextWidth(i, cell), lineGap: 1.5 });
        };
        const drawSub = (): void => {
          if (!cell.sub) return;
          const subTop = top + padY + this.textHeight(cell.text, face, size, cellTextWidth(i, cell), 1.5) + 1.5;
          this.setFont('regular', SIZE.small, COLOR.muted);
          this.doc.text(cell.sub, textX, subTop, { width: cellTextWidth(i, cell), lineGap: 1.5 });
        };
        // In a table without a header row, a bold first column labels its row: tag it as a row header.
        const cellTag = tag === 'TD' && !showHeader && i === 0 && columns[0]!.face === 'bold' ? 'TH' : tag;
        if (parent && cellTag) {
          if (cell.sub) {
            // Text and its small second line are separate paragraphs, so they are read as two phrases.
            const el = this.doc.struct(cellTag);
            parent.add(el);
            el.add(this.doc.struct('P', {}, drawMain));
            el.add(this.doc.struct('P', {}, drawSub));
            el.end();
          } else {
            parent.add(this.doc.struct(cellTag, {}, drawMain));
          }
        } else {
          this.artifact(() => {
            drawMain();
            drawSub();
          });
        }
        x += widths[i]!;
      });
      this.artifact(() => {
        this.doc
          .lineWidth(tag === 'TD' ? 0.5 : 0.9)
          .moveTo(MARGIN.left, top + height)
          .lineTo(MARGIN.left + CONTENT_WIDTH, top + height)
          .stroke(tag === 'TD' ? COLOR.rule : COLOR.muted);
      });
    };

    return {
      after,
      height: () => headerHeight() + rows.reduce((a, r) => a + rowHeight(r), 0) + after,
      minHeight: () => {
        const whole = headerHeight() + rows.reduce((a, r) => a + rowHeight(r), 0) + after;
        return opts.keepTogether && whole <= PAGE_ROOM ? whole : headerHeight() + (rows[0] ? rowHeight(rows[0]) : 0) + after;
      },
      draw: (parent) => {
        const tableEl = this.doc.struct('Table');
        parent.add(tableEl);
        const hh = headerHeight();
        if (showHeader) {
          const top = this.y;
          const tr = this.doc.struct('TR');
          tableEl.add(tr);
          drawRow(headerCells, top, hh, 'TH', tr);
          this.y = top + hh;
        }
        rows.forEach((row, i) => {
          const h = rowHeight(row);
          // The last row never starts a page alone: the one before it moves with it.
          const need = h + (i === rows.length - 2 && rows.length > 2 ? rowHeight(rows[i + 1]!) : 0);
          if (need > this.remaining() && !this.atTop()) {
            this.newPage();
            if (showHeader) {
              // The repeated header is visual only: the structure tree already has the header row once.
              const top = this.y;
              drawRow(headerCells, top, hh, null, null);
              this.y = top + hh;
            }
          }
          const top = this.y;
          const tr = this.doc.struct('TR');
          tableEl.add(tr);
          drawRow(row, top, h, 'TD', tr);
          this.y = top + h;
        });
        tableEl.end();
        this.y += after;
      },
    };
  }

  /**
   * Notices beside a claim (e.g. the claim was edited after its results were seen): a shaded box with a rule at its
   * left edge and a small "Note" label, so it stands out without relying on colour.
   */
  notices(items: string[], opts: { spaceAfter?: number } = {}): Block {
    const labelH = SIZE.small * 1.4 + 2;
    return this.ruledBox(
      { pad: 8, rule: 4, shade: COLOR.noticeShade, ruleColor: COLOR.notice, after: opts.spaceAfter ?? 12 },
      (width) => {
        const itemHeights = (): number[] => items.map((t) => this.textHeight(t, 'regular', SIZE.body, width));
        return {
          height: () => labelH + itemHeights().reduce((a, b) => a + b + 4, 0) - 4,
          draw: (parent, x, top) => {
            const box = this.doc.struct('Div');
            parent.add(box);
            box.add(
              this.doc.struct('P', {}, () => {
                this.setFont('bold', SIZE.small, COLOR.noticeInk);
                this.doc.text(items.length > 1 ? 'NOTES' : 'NOTE', x, top, { width, characterSpacing: 0.8, lineBreak: false });
              }),
            );
            let y = top + labelH;
            const heights = itemHeights();
            items.forEach((text, i) => {
              box.add(
                this.doc.struct('P', {}, () => {
                  this.setFont('regular', SIZE.body);
                  this.doc.text(text, x, y, { width, lineGap: LINE_GAP });
                }),
              );
              y += heights[i]! + 4;
            });
            box.end();
          },
        };
      },
    );
  }

  /**
   * The numbers of a claim, set compactly: two label/value pairs side by side when both values are short, one pair
   * across the width otherwise. Labels are row headers (TH), values data cells (TD); rows never split over pages.
   */
  numberPairs(
    rows: Array<{ label: string; value: string }>,
    opts: { spaceAfter?: number; pair?: boolean; padY?: number } = {},
  ): Block {
    const size = SIZE.table;
    const padX = 5;
    const padY = opts.padY ?? 2.8;
    const gap = 1.2;
    const after = opts.spaceAfter ?? 4;
    const half = CONTENT_WIDTH / 2;
    const labelW = NUMBER_LABEL_WIDTH;
    const shortValueW = half - labelW;
    const fullValueW = CONTENT_WIDTH - labelW;
    const fitsShort = (r: { label: string; value: string }): boolean => {
      this.doc.font(FONT_NAME.regular).fontSize(size);
      return (
        this.doc.widthOfString(r.value) <= shortValueW - 2 * padX &&
        this.textHeight(r.label, 'regular', size, labelW - 2 * padX, gap) <= this.textHeight('A\nA', 'regular', size, 100, gap) + 0.5
      );
    };
    type Line = Array<{ label: string; value: string; valueW: number }>;
    const lines: Line[] = [];
    for (let i = 0; i < rows.length; i++) {
      const a = rows[i]!;
      const b = rows[i + 1];
      if (b && opts.pair !== false && fitsShort(a) && fitsShort(b)) {
        lines.push([
          { ...a, valueW: shortValueW },
          { ...b, valueW: shortValueW },
        ]);
        i++;
      } else {
        lines.push([{ ...a, valueW: fullValueW }]);
      }
    }
    const lineHeight = (line: Line): number =>
      Math.max(
        ...line.flatMap((c) => [
          this.textHeight(c.label, 'regular', size, labelW - 2 * padX, gap),
          this.textHeight(c.value, 'regular', size, c.valueW - 2 * padX, gap),
        ]),
      ) +
      2 * padY -
      gap;
    return {
      after,
      height: () => lines.reduce((a, l) => a + lineHeight(l), 0) + after,
      minHeight: () => (lines[0] ? lineHeight(lines[0]) : 0) + after,
      draw: (parent) => {
        const tableEl = this.doc.struct('Table');
        parent.add(tableEl);
        for (const line of lines) {
          const h = lineHeight(line);
          if (h > this.remaining() && !this.atTop()) this.newPage();
          const top = this.y;
          const tr = this.doc.struct('TR');
          tableEl.add(tr);
          let x = MARGIN.left;
          for (const cell of line) {
            const lx = x;
            tr.add(
              this.doc.struct('TH', {}, () => {
                this.setFont('regular', size, COLOR.muted);
                this.doc.text(cell.label, lx + padX, top + padY, { width: labelW - 2 * padX, lineGap: gap });
              }),
            );
            const vx = x + labelW;
            tr.add(
              this.doc.struct('TD', {}, () => {
                this.setFont('regular', size, COLOR.ink);
                this.doc.text(cell.value, vx + padX, top + padY, { width: cell.valueW - 2 * padX, lineGap: gap });
              }),
            );
            x += labelW + cell.valueW;
          }
          tr.end();
          this.artifact(() => {
            this.doc.lineWidth(0.5).moveTo(MARGIN.left, top + h).lineTo(MARGIN.left + CONTENT_WIDTH, top + h).stroke(COLOR.rule);
            if (line.length > 1) {
              this.doc.lineWidth(0.5).moveTo(MARGIN.left + half, top + 3).lineTo(MARGIN.left + half, top + h - 3).stroke(COLOR.rule);
            }
          });
          this.y = top + h;
        }
        tableEl.end();
        this.y += after;
      },
    };
  }

  /** A line of verdict marks with counts ("● Supported: 3"), wrapping when it is wider than the page. */
  tally(items: Array<{ kind: VerdictKind; label: string; count: number }>): Block {
    const size = SIZE.table;
    const markRoom = 13;
    const gapX = 14;
    const lineH = size * 1.5;
    const texts = items.map((it) => `${it.label}: ${it.count}`);
    const layout = (): Array<{ x: number; row: number }> => {
      this.doc.font(FONT_NAME.bold).fontSize(size);
      let x = 0;
      let row = 0;
      return texts.map((t) => {
        const w = markRoom + this.doc.widthOfString(t);
        if (x > 0 && x + w > CONTENT_WIDTH) {
          x = 0;
          row++;
        }
        const at = { x, row };
        x += w + gapX;
        return at;
      });
    };
    const h = (): number => ((layout().at(-1)?.row ?? 0) + 1) * lineH;
    return {
      after: 12,
      height: () => h() + 12,
      minHeight: () => h() + 12,
      draw: (parent) => {
        const top = this.y;
        const places = layout();
        this.artifact(() => {
          items.forEach((it, i) => {
            const p = places[i]!;
            this.drawMark(it.kind, MARGIN.left + p.x + 4.5, top + p.row * lineH + size * 0.7, 4);
          });
        });
        parent.add(
          this.doc.struct('P', {}, () => {
            texts.forEach((t, i) => {
              const p = places[i]!;
              this.setFont('bold', size, COLOR.ink);
              this.doc.text(t, MARGIN.left + p.x + markRoom, top + p.row * lineH, {
                lineBreak: false,
              });
            });
          }),
        );
        this.y = top + h() + 12;
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

/** Width and height of an SVG from its root attributes. */
function svgSize(svg: string): { width: number; height: number } {
  const root = /<svg\b[^>]*>/.exec(svg)?.[0] ?? '';
  const width = Number(/\swidth="([\d.]+)"/.exec(root)?.[1]);
  const height = Number(/\sheight="([\d.]+)"/.exec(root)?.[1]);
  if (!(width > 0 && height > 0)) throw new Error('Chart SVG has no width and height on its root element.');
  return { width, height };
}

function shortHash(sha256: string): string {
  return sha256.length > 12 ? sha256.slice(0, 12) : sha256;
}

function shorten(text: string, max: number): string {
  const t = text.replace(/\s+/g, ' ').trim();
  return t.length <= max ? t : `${t.slice(0, max - 1).trimEnd()}\u2026`;
}

/** Vertical spacing inside a claim's section (points). */
interface ClaimSpacing {
  head: number;
  notice: number;
  panelPad: number;
  panel: number;
  h3: number;
  compared: number;
  rowPadY: number;
  method: number;
  figure: number;
}

/** Outer height of a scatter or period chart that starts the second page of a claim too long for one page. */
const CONTINUED_CHART_HEIGHT = 270;

/** The usual spacing of a claim's section. */
const SPACING_NORMAL: ClaimSpacing = { head: 12, notice: 12, panelPad: 9, panel: 12, h3: 4, compared: 10, rowPadY: 2.8, method: 12, figure: 14 };
/** Closer spacing (same type sizes) for a claim that would otherwise run a little onto a second page. */
const SPACING_TIGHT: ClaimSpacing = { head: 8, notice: 8, panelPad: 7, panel: 9, h3: 3, compared: 6, rowPadY: 1.9, method: 7, figure: 8 };

function claimBlocks(
  L: Layout,
  claim: ClaimSection,
  svg: string | undefined,
  bookmarks: () => PDFKit.OutlineItem,
  sp: ClaimSpacing = SPACING_NORMAL,
): Block[] {
  const blocks: Block[] = [];
  // Heading: the "Claim C1" label with the verdict badge at the right of the same line, then the statement in the
  // user's words. The label and statement form one H2; the verdict word follows it in reading order.
  const label = `Claim ${claim.id}`.toUpperCase();
  const badgeW = (): number => L.badgeWidth(claim.verdictLabel);
  const labelWidth = (): number => CONTENT_WIDTH - badgeW() - 12;
  const labelH = (): number => Math.max(BADGE.height, L.textHeight(label, 'bold', SIZE.small, labelWidth(), 1));
  const statementHeight = (): number => L.textHeight(claim.statement, 'bold', SIZE.h3, CONTENT_WIDTH, 1.5);
  const headH = (): number => labelH() + 6 + statementHeight() + sp.head;
  blocks.push({
    keepWithNext: true,
    height: headH,
    minHeight: headH,
    draw: (parent) => {
      const top = L.y;
      bookmarks().addItem(`${claim.id}: ${shorten(claim.statement, 70)}`, { left: PAGE.width, top: top - 12 });
      // Measure first: measuring changes the current font, so it must not happen between setting a font and drawing.
      const lw = labelWidth();
      const labelTop = top + Math.max(0, (BADGE.height - L.textHeight(label, 'bold', SIZE.small, lw, 1)) / 2);
      const statementTop = top + labelH() + 6;
      parent.add(
        L.doc.struct('H2', {}, () => {
          L.setFont('bold', SIZE.small, COLOR.accent);
          L.doc.text(label, MARGIN.left, labelTop, { width: lw, characterSpacing: 0.8, lineGap: 1 });
          L.setFont('bold', SIZE.h3);
          L.doc.text(claim.statement, MARGIN.left, statementTop, { width: CONTENT_WIDTH, lineGap: 1.5 });
        }),
      );
      L.drawBadge(claim.verdict, claim.verdictLabel, MARGIN.left + CONTENT_WIDTH - badgeW(), top, parent);
      L.y = top + headH();
    },
  });
  // Lead with the answer: the verdict and its paragraph come first, then what was compared, then the numbers.
  if (claim.notices && claim.notices.length > 0) blocks.push(L.notices(claim.notices, { spaceAfter: sp.notice }));
  blocks.push(L.panel(claim.verdictText, { pad: sp.panelPad, spaceAfter: sp.panel }));
  blocks.push(L.heading('H3', 'What was compared and tested', { spaceAfter: sp.h3 }));
  blocks.push(
    L.numberPairs(
      [
        { label: 'Compared', value: claim.compared },
        { label: 'Null hypothesis', value: claim.hypotheses.null },
        { label: 'Alternative hypothesis', value: claim.hypotheses.alternative },
      ],
      { spaceAfter: sp.compared, pair: false, padY: sp.rowPadY },
    ),
  );
  if (claim.numbers.length > 0) {
    blocks.push(L.heading('H3', 'The numbers', { spaceAfter: sp.h3 }));
    blocks.push(L.numberPairs(claim.numbers, { spaceAfter: 4, padY: sp.rowPadY }));
  }
  // The method line reads as a note under the numbers it produced.
  blocks.push(L.paragraph(claim.methodLine, { face: 'italic', size: SIZE.small, color: COLOR.muted, spaceAfter: sp.method }));
  if (claim.chart && svg) blocks.push(L.figure(svg, claim.chart.alt, { spaceAfter: sp.figure }));
  if (claim.cautions.length > 0) {
    blocks.push(L.heading('H3', 'Cautions', { spaceAfter: sp.h3 }));
    blocks.push(L.bullets(claim.cautions, { size: SIZE.table }));
  }
  return blocks;
}

/**
 * Lay a claim out to fit one page when it can: first with the usual spacing, then with closer spacing (same type
 * sizes), then with closer spacing and a shorter chart (never below MIN_CHART_HEIGHT). A claim that fits none of
 * these keeps its usual spacing and full chart, and breaks between blocks (the chart and cautions move on together).
 */
async function fitClaim(
  L: Layout,
  claim: ClaimSection,
  svg: string | undefined,
  bookmarks: () => PDFKit.OutlineItem,
): Promise<{ blocks: Block[]; fits: boolean }> {
  const normal = claimBlocks(L, claim, svg, bookmarks, SPACING_NORMAL);
  if (blocksHeight(normal) <= PAGE_ROOM) return { blocks: normal, fits: true };
  const tight = claimBlocks(L, claim, svg, bookmarks, SPACING_TIGHT);
  const overflow = blocksHeight(tight) - PAGE_ROOM;
  if (overflow <= 0) return { blocks: tight, fits: true };
  if (claim.chart && svg) {
    const target = Math.floor(svgSize(svg).height - overflow - 1);
    if (target >= MIN_CHART_HEIGHT) {
      const shorter = await chartSvg(claim.chart.data, { height: target });
      const blocks = claimBlocks(L, claim, shorter, bookmarks, SPACING_TIGHT);
      if (blocksHeight(blocks) <= PAGE_ROOM) return { blocks, fits: true };
    }
  }
  // The chart then starts the claim's second page, where a scatter or a period line can have more height.
  if (claim.chart && svg && (claim.chart.data.kind === 'scatter' || claim.chart.data.kind === 'periods')) {
    const taller = await chartSvg(claim.chart.data, { height: CONTINUED_CHART_HEIGHT });
    return { blocks: claimBlocks(L, claim, taller, bookmarks, SPACING_NORMAL), fits: false };
  }
  return { blocks: normal, fits: false };
}

/** Height of a run of blocks, less the blank space after the last one. */
function blocksHeight(blocks: Block[]): number {
  return blocks.reduce((a, b) => a + b.height(), 0) - (blocks.at(-1)?.after ?? 0);
}

/** Render the evidence pack. Deterministic: the same model and options give the same bytes. */
export async function renderPdf(model: PackModel, options: RenderOptions = {}): Promise<Buffer> {
  if (!model.title.trim()) throw new Error('Pack model: the title is empty; a title is required for the PDF.');
  const created = options.createdAt ?? FIXED_EPOCH;
  if (Number.isNaN(created.getTime())) throw new Error('Render options: createdAt is not a valid date.');

  // Charts first (asynchronous), then all drawing in one synchronous pass.
  const svgs = new Map<string, string>();
  for (const claim of model.claims) {
    if (claim.chart) svgs.set(claim.id, await chartSvg(claim.chart.data as ChartData));
  }

  const doc = new PDFDocument({
    size: 'A4',
    margins: MARGIN,
    bufferPages: true,
    autoFirstPage: false,
    tagged: true,
    lang: 'en-GB',
    displayTitle: true,
    pdfVersion: '1.7',
    font: null,
    info: {
      Title: model.title,
      Author: model.organisation,
      Subject: model.description ?? 'Evidence pack',
      Creator: 'warrant',
      Producer: 'warrant',
      CreationDate: created,
      ModDate: created,
      // A digest of everything drawn: pdfkit derives the document ID from the info dictionary, so this makes the ID
      // follow the content (two different packs never share an ID; the same pack always gets the same one).
      ContentDigest: createHash('sha256').update(JSON.stringify(model)).digest('hex').slice(0, 32),
    },
  });
  for (const face of ['regular', 'bold', 'italic'] as const) doc.registerFont(FONT_NAME[face], fontBytes(face));
  const chunks: Buffer[] = [];
  doc.on('data', (c: Buffer) => chunks.push(c));
  const finished = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });

  const L = new Layout(doc);
  L.newPage();
  const root = doc.struct('Document');
  doc.addStructure(root);
  const bookmark = (title: string): PDFKit.OutlineItem => doc.outline.addItem(title, { left: PAGE.width, top: L.y - 12 });

  // ---- Cover ----
  const cover = doc.struct('Sect');
  root.add(cover);
  L.y = MARGIN.top + 90;
  bookmark('Cover');
  const coverBlocks: Block[] = [
    L.paragraph('EVIDENCE PACK', { face: 'bold', size: SIZE.small, color: COLOR.accent, spaceAfter: 6 }),
    L.heading('H1', model.title, { spaceAfter: 8 }),
    L.paragraph(model.organisation, { size: SIZE.h3, color: COLOR.muted, spaceAfter: 18 }),
  ];
  if (model.description) coverBlocks.push(L.paragraph(model.description, { spaceAfter: 18 }));
  coverBlocks.push(
    L.table(
      [
        { header: '', width: 150, face: 'bold' },
        { header: '', width: 317 },
      ],
      [
        [{ text: 'Date' }, { text: model.date }],
        [{ text: 'Confidence level' }, { text: model.confidenceText }],
        [{ text: 'Adjustment for many claims' }, { text: model.adjustmentText }],
        [{ text: 'Claims in this pack' }, { text: String(model.claims.length) }],
      ],
      { header: false, size: SIZE.body - 0.5, spaceAfter: 24 },
    ),
  );
  if (model.sources.length > 0) {
    coverBlocks.push(L.heading('H2', 'Data sources', { size: SIZE.h3, spaceAfter: 8 }));
    coverBlocks.push(
      L.table(
        [
          { header: 'Source', width: 150 },
          { header: 'File', width: 150 },
          { header: 'Rows', width: 55 },
          { header: 'SHA-256 (first 12)', width: 112 },
        ],
        model.sources.map((s) => [
          { text: s.description ? `${s.id}: ${s.description}` : s.id },
          { text: s.file },
          { text: s.rows.toLocaleString('en-GB') },
          { text: shortHash(s.sha256) },
        ]),
      ),
    );
  }
  L.flow(coverBlocks, cover);
  cover.end();

  // ---- Summary ----
  L.newPage();
  const summary = doc.struct('Sect');
  root.add(summary);
  bookmark('Summary');
  // At a glance: each verdict's mark, word and count, in the order a committee asks (holds up first).
  const tallyItems = (['supported', 'opposite', 'not-supported', 'too-little-data', 'estimate'] as const).flatMap((k) => {
    const rows = model.summary.filter((r) => r.verdict === k);
    return rows.length > 0 ? [{ kind: k, label: rows[0]!.verdictLabel, count: rows.length }] : [];
  });
  L.flow(
    [
      L.heading('H2', 'Summary'),
      L.paragraph(model.summaryIntro, { size: SIZE.table + 0.5, spaceAfter: 10 }),
      ...(tallyItems.length > 0 ? [L.tally(tallyItems)] : []),
      L.table(
        [
          { header: 'Claim', width: 210 },
          { header: 'Verdict', width: 128 },
          { header: 'Key figure', width: 129 },
        ],
        model.summary.map((r) => [
          { text: r.statement, sub: r.id },
          { text: r.verdictLabel, mark: r.verdict, face: 'bold' as const },
          { text: r.keyFigure },
        ]),
        { padY: 2.8 },
      ),
    ],
    summary,
  );
  summary.end();

  // ---- What changed since the previous pack: right after the summary, on from it when there is room ----
  if (model.changes) {
    const ch = model.changes;
    const heading = L.heading('H2', ch.heading);
    const blocks: Block[] = [heading, L.paragraph(ch.intro, { spaceAfter: 10 })];
    if (ch.verdicts.length > 0) {
      blocks.push(
        L.table(
          [
            { header: 'Claim', width: 196 },
            { header: 'Before', width: 84 },
            { header: 'After', width: 114 },
            { header: 'Why', width: 73 },
          ],
          ch.verdicts.map((v) => [{ text: v.claim }, { text: v.before }, { text: v.after, face: 'bold' as const }, { text: v.why }]),
        ),
      );
    }
    if (ch.notes.length > 0) blocks.push(L.bullets(ch.notes));
    if (!L.atTop()) L.y += 22;
    // The whole section moves to a new page when that keeps it on one page; else it starts here and runs on.
    const whole = blocksHeight(blocks);
    if (whole > L.remaining() && whole <= PAGE_ROOM) L.ensure(whole);
    else L.ensure(heading.height() + blocks[1]!.minHeight());
    const sect = doc.struct('Sect');
    root.add(sect);
    bookmark(shorten(ch.heading, 70));
    L.flow(blocks, sect);
    sect.end();
  }

  // ---- Claims: each on a new page unless it fits in the space left ----
  let claimsBookmark: PDFKit.OutlineItem | undefined;
  for (const claim of model.claims) {
    const { blocks } = await fitClaim(L, claim, svgs.get(claim.id), () => claimsBookmark!);
    if (claimsBookmark === undefined || blocksHeight(blocks) + CLAIM_GAP > L.remaining()) {
      L.newPage();
    } else {
      // A claim that fits below the previous one is set off by a rule.
      const y = L.y + CLAIM_GAP / 2 - 6;
      L.artifact(() => {
        doc.lineWidth(0.75).moveTo(MARGIN.left, y).lineTo(MARGIN.left + CONTENT_WIDTH, y).stroke(COLOR.rule);
      });
      L.y += CLAIM_GAP;
    }
    // The "Claims" bookmark points at the first claim; each claim's bookmark sits under it.
    claimsBookmark ??= doc.outline.addItem('Claims', { left: PAGE.width, top: L.y - 12, expanded: true });
    const sect = doc.struct('Sect');
    root.add(sect);
    L.continuation = `Claim ${claim.id} (continued)`.toUpperCase();
    L.flow(blocks, sect);
    L.continuation = undefined;
    sect.end();
  }

  // ---- Closing sections ----
  // The closing sections run on from one another: the first starts a page, the rest follow with a gap.
  let closingStarted = false;
  const closing = (title: string, blocks: Block[]): void => {
    if (blocks.length === 0) return;
    if (!closingStarted) L.newPage();
    else if (!L.atTop()) L.y += 22;
    closingStarted = true;
    const heading = L.heading('H2', title);
    L.ensure(heading.height() + blocks[0]!.minHeight());
    const sect = doc.struct('Sect');
    root.add(sect);
    bookmark(title);
    L.flow([heading, ...blocks], sect);
    sect.end();
  };
  closing('General cautions', model.generalCautions.length > 0 ? [L.bullets(model.generalCautions)] : []);
  closing(
    'Method notes',
    model.methods.flatMap((m) => [
      L.heading('H3', m.name),
      L.paragraph(m.text, { spaceAfter: 4, keepWithNext: true }),
      L.paragraph(`Source: ${m.source}`, { face: 'italic', size: SIZE.small, color: COLOR.muted, spaceAfter: 14 }),
    ]),
  );
  closing(
    'Glossary',
    model.glossary.length > 0
      ? [
          L.table(
            [
              { header: 'Term', width: 130, face: 'bold' },
              { header: 'Meaning', width: 337 },
            ],
            model.glossary.map((g) => [{ text: g.term }, { text: g.text }]),
            { size: SIZE.body - 0.5 },
          ),
        ]
      : [],
  );
  closing(
    'Reproducibility',
    model.reproducibility.length > 0
      ? [
          L.table(
            [
              { header: 'Item', width: 150, face: 'bold' },
              { header: 'Value', width: 317 },
            ],
            model.reproducibility.map((r) => [{ text: r.label }, { text: r.value }]),
            { keepTogether: true },
          ),
        ]
      : [],
  );

  // ---- Page furniture on every page, as Artifacts: title header from page 2, "Page N of M" footer ----
  const range = doc.bufferedPageRange();
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    const bottom = doc.page.margins.bottom;
    doc.page.margins.bottom = 0;
    doc.markContent('Artifact', { type: 'Pagination' });
    if (i > range.start) {
      doc.font(FONT_NAME.regular).fontSize(SIZE.furniture).fillColor(COLOR.muted);
      doc.text(shorten(model.title, 95), MARGIN.left, MARGIN.top - 30, { width: CONTENT_WIDTH, lineBreak: false });
      doc.lineWidth(0.5).moveTo(MARGIN.left, MARGIN.top - 16).lineTo(PAGE.width - MARGIN.right, MARGIN.top - 16).stroke(COLOR.rule);
    }
    doc.lineWidth(0.5).moveTo(MARGIN.left, PAGE.height - 42).lineTo(PAGE.width - MARGIN.right, PAGE.height - 42).stroke(COLOR.rule);
    doc.font(FONT_NAME.regular).fontSize(SIZE.furniture).fillColor(COLOR.muted);
    doc.text(shorten(model.organisation, 70), MARGIN.left, PAGE.height - 35, { width: CONTENT_WIDTH / 2, lineBreak: false });
    doc.text(`Page ${i - range.start + 1} of ${range.count}`, MARGIN.left + CONTENT_WIDTH / 2, PAGE.height - 35, {
      width: CONTENT_WIDTH / 2,
      align: 'right',
      lineBreak: false,
    });
    doc.endMarkedContent();
    doc.page.margins.bottom = bottom;
  }

  root.end();
  doc.end();
  return finished;
}
