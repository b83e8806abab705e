/**
 * The change in a gap between two groups from one period to another (src/stats/difference-of-differences.ts).
 *
 * Sources: GNU R 4.2.2, the formulas written out with prop.test's Wilson bounds, pnorm and qnorm
 * (tests/fixtures/r/gap-change.R -> gap-change.json); Newcombe (1998), Table II, 56/70 - 48/80 (0.0524 to 0.3339) for
 * the contrast interval with one difference; and the intersection-union test's defining property, checked by
 * simulation: with the gap's size unchanged, "narrowed" is found no more often than 1 - level.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { differenceOfDifferences, gapSizeChange, proportionContrast, type Gap } from '../../src/stats/difference-of-differences.js';
import { newcombeInterval } from '../../src/stats/newcombe.js';
import { minDetectableGapChange } from '../../src/stats/power-gap-change.js';
import { expectClose } from '../helpers/tolerance.js';

interface Case {
  earlier: [number, number, number, number];
  later: [number, number, number, number];
  level: number;
  d: number;
  se: number;
  z: number;
  p_two: number;
  p_less: number;
  p_greater: number;
  lower: number;
  upper: number;
  s: number;
  z_s: number;
  s_lower: number;
  s_upper: number;
  p_narrowed: number;
  p_widened: number;
  detectable_two: number;
  detectable_one: number;
}
const r = JSON.parse(readFileSync(new URL('../fixtures/r/gap-change.json', import.meta.url), 'utf8')) as {
  r_version: string;
  newcombe_example: { lower: number; upper: number };
  cases: Case[];
};
const gap = (v: number[]): Gap => ({ first: { x: v[0] as number, n: v[1] as number }, second: { x: v[2] as number, n: v[3] as number } });

describe('difference of differences against R 4.2.2 (formulas written out)', () => {
  it('the fixture was made by R and reproduces Newcombe 1998 Table II', () => {
    expect(r.r_version).toMatch(/^R version 4\./);
    expect(r.cases.length).toBeGreaterThanOrEqual(8);
    expect(r.newcombe_example.lower).toBeCloseTo(0.0524, 4);
    expect(r.newcombe_example.upper).toBeCloseTo(0.3339, 4);
    const c = proportionContrast([{ x: 56, n: 70 }, { x: 48, n: 80 }], [1, -1], 0.95);
    expectClose(c.interval.lower, r.newcombe_example.lower, 'bound', 'lower');
    expectClose(c.interval.upper, r.newcombe_example.upper, 'bound', 'upper');
    const n = newcombeInterval(56, 70, 48, 80);
    expectClose(c.interval.lower, n.lower, 'closed', 'same as newcombe.ts');
    expectClose(c.interval.upper, n.upper, 'closed', 'same as newcombe.ts');
  });
  for (const c of r.cases) {
    it(`earlier ${c.earlier.join('/')}, later ${c.later.join('/')} at ${c.level}`, () => {
      const two = differenceOfDifferences(gap(c.earlier), gap(c.later), { level: c.level });
      expectClose(two.estimate.value, c.d, 'closed', 'D');
      expectClose(two.statistic?.value as number, c.z, 'closed', 'z');
      expectClose(two.p, c.p_two, 'p', 'two-sided p');
      expectClose(two.interval?.lower as number, c.lower, 'bound', 'lower');
      expectClose(two.interval?.upper as number, c.upper, 'bound', 'upper');
      expectClose(differenceOfDifferences(gap(c.earlier), gap(c.later), { level: c.level, alternative: 'less' }).p, c.p_less, 'p', 'less');
      expectClose(differenceOfDifferences(gap(c.earlier), gap(c.later), { level: c.level, alternative: 'greater' }).p, c.p_greater, 'p', 'greater');
      const narrowed = gapSizeChange(gap(c.earlier), gap(c.later), 'narrowed', { level: c.level });
      const widened = gapSizeChange(gap(c.earlier), gap(c.later), 'widened', { level: c.level });
      expectClose(narrowed.p, c.p_narrowed, 'p', 'narrowed');
      expectClose(widened.p, c.p_widened, 'p', 'widened');
      expectClose(narrowed.pOpposite, c.p_widened, 'p', 'narrowed opposite');
      expectClose(narrowed.s.estimate, c.s, 'closed', 'S');
      expectClose(narrowed.s.z, c.z_s, 'closed', 'z of S');
      expectClose(narrowed.s.interval.lower, c.s_lower, 'bound', 'S lower');
      expectClose(narrowed.s.interval.upper, c.s_upper, 'bound', 'S upper');
      // The two tests behind each claim: of D and of S, with R's z; the claim's p-value (R's) is the larger of theirs.
      for (const [t, pR] of [[narrowed, c.p_narrowed], [widened, c.p_widened]] as const) {
        expect(t.components.map((k) => k.of)).toEqual(['change', 'sum']);
        expectClose(t.components[0].z, c.z, 'closed', 'component z of D');
        expectClose(t.components[1].z, c.z_s, 'closed', 'component z of S');
        expectClose(Math.max(t.components[0].p, t.components[1].p), pR, 'p', 'the larger component p');
      }
      expectClose(minDetectableGapChange(c.se, { alpha: 1 - c.level }), c.detectable_two, 'closed', 'detectable, two-sided');
      expectClose(minDetectableGapChange(c.se, { alpha: 1 - c.level, sided: 'one-sided' }), c.detectable_one, 'closed', 'detectable, one-sided');
    });
  }
  it('refuses four samples that all answered one way', () => {
    expect(() => differenceOfDifferences(gap([10, 10, 0, 10]), gap([0, 10, 10, 10]))).toThrow(/standard error is 0/);
    expect(() => differenceOfDifferences(gap([11, 10, 0, 10]), gap([0, 10, 10, 10]))).toThrow(/between 0 and n/);
  });
});

describe('the gap-size test holds its level (intersection-union, defining property)', () => {
  // A seeded generator (mulberry32, common practice) so the check is the same each run.
  function rng(seed: number): () => number {
    let a = seed >>> 0;
    return () => {
      a = (a + 0x6d2b79f5) >>> 0;
      let t = a;
      t = Math.imul(t ^ (t >>> 15), t | 1);
      t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
      return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
    };
  }
  const draw = (u: () => number, p: number, n: number): number => {
    let x = 0;
    for (let i = 0; i < n; i++) if (u() < p) x++;
    return x;
  };
  // Null settings on the boundary |later gap| = |earlier gap|: no gap at all, an unchanged gap, a gap that swapped
  // sides, and a noisy earlier period with a precise later one (where one-sided tests without the doubling reach 2α).
  const settings = [
    { name: 'no gap in either period', pa: [0.5, 0.5], pb: [0.5, 0.5], na: 200, nb: 200 },
    { name: 'an unchanged 10-point gap', pa: [0.6, 0.5], pb: [0.6, 0.5], na: 300, nb: 300 },
    { name: 'a gap that swapped sides', pa: [0.6, 0.5], pb: [0.5, 0.6], na: 300, nb: 300 },
    { name: 'no gap, the earlier period much smaller', pa: [0.5, 0.5], pb: [0.5, 0.5], na: 30, nb: 3000 },
  ];
  for (const s of settings) {
    it(`${s.name}: narrowed found in at most about 5% of 2000 samples at 95%`, () => {
      const u = rng(20261204);
      let found = 0;
      const runs = 2000;
      for (let i = 0; i < runs; i++) {
        const earlier = gap([draw(u, s.pa[0] as number, s.na), s.na, draw(u, s.pa[1] as number, s.na), s.na]);
        const later = gap([draw(u, s.pb[0] as number, s.nb), s.nb, draw(u, s.pb[1] as number, s.nb), s.nb]);
        if (gapSizeChange(earlier, later, 'narrowed').p < 0.05) found++;
      }
      // 5% of 2000 is 100; a binomial's upper 99.9% point is about 131.
      expect(found).toBeLessThanOrEqual(131);
    });
  }
  it('finds a gap that clearly narrowed, and not the other way', () => {
    const t = gapSizeChange(gap([300, 1000, 500, 1000]), gap([420, 1000, 480, 1000]), 'narrowed');
    expect(t.p).toBeLessThan(0.001);
    expect(t.pOpposite).toBe(1);
  });
});

describe('the gap-size test result', () => {
  it('names the two tests of the claimed region with their directions and p-values at the two-sided level', () => {
    // Earlier 30% vs 50% (gap −20), later 42% vs 48% (gap −6): narrowed with the against group ahead, so the change
    // in the gap must be above zero and the two gaps added together below zero. z of D = 0.14 / sqrt(0.3·0.7/1000 +
    // 0.5·0.5/1000 + 0.42·0.58/1000 + 0.48·0.52/1000) = 0.14 / 0.030874 = 4.535 (worked by hand, common practice).
    const t = gapSizeChange(gap([300, 1000, 500, 1000]), gap([420, 1000, 480, 1000]), 'narrowed');
    expect(t.components.map((k) => [k.of, k.alternative])).toEqual([['change', 'greater'], ['sum', 'less']]);
    expectClose(t.components[0].z, 0.14 / Math.sqrt((0.3 * 0.7 + 0.25 + 0.42 * 0.58 + 0.48 * 0.52) / 1000), 'closed', 'z of D');
    expect(t.components[0].z).toBeCloseTo(4.535, 2);
    expect(Math.max(t.components[0].p, t.components[1].p)).toBe(t.p);
    // Widened, read on the same data: the region on the side S lies (the against group ahead) with D below zero.
    const w = gapSizeChange(gap([300, 1000, 500, 1000]), gap([420, 1000, 480, 1000]), 'widened');
    expect(w.components.map((k) => [k.of, k.alternative])).toEqual([['change', 'less'], ['sum', 'less']]);
    expect(w.components[0].p).toBe(1);
  });

  it('names its method and gives the change in size as its estimate', () => {
    const t = gapSizeChange(gap([300, 1000, 500, 1000]), gap([420, 1000, 480, 1000]), 'narrowed');
    expect(t.test.method).toBe('gap-size-iut');
    expect(t.test.p).toBe(t.p);
    // |42% - 48%| - |30% - 50%| = 6 - 20 = -14 points.
    expectClose(t.test.estimate.value, -0.14, 'closed', 'size change');
    expectClose(t.test.interval?.lower as number, t.d.interval?.lower as number, 'closed', 'interval of D');
  });
});
