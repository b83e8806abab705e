/**
 * What a word written where warrant expects one of its own names probably meant: the claim kinds people call by other
 * names (a "correlation" is an association, a "benchmark" a target, "highest" a rank), the claims no kind can say (a
 * place such as the top third, every unit within a margin) with what can be said instead, "each" an every claim, a gap that narrowed (a change claim with focus and
 * against), and the directions people write in their own words ("below", "fell"). Used by the schema messages (src/claims/validate.ts) so that a refusal leads
 * to the form meant.
 */

/** The word as a key: lower case, spaces and underscores as hyphens. */
function key(word: string): string {
  return word.trim().toLowerCase().replace(/[\s_]+/g, '-');
}

const KIND_SYNONYMS: Record<string, string[]> = {
  compare: ['comparison', 'compared', 'versus', 'vs', 'gap', 'difference', 'differ', 'two-proportions', 'z-test'],
  association: ['correlation', 'correlate', 'correlates', 'correlated', 'relationship', 'relation', 'related', 'regression', 'scatter', 'associated', 'pearson', 'spearman'],
  change: ['year-on-year', 'yoy', 'since', 'before-after', 'change-over-time', 'fall', 'rise', 'improvement', 'decline'],
  trend: ['trends', 'over-time', 'time-series', 'steady', 'trajectory', 'cochran-armitage'],
  target: ['benchmark', 'threshold', 'goal', 'standard', 'kpi', 'at-least', 'minimum', 'one-sample'],
  crosstab: ['chi-square', 'chisq', 'chi-squared', 'contingency', 'table', 'cross-tab', 'cross-tabulation', 'distribution', 'spread', 'breakdown'],
  means: ['mean', 'average', 'averages', 'score', 'scores', 'mean-score', 't-test', 'ttest', 'welch', 'mann-whitney'],
  equivalence: ['equal', 'equality', 'same', 'similar', 'no-difference', 'parity', 'tost', 'alike', 'equivalent'],
  every: ['each', 'all', 'for-each', 'per-unit', 'every-unit', 'all-units', 'all-groups', 'each-unit', 'across-the-board'],
  rank: ['ranking', 'rankings', 'ranked', 'highest', 'lowest', 'top', 'bottom', 'best', 'worst', 'league', 'league-table', 'first-place', 'leader', 'extreme', 'max', 'min'],
  estimate: ['proportion', 'percentage', 'percent', 'rate', 'share', 'figure', 'margin-of-error', 'interval', 'confidence-interval', 'descriptive'],
};

/**
 * A gap between two groups that narrowed or widened between periods: a change claim with focus and against (the
 * unknown-kind message leads there).
 */
export const GAP_CHANGE = {
  why: 'a gap between two groups that changed between periods (narrowed or widened) is a change claim with focus and against',
  instead: 'Write kind: change with from and to (the two periods), focus and against (the two groups, or against: rest) and expect: narrowed or widened (the gap\'s size, whichever group is ahead), or lower, higher or different (focus minus against)',
};

/** Kinds of claim warrant has no test for, with what can be claimed instead. */
const UNSAYABLE: Array<{ words: string[]; why: string; instead: string }> = [
  {
    words: ['top-third', 'top-quarter', 'position', 'percentile', 'quartile', 'tercile', 'second', 'second-highest', 'top-three', 'top-five'],
    why: 'warrant has no claim of a place in a ranking other than first or last ("in the top third"): such a place depends on every other unit\'s result and its sampling error, and no test here gives it an interval',
    instead: 'Claim the highest or lowest place with kind: rank (expect: highest or lowest); or claim what the place stands for: kind: compare with against: rest (above the rest of the group), or kind: target with value: the rate that marks the top third',
  },
  {
    words: ['interaction', 'diff-in-diff', 'difference-in-differences', 'did', 'gap-change', 'gap-narrowed', 'narrowed', 'narrowing', 'widened', 'widening', 'closing-gap', 'gap-closed'],
    ...GAP_CHANGE,
  },
  {
    words: ['none', 'no-unit', 'within-margin-each'],
    why: 'no kind tests that every unit lies within a margin of something ("no subject is more than 5 points from the institution")',
    instead: 'For every unit above or below a fixed value use kind: every (units, value, expect: higher or lower); for every unit within a margin write one equivalence claim per unit (margin: 5 points, against: rest); the adjustment for many claims then applies across them',
  },
];

