import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { binomCdf, binomPmf, binomQuantile, binomSf } from '../../src/stats/distributions/binomial.js';
import { hyperCdf, hyperPmf, hyperSf } from '../../src/stats/distributions/hypergeometric.js';
import { expectClose, relativeError } from '../helpers/tolerance.js';
import { R_REF, flag, num, tolFor } from './distributions-fixture.js';

function worstOf(errors: number[]): number {
  return errors.reduce((a, b) => Math.max(a, b), 0);
}

describe('binomial against R 4.2 (tests/fixtures/r/distributions.json)', () => {
  it('dbinom, n up to 1e5, relative 1e-12', () => {
    // Source: R 4.2.2 dbinom(x, size, prob) via tests/fixtures/r/distributions.R.
    const errs: number[] = [];
    for (const r of R_REF.dbinom!) {
      const expected = num(r, 'value');
      const actual = binomPmf(num(r, 'x'), num(r, 'size'), num(r, 'prob'));
      if (expected === 0 && actual < 1e-300) continue;
      expectClose(actual, expected, tolFor(expected, 1e-12), `dbinom(${num(r, 'x')}, ${num(r, 'size')}, ${num(r, 'prob')})`);
      if (expected > 1e-300) errs.push(relativeError(actual, expected));
    }
    console.log('dbinom worst relative error', worstOf(errs));
  });
  it('pbinom both tails, relative 1e-10', () => {
    // Source: R 4.2.2 pbinom(x, size, prob, lower.tail = lower) via tests/fixtures/r/distributions.R.
    const errs: number[] = [];
    for (const r of R_REF.pbinom!) {
      const expected = num(r, 'value');
      const [x, n, p] = [num(r, 'x'), num(r, 'size'), num(r, 'prob')];
      const actual = flag(r, 'lower') ? binomCdf(x, n, p) : binomSf(x, n, p);
      if (expected === 0 && actual < 1e-300) continue;
      expectClose(actual, expected, tolFor(expected, 1e-10), `pbinom(${x}, ${n}, ${p}, lower=${flag(r, 'lower')})`);
      if (expected > 1e-300) errs.push(relativeError(actual, expected));
    }
    console.log('pbinom worst relative error', worstOf(errs));
  });
  it('qbinom matches exactly', () => {
    // Source: R 4.2.2 qbinom(p, size, prob) via tests/fixtures/r/distributions.R.
    for (const r of R_REF.qbinom!) {
      expect(binomQuantile(num(r, 'p'), num(r, 'size'), num(r, 'prob')), JSON.stringify(r)).toBe(num(r, 'value'));
    }
  });
});

describe('hypergeometric against R 4.2', () => {
  it('dhyper, relative 1e-12', () => {
    // Source: R 4.2.2 dhyper(x, m, n, k) via tests/fixtures/r/distributions.R.
    for (const r of R_REF.dhyper!) {
      const expected = num(r, 'value');
      const actual = hyperPmf(num(r, 'x'), num(r, 'm'), num(r, 'n'), num(r, 'k'));
      if (expected === 0 && actual < 1e-300) continue;
      expectClose(actual, expected, tolFor(expected, 1e-12), `dhyper ${JSON.stringify(r)}`);
    }
  });
  it('phyper both tails, relative 1e-10', () => {
    // Source: R 4.2.2 phyper(x, m, n, k, lower.tail = lower) via tests/fixtures/r/distributions.R.
    const errs: number[] = [];
    for (const r of R_REF.phyper!) {
      const expected = num(r, 'value');
      const [x, m, n, k] = [num(r, 'x'), num(r, 'm'), num(r, 'n'), num(r, 'k')];
      const actual = flag(r, 'lower') ? hyperCdf(x, m, n, k) : hyperSf(x, m, n, k);
      if (expected === 0 && actual < 1e-300) continue;
      expectClose(actual, expected, tolFor(expected, 1e-10), `phyper ${JSON.stringify(r)}`);
      if (expected > 1e-300) errs.push(relativeError(actual, expected));
    }
    console.log('phyper worst relative error', worstOf(errs));
  });
});

describe('discrete distributions, properties', () => {
  it('binomial cdf + sf = 1 and the pmf sums to the cdf', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 200 }), fc.double({ min: 0.01, max: 0.99, noNaN: true }), fc.nat(), (n, p, kk) => {
        const k = kk % n;
        expect(Math.abs(binomCdf(k, n, p) + binomSf(k, n, p) - 1)).toBeLessThanOrEqual(1e-14);
        let s = 0;
        for (let j = 0; j <= k; j++) s += binomPmf(j, n, p);
        // Subnormal results (below 2.2e-308) hold fewer significant bits, so only normal doubles are compared.
        if (binomCdf(k, n, p) > 1e-290) expect(relativeError(s, binomCdf(k, n, p))).toBeLessThanOrEqual(1e-12);
        // A cdf value that rounds to 1 maps to n, as in R; below that the quantile returns k itself.
        const c = binomCdf(k, n, p);
        if (c < 1 - 1e-12 && c > 1e-290) expect(binomQuantile(c, n, p)).toBe(k);
      }),
    );
  });
  it('hypergeometric cdf + sf = 1 and monotone cdf', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 60 }), fc.integer({ min: 0, max: 60 }), fc.nat(), fc.nat(), (m, n, kk, xx) => {
        const k = m + n === 0 ? 0 : kk % (m + n + 1);
        const x = xx % (k + 1);
        expect(Math.abs(hyperCdf(x, m, n, k) + hyperSf(x, m, n, k) - 1)).toBeLessThanOrEqual(1e-14);
        if (x > 0) expect(hyperCdf(x - 1, m, n, k)).toBeLessThanOrEqual(hyperCdf(x, m, n, k));
      }),
    );
  });
  it('rejects invalid parameters clearly', () => {
    expect(() => binomPmf(1.5, 10, 0.3)).toThrow(/whole number/);
    expect(() => binomCdf(1, -1, 0.3)).toThrow(/whole number/);
    expect(() => binomSf(1, 10, 1.3)).toThrow(/between 0 and 1/);
    expect(() => hyperCdf(1, 5, 5, 11)).toThrow(/exceeds/);
  });
});
