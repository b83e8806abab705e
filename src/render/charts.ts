/**
 * Charts for the evidence pack: ChartData -> Vega-Lite spec -> Vega view (headless, no canvas) -> SVG string.
 * The SVG is drawn into the PDF as vectors by pdf.ts. Turning a spec into a drawing (compiling, parsing, the headless
 * view, text widths measured with the faces the PDF embeds) is chart-runtime.ts's work; this module builds the specs.
 *
 *   ChartData --chartSpec--> Vega-Lite spec --vega-lite compile--> Vega spec --View(renderer none)--> SVG
 */
import type { ChartData } from './model.js';
import { count, percent } from '../format/numbers.js';
import { CHART_FONT_FAMILY, textWidth } from './fonts.js';
import { compileVegaLite, drawSpec, keepDrawing } from './chart-runtime.js';
import { KeptUntilUsed } from './kept.js';
import { chartThread } from './chart-thread.js';
import { shareRange, shareValues, WHOLE_SHARE } from './chart-scales.js';

/**
 * Chart palette (our own). Safe for colour-blind readers because the three colours differ strongly in lightness
 * (dark blue about L* 35, orange about L* 60, light grey-blue about L* 75), so they stay distinct in greyscale and
 * under every common colour-vision deficiency; blue against orange is also the hue pair dichromats separate best.
 * No meaning is carried by colour alone: the reference line is also dashed and labelled.
 */
export const PALETTE = {
  ink: '#1d2733',
  muted: '#5b6673',
  grid: '#e3e6ea',
  primary: '#1f4e8c',
  secondary: '#c4620f',
  light: '#9db8d6',
} as const;

/** Outer size of every chart in points (the PDF draws the SVG at 1 px = 1 pt). */
export const CHART_WIDTH = 460;
export const CHART_HEIGHT = 200;

const AXIS_LABEL_SIZE = 9;
const AXIS_TITLE_SIZE = 9.5;

function baseConfig(): Record<string, unknown> {
  return {
    font: CHART_FONT_FAMILY,
    background: '#ffffff',
    view: { stroke: null },
    axis: {
      labelFont: CHART_FONT_FAMILY,
      titleFont: CHART_FONT_FAMILY,
      labelFontSize: AXIS_LABEL_SIZE,
      titleFontSize: AXIS_TITLE_SIZE,
      titleFontWeight: 'normal',
      labelColor: PALETTE.ink,
      titleColor: PALETTE.ink,
      domainColor: PALETTE.muted,
      tickColor: PALETTE.muted,
      gridColor: PALETTE.grid,
      labelLimit: 0,
      titlePadding: 8,
    },
    text: { font: CHART_FONT_FAMILY, fontSize: AXIS_LABEL_SIZE, color: PALETTE.ink },
  };
}

/** A share axis over `domain`: grid every 10%, labels every 10% or, on a wide range, every 20% (never "90%100%"). */
function shareAxis(domain: [number, number], extra: Record<string, unknown> = {}): Record<string, unknown> {
  const tenths: number[] = [];
  for (let k = Math.round(domain[0] * 10); k <= Math.round(domain[1] * 10); k++) tenths.push(k / 10);
  const every = tenths.length > 7 ? 20 : 10;
  return {
    format: '.0%',
    values: tenths,
    labelExpr: `round(datum.value * 100) % ${every} === 0 ? datum.label : ''`,
    grid: true,
    ...extra,
  };
}

function requireFinite(value: number, what: string): void {
  if (!Number.isFinite(value)) throw new Error(`Chart data: ${what} is ${value}; a finite number is required.`);
}

/**
 * An axis domain that contains every value with a little room, with ends on a round step (a 1, 2 or 5 multiple
 * of a power of ten chosen so the range holds about five steps).
 */
export function roundDomain(values: number[]): [number, number] {
  let lo = Math.min(...values);
  let hi = Math.max(...values);
  if (lo === hi) {
    const pad = lo === 0 ? 1 : Math.abs(lo) * 0.1;
    lo -= pad;
    hi += pad;
  }
  const raw = (hi - lo) / 5;
  const power = 10 ** Math.floor(Math.log10(raw));
  const step = ([1, 2, 5, 10].find((m) => m * power >= raw) ?? 10) * power;
  const pad = (hi - lo) * 0.02;
  return [Math.floor((lo - pad) / step) * step, Math.ceil((hi + pad) / step) * step];
}

/** Outer height of a rates chart: about 30 pt a row plus the axis, within 110..CHART_HEIGHT + 60. */
export function ratesChartHeight(rows: number): number {
  return Math.max(110, Math.min(CHART_HEIGHT + 60, 56 + rows * 30));
}

