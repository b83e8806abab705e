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
import { isDeepStrictEqual } from 'node:util';
import { compileTemplate, drawSpec, instantiate, loadChartLibs, shapeStats, specSvg, type Slot, type Template } from '../../src/render/chart-runtime.js';
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

  it('learns a shape at once when asked (the warm-up), and draws the next chart of it from the template as a fresh compile does', async () => {
    // A shape no other test draws: three bars, one label holding a backslash and a quote.
    const bars = [
      { label: 'Ŵern \\ "north"', rate: 0.41, lower: 0.33, upper: 0.49, n: 140 },
      { label: 'Cefnŷdd', rate: 0.57, lower: 0.5, upper: 0.64, n: 190 },
      { label: 'Tŷ Łąka (n)', rate: 0.22, lower: 0.15, upper: 0.31, n: 120 },
    ];
    const first: ChartData = { kind: 'rates', axisTitle: 'Content (%)', bars };
    const before = shapeStats();
    const drawn = await drawSpec(chartSpec(first), { learnShape: true });
    expect(drawn.svg).toBe(await fromScratch(chartSpec(first)));
    expect(shapeStats()).toEqual({ shapes: before.shapes + 1, templated: before.templated + 1 });
    const next: ChartData = { kind: 'rates', axisTitle: 'Settled "well" (%)', bars: bars.map((b, i) => ({ ...b, label: `${b.label} ${i}'`, rate: b.rate + 0.01 })) };
    expect(await specSvg(chartSpec(next))).toBe(await fromScratch(chartSpec(next)));
    expect(shapeStats()).toEqual({ shapes: before.shapes + 1, templated: before.templated + 1 });
  });
});

/** Hostile text: quotes, backslashes, line and paragraph separators, template-literal and script-like pieces. */
const hostileText = fc.oneof(
  fc.string({ unit: fc.constantFrom('a', '"', "'", '\\', '\n', '\u2028', '\u2029', '`', '$', '{', '}', '</', 'é', '\u0000', ' '), maxLength: 12 }),
  fc.constantFrom('__proto__', 'constructor', 'prototype', '1', '01', '', 'toString'),
  fc.string({ unit: 'binary', maxLength: 8 }),
);
const hostileNumber = fc.oneof(fc.double(), fc.constantFrom(-0, 0, Number.NaN, Infinity, -Infinity, 1e308, 5e-324, -1));
const SLOTS = 6;

/** Templates of any form: every kind of node, nested, with hostile keys, pieces and constants. */
const { template } = fc.letrec<{ template: Template }>((tie) => ({
  template: fc.oneof(
    { depthSize: 'small', withCrossShrink: true },
    fc.record({ kind: fc.constant('const' as const), value: fc.oneof(fc.constant(null), fc.boolean(), hostileNumber, hostileText, fc.constant({ shared: true })) }),
    fc.record({ kind: fc.constant('value' as const), slot: fc.integer({ min: 0, max: SLOTS - 1 }) }),
    fc
      .tuple(fc.array(fc.tuple(fc.integer({ min: 0, max: SLOTS - 1 }), hostileText), { minLength: 1, maxLength: 3 }), hostileText, fc.constantFrom('raw' as const, 'js' as const, 'dq' as const))
      .map(([pairs, first, writing]): Template => ({ kind: 'string', part: { pieces: [first, ...pairs.map((p) => p[1])], slots: pairs.map((p) => p[0]), writing } })),
    fc.record({ kind: fc.constant('array' as const), items: fc.array(tie('template'), { maxLength: 4 }) }),
    fc
      .uniqueArray(fc.tuple(hostileText, tie('template')), { maxLength: 5, selector: (e) => e[0] })
      .map((entries): Template => ({ kind: 'object', entries })),
  ),
}));
const slotValues = fc.array(fc.oneof(hostileText, hostileNumber) as fc.Arbitrary<Slot>, { minLength: SLOTS, maxLength: SLOTS });

/** Same values, same own keys in the same order, same prototypes, all the way down. */
function sameSpec(a: unknown, b: unknown): boolean {
  if (!isDeepStrictEqual(a, b)) return false;
  if (a === null || typeof a !== 'object') return true;
  const ka = Object.keys(a);
  const kb = Object.keys(b as object);
  return ka.join('\u0000') === kb.join('\u0000') && ka.every((k) => sameSpec((a as Record<string, unknown>)[k], (b as Record<string, unknown>)[k]));
}

describe('compileTemplate', () => {
  it('gives the same runtime spec as walking the template, for any template and hostile slot values', () => {
    fc.assert(
      fc.property(template, slotValues, (t, values) => {
        const fill = compileTemplate(t);
        const compiled = fill(values);
        expect(sameSpec(compiled, instantiate(t, values))).toBe(true);
        // Fresh objects every time: a view may change the spec it is given.
        if (t.kind === 'object' || t.kind === 'array') expect(fill(values)).not.toBe(compiled);
      }),
      { numRuns: 400 },
    );
  });

  it('writes a slot inside a string as the template says: as it is, escaped as a JSON string, or with its double quotes escaped', () => {
    const part = (writing: 'raw' | 'js' | 'dq'): Template => ({ kind: 'string', part: { pieces: ['x=', ';'], slots: [0], writing } });
    const values: Slot[] = ['a"b\\c\n'];
    expect(compileTemplate(part('raw'))(values)).toBe('x=a"b\\c\n;');
    expect(compileTemplate(part('js'))(values)).toBe('x=a\\"b\\\\c\\n;');
    expect(compileTemplate(part('dq'))(values)).toBe('x=a\\"b\\c\n;');
    // "__proto__" stays an own key, as JSON.parse leaves it.
    const own = compileTemplate({ kind: 'object', entries: [['__proto__', { kind: 'value', slot: 0 }]] })(values) as object;
    expect(Object.keys(own)).toEqual(['__proto__']);
    expect(Object.getPrototypeOf(own)).toBe(Object.prototype);
  });
});
