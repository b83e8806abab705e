/**
 * Where a claim's data came from, in words: the survey's name, who ran it (an independent release or the
 * organisation's own survey, as the claims file states in the source's `origin`), and the response rate or that it
 * is unknown. Also the cover's respondents and periods for each source.
 */
import type { Analysis, RateSummary } from '../analyse/types.js';
import type { SourceSpec } from '../claims/types.js';
import type { Cube } from '../data/types.js';
import * as fmt from '../format/numbers.js';
import type { Templates } from './templates.js';

/** Every selection's rate a claim reports (two groups, one selection, or one per period). */
function ratesOf(a: Analysis): RateSummary[] {
  // A rank claim reports every unit it ranked.
  if (a.kind === 'rank') return a.units ?? [];
  if (a.kind === 'every') return (a.tests ?? []).map((u) => u.rate);
  const x = a as unknown as { focus?: RateSummary; against?: RateSummary; rate?: RateSummary; earlier?: RateSummary; later?: RateSummary; rates?: RateSummary[] };
  const all = [x.focus, x.against, x.rate, x.earlier, x.later, ...(x.rates ?? [])];
  return all.filter((r): r is RateSummary => r !== undefined && typeof r.n === 'number');
}

/** The lowest response rate (respondents / eligible) among the claim's selections, where the number eligible is known. */
export function responseRateOf(a: Analysis): { rate: number; of: number } | undefined {
  const known = ratesOf(a).filter((r) => r.population !== undefined && (r.population as number) > 0);
  if (known.length === 0) return undefined;
  return { rate: Math.min(...known.map((r) => r.n / (r.population as number))), of: known.length };
}

export function originText(spec: SourceSpec | undefined): string {
  if (spec?.origin === 'independent') return 'an independent release';
  if (spec?.origin === 'own') return "the organisation's own survey";
  return 'the claims file does not say who ran it';
}

export function sourceLine(a: Analysis, spec: SourceSpec | undefined, cube: Cube | undefined, t: Templates): string {
  const rr = a.status === 'tested' ? responseRateOf(a) : undefined;
  return t.render('source-line', {
    title: spec?.title ?? a.claim.source,
    origin: originText(spec),
    file: spec?.file ?? cube?.file ?? '',
    known: rr !== undefined,
    rate: rr ? fmt.percent(rr.rate) : '',
    lowest: rr !== undefined && rr.of > 1,
    noPopulation: rr === undefined && !cube?.hasPopulation,
    withheld: a.status !== 'tested',
  });
}

/** The column that names the question in a cube, if any (respondent files always have one). */
function questionColumn(spec: SourceSpec | undefined, cube: Cube): string | undefined {
  if (spec?.shape === 'respondents' && cube.dimensions.includes(spec.questionColumn)) return spec.questionColumn;
  return cube.dimensions.find((d) => /^(question|item|question code)$/i.test(d.trim()));
}

/** Whole numbers written plainly (no sign, no leading zero): their numeric collation order is their numeric order. */
const PLAIN_WHOLE = /^(0|[1-9][0-9]{0,14})$/;

/**
 * Periods in numeric collation order (2 before 10). Plain whole numbers, such as years, are put in order as numbers,
 * the same order without loading the locale's collation data (about 10 ms the first time).
 */
function sortPeriods(values: readonly string[]): string[] {
  if (values.every((v) => PLAIN_WHOLE.test(v))) return [...values].sort((p, q) => Number(p) - Number(q));
  return [...values].sort((p, q) => p.localeCompare(q, 'en', { numeric: true }));
}

/**
 * Respondents per period for the cover: for each period, the number who answered the most-answered question (the
 * closest a file of answers per question comes to a head count). Undefined without a question column.
 */
export function respondentsByPeriod(spec: SourceSpec | undefined, cube: Cube): { periods: string[]; respondents: Array<{ period: string; n: number }> | undefined } {
  const period = spec?.period && cube.dimensions.includes(spec.period) ? spec.period : undefined;
  const periods = period ? sortPeriods(cube.values[period] ?? []) : [];
  const question = questionColumn(spec, cube);
  if (!question) return { periods, respondents: undefined };
  const totals = new Map<string, Map<string, number>>();
  for (const cell of cube.cells) {
    const p = period ? cell.dims[period] ?? '' : '';
    const q = cell.dims[question] ?? '';
    const byQ = totals.get(p) ?? new Map<string, number>();
    byQ.set(q, (byQ.get(q) ?? 0) + cell.n);
    totals.set(p, byQ);
  }
  const keys = period ? periods : [''];
  return { periods, respondents: keys.map((p) => ({ period: p, n: Math.max(0, ...(totals.get(p)?.values() ?? [])) })) };
}

export function respondentsText(spec: SourceSpec | undefined, cube: Cube): string | undefined {
  const { respondents } = respondentsByPeriod(spec, cube);
  if (!respondents || respondents.length === 0) return undefined;
  const parts = respondents.map((r) => (r.period ? `${fmt.count(r.n)} in ${r.period}` : fmt.count(r.n)));
  const list = parts.length > 1 ? `${parts.slice(0, -1).join(', ')} and ${parts[parts.length - 1]}` : parts[0];
  return `${list} (the most answering any one question)`;
}
