/**
 * The back of the pack: general cautions, method notes, glossary and reproducibility. The closing sections run on
 * from one another: the first starts a page, the rest follow with a gap.
 */
import type { PackModel } from '../model.js';
import type { Layout } from './layout.js';
import { table } from './tables.js';
import { COLOR, SIZE, type Block, type Struct } from './style.js';

export function drawBackMatter(L: Layout, model: PackModel, root: Struct, bookmark: (title: string) => PDFKit.OutlineItem): void {
  const doc = L.doc;
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
          table(
            L,
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
          table(
            L,
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
}
