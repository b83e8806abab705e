/**
 * results.json: every claim's numbers and verdict in a machine-readable form, described by
 * schema/results.schema.json. It holds no clock time, so the same claims and data give the same bytes.
 */
import type { Analysis, RateSummary } from '../analyse/types.js';
import type { Claim, ClaimsFile } from '../claims/types.js';
import type { Cube } from '../data/types.js';
import type { ClaimSection } from '../render/model.js';
import type { Interval, TestResult } from '../stats/result.js';
import type { Decision } from '../verdicts/decide.js';
import { claimFingerprint } from '../history/fingerprint.js';
import type { SealStatus } from '../verdicts/words/seal.js';

type SealFacts = SealStatus['facts'];
import { WORTH_DEFAULTS, type Worth } from '../verdicts/advice.js';
import { responseRateOf } from '../verdicts/source.js';
import { shownSlope, shownSlopeUnit } from '../verdicts/words/association.js';
import { cohensDIntervalAt } from '../analyse/means.js';
import { POWER } from '../analyse/detectable.js';

export const RESULTS_FORMAT = 1;

export interface SelectionResult {
  label: string;
  n: number;
  agree: number;
  rate: number;
  interval: Interval;
  population?: number;
  approximate: boolean;
}

export interface ClaimResult {
  id: string;
  statement: string;
  kind: string;
  /** The data source the claim was tested on. */
  source: string;
  /** Digest of what the claim commits to (words, selections, direction, confidence, thresholds); see src/history. */
  fingerprint: string;
  method: string | null;
  methods: string[];
  hypotheses: { null: string; alternative: string };
  confidence: number;
  sided: 'two-sided' | 'one-sided';
  expect: string;
  verdict: string;
  verdictText: string;
  estimate: { name: string; value: number } | null;
  interval: Interval | null;
  statistic: { symbol: string; value: number } | null;
  df: number | [number, number] | null;
  p: number | null;
  pAdjusted: number | null;
  /** The threshold the adjustment applied to this claim's raw p-value (src/stats/p-adjust-thresholds.ts). */
  effectiveAlpha: number | null;
  /**
   * The headline interval again at the level that agrees with the test that decided the verdict: 1 - effectiveAlpha
   * where the adjustment lowered the threshold, 1 - 2 effectiveAlpha for a claim tested one-sided; null otherwise.
   */
  adjustedInterval: Interval | null;
  /** The verdict at 90, 95 and 99% confidence with and without adjustment; null for estimates and untested claims. */
  stability: {
    levels: Array<{ level: number; adjusted: string; unadjusted: string }>;
    adjustmentApplies: boolean;
    dependsOnLevel: boolean;
    dependsOnAdjustment: boolean;
    text: string;
  } | null;
  n: number[];
  /** Selections (compare) with their rates; empty when data were too few (nothing suppressed is shown). */
  selections: SelectionResult[];
  /** Mean scores (means: each group; estimate of a mean: one) with SD, n and t interval; empty otherwise. */
  means: Array<{ label: string; n: number; mean: number; sd: number; interval: Interval }>;
  /** Trend: the fitted change in the rate per period (proportion per period); null otherwise. */
  slope: number | null;
  /** The difference the pack prints with its interval at the claim's own level (proportion or scale points); null otherwise. */
  difference: { value: number; interval: Interval } | null;
  /** Units (association) with their two measures (and, with controls, their residuals); empty when data were too few. */
  units: Array<{ unit: string; x: number; y: number; nx: number; ny: number; xResidual?: number; yResidual?: number }>;
  /** Smallest difference (proportion) or correlation detectable with 80% power. */
  detectable: number | null;
  comparedWithRest: boolean;
  cautions: string[];
  /** The verdict in the pack's words. */
  verdictLabel?: string;
  /** For not-supported: inconclusive, ruled-out or too-small; null otherwise (see src/verdicts/advice.ts). */
  verdictDetail?: string | null;
  /**
   * The difference worth reporting that split not-supported, in the interval's units, and its basis; for mean scores
   * set in standard deviations, that size too (`standardized`).
   */
  worthReporting?: { value: number; basis: string; standardized?: number } | null;
  /** What the summary advises doing with the claim. */
  advice?: { action: string; label: string; reason: string; wording?: string };
  /** Other claims tested on the same data. */
  linkedClaims?: string[];
  /** How many more claims are tested on the same data than linkedClaims lists. */
  linkedClaimsMore?: number;
  /** Lowest response rate among the selections (0-1), null when unknown. */
  responseRate?: number | null;
  /**
   * The finite-population correction as decided for the claim: used in every figure of its rates or in none, and
   * why not ('off': turned off in the claims file; 'no-population': no number eligible; 'no-form': the claim's test
   * has no corrected form, named in `form`). Null when the source gives no number eligible and none was asked for.
   */
  finitePopulationCorrection?: { used: boolean; why?: string; form?: string } | null;
  /**
   * A second test printed beside the main one: Mann–Whitney beside a t test (or Welch beside the rank test) for mean
   * scores; the respondent-weighted correlation beside the unweighted one for associations. Null when none.
   */
  check?: { method: string; estimate: number | null; p: number; interval?: Interval } | null;
  /** Cohen's d for mean scores (difference over the pooled standard deviation); null for other kinds. */
  cohensD?: number | null;
  /**
   * Mean-score claims: Cohen's d's interval at the claim's level and, where the adjustment for many claims lowered the
   * threshold, at the level that decided the verdict (noncentral t inversion); null otherwise.
   */
  cohensDInterval?: Interval | null;
  cohensDAdjustedInterval?: Interval | null;
  /**
   * Groups the claim's figures leave out: selections with rows withheld in the release (each with how many of its
   * rows), and units or table rows left out for fewer respondents than the minimum (names only); `groups` counts both.
   */
  suppression?: { groups: number; inRelease: Array<{ label: string; rows: number; of: number }>; leftOut: string[] };
  /** How many notes the pack gives on how the claim's source was read (sources[].readingNotes). */
  sourceReadingNotes?: number;
  /** Crosstab cells whose adjusted residual lies beyond the level's critical value, largest first. */
  notableCells?: Array<{ row: string; column: string; residual: number }>;
  /**
   * Change claims with focus and against (kind gap-change): the gap (focus rate minus against rate) in each period with
   * its Newcombe interval, and the change in the gap's size (|later gap| minus |earlier gap|; negative: narrowed).
   */
  gaps?: {
    from: GapResult;
    to: GapResult;
    sizeChange: number;
    /** A claim that the gap narrowed or widened: its two one-sided z tests, each p-value at the two-sided level. */
    sizeTests?: Array<{ of: 'change' | 'sum'; alternative: 'less' | 'greater'; z: number; p: number }>;
  };
  /**
   * Rank claims: the focus against each rival unit tested (nearest rate first): focus minus rival with Newcombe's
   * interval, the one-sided p-value the intersection-union test used, and whether the rival was separated at the
   * threshold that decided the verdict; `closest` names the rival nearest the focus.
   */
  rivals?: { closest: string; each: RivalFigures[] };
  /**
   * Every claims: each unit tested against the value (nearest the value first): its rate minus the value with the
   * rate's interval shifted by the value, the one-sided p-value the intersection-union test used, and whether the unit
   * was shown on the claimed side at the threshold that decided the verdict.
   */
  unitTests?: Array<{ label: string; difference: number; interval: Interval; p: number; shown: boolean }>;
  /** Compare and change: Cohen's h for the two rates. */
  cohensH?: number | null;
  /** Target and every: the fixed value the rate (each unit's rate) is held to (proportion). */
  comparisonValue?: number;
  /** Equivalence: the margin (proportion; 0.06 = 6 percentage points). */
  margin?: number;
  /** Estimate: the larger distance from the estimate to an end of its interval (proportion, or scale points for a mean). */
  marginOfError?: number;
  /** Target with the exact test: the rate's Clopper–Pearson interval. */
  exactInterval?: Interval;
  /** Means: the answer scale's lowest and highest code. */
  scale?: [number, number];
  /** Means with the rank test: probability that a focus answer exceeds an against answer (ties count half). */
  superiority?: number;
  /** Trend: the fitted rate per period (same order as selections) and the fitted change first to last period (proportions). */
  fitted?: { rates: number[]; change: number };
  /** Trend: the chi-square for departure from a straight line. */
  departure?: { statistic: number; df: number; p: number } | null;
  /**
   * Association: the least-squares line y = intercept + slope x (in the measures' units: proportions for rates) and R²;
   * with controls, of y's residuals on x's residuals (of: 'residuals'), whose R² is the partial r².
   */
  line?: { of: 'values' | 'residuals'; intercept: number; slope: number; rSquared: number; shownSlope?: { value: number; unit: string } } | null;
  /** Association: the labels of the controls allowed for (partial correlation), in the claim's order; empty when none. */
  controls?: string[];
  /** Association: the checks on ranks printed beside r (Spearman's rho, Kendall's tau-b), each with its p-value. */
  rankChecks?: Array<{ method: string; estimate: number; p: number | null }>;
  /** Association: rank checks not shown, with the reason the pack prints (see RankCheckLeftOut in src/analyse/types.ts). */
  rankChecksLeftOut?: Array<{ check: string; reason: string }>;
  /** Association and crosstab: units (rows) tested, all units (rows) found, and those left out for too few respondents. */
  unitCounts?: { tested: number; all: number; leftOut: number };
  /** Crosstab: the table of counts (rows × columns, rows with enough respondents), its smallest expected count and the residual cutoff. */
  table?: { rows: string[]; columns: string[]; counts: number[][]; smallestExpected: number | null; residualCutoff: number | null };
}

