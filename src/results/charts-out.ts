/**
 * The charts of a pack as files beside the PDF: charts/<claim-id>.svg (the drawing) and charts/<claim-id>.vl.json
 * (its Vega-Lite spec, so anyone can redraw or restyle it). Each carries the chart's alt text: the spec as its
 * `description`, the SVG as a <title> and aria-label (SVG 2, section 5.9; WAI-ARIA 1.2 role "img").
 */
import type { PackModel } from '../render/model.js';
import { chartSpec, chartSvg } from '../render/charts.js';

/** A claim id as a file name: letters, digits, dot, dash and underscore kept; anything else becomes "_". */
export function chartFileStem(id: string): string {
  const stem = id.replace(/[^A-Za-z0-9._-]/g, '_').replace(/^\.+/, '_');
  if (stem.length === 0) throw new Error('Chart files: a claim has an empty id; every claim needs an id to name its chart.');
  return stem;
}

function escapeXml(text: string): string {
  return text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
}

/** Put the alt text into an SVG: role and aria-label on the root, and a <title> as its first child. */
export function withAltText(svg: string, alt: string): string {
  const root = /<svg\b[^>]*>/.exec(svg);
  if (!root) throw new Error('Chart files: the chart drawing has no <svg> root element.');
  const open = root[0]
    .replace(/\s(role|aria-label)="[^"]*"/g, '')
    .replace(/^<svg\b/, `<svg role="img" aria-label="${escapeXml(alt)}"`);
  const at = root.index + root[0].length;
  return `${svg.slice(0, root.index)}${open}<title>${escapeXml(alt)}</title>${svg.slice(at)}`;
}

/**
 * The names of the chart files of a pack, in claim order ("charts/<stem>.svg", "charts/<stem>.vl.json" for each claim
 * with a chart), known before any chart is drawn. Throws when two claim ids would give the same file name.
 */
export function chartFileNames(model: PackModel): string[] {
  const names: string[] = [];
  const seen = new Map<string, string>();
  for (const claim of model.claims) {
    if (!claim.chart) continue;
    const stem = chartFileStem(claim.id);
    const other = seen.get(stem.toLowerCase());
    if (other !== undefined) {
      throw new Error(
        `Chart files: claims "${other}" and "${claim.id}" would both be written as charts/${stem}.svg; give one of them a different id.`,
      );
    }
    seen.set(stem.toLowerCase(), claim.id);
    names.push(`charts/${stem}.svg`, `charts/${stem}.vl.json`);
  }
  return names;
}

/** The two files of one claim's chart, from the SVG drawn for it at its usual size: [relative path, content] pairs. */
export function chartFilesOf(claim: PackModel['claims'][number], svg: string): Array<[string, string]> {
  if (!claim.chart) return [];
  const stem = chartFileStem(claim.id);
  const spec = { description: claim.chart.alt, ...(chartSpec(claim.chart.data) as Record<string, unknown>) };
  return [
    [`charts/${stem}.svg`, withAltText(svg, claim.chart.alt)],
    [`charts/${stem}.vl.json`, `${JSON.stringify(spec, null, 2)}\n`],
  ];
}

/**
 * Files for every claim with a chart, in claim order: [relative path, content] pairs, e.g.
 * ["charts/feedback-below-region.svg", "<svg ...>"]. Deterministic: the same model gives the same files.
 * Throws when two claim ids would give the same file name. (A build writes each claim's files as its chart is drawn,
 * with chartFileNames and chartFilesOf, rather than holding them all.)
 */
export async function chartFiles(model: PackModel): Promise<Array<[string, string]>> {
  chartFileNames(model);
  const files: Array<[string, string]> = [];
  for (const claim of model.claims) {
    if (claim.chart) files.push(...chartFilesOf(claim, await chartSvg(claim.chart.data)));
  }
  return files;
}
