/**
 * Tables: a general table whose header row repeats on each page it continues on, and the compact label/value pairs
 * of a claim's numbers.
 */
import { FONT_NAME, type Face } from '../fonts.js';
import type { Layout } from './layout.js';
import type { VerdictKind } from '../model.js';
import { BADGE_STYLE, badgeHeight, drawBadgeBox, drawMark } from './marks.js';
import {
  COLOR, CONTENT_WIDTH, MARGIN, NUMBER_LABEL_MAX, NUMBER_LABEL_WIDTH, PAGE_ROOM, SIZE,
  type Block, type Cell, type Column, type Struct,
} from './style.js';

/** One line block of a cell: its text and how it is set. */
interface Part {
  text: string;
  face: Face;
  size: number;
  color: string;
  /** Space above this part. */
  gap: number;
  badge?: VerdictKind;
}

/**
 * A table with a header row repeated on each page it continues on. Rows never split across pages and cell text
 * always wraps inside its column. A cell may be drawn as a verdict badge and carry further lines under its text;
 * a row may be shaded with a rule at its left edge (drawn as Artifacts) to give it weight.
 */
export function table(
  L: Layout,
  columns: Column[],
  rows: Cell[][],
  opts: {
    header?: boolean;
    size?: number;
    spaceAfter?: number;
    padY?: number;
    /** Move the whole table to the next page rather than split it, when it fits on one page. */
    keepTogether?: boolean;
    /** Per data row: a shade behind the row and a coloured rule at its left edge. */
    rowStyle?: Array<{ shade: string; rule: string } | undefined>;
    /** Type size of badges drawn in cells (defaults to the table's size). */
    badgeSize?: number;
  } = {},
): Block {
  const showHeader = opts.header ?? true;
  const size = opts.size ?? SIZE.table;
  const badgeSize = opts.badgeSize ?? size;
  const padX = 5;
  const padY = opts.padY ?? 3.6;
  const after = opts.spaceAfter ?? 12;
  const total = columns.reduce((a, c) => a + c.width, 0);
  const scale = CONTENT_WIDTH / total;
  const widths = columns.map((c) => c.width * scale);
  const markRoom = 13;
  const cellTextWidth = (i: number, cell?: Cell): number => widths[i]! - 2 * padX - (cell?.mark ? markRoom : 0);
  const parts = (cell: Cell, i: number, header: boolean): Part[] => {
    const face: Face = header ? 'bold' : (cell.face ?? columns[i]!.face ?? 'regular');
    const out: Part[] = [
      { text: cell.text, face, size, color: header ? COLOR.muted : (cell.color ?? COLOR.ink), gap: 0, ...(cell.badge ? { badge: cell.badge } : {}) },
    ];
    if (cell.sub) out.push({ text: cell.sub, face: 'regular', size: SIZE.small, color: COLOR.muted, gap: 1.5 });
    for (const m of cell.more ?? []) {
      out.push({ text: m.text, face: m.face ?? 'regular', size: m.size ?? size, color: m.color ?? COLOR.ink, gap: m.gap ?? 2 });
    }
    return out;
  };
  const partHeight = (p: Part, width: number): number =>
    p.badge ? badgeHeight(badgeSize) + 1.5 : L.textHeight(p.text, p.face, p.size, width, 1.5);
  const cellHeight = (cell: Cell, i: number, header: boolean): number =>
    parts(cell, i, header).reduce((a, p) => a + p.gap + partHeight(p, cellTextWidth(i, cell)), 0);
  // A row's height is asked for to fit the table, to break it and to draw it: worked out once per row.
  const rowHeights = new Map<Cell[], number>();
  const rowHeight = (cells: Cell[], header = false): number => {
    let h = rowHeights.get(cells);
    if (h === undefined) {
      h = Math.max(...cells.map((cell, i) => cellHeight(cell, i, header))) + 2 * padY - 1.5;
      rowHeights.set(cells, h);
    }
    return h;
  };
  const headerCells: Cell[] = columns.map((c) => ({ text: c.header, face: 'bold' }));
  const headerHeight = (): number => (showHeader ? rowHeight(headerCells, true) : 0);

  const drawRow = (
    cells: Cell[],
    top: number,
    height: number,
    tag: 'TH' | 'TD' | null,
    parent: Struct | null,
    style?: { shade: string; rule: string },
  ): void => {
    if (style) {
      L.artifact(() => {
        L.doc.rect(MARGIN.left, top, CONTENT_WIDTH, height).fill(style.shade);
        L.doc.rect(MARGIN.left, top, 3, height).fill(style.rule);
      });
    }
    let x = MARGIN.left;
    cells.forEach((cell, i) => {
      const header = tag === 'TH' || tag === null;
      let textX = x + padX + (style && i === 0 ? 2 : 0);
      if (cell.mark) {
        const mark = cell.mark;
        const mx = x + padX + 4.5;
        L.artifact(() => drawMark(L, mark, mx, top + padY + size * 0.68, 3.8));
        textX += markRoom;
      }
      const width = cellTextWidth(i, cell);
      const ps = parts(cell, i, header);
      const draws: Array<() => void> = [];
      let y = top + padY;
      for (const p of ps) {
        y += p.gap;
        const at = y;
        if (p.badge) {
          const kind = p.badge;
          // The badge's box is page furniture, drawn now (outside the cell's marked content); its word is the text.
          const box = drawBadgeBox(L, kind, p.text, textX, at, badgeSize, width);
          draws.push(() => {
            const bs = BADGE_STYLE[kind];
            L.setFont(bs.face, badgeSize, bs.ink);
            L.textLine(p.text, bs.face, badgeSize, box.textX, box.textY, { width: box.width + 2, lineBreak: false });
          });
        } else {
          draws.push(() => {
            L.setFont(p.face, p.size, p.color);
            L.drawText(p.text, p.face, p.size, textX, at, width, 1.5);
          });
        }
        y += partHeight(p, width);
      }
      // In a table without a header row, a bold first column labels its row: tag it as a row header.
      const cellTag = tag === 'TD' && !showHeader && i === 0 && columns[0]!.face === 'bold' ? 'TH' : tag;
      if (parent && cellTag) {
        if (draws.length > 1) {
          // Each line of a cell is its own paragraph, so they are read as separate phrases.
          const el = L.doc.struct(cellTag);
          parent.add(el);
          for (const d of draws) el.add(L.doc.struct('P', {}, d));
          el.end();
        } else {
          parent.add(L.doc.struct(cellTag, {}, draws[0]!));
        }
      } else {
        L.artifact(() => draws.forEach((d) => d()));
      }
      x += widths[i]!;
    });
    L.artifact(() => {
      L.doc
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
      const tableEl = L.doc.struct('Table');
      parent.add(tableEl);
      const hh = headerHeight();
      if (showHeader) {
        const top = L.y;
        const tr = L.doc.struct('TR');
        tableEl.add(tr);
        drawRow(headerCells, top, hh, 'TH', tr);
        L.y = top + hh;
      }
      rows.forEach((row, i) => {
        const h = rowHeight(row);
        // The last row never starts a page alone: the one before it moves with it.
        const need = h + (i === rows.length - 2 && rows.length > 2 ? rowHeight(rows[i + 1]!) : 0);
        if (need > L.remaining() && !L.atTop()) {
          L.newPage();
          if (showHeader) {
            // The repeated header is visual only: the structure tree already has the header row once.
            const top = L.y;
            drawRow(headerCells, top, hh, null, null);
            L.y = top + hh;
          }
        }
        const top = L.y;
        const tr = L.doc.struct('TR');
        tableEl.add(tr);
        drawRow(row, top, h, 'TD', tr, opts.rowStyle?.[i]);
        L.y = top + h;
      });
      tableEl.end();
      L.y += after;
    },
  };
}

/** Inner padding of a label/value cell (left and right). */
const PAIR_PAD_X = 5;

/**
 * Width of the label column of a claim's tables: as wide as the longest label needs, within
 * NUMBER_LABEL_WIDTH..NUMBER_LABEL_MAX, so that labels such as "p-value adjusted for 13 claims" stay on one line and
 * the four columns of paired rows never wrap a label. Tables of one claim share the widest of their widths.
 */
export function numberLabelWidth(L: Layout, labels: string[], face: Face = 'regular', size: number = SIZE.table): number {
  L.doc.font(FONT_NAME[face]).fontSize(size);
  const longest = Math.max(0, ...labels.map((l) => L.widthOfString(l, face, size)));
  return Math.min(NUMBER_LABEL_MAX, Math.max(NUMBER_LABEL_WIDTH, Math.ceil(longest + 2 * PAIR_PAD_X + 1)));
}

/**
 * The numbers of a claim, set compactly: two label/value pairs side by side when both values are short, one pair
 * across the width otherwise. Labels are row headers (TH), values data cells (TD); rows never split over pages.
 */
export function numberPairs(
  L: Layout,
  rows: Array<{ label: string; value: string }>,
  opts: { spaceAfter?: number; pair?: boolean; padY?: number; labelFace?: Face; labelWidth?: number; size?: number } = {},
): Block {
  const size = opts.size ?? SIZE.table;
  const padX = PAIR_PAD_X;
  const padY = opts.padY ?? 2.8;
  const gap = 1.2;
  const after = opts.spaceAfter ?? 4;
  const half = CONTENT_WIDTH / 2;
  const labelFace = opts.labelFace ?? 'regular';
  const labelW = opts.labelWidth ?? numberLabelWidth(L, rows.map((r) => r.label), labelFace, size);
  const shortValueW = half - labelW;
  const fullValueW = CONTENT_WIDTH - labelW;
  const fitsShort = (r: { label: string; value: string }): boolean => {
    const labelFits = L.widthOfString(r.label, labelFace, size) <= labelW - 2 * padX;
    return labelFits && L.widthOfString(r.value, 'regular', size) <= shortValueW - 2 * padX;
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
  const lineHeights = new Map<Line, number>();
  const lineHeight = (line: Line): number => {
    let h = lineHeights.get(line);
    if (h === undefined) {
      h =
        Math.max(
          ...line.flatMap((c) => [
            L.textHeight(c.label, labelFace, size, labelW - 2 * padX, gap),
            L.textHeight(c.value, 'regular', size, c.valueW - 2 * padX, gap),
          ]),
        ) +
        2 * padY -
        gap;
      lineHeights.set(line, h);
    }
    return h;
  };
  return {
    after,
    height: () => lines.reduce((a, l) => a + lineHeight(l), 0) + after,
    minHeight: () => (lines[0] ? lineHeight(lines[0]) : 0) + after,
    draw: (parent) => {
      const tableEl = L.doc.struct('Table');
      parent.add(tableEl);
      for (const line of lines) {
        const h = lineHeight(line);
        if (h > L.remaining() && !L.atTop()) L.newPage();
        const top = L.y;
        const tr = L.doc.struct('TR');
        tableEl.add(tr);
        let x = MARGIN.left;
        for (const cell of line) {
          const lx = x;
          tr.add(
            L.doc.struct('TH', {}, () => {
              L.setFont(labelFace, size, labelFace === 'bold' ? COLOR.ink : COLOR.muted);
              L.drawText(cell.label, labelFace, size, lx + padX, top + padY, labelW - 2 * padX, gap);
            }),
          );
          const vx = x + labelW;
          tr.add(
            L.doc.struct('TD', {}, () => {
              L.setFont('regular', size, COLOR.ink);
              L.drawText(cell.value, 'regular', size, vx + padX, top + padY, cell.valueW - 2 * padX, gap);
            }),
          );
          x += labelW + cell.valueW;
        }
        tr.end();
        L.artifact(() => {
          L.doc.lineWidth(0.5).moveTo(MARGIN.left, top + h).lineTo(MARGIN.left + CONTENT_WIDTH, top + h).stroke(COLOR.rule);
          if (line.length > 1) {
            L.doc.lineWidth(0.5).moveTo(MARGIN.left + half, top + 3).lineTo(MARGIN.left + half, top + h - 3).stroke(COLOR.rule);
          }
        });
        L.y = top + h;
      }
      tableEl.end();
      L.y += after;
    },
  };
}
