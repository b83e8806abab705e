/**
 * Chart specs compile with no Vega-Lite warning, and the SVG drawn headless holds the expected labels. The axis
 * domains are checked against the data by hand (the percent axis rounds outward to whole tenths).
 */
import { describe, it, expect } from 'vitest';
import { chartSpec, chartSvg, compileChart, ratesChartHeight } from '../../src/render/charts.js';
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
    { label: 'Llŷn campus', parts: [{ label: 'Agree', count: 60 }, { label: 'Neutral', count: 25 }, { label: 'Disagree', count: 15 }] },
    { label: 'Łódź exchange', parts: [{ label: 'Agree', count: 30 }, { label: 'Neutral', count: 10 }, { label: 'Disagree', count: 12 }] },
  ],
};
const means: ChartData = {
  kind: 'means',
  axisTitle: 'Mean rating (1–5)',
  domain: [1, 5],
  bars: [
    { label: 'Ynys Môn', mean: 3.9, lower: 3.7, upper: 4.1, n: 120 },
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
    expect(st).toContain('Llŷn campus (n = 100)');
    expect(st).toContain('Disagree');
    expect(await chartSvg(means)).toContain('Naïve Arts (n = 45)');
    expect(await chartSvg(difference)).toContain('Margin ±3 points');
  });

  it('draws the rates chart with n in labels, the reference label and percent ticks', async () => {
    const svg = await chartSvg(rates);
    expect(svg).toMatch(/^<svg[^>]* width="460" height="116"/);
    expect(svg).toContain('Coleg Gŵyr (n = 840)');
    expect(svg).toContain('Rest of region (n = 18,500)');
    expect(svg).toContain('Target 75%');
    // Data span 57.6% to 75%: domain rounds out to 50%..90%.
    for (const tick of ['50%', '60%', '70%', '80%', '90%']) expect(svg).toContain(`>${tick}<`);
    expect(svg).toContain('font-family="Noto Sans"');
  });

  it('draws the scatter chart with the note and both axis titles', async () => {
    const svg = await chartSvg(scatter);
    expect(svg).toContain('r = 0.41');
    expect(svg).toContain('Resources rated good (%)');
    expect(svg).toContain('Satisfied overall (%)');
  });
});

describe('textWidth', () => {
  it('measures with the font: a bold run is wider than the same regular run, widths scale with size', () => {
    const regular = textWidth('Coleg Gŵyr', 10);
    expect(textWidth('Coleg Gŵyr', 10, 'bold')).toBeGreaterThan(regular);
    expect(textWidth('Coleg Gŵyr', 20)).toBeCloseTo(2 * regular, 9);
    // Noto Sans has an advance of 572/1000 em for digits (tabular figures; font metrics, common practice).
    expect(textWidth('0', 10)).toBeCloseTo(5.72, 9);
  });
});

describe('hasGlyphs', () => {
  it('finds Welsh and Polish letters in Noto Sans, and reports Han characters it lacks', () => {
    expect(hasGlyphs('Gŵyr Brynŷs Łąka Naïve')).toBe(true);
    // Noto Sans (Latin, Greek, Cyrillic) has no CJK ideographs; those live in Noto Sans CJK (font coverage, common practice).
    expect(hasGlyphs('满意度')).toBe(false);
  });
});