function ratesSpec(data: Extract<ChartData, { kind: 'rates' }>, maxHeight: number): Record<string, unknown> {
  if (data.bars.length === 0) throw new Error('Chart data: a rates chart needs at least one bar.');
  const rows = data.bars.map((b) => {
    requireFinite(b.rate, `rate of "${b.label}"`);
    requireFinite(b.lower, `lower bound of "${b.label}"`);
    requireFinite(b.upper, `upper bound of "${b.label}"`);
    return { label: b.label, n: b.n, value: b.rate, lower: b.lower, upper: b.upper, text: percent(b.rate, data.digits) };
  });
  if (data.reference) requireFinite(data.reference.value, 'reference value');
  const domain = data.domain ?? shareRange(shareValues(data));
  return dotIntervalSpec(rows, data.axisTitle, domain, shareAxis(domain, { domain: false }), maxHeight, data.reference, data.highlight);
}

function meansSpec(data: Extract<ChartData, { kind: 'means' }>, maxHeight: number): Record<string, unknown> {
  if (data.bars.length === 0) throw new Error('Chart data: a means chart needs at least one bar.');
  const [lo, hi] = data.domain;
  requireFinite(lo, 'lower end of the scale');
  requireFinite(hi, 'upper end of the scale');
  if (!(hi > lo)) throw new Error(`Chart data: the scale [${lo}, ${hi}] of a means chart is empty.`);
  const rows = data.bars.map((b) => {
    requireFinite(b.mean, `mean of "${b.label}"`);
    requireFinite(b.lower, `lower bound of "${b.label}"`);
    requireFinite(b.upper, `upper bound of "${b.label}"`);
    return { label: b.label, n: b.n, value: b.mean, lower: b.lower, upper: b.upper, text: b.mean.toFixed(2) };
  });
  const ticks = hi - lo <= 10 && Number.isInteger(lo) && Number.isInteger(hi) ? hi - lo : 5;
  return dotIntervalSpec(rows, data.axisTitle, [lo, hi], { format: '~g', grid: true, tickCount: ticks, domain: false }, maxHeight);
}

/** Dots with interval bars, one row per selection in data order, labels with n, values in a column at the right. */
function dotIntervalSpec(
  rowsIn: Array<{ label: string; n: number; value: number; lower: number; upper: number; text: string }>,
  axisTitle: string,
  domain: [number, number],
  axis: Record<string, unknown>,
  maxHeight: number,
  reference?: { value: number; label: string },
  highlight?: string,
): Record<string, unknown> {
  const [lo, hi] = domain;
  const values = rowsIn.map((r, i) => ({
    order: i,
    row: `${r.label} (n = ${count(r.n)})`,
    ...(highlight !== undefined ? { marked: r.label === highlight } : {}),
    rate: r.value,
    lower: r.lower,
    upper: r.upper,
    rateText: r.text,
  }));
  const data = { bars: rowsIn, axisTitle, reference };
  // A marked row (a rank claim's unit) in the second colour, its label in bold; other charts keep their one colour.
  const markedRow = highlight !== undefined ? values.find((v) => v.marked === true)?.row : undefined;
  const colour = markedRow !== undefined ? { color: { condition: { test: 'datum.marked', value: PALETTE.secondary }, value: PALETTE.primary } } : {};
  const rowOrder = values.map((v) => v.row);
  const y = {
    field: 'row',
    type: 'nominal',
    sort: rowOrder,
    title: null,
    axis: {
      labelFontSize: AXIS_LABEL_SIZE,
      labelPadding: 6,
      ticks: false,
      domain: false,
      labelLimit: 0,
      ...(markedRow !== undefined ? { labelFontWeight: { condition: { test: `datum.value === ${JSON.stringify(markedRow)}`, value: 'bold' }, value: 'normal' } } : {}),
    },
    scale: { paddingOuter: 0.5 },
  };
  const xScale = { domain: [lo, hi], nice: false, zero: false };
  const layers: Array<Record<string, unknown>> = [
    {
      mark: { type: 'rule', color: PALETTE.primary, strokeWidth: 2 },
      encoding: {
        y,
        ...colour,
        x: {
          field: 'lower',
          type: 'quantitative',
          scale: xScale,
          title: data.axisTitle,
          axis,
        },
        x2: { field: 'upper' },
      },
    },
    {
      mark: { type: 'tick', color: PALETTE.primary, orient: 'vertical', size: 10, thickness: 2 },
      encoding: { y, ...colour, x: { field: 'lower', type: 'quantitative' } },
    },
    {
      mark: { type: 'tick', color: PALETTE.primary, orient: 'vertical', size: 10, thickness: 2 },
      encoding: { y, ...colour, x: { field: 'upper', type: 'quantitative' } },
    },
    {
      mark: { type: 'point', filled: true, size: 70, color: PALETTE.primary, opacity: 1, stroke: '#ffffff', strokeWidth: 1 },
      encoding: { y, ...colour, x: { field: 'rate', type: 'quantitative' } },
    },
    {
      // The rates stand in a column at the right of the plot, where no interval or reference line can cross them.
      // Set well clear of the last grid line, which lies on the plot's right edge.
      mark: { type: 'text', align: 'left', dx: 18, baseline: 'middle', color: PALETTE.ink, fontWeight: 'bold' },
      encoding: { y, x: { value: 'width' }, text: { field: 'rateText', type: 'nominal' } },
    },
  ];
  if (data.reference) {
    const ref = [{ value: data.reference.value, label: data.reference.label }];
    const refOnRight = data.reference.value > (lo + hi) / 2;
    layers.unshift(
      {
        data: { values: ref },
        mark: { type: 'rule', color: PALETTE.secondary, strokeDash: [5, 3], strokeWidth: 1.5 },
        encoding: { x: { field: 'value', type: 'quantitative' } },
      },
      {
        data: { values: ref },
        // The label sits on the side of the line with more room, so it is never cut at the plot edge.
        mark: {
          type: 'text',
          align: refOnRight ? 'right' : 'left',
          baseline: 'top',
          dx: refOnRight ? -4 : 4,
          y: 0,
          color: PALETTE.secondary,
          fontStyle: 'italic',
        },
        encoding: { x: { field: 'value', type: 'quantitative' }, text: { field: 'label', type: 'nominal' } },
      },
    );
  }
  return {
    $schema: 'https://vega.github.io/schema/vega-lite/v6.json',
    width: CHART_WIDTH,
    height: Math.min(maxHeight, ratesChartHeight(data.bars.length)),
    autosize: { type: 'fit', contains: 'padding' },
    padding: { left: 2, right: 8, top: 6, bottom: 2 },
    config: baseConfig(),
    data: { values },
    layer: layers,
  };
}

