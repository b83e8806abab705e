import { describe, expect, it } from 'vitest';
import { analyseEquivalence } from '../../src/analyse/equivalence.js';
import type { EquivalenceClaim } from '../../src/claims/types.js';
import { decide } from '../../src/verdicts/decide.js';
import { composeClaim } from '../../src/verdicts/compose.js';
import { Templates } from '../../src/verdicts/templates.js';
import { expectClose } from '../helpers/tolerance.js';
import { base, ctx, cubeOf, find, ref, type EquivalenceCase } from './kinds-b-fixture.js';

// Reference: TOST for two proportions by its published formula (Schuirmann 1987; Wellek 2010, ch. 6) and Newcombe's
// hybrid score interval (Newcombe 1998, method 10) from R's Wilson intervals, in tests/fixtures/r/kinds-b.R (GNU R 4.2).

function claim(c: EquivalenceCase): EquivalenceClaim {
  return { ...base, id: 'e', kind: 'equivalence', focus: { Site: 'North' }, against: { Site: 'South' }, margin: c.margin, confidence: 1 - c.alpha };
}
function cube(c: EquivalenceCase) {
  return cubeOf([
    { dims: { Site: 'North' }, n: c.n1, agree: c.x1 },
    { dims: { Site: 'South' }, n: c.n2, agree: c.x2 },
  ]);
}
const words = (a: ReturnType<typeof analyseEquivalence>, d: ReturnType<typeof decide>) =>
  composeClaim(a, d, { templates: new Templates(), claimsTested: 1, adjustName: 'no adjustment', adjusted: false, minRespondents: 10, periodColumns: [] });

describe('equivalence: TOST and Newcombe against the published formulas in R', () => {
  for (const c of ref.equivalence) {
    it(c.name, () => {
      const a = analyseEquivalence(claim(c), cube(c), ctx);
      expectClose(a.test?.p ?? NaN, c.p, 'p', 'TOST p');
      expectClose(a.equivalenceInterval?.lower ?? NaN, c.tost_lower, 'bound', 'TOST lower');
      expectClose(a.equivalenceInterval?.upper ?? NaN, c.tost_upper, 'bound', 'TOST upper');
      expectClose(a.difference?.interval.lower ?? NaN, c.newcombe_lower, 'bound', 'Newcombe lower');
      expectClose(a.difference?.interval.upper ?? NaN, c.newcombe_upper, 'bound', 'Newcombe upper');
      expectClose(a.difference?.value ?? NaN, c.difference, 'closed', 'difference');
    });
  }
});

describe('equivalence: verdict paths', () => {
  it('supported when both one-sided tests reject', () => {
    const c = find(ref.equivalence, 'within-margin');
    const a = analyseEquivalence(claim(c), cube(c), ctx);
    const d = decide(a, a.test?.p);
    expect(d.verdict).toBe('supported');
    const w = words(a, d);
    expect(w.section.verdictText).toMatch(/lies inside the margin of ±5\.0 points/);
    expect(w.section.chart?.data).toMatchObject({ kind: 'difference', margin: 0.05 });
  });
  it('a Holm-adjusted TOST p above alpha is not supported', () => {
    const c = find(ref.equivalence, 'within-margin');
    const a = analyseEquivalence(claim(c), cube(c), ctx);
    expect(decide(a, Math.min(1, (a.test?.p ?? 0) * 4)).verdict).toBe('not-supported');
  });
  it('not supported when the interval reaches beyond the margin', () => {
    const c = find(ref.equivalence, 'too-imprecise');
    const a = analyseEquivalence(claim(c), cube(c), ctx);
    const d = decide(a, a.test?.p);
    expect(d.verdict).toBe('not-supported');
    expect(words(a, d).section.verdictText).toMatch(/reaches beyond the margin/);
  });
  it('points the other way when the Newcombe interval lies wholly beyond the margin', () => {
    const c = find(ref.equivalence, 'clearly-apart');
    const a = analyseEquivalence(claim(c), cube(c), ctx);
    expect(a.beyondMargin).toBe(true);
    expect(decide(a, a.test?.p).verdict).toBe('opposite');
  });
  it('too little data below the minimum', () => {
    const c = { ...find(ref.equivalence, 'too-imprecise'), n2: 8, x2: 6 };
    const a = analyseEquivalence(claim(c), cube(c), ctx);
    expect(a.status).toBe('too-little-data');
    expect(decide(a, undefined).verdict).toBe('too-little-data');
  });
  it('ignores the smallest difference that matters', () => {
    const c = find(ref.equivalence, 'within-margin');
    const a = analyseEquivalence({ ...claim(c), smallestDifference: 0.2 }, cube(c), ctx);
    expect(decide(a, a.test?.p).verdict).toBe('supported');
  });
});
