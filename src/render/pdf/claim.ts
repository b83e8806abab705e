/**
 * A claim's section: its heading with the verdict badge, notices, the verdict panel, what was compared, the numbers,
 * the method line, the chart and the cautions; fitted to one page when it can be.
 */
import type { ClaimSection, PackModel, VerdictKind, VerdictStability } from '../model.js';
import { chartSvg, MIN_CHART_HEIGHT } from '../charts.js';
import { blocksHeight, type Layout } from './layout.js';
import { badgeWidth, drawBadge } from './marks.js';
import { numberLabelWidth, numberPairs, table } from './tables.js';
import {
  BADGE, CLAIM_GAP, COLOR, CONTENT_WIDTH, CONTINUATION_HEIGHT, LINE_GAP, MARGIN, NUMBER_LABEL_WIDTH, PAGE, PAGE_ROOM, SIZE, shorten,
  svgSize, type Block, type Cell, type Struct,
} from './style.js';

/** The verdict paragraph on a shaded panel with an accent bar at its left edge. */
export function panel(L: Layout, text: string, opts: { pad?: number; spaceAfter?: number; size?: number } = {}): Block {
  const size = opts.size ?? SIZE.body;
  return L.ruledBox(
    { pad: opts.pad ?? 9, rule: 3, shade: COLOR.shade, ruleColor: COLOR.accent, after: opts.spaceAfter ?? 12 },
    (width) => ({
      height: () => L.textHeight(text, 'regular', size, width),
      draw: (parent, x, y) => {
        parent.add(
          L.doc.struct('P', {}, () => {
            L.setFont('regular', size);
            L.drawText(text, 'regular', size, x, y, width, LINE_GAP);
          }),
        );
      },
    }),
  );
}

/**
 * Notices beside a claim (e.g. the claim was edited after its results were seen): a shaded box with a rule at its
 * left edge and a small "Note" label, so it stands out without relying on colour.
 */
