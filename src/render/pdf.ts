/**
 * The evidence pack as a PDF: layout only. Every sentence and number comes ready-made in the PackModel.
 *
 * Properties the committee (and anyone checking the pack) can rely on:
 * - Deterministic: the info dates are fixed (from options or a fixed epoch), so two builds are byte-identical.
 * - Tagged PDF 1.7 (ISO 32000-1, section 14.8): a structure tree in reading order (H1/H2/H3, P, Table/TR/TH/TD,
 *   L/LI/LBody, Figure with alt text), page furniture (header, footer, rules, shading, verdict marks) marked as
 *   Artifact, document language en-GB and the title shown in the viewer's title bar.
 * - Bookmarks for every main section and every claim.
 * - Nothing overflows: every block is measured with the same font before it is drawn, moved to a new page when it
 *   does not fit, and tables repeat their header row on each page they continue on.
 *
 * The page parts live in src/render/pdf/: style.ts (geometry, type, colours), layout.ts (the layout engine and
 * general blocks), tables.ts, marks.ts (verdict marks, badges, tally), front-matter.ts (cover, summary, what
 * changed), claim.ts (a claim's section), back-matter.ts (cautions, methods, glossary, reproducibility) and
 * furniture.ts (header and footer).
 */
import { createHash } from 'node:crypto';
import { deflateRawSync, inflateRawSync } from 'node:zlib';
import PDFDocument from 'pdfkit';
import type { ClaimSection, PackModel } from './model.js';
import { FONT_NAME, fontFor, shapeQuickly } from './fonts.js';
import { Layout } from './pdf/layout.js';
import { drawCover, drawSummary, drawChanges } from './pdf/front-matter.js';
import { drawClaims } from './pdf/claim.js';
import { drawBackMatter } from './pdf/back-matter.js';
import { drawFurniture } from './pdf/furniture.js';
import { MARGIN, PAGE } from './pdf/style.js';

export { MARK_DESCRIPTION } from './pdf/marks.js';

export interface RenderOptions {
  /** Date written into the PDF info dictionary; defaults to a fixed epoch so that builds repeat byte for byte. */
  createdAt?: Date;
  /** Called once every claim's chart is in the document: a build lets the chart thread go then, freeing its memory. */
  chartsDrawn?: () => void;
  /** Called with each claim's chart, drawn at its usual size, when its page has used it (a build writes its files). */
  chartDrawn?: (claim: ClaimSection, svg: string) => void;
}

/** The fixed date used when no creation date is given (a build must not depend on the clock). */
export const FIXED_EPOCH = new Date(Date.UTC(2000, 0, 1, 0, 0, 0));

/** The parts of pdfkit's object for a page's content stream that keepContentAsText wraps. */
interface ContentStream {
  write(chunk: string | Uint8Array): void;
  finalize(): void;
}

/** Node's Buffer#latin1Write (what buf.write(text, offset, 'latin1') calls after checking its arguments). */
interface Latin1Writer {
  latin1Write(text: string, offset: number): number;
}

/** Pages whose operators are kept as they are until pdfkit takes them; those after are kept deflated (a large pack). */
const PAGES_KEPT_PLAIN = 400;

/**
 * pdfkit turns every content operator it is given into a small byte array of its own and, with buffered pages, keeps
 * them all until the document ends: some 160,000 arrays for a pack of 200 charted claims, most of the renderer's
 * memory and much of its garbage collection. Instead, a page's operators are written straight into one reused byte
 * buffer, and handed to pdfkit as one byte array of their own when the next page begins, when another page is written
 * to (page furniture goes to every page at the end), when the page is written, or before any bytes written directly.
 * The bytes are the very same: pdfkit keeps the low byte of each character (latin1) and ends each operator with a line
 * break, as done here. Returns, for each page's content stream, the function that hands over what it has gathered.
 */
