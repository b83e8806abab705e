import { describe, expect, it } from 'vitest';
import { analyseCompare } from '../../src/analyse/compare.js';
import { analyseMeans } from '../../src/analyse/means.js';
import type { CompareClaim, MeansClaim } from '../../src/claims/types.js';
import { decide } from '../../src/verdicts/decide.js';
import { composeClaim } from '../../src/verdicts/compose.js';
import { Templates } from '../../src/verdicts/templates.js';
import { expectClose } from '../helpers/tolerance.js';
import { base, codes, ctx, cubeOf, find, ref } from './kinds-b-fixture.js';

// The smallest difference that matters is this project's own verdict rule (issue 4): a statistically significant
// result in the claimed direction that is smaller than the threshold is not supported. The p-values here are checked
// against R elsewhere (kinds-b means cases; two-proportion tests in tests/stats); these tests pin the rule.

const composeCtx = { templates: new Templates(), claimsTested: 1, adjustName: 'no adjustment', adjusted: false, minRespondents: 10, periodColumns: [] };

describe('smallest difference that matters: compare (percentage points)', () => {
  // 50% of 10,000 against 53% of 10,000: a 3-point gap, far beyond chance.
  const cube = cubeOf([
    { dims: { Unit: 'North' }, n: 10000, agree: 5000 },
    { dims: { Unit: 'South' }, n: 10000, agree: 5300 },
  ]);
  const claim = (smallestDifference?: number): CompareClaim => ({
    ...base,
    id: 'c',
    kind: 'compare',
    focus: { Unit: 'North' },
    against: { Unit: 'South' },
    expect: 'lower',
    ...(smallestDifference !== undefined ? { smallestDifference } : {}),
  });
  it('a real 3-point gap is not supported when 5 points is the smallest that matters', () => {
    const a = analyseCompare(claim(0.05), cube, ctx);
    expect(a.test?.p).toBeLessThan(1e-4);
    const d = decide(a, a.test?.p);
    expect(d.verdict).toBe('not-supported');
    expectClose(d.belowThreshold?.effect ?? NaN, -0.03, 'closed', 'effect');
    const w = composeClaim(a, d, composeCtx);
    expect(w.section.verdictText).toBe(
      'Not supported as a difference that matters. The gap of 3.0 points is larger than chance alone would explain, but smaller than the 5.0 points set as the smallest difference that matters.',
    );
  });
  it('the same gap is supported when 2 points is the smallest that matters, or when none is set', () => {
    const a2 = analyseCompare(claim(0.02), cube, ctx);
    expect(decide(a2, a2.test?.p).verdict).toBe('supported');
    const a0 = analyseCompare(claim(), cube, ctx);
    expect(decide(a0, a0.test?.p)).not.toHaveProperty('belowThreshold');
    expect(decide(a0, a0.test?.p).verdict).toBe('supported');
  });
  it('a gap the other way is still "points the other way"', () => {
    const a = analyseCompare({ ...claim(0.05), expect: 'higher' }, cube, ctx);
    expect(decide(a, a.test?.p).verdict).toBe('opposite');
  });
});

describe('smallest difference that matters: means (share of the scale range)', () => {
  const c = find(ref.means, 'large-small-gap');
  const sum = (v: number[]) => v.reduce((s, x) => s + x, 0);
  const cube = cubeOf([
    { dims: { Dept: 'Art' }, n: sum(c.focus), agree: 0, codes: codes(c.focus) },
    { dims: { Dept: 'Law' }, n: sum(c.against), agree: 0, codes: codes(c.against) },
  ]);
  const claim = (smallestDifference: number): MeansClaim => ({
    ...base,
    id: 'm',
    kind: 'means',
    focus: { Dept: 'Art' },
    against: { Dept: 'Law' },
    measure: { type: 'mean' },
    test: 'welch',
    expect: 'higher',
    smallestDifference,
  });
  it('0.05 of a 1-5 scale is 0.2 scale points; a real 0.046 gap is below it', () => {
    const a = analyseMeans(claim(0.05), cube, ctx);
    const two = c.tests.find((t) => t.alternative === 'two.sided');
    expectClose(a.test?.p ?? NaN, two?.welch.p ?? NaN, 'p', 'Welch p (R t.test)');
    expect(a.threshold).toMatchObject({ smallest: 0.2, unit: 'scale points' });
    const d = decide(a, a.test?.p);
    expect(d.verdict).toBe('not-supported');
    expect(composeClaim(a, d, composeCtx).section.verdictText).toMatch(/gap of 0\.05 scale points .* smaller than the 0\.20 scale points .*5% of the answer scale's range/);
  });
  it('supported when the threshold is below the gap', () => {
    const a = analyseMeans(claim(0.01), cube, ctx);
    expect(decide(a, a.test?.p).verdict).toBe('supported');
  });
});
