/**
 * Words for the interval at the adjusted level (src/verdicts/adjusted-interval.ts): the headline row of the numbers
 * table names both intervals in one phrase; where the adjustment changes the verdict (where the unadjusted interval
 * alone would suggest a different one), the verdict paragraph says which is which and the summary's key figure adds
 * the adjusted interval.
 */
import type { Analysis } from '../../analyse/types.js';
import * as fmt from '../../format/numbers.js';
import type { NumberRow } from '../../render/model.js';
import { headline, testedOneSided, type HeadlineUnit } from '../adjusted-interval.js';
import { decide, type Decision } from '../decide.js';
import type { ComposeContext, Composed } from './common.js';
import { scalePoints } from './means.js';

function bound(v: number, unit: HeadlineUnit, digits: number): string {
  if (unit === 'points') return fmt.points(v, { sign: true, digits });
  if (unit === 'scale points') return scalePoints(v, { sign: true, digits });
  return fmt.coefficient(v, digits);
}

/** Decimals a kind starts from (src/format/numbers.ts): more are used where an interval's ends would collapse. */
const BASE_DIGITS: Record<HeadlineUnit, number> = { points: 1, 'scale points': 2, coefficient: 2 };

/**
 * An interval's two ends as the numbers table prints them: points and scale points signed ("+4.8"), a coefficient
 * plain ("0.76"), at the fewest decimals (at least `minDigits`, at most two beyond the kind's usual) at which the two
 * ends print differently.
 */
export function intervalEnds(lower: number, upper: number, unit: HeadlineUnit, minDigits = 0): { lower: string; upper: string } {
  const base = BASE_DIGITS[unit];
  const digits = Math.max(minDigits, fmt.distinctDigits([lower, upper], (v, d) => bound(v, unit, d), base, base + 2));
  return { lower: bound(lower, unit, digits), upper: bound(upper, unit, digits) };
}

/** A confidence level with enough decimals never to read as 100% ("99.98%"). */
export function preciseLevel(confidence: number): string {
  for (let digits = 1; digits < 8; digits++) {
    const text = (confidence * 100).toFixed(digits).replace(/\.?0+$/, '');
    if (Number(text) < 100) return `${text}%`;
  }
  return fmt.level(confidence);
}

/** The composed claim with the adjusted-level interval added beside the unadjusted one (unchanged when none applies). */
export function withAdjustedInterval(built: Composed, a: Analysis, decision: Decision, ctx: ComposeContext): Composed {
  const adjusted = decision.adjustedInterval;
  const own = headline(a);
  const oneSided = testedOneSided(a);
  if ((!ctx.adjusted && !oneSided) || !adjusted || !own) return built;
  const t = ctx.templates;
  // The headline row: the first whose value shows the unadjusted interval's two bounds, at the decimals its kind
  // chose for them (one more at a time from the kind's usual, see fmt.distinctDigits).
  const base = BASE_DIGITS[own.unit];
  let digits = base;
  let at = -1;
  for (let d = base; d <= base + 2 && at < 0; d++) {
    const pair = `${bound(own.interval.lower, own.unit, d)} to ${bound(own.interval.upper, own.unit, d)}`;
    at = built.section.numbers.findIndex((r) => r.value.includes(pair));
    if (at >= 0) digits = d;
  }
  const lower = bound(own.interval.lower, own.unit, digits);
  const upper = bound(own.interval.upper, own.unit, digits);
  const adjustedEnds = intervalEnds(adjusted.interval.lower, adjusted.interval.upper, adjusted.unit, digits);
  const view = {
    level: fmt.level(own.interval.level),
    lower,
    upper,
    adjustedLevel: preciseLevel(adjusted.interval.level),
    adjustedLower: adjustedEnds.lower,
    adjustedUpper: adjustedEnds.upper,
    claimsTested: ctx.claimsTested,
    unitWord: own.unit === 'coefficient' ? '' : ` ${own.unit}`,
    // Which reasons the two intervals differ: the adjustment lowered the threshold, the test is one-sided, or both.
    adjusted: ctx.adjusted && decision.effectiveAlpha !== undefined && decision.effectiveAlpha < decision.alpha,
    oneSided,
  };
  const pair = `${lower} to ${upper}`;
  const numbers: NumberRow[] = built.section.numbers.slice();
  if (at >= 0) {
    const row = numbers[at] as NumberRow;
    const bracketed = new RegExp(`\\((?:[0-9.]+% )?interval ${escape(pair)}\\)`);
    numbers[at] = {
      ...row,
      value: bracketed.test(row.value)
        ? row.value.replace(bracketed, `(${t.render('interval.adjusted-row', view)})`)
        : `${row.value} (${t.render('interval.adjusted-row-short', view)})`,
    };
  } else {
    numbers.push({ label: t.render('interval.adjusted-label', view), value: `${view.adjustedLower} to ${view.adjustedUpper}${view.unitWord} (${view.adjustedLevel})` });
  }
  // Where the unadjusted verdict differs from the adjusted one (where the interval at the claim's own level alone
  // would suggest another verdict), the verdict paragraph and the summary also give the interval that decided it.
  const unadjusted = a.test ? decide(a, a.test.p).verdict : decision.verdict;
  // A one-sided claim: where the claim's own two-sided interval and the one that matches its test disagree on
  // whether there is no difference (supported at p = 0.03, with a 95% interval that holds zero), say which is which.
  const excludesZero = (i: { lower: number; upper: number }): boolean => i.lower > 0 || i.upper < 0;
  const differs = unadjusted !== decision.verdict || (oneSided && excludesZero(own.interval) !== excludesZero(adjusted.interval));
  const verdictText = differs ? `${built.section.verdictText} ${t.render('interval.adjusted-sentence', view)}` : built.section.verdictText;
  const key = differs ? `${built.key}${t.render('interval.adjusted-key', view)}` : built.key;
  return { section: { ...built.section, numbers, verdictText }, key };
}

function escape(s: string): string {
  return s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
}
