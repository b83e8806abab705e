import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { chiSquareIndependence } from '../../src/stats/chi-square-independence.js';
import { fisherExactRxc, FisherTooLargeError } from '../../src/stats/fisher-exact-rxc.js';
import { expectClose } from '../helpers/tolerance.js';

interface ChisqCase {
  table: number[][];
  correct: boolean;
  statistic: number;
  df: number;
  p: number;
  expected: number[][];
  residuals: number[][];
  stdres: number[][];
}
interface FisherCase {
  table: number[][];
  p: number;
}
const fixture = JSON.parse(readFileSync(new URL('../fixtures/r/tables.json', import.meta.url), 'utf8')) as {
  chisq: ChisqCase[];
  fisher: FisherCase[];
};

function eachCell(a: number[][], b: number[][], f: (x: number, y: number, where: string) => void): void {
  expect(a.length).toBe(b.length);
  a.forEach((row, i) => {
    expect(row.length).toBe((b[i] as number[]).length);
    row.forEach((v, j) => f(v, (b[i] as number[])[j] as number, `[${i}][${j}]`));
  });
}

describe('chiSquareIndependence against R chisq.test', () => {
  // Source: GNU R 4.2 stats::chisq.test, fixture tests/fixtures/r/tables.R -> tables.json.
  fixture.chisq.forEach((c, k) => {
    it(`case ${k + 1}: ${c.table.length} x ${(c.table[0] as number[]).length}, correct = ${c.correct}`, () => {
      const r = chiSquareIndependence(c.table, { yates: c.correct });
      expectClose(r.statistic.value, c.statistic, 'closed', 'X²');
      expect(r.df).toBe(c.df);
      expectClose(r.p, c.p, 'p', 'p');
      eachCell(r.expected, c.expected, (a, b, w) => expectClose(a, b, 'closed', `expected${w}`));
      eachCell(r.residuals, c.residuals, (a, b, w) => expectClose(a, b, 'closed', `residual${w}`));
      eachCell(r.adjustedResiduals, c.stdres, (a, b, w) => expectClose(a, b, 'closed', `stdres${w}`));
      const smallExpected = c.expected.some((row) => row.some((e) => e < 5));
      expect(r.warnings.length > 0).toBe(smallExpected);
    });
  });

  it('a published worked example: party identification by gender', () => {
    // Source: Agresti A. (2007) An Introduction to Categorical Data Analysis, 2nd ed., Tables 2.5 and 2.6
    // (from memory): X² = 30.1 on 2 df; adjusted residuals for females 4.50, 0.70, −5.32.
    const r = chiSquareIndependence([
      [762, 327, 468],
      [484, 239, 477],
    ]);
    expectClose(r.statistic.value, 30.1, 0.005, 'X² (published to 3 figures)');
    expect(r.df).toBe(2);
    const published = [4.5, 0.7, -5.32];
    published.forEach((v, j) => expectClose(r.adjustedResiduals[0]?.[j] as number, v, 0.01, `female residual ${j}`));
    published.forEach((v, j) => expectClose(r.adjustedResiduals[1]?.[j] as number, -v, 0.01, `male residual ${j}`));
    // Cramér's V = sqrt(X² / N) for a 2-row table; N = 2757 (the table's total).
    expectClose(r.cramersV, Math.sqrt(r.statistic.value / 2757), 'closed', "Cramér's V");
  });

  it('Yates is applied to 2 x 2 only', () => {
    const big = chiSquareIndependence([
      [20, 31, 14],
      [12, 18, 25],
    ]);
    expect(big.yates).toBe(false);
    expect(chiSquareIndependence([[12, 5], [7, 9]]).yates).toBe(true);
    expect(chiSquareIndependence([[12, 5], [7, 9]], { yates: false }).yates).toBe(false);
  });

  it('rejects tables it cannot test, saying what is wrong', () => {
    expect(() => chiSquareIndependence([[1, 2]])).toThrow(/1 row\(s\) with observations; at least 2/);
    expect(() => chiSquareIndependence([[1], [2]])).toThrow(/1 column\(s\) with observations; at least 2/);
    expect(() => chiSquareIndependence([[1, 2], [3]])).toThrow(/rectangular/);
    expect(() => chiSquareIndependence([[1, -2], [3, 4]])).toThrow(/row 1, column 2 is -2/);
    expect(() => chiSquareIndependence([[0, 0], [3, 4]])).toThrow(/1 row\(s\) with observations/);
    expect(() => chiSquareIndependence([[1, Number.NaN], [3, 4]])).toThrow(/finite/);
  });

  it('leaves out an empty row or column, says so, and tests the rest (as R does on the reduced table)', () => {
    // Source: the 2 x 3 case of tables.json is this table without its empty first column and empty middle row.
    const c = fixture.chisq.find((k) => JSON.stringify(k.table) === JSON.stringify([[762, 327, 468], [484, 239, 477]]));
    expect(c).toBeDefined();
    const r = chiSquareIndependence([
      [0, 762, 327, 468],
      [0, 0, 0, 0],
      [0, 484, 239, 477],
    ]);
    expect(r.warnings).toContain('Row 2 had no observations and was left out.');
    expect(r.warnings).toContain('Column 1 had no observations and was left out.');
    expect(r.df).toBe(2);
    expectClose(r.statistic.value, (c as ChisqCase).statistic, 'closed', 'X²');
    expectClose(r.p, (c as ChisqCase).p, 'p', 'p');
  });
});

