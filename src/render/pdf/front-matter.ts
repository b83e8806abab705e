/**
 * The front of the pack: the cover (title, organisation, settings, data sources), the summary (a tally of verdicts
 * and one row per claim) and, when there is an earlier pack, what changed since it.
 */
import type { PackModel } from '../model.js';
import { blocksHeight, type Layout } from './layout.js';
import { tally } from './marks.js';
import { table } from './tables.js';
import { COLOR, MARGIN, PAGE_ROOM, SIZE, shortHash, shorten, type Block, type Struct } from './style.js';

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
    // How each source's table was read (notes under it, suppressed rows, footnote markers), under the table.
    const readNotes = model.sources.flatMap((s) => (s.notes ?? []).map((n) => (model.sources.length > 1 ? `${s.id}: ${n}` : n)));
    if (readNotes.length > 0) coverBlocks.push(L.bullets(readNotes, { size: SIZE.table }));
  }
  L.flow(coverBlocks, cover);
  cover.end();
}

/** The summary, on a new page. */
export function drawSummary(L: Layout, model: PackModel, root: Struct, bookmark: Bookmark): void {
  const doc = L.doc;
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
      ...(tallyItems.length > 0 ? [tally(L, tallyItems)] : []),
      table(
        L,
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