function keepContentAsBytes(): (content: ContentStream) => () => void {
  let scratch = Buffer.allocUnsafe(64 * 1024);
  let used = 0;
  /** The hand-over of the page whose operators the buffer holds. */
  let owner: (() => void) | undefined;
  let pages = 0;
  return (content) => {
    const write = content.write.bind(content);
    const finalize = content.finalize.bind(content);
    // pdfkit keeps every buffered page's operators until the document ends (the page furniture is drawn last, on every
    // page), uncompressed: about 26 KB a page, some 100 MB for a pack of 2,000 claims. A page after the first
    // PAGES_KEPT_PLAIN keeps them deflated (raw, fastest level) until pdfkit is next given this page's bytes, when
    // they are inflated and handed over first: the same bytes, in the same order, in a fifth of the memory.
    const deferred = ++pages > PAGES_KEPT_PLAIN;
    let stored: Buffer | undefined;
    const release = (): void => {
      if (stored === undefined) return;
      const bytes = inflateRawSync(stored);
      stored = undefined;
      write(bytes);
    };
    let handed = false;
    const flush = (): void => {
      if (owner !== flush) return;
      owner = undefined;
      if (used === 0) return;
      const bytes = Buffer.from(scratch.subarray(0, used));
      used = 0;
      if (deferred && !handed && stored === undefined) {
        const packed = deflateRawSync(bytes, { level: 1 });
        // zlib's result is a view of a buffer of 16 KB or more: copied, so that only the deflated bytes are kept.
        stored = Buffer.from(packed);
        return;
      }
      release();
      handed = true;
      write(bytes);
    };
    content.write = (chunk: string | Uint8Array): void => {
      if (chunk instanceof Uint8Array) {
        flush();
        release();
        handed = true;
        write(chunk);
        return;
      }
      if (owner !== flush) {
        owner?.();
        owner = flush;
      }
      if (used + chunk.length + 1 > scratch.length) {
        const grown = Buffer.allocUnsafe(Math.max(2 * scratch.length, used + chunk.length + 1));
        scratch.copy(grown, 0, 0, used);
        scratch = grown;
      }
      used += (scratch as unknown as Latin1Writer).latin1Write(chunk, used);
      scratch[used++] = 10;
    };
    content.finalize = (): void => {
      flush();
      release();
      finalize();
    };
    return flush;
  };
}

/** The parts of pdfkit's document that setting a colour goes through. */
export interface ColorSetter {
  fillColor(color: unknown, opacity?: unknown): unknown;
  strokeColor(color: unknown, opacity?: unknown): unknown;
  addContent(data: string): unknown;
  _fillColor: unknown;
}

/**
 * Colours set as '#rrggbb' without an opacity (every colour of the pack's pages) are written from the operators pdfkit
 * wrote for them the first time — "/DeviceRGB cs" (or CS) and the three parts over 255 with "scn" (or SCN), as
 * _setColorCore writes them — instead of parsing the colour again each time (setFont sets one for every text);
 * pdfkit's own handles any other colour.
 */
export function quickColors(doc: ColorSetter): void {
  const fill = doc.fillColor.bind(doc);
  const stroke = doc.strokeColor.bind(doc);
  const operators = new Map<string, [string, string]>();
  const plain = (color: unknown, opacity: unknown): color is string =>
    opacity === undefined && typeof color === 'string' && color.length === 7 && /^#[0-9a-fA-F]{6}$/.test(color);
  const ops = (color: string): [string, string] => {
    let known = operators.get(color);
    if (known === undefined) {
      const hex = parseInt(color.slice(1), 16);
      const parts = [hex >> 16, (hex >> 8) & 0xff, hex & 0xff].map((part) => part / 255).join(' ');
      known = [`/DeviceRGB cs\n${parts} scn`, `/DeviceRGB CS\n${parts} SCN`];
      operators.set(color, known);
    }
    return known;
  };
  doc.fillColor = (color: unknown, opacity?: unknown): unknown => {
    if (!plain(color, opacity)) return fill(color, opacity);
    doc.addContent(ops(color)[0]);
    doc._fillColor = [color, opacity];
    return doc;
  };
  doc.strokeColor = (color: unknown, opacity?: unknown): unknown => {
    if (!plain(color, opacity)) return stroke(color, opacity);
    doc.addContent(ops(color)[1]);
    return doc;
  };
}

/** The part of pdfkit's document that writes the file's bytes. */
export interface OutputStream {
  _offset: number;
  _write(data: string | Uint8Array): void;
}

/**
 * pdfkit writes the file a line at a time: every object number, dictionary and keyword is copied character by character
 * into a byte array of its own and pushed through the document's stream, some 40,000 pushes for a pack of 200 claims.
 * This keeps what is written from here on instead, the text as one string and byte arrays as they are, and returns
 * the function that hands it all over as bytes once the document has ended. The bytes and the offsets pdfkit counts
 * (for the cross-reference table) are the very same: a line is its characters' low bytes (latin1), then a line break.
 * What pdfkit wrote before this was called (the file's header) still comes through the stream, ahead of it.
 */
