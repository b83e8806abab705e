import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import * as fmt from '../../src/format/numbers.js';

// How numbers are written in the pack (house style; percentage points as in common practice).
describe('number formatting', () => {
  it('writes rates as whole percentages, with a decimal only near 0% and 100%', () => {
    expect(fmt.percent(0.6149)).toBe('61%');
    expect(fmt.percent(0.004)).toBe('0.4%');
    expect(fmt.percent(0.9962)).toBe('99.6%');
    expect(fmt.percent(1)).toBe('100%');
    expect(fmt.percent(0)).toBe('0%');
  });
  it('writes differences in points with a true minus sign', () => {
    expect(fmt.points(-0.0623)).toBe('\u22126.2');
    expect(fmt.points(0.0623, { sign: true })).toBe('+6.2');
    expect(fmt.points(0.00004, { sign: true })).toBe('0.0');
    expect(fmt.pointsSize(-0.0623)).toBe('6.2');
    // A detectable difference from a very large sample is never written as zero (common practice).
    expect(fmt.pointsSizeNonZero(0.000384)).toBe('0.04');
    expect(fmt.pointsSizeNonZero(0.0000042)).toBe('0.0004');
    expect(fmt.pointsSizeNonZero(0.0623)).toBe('6.2');
  });
  it('writes p-values without claiming more precision than is useful', () => {
    expect(fmt.pValue(0.0004)).toBe('< 0.001');
    expect(fmt.pPhrase(0.0004)).toBe('p < 0.001');
    expect(fmt.pPhrase(0.0123)).toBe('p = 0.012');
    expect(fmt.pValue(0.00512)).toBe('0.0051');
    expect(fmt.pValue(1)).toBe('1.000');
  });
  it('writes confidence levels as people say them', () => {
    expect(fmt.level(0.95)).toBe('95%');
    expect(fmt.level(0.975)).toBe('97.5%');
    expect(fmt.level(0.99)).toBe('99%');
  });
  it('writes counts with thousands separators and coefficients with two decimals', () => {
    expect(fmt.count(18500)).toBe('18,500');
    expect(fmt.coefficient(-0.4149)).toBe('\u22120.41');
    expect(fmt.coefficient(-0.001)).toBe('0.00');
  });
});

// Rounding never collapses an interval (common practice: show enough decimals that the printed ends differ).
describe('decimals chosen from an interval\'s width', () => {
  it('keeps the reported cases apart: "75% (75% to 76%)" and "80% to 80%" no longer print', () => {
    const dg = fmt.percentDigits(0.754, 0.746, 0.762);
    expect([fmt.percent(0.754, dg), fmt.percent(0.746, dg), fmt.percent(0.762, dg)]).toEqual(['75.4%', '74.6%', '76.2%']);
    const d2 = fmt.percentDigits(0.7981, 0.8032);
    expect(`${fmt.percent(0.7981, d2)} to ${fmt.percent(0.8032, d2)}`).toBe('79.8% to 80.3%');
    // A wide interval keeps whole percentages.
    expect(fmt.percentDigits(0.61, 0.58, 0.64)).toBe(0);
    // Points: one decimal unless the ends would meet.
    expect(fmt.pointsDigits(0.0005, 0.0004, 0.0006)).toBe(2);
    expect(fmt.points(0.0004, { sign: true, digits: 2 })).toBe('+0.04');
    expect(fmt.pointsDigits(-0.119, -0.142, -0.095)).toBe(1);
    expect(fmt.coefficientDigits(0.973, 0.968, 0.977)).toBe(3);
  });

  const rate = fc.double({ min: 0, max: 1, noNaN: true });
  it('prints any two rates at least 0.01 percentage points apart differently', () => {
    fc.assert(
      fc.property(rate, rate, rate, (a, b, c) => {
        const [lo, mid, hi] = [a, b, c].sort((x, y) => x - y) as [number, number, number];
        const dg = fmt.percentDigits(mid, lo, hi);
        const t = [lo, mid, hi].map((v) => fmt.percent(v, dg));
        const apart = (x: number, y: number) => Math.abs(x - y) >= 1e-4;
        return (!apart(lo, hi) || t[0] !== t[2]) && (!apart(lo, mid) || t[0] !== t[1]) && (!apart(mid, hi) || t[1] !== t[2]);
      }),
      { seed: 20261203, numRuns: 2000 },
    );
  });
  it('prints any two differences at least 0.001 points apart differently, and coefficients 0.0001 apart', () => {
    const diff = fc.double({ min: -1, max: 1, noNaN: true });
    fc.assert(
      fc.property(diff, diff, (a, b) => {
        const dp = fmt.pointsDigits(a, b);
        const dc = fmt.coefficientDigits(a, b);
        const pointsOk = Math.abs(a - b) < 1e-5 || fmt.points(a, { sign: true, digits: dp }) !== fmt.points(b, { sign: true, digits: dp });
        const coefOk = Math.abs(a - b) < 1e-4 || fmt.coefficient(a, dc) !== fmt.coefficient(b, dc);
        return pointsOk && coefOk;
      }),
      { seed: 20261204, numRuns: 2000 },
    );
  });
});

