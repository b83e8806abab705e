/**
 * The PDF draws charts from Vega's scene (chart-pdf.ts) rather than from their SVG. Checked against Vega's own SVG
 * renderer (vega-scenegraph's SVGStringRenderer, outside this module) on every sample chart kind: the recorded
 * drawing puts the same texts at the same anchor points, in the same faces and sizes, as the SVG does; and played
 * into a pdfkit page, the chart's words read back from the PDF with pdftotext (poppler-utils).
 */
import { describe, it, expect } from 'vitest';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import PDFDocument from 'pdfkit';
import { chartSpec } from '../../src/render/charts.js';
import { chartDrawing, specSvg } from '../../src/render/chart-runtime.js';
import { drawChart, type ChartDrawing } from '../../src/render/chart-pdf.js';
import { FONT_NAME, fontBytes } from '../../src/render/fonts.js';
import { testDoc } from '../helpers/pdf-doc.js';
import fc from 'fast-check';
import { sampleModel } from './sample-model.js';

const sample = sampleModel.claims.flatMap((c) => (c.chart ? [c.chart.data] : []));

const unescape = (s: string): string => s.replace(/&lt;/g, '<').replace(/&gt;/g, '>').replace(/&quot;/g, '"').replace(/&#39;/g, "'").replace(/&amp;/g, '&');

/** Each <text> of a Vega SVG: its words (white space collapsed, as SVG shows them), anchor point, size and anchor. */
function svgTexts(svg: string): string[] {
  const out: string[] = [];
  const stack: Array<[number, number]> = [[0, 0]];
  const tag = /<(\/?)(g|text)\b([^>]*)>([^<]*)/g;
  for (let m = tag.exec(svg); m; m = tag.exec(svg)) {
    const [, close, name, attrs, content] = m as unknown as [string, string, string, string, string];
    if (name === 'g') {
      if (close) stack.pop();
      else {
        const t = /transform="translate\(([-\d.e]+),([-\d.e]+)\)"/.exec(attrs);
        const [x, y] = stack.at(-1) as [number, number];
        stack.push(t ? [x + Number(t[1]), y + Number(t[2])] : [x, y]);
      }
      continue;
    }
    if (close) continue;
    const t = /transform="translate\(([-\d.e]+),([-\d.e]+)\)( rotate\(([-\d.e]+)\))?"/.exec(attrs);
    const [x, y] = stack.at(-1) as [number, number];
    const size = /font-size="([\d.]+)px"/.exec(attrs)?.[1];
    const anchor = /text-anchor="(\w+)"/.exec(attrs)?.[1] ?? 'start';
    const weight = /font-weight="(\w+)"/.exec(attrs)?.[1] === 'bold' ? 'bold' : 'regular';
    const text = unescape(content).replace(/\s+/g, ' ').trim();
    if (text) out.push(`${text} @ ${(x + Number(t?.[1] ?? 0)).toFixed(2)},${(y + Number(t?.[2] ?? 0)).toFixed(2)} ${size} ${weight} ${anchor}`);
  }
  return out.sort();
}

/** The same from a recorded drawing: the anchor point through the text's transformation. */
function drawingTexts(d: ChartDrawing): string[] {
  const align: Record<string, string> = { left: 'start', center: 'middle', right: 'end' };
  return d.ops
    .flatMap((o) => (o.op === 'text' ? [o] : []))
    .map((o) => {
      const [a, b, c, dd, e, f] = o.m;
      const x = a * o.x + c * o.y + e;
      const y = b * o.x + dd * o.y + f;
      return `${o.text} @ ${x.toFixed(2)},${y.toFixed(2)} ${o.size} ${o.face === 'bold' ? 'bold' : 'regular'} ${align[o.align] ?? o.align}`;
    })
    .sort();
}

describe('charts drawn from the scene', () => {
  it('records every sample chart kind, with the texts where Vega’s SVG renderer puts them', async () => {
    const kinds = new Set<string>();
    for (const data of sample) {
      const svg = await specSvg(chartSpec(data));
      const drawing = chartDrawing(svg);
      expect(drawing, `${data.kind} chart recorded`).toBeDefined();
      kinds.add(data.kind);
      const want = svgTexts(svg);
      expect(want.length).toBeGreaterThan(2);
      expect(drawingTexts(drawing as ChartDrawing)).toEqual(want);
      expect(drawing?.width).toBe(Number(/<svg[^>]*\swidth="([\d.]+)"/.exec(svg)?.[1]));
    }
    expect([...kinds].sort()).toEqual(['difference', 'means', 'periods', 'rates', 'scatter', 'stacked']);
  });

  it('plays a chart into a PDF page whose text pdftotext reads back', async () => {
    const data = sample.find((d) => d.kind === 'rates');
    const svg = await specSvg(chartSpec(data!));
    const doc = new PDFDocument({ size: 'A4', font: null, autoFirstPage: true });
    for (const face of ['regular', 'bold', 'italic'] as const) doc.registerFont(FONT_NAME[face], fontBytes(face));
    const chunks: Buffer[] = [];
    doc.on('data', (c: Buffer) => chunks.push(c));
    const done = new Promise<Buffer>((resolve) => doc.on('end', () => resolve(Buffer.concat(chunks))));
    drawChart(doc, chartDrawing(svg)!, 40, 40, 1);
    doc.end();
    const dir = mkdtempSync(join(tmpdir(), 'warrant-chart-pdf-'));
    try {
      writeFileSync(join(dir, 'c.pdf'), await done);
      const text = spawnSync('pdftotext', [join(dir, 'c.pdf'), '-'], { encoding: 'utf8' }).stdout.replace(/\s+/g, ' ');
      for (const bar of (data as { bars: Array<{ label: string }> }).bars) expect(text).toContain(bar.label);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});

/** A document as the pack sets one up (parsed faces, fixed dates), and its bytes once ended. */
function newDoc(): { doc: PDFKit.Document; done: Promise<Buffer> } {
  return testDoc();
}

/** The texts of a drawing written with pdfkit's own doc.text, as drawChart wrote them before writeLine. */
function drawTextsWithPdfkit(doc: PDFKit.Document, drawing: ChartDrawing, x: number, y: number): void {
  const keep = { x: doc.x, y: doc.y };
  doc.save();
  doc.translate(x, y);
  for (const o of drawing.ops) {
    if (o.op !== 'text') continue;
    doc.font(FONT_NAME[o.face]).fontSize(o.size).fillColor(o.paint.color, o.paint.alpha);
    const w = o.align === 'center' || o.align === 'right' || o.align === 'end' ? doc.widthOfString(o.text) : 0;
    const left = o.x - (o.align === 'center' ? w / 2 : w);
    doc.save();
    doc.transform(...o.m);
    doc.text(o.text, left, o.y, { lineBreak: false, baseline: 'alphabetic' });
    doc.restore();
  }
  doc.restore();
  doc.x = keep.x;
  doc.y = keep.y;
}

describe('chart texts in the PDF', () => {
  const label = fc.string({ unit: fc.constantFrom('a', 'Z', ' ', 'fi', 'ffi', 'AV', 'To', 'ŵ', 'Ł', 'ï', 'i\u0308', '%', '(', '1', '.', '-', '–', '"'), minLength: 1, maxLength: 20 });
  const textOp = fc.record({
    text: label.map((t) => t.replace(/\s+/g, ' ').trim()).filter((t) => t.length > 0),
    x: fc.double({ min: -50, max: 400, noNaN: true }),
    y: fc.double({ min: -50, max: 300, noNaN: true }),
    face: fc.constantFrom('regular' as const, 'bold' as const, 'italic' as const),
    size: fc.constantFrom(8, 9, 9.5, 11),
    align: fc.constantFrom('left', 'center', 'right', 'start', 'end'),
    m: fc.constantFrom<[number, number, number, number, number, number]>([1, 0, 0, 1, 0, 0], [0, -1, 1, 0, 12.5, 80.25], [1, 0, 0, 1, 3.5, -2]),
    color: fc.constantFrom('#1d2733', '#ffffff'),
  });

  it('writes each text with the same bytes as doc.text with an alphabetic baseline (pdfkit 0.20)', async () => {
    await fc.assert(
      fc.asyncProperty(fc.array(textOp, { minLength: 1, maxLength: 8 }), async (texts) => {
        const drawing: ChartDrawing = {
          width: 460,
          height: 200,
          ops: texts.map((t) => ({ op: 'text' as const, text: t.text, x: t.x, y: t.y, m: t.m, face: t.face, size: t.size, align: t.align, paint: { color: t.color, alpha: 1 } })),
        };
        const mine = newDoc();
        drawChart(mine.doc, drawing, 40.5, 60.25, 1);
        mine.doc.end();
        const theirs = newDoc();
        drawTextsWithPdfkit(theirs.doc, drawing, 40.5, 60.25);
        theirs.doc.end();
        expect((await mine.done).equals(await theirs.done)).toBe(true);
      }),
      { numRuns: 60 },
    );
  });
});
