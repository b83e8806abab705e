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
  /**
   * The text for a pack in which no adjustment for many claims was made (adjust: none, or one claim tested), where
   * `text` speaks of that adjustment.
   */
  unadjusted?: string;
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
  'finite-population-correction': {
    name: 'Finite-population correction',
    text: 'Where the number eligible (N) is known and most of a small cohort answered, each rate’s variance is multiplied by (N − n)/(N − 1). warrant applies it to every figure of a claim (the test, each rate’s interval, the interval for the difference and the smallest detectable difference, each group counting as n divided by that factor) or to none, and the claim’s numbers say which. It assumes those who answered are like those who did not; a low response rate is a caution no correction removes.',
    source: 'Cochran, W. G. (1977). Sampling Techniques, 3rd ed., Wiley, §2.6 and §3.3.',
  },
  'two-proportion-z-fpc': {
    name: 'Two-proportion z test with the finite-population correction',
    text: 'The pooled two-proportion z test with each group’s variance multiplied by (N − n)/(N − 1).',
    source: 'Fleiss, J. L., Levin, B. and Paik, M. C. (2003). Statistical Methods for Rates and Proportions, 3rd ed., §2.5; correction as in Cochran (1977), Sampling Techniques, §3.3.',
  },
  'one-sample-score-fpc': {
    name: 'Score test against a fixed value with the finite-population correction',
    text: 'The score test of a rate against a fixed value, its variance multiplied by (N − n)/(N − 1).',
    source: 'Wilson (1927); correction as in Cochran, W. G. (1977). Sampling Techniques, 3rd ed., §3.3.',
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
  'difference-of-differences-z': {
    name: 'z test of a change in a gap',
    text: 'Tests whether the gap between two groups’ rates changed from one period to another: the later gap minus the earlier one, over its standard error from the four groups’ own variances (each period answered by a different cohort, so the four rates are independent samples). A large-sample test: it needs each group to have at least about five agreeing and five not agreeing.',
    source: 'Agresti, A. (2013). Categorical Data Analysis, 3rd ed., Wiley, §3.1, the standard error of a difference of independent proportions, here summed over two differences.',
  },
  'mover-wilson': {
    name: 'Hybrid score interval for a change in a gap',
    text: 'An interval for the change in the gap between two groups, built from the four Wilson intervals as Newcombe’s interval is built from two (the method of variance estimates recovery). It keeps close to its stated coverage for small groups and rates near 0% or 100%, where the plain Wald interval does not.',
    source: 'Zou, G. Y. and Donner, A. (2008). Construction of confidence limits about effect measures: a general approach. Statistics in Medicine 27, 1693–1702; Newcombe, R. G. (1998). Statistics in Medicine 17, 873–890 (method 10).',
  },
  'rank-iut': {
    name: 'Test that one unit is the highest (or lowest)',
    text: 'A unit is shown highest only if it is shown higher than each other unit: one one-sided two-proportion test against every rival, all of which must find the difference at the claim’s level (an intersection–union test). The claim’s p-value is the largest of them, so the weakest comparison decides, and no further correction is needed within the claim; it is that one p-value that the adjustment for many claims sees. A rival with too few respondents to test leaves the claim unshown. Not being shown highest is not evidence that another unit is.',
    source: 'Berger, R. L. (1982). Multiparameter hypothesis testing and acceptance sampling. Technometrics 24, 295–300; Berger, R. L. and Hsu, J. C. (1996). Bioequivalence trials, intersection–union tests and equivalence confidence sets. Statistical Science 11, 283–319.',
  },
  'every-iut': {
    name: 'Test that every unit is above (or below) a value',
    text: 'Every unit is shown above the value only if each unit is shown above it: one one-sided test of each unit’s rate against the value (the score test, or the exact binomial test for a small unit), all of which must find it at the claim’s level (an intersection–union test). The claim’s p-value is the largest of them, so the weakest unit decides, and no further correction is needed within the claim; it is that one p-value that the adjustment for many claims sees. A unit with too few respondents to test leaves the claim unshown. Not being shown above the value is not evidence that a unit is below it.',
    source: 'Berger, R. L. (1982). Multiparameter hypothesis testing and acceptance sampling. Technometrics 24, 295–300; Berger, R. L. and Hsu, J. C. (1996). Statistical Science 11, 283–319.',
  },
  'gap-size-iut': {
    name: 'Test that a gap narrowed or widened',
    text: 'A gap narrowed when the later gap is closer to zero than the earlier one, whichever group is ahead. That is tested as two z tests that must both find their way: the change in the gap points back towards zero, and the later gap has not crossed beyond the earlier gap’s size on the other side (for widened: the change points away from zero on the side the later gap is on). Each is held to the two-sided threshold, because which group is ahead is read from the data, so the test keeps its stated level even when the earlier gap is near zero.',
    source: 'Berger, R. L. (1982). Multiparameter hypothesis testing and acceptance sampling. Technometrics 24, 295–300 (the intersection–union test); Berger, R. L. and Hsu, J. C. (1996). Statistical Science 11, 283–319.',
  },
  'power-gap-change': {
    name: 'Smallest detectable change in a gap',
    text: 'The smallest change in the gap between two groups that the z test, with these four groups’ sizes and rates, would find 80% of the time, at the threshold that actually decided the verdict: the sum of the normal quantiles for the threshold and for 80% power, times the standard error of the change. For a claim that the gap narrowed or widened it is the change the first of its two tests would find; the second (that the later gap did not cross to the other side by as much) can ask for more.',
    source: 'Cohen, J. (1988). Statistical Power Analysis for the Behavioral Sciences, 2nd ed., Erlbaum, ch. 12 (the normal-approximation power of a z test; cited from memory); the standard error held at the observed rates (common practice).',
  },
  'power-two-proportions': {
    name: 'Smallest detectable difference',
    text: 'The smallest difference between two rates that a test of this kind, with these group sizes, would find 80% of the time, at the threshold that actually decided the verdict (after the adjustment for many claims, the threshold each claim was held to is smaller than one minus the confidence level, so the detectable difference is larger). It tells how large a difference a claim that is not supported could still hide.',
    unadjusted: 'The smallest difference between two rates that a test of this kind, with these group sizes, would find 80% of the time, at the threshold that decided the verdict: one minus the claim’s confidence level, as no adjustment for many claims was made. It tells how large a difference a claim that is not supported could still hide.',
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
  'partial-line': {
    name: 'Least-squares line after allowing for controls',
    text: 'The straight line through the units’ residuals: each measure less what a straight-line fit on the named controls predicts for the unit. Its slope equals the first measure’s coefficient in a regression of the second on the first and the controls together, and the chart of residuals shows what the partial correlation measures.',
    source: 'Frisch, R. and Waugh, F. V. (1933). Partial time regressions as compared with individual trends. Econometrica 1, 387–401.',
  },
  'power-correlation': {
    name: 'Smallest detectable correlation',
    text: 'The weakest correlation that a test with this number of units would find 80% of the time at the threshold that decided the verdict (after the adjustment for many claims), from the Fisher z approximation.',
    unadjusted: 'The weakest correlation that a test with this number of units would find 80% of the time at the threshold that decided the verdict (one minus the claim’s confidence level, as no adjustment for many claims was made), from the Fisher z approximation.',
    source: 'Cohen, J. (1988). Statistical Power Analysis for the Behavioral Sciences, 2nd ed., Erlbaum, ch. 3.',
  },
  holm: {
    name: "Holm's step-down adjustment",
    text: 'Adjusts the p-values of all claims tested together so that the chance of even one false finding anywhere in the pack is kept at 5% or less at 95% confidence (in general, at one minus the confidence level), without assuming how the claims relate to each other. Each claim is in effect held to a stricter threshold: 0.05 divided by the number of claims not yet settled at its step.',
    source: 'Holm, S. (1979). A simple sequentially rejective multiple test procedure. Scandinavian Journal of Statistics 6, 65–70.',
  },
  'benjamini-hochberg': {
    name: 'Benjamini–Hochberg adjustment',
    text: 'Adjusts the p-values so that, on average, the share of supported claims that are false findings stays within the stated level. It is less strict than Holm and suits long lists of claims.',
    source: 'Benjamini, Y. and Hochberg, Y. (1995). Controlling the false discovery rate. Journal of the Royal Statistical Society B 57, 289–300.',
  },
  'wilson-cc': {
    name: 'Wilson score interval with continuity correction',
    text: 'A slightly wider version of the Wilson interval that allows for the counts being whole numbers; it errs on the side of covering the true rate.',
    source: 'Newcombe, R. G. (1998). Two-sided confidence intervals for the single proportion: comparison of seven methods. Statistics in Medicine 17, 857–872 (method 4).',
  },
  'clopper-pearson': {
    name: 'Clopper–Pearson exact interval',
    text: 'An interval for a single rate built from exact binomial tail probabilities. It never covers less than its stated level and is often wider than it needs to be.',
    source: 'Clopper, C. J. and Pearson, E. S. (1934). The use of confidence or fiducial limits illustrated in the case of the binomial. Biometrika 26, 404–413.',
  },
  'one-sample-score': {
    name: 'Score test against a fixed rate',
    text: 'Tests whether a rate differs from a fixed value such as a target or a published benchmark, using the variance under the null hypothesis. It assumes independent respondents and enough of them for the normal approximation.',
    source: 'Wilson (1927); Agresti, A. (2013). Categorical Data Analysis, 3rd ed., Wiley, section 1.4.',
  },
  'binomial-exact': {
    name: 'Exact binomial test',
    text: 'Tests a rate against a fixed value from exact binomial probabilities, for small groups where the normal approximation is poor.',
    source: 'Clopper and Pearson (1934); two-sided p-value by summing outcomes no more likely than the one seen, as in Agresti (2013), section 1.4.',
  },
  'newcombe-hybrid-fpc': {
    name: 'Newcombe hybrid score interval with finite-population correction',
    text: 'Newcombe’s interval for a difference, built from Wilson intervals that each carry the finite-population correction where the number eligible is known.',
    source: 'Newcombe (1998), method 10; Cochran (1977), ch. 3.',
  },
  wald: {
    name: 'Wald interval for a difference',
    text: 'The textbook interval for a difference of two rates, estimate plus or minus z standard errors. Used here only inside the equivalence test.',
    source: 'Agresti, A. and Caffo, B. (2000). Simple and effective confidence intervals for proportions and differences of proportions. The American Statistician 54, 280–288.',
  },
  'tost-two-proportions': {
    name: 'Two one-sided tests for equivalence',
    text: 'Supports "no real difference" only if the difference is shown to be both above minus the margin and below plus the margin. A test that merely fails to find a difference cannot do this.',
    source: 'Schuirmann, D. J. (1987). A comparison of the two one-sided tests procedure and the power approach for assessing the equivalence of average bioavailability. Journal of Pharmacokinetics and Biopharmaceutics 15, 657–680.',
  },
  'fisher-z': {
    name: 'Fisher z interval for a correlation',
    text: 'An interval for a correlation from the transformation z = atanh(r), whose sampling distribution is close to normal with variance 1/(n − 3).',
    source: 'Fisher (1921).',
  },
  spearman: {
    name: 'Spearman rank correlation',
    text: 'The correlation of the units’ ranks rather than their values: it measures whether two measures rise together at all, not whether they follow a straight line, and is less swayed by one unusual unit.',
    source: 'Spearman, C. (1904). The proof and measurement of association between two things. American Journal of Psychology 15, 72–101.',
  },
  'rank-exact': {
    name: 'Exact p-values for the rank checks',
    text: 'With nine units or fewer and no ties, the p-values of Spearman’s rho and Kendall’s tau are counted exactly over every ordering of the units, as equally likely under no association; the t and normal approximations are far off with so few units.',
    source: 'Kendall, M. G. and Gibbons, J. D. (1990). Rank Correlation Methods, 5th ed., Arnold, ch. 5–6; Best, D. J. and Roberts, D. E. (1975). Algorithm AS 89: the upper tail probabilities of Spearman’s rho. Applied Statistics 24, 377–379.',
  },
  'kendall-tau-b': {
    name: 'Kendall rank correlation (tau-b)',
    text: 'The balance of pairs of units ordered the same way on both measures against pairs ordered the opposite way, corrected for ties.',
    source: 'Kendall, M. G. (1945). The treatment of ties in ranking problems. Biometrika 33, 239–251.',
  },
  'partial-pearson': {
    name: 'Partial correlation',
    text: 'The correlation of two measures after the straight-line effect of the named control variables has been removed from both. It controls only for the variables named, and only for their linear effect.',
    source: 'Fisher, R. A. (1924). The distribution of the partial correlation coefficient. Metron 3, 329–332.',
  },
  'partial-spearman': {
    name: 'Partial Spearman rank correlation',
    text: 'Spearman’s rank correlation after the named controls have been allowed for: every measure is replaced by the units’ ranks, and the straight-line effect of the controls’ ranks is removed from both ranks before they are correlated. Its p-value uses the t approximation on n − 2 − k degrees of freedom (k controls).',
    source: 'Conover, W. J. and Iman, R. L. (1981). Rank transformations as a bridge between parametric and nonparametric statistics. The American Statistician 35, 124–129; Kim, S. (2015). ppcor: an R package for a fast calculation to semi-partial correlation coefficients. Communications for Statistical Applications and Methods 22, 665–674.',
  },
  'partial-kendall': {
    name: 'Kendall partial rank correlation',
    text: 'Kendall’s tau between two measures with one control allowed for, from the three pairwise taus: (τxy − τxz τyz) / √((1 − τxz²)(1 − τyz²)). It is shown as a description only, with no p-value: its sampling distribution is not that of tau and has no standard form. There is no classic formula for several controls, so it is left out when a claim names more than one.',
    source: 'Kendall, M. G. (1942). Partial rank correlation. Biometrika 32, 277–283.',
  },
  'one-way-anova': {
    name: 'One-way analysis of variance',
    text: 'Tests whether the means of several groups are all equal, assuming roughly normal scores with similar spread in each group.',
    source: 'Fisher, R. A. (1925). Statistical Methods for Research Workers, Oliver and Boyd.',
  },
  'chi-square-independence': {
    name: 'Pearson chi-square test of independence',
    text: 'Tests whether two categorical variables are related in a table of counts. It assumes expected counts of at least about 5; adjusted standardized residuals show which cells drive the result, and Cramér’s V gives its strength.',
    source: 'Agresti, A. (2013). Categorical Data Analysis, 3rd ed., Wiley, sections 3.2–3.3.',
  },
  'chi-square-independence-yates': {
    name: 'Chi-square test with Yates’ continuity correction',
    text: 'The chi-square test for a 2×2 table with Yates’ correction, which makes it more cautious for small counts.',
    source: 'Yates, F. (1934). Contingency tables involving small numbers and the χ² test. Supplement to the Journal of the Royal Statistical Society 1, 217–235.',
  },
  'fisher-exact-rxc': {
    name: "Fisher's exact test for larger tables",
    text: 'An exact test of independence for a table with more than two rows or columns, used when expected counts are small.',
    source: 'Mehta, C. R. and Patel, N. R. (1983). A network algorithm for performing Fisher’s exact test in r × c contingency tables. Journal of the American Statistical Association 78, 427–434.',
  },
  'power-trend': {
    name: 'Smallest detectable trend',
    text: 'The smallest steady change per period that the trend test would find 80% of the time with these numbers of respondents, at the threshold that decided the verdict (after the adjustment for many claims), from the normal approximation to the trend statistic with its spread under no trend.',
    unadjusted: 'The smallest steady change per period that the trend test would find 80% of the time with these numbers of respondents, at the threshold that decided the verdict (one minus the claim’s confidence level, as no adjustment for many claims was made), from the normal approximation to the trend statistic with its spread under no trend.',
    source: 'Armitage, P. (1955). Tests for linear trends in proportions and frequencies. Biometrics 11, 375–386.',
  },
  'power-one-proportion': {
    name: 'Smallest detectable gap from a fixed value',
    text: 'The smallest gap between a rate and a fixed value (a target or benchmark) that the test against that value would find 80% of the time with this many respondents, at the threshold that decided the verdict (after the adjustment for many claims).',
    unadjusted: 'The smallest gap between a rate and a fixed value (a target or benchmark) that the test against that value would find 80% of the time with this many respondents, at the threshold that decided the verdict (one minus the claim’s confidence level, as no adjustment for many claims was made).',
    source: 'Lachin, J. M. (1981). Introduction to sample size determination and power analysis for clinical trials. Controlled Clinical Trials 2, 93–113.',
  },
  't-interval-mean': {
    name: 't interval for a mean score',
    text: 'An interval for a mean answer score: the mean plus or minus a t quantile times the standard error. It treats the answer codes as evenly spaced numbers and relies on the mean of many answers being close to normally distributed.',
    source: 'Student (1908). The probable error of a mean. Biometrika 6, 1–25.',
  },
  'cochran-armitage-trend': {
    name: 'Cochran–Armitage test for trend',
    text: 'Tests whether a rate rises or falls steadily across ordered periods, with the fitted change per period. It looks for a straight-line trend and can miss a rise followed by a fall.',
    source: 'Armitage, P. (1955). Tests for linear trends in proportions and frequencies. Biometrics 11, 375–386.',
  },
  'trend-wald': {
    name: 'Interval for the fitted change per period',
    text: 'The fitted change per period plus or minus a normal quantile times the trend test’s own standard error (the spread of the slope at the pooled rate), so the interval leaves out no change exactly when the two-sided trend test finds one at the same level: the interval and the verdict cannot disagree. With every period’s rate near the pooled rate, as in most surveys, this is the usual Wald interval; with some periods near 0% or 100% and others far from them, each period’s own spread would give a somewhat different width.',
    source: 'Armitage, P. (1955). Tests for linear trends in proportions and frequencies. Biometrics 11, 375–386; Miettinen, O. S. (1976). Estimability and estimation in case-referent studies. American Journal of Epidemiology 103, 226–235 (test-based interval).',
  },
  'departure-from-trend': {
    name: 'Chi-square for departure from a straight-line trend',
    text: 'Pearson’s chi-square over the periods minus the trend test’s, on two fewer degrees of freedom than periods: whether the rates stray from the fitted straight line (a rise then a fall) more than chance would explain.',
    source: 'Armitage, P. (1955). Tests for linear trends in proportions and frequencies. Biometrics 11, 375–386.',
  },
  'power-chi-square': {
    name: "Smallest detectable Cramér's V",
    text: 'The weakest relation (as Cramér’s V) that the chi-square test of a table this size would find 80% of the time at the threshold that decided the verdict, from the noncentral chi-square distribution of the test statistic.',
    source: 'Cohen, J. (1988). Statistical Power Analysis for the Behavioral Sciences, 2nd ed., Erlbaum, ch. 7.',
  },
  'power-two-means': {
    name: 'Smallest detectable difference in mean scores',
    text: 'The smallest difference in mean scores that the test would find 80% of the time with these group sizes and spreads, at the threshold that decided the verdict, by the normal approximation to the t test with each group’s own spread.',
    source: 'Cohen, J. (1988). Statistical Power Analysis for the Behavioral Sciences, 2nd ed., Erlbaum, ch. 2.',
  },
  'cohens-d-noncentral-t': {
    name: "Interval for Cohen's d",
    text: 'Cohen’s d is the difference in mean scores divided by the two groups’ pooled standard deviation, so that differences on different scales can be compared (0.2 is conventionally small, 0.5 medium, 0.8 large). Its interval holds the values of d under which the observed t statistic would not be in either tail of its noncentral t distribution. It assumes the two groups have the same spread, as Student’s t test does.',
    source: 'Steiger, J. H. and Fouladi, R. T. (1997). Noncentrality interval estimation and the evaluation of statistical models. In Harlow, Mulaik and Steiger (eds), What If There Were No Significance Tests?, Erlbaum, 221–257.',
  },
  'worth-reporting': {
    name: 'Splitting "not supported"',
    text: 'A claim that is not supported is called inconclusive when its interval holds both no difference and a difference worth reporting, and ruled out when its interval excludes a difference worth reporting in the claimed direction. Worth reporting means the size the claim sets for it (worth_reporting) or its smallest difference that matters; else the margin of an equivalence claim in the pack on the same data; else the size the claims file sets for the measure (worth_reporting); else a default fixed in advance (common practice): 5 percentage points for rates, 0.2 standard deviations (Cohen’s “small” d) for mean scores, a correlation of 0.3 across units. The smallest detectable difference is not used for this: it shrinks with the sample as the interval does, so the split would follow the sample size alone.',
    source: 'Cohen, J. (1988). Statistical Power Analysis for the Behavioral Sciences, 2nd ed., Erlbaum, ch. 2–3 (conventional effect sizes); the logic of the split as in Schuirmann (1987).',
  },
  'welch-t': {
    name: 'Welch t test',
    text: 'Compares two mean scores without assuming the two groups have the same spread.',
    source: 'Welch, B. L. (1947). The generalization of "Student\'s" problem when several different population variances are involved. Biometrika 34, 28–35.',
  },
  'student-t': {
    name: 'Student t test',
    text: 'Compares two mean scores assuming the two groups have the same spread.',
    source: 'Student (1908). The probable error of a mean. Biometrika 6, 1–25.',
  },
  'mann-whitney': {
    name: 'Mann–Whitney U test',
    text: 'Compares two groups’ scores by their ranks, without assuming a normal distribution; with ties and a continuity correction in the normal approximation.',
    source: 'Mann, H. B. and Whitney, D. R. (1947). On a test of whether one of two random variables is stochastically larger than the other. Annals of Mathematical Statistics 18, 50–60.',
  },
  'benjamini-yekutieli': {
    name: 'Benjamini–Yekutieli adjustment',
    text: 'A version of the Benjamini–Hochberg adjustment that stays valid whatever the dependence between claims; more cautious.',
    source: 'Benjamini, Y. and Yekutieli, D. (2001). The control of the false discovery rate in multiple testing under dependency. Annals of Statistics 29, 1165–1188.',
  },
  hochberg: {
    name: "Hochberg's step-up adjustment",
    text: 'A step-up version of Holm’s adjustment, slightly less cautious, valid when the claims’ tests are independent or positively related.',
    source: 'Hochberg, Y. (1988). A sharper Bonferroni procedure for multiple tests of significance. Biometrika 75, 800–802.',
  },
  bonferroni: {
    name: 'Bonferroni adjustment',
    text: 'Multiplies each p-value by the number of claims tested; simple and the most cautious.',
    source: 'Dunn, O. J. (1961). Multiple comparisons among means. Journal of the American Statistical Association 56, 52–64.',
  },
  rounding: {
    name: 'How the figures are rounded',
    text: 'Rates are printed as whole percentages, with as many decimals as it takes for two rates set side by side, or an interval’s two ends, to print differently; differences usually to a tenth of a point. Every difference, interval and test is worked out from the unrounded counts, so a printed difference can disagree by up to a point with the gap between the two printed rates: 80.4% and 80.6%, for example, print as 80% and 81% with a difference of 0.2 points. results.json holds every figure unrounded.',
    // Reference cited from memory.
    source: 'Common practice, warrant\'s own rule; on rounding figures for readers see Ehrenberg, A. S. C. (1977). Rudiments of numeracy. Journal of the Royal Statistical Society, Series A 140, 277–297.',
  },
  'chart-scales': {
    name: 'How the charts are drawn',
    text: 'Every agreement rate in the pack (the charts of rates and the lines over periods) is drawn on one common range, from the lowest to the highest interval end in the pack rounded out to a tenth, so that equal gaps look equal from page to page. The parts of a stacked bar fill the whole 0% to 100%. A mean score is drawn on the whole answer scale, and a difference set against an equivalence margin on a range centred on zero. Only a scatter of units, whose point is how two measures move together rather than their level, fits its axes to the units shown. Periods run earliest first in every table and chart. Each interval is drawn at the level the claim states beside it.',
    source: 'Common practice, warrant\'s own rule; on choosing scales see Cleveland, W. S. (1994). The Elements of Graphing Data, revised ed., Hobart Press, ch. 2.',
  },
};

export function methodInfo(id: string): MethodInfo {
  const info = METHODS[id];
  if (!info) throw new Error(`no method notes for "${id}": add an entry to src/stats/methods.ts`);
  return info;
}
