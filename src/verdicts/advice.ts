/**
 * What a reader should do with each claim, and which kind of "not supported" a result is.
 *
 * "Not supported" is split where the claim has an interval to judge by (a difference of rates or of mean scores, a
 * gap from a fixed value, a correlation):
 * - too-small: the difference is real and in the claimed direction but below the claim's smallest difference that
 *   matters (decide.ts sets `belowThreshold`);
 * - ruled-out: the interval at the claim's confidence level excludes a difference worth reporting in the claimed
 *   direction (both directions for a claim of "a difference"), so the data speak against a difference of that size;
 * - inconclusive: otherwise: the interval holds both no difference (or too little to count) and a difference
 *   worth reporting.
 *
 * "Worth reporting" is, in this order: the claim's own `worth_reporting`; the smallest difference that matters
 * (`smallest_difference`, the claim's or the file's); the margin of an equivalence claim in the pack that tests the
 * same two selections on the same data; the file's `worth_reporting` for the claim's measure; else a stated default
 * (common practice, fixed before any data are seen): 5 percentage points for rates, a standardized difference of 0.2
 * (Cohen's "small" d) for mean scores, a correlation of 0.3 (Cohen's "medium" r) across units. The smallest
 * detectable difference is not used: it shrinks with the same standard error as the interval, so comparing the two
 * would decide the split by the sample size alone. The method notes say so ("worth-reporting" in
 * src/stats/methods.ts). Crosstab claims have no interval for their effect, and trend claims (whose fitted change per
 * period has one) no size worth reporting per period, so their "not supported" is not split.
 *
 * The advice follows from the verdict: supported -> quote as written; estimate -> quote with its interval; points
 * the other way -> must not make; ruled out or too small -> reword to what the interval supports (a suggested
 * wording is given); inconclusive, too little data -> drop.
 */
import type { Analysis } from '../analyse/types.js';
import type { ClaimsFile } from '../claims/types.js';
import { filterLabel } from '../analyse/labels.js';
import { isLowResponse } from '../analyse/thresholds.js';
import * as fmt from '../format/numbers.js';
import type { ClaimAdvice, LinkedClaim, NotSupportedAs } from '../render/model.js';
import type { Decision } from './decide.js';
import type { Templates } from './templates.js';
import { intervalEnds } from './words/adjusted.js';
import { unitWords } from './words/association.js';
import { listWords } from './words/common.js';

/** A difference worth reporting, in the units of the claim's interval, and where it comes from. */
export interface Worth {
  value: number;
  /**
   * claim: the claim's own worth_reporting; threshold: its smallest difference that matters; linked-margin: an
   * equivalence margin on the same data; file: the claims file's worth_reporting; default: the pack's default.
   */
  basis: 'claim' | 'threshold' | 'linked-margin' | 'file' | 'default';
  /** For 'linked-margin': the equivalence claim whose margin is used. */
  linkedId?: string;
  /** For mean scores set in standard deviations (claim, file, default): that size; `value` is it in scale points. */
  standardized?: number;
}

/** The effect and its interval in the claim's own units, for the kinds whose "not supported" can be split. */
export interface EffectInterval {
  value: number;
  lower: number;
  upper: number;
  unit: 'points' | 'scale points' | 'r';
}

/**
 * The interval the split and the rewording are judged by: the one at the level that decided the verdict (after the
 * adjustment for many claims, decision.adjustedInterval) where there is one, else the claim's own. Ruling a
 * difference out is itself a finding, so it is held to the same threshold as the verdict.
 */
export function judgedInterval(a: Analysis, decision: Decision): (EffectInterval & { level: number }) | undefined {
  const e = effectInterval(a);
  if (!e) return undefined;
  const adj = decision.adjustedInterval;
  if (adj && a.kind !== 'equivalence') return { ...e, lower: adj.interval.lower, upper: adj.interval.upper, level: adj.interval.level };
  return { ...e, level: a.claim.confidence };
}

export function effectInterval(a: Analysis): EffectInterval | undefined {
  if (a.status !== 'tested') return undefined;
  switch (a.kind) {
    case 'compare':
    case 'change':
    case 'gap-change':
    case 'target':
    case 'equivalence':
      return a.difference ? { value: a.difference.value, lower: a.difference.interval.lower, upper: a.difference.interval.upper, unit: 'points' } : undefined;
    case 'means':
      return a.difference ? { value: a.difference.value, lower: a.difference.interval.lower, upper: a.difference.interval.upper, unit: 'scale points' } : undefined;
    case 'association':
      return a.test?.interval ? { value: a.test.estimate.value, lower: a.test.interval.lower, upper: a.test.interval.upper, unit: 'r' } : undefined;
    default:
      return undefined;
  }
}

