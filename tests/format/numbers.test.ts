import { describe, expect, it } from 'vitest';
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
