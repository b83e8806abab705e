/**
 * Through the command line: the pack never says one thing on one page and another elsewhere. Small invented
 * releases (written here, fictional units) are built into packs and read back with pdftotext; each test names the
 * two places that must agree.
 *
 * - The words about the adjustment for many claims follow the adjustment actually made: none with `adjust: none` or
 *   with a single claim tested (the cover already said "None: each claim is judged on its own p-value"), and a false
 *   discovery rate for Benjamini–Hochberg (Benjamini and Hochberg (1995), JRSS B 57, 289–300: the expected share of
 *   false findings among those declared, not the chance of even one), as the pack's own method note says.
 */
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { buildPack } from '../helpers/cli.js';

const work = mkdtempSync(join(tmpdir(), 'warrant-coherence-'));
afterAll(() => rmSync(work, { recursive: true, force: true }));

/** An invented summary release: four units, two questions. */
const SUMMARY = ['Unit,Question,Respondents,Agreeing', 'Alderholt,Q1,400,236', 'Birchmere,Q1,400,210', 'Alderholt,Q2,300,180', 'Birchmere,Q2,300,150', ''].join('\n');

function header(adjust: string): string {
  return `title: Coherence check
organisation: Alderholt Learners Council
data_date: 2026-03-01
confidence: 95%
adjust: ${adjust}
sources:
  s:
    file: summary.csv
    shape: summary
    respondents: Respondents
    agree: Agreeing
claims:
`;
}

function compareClaim(id: string, question: string): string {
  return `  - id: ${id}
    claim: Alderholt agrees more than Birchmere on ${question}.
    kind: compare
    source: s
    where: { Question: ${question} }
    focus: { Unit: Alderholt }
    against: { Unit: Birchmere }
    expect: higher
`;
}

function build(name: string, yaml: string) {
  const dir = join(work, name);
  rmSync(dir, { recursive: true, force: true });
  mkdirSync(dir, { recursive: true });
  writeFileSync(join(dir, 'summary.csv'), SUMMARY);
  return buildPack(dir, yaml);
}

describe('the adjustment for many claims is described as made', () => {
  it('adjust: none with two claims: no page says the p-values were adjusted', () => {
    const pack = build('none', header('none') + compareClaim('q1-higher', 'Q1') + compareClaim('q2-higher', 'Q2'));
    const t = pack.text;
    expect(t).toContain('Adjustment for many claims None: each claim is judged on its own p-value');
    expect(t).not.toContain('after adjusting for testing 2 claims together');
    expect(t).not.toContain('adjusted for this with no adjustment');
    expect(t).not.toContain('No adjustment does this');
    expect(t).not.toContain('after adjusting for the other claims tested');
    expect(t).not.toContain('only the p-values are adjusted');
    expect(t).toContain('no adjustment was made for testing 2 claims together');
    expect(t).toContain('2 claims were tested together and their p-values were not adjusted for it (the claims file sets adjust: none)');
    expect(t).toContain('This pack makes none (the claims file sets adjust: none): each claim is judged on its own p-value against 5%');
    // R 4.x prop.test(c(236, 210), c(400, 400), correct = FALSE): p = 0.064, not supported; prop.test(c(180, 150),
    // c(300, 300), correct = FALSE): p = 0.0138, supported on its own p-value (its advice is the sentence checked above).
    expect(pack.results.claims.map((c) => c.verdict)).toEqual(['not-supported', 'supported']);
    expect(pack.results.claims[1]!.p).toBeCloseTo(0.01382302, 6);
  }, 60_000);

  it('one claim under Holm: nothing is adjusted, and no page says it was', () => {
    const pack = build('single', header('holm') + compareClaim('q2-higher', 'Q2'));
    const t = pack.text;
    expect(t).not.toContain('after adjusting for testing 1 claims');
    expect(t).not.toContain('1 claims were tested together');
    expect(t).not.toContain('after adjusting for the other claims tested');
    expect(t).not.toContain("Holm's method does this");
    expect(t).toContain('This pack makes none, as only one claim was tested');
    // The claim's method line agrees with the cover ("None: each claim is judged on its own p-value").
    expect(t).toContain('95% confidence; no adjustment.');
    expect(t).not.toContain("Holm's method");
  }, 60_000);

  it('Benjamini–Hochberg: the glossary speaks of a false discovery rate, as the method note does', () => {
    const pack = build('bh', header('benjamini-hochberg') + compareClaim('q1-higher', 'Q1') + compareClaim('q2-higher', 'Q2'));
    const t = pack.text;
    expect(t).toContain('the share of supported claims that are false findings stays within the stated level');
    expect(t).not.toContain('the chance of even one false finding across the whole pack');
    expect(t).toContain('on average, the share of false findings among the supported claims is kept at 5%');
    expect(t).toContain('The Benjamini–Hochberg method does this');
  }, 60_000);

  it("Holm's method with two claims keeps the family-wise words", () => {
    const pack = build('holm', header('holm') + compareClaim('q1-higher', 'Q1') + compareClaim('q2-higher', 'Q2'));
    const t = pack.text;
    expect(t).toContain('after adjusting for testing 2 claims together');
    expect(t).toContain("the chance of even one false finding across the whole pack is kept at 5% (one minus the confidence level) or less. Holm's method does this");
    expect(t).toContain("the p-values were adjusted for this with Holm's method");
  }, 60_000);
});

