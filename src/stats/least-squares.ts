/**
 * Linear least squares by Householder QR with iterative refinement.
 *
 * Method: the columns of the design matrix are scaled by powers of two (exact) to unit order, factorized A = QR by
 * Householder reflections (Golub & Van Loan, "Matrix Computations", 4th ed., 2013, Algorithm 5.2.1), and the solution
 * and residual are then refined on the augmented system [I A; A' 0][r; x] = [y; 0] with the residuals of that system
 * computed in twice the working precision (Björck, "Iterative refinement of linear least squares solutions I", BIT 7
 * (1967) 257-278; Björck, "Numerical Methods for Least Squares Problems", SIAM 1996, section 2.9). The design is held
 * as a double-double (each entry an unevaluated sum hi + lo of two doubles; Dekker, "A floating-point technique for
 * extending the available precision", Numerische Mathematik 18 (1971) 224-242): data given in double have lo = 0,
 * weighted rows and polynomial terms x^k (polynomialFit) are formed in it with Dekker's TwoProduct. The QR
 * factors are those of the double part only; the refinement residuals are taken against the whole double-double
 * design, so the refinement converges to the least-squares solution of that design (the double QR serves as the
 * preconditioner). This keeps every NIST StRD linear regression problem (Longley, Filip, Wampler1-5 included) at 13
 * digits or more in double precision; for Filip, a degree-10 polynomial, rounding x^k to double alone would cost
 * 6 of them.
 *
 * Standard errors are s * sqrt(diag((A'A)^-1)) with s^2 = RSS / (n - p), each diagonal element refined in the same
 * way (augmented system with right-hand side [0; -e_j], whose x part is (A'A)^-1 e_j); t = estimate / SE with n - p
 * degrees of freedom (Draper & Smith, "Applied Regression Analysis", 3rd ed., 1998, ch. 5). With weights w, rows are
 * multiplied by sqrt(w) (weighted least squares, Draper & Smith section 9.2); rows with weight 0 are left out of the
 * fit and of the degrees of freedom, as R's lm() does. R squared is 1 - RSS/TSS with TSS taken about the (weighted)
 * mean of y when the model has an intercept and about zero when it has not (as in R's summary.lm and the NIST
 * no-intercept files).
 */
import { accurateDot, twoProduct } from './compensated-dot.js';
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
  /** estimate / standardError (NaN when both are exactly 0, in an exact fit). */
  t: number;
  /** Two-sided p-value of t with dfResidual degrees of freedom (NaN when t is). */
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

/** Options of polynomialFit(). */
export interface PolynomialFitOptions {
  /** Add a constant term (default true). */
  intercept?: boolean;
  /** Non-negative weights, one per observation. */
  weights?: readonly number[];
  /** Name of the variable in the coefficient names: x, x^2, ... (default 'x'). */
  name?: string;
}

const RANK_TOLERANCE = 1e-13;
/** Most refinement steps; the loop stops sooner once a step no longer changes the solution. */
const MAX_REFINEMENT_STEPS = 12;

/**
 * A column of numbers each held as the unevaluated sum hi + lo of two doubles (double-double). Data given in double
 * have lo = 0; polynomial terms x^k are formed with lo carrying what the rounding of hi to double lost.
 */
interface Column {
  hi: Float64Array;
  lo: Float64Array;
}

/** (hi + lo) * s in double-double, renormalized so that |lo| <= ulp(hi) / 2. */
function scaleColumn(col: Column, s: readonly number[] | Float64Array, rows: readonly number[]): Column {
  const hi = new Float64Array(rows.length);
  const lo = new Float64Array(rows.length);
  const pr: [number, number] = [0, 0];
  rows.forEach((i, k) => {
    twoProduct(col.hi[i]!, s[k]!, pr);
    const e = pr[1] + col.lo[i]! * s[k]!;
    const sum = pr[0] + e;
    hi[k] = sum;
    lo[k] = e - (sum - pr[0]);
  });
  return { hi, lo };
}

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

