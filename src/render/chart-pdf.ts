/**
 * Charts drawn straight into the PDF from Vega's scene graph, without an SVG round trip.
 *
 * Vega draws a scene through a small part of the HTML canvas API (paths, fills, strokes, clips, text). A recording
 * context here stands in for that canvas: Vega's own mark painters (`Marks[type].draw`, the same code its canvas
 * renderer runs) draw the scene into it, and it keeps what they drew as a short list of paint operations, each with
 * its path, colour and line settings. The list is then played into pdfkit at the place the chart goes, with the pack's
 * embedded faces for text. The SVG files beside the pack are still made by Vega's SVG renderer from the same scene.
 *
 * A scene using anything the recorder does not know (gradients, images, blend modes, outlined text) is not recorded
 * (`recordScene` returns undefined) and the chart is drawn from its SVG as before.
 */
import type { Face } from './fonts.js';
import { faceFor, FONT_NAME } from './fonts.js';
import { writeLine } from './pdf/fragment.js';

/** A path: moveTo (M), lineTo (L), cubic curve (C), rectangle (R) and close (Z), in the coordinates in force. */
type Segment = ['M', number, number] | ['L', number, number] | ['C', number, number, number, number, number, number] | ['R', number, number, number, number] | ['Z'];

/** A colour pdfkit takes (a hex or CSS name, or red-green-blue 0-255) with its opacity. */
interface Paint {
  color: string | [number, number, number];
  alpha: number;
}

type Op =
  | { op: 'save' }
  | { op: 'restore' }
  | { op: 'fill'; path: Segment[]; paint: Paint }
  | { op: 'stroke'; path: Segment[]; paint: Paint; width: number; cap: string; join: string; miter: number; dash: number[]; dashOffset: number }
  | { op: 'clip'; path: Segment[] }
  | { op: 'text'; text: string; x: number; y: number; m: Matrix; face: Face; size: number; align: string; paint: Paint };

/** An affine transformation [a, b, c, d, e, f] as in canvas and PDF: x' = a x + c y + e, y' = b x + d y + f. */
type Matrix = [number, number, number, number, number, number];

/** A chart as paint operations, in its own coordinates (0, 0 top left; width by height). */
export interface ChartDrawing {
  width: number;
  height: number;
  ops: Op[];
}

class Unsupported extends Error {}

/** Named colours the recorder treats as no paint at all. */
const NO_PAINT = new Set(['none', 'transparent']);

