import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyse } from '../../src/analyse/index.js';
import type { TargetAnalysis } from '../../src/analyse/types.js';
import type { TargetClaim } from '../../src/claims/types.js';
import type { Cell, Cube } from '../../src/data/types.js';
import { InputError } from '../../src/errors.js';
import { minDetectableGap, powerOneProportion } from '../../src/stats/power-one-proportion.js';
import { composeClaim } from '../../src/verdicts/compose.js';
import { decide } from '../../src/verdicts/decide.js';
import { Templates } from '../../src/verdicts/templates.js';
import { expectClose } from '../helpers/tolerance.js';

// Reference values: tests/fixtures/r/kinds-a.json from tests/fixtures/r/kinds-a.R (GNU R 4.2: prop.test one sample
// with correct = FALSE, binom.test; the power of the one-sample score test written out in R from Lachin (1981) and
// solved with uniroot).
interface TargetRef { x: number; n: number; p0: number; alternative: string; exact: boolean; z: number | null; p_value: number; wilson_low: number; wilson_high: number }
interface GapRef { n: number; p0: number; population: number | null; sided: 'two-sided' | 'one-sided'; power_at_5_points: number; increase: number | null; decrease: number | null }
const R = JSON.parse(readFileSync(resolve(__dirname, '../fixtures/r/kinds-a.json'), 'utf8')) as { target: TargetRef[]; gap: GapRef[] };
function ref(x: number, n: number, alternative: string): TargetRef {
  const row = R.target.find((r) => r.x === x && r.n === n && r.alternative === alternative);
  if (!row) throw new Error(`no R row for ${x}/${n} ${alternative}`);
  return row;
}

const rows: Array<[string, number, number, number?]> = [['A', 200, 150, 300], ['B', 200, 165], ['C', 200, 190], ['D', 18, 14], ['E', 60, 40]];
const data: Cube = {
  sourceId: 'results', file: 'results.csv', sha256: '0', rows: rows.length, dimensions: ['Unit'],
  cells: rows.map(([Unit, n, agree], i): Cell => ({ dims: { Unit }, n, agree, approximate: false, firstRow: i + 2 })),
  values: { Unit: rows.map((r) => r[0]) }, approximate: false, hasPopulation: false,
};
const withPopulation: Cube = { ...data, hasPopulation: true, cells: data.cells.map((c, i) => ({ ...c, population: rows[i]?.[3] ?? c.n * 4 })) };

function claim(unit: string, value: number, expect: TargetClaim['expect'], over: Partial<TargetClaim> = {}): TargetClaim {
  return {
    kind: 'target', id: `target-${unit}`, statement: `${unit} is below the target.`, source: 'results', where: {},
    select: { Unit: unit }, value, valueWritten: `${value * 100}%`, expect, confidence: 0.95, confidenceWritten: '95%',
    sided: 'two-sided', minRespondents: 10, place: { line: 9, column: 5 }, ...over,
  };
}
const ctx = { minRespondents: 10, claimsFile: 'claims.yaml' };
const words = { templates: new Templates(), claimsTested: 1, adjustName: 'no adjustment (one claim)', adjusted: false, minRespondents: 10, periodColumns: [] };
function run(c: TargetClaim, cube = data) {
  const a = analyse(c, cube, ctx) as TargetAnalysis;
  const d = decide(a, a.test?.p);
  return { a, d, w: composeClaim(a, d, words) };
}

