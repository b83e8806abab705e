/**
 * Pieces every claim kind's wording uses: the context, number rows shared by all tests, the "too little data" section.
 */
import type { Analysis, RateSummary } from '../../analyse/types.js';
import { filterLabel } from '../../analyse/labels.js';
import type { Filter, Naming } from '../../claims/types.js';
import * as fmt from '../../format/numbers.js';
import type { ClaimSection, NumberRow } from '../../render/model.js';
import type { Claim } from '../../claims/types.js';
import type { Decision } from '../decide.js';
import type { Templates } from '../templates.js';
import { isLowResponse } from '../../analyse/thresholds.js';

export interface ComposeContext {
  templates: Templates;
  /** How many claims were tested together (the adjustment's family). */
  claimsTested: number;
  /** The adjustment's name in words, e.g. "Holm's method". */
  adjustName: string;
  /** True when an adjustment other than none was applied and more than one claim was tested. */
  adjusted: boolean;
  minRespondents: number;
  /** The column that holds survey years, if known, to spot year-on-year claims. */
  periodColumns: string[];
  /** The distinct values of each column of a claim's source (and its period column), to read its words against. */
  wordsData?: (claim: Claim) => { values: Readonly<Record<string, readonly string[]>>; period?: string } | undefined;
}

/** What a kind's wording returns: the section body and the summary table's key figure. */
export interface Composed {
  section: Omit<ClaimSection, 'id' | 'statement' | 'verdictLabel' | 'verdict'>;
  key: string;
}

/**
 * A rate with its interval, written for people. `digits` is the precision shared with the rates it is compared with
 * (`sharedDigits`); alone, the decimals are chosen so that the rate and its interval's ends never print alike.
 */
export function rateView(r: RateSummary, digits?: number) {
  const dg = digits ?? fmt.percentDigits(r.rate, r.interval.lower, r.interval.upper);
  return { label: r.label, n: fmt.count(r.n), rate: fmt.percent(r.rate, dg), lower: fmt.percent(r.interval.lower, dg), upper: fmt.percent(r.interval.upper, dg) };
}

/**
 * The caution for a comparison of a selection with the rest of a group that holds it (compare, means, equivalence):
 * names the inner selection, the group and the size of the rest (`sizes`: the two selections' respondents). None
 * when the two selections are separate.
 */
export function restOfGroupCaution(
  relation: 'separate' | 'focus-inside' | 'against-inside',
  claim: { focus: Filter; against: Filter; focusLabel?: string; againstLabel?: string; againstRest?: true; naming?: Naming },
  sizes: { focus: number; against: number },
  t: Templates,
): string[] {
  // `against: rest` asked for everyone else in so many words: the label already says so.
  if (relation === 'separate' || claim.againstRest === true) return [];
  const inner = relation === 'focus-inside' ? claim.focusLabel ?? filterLabel(claim.focus, claim.naming) : claim.againstLabel ?? filterLabel(claim.against, claim.naming);
  const outer = relation === 'focus-inside' ? claim.againstLabel ?? filterLabel(claim.against, claim.naming) : claim.focusLabel ?? filterLabel(claim.focus, claim.naming);
  const restN = relation === 'focus-inside' ? sizes.against : sizes.focus;
  return [t.render('caution.rest-of-group', { inner, outer, restN: fmt.count(restN) })];
}

/**
 * Whether a claim sets respondents of different periods against each other, so that the cohorts caution applies:
 * change and trend always; a comparison of two selections (compare, means, equivalence) whose focus and against
 * both name a period; a crosstab whose rows or columns are a period column. The general cautions speak of cohorts
 * only in a pack that has such a claim.
 */
