/**
 * What the renderer draws: a document model with every sentence already written (from templates/) and every number
 * already formatted. The renderer decides layout only; it never computes statistics or chooses words.
 */

/** 'estimate' is for claims that test no hypothesis (a plain estimate with its margin of error). */
export type VerdictKind = 'supported' | 'not-supported' | 'opposite' | 'too-little-data' | 'estimate';

/**
 * Which kind of "not supported" a result is, where the data allow the split (a difference or correlation with an
 * interval): 'inconclusive' when the interval holds both no difference and a difference worth reporting;
 * 'ruled-out' when the interval excludes a difference worth reporting in the claimed direction(s); 'too-small' when
 * the difference is real and in the claimed direction but below the claim's smallest difference that matters.
 * Absent for other verdicts and for kinds with no interval to judge by (crosstab, trend).
 */
export type NotSupportedAs = 'inconclusive' | 'ruled-out' | 'too-small';

/**
 * What the summary advises doing with a claim: 'quote' as written; 'quote-with-interval' (an estimate: quote the
 * figure with its margin); 'reword' to what the data support (`wording` holds a suggestion); 'drop' it; or
 * 'must-not-make' (the data point the other way). Drawn first and with weight: 'must-not-make'.
 */
export type ClaimAction = 'quote' | 'quote-with-interval' | 'reword' | 'drop' | 'must-not-make';

export interface ClaimAdvice {
  action: ClaimAction;
  /** The action in words, e.g. "Quote as written", "Reword", "Drop", "Must not make". */
  label: string;
  /** One or two sentences saying why, e.g. "The interval rules out a gap of 5.7 points or more." */
  reason: string;
  /** A wording the data support, ready to quote ('reword' and 'quote-with-interval'; sometimes 'drop'). */
  wording?: string;
}

/** Another claim in the pack tested on the same data (e.g. "the campuses differ" and "equally reachable"). */
export interface LinkedClaim {
  id: string;
  verdictLabel: string;
  /** One sentence saying how the two relate, e.g. "Tests the same two campuses on the same question: Supported". */
  text: string;
}

/** Data for one chart; the renderer turns it into a Vega-Lite spec, then SVG, then PDF vectors. */
export type ChartData =
  | {
      kind: 'rates';
      /** One bar (a dot with its interval) per selection, in this order. Rates are fractions 0..1. */
      bars: Array<{ label: string; rate: number; lower: number; upper: number; n: number }>;
      /** Axis title, e.g. "Agreeing (%)". */
      axisTitle: string;
      /** Decimals of the rate printed beside each bar: the claim's own precision for these rates (src/format/numbers.ts). */
      digits?: number;
      /** Optional reference line (a target), as a fraction. */
      reference?: { value: number; label: string };
      /** The label of a bar to mark (a rank claim's unit): drawn in the second colour, its label in bold. */
      highlight?: string;      /** The axis range, common to the pack (see withCommonShareRange in charts.ts); fitted to this chart when absent. */
      domain?: [number, number];
    }
  | {
      kind: 'scatter';
      points: Array<{ label: string; x: number; y: number; n: number }>;
      xTitle: string;
      yTitle: string;
      /** Least-squares line y = intercept + slope * x, drawn across the range of x. */
      fit?: { intercept: number; slope: number };
      /** Text shown in a corner, e.g. "r = 0.41". */
      note?: string;
      /** True when x and y are fractions to show as percentages. */
      percent: boolean;
    }
  | {
      /** A rate per period, oldest first, with an interval band; optional fitted trend line. */
      kind: 'periods';
      points: Array<{ period: string; rate: number; lower: number; upper: number; n: number }>;
      axisTitle: string;
      /** Fitted rate per period (same order), drawn as a line. */
      fit?: number[];      /** The axis range, common to the pack (see withCommonShareRange in charts.ts); fitted to this chart when absent. */
      domain?: [number, number];
    }
  | {
      /** Stacked bars, one per row of a table, split into parts (e.g. agreeing / not agreeing). Shares computed by the renderer. */
      kind: 'stacked';
      rows: Array<{ label: string; parts: Array<{ label: string; count: number }> }>;
      axisTitle: string;
    }
  | {
      /** Mean scores as dots with interval bars, on the answer scale. */
      kind: 'means';
      bars: Array<{ label: string; mean: number; lower: number; upper: number; n: number }>;
      axisTitle: string;
      /** Axis range, e.g. [1, 5]. */
      domain: [number, number];
    }
  | {
      /** One difference (fraction) with its interval against a band of ± margin (equivalence). */
      kind: 'difference';
      value: number;
      lower: number;
      upper: number;
      margin: number;
      axisTitle: string;
      /** What the interval is, for the chart's key, e.g. "90% interval (1 − 2α)"; "interval" when absent. */
      intervalLabel?: string;
    };

