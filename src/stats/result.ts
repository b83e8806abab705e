/**
 * The one result shape every statistical method returns. A method reports what it computed; the decision
 * (supported or not) is derived later from the p-value, the claim and its confidence level (src/verdicts), and the
 * wording lives in templates/. Nothing here formats numbers for people.
 */

/** The alternative hypothesis, as in R: 'less' means the first estimate is below the second (or below the null value). */
export type Alternative = 'two-sided' | 'less' | 'greater';

/** How many tails a power calculation counts: an alternative's sidedness without its direction (see `sidedOf`). */
export type Sided = 'two-sided' | 'one-sided';

/** The sidedness of an alternative hypothesis. */
export function sidedOf(alternative: Alternative): Sided {
  return alternative === 'two-sided' ? 'two-sided' : 'one-sided';
}

/**
 * The settings every power and detectable-effect function takes, by name: the significance level the test is held
 * to, the power wanted (for a detectable effect), and whether the test is two-sided.
 */
export interface PowerSettings {
  /** Significance level, e.g. 0.05 (default 0.05). */
  alpha?: number;
  /** Power wanted, e.g. 0.8 (default 0.8); for the smallest detectable effect only. */
  power?: number;
  /** Default 'two-sided'. */
  sided?: Sided;
}

export interface Interval {
  lower: number;
  upper: number;
  /** Confidence level, e.g. 0.95. */
  level: number;
  /** Machine name of the interval method, e.g. 'wilson', 'newcombe-hybrid', 'fisher-z'. */
  method: string;
}

export interface Estimate {
  /** What the number is, e.g. 'difference in proportions', 'Pearson r'. */
  name: string;
  value: number;
}

export interface TestResult {
  /** Machine name of the method, e.g. 'two-proportion-z'. Matches an entry in src/stats/methods.ts. */
  method: string;
  /** The test statistic with its usual symbol (z, t, X², U...). */
  statistic?: { symbol: string; value: number };
  /** Degrees of freedom where the reference distribution has them (one number, or two for F). */
  df?: number | [number, number];
  /** p-value for the stated alternative. */
  p: number;
  alternative: Alternative;
  /** Value of the parameter under the null hypothesis (0 for a difference, or a target rate). */
  nullValue: number;
  estimate: Estimate;
  interval?: Interval;
  /** Sample sizes in the order the inputs were given. */
  n: number[];
  /** Conditions a reader should know, e.g. 'an expected count is below 5'. Plain sentences. */
  warnings: string[];
}

/** A single rate with its interval (no test). */
export interface RateEstimate {
  /** Agreeing count (may be non-integer only when derived from a rounded percentage; callers round first). */
  x: number;
  n: number;
  p: number;
  interval: Interval;
}
