/**
 * Axis ranges of the pack's charts, kept apart from the chart drawing (no heavy libraries), so that the pack model
 * can set a range common to the pack before anything is drawn.
 *
 * The one rule for axis ranges. Every agreement rate of a pack (the dot charts of rates and the period lines) is
 * drawn on one common range, from the lowest to the highest interval end in the pack rounded out to a tenth, so
 * equal gaps look equal from page to page; the parts of a stacked bar fill the whole 0-100%; a mean score is drawn
 * on the whole answer scale; a difference against an equivalence margin on a range centred on zero. Only a scatter
 * of units, whose point is the relation and not the level, fits its axes to the units shown. The method notes say
 * so ('chart-scales' in src/stats/methods.ts).
 */
import type { ChartData } from './model.js';

export const WHOLE_SHARE: [number, number] = [0, 1];

/** Round a fraction down (or up) to a tenth. */
function tenthFloor(v: number): number {
  return Math.max(0, Math.floor(v * 10 + 1e-9) / 10);
}
function tenthCeil(v: number): number {
  return Math.min(1, Math.ceil(v * 10 - 1e-9) / 10);
}

/** The range of a share axis holding these values: a little room each side, ends on tenths, at least 20 points. */
export function shareRange(values: number[]): [number, number] {
  let lo = tenthFloor(Math.min(...values) - 0.02);
  let hi = tenthCeil(Math.max(...values) + 0.02);
  if (hi - lo < 0.2) {
    lo = tenthFloor((hi + lo) / 2 - 0.1);
    hi = tenthCeil(lo + 0.2);
  }
  return [lo, hi];
}

/** The values a share chart puts on its axis (interval ends, fitted rates, a reference line). */
export function shareValues(data: ChartData): number[] {
  switch (data.kind) {
    case 'rates':
      return data.bars.flatMap((b) => [b.lower, b.upper]).concat(data.reference ? [data.reference.value] : []);
    case 'periods':
      return data.points.flatMap((p) => [p.lower, p.upper]).concat(data.fit ?? []);
    default:
      return [];
  }
}

/**
 * The pack's common share range, set on every rates and periods chart (in place of each chart's own fitted range),
 * so the PDF and the chart files beside it draw the same axes. Non-finite values are left for the chart to refuse.
 */
export function withCommonShareRange<T extends { chart?: { data: ChartData } }>(sections: T[]): T[] {
  const values = sections.flatMap((s) => (s.chart ? shareValues(s.chart.data) : [])).filter(Number.isFinite);
  if (values.length === 0) return sections;
  const domain = shareRange(values);
  return sections.map((s) =>
    s.chart && (s.chart.data.kind === 'rates' || s.chart.data.kind === 'periods')
      ? { ...s, chart: { ...s.chart, data: { ...s.chart.data, domain } } }
      : s,
  );
}