export function comparesPeriods(a: Analysis, periodColumns: readonly string[]): boolean {
  if (a.kind === 'change' || a.kind === 'gap-change' || a.kind === 'trend') return true;
  const c = a.claim as unknown as { focus?: Filter; against?: Filter; rows?: string[]; columns?: string | string[] };
  if ((a.kind === 'compare' || a.kind === 'means' || a.kind === 'equivalence') && c.focus && c.against) {
    return periodColumns.some((p) => p in (c.focus as Filter) && p in (c.against as Filter));
  }
  if (a.kind === 'crosstab') return periodColumns.some((p) => (c.rows ?? []).includes(p) || (Array.isArray(c.columns) && c.columns.includes(p)));
  return false;
}

/** True for a claim of a relation between two measures or variables (association, crosstab): causation caution. */
export function relatesMeasures(a: Analysis): boolean {
  return a.kind === 'association' || a.kind === 'crosstab';
}

export function scopeText(where: Filter, naming?: Naming): string {
  return Object.keys(where).length > 0 ? filterLabel(where, naming) : '';
}

/** A significance threshold in three significant figures, trailing zeros dropped: 0.05, 0.0125, 0.00833. */
export function thresholdText(alpha: number): string {
  return String(Number(alpha.toPrecision(3)));
}

/**
 * Where the detectable effect was computed: at the threshold that decided the verdict (after the adjustment for many
 * claims, when one was made), e.g. " at the threshold that decided this verdict (p below 0.00385 after adjusting for
 * 13 claims)". Empty when the claim was not tested.
 */
export function detectAtPhrase(decision: Decision, ctx: ComposeContext): string {
  const at = decision.effectiveAlpha;
  if (at === undefined) return '';
  const adjusted = ctx.adjusted && at < decision.alpha;
  return ` at the threshold that decided this verdict (p below ${thresholdText(at)}${adjusted ? ` after adjusting for ${ctx.claimsTested} claims` : ''})`;
}

/** The numbers-table label for a detectable effect: "Smallest difference detected 80% of the time (p below 0.0038)". */
export function detectableLabel(what: string, decision: Decision): string {
  const at = decision.effectiveAlpha;
  return `Smallest ${what} detected 80% of the time${at !== undefined ? ` (at p below ${thresholdText(at)})` : ''}`;
}

export function pView(decision: Decision, ctx: ComposeContext) {
  return {
    detectAt: detectAtPhrase(decision, ctx),
    pPhrase: fmt.pPhrase(decision.p ?? NaN),
    pAdjustedPhrase: `adjusted ${fmt.pPhrase(decision.pAdjusted ?? NaN)}`,
    adjusted: ctx.adjusted,
    claimsTested: ctx.claimsTested,
  };
}

export function commonRows(a: Analysis, decision: Decision, ctx: ComposeContext): NumberRow[] {
  const rows: NumberRow[] = [];
  if (a.test?.statistic) {
    const df =
      a.test.df === undefined
        ? ''
        : Array.isArray(a.test.df)
          ? `, ${a.test.df.join(' and ')} degrees of freedom`
          : `, ${fmt.plain(a.test.df, 1)} ${a.test.df === 1 ? 'degree' : 'degrees'} of freedom`;
    rows.push({ label: 'Test statistic', value: `${a.test.statistic.symbol} = ${fmt.statistic(a.test.statistic.value)}${df}` });
  }
  // The TOST p-value is neither one- nor two-sided: it is the larger of the two one-sided p-values.
  const sidedness =
    a.kind === 'equivalence'
      ? 'TOST, the larger of the two one-sided p-values'
      : a.test?.method === 'gap-size-iut'
        ? 'the larger of the two tests’'
        : a.test?.method === 'rank-iut'
          ? `the largest of the one-sided tests, one per rival${a.test.alternative === 'two-sided' ? ', each at the two-sided level' : ''}`
          : a.test?.method === 'every-iut'
            ? `the largest of the one-sided tests, one per ${a.claim.kind === 'every' ? a.claim.units.toLowerCase() : 'unit'}${a.test.alternative === 'two-sided' ? ', each at the two-sided level' : ''}`
          : a.test?.alternative === 'two-sided'
            ? 'two-sided'
            : 'one-sided';
  rows.push({ label: `p-value (${sidedness})`, value: fmt.pValue(decision.p ?? NaN) });
  if (ctx.adjusted) rows.push({ label: `p-value adjusted for ${ctx.claimsTested} claims`, value: fmt.pValue(decision.pAdjusted ?? NaN) });
  const level = fmt.level(a.claim.confidence);
  const written = a.claim.confidenceWritten;
  // Say what was understood when the claims file wrote the level another way (0.95, 95), so nobody is surprised.
  const understood = written === 'default' ? ' (the default)' : written.replace(/\s+/g, '') === level ? '' : ` (written as ${written})`;
  rows.push({ label: 'Confidence level', value: `${level}${understood}` });
  // Whether the correction was used, with the numbers eligible it works from (the method line says so too).
  const fpc = fpcRow(a);
  if (fpc !== undefined) rows.push(fpc);
  return rows;
}

