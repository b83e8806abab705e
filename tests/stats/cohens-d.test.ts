/**
 * The noncentral t distribution (src/stats/distributions/nct.ts) and the interval for Cohen's d that inverts it
 * (src/stats/cohens-d-interval.ts).
 *
 * Sources: GNU R 4.2.2 pt(t, df, ncp) and uniroot on it (tests/fixtures/r/cohens-d.R -> cohens-d.json); scipy.stats.nct
 * 1.17 (Boost) where R switches to a normal approximation (tests/fixtures/scipy/nct.py -> nct.json); and the
 * interval's defining property: it excludes 0 exactly when Student's two-sided t test has p below 1 − level.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { nctCdf, nctSf } from '../../src/stats/distributions/nct.js';
import { cohensDInterval } from '../../src/stats/cohens-d-interval.js';
import { studentT } from '../../src/stats/student-t.js';
import { expectClose } from '../helpers/tolerance.js';

interface CdfCase {
  t: number;
  df: number;
  ncp: number;
  cdf: number;
  sf: number;
}
const r = JSON.parse(readFileSync(new URL('../fixtures/r/cohens-d.json', import.meta.url), 'utf8')) as {
  r_version: string;
  cdf: CdfCase[];
  intervals: Array<{ d: number; n1: number; n2: number; confidence: number; lower: number; upper: number }>;
};
const scipy = JSON.parse(readFileSync(new URL('../fixtures/scipy/nct.json', import.meta.url), 'utf8')) as { scipy_version: string; cases: CdfCase[] };

describe('noncentral t against R 4.2.2 pt(t, df, ncp)', () => {
  it('the fixture was made by R', () => {
    expect(r.r_version).toMatch(/^R version 4\./);
    expect(r.cdf.length).toBeGreaterThanOrEqual(15);
  });
  for (const c of r.cdf) {
    it(`t = ${c.t}, df = ${c.df}, ncp = ${c.ncp}`, () => {
      // R's pnt stops its series at an error of 1e-12 (AS 243's errmax): compare to 1e-9 relative, as for every series.
      expectClose(nctCdf(c.t, c.df, c.ncp), c.cdf, 'p', 'cdf');
      expectClose(nctSf(c.t, c.df, c.ncp), c.sf, 'p', 'sf');
    });
  }
});

describe('noncentral t against scipy.stats.nct where R approximates (|ncp| > 37.62 or df > 4e5)', () => {
  for (const c of scipy.cases) {
    it(`t = ${c.t}, df = ${c.df}, ncp = ${c.ncp}`, () => {
      expectClose(nctCdf(c.t, c.df, c.ncp), c.cdf, 'p', 'cdf');
      expectClose(nctSf(c.t, c.df, c.ncp), c.sf, 'p', 'sf');
    });
  }

  it('reduces to the central t at ncp = 0 and is symmetric: P(T ≤ t; δ) = P(T > −t; −δ)', () => {
    // R 4.2.2: pt(1.3, 7) = 0.88263456499866... (from memory of the central t; checked by the identity instead).
    fc.assert(
      fc.property(fc.double({ min: -20, max: 20, noNaN: true }), fc.integer({ min: 1, max: 5000 }), fc.double({ min: -30, max: 30, noNaN: true }), (t, df, ncp) => {
        const a = nctCdf(t, df, ncp);
        const b = nctSf(-t, df, -ncp);
        expect(Math.abs(a - b)).toBeLessThanOrEqual(1e-14 + 1e-12 * a);
        // The two tails add to one (each computed on its own).
        expect(Math.abs(nctCdf(t, df, ncp) + nctSf(t, df, ncp) - 1)).toBeLessThan(1e-12);
      }),
      { numRuns: 200 },
    );
  });
});

describe("Cohen's d interval (noncentral t inversion) against R 4.2.2 uniroot on pt", () => {
  for (const c of r.intervals) {
    it(`d = ${c.d}, n = ${c.n1} and ${c.n2}, level ${c.confidence}`, () => {
      const got = cohensDInterval(c.d, c.n1, c.n2, c.confidence);
      expectClose(got.lower, c.lower, 'bound', 'lower');
      expectClose(got.upper, c.upper, 'bound', 'upper');
      expect(got.level).toBe(c.confidence);
      expect(got.method).toBe('cohens-d-noncentral-t');
    });
  }

  it("excludes 0 exactly when Student's two-sided t test has p below 1 − level (the inversion's defining property)", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 2, max: 400 }),
        fc.integer({ min: 2, max: 400 }),
        fc.double({ min: -1.5, max: 1.5, noNaN: true }),
        fc.constantFrom(0.9, 0.95, 0.99, 0.99642857142857144),
        (n1, n2, d, level) => {
          // Two groups with these sizes, spread 1 and means d apart: Student's t is d / sqrt(1/n1 + 1/n2).
          const test = studentT({ n: n1, mean: d, sd: 1 }, { n: n2, mean: 0, sd: 1 }, { alternative: 'two-sided', level });
          const ci = cohensDInterval(d, n1, n2, level);
          // Away from the edge (p within 1e-9 of alpha), the interval and the test agree.
          fc.pre(Math.abs(test.p - (1 - level)) > 1e-9);
          expect(ci.lower > 0 || ci.upper < 0).toBe(test.p < 1 - level);
          expect(ci.lower).toBeLessThan(d);
          expect(ci.upper).toBeGreaterThan(d);
        },
      ),
      { numRuns: 150 },
    );
  });

  it('refuses what it cannot use', () => {
    expect(() => cohensDInterval(Number.NaN, 10, 10, 0.95)).toThrow(/d must be a finite number/);
    expect(() => cohensDInterval(0.2, 1, 10, 0.95)).toThrow(/n1 must be a whole number of at least 2/);
    expect(() => cohensDInterval(0.2, 10, 10, 1)).toThrow(/confidence level must be between 0 and 1/);
  });
});
