import { readFileSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { analyse } from '../../src/analyse/index.js';
import type { EveryAnalysis } from '../../src/analyse/types.js';
import type { EveryClaim } from '../../src/claims/types.js';
import { parseClaimsText } from '../../src/claims/read.js';
import type { Cell, Cube } from '../../src/data/types.js';
import { InputError } from '../../src/errors.js';
import { minDetectableGap } from '../../src/stats/power-one-proportion.js';
import { composeClaim } from '../../src/verdicts/compose.js';
import { decide } from '../../src/verdicts/decide.js';
import { Templates } from '../../src/verdicts/templates.js';
import { expectClose } from '../helpers/tolerance.js';

// Reference values: tests/fixtures/r/every-iut.json from tests/fixtures/r/every-iut.R (GNU R 4.2.2: prop.test one
// sample with correct = FALSE, or binom.test for small units, each one-sided; the largest p-value for the
// intersection-union test; Bonferroni over the units the other way; Wilson intervals from prop.test).
interface UnitRef { unit: number; p: number; p_opposite: number; lower: number; upper: number; exact: boolean }
interface CaseRef { x: number[]; n: number[]; p0: number; expect: 'higher' | 'lower'; sided: 'one-sided' | 'two-sided'; level: number; p: number; p_opposite: number; units: UnitRef[] }
const here = dirname(fileURLToPath(import.meta.url));
const R = JSON.parse(readFileSync(resolve(here, '../fixtures/r/every-iut.json'), 'utf8')) as { cases: CaseRef[] };

function cubeOf(x: number[], n: number[]): Cube {
  const units = x.map((_, i) => `U${i}`);
  return {
    sourceId: 'results', file: 'results.csv', sha256: '0', rows: x.length, dimensions: ['Unit'],
    cells: x.map((agree, i): Cell => ({ dims: { Unit: units[i] as string }, n: n[i] as number, agree, approximate: false, firstRow: i + 2 })),
    values: { Unit: units }, approximate: false, hasPopulation: false,
  };
}
function claim(value: number, expect: EveryClaim['expect'], over: Partial<EveryClaim> = {}): EveryClaim {
  return {
    kind: 'every', id: 'every-a', statement: `Every unit is ${expect === 'higher' ? 'above' : 'below'} the value.`, source: 'results', where: {},
    units: 'Unit', value, valueWritten: `${Math.round(value * 100)}%`, expect, confidence: 0.95, confidenceWritten: '95%', sided: 'one-sided',
    minRespondents: 10, place: { line: 9, column: 5 }, ...over,
  };
}
const ctx = { minRespondents: 10, claimsFile: 'claims.yaml' };
const words = { templates: new Templates(), claimsTested: 1, adjustName: 'no adjustment (one claim)', adjusted: false, minRespondents: 10, periodColumns: [] };
function run(c: EveryClaim, cube: Cube) {
  const a = analyse(c, cube, ctx) as EveryAnalysis;
  const d = decide(a, a.test?.p);
  return { a, d, w: composeClaim(a, d, words) };
}

describe('every claims: each unit on one side of a value (intersection-union test)', () => {
  it.each(R.cases.map((c, i) => [i, c] as const))('case %i matches R: each unit, the largest p, the other way', (_i, ref) => {
    const { a } = run(claim(ref.p0, ref.expect, { sided: ref.sided, confidence: ref.level }), cubeOf(ref.x, ref.n));
    expect(a.status).toBe('tested');
    expectClose(a.test?.p as number, ref.p, 'p', 'IUT p'); // R: max of prop.test / binom.test p-values
    expectClose(a.pOpposite as number, ref.p_opposite, 'p', 'p other way'); // R: Bonferroni over units
    for (const u of ref.units) {
      const mine = a.tests?.find((x) => x.rate.label === `U${u.unit}`);
      expectClose(mine?.p as number, u.p, 'p', `p of U${u.unit}`); // R prop.test / binom.test
      expectClose(mine?.rate.interval.lower as number, u.lower, 'bound', 'Wilson lower'); // R prop.test conf.int
      expectClose(mine?.rate.interval.upper as number, u.upper, 'bound', 'Wilson upper');
      expect(mine?.exact).toBe(u.exact);
    }
  });

  it('supported: every unit shown above; the nearest unit is named with its gap', () => {
    const ref = R.cases[0] as CaseRef; // 82.5%, 78.9%, 80%, 81.8% against 70%
    const { a, d, w } = run(claim(0.7, 'higher'), cubeOf(ref.x, ref.n));
    expect(d.verdict).toBe('supported');
    expect(a.nearest?.rate.label).toBe('U1');
    expect(a.test?.n).toEqual([380, 200, 110, 400]); // each unit once, nearest the value first (78.9%, 80%, 81.8%, 82.5%)
    expect(w.section.verdictText).toContain('Supported. Each of the 4 units was shown above the value of 70%. The nearest to it is U1');
    expect(w.section.chart?.data).toMatchObject({ kind: 'rates', reference: { value: 0.7 } });
  });

  it('not supported: names the units not shown above, and does not say they are below', () => {
    const ref = R.cases[2] as CaseRef; // 80/100, 75/100, 150/200 against 70%
    const { a, d, w } = run(claim(0.7, 'higher'), cubeOf(ref.x, ref.n));
    expect(d.verdict).toBe('not-supported');
    expect(w.section.verdictText).toContain('U1 and U2 could not be shown above the value of 70%');
    expect(w.section.verdictText).toContain('This does not show that any unit is on the other side of the value');
    // The smallest unit's detectable gap (score test power, Lachin 1981), one-sided at 0.05.
    const gap = minDetectableGap(100, 0.7, { alpha: 0.05, power: 0.8, sided: 'one-sided' });
    expectClose(a.detectable as number, gap.increase as number, 'closed', 'detectable');
  });

  it('points the other way when a unit is shown on the far side of the value', () => {
    const ref = R.cases[5] as CaseRef; // 50/100 against 70%
    const { d, w } = run(claim(0.7, 'higher'), cubeOf(ref.x, ref.n));
    expect(d.verdict).toBe('opposite');
    expect(w.section.verdictText).toContain('U1 is shown below it');
  });

  it('a unit with too few respondents: the claim about every unit cannot be shown, and the unit is named', () => {
    const { a, d, w } = run(claim(0.7, 'higher'), cubeOf([330, 300, 7], [400, 380, 8]));
    expect(a.suppressedUnits).toEqual(['U2']);
    expect(a.test?.p).toBe(1);
    expect(d.verdict).toBe('not-supported');
    expect(w.section.verdictText).toContain('U2 had fewer than 10 respondents and could not be tested, so a claim about every unit cannot be shown');
  });

  it('every unit too small is too little data', () => {
    expect(run(claim(0.7, 'higher'), cubeOf([7, 6], [8, 9])).d.verdict).toBe('too-little-data');
  });

  it('bad input is an InputError naming the claim, the field and a fix', () => {
    const cube = cubeOf([330, 300, 160], [400, 380, 200]);
    const message = (f: () => unknown): string => {
      try {
        f();
      } catch (e) {
        expect(e).toBeInstanceOf(InputError);
        expect((e as InputError).problems[0]?.line).toBe(9);
        return (e as InputError).message;
      }
      throw new Error('no InputError');
    };
    expect(message(() => analyse(claim(0.7, 'higher', { units: 'Campus' }), cube, ctx))).toMatch(/no such column/);
    expect(message(() => analyse(claim(0.7, 'higher', { where: { Unit: 'U0' } }), cube, ctx))).toMatch(/only one \(U0\).*kind: target/s);
    expect(message(() => analyse(claim(1, 'higher', { valueWritten: '100%' }), cube, ctx))).toMatch(/strictly between 0% and 100%/);
  });
});

describe('every claims in the claims file', () => {
  const head = `title: T
organisation: O
sources:
  results:
    file: data/kinds-summary.csv
    shape: summary
    respondents: Respondents
    agree: Agreeing
claims:
`;
  const parse = (c: string) => parseClaimsText(head + c + '\n', { absPath: resolve(here, '../fixtures/claims/inline.yaml'), file: 'claims.yaml', sha256: '' });
  it('normalizes with its value and label', () => {
    const f = parse('  - { id: a, claim: Every provider is above the 70% benchmark., kind: every, units: provider, value: 70%, value_label: the 70% benchmark, expect: higher }');
    expect(f.claims[0]).toMatchObject({ kind: 'every', units: 'provider', value: 0.7, valueWritten: '70%', valueLabel: 'the 70% benchmark', expect: 'higher' });
  });
  it('kind: each is read as an every claim; a margin for every unit stays refused with the way out', () => {
    expect(() => parse('  - { id: a, claim: c, kind: each, units: provider, value: 70%, expect: higher }')).toThrow(/Did you mean every .*Write kind: every/);
    expect(() => parse('  - { id: a, claim: c, kind: none, units: provider }')).toThrow(/within a margin.*kind: every/s);
  });
  it('on a source with periods, where must name the period (or units be the period column)', () => {
    const withPeriod = (c: string) => parseClaimsText(head.replace('    agree: Agreeing\n', '    agree: Agreeing\n    period: year\n') + c + '\n', { absPath: resolve(here, '../fixtures/claims/inline.yaml'), file: 'claims.yaml', sha256: '' });
    expect(() => withPeriod('  - { id: a, claim: c, kind: every, units: provider, value: 70%, expect: higher }')).toThrow(/does not say which period it covers.*Add year: latest to where/s);
    expect(withPeriod('  - { id: a, claim: c, kind: every, where: { year: latest }, units: provider, value: 70%, expect: higher }').claims).toHaveLength(1);
  });
  it('refuses expect: different (every unit on one side needs a side)', () => {
    expect(() => parse('  - { id: a, claim: c, kind: every, units: provider, value: 70%, expect: different }')).toThrow(/higher|lower/);
  });
});
