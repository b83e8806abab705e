/**
 * The whole pack's words: cover, summary, sections, method notes, glossary, reproducibility. Per-claim wording is in
 * compose.ts; this file adds what belongs to the pack as a whole.
 */
import { realpathSync } from 'node:fs';
import { dirname, isAbsolute, relative } from 'node:path';
import type { Analysis } from '../analyse/types.js';
import type { ClaimsFile } from '../claims/types.js';
import type { Cube } from '../data/types.js';
import { readingNotes } from '../data/reading-notes.js';
import * as fmt from '../format/numbers.js';
import type { ClaimSection, PackModel, SummaryRow } from '../render/model.js';
import { METHODS, methodInfo } from '../stats/methods.js';
import { withCommonShareRange } from '../render/chart-scales.js';
import type { Templates } from './templates.js';
import { termDefinitions } from './compose.js';
import { originText, respondentsByPeriod, respondentsText } from './source.js';
import { packWorthSizes } from './advice.js';
import { comparesPeriods, relatesMeasures } from './words/common.js';

/** A template of "Label | meaning" lines (verdict and action definitions). */
function definitions(templates: Templates, name: string, view: Record<string, unknown>): Array<{ label: string; text: string }> {
  return templates.renderLines(name, view).map((line) => {
    const at = line.indexOf('|');
    const text = line.slice(at + 1).trim();
    return { label: line.slice(0, at).trim(), text: text.length > 0 ? text[0]!.toUpperCase() + text.slice(1) : text };
  });
}

export const ADJUST_NAMES: Record<ClaimsFile['adjust'], string> = {
  holm: "Holm's method",
  'benjamini-hochberg': 'the Benjamini–Hochberg method',
  none: 'no adjustment',
  hochberg: "Hochberg's method",
  bonferroni: 'the Bonferroni method',
  'benjamini-yekutieli': 'the Benjamini–Yekutieli method',
};

/**
 * For a data file outside the claims file's folder (a path with "..", an absolute path, a link leading out): the
 * file actually read, so that a reader sees exactly which one was used. Files inside the folder need no more than
 * the path as written, which keeps the pack the same wherever the folder is copied.
 */
function readFrom(claims: ClaimsFile, sourceId: string): string {
  const spec = claims.sources.find((s) => s.id === sourceId);
  if (spec === undefined) return '';
  let real: string;
  let folder: string;
  try {
    real = realpathSync(spec.path);
    folder = realpathSync(dirname(claims.path));
  } catch {
    return '';
  }
  const rel = relative(folder, real);
  return rel.startsWith('..') || isAbsolute(rel) ? ` (outside the claims file's folder: read from ${real})` : '';
}

/**
 * Kinds whose claims measure something other than agreement rates, or choose their measure: every other kind compares
 * agreement rates and gives its differences in percentage points (compare, change, gap-change, trend, target,
 * equivalence, rank, and any kind added later unless it is named here).
 */
const NOT_RATE_KINDS = new Set<string>(['association', 'crosstab', 'means', 'estimate']);

/**
 * Which glossary entries the pack uses, from its analyses and composed pages: each entry is listed only where
 * something in the pack speaks of it (no "Correlation (r)" in a pack with no association claim, no "Power" where no
 * hypothesis was tested, no "Rest of a group" where no group was compared with the rest of it), and of the terms
 * explained beside a claim's numbers (Cohen's h, TOST, ...) only those a page explains (ClaimSection.terms).
 */
export function glossaryUse(analyses: Analysis[], sections: ClaimSection[], templates: Templates): Record<string, unknown> {
  const tested = analyses.filter((a) => a.status === 'tested' && a.kind !== 'estimate');
  const agreeMeasure = (m: { type: string } | undefined): boolean => m === undefined || m.type === 'agree';
  const usedTerms = new Set(sections.flatMap((s) => (s.terms ?? []).map((t) => t.term)));
  return {
    rates: analyses.some((a) => {
      if (!NOT_RATE_KINDS.has(a.kind)) return true;
      if (a.kind === 'estimate') return agreeMeasure(a.claim.measure);
      if (a.kind === 'association') return agreeMeasure(a.claim.xMeasure) || agreeMeasure(a.claim.yMeasure);
      return false;
    }),
    points: analyses.some((a) => !NOT_RATE_KINDS.has(a.kind)),
    tested: analyses.some((a) => a.kind !== 'estimate'),
    correlation: analyses.some((a) => a.kind === 'association'),
    // The smallest difference detected 80% of the time is given for every tested claim but an equivalence claim.
    power: tested.some((a) => a.kind !== 'equivalence'),
    rest: analyses.some((a) => ('relation' in a && a.relation !== undefined && a.relation !== 'separate') || (a.claim as { againstRest?: true }).againstRest === true),
    terms: termDefinitions(templates).filter((t) => usedTerms.has(t.term)),
  };
}

