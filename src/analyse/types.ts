/**
 * What testing one claim produces, before any words are chosen. One interface per claim kind; the verdict is derived
 * afterwards (src/verdicts/decide.ts) from the adjusted p-value, the claim's direction and its confidence level.
 */
import type { AssociationClaim, Claim, CompareClaim } from '../claims/types.js';
import type { Interval, TestResult } from '../stats/result.js';

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
}

export interface AssociationAnalysis extends AnalysisBase {
  kind: 'association';
  claim: AssociationClaim;
  points: UnitPoint[];
  /** Units left out because a measure had fewer respondents than the minimum (names only, never counts). */
  suppressedUnits: string[];
  fit?: { intercept: number; slope: number; rSquared: number };
  /** Smallest |r| detectable with 80% power at this number of units. */
  detectable?: number;
  /** Total respondents behind each measure. */
  totals?: { x: number; y: number };
}

export type Analysis = CompareAnalysis | AssociationAnalysis;

/** Pack-wide settings a claim's analysis needs. */
export interface AnalysisSettings {
  minRespondents: number;
}

export type AnalysisFor<C extends Claim> = C extends CompareClaim ? CompareAnalysis : AssociationAnalysis;