/**
 * Whether a claim's figures carry the finite-population correction, for its numbers table: one decision, so the
 * words say "every figure" or "no figure".
 */
export function fpcWords(fpc: NonNullable<Analysis['fpc']>): string {
  if (fpc.used) return 'used in every figure';
  if (fpc.why === 'off') return 'not used (turned off)';
  if (fpc.why === 'no-form') return `not used in any figure (${fpc.form ?? 'the test'} has no corrected form)`;
  return 'not used (no number eligible)';
}

/** The rates a claim's figures come from, in the order its numbers table shows them. */
function ratesOf(a: Analysis): RateSummary[] {
  const r = a as Partial<Record<'focus' | 'against' | 'later' | 'earlier' | 'rate', RateSummary>> & { rates?: RateSummary[] };
  if (a.kind === 'change') return [r.later, r.earlier].filter((x): x is RateSummary => x !== undefined);
  if (a.kind === 'gap-change') return a.earlier && a.later ? [a.earlier.focus, a.earlier.against, a.later.focus, a.later.against] : [];
  // A rank claim's unit and its closest rival (every unit's figures carry the same decision).
  if (a.kind === 'rank') return a.focus && a.closest ? [a.focus, a.closest.rival] : [];
  // Each unit of an every claim, nearest the value first.
  if (a.kind === 'every') return (a.tests ?? []).map((u) => u.rate);
  return [r.focus, r.against, r.rate, ...(r.rates ?? [])].filter((x): x is RateSummary => x !== undefined);
}

/**
 * The numbers table's row on the finite-population correction, whenever the claim's source gives the number
 * eligible (or the claim asked for it): used in every figure or in none, and why, with the numbers eligible it works
 * from ("used in every figure; 3,358 eligible in 2026, 3,319 in 2025"). Undefined when there is nothing to say.
 */
export function fpcRow(a: Analysis): NumberRow | undefined {
  if (a.fpc === undefined) return undefined;
  const rates = ratesOf(a)
    .filter((r) => r.population !== undefined)
    // A change's two rates are named by their periods.
    .map((r, i) => (a.kind === 'change' ? { ...r, label: i === 0 ? a.periods.to : a.periods.from } : r));
  // Labels name the numbers when they are short (periods, campuses); long ones are given in the table's order.
  const short = rates.every((r) => r.label.length <= 32);
  const eligible =
    rates.length === 0
      ? ''
      : rates.length === 1
        ? `${fmt.count(rates[0]!.population!)} eligible`
        : short
          ? `${fmt.count(rates[0]!.population!)} eligible in ${rates[0]!.label}, ${rates.slice(1).map((r) => `${fmt.count(r.population!)} in ${r.label}`).join(', ')}`
          : `${rates.map((r) => fmt.count(r.population!)).join(' and ')} eligible, in the order above`;
  return { label: 'Finite-population correction', value: `${fpcWords(a.fpc)}${eligible !== '' ? `; ${eligible}` : ''}` };
}