/** An invented release where most of each cohort answered: two groups at 50%, 200 of 210 and 300 of 320 eligible. */
const CENSUS_LIKE = ['Unit,Question,Respondents,Agreeing,Eligible', 'Corrow,Q1,200,100,210', 'Dunmere,Q1,300,150,320', ''].join('\n');

describe('a compare claim and an equivalence claim on the same two groups read the same data alike', () => {
  it('with the number eligible, the equivalence test carries the finite-population correction as the compare claim does', () => {
    const dir = join(work, 'linked');
    mkdirSync(dir, { recursive: true });
    writeFileSync(join(dir, 'release.csv'), CENSUS_LIKE);
    const yaml = `title: Linked claims
organisation: Corrow Students Forum
data_date: 2026-03-01
adjust: none
sources:
  s:
    file: release.csv
    shape: summary
    respondents: Respondents
    agree: Agreeing
    population: Eligible
claims:
  - id: corrow-differs
    claim: Corrow and Dunmere differ on Q1.
    kind: compare
    source: s
    where: { Question: Q1 }
    focus: { Unit: Corrow }
    against: { Unit: Dunmere }
    expect: different
  - id: corrow-like-dunmere
    claim: Corrow and Dunmere are within 5 points of each other on Q1.
    kind: equivalence
    source: s
    where: { Question: Q1 }
    focus: { Unit: Corrow }
    against: { Unit: Dunmere }
    margin: 5 points
`;
    const pack = buildPack(dir, yaml);
    const [cmp, eq] = pack.results.claims as Array<Record<string, any>>;
    // The compare claim is ruled out by the equivalence claim's margin: its interval excludes ±5 points.
    expect(cmp!.verdictDetail).toBe('ruled-out');
    expect(cmp!.worthReporting.basis).toBe('linked-margin');
    expect(Math.max(-cmp!.interval.lower, cmp!.interval.upper)).toBeLessThan(0.05);
    // The equivalence claim reads the same spread, so its 90% interval lies inside the margin too: supported.
    // Its figures, from f = (N - n)/(N - 1) (Cochran 1977, §3.3) on the unpooled variance (Schuirmann 1987), written
    // out in R 4.x: f1 = 10/209, f2 = 20/319; se = sqrt(f1 * .25/200 + f2 * .25/300) = 0.010585614;
    // p = pnorm(-0.05/se) = 1.159717e-06; 90% interval ±qnorm(0.95) * se = ±0.017411785.
    expect(eq!.finitePopulationCorrection).toEqual({ used: true });
    expect(eq!.verdict).toBe('supported');
    expect(eq!.interval.upper).toBeCloseTo(0.017411785, 8);
    expect(eq!.interval.lower).toBeCloseTo(-0.017411785, 8);
    expect(eq!.p / 1.159717e-6).toBeCloseTo(1, 5);
    // Both give the response rate (the lower of the two groups: 200 of 210).
    expect(pack.text.match(/Response rate: 94% of those eligible answered \(the lowest of the groups compared\)/g)).toHaveLength(2);
  }, 60_000);
});