describe('target claims: a rate against a fixed value', () => {
  it('75% against an 80% target: the score test matches R; supported one-sided, with the Wilson interval', () => {
    const { a } = run(claim('A', 0.8, 'lower'));
    const r = ref(150, 200, 'two-sided');
    expect(a.test?.method).toBe('one-sample-score');
    expectClose(a.test?.statistic?.value as number, r.z as number, 'closed', 'z'); // R prop.test (signed root)
    expectClose(a.test?.p as number, r.p_value, 'p', 'p'); // R prop.test
    expectClose(a.rate?.interval.lower as number, r.wilson_low, 'bound', 'Wilson lower'); // R prop.test conf.int
    expectClose(a.rate?.interval.upper as number, r.wilson_high, 'bound', 'Wilson upper'); // R prop.test conf.int
    const { d, w } = run(claim('A', 0.8, 'lower', { sided: 'one-sided' }));
    expect(d.verdict).toBe('supported');
    expect(w.section.verdictText).toMatch(/^Supported\. 75% of the 200 respondents in A agreed: 5\.0 points below the value of 80%/);
    // With no value_label the value is named once, not twice ("the value of 80% (80%)").
    expect(w.section.verdictText).not.toContain('the value of 80% (80%)');
    expect(w.section.compared).toBe('A (200 respondents) against the value of 80%.');
    expect(w.section.hypotheses.null).not.toContain('(80%)');
    expect(w.section.chart?.data).toMatchObject({ kind: 'rates', reference: { value: 0.8 } });
    expect(w.section.cautions.join(' ')).toMatch(/is a target/);
  });

  it('one-sided p in both directions (R prop.test alternative less / greater)', () => {
    const { a, d } = run(claim('A', 0.8, 'lower', { sided: 'one-sided' }));
    expectClose(a.test?.p as number, ref(150, 200, 'less').p_value, 'p', 'p less'); // R prop.test
    expectClose(a.pOpposite as number, ref(150, 200, 'greater').p_value, 'p', 'p greater'); // R prop.test
    expect(d.verdict).toBe('supported');
  });

  it('82.5% against 80% is not supported and says what gap could be detected (R: Lachin power)', () => {
    const { a, d, w } = run(claim('B', 0.8, 'lower'));
    expectClose(a.test?.p as number, ref(165, 200, 'two-sided').p_value, 'p', 'p'); // R prop.test
    expect(d.verdict).toBe('not-supported');
    const g = R.gap.find((x) => x.n === 200 && x.p0 === 0.8 && x.population === null && x.sided === 'two-sided') as GapRef;
    expectClose(a.detectable as number, g.decrease as number, 'bound', 'detectable decrease'); // R uniroot
    expect(w.section.verdictText).toMatch(/a gap of about 8\.2 points or more would be detected 80% of the time/);
  });

  it('95% when below 80% was claimed points the other way; a benchmark gets its own caution', () => {
    const { a, d, w } = run(claim('C', 0.8, 'lower', { valueLabel: 'the national benchmark' }));
    expectClose(a.test?.p as number, ref(190, 200, 'two-sided').p_value, 'p', 'p'); // R prop.test
    expect(d.verdict).toBe('opposite');
    expect(w.section.verdictText).toMatch(/^The data point the other way\./);
    expect(w.section.cautions.join(' ')).toMatch(/comes from another source with its own sampling error/);
  });

  it('uses the exact binomial test when n(1 - p0) < 5 (R binom.test), all alternatives', () => {
    for (const [sided, expectDir, alt] of [['two-sided', 'different', 'two-sided'], ['one-sided', 'lower', 'less'], ['one-sided', 'higher', 'greater']] as const) {
      const { a } = run(claim('D', 0.9, expectDir, { sided }));
      const r = ref(14, 18, alt);
      expect(r.exact).toBe(true);
      expect(a.test?.method).toBe('binomial-exact');
      expectClose(a.test?.p as number, r.p_value, 'p', `binomial p ${alt}`); // R binom.test
    }
  });

  it('the finite-population correction narrows the interval and the detectable gap (R uniroot)', () => {
    const { a } = run(claim('A', 0.8, 'lower'), withPopulation);
    expect(a.methods).toContain('wilson-fpc');
    expect(a.responseRate).toBeCloseTo(200 / 300, 12);
    const g = R.gap.find((x) => x.n === 200 && x.p0 === 0.8 && x.population === 300 && x.sided === 'two-sided') as GapRef;
    expectClose(a.detectable as number, g.decrease as number, 'bound', 'detectable with population'); // R uniroot
  });

  it('smallest difference that matters: a real gap smaller than it is not supported', () => {
    const { d, w } = run(claim('A', 0.8, 'lower', { sided: 'one-sided', smallestDifference: 0.1 }));
    expect(d.verdict).toBe('not-supported');
    expect(w.section.verdictText).toMatch(/^Not supported as a gap that matters/);
  });

  it('too little data below the minimum; a value of 100% is an input error', () => {
    expect(run(claim('A', 0.8, 'lower', { minRespondents: 201 })).d.verdict).toBe('too-little-data');
    expect(() => run(claim('A', 1, 'lower'))).toThrow(InputError);
  });
});

describe('power of the one-sample score test (Lachin 1981) against R', () => {
  it('power at a 5-point gap and the smallest detectable gaps, with and without a population', () => {
    for (const g of R.gap) {
      const pop = g.population ?? undefined;
      expectClose(powerOneProportion(g.n, Math.min(g.p0 + 0.05, 0.999), g.p0, { alpha: 0.05, sided: g.sided, ...(pop !== undefined ? { populationSize: pop } : {}) }), g.power_at_5_points, 'p', `power n=${g.n} p0=${g.p0}`); // R formula
      const gaps = minDetectableGap(g.n, g.p0, { alpha: 0.05, power: 0.8, sided: g.sided, ...(pop !== undefined ? { populationSize: pop } : {}) });
      if (g.increase === null) expect(gaps.increase).toBeNull();
      else expectClose(gaps.increase as number, g.increase, 'bound', `increase n=${g.n} p0=${g.p0} ${g.sided}`); // R uniroot
      if (g.decrease === null) expect(gaps.decrease).toBeNull();
      else expectClose(gaps.decrease as number, g.decrease, 'bound', `decrease n=${g.n} p0=${g.p0} ${g.sided}`); // R uniroot
    }
  });

  it('rejects a fixed value outside (0, 1) and a population smaller than n', () => {
    expect(() => powerOneProportion(100, 0.5, 1)).toThrow(/strictly between 0 and 1/);
    expect(() => minDetectableGap(100, 0.5, { alpha: 0.05, power: 0.8, sided: 'two-sided', populationSize: 50 })).toThrow(/population size/);
  });
});
