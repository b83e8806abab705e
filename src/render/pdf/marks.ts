/**
 * Verdict marks and badges: a shape for each verdict (so a verdict never rests on colour alone), the badge beside a
 * claim's heading and in the summary.
 */
import type { VerdictKind } from '../model.js';
import type { Layout } from './layout.js';
import { BADGE, COLOR, CONTENT_WIDTH, type Struct } from './style.js';

/** Verdict marks: a shape for each verdict, so the verdict never rests on colour alone. */
export const MARK_DESCRIPTION: Record<VerdictKind, string> = {
  supported: 'filled circle',
  'not-supported': 'hollow circle',
  opposite: 'downward triangle',
  'too-little-data': 'dash',
  estimate: 'diamond',
};

/**
 * How each verdict's badge looks, so that the verdicts differ by fill, outline and weight and stay apart in
 * greyscale, not by colour alone: "points the other way" is the heaviest (solid dark fill, square corners, white
 * bold word), "supported" a tinted pill with a solid outline and a bold word, "not supported" a dashed outline
 * with a regular word, "too little data" a dotted grey outline with a grey word, and an estimate a thin outline
 * with square corners.
 */
export interface BadgeStyle {
  fill?: string;
  stroke?: string;
  lineWidth: number;
  dash?: [number, number];
  /** Corner radius as a share of the badge's height (0.5: a pill). */
  round: number;
  ink: string;
  face: 'bold' | 'regular';
}

export const BADGE_STYLE: Record<VerdictKind, BadgeStyle> = {
  opposite: { fill: COLOR.opposite, lineWidth: 0, round: 0, ink: '#ffffff', face: 'bold' },
  supported: { fill: COLOR.supportedShade, stroke: COLOR.accent, lineWidth: 1.4, round: 0.5, ink: COLOR.accent, face: 'bold' },
  'not-supported': { stroke: COLOR.muted, lineWidth: 1, dash: [3, 2], round: 0.2, ink: COLOR.ink, face: 'regular' },
  'too-little-data': { stroke: COLOR.muted, lineWidth: 0.9, dash: [1, 1.6], round: 0.2, ink: COLOR.muted, face: 'regular' },
  estimate: { stroke: COLOR.accent, lineWidth: 0.8, round: 0, ink: COLOR.accent, face: 'regular' },
};

/** A small vector mark for a verdict, centred at (cx, cy), radius about r, in `color`. */
export function drawMark(L: Layout, kind: VerdictKind, cx: number, cy: number, r = 4, color: string = COLOR.accent): void {
  const d = L.doc;
  d.lineWidth(1.3);
  switch (kind) {
    case 'supported':
      d.circle(cx, cy, r).fill(color);
      break;
    case 'not-supported':
      d.circle(cx, cy, r - 0.6).stroke(color);
      break;
    case 'opposite':
      d.polygon([cx - r - 0.4, cy - r + 0.8], [cx + r + 0.4, cy - r + 0.8], [cx, cy + r + 0.6]).fill(color);
      break;
    case 'too-little-data':
      d.rect(cx - r, cy - 1.2, 2 * r, 2.4).fill(color);
      break;
    case 'estimate':
      d.polygon([cx, cy - r - 0.6], [cx + r + 0.6, cy], [cx, cy + r + 0.6], [cx - r - 0.6, cy]).stroke(color);
      break;
  }
}

/** Room inside a badge: left pad, the mark, the gap to the word, right pad (at a given type size). */
function badgeRoom(size: number): { padX: number; mark: number } {
  return { padX: (size * BADGE.padX) / BADGE.size, mark: (size * 14) / BADGE.size };
}

/** Width of a badge holding `label` at `size` points (never wider than `max`). */
export function badgeWidth(L: Layout, label: string, kind: VerdictKind = 'supported', size: number = BADGE.size, max: number = CONTENT_WIDTH): number {
  const width = L.widthOfString(label, BADGE_STYLE[kind].face, size);
  const { padX, mark } = badgeRoom(size);
  return Math.min(max, width + 2 * padX + mark);
}

/** Height of a badge at `size` points. */
export function badgeHeight(size: number = BADGE.size): number {
  return (size * BADGE.height) / BADGE.size;
}

/** Draw the badge's box and mark (an Artifact) with its top-left corner at (x, top); returns where the word starts. */
export function drawBadgeBox(L: Layout, kind: VerdictKind, label: string, x: number, top: number, size: number = BADGE.size, max?: number): { textX: number; textY: number; width: number } {
  const style = BADGE_STYLE[kind];
  const w = badgeWidth(L, label, kind, size, max);
  const h = badgeHeight(size);
  const { padX, mark } = badgeRoom(size);
  L.artifact(() => {
    const d = L.doc;
    d.roundedRect(x, top, w, h, style.round * h);
    if (style.fill && style.stroke) d.lineWidth(style.lineWidth).fillAndStroke(style.fill, style.stroke);
    else if (style.fill) d.fill(style.fill);
    else {
      if (style.dash) d.dash(style.dash[0], { space: style.dash[1] });
      d.lineWidth(style.lineWidth).stroke(style.stroke ?? COLOR.accent);
      d.undash();
    }
    drawMark(L, kind, x + padX + (4 * size) / BADGE.size, top + h / 2, (4.2 * size) / BADGE.size, style.ink);
  });
  return { textX: x + padX + mark, textY: top + (h - size * 1.36) / 2, width: w - padX - mark };
}

/** Draw a verdict badge with its top-left corner at (x, top); the word is a P under `parent`. */
export function drawBadge(L: Layout, kind: VerdictKind, label: string, x: number, top: number, parent: Struct, size: number = BADGE.size, max?: number): void {
  const at = drawBadgeBox(L, kind, label, x, top, size, max);
  const style = BADGE_STYLE[kind];
  parent.add(
    L.doc.struct('P', {}, () => {
      L.setFont(style.face, size, style.ink);
      L.textLine(label, style.face, size, at.textX, at.textY, { width: at.width + 2, lineBreak: false });
    }),
  );
}
