/**
 * Claim kind "estimate": one selection's value with its margin of error. No hypothesis is tested, so there is no
 * p-value and the verdict is always "estimate".
 *
 * - measure agree: the pooled agreement rate with the Wilson score interval (Wilson 1927, JASA 22, 209–212), with
 *   the finite-population correction where the number eligible is known (Cochran 1977, Sampling Techniques, §3.3).
 * - measure mean: the mean answer code with the t interval mean ± t(n − 1) · sd / √n (Student 1908, Biometrika 6,
 *   1–25), computed from the count of answers at each code (respondent-level sources). Deviations are taken from the
 *   mean in a second pass (Chan, Golub and LeVeque 1983, The American Statistician 37, 242–247).
 * - measure column: the respondent-weighted mean of a numeric column of a summary source. A summary row holds no
 *   spread, so no interval can be given; the pack says so.
 */
import type { EstimateClaim } from '../claims/types.js';
import type { Cube, Pooled } from '../data/types.js';
import { checkFilter, matches, pool } from '../data/select.js';
import { InputError } from '../errors.js';
import { tQuantile } from '../stats/distributions/t.js';
import type { Interval } from '../stats/result.js';
import type { CompareContext } from './compare.js';
import { filterLabel } from './labels.js';
import { fpcWanted, rateSummary } from './rates.js';
import { shortfall } from './thresholds.js';
import type { EstimateAnalysis } from './types.js';

/** Mean, standard deviation (n − 1 divisor) and t interval of answers given as code -> count. */
export function meanFromCodes(codes: Record<string, number>, level: number): { n: number; mean: number; sd: number; interval: Interval } {
  const entries = Object.entries(codes)
    .map(([code, count]) => [Number(code), count] as const)
    .filter(([, count]) => count > 0);
  for (const [code, count] of entries) {
    if (!Number.isFinite(code)) throw new Error(`meanFromCodes: answer code "${code}" is not a number`);
    if (!(Number.isInteger(count) && count >= 0)) throw new Error(`meanFromCodes: code ${code} has a count of ${count}; counts must be whole numbers`);
  }
  const n = entries.reduce((a, [, c]) => a + c, 0);
  if (n < 2) throw new Error(`meanFromCodes: ${n} answer(s); a mean with an interval needs at least 2`);
  if (!(level > 0 && level < 1)) throw new Error(`meanFromCodes: the confidence level must be between 0 and 1, got ${level}`);
  const mean = entries.reduce((a, [code, c]) => a + code * c, 0) / n;
  // Second pass on the deviations, with the correction term of the two-pass algorithm (Chan, Golub and LeVeque).
  let ss = 0;
  let comp = 0;
  for (const [code, c] of entries) {
    const d = code - mean;
    ss += c * d * d;
    comp += c * d;
  }
  const variance = (ss - (comp * comp) / n) / (n - 1);
  const sd = Math.sqrt(Math.max(0, variance));
  const half = tQuantile((1 + level) / 2, n - 1) * (sd / Math.sqrt(n));
  return { n, mean, sd, interval: { lower: mean - half, upper: mean + half, level, method: 't-interval-mean' } };
}

/** Answer-code counts summed over the cells the filter matches; undefined when the source holds no answer codes. */
function poolCodes(cube: Cube, filter: EstimateClaim['where']): Record<string, number> | undefined {
  checkFilter(cube, filter);
  let any = false;
  const out: Record<string, number> = {};
  for (const c of cube.cells) {
    if (c.codes === undefined) continue;
    any = true;
    if (!matches(c, filter)) continue;
    for (const [code, count] of Object.entries(c.codes)) out[code] = (out[code] ?? 0) + count;
  }
  return any ? out : undefined;
}

export function analyseEstimate(claim: EstimateClaim, cube: Cube, ctx: CompareContext): EstimateAnalysis {
  const filter = { ...claim.where, ...claim.select };
  const label = claim.selectLabel ?? filterLabel(filter, claim.naming);
  const pooled = pool(cube, filter);
  const base = { kind: 'estimate' as const, claim, expectSign: 0 as const, observedSign: 0 as const, methods: [] as string[] };
  const measure = claim.measure;
  const fail = (problem: string, fix: string): InputError =>
    new InputError({ file: ctx.claimsFile, line: claim.place.line, column: claim.place.column, field: `claims.${claim.id}.measure`, found: measure.type === 'column' ? measure.column : measure.type, problem, fix });

  if (measure.type === 'agree') {
    const why = shortfall(claim, [{ label, pooled }]);
    if (why !== undefined) return { ...base, status: 'too-little-data', shortfall: why };
    const wanted = fpcWanted(claim, cube);
    const rate = rateSummary(label, pooled, claim.confidence, wanted?.used === true);
    const fpc = wanted?.used === true && rate.fpc !== true ? { used: false, why: 'no-population' as const } : wanted;
    return {
      ...base,
      status: 'tested',
      rate,
      ...(fpc !== undefined ? { fpc } : {}),
      ...(rate.population !== undefined ? { responseRate: rate.n / rate.population } : {}),
      methods: rate.fpc === true ? ['wilson-fpc', 'finite-population-correction'] : ['wilson'],
    };
  }
  if (measure.type === 'mean') {
    const codes = poolCodes(cube, filter);
    if (codes === undefined) {
      throw fail(`claim "${claim.id}" asks for a mean score, but source "${claim.source}" holds counts, not people's answers`, 'use `measure: agree` with a summary source, or point the claim at a source with one row per respondent');
    }
    const n = Object.values(codes).reduce((a, b) => a + b, 0);
    const answered: Pooled = { ...pooled, n };
    const why = shortfall(claim, [{ label, pooled: answered }]);
    if (why !== undefined) return { ...base, status: 'too-little-data', shortfall: why };
    const m = meanFromCodes(codes, claim.confidence);
    return { ...base, status: 'tested', mean: { label, ...m }, methods: ['t-interval-mean'] };
  }
  const sums = pooled.numeric?.[measure.column] ?? numericSums(cube, filter, measure.column);
  if (sums === undefined) {
    throw fail(`claim "${claim.id}" asks for column "${measure.column}", which source "${claim.source}" does not list as a numeric column`, `add "${measure.column}" to the source's \`numeric\` list, or choose one of its numeric columns`);
  }
  const why = shortfall(claim, [{ label, pooled: { ...pooled, n: sums.weight } }]);
  if (why !== undefined) return { ...base, status: 'too-little-data', shortfall: why };
  return { ...base, status: 'tested', value: { label, column: measure.column, value: sums.weightedSum / sums.weight, n: sums.weight }, methods: [] };
}

function numericSums(cube: Cube, filter: EstimateClaim['where'], column: string): { weightedSum: number; weight: number } | undefined {
  let found = false;
  let weightedSum = 0;
  let weight = 0;
  for (const c of cube.cells) {
    const v = c.numeric?.[column];
    if (v === undefined) continue;
    found = true;
    if (!matches(c, filter)) continue;
    weightedSum += v.weightedSum;
    weight += v.weight;
  }
  return found ? { weightedSum, weight } : undefined;
}