export interface ResultsFile {
  format: number;
  tool: { name: 'warrant'; version: string };
  /** Digest of the claims file, data files, tool version and output options: names the pack's folder. */
  fingerprint: string;
  title: string;
  organisation: string;
  date: string;
  claimsFile: { file: string; sha256: string };
  settings: {
    confidence: number;
    adjust: string;
    minRespondents: number;
    claimsTested: number;
    detectablePower: number;
    /** The pack-wide sizes worth reporting (rates as proportions, mean scores in standard deviations, r) and which the claims file set. */
    worthReporting: { rates: number; meanScores: number; correlations: number; fromClaimsFile: string[] };
  };
  sources: Array<{
    id: string;
    file: string;
    sheet?: string;
    shape: string;
    sha256: string;
    rows: number;
    /** Rows whose counts the release withheld (suppressed), and the markers that said so with how many cells each. */
    suppressedRows: number;
    suppressedMarkers: Record<string, number>;
    /** Footnote markers read off numbers, each with how many cells carried it and the first such cell. */
    footnoteMarkers: Array<{ marker: string; cells: number; example: string; row: number }>;
    /** The notes the pack prints on how the table was read (one sentence each). */
    readingNotes: string[];
  }>;
  /** What the seal beside the claims file proves (src/commands/seal.ts); null when there is none. */
  seal: SealFacts;
  claims: ClaimResult[];
}

