import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyse } from '../../src/analyse/index.js';
import { meanFromCodes } from '../../src/analyse/estimate.js';
import type { EstimateAnalysis } from '../../src/analyse/types.js';
import type { EstimateClaim, Measure } from '../../src/claims/types.js';
import type { Cell, Cube } from '../../src/data/types.js';
import { InputError } from '../../src/errors.js';
import { composeClaim } from '../../src/verdicts/compose.js';
import { decide } from '../../src/verdicts/decide.js';
import { Templates } from '../../src/verdicts/templates.js';
import { expectClose } from '../helpers/tolerance.js';

// Reference values: tests/fixtures/r/kinds-a.json from tests/fixtures/r/kinds-a.R (GNU R 4.2: Wilson bounds with and
// without the finite-population correction by uniroot on the score equation; t.test on the answers rebuilt with rep).
interface RateRef { x: number; n: number; population: number | null; level: number; low: number; high: number }
interface MeanRef { counts: number[]; level: number; n: number; mean: number; sd: number; low: number; high: number }
const R = JSON.parse(readFileSync(resolve(__dirname, '../fixtures/r/kinds-a.json'), 'utf8')) as { estimate_rate: RateRef[]; estimate_mean: MeanRef[] };

const codesOf = (counts: number[]) => Object.fromEntries(counts.map((c, i) => [String(i + 1), c]));
const summary: Cube = {
  sourceId: 'results', file: 'results.csv', sha256: '0', rows: 3, dimensions: ['Unit'],
  cells: [
    { dims: { Unit: 'A' }, n: 150, agree: 110, population: 200, approximate: false, firstRow: 2, numeric: { Ratio: { weightedSum: 150 * 14.5, weight: 150 } } },
    { dims: { Unit: 'A2' }, n: 50, agree: 40, population: 50, approximate: false, firstRow: 3, numeric: { Ratio: { weightedSum: 50 * 16.5, weight: 50 } } },
    { dims: { Unit: 'B' }, n: 40, agree: 9, population: 41, approximate: true, firstRow: 4, numeric: { Ratio: { weightedSum: 40 * 12, weight: 40 } } },
  ],
  values: { Unit: ['A', 'A2', 'B'] }, approximate: true, hasPopulation: true,
};
const answers: Cube = {
  sourceId: 'people', file: 'people.csv', sha256: '0', rows: 200, dimensions: ['Unit', 'question'],
  cells: (R.estimate_mean.filter((m) => m.level === 0.95)).map((m, i): Cell => ({
    dims: { Unit: `U${i}`, question: 'Q1' }, n: m.n, agree: (m.counts[3] ?? 0) + (m.counts[4] ?? 0), approximate: false, firstRow: i + 2, codes: codesOf(m.counts),
  })),
  values: { Unit: ['U0', 'U1', 'U2'], question: ['Q1'] }, approximate: false, hasPopulation: false,
};

function claim(select: Record<string, string | string[]>, measure: Measure, over: Partial<EstimateClaim> = {}): EstimateClaim {
  return {
    kind: 'estimate', id: 'estimate', statement: 'How many agree?', source: 'results', where: {}, select, measure,
    confidence: 0.95, confidenceWritten: '95%', sided: 'two-sided', minRespondents: 10, place: { line: 11, column: 5 }, ...over,
  };
}
const ctx = { minRespondents: 10, claimsFile: 'claims.yaml' };
const words = { templates: new Templates(), claimsTested: 0, adjustName: 'no adjustment', adjusted: false, minRespondents: 10, periodColumns: [] };
function run(c: EstimateClaim, cube: Cube) {
  const a = analyse(c, cube, ctx) as EstimateAnalysis;
  const d = decide(a, undefined);
  return { a, d, w: composeClaim(a, d, words) };
}

