/** Words for the "crosstab" kind: a table of counts, rows by columns, related or not. */
import type { CrosstabAnalysis } from '../../analyse/types.js';
import * as fmt from '../../format/numbers.js';
import type { Chart, NumberRow } from '../../render/model.js';
import type { Decision } from '../decide.js';
import type { View } from '../templates.js';
import { commonRows, plural, pView, scopeText, tooLittle, type ComposeContext, type Composed } from './common.js';

/** Test names for people, by method machine name. */
const TEST_NAMES: Record<string, string> = {
  'chi-square-independence': 'Pearson chi-square test',
  'chi-square-independence-yates': 'Pearson chi-square test with Yates’ correction',
  'fisher-exact-2x2': 'Fisher’s exact test',
  'fisher-exact-rxc': 'Fisher’s exact test (Freeman–Halton)',
};

export function composeCrosstab(a: CrosstabAnalysis, decision: Decision, ctx: ComposeContext): Composed {
  const t = ctx.templates;
  const claim = a.claim;
  const agreement = claim.columns === 'agreement';
  const rowsName = claim.rows;
  const columnsName = agreement ? 'agreement' : claim.columns;
  const labels = { rowsName, columnsName, rowsOne: rowsName.toLowerCase(), rowsPlural: plural(rowsName) };
  const hypotheses = { null: t.render('crosstab.null', labels), alternative: t.render('crosstab.alternative', labels) };
  if (a.status === 'too-little-data' || !a.test) {
    return tooLittle(a, ctx, `${rowsName} by ${columnsName}${scopeText(claim.where) ? `, for ${scopeText(claim.where)}` : ''}.`, hypotheses);
  }
  const total = a.counts.reduce((s, r) => s + r.reduce((u, v) => u + v, 0), 0);
  const notableText = a.notable
    .map((c) => t.render(c.residual > 0 ? 'crosstab.cell-more' : 'crosstab.cell-fewer', { row: c.row, column: c.column }))
    .join('; ');
  const testName = TEST_NAMES[a.test.method] ?? a.test.method;
  const view: View = {
    ...labels,
    rowCount: a.rowLabels.length,
    total: fmt.count(total),
    scope: scopeText(claim.where),
    v: fmt.coefficient(a.cramersV ?? NaN),
    notableText: notableText ? `${notableText.charAt(0).toUpperCase()}${notableText.slice(1)}.` : '',
    testName,
    chiAlso: a.test.method.startsWith('fisher'),
    level: fmt.level(claim.confidence),
    adjustName: ctx.adjustName,
    ...pView(decision, ctx),
  };
  const numbers: NumberRow[] = [
    ...a.rowLabels.map((row, i) => ({
      label: row,
      value: a.columnLabels.map((col, j) => `${col} ${fmt.count((a.counts[i] as number[])[j] as number)}`).join(', '),
    })),
    ...commonRows(a, decision, ctx),
    { label: "Cramér's V", value: view.v as string },
    { label: 'Smallest expected count', value: fmt.plain(a.minExpected ?? NaN, 1) },
  ];
  const cautions: string[] = [];
  if (a.suppressedRows.length > 0) cautions.push(t.render('crosstab.caution-suppressed', { names: a.suppressedRows.join(', '), minRespondents: claim.minRespondents }));
  if (a.test.method.startsWith('fisher')) cautions.push(t.render('caution.fisher', {}));
  if (a.fisherTooLarge) cautions.push(t.render('crosstab.caution-fisher-too-large', {}));
  const chart: Chart = {
    data: {
      kind: 'stacked',
      rows: a.rowLabels.map((row, i) => ({ label: row, parts: a.columnLabels.map((col, j) => ({ label: col, count: (a.counts[i] as number[])[j] as number })) })),
      axisTitle: `Share of respondents (%)`,
    },
    alt: `Stacked bars, one per ${labels.rowsOne}, split by ${columnsName}: ${a.rowLabels
      .map((row, i) => {
        const r = a.counts[i] as number[];
        const n = r.reduce((s, v) => s + v, 0);
        return `${row} ${a.columnLabels.map((col, j) => `${fmt.percent(((r[j] as number) / n))} ${col}`).join(', ')}`;
      })
      .join('; ')}.`,
  };
  return {
    section: {
      compared: t.render('crosstab.compared', view),
      hypotheses,
      numbers,
      chart,
      verdictText: t.render(`crosstab.${decision.verdict}`, view),
      cautions,
      methodLine: t.render('crosstab.method', view),
    },
    key: t.render('crosstab.key', view),
  };
}