/** A rank claim's comparison of its unit with one rival. */
export interface RivalFigures {
  label: string;
  difference: number;
  interval: Interval;
  p: number;
  separated: boolean;
}

/** One period's gap in a gap-change claim. */
export interface GapResult {
  period: string;
  value: number;
  interval: Interval;
}

function selection(r: RateSummary): SelectionResult {
  return {
    label: r.label,
    n: r.n,
    agree: r.agree,
    rate: r.rate,
    interval: r.interval,
    ...(r.population !== undefined ? { population: r.population } : {}),
    approximate: r.approximate,
  };
}

function testFields(test: TestResult | undefined) {
  return {
    method: test?.method ?? null,
    estimate: test ? test.estimate : null,
    statistic: test?.statistic ?? null,
    df: test?.df ?? null,
    n: test?.n ?? [],
  };
}

/** The groups a claim's figures leave out (ClaimResult.suppression). */
function suppressionOf(a: Analysis, rates: RateSummary[]): NonNullable<ClaimResult['suppression']> {
  const inRelease = rates.flatMap((r) => (r.suppressed ? [{ label: r.label, rows: r.suppressed.rows, of: r.suppressed.of }] : []));
  const leftOut = a.kind === 'association' || a.kind === 'rank' || a.kind === 'every' ? [...a.suppressedUnits] : a.kind === 'crosstab' ? [...a.suppressedRows] : [];
  return { groups: inRelease.length + leftOut.length, inRelease, leftOut };
}

/**
 * One claim's results. `written` is the claim as the claims file states it (before relative periods such as
 * `latest` were resolved): its fingerprint must not change just because next year's data have a new latest period.
 */