/** Points of a scatter chart are named when there are at most this many (more would crowd the plot). */
export const MAX_NAMED_POINTS = 25;
const POINT_LABEL_SIZE = 8;
/** Space in points kept between two point labels on one line. */
const LABEL_GAP = 3;
/** Radius in points of a scatter point (a filled circle of area 40). */
const POINT_RADIUS = Math.sqrt(40 / Math.PI);

/** Room the plot of a scatter chart takes inside its outer size (estimated from the axis labels and titles). */
function scatterPlotSize(
  height: number,
  yDomain: [number, number],
  fmt: string,
  title_: { noteLines: number; axisLines: number },
): { width: number; height: number } {
  const yLabel = (v: number): string => (fmt === '.0%' ? `${Math.round(v * 100)}%` : String(+v.toPrecision(3)));
  const yLabelWidth = Math.max(textWidth(yLabel(yDomain[0]), AXIS_LABEL_SIZE), textWidth(yLabel(yDomain[1]), AXIS_LABEL_SIZE));
  const left = 2 + yLabelWidth + 2 + 5;
  const title = (title_.noteLines > 0 ? title_.noteLines * 10 * 1.25 + 3 : 0) + title_.axisLines * AXIS_TITLE_SIZE * 1.25 + 8;
  const xAxis = 5 + 2 + AXIS_LABEL_SIZE * 1.25 + 8 + AXIS_TITLE_SIZE * 1.25;
  return { width: CHART_WIDTH - left - 8, height: height - 6 - 2 - title - xAxis };
}

interface Box {
  x0: number;
  y0: number;
  x1: number;
  y1: number;
}

function overlap(a: Box, b: Box): number {
  const w = Math.min(a.x1, b.x1) - Math.max(a.x0, b.x0);
  const h = Math.min(a.y1, b.y1) - Math.max(a.y0, b.y0);
  return w > 0 && h > 0 ? w * h : 0;
}

/**
 * Place a label beside each point (right, left, above, below, then the diagonals), taking for each the first place
 * that covers no point, no label already placed and does not leave the plot; where none is free, the place that
 * covers least. Points are labelled from the most crowded first. Returns the label anchors in data units.
 */