export function notices(L: Layout, items: string[], opts: { spaceAfter?: number } = {}): Block {
  const labelH = SIZE.small * 1.4 + 2;
  return L.ruledBox(
    { pad: 8, rule: 4, shade: COLOR.noticeShade, ruleColor: COLOR.notice, after: opts.spaceAfter ?? 12 },
    (width) => {
      const itemHeights = (): number[] => items.map((t) => L.textHeight(t, 'regular', SIZE.body, width));
      return {
        height: () => labelH + itemHeights().reduce((a, b) => a + b + 4, 0) - 4,
        draw: (parent, x, top) => {
          const box = L.doc.struct('Div');
          parent.add(box);
          box.add(
            L.doc.struct('P', {}, () => {
              L.setFont('bold', SIZE.small, COLOR.noticeInk);
              L.textLine(items.length > 1 ? 'NOTES' : 'NOTE', 'bold', SIZE.small, x, top, { width, spaced: true, lineBreak: false });
            }),
          );
          let y = top + labelH;
          const heights = itemHeights();
          items.forEach((text, i) => {
            box.add(
              L.doc.struct('P', {}, () => {
                L.setFont('regular', SIZE.body);
                L.drawText(text, 'regular', SIZE.body, x, y, width, LINE_GAP);
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

/** Vertical spacing inside a claim's section (points), and the type size of its cautions. */
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
  caution: number;
  /** Type size of the verdict paragraph and of the tables. */
  body: number;
  table: number;
}

/** Outer height of a scatter or period chart that starts the second page of a claim too long for one page. */
const CONTINUED_CHART_HEIGHT = 270;

/** The usual spacing of a claim's section. */
const SPACING_NORMAL: ClaimSpacing = { head: 12, notice: 12, panelPad: 9, panel: 12, h3: 4, compared: 10, rowPadY: 2.8, method: 12, figure: 14, caution: SIZE.table, body: SIZE.body, table: SIZE.table };
/** Closer spacing (same type sizes) for a claim that would otherwise run a little onto a second page. */
const SPACING_TIGHT: ClaimSpacing = { head: 8, notice: 8, panelPad: 7, panel: 9, h3: 3, compared: 6, rowPadY: 1.9, method: 7, figure: 8, caution: SIZE.table, body: SIZE.body, table: SIZE.table };
/**
 * Closest spacing, type half a point smaller (the verdict paragraph 10 pt, tables 9 pt) and cautions at the size of
 * the method line, all still readable in print, for a claim that would otherwise run onto a second page.
 */
const SPACING_CLOSE: ClaimSpacing = { head: 4, notice: 5, panelPad: 5, panel: 4, h3: 1.5, compared: 3, rowPadY: 0.9, method: 3, figure: 3, caution: SIZE.small + 0.5, body: SIZE.body - 0.5, table: SIZE.table - 0.5 };

/** Type size of the method line, the source line and term notes under a claim's tables (readable in print). */
const NOTE_SIZE = SIZE.small + 0.5;

/**
 * A claim's blocks, and how many of them form its head: the heading through the numbers, the method line and the
 * terms, which always share a page (the chart and cautions may run on to the next).
 */
interface ClaimBlocks {
  blocks: Block[];
  head: number;
}

function claimBlocks(
  L: Layout,
  claim: ClaimSection,
  svg: string | undefined,
  bookmarks: () => PDFKit.OutlineItem,
  sp: ClaimSpacing = SPACING_NORMAL,
  /** Put what was compared and tested after the chart (a claim over two pages: its second page is not left bare). */
  comparedLate = false,
): ClaimBlocks {
  const blocks: Block[] = [];
  // Heading: the "Claim C1" label with the verdict badge at the right of the same line, then the statement in the
  // user's words. The label and statement form one H2; the verdict word follows it in reading order.
  const label = `Claim ${claim.id}`.toUpperCase();
  const badgeW = (): number => badgeWidth(L, claim.verdictLabel, claim.verdict);
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
          L.textLine(label, 'bold', SIZE.small, MARGIN.left, labelTop, { width: lw, spaced: true, lineGap: 1 });
          L.setFont('bold', SIZE.h3);
          L.drawText(claim.statement, 'bold', SIZE.h3, MARGIN.left, statementTop, CONTENT_WIDTH, 1.5);
        }),
      );
      drawBadge(L, claim.verdict, claim.verdictLabel, MARGIN.left + CONTENT_WIDTH - badgeW(), top, parent);
      L.y = top + headH();
    },
  });
  // Lead with the answer: the verdict and its paragraph come first, then what to do with the claim, then what was
  // compared, then the numbers.
  if (claim.notices && claim.notices.length > 0) blocks.push(notices(L, claim.notices, { spaceAfter: sp.notice }));
  const advice = adviceRows(claim);
  blocks.push(panel(L, claim.verdictText, { size: sp.body, pad: sp.panelPad, spaceAfter: advice.length > 0 ? Math.min(6, sp.panel) : sp.panel }));
  if (advice.length > 0) {
    blocks.push(numberPairs(L, advice, { spaceAfter: sp.panel, pair: false, padY: sp.rowPadY, labelFace: 'bold', labelWidth: NUMBER_LABEL_WIDTH, size: sp.table }));
  }
  const compared = [
    { label: 'Compared', value: claim.compared },
    { label: 'Null hypothesis', value: claim.hypotheses.null },
    { label: 'Alternative hypothesis', value: claim.hypotheses.alternative },
  ];
  const comparedBlocks: Block[] = [
    L.heading('H3', 'What was compared and tested', { spaceAfter: sp.h3 }),
    numberPairs(L, compared, { spaceAfter: claim.sourceLine ? 3 : sp.compared, pair: false, padY: sp.rowPadY, size: sp.table }),
  ];
  // Where the data came from and how many of those asked answered, under what was compared.
  if (claim.sourceLine) comparedBlocks.push(L.paragraph(claim.sourceLine, { size: NOTE_SIZE, color: COLOR.muted, spaceAfter: sp.compared }));
  if (!comparedLate) blocks.push(...comparedBlocks);
  const labelW = numberLabelWidth(L, claim.numbers.map((r) => r.label), 'regular', sp.table);
  if (claim.numbers.length > 0) {
    blocks.push(L.heading('H3', 'The numbers', { spaceAfter: sp.h3 }));
    blocks.push(numberPairs(L, claim.numbers, { spaceAfter: 4, padY: sp.rowPadY, labelWidth: labelW, size: sp.table }));
  }
  // The method line reads as a note under the numbers it produced, at a size that stays readable in print; then the
  // verdict at other confidence levels (in the numbers' label column) and the terms met here first in the pack.
  const terms = claim.terms ?? [];
  const after = (last: boolean): number => (last ? sp.method : 4);
  blocks.push(L.paragraph(claim.methodLine, { face: 'italic', size: NOTE_SIZE, color: COLOR.muted, spaceAfter: after(!claim.stability && terms.length === 0) }));
  if (claim.stability) blocks.push(stabilityRows(L, claim.stability, labelW, sp, after(terms.length === 0)));
  terms.forEach((term, i) => {
    blocks.push(L.paragraph(`${term.term}: ${term.text}`, { size: NOTE_SIZE, color: COLOR.muted, spaceAfter: i === terms.length - 1 ? sp.method : 2 }));
  });
  const head = blocks.length;
  if (claim.chart && svg) blocks.push(L.figure(svg, claim.chart.alt, { spaceAfter: sp.figure }));
  if (comparedLate) blocks.push(...comparedBlocks);
  if (claim.cautions.length > 0) {
    blocks.push(L.heading('H3', 'Cautions', { spaceAfter: sp.h3 }));
    blocks.push(L.bullets(claim.cautions, { size: sp.caution }));
  }
  return { blocks, head };
}

/** What to do with the claim: the advice, a wording the data support, the claims to read it with. */
function adviceRows(claim: ClaimSection): Array<{ label: string; value: string }> {
  const rows: Array<{ label: string; value: string }> = [];
  if (claim.advice) {
    // Quoting needs no reason beyond the verdict paragraph above; the other advice says why.
    const quote = claim.advice.action === 'quote' || claim.advice.action === 'quote-with-interval';
    rows.push({ label: 'What to do', value: quote ? `${claim.advice.label}.` : `${claim.advice.label}. ${claim.advice.reason}` });
  }
  if (claim.advice?.wording && claim.advice.action !== 'quote-with-interval') {
    rows.push({ label: 'Suggested wording', value: claim.advice.wording });
  }
  for (const link of claim.linked ?? []) rows.push({ label: 'Read with', value: link.text });
  if (claim.linkedMore) rows.push({ label: 'Read with', value: claim.linkedMore.text });
  return rows;
}

/**
 * The verdict at 90, 95 and 99% confidence, under the method line of the numbers. When the verdict is the same at every
 * level with and without adjustment, one row says so with the verdict's mark. Otherwise a small grid: the levels
 * across (the claim's own level in bold), one line with the pack's adjustment for many claims and, where an
 * adjustment applies, one without it, each cell the verdict's mark and word.
 */
function stabilityRows(L: Layout, s: VerdictStability, labelW: number, sp: ClaimSpacing, spaceAfter: number): Block {
  const own = s.cells.find((c) => c.own) ?? s.cells[1]!;
  if (!s.dependsOnLevel && !s.dependsOnAdjustment) {
    // The sentence names the levels and the adjustment itself, so it takes the whole width.
    return table(L, [{ header: '', width: CONTENT_WIDTH }], [[{ text: s.text, mark: own.adjusted }]], {
      header: false,
      size: sp.table,
      padY: sp.rowPadY + 0.8,
      spaceAfter,
    });
  }
  // The grid's label column also holds its heading on one line (bold, over the row labels).
  const gridLabelW = Math.min(CONTENT_WIDTH / 2, Math.max(labelW, Math.ceil(L.widthOfString(s.heading, 'bold', sp.table) + 11)));
  const cellW = (CONTENT_WIDTH - gridLabelW) / 3;
  const line = (name: string, pick: (c: VerdictStability['cells'][number]) => { kind: VerdictKind; word: string }): Cell[] => [
    { text: name, color: COLOR.muted },
    ...s.cells.map((c) => ({ text: pick(c).word, mark: pick(c).kind, ...(c.own ? { face: 'bold' as const } : {}) })),
  ];
  // With an adjustment, one line with it and one without, under the heading; with none, one line named by the heading.
  const rows: Cell[][] = s.adjustmentApplies
    ? [
        line(s.adjustedLabel, (c) => ({ kind: c.adjusted, word: c.adjustedLabel })),
        line(s.unadjustedLabel, (c) => ({ kind: c.unadjusted, word: c.unadjustedLabel })),
      ]
    : [line(s.heading, (c) => ({ kind: c.adjusted, word: c.adjustedLabel }))];
  return table(
    L,
    [
      { header: s.adjustmentApplies ? s.heading : '', width: gridLabelW },
      ...s.cells.map((c) => ({ header: c.level, width: cellW, ...(c.own ? { face: 'bold' as const } : {}) })),
    ],
    rows,
    { size: sp.table, padY: sp.rowPadY + 0.4, spaceAfter, keepTogether: true },
  );
}

/**
 * A claim laid out to fit one page when it can: with the usual spacing, then closer spacing (same type sizes), then
 * the closest spacing with type half a point smaller, each time with a shorter chart when that is what it takes
 * (never below MIN_CHART_HEIGHT). A claim that fits none of these runs over two pages: its head (heading, verdict,
 * advice, numbers, method and terms) on the first, in the widest spacing that holds it; then the chart, what was
 * compared and tested with the source, and the cautions, which start the second page when they do not fit below
 * the head, so the second page carries a good share of the claim rather than a lone chart or caution.
 */
async function layClaim(
  L: Layout,
  claim: ClaimSection,
  svg: string | undefined,
  bookmarks: () => PDFKit.OutlineItem,
): Promise<{ blocks: Block[]; fits: boolean }> {
  const normal = claimBlocks(L, claim, svg, bookmarks, SPACING_NORMAL);
  if (blocksHeight(normal.blocks) <= PAGE_ROOM) return { blocks: normal.blocks, fits: true };
  for (const sp of [SPACING_TIGHT, SPACING_CLOSE]) {
    const { blocks } = claimBlocks(L, claim, svg, bookmarks, sp);
    const overflow = blocksHeight(blocks) - PAGE_ROOM;
    if (overflow <= 0) return { blocks, fits: true };
    if (claim.chart && svg) {
      const target = Math.floor(svgSize(svg).height - overflow - 1);
      if (target >= MIN_CHART_HEIGHT) {
        const shorter = await chartSvg(claim.chart.data, { height: target });
        const fitted = claimBlocks(L, claim, shorter, bookmarks, sp).blocks;
        if (blocksHeight(fitted) <= PAGE_ROOM) return { blocks: fitted, fits: true };
      }
    }
  }
  // Over two pages: a scatter or period chart may then be taller, when the second page still holds the rest.
  let chart = svg;
  if (claim.chart && svg && (claim.chart.data.kind === 'scatter' || claim.chart.data.kind === 'periods')) {
    const taller = await chartSvg(claim.chart.data, { height: CONTINUED_CHART_HEIGHT });
    const laid = claimBlocks(L, claim, taller, bookmarks, SPACING_NORMAL, true);
    if (blocksHeight(laid.blocks.slice(laid.head)) <= PAGE_ROOM) chart = taller;
  }
  for (const sp of [SPACING_NORMAL, SPACING_TIGHT, SPACING_CLOSE]) {
    const { blocks, head } = claimBlocks(L, claim, chart, bookmarks, sp, true);
    if (blocksHeight(blocks.slice(0, head)) > PAGE_ROOM && sp !== SPACING_CLOSE) continue;
    // The rest starts the second page whole when it fits there, rather than leaving its last part alone on it.
    const tail = blocksHeight(blocks.slice(head));
    if (tail > PAGE_ROOM - CONTINUATION_HEIGHT) return { blocks, fits: false };
    return { blocks: [...blocks.slice(0, head), keepTogether(tail), ...blocks.slice(head)], fits: false };
  }
  return { blocks: normal.blocks, fits: false };
}

/** A mark that moves the blocks after it to a new page unless `height` points of them fit on this one. */
function keepTogether(height: number): Block {
  return { height: () => 0, minHeight: () => height, draw: () => undefined };
}

/** Draw every claim: each on a new page unless it fits in the space left below the previous one. */
export async function drawClaims(L: Layout, model: PackModel, root: Struct, chartDrawn?: (claim: ClaimSection, svg: string) => void): Promise<void> {
  const doc = L.doc;
  let claimsBookmark: PDFKit.OutlineItem | undefined;
  for (const claim of model.claims) {
    const svg = claim.chart ? await chartSvg(claim.chart.data) : undefined;
    const { blocks } = await layClaim(L, claim, svg, () => claimsBookmark!);
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
    L.forgetMeasured();
    if (svg !== undefined) chartDrawn?.(claim, svg);
  }
}