describe('a claim tested one-sided is shown with the interval that matches its test', () => {
  it('supported one-sided at p = 0.032: the 90% interval excludes no difference; the two-sided 95% one keeps its signs', () => {
    const yaml = `${header('none')}${compareClaim('q1-higher', 'Q1')}    test: one-sided\n`;
    const pack = build('one-sided', yaml);
    const c = pack.results.claims[0] as Record<string, any>;
    // R 4.x prop.test(c(236, 210), c(400, 400), correct = FALSE, alternative = "greater")$p.value = 0.0321023.
    expect(c.p / 0.0321023).toBeCloseTo(1, 5);
    expect(c.verdict).toBe('supported');
    // The one-sided test at 5% matches the two-sided 90% interval (Newcombe's hybrid score interval, method 10,
    // written out in R 4.x from Wilson's limits at 90%): 0.007238551439 to 0.122152167065.
    expect(c.adjustedInterval.level).toBeCloseTo(0.9, 12);
    expect(c.adjustedInterval.lower).toBeCloseTo(0.007238551439, 9);
    expect(c.adjustedInterval.upper).toBeCloseTo(0.122152167065, 9);
    // The claim's own 95% interval holds zero (−0.4 to +13.3): the sentence keeps its signs, and says which interval
    // decided the verdict, on the page and in the summary's key figure.
    expect(c.interval.lower).toBeLessThan(0);
    expect(pack.text).toContain('Alderholt is 6.5 points higher (95% interval −0.4 to +13.3 points)');
    expect(pack.text).not.toContain('95% interval 0.4 to 13.3 points');
    expect(pack.text).toContain('The 95% interval is two-sided; at the level that decided the verdict (90%, matching the one-sided test) it runs from +0.7 to +12.2 points.');
    // (The summary's narrow column may break "one-sided" at its hyphen.)
    expect(pack.text).toMatch(/90% interval matching the one-?sided test: \+0\.7 to \+12\.2/);
    expect(pack.text).toContain('95% interval −0.4 to +13.3, two-sided; 90% interval +0.7 to +12.2, matching the one-sided test');
  }, 60_000);
});

describe('the smallest detectable difference when the comparison group is at 100%', () => {
  it('a fall from 100% is still within reach: the pack gives its size, not "none within reach"', () => {
    const dir = join(work, 'edge');
    mkdirSync(dir, { recursive: true });
    writeFileSync(join(dir, 'release.csv'), ['Unit,Question,Respondents,Agreeing', 'Fenwick,Q1,40,40', 'Glenmoor,Q1,40,36', ''].join('\n'));
    const yaml = `title: Edge rates
organisation: Fenwick Forum
data_date: 2026-03-01
sources:
  s:
    file: release.csv
    shape: summary
    respondents: Respondents
    agree: Agreeing
claims:
  - id: glenmoor-lower
    claim: Glenmoor agrees less than Fenwick on Q1.
    kind: compare
    source: s
    where: { Question: Q1 }
    focus: { Unit: Glenmoor }
    against: { Unit: Fenwick }
    expect: lower
`;
    const pack = buildPack(dir, yaml);
    const c = pack.results.claims[0] as Record<string, any>;
    expect(c.verdict).toBe('not-supported');
    // R 4.x power.prop.test(n = 40, p1 = 1e-20, power = 0.8, tol = 1e-14)$p2 = 0.1739402: the rise from 0% that the
    // test finds 80% of the time at two-sided 5%, which by the formula's symmetry is the fall from 100%.
    expect(c.detectable).toBeCloseTo(0.1739402, 6);
    expect(pack.text).toContain('a difference of about 17.4 points or more would be detected 80% of the time');
    expect(pack.text).not.toContain('none within reach');
  }, 60_000);
});

