/**
 * The pack's page geometry, type sizes and colours, and the shapes every layout part shares: a table cell and column,
 * and a Block (measured first, then drawn where it fits).
 */
import type { Face } from '../fonts.js';
import type { VerdictKind } from '../model.js';

export type Doc = PDFKit.Document;
export type Struct = PDFKit.StructureElement;

// ---- Page geometry (points; A4 is 595.28 x 841.89) ----
export const PAGE = { width: 595.28, height: 841.89 };
export const MARGIN = { top: 50, bottom: 48, left: 58, right: 58 };
export const CONTENT_WIDTH = PAGE.width - MARGIN.left - MARGIN.right;
export const CONTENT_BOTTOM = PAGE.height - MARGIN.bottom;
/** Slack kept under every block so that rounding in line heights can never push text past the margin. */
export const SLACK = 2;
/** Room taken at the top of a page by the line naming the claim that continues there. */
export const CONTINUATION_HEIGHT = 22;
/** Height available for blocks on an empty page. */
export const PAGE_ROOM = CONTENT_BOTTOM - SLACK - MARGIN.top;

// ---- Typography: one accent colour, body 10.5 pt, headings 16 / 13 pt ----
export const COLOR = {
  ink: '#1d2733',
  muted: '#5b6673',
  accent: '#1f4e8c',
  rule: '#cfd5dc',
  shade: '#f1f4f8',
  /** Notices: an amber rule and a warm shade, with dark ink for the label (contrast above 7:1 on the shade). */
  notice: '#c4620f',
  noticeShade: '#fbf1e6',
  noticeInk: '#7a3a05',
  /** The badge of a claim that points the other way: white on this dark amber-brown (contrast about 7.7:1). */
  opposite: '#8c3b00',
  /** The tint inside a "supported" badge. */
  supportedShade: '#e4ecf6',
} as const;
export const SIZE = { title: 24, h2: 16, h3: 13, sub: 10.5, body: 10.5, table: 9.5, small: 8.5, furniture: 8 } as const;
export const LINE_GAP = 2.2;
export const PARA_GAP = 8;
/**
 * Small letter-spaced capitals (a claim's label, its continuation line, the NOTE label). Kerning is switched off:
 * letter-spaced capitals need none, and a kerned pair such as "TT" or "AT" inside the extra spacing leaves a gap that
 * text extraction (pdftotext, screen readers, search) reads as a space ("BUT TON" for "BUTTON").
 */
export const SPACED_CAPS = { characterSpacing: 0.8, features: { kern: false } } as const;
/** The verdict badge: bold word beside a verdict mark in an outlined box. */
export const BADGE = { size: 11, padX: 9, height: 22 } as const;
/** Width of the label column in a claim's tables ("Null hypothesis", "Test statistic"). */
export const NUMBER_LABEL_WIDTH = 130;
/** The widest the label column of a claim's tables grows to hold its longest label on one line. */
export const NUMBER_LABEL_MAX = 150;
/** Space between two claims that share a page (a rule is drawn in it). */
export const CLAIM_GAP = 24;

export interface Cell {
  text: string;
  /** A second, small muted line under the text (e.g. a claim's id under its statement). */
  sub?: string;
  face?: Face;
  /** Ink of the text (defaults to the body ink; header cells are muted). */
  color?: string;
  mark?: VerdictKind;
  /** Draw the text as a verdict badge of this kind (one line). */
  badge?: VerdictKind;
  /** Further lines under the text (and its sub line), each its own paragraph. */
  more?: Array<{ text: string; face?: Face; size?: number; color?: string; gap?: number }>;
}

export interface Column {
  header: string;
  width: number;
  face?: Face;
}

/** A unit of layout: measured first, then drawn where it fits. */
export interface Block {
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

/** Width and height of an SVG from its root attributes. */
export function svgSize(svg: string): { width: number; height: number } {
  const root = /<svg\b[^>]*>/.exec(svg)?.[0] ?? '';
  const width = Number(/\swidth="([\d.]+)"/.exec(root)?.[1]);
  const height = Number(/\sheight="([\d.]+)"/.exec(root)?.[1]);
  if (!(width > 0 && height > 0)) throw new Error('Chart SVG has no width and height on its root element.');
  return { width, height };
}

export function shortHash(sha256: string): string {
  return sha256.length > 12 ? sha256.slice(0, 12) : sha256;
}

export function shorten(text: string, max: number): string {
  const t = text.replace(/\s+/g, ' ').trim();
  return t.length <= max ? t : `${t.slice(0, max - 1).trimEnd()}\u2026`;
}