export function composePack(input: {
  claims: ClaimsFile;
  claimsDisplay: string;
  cubes: Cube[];
  analyses: Analysis[];
  sections: ClaimSection[];
  summary: SummaryRow[];
  claimsTested: number;
  date: string;
  version: string;
  command: string;
  templates: Templates;
  /** What the seal beside the claims file proves about when the claims were written (src/verdicts/words/seal.ts). */
  sealText?: string;
  /** The source columns that hold periods (years), to tell which general cautions apply (words/common.ts). */
  periodColumns?: string[];
}): PackModel {
  const { claims, templates } = input;
  const adjustName = ADJUST_NAMES[claims.adjust];
  const oneSided = claims.claims.some((c) => c.sided === 'one-sided');
  const methodIds = [...new Set(input.analyses.flatMap((a) => a.methods))];
  if (claims.adjust !== 'none' && input.claimsTested > 1) methodIds.push(claims.adjust);
  if (input.sections.some((s) => s.chart)) methodIds.push('chart-scales');
  methodIds.push('rounding');
  const view = {
    claimsTested: input.claimsTested,
    // The words about the adjustment follow the one made: none with adjust: none or a single claim tested; a false
    // discovery rate (Benjamini–Hochberg, –Yekutieli) is not the chance of even one false finding.
    adjusted: claims.adjust !== 'none' && input.claimsTested > 1,
    unadjustedMany: claims.adjust === 'none' && input.claimsTested > 1,
    falseDiscovery: claims.adjust === 'benjamini-hochberg' || claims.adjust === 'benjamini-yekutieli',
    minRespondents: claims.minRespondents,
    adjustName,
    adjustNameStart: `${adjustName.charAt(0).toUpperCase()}${adjustName.slice(1)}`,
    level: fmt.level(claims.confidence),
    alphaPercent: fmt.level(1 - claims.confidence),
    sealSentence: input.sealText ?? '',
    worthSizes: packWorthSizes(claims),
    // The general cautions on cohorts between periods and on cause and effect, only where a claim of that sort is made.
    cohorts: input.analyses.some((a) => comparesPeriods(a, input.periodColumns ?? [])),
    relations: input.analyses.some(relatesMeasures),
  };
  if (input.sections.some((s) => s.verdictDetail === 'inconclusive' || s.verdictDetail === 'ruled-out')) methodIds.push('worth-reporting');
  const ordered = Object.keys(METHODS).filter((id) => methodIds.includes(id));
  const glossary = templates.renderLines('glossary', { ...view, ...glossaryUse(input.analyses, input.sections, templates) }).map((line) => {
    const at = line.indexOf(':');
    const text = line.slice(at + 1).trim();
    return { term: line.slice(0, at).trim(), text: text.length > 0 ? text[0]!.toUpperCase() + text.slice(1) : text };
  });
  return {
    title: claims.title,
    organisation: claims.organisation,
    ...(claims.description !== undefined ? { description: claims.description } : {}),
    date: input.date,
    confidenceText: `${fmt.level(claims.confidence)}, two-sided${oneSided ? ' unless a claim states a one-sided test' : ''}`,
    adjustmentText:
      claims.adjust === 'none' || input.claimsTested < 2
        ? 'None: each claim is judged on its own p-value'
        : `${adjustName[0]?.toUpperCase()}${adjustName.slice(1)} across the ${input.claimsTested} claims tested`,
    sources: input.cubes.map((c) => {
      const spec = claims.sources.find((s) => s.id === c.sourceId);
      const shape = spec?.shape === 'respondents' ? 'one row per respondent' : 'summary counts per group';
      const sheet = spec?.sheet ?? c.sheet;
      const periods = respondentsByPeriod(spec, c).periods;
      const respondents = respondentsText(spec, c);
      const notes = readingNotes(c, templates);
      return {
        id: c.sourceId,
        file: c.file,
        description: `${shape}${sheet ? `, sheet "${sheet}"` : ''}`,
        rows: c.rows,
        sha256: c.sha256,
        ...(spec?.title ? { title: spec.title } : {}),
        ...(spec?.origin ? { origin: originText(spec) } : {}),
        ...(periods.length > 0 ? { periods } : {}),
        ...(respondents ? { respondentsText: respondents } : {}),
        ...(notes.length > 0 ? { notes } : {}),
      };
    }),
    summaryIntro: templates.render('summary.intro', view),
    // The mark on a summary row whose claim's words and fields disagree, and the note under the table that explains it.
    ...(input.summary.some((r) => r.wordsDisagree)
      ? { summaryMarks: { wordsDisagree: { mark: templates.render('summary.words-fields-mark', view), note: templates.render('summary.words-fields-note', view) } } }
      : {}),
    ...(input.sealText !== undefined ? { sealText: input.sealText } : {}),
    verdictDefinitions: definitions(templates, 'verdict-definitions', view),
    actionDefinitions: definitions(templates, 'action-definitions', view),
    summary: input.summary,
    claims: withCommonShareRange(input.sections),
    methods: ordered.map((id) => {
      const info = methodInfo(id);
      // The split of "not supported" names the sizes this pack used (the claims file's or the defaults).
      // A note that speaks of the adjustment for many claims has its own words for a pack that made none.
      const base = !view.adjusted && info.unadjusted !== undefined ? info.unadjusted : info.text;
      const text = id === 'worth-reporting' && view.worthSizes ? `${base} ${templates.render('worth-sizes', view)}` : base;
      return { name: info.name, text, source: info.source };
    }),
    glossary,
    reproducibility: [
      { label: 'Tool', value: `warrant ${input.version}` },
      { label: 'Command', value: input.command },
      { label: 'Claims file', value: `${input.claimsDisplay} (SHA-256 ${claims.sha256})` },
      ...input.cubes.map((c) => ({ label: `Data: ${c.sourceId}`, value: `${c.file}${readFrom(claims, c.sourceId)}, ${fmt.count(c.rows)} rows (SHA-256 ${c.sha256})` })),
    ],
    generalCautions: templates.renderLines('general-cautions', view),
  };
}
