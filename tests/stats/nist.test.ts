/**
 * NIST Statistical Reference Datasets (StRD): univariate summary statistics, linear least squares and one-way ANOVA
 * against the certified values printed in each file (computed by NIST in multiple precision; source: NIST/ITL
 * Statistical Engineering Division, files as stored in /work/shared/reference/nist-strd). Accuracy is measured as the
 * log relative error (LRE, number of correct significant digits; McCullough, "Assessing the reliability of statistical
 * software: Part I", The American Statistician 52 (1998) 358-366). Required: 12 digits on the lower and average
 * difficulty files, 9 on the higher ones, with one recorded exception (Filip, below).
 */
import { describe, expect, it } from 'vitest';
import { logRelativeError } from '../helpers/tolerance.js';
import {
  anovaCertified,
  linregCertified,
  readStrd,
  shiftedExactly,
  univariateCertified,
  type Difficulty,
} from '../helpers/nist.js';
import { mean } from '../../src/stats/mean.js';
import { standardDeviation } from '../../src/stats/variance.js';
import { lag1Autocorrelation } from '../../src/stats/autocorrelation.js';
import { leastSquares, polynomialFit, type LeastSquaresFit } from '../../src/stats/least-squares.js';
import { oneWayAnova } from '../../src/stats/anova-oneway.js';

function required(difficulty: Difficulty | undefined): number {
  return difficulty === 'higher' ? 9 : 12;
}

interface Row {
  file: string;
  difficulty: string;
  quantity: string;
  certified: number;
  computed: number;
  lre: number;
  required: number;
}

function check(rows: Row[], file: string, difficulty: Difficulty | undefined, quantity: string, computed: number, certified: number, need = required(difficulty)): void {
  rows.push({
    file,
    difficulty: difficulty ?? 'not stated',
    quantity,
    certified,
    computed,
    lre: Number(logRelativeError(computed, certified).toFixed(2)),
    required: need,
  });
}

function assertRows(rows: Row[]): void {
  console.table(rows);
  const failures = rows.filter((r) => !(r.lre >= r.required));
  expect(failures, JSON.stringify(failures, null, 1)).toEqual([]);
}

const UNIVARIATE = ['PiDigits', 'Lottery', 'Lew', 'Mavro', 'Michelso', 'NumAcc1', 'NumAcc2', 'NumAcc3', 'NumAcc4'];

describe('NIST StRD univariate: mean, standard deviation, lag-1 autocorrelation', () => {
  it('matches the certified values of all 9 files', () => {
    const rows: Row[] = [];
    const raw: { file: string; sdLreFromDoubles: number }[] = [];
    for (const name of UNIVARIATE) {
      const f = readStrd('univariate', name);
      const cert = univariateCertified(f);
      const tokens = f.rows.map((r) => r[0]!);
      expect(tokens.length, `${name} observations`).toBe(cert.n);
      // Shift by the first value exactly in decimal (see shiftedExactly); the mean adds the offset back.
      const { offset, values } = shiftedExactly(tokens);
      check(rows, name, f.difficulty, 'mean', offset + mean(values), cert.mean);
      check(rows, name, f.difficulty, 'sd', standardDeviation(values), cert.sd);
      check(rows, name, f.difficulty, 'r(1)', lag1Autocorrelation(values), cert.r1);
      // The same statistics from the text rounded straight to double, for the record: here the data themselves
      // carry representation error (about 1e-9 relative to the spread in NumAcc3/4).
      const doubles = tokens.map(Number);
      raw.push({ file: name, sdLreFromDoubles: Number(logRelativeError(standardDeviation(doubles), cert.sd).toFixed(2)) });
      check(rows, name, f.difficulty, 'mean (direct parse)', mean(doubles), cert.mean);
    }
    console.table(raw);
    assertRows(rows);
  });
});

/** Degree of the polynomial in x for the polynomial files (the model written in each header), 0 for Longley. */
function polynomialDegree(name: string): number {
  switch (name) {
    case 'Norris':
    case 'NoInt1':
    case 'NoInt2':
      return 1;
    case 'Pontius':
      return 2;
    case 'Filip':
      return 10;
    case 'Longley':
      return 0;
    default:
      return 5; // Wampler1-5
  }
}

const LINREG = ['Norris', 'Pontius', 'NoInt1', 'NoInt2', 'Longley', 'Filip', 'Wampler1', 'Wampler2', 'Wampler3', 'Wampler4', 'Wampler5'];

/**
 * The polynomial files of degree 2 and more (Pontius, Filip, Wampler1-5) go through polynomialFit(), which forms the
 * powers of x in double-double; Norris, NoInt1/2 (straight lines) and Longley (six predictors) through
 * leastSquares() with the columns as read. Filip (degree 10) needs the exact powers: the problem is so
 * ill-conditioned that rounding x^k to double alone moves its solution in the 8th digit (the exact least-squares
 * solution of the design rounded to double agrees with the certified values to only 7.6 digits, computed in exact
 * rational arithmetic with Python fractions), so the same fit from powers rounded to double is shown for the record
 * only.
 */
function fitFile(name: string, rows: string[][]): LeastSquaresFit {
  const y = rows.map((r) => Number(r[0]));
  const x = rows.map((r) => Number(r[1]));
  const degree = polynomialDegree(name);
  const intercept = name !== 'NoInt1' && name !== 'NoInt2';
  if (degree === 0) return leastSquares([1, 2, 3, 4, 5, 6].map((j) => rows.map((r) => Number(r[j]))), y);
  if (degree === 1) return leastSquares([x], y, { intercept });
  return polynomialFit(x, y, degree, { intercept });
}

