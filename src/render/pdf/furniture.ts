/** Page furniture on every page, as Artifacts: the title header from page 2 and the "Page N of M" footer. */
import type { PackModel } from '../model.js';
import { FONT_NAME } from '../fonts.js';
import { COLOR, CONTENT_WIDTH, MARGIN, PAGE, SIZE, shorten, type Doc } from './style.js';

export function drawFurniture(doc: Doc, model: PackModel): void {
  const range = doc.bufferedPageRange();
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    const bottom = doc.page.margins.bottom;
    doc.page.margins.bottom = 0;
    doc.markContent('Artifact', { type: 'Pagination' });
    if (i > range.start) {
      doc.font(FONT_NAME.regular).fontSize(SIZE.furniture).fillColor(COLOR.muted);
      doc.text(shorten(model.title, 95), MARGIN.left, MARGIN.top - 30, { width: CONTENT_WIDTH, lineBreak: false });
      doc.lineWidth(0.5).moveTo(MARGIN.left, MARGIN.top - 16).lineTo(PAGE.width - MARGIN.right, MARGIN.top - 16).stroke(COLOR.rule);
    }
    doc.lineWidth(0.5).moveTo(MARGIN.left, PAGE.height - 42).lineTo(PAGE.width - MARGIN.right, PAGE.height - 42).stroke(COLOR.rule);
    doc.font(FONT_NAME.regular).fontSize(SIZE.furniture).fillColor(COLOR.muted);
    doc.text(shorten(model.organisation, 70), MARGIN.left, PAGE.height - 35, { width: CONTENT_WIDTH / 2, lineBreak: false });
    doc.text(`Page ${i - range.start + 1} of ${range.count}`, MARGIN.left + CONTENT_WIDTH / 2, PAGE.height - 35, {
      width: CONTENT_WIDTH / 2,
      align: 'right',
      lineBreak: false,
    });
    doc.endMarkedContent();
    doc.page.margins.bottom = bottom;
  }
}
