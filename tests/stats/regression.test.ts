/**
 * Least squares against GNU R's lm()/summary.lm() (fixture tests/fixtures/r/correlation.json, written by
 * tests/fixtures/r/correlation.R): with and without intercept, weighted (including zero weights), and the simple
 * straight-line convenience. NIST StRD certified values are checked in nist.test.ts.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { expectClose } from '../helpers/tolerance.js';
import { leastSquares, polynomialFit, simpleLinearFit, type LeastSquaresFit } from '../../src/stats/least-squares.js';

interface LmSummary {
  estimate: number[];
  se: number[];
  t: number[];
  p: number[];
  sigma: number;
  r_squared: number;
  adj_r_squared: number;
  df_residual: number;
  residuals: number[];
  fitted: number[];
  f?: number;
  f_df1?: number;
  f_df2?: number;
  f_p?: number;
}

const R = JSON.parse(readFileSync(new URL('../fixtures/r/correlation.json', import.meta.url), 'utf8')) as {
  r_version: string;
  regression: {
    z1: number[];
    z2: number[];
    z3: number[];
    y: number[];
    w: number[];
    full: LmSummary;
    no_intercept: LmSummary;
    weighted: LmSummary;
    simple: LmSummary;
    simple_weighted: LmSummary;
  };
};
const G = R.regression;

const P = JSON.parse(readFileSync(new URL('../fixtures/r/polynomial.json', import.meta.url), 'utf8')) as {
  r_version: string;
  x: number[];
  y: number[];
  w: number[];
  cubic: LmSummary;
  cubic_weighted: LmSummary;
  quadratic_no_intercept: LmSummary;
};

/** Compares a fit with summary.lm; estimates, SEs and t are closed-form (1e-12), p-values 1e-9. */
function compare(fit: LeastSquaresFit, ref: LmSummary, what: string): void {
  // source: R lm() and summary.lm()
  expect(fit.coefficients.length).toBe(ref.estimate.length);
  fit.coefficients.forEach((c, j) => {
    expectClose(c.estimate, ref.estimate[j]!, 'closed', `${what} estimate ${j}`);
    expectClose(c.standardError, ref.se[j]!, 'closed', `${what} se ${j}`);
    expectClose(c.t, ref.t[j]!, 'closed', `${what} t ${j}`);
    expectClose(c.p, ref.p[j]!, 'p', `${what} p ${j}`);
  });
  expectClose(fit.residualSd, ref.sigma, 'closed', `${what} sigma`);
  expectClose(fit.rSquared, ref.r_squared, 'closed', `${what} R squared`);
  expectClose(fit.adjustedRSquared, ref.adj_r_squared, 'closed', `${what} adjusted R squared`);
  expect(fit.dfResidual).toBe(ref.df_residual);
  ref.residuals.forEach((r, i) => expectClose(fit.residuals[i]!, r, 'closed', `${what} residual ${i}`));
  ref.fitted.forEach((f, i) => expectClose(fit.fitted[i]!, f, 'closed', `${what} fitted ${i}`));
  if (ref.f !== undefined) {
    expect(fit.fTest).toBeDefined();
    expectClose(fit.fTest!.value, ref.f, 'closed', `${what} F`);
    expect(fit.fTest!.df).toEqual([ref.f_df1, ref.f_df2]);
    expectClose(fit.fTest!.p, ref.f_p!, 'p', `${what} F p`);
  }
}

describe(`least squares against ${R.r_version} lm()`, () => {
  it('three predictors with intercept', () => {
    compare(leastSquares([G.z1, G.z2, G.z3], G.y), G.full, 'full');
  });

  it('two predictors without intercept (R squared about zero)', () => {
    compare(leastSquares([G.z1, G.z2], G.y, { intercept: false }), G.no_intercept, 'no intercept');
  });

  it('weighted, with two zero weights left out of the degrees of freedom', () => {
    compare(leastSquares([G.z1, G.z2], G.y, { weights: G.w }), G.weighted, 'weighted');
  });

  it('simple straight line, plain and weighted', () => {
    for (const [ref, w, what] of [
      [G.simple, undefined, 'simple'],
      [G.simple_weighted, G.w, 'simple weighted'],
    ] as const) {
      const line = simpleLinearFit(G.z1, G.y, w);
      // source: R lm(y ~ z1) and lm(y ~ z1, weights = w)
      expectClose(line.intercept, ref.estimate[0]!, 'closed', `${what} intercept`);
      expectClose(line.slope, ref.estimate[1]!, 'closed', `${what} slope`);
      expectClose(line.interceptSe, ref.se[0]!, 'closed', `${what} intercept se`);
      expectClose(line.slopeSe, ref.se[1]!, 'closed', `${what} slope se`);
      expectClose(line.slopeT, ref.t[1]!, 'closed', `${what} slope t`);
      expectClose(line.slopeP, ref.p[1]!, 'p', `${what} slope p`);
      expectClose(line.rSquared, ref.r_squared, 'closed', `${what} R squared`);
      expectClose(line.residualSd, ref.sigma, 'closed', `${what} sigma`);
      expect(line.dfResidual).toBe(ref.df_residual);
    }
  });

  it('names coefficients and keeps the coefficient order', () => {
    const fit = leastSquares([G.z1, G.z2], G.y, { names: ['resources', 'feedback'] });
    expect(fit.coefficients.map((c) => c.name)).toEqual(['(Intercept)', 'resources', 'feedback']);
  });
});