describe('NIST StRD linear regression: coefficients, their SDs, residual SD, R squared, ANOVA table', () => {
  it('matches the certified values of all 11 files', () => {
    const rows: Row[] = [];
    for (const name of LINREG) {
      const f = readStrd('linreg', name);
      const cert = linregCertified(f);
      const fit = fitFile(name, f.rows);
      const need = required(f.difficulty);
      expect(fit.coefficients.length, `${name} parameters`).toBe(cert.parameters.length);
      cert.parameters.forEach((c, j) => {
        check(rows, name, f.difficulty, `${c.name} estimate`, fit.coefficients[j]!.estimate, c.estimate, need);
        check(rows, name, f.difficulty, `${c.name} sd`, fit.coefficients[j]!.standardError, c.sd, need);
      });
      check(rows, name, f.difficulty, 'residual sd', fit.residualSd, cert.residualSd, need);
      check(rows, name, f.difficulty, 'R squared', fit.rSquared, cert.rSquared, need);
      expect(fit.dfModel, `${name} regression df`).toBe(cert.regression.df);
      expect(fit.dfResidual, `${name} residual df`).toBe(cert.residual.df);
      check(rows, name, f.difficulty, 'regression SS', fit.regressionSumOfSquares, cert.regression.ss, need);
      check(rows, name, f.difficulty, 'residual SS', fit.residualSumOfSquares, cert.residual.ss, need);
      check(rows, name, f.difficulty, 'F', fit.fTest!.value, cert.regression.f, need);
    }
    const lowest = new Map<string, number>();
    for (const r of rows) lowest.set(r.difficulty, Math.min(lowest.get(r.difficulty) ?? Infinity, r.lre));
    console.table([...lowest].map(([difficulty, lre]) => ({ difficulty, lowestLre: lre })));
    assertRows(rows);
  });

  it('leastSquares() on powers rounded to double meets the same bounds for Pontius and Wampler1-5', () => {
    const rows: Row[] = [];
    for (const name of ['Pontius', 'Wampler1', 'Wampler2', 'Wampler3', 'Wampler4', 'Wampler5', 'Filip']) {
      const f = readStrd('linreg', name);
      const cert = linregCertified(f);
      const y = f.rows.map((r) => Number(r[0]));
      const x = f.rows.map((r) => Number(r[1]));
      const powers = Array.from({ length: polynomialDegree(name) }, (_, k) => x.map((v) => v ** (k + 1)));
      const fit = leastSquares(powers, y);
      const part: Row[] = [];
      cert.parameters.forEach((c, j) => {
        check(part, name, f.difficulty, `${c.name} estimate`, fit.coefficients[j]!.estimate, c.estimate);
        check(part, name, f.difficulty, `${c.name} sd`, fit.coefficients[j]!.standardError, c.sd);
      });
      check(part, name, f.difficulty, 'residual sd', fit.residualSd, cert.residualSd);
      check(part, name, f.difficulty, 'R squared', fit.rSquared, cert.rSquared);
      if (name === 'Filip') {
        // For the record only: with x^k rounded to double, Filip is a different problem (see fitFile above); the
        // digits here are about 8 on the estimates and 7.7 on their SDs (shown, not required).
        console.table(part);
      } else {
        rows.push(...part);
      }
    }
    assertRows(rows);
  });
});

const ANOVA = ['SiRstv', 'SmLs01', 'SmLs02', 'SmLs03', 'AtmWtAg', 'SmLs04', 'SmLs05', 'SmLs06', 'SmLs07', 'SmLs08', 'SmLs09'];

describe('NIST StRD one-way ANOVA: sums of squares, mean squares, F, R squared, residual SD', () => {
  it('matches the certified values of all 11 files', () => {
    const rows: Row[] = [];
    const raw: { file: string; fLreFromDoubles: number }[] = [];
    for (const name of ANOVA) {
      const f = readStrd('anova', name);
      const cert = anovaCertified(f);
      // Responses shifted exactly in decimal by the first one (every certified ANOVA quantity is shift-invariant).
      const { values } = shiftedExactly(f.rows.map((r) => r[1]!));
      const groups: number[][] = [];
      f.rows.forEach((r, i) => {
        const g = Number(r[0]) - 1;
        (groups[g] ??= []).push(values[i]!);
      });
      const res = oneWayAnova(groups);
      const t = res.table;
      // For the record: F from the text rounded straight to double (the data then carry representation error of up
      // to 1e-4 relative to their spread in SmLs07-09).
      const direct: number[][] = [];
      f.rows.forEach((r) => (direct[Number(r[0]) - 1] ??= []).push(Number(r[1])));
      raw.push({ file: name, fLreFromDoubles: Number(logRelativeError(oneWayAnova(direct).table.f, cert.between.f).toFixed(2)) });
      expect(t.between.df, `${name} between df`).toBe(cert.between.df);
      expect(t.within.df, `${name} within df`).toBe(cert.within.df);
      check(rows, name, f.difficulty, 'between SS', t.between.ss, cert.between.ss);
      check(rows, name, f.difficulty, 'between MS', t.between.ms, cert.between.ms);
      check(rows, name, f.difficulty, 'within SS', t.within.ss, cert.within.ss);
      check(rows, name, f.difficulty, 'within MS', t.within.ms, cert.within.ms);
      check(rows, name, f.difficulty, 'F', t.f, cert.between.f);
      check(rows, name, f.difficulty, 'R squared', t.rSquared, cert.rSquared);
      check(rows, name, f.difficulty, 'residual sd', t.residualSd, cert.residualSd);
      expect(res.statistic?.value).toBe(t.f);
    }
    console.table(raw);
    assertRows(rows);
  });
});
