/**
 * Words for the interval at the adjusted level (src/verdicts/adjusted-interval.ts): the headline row of the numbers
 * table names both intervals in one phrase, the verdict paragraph says which is which, and the summary's key figure
 * adds the adjusted interval where the adjustment changes the verdict (where the unadjusted interval alone would
 * suggest a different one).
 */
import type { Analysis } from '../../analyse/types.js';
import * as fmt from '../../format/numbers.js';
import type { NumberRow } from '../../render/model.js';
import { headline, type HeadlineUnit } from '../adjusted-interval.js';
import { decide, type Decision } from '../decide.js';
import type { ComposeContext, Composed } from './common.js';
import { scalePoints } from './means.js';

function bound(v: number, unit: HeadlineUnit): string {
  if (unit === 'points') return fmt.points(v, { sign: true });
  if (unit === 'scale points') return scalePoints(v, { sign: true });
  return fmt.coefficient(v);
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
  if (!ctx.adjusted || !adjusted || !own) return built;
  const t = ctx.templates;
  const lower = bound(own.interval.lower, own.unit);
  const upper = bound(own.interval.upper, own.unit);
  const view = {
    level: fmt.level(own.interval.level),
    lower,
    upper,
    adjustedLevel: preciseLevel(adjusted.interval.level),
    adjustedLower: bound(adjusted.interval.lower, adjusted.unit),
    adjustedUpper: bound(adjusted.interval.upper, adjusted.unit),
    claimsTested: ctx.claimsTested,
    unitWord: own.unit === 'coefficient' ? '' : ` ${own.unit}`,
  };
  // The headline row: the first whose value shows the unadjusted interval's two bounds.
  const pair = `${lower} to ${upper}`;
  const numbers: NumberRow[] = built.section.numbers.slice();
  const at = numbers.findIndex((r) => r.value.includes(pair));
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
  const verdictText = `${built.section.verdictText} ${t.render('interval.adjusted-sentence', view)}`;
  // Where the unadjusted verdict differs from the adjusted one, the summary shows the interval that decided it.
  const unadjusted = a.test ? decide(a, a.test.p).verdict : decision.verdict;
  const key = unadjusted !== decision.verdict ? `${built.key}${t.render('interval.adjusted-key', view)}` : built.key;
  return { section: { ...built.section, numbers, verdictText }, key };
}

function escape(s: string): string {
  return s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
}