/** What an unknown kind probably meant: a kind of warrant's, or a claim no kind can say and what to write instead. */
export function meantKind(word: string): { kind: string } | { why: string; instead: string } | undefined {
  const k = key(word);
  for (const [kind, words] of Object.entries(KIND_SYNONYMS)) if (words.includes(k)) return { kind };
  for (const u of UNSAYABLE) if (u.words.includes(k)) return { why: u.why, instead: u.instead };
  return undefined;
}

/** Each kind in a few words, for the list of kinds in a message. */
export const KIND_WORDS: Record<string, string> = {
  compare: 'two selections\' rates',
  association: 'two measures across units, a correlation',
  change: 'one selection between two periods',
  trend: 'a steady rise or fall over three or more periods',
  target: 'a selection against a fixed value or benchmark',
  crosstab: 'a table of counts, related or not',
  means: 'mean scores of two selections',
  equivalence: 'two rates within a margin, no real difference',
  estimate: 'a figure with its margin of error',
  rank: 'one unit the highest or lowest of several',
  every: 'every unit above or below a fixed value',
};

const LOWER = ['below', 'less', 'fewer', 'worse', 'down', 'decrease', 'decreased', 'decreasing', 'fell', 'fall', 'falls', 'fallen', 'declined', 'decline', 'dropped', 'drop', 'smaller', 'under', 'lower-than', 'less-than', 'negative'];
const HIGHER = ['above', 'more', 'greater', 'better', 'up', 'increase', 'increased', 'increasing', 'rose', 'rise', 'rises', 'risen', 'improved', 'improve', 'bigger', 'over', 'exceeds', 'higher-than', 'more-than', 'positive'];
const EITHER = ['differ', 'differs', 'difference', 'two-sided', 'either', 'both', 'unequal', 'not-equal', 'changed', 'change', 'moved', 'related', 'any-direction'];

/**
 * The allowed value of expect a word written in its place probably meant, for a claim of the given kind (allowed: the
 * values it accepts), or a sentence when the word asks for another kind ("same" is an equivalence claim).
 */
export function meantExpect(word: string, allowed: readonly string[]): { value: string } | { other: string } | undefined {
  const k = key(word);
  const pick = (...vs: string[]): { value: string } | undefined => {
    const v = vs.find((x) => allowed.includes(x));
    return v !== undefined ? { value: v } : undefined;
  };
  if (['top', 'best', 'first', 'most', 'max', 'maximum', 'greatest', 'largest', 'biggest', 'leading'].includes(k)) return pick('highest', 'higher', 'rising', 'positive');
  if (['bottom', 'worst', 'last', 'least', 'min', 'minimum', 'smallest', 'fewest'].includes(k)) return pick('lowest', 'lower', 'falling', 'negative');
  if (LOWER.includes(k)) return pick('lower', 'falling', 'negative', 'lowest');
  if (HIGHER.includes(k)) return pick('higher', 'rising', 'positive', 'highest');
  if (k === 'highest') return pick('higher', 'rising', 'positive');
  if (k === 'lowest') return pick('lower', 'falling', 'negative');
  if (EITHER.includes(k)) return pick('different', 'any', 'related');
  if (['same', 'equal', 'similar', 'none', 'no-difference', 'alike', 'equivalent'].includes(k)) {
    return { other: 'to claim that there is no real difference, use kind: equivalence with a margin (e.g. margin: 5 points), which has no expect' };
  }
  return undefined;
}