export function placeLabels(
  points: Array<{ label: string; x: number; y: number }>,
  xDomain: [number, number],
  yDomain: [number, number],
  plot: { width: number; height: number },
): Array<{ label: string; x: number; y: number; align: 'left' | 'right' | 'center' }> {
  const px = (x: number): number => ((x - xDomain[0]) / (xDomain[1] - xDomain[0])) * plot.width;
  const py = (y: number): number => plot.height - ((y - yDomain[0]) / (yDomain[1] - yDomain[0])) * plot.height;
  const dots: Box[] = points.map((p) => ({
    x0: px(p.x) - POINT_RADIUS,
    x1: px(p.x) + POINT_RADIUS,
    y0: py(p.y) - POINT_RADIUS,
    y1: py(p.y) + POINT_RADIUS,
  }));
  const lineH = POINT_LABEL_SIZE * 1.2;
  const gap = POINT_RADIUS + 3;
  const crowd = points.map((p, i) =>
    points.reduce((a, q, j) => a + (i !== j && Math.hypot(px(p.x) - px(q.x), py(p.y) - py(q.y)) < 60 ? 1 : 0), 0),
  );
  const order = points.map((_, i) => i).sort((a, b) => crowd[b]! - crowd[a]! || a - b);
  const boxes: Box[] = [];
  const out: Array<{ label: string; x: number; y: number; align: 'left' | 'right' | 'center' }> = new Array(points.length);
  for (const i of order) {
    const p = points[i]!;
    const cx = px(p.x);
    const cy = py(p.y);
    const w = textWidth(p.label, POINT_LABEL_SIZE);
    // Anchor (ax, ay) in plot points, with the alignment of the text about it.
    const candidates: Array<{ ax: number; ay: number; align: 'left' | 'right' | 'center' }> = [
      { ax: cx + gap, ay: cy, align: 'left' },
      { ax: cx - gap, ay: cy, align: 'right' },
      { ax: cx, ay: cy - gap - lineH / 2, align: 'center' },
      { ax: cx, ay: cy + gap + lineH / 2, align: 'center' },
      { ax: cx + gap - 2, ay: cy - gap - 1, align: 'left' },
      { ax: cx + gap - 2, ay: cy + gap + 1, align: 'left' },
      { ax: cx - gap + 2, ay: cy - gap - 1, align: 'right' },
      { ax: cx - gap + 2, ay: cy + gap + 1, align: 'right' },
    ];
    let best: { c: (typeof candidates)[number]; box: Box; cost: number } | undefined;
    for (const c of candidates) {
      const x0 = c.align === 'left' ? c.ax : c.align === 'right' ? c.ax - w : c.ax - w / 2;
      const box = { x0, x1: x0 + w, y0: c.ay - lineH / 2, y1: c.ay + lineH / 2 };
      const outside =
        Math.max(0, -box.x0) + Math.max(0, box.x1 - plot.width) + Math.max(0, -box.y0) + Math.max(0, box.y1 - plot.height);
      const cost =
        outside * lineH * 4 +
        dots.reduce((a, d) => a + overlap(box, d), 0) +
        // Two labels need a little space between them, or they read as one word ("GeologyLinguistics").
        boxes.reduce((a, b) => a + overlap({ ...box, x0: box.x0 - LABEL_GAP, x1: box.x1 + LABEL_GAP }, b), 0);
      if (best === undefined || cost < best.cost) best = { c, box, cost };
      if (cost === 0) break;
    }
    boxes.push(best!.box);
    out[i] = {
      label: p.label,
      x: xDomain[0] + (best!.c.ax / plot.width) * (xDomain[1] - xDomain[0]),
      y: yDomain[0] + ((plot.height - best!.c.ay) / plot.height) * (yDomain[1] - yDomain[0]),
      align: best!.c.align,
    };
  }
  return out;
}