// One precision per sentence (house style): figures compared in one sentence or table row share their decimals,
// the finest any of them needs.
describe('one precision for compared figures', () => {
  it('gives two compared rates the decimals the finer needs: "60.3% against 72.2%", not "60% against 72.2%"', () => {
    // Quarrendell University (wide interval, whole percentages alone) against the rest of the region (narrow).
    const dg = fmt.comparedPercentDigits([0.6033, 0.59, 0.6164], [0.7219, 0.7151, 0.7287]);
    expect(dg).toBe(1);
    expect(`${fmt.percent(0.6033, dg)} against ${fmt.percent(0.7219, dg)}`).toBe('60.3% against 72.2%');
    expect(fmt.comparedPercentDigits([0.61, 0.58, 0.64], [0.67, 0.64, 0.7])).toBe(0);
  });
  it('keeps two different rates apart, to one decimal: "80.0% vs 79.5%", not "80% vs 80%"', () => {
    const dg = fmt.comparedPercentDigits([0.8, 0.68, 0.88], [0.7953, 0.778, 0.812]);
    expect(`${fmt.percent(0.8, dg)} vs ${fmt.percent(0.7953, dg)}`).toBe('80.0% vs 79.5%');
    // No more than one decimal only to keep compared rates apart.
    expect(fmt.comparedPercentDigits([0.8, 0.7, 0.9], [0.8001, 0.7, 0.9])).toBe(1);
  });
  it('writes a rate near 0% and one far from it alike: "0.4% to 2.1%", never "0.4% to 2%"', () => {
    const dg = fmt.percentDigits(0.004, 0.021);
    expect(`${fmt.percent(0.004, dg)} to ${fmt.percent(0.021, dg)}`).toBe('0.4% to 2.1%');
    expect(fmt.comparedPercentDigits([0.9962], [0.95])).toBe(1);
  });
  it('gives compared means, their intervals and their difference one precision, at least two decimals', () => {
    expect(fmt.comparedCoefficientDigits([3.8, 3.67, 3.93], [3.94, 3.89, 3.98], [-0.13, -0.28, 0.01])).toBe(2);
    expect(fmt.comparedCoefficientDigits([3.8, 3.67, 3.93], [3.973, 3.968, 3.977])).toBe(3);
  });
});

// grouped() writes safe whole numbers itself, so that a build need not load ICU's number data; the reference is
// Node's own toLocaleString('en-GB') (ICU with CLDR's en-GB grouping), which it must match character for character.
describe('grouped: the text of toLocaleString("en-GB")', () => {
  it('matches it for whole numbers of every length and sign', () => {
    fc.assert(
      fc.property(fc.integer({ min: Number.MIN_SAFE_INTEGER, max: Number.MAX_SAFE_INTEGER }), (n) => {
        expect(fmt.grouped(n)).toBe(n.toLocaleString('en-GB'));
      }),
      { numRuns: 3000 },
    );
    for (const n of [0, 7, 999, 1000, -1000, 18500, 999999, 1000000, -1234567, Number.MAX_SAFE_INTEGER]) expect(fmt.grouped(n)).toBe(n.toLocaleString('en-GB'));
    expect(fmt.grouped(18500)).toBe('18,500');
  });
  it('leaves fractions, minus zero, huge and non-finite numbers to toLocaleString', () => {
    for (const n of [-0, 1234.5, 2 ** 53, 1e21, Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY]) expect(fmt.grouped(n)).toBe(n.toLocaleString('en-GB'));
  });
  it('count rounds first', () => {
    expect(fmt.count(18499.5)).toBe('18,500');
    expect(fmt.count(-0.4)).toBe((-0).toLocaleString('en-GB'));
  });
});