/** Two selections tested on the same data: same source, same scope, same pair (in either order). */
function dataKey(a: Analysis): string | undefined {
  const c = a.claim as unknown as { source: string; where?: Record<string, unknown>; focus?: Record<string, unknown>; against?: Record<string, unknown> };
  if (!c.focus || !c.against || !['compare', 'equivalence', 'means'].includes(a.kind)) return undefined;
  // Keys in code-unit order: any fixed order makes equal selections equal text (no collation data needed).
  const canon = (v: unknown): string =>
    JSON.stringify(v, (_k, x: unknown) => (x && typeof x === 'object' && !Array.isArray(x) ? Object.fromEntries(Object.entries(x as Record<string, unknown>).sort(([p], [q]) => (p < q ? -1 : p > q ? 1 : 0))) : x));
  const pair = [canon(c.focus), canon(c.against)].sort();
  // Means claims measure scores, not agreement: they link only with other means claims.
  return JSON.stringify([a.kind === 'means' ? 'means' : 'rates', c.source, canon(c.where ?? {}), pair]);
}

/**
 * How many of the other claims on the same data a claim's page names ("Read with"), and results.json lists; the
 * rest are counted. Every pair named would grow as the square of the claims: 300 copies of one compare claim made a
 * pack of 3,932 pages, 1,000 copies took 285 s and 3.8 GB, and 3,000 (a 570 KB claims file) stopped the build.
 */
export const LINKED_SHOWN = 3;

/** The other claims tested on the same data as one claim: the first LINKED_SHOWN of them (ascending), and how many in all. */
export interface Links {
  shown: number[];
  count: number;
  /** The first equivalence claim among them, whose margin can size a difference worth reporting. */
  equivalence?: number;
}

/** For each claim, the other claims tested on the same data (see Links). */
export function linksOf(analyses: Analysis[]): Links[] {
  const keys = analyses.map(dataKey);
  const byKey = new Map<string, number[]>();
  keys.forEach((k, i) => {
    if (k === undefined) return;
    const same = byKey.get(k);
    if (same === undefined) byKey.set(k, [i]);
    else same.push(i);
  });
  // The first two equivalence claims of each key: a claim's own is never its link.
  const equivalences = new Map<string, number[]>();
  keys.forEach((k, i) => {
    if (k === undefined || analyses[i]!.kind !== 'equivalence') return;
    const found = equivalences.get(k) ?? [];
    if (found.length < 2) equivalences.set(k, [...found, i]);
  });
  return keys.map((k, i) => {
    if (k === undefined) return { shown: [], count: 0 };
    const group = byKey.get(k) as number[];
    const shown: number[] = [];
    for (const j of group) {
      if (shown.length === LINKED_SHOWN) break;
      if (j !== i) shown.push(j);
    }
    const [e1, e2] = equivalences.get(k) ?? [];
    const equivalence = e1 !== i ? e1 : e2;
    return { shown, count: group.length - 1, ...(equivalence !== undefined ? { equivalence } : {}) };
  });
}

/** Defaults for a difference worth reporting when the claim sets none (common practice; see the file comment). */
export const WORTH_DEFAULTS = { points: 0.05, standardized: 0.2, correlation: 0.3 } as const;

