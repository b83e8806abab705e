/**
 * What testing one claim produces, before any words are chosen. One interface per claim kind; the verdict is derived
 * afterwards (src/verdicts/decide.ts) from the adjusted p-value, the claim's direction and its confidence level.
 */
import type { GapSizeComponent } from '../stats/difference-of-differences.js';
import type { AssociationClaim, Claim, CompareClaim, CrosstabClaim, EquivalenceClaim, MeansClaim } from '../claims/types.js';
import type { Interval, TestResult } from '../stats/result.js';
import type { PartialKendall } from '../stats/partial-kendall.js';
import type { ChangeClaim, EstimateClaim, EveryClaim, GapChangeClaim, RankClaim, TargetClaim, TrendClaim } from '../claims/types.js';

/** One selection's pooled agreement rate with its interval. */
export interface RateSummary {
  label: string;
  n: number;
  agree: number;
  rate: number;
  interval: Interval;
  /** Number eligible, where the data give it. */
  population?: number;
  /** True when counts were rebuilt from rounded percentages. */
  approximate: boolean;
  /** Rows of the selection whose counts were withheld in the release, and all its rows (only when some were). */
  suppressed?: { rows: number; of: number };
  /** True when the interval carries the finite-population correction. */
  fpc?: true;
}

/**
 * The finite-population correction as decided for a claim: used for every figure of its rates, or for none, and
 * why not: turned off in the claims file, no number eligible in the data, or no corrected form of the claim's test.
 */
export interface FpcChoice {
  used: boolean;
  why?: 'off' | 'no-population' | 'no-form';
  /** why 'no-form': the test that has no corrected form, e.g. "the trend test". */
  form?: string;
}

/** Sign of an effect in the claim's terms: +1 the way the claim says, -1 the other way, 0 no direction claimed. */
export type Direction = 1 | -1 | 0;

interface AnalysisBase {
  /** 'too-little-data' when a selection is below the minimum number of respondents; nothing else is shown then. */
  status: 'tested' | 'too-little-data';
  /** Why there is too little data, as a plain sentence (never with the suppressed counts). */
  shortfall?: string;
  /** Primary test; its p-value is the one adjusted for many claims. */
  test?: TestResult;
  /** One-sided p-value in the direction opposite to the claim, for one-sided claims (to say "points the other way"). */
  pOpposite?: number;
  /** The direction the claim expects: +1 for "higher"/"positive", -1 for "lower"/"negative", 0 for none. */
  expectSign: Direction;
  /** Sign of the observed estimate (difference or r): +1, -1 or 0. */
  observedSign: Direction;
  /** Method machine names used (the test, the intervals), for the method notes. */
  methods: string[];
  /**
   * Two-selection kinds (compare, means, equivalence): the two groups as compared, named as their rates are ("the
   * rest of the region" where one selection holds the other, or `against: rest`), also when too few answered.
   */
  compared?: { focus: string; against: string };
  /**
   * The estimate and the smallest difference that matters, in the same units, when the claim sets one
   * (claim.smallestDifference). 'points' are proportion units (0.05 = 5 points); 'scale points' are answer-scale
   * units (for mean scores the fraction is read as a share of the scale's range: 0.05 on a 1-5 scale is 0.2).
   */
  threshold?: { effect: number; smallest: number; unit: 'points' | 'scale points' };
  /** The finite-population correction: used for every figure of the claim's rates or for none (see FpcChoice). */
  fpc?: FpcChoice;
  /**
   * The significance level the kind's `detectable` effect is computed at: the threshold that decided the verdict
   * after adjustment for many claims (src/analyse/detectable.ts). Absent: 1 − confidence.
   */
  detectableAlpha?: number;
}

export interface CompareAnalysis extends AnalysisBase {
  kind: 'compare';
  claim: CompareClaim;
  focus?: RateSummary;
  /** The comparison group; when the focus lies inside it, this is the rest of it (focus removed). */
  against?: RateSummary;
  /** How the two selections relate in the data. */
  relation: 'separate' | 'focus-inside' | 'against-inside';
  /** Difference focus - against, with the Newcombe interval. */
  difference?: { value: number; interval: Interval };
  /** Cohen's h for the two rates. */
  cohensH?: number;
  /** Smallest difference (in proportion units) detectable with 80% power at these sample sizes. */
  detectable?: number;
  /** Lowest response rate (respondents / eligible) among the two selections, where eligible is known. */
  responseRate?: number;
}

export interface UnitPoint {
  unit: string;
  x: number;
  y: number;
  nx: number;
  ny: number;
  /** Values of the claim's control measures for this unit, in the claim's order. */
  controls?: number[];
  /**
   * With controls: x less its least-squares fit (with intercept) on the controls, in x's own units (a proportion for
   * an agreement rate). Set on tested claims only.
   */
  xResidual?: number;
  /** With controls: y less its least-squares fit on the controls, in y's own units. */
  yResidual?: number;
}