describe('cautions about cohorts and about cause and effect appear where a claim needs them, and only there', () => {
  /** Invented respondents: two years, two campuses, answers 1-5 to one question, spread by a fixed rule. */
  function respondents(): string {
    const lines = ['Year,Campus,Q1'];
    for (const year of [2025, 2026]) {
      for (const campus of ['Harrowfen', 'Lisswater']) {
        for (let i = 0; i < 60; i++) lines.push(`${year},${campus},${1 + ((i * 7 + (year === 2026 ? 2 : 0) + (campus === 'Lisswater' ? 1 : 0)) % 5)}`);
      }
    }
    return `${lines.join('\n')}\n`;
  }
  const head = `title: Cohorts
organisation: Harrowfen Learners Council
data_date: 2026-03-01
sources:
  r:
    file: answers.csv
    shape: respondents
    questions: [Q1]
    question_column: Question
    period: Year
claims:
`;

  it('a crosstab of the answers by year, and a comparison of mean scores between years, carry the cohorts caution', () => {
    const dir = join(work, 'cohorts');
    mkdirSync(dir, { recursive: true });
    writeFileSync(join(dir, 'answers.csv'), respondents());
    const yaml = `${head}  - id: answers-by-year
    claim: The answers to Q1 shifted between 2025 and 2026.
    kind: crosstab
    source: r
    where: { Question: Q1 }
    rows: Year
    columns: answers
    expect: related
  - id: mean-by-year
    claim: The mean score on Q1 rose between 2025 and 2026.
    kind: means
    source: r
    where: { Question: Q1 }
    focus: { Year: 2026 }
    against: { Year: 2025 }
    expect: higher
`;
    const pack = buildPack(dir, yaml);
    const [crosstab, means] = pack.results.claims as Array<Record<string, any>>;
    expect(crosstab!.cautions.join(' ')).toContain("Each period's respondents are treated as a separate sample");
    expect(means!.cautions.join(' ')).toContain("The two years' respondents are treated as separate samples");
    // The pack makes claims across years and a claim of a relation (a crosstab): both general cautions apply.
    expect(pack.text).toContain('A change between years compares two groups of respondents that may overlap');
    expect(pack.text).toContain('An association between two measures does not show that one causes the other');
  }, 60_000);

  it('a pack of comparisons within one year says nothing of changes between years or of cause and effect', () => {
    const pack = build('within-year', header('holm') + compareClaim('q1-higher', 'Q1') + compareClaim('q2-higher', 'Q2'));
    expect(pack.text).not.toContain('A change between years compares');
    expect(pack.text).not.toContain('An association between two measures');
    expect(pack.text).toContain('Every interval and verdict assumes the respondents are like a random sample');
  }, 60_000);
});

describe('a claim with too few respondents names its groups as a tested one would', () => {
  it('the rest of a group stays "the rest" (or "everyone else") in what was compared and the hypotheses', () => {
    const dir = join(work, 'rest-too-few');
    mkdirSync(dir, { recursive: true });
    writeFileSync(join(dir, 'release.csv'), ['Unit,Region,Question,Respondents,Agreeing', 'Tarnhollow,Marsh Reach,Q1,6,3', 'Bexley Fen,Marsh Reach,Q1,300,150', ''].join('\n'));
    const claim = (id: string, against: string) => `  - id: ${id}
    claim: Tarnhollow agrees less than the rest of Marsh Reach on Q1.
    kind: compare
    source: s
    where: { Question: Q1 }
    focus: { Unit: Tarnhollow }
    against: ${against}
    expect: lower
`;
    const yaml = `title: Too few
organisation: Marsh Reach Forum
data_date: 2026-03-01
sources:
  s:
    file: release.csv
    shape: summary
    respondents: Respondents
    agree: Agreeing
claims:
${claim('against-rest', 'rest')}${claim('against-region', '{ Region: Marsh Reach }')}`;
    const pack = buildPack(dir, yaml);
    expect(pack.results.claims.map((c) => c.verdict)).toEqual(['too-little-data', 'too-little-data']);
    expect(pack.text).toContain('Compared Tarnhollow against everyone else, for Q1.');
    expect(pack.text).toContain('Compared Tarnhollow against the rest of Marsh Reach, for Q1.');
    expect(pack.text).toContain('The agreement rate in Tarnhollow is the same as in the rest of Marsh Reach.');
    expect(pack.text).not.toContain('against all respondents');
    expect(pack.text).not.toContain('Tarnhollow against Marsh Reach');
  }, 60_000);
});

describe('the association page speaks of its units in good English', () => {
  it('"an institution with more such people", not "a institution"', () => {
    const dir = join(work, 'institutions');
    mkdirSync(dir, { recursive: true });
    const rows = ['Institution,Question,Respondents,Agreeing'];
    ['Ashgrove', 'Brindle', 'Corve', 'Dunlin', 'Eskham', 'Farrow'].forEach((name, i) => {
      rows.push(`${name} College,Q1,200,${100 + 12 * i}`, `${name} College,Q2,200,${96 + 13 * i + (i % 2) * 5}`);
    });
    writeFileSync(join(dir, 'release.csv'), `${rows.join('\n')}\n`);
    const yaml = `title: Units
organisation: Ashgrove Forum
data_date: 2026-03-01
sources:
  s:
    file: release.csv
    shape: summary
    respondents: Respondents
    agree: Agreeing
claims:
  - id: q1-with-q2
    claim: Institutions where more agree on Q1 have more agreeing on Q2.
    kind: association
    source: s
    units: Institution
    x: { Question: Q1 }
    y: { Question: Q2 }
    expect: positive
`;
    const pack = buildPack(dir, yaml);
    const cautions = (pack.results.claims[0] as Record<string, any>).cautions.join(' ');
    expect(cautions).toContain('an institution with more such people scores higher on both');
    expect(pack.text).not.toMatch(/\ba institution\b/);
  }, 60_000);
});

