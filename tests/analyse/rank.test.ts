import { readFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { analyse } from '../../src/analyse/index.js';
import type { RankAnalysis } from '../../src/analyse/types.js';
import type { RankClaim } from '../../src/claims/types.js';
import { parseClaimsText } from '../../src/claims/read.js';
import type { Cell, Cube } from '../../src/data/types.js';
import { InputError } from '../../src/errors.js';
import { intersectionUnion } from '../../src/stats/intersection-union.js';
import { twoProportionZ } from '../../src/stats/two-proportion-z.js';
import { minDetectableDifference } from '../../src/stats/power-two-proportions.js';
import { composeClaim } from '../../src/verdicts/compose.js';
import { decide } from '../../src/verdicts/decide.js';
import { Templates } from '../../src/verdicts/templates.js';
import { expectClose } from '../helpers/tolerance.js';

// Reference values: tests/fixtures/r/rank-iut.json from tests/fixtures/r/rank-iut.R (GNU R 4.2.2: prop.test with
// correct = FALSE and fisher.test for each one-sided comparison, Newcombe's interval from prop.test's Wilson bounds,
// the largest p-value for the intersection-union test, Bonferroni over the rivals the other way).
interface RivalRef { rival: number; p: number; p_opposite: number; difference: number; lower: number; upper: number; fisher: boolean }
interface CaseRef { x: number[]; n: number[]; focus: number; expect: 'highest' | 'lowest'; sided: 'one-sided' | 'two-sided'; level: number; p: number; p_opposite: number; rivals: RivalRef[] }
const here = dirname(fileURLToPath(import.meta.url));
const R = JSON.parse(readFileSync(resolve(here, '../fixtures/r/rank-iut.json'), 'utf8')) as { cases: CaseRef[] };

function cubeOf(x: number[], n: number[], extra: Partial<Cube> = {}): Cube {
  const units = x.map((_, i) => `U${i}`);
  return {
    sourceId: 'results', file: 'results.csv', sha256: '0', rows: x.length, dimensions: ['Unit'],
    cells: x.map((agree, i): Cell => ({ dims: { Unit: units[i] as string }, n: n[i] as number, agree, approximate: false, firstRow: i + 2 })),
    values: { Unit: units }, approximate: false, hasPopulation: false, ...extra,
  };
}
function claim(focus: string, expect: RankClaim['expect'], over: Partial<RankClaim> = {}): RankClaim {
  return {
    kind: 'rank', id: 'rank-a', statement: `${focus} has the ${expect} rate of the units.`, source: 'results', where: {},
    units: 'Unit', focus: { Unit: focus }, expect, confidence: 0.95, confidenceWritten: '95%', sided: 'one-sided',
    minRespondents: 10, place: { line: 9, column: 5 }, ...over,
  };
}
const ctx = { minRespondents: 10, claimsFile: 'claims.yaml' };
const words = { templates: new Templates(), claimsTested: 1, adjustName: 'no adjustment (one claim)', adjusted: false, minRespondents: 10, periodColumns: [] };
function run(c: RankClaim, cube: Cube) {
  const a = analyse(c, cube, ctx) as RankAnalysis;
  const d = decide(a, a.test?.p);
  return { a, d, w: composeClaim(a, d, words) };
}
function inputError(f: () => unknown): string {
  try {
    f();
  } catch (e) {
    expect(e).toBeInstanceOf(InputError);
    expect((e as InputError).problems[0]?.file).toBe('claims.yaml');
    expect((e as InputError).problems[0]?.line).toBe(9);
    return (e as InputError).message;
  }
  throw new Error('no InputError');
}

describe('rank claims: one unit the highest or lowest (intersection-union test)', () => {
  it.each(R.cases.map((c, i) => [i, c] as const))('case %i matches R: each rival, the largest p, the other way', (_i, ref) => {
    const { a } = run(claim(`U${ref.focus}`, ref.expect, { sided: ref.sided, confidence: ref.level, confidenceWritten: String(ref.level) }), cubeOf(ref.x, ref.n));
    expect(a.status).toBe('tested');
    expectClose(a.test?.p as number, ref.p, 'p', 'IUT p'); // R: max of prop.test / fisher.test p-values
    expectClose(a.pOpposite as number, ref.p_opposite, 'p', 'p other way'); // R: Bonferroni over rivals
    for (const r of ref.rivals) {
      const mine = a.rivals?.find((x) => x.rival.label === `U${r.rival}`);
      expect(mine, `rival U${r.rival}`).toBeDefined();
      expectClose(mine?.p as number, r.p, 'p', `p against U${r.rival}`); // R prop.test / fisher.test
      expectClose(mine?.difference.value as number, r.difference, 'closed', 'difference');
      expectClose(mine?.difference.interval.lower as number, r.lower, 'bound', 'Newcombe lower'); // R, method 10
      expectClose(mine?.difference.interval.upper as number, r.upper, 'bound', 'Newcombe upper');
      expect(mine?.methods.includes('fisher-exact-2x2')).toBe(r.fisher);
    }
    expect(a.test?.alternative).toBe(ref.sided === 'two-sided' ? 'two-sided' : ref.expect === 'highest' ? 'greater' : 'less');
  });

  it('supported: shown above each rival; the closest rival and smallest lead are named', () => {
    const ref = R.cases[0] as CaseRef;
    const { a, d, w } = run(claim('U0', 'highest'), cubeOf(ref.x, ref.n));
    expect(d.verdict).toBe('supported');
    expect(a.closest?.rival.label).toBe('U1'); // 82.5% against 75%: the nearest rate
    expect(a.units?.map((u) => u.label)).toEqual(['U0', 'U1', 'U2', 'U3']); // highest first
    expect(a.test?.n).toEqual([400, 400, 350, 220]); // each unit once: the focus, then the rivals nearest first
    expect(w.section.verdictText).toContain('Supported. U0 has the highest rate: 83% of its 400 respondents agreed, 7.5 points above the closest rival, U1');
    expect(w.section.chart?.data).toMatchObject({ kind: 'rates', highlight: 'U0' });
  });

  it('not supported: names the rival it could not be separated from and never says another unit is highest', () => {
    const ref = R.cases[2] as CaseRef; // 80/100 against 78/100 and 40/60
    const { a, d, w } = run(claim('U0', 'highest'), cubeOf(ref.x, ref.n));
    expect(d.verdict).toBe('not-supported');
    expect(w.section.verdictText).toContain('could not be separated from U1 (');
    expect(w.section.verdictText).not.toContain('U2 (');
    expect(w.section.verdictText).toContain('This does not show that another unit is highest');
    expect(w.section.verdictText).not.toMatch(/is not the highest|is not highest/);
    // The lead over the closest rival its pair would detect 80% of the time, one-sided at 0.05 (common practice).
    const both = minDetectableDifference(100, 100, 0.78, { alpha: 0.05, power: 0.8, sided: 'one-sided' });
    expectClose(a.detectable as number, both.increase as number, 'closed', 'detectable');
  });

  it('points the other way when a rival is shown above the focus (corrected for the rivals)', () => {
    const ref = R.cases[5] as CaseRef; // 50/100 against 90/100 and 85/100
    const { d, w } = run(claim('U0', 'highest'), cubeOf(ref.x, ref.n));
    expect(d.verdict).toBe('opposite');
    expect(w.section.verdictText).toContain('U1 is shown above it');
    // 90/100 against 50/100: 40 points above, the interval's ends low to high (Newcombe, R fixture case 5).
    const m = /(\d+\.\d) points above \(95% interval (\d+\.\d) to (\d+\.\d) points/.exec(w.section.verdictText) as RegExpExecArray;
    const r = ref.rivals.find((x) => x.rival === 1) as RivalRef;
    expect(Number(m[1])).toBeCloseTo(-r.difference * 100, 1);
    expect(Number(m[2])).toBeCloseTo(-r.upper * 100, 1);
    expect(Number(m[3])).toBeCloseTo(-r.lower * 100, 1);
    // The numbers table names the row for what it is: the rival furthest above (U1, 90 against 50), not a smallest lead.
    const labels = w.section.numbers.map((row) => row.label);
    expect(labels).toContain('Difference from the unit furthest above it, U0 minus U1');
    expect(labels.some((l) => /Smallest difference/.test(l))).toBe(false);
  });

  it('lowest, pointing the other way: the rival below the focus is named, its interval low to high', () => {
    const { d, w } = run(claim('U0', 'lowest'), cubeOf([330, 300, 260], [400, 400, 350]));
    expect(d.verdict).toBe('opposite');
    const m = /shown below it: .* (\d+\.\d) points below \(95% interval (\d+\.\d) to (\d+\.\d) points/.exec(w.section.verdictText) as RegExpExecArray;
    expect(m).not.toBeNull();
    expect(Number(m[2])).toBeLessThan(Number(m[1]));
    expect(Number(m[1])).toBeLessThan(Number(m[3]));
  });

  it('lowest: the interval of the lead reads low to high', () => {
    const ref = R.cases[3] as CaseRef;
    const { d, w } = run(claim('U0', 'lowest', { sided: 'two-sided', confidence: 0.9 }), cubeOf(ref.x, ref.n));
    expect(d.verdict).toBe('supported');
    expect(w.section.verdictText).toMatch(/points below the closest rival, U\d .*interval for the difference (\d+\.\d) to (\d+\.\d) points/);
    const m = /interval for the difference (\d+\.\d) to (\d+\.\d) points/.exec(w.section.verdictText) as RegExpExecArray;
    expect(Number(m[1])).toBeLessThan(Number(m[2]));
  });

  it('a rival with too few respondents leaves the claim unshown (p = 1) and is named', () => {
    const { a, d, w } = run(claim('U0', 'highest'), cubeOf([330, 300, 4], [400, 400, 8]));
    expect(a.suppressedUnits).toEqual(['U2']);
    expect(a.test?.p).toBe(1);
    expect(d.verdict).toBe('not-supported');
    expect(w.section.verdictText).toContain('U2 had fewer than 10 respondents and could not be tested, so the claim about every unit cannot be shown');
  });

  it('a focus with too few respondents is too little data', () => {
    const { d } = run(claim('U2', 'highest'), cubeOf([330, 300, 4], [400, 400, 8]));
    expect(d.verdict).toBe('too-little-data');
  });

  it('one p-value for the adjustment for many claims: the largest (Berger 1982)', () => {
    const parts = [twoProportionZ(80, 100, 60, 100, 'greater'), twoProportionZ(80, 100, 70, 100, 'greater')];
    const iut = intersectionUnion(parts, { method: 'rank-iut', estimate: { name: 'd', value: 0.1 } });
    expect(iut.test.p).toBe(Math.max(parts[0]!.p, parts[1]!.p));
    expect(iut.deciding).toBe(1);
    expect(intersectionUnion(parts, { method: 'rank-iut', sided: 'two-sided', estimate: { name: 'd', value: 0.1 } }).test.p).toBe(Math.min(1, 2 * parts[1]!.p));
    expect(intersectionUnion(parts, { method: 'rank-iut', missing: 1, estimate: { name: 'd', value: 0.1 } }).test.p).toBe(1);
    expect(() => intersectionUnion([], { method: 'rank-iut', estimate: { name: 'd', value: 0 } })).toThrow(/at least one/);
    expect(() => intersectionUnion([parts[0]!, twoProportionZ(80, 100, 70, 100, 'less')], { method: 'rank-iut', estimate: { name: 'd', value: 0 } })).toThrow(/different directions/);
  });

  it('bad input is an InputError naming the claim, the field and a fix', () => {
    const cube = cubeOf([330, 300, 260], [400, 400, 350]);
    expect(inputError(() => analyse(claim('U9', 'highest'), cube, ctx))).toMatch(/not among the units of column "Unit".*name one of U0, U1, U2/s);
    expect(inputError(() => analyse(claim('U0', 'highest', { units: 'Campus' }), cube, ctx))).toMatch(/column "Campus", which its source does not have/);
    expect(inputError(() => analyse(claim('U0', 'highest', { where: { Unit: 'U0' } }), cube, ctx))).toMatch(/no other unit to rank it against.*widen where/s);
    expect(inputError(() => analyse(claim('U0', 'highest', { where: { Unit: ['U1', 'U2'] } }), cube, ctx))).toMatch(/ranks "U0", which is not among the units .* \(U1, U2\)/s);
  });
});

describe('rank claims in the claims file', () => {
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
  const problems = (c: string): string => {
    try {
      parse(c);
    } catch (e) {
      expect(e).toBeInstanceOf(InputError);
      return (e as InputError).message;
    }
    throw new Error('no problems');
  };
  it('normalizes, the units column defaulting to the focus column', () => {
    const f = parse('  - { id: a, claim: Tarnquill has the highest rate., kind: rank, where: { question: Q09 }, focus: { provider: Tarnquill }, expect: highest }');
    expect(f.claims[0]).toMatchObject({ kind: 'rank', units: 'provider', focus: { provider: 'Tarnquill' }, expect: 'highest' });
  });
  it('refuses a focus on another column than units, a list, and a direction it does not know', () => {
    expect(problems('  - { id: a, claim: c, kind: rank, units: provider, focus: { region: North }, expect: highest }')).toMatch(/does not name a value of provider.*focus: \{ provider:/s);
    expect(problems('  - { id: a, claim: c, kind: rank, focus: { provider: [A, B] }, expect: highest }')).toMatch(/one unit as its focus.*kind: compare with against: rest/s);
    expect(problems('  - { id: a, claim: c, kind: rank, focus: { provider: A, region: N }, expect: highest }')).toMatch(/Add units:/);
    expect(problems('  - { id: a, claim: c, kind: rank, focus: { provider: A }, expect: top }')).toMatch(/highest/);
  });
  it('kind: ranking and kind: highest lead to rank', () => {
    expect(problems('  - { id: a, claim: c, kind: highest, focus: { provider: A }, expect: highest }')).toMatch(/kind: rank|"rank"/);
  });
});