/** The difference worth reporting for a claim (see the file comment), or undefined when none can be named. */
export function worthReporting(a: Analysis, decision: Decision, linked: Analysis[]): Worth | undefined {
  if (decision.belowThreshold) return { value: decision.belowThreshold.smallest, basis: 'threshold' };
  const set = a.claim.worthReporting;
  // A size in standard deviations, in scale points: times the pooled standard deviation of the two groups.
  const standardized = (sd: number, basis: Worth['basis']): Worth | undefined => {
    if (a.kind !== 'means' || a.status !== 'tested' || !a.focus || !a.against) return undefined;
    const { focus: f, against: g } = a;
    const pooled = Math.sqrt(((f.n - 1) * f.sd * f.sd + (g.n - 1) * g.sd * g.sd) / (f.n + g.n - 2));
    return pooled > 0 ? { value: sd * pooled, basis, standardized: sd } : undefined;
  };
  const own = (value: number, basis: Worth['basis']): Worth | undefined => (a.kind === 'means' ? standardized(value, basis) : { value, basis });
  if (set?.from === 'claim') return own(set.value, 'claim');
  if (a.threshold) return { value: a.threshold.smallest, basis: 'threshold' };
  if (a.claim.smallestDifference !== undefined && a.kind !== 'means' && a.kind !== 'association') return { value: a.claim.smallestDifference, basis: 'threshold' };
  if (a.kind === 'compare') {
    const eq = linked.find((l) => l.kind === 'equivalence');
    if (eq && eq.kind === 'equivalence') return { value: eq.claim.margin, basis: 'linked-margin', linkedId: eq.claim.id };
  }
  if (a.kind === 'equivalence') return { value: a.claim.margin, basis: 'threshold' };
  if (a.status !== 'tested') return undefined;
  if (set?.from === 'file') return own(set.value, 'file');
  if (a.kind === 'compare' || a.kind === 'change' || a.kind === 'gap-change' || a.kind === 'target') return { value: WORTH_DEFAULTS.points, basis: 'default' };
  if (a.kind === 'association') return { value: WORTH_DEFAULTS.correlation, basis: 'default' };
  if (a.kind === 'means') return standardized(WORTH_DEFAULTS.standardized, 'default');
  return undefined;
}

/**
 * The pack-wide sizes worth reporting for the measures its claims use, in words, for the verdict definitions and the
 * method notes: "5 points for rates, 0.2 standard deviations for mean scores and a correlation of 0.3 across units",
 * each size the claims file set marked "(set in the claims file)". Empty when no claim's kind is split.
 */
export function packWorthSizes(claims: ClaimsFile): string {
  const kinds = new Set(claims.claims.map((c) => c.kind));
  const set = claims.worthReporting ?? {};
  const parts: string[] = [];
  const mark = (v: number | undefined): string => (v !== undefined ? ' (set in the claims file)' : '');
  // As written: "5 points", "2.5 points", "0.2 standard deviations" (no trailing zeros).
  const plain = (v: number): string => String(Number(v.toPrecision(12)));
  if (['compare', 'change', 'gap-change', 'target'].some((k) => kinds.has(k as never))) {
    parts.push(`${plain((set.rates ?? WORTH_DEFAULTS.points) * 100)} points for rates${mark(set.rates)}`);
  }
  if (kinds.has('means')) parts.push(`${plain(set.meanScores ?? WORTH_DEFAULTS.standardized)} standard deviations for mean scores${mark(set.meanScores)}`);
  if (kinds.has('association')) parts.push(`a correlation of ${plain(set.correlations ?? WORTH_DEFAULTS.correlation)} across units${mark(set.correlations)}`);
  // Every size named set in the claims file: one mark at the end instead of one each.
  const allSet = parts.length > 0 && parts.every((p) => p.endsWith(mark(0)));
  const shown = allSet ? parts.map((p) => p.slice(0, -mark(0).length)) : parts;
  const list = shown.length > 1 ? `${shown.slice(0, -1).join(', ')} and ${shown[shown.length - 1]}` : (shown[0] ?? '');
  return allSet ? `${list}${mark(0)}` : list;
}

/**
 * The direction of the claim in the terms of its effect interval: the claim's expectSign, except for a gap that
 * narrowed or widened, whose interval is the change in the gap (later minus earlier): narrowing moves it back towards
 * zero from the earlier gap's side, widening away from zero on that side (no direction when the earlier gap was 0).
 */
export function intervalDirection(a: Analysis): 1 | -1 | 0 {
  if (a.kind === 'gap-change' && (a.claim.expect === 'narrowed' || a.claim.expect === 'widened')) {
    const side = a.earlier === undefined ? 0 : Math.sign(a.earlier.gap);
    return (a.claim.expect === 'narrowed' ? -side : side) as 1 | -1 | 0;
  }
  return a.expectSign;
}

/** Which kind of "not supported" this is, or undefined for other verdicts and kinds that cannot be split. */
export function notSupportedAs(a: Analysis, decision: Decision, worth: Worth | undefined): NotSupportedAs | undefined {
  if (decision.verdict !== 'not-supported') return undefined;
  if (decision.belowThreshold) return 'too-small';
  const e = judgedInterval(a, decision);
  if (!e) return undefined;
  // Equivalence not shown: the interval crosses the margin, so it holds both a gap inside and one beyond it.
  if (a.kind === 'equivalence') return 'inconclusive';
  if (worth === undefined) return undefined;
  const direction = intervalDirection(a);
  const directions = direction === 0 ? [1, -1] : [direction];
  const ruledOut = directions.every((d) => (d > 0 ? e.upper < worth.value : e.lower > -worth.value));
  return ruledOut ? 'ruled-out' : 'inconclusive';
}