/**
 * A rank check the pack leaves out, and why: 'undefined' (every unit tied on one measure), 'undefined-partial' (with
 * controls: a measure's ranks fully explained by the controls', or in the same order as the control), or
 * 'several-controls' (Kendall's partial tau has a classic formula for one control only).
 */
export interface RankCheckLeftOut {
  check: 'spearman' | 'kendall';
  reason: 'undefined' | 'undefined-partial' | 'several-controls';
}

export interface AssociationAnalysis extends AnalysisBase {
  kind: 'association';
  claim: AssociationClaim;
  points: UnitPoint[];
  /** Units left out because a measure had fewer respondents than the minimum (names only, never counts). */
  suppressedUnits: string[];
  /**
   * The least-squares line: of y on x; with controls, of y's residuals on x's residuals (the partial line, whose
   * slope is x's coefficient in the regression of y on x and the controls, and whose R² is the partial r²).
   */
  fit?: { intercept: number; slope: number; rSquared: number };
  /** Smallest |r| detectable with 80% power at this number of units. */
  detectable?: number;
  /** Total respondents behind each measure. */
  totals?: { x: number; y: number };
  /**
   * Spearman's rho over the same units, as a check that does not rest on straight lines or outliers; with controls,
   * the partial Spearman rho (method 'partial-spearman').
   */
  spearman?: TestResult;
  /** Kendall's tau-b over the same units, a second check on ranks that counts agreeing and disagreeing pairs (no controls). */
  kendall?: TestResult;
  /** With one control: Kendall's partial tau, a description with no p-value (src/stats/partial-kendall.ts). */
  partialKendall?: PartialKendall;
  /** Rank checks left out, with the reason the page gives; never replaced by an unpartialled figure. */
  rankChecksLeftOut?: RankCheckLeftOut[];
  /** Labels of the controls when the test is a partial correlation. */
  controlled?: string[];
  /** True when units were weighted by their respondents. */
  weighted?: boolean;
  /**
   * The Pearson correlation weighted by each unit's respondents (the fewer of its two measures'), given beside the
   * unweighted one when unit sizes differ a lot (largest at least three times the smallest) and the claim is neither
   * weighted nor controlled.
   */
  weightedCheck?: TestResult;
}

/** Claim kind "crosstab": a table of counts, rows by columns. */
export interface CrosstabAnalysis extends AnalysisBase {
  kind: 'crosstab';
  claim: CrosstabClaim;
  rowLabels: string[];
  columnLabels: string[];
  /** Counts, rowLabels × columnLabels (only rows with enough respondents). */
  counts: number[][];
  /** Rows left out for too few respondents (names only, never counts). */
  suppressedRows: string[];
  cramersV?: number;
  /** Smallest expected count under independence. */
  minExpected?: number;
  /** Cells whose adjusted standardized residual lies beyond ±residualCutoff, largest first. */
  notable: Array<{ row: string; column: string; residual: number }>;
  /** The cutoff for naming cells: the two-sided normal critical value at the claim's confidence (1.96 at 95%). */
  residualCutoff?: number;
  /** Smallest Cramér's V the chi-square test would detect 80% of the time (src/stats/power-chi-square.ts). */
  detectable?: number;
  /** True when Fisher's exact test was called for but the table was too large, so chi-square was used. */
  fisherTooLarge?: boolean;
  /**
   * columns `answers`: the question whose answer codes are the columns, the codes, and the answers left out of the
   * table (in the rows shown): not applicable, blank, or a valid code outside the scale.
   */
  answers?: { question: string; scale: number[]; notApplicable: number; blank: number; offScale: number };
}

/** One selection's mean score with its t interval. */
export interface MeanSummary {
  label: string;
  n: number;
  mean: number;
  sd: number;
  interval: Interval;
}

/** Claim kind "means": two selections' mean scores. */
export interface MeansAnalysis extends AnalysisBase {
  kind: 'means';
  claim: MeansClaim;
  focus?: MeanSummary;
  against?: MeanSummary;
  relation: 'separate' | 'focus-inside' | 'against-inside';
  /** Difference focus - against in scale points, with the t interval (Welch or Student). */
  difference?: { value: number; interval: Interval };
  /** Lowest and highest answer code in the source. */
  scale?: [number, number];
  /** Rank test only: probability that a focus answer exceeds an against answer (ties count half). */
  superiority?: number;
  /** Smallest difference in mean scores (scale points) detectable with 80% power (src/stats/power-two-means.ts). */
  detectable?: number;
  /**
   * The other family of test on the same answers, in the claim's direction, as a check: Mann–Whitney beside a t test,
   * Welch's t test beside Mann–Whitney. The words say when the two disagree about the verdict.
   */
  check?: { method: 'mann-whitney' | 'welch-t'; test: TestResult };
  /** Cohen's d: difference in means over the pooled standard deviation. */
  cohensD?: number;
  /** Cohen's d's two-sided interval at the claim's confidence (noncentral t inversion, src/stats/cohens-d-interval.ts). */
  cohensDInterval?: Interval;
}