describe('fisherExactRxc against R fisher.test', () => {
  // Source: GNU R 4.2 stats::fisher.test (two-sided), fixture tests/fixtures/r/tables.R -> tables.json.
  fixture.fisher.forEach((c, k) => {
    it(`case ${k + 1}: ${c.table.length} x ${(c.table[0] as number[]).length}`, () => {
      expectClose(fisherExactRxc(c.table).p, c.p, 'p', 'p');
    });
  });

  it('the same p-value for the transposed table', () => {
    for (const c of fixture.fisher) {
      const t = (c.table[0] as number[]).map((_, j) => c.table.map((row) => row[j] as number));
      expectClose(fisherExactRxc(t).p, c.p, 'p', 'p of transpose');
    }
  });

  it("a published worked example: Fisher's tea-tasting table", () => {
    // Source: Agresti A. (2013) Categorical Data Analysis, 3rd ed., §3.5.2 (from memory): the first-row count has
    // hypergeometric probabilities 1/70, 16/70, 36/70, 16/70, 1/70 for 0..4; the two-sided p is 34/70.
    const r = fisherExactRxc([
      [3, 1],
      [1, 3],
    ]);
    expectClose(r.p, 34 / 70, 'closed', 'two-sided p');
    expectClose(r.tableProbability, 16 / 70, 'closed', 'P(observed table)');
  });

  it('a published worked example: job satisfaction by income, 4 x 4', () => {
    // Source: Agresti A. (2002) Categorical Data Analysis, 2nd ed., Table 2.8, as used in R's ?fisher.test
    // (from memory): two-sided p = 0.7827.
    const job = [
      [1, 3, 10, 6],
      [2, 3, 10, 7],
      [1, 6, 14, 12],
      [0, 1, 9, 11],
    ];
    expectClose(fisherExactRxc(job).p, 0.7827, 5e-5, 'p (published to 4 figures)');
  });

  it('a 2 x 3 table by full enumeration of its tables', () => {
    // Independent check, exact arithmetic: enumerate every 2 x 3 table with the margins of [[4,7,2],[1,3,9]]
    // (rows 13, 13; columns 5, 10, 11) and sum the multivariate hypergeometric probabilities <= observed.
    const lf = (n: number): number => {
      let s = 0;
      for (let k = 2; k <= n; k++) s += Math.log(k);
      return s;
    };
    const prob = (a: number, b: number, c: number): number =>
      Math.exp(2 * lf(13) + lf(5) + lf(10) + lf(11) - lf(26) - lf(a) - lf(b) - lf(c) - lf(5 - a) - lf(10 - b) - lf(11 - c));
    const obs = prob(4, 7, 2);
    let p = 0;
    for (let a = 0; a <= 5; a++) for (let b = 0; b <= 10; b++) {
      const c = 13 - a - b;
      if (c < 0 || c > 11) continue;
      const q = prob(a, b, c);
      if (q <= obs * (1 + 1e-7)) p += q;
    }
    expectClose(fisherExactRxc([[4, 7, 2], [1, 3, 9]]).p, p, 1e-11, 'p by enumeration');
  });

  it('stops with FisherTooLargeError past its work limit', () => {
    const big = [
      [40, 32, 28, 35, 30, 25],
      [30, 38, 31, 27, 36, 33],
      [29, 31, 40, 33, 26, 37],
      [35, 28, 30, 36, 33, 29],
    ];
    expect(() => fisherExactRxc(big, { maxSteps: 1000 })).toThrow(FisherTooLargeError);
    expect(() => fisherExactRxc(big, { maxSteps: 1000 })).toThrow(/too large for the exact test/);
  });

  it('rejects counts that are not whole numbers', () => {
    expect(() => fisherExactRxc([[1.5, 2], [3, 4]])).toThrow(/whole numbers/);
  });

  it('p is in [0, 1] and at least the probability of the observed table (random small tables)', () => {
    const cell = fc.integer({ min: 0, max: 6 });
    const tableArb = fc
      .tuple(fc.integer({ min: 2, max: 3 }), fc.integer({ min: 2, max: 4 }))
      .chain(([r, c]) => fc.array(fc.array(cell, { minLength: c, maxLength: c }), { minLength: r, maxLength: r }))
      .filter((t) => t.every((row) => row.some((v) => v > 0)) && (t[0] as number[]).every((_, j) => t.some((row) => (row[j] as number) > 0)));
    fc.assert(
      fc.property(tableArb, (t) => {
        const r = fisherExactRxc(t);
        return r.p >= 0 && r.p <= 1 && r.p >= r.tableProbability * (1 - 1e-9);
      }),
      { seed: 20260116, numRuns: 200 },
    );
  });
});