export function claimResult(a: Analysis, decision: Decision, section: ClaimSection, written: Claim = a.claim, worth?: Worth): ClaimResult {
  const tested = a.status === 'tested';
  // Fields not every kind has are read by name, so a new claim kind appears here without changes to this file:
  // `expect` (direction), `detectable` (power), `focus`/`against` or `selections` (rates), `points` (units),
  // `difference` (the interval of interest for two-rate kinds), `relation` (compared with the rest of a group).
  const claim = a.claim as unknown as Record<string, unknown>;
  const extra = a as unknown as Record<string, unknown>;
  // Every rate the pack prints: two selections (compare, equivalence), two periods (change, earlier first), each
  // period (trend), one selection (target, estimate), or a list of selections.
  const rates: RateSummary[] = [];
  if (a.kind === 'gap-change') {
    if (a.earlier && a.later) rates.push(a.earlier.focus, a.earlier.against, a.later.focus, a.later.against);
  } else if (a.kind === 'rank') {
    if (a.units) rates.push(...a.units);
  } else if (a.kind === 'every') {
    if (a.tests) rates.push(...a.tests.map((u) => u.rate));
  } else if (extra.focus && extra.against) rates.push(extra.focus as RateSummary, extra.against as RateSummary);
  else if (extra.earlier && extra.later) rates.push(extra.earlier as RateSummary, extra.later as RateSummary);
  else if (Array.isArray(extra.rates)) rates.push(...(extra.rates as RateSummary[]));
  else if (extra.rate && typeof extra.rate === 'object') rates.push(extra.rate as RateSummary);
  else if (Array.isArray(extra.selections)) rates.push(...(extra.selections as RateSummary[]));
  // Mean scores (means: two groups; estimate: one), each with its SD, n and t interval.
  const meanGroups = (a.kind === 'means' && extra.focus && extra.against ? [extra.focus, extra.against] : extra.mean ? [extra.mean] : []) as Array<{
    label: string;
    n: number;
    mean: number;
    sd: number;
    interval: Interval;
  }>;
  const points = Array.isArray(extra.points) ? (extra.points as ClaimResult['units']) : [];
  // Where a kind reports a difference (two rates, a rate against a fixed value), the estimate and the interval in
  // results.json are both the difference's, so that they always describe the same quantity.
  const difference = extra.difference as { value?: number; interval?: Interval } | undefined;
  const estimate =
    difference && typeof difference.value === 'number' && difference.interval
      ? {
          // A gap-change claim reports the change in the gap (its interval's quantity) whichever test decided it.
          name: a.kind === 'gap-change' ? 'change in the difference of proportions' : a.test?.estimate.name && /difference/i.test(a.test.estimate.name) ? a.test.estimate.name : 'difference from the comparison value',
          value: difference.value,
        }
      : a.test?.estimate ?? null;
  return {
    id: a.claim.id,
    statement: a.claim.statement,
    kind: a.kind,
    source: a.claim.source,
    fingerprint: claimFingerprint(written),
    ...testFields(a.test),
    estimate,
    methods: a.methods,
    hypotheses: section.hypotheses,
    confidence: a.claim.confidence,
    sided: a.claim.sided,
    expect: typeof claim.expect === 'string' ? claim.expect : 'none',
    verdict: decision.verdict,
    verdictText: section.verdictText,
    p: decision.p ?? null,
    pAdjusted: decision.pAdjusted ?? null,
    effectiveAlpha: decision.effectiveAlpha ?? null,
    adjustedInterval: decision.adjustedInterval?.interval ?? null,
    stability:
      decision.stability && section.stability
        ? {
            levels: decision.stability.cells.map((c) => ({ level: c.level, adjusted: c.adjusted, unadjusted: c.unadjusted })),
            adjustmentApplies: decision.stability.adjustmentApplies,
            dependsOnLevel: decision.stability.dependsOnLevel,
            dependsOnAdjustment: decision.stability.dependsOnAdjustment,
            text: section.stability.text,
          }
        : null,
    detectable: tested && typeof extra.detectable === 'number' ? extra.detectable : null,
    cautions: section.cautions,
    // Equivalence: the 1 - 2 alpha interval the pack sets against the margin (the one its verdict rests on).
    interval: (a.kind === 'equivalence' ? a.equivalenceInterval : undefined) ?? difference?.interval ?? a.test?.interval ?? null,
    selections: tested ? rates.filter((r) => typeof r.rate === 'number').map(selection) : [],
    means: tested ? meanGroups.map((m) => ({ label: m.label, n: m.n, mean: m.mean, sd: m.sd, interval: m.interval })) : [],
    slope: tested && a.kind === 'trend' && typeof extra.slope === 'number' ? extra.slope : null,
    difference: tested && difference && typeof difference.value === 'number' && difference.interval ? { value: difference.value, interval: difference.interval } : null,
    units: tested
      ? points.map((p) => ({
          unit: p.unit,
          x: p.x,
          y: p.y,
          nx: p.nx,
          ny: p.ny,
          ...(p.xResidual !== undefined && p.yResidual !== undefined ? { xResidual: p.xResidual, yResidual: p.yResidual } : {}),
        }))
      : [],
    comparedWithRest: extra.relation !== undefined && extra.relation !== 'separate',
    verdictLabel: section.verdictLabel,
    verdictDetail: section.verdictDetail ?? null,
    worthReporting: worth ? { value: worth.value, basis: worth.basis, ...(worth.standardized !== undefined ? { standardized: worth.standardized } : {}) } : null,
    ...(section.advice ? { advice: section.advice } : {}),
    linkedClaims: (section.linked ?? []).map((l) => l.id),
    ...(section.linkedMore ? { linkedClaimsMore: section.linkedMore.count } : {}),
    responseRate: tested ? responseRateOf(a)?.rate ?? null : null,
    finitePopulationCorrection: a.fpc !== undefined ? { used: a.fpc.used, ...(a.fpc.why !== undefined ? { why: a.fpc.why } : {}), ...(a.fpc.form !== undefined ? { form: a.fpc.form } : {}) } : null,
    check:
      a.kind === 'means' && a.check
        ? { method: a.check.method, estimate: null, p: a.check.test.p }
        : a.kind === 'association' && a.weightedCheck
          ? { method: 'pearson-weighted', estimate: a.weightedCheck.estimate.value, p: a.weightedCheck.p, ...(a.weightedCheck.interval ? { interval: a.weightedCheck.interval } : {}) }
          : null,
    cohensD: a.kind === 'means' ? a.cohensD ?? null : null,
    cohensDInterval: a.kind === 'means' ? a.cohensDInterval ?? null : null,
    cohensDAdjustedInterval:
      a.kind === 'means' && a.cohensDInterval && decision.adjustedInterval && decision.effectiveAlpha !== undefined
        ? cohensDIntervalAt(a, decision.adjustedInterval.interval.level) ?? null
        : null,
    ...(a.kind === 'crosstab' ? { notableCells: a.notable } : {}),
    suppression: suppressionOf(a, rates),
    ...(tested ? kindFigures(a, decision) : {}),
  };
}

