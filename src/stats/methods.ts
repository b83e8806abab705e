/**
 * What each method is, what it assumes and where it is published. The pack's method notes are generated from this
 * table for the methods a build actually used, so what the pack says is what the code did. Keys are the `method`
 * names that the functions in src/stats/ put in their results.
 */

export interface MethodInfo {
  name: string;
  /** What it does and what it assumes, in plain words. */
  text: string;
  /** Published source. */
  source: string;
}

export const METHODS: Record<string, MethodInfo> = {
  wilson: {
    name: 'Wilson score interval',
    text: 'An interval for a single rate that stays inside 0% to 100% and behaves well for small groups and rates near the extremes. It assumes respondents are independent and like a random sample of the people they stand for.',
    source: 'Wilson, E. B. (1927). Probable inference, the law of succession, and statistical inference. Journal of the American Statistical Association 22, 209–212.',
  },
  'wilson-fpc': {
    name: 'Wilson score interval with finite-population correction',
    text: 'Where the number eligible is known, the variance is multiplied by (N − n)/(N − 1), so that the interval narrows as the share of the cohort that answered grows and vanishes when everyone answered. It still assumes those who answered are like those who did not.',
    source: 'Wilson (1927); finite-population correction as in Cochran, W. G. (1977). Sampling Techniques, 3rd ed., Wiley, ch. 3.',
  },
  'two-proportion-z': {
    name: 'Two-proportion z test (pooled)',
    text: 'Tests whether two agreement rates differ, using the pooled rate under the null hypothesis. It assumes the two groups are separate, respondents are independent, and each group has at least about five agreeing and five not agreeing.',
    source: 'Agresti, A. (2013). Categorical Data Analysis, 3rd ed., Wiley, section 3.1 (equivalent to the Pearson chi-square test on a 2×2 table).',
  },
  'fisher-exact-2x2': {
    name: "Fisher's exact test",
    text: 'Used in place of the z test when an expected count is below 5. It computes the probability of the observed table and more extreme ones given the totals, so it needs no large-sample approximation.',
    source: 'Fisher, R. A. (1935). The logic of inductive inference. Journal of the Royal Statistical Society 98, 39–82.',
  },
  'newcombe-hybrid': {
    name: 'Newcombe hybrid score interval',
    text: 'An interval for the difference between two independent rates, built from the two Wilson intervals. It keeps close to its stated coverage even for small groups and extreme rates.',
    source: 'Newcombe, R. G. (1998). Interval estimation for the difference between independent proportions: comparison of eleven methods. Statistics in Medicine 17, 873–890 (method 10).',
  },
  'power-two-proportions': {
    name: 'Smallest detectable difference',
    text: 'The smallest difference between two rates that a test of this kind, with these group sizes, would find 80% of the time. It tells how large a difference a claim that is not supported could still hide.',
    source: 'Fleiss, J. L., Levin, B. and Paik, M. C. (2003). Statistical Methods for Rates and Proportions, 3rd ed., Wiley, ch. 4.',
  },
  pearson: {
    name: 'Pearson correlation',
    text: 'Measures how closely two measures follow a straight line across units, with a t test of zero correlation and an interval from Fisher’s z transformation. It assumes a roughly linear relationship and is sensitive to single unusual units.',
    source: 'Fisher, R. A. (1921). On the "probable error" of a coefficient of correlation deduced from a small sample. Metron 1, 3–32.',
  },
  'least-squares': {
    name: 'Least-squares line',
    text: 'The straight line that best fits the points, drawn on the chart to show the direction and size of the association.',
    source: 'Draper, N. R. and Smith, H. (1998). Applied Regression Analysis, 3rd ed., Wiley, ch. 1.',
  },
  'power-correlation': {
    name: 'Smallest detectable correlation',
    text: 'The weakest correlation that a test with this number of units would find 80% of the time, from the Fisher z approximation.',
    source: 'Cohen, J. (1988). Statistical Power Analysis for the Behavioral Sciences, 2nd ed., Erlbaum, ch. 3.',
  },
  holm: {
    name: "Holm's step-down adjustment",
    text: 'Adjusts the p-values of all claims tested together so that the chance of any false finding in the pack stays within the stated level, without assuming how the claims relate to each other.',
    source: 'Holm, S. (1979). A simple sequentially rejective multiple test procedure. Scandinavian Journal of Statistics 6, 65–70.',
  },
  'benjamini-hochberg': {
    name: 'Benjamini–Hochberg adjustment',
    text: 'Adjusts the p-values so that, on average, the share of supported claims that are false findings stays within the stated level. It is less strict than Holm and suits long lists of claims.',
    source: 'Benjamini, Y. and Hochberg, Y. (1995). Controlling the false discovery rate. Journal of the Royal Statistical Society B 57, 289–300.',
  },
};

export function methodInfo(id: string): MethodInfo {
  const info = METHODS[id];
  if (!info) throw new Error(`no method notes for "${id}": add an entry to src/stats/methods.ts`);
  return info;
}
