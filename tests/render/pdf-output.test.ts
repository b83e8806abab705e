/**
 * keepOutput (src/render/pdf.ts) keeps what pdfkit writes and hands it over as bytes at the end, instead of pdfkit
 * pushing every line through its stream. The check is pdfkit itself (0.20, the library that writes the pack): the same
 * document written both ways — several pages of text in each face, shapes, colours, a structure tree, compressed
 * streams and embedded font subsets — gives the very same bytes, cross-reference offsets included.
 */
import PDFDocument from 'pdfkit';
import { describe, expect, it } from 'vitest';
import { FONT_NAME, fontFor } from '../../src/render/fonts.js';
import { keepOutput, quickColors, type ColorSetter, type OutputStream } from '../../src/render/pdf.js';

function write(keep: boolean, colors = false): Promise<Buffer> {
  const doc = new PDFDocument({
    size: 'A4',
    autoFirstPage: false,
    tagged: true,
    lang: 'en-GB',
    pdfVersion: '1.7',
    font: null,
    info: { Title: 'Tŷ Łąka — output check', CreationDate: new Date(Date.UTC(2000, 0, 1)), ModDate: new Date(Date.UTC(2000, 0, 1)) },
  } as PDFKit.DocumentOptions);
  for (const face of ['regular', 'bold', 'italic'] as const) doc.registerFont(FONT_NAME[face], fontFor(face));
  const chunks: Buffer[] = [];
  doc.on('data', (c: Buffer) => chunks.push(c));
  if (colors) quickColors(doc as unknown as ColorSetter);
  const written = keep ? keepOutput(doc as unknown as OutputStream) : (): Buffer[] => [];
  const done = new Promise<Buffer>((resolve) => doc.on('end', () => resolve(Buffer.concat([...chunks, ...written()]))));
  const root = doc.struct('Document');
  doc.addStructure(root);
  for (let page = 0; page < 3; page++) {
    doc.addPage();
    for (const face of ['regular', 'bold', 'italic'] as const) {
      root.add(
        doc.struct('P', {}, () => {
          doc.font(FONT_NAME[face]).fontSize(10 + page).fillColor('#1d2733');
          doc.text(`Page ${page + 1}: Pant-yr-ŵyn, Tŷ Łąka, naïve office figures (n = 1,234) — ${face}. `.repeat(6), 58, doc.y + 6, { width: 420 });
        }),
      );
    }
    doc.rect(58, 700, 200, 40).fill('#f1f4f8');
    doc.lineWidth(0.5).moveTo(58, 760).lineTo(500, 760).stroke('#cfd5dc');
    // Colours of every form pdfkit takes: six and three hex digits, names, arrays, with an opacity.
    doc.rect(58, 600, 20, 20).fillAndStroke('#1F4E8C', '#c4620f');
    doc.rect(90, 600, 20, 20).fill('#fff');
    doc.rect(120, 600, 20, 20).fill('red');
    doc.rect(150, 600, 20, 20).fill([12, 200, 40]);
    doc.fillColor('#8c3b00', 0.5).rect(180, 600, 20, 20).fill();
    doc.strokeColor('#5b6673').strokeColor('#5b6673', 0.3).rect(210, 600, 20, 20).stroke();
  }
  root.end();
  doc.end();
  return done;
}

describe('quickColors', () => {
  it('writes the colour operators pdfkit’s fillColor and strokeColor write', async () => {
    const [quick, own] = await Promise.all([write(false, true), write(false, false)]);
    expect(quick.equals(own)).toBe(true);
  });
});

describe('keepOutput', () => {
  it('gives the bytes pdfkit’s own stream gives', async () => {
    const [kept, streamed] = await Promise.all([write(true), write(false)]);
    expect(streamed.length).toBeGreaterThan(10_000);
    expect(kept.equals(streamed)).toBe(true);
  });
});
