/**
 * End to end through the command line: claims the claims language could not say before (units and table rows made
 * of several columns, the spread of answers to one question, "everyone else" as the comparison group), and the
 * refusals that point to the form meant. A claims file goes in; results.json and the PDF's text (read back with
 * poppler's pdftotext) come out, and every number is checked against GNU R on the same rows
 * (tests/fixtures/r/language.R -> language.json, data in tests/fixtures/r/language/).
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildPack, fold } from '../helpers/cli.js';
import { expectClose } from '../helpers/tolerance.js';

const root = resolve(__dirname, '../..');
const bin = join(root, 'bin/warrant.js');
const data = join(root, 'tests/fixtures/r/language');
const R = JSON.parse(readFileSync(join(root, 'tests/fixtures/r/language.json'), 'utf8'));
const work = mkdtempSync(join(tmpdir(), 'warrant-language-'));

const SOURCES = `
title: Claims language
organisation: Test
sources:
  sector:
    file: ${join(data, 'summary.csv')}
    shape: summary
    respondents: Respondents
    agree: Agreeing
    period: Year
  survey:
    file: ${join(data, 'respondents.csv')}
    shape: respondents
    questions: [Q01, Q02, Q03]
    question_column: Question
    period: Year
    not_applicable: [9]
    wording:
      Q01: Teaching staff explain things clearly
      Q02: My timetable works well for me
    answer_wording: { 1: Strongly disagree, 4: Agree, 5: Strongly agree }
claims:
`;

const CLAIMS = `
  - id: departments-within-institutions
    claim: Departments within institutions where more agree on Q01 also have more agreeing on Q02.
    kind: association
    source: sector
    where: { Year: 2026 }
    units: [Department, Institution]
    x: { Question: Q01 }
    y: { Question: Q02 }
    expect: positive
  - id: weighted-within-institutions
    claim: Weighted by respondents, the same association holds.
    kind: association
    source: sector
    where: { Year: 2026 }
    units: [Department, Institution]
    x: { Question: Q01 }
    y: { Question: Q02 }
    weighted: true
    expect: positive
  - id: controlled-within-institutions
    claim: Controlling for Q03, the association holds.
    kind: association
    source: sector
    where: { Year: 2026 }
    units: [Department, Institution]
    x: { Question: Q01 }
    y: { Question: Q02 }
    controls: [{ label: agreement on Q03, where: { Question: Q03 } }]
    expect: positive
  - id: campus-and-mode
    claim: Agreement on Q01 differs between campuses and modes of study.
    kind: crosstab
    source: survey
    where: { Year: 2026, Question: Q01 }
    rows: [Campus, Mode]
    columns: agreement
    expect: related
  - id: answers-by-campus
    claim: Answers to Q02 differ between campuses.
    kind: crosstab
    source: survey
    where: { Year: 2026, Question: Q02 }
    rows: Campus
    columns: answers
    expect: related
  - id: answers-by-year
    claim: The spread of answers to Q02 changed between last year and this year.
    kind: crosstab
    source: survey
    where: { Question: Q02 }
    rows: Year
    columns: answers
    expect: related
  - id: harrowfen-against-the-rest
    claim: Harrowfen students and the rest of the college differ in how often they agree on Q01.
    kind: compare
    source: survey
    where: { Year: 2026, Question: Q01 }
    focus: { Campus: Harrowfen }
    against: rest
    against_label: the college
    expect: different
`;

function run(args: string[], cwd = work) {
  return spawnSync(process.execPath, [bin, ...args], { cwd, encoding: 'utf8' });
}

let results: { claims: Array<Record<string, any>> };
let text: string;
const claim = (id: string) => results.claims.find((c) => c.id === id) as Record<string, any>;

beforeAll(() => {
  ({ results, text } = buildPack(work, SOURCES + CLAIMS));
}, 120_000);

afterAll(() => rmSync(work, { recursive: true, force: true }));

describe('units made of several columns', () => {
  it('correlates department-and-institution combinations as R cor.test does, leaving out those under the minimum', () => {
    const c = claim('departments-within-institutions');
    expect(c.units).toHaveLength(R.association.units);
    expectClose(c.estimate.value, R.association.r, 'statistic', 'R cor.test estimate');
    expectClose(c.p, R.association.p, 'p', 'R cor.test p-value');
    expectClose(c.interval.lower, R.association.lower, 'bound', 'R cor.test conf.int');
    expectClose(c.interval.upper, R.association.upper, 'bound', 'R cor.test conf.int');
    // A unit is named by its values, department then institution.
    expect(c.units.map((u: { unit: string }) => u.unit)).toContain('Chemistry, Cadderly Hall');
    // The counts and the chart say how many combinations were used and how many were left out.
    expect(text).toContain(`${R.association.units} of ${R.association.units + 2} department and institution combinations (2 under 10 respondents left out)`);
    for (const name of R.association.dropped as string[]) expect(text).toContain(name);
  });

  it('weighted by respondents: R cov.wt(cor = TRUE), t test on the number of units', () => {
    const c = claim('weighted-within-institutions');
    expectClose(c.estimate.value, R.weighted.r, 'statistic', 'R cov.wt correlation');
    expectClose(c.p, R.weighted.p, 'p', 'R pt on the weighted r');
  });

  it('controlled: the correlation of R lm residuals, t test on n - 3 degrees of freedom', () => {
    const c = claim('controlled-within-institutions');
    expectClose(c.estimate.value, R.controlled.r, 'statistic', 'R cor(resid(lm))');
    expectClose(c.p, R.controlled.p, 'p', 'R pt on the partial r');
    expect(c.df).toBe(R.association.units - 3);
  });

  it('crosstab rows made of campus and mode: R chisq.test on the same table', () => {
    const c = claim('campus-and-mode');
    expectClose(c.statistic.value, R.rows_two_columns.statistic, 'statistic', 'R chisq.test statistic');
    expectClose(c.p, R.rows_two_columns.p, 'p', 'R chisq.test p-value');
    expect(c.df).toBe(R.rows_two_columns.df);
    (R.rows_two_columns.rows as string[]).forEach((row, i) => {
      expect(text).toContain(`${row} agreeing ${R.rows_two_columns.agreeing[i]}, not agreeing ${R.rows_two_columns.not_agreeing[i]}`);
    });
  });
});

describe('the spread of answers to one question', () => {
  it('campus by answer code 1-5: R chisq.test, with not-applicable and blank answers counted in a note', () => {
    const c = claim('answers-by-campus');
    expectClose(c.statistic.value, R.answers_by_campus.statistic, 'statistic', 'R chisq.test statistic');
    expectClose(c.p, R.answers_by_campus.p, 'p', 'R chisq.test p-value');
    expect(c.df).toBe(R.answers_by_campus.df);
    expect(c.n).toEqual((R.answers_by_campus.counts as number[][]).map((r) => r.reduce((a, b) => a + b, 0)));
    (R.answers_by_campus.rows as string[]).forEach((row, i) => {
      const counts = (R.answers_by_campus.counts as number[][])[i] as number[];
      expect(text).toContain(`${row} ${counts.map((k, j) => `${j + 1}: ${k}`).join(', ')}`);
    });
    expect(text).toContain(`left out: ${R.answers_by_campus.not_applicable} answers of "not applicable" and ${R.answers_by_campus.blank} blank answers`);
    expect(text).toContain('Campus by the answer to “My timetable works well for me” (Q02): 3 campuses');
    expect(text).toContain('The answer to Q02 is spread the same way in every campus');
    // The source's answer_wording is shown beside the codes it names.
    expect(text).toContain('codes 1, 2, 3, 4, 5, number answering each (1 Strongly disagree, 4 Agree, 5 Strongly agree)');
  });

  it('year by answer code: the spread changed between the two years, as R chisq.test finds', () => {
    const c = claim('answers-by-year');
    expectClose(c.statistic.value, R.answers_by_year.statistic, 'statistic', 'R chisq.test statistic');
    expectClose(c.p, R.answers_by_year.p, 'p', 'R chisq.test p-value');
    expect(c.verdict).toBe('supported');
  });

  it('names the cells beyond ±1.96 as R chisq.test()$stdres does, as answers with their wording, the later year first', () => {
    const c = claim('answers-by-year');
    const [first, later] = R.answers_by_year.rows as string[];
    const res = (R.answers_by_year.stdres as number[][])[1] as number[];
    const codes = R.answers_by_year.codes as string[];
    const words: Record<string, string> = { '1': 'strongly disagree', '4': 'agree', '5': 'strongly agree' };
    const named = (pick: (r: number) => boolean) =>
      codes.filter((_, j) => pick(res[j] as number)).map((k) => (words[k] ? `${k} (${words[k]})` : k));
    const list = (xs: string[]) => (xs.length > 1 ? `${xs.slice(0, -1).join(', ')} and ${xs.at(-1)}` : xs[0]);
    const more = named((r) => r > 1.96);
    const fewer = named((r) => r < -1.96);
    expect(more.length + fewer.length).toBeGreaterThan(0);
    const what = more.length > 0 && fewer.length > 0 ? `more answers of ${list(more)}, and fewer of ${list(fewer)},` : more.length > 0 ? `more answers of ${list(more)}` : `fewer answers of ${list(fewer)}`;
    const sentence = `${later} has ${what} than independence would give, and ${first} the reverse`;
    expect(c.verdictText).toContain(sentence);
    expect(text).toContain(sentence);
    expect(text).not.toMatch(/has (more|fewer) \d/);
    // results.json keeps every cell with its residual, both rows.
    for (const cell of c.notableCells as Array<{ row: string; column: string; residual: number }>) {
      const i = (R.answers_by_year.rows as string[]).indexOf(cell.row);
      expectClose(cell.residual, (R.answers_by_year.stdres as number[][])[i]![codes.indexOf(cell.column)] as number, 'statistic', 'R chisq.test stdres');
    }
    expect(c.notableCells).toHaveLength(2 * (more.length + fewer.length));
  });
});

describe('everyone else as the comparison group', () => {
  it('compares the focus with the rest within the claim\'s where, as R prop.test on the two groups', () => {
    const c = claim('harrowfen-against-the-rest');
    expect(c.n).toEqual([R.rest.focus_n, R.rest.rest_n]);
    expect(c.selections.map((s: { agree: number }) => s.agree)).toEqual([R.rest.focus_agree, R.rest.rest_agree]);
    expectClose(c.statistic.value ** 2, R.rest.statistic, 'statistic', 'R prop.test X-squared = z²');
    expectClose(c.p, R.rest.p, 'p', 'R prop.test p-value');
    expect(c.selections[1].label).toBe('the rest of the college');
    expect(text).toContain(`against the rest of the college (${R.rest.rest_n} respondents)`);
    expect(text).not.toMatch(/2025 or 2026|Harrowfen is part of/);
  });
});

describe('question wording', () => {
  it('speaks in the wording with the code beside it, and names the group, then the question, then the period', () => {
    expect(text).toContain('the differences in the answer to “My timetable works well for me” (Q02) between campuses');
    // The comparison: the group, the question in its wording with its code, then the period, in a sentence.
    expect(text).toContain('Harrowfen (379 respondents) against the rest of the college (362 respondents), for “Teaching staff explain things clearly” (Q01) in 2026.');
    // Never a label gluing the period and the code into the group's name.
    expect(text).not.toMatch(/Harrowfen, (Q01|2026)|2026, Q0\d|Q0\d, 2026/);
  });

  it('a summary source without wording keeps the codes, still in that order', () => {
    expect(text).toContain('Q01 against Q02 across 16 department and institution combinations, for 2026');
  });
});

describe('refusals that lead somewhere', () => {
  const check = (claims: string) => {
    writeFileSync(join(work, 'bad.yaml'), SOURCES + claims);
    const r = run(['check', 'bad.yaml']);
    return { status: r.status, out: fold(r.stdout + r.stderr) };
  };

  it('units written as one name with a comma: suggests the list', () => {
    const r = check(`
  - id: a
    claim: c
    kind: association
    source: sector
    units: Department, Institution
    x: { Question: Q01 }
    y: { Question: Q02 }
    expect: positive
`);
    expect(r.status).toBe(2);
    expect(r.out).toContain('units: [Department, Institution]');
  });

  it('units written as something that is not a column name: says both forms', () => {
    const r = check(`
  - id: a
    claim: c
    kind: association
    source: sector
    units: { Department: Chemistry }
    x: { Question: Q01 }
    y: { Question: Q02 }
    expect: positive
`);
    expect(r.status).toBe(2);
    expect(r.out).toContain('units: [Department, Institution] to use each combination of their values');
  });

  it('columns naming a question: suggests columns: answers with the question in where', () => {
    const r = check(`
  - id: a
    claim: c
    kind: crosstab
    source: survey
    where: { Year: 2026 }
    rows: Campus
    columns: Q01
    expect: related
`);
    expect(r.status).toBe(2);
    expect(r.out).toContain('write columns: answers and select the question in where, e.g. where: { Question: Q01 }');
  });

  it('columns: answers without one question selected: says to name one', () => {
    writeFileSync(join(work, 'bad.yaml'), `${SOURCES}
  - id: a
    claim: c
    kind: crosstab
    source: survey
    where: { Year: 2026 }
    rows: Campus
    columns: answers
    expect: related
`);
    const r = run(['build', 'bad.yaml', '--out', 'bad-out']);
    expect(r.status).toBe(2);
    expect(fold(r.stderr)).toContain('name one question in where, e.g. where: { Question: Q01 }');
  });

  it('columns: answers on a summary source: says it cannot be done there and what can', () => {
    writeFileSync(join(work, 'bad.yaml'), `${SOURCES}
  - id: a
    claim: c
    kind: crosstab
    source: sector
    where: { Year: 2026, Question: Q01 }
    rows: Institution
    columns: answers
    expect: related
`);
    const r = run(['build', 'bad.yaml', '--out', 'bad-out']);
    expect(r.status).toBe(2);
    expect(fold(r.stderr)).toContain('holds counts per group, not each respondent');
    expect(fold(r.stderr)).toContain('write columns: agreement');
  });

  it('against written as a word other than rest: suggests rest', () => {
    const r = check(`
  - id: a
    claim: c
    kind: compare
    source: survey
    where: { Year: 2026, Question: Q01 }
    focus: { Campus: Harrowfen }
    against: everyone
    expect: lower
`);
    expect(r.status).toBe(2);
    expect(r.out).toContain('write against: rest');
  });

  it('against: rest when the focus takes in everyone: says there is no rest', () => {
    writeFileSync(join(work, 'bad.yaml'), `${SOURCES}
  - id: a
    claim: c
    kind: compare
    source: survey
    where: { Year: 2026, Question: Q01, Campus: Harrowfen }
    focus: { Campus: Harrowfen }
    against: rest
    expect: lower
`);
    const r = run(['build', 'bad.yaml', '--out', 'bad-out']);
    expect(r.status).toBe(2);
    expect(fold(r.stderr)).toContain('there is no rest');
  });
});