export interface Chart {
  data: ChartData;
  /** Alt text: one generated sentence saying what the chart shows. */
  alt: string;
}

export interface NumberRow {
  label: string;
  value: string;
}

/**
 * The verdict at 90%, 95% and 99% confidence, with and without the adjustment for many claims (src/verdicts/stability.ts):
 * drawn as one compact row on the claim's page. Absent for claims that test no hypothesis or were not tested.
 */
export interface VerdictStability {
  /** Three cells, at 90%, 95% and 99% in that order. */
  cells: Array<{
    /** e.g. "95%". */
    level: string;
    /** True for the claim's own confidence level (the verdict the pack gives). */
    own: boolean;
    /** The verdict with the pack's adjustment for many claims, and its word (e.g. "Supported"). */
    adjusted: VerdictKind;
    adjustedLabel: string;
    /** The verdict on the claim's own p-value, without adjustment, and its word. */
    unadjusted: VerdictKind;
    unadjustedLabel: string;
  }>;
  /** False when no adjustment applies (adjust: none, or one claim tested): draw the adjusted verdicts only. */
  adjustmentApplies: boolean;
  /** True when the verdict (with the pack's adjustment) is not the same at all three levels. */
  dependsOnLevel: boolean;
  /** True when adjusting for many claims changes the verdict at some level. */
  dependsOnAdjustment: boolean;
  /** Row heading, e.g. "Verdict at other confidence levels". */
  heading: string;
  /** Row labels for the two lines, e.g. "Adjusted for 13 claims" and "Not adjusted". */
  adjustedLabel: string;
  unadjustedLabel: string;
  /** The whole row in one sentence (for the text layer, alt text and results), e.g. "Supported at 90% and 95%, not supported at 99% (adjusted for 13 claims); ...". */
  text: string;
}

export interface ClaimSection {
  id: string;
  /** The claim in the user's words. */
  statement: string;
  verdict: VerdictKind;
  /** Word for the verdict, e.g. "Supported". */
  verdictLabel: string;
  /** What was compared and how many answered, one sentence. */
  compared: string;
  hypotheses: { null: string; alternative: string };
  /** The numbers table: rates or r with intervals, difference, statistic, p raw and adjusted. */
  numbers: NumberRow[];
  chart?: Chart;
  /** The verdict paragraph. */
  verdictText: string;
  cautions: string[];
  /** One line naming the method, e.g. "Two-proportion z test (pooled); Wilson and Newcombe intervals." */
  methodLine: string;
  /** The verdict at 90, 95 and 99% confidence, with and without adjustment; absent for estimates and untested claims. */
  stability?: VerdictStability;
  /** The verdict refined for 'not-supported' (see NotSupportedAs); absent otherwise. */
  verdictDetail?: NotSupportedAs;
  /**
   * What to do with the claim (quote, reword, drop, must not make), with a suggested wording where one fits. The
   * pipeline always sets it; optional only so that hand-built models (renderer tests) may leave it out.
   */
  advice?: ClaimAdvice;
  /** Other claims tested on the same data, to read together (the first few: see LINKED_SHOWN). */
  linked?: LinkedClaim[];
  /** How many more claims test the same data than `linked` names, and the sentence that says so. */
  linkedMore?: { count: number; text: string };
  /**
   * Where the data came from, one sentence: the source's name, whether it is an independent release or the
   * organisation's own survey (or that this is not stated), and the response rate or that it is unknown.
   */
  sourceLine?: string;
  /**
   * Terms of the trade that appear for the first time in the pack on this page, each with a plain explanation
   * (also in the glossary), e.g. { term: "Cohen's h", text: "..." }. Drawn near the numbers table.
   */
  terms?: Array<{ term: string; text: string }>;
  /**
   * A notice to show prominently beside the claim, e.g. that the claim was edited after an earlier pack showed its
   * results (weaker evidence), or that its verdict changed since the previous pack.
   */
  notices?: string[];
}

