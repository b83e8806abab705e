/** Page furniture on every page, as Artifacts: the title header from page 2 and the "Page N of M" footer. */
import type { PackModel } from '../model.js';
import type { Layout } from './layout.js';
import { COLOR, CONTENT_WIDTH, MARGIN, PAGE, SIZE, shorten } from './style.js';

export function drawFurniture(L: Layout, model: PackModel): void {
  const doc = L.doc;
  const range = doc.bufferedPageRange();
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    const bottom = doc.page.margins.bottom;
    doc.page.margins.bottom = 0;
    doc.markContent('Artifact', { type: 'Pagination' });
    if (i > range.start) {
      L.setFont('regular', SIZE.furniture, COLOR.muted);
      L.textLine(shorten(model.title, 95), 'regular', SIZE.furniture, MARGIN.left, MARGIN.top - 30, { width: CONTENT_WIDTH, lineBreak: false });
      doc.lineWidth(0.5).moveTo(MARGIN.left, MARGIN.top - 16).lineTo(PAGE.width - MARGIN.right, MARGIN.top - 16).stroke(COLOR.rule);
    }
    doc.lineWidth(0.5).moveTo(MARGIN.left, PAGE.height - 42).lineTo(PAGE.width - MARGIN.right, PAGE.height - 42).stroke(COLOR.rule);
    L.setFont('regular', SIZE.furniture, COLOR.muted);
    L.textLine(shorten(model.organisation, 70), 'regular', SIZE.furniture, MARGIN.left, PAGE.height - 35, { width: CONTENT_WIDTH / 2, lineBreak: false });
    L.textLine(`Page ${i - range.start + 1} of ${range.count}`, 'regular', SIZE.furniture, MARGIN.left + CONTENT_WIDTH / 2, PAGE.height - 35, {
      width: CONTENT_WIDTH / 2,
      align: 'right',
      lineBreak: false,
    });
    doc.endMarkedContent();
    doc.page.margins.bottom = bottom;
  }
}