export function keepOutput(stream: OutputStream): () => Buffer[] {
  const parts: Buffer[] = [];
  let text = '';
  const flush = (): void => {
    if (text.length === 0) return;
    parts.push(Buffer.from(text, 'latin1'));
    text = '';
  };
  stream._write = (data: string | Uint8Array): void => {
    if (data instanceof Uint8Array) {
      flush();
      // A compressed stream can be a small view of zlib's larger buffer: copied then, so the buffer is let go.
      const whole = data.byteLength * 2 >= data.buffer.byteLength;
      parts.push(whole ? Buffer.from(data.buffer, data.byteOffset, data.byteLength) : Buffer.from(data));
      stream._offset += data.length;
    } else {
      const line = `${data}\n`;
      text += line;
      stream._offset += line.length;
      // Made bytes every 64 K characters: while the pages are drawn, pdfkit writes the objects it has ended (the
      // structure tree's parts) and no stream, and the text grew into one string of some 650,000 joined pieces.
      if (text.length > 65536) flush();
    }
  };
  return () => {
    flush();
    return parts;
  };
}

/** Render the evidence pack. Deterministic: the same model and options give the same bytes. */
export async function renderPdf(model: PackModel, options: RenderOptions = {}): Promise<Buffer> {
  return Buffer.concat(await renderPdfParts(model, options));
}

/**
 * The evidence pack as the pieces of its bytes in order, to be written one after another (joined, the PDF of a pack
 * of 3,000 claims was held twice at the end, some 60 MB).
 */
export async function renderPdfParts(model: PackModel, options: RenderOptions = {}): Promise<Buffer[]> {
  if (!model.title.trim()) throw new Error('Pack model: the title is empty; a title is required for the PDF.');
  const created = options.createdAt ?? FIXED_EPOCH;
  if (Number.isNaN(created.getTime())) throw new Error('Render options: createdAt is not a valid date.');

  // Each claim's chart is asked for when its page comes (on the chart thread, the pack's charts were asked for ahead,
  // charts.ts's prefetchCharts), and let go once drawn: held all at once, they grew with the number of claims.
  const doc = new PDFDocument({
    size: 'A4',
    margins: MARGIN,
    bufferPages: true,
    autoFirstPage: false,
    tagged: true,
    lang: 'en-GB',
    displayTitle: true,
    pdfVersion: '1.7',
    font: null,
    info: {
      Title: model.title,
      Author: model.organisation,
      Subject: model.description ?? 'Evidence pack',
      Creator: 'warrant',
      Producer: 'warrant',
      CreationDate: created,
      ModDate: created,
      // A digest of everything drawn: pdfkit derives the document ID from the info dictionary, so this makes the ID
      // follow the content (two different packs never share an ID; the same pack always gets the same one).
      ContentDigest: createHash('sha256').update(JSON.stringify(model)).digest('hex').slice(0, 32),
    },
  });
  for (const face of ['regular', 'bold', 'italic'] as const) doc.registerFont(FONT_NAME[face], fontFor(face));
  shapeQuickly(doc);
  quickColors(doc as unknown as ColorSetter);
  const keepContent = keepContentAsBytes();
  let lastPage: (() => void) | undefined;
  doc.on('pageAdded', () => {
    lastPage?.();
    lastPage = keepContent((doc as unknown as { page: { content: ContentStream } }).page.content);
  });
  const chunks: Buffer[] = [];
  doc.on('data', (c: Buffer) => chunks.push(c));
  const written = keepOutput(doc as unknown as OutputStream);
  const finished = new Promise<Buffer[]>((resolve, reject) => {
    doc.on('end', () => resolve([...chunks, ...written()]));
    doc.on('error', reject);
  });

  const L = new Layout(doc);
  L.newPage();
  const root = doc.struct('Document');
  doc.addStructure(root);
  const bookmark = (title: string): PDFKit.OutlineItem => doc.outline.addItem(title, { left: PAGE.width, top: L.y - 12 });

  drawCover(L, model, root, bookmark);
  drawSummary(L, model, root, bookmark);
  drawChanges(L, model, root, bookmark);
  await drawClaims(L, model, root, options.chartDrawn);
  options.chartsDrawn?.();
  drawBackMatter(L, model, root, bookmark);
  drawFurniture(L, model);

  root.end();
  doc.end();
  return finished;
}