/** A canvas colour as pdfkit takes it, or undefined for no paint. rgb()/rgba() become numbers; hex and names pass. */
function paintOf(style: unknown, alpha: number): Paint | undefined {
  if (typeof style !== 'string') throw new Unsupported(`paint ${typeof style}`);
  const s = style.trim().toLowerCase();
  if (NO_PAINT.has(s) || alpha <= 0) return undefined;
  if (/^#[0-9a-f]{3}([0-9a-f]{3})?$/.test(s) || /^[a-z]+$/.test(s)) return { color: s, alpha };
  const m = /^rgba?\(\s*([\d.]+)\s*,\s*([\d.]+)\s*,\s*([\d.]+)\s*(?:,\s*([\d.]+)\s*)?\)$/.exec(s);
  if (!m) throw new Unsupported(`colour ${style}`);
  const a = m[4] === undefined ? 1 : Number(m[4]);
  if (a <= 0) return undefined;
  return { color: [Number(m[1]), Number(m[2]), Number(m[3])], alpha: alpha * a };
}

/** The face and size in a canvas font string such as `italic bold 11px Noto Sans`. */
function fontOf(font: string): { face: Face; size: number } {
  const size = /(?:^|\s)([\d.]+)px\s/.exec(font);
  if (!size) throw new Unsupported(`font ${font}`);
  const words = font.slice(0, size.index).trim().split(/\s+/);
  const style = words.find((w) => w === 'italic' || w === 'oblique');
  const weight = words.find((w) => w === 'bold' || w === 'bolder' || /^\d+$/.test(w));
  return { face: faceFor(weight, style), size: Number(size[1]) };
}

/**
 * The part of the canvas 2D context Vega's mark painters use, recording instead of drawing. As in a canvas, a path's
 * points are placed by the transformation in force when each is added (Vega moves to a symbol's place, builds its
 * path and moves back before filling it), so paths are kept in the chart's own coordinates, quadratic curves and arcs
 * turned into cubic curves (PDF has no others). Fill, stroke, clip and text record an operation with the state in
 * force; text keeps its transformation (axis titles are turned).
 */
class RecordingContext {
  ops: Op[] = [];
  fillStyle: unknown = '#000000';
  strokeStyle: unknown = '#000000';
  lineWidth = 1;
  lineCap = 'butt';
  lineJoin = 'miter';
  miterLimit = 10;
  globalAlpha = 1;
  lineDashOffset = 0;
  font = '10px sans-serif';
  textAlign = 'start';
  textBaseline = 'alphabetic';
  private compositeOperation = 'source-over';
  private dash: number[] = [];
  private path: Segment[] = [];
  private start: [number, number] | undefined;
  private at: [number, number] | undefined;
  private m: Matrix = [1, 0, 0, 1, 0, 0];
  private stack: Array<{ m: Matrix; fillStyle: unknown; strokeStyle: unknown; lineWidth: number; lineCap: string; lineJoin: string; miterLimit: number; globalAlpha: number; lineDashOffset: number; font: string; textAlign: string; dash: number[] }> = [];
  readonly pixelRatio = 1;

  get globalCompositeOperation(): string {
    return this.compositeOperation;
  }
  set globalCompositeOperation(v: string) {
    if (v !== 'source-over') throw new Unsupported(`blend ${v}`);
    this.compositeOperation = v;
  }

  save(): void {
    const { m, fillStyle, strokeStyle, lineWidth, lineCap, lineJoin, miterLimit, globalAlpha, lineDashOffset, font, textAlign, dash } = this;
    this.stack.push({ m: [...m], fillStyle, strokeStyle, lineWidth, lineCap, lineJoin, miterLimit, globalAlpha, lineDashOffset, font, textAlign, dash });
    this.ops.push({ op: 'save' });
  }
  restore(): void {
    const s = this.stack.pop();
    if (!s) return;
    Object.assign(this, s);
    this.ops.push({ op: 'restore' });
  }
  translate(x: number, y: number): void {
    const m = this.m;
    m[4] += m[0] * x + m[2] * y;
    m[5] += m[1] * x + m[3] * y;
  }
  rotate(angle: number): void {
    const [a, b, c, d] = this.m;
    const cos = Math.cos(angle);
    const sin = Math.sin(angle);
    this.m[0] = a * cos + c * sin;
    this.m[1] = b * cos + d * sin;
    this.m[2] = c * cos - a * sin;
    this.m[3] = d * cos - b * sin;
  }
  scale(x: number, y: number): void {
    if (x !== y) throw new Unsupported('uneven scale');
    for (let i = 0; i < 4; i++) this.m[i] = (this.m[i] as number) * x;
  }
  /** How much the transformation in force stretches lengths (line widths, dashes). */
  private stretch(): number {
    const [a, b, c, d] = this.m;
    return Math.sqrt(Math.abs(a * d - b * c));
  }
  private px(x: number, y: number): number {
    return this.m[0] * x + this.m[2] * y + this.m[4];
  }
  private py(x: number, y: number): number {
    return this.m[1] * x + this.m[3] * y + this.m[5];
  }
  setLineDash(d: number[]): void {
    this.dash = [...d];
  }

  beginPath(): void {
    this.path = [];
    this.start = this.at = undefined;
  }
  moveTo(x: number, y: number): void {
    this.path.push(['M', this.px(x, y), this.py(x, y)]);
    this.start = this.at = [x, y];
  }
  lineTo(x: number, y: number): void {
    if (!this.at) return this.moveTo(x, y);
    this.path.push(['L', this.px(x, y), this.py(x, y)]);
    this.at = [x, y];
  }
  bezierCurveTo(a: number, b: number, c: number, d: number, x: number, y: number): void {
    if (!this.at) this.moveTo(a, b);
    this.path.push(['C', this.px(a, b), this.py(a, b), this.px(c, d), this.py(c, d), this.px(x, y), this.py(x, y)]);
    this.at = [x, y];
  }
  quadraticCurveTo(cx: number, cy: number, x: number, y: number): void {
    if (!this.at) this.moveTo(cx, cy);
    const [x0, y0] = this.at as [number, number];
    this.bezierCurveTo(x0 + (2 / 3) * (cx - x0), y0 + (2 / 3) * (cy - y0), x + (2 / 3) * (cx - x), y + (2 / 3) * (cy - y), x, y);
  }
  rect(x: number, y: number, w: number, h: number): void {
    const [a, b, c, d] = this.m;
    if (b === 0 && c === 0 && a > 0 && d > 0) this.path.push(['R', this.px(x, y), this.py(x, y), w * a, h * d]);
    else {
      this.moveTo(x, y);
      this.lineTo(x + w, y);
      this.lineTo(x + w, y + h);
      this.lineTo(x, y + h);
      this.path.push(['Z']);
    }
    this.start = this.at = [x, y];
  }
  closePath(): void {
    if (!this.at) return;
    this.path.push(['Z']);
    this.at = this.start;
  }
  /** The canvas arc: a line to its start, then the sweep as cubic curves of at most a quarter turn each. */
  arc(cx: number, cy: number, r: number, a0: number, a1: number, ccw = false): void {
    const TAU = 2 * Math.PI;
    let sweep: number;
    if (!ccw) sweep = a1 - a0 >= TAU ? TAU : ((((a1 - a0) % TAU) + TAU) % TAU);
    else sweep = a0 - a1 >= TAU ? -TAU : -((((a0 - a1) % TAU) + TAU) % TAU);
    const sx = cx + r * Math.cos(a0);
    const sy = cy + r * Math.sin(a0);
    if (this.at) this.lineTo(sx, sy);
    else this.moveTo(sx, sy);
    if (r <= 0 || sweep === 0) return;
    const n = Math.ceil(Math.abs(sweep) / (Math.PI / 2) - 1e-9);
    const step = sweep / n;
    const k = (4 / 3) * Math.tan(step / 4);
    let a = a0;
    for (let i = 0; i < n; i++) {
      const b = a + step;
      const [ca, sa, cb, sb] = [Math.cos(a), Math.sin(a), Math.cos(b), Math.sin(b)];
      this.bezierCurveTo(cx + r * (ca - k * sa), cy + r * (sa + k * ca), cx + r * (cb + k * sb), cy + r * (sb - k * cb), cx + r * cb, cy + r * sb);
      a = b;
    }
  }

  fill(): void {
    const paint = paintOf(this.fillStyle, this.globalAlpha);
    if (paint && this.path.length > 0) this.ops.push({ op: 'fill', path: this.path, paint });
  }
  stroke(): void {
    const paint = paintOf(this.strokeStyle, this.globalAlpha);
    if (!paint || this.path.length === 0 || !(this.lineWidth > 0)) return;
    this.ops.push({
      op: 'stroke',
      path: this.path,
      paint,
      width: this.lineWidth * this.stretch(),
      cap: this.lineCap,
      join: this.lineJoin,
      miter: this.miterLimit,
      dash: this.dash.map((x) => x * this.stretch()),
      dashOffset: this.lineDashOffset * this.stretch(),
    });
  }
  clip(): void {
    this.ops.push({ op: 'clip', path: this.path });
  }
  /** Text as its SVG shows it (and as the pack showed it when drawn from the SVG): runs of white space as one space. */
  fillText(raw: string, x: number, y: number): void {
    const text = String(raw).replace(/\s+/g, ' ').trim();
    const paint = paintOf(this.fillStyle, this.globalAlpha);
    if (!paint || text.length === 0) return;
    this.ops.push({ op: 'text', text, x, y, m: [...this.m], ...fontOf(this.font), align: this.textAlign, paint });
  }
  strokeText(): void {
    throw new Unsupported('outlined text');
  }
  createLinearGradient(): never {
    throw new Unsupported('gradient');
  }
  createRadialGradient(): never {
    throw new Unsupported('gradient');
  }
  createPattern(): never {
    throw new Unsupported('pattern');
  }
  drawImage(): never {
    throw new Unsupported('image');
  }
}

/** Vega's mark painters, each called as its canvas renderer calls it. */
interface MarkPainters {
  [type: string]: { draw: (this: unknown, ctx: unknown, scene: unknown, bounds: unknown, markTypes?: unknown) => void };
}

/**
 * Record the scene of a Vega view as paint operations: the background, then the scene at the view's origin, painted
 * by Vega's own canvas mark painters. Undefined when the scene uses something the recorder does not draw.
 */
export function recordScene(
  marks: MarkPainters,
  scene: { marktype: string; clip?: unknown },
  size: { width: number; height: number; origin: [number, number]; background?: string | null },
): ChartDrawing | undefined {
  const ctx = new RecordingContext();
  // As vega's CanvasRenderer.draw: clip a mark's items to its group when asked, then paint the mark.
  const renderer = {
    draw(c: RecordingContext, s: { marktype: string; clip?: unknown; group?: { width?: number; height?: number } }, bounds: unknown, markTypes?: unknown): void {
      const mark = marks[s.marktype];
      if (!mark) throw new Unsupported(`mark ${s.marktype}`);
      if (s.clip) {
        if (typeof s.clip === 'function') throw new Unsupported('clip path');
        c.save();
        c.beginPath();
        c.rect(0, 0, s.group?.width ?? 0, s.group?.height ?? 0);
        c.clip();
      }
      mark.draw.call(renderer, c, s, bounds, markTypes);
      if (s.clip) c.restore();
    },
  };
  try {
    if (size.background) {
      ctx.beginPath();
      ctx.rect(0, 0, size.width, size.height);
      ctx.fillStyle = size.background;
      ctx.fill();
    }
    ctx.save();
    ctx.translate(size.origin[0], size.origin[1]);
    renderer.draw(ctx, scene, null);
    ctx.restore();
  } catch (e) {
    if (e instanceof Unsupported) {
      if (process.env.WARRANT_DEBUG_CHARTS) console.error('chart drawn from its SVG:', e.message);
      return undefined;
    }
    throw e;
  }
  return { width: size.width, height: size.height, ops: ctx.ops };
}

/** The part of pdfkit's document the player uses. */
type Doc = PDFKit.Document;

function tracePath(doc: Doc, path: Segment[]): void {
  for (const s of path) {
    switch (s[0]) {
      case 'M':
        doc.moveTo(s[1], s[2]);
        break;
      case 'L':
        doc.lineTo(s[1], s[2]);
        break;
      case 'C':
        doc.bezierCurveTo(s[1], s[2], s[3], s[4], s[5], s[6]);
        break;
      case 'R':
        doc.rect(s[1], s[2], s[3], s[4]);
        break;
      default:
        doc.closePath();
    }
  }
}

/** Play a recorded chart into the PDF with its top left corner at (x, y), scaled by `scale`. */
export function drawChart(doc: Doc, drawing: ChartDrawing, x: number, y: number, scale: number): void {
  const keep = { x: doc.x, y: doc.y };
  doc.save();
  doc.translate(x, y);
  if (scale !== 1) doc.scale(scale);
  for (const o of drawing.ops) {
    switch (o.op) {
      case 'save':
        doc.save();
        break;
      case 'restore':
        doc.restore();
        break;
      case 'fill':
        tracePath(doc, o.path);
        doc.fillColor(o.paint.color, o.paint.alpha).fill();
        break;
      case 'stroke':
        tracePath(doc, o.path);
        doc.strokeColor(o.paint.color, o.paint.alpha).lineWidth(o.width);
        doc.lineCap(o.cap).lineJoin(o.join).miterLimit(o.miter);
        if (o.dash.length > 0 && o.dash.every((d) => d > 0)) doc.dash(o.dash, { phase: o.dashOffset });
        else doc.undash();
        doc.stroke();
        break;
      case 'clip':
        tracePath(doc, o.path);
        doc.clip();
        break;
      default: {
        doc.font(FONT_NAME[o.face]).fontSize(o.size).fillColor(o.paint.color, o.paint.alpha);
        const w = o.align === 'center' || o.align === 'right' || o.align === 'end' ? doc.widthOfString(o.text) : 0;
        const left = o.x - (o.align === 'center' ? w / 2 : w);
        doc.save();
        doc.transform(...o.m);
        // As doc.text(o.text, left, o.y, { lineBreak: false, baseline: 'alphabetic' }) writes it, without laying the
        // text out again and measuring it twice (doc.x and doc.y, which that moves, are put back below).
        if (!writeLine(doc, o.text, left, o.y, 'alphabetic')) doc.text(o.text, left, o.y, { lineBreak: false, baseline: 'alphabetic' });
        doc.restore();
      }
    }
  }
  doc.restore();
  doc.x = keep.x;
  doc.y = keep.y;
}
