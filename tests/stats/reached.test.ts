/**
 * Methods reached from the claims by way of the claim kinds, checked through the claim path against GNU R 4.2
 * (tests/fixtures/r/reached.R writes tests/fixtures/r/reached.json):
 * - Kendall's tau-b as the second check on ranks in association claims (R cor.test(method = "kendall", exact = FALSE));
 * - the two-sided Clopper–Pearson interval shown with the exact binomial test in target claims (R binom.test);
 * - the adjustments hochberg, bonferroni and benjamini-yekutieli accepted in the claims file (R p.adjust).
 */
import { readFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { analyseAssociation } from '../../src/analyse/association.js';
import { analyse } from '../../src/analyse/index.js';
import type { TargetAnalysis } from '../../src/analyse/types.js';
import type { AssociationClaim, TargetClaim } from '../../src/claims/types.js';
import { parseClaimsText } from '../../src/claims/read.js';
import type { Cell, Cube } from '../../src/data/types.js';
import { InputError } from '../../src/errors.js';
import { adjustP } from '../../src/stats/p-adjust.js';
import { clopperPearsonInterval } from '../../src/stats/clopper-pearson.js';
import { binomialExactTest } from '../../src/stats/binomial-exact.js';
import { methodInfo } from '../../src/stats/methods.js';
import { composeClaim } from '../../src/verdicts/compose.js';
import { decide } from '../../src/verdicts/decide.js';
import { ADJUST_NAMES } from '../../src/verdicts/pack.js';
import { Templates } from '../../src/verdicts/templates.js';
import { expectClose } from '../helpers/tolerance.js';

type RAlt = 'two.sided' | 'less' | 'greater';
const here = dirname(fileURLToPath(import.meta.url));
const R = JSON.parse(readFileSync(resolve(here, '../fixtures/r/reached.json'), 'utf8')) as {
  r_version: string;
  association: { nx: number[]; ax: number[]; ny: number[]; ay: number[]; kendall: { alternative: RAlt; tau: number; z: number; p: number }[] };
  clopper_pearson: { x: number; n: number; p0: number; level: number; p: number; lower: number; upper: number }[];
  adjust: { p: number[]; hochberg: number[]; bonferroni: number[]; BY: number[] };
};

const templates = new Templates();
const words = { templates, claimsTested: 1, adjustName: 'no adjustment', adjusted: false, minRespondents: 10, periodColumns: [] };
const ctx = { minRespondents: 10, claimsFile: 'claims.yaml' };
const common = {
  statement: 'A claim.',
  source: 'test',
  where: {},
  confidence: 0.95,
  confidenceWritten: '95%',
  minRespondents: 10,
  place: { line: 3, column: 5 },
};

function cubeOf(cells: Array<{ dims: Record<string, string>; n: number; agree: number }>): Cube {
  const full: Cell[] = cells.map((c, i) => ({ approximate: false, firstRow: i + 2, ...c }));
  const dimensions = [...new Set(full.flatMap((c) => Object.keys(c.dims)))];
  const values: Record<string, string[]> = {};
  for (const d of dimensions) values[d] = [...new Set(full.map((c) => c.dims[d] as string))];
  return { sourceId: 'test', file: 'test.csv', sha256: '0', rows: full.length, dimensions, cells: full, values, approximate: false, hasPopulation: false };
}

describe(`Kendall's tau-b in association claims against ${R.r_version} cor.test(method = "kendall", exact = FALSE)`, () => {
  const A = R.association;
  const cube = cubeOf(
    A.nx.flatMap((_, i) => [
      { dims: { Dept: `D${i + 1}`, Q: 'Q1' }, n: A.nx[i]!, agree: A.ax[i]! },
      { dims: { Dept: `D${i + 1}`, Q: 'Q2' }, n: A.ny[i]!, agree: A.ay[i]! },
    ]),
  );
  const claim = (alt: RAlt): AssociationClaim => ({
    ...common,
    id: 'a',
    kind: 'association',
    units: 'Dept',
    x: { Q: 'Q1' },
    y: { Q: 'Q2' },
    xLabel: 'resources',
    yLabel: 'satisfaction',
    xMeasure: { type: 'agree' },
    yMeasure: { type: 'agree' },
    controls: [],
    weighted: false,
    expect: alt === 'less' ? 'negative' : alt === 'greater' ? 'positive' : 'any',
    sided: alt === 'two.sided' ? 'two-sided' : 'one-sided',
  });

  for (const r of A.kendall) {
    it(`tau-b, z and p, ${r.alternative}`, () => {
      const a = analyseAssociation(claim(r.alternative), cube, ctx);
      // Source: R 4.2 cor.test(x, y, method = "kendall", exact = FALSE, alternative) in reached.R
      expectClose(a.kendall?.estimate.value ?? NaN, r.tau, 'closed', 'tau-b');
      expectClose(a.kendall?.statistic?.value ?? NaN, r.z, 'closed', 'z');
      expectClose(a.kendall?.p ?? NaN, r.p, 'p', 'p');
      expect(a.methods).toContain('kendall-tau-b');
      expect(a.methods).toContain('spearman');
    });
  }

  it('is shown beside Spearman in the pack, with the method notes it names', () => {
    const a = analyseAssociation(claim('two.sided'), cube, ctx);
    const d = decide(a, a.test?.p);
    const section = composeClaim(a, d, words).section;
    const row = section.numbers.find((n) => n.label.startsWith("Kendall's tau-b"));
    // tau-b = 0.8667 from R (reached.json), printed with the pack's coefficient format
    expect(row?.value).toMatch(/^0\.87 \(/);
    expect(methodInfo('kendall-tau-b').source).toMatch(/Kendall/);
  });
});

describe(`Clopper–Pearson interval in target claims against ${R.r_version} binom.test`, () => {
  const cube = cubeOf([{ dims: { Unit: 'D' }, n: 18, agree: 14 }]);
  const claim = (level: number, expect: TargetClaim['expect']): TargetClaim => ({
    ...common,
    kind: 'target',
    id: 't',
    select: { Unit: 'D' },
    value: 0.9,
    valueWritten: '90%',
    expect,
    confidence: level,
    confidenceWritten: `${level * 100}%`,
    sided: expect === 'different' ? 'two-sided' : 'one-sided',
  });

  for (const r of R.clopper_pearson.filter((c) => c.x === 14)) {
    it(`14 of 18 against 90%: the exact test with its two-sided interval at ${r.level}`, () => {
      for (const direction of ['lower', 'different'] as const) {
        const a = analyse(claim(r.level, direction), cube, ctx) as TargetAnalysis;
        expect(a.methods).toContain('binomial-exact');
        expect(a.methods).toContain('clopper-pearson');
        // Source: R 4.2 binom.test(14, 18, p = 0.9, conf.level = level)$conf.int, two-sided even for a one-sided claim
        expectClose(a.exactInterval?.lower ?? NaN, r.lower, 'bound', 'lower');
        expectClose(a.exactInterval?.upper ?? NaN, r.upper, 'bound', 'upper');
        if (direction === 'different') expectClose(a.test?.p ?? NaN, r.p, 'p', 'two-sided exact p'); // binom.test p.value
      }
    });
  }

  it('the pack shows the exact interval; a large selection (score test) has none', () => {
    const a = analyse(claim(0.95, 'lower'), cube, ctx) as TargetAnalysis;
    const section = composeClaim(a, decide(a, a.test?.p), words).section;
    // 0.5236 to 0.9359 from R binom.test(14, 18)$conf.int (reached.json), in the pack's whole-percent format
    expect(section.numbers.find((n) => n.label.includes('Clopper–Pearson'))?.value).toBe('52% to 94%');
    const big = analyse({ ...claim(0.95, 'lower'), select: { Unit: 'E' } }, cubeOf([{ dims: { Unit: 'E' }, n: 200, agree: 150 }]), ctx) as TargetAnalysis;
    expect(big.exactInterval).toBeUndefined();
    expect(big.methods).not.toContain('clopper-pearson');
  });

  it('clopperPearsonInterval and binomialExactTest agree with binom.test on the other cases, edges included', () => {
    for (const r of R.clopper_pearson) {
      const iv = clopperPearsonInterval(r.x, r.n, { level: r.level }).interval;
      // Source: R 4.2 binom.test(x, n, p0, conf.level)$conf.int and $p.value (reached.json)
      expectClose(iv.lower, r.lower, 'bound', `lower ${r.x}/${r.n}`);
      expectClose(iv.upper, r.upper, 'bound', `upper ${r.x}/${r.n}`);
      expectClose(binomialExactTest(r.x, r.n, r.p0, { level: r.level }).p, r.p, 'p', `p ${r.x}/${r.n}`);
    }
  });
});

describe('adjustments accepted in the claims file', () => {
  const fixture = resolve(here, '../fixtures/claims/valid-association.yaml');
  const text = readFileSync(fixture, 'utf8');
  const withAdjust = (name: string): string => text.replace(/^adjust: .*$/m, `adjust: ${name}`);
  const read = (name: string) => parseClaimsText(withAdjust(name), { absPath: fixture, file: 'claims.yaml', sha256: '0' });

  it('the fixture sets an adjustment to replace', () => {
    expect(text).toMatch(/^adjust: benjamini-hochberg$/m);
  });

  for (const [name, ref] of [
    ['hochberg', R.adjust.hochberg],
    ['bonferroni', R.adjust.bonferroni],
    ['benjamini-yekutieli', R.adjust.BY],
  ] as const) {
    it(`${name}: read from the claims file, named in the pack, adjusted as R p.adjust does`, () => {
      const claims = read(name);
      expect(claims.adjust).toBe(name);
      expect(ADJUST_NAMES[claims.adjust]).toMatch(/method/);
      expect(methodInfo(claims.adjust).name).toMatch(/adjustment/);
      // The pipeline adjusts the tested claims' p-values with adjustP(p, claims.adjust).
      const got = adjustP(R.adjust.p, claims.adjust);
      // Source: R 4.2 p.adjust(p, method) in reached.R
      ref.forEach((v, i) => expectClose(got[i]!, v, 'closed', `${name}[${i + 1}]`));
    });
  }

  it('an unknown adjustment is an input error naming the field', () => {
    let problem: InputError | undefined;
    try {
      read('sidak');
    } catch (e) {
      problem = e as InputError;
    }
    expect(problem).toBeInstanceOf(InputError);
    expect(problem!.problems.some((p) => p.field === 'adjust' && p.file === 'claims.yaml')).toBe(true);
  });

  it('the schema lists every adjustment the claims file type allows', () => {
    const schema = JSON.parse(readFileSync(join(here, '../../schema/claims.schema.json'), 'utf8')) as {
      properties: { adjust: { enum: string[] } };
    };
    expect([...schema.properties.adjust.enum].sort()).toEqual(Object.keys(ADJUST_NAMES).sort());
  });
});
