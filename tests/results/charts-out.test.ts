/**
 * Chart files beside the pack: each spec is checked by compiling it with vega-lite's own compiler and rendering it
 * with vega (outside the project), and each SVG is parsed with saxes, an XML parser, to prove it is well formed.
 */
import { describe, it, expect, beforeAll } from 'vitest';
import { SaxesParser } from 'saxes';
import * as vl from 'vega-lite';
import * as vega from 'vega';
import { chartFiles, chartFileStem, withAltText } from '../../src/results/charts-out.js';
import { sampleModel } from '../render/sample-model.js';
import type { PackModel } from '../../src/render/model.js';

let files: Array<[string, string]>;

beforeAll(async () => {
  files = await chartFiles(sampleModel);
});

function parseXml(xml: string): { root: string; attrs: Record<string, string>; title: string } {
  const parser = new SaxesParser();
  let root = '';
  let attrs: Record<string, string> = {};
  let depth = 0;
  let inTitle = false;
  let title = '';
  parser.on('opentag', (t) => {
    if (depth === 0) {
      root = t.name;
      attrs = t.attributes as Record<string, string>;
    }
    if (depth === 1 && t.name === 'title') inTitle = true;
    depth++;
  });
  parser.on('closetag', (t) => {
    depth--;
    if (t.name === 'title') inTitle = false;
  });
  parser.on('text', (x) => {
    if (inTitle) title += x;
  });
  parser.write(xml).close();
  return { root, attrs, title };
}

describe('chartFiles', () => {
  it('writes an SVG and a Vega-Lite spec for each claim with a chart, in claim order', () => {
    const withCharts = sampleModel.claims.filter((c) => c.chart).map((c) => c.id);
    expect(files.map(([p]) => p)).toEqual(withCharts.flatMap((id) => [`charts/${id}.svg`, `charts/${id}.vl.json`]));
  });

  it('gives well-formed SVG carrying the alt text as title and aria-label', () => {
    for (const claim of sampleModel.claims.filter((c) => c.chart)) {
      const svg = files.find(([p]) => p === `charts/${claim.id}.svg`)![1];
      const parsed = parseXml(svg);
      expect(parsed.root).toBe('svg');
      expect(parsed.attrs.role).toBe('img');
      expect(parsed.attrs['aria-label']).toBe(claim.chart!.alt);
      expect(parsed.title).toBe(claim.chart!.alt);
    }
  });

  it('gives specs that vega-lite compiles and vega renders to SVG', async () => {
    for (const [path, content] of files.filter(([p]) => p.endsWith('.vl.json'))) {
      const spec = JSON.parse(content);
      expect(spec.$schema).toMatch(/vega-lite\/v6/);
      const id = path.slice('charts/'.length, -'.vl.json'.length);
      expect(spec.description).toBe(sampleModel.claims.find((c) => c.id === id)!.chart!.alt);
      const view = new vega.View(vega.parse(vl.compile(spec).spec), { renderer: 'none' });
      const svg = await view.toSVG();
      view.finalize();
      expect(svg).toMatch(/^<svg/);
    }
    const c1 = JSON.parse(files.find(([p]) => p === 'charts/C1.vl.json')![1]);
    expect(JSON.stringify(c1)).toContain('Coleg Ŵennalt (n = 840)');
  });

  it('is deterministic', async () => {
    expect(await chartFiles(sampleModel)).toEqual(files);
  });

  it('makes file names safe and refuses two claims that would share one', async () => {
    expect(chartFileStem('a/b c')).toBe('a_b_c');
    expect(chartFileStem('..x')).toBe('_x');
    const c = sampleModel.claims[0]!;
    const model: PackModel = { ...sampleModel, claims: [{ ...c, id: 'a b' }, { ...c, id: 'a/b' }] };
    await expect(chartFiles(model)).rejects.toThrow(/"a b" and "a\/b" would both be written as charts\/a_b\.svg/);
  });

  it('escapes the alt text', () => {
    const svg = withAltText('<svg width="1" height="1"></svg>', 'A < B & "C"');
    expect(parseXml(svg).title).toBe('A < B & "C"');
    expect(parseXml(svg).attrs['aria-label']).toBe('A < B & "C"');
  });
});