/** The figures one kind's numbers table prints beyond the fields every claim has (see schema/results.schema.json). */
function kindFigures(a: Analysis, decision: Decision): Partial<ClaimResult> {
  switch (a.kind) {
    case 'compare':
    case 'change':
      return { cohensH: a.cohensH ?? null };
    case 'gap-change':
      return a.earlier && a.later && a.sizeChange !== undefined
        ? {
            gaps: {
              from: { period: a.periods.from, value: a.earlier.gap, interval: a.earlier.interval },
              to: { period: a.periods.to, value: a.later.gap, interval: a.later.interval },
              sizeChange: a.sizeChange,
              ...(a.sizeTests ? { sizeTests: a.sizeTests.map((c) => ({ of: c.of, alternative: c.alternative, z: c.z, p: c.p })) } : {}),
            },
          }
        : {};
    case 'target':
      return { comparisonValue: a.claim.value, ...(a.exactInterval ? { exactInterval: a.exactInterval } : {}) };
    case 'equivalence':
      return { margin: a.claim.margin };
    case 'estimate': {
      const est = a.rate ? { value: a.rate.rate, interval: a.rate.interval } : a.mean ? { value: a.mean.mean, interval: a.mean.interval } : undefined;
      return est ? { marginOfError: Math.max(est.value - est.interval.lower, est.interval.upper - est.value) } : {};
    }
    case 'means':
      return { ...(a.scale ? { scale: a.scale } : {}), ...(a.superiority !== undefined ? { superiority: a.superiority } : {}) };
    case 'trend':
      return a.fitted && a.fitted.length > 0
        ? {
            fitted: { rates: a.fitted.slice(), change: (a.fitted[a.fitted.length - 1] as number) - (a.fitted[0] as number) },
            departure: a.departure ? { statistic: a.departure.statistic, df: a.departure.df, p: a.departure.p } : null,
          }
        : {};
    case 'association':
      return {
        line: a.fit
          ? {
              of: a.controlled ? 'residuals' : 'values',
              intercept: a.fit.intercept,
              slope: a.fit.slope,
              rSquared: a.fit.rSquared,
              // The residual line is printed and drawn in points (rates) and scale points (means), not proportions.
              ...(a.controlled ? { shownSlope: { value: shownSlope(a), unit: shownSlopeUnit(a) } } : {}),
            }
          : null,
        controls: a.controlled ?? [],
        // With controls the checks are partial (partial Spearman; Kendall's partial tau, which has no p-value).
        rankChecks: [
          ...(a.spearman ? [{ method: a.spearman.method, estimate: a.spearman.estimate.value, p: a.spearman.p }] : []),
          ...(a.kendall ? [{ method: 'kendall-tau-b', estimate: a.kendall.estimate.value, p: a.kendall.p }] : []),
          ...(a.partialKendall ? [{ method: a.partialKendall.method, estimate: a.partialKendall.estimate.value, p: null }] : []),
        ],
        rankChecksLeftOut: (a.rankChecksLeftOut ?? []).map((l) => ({ check: l.check, reason: l.reason })),
        unitCounts: { tested: a.points.length, all: a.points.length + a.suppressedUnits.length, leftOut: a.suppressedUnits.length },
      };
    case 'rank': {
      if (!a.rivals || !a.closest) return {};
      const at = decision.effectiveAlpha ?? decision.alpha;
      return {
        rivals: {
          closest: a.closest.rival.label,
          each: a.rivals.map((r) => ({ label: r.rival.label, difference: r.difference.value, interval: r.difference.interval, p: r.p ?? 1, separated: (r.p ?? 1) < at })),
        },
        unitCounts: { tested: (a.units ?? []).length, all: a.unitCount, leftOut: a.suppressedUnits.length },
      };
    }
    case 'every': {
      if (!a.tests) return {};
      const at = decision.effectiveAlpha ?? decision.alpha;
      return {
        comparisonValue: a.claim.value,
        unitTests: a.tests.map((u) => ({ label: u.rate.label, difference: u.difference.value, interval: u.difference.interval, p: u.p ?? 1, shown: (u.p ?? 1) < at })),
        unitCounts: { tested: a.tests.length, all: a.unitCount, leftOut: a.suppressedUnits.length },
      };
    }
    case 'crosstab':
      return {
        table: { rows: a.rowLabels, columns: a.columnLabels, counts: a.counts, smallestExpected: a.minExpected ?? null, residualCutoff: a.residualCutoff ?? null },
        unitCounts: { tested: a.rowLabels.length, all: a.rowLabels.length + a.suppressedRows.length, leftOut: a.suppressedRows.length },
      };
  }
}

