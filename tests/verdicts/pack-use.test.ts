/**
 * What the pack's back matter says follows what the pack holds: built through the pipeline from small invented
 * summary files (one claim of a kind, or estimates alone), the glossary lists only the terms the pack uses, and the
 * method notes on the smallest detectable effect speak of an adjustment for many claims only where one was made.
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { build, type BuildResult } from '../../src/pipeline.js';

const work = mkdtempSync(join(tmpdir(), 'warrant-pack-use-'));
afterAll(() => rmSync(work, { recursive: true, force: true }));

const csv = `Campus,Question,Respondents,Agreeing
North,Q1,1000,560
South,Q1,1000,510
North,Q2,800,400
South,Q2,800,404
`;

async function buildPack(name: string, header: string, claims: string, data = csv): Promise<BuildResult> {
  const dir = join(work, name);
  const { mkdirSync } = await import('node:fs');
  mkdirSync(dir, { recursive: true });
  writeFileSync(join(dir, 'summary.csv'), data);
  writeFileSync(
    join(dir, 'claims.yaml'),
    `title: Pack use\norganisation: Fernwick Students\ndata_date: 2026-01-15\nconfidence: 95%\n${header}sources:\n  s:\n    file: summary.csv\n    shape: summary\n    respondents: Respondents\n    agree: Agreeing\nclaims:\n${claims}`,
  );
  return build({ claimsPath: join(dir, 'claims.yaml'), outDir: join(dir, 'out'), cwd: dir });
}

const compare = (q: string) => `  - id: north-${q.toLowerCase()}
    claim: North campus agrees more often than South on ${q}.
    kind: compare
    where: { Question: ${q} }
    focus: { Campus: North }
    against: { Campus: South }
    expect: higher
`;
const estimate = (q: string) => `  - id: north-estimate-${q.toLowerCase()}
    claim: Most North students agree on ${q}.
    kind: estimate
    select: { Campus: North, Question: ${q} }
`;

let oneCompare: BuildResult;
let estimatesOnly: BuildResult;
let twoUnadjusted: BuildResult;
let twoHolm: BuildResult;
beforeAll(async () => {
  oneCompare = await buildPack('one-compare', 'adjust: holm\n', compare('Q1'));
  estimatesOnly = await buildPack('estimates', '', estimate('Q1') + estimate('Q2'));
  twoUnadjusted = await buildPack('two-none', 'adjust: none\n', compare('Q1') + compare('Q2'));
  twoHolm = await buildPack('two-holm', 'adjust: holm\n', compare('Q1') + compare('Q2'));
}, 120_000);

const terms = (b: BuildResult) => b.model.glossary.map((g) => g.term);

describe('the glossary', () => {
  it('lists for one comparison of two separate campuses the words its page uses, and no other', () => {
    expect(terms(oneCompare)).toEqual([
      'Agreement rate',
      'Confidence level',
      'Confidence interval',
      'Null hypothesis',
      'p-value',
      'Adjustment for many claims',
      'Percentage points',
      'Power',
      "Cohen's h",
    ]);
  });

  it('lists for estimates alone no hypothesis, p-value, power, correlation or differences', () => {
    expect(terms(estimatesOnly)).toEqual(['Agreement rate', 'Confidence level', 'Confidence interval']);
  });

  it('lists agreement rates and percentage points for a rank claim alone', async () => {
    const data = 'Campus,Question,Respondents,Agreeing\nNorth,Q1,1000,700\nSouth,Q1,1000,500\nWest,Q1,1000,520\n';
    const rank = `  - id: north-highest\n    claim: North has the highest rate on Q1 of the three campuses.\n    kind: rank\n    where: { Question: Q1 }\n    focus: { Campus: North }\n    expect: highest\n`;
    const pack = await buildPack('rank', '', rank, data);
    expect(pack.analyses[0]!.kind).toBe('rank');
    expect(terms(pack)).toEqual(expect.arrayContaining(['Agreement rate', 'Percentage points', 'p-value', 'Power']));
    expect(terms(pack)).not.toContain('Correlation (r)');
  }, 60_000);

  it('still lists every term the demo uses, each explained on a claim page first', async () => {
    const { resolve } = await import('node:path');
    const root = resolve(__dirname, '../..');
    const demo = await build({ claimsPath: join(root, 'demo/claims.yaml'), outDir: join(work, 'demo-out'), cwd: root });
    const onPages = new Set(demo.model.claims.flatMap((c) => (c.terms ?? []).map((t) => t.term)));
    const listed = terms(demo);
    for (const t of onPages) expect(listed).toContain(t);
    expect(listed).toEqual(expect.arrayContaining(['Correlation (r)', 'Causation', 'Rest of a group', 'TOST', "Cohen's d"]));
    // Every glossary entry after the general ones is a term some page explains.
    const general = ['Agreement rate', 'Confidence level', 'Confidence interval', 'Null hypothesis', 'p-value', 'Adjustment for many claims', 'Percentage points', 'Correlation (r)', 'Causation', 'Power', 'Rest of a group'];
    for (const t of listed) if (!general.includes(t)) expect(onPages.has(t), t).toBe(true);
  }, 120_000);
});

describe('the method note on the smallest detectable difference', () => {
  const note = (b: BuildResult) => b.model.methods.find((m) => m.name === 'Smallest detectable difference')?.text ?? '';

  it('speaks of no adjustment with one claim tested under holm, as the cover and the method line do', () => {
    expect(oneCompare.model.adjustmentText).toMatch(/^None/);
    expect(note(oneCompare)).toContain('one minus the claim’s confidence level, as no adjustment for many claims was made');
    expect(note(oneCompare)).not.toContain('after the adjustment');
    expect(oneCompare.model.methods.map((m) => m.name)).not.toContain("Holm's step-down adjustment");
  });

  it('speaks of no adjustment with adjust: none and two claims', () => {
    expect(note(twoUnadjusted)).toContain('as no adjustment for many claims was made');
    expect(note(twoUnadjusted)).not.toContain('after the adjustment');
  });

  it('speaks of the adjustment where two claims were adjusted by Holm', () => {
    expect(twoHolm.model.adjustmentText).toMatch(/^Holm's method across the 2 claims/);
    expect(note(twoHolm)).toContain('after the adjustment for many claims, the threshold each claim was held to is smaller');
  });
});

describe('the general cautions on intervals under an adjustment', () => {
  it('say that the numbers give the interval at the adjusted level, as each claim page does', () => {
    const cautions = twoHolm.model.generalCautions.join(' ');
    expect(cautions).not.toContain('only the p-values are adjusted');
    expect(cautions).toContain('Where adjusting for testing 2 claims together held a claim to a stricter level, its numbers also give the interval at that level (marked "adjusted for 2 claims")');
    // Holm's first step holds the smaller p-value (Q1's) to 0.05 / 2 = 0.025 and the second to 0.05 (Holm 1979):
    // Q1's numbers give the 97.5% interval, marked; Q2, held to its own level, has none to give.
    const difference = twoHolm.model.claims.map((c) => c.numbers.find((r) => r.label === 'Difference')?.value ?? '');
    expect(twoHolm.decisions.map((d) => d.effectiveAlpha)).toEqual([0.025, 0.05]);
    expect(difference[0]).toMatch(/97\.5% interval .* adjusted for 2 claims/);
    expect(difference[1]).not.toContain('adjusted for');
  });
});

describe('a comparison decided by Fisher\'s exact test whose interval leaves out no difference', () => {
  it('says that the test and the interval disagree, with both figures, and none where they agree', async () => {
    // North 0 of 30 against South 5 of 30: R 4.2 fisher.test(matrix(c(0, 30, 5, 25), 2))$p.value = 0.05218555, while
    // Newcombe's hybrid score interval (method 10, worked in R from the two Wilson intervals) is -0.3356435 to
    // -0.0197299: the 95% interval excludes no difference, the test at 5% does not find one.
    const data = 'Campus,Question,Respondents,Agreeing\nNorth,Q1,30,0\nSouth,Q1,30,5\nNorth,Q2,30,0\nSouth,Q2,30,9\n';
    const pack = await buildPack('fisher', '', compare('Q1'), data);
    const a = pack.analyses[0]!;
    expect(a.methods).toContain('fisher-exact-2x2');
    expect(pack.decisions[0]!.p).toBeCloseTo(0.05218555, 7);
    expect(pack.decisions[0]!.verdict).toBe('not-supported');
    const cautions = pack.model.claims[0]!.cautions;
    expect(cautions).toContain(
      "Here the test and the interval for the difference disagree: the 95% interval (−33.6 to −2.0 points) leaves out no difference, yet Fisher's exact test does not find one at that level (p = 0.052). The two are worked out in different ways and can part with counts this small; the verdict follows the test, so read the claim as borderline.",
    );
    // North 0 of 30 against South 9 of 30 (an expected count of 4.5, so Fisher's test again): both find a difference
    // (R fisher.test(matrix(c(0, 30, 9, 21), 2))$p.value = 0.0019356), so no such caution.
    const agree = await buildPack('fisher-agree', '', compare('Q2'), data);
    expect(agree.analyses[0]!.methods).toContain('fisher-exact-2x2');
    expect(agree.decisions[0]!.p).toBeCloseTo(0.0019356, 7);
    expect(agree.model.claims[0]!.cautions.join(' ')).not.toContain('disagree');
  }, 60_000);
});

describe('a real difference below the smallest difference that matters', () => {
  // North 560 of 1,000 against South 510 of 1,000: R 4.2 prop.test(c(560, 510), c(1000, 1000), correct = FALSE)
  // p = 0.02499 (real at 95%), difference +5.0 points, Newcombe's hybrid score interval (method 10, worked in R from
  // the two Wilson intervals) +0.63 to +9.34 points.
  const withSmallest = (size: string) => compare('Q1').replace('    expect: higher\n', `    expect: higher\n    smallest_difference: ${size}\n`);

  it('is not said to be smaller than a size its interval still reaches', async () => {
    const pack = await buildPack('small-6', '', withSmallest('6 points'));
    expect(pack.model.claims[0]!.verdictDetail).toBe('too-small');
    const advice = pack.model.claims[0]!.advice!;
    expect(advice.reason).toContain('its estimate is below 6.0 points (the smallest difference that matters set by the claim); but the 95% interval (+0.6 to +9.3 points) reaches 6.0 points, so the data cannot say whether it is smaller.');
    expect(advice.wording).toMatch(/: a real difference, estimated below 6\.0 points\.$/);
    expect(advice.wording).not.toContain('smaller than');
  }, 60_000);

  it('is said to be smaller where the whole interval is below it', async () => {
    const pack = await buildPack('small-10', '', withSmallest('10 points'));
    expect(pack.model.claims[0]!.verdictDetail).toBe('too-small');
    const advice = pack.model.claims[0]!.advice!;
    expect(advice.reason).toBe('The difference is real and in the claimed direction, but smaller than 10.0 points (the smallest difference that matters set by the claim). Say how large it is rather than that it matters.');
    expect(advice.wording).toMatch(/: a real difference, smaller than 10\.0 points\.$/);
  }, 60_000);
});
