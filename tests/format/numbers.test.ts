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
