/** Words for the "crosstab" kind: a table of counts, rows by columns, related or not. */
import type { CrosstabAnalysis } from '../../analyse/types.js';
import * as fmt from '../../format/numbers.js';
import type { Chart, NumberRow } from '../../render/model.js';
import type { Decision } from '../decide.js';
import type { View } from '../templates.js';
import { unitWords } from './association.js';
import { questionWords } from '../../analyse/labels.js';
import { commonRows, detectableLabel, pView, scopeText, tooLittle, type ComposeContext, type Composed } from './common.js';

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
  const rowsName = [claim.rows].flat().join(', ');
  const rowWords = unitWords(claim.rows);
  const columnsName = a.answers !== undefined ? `the answer to ${questionWords(a.answers.question, claim.naming)}` : Array.isArray(claim.columns) ? claim.columns.join(', ') : claim.columns;
  const labels = { rowsName, columnsName, rowsOne: rowWords.unitName, rowsPlural: rowWords.unitsName };
  const hypotheses = { null: t.render('crosstab.null', labels), alternative: t.render('crosstab.alternative', labels) };
  if (a.status === 'too-little-data' || !a.test) {
    return tooLittle(a, ctx, `${rowsName} by ${columnsName}${scopeText(claim.where, claim.naming) ? `, for ${scopeText(claim.where, claim.naming)}` : ''}.`, hypotheses);
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
    // With the answers to one question as the columns, the question is named there, not again in the scope.
    scope: scopeText(a.answers !== undefined && claim.naming?.question !== undefined ? Object.fromEntries(Object.entries(claim.where).filter(([k]) => k !== claim.naming?.question)) : claim.where, claim.naming),
    v: fmt.coefficient(a.cramersV ?? NaN),
    notableText: notableText ? `${notableText.charAt(0).toUpperCase()}${notableText.slice(1)}.` : '',
    cutoff: fmt.plain(a.residualCutoff ?? 1.96, 2),
    detectable: a.detectable !== undefined ? fmt.coefficient(a.detectable) : '',
    testName,
    chiAlso: a.test.method.startsWith('fisher'),
    level: fmt.level(claim.confidence),
    adjustName: ctx.adjustName,
    ...pView(decision, ctx),
  };
  const numbers: NumberRow[] = [
    ...(a.answers !== undefined ? [{ label: `Answers to ${a.answers.question}`, value: `codes ${a.columnLabels.join(', ')}, number answering each` }] : []),
    ...a.rowLabels.map((row, i) => ({
      label: row,
      value: a.columnLabels.map((col, j) => `${a.answers !== undefined ? `${col}:` : col} ${fmt.count((a.counts[i] as number[])[j] as number)}`).join(', '),
    })),
    ...(a.suppressedRows.length > 0
      ? [{ label: 'Rows used', value: `${a.rowLabels.length} of ${a.rowLabels.length + a.suppressedRows.length} ${labels.rowsPlural} (${a.suppressedRows.length} under ${claim.minRespondents} respondents left out)` }]
      : []),
    ...commonRows(a, decision, ctx),
    { label: "Cramér's V", value: view.v as string },
    { label: 'Smallest expected count', value: fmt.plain(a.minExpected ?? NaN, 1) },
    {
      label: `Cells beyond ±${view.cutoff as string} (adjusted residual)`,
      value: a.notable.length > 0 ? a.notable.map((c) => `${c.row}, ${c.column}: ${fmt.statistic(c.residual)}`).join('; ') : 'none',
    },
    ...(a.detectable !== undefined ? [{ label: detectableLabel("Cramér's V", decision), value: `about ${view.detectable as string}` }] : []),
  ];
  const cautions: string[] = [];
  const left = a.answers !== undefined ? answersLeftOut(a.answers) : '';
  if (left !== '') cautions.push(left);
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

/**
 * The answers a table of answer codes leaves out, in the rows it shows: "Left out of the table: 41 answers of
 * not applicable and 118 blank answers; the table counts the 2,220 answers on the scale 1 to 5." Empty when none.
 */
function answersLeftOut(x: NonNullable<CrosstabAnalysis['answers']>): string {
  const parts: string[] = [];
  if (x.notApplicable > 0) parts.push(`${fmt.count(x.notApplicable)} ${x.notApplicable === 1 ? 'answer' : 'answers'} of "not applicable"`);
  if (x.blank > 0) parts.push(`${fmt.count(x.blank)} blank ${x.blank === 1 ? 'answer' : 'answers'} (respondents who answered other questions but not this one)`);
  if (x.offScale > 0) parts.push(`${fmt.count(x.offScale)} ${x.offScale === 1 ? 'answer' : 'answers'} with codes outside ${x.scale.join(', ')}`);
  if (parts.length === 0) return '';
  const list = parts.length === 1 ? parts[0] : `${parts.slice(0, -1).join(', ')} and ${parts[parts.length - 1]}`;
  const same =
    x.offScale > 0
      ? ` Agreement rates and mean scores on ${x.question} also count the answers outside the scale, so their base is larger by ${fmt.count(x.offScale)}.`
      : ` Agreement rates and mean scores on ${x.question} count the same answers, leaving out the same ones.`;
  return `The table counts the answers to ${x.question} on the scale ${x.scale.join(', ')}; left out: ${list}.${same}`;
}