function householderQr(cols: readonly Float64Array[], n: number, names: readonly string[]): Householder {
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

/** The scaled, weighted design A = hi + lo (n x p, double-double) and the QR factors of its double part. */
interface Design {
  n: number;
  p: number;
  cols: Column[];
  qr: Householder;
}

/**
 * Solves the augmented system [I A; A' 0][r; x] = [b; c] by iterative refinement from r = 0, x = 0 (the first step
 * is the plain QR solution). Each step computes f = b - r - A x and g = c - A' r in twice the working precision
 * against the double-double design, and corrects with the QR factors of its double part (Björck 1967): the
 * refinement converges to the solution for the design as held in double-double as long as the double QR is a good
 * enough approximation of it (condition number of the scaled design well below 1e16).
 * b = y gives the least-squares solution and its residual; b = 0, c = -e_j gives x = (A'A)^-1 e_j.
 */
function solveAugmented(d: Design, b: Column | null, c: Float64Array | null): Float64Array {
  const { n, p, cols, qr } = d;
  const x = new Float64Array(p);
  const r = new Float64Array(n);
  const rowA = new Float64Array(2 * p + 3);
  const rowB = new Float64Array(2 * p + 3);
  const colA = new Float64Array(2 * n + 1);
  const colB = new Float64Array(2 * n + 1);
  let previous = Infinity;
  for (let step = 0; step < MAX_REFINEMENT_STEPS; step++) {
    const f = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      rowA[0] = b === null ? 0 : b.hi[i]!;
      rowB[0] = 1;
      rowA[1] = b === null ? 0 : b.lo[i]!;
      rowB[1] = 1;
      rowA[2] = r[i]!;
      rowB[2] = -1;
      for (let j = 0; j < p; j++) {
        rowA[3 + 2 * j] = cols[j]!.hi[i]!;
        rowA[4 + 2 * j] = cols[j]!.lo[i]!;
        rowB[3 + 2 * j] = -x[j]!;
        rowB[4 + 2 * j] = -x[j]!;
      }
      f[i] = accurateDot(rowA, rowB);
    }
    const g = new Float64Array(p);
    colA[0] = 1;
    for (let i = 0; i < n; i++) {
      colB[1 + 2 * i] = -r[i]!;
      colB[2 + 2 * i] = -r[i]!;
    }
    for (let j = 0; j < p; j++) {
      colB[0] = c === null ? 0 : c[j]!;
      const col = cols[j]!;
      for (let i = 0; i < n; i++) {
        colA[1 + 2 * i] = col.hi[i]!;
        colA[2 + 2 * i] = col.lo[i]!;
      }
      g[j] = accurateDot(colA, colB);
    }
    const h = solveRt(qr, g);
    applyQt(qr, f);
    const d1 = new Float64Array(p);
    for (let j = 0; j < p; j++) d1[j] = f[j]! - h[j]!;
    const dx = solveR(qr, d1);
    const dr = new Float64Array(n);
    for (let j = 0; j < p; j++) dr[j] = h[j]!;
    for (let i = p; i < n; i++) dr[i] = f[i]!;
    applyQ(qr, dr);
    let change = 0;
    for (let j = 0; j < p; j++) {
      x[j] = x[j]! + dx[j]!;
      change = Math.max(change, Math.abs(dx[j]!) / Math.max(Math.abs(x[j]!), Number.MIN_VALUE));
    }
    for (let i = 0; i < n; i++) r[i] = r[i]! + dr[i]!;
    // Stop at convergence, or when a step no longer halves the change (the rounding level has been reached).
    if (change < 1e-17 || (step >= 2 && change > previous / 2)) break;
    previous = change;
  }
  return x;
}