export function tooLittle(a: Analysis, ctx: ComposeContext, compared: string, hypotheses: ClaimSection['hypotheses']): Composed {
  // The claim's own thresholds (a claim may set min_respondents or min_response_rate of its own), and which one
  // withheld it: too few respondents, or too few of those eligible (non-response, not sample size).
  const lowResponse = isLowResponse(a.shortfall);
  const view = {
    shortfall: a.shortfall ?? 'too few people answered',
    minRespondents: a.claim.minRespondents ?? ctx.minRespondents,
    lowResponse,
    minResponseRate: a.claim.minResponseRate !== undefined ? fmt.percent(a.claim.minResponseRate) : '',
  };
  return {
    section: {
      compared,
      hypotheses,
      numbers: [{ label: 'Result', value: lowResponse ? 'Withheld: too few of those eligible answered' : 'Withheld: too few respondents' }],
      verdictText: ctx.templates.render('too-little-data', view),
      cautions: [],
      methodLine: 'No test was run.',
    },
    key: ctx.templates.render('too-little-data.key', view),
  };
}

/** Plural of a unit column name for sentences: "Department" -> "departments". */
export function plural(units: string): string {
  const lower = units.toLowerCase();
  if (/(s|x|ch|sh)$/.test(lower)) return `${lower}es`;
  if (/[^aeiou]y$/.test(lower)) return `${lower.slice(0, -1)}ies`;
  return `${lower}s`;
}

/**
 * One precision for the rates a claim compares (and any other rates printed beside them, e.g. a fitted line or a
 * fixed value): each rate with its interval's ends, so that one sentence or table never writes "60% against 72.2%".
 */
export function sharedDigits(rates: readonly RateSummary[], others: readonly number[] = []): number {
  return fmt.comparedPercentDigits(...rates.map((r) => [r.rate, r.interval.lower, r.interval.upper]), ...others.map((v) => [v]));
}

/** A rate's row in the numbers table: "61% agreed of 840 (interval 58% to 64%)", at `digits` when it is compared. */
export function rateRow(r: RateSummary, label: string = r.label, digits?: number): NumberRow {
  const v = rateView(r, digits);
  return { label, value: `${v.rate} agreed of ${v.n} (interval ${v.lower} to ${v.upper})` };
}

/**
 * A difference in points with its interval, for templates: signed ("−6.2", interval "−9.1" to "−3.3") and as a size
 * ("6.2", interval "3.3" to "9.1": the bounds swapped for a negative difference so that they read low to high).
 */
export function differenceView(d: { value: number; interval: { lower: number; upper: number } }, observedSign: number) {
  const digits = fmt.pointsDigits(d.value, d.interval.lower, d.interval.upper);
  const sizes = intervalSizes(d.interval, observedSign, (v, sign) => (sign ? fmt.points(v, { sign: true, digits }) : fmt.pointsSize(v, digits)));
  return {
    signed: fmt.points(d.value, { sign: true, digits }),
    signedLower: fmt.points(d.interval.lower, { sign: true, digits }),
    signedUpper: fmt.points(d.interval.upper, { sign: true, digits }),
    size: fmt.pointsSize(d.value, digits),
    sizeLower: sizes.lower,
    sizeUpper: sizes.upper,
  };
}

/**
 * An interval's ends as sizes in the observed direction ("6.5 points higher (interval 0.4 to 13.3 points)"): each end
 * measured the way the estimate lies. Where the interval holds no difference, its end on the other side of zero is
 * not a size the same way, so both ends are then written with their signs in that frame ("−0.4 to +13.3"), never
 * as a bare "0.4" that reads as the wrong side of zero.
 */
export function intervalSizes(interval: { lower: number; upper: number }, observedSign: number, write: (v: number, sign: boolean) => string): { lower: string; upper: string } {
  const flip = observedSign < 0 ? -1 : 1;
  const [near, far] = observedSign < 0 ? [interval.upper, interval.lower] : [interval.lower, interval.upper];
  const straddles = interval.lower < 0 && interval.upper > 0;
  return straddles ? { lower: write(flip * near, true), upper: write(flip * far, true) } : { lower: write(near, false), upper: write(far, false) };
}