export function resultsFile(input: {
  version: string;
  fingerprint: string;
  claims: ClaimsFile;
  claimsDisplay: string;
  date: string;
  cubes: Cube[];
  results: ClaimResult[];
  seal?: SealFacts;
  /** Claims tested together: the family the adjustment for many claims counts. */
  claimsTested: number;
  /** The pack's notes on how each source was read, by source id (src/data/reading-notes.ts). */
  readingNotes?: Record<string, string[]>;
}): ResultsFile {
  const { claims } = input;
  const notes = input.readingNotes ?? {};
  return {
    format: RESULTS_FORMAT,
    tool: { name: 'warrant', version: input.version },
    fingerprint: input.fingerprint,
    title: claims.title,
    organisation: claims.organisation,
    date: input.date,
    claimsFile: { file: input.claimsDisplay, sha256: claims.sha256 },
    settings: {
      confidence: claims.confidence,
      adjust: claims.adjust,
      minRespondents: claims.minRespondents,
      claimsTested: input.claimsTested,
      detectablePower: POWER,
      worthReporting: {
        rates: claims.worthReporting?.rates ?? WORTH_DEFAULTS.points,
        meanScores: claims.worthReporting?.meanScores ?? WORTH_DEFAULTS.standardized,
        correlations: claims.worthReporting?.correlations ?? WORTH_DEFAULTS.correlation,
        fromClaimsFile: Object.keys(claims.worthReporting ?? {}),
      },
    },
    sources: input.cubes.map((c) => {
      const spec = claims.sources.find((s) => s.id === c.sourceId);
      const sheet = spec?.sheet ?? c.sheet;
      return {
        id: c.sourceId,
        file: c.file,
        ...(sheet ? { sheet } : {}),
        shape: spec?.shape ?? 'summary',
        sha256: c.sha256,
        rows: c.rows,
        suppressedRows: c.suppressedRows ?? 0,
        suppressedMarkers: { ...(c.suppressedMarkers ?? {}) },
        footnoteMarkers: (c.footnotes ?? []).map((f) => ({ marker: f.marker, cells: f.cells, example: f.example, row: f.row })),
        readingNotes: [...(notes[c.sourceId] ?? [])],
      };
    }),
    seal: input.seal ?? null,
    claims: input.results.map((r) => ({ ...r, sourceReadingNotes: (notes[r.source] ?? []).length })),
  };
}
