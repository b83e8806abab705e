/**
 * Claim kind "trend": the agreement rate of one selection over three or more ordered periods.
 *
 * Test: the Cochran–Armitage test for a linear trend in proportions (Cochran 1954, Biometrics 10, 417–451; Armitage
 * 1955, Biometrics 11, 375–386), with the periods scored 0, 1, ..., k − 1 in order, so that the slope of its weighted
 * least-squares line is the fitted change in the rate per period. Two-sided claims use z² against chi-square(1), as
 * R's prop.trend.test; a one-sided claim uses the normal tail of the signed z in its direction. The fitted change per
 * period has a two-sided Wald interval at the claim's confidence with the test's own standard error, so it excludes
 * no change exactly when the two-sided test rejects (src/stats/cochran-armitage.ts). Wilson interval per period
 * (with the finite-population correction where the number eligible is known).
 *
 * Smallest detectable change per period (80% power), by the normal approximation with the variance of the trend
 * statistic under the null hypothesis (Armitage 1955): the slope estimate b has standard error
 * sqrt(p̄ (1 − p̄) / Σ n_i (s_i − s̄)²), so a true slope of (z_α + z_0.8) times that error is found 80% of the time,
 * z_α being the upper α/2 (two-sided) or α (one-sided) normal quantile. The variance at the alternative is taken
 * equal to the null one, a good approximation for the modest slopes that matter in practice.
 */
import type { TrendClaim, TrendExpect } from '../claims/types.js';
import type { Cube, Pooled } from '../data/types.js';
import { pool } from '../data/select.js';
import { InputError } from '../errors.js';
import { cochranArmitage } from '../stats/cochran-armitage.js';
import { departureFromTrend } from '../stats/departure-from-trend.js';
import { normalSfQuantile } from '../stats/distributions/normal.js';
import type { Alternative } from '../stats/result.js';
import type { CompareContext } from './compare.js';
import { requirePeriodColumn } from './change.js';
import { sign } from './labels.js';
import { orderedPeriods, resolvePeriods } from './periods.js';
import { orderIsInTime } from '../claims/periods.js';
import { fpcWanted, rateSummary } from './rates.js';
import { shortfall } from './thresholds.js';
import type { TrendAnalysis } from './types.js';

/** Fewest periods a trend claim needs (two periods are a change, not a trend). */
export const MIN_PERIODS = 3;

function alternativeFor(expect: TrendExpect, sided: TrendClaim['sided'], opposite = false): Alternative {
  if (sided === 'two-sided' || expect === 'any') return 'two-sided';
  const rising = expect === 'rising' ? !opposite : opposite;
  return rising ? 'greater' : 'less';
}

/**
 * Smallest true change per period that the trend test would find with the given power (see the file comment).
 * Inputs are the respondents per period and the pooled rate; scores 0..k-1.
 */
export function detectableSlope(respondents: readonly number[], pooledRate: number, alpha: number, sided: 'two-sided' | 'one-sided', power = 0.8): number {
  if (!(pooledRate > 0 && pooledRate < 1)) throw new Error(`detectableSlope: the pooled rate must be strictly between 0 and 1, got ${pooledRate}`);
  const total = respondents.reduce((a, b) => a + b, 0);
  const sBar = respondents.reduce((acc, n, i) => acc + n * i, 0) / total;
  const sxx = respondents.reduce((acc, n, i) => acc + n * (i - sBar) ** 2, 0);
  if (!(sxx > 0)) throw new Error('detectableSlope: at least two periods with respondents are needed');
  const z = normalSfQuantile(sided === 'two-sided' ? alpha / 2 : alpha) + normalSfQuantile(1 - power);
  return z * Math.sqrt((pooledRate * (1 - pooledRate)) / sxx);
}