describe('rank checks with a few units', () => {
  it('four units in perfect order: Spearman and Kendall p = 2/24 = 0.083 exactly (R cor.test), not "p < 0.001"', () => {
    const dir = join(work, 'four-units');
    mkdirSync(dir, { recursive: true });
    const rows = ['Institution,Question,Respondents,Agreeing'];
    ['Ashgrove', 'Brindle', 'Corve', 'Dunlin'].forEach((name, i) => rows.push(`${name} College,Q1,200,${100 + 12 * i}`, `${name} College,Q2,200,${96 + 14 * i}`));
    writeFileSync(join(dir, 'release.csv'), `${rows.join('\n')}\n`);
    const yaml = `title: Four units
organisation: Ashgrove Forum
data_date: 2026-03-01
sources:
  s:
    file: release.csv
    shape: summary
    respondents: Respondents
    agree: Agreeing
claims:
  - id: q1-with-q2
    claim: Institutions where more agree on Q1 have more agreeing on Q2.
    kind: association
    source: s
    units: Institution
    x: { Question: Q1 }
    y: { Question: Q2 }
    expect: positive
`;
    const pack = buildPack(dir, yaml);
    const checks = (pack.results.claims[0] as Record<string, any>).rankChecks as Array<{ method: string; p: number }>;
    // R 4.x: cor.test(1:4, 1:4, method = "spearman")$p.value = cor.test(..., method = "kendall")$p.value = 0.08333333.
    expect(checks.find((c) => c.method === 'spearman')!.p).toBeCloseTo(0.08333333, 7);
    expect(checks.find((c) => c.method === 'kendall-tau-b')!.p).toBeCloseTo(0.08333333, 7);
    expect(pack.text).toContain("Spearman's rho (check on ranks) 1.00 (p = 0.083)");
    expect(pack.text).toContain('Exact p-values for the rank checks');
  }, 60_000);
});

describe('a claim withheld says why in terms of the threshold that withheld it', () => {
  it('a low response rate is not called too few people; a claim\'s own min_respondents is the one quoted', () => {
    const dir = join(work, 'withheld');
    mkdirSync(dir, { recursive: true });
    writeFileSync(join(dir, 'release.csv'), ['Unit,Question,Respondents,Agreeing,Eligible', 'Oakhurst,Q1,120,80,400', 'Pellmarsh,Q1,150,90,180', 'Quillby,Q1,20,12,22', ''].join('\n'));
    const claim = (id: string, focus: string, against: string, extra = '') => `  - id: ${id}
    claim: ${focus} agrees more than ${against}.
    kind: compare
    source: s
    where: { Question: Q1 }
    focus: { Unit: ${focus} }
    against: { Unit: ${against} }
    expect: higher${extra}
`;
    const yaml = `title: Withheld
organisation: Oakhurst Forum
data_date: 2026-03-01
min_response_rate: 40%
sources:
  s:
    file: release.csv
    shape: summary
    respondents: Respondents
    agree: Agreeing
    population: Eligible
claims:
${claim('oakhurst-higher', 'Oakhurst', 'Pellmarsh')}${claim('quillby-higher', 'Quillby', 'Pellmarsh', '\n    min_respondents: 30')}`;
    const pack = buildPack(dir, yaml);
    const [low, few] = pack.results.claims as Array<Record<string, any>>;
    expect(low!.verdict).toBe('too-little-data');
    // 120 of 400 answered in Oakhurst (30%, below 40%): many people, few of those eligible.
    expect(low!.verdictText).toContain('fewer than 40% of those eligible answered in Oakhurst');
    expect(low!.verdictText).toContain('those who did not may differ from those who did');
    expect(low!.verdictText).not.toContain('Results from so few people');
    expect(low!.advice.reason).toContain('Too few of those eligible answered');
    // 20 in Quillby, below the claim's own minimum of 30 (the pack's is 10): the sentence quotes 30 both times.
    expect(few!.verdictText).toContain('fewer than 30 people answered in Quillby');
    expect(few!.verdictText).toContain('withholds any group with fewer than 30 respondents');
    expect(few!.verdictText).not.toContain('fewer than 10 respondents');
  }, 60_000);
});
