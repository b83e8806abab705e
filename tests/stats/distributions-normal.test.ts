import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { normalCdf, normalPdf, normalQuantile, normalSf, normalSfQuantile } from '../../src/stats/distributions/normal.js';
import { erf, erfc, erfcx } from '../../src/stats/distributions/special.js';
import { expectClose, relativeError } from '../helpers/tolerance.js';
import { R_REF, flag, num, tolFor } from './distributions-fixture.js';

describe('normal distribution against R 4.2 (tests/fixtures/r/distributions.json)', () => {
  it('pnorm, both tails, z from -38 to 38, relative 1e-13', () => {
    // Source: R 4.2.2 pnorm(q, lower.tail = lower), via tests/fixtures/r/distributions.R.
    let worst = 0;
    for (const row of R_REF.pnorm!) {
      const q = num(row, 'q');
      const expected = num(row, 'value');
      const actual = flag(row, 'lower') ? normalCdf(q) : normalSf(q);
      if (expected === 0) {
        // R flushes results below about 1e-308 to 0 where we return a subnormal: both are below any p-value use.
        expect(actual).toBeLessThan(1e-307);
        continue;
      }
      expectClose(actual, expected, tolFor(expected, 1e-13), `pnorm(${q}, lower=${flag(row, 'lower')})`);
      if (Math.abs(expected) > 1e-300) worst = Math.max(worst, relativeError(actual, expected));
    }
    expect(worst).toBeLessThan(1e-13);
  });

  it('qnorm, both tails, p from 1e-300 to 1 - 1e-12, relative 1e-14', () => {
    // Source: R 4.2.2 qnorm(p, lower.tail = lower), via tests/fixtures/r/distributions.R.
    for (const row of R_REF.qnorm!) {
      const p = num(row, 'p');
      const expected = num(row, 'value');
      const actual = flag(row, 'lower') ? normalQuantile(p) : normalSfQuantile(p);
      expectClose(actual, expected, 1e-14, `qnorm(${p}, lower=${flag(row, 'lower')})`);
    }
  });
});

describe('normal distribution, published values', () => {
  it('matches the familiar table values', () => {
    // Source: R 4.2.2 printed pnorm(1.96) = 0.97500210485177963 and qnorm(0.975) = 1.9599639845400536
    // (scipy 1.17.1 norm.cdf(1.96) = 0.9750021048517795, norm.ppf(0.975) = 1.959963984540054 agree).
    expectClose(normalCdf(1.96), 0.9750021048517795, 'closed', 'Phi(1.96)');
    expectClose(normalQuantile(0.975), 1.959963984540054, 'closed', 'qnorm(0.975)');
    // Source: R 4.2.2 dnorm(1) = 0.24197072451914337.
    expectClose(normalPdf(1), 0.24197072451914337, 'closed', 'dnorm(1)');
  });

  it('error functions match scipy 1.17.1 scipy.special', () => {
    // Source: scipy 1.17.1, printed by python3: special.erf(0.3) = 0.3286267594591274, special.erfc(2.0) =
    // 0.004677734981047266, special.erfc(10.0) = 2.0884875837625446e-45, special.erfcx(10.0) = 0.05614099274382259,
    // special.erfc(1.0) = 0.15729920705028516.
    expectClose(erf(0.3), 0.3286267594591274, 1e-14, 'erf(0.3)');
    expectClose(erfc(2), 0.004677734981047266, 1e-14, 'erfc(2)');
    expectClose(erfc(10), 2.0884875837625446e-45, 1e-13, 'erfc(10)');
    expectClose(erfcx(10), 0.05614099274382259, 1e-13, 'erfcx(10)');
    expectClose(erfc(-1), 2 - 0.15729920705028516, 1e-15, 'erfc(-1)');
  });
});

describe('normal distribution, properties', () => {
  it('cdf + sf = 1 within 1e-15 where both are not tiny', () => {
    fc.assert(
      fc.property(fc.double({ min: -8, max: 8, noNaN: true }), (z) => {
        expect(Math.abs(normalCdf(z) + normalSf(z) - 1)).toBeLessThanOrEqual(1e-15);
      }),
    );
  });

  it('cdf is monotone non-decreasing', () => {
    fc.assert(
      fc.property(fc.double({ min: -40, max: 40, noNaN: true }), fc.double({ min: -40, max: 40, noNaN: true }), (a, b) => {
        const [lo, hi] = a <= b ? [a, b] : [b, a];
        expect(normalCdf(lo)).toBeLessThanOrEqual(normalCdf(hi));
        expect(normalSf(lo)).toBeGreaterThanOrEqual(normalSf(hi));
      }),
    );
  });

  it('quantile inverts the cdf and the sf', () => {
    fc.assert(
      fc.property(fc.double({ min: -37, max: 37, noNaN: true }), (z) => {
        // A probability stored in a double carries a relative rounding error of up to 2^-53, which moves the
        // quantile by about p * 2^-53 / density(z) (the condition of the inverse; common practice in error
        // analysis). Near p = 1 that alone exceeds 1e-12, so the bound adds it: 4 ulps' worth, plus 1e-12 relative.
        const density = Math.exp(-0.5 * z * z) / Math.sqrt(2 * Math.PI);
        const p = normalCdf(z);
        const q = normalSf(z);
        const bound = (prob: number) => 1e-12 * Math.max(1, Math.abs(z)) + (4 * Number.EPSILON * prob) / density;
        // A probability that rounds to exactly 1 has lost z altogether (its quantile is infinite by definition).
        if (p < 1) expect(Math.abs(normalQuantile(p) - z)).toBeLessThanOrEqual(bound(p));
        else expect(normalQuantile(p)).toBe(Infinity);
        if (q < 1) expect(Math.abs(normalSfQuantile(q) - z)).toBeLessThanOrEqual(bound(q));
        else expect(normalSfQuantile(q)).toBe(-Infinity);
      }),
    );
  });

  it('rejects invalid input with a clear message', () => {
    expect(() => normalQuantile(1.5)).toThrow(/between 0 and 1/);
    expect(() => normalSfQuantile(-0.1)).toThrow(/between 0 and 1/);
    expect(() => normalCdf(NaN)).toThrow(/must be a number/);
    expect(normalQuantile(0)).toBe(-Infinity);
    expect(normalSfQuantile(0)).toBe(Infinity);
  });
});
