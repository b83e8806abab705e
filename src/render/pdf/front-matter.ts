/**
 * The front of the pack: the cover (title, organisation, settings, data sources), the summary (a tally of verdicts
 * and one row per claim) and, when there is an earlier pack, what changed since it.
 */
import type { ClaimAction, PackModel, SummaryRow, VerdictKind } from '../model.js';
import { blocksHeight, type Layout } from './layout.js';
import { table } from './tables.js';
import { grouped } from '../../format/numbers.js';
import { COLOR, MARGIN, PAGE_ROOM, SIZE, shortHash, shorten, type Block, type Cell, type Struct } from './style.js';

type Bookmark = (title: string) => PDFKit.OutlineItem;

/** The cover page. */
export function drawCover(L: Layout, model: PackModel, root: Struct, bookmark: Bookmark): void {
  const doc = L.doc;
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
    table(
      L,
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
      table(
        L,
        [
          { header: 'Source', width: 150 },
          { header: 'Years', width: 62 },
          { header: 'Respondents', width: 135 },
          { header: 'File', width: 120 },
        ],
        model.sources.map((s) => [
          { text: s.title ?? s.id, sub: s.origin ? `${s.id}: ${s.origin}` : s.title ? s.id : undefined },
          { text: s.periods && s.periods.length > 0 ? s.periods.join(', ') : 'not stated' },
          { text: s.respondentsText ?? 'not counted' },
          {
            text: s.file,
            sub: `${s.description ? `${s.description}; ` : ''}${grouped(s.rows)} rows; SHA-256 ${shortHash(s.sha256)}`,
          },
        ]),
      ),
    );
    // How each source's table was read (notes under it, suppressed rows, footnote markers), under the table.
    const readNotes = model.sources.flatMap((s) => (s.notes ?? []).map((n) => (model.sources.length > 1 ? `${s.id}: ${n}` : n)));
    if (readNotes.length > 0) coverBlocks.push(L.bullets(readNotes, { size: SIZE.table }));
  }
  L.flow(coverBlocks, cover);
  cover.end();
}

/** The order of the summary's rows by what to do with each claim: claims that must not be made first. */
const ACTION_ORDER: ClaimAction[] = ['must-not-make', 'reword', 'drop', 'quote', 'quote-with-interval'];

/** A verdict word split into the badge's word and its refinement ("Not supported: ruled out"). */
function splitLabel(label: string): { word: string; detail?: string } {
  const at = label.indexOf(': ');
  return at < 0 ? { word: label } : { word: label.slice(0, at), detail: label.slice(at + 2) };
}

/** Summary rows in the order drawn: by advice (must not make first), else by file order with opposite first. */
export function summaryOrder(rows: SummaryRow[]): SummaryRow[] {
  const rank = (r: SummaryRow): number =>
    r.advice ? ACTION_ORDER.indexOf(r.advice.action) : r.verdict === 'opposite' ? 0 : ACTION_ORDER.length;
  return rows
    .map((r, i) => ({ r, i }))
    .sort((a, b) => rank(a.r) - rank(b.r) || a.i - b.i)
    .map((x) => x.r);
}

/** Type size of the badges in the summary's tables. */
const SUMMARY_BADGE = 9;

/**
 * The summary, on a new page: how to read it, what each verdict word means (with its badge and how many claims got
 * it), one row per claim (claims that must not be made first, shaded, then those to reword, drop and quote), with
 * the claim's verdict badge, what to do with it, whether the verdict depends on the confidence level chosen, and
 * its key figure with the interval's level; then what each piece of advice means.
 */
