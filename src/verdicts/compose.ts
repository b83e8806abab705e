/**
 * Words for one claim: the claim's analysis and decision in, a ClaimSection and a summary row out. Every sentence is
 * a template (templates/); the files in words/ (one per claim kind) build the values the templates need.
 */
import type { Analysis } from '../analyse/types.js';
import type { ClaimSection, SummaryRow } from '../render/model.js';
import type { Decision } from './decide.js';
import type { ComposeContext, Composed } from './words/common.js';
import { composeAssociation } from './words/association.js';
import { composeCompare } from './words/compare.js';
import { composeChange } from './words/change.js';
import { composeGapChange } from './words/gap-change.js';
import { composeEstimate } from './words/estimate.js';
import { composeTarget } from './words/target.js';
import { composeTrend } from './words/trend.js';
import { composeCrosstab } from './words/crosstab.js';
import { composeEquivalence } from './words/equivalence.js';
import { composeMeans, scalePoints } from './words/means.js';
import { composeRank } from './words/rank.js';
import { composeEvery } from './words/every.js';
import * as fmt from '../format/numbers.js';
import { adviseClaim, linkNote, linksOf, moreLinksNote, notSupportedAs, worthReporting, type Worth } from './advice.js';
import type { NotSupportedAs } from '../render/model.js';
import { withAdjustedInterval } from './words/adjusted.js';
import { headline } from './adjusted-interval.js';
import { wordsAgainstFields } from '../claims/wording.js';

export type { ComposeContext } from './words/common.js';

function composeKind(a: Analysis, decision: Decision, ctx: ComposeContext): Composed {
  switch (a.kind) {
    case 'compare':
      return composeCompare(a, decision, ctx);
    case 'association':
      return composeAssociation(a, decision, ctx);
    case 'crosstab':
      return composeCrosstab(a, decision, ctx);
    case 'means':
      return composeMeans(a, decision, ctx);
    case 'equivalence':
      return composeEquivalence(a, decision, ctx);
    case 'change':
      return composeChange(a, decision, ctx);
    case 'gap-change':
      return composeGapChange(a, decision, ctx);
    case 'trend':
      return composeTrend(a, decision, ctx);
    case 'target':
      return composeTarget(a, decision, ctx);
    case 'estimate':
      return composeEstimate(a, decision, ctx);
    case 'rank':
      return composeRank(a, decision, ctx);
    case 'every':
      return composeEvery(a, decision, ctx);
  }
}

/** What the pack-wide pass (src/verdicts/advice.ts) found for a claim: its kind of "not supported" and the worth-reporting size. */
export interface ClaimExtras {
  detail?: NotSupportedAs;
  worth?: Worth;
  /** One sentence naming the claim's source and response rate. */
  sourceLine?: string;
}

export function composeClaim(a: Analysis, decision: Decision, ctx: ComposeContext, extras: ClaimExtras = {}): { section: ClaimSection; summary: SummaryRow } {
  const kindBuilt = composeKind(a, decision, ctx);
  const small = decision.belowThreshold;
  if (small) {
    // Real and in the claimed direction, but smaller than the smallest difference that matters: its own sentence
    // (templates/<kind>.below-threshold), followed by the kind's usual numbers.
    const size = small.unit === 'points' ? fmt.pointsSize : (v: number) => scalePoints(Math.abs(v));
    const smallestWritten = fmt.percent(a.claim.smallestDifference ?? 0);
    kindBuilt.section.verdictText = ctx.templates.render(`${a.kind}.below-threshold`, { effect: size(small.effect), smallest: size(small.smallest), smallestWritten });
  }
  // Beside the interval at the claim's own level, the interval at the level that decided the adjusted verdict.
  const built = withAdjustedInterval(kindBuilt, a, decision, ctx);
  // Sentences start with a capital even when a template opens with a label written in lower case.
  const section = built.section;
  section.compared = sentence(section.compared);
  section.hypotheses = { null: sentence(section.hypotheses.null), alternative: sentence(section.hypotheses.alternative) };
  section.verdictText = sentence(section.verdictText);
  // A claim whose own words and fields say different things: said first, since the verdict answers the fields.
  const mismatched = wordsAgainstFields(a.claim, ctx.wordsData?.(a.claim)).map((m) => ctx.templates.render('caution.words-fields', { said: m.said }));
  section.cautions = [...mismatched, ...section.cautions].map(sentence);
  section.numbers = section.numbers.map((row) => ({ ...row, label: sentence(row.label) }));
  const detail = extras.detail;
  const verdictLabel = ctx.templates.render(detail ? `verdict.${decision.verdict}.${detail}` : `verdict.${decision.verdict}`, {});
  const advice = adviseClaim({ analysis: a, decision, detail, worth: extras.worth, key: built.key, templates: ctx.templates, adjusted: ctx.adjusted });
  const head = { id: a.claim.id, statement: a.claim.statement, verdict: decision.verdict, verdictLabel, ...(detail ? { verdictDetail: detail } : {}), advice };
  // The level of the interval in the key figure (claims in one pack may use 90, 95 and 99%).
  const h = headline(a);
  const level = h ? fmt.level(h.interval.level) : a.kind === 'estimate' && a.status === 'tested' ? fmt.level(a.claim.confidence) : undefined;
  return {
    section: { ...head, ...built.section, ...(extras.sourceLine ? { sourceLine: extras.sourceLine } : {}) },
    summary: { ...head, keyFigure: built.key, ...(level ? { intervalLevel: level } : {}), ...(mismatched.length > 0 ? { wordsDisagree: true } : {}) },
  };
}

