/**
 * Minimal type declarations for the untyped libraries the renderer uses (pdfkit 0.20, fontkit 2, svg-to-pdfkit).
 * Only the members used in src/render are declared.
 */
declare module 'fontkit' {
  export interface Glyph {
    id: number;
    advanceWidth: number;
    codePoints: number[];
  }
  export interface GlyphPosition {
    xAdvance: number;
    yAdvance: number;
    xOffset: number;
    yOffset: number;
  }
  export interface GlyphRun {
    glyphs: Glyph[];
    positions: GlyphPosition[];
    advanceWidth: number;
  }
  export interface Font {
    unitsPerEm: number;
    ascent: number;
    descent: number;
    postscriptName: string;
    layout(text: string, features?: unknown): GlyphRun;
    hasGlyphForCodePoint(codePoint: number): boolean;
    glyphForCodePoint(codePoint: number): Glyph;
    getGlyph(id: number, codePoints?: number[]): Glyph;
  }
  export function create(buffer: Buffer | Uint8Array): Font;
}

declare module 'svg-to-pdfkit' {
  interface SvgToPdfOptions {
    width?: number;
    height?: number;
    assumePt?: boolean;
    precision?: number;
    preserveAspectRatio?: string;
    fontCallback?: (family: string, bold: boolean, italic: boolean, options: { fauxItalic: boolean; fauxBold: boolean }) => string;
    warningCallback?: (message: string) => void;
  }
  function SVGtoPDF(doc: unknown, svg: string, x: number, y: number, options?: SvgToPdfOptions): void;
  export default SVGtoPDF;
}

/** pdfkit's document API (global namespace, as in pdfkit's own typings). */
declare namespace PDFKit {
  interface TextOptions {
    width?: number;
    height?: number;
    align?: 'left' | 'center' | 'right' | 'justify';
    lineGap?: number;
    paragraphGap?: number;
    continued?: boolean;
    lineBreak?: boolean;
    ellipsis?: boolean | string;
    indent?: number;
    /** OpenType features: a list to switch on, or a map switching each on (true) or off (false), e.g. { kern: false }. */
    features?: string[] | Record<string, boolean>;
    characterSpacing?: number;
    destination?: string;
    goTo?: string;
    /** Where y is: 'alphabetic' puts the baseline there (the default is the top of the line). */
    baseline?: 'alphabetic' | 'top' | 'middle' | 'bottom' | 'hanging' | 'ideographic' | number;
  }
  interface StructureElement {
    add(child: StructureElement | (() => void)): StructureElement;
    end(): void;
  }
  interface OutlineItem {
    addItem(title: string, options?: { top?: number; left?: number; zoom?: number; expanded?: boolean; fit?: boolean }): OutlineItem;
  }
  interface Page {
    width: number;
    height: number;
    margins: { top: number; bottom: number; left: number; right: number };
  }
  interface DocumentInfo {
    Title?: string;
    Author?: string;
    Subject?: string;
    Keywords?: string;
    Creator?: string;
    Producer?: string;
    CreationDate?: Date;
    ModDate?: Date;
    /** Custom entries are written into the Info dictionary as text. */
    [key: string]: string | Date | undefined;
  }
  interface DocumentOptions {
    size?: string | [number, number];
    margins?: { top: number; bottom: number; left: number; right: number };
    bufferPages?: boolean;
    autoFirstPage?: boolean;
    tagged?: boolean;
    lang?: string;
    displayTitle?: boolean;
    pdfVersion?: '1.3' | '1.4' | '1.5' | '1.6' | '1.7' | '1.7ext3';
    info?: DocumentInfo;
    compress?: boolean;
    font?: string | null;
  }
  interface Document extends NodeJS.ReadableStream {
    x: number;
    y: number;
    page: Page;
    info: DocumentInfo;
    outline: OutlineItem;
    registerFont(name: string, src: string | Buffer | import('fontkit').Font): this;
    font(name: string): this;
    fontSize(size: number): this;
    fillColor(color: string | [number, number, number], opacity?: number): this;
    strokeColor(color: string | [number, number, number], opacity?: number): this;
    lineWidth(w: number): this;
    lineCap(cap: string): this;
    lineJoin(join: string): this;
    miterLimit(m: number): this;
    bezierCurveTo(cp1x: number, cp1y: number, cp2x: number, cp2y: number, x: number, y: number): this;
    transform(a: number, b: number, c: number, d: number, e: number, f: number): this;
    translate(x: number, y: number): this;
    scale(s: number): this;
    clip(rule?: string): this;
    text(text: string, x?: number, y?: number, options?: TextOptions): this;
    widthOfString(text: string, options?: TextOptions): number;
    heightOfString(text: string, options?: TextOptions): number;
    currentLineHeight(includeGap?: boolean): number;
    addPage(options?: DocumentOptions): this;
    switchToPage(n: number): Page;
    bufferedPageRange(): { start: number; count: number };
    flushPages(): void;
    moveTo(x: number, y: number): this;
    lineTo(x: number, y: number): this;
    rect(x: number, y: number, w: number, h: number): this;
    roundedRect(x: number, y: number, w: number, h: number, r: number): this;
    circle(x: number, y: number, r: number): this;
    polygon(...points: Array<[number, number]>): this;
    closePath(): this;
    fill(color?: string): this;
    stroke(color?: string): this;
    fillAndStroke(fill?: string, stroke?: string): this;
    dash(length: number | number[], options?: { space?: number; phase?: number }): this;
    undash(): this;
    save(): this;
    restore(): this;
    struct(type: string, options?: { alt?: string; lang?: string; actual?: string; bbox?: number[]; placement?: string }, children?: (() => void) | StructureElement[]): StructureElement;
    addStructure(el: StructureElement): this;
    markContent(tag: string, options?: { type?: string; bbox?: number[] } | null): this;
    endMarkedContent(): this;
    addNamedDestination(name: string, ...args: unknown[]): void;
    end(): void;
  }
}

declare module 'pdfkit' {
  const PDFDocument: new (options?: PDFKit.DocumentOptions) => PDFKit.Document;
  export default PDFDocument;
}

declare module 'linebreak' {
  /** The Unicode line breaking algorithm (UAX #14), as pdfkit's line wrapper uses it. */
  export default class LineBreaker {
    constructor(text: string);
    nextBreak(): { position: number; required: boolean } | null;
  }
}
