import { describe, expect, it } from 'vitest';
import { analyseMeans } from '../../src/analyse/means.js';
import type { MeansClaim } from '../../src/claims/types.js';
import { InputError } from '../../src/errors.js';
import { decide } from '../../src/verdicts/decide.js';
import { composeClaim } from '../../src/verdicts/compose.js';
import { Templates } from '../../src/verdicts/templates.js';
import { expectClose } from '../helpers/tolerance.js';
import { base, codes, ctx, cubeOf, find, n, ourAlternative, ref, type MeansCase } from './kinds-b-fixture.js';

// Reference: GNU R 4.2 t.test (Welch and var.equal = TRUE) and wilcox.test(exact = FALSE, correct = TRUE) on the
// answer histograms expanded with rep(1:5, counts); one-sample t.test for each mean's interval
// (tests/fixtures/r/kinds-b.R).

function claim(over: Partial<MeansClaim> = {}): MeansClaim {
  return { ...base, id: 'm', kind: 'means', focus: { Dept: 'Art' }, against: { Dept: 'Law' }, measure: { type: 'mean' }, test: 'welch', expect: 'different', ...over };
}

function cube(c: MeansCase) {
  const sum = (v: number[]) => v.reduce((s, x) => s + x, 0);
  return cubeOf([
    { dims: { Dept: 'Art' }, n: sum(c.focus), agree: (c.focus[3] as number) + (c.focus[4] as number), codes: codes(c.focus) },
    { dims: { Dept: 'Law' }, n: sum(c.against), agree: (c.against[3] as number) + (c.against[4] as number), codes: codes(c.against) },
  ]);
}

const words = (a: ReturnType<typeof analyseMeans>, d: ReturnType<typeof decide>) =>
  composeClaim(a, d, { templates: new Templates(), claimsTested: 1, adjustName: 'no adjustment', adjusted: false, minRespondents: 10, periodColumns: [] });

describe('means: t tests and the rank test from answer counts, against R', () => {
  for (const c of ref.means) {
    for (const t of c.tests) {
      const alternative = ourAlternative(t.alternative);
      const expect_ = alternative === 'less' ? 'lower' : alternative === 'greater' ? 'higher' : 'different';
      const sided = alternative === 'two-sided' ? 'two-sided' : 'one-sided';
      for (const test of ['welch', 'student', 'rank'] as const) {
        it(`${c.name}, ${test}, ${t.alternative}`, () => {
          const a = analyseMeans(claim({ test, expect: expect_, sided }), cube(c), ctx);
          expect(a.status).toBe('tested');
          if (test === 'rank') {
            expectClose(a.test?.statistic?.value ?? NaN, t.wilcox.statistic, 'closed', 'W');
            expectClose(a.test?.p ?? NaN, t.wilcox.p, 'p', 'p');
          } else {
            const r = t[test];
            expectClose(a.test?.statistic?.value ?? NaN, r.statistic, 'statistic', 't');
            expectClose(a.test?.df as number, r.df, 'statistic', 'df');
            expectClose(a.test?.p ?? NaN, r.p, 'p', 'p');
          }
          // The difference's interval is always the two-sided t interval (Welch unless Student was asked for).
          const two = (c.tests.find((x) => x.alternative === 'two.sided') as MeansCase['tests'][number])[test === 'student' ? 'student' : 'welch'];
          expectClose(a.difference?.interval.lower ?? NaN, n(two.lower), 'bound', 'difference lower');
          expectClose(a.difference?.interval.upper ?? NaN, n(two.upper), 'bound', 'difference upper');
          expectClose(a.focus?.interval.lower ?? NaN, c.focus_ci[0] as number, 'bound', 'focus mean lower');
          expectClose(a.against?.interval.upper ?? NaN, c.against_ci[1] as number, 'bound', 'against mean upper');
        });
      }
    }
  }
});

describe('means: verdict paths', () => {
  it('supported: focus scores higher as claimed (one-sided Welch)', () => {
    const a = analyseMeans(claim({ expect: 'higher', sided: 'one-sided' }), cube(find(ref.means, 'focus-higher')), ctx);
    const d = decide(a, a.test?.p);
    expect(d.verdict).toBe('supported');
    const w = words(a, d);
    expect(w.section.verdictText).toMatch(/^Supported\. The mean score in Art is 3\.58/);
    expect(w.section.chart?.data).toMatchObject({ kind: 'means', domain: [1, 5] });
  });
  it('opposite: focus scores higher when the claim said lower', () => {
    const a = analyseMeans(claim({ expect: 'lower', sided: 'one-sided' }), cube(find(ref.means, 'focus-higher')), ctx);
    const d = decide(a, a.test?.p);
    expect(d.verdict).toBe('opposite');
    expect(words(a, d).section.verdictText).toMatch(/point the other way/);
  });
  it('not supported: two close groups', () => {
    const a = analyseMeans(claim(), cube(find(ref.means, 'close')), ctx);
    const d = decide(a, a.test?.p);
    expect(d.verdict).toBe('not-supported');
    expect(words(a, d).section.verdictText).toMatch(/within what chance alone could produce/);
  });
  it('too little data below the minimum respondents', () => {
    const a = analyseMeans({ ...claim(), minRespondents: 20 }, cube(find(ref.means, 'small-groups')), ctx);
    expect(a.status).toBe('too-little-data');
    expect(a.shortfall).toMatch(/fewer than 20 people answered in Art and Law/);
    expect(decide(a, undefined).verdict).toBe('too-little-data');
  });
  it('refuses a numeric column of a summary source, and a source without answer codes', () => {
    const c = find(ref.means, 'close');
    expect(() => analyseMeans(claim({ measure: { type: 'column', column: 'Ratio' } }), cube(c), ctx)).toThrow(InputError);
    expect(() => analyseMeans(claim({ measure: { type: 'column', column: 'Ratio' } }), cube(c), ctx)).toThrow(/respondent/);
    const summary = cubeOf([
      { dims: { Dept: 'Art' }, n: 40, agree: 20 },
      { dims: { Dept: 'Law' }, n: 40, agree: 25 },
    ]);
    expect(() => analyseMeans(claim(), summary, ctx)).toThrow(/answer codes/);
  });
});
