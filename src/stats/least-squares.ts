/**
 * Linear least squares by Householder QR with iterative refinement.
 *
 * Method: the columns of the design matrix are scaled by powers of two (exact) to unit order, factorized A = QR by
 * Householder reflections (Golub & Van Loan, "Matrix Computations", 4th ed., 2013, Algorithm 5.2.1), and the solution
 * and residual are then refined on the augmented system [I A; A' 0][r; x] = [y; 0] with the residuals of that system
 * computed in twice the working precision (Björck, "Iterative refinement of linear least squares solutions I", BIT 7
 * (1967) 257-278; Björck, "Numerical Methods for Least Squares Problems", SIAM 1996, section 2.9). This keeps the
 * NIST StRD linear regression problems (Longley, Wampler1-5) at 12 digits or more in double precision.
 *
 * Standard errors are s * sqrt(diag((R'R)^-1)) with s^2 = RSS / (n - p); t = estimate / SE with n - p degrees of
 * freedom (Draper & Smith, "Applied Regression Analysis", 3rd ed., 1998, ch. 5). With weights w, rows are multiplied
 * by sqrt(w) (weighted least squares, Draper & Smith section 9.2); rows with weight 0 are left out of the fit and of
 * the degrees of freedom, as R's lm() does. R squared is 1 - RSS/TSS with TSS taken about the (weighted) mean of y
 * when the model has an intercept and about zero when it has not (as in R's summary.lm and the NIST no-intercept
 * files).
 */
import { accurateDot } from './compensated-dot.js';
import { compensatedSum, requireFinite } from './mean.js';
import { fSf } from './distributions/f.js';
import { tSf } from './distributions/t.js';

export interface LeastSquaresOptions {
  /** Add a constant column first (default true). */
  intercept?: boolean;
  /** Non-negative weights, one per observation. */
  weights?: readonly number[];
  /** Names of the predictor columns, in order (default x1, x2, ...). The intercept is named '(Intercept)'. */
  names?: readonly string[];
}

export interface Coefficient {
  name: string;
  estimate: number;
  standardError: number;
  /** estimate / standardError. */
  t: number;
  /** Two-sided p-value of t with dfResidual degrees of freedom. */
  p: number;
}

export interface LeastSquaresFit {
  coefficients: Coefficient[];
  intercept: boolean;
  /** Observations used (weight > 0). */
  n: number;
  /** Degrees of freedom of the model: number of coefficients, less one with an intercept. */
  dfModel: number;
  /** n - number of coefficients. */
  dfResidual: number;
  /** Residual (weighted) sum of squares. */
  residualSumOfSquares: number;
  /** Total (weighted) sum of squares: about the mean with an intercept, about zero without. */
  totalSumOfSquares: number;
  /** totalSumOfSquares - residualSumOfSquares. */
  regressionSumOfSquares: number;
  /** sqrt(RSS / dfResidual). */
  residualSd: number;
  rSquared: number;
  adjustedRSquared: number;
  /**
   * Overall F test of all coefficients but the intercept; absent when the model has no such coefficient. F is
   * Infinity (p = 0) for an exact fit, when RSS is below 2^-104 of the total sum of squares.
   */
  fTest?: { value: number; df: [number, number]; p: number };
  /** y - fitted, for every observation given (including weight 0). */
  residuals: number[];
  fitted: number[];
}

const RANK_TOLERANCE = 1e-13;
const REFINEMENT_STEPS = 4;

/** Column-major Householder QR of an n x p matrix (p <= n), stored in place. */
interface Householder {
  n: number;
  p: number;
  /** Householder vectors, v[k] has length n - k. */
  v: Float64Array[];
  beta: number[];
  /** Upper triangle, r[i][j] for j >= i. */
  r: number[][];
}