function scatterSpec(data: Extract<ChartData, { kind: 'scatter' }>, height: number): Record<string, unknown> {
  if (data.points.length === 0) throw new Error('Chart data: a scatter chart needs at least one point.');
  for (const p of data.points) {
    requireFinite(p.x, `x of "${p.label}"`);
    requireFinite(p.y, `y of "${p.label}"`);
  }
  // Not '~g': with a tick step of one significant digit it writes 20 as "2e+1"; '~r' never uses an exponent.
  const fmt = data.percent ? '.0%' : '~r';
  const xs = data.points.map((p) => p.x);
  const ys = data.points.map((p) => p.y);
  if (data.fit) {
    for (const x of [Math.min(...xs), Math.max(...xs)]) ys.push(data.fit.intercept + data.fit.slope * x);
  }
  const xScale = { domain: roundDomain(xs), nice: false, zero: false };
  const yScale = { domain: roundDomain(ys), nice: false, zero: false };
  const layers: Array<Record<string, unknown>> = [
    {
      data: { values: data.points.map((p) => ({ label: p.label, x: p.x, y: p.y, n: p.n })) },
      mark: { type: 'point', filled: true, size: 40, color: PALETTE.primary, opacity: 0.8 },
      encoding: {
        x: { field: 'x', type: 'quantitative', title: data.xTitle, scale: xScale, axis: { format: fmt, grid: true } },
        // The vertical axis is named in the chart's title, set horizontally: a long rotated title would be cut off.
        y: { field: 'y', type: 'quantitative', title: null, scale: yScale, axis: { format: fmt, grid: true } },
      },
    },
  ];
  if (data.points.length <= MAX_NAMED_POINTS) {
    // Every point is named, each label placed beside its point where it covers no other label or point.
    const plot = scatterPlotSize(height, yScale.domain, fmt, {
      noteLines: data.note === undefined ? 0 : wrapTitle(data.note, 10, 'bold').length,
      axisLines: wrapTitle(data.yTitle, AXIS_TITLE_SIZE, 'regular').length,
    });
    const placed = placeLabels(data.points, xScale.domain, yScale.domain, plot);
    for (const align of ['left', 'right', 'center'] as const) {
      const values = placed.filter((p) => p.align === align);
      if (values.length === 0) continue;
      layers.push({
        data: { values },
        mark: { type: 'text', align, baseline: 'middle', color: PALETTE.muted, fontSize: POINT_LABEL_SIZE },
        encoding: {
          x: { field: 'x', type: 'quantitative' },
          y: { field: 'y', type: 'quantitative' },
          text: { field: 'label', type: 'nominal' },
        },
      });
    }
  }
  if (data.fit) {
    requireFinite(data.fit.intercept, 'fit intercept');
    requireFinite(data.fit.slope, 'fit slope');
    const x0 = Math.min(...xs);
    const x1 = Math.max(...xs);
    const line = [x0, x1].map((x) => ({ x, y: data.fit!.intercept + data.fit!.slope * x }));
    layers.push({
      data: { values: line },
      mark: { type: 'line', color: PALETTE.secondary, strokeWidth: 1.75 },
      encoding: { x: { field: 'x', type: 'quantitative' }, y: { field: 'y', type: 'quantitative' } },
    });
  }
  return {
    // The note (e.g. "r = 0.41") sits above the plot as its title, where it can never cover a point; the vertical
    // axis's name follows it as a subtitle, read across like every other text.
    title: verticalTitle(data.yTitle, data.note),
    $schema: 'https://vega.github.io/schema/vega-lite/v6.json',
    width: CHART_WIDTH,
    height,
    autosize: { type: 'fit', contains: 'padding' },
    padding: { left: 2, right: 8, top: 6, bottom: 2 },
    config: baseConfig(),
    layer: layers,
  };
}

/**
 * A title's lines: the whole text when it fits the chart's width, else one line per part of a note (parts end with
 * ";") and each part broken between words, so that a long note or axis name is never cut off at the chart's edge.
 */
export function wrapTitle(text: string, size: number, face: 'regular' | 'bold'): string[] {
  const room = CHART_WIDTH - 12;
  if (textWidth(text, size, face) <= room) return [text];
  const lines: string[] = [];
  // The parts of a note ("partial r = 0.11; 38 of 40 ...") start new lines; each part is broken between words.
  for (const part of text.split(/(?<=;) /)) {
    let line = '';
    for (const word of part.split(' ')) {
      const next = line ? `${line} ${word}` : word;
      if (line && textWidth(next, size, face) > room) {
        lines.push(line);
        line = word;
      } else {
        line = next;
      }
    }
    if (line) lines.push(line);
  }
  return lines;
}

/** Vega takes a one-line title as a string and several lines as an array. */
function oneOrLines(lines: string[]): string | string[] {
  return lines.length === 1 ? (lines[0] as string) : lines;
}

/**
 * A chart title naming the vertical axis, set horizontally above the plot at its left, under an optional
 * bold note. Used instead of a rotated axis title, which a long name would overrun.
 */
function verticalTitle(axisTitle: string, note?: string): Record<string, unknown> {
  const axis = oneOrLines(wrapTitle(axisTitle, AXIS_TITLE_SIZE, 'regular'));
  const common = { anchor: 'start', color: PALETTE.ink, offset: 8, subtitleColor: PALETTE.ink, subtitleFontSize: AXIS_TITLE_SIZE };
  return note
    ? { ...common, text: oneOrLines(wrapTitle(note, 10, 'bold')), fontSize: 10, fontWeight: 'bold', subtitle: axis, subtitlePadding: 3 }
    : { ...common, text: axis, fontSize: AXIS_TITLE_SIZE, fontWeight: 'normal' };
}