describe('estimate claims: a value with its margin of error, no test', () => {
  it('agreement rate pooled over rows with the Wilson interval and the finite-population correction (R uniroot)', () => {
    for (const level of [0.95, 0.9]) {
      const { a, d, w } = run(claim({ Unit: ['A', 'A2'] }, { type: 'agree' }, { confidence: level }), summary);
      const r = R.estimate_rate.find((x) => x.x === 150 && x.population === 250 && x.level === level) as RateRef;
      expect(a.rate?.n).toBe(200);
      expectClose(a.rate?.interval.lower as number, r.low, 'bound', `lower ${level}`); // R uniroot, N = 250
      expectClose(a.rate?.interval.upper as number, r.high, 'bound', `upper ${level}`); // R uniroot, N = 250
      expect(d.verdict).toBe('estimate');
      expect(a.test).toBeUndefined();
      expect(w.section.verdictLabel).toBe('Estimate');
      expect(w.section.verdictText).toMatch(/^75% of the 200 respondents in A or A2 agreed, with a \d+% interval of/);
      expect(w.section.chart?.data).toMatchObject({ kind: 'rates', bars: [{ rate: 0.75 }] });
    }
  });

  it('a small selection with rounded counts carries its cautions; its Wilson interval without a population matches R', () => {
    const { a, w } = run(claim({ Unit: 'B' }, { type: 'agree' }), { ...summary, hasPopulation: false, cells: summary.cells.map(({ population: _p, ...c }) => c) });
    const r = R.estimate_rate.find((x) => x.x === 9 && x.population === null && x.level === 0.95) as RateRef;
    expectClose(a.rate?.interval.lower as number, r.low, 'bound', 'lower'); // R uniroot
    expectClose(a.rate?.interval.upper as number, r.high, 'bound', 'upper'); // R uniroot
    expect(w.section.cautions.join(' ')).toMatch(/With only 40 respondents/);
    expect(w.section.cautions.join(' ')).toMatch(/rounded percentages/);
  });

  it('mean score from the answer-code counts with a t interval (R t.test)', () => {
    R.estimate_mean.forEach((m) => {
      const got = meanFromCodes(codesOf(m.counts), m.level);
      expectClose(got.mean, m.mean, 'closed', 'mean'); // R mean
      expectClose(got.sd, m.sd, 'closed', 'sd'); // R sd
      expectClose(got.interval.lower, m.low, 'bound', 'lower'); // R t.test conf.int
      expectClose(got.interval.upper, m.high, 'bound', 'upper'); // R t.test conf.int
    });
    const { a, d, w } = run(claim({ Unit: 'U0' }, { type: 'mean' }, { source: 'people' }), answers);
    const m0 = R.estimate_mean[0] as MeanRef;
    expectClose(a.mean?.mean as number, m0.mean, 'closed', 'mean in analysis'); // R mean
    expect(d.verdict).toBe('estimate');
    expect(w.section.verdictText).toMatch(/^The mean score in U0 is 3\.\d+ from 100 answers/);
    expect(w.section.cautions.join(' ')).toMatch(/equally spaced/);
  });

  it('a numeric column gives its weighted mean and says there is no interval', () => {
    const { a, w } = run(claim({ Unit: ['A', 'A2'] }, { type: 'column', column: 'Ratio' }), summary);
    expect(a.value?.value).toBeCloseTo((150 * 14.5 + 50 * 16.5) / 200, 12); // weighted mean by hand
    expect(w.section.verdictText).toMatch(/no margin of error can be given/);
  });

  it('too little data below the minimum; a mean from a summary source is an input error', () => {
    const { d, w } = run(claim({ Unit: 'B' }, { type: 'agree' }, { minRespondents: 50 }), summary);
    expect(d.verdict).toBe('too-little-data');
    expect(w.section.verdictText).not.toMatch(/\b40\b|\b9\b/);
    expect(() => run(claim({ Unit: 'A' }, { type: 'mean' }), summary)).toThrow(InputError);
  });
});