/** The test used for two rates, in words. */
export function twoRateTestName(methods: string[]): string {
  return methods.includes('fisher-exact-2x2') ? "Fisher's exact test" : 'Pooled two-proportion z test';
}

/** A group this small gets its own caution: one person moves its rate by 2 points or more (common practice). */
const SMALL_GROUP = 50;
/** Below this share of those eligible answering, non-response may bias the result (a common threshold). */
const LOW_RESPONSE = 0.5;

/**
 * The cautions every rate-based kind gives, in this order: each group under 50 respondents, a response rate below
 * one half where the number eligible is known, and counts rebuilt from rounded percentages.
 */
export function rateCautions(rates: RateSummary[], responseRate: number | undefined, t: Templates): string[] {
  const cautions = rates
    .filter((r) => r.n < SMALL_GROUP)
    .map((r) => t.render('caution.small-sample', { n: fmt.count(r.n), label: r.label, onePerson: fmt.pointsSize(1 / r.n) }));
  if (responseRate !== undefined && responseRate < LOW_RESPONSE) cautions.push(t.render('caution.response-rate', { rate: fmt.percent(responseRate) }));
  if (rates.some((r) => r.approximate)) cautions.push(t.render('caution.rounded', {}));
  for (const r of rates) {
    if (r.suppressed === undefined) continue;
    const { rows, of } = r.suppressed;
    cautions.push(t.render('caution.suppressed-rows', { rows: fmt.count(rows), of: fmt.count(of), rest: fmt.count(of - rows), label: r.label, one: rows === 1 }));
  }
  return cautions;
}

/**
 * For a two-rate claim decided by Fisher's exact test: a sentence where the printed interval for the difference
 * (Newcombe's, from the two Wilson intervals) and the test disagree at a level the page gives, the interval leaving
 * out no difference while the test finds none at that level, or the other way round. The exact test is the more
 * cautious near small counts, so the two can part (common practice); the page would otherwise show an interval
 * that excludes zero beside a verdict that no difference was found, with nothing to say why. Checked at the claim's
 * own level (its p-value) and, where the adjustment for many claims held it to a stricter level, at that level (its
 * adjusted p-value against the interval there); two-sided tests only, where interval and test answer the same
 * question. None when they agree.
 */
export function fisherIntervalCaution(
  a: { methods: string[]; test?: { alternative: string }; difference?: { value: number; interval: { lower: number; upper: number; level: number } } },
  decision: Decision,
  t: Templates,
): string[] {
  if (!a.methods.includes('fisher-exact-2x2') || a.test?.alternative !== 'two-sided' || !a.difference || decision.p === undefined) return [];
  const checks: Array<{ interval: { lower: number; upper: number; level: number }; p: number; alpha: number }> = [
    { interval: a.difference.interval, p: decision.p, alpha: decision.alpha },
  ];
  const adjusted = decision.adjustedInterval?.interval;
  if (adjusted && decision.pAdjusted !== undefined) checks.push({ interval: adjusted, p: decision.pAdjusted, alpha: decision.alpha });
  for (const c of checks) {
    const excludes = c.interval.lower > 0 || c.interval.upper < 0;
    const finds = c.p < c.alpha;
    if (excludes === finds) continue;
    const digits = fmt.pointsDigits(a.difference.value, c.interval.lower, c.interval.upper);
    return [
      t.render('caution.fisher-interval', {
        level: fmt.level(c.interval.level),
        lower: fmt.points(c.interval.lower, { sign: true, digits }),
        upper: fmt.points(c.interval.upper, { sign: true, digits }),
        pPhrase: fmt.pPhrase(c.p),
        adjusted: c.interval !== a.difference.interval,
        excludes,
      }),
    ];
  }
  return [];
}

/** A list for people: "A", "A and B", "A, B and C". */
export function listWords(items: readonly string[]): string {
  return items.length <= 1 ? (items[0] ?? '') : `${items.slice(0, -1).join(', ')} and ${items[items.length - 1] as string}`;
}
