import PDFDocument from 'pdfkit';
import { FONT_NAME, fontFor } from '../../src/render/fonts.js';

/**
 * A pdfkit document set up as the pack sets one up (A4, the three parsed faces, fixed dates so that two documents
 * with the same drawing give the same bytes), with its bytes once ended.
 */
export function testDoc(options: { margins?: PDFKit.DocumentOptions['margins']; firstPage?: boolean } = {}): {
  doc: PDFKit.Document;
  chunks: Buffer[];
  done: Promise<Buffer>;
} {
  const doc = new PDFDocument({
    size: 'A4',
    ...(options.margins ? { margins: options.margins } : {}),
    autoFirstPage: options.firstPage ?? true,
    font: null,
    info: { CreationDate: new Date(Date.UTC(2000, 0, 1)), ModDate: new Date(Date.UTC(2000, 0, 1)) },
  } as PDFKit.DocumentOptions);
  for (const face of ['regular', 'bold', 'italic'] as const) doc.registerFont(FONT_NAME[face], fontFor(face));
  const chunks: Buffer[] = [];
  doc.on('data', (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((resolve) => doc.on('end', () => resolve(Buffer.concat(chunks))));
  return { doc, chunks, done };
}