export function analyseTrend(written: TrendClaim, cube: Cube, ctx: CompareContext): TrendAnalysis {
  const column = requirePeriodColumn(written, cube, ctx);
  const claim = resolvePeriods(written, cube, column, ctx.claimsFile).claim as TrendClaim;
  const periods = (claim.periods as Array<string | number>).map((p) => String(p).trim());
  const distinct = new Set(periods);
  if (periods.length < MIN_PERIODS || distinct.size !== periods.length) {
    throw new InputError({
      file: ctx.claimsFile,
      line: claim.place.line,
      column: claim.place.column,
      field: `claims.${claim.id}.periods`,
      found: periods.join(', '),
      problem:
        distinct.size !== periods.length
          ? `claim "${claim.id}" names the same period twice`
          : `claim "${claim.id}" has ${periods.length} period${periods.length === 1 ? '' : 's'}; a trend needs ${MIN_PERIODS} or more`,
      fix: 'list three or more different periods oldest first, or write `periods: { last: 3 }`; for two periods use the kind `change`',
    });
  }
  // Periods are scored 0, 1, ... in the order listed: listed newest first, a fall would be reported as a rise.
  const order = orderedPeriods(cube, column);
  const at = periods.map((p) => order.indexOf(p));
  if (at.every((i) => i >= 0) && orderIsInTime(periods) && at.some((i, k) => k > 0 && i < at[k - 1]!)) {
    const asWritten = Array.isArray(written.periods) ? written.periods.map(String) : periods;
    const sorted = asWritten.map((w, k) => ({ w, i: at[k]! })).sort((a, b) => a.i - b.i).map((x) => x.w);
    throw new InputError({
      file: ctx.claimsFile,
      line: claim.place.line,
      column: claim.place.column,
      field: `claims.${claim.id}.periods`,
      found: periods.join(', '),
      problem: `claim "${claim.id}" lists its periods out of order (${periods.join(', ')}); a trend follows them in the order listed, so listed newest first a fall would be reported as a rise`,
      fix: `list them oldest first: periods: [${sorted.join(', ')}]`,
    });
  }
  const pooled: Pooled[] = periods.map((p) => pool(cube, { ...claim.where, [column]: p }));
  const expectSign = claim.expect === 'rising' ? 1 : claim.expect === 'falling' ? -1 : 0;
  const base = { kind: 'trend' as const, claim, periodColumn: column, periods, expectSign: expectSign as 1 | -1 | 0, methods: [] as string[] };
  const why = shortfall(
    claim,
    periods.map((p, i) => ({ label: p, pooled: pooled[i] as Pooled })),
  );
  if (why !== undefined) return { ...base, status: 'too-little-data', shortfall: why, observedSign: 0 };

  // The trend test has no corrected form, so no figure of a trend claim carries the finite-population correction.
  const fpc = fpcWanted(claim, cube, 'the trend test');
  const rates = periods.map((p, i) => rateSummary(p, pooled[i] as Pooled, claim.confidence, false));
  const x = rates.map((r) => r.agree);
  const n = rates.map((r) => r.n);
  const scores = periods.map((_, i) => i);
  const alternative = alternativeFor(claim.expect, claim.sided);
  const pooledRate = x.reduce((a, b) => a + b, 0) / n.reduce((a, b) => a + b, 0);
  if (pooledRate === 0 || pooledRate === 1) {
    throw new InputError({
      file: ctx.claimsFile,
      line: claim.place.line,
      column: claim.place.column,
      field: `claims.${claim.id}`,
      problem: `claim "${claim.id}" cannot be tested: ${pooledRate === 0 ? 'no one' : 'everyone'} agreed in every period, so there is no trend to test`,
      fix: 'remove the claim, or choose a question whose answers vary',
    });
  }
  // The slope's interval is two-sided at the claim's confidence, as every kind's interval is.
  const test = cochranArmitage(x, n, { scores, alternative, level: claim.confidence });
  const pOpposite = alternative === 'two-sided' ? undefined : cochranArmitage(x, n, { scores, alternative: alternativeFor(claim.expect, claim.sided, true) }).p;
  const fitted = scores.map((s) => test.intercept + test.slope * s);
  // How far the periods stray from that line (overall chi-square minus the trend's, k - 2 df): a rise then a fall.
  const departure = departureFromTrend(x, n, scores);
  const detectable = detectableSlope(n, pooledRate, 1 - claim.confidence, alternative === 'two-sided' ? 'two-sided' : 'one-sided');
  const withPop = rates.filter((r) => r.population !== undefined);
  return {
    ...base,
    status: 'tested',
    rates,
    test,
    ...(pOpposite !== undefined ? { pOpposite } : {}),
    observedSign: sign(test.z),
    slope: test.slope,
    fitted,
    departure: { statistic: departure.statistic.value, df: departure.df, p: departure.p, overall: departure.overall },
    detectable,
    ...(withPop.length > 0 ? { responseRate: Math.min(...withPop.map((r) => r.n / (r.population as number))) } : {}),
    ...(fpc !== undefined ? { fpc } : {}),
    methods: ['cochran-armitage-trend', 'trend-wald', 'departure-from-trend', 'wilson', 'power-trend'],
  };
}
