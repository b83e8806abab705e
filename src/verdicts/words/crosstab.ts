/** Words for the "crosstab" kind: a table of counts, rows by columns, related or not. */
import type { CrosstabAnalysis } from '../../analyse/types.js';
import * as fmt from '../../format/numbers.js';
import type { Chart, NumberRow } from '../../render/model.js';
import type { Decision } from '../decide.js';
import type { View } from '../templates.js';
import { unitWords } from './association.js';
import { questionWords } from '../../analyse/labels.js';
import { commonRows, comparesPeriods, detectableLabel, listWords, pView, scopeText, tooLittle, type ComposeContext, type Composed } from './common.js';

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
  // The hypotheses name the question by its code; what was compared has it in its wording.
  const columnsShort = a.answers !== undefined ? `the answer to ${a.answers.question}` : columnsName;
  const labels = { rowsName, columnsName, columnsShort, rowsOne: rowWords.unitName, rowsPlural: rowWords.unitsName };
  const hypotheses = { null: t.render('crosstab.null', labels), alternative: t.render('crosstab.alternative', labels) };
  if (a.status === 'too-little-data' || !a.test) {
    return tooLittle(a, ctx, `${rowsName} by ${columnsName}${scopeText(claim.where, claim.naming) ? `, for ${scopeText(claim.where, claim.naming)}` : ''}.`, hypotheses);
  }
  const total = a.counts.reduce((s, r) => s + r.reduce((u, v) => u + v, 0), 0);
  const notableText = notableCells(a, columnsName, t);
  const testName = TEST_NAMES[a.test.method] ?? a.test.method;
  const view: View = {
    ...labels,
    rowCount: a.rowLabels.length,
    total: fmt.count(total),
    // With the answers to one question as the columns, the question is named there, not again in the scope.
    scope: scopeText(a.answers !== undefined && claim.naming?.question !== undefined ? Object.fromEntries(Object.entries(claim.where).filter(([k]) => k !== claim.naming?.question)) : claim.where, claim.naming),
    v: fmt.coefficient(a.cramersV ?? NaN),
    notableText,
    cutoff: fmt.plain(a.residualCutoff ?? 1.96, 2),
    detectable: a.detectable !== undefined ? fmt.coefficient(a.detectable) : '',
    testName,
    chiAlso: a.test.method.startsWith('fisher'),
    level: fmt.level(claim.confidence),
    adjustName: ctx.adjustName,
    ...pView(decision, ctx),
  };
  const numbers: NumberRow[] = [
    ...(a.answers !== undefined ? [{ label: `Answers to ${a.answers.question}`, value: `codes ${a.columnLabels.join(', ')}, number answering each${answerKey(a.columnLabels, claim.naming?.answers)}` }] : []),
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
      value: notableValue(a),
    },
    ...(a.detectable !== undefined ? [{ label: detectableLabel("Cramér's V", decision), value: `about ${view.detectable as string}` }] : []),
  ];
  const cautions: string[] = [];
  const left = a.answers !== undefined ? answersLeftOut(a.answers) : '';
  if (left !== '') cautions.push(left);
  if (a.suppressedRows.length > 0) cautions.push(t.render('crosstab.caution-suppressed', { names: a.suppressedRows.join(', '), minRespondents: claim.minRespondents }));
  if (a.test.method.startsWith('fisher')) cautions.push(t.render('caution.fisher', {}));
  if (a.fisherTooLarge) cautions.push(t.render('crosstab.caution-fisher-too-large', {}));
  if (comparesPeriods(a, ctx.periodColumns)) cautions.push(t.render('crosstab.caution-cohorts', {}));
  // With answers as the columns, the legend names each code in the scale's wording where the source gives it.
  const answerWords = a.answers !== undefined ? claim.naming?.answers : undefined;
  const partLabel = (col: string): string => (answerWords?.[col] !== undefined ? `${col} ${answerWords[col] as string}` : col);
  const chart: Chart = {
    data: {
      kind: 'stacked',
      rows: a.rowLabels.map((row, i) => ({ label: row, parts: a.columnLabels.map((col, j) => ({ label: partLabel(col), count: (a.counts[i] as number[])[j] as number })) })),
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

/** The wording of the answer codes shown, when the source gives it: " (1 strongly disagree, 5 strongly agree)". */
function answerKey(codes: string[], words?: Record<string, string>): string {
  const named = codes.flatMap((c) => (words?.[c] !== undefined ? [`${c} ${words[c] as string}`] : []));
  return named.length > 0 ? ` (${named.join(', ')})` : '';
}

/**
 * The cells beyond the cutoff with their adjusted residuals ("2026, 4: 3.76; 2026, 3: −4.38"). In a table of two rows
 * the other row's residuals are the same with the opposite sign, so only the second row (named in the verdict) is listed.
 */
function notableValue(a: CrosstabAnalysis): string {
  if (a.notable.length === 0) return 'none';
  const two = a.rowLabels.length === 2 ? a.rowLabels[1]! : undefined;
  const rows = two !== undefined ? [two] : [...new Set(a.notable.map((c) => c.row))];
  const sign = (x: number): string => (x > 0 ? `+${fmt.statistic(x)}` : fmt.statistic(x));
  const text = rows
    .map((row) => {
      const cells = a.notable.filter((c) => c.row === row).sort((x, y) => a.columnLabels.indexOf(x.column) - a.columnLabels.indexOf(y.column));
      return `${row}: ${cells.map((c) => `${c.column} ${sign(c.residual)}`).join(', ')}`;
    })
    .join('; ');
  const other = two !== undefined ? a.rowLabels.find((r) => r !== two) : undefined;
  return other !== undefined ? `${text}; ${other}: the same with opposite signs` : text;
}


/**
 * The cells beyond the residual cutoff, one clause per row, naming the columns as a reader would: "2026 has more
 * answers of 4 (agree) and 5 (strongly agree), and fewer of 1 (strongly disagree), than independence would give".
 * Answers are named by their code with the source's answer wording beside it; agreement columns as respondents
 * agreeing; other columns by their value. In a table of two rows each cell mirrors the other row's, so only the row
 * is named (the later period, when the rows are periods), with the other said to be the reverse.
 */
export function notableCells(a: CrosstabAnalysis, columnsName: string, t: ComposeContext['templates']): string {
  if (a.notable.length === 0) return '';
  const words = a.claim.naming?.answers;
  const kind: 'answers' | 'agreement' | 'other' = a.answers !== undefined ? 'answers' : a.claim.columns === 'agreement' ? 'agreement' : 'other';
  const name = (col: string): string => {
    if (kind === 'answers') {
      const w = words?.[col];
      return w !== undefined ? `${col} (${w.charAt(0).toLowerCase()}${w.slice(1)})` : col;
    }
    return col;
  };
  const phrase = (cols: string[], first: boolean): string => {
    const named = listWords(cols.map(name));
    if (kind === 'answers') return first ? `answers of ${named}` : `of ${named}`;
    if (kind === 'agreement') return `respondents ${named}`;
    return first ? `respondents with ${columnsName} ${named}` : `with ${named}`;
  };
  const two = a.rowLabels.length === 2;
  // Of two rows, the second is named (for periods, the later one).
  const rows = two ? [a.rowLabels[1]!] : [...new Set(a.notable.map((c) => c.row))];
  return rows
    .map((row) => {
      // Columns in the table's order (the scale's order for answers), not by the size of the residual.
      const cells = a.notable.filter((c) => c.row === row).sort((x, y) => a.columnLabels.indexOf(x.column) - a.columnLabels.indexOf(y.column));
      const more = cells.filter((c) => c.residual > 0).map((c) => c.column);
      const fewer = cells.filter((c) => c.residual < 0).map((c) => c.column);
      const what =
        more.length > 0 && fewer.length > 0
          ? `more ${phrase(more, true)}, and fewer ${phrase(fewer, false)},`
          : more.length > 0
            ? `more ${phrase(more, true)}`
            : `fewer ${phrase(fewer, true)}`;
      const other = two ? a.rowLabels.find((r) => r !== row) : undefined;
      return t.render('crosstab.cells', { row, what, reverse: other ?? '' });
    })
    .join('; ');
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
