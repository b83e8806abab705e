/**
 * The chart runtime draws a chart from its shape's template exactly as compiling it from scratch would: the SVG from
 * specSvg (second and later charts of a shape come from the template) must equal the SVG of the same spec compiled by
 * vega-lite, parsed by vega and drawn by a fresh headless view (the libraries' own path, outside this module).
 */
import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import * as vega from 'vega';
import * as vl from 'vega-lite';
import { chartSpec } from '../../src/render/charts.js';
import { loadChartLibs, shapeStats, specSvg } from '../../src/render/chart-runtime.js';
import { sampleModel } from './sample-model.js';
import type { ChartData } from '../../src/render/model.js';

async function fromScratch(spec: object): Promise<string> {
  await loadChartLibs(); // the same text measuring as the runtime
  const view = new vega.View(vega.parse(vl.compile(spec as vl.TopLevelSpec).spec), { renderer: 'none' });
  try {
    return await view.toSVG();
  } finally {
    view.finalize();
  }
}

const sample = sampleModel.claims.flatMap((c) => (c.chart ? [c.chart.data] : []));

/** Rates charts of two bars: the shape of every compare claim's chart. */
const label = fc.string({ unit: fc.constantFrom('a', 'Z', ' ', ',', '"', "'", '\\', 'ŵ', 'Ł', 'ï', '(', '%', '1', '<', '&'), minLength: 1, maxLength: 24 });
const bar = fc
  .record({ label, rate: fc.double({ min: 0.01, max: 0.99, noNaN: true }), half: fc.double({ min: 0.005, max: 0.2, noNaN: true }), n: fc.integer({ min: 5, max: 200_000 }) })
  .map(({ label, rate, half, n }) => ({ label, rate, lower: Math.max(0, rate - half), upper: Math.min(1, rate + half), n }));
const rates = fc
  .tuple(bar, bar, fc.constantFrom('Agreeing (%)', 'Satisfied "overall" (%)', 'Łąka\\ (%)'))
  .filter(([a, b]) => a.label !== b.label)
  .map(([a, b, axisTitle]): ChartData => ({ kind: 'rates', axisTitle, bars: [a, b] }));

describe('specSvg', () => {
  it('draws every sample chart twice (the second time from its template) as a fresh compile does', async () => {
    for (const data of sample) {
      const spec = chartSpec(data);
      const want = await fromScratch(spec);
      expect(await specSvg(spec)).toBe(want);
      expect(await specSvg(spec)).toBe(want);
      expect(await specSvg(chartSpec(data, { height: 150 }))).toBe(await fromScratch(chartSpec(data, { height: 150 })));
    }
  });

  it('draws random two-bar rates charts (quotes, backslashes, non-ASCII labels) as a fresh compile does', async () => {
    const before = shapeStats().templated;
    await fc.assert(
      fc.asyncProperty(rates, async (data) => {
        const spec = chartSpec(data);
        expect(await specSvg(spec)).toBe(await fromScratch(spec));
      }),
      { numRuns: 40 },
    );
    // The random charts share shapes, so templates were learnt and used.
    expect(shapeStats().templated).toBeGreaterThan(before);
  });
});