function periodsSpec(data: Extract<ChartData, { kind: 'periods' }>, height: number): Record<string, unknown> {
  if (data.points.length === 0) throw new Error('Chart data: a periods chart needs at least one period.');
  if (data.fit && data.fit.length !== data.points.length) {
    throw new Error(`Chart data: ${data.fit.length} fitted rates given for ${data.points.length} periods.`);
  }
  const values = data.points.map((p, i) => {
    requireFinite(p.rate, `rate of period "${p.period}"`);
    requireFinite(p.lower, `lower bound of period "${p.period}"`);
    requireFinite(p.upper, `upper bound of period "${p.period}"`);
    if (data.fit) requireFinite(data.fit[i]!, `fitted rate of period "${p.period}"`);
    return { period: `${p.period} (n = ${count(p.n)})`, rate: p.rate, lower: p.lower, upper: p.upper, fit: data.fit?.[i] };
  });
  const x = {
    field: 'period',
    type: 'ordinal',
    sort: null,
    title: null,
    axis: { labelAngle: values.length > 5 ? -30 : 0, labelPadding: 6 },
    scale: { padding: 0.5 },
  };
  const domain = data.domain ?? shareRange(shareValues(data));
  const yScale = { domain, nice: false, zero: false };
  const layers: Array<Record<string, unknown>> = [
    {
      mark: { type: 'area', color: PALETTE.light, opacity: 0.45 },
      encoding: {
        x,
        y: { field: 'lower', type: 'quantitative', scale: yScale, title: null, axis: shareAxis(domain) },
        y2: { field: 'upper' },
      },
    },
    {
      mark: { type: 'line', color: PALETTE.primary, strokeWidth: 2, point: { filled: true, size: 50, color: PALETTE.primary } },
      encoding: { x, y: { field: 'rate', type: 'quantitative' } },
    },
  ];
  if (data.fit) {
    layers.push({
      mark: { type: 'line', color: PALETTE.secondary, strokeDash: [5, 3], strokeWidth: 1.5 },
      encoding: { x, y: { field: 'fit', type: 'quantitative' } },
    });
  }
  return {
    $schema: 'https://vega.github.io/schema/vega-lite/v6.json',
    title: verticalTitle(data.axisTitle),
    width: CHART_WIDTH,
    height,
    autosize: { type: 'fit', contains: 'padding' },
    padding: { left: 2, right: 8, top: 6, bottom: 2 },
    config: baseConfig(),
    data: { values },
    layer: layers,
  };
}

/** Colours for the parts of a stacked bar, darkest first, so neighbouring parts always differ in lightness. */
const STACK_COLOURS = [PALETTE.primary, PALETTE.light, PALETTE.secondary, '#e9c9a6', PALETTE.muted, '#d9dde2'];

/** Parts of a stacked bar drawn in white (dark fills) rather than ink (light fills), by index in STACK_COLOURS. */
const STACK_ON_DARK = [true, false, true, false, true, false];
/** A part narrower than this share carries no value inside it (the value would not fit); its share is in the table. */
const STACK_MIN_LABELLED = 0.06;

function stackedSpec(data: Extract<ChartData, { kind: 'stacked' }>, maxHeight: number): Record<string, unknown> {
  if (data.rows.length === 0) throw new Error('Chart data: a stacked chart needs at least one row.');
  const partNames: string[] = [];
  // Each part's share and where it starts and ends along its bar, so that the bar and its value share one position.
  const values = data.rows.flatMap((r) => {
    const total = r.parts.reduce((a, p) => a + p.count, 0);
    if (!(total > 0)) throw new Error(`Chart data: row "${r.label}" of a stacked chart has no counts.`);
    let start = 0;
    return r.parts.map((p) => {
      requireFinite(p.count, `count of "${p.label}" in "${r.label}"`);
      if (!partNames.includes(p.label)) partNames.push(p.label);
      const order = partNames.indexOf(p.label);
      const share = p.count / total;
      const part = { row: `${r.label} (n = ${count(total)})`, part: p.label, order, count: p.count, start, end: start + share, mid: start + share / 2 };
      start += share;
      return {
        ...part,
        shareText: share >= STACK_MIN_LABELLED ? `${Math.round(share * 100)}%` : '',
        ink: STACK_ON_DARK[order] ? '#ffffff' : PALETTE.ink,
      };
    });
  });
  if (partNames.length > STACK_COLOURS.length) {
    throw new Error(`Chart data: a stacked chart can show at most ${STACK_COLOURS.length} parts; found ${partNames.length}.`);
  }
  const rowOrder = [...new Set(values.map((v) => v.row))];
  const y = {
    field: 'row',
    type: 'nominal',
    sort: rowOrder,
    title: null,
    axis: { ticks: false, domain: false, labelPadding: 6, labelLimit: 0 },
  };
  return {
    $schema: 'https://vega.github.io/schema/vega-lite/v6.json',
    width: CHART_WIDTH,
    height: Math.min(maxHeight, ratesChartHeight(data.rows.length) + 24),
    autosize: { type: 'fit', contains: 'padding' },
    padding: { left: 2, right: 8, top: 6, bottom: 2 },
    config: { ...baseConfig(), legend: { labelFont: CHART_FONT_FAMILY, labelFontSize: AXIS_LABEL_SIZE, orient: 'bottom', title: null } },
    data: { values },
    layer: [
      {
        mark: { type: 'bar', stroke: '#ffffff', strokeWidth: 1 },
        encoding: {
          y,
          x: {
            field: 'start',
            type: 'quantitative',
            scale: { domain: WHOLE_SHARE, nice: false, zero: false },
            title: data.axisTitle,
            axis: shareAxis(WHOLE_SHARE),
          },
          x2: { field: 'end' },
          color: {
            field: 'part',
            type: 'nominal',
            sort: partNames,
            scale: { domain: partNames, range: STACK_COLOURS.slice(0, partNames.length) },
            // Long part names (an answer scale in words) go in rows of three rather than one line off the chart.
            legend: { title: null, ...(partNames.join('').length > 40 ? { columns: 3, labelLimit: 0 } : {}) },
          },
        },
      },
      // Each part's share printed inside it, white on the dark fills and ink on the light ones.
      ...(['#ffffff', PALETTE.ink] as const).map((ink) => ({
        transform: [{ filter: { field: 'ink', equal: ink } }],
        mark: { type: 'text', baseline: 'middle', align: 'center', fontWeight: 'bold', color: ink },
        encoding: { y, x: { field: 'mid', type: 'quantitative' }, text: { field: 'shareText', type: 'nominal' } },
      })),
    ],
  };
}

