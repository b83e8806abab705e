import { describe, expect, it } from 'vitest';
import { mannWhitneyCounts } from '../../src/stats/mann-whitney-counts.js';
import { mannWhitney } from '../../src/stats/mann-whitney.js';
import { summaryFromCounts } from '../../src/stats/summary-counts.js';
import { expectClose } from '../helpers/tolerance.js';
import { codes, ourAlternative, ref } from '../analyse/kinds-b-fixture.js';

// Reference: GNU R 4.2 wilcox.test(exact = FALSE, correct = TRUE), mean() and sd() on the histograms expanded with
// rep(1:5, counts) (tests/fixtures/r/kinds-b.R).
describe('mannWhitneyCounts against R wilcox.test on expanded answers', () => {
  for (const c of ref.means) {
    for (const t of c.tests) {
      it(`${c.name}, ${t.alternative}`, () => {
        const r = mannWhitneyCounts(codes(c.focus), codes(c.against), { alternative: ourAlternative(t.alternative) });
        expectClose(r.statistic.value, t.wilcox.statistic, 'closed', 'W');
        expectClose(r.p, t.wilcox.p, 'p', 'p-value');
      });
    }
  }
  it('gives the same result as the raw-value version', () => {
    const r = mannWhitneyCounts({ 1: 2, 2: 1, 4: 3 }, { 2: 1, 3: 2, 4: 1 });
    const raw = mannWhitney([1, 1, 2, 4, 4, 4], [2, 3, 3, 4]);
    expectClose(r.p, raw.p, 'closed', 'p');
    expect(r.statistic.value).toBe(raw.statistic.value);
  });
  it('refuses bad counts and groups with nothing to rank', () => {
    expect(() => mannWhitneyCounts({ 1: -1 }, { 2: 3 })).toThrow(/whole numbers/);
    expect(() => mannWhitneyCounts({ x: 1 }, { 2: 3 })).toThrow(/not a number/);
    expect(() => mannWhitneyCounts({ 1: 0 }, { 2: 3 })).toThrow(/first group has no answers/);
    expect(() => mannWhitneyCounts({ 3: 4 }, { 3: 5 })).toThrow(/same code/);
  });
});

describe('summaryFromCounts against R mean() and sd()', () => {
  for (const c of ref.means) {
    it(c.name, () => {
      const f = summaryFromCounts(codes(c.focus));
      const a = summaryFromCounts(codes(c.against));
      expectClose(f.mean, c.focus_mean, 'closed', 'focus mean');
      expectClose(f.sd, c.focus_sd, 'closed', 'focus sd');
      expectClose(a.mean, c.against_mean, 'closed', 'against mean');
      expectClose(a.sd, c.against_sd, 'closed', 'against sd');
      expect(f.n).toBe(c.focus.reduce((s, v) => s + v, 0));
    });
  }
  it('refuses an empty histogram', () => {
    expect(() => summaryFromCounts({ 1: 0, 2: 0 })).toThrow(/no answers/);
  });
});
