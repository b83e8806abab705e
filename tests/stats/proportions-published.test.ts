/**
 * Published worked examples, compared to the 4 decimals printed.
 * - R. G. Newcombe (1998a), "Two-sided confidence intervals for the single proportion: comparison of seven
 *   methods", Statistics in Medicine 17, 857-872, Table I: 95% intervals for 81/263, 15/148, 0/20, 1/29 by
 *   method 3 (Wilson), method 4 (Wilson with continuity correction), method 5 (Clopper-Pearson).
 * - R. G. Newcombe (1998b), "Interval estimation for the difference between independent proportions: comparison of
 *   eleven methods", Statistics in Medicine 17, 873-890, Table II: 95% intervals for p1 - p2 by method 10.
 * Values from memory; each also agrees to 4 decimals with R 4.2 (tests/fixtures/r/proportions.R).
 */
import { describe, expect, it } from 'vitest';
import { wilsonInterval } from '../../src/stats/wilson.js';
import { wilsonCcInterval } from '../../src/stats/wilson-cc.js';
import { clopperPearsonInterval } from '../../src/stats/clopper-pearson.js';
import { newcombeInterval } from '../../src/stats/newcombe.js';

/** Agreement to the 4 decimals printed: |actual - printed| <= half a unit in the 4th decimal. */
function expect4(actual: number, printed: number, what: string): void {
  const delta = Math.abs(actual - printed);
  if (delta > 0.00005 + 1e-12) expect.fail(`${what}: printed ${printed}, actual ${actual}, delta ${delta}`);
  expect(delta).toBeLessThanOrEqual(0.00005 + 1e-12);
}

// [x, n, Wilson (method 3), Wilson CC (method 4), Clopper-Pearson (method 5)], Newcombe (1998a) Table I, from memory.
const tableI: Array<[number, number, [number, number], [number, number], [number, number]]> = [
  [81, 263, [0.2553, 0.3662], [0.2535, 0.3682], [0.2527, 0.3676]],
  [15, 148, [0.0624, 0.1605], [0.0598, 0.1644], [0.0578, 0.1617]],
  [0, 20, [0, 0.1611], [0, 0.2005], [0, 0.1684]],
  [1, 29, [0.0061, 0.1718], [0.0018, 0.1963], [0.0009, 0.1776]],
];

describe('Newcombe (1998a) Table I, single proportions at 95%', () => {
  it.each(tableI)('%i/%i', (x, n, w, cc, cp) => {
    const a = wilsonInterval(x, n).interval;
    expect4(a.lower, w[0], 'Wilson lower');
    expect4(a.upper, w[1], 'Wilson upper');
    const b = wilsonCcInterval(x, n).interval;
    expect4(b.lower, cc[0], 'Wilson CC lower');
    expect4(b.upper, cc[1], 'Wilson CC upper');
    const c = clopperPearsonInterval(x, n).interval;
    expect4(c.lower, cp[0], 'Clopper-Pearson lower');
    expect4(c.upper, cp[1], 'Clopper-Pearson upper');
  });
});

// [x1, n1, x2, n2, method 10 interval], Newcombe (1998b) Table II, from memory.
const tableII: Array<[number, number, number, number, [number, number]]> = [
  [56, 70, 48, 80, [0.0524, 0.3339]],
  [9, 10, 3, 10, [0.1705, 0.809]],
  [5, 56, 0, 29, [-0.0381, 0.1926]],
  [10, 10, 0, 20, [0.6791, 1]],
  [10, 10, 0, 10, [0.6075, 1]],
  [0, 10, 0, 20, [-0.1611, 0.2775]],
  [0, 10, 0, 10, [-0.2775, 0.2775]],
];

describe('Newcombe (1998b) Table II, method 10 (hybrid score) at 95%', () => {
  it.each(tableII)('%i/%i - %i/%i', (x1, n1, x2, n2, iv) => {
    const a = newcombeInterval(x1, n1, x2, n2);
    expect4(a.lower, iv[0], 'lower');
    expect4(a.upper, iv[1], 'upper');
  });
});
