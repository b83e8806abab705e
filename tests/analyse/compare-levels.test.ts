import { describe, expect, it } from 'vitest';
import { analyseCompare, compareAtLevel } from '../../src/analyse/compare.js';
import type { CompareClaim } from '../../src/claims/types.js';
import type { Cube } from '../../src/data/types.js';
import { decide } from '../../src/verdicts/decide.js';
import { base, ctx, cubeOf } from './kinds-b-fixture.js';

// Verdict stability decides a compare claim at 90, 95 and 99% on the figures of its own level (compareAtLevel)
// instead of analysing it again at each. This checks, case by case, that the verdicts are those of a full analysis
// at each level (the p-values themselves are checked against R in tests/stats): the z test, Fisher's exact test for
// small counts, the corrected z test where the number eligible is known, one- and two-sided claims, a smallest
// difference that matters, and p-values adjusted for many claims.

const LEVELS = [0.9, 0.95, 0.99];
// Multiplicity factors standing in for adjustments (1: none).
const FACTORS = [1, 2.5, 40];

function cube(focus: [number, number], against: [number, number], population?: [number, number]): Cube {
  const c = cubeOf([
    { dims: { Unit: 'North' }, agree: focus[0], n: focus[1], ...(population ? { population: population[0] } : {}) },
    { dims: { Unit: 'South' }, agree: against[0], n: against[1], ...(population ? { population: population[1] } : {}) },
  ]);
  return population ? { ...c, hasPopulation: true } : c;
}

const claims: Array<Partial<CompareClaim>> = [
  { expect: 'different' },
  { expect: 'higher' },
  { expect: 'lower' },
  { expect: 'higher', sided: 'one-sided' },
  { expect: 'lower', sided: 'one-sided' },
  { expect: 'higher', smallestDifference: 0.05 },
  { expect: 'lower', sided: 'one-sided', smallestDifference: 0.02 },
];

const data: Array<{ name: string; cube: Cube }> = [
  // p near the 5% and 1% thresholds, so that the verdict changes between levels
  { name: 'z test, p about 0.03', cube: cube([560, 1000], [512, 1000]) },
  { name: 'z test, p about 0.005', cube: cube([590, 1000], [527, 1000]) },
  { name: 'z test, far apart', cube: cube([700, 1000], [500, 1000]) },
  { name: "Fisher's exact test (small counts)", cube: cube([9, 10], [3, 12]) },
  { name: 'corrected z test (number eligible known)', cube: cube([300, 400], [250, 380], [500, 450]) },
  { name: 'no difference', cube: cube([50, 100], [50, 100]) },
];

describe('compareAtLevel decides as a full analysis at each level', () => {
  for (const { name, cube: c } of data) {
    it(name, () => {
      let checked = 0;
      for (const extra of claims) {
        const claim = { ...base, id: 'c', kind: 'compare', focus: { Unit: 'North' }, against: { Unit: 'South' }, expect: 'different', ...extra } as CompareClaim;
        const own = analyseCompare(claim, c, ctx);
        for (const level of LEVELS) {
          const full = analyseCompare({ ...claim, confidence: level }, c, ctx);
          const quick = compareAtLevel(own, level);
          for (const factor of FACTORS) {
            const p = (x: typeof full) => (x.test ? Math.min(1, x.test.p * factor) : undefined);
            expect(decide(quick, p(quick)), `${JSON.stringify(extra)} at ${level}, factor ${factor}`).toEqual(decide(full, p(full)));
            checked += 1;
          }
        }
      }
      expect(checked).toBe(claims.length * LEVELS.length * FACTORS.length);
    });
  }
  it('each case is tested by the method it stands for', () => {
    const claim = { ...base, id: 'c', kind: 'compare', focus: { Unit: 'North' }, against: { Unit: 'South' }, expect: 'different' } as CompareClaim;
    expect(data.map((d) => analyseCompare(claim, d.cube, ctx).test?.method)).toEqual([
      'two-proportion-z',
      'two-proportion-z',
      'two-proportion-z',
      'fisher-exact-2x2',
      'two-proportion-z-fpc',
      'two-proportion-z',
    ]);
  });
  it('the cases reach different verdicts at different levels', () => {
    // Without this the check above could pass on cases whose verdict never depends on the level.
    const claim = { ...base, id: 'c', kind: 'compare', focus: { Unit: 'North' }, against: { Unit: 'South' }, expect: 'higher' } as CompareClaim;
    const a = analyseCompare(claim, data[0]!.cube, ctx);
    const verdicts = LEVELS.map((level) => decide(compareAtLevel(a, level), a.test?.p).verdict);
    expect(verdicts).toEqual(['supported', 'supported', 'not-supported']);
  });
});