/** An amount in the interval's units: "5.7 points", "0.20 scale points", "0.73". */
export function amount(value: number, unit: EffectInterval['unit']): string {
  if (unit === 'points') return `${fmt.pointsSize(value)} points`;
  if (unit === 'scale points') return `${fmt.coefficient(Math.abs(value), 2)} scale points`;
  return fmt.coefficient(Math.abs(value), 2);
}

/** An effect interval's two ends as its numbers table prints them (src/verdicts/words/adjusted.ts). */
function effectEnds(e: EffectInterval): { lower: string; upper: string } {
  return intervalEnds(e.lower, e.upper, e.unit === 'r' ? 'coefficient' : e.unit);
}

export interface AdviceInput {
  analysis: Analysis;
  decision: Decision;
  detail: NotSupportedAs | undefined;
  worth: Worth | undefined;
  /** The kind's key figure (as on the summary), quoted in the advice where a figure is needed. */
  key: string;
  templates: Templates;
  /** True when the p-values were adjusted for many claims (ComposeContext.adjusted). */
  adjusted: boolean;
}

/** The words of the worth-reporting threshold and where it came from, for templates. */
export function worthView(worth: Worth | undefined, unit: EffectInterval['unit'] | undefined) {
  if (!worth || !unit) return { worth: '', worthBasis: '' };
  // As written in the claims file or the defaults: "0.2 standard deviations", not "0.20".
  const sd = worth.standardized !== undefined ? `${String(Number(worth.standardized.toPrecision(12)))} standard deviations` : '';
  const basis =
    worth.basis === 'claim'
      ? `the size worth reporting set by the claim${sd ? `: ${sd}` : ''}`
      : worth.basis === 'threshold'
        ? 'the smallest difference that matters set by the claim'
        : worth.basis === 'linked-margin'
          ? `the margin of claim ${worth.linkedId ?? ''}, which tests the same data`
          : worth.basis === 'file'
            ? `the claims file's size worth reporting for ${unit === 'r' ? 'correlations' : unit === 'scale points' ? 'mean scores' : 'rates'}${sd ? `: ${sd}` : ''}`
            : unit === 'r'
              ? "the pack's default for a correlation worth reporting"
              : unit === 'scale points'
                ? `the pack's default for a difference in mean scores worth reporting: ${sd || '0.2 standard deviations'}`
                : "the pack's default for a difference worth reporting";
  return { worth: unit === 'r' ? `a correlation of ${amount(worth.value, unit)}` : amount(worth.value, unit), worthBasis: basis };
}

function labelsOf(a: Analysis): { focus: string; against: string; subject: string } {
  const c = a.claim as unknown as { focus?: Record<string, unknown>; against?: Record<string, unknown>; focusLabel?: string; againstLabel?: string; selectLabel?: string; select?: Record<string, unknown>; where?: Record<string, unknown> };
  const x = a as unknown as { focus?: { label: string }; against?: { label: string }; rate?: { label: string } };
  if (a.kind === 'gap-change') return { focus: c.focusLabel ?? filterLabel(a.claim.focus, a.claim.naming), against: a.claim.againstRest === true ? 'everyone else' : c.againstLabel ?? filterLabel(a.claim.against, a.claim.naming), subject: '' };
  const focus = x.focus?.label ?? c.focusLabel ?? (c.focus ? filterLabel(c.focus as never) : '');
  const against = x.against?.label ?? c.againstLabel ?? (c.against ? filterLabel(c.against as never) : '');
  const subject = x.rate?.label ?? c.selectLabel ?? (c.where ? filterLabel(c.where as never) : '');
  return { focus, against, subject };
}

