/**
 * Chart specs compile with no Vega-Lite warning, and the SVG drawn headless holds the expected labels. The axis
 * domains are checked against the data by hand (the percent axis rounds outward to whole tenths).
 */
import { describe, it, expect } from 'vitest';
import { chartSpec, chartSvg, compileChart, MAX_NAMED_POINTS, placeLabels, ratesChartHeight } from '../../src/render/charts.js';
import { withCommonShareRange } from '../../src/render/chart-scales.js';
import { hasGlyphs, textWidth } from '../../src/render/fonts.js';
import { sampleModel } from './sample-model.js';
import type { ChartData } from '../../src/render/model.js';

const charts = sampleModel.claims.flatMap((c) => (c.chart ? [c.chart.data] : []));
const rates = charts.find((c) => c.kind === 'rates')!;
const scatter = charts.find((c) => c.kind === 'scatter')!;

// Invented data for the other chart kinds.
const periods: ChartData = {
  kind: 'periods',
  axisTitle: 'Satisfied (%)',
  points: [
    { period: '2021', rate: 0.72, lower: 0.66, upper: 0.77, n: 210 },
    { period: '2022', rate: 0.69, lower: 0.63, upper: 0.74, n: 230 },
    { period: '2023', rate: 0.66, lower: 0.6, upper: 0.71, n: 250 },
  ],
  fit: [0.72, 0.69, 0.66],
};
const stacked: ChartData = {
  kind: 'stacked',
  axisTitle: 'Share of respondents (%)',
  rows: [
    { label: 'Cefnŷdd campus', parts: [{ label: 'Agree', count: 60 }, { label: 'Neutral', count: 25 }, { label: 'Disagree', count: 15 }] },
    { label: 'Łóźmir exchange', parts: [{ label: 'Agree', count: 30 }, { label: 'Neutral', count: 10 }, { label: 'Disagree', count: 12 }] },
  ],
};
const means: ChartData = {
  kind: 'means',
  axisTitle: 'Mean rating (1–5)',
  domain: [1, 5],
  bars: [
    { label: 'Ynys Fôrlas', mean: 3.9, lower: 3.7, upper: 4.1, n: 120 },
    { label: 'Naïve Arts', mean: 3.4, lower: 3.1, upper: 3.7, n: 45 },
  ],
};
const difference: ChartData = { kind: 'difference', axisTitle: 'Difference (points)', value: 0.004, lower: -0.015, upper: 0.021, margin: 0.03 };

describe('chartSpec', () => {
  it.each([
    ['rates', rates],
    ['scatter', scatter],
    ['periods', periods],
    ['stacked', stacked],
    ['means', means],
    ['difference', difference],
  ] as const)('%s compiles without Vega-Lite warnings', async (_kind, data) => {
    const { warnings } = await compileChart(data);
    expect(warnings).toEqual([]);
  });

  it('keeps the data order of the rows (no alphabetical sort)', () => {
    const data: ChartData = {
      kind: 'rates',
      axisTitle: 'Agreeing (%)',
      bars: [
        { label: 'Zeta', rate: 0.5, lower: 0.4, upper: 0.6, n: 100 },
        { label: 'Alpha', rate: 0.6, lower: 0.5, upper: 0.7, n: 100 },
      ],
    };
    const spec = chartSpec(data) as { layer: Array<{ encoding: { y?: { sort: unknown } } }> };
    expect(spec.layer[0]!.encoding.y!.sort).toEqual(['Zeta (n = 100)', 'Alpha (n = 100)']);
  });

  it('throws on a non-finite rate instead of drawing nothing', () => {
    const bad: ChartData = { kind: 'rates', axisTitle: 'x', bars: [{ label: 'A', rate: NaN, lower: 0, upper: 1, n: 3 }] };
    expect(() => chartSpec(bad)).toThrow(/rate of "A" is NaN/);
  });

  it('sizes a rates chart by its rows', () => {
    expect(ratesChartHeight(2)).toBe(116);
    expect(ratesChartHeight(20)).toBe(260);
  });
});

describe('chartSvg', () => {
  it('draws every other kind with its labels', async () => {
    expect(await chartSvg(periods)).toContain('2022 (n = 230)');
    const st = await chartSvg(stacked);
    expect(st).toContain('Cefnŷdd campus (n = 100)');
    expect(st).toContain('Disagree');
    expect(await chartSvg(means)).toContain('Naïve Arts (n = 45)');
    expect(await chartSvg(difference)).toContain('Shaded: margin ±3 points.');
  });

  it('draws the rates chart with n in labels, the reference label and percent ticks', async () => {
    const svg = await chartSvg(rates);
    expect(svg).toMatch(/^<svg[^>]* width="460" height="116"/);
    expect(svg).toContain('Coleg Ŵennalt (n = 840)');
    expect(svg).toContain('Rest of region (n = 18,500)');
    expect(svg).toContain('Target 75%');
    // Interval ends and target span 57.6% to 75%: the range rounds out (2 points of room) to tenths, 50%..80%.
    for (const tick of ['50%', '60%', '70%', '80%']) expect(svg).toContain(`>${tick}<`);
    expect(svg).not.toContain('>90%<');
    expect(svg).toContain('font-family="Noto Sans"');
  });

  it('draws the scatter chart with the note and both axis titles', async () => {
    const svg = await chartSvg(scatter);
    expect(svg).toContain('r = 0.41');
    expect(svg).toContain('Resources rated good (%)');
    expect(svg).toContain('Satisfied overall (%)');
  });
});