function householderQr(cols: Float64Array[], n: number, names: readonly string[]): Householder {
  const p = cols.length;
  const a = cols.map((c) => Float64Array.from(c));
  const v: Float64Array[] = [];
  const beta: number[] = [];
  const r: number[][] = Array.from({ length: p }, () => new Array<number>(p).fill(0));
  for (let k = 0; k < p; k++) {
    const col = a[k]!;
    let norm2 = 0;
    for (let i = k; i < n; i++) norm2 += col[i]! * col[i]!;
    const norm = Math.sqrt(norm2);
    if (!(norm > RANK_TOLERANCE)) {
      throw new Error(
        `least squares: predictor "${names[k]}" is (almost) a linear combination of the ones before it; ` +
          'remove it or one of the predictors it depends on.',
      );
    }
    const x0 = col[k]!;
    const alpha = x0 > 0 ? -norm : norm;
    const vk = new Float64Array(n - k);
    for (let i = k; i < n; i++) vk[i - k] = col[i]!;
    vk[0] = x0 - alpha;
    const vnorm2 = norm2 - x0 * x0 + vk[0]! * vk[0]!;
    const b = 2 / vnorm2;
    v.push(vk);
    beta.push(b);
    r[k]![k] = alpha;
    for (let j = k + 1; j < p; j++) {
      const cj = a[j]!;
      let s = 0;
      for (let i = k; i < n; i++) s += vk[i - k]! * cj[i]!;
      s *= b;
      for (let i = k; i < n; i++) cj[i] = cj[i]! - s * vk[i - k]!;
      r[k]![j] = cj[k]!;
    }
  }
  return { n, p, v, beta, r };
}

/** Q' b, in place. */
function applyQt(h: Householder, b: Float64Array): void {
  for (let k = 0; k < h.p; k++) {
    const vk = h.v[k]!;
    let s = 0;
    for (let i = k; i < h.n; i++) s += vk[i - k]! * b[i]!;
    s *= h.beta[k]!;
    for (let i = k; i < h.n; i++) b[i] = b[i]! - s * vk[i - k]!;
  }
}

/** Q b, in place. */
function applyQ(h: Householder, b: Float64Array): void {
  for (let k = h.p - 1; k >= 0; k--) {
    const vk = h.v[k]!;
    let s = 0;
    for (let i = k; i < h.n; i++) s += vk[i - k]! * b[i]!;
    s *= h.beta[k]!;
    for (let i = k; i < h.n; i++) b[i] = b[i]! - s * vk[i - k]!;
  }
}

/** Solves R x = c (back substitution). */
function solveR(h: Householder, c: ArrayLike<number>): Float64Array {
  const x = new Float64Array(h.p);
  for (let i = h.p - 1; i >= 0; i--) {
    let s = c[i]!;
    for (let j = i + 1; j < h.p; j++) s -= h.r[i]![j]! * x[j]!;
    x[i] = s / h.r[i]![i]!;
  }
  return x;
}

/** Solves R' x = c (forward substitution). */
function solveRt(h: Householder, c: ArrayLike<number>): Float64Array {
  const x = new Float64Array(h.p);
  for (let i = 0; i < h.p; i++) {
    let s = c[i]!;
    for (let j = 0; j < i; j++) s -= h.r[j]![i]! * x[j]!;
    x[i] = s / h.r[i]![i]!;
  }
  return x;
}

/** Power of two nearest the Euclidean norm of a column (scaling by it is exact). */
function powerOfTwoScale(col: Float64Array): number {
  let m = 0;
  for (let i = 0; i < col.length; i++) m = Math.max(m, Math.abs(col[i]!));
  if (m === 0) return 1;
  let ss = 0;
  for (let i = 0; i < col.length; i++) ss += (col[i]! / m) * (col[i]! / m);
  const norm = m * Math.sqrt(ss);
  return 2 ** Math.round(Math.log2(norm));
}

function twoSidedTP(estimate: number, se: number, df: number): { t: number; p: number } {
  if (se === 0) {
    if (estimate === 0) throw new Error('least squares: a coefficient and its standard error are both exactly 0.');
    return { t: estimate > 0 ? Infinity : -Infinity, p: 0 };
  }
  const t = estimate / se;
  return { t, p: Math.min(1, 2 * tSf(Math.abs(t), df)) };
}

/**
 * Fits y = b0 + b1 x1 + ... + bk xk (b0 only with an intercept) by least squares.
 * @param predictors one array per predictor column, each as long as y
 * @throws Error when lengths differ, a value is not finite, a weight is negative, there are no more observations
 *   than coefficients, a predictor is a linear combination of others, or y is constant (R squared undefined).
 */