/** Claim kind "equivalence": two rates within a margin of each other. */
export interface EquivalenceAnalysis extends AnalysisBase {
  kind: 'equivalence';
  claim: EquivalenceClaim;
  focus?: RateSummary;
  against?: RateSummary;
  relation: 'separate' | 'focus-inside' | 'against-inside';
  /** Difference focus - against with the Newcombe interval at the claim's confidence. */
  difference?: { value: number; interval: Interval };
  /** The TOST (Wald) interval at 1 - 2 alpha; equivalence holds when it lies inside ± margin. */
  equivalenceInterval?: Interval;
  /** True when the Newcombe interval lies entirely beyond + margin or - margin: clearly different. */
  beyondMargin?: boolean;
  /** Lowest response rate among the two, where eligible is known. */
  responseRate?: number;
}

/** Claim kind "change": the same selection in an earlier and a later period. */
export interface ChangeAnalysis extends AnalysisBase {
  kind: 'change';
  claim: ChangeClaim;
  /** The source's period column. */
  periodColumn: string;
  /** The two periods compared, as the data write them (relative words resolved). */
  periods: { from: string; to: string };
  /** The later period's rate (the claim's `to`). */
  later?: RateSummary;
  /** The earlier period's rate (the claim's `from`). */
  earlier?: RateSummary;
  /** Change later - earlier, with the Newcombe interval. */
  difference?: { value: number; interval: Interval };
  cohensH?: number;
  /** Smallest change (proportion units) detectable with 80% power at these sample sizes. */
  detectable?: number;
  responseRate?: number;
}

/** One period of a gap-change claim: the two selections' rates and the gap focus - against with Newcombe's interval. */
export interface GapInPeriod {
  focus: RateSummary;
  against: RateSummary;
  /** focus rate - against rate. */
  gap: number;
  interval: Interval;
}

/** A change claim with focus and against: the gap between two selections in an earlier and a later period. */
export interface GapChangeAnalysis extends AnalysisBase {
  kind: 'gap-change';
  claim: GapChangeClaim;
  /** The source's period column. */
  periodColumn: string;
  /** The two periods, as the data write them (relative words resolved). */
  periods: { from: string; to: string };
  /** How the two selections relate in the data (in the later period). */
  relation: 'separate' | 'focus-inside' | 'against-inside';
  earlier?: GapInPeriod;
  later?: GapInPeriod;
  /** The change in the gap, later gap - earlier gap, with the MOVER-Wilson interval. */
  difference?: { value: number; interval: Interval };
  /** The change in the gap's size, |later gap| - |earlier gap| (negative: narrowed). */
  sizeChange?: number;
  /**
   * A claim that the gap narrowed or widened: the two one-sided z tests of the intersection–union test that decide
   * its p-value (the change in the gap, then the sum of the two gaps; src/stats/difference-of-differences.ts).
   */
  sizeTests?: [GapSizeComponent, GapSizeComponent];
  /** Smallest change in the gap (proportion units) detectable with 80% power (src/stats/power-gap-change.ts). */
  detectable?: number;
  responseRate?: number;
}

/** Claim kind "trend": the agreement rate over three or more ordered periods. */
export interface TrendAnalysis extends AnalysisBase {
  kind: 'trend';
  claim: TrendClaim;
  /** The source's period column. */
  periodColumn: string;
  /** The periods, oldest first (relative words resolved). */
  periods: string[];
  /** One rate per period, same order, labelled with the period. */
  rates?: RateSummary[];
  /** Fitted change in the rate per period (slope of the Cochran–Armitage line, scores 0..k-1). */
  slope?: number;
  /** Fitted rate per period, same order. */
  fitted?: number[];
  /**
   * Chi-square for departure from the straight line (Pearson's chi-square over the periods minus the trend's, on
   * k - 2 df), with the overall chi-square it came from: a small p says the line does not describe the periods.
   */
  departure?: { statistic: number; df: number; p: number; overall: number };
  /** Smallest steady change per period detectable with 80% power. */
  detectable?: number;
  responseRate?: number;
}

/** Claim kind "target": a selection's rate against a fixed value. */
export interface TargetAnalysis extends AnalysisBase {
  kind: 'target';
  claim: TargetClaim;
  rate?: RateSummary;
  /** Rate - target, with the rate's Wilson interval shifted by the target. */
  difference?: { value: number; interval: Interval };
  /** Smallest gap from the target (proportion units) detectable with 80% power, in the claimed direction. */
  detectable?: number;
  responseRate?: number;
  /** With the exact binomial test: the rate's two-sided Clopper–Pearson interval at the claim's confidence. */
  exactInterval?: Interval;
}