function differenceSpec(data: Extract<ChartData, { kind: 'difference' }>): Record<string, unknown> {
  for (const [v, what] of [
    [data.value, 'difference'],
    [data.lower, 'lower bound'],
    [data.upper, 'upper bound'],
    [data.margin, 'margin'],
  ] as const) {
    requireFinite(v, what);
  }
  if (!(data.margin > 0)) throw new Error(`Chart data: the equivalence margin is ${data.margin}; it must be above 0.`);
  // Shown in percentage points.
  const pts = (v: number): number => v * 100;
  const extent = Math.max(Math.abs(pts(data.lower)), Math.abs(pts(data.upper)), pts(data.margin)) * 1.25;
  const [lo, hi] = roundDomain([-extent, extent]);
  const xScale = { domain: [lo, hi], nice: false, zero: false };
  const row = [{ value: pts(data.value), lower: pts(data.lower), upper: pts(data.upper), m0: -pts(data.margin), m1: pts(data.margin) }];
  // The key sits above the plot, where the zero line cannot strike through it.
  const key = `Shaded: margin \u00b1${+pts(data.margin).toFixed(1)} points.   Bar: ${data.intervalLabel ?? 'interval'} of the difference.`;
  return {
    $schema: 'https://vega.github.io/schema/vega-lite/v6.json',
    title: { text: key, anchor: 'start', color: PALETTE.ink, fontSize: AXIS_LABEL_SIZE, fontWeight: 'normal', offset: 6 },
    width: CHART_WIDTH,
    height: 124,
    autosize: { type: 'fit', contains: 'padding' },
    padding: { left: 2, right: 8, top: 6, bottom: 2 },
    config: baseConfig(),
    data: { values: row },
    layer: [
      {
        mark: { type: 'rect', color: PALETTE.light, opacity: 0.35 },
        encoding: {
          x: { field: 'm0', type: 'quantitative', scale: xScale, title: data.axisTitle, axis: { format: '+~f', grid: true } },
          x2: { field: 'm1' },
        },
      },
      { mark: { type: 'rule', color: PALETTE.muted, strokeDash: [2, 2] }, encoding: { x: { datum: 0, type: 'quantitative' } } },
      {
        mark: { type: 'rule', color: PALETTE.primary, strokeWidth: 2 },
        encoding: { x: { field: 'lower', type: 'quantitative' }, x2: { field: 'upper' }, y: { value: 34 } },
      },
      {
        mark: { type: 'tick', color: PALETTE.primary, orient: 'vertical', size: 10, thickness: 2 },
        encoding: { x: { field: 'lower', type: 'quantitative' }, y: { value: 34 } },
      },
      {
        mark: { type: 'tick', color: PALETTE.primary, orient: 'vertical', size: 10, thickness: 2 },
        encoding: { x: { field: 'upper', type: 'quantitative' }, y: { value: 34 } },
      },
      {
        mark: { type: 'point', filled: true, size: 70, color: PALETTE.primary, opacity: 1, stroke: '#ffffff', strokeWidth: 1 },
        encoding: { x: { field: 'value', type: 'quantitative' }, y: { value: 34 } },
      },
    ],
  };
}