export function leastSquares(
  predictors: readonly (readonly number[])[],
  y: readonly number[],
  options: LeastSquaresOptions = {},
): LeastSquaresFit {
  const intercept = options.intercept ?? true;
  requireFinite(y, 'least squares: y');
  const nAll = y.length;
  predictors.forEach((col, j) => {
    if (col.length !== nAll) {
      throw new Error(`least squares: predictor ${j + 1} has ${col.length} values but y has ${nAll}.`);
    }
    requireFinite(col, `least squares: predictor ${j + 1}`);
  });
  const weights = options.weights;
  if (weights !== undefined) {
    if (weights.length !== nAll) throw new Error(`least squares: ${weights.length} weights for ${nAll} observations.`);
    requireFinite(weights, 'least squares: weights');
    weights.forEach((w, i) => {
      if (w < 0) throw new Error(`least squares: weight ${i + 1} is negative (${w}).`);
    });
  }
  const names = [
    ...(intercept ? ['(Intercept)'] : []),
    ...predictors.map((_, j) => options.names?.[j] ?? `x${j + 1}`),
  ];
  const used: number[] = [];
  for (let i = 0; i < nAll; i++) if (weights === undefined || weights[i]! > 0) used.push(i);
  const n = used.length;
  const p = names.length;
  if (p === 0) throw new Error('least squares: the model has no coefficients (no predictors and no intercept).');
  if (n <= p) {
    throw new Error(`least squares: ${n} observations for ${p} coefficients; at least ${p + 1} are needed.`);
  }
  const sw = used.map((i) => (weights === undefined ? 1 : Math.sqrt(weights[i]!)));
  const rawCols: Float64Array[] = [];
  if (intercept) rawCols.push(Float64Array.from(sw));
  for (const col of predictors) rawCols.push(Float64Array.from(used, (i, k) => col[i]! * sw[k]!));
  const yw = Float64Array.from(used, (i, k) => y[i]! * sw[k]!);
  const scale = rawCols.map(powerOfTwoScale);
  const cols = rawCols.map((c, j) => c.map((v) => v / scale[j]!));

  const qr = householderQr(cols, n, names);

  // Initial solution and residual.
  const c = Float64Array.from(yw);
  applyQt(qr, c);
  const x = solveR(qr, c.subarray(0, p));
  const rv = new Float64Array(n);
  for (let i = p; i < n; i++) rv[i] = c[i]!;
  applyQ(qr, rv);

  // Refinement on the augmented system, residuals in twice the working precision.
  const rowA = new Float64Array(p + 2);
  const rowB = new Float64Array(p + 2);
  const colR = new Float64Array(n);
  for (let step = 0; step < REFINEMENT_STEPS; step++) {
    const f = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      rowA[0] = yw[i]!;
      rowB[0] = 1;
      rowA[1] = rv[i]!;
      rowB[1] = -1;
      for (let j = 0; j < p; j++) {
        rowA[j + 2] = cols[j]![i]!;
        rowB[j + 2] = -x[j]!;
      }
      f[i] = accurateDot(rowA, rowB);
    }
    const g = new Float64Array(p);
    for (let i = 0; i < n; i++) colR[i] = -rv[i]!;
    for (let j = 0; j < p; j++) g[j] = accurateDot(cols[j]!, colR);
    const hv = solveRt(qr, g);
    applyQt(qr, f);
    const d1 = new Float64Array(p);
    for (let j = 0; j < p; j++) d1[j] = f[j]! - hv[j]!;
    const dx = solveR(qr, d1);
    const dr = new Float64Array(n);
    for (let j = 0; j < p; j++) dr[j] = hv[j]!;
    for (let i = p; i < n; i++) dr[i] = f[i]!;
    applyQ(qr, dr);
    let change = 0;
    for (let j = 0; j < p; j++) {
      x[j] = x[j]! + dx[j]!;
      change = Math.max(change, Math.abs(dx[j]!) / Math.max(Math.abs(x[j]!), Number.MIN_VALUE));
    }
    for (let i = 0; i < n; i++) rv[i] = rv[i]! + dr[i]!;
    if (change < 1e-17) break;
  }

  // Residuals of the weighted problem recomputed from the final coefficients in twice the precision.
  const estimates = Array.from(x, (v, j) => v / scale[j]!);
  const fitted = new Array<number>(nAll);
  const residuals = new Array<number>(nAll);
  const wr: number[] = [];
  const rowX = new Float64Array(p + 1);
  const rowC = new Float64Array(p + 1);
  for (let i = 0; i < nAll; i++) {
    let k = 0;
    if (intercept) {
      rowX[k] = 1;
      rowC[k++] = estimates[0]!;
    }
    for (const col of predictors) {
      rowX[k] = col[i]!;
      rowC[k] = estimates[k]!;
      k++;
    }
    rowX[k] = y[i]!;
    rowC[k] = -1;
    const minusResidual = accurateDot(rowX.subarray(0, k + 1), rowC.subarray(0, k + 1));
    residuals[i] = -minusResidual;
    fitted[i] = y[i]! + minusResidual;
  }
  used.forEach((i, k) => wr.push(residuals[i]! * sw[k]!));
  const rss = accurateDot(wr, wr);

  let tss: number;
  if (intercept) {
    const wsum = compensatedSum(sw.map((s) => s * s));
    const ybar = accurateDot(
      sw.map((s) => s * s),
      used.map((i) => y[i]!),
    ) / wsum;
    const dev = used.map((i, k) => (y[i]! - ybar) * sw[k]!);
    tss = accurateDot(dev, dev);
  } else {
    tss = accurateDot(yw, yw);
  }
  if (!(tss > 0)) throw new Error('least squares: y does not vary, so R squared is undefined.');

  const dfResidual = n - p;
  const dfModel = intercept ? p - 1 : p;
  const s2 = rss / dfResidual;
  const residualSd = Math.sqrt(s2);

  // Standard errors from the rows of R^-1 (scaled problem), then unscaled.
  const coefficients: Coefficient[] = [];
  for (let j = 0; j < p; j++) {
    const e = new Float64Array(p);
    e[j] = 1;
    // row j of R^-1 is the solution of R' z = e_j
    const z = solveRt(qr, e);
    let ss = 0;
    for (let k = 0; k < p; k++) ss += z[k]! * z[k]!;
    const se = (residualSd * Math.sqrt(ss)) / scale[j]!;
    const { t, p: pValue } = twoSidedTP(estimates[j]!, se, dfResidual);
    coefficients.push({ name: names[j]!, estimate: estimates[j]!, standardError: se, t, p: pValue });
  }

  const rSquared = 1 - rss / tss;
  const dfTotal = intercept ? n - 1 : n;
  const adjustedRSquared = 1 - (rss / dfResidual) / (tss / dfTotal);
  const fit: LeastSquaresFit = {
    coefficients,
    intercept,
    n,
    dfModel,
    dfResidual,
    residualSumOfSquares: rss,
    totalSumOfSquares: tss,
    regressionSumOfSquares: tss - rss,
    residualSd,
    rSquared,
    adjustedRSquared,
    residuals,
    fitted,
  };
  if (dfModel > 0) {
    // A residual sum of squares below the rounding level of the data (relative 2^-104 of the total) is an exact fit.
    const exact = rss <= Number.EPSILON * Number.EPSILON * tss;
    const value = exact ? Infinity : (tss - rss) / dfModel / s2;
    fit.fTest = { value, df: [dfModel, dfResidual], p: value === Infinity ? 0 : fSf(value, dfModel, dfResidual) };
  }
  return fit;
}

export interface SimpleLinearFit {
  intercept: number;
  slope: number;
  interceptSe: number;
  slopeSe: number;
  /** t statistic and two-sided p-value for slope = 0, with n - 2 degrees of freedom. */
  slopeT: number;
  slopeP: number;
  rSquared: number;
  residualSd: number;
  n: number;
  dfResidual: number;
}

/**
 * Straight line y = a + b x by (weighted) least squares; a convenience over leastSquares().
 * @throws Error as leastSquares() does, and when x does not vary.
 */
export function simpleLinearFit(
  x: readonly number[],
  y: readonly number[],
  weights?: readonly number[],
): SimpleLinearFit {
  const fit = leastSquares([x], y, weights === undefined ? { names: ['x'] } : { names: ['x'], weights });
  const [a, b] = fit.coefficients as [Coefficient, Coefficient];
  return {
    intercept: a.estimate,
    slope: b.estimate,
    interceptSe: a.standardError,
    slopeSe: b.standardError,
    slopeT: b.t,
    slopeP: b.p,
    rSquared: fit.rSquared,
    residualSd: fit.residualSd,
    n: fit.n,
    dfResidual: fit.dfResidual,
  };
}