export function drawSummary(L: Layout, model: PackModel, root: Struct, bookmark: Bookmark): void {
  const doc = L.doc;
  L.newPage();
  const summary = doc.struct('Sect');
  root.add(summary);
  bookmark('Summary');
  const blocks: Block[] = [L.heading('H2', 'Summary'), L.paragraph(model.summaryIntro, { size: SIZE.table + 0.5, spaceAfter: 10 })];

  // What the verdict words mean: every word the pack uses, with its badge and count, in the model's order.
  const used = new Map<string, { kind: VerdictKind; count: number }>();
  for (const r of model.summary) {
    const u = used.get(r.verdictLabel);
    if (u) u.count++;
    else used.set(r.verdictLabel, { kind: r.verdict, count: 1 });
  }
  const defs = (model.verdictDefinitions ?? []).filter((d) => used.has(d.label));
  const undefinedLabels = [...used.keys()].filter((l) => !defs.some((d) => d.label === l));
  const defRows = [...defs, ...undefinedLabels.map((label) => ({ label, text: '' }))].map((d) => {
    const u = used.get(d.label)!;
    const { word, detail } = splitLabel(d.label);
    return [
      { text: word, badge: u.kind, ...(detail ? { more: [{ text: detail, face: 'bold' as const, size: SIZE.small, color: COLOR.ink }] } : {}) },
      { text: `${u.count} ${u.count === 1 ? 'claim' : 'claims'}` },
      { text: d.text },
    ];
  });
  if (defRows.length > 0) {
    blocks.push(L.heading('H3', 'What the verdicts mean', { spaceAfter: 4 }));
    blocks.push(
      table(
        L,
        [
          { header: 'Verdict', width: 140 },
          { header: 'Claims', width: 52 },
          { header: 'What it means', width: 275 },
        ],
        defRows,
        { padY: 2.6, badgeSize: SUMMARY_BADGE, spaceAfter: 14 },
      ),
    );
  }

  // The claims, must-not-make first.
  const rows = summaryOrder(model.summary);
  blocks.push(L.heading('H3', 'The claims, and what to do with each', { spaceAfter: 4 }));
  blocks.push(
    table(
      L,
      [
        { header: 'Claim', width: 192 },
        { header: 'Verdict and what to do', width: 130 },
        { header: 'Key figure (interval)', width: 145 },
      ],
      rows.map((r) => {
        const { word, detail } = splitLabel(r.verdictLabel);
        const verdictLines: NonNullable<Cell['more']> = [];
        if (detail) verdictLines.push({ text: detail, face: 'bold', size: SIZE.small, gap: 1 });
        if (r.advice) {
          verdictLines.push({
            text: r.advice.label,
            face: 'bold',
            color: r.advice.action === 'must-not-make' ? COLOR.noticeInk : COLOR.ink,
            gap: 3,
          });
        }
        const marks = model.summaryMarks?.wordsDisagree;
        if (r.wordsDisagree && marks) {
          verdictLines.push({ text: marks.mark, face: 'bold', size: SIZE.small, color: COLOR.noticeInk, gap: 2 });
        }
        if (r.dependsOnLevel) {
          verdictLines.push({ text: 'Depends on the confidence level chosen: see its page', face: 'italic', size: SIZE.small, color: COLOR.muted, gap: 2 });
        }
        const claimLines: NonNullable<Cell['more']> =
          r.advice?.action === 'reword' && r.advice.wording
            ? [{ text: `Suggested wording: ${r.advice.wording}`, face: 'italic', size: SIZE.small, gap: 3 }]
            : [];
        return [
          { text: r.statement, sub: r.id, more: claimLines },
          { text: word, badge: r.verdict, more: verdictLines },
          { text: r.keyFigure, ...(r.intervalLevel ? { sub: `${r.intervalLevel} interval` } : {}) },
        ];
      }),
      {
        padY: 3.4,
        badgeSize: SUMMARY_BADGE,
        rowStyle: rows.map((r) =>
          r.advice?.action === 'must-not-make' || (!r.advice && r.verdict === 'opposite')
            ? { shade: COLOR.noticeShade, rule: COLOR.opposite }
            : undefined,
        ),
      },
    ),
  );

  // The note a mark on a row refers to, under the table.
  const wordsNote = model.summaryMarks?.wordsDisagree;
  if (wordsNote && rows.some((r) => r.wordsDisagree)) {
    blocks.push(L.paragraph(wordsNote.note, { size: SIZE.small, color: COLOR.noticeInk, spaceAfter: 10 }));
  }

  // What each piece of advice means, for the advice the summary gives.
  const actions = (model.actionDefinitions ?? []).filter((d) => rows.some((r) => r.advice?.label === d.label));
  if (actions.length > 0) {
    blocks.push(L.heading('H3', 'What the advice means', { spaceAfter: 4 }));
    blocks.push(
      table(
        L,
        [
          { header: 'Advice', width: 120, face: 'bold' },
          { header: 'What it means', width: 347 },
        ],
        actions.map((d) => [{ text: d.label }, { text: d.text }]),
        { padY: 2.6, keepTogether: true },
      ),
    );
  }
  L.flow(blocks, summary);
  summary.end();
}

/** What changed since the previous pack: right after the summary, on from it when there is room. */
export function drawChanges(L: Layout, model: PackModel, root: Struct, bookmark: Bookmark): void {
  const doc = L.doc;
  if (model.changes) {
    const ch = model.changes;
    const heading = L.heading('H2', ch.heading);
    const blocks: Block[] = [heading, L.paragraph(ch.intro, { spaceAfter: 10 })];
    if (ch.verdicts.length > 0) {
      blocks.push(
        table(
          L,
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
}