function twoSidedTP(estimate: number, se: number, df: number): { t: number; p: number } {
  if (se === 0) {
    // 0/0: a coefficient that is exactly 0 in an exact fit (e.g. the intercept of y = x) has no t statistic. R's
    // summary.lm prints NaN for such a ratio; callers test only coefficients that cannot be 0/0 (a slope of 0 with no
    // residual means y does not vary, refused above).
    if (estimate === 0) return { t: NaN, p: NaN };
    return { t: estimate > 0 ? Infinity : -Infinity, p: 0 };
  }
  const t = estimate / se;
  return { t, p: Math.min(1, 2 * tSf(Math.abs(t), df)) };
}

function checkWeights(weights: readonly number[] | undefined, nAll: number): void {
  if (weights === undefined) return;
  if (weights.length !== nAll) throw new Error(`least squares: ${weights.length} weights for ${nAll} observations.`);
  requireFinite(weights, 'least squares: weights');
  weights.forEach((w, i) => {
    if (w < 0) throw new Error(`least squares: weight ${i + 1} is negative (${w}).`);
  });
}

/** The fit itself, for a design given column by column in double-double over all observations (intercept included). */
function fitColumns(
  design: readonly Column[],
  y: readonly number[],
  intercept: boolean,
  weights: readonly number[] | undefined,
  names: readonly string[],
): LeastSquaresFit {
  const nAll = y.length;
  const used: number[] = [];
  for (let i = 0; i < nAll; i++) if (weights === undefined || weights[i]! > 0) used.push(i);
  const n = used.length;
  const p = names.length;
  if (p === 0) throw new Error('least squares: the model has no coefficients (no predictors and no intercept).');
  if (n <= p) {
    throw new Error(`least squares: ${n} observations for ${p} coefficients; at least ${p + 1} are needed.`);
  }
  const sw = used.map((i) => (weights === undefined ? 1 : Math.sqrt(weights[i]!)));
  // Rows multiplied by sqrt(w) in double-double, then columns scaled by powers of two (exactly).
  const weighted = design.map((col) => scaleColumn(col, sw, used));
  const scale = weighted.map((col) => powerOfTwoScale(col.hi));
  const cols = weighted.map((col, j) => ({
    hi: col.hi.map((v) => v / scale[j]!),
    lo: col.lo.map((v) => v / scale[j]!),
  }));
  const yw = scaleColumn({ hi: Float64Array.from(y), lo: new Float64Array(nAll) }, sw, used);
  const qr = householderQr(
    cols.map((col) => col.hi),
    n,
    names,
  );
  const d: Design = { n, p, cols, qr };
  const x = solveAugmented(d, yw, null);

  // Residuals of every observation, from the final coefficients and the double-double design, in twice the precision.
  const estimates = Array.from(x, (v, j) => v / scale[j]!);
  const fitted = new Array<number>(nAll);
  const residuals = new Array<number>(nAll);
  const rowX = new Float64Array(2 * p + 1);
  const rowC = new Float64Array(2 * p + 1);
  for (let j = 0; j < p; j++) {
    rowC[2 * j] = estimates[j]!;
    rowC[2 * j + 1] = estimates[j]!;
  }
  rowC[2 * p] = -1;
  for (let i = 0; i < nAll; i++) {
    for (let j = 0; j < p; j++) {
      rowX[2 * j] = design[j]!.hi[i]!;
      rowX[2 * j + 1] = design[j]!.lo[i]!;
    }
    rowX[2 * p] = y[i]!;
    const minusResidual = accurateDot(rowX, rowC);
    residuals[i] = -minusResidual;
    fitted[i] = y[i]! + minusResidual;
  }
  const wr = used.map((i, k) => residuals[i]! * sw[k]!);
  const rss = accurateDot(wr, wr);

  let tss: number;
  if (intercept) {
    const wsum = compensatedSum(sw.map((s) => s * s));
    const ybar =
      accurateDot(
        sw.map((s) => s * s),
        used.map((i) => y[i]!),
      ) / wsum;
    const dev = used.map((i, k) => (y[i]! - ybar) * sw[k]!);
    tss = accurateDot(dev, dev);
  } else {
    tss = accurateDot(yw.hi, yw.hi);
  }
  if (!(tss > 0)) throw new Error('least squares: y does not vary, so R squared is undefined.');

  const dfResidual = n - p;
  const dfModel = intercept ? p - 1 : p;
  const s2 = rss / dfResidual;
  const residualSd = Math.sqrt(s2);

  // Standard errors: s sqrt(((A'A)^-1)_jj), the diagonal element refined like the solution (b = 0, c = -e_j).
  const coefficients: Coefficient[] = [];
  for (let j = 0; j < p; j++) {
    const e = new Float64Array(p);
    e[j] = -1;
    const z = solveAugmented(d, null, e);
    const se = (residualSd * Math.sqrt(z[j]!)) / scale[j]!;
    const { t, p: pValue } = twoSidedTP(estimates[j]!, se, dfResidual);
    coefficients.push({ name: names[j]!, estimate: estimates[j]!, standardError: se, t, p: pValue });
  }

  const rSquared = 1 - rss / tss;
  const dfTotal = intercept ? n - 1 : n;
  const adjustedRSquared = 1 - rss / dfResidual / (tss / dfTotal);
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
  checkWeights(options.weights, nAll);
  const names = [
    ...(intercept ? ['(Intercept)'] : []),
    ...predictors.map((_, j) => options.names?.[j] ?? `x${j + 1}`),
  ];
  const design: Column[] = [];
  if (intercept) design.push({ hi: new Float64Array(nAll).fill(1), lo: new Float64Array(nAll) });
  for (const col of predictors) design.push({ hi: Float64Array.from(col), lo: new Float64Array(nAll) });
  return fitColumns(design, y, intercept, options.weights, names);
}