describe(`polynomial fit against ${P.r_version} lm(y ~ x + I(x^2) + ...)`, () => {
  // Fixture tests/fixtures/r/polynomial.json, written by tests/fixtures/r/polynomial.R.
  it('cubic with intercept', () => {
    const fit = polynomialFit(P.x, P.y, 3);
    compare(fit, P.cubic, 'cubic');
    expect(fit.coefficients.map((c) => c.name)).toEqual(['(Intercept)', 'x', 'x^2', 'x^3']);
  });

  it('weighted cubic, with two zero weights left out of the degrees of freedom', () => {
    compare(polynomialFit(P.x, P.y, 3, { weights: P.w }), P.cubic_weighted, 'weighted cubic');
  });

  it('quadratic without intercept', () => {
    const fit = polynomialFit(P.x, P.y, 2, { intercept: false, name: 'score' });
    compare(fit, P.quadratic_no_intercept, 'quadratic without intercept');
    expect(fit.coefficients.map((c) => c.name)).toEqual(['score', 'score^2']);
  });

  it('throws clear errors', () => {
    expect(() => polynomialFit([1, 2, 3, 4], [1, 2, 4, 3], 0)).toThrow(/degree must be a whole number of at least 1/);
    expect(() => polynomialFit([1, 2, 3, 4], [1, 2, 4, 3], 1.5)).toThrow(/degree must be a whole number/);
    expect(() => polynomialFit([1, 2, 3], [1, 2, 4, 3], 2)).toThrow(/x has 3 values but y has 4/);
    expect(() => polynomialFit([1, 2, 3, 4], [1, 2, 4, 3], 3)).toThrow(/4 observations for 4 coefficients/);
    expect(() => polynomialFit([1, 2, NaN, 4, 5], [1, 2, 4, 3, 5], 2)).toThrow(/not a finite number/);
    expect(() => polynomialFit([1, 2, 1e200, 4, 5], [1, 2, 4, 3, 5], 2)).toThrow(/x\^2 overflows at observation 3/);
    expect(() => polynomialFit([1, 2, 3, 4, 5], [1, 2, 4, 3, 5], 2, { weights: [1, 1, -1, 1, 1] })).toThrow(
      /weight 3 is negative/,
    );
  });
});

describe('least squares: degenerate input', () => {
  it('throws clear errors', () => {
    expect(() => leastSquares([[1, 2, 3]], [1, 2])).toThrow(/has 3 values but y has 2/);
    expect(() => leastSquares([[1, 2]], [1, 2])).toThrow(/2 observations for 2 coefficients/);
    expect(() => leastSquares([[1, 2, 3, 4], [2, 4, 6, 8]], [1, 3, 2, 5])).toThrow(/"x2" is \(almost\) a linear combination/);
    expect(() => simpleLinearFit([2, 2, 2, 2], [1, 2, 3, 4])).toThrow(/"x" is \(almost\) a linear combination/);
    expect(() => leastSquares([[1, 2, 3, 4]], [5, 5, 5, 5])).toThrow(/y does not vary/);
    expect(() => leastSquares([[1, 2, 3, 4]], [1, 2, 4, 3], { weights: [1, -1, 1, 1] })).toThrow(/weight 2 is negative/);
    expect(() => leastSquares([[1, 2, Infinity, 4]], [1, 2, 4, 3])).toThrow(/not a finite number/);
  });

  it('reports an exact fit with zero standard errors and p = 0, not NaN', () => {
    const fit = leastSquares([[1, 2, 3, 4, 5]], [3, 5, 7, 9, 11]);
    expect(fit.coefficients.map((c) => c.estimate)).toEqual([1, 2]);
    expect(fit.residualSd).toBe(0);
    expect(fit.coefficients.every((c) => c.p === 0 && Math.abs(c.t) === Infinity)).toBe(true);
    expect(fit.fTest!.value).toBe(Infinity);
  });

  it('an exact fit through the origin: the slope is tested, the zero intercept has no t (0/0) instead of an error', () => {
    // y = x at the rates 0.30, 0.35, ..., 0.65. R 4.2.2 summary(lm(y ~ x)) gives estimates 0 and 1 with standard
    // errors at the rounding level (2.4e-17 and 4.9e-17), t 0 and 2.0e16; this fit leaves no residual at all, so the
    // intercept's t is 0/0, which R prints as NaN.
    const x = [0, 1, 2, 3, 4, 5, 6, 7].map((i) => (30 + i * 5) / 100);
    const fit = leastSquares([x], x);
    expect(fit.coefficients.map((c) => c.estimate)).toEqual([0, 1]);
    expect(fit.coefficients.map((c) => c.standardError)).toEqual([0, 0]);
    expect(Number.isNaN(fit.coefficients[0]!.t) && Number.isNaN(fit.coefficients[0]!.p)).toBe(true);
    const line = simpleLinearFit(x, x);
    expect([line.slope, line.slopeT, line.slopeP]).toEqual([1, Infinity, 0]);
  });
});