/** The suggested rewording of a claim whose size is ruled out: what the interval supports. */
function rewording(a: Analysis, e: EffectInterval & { level: number }, t: Templates): string {
  const direction = intervalDirection(a);
  // The bound the interval puts on an effect in the claimed direction(s), never below zero.
  const bound = direction > 0 ? Math.max(e.upper, 0) : direction < 0 ? Math.max(-e.lower, 0) : Math.max(Math.abs(e.lower), Math.abs(e.upper));
  const l = labelsOf(a);
  const c = a.claim as unknown as { confidence: number; valueLabel?: string; value?: number; xLabel?: string; yLabel?: string; controls?: Array<{ label: string }> };
  const x = a as unknown as { periods?: { from: string; to: string }; points?: unknown[]; claim: { units?: string | string[] } };
  const view = {
    focus: l.focus,
    against: l.against,
    subject: l.subject,
    bound: e.unit === 'r' ? fmt.coefficient(bound, 2) : amount(bound, e.unit),
    unitWord: e.unit,
    ...effectEnds(e),
    level: fmt.level(e.level),
    twoSided: direction === 0,
    higher: direction > 0,
    lower_: direction < 0,
    from: x.periods?.from ?? '',
    to: x.periods?.to ?? '',
    target: c.valueLabel ?? (c.value !== undefined ? fmt.percent(c.value) : ''),
    xLabel: c.xLabel ?? '',
    yLabel: c.yLabel ?? '',
    units: String(x.points?.length ?? ''),
    unitsName: x.claim.units ? unitWords(x.claim.units).unitsName : 'units',
    // An association with controls: the bound is on the partial correlation, and the wording says so.
    controlled: listWords((c.controls ?? []).map((z) => z.label)),
  };
  return t.render(`advice.wording.${a.kind}`, view);
}

/** Does the interval reach `smallest` (a size, in its units) on the side the claim looks to? */
function reachesSmallest(a: Analysis, e: EffectInterval, smallest: number): boolean {
  const direction = intervalDirection(a) || a.observedSign;
  return direction > 0 ? e.upper >= smallest : direction < 0 ? -e.lower >= smallest : false;
}

export function adviseClaim(input: AdviceInput): ClaimAdvice {
  const { analysis: a, decision, detail, worth, key, templates: t } = input;
  const e = judgedInterval(a, decision);
  const view = {
    key,
    level: fmt.level(e?.level ?? a.claim.confidence),
    claimLevel: fmt.level(a.claim.confidence),
    ...(e ? effectEnds(e) : { lower: '', upper: '' }),
    unitWord: e?.unit === 'r' ? '' : ` ${e?.unit ?? ''}`,
    association: a.kind === 'association',
    // A correlation across units is settled by more units, not by more respondents in the same units.
    unitsName: a.kind === 'association' ? unitWords(a.claim.units).unitsName : '',
    twoSided: a.expectSign === 0,
    adjusted: input.adjusted,
    lowResponse: isLowResponse(a.shortfall),
    ...worthView(worth, e?.unit),
    // Too small: whether the interval still reaches the smallest difference that matters, in the claimed direction
    // (or the observed one, for a claim of a difference either way). The estimate lies below it, but only an interval
    // that stays below it shows the difference to be smaller.
    reaches: detail === 'too-small' && e !== undefined && decision.belowThreshold !== undefined && reachesSmallest(a, e, decision.belowThreshold.smallest),
  };
  const make = (action: ClaimAdvice['action'], reason: string, wording?: string): ClaimAdvice => ({
    action,
    label: t.render(`action.${action}`, {}),
    reason: t.render(`advice.reason.${reason}`, view),
    ...(wording ? { wording } : {}),
  });
  switch (decision.verdict) {
    case 'supported':
      return make('quote', a.kind === 'association' ? 'supported-association' : 'supported');
    case 'estimate':
      return make('quote-with-interval', 'estimate', key);
    case 'opposite':
      return make('must-not-make', 'opposite');
    case 'too-little-data':
      return make('drop', 'too-little-data');
    case 'not-supported':
      if (detail === 'too-small') return make('reword', 'too-small', t.render('advice.wording.too-small', view));
      if (detail === 'ruled-out' && e) return make('reword', 'ruled-out', rewording(a, e, t));
      if (detail === 'inconclusive') return make('drop', a.kind === 'equivalence' ? 'inconclusive-equivalence' : 'inconclusive');
      return make('drop', 'not-supported');
  }
}

/** The note on a claim that more claims than those named test the same data. */
export function moreLinksNote(more: number, t: Templates): string {
  return t.render('linked-more', { count: more.toLocaleString('en-GB'), one: more === 1 });
}

/** The note on a claim that another claim tests the same data. */
export function linkNote(other: { id: string; verdictLabel: string; kind: string }, t: Templates): LinkedClaim {
  return { id: other.id, verdictLabel: other.verdictLabel, text: t.render('linked', { id: other.id, verdictLabel: other.verdictLabel, equivalence: other.kind === 'equivalence' }) };
}
