/**
 * Verdict marks and badges: a shape for each verdict (so a verdict never rests on colour alone), the badge beside a
 * claim's heading and the line of marks with counts on the summary.
 */
import type { VerdictKind } from '../model.js';
import { FONT_NAME } from '../fonts.js';
import type { Layout } from './layout.js';
import { BADGE, COLOR, CONTENT_WIDTH, MARGIN, SIZE, type Block, type Struct } from './style.js';

/** Verdict marks: a shape for each verdict, so the verdict never rests on colour alone. */
export const MARK_DESCRIPTION: Record<VerdictKind, string> = {
  supported: 'filled circle',
  'not-supported': 'hollow circle',
  opposite: 'downward triangle',
  'too-little-data': 'dash',
  estimate: 'diamond',
};

/** A small vector mark for a verdict, centred at (cx, cy), radius about r. */
export function drawMark(L: Layout, kind: VerdictKind, cx: number, cy: number, r = 4): void {
  const d = L.doc;
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

export function badgeWidth(L: Layout, label: string): number {
  L.doc.font(FONT_NAME.bold).fontSize(BADGE.size);
  return Math.min(CONTENT_WIDTH, L.doc.widthOfString(label) + 2 * BADGE.padX + 16);
}

/** Draw a verdict badge with its top-left corner at (x, top); the word is a P under `parent`. */
export function drawBadge(L: Layout, kind: VerdictKind, label: string, x: number, top: number, parent: Struct): void {
  const { size, padX, height } = BADGE;
  const w = badgeWidth(L, label);
  L.artifact(() => {
    L.doc.lineWidth(1).roundedRect(x, top, w, height, 3).stroke(COLOR.accent);
    drawMark(L, kind, x + padX + 4, top + height / 2, 4.2);
  });
  parent.add(
    L.doc.struct('P', {}, () => {
      L.setFont('bold', size, COLOR.accent);
      L.doc.text(label, x + padX + 14, top + (height - size * 1.36) / 2, { width: w - padX - 14, lineBreak: false });
    }),
  );
}

/** A line of verdict marks with counts ("● Supported: 3"), wrapping when it is wider than the page. */
export function tally(L: Layout, items: Array<{ kind: VerdictKind; label: string; count: number }>): Block {
  const size = SIZE.table;
  const markRoom = 13;
  const gapX = 14;
  const lineH = size * 1.5;
  const texts = items.map((it) => `${it.label}: ${it.count}`);
  const layout = (): Array<{ x: number; row: number }> => {
    L.doc.font(FONT_NAME.bold).fontSize(size);
    let x = 0;
    let row = 0;
    return texts.map((t) => {
      const w = markRoom + L.doc.widthOfString(t);
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
      const top = L.y;
      const places = layout();
      L.artifact(() => {
        items.forEach((it, i) => {
          const p = places[i]!;
          drawMark(L, it.kind, MARGIN.left + p.x + 4.5, top + p.row * lineH + size * 0.7, 4);
        });
      });
      parent.add(
        L.doc.struct('P', {}, () => {
          texts.forEach((t, i) => {
            const p = places[i]!;
            L.setFont('bold', size, COLOR.ink);
            L.doc.text(t, MARGIN.left + p.x + markRoom, top + p.row * lineH, {
              lineBreak: false,
            });
          });
        }),
      );
      L.y = top + h() + 12;
    },
  };
}
