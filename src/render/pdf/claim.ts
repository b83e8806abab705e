/**
 * A claim's section: its heading with the verdict badge, notices, the verdict panel, what was compared, the numbers,
 * the method line, the chart and the cautions; fitted to one page when it can be.
 */
import type { ClaimSection, PackModel } from '../model.js';
import { chartSvg, MIN_CHART_HEIGHT } from '../charts.js';
import { blocksHeight, type Layout } from './layout.js';
import { badgeWidth, drawBadge } from './marks.js';
import { numberPairs } from './tables.js';
import {
  BADGE, CLAIM_GAP, COLOR, CONTENT_WIDTH, LINE_GAP, MARGIN, SPACED_CAPS, PAGE, PAGE_ROOM, SIZE, shorten, svgSize,
  type Block, type Struct,
} from './style.js';

/** The verdict paragraph on a shaded panel with an accent bar at its left edge. */
export function panel(L: Layout, text: string, opts: { pad?: number; spaceAfter?: number } = {}): Block {
  return L.ruledBox(
    { pad: opts.pad ?? 9, rule: 3, shade: COLOR.shade, ruleColor: COLOR.accent, after: opts.spaceAfter ?? 12 },
    (width) => ({
      height: () => L.textHeight(text, 'regular', SIZE.body, width),
      draw: (parent, x, y) => {
        parent.add(
          L.doc.struct('P', {}, () => {
            L.setFont('regular', SIZE.body);
            L.doc.text(text, x, y, { width, lineGap: LINE_GAP });
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
              L.doc.text(items.length > 1 ? 'NOTES' : 'NOTE', x, top, { width, ...SPACED_CAPS, lineBreak: false });
            }),
          );
          let y = top + labelH;
          const heights = itemHeights();
          items.forEach((text, i) => {
            box.add(
              L.doc.struct('P', {}, () => {
                L.setFont('regular', SIZE.body);
                L.doc.text(text, x, y, { width, lineGap: LINE_GAP });
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
          L.doc.text(label, MARGIN.left, labelTop, { width: lw, ...SPACED_CAPS, lineGap: 1 });
          L.setFont('bold', SIZE.h3);
          L.doc.text(claim.statement, MARGIN.left, statementTop, { width: CONTENT_WIDTH, lineGap: 1.5 });
        }),
      );
      drawBadge(L, claim.verdict, claim.verdictLabel, MARGIN.left + CONTENT_WIDTH - badgeW(), top, parent);
      L.y = top + headH();
    },
  });
  // Lead with the answer: the verdict and its paragraph come first, then what was compared, then the numbers.
  if (claim.notices && claim.notices.length > 0) blocks.push(notices(L, claim.notices, { spaceAfter: sp.notice }));
  blocks.push(panel(L, claim.verdictText, { pad: sp.panelPad, spaceAfter: sp.panel }));
  blocks.push(L.heading('H3', 'What was compared and tested', { spaceAfter: sp.h3 }));
  blocks.push(
    numberPairs(
      L,
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
    blocks.push(numberPairs(L, claim.numbers, { spaceAfter: 4, padY: sp.rowPadY }));
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

/** Draw every claim: each on a new page unless it fits in the space left below the previous one. */
export async function drawClaims(L: Layout, model: PackModel, svgs: Map<string, string>, root: Struct): Promise<void> {
  const doc = L.doc;
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
}