/** Claim kind "estimate": one selection's rate or mean score with its margin of error; no test. */
export interface EstimateAnalysis extends AnalysisBase {
  kind: 'estimate';
  claim: EstimateClaim;
  /** measure agree: the rate with its Wilson interval. */
  rate?: RateSummary;
  /** measure mean: the mean score with its t interval. */
  mean?: { label: string; n: number; mean: number; sd: number; interval: Interval };
  /** measure column: the respondent-weighted mean of a numeric column (no interval: the data hold no spread). */
  value?: { label: string; column: string; value: number; n: number };
  responseRate?: number;
}

/** A rank claim's comparison of the focus with one rival unit. */
export interface RivalResult {
  rival: RateSummary;
  /** The one-sided test of the focus against this rival, in the claimed direction. */
  test: TestResult;
  /** The same test the other way (one-sided). */
  pOpposite: number;
  /** The p-value as the intersection–union test used it (doubled when the claim is two-sided). */
  p?: number;
  /** Focus minus rival, with Newcombe's interval at the claim's confidence. */
  difference: { value: number; interval: Interval };
  methods: string[];
}

/** Claim kind "rank": one unit the highest (or lowest) of the units under where. */
export interface RankAnalysis extends AnalysisBase {
  kind: 'rank';
  claim: RankClaim;
  /** The column whose values are the units, and how many units where selects (the focus included). */
  unitColumn: string;
  unitCount: number;
  focus?: RateSummary;
  /** Each rival tested, the closest (smallest lead) first. */
  rivals?: RivalResult[];
  /** The rival whose rate is nearest the focus's. */
  closest?: RivalResult;
  /** Every tested unit's rate, the focus among them, in the claimed order (highest first for highest). */
  units?: RateSummary[];
  /** Rivals with too few respondents to test (names only, never counts): the claim cannot be shown while any remain. */
  suppressedUnits: string[];
  /** Focus minus the closest rival, with Newcombe's interval. */
  difference?: { value: number; interval: Interval };
  /** Smallest lead over the closest rival (proportion units) detectable with 80% power in that pair. */
  detectable?: number;
  responseRate?: number;
}

/** An every claim's test of one unit against the value. */
export interface UnitTest {
  rate: RateSummary;
  /** One-sided test of the unit's rate against the value, in the claimed direction. */
  test: TestResult;
  /** The same test the other way (one-sided). */
  pOpposite: number;
  /** The p-value as the intersection–union test used it (doubled when the claim is two-sided). */
  p?: number;
  /** Rate minus the value, with the rate's interval shifted by the value. */
  difference: { value: number; interval: Interval };
  exact: boolean;
}

/** Claim kind "every": each unit under where on one side of a fixed value. */
export interface EveryAnalysis extends AnalysisBase {
  kind: 'every';
  claim: EveryClaim;
  /** The column whose values are the units, and how many units where selects. */
  unitColumn: string;
  unitCount: number;
  /** Each unit tested, the one with the smallest gap in the claimed direction first. */
  tests?: UnitTest[];
  /** The unit with the smallest gap in the claimed direction (nearest the wrong side of the value, or past it). */
  nearest?: UnitTest;
  /** Units with too few respondents to test (names only): the claim about every unit cannot be shown while any remain. */
  suppressedUnits: string[];
  /** The nearest unit's rate minus the value, with its interval. */
  difference?: { value: number; interval: Interval };
  /** The largest of the units' smallest detectable gaps from the value (80% power), and whose it is. */
  detectable?: number;
  detectableUnit?: string;
  responseRate?: number;
}

export type Analysis = CompareAnalysis | AssociationAnalysis | CrosstabAnalysis | MeansAnalysis | EquivalenceAnalysis | ChangeAnalysis | GapChangeAnalysis | TrendAnalysis | TargetAnalysis | EstimateAnalysis | RankAnalysis | EveryAnalysis;

/** Pack-wide settings a claim's analysis needs. */
export interface AnalysisSettings {
  minRespondents: number;
  /** Period column per source id, where the claims file names one (for change, trend and relative periods). */
  periodColumns?: Record<string, string>;
  /**
   * False when the caller has no use for a compare or change claim's smallest detectable difference at
   * 1 − confidence: the build works it out again at the threshold that decided the verdict (atThreshold in
   * detectable.ts), and an analysis at another level only for its verdict needs none. Default true.
   */
  detectable?: boolean;
}

export type AnalysisFor<C extends Claim> = C extends CompareClaim ? CompareAnalysis : AssociationAnalysis;