describe('axis ranges, values and labels', () => {
  /** The text of every <text> element of an SVG, in document order. */
  const texts = (svg: string): string[] => [...svg.matchAll(/<text[^>]*>([^<]*)<\/text>/g)].map((m) => m[1]!);

  it('gives every share chart of a pack one common range, from the lowest to the highest interval end', () => {
    const sections = withCommonShareRange([{ chart: { data: rates } }, { chart: { data: periods } }, { chart: { data: means } }, {}]);
    // Lowest end 57.6% (rates) and highest 77% (periods), 2 points of room each side, out to tenths: 50%..80%.
    expect((sections[0]!.chart!.data as { domain?: unknown }).domain).toEqual([0.5, 0.8]);
    expect((sections[1]!.chart!.data as { domain?: unknown }).domain).toEqual([0.5, 0.8]);
    // A mean score keeps its answer scale.
    expect(sections[2]!.chart!.data).toBe(means);
  });

  it('labels a whole 0-100% axis every 20% so that no two labels touch ("90%100%")', async () => {
    const labels = texts(await chartSvg(stacked));
    for (const tick of ['0%', '20%', '40%', '60%', '80%', '100%']) expect(labels).toContain(tick);
    expect(labels).not.toContain('90%');
  });

  it('prints each part of a stacked bar with its share (rounded, as in the table)', async () => {
    const labels = texts(await chartSvg(stacked));
    // Cefnŷdd campus 60/25/15 of 100; Łóźmir exchange 30/10/12 of 52: 57.7% 19.2% 23.1%.
    for (const share of ['60%', '25%', '15%', '58%', '19%', '23%']) expect(labels).toContain(share);
  });

  it('says what the equivalence interval is, above the plot where the zero line cannot cross it', async () => {
    const labelled: ChartData = { ...difference, intervalLabel: '90% interval (1 − 2α)' } as ChartData;
    const svg = await chartSvg(labelled);
    expect(svg).toContain('Bar: 90% interval (1 − 2α) of the difference.');
    // The key is the chart's title, drawn above the plot: its baseline lies above every mark of the plot.
    const spec = chartSpec(labelled) as { title: { text: string }; layer: unknown[] };
    expect(spec.title.text).toContain('Shaded: margin ±3 points.');
  });

  it(`names every point of a scatter of up to ${MAX_NAMED_POINTS} units, with no two names overlapping`, async () => {
    const points = Array.from({ length: MAX_NAMED_POINTS }, (_, i) => ({
      label: `Unit ${String.fromCharCode(65 + i)}`,
      x: 0.5 + 0.4 * ((i * 7) % 25) / 25,
      y: 0.55 + 0.35 * ((i * 11) % 25) / 25,
      n: 100,
    }));
    const data: ChartData = { kind: 'scatter', points, xTitle: 'x (%)', yTitle: 'y (%)', percent: true };
    const labels = texts(await chartSvg(data));
    for (const p of points) expect(labels).toContain(p.label);
    const placed = placeLabels(points, [0.5, 0.9], [0.5, 0.9], { width: 400, height: 150 });
    expect(placed).toHaveLength(points.length);
    expect(new Set(placed.map((p) => p.label)).size).toBe(points.length);
    // Back to plot points (400 x 150, y down): no two label boxes (8 pt text, 1.2 line height) overlap.
    const boxes = placed.map((p) => {
      const w = textWidth(p.label, 8);
      const ax = ((p.x - 0.5) / 0.4) * 400;
      const ay = 150 - ((p.y - 0.5) / 0.4) * 150;
      const x0 = p.align === 'left' ? ax : p.align === 'right' ? ax - w : ax - w / 2;
      return { x0, x1: x0 + w, y0: ay - 4.8, y1: ay + 4.8 };
    });
    for (let i = 0; i < boxes.length; i++) {
      for (let j = i + 1; j < boxes.length; j++) {
        const a = boxes[i]!;
        const b = boxes[j]!;
        const clear = a.x1 <= b.x0 + 1e-6 || b.x1 <= a.x0 + 1e-6 || a.y1 <= b.y0 + 1e-6 || b.y1 <= a.y0 + 1e-6;
        expect(clear, `${placed[i]!.label} and ${placed[j]!.label}`).toBe(true);
      }
    }
    // One more unit than the limit: no names.
    const many: ChartData = { ...data, points: [...points, { label: 'Unit Z', x: 0.6, y: 0.6, n: 5 }] } as ChartData;
    expect(texts(await chartSvg(many))).not.toContain('Unit Z');
  });
});

describe('textWidth', () => {
  it('measures with the font: a bold run is wider than the same regular run, widths scale with size', () => {
    const regular = textWidth('Coleg Ŵennalt', 10);
    expect(textWidth('Coleg Ŵennalt', 10, 'bold')).toBeGreaterThan(regular);
    expect(textWidth('Coleg Ŵennalt', 20)).toBeCloseTo(2 * regular, 9);
    // Noto Sans has an advance of 572/1000 em for digits (tabular figures; font metrics, common practice).
    expect(textWidth('0', 10)).toBeCloseTo(5.72, 9);
  });
});

describe('hasGlyphs', () => {
  it('finds Welsh and Polish letters in Noto Sans, and reports Han characters it lacks', () => {
    expect(hasGlyphs('Brithŵyr Brynŷs Łąka Naïve')).toBe(true);
    // Noto Sans (Latin, Greek, Cyrillic) has no CJK ideographs; those live in Noto Sans CJK (font coverage, common practice).
    expect(hasGlyphs('满意度')).toBe(false);
  });
});