/** "What changed since <date>": the comparison with the previous pack of the same claims file. */
export interface ChangeSection {
  /** e.g. "What changed since 3 March 2025". */
  heading: string;
  /** One or two sentences: which pack this is compared with and what changed overall. */
  intro: string;
  /** Verdicts that changed: claim, before, after, and why (new data, changed claim, changed threshold). */
  verdicts: Array<{ claim: string; before: string; after: string; why: string }>;
  /** Other changes, one sentence each: estimates that moved beyond their intervals, claims added or removed,
   * claims that became testable or untestable, data files whose fingerprint changed. */
  notes: string[];
}

export interface SummaryRow {
  id: string;
  statement: string;
  verdict: VerdictKind;
  verdictLabel: string;
  /** e.g. "61% vs 67%, gap −6 points (−9 to −3)". */
  keyFigure: string;
  /** The confidence level of the interval in the key figure, e.g. "95%" ("90%" for an equivalence claim at 95%). */
  intervalLevel?: string;
  /** True when the verdict would differ at 90%, 95% or 99% confidence: the summary marks such claims. */
  dependsOnLevel?: boolean;
  /**
   * True when the claim's own words and its fields disagree (the page's first caution says how): the summary marks
   * such claims, so that a reader of the summary alone is not told to quote words the verdict does not answer.
   */
  wordsDisagree?: boolean;
  /** The verdict refined for 'not-supported' (see NotSupportedAs); absent otherwise. */
  verdictDetail?: NotSupportedAs;
  /**
   * What to do with the claim (quote, reword, drop, must not make), with a suggested wording where one fits. The
   * pipeline always sets it; optional only so that hand-built models (renderer tests) may leave it out.
   */
  advice?: ClaimAdvice;
  /** Other claims tested on the same data, to read together. */
  linked?: LinkedClaim[];
}

export interface PackModel {
  title: string;
  organisation: string;
  description?: string;
  /** The date shown on the cover (from the claims file or an option; never the clock, so builds are repeatable). */
  date: string;
  /** e.g. "95% (two-sided unless a claim says otherwise)". */
  confidenceText: string;
  /** e.g. "Holm's method across the 9 claims tested". */
  adjustmentText: string;
  sources: Array<{
    id: string;
    file: string;
    description: string;
    rows: number;
    sha256: string;
    /** The survey's name where the claims file gives one (source `title`), e.g. "Lanternfield Student Opinion Survey 2026". */
    title?: string;
    /** "an independent release", "the organisation's own survey", or absent when the claims file does not say. */
    origin?: string;
    /** The periods (years) the file holds, oldest first, where the source names its period column. */
    periods?: string[];
    /** Respondents in words for the cover, e.g. "2,229 in 2025 and 2,218 in 2026 (the most answering any one question)". */
    respondentsText?: string;
    /** How the source's table was read (rows taken as notes, suppressed rows, footnote markers), one sentence each. */
    notes?: string[];
  }>;
  /**
   * Every verdict word the pack may use, with its meaning, for the summary page (in this order: the words that tell a
   * reader not to make a claim first). `label` matches a ClaimSection's verdictLabel.
   */
  verdictDefinitions?: Array<{ label: string; text: string }>;
  /** Every action word the summary may advise (ClaimAdvice.label), with its meaning. */
  actionDefinitions?: Array<{ label: string; text: string }>;
  /**
   * What the pack can prove about when the claims were written: "These 15 claims were sealed on 12 February 2026, before
   * the data file dated 3 March 2026; ..." or that it cannot confirm it (no seal). Also the summary intro's first sentence.
   */
  sealText?: string;
  /** A short paragraph under the summary table: how to read it and the overall cautions. */
  summaryIntro: string;
  /**
   * The summary's marks on a claim's row and the note each refers to (under the claims table), for the marks the
   * summary uses, e.g. { wordsDisagree: { mark: "Words and test disagree*", note: "* The claim's own words ..." } }.
   */
  summaryMarks?: { wordsDisagree?: { mark: string; note: string } };
  summary: SummaryRow[];
  claims: ClaimSection[];
  /** Method notes: one entry per method used, with what it assumes and its published source. */
  methods: Array<{ name: string; text: string; source: string }>;
  /** Glossary in plain words. */
  glossary: Array<{ term: string; text: string }>;
  /** Reproducibility: tool version, command, file fingerprints. */
  reproducibility: NumberRow[];
  /** General cautions that apply to the whole pack (response rates, cohorts, causation, local policy). */
  generalCautions: string[];
  /** Present when an earlier pack of the same claims file was found: drawn after the summary. */
  changes?: ChangeSection;
}