/** Options for the size of a chart. */
export interface ChartSizeOptions {
  /**
   * Outer height in points: a scatter chart takes it exactly, a rates chart at most (its height follows its rows).
   * Defaults to CHART_HEIGHT. The renderer passes a smaller height so that a claim fits on one page.
   */
  height?: number;
}

/** Smallest outer height that still leaves a readable plot. */
export const MIN_CHART_HEIGHT = 130;

/** The Vega-Lite spec for a chart. Pure: same data, same spec. */
export function chartSpec(data: ChartData, options: ChartSizeOptions = {}): object {
  const height = options.height ?? CHART_HEIGHT;
  if (!(height >= MIN_CHART_HEIGHT)) {
    throw new Error(`Chart size: height ${height} is below the smallest readable height ${MIN_CHART_HEIGHT}.`);
  }
  switch (data.kind) {
    case 'rates':
      return ratesSpec(data, Math.max(height, ratesChartHeight(1)));
    case 'scatter':
      return scatterSpec(data, height);
    case 'means':
      return meansSpec(data, Math.max(height, ratesChartHeight(1)));
    case 'periods':
      return periodsSpec(data, height);
    case 'stacked':
      return stackedSpec(data, Math.max(height, ratesChartHeight(1) + 24));
    case 'difference':
      return differenceSpec(data);
    default: {
      const never: never = data;
      throw new Error(`Chart data: unknown chart kind ${JSON.stringify((never as { kind: unknown }).kind)}.`);
    }
  }
}

/** Compile a chart to a Vega spec, collecting every Vega-Lite warning (a correct spec compiles with none). */
export async function compileChart(
  data: ChartData,
  options: ChartSizeOptions = {},
): Promise<{ vegaSpec: object; warnings: string[] }> {
  return compileVegaLite(chartSpec(data, options));
}

/**
 * SVGs remembered: the pack and the chart files beside it draw each chart with the same data and size. A chart asked
 * for ahead (prefetchCharts) is kept until it is first asked for by chartSvg.
 */
const SVGS_KEPT = 512;
const svgs = new KeptUntilUsed<Promise<string>>(SVGS_KEPT);

/**
 * The chart as an SVG string, rendered headless (no canvas). Pure, so a chart already drawn with the same data and
 * size is handed back from memory rather than compiled and rendered again. Drawn on the chart thread when one runs.
 */
export function chartSvg(data: ChartData, options: ChartSizeOptions = {}): Promise<string> {
  const svg = rememberedSvg(data, options, true);
  askAhead();
  return svg;
}

function rememberedSvg(data: ChartData, options: ChartSizeOptions, urgent: boolean): Promise<string> {
  const key = JSON.stringify([data, options]);
  const known = svgs.get(key, urgent);
  if (known !== undefined) return known;
  const made = renderChartSvg(data, options, urgent);
  svgs.set(key, made, urgent);
  made.catch(() => svgs.delete(key));
  return made;
}

async function renderChartSvg(data: ChartData, options: ChartSizeOptions, urgent: boolean): Promise<string> {
  const thread = chartThread();
  const { svg, drawing } = thread ? await thread.draw(data, options, urgent) : await drawSpec(chartSpec(data, options));
  keepDrawing(svg, drawing);
  return svg;
}

/** Whether charts are drawn on a second thread (chart-thread.ts; a build starts it). */
export function drawsOnThread(): boolean {
  return chartThread() !== undefined;
}

/**
 * Ask for these charts now, in this order, at their usual size, when a chart thread runs (with none, charts are drawn
 * when first asked for, one at a time, as before). Their errors are left to whoever asks for the chart (chartSvg).
 */
export function prefetchCharts(charts: ChartData[]): void {
  if (!chartThread()) return;
  ahead = charts;
  nextAhead = 0;
  askAhead();
}

/**
 * How many charts asked for ahead may be drawn and not yet used at once. The pages use the charts in the order they
 * were asked for, so the thread keeps this far ahead of the pages and the memory they hold does not grow with the
 * number of claims (asked for all at once, every chart of a pack of 2,000 claims was held until its page).
 */
const AHEAD = 32;
let ahead: ChartData[] = [];
let nextAhead = 0;

/** Ask for the next charts of prefetchCharts' list, up to AHEAD not yet used. */
function askAhead(): void {
  while (nextAhead < ahead.length && svgs.unused < AHEAD) rememberedSvg(ahead[nextAhead++]!, {}, false).catch(() => undefined);
  if (nextAhead >= ahead.length) ahead = [];
}