/** The text with its first letter in upper case (a sentence may open with a lower-case label from the claims file). */
export function sentence(text: string): string {
  // Terms the trade writes in lower case stay so: "p-value", "r = 0.41".
  if (/^(p-value|[a-zα-ω](\s|=|$))/.test(text)) return text;
  return text.length > 0 ? text[0]!.toUpperCase() + text.slice(1) : text;
}

/**
 * Words for every claim of a pack: each claim's kind of "not supported" and advice (src/verdicts/advice.ts), its
 * source line, and links between claims tested on the same data.
 */
export function composeClaims(
  analyses: Analysis[],
  decisions: Decision[],
  ctx: ComposeContext,
  sourceLines: string[],
): Array<{ section: ClaimSection; summary: SummaryRow; worth?: Worth }> {
  const links = linksOf(analyses);
  const composed = analyses.map((a, i) => {
    const decision = decisions[i] as Decision;
    const own = links[i]!;
    const linked = [...own.shown, ...(own.equivalence !== undefined && !own.shown.includes(own.equivalence) ? [own.equivalence] : [])].map((j) => analyses[j] as Analysis);
    const worth = worthReporting(a, decision, linked);
    const detail = notSupportedAs(a, decision, worth);
    const built = composeClaim(a, decision, ctx, { ...(detail ? { detail } : {}), ...(worth ? { worth } : {}), ...(sourceLines[i] ? { sourceLine: sourceLines[i] } : {}) });
    return { ...built, ...(worth && detail ? { worth } : {}) };
  });
  addTerms(composed.map((c) => c.section), ctx.templates);
  composed.forEach((c, i) => {
    const own = links[i]!;
    const notes = own.shown.map((j) => linkNote({ id: composed[j]!.section.id, verdictLabel: composed[j]!.section.verdictLabel, kind: analyses[j]!.kind }, ctx.templates));
    if (notes.length > 0) {
      c.section.linked = notes;
      c.summary.linked = notes;
    }
    if (own.count > own.shown.length) {
      c.section.linkedMore = { count: own.count - own.shown.length, text: moreLinksNote(own.count - own.shown.length, ctx.templates) };
    }
  });
  return composed;
}

/** Terms of the trade with their plain explanations (templates/terms.mustache: "Term | meaning" lines). */
export function termDefinitions(templates: ComposeContext['templates']): Array<{ term: string; text: string }> {
  return templates.renderLines('terms', {}).map((line) => {
    const at = line.indexOf('|');
    const text = line.slice(at + 1).trim();
    return { term: line.slice(0, at).trim(), text: text.length > 0 ? text[0]!.toUpperCase() + text.slice(1) : text };
  });
}

/** How each term may be written on a page, where that differs from the term itself. */
const TERM_PATTERNS: Record<string, RegExp> = {
  'degrees of freedom': /\bdegrees? of freedom\b/i,
  'Adjusted residual': /\badjusted (standardized )?residuals?\b/i,
  TOST: /\bTOST\b|two one-sided tests/i,
  'Mann–Whitney': /Mann[–-]Whitney/,
};

/** Each term is explained on the first claim page where it appears (and in the glossary). */
function addTerms(sections: ClaimSection[], templates: ComposeContext['templates']): void {
  const terms = termDefinitions(templates);
  const seen = new Set<string>();
  for (const section of sections) {
    const text = [section.compared, section.verdictText, section.methodLine, ...section.numbers.flatMap((r) => [r.label, r.value])].join('\n');
    const found = terms.filter((t) => !seen.has(t.term) && (TERM_PATTERNS[t.term] ?? new RegExp(t.term.replace(/[.*+?^${}()|[\]\\]/g, '\\$&'), 'i')).test(text));
    for (const t of found) seen.add(t.term);
    if (found.length > 0) section.terms = found;
  }
}