/**
 * Polynomial y = b0 + b1 x + b2 x^2 + ... + bd x^d by least squares (b0 only with an intercept). The powers x^k are
 * formed in double-double (each product split exactly by Dekker's TwoProduct), so the fit is that of the exact
 * powers of the given x, not of powers rounded to double: for a high degree the rounding of x^k alone can move the
 * solution in the 8th digit (NIST StRD Filip). Coefficients are named x, x^2, ... (after options.name).
 * @throws Error as leastSquares() does, and when degree is not a whole number of at least 1 or a power overflows.
 */
export function polynomialFit(
  x: readonly number[],
  y: readonly number[],
  degree: number,
  options: PolynomialFitOptions = {},
): LeastSquaresFit {
  if (!Number.isInteger(degree) || degree < 1) {
    throw new Error(`polynomial fit: the degree must be a whole number of at least 1, not ${degree}.`);
  }
  const intercept = options.intercept ?? true;
  requireFinite(y, 'least squares: y');
  requireFinite(x, 'polynomial fit: x');
  const nAll = y.length;
  if (x.length !== nAll) throw new Error(`polynomial fit: x has ${x.length} values but y has ${nAll}.`);
  checkWeights(options.weights, nAll);
  const name = options.name ?? 'x';
  const names = [
    ...(intercept ? ['(Intercept)'] : []),
    ...Array.from({ length: degree }, (_, k) => (k === 0 ? name : `${name}^${k + 1}`)),
  ];
  const design: Column[] = [];
  if (intercept) design.push({ hi: new Float64Array(nAll).fill(1), lo: new Float64Array(nAll) });
  let power: Column = { hi: Float64Array.from(x), lo: new Float64Array(nAll) };
  const all = Array.from({ length: nAll }, (_, i) => i);
  design.push(power);
  for (let k = 2; k <= degree; k++) {
    // x^k = x^(k-1) * x, each term in double-double
    power = scaleColumn(power, x, all);
    power.hi.forEach((v, i) => {
      if (!Number.isFinite(v)) {
        throw new Error(`polynomial fit: x^${k} overflows at observation ${i + 1} (x = ${x[i]}).`);
      }
    });
    design.push(power);
  }
  return fitColumns(design, y, intercept, options.weights, names);
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
