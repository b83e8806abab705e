/**
 * Mean and sample standard deviation (divisor n − 1) of answers given as counts per code, without expanding them
 * into one value per respondent. Two passes, as for raw values: the mean Σ c·v / n, then the centred sum of squares
 * Σ c·(v − mean)², which avoids the cancellation of the one-pass formula Σ c·v² − n·mean² (Chan T. F., Golub G. H.,
 * LeVeque R. J. (1983) "Algorithms for computing the sample variance: analysis and recommendations", The American
 * Statistician 37, 242–247). With few distinct codes each pass is a handful of products.
 *
 * @throws Error when a count or code is invalid (see codeEntries) or there are no answers.
 * @example summaryFromCounts({ 1: 1, 2: 1, 3: 1 }) // { mean: 2, sd: 1, n: 3 }
 */
import { codeEntries, type CodeCounts } from './mann-whitney-counts.js';
import type { GroupSummary } from './student-t.js';

export function summaryFromCounts(counts: CodeCounts, which = 'first'): GroupSummary {
  const entries = codeEntries(counts, which, 'summaryFromCounts');
  let n = 0;
  let sum = 0;
  for (const [v, c] of entries) {
    n += c;
    sum += c * v;
  }
  if (n === 0) throw new Error(`summaryFromCounts: the ${which} group has no answers`);
  const mean0 = sum / n;
  let corr = 0;
  for (const [v, c] of entries) corr += c * (v - mean0);
  const mean = mean0 + corr / n;
  let ss = 0;
  for (const [v, c] of entries) ss += c * (v - mean) * (v - mean);
  return { mean, sd: n > 1 ? Math.sqrt(ss / (n - 1)) : 0, n };
}
