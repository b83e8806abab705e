/**
 * End to end through the command line: the labels the pack builds from what a claim selects. A selection that leaves
 * values out (`{ not: ... }`) is named in words ("all but Harrowfen and Tollwick"), never as "[object Object]", in
 * every kind of claim, in the PDF (read back with poppler's pdftotext), results.json, results.xlsx and the charts.
 * The respondent counts the labels carry are counted here straight from the fixture's rows
 * (tests/fixtures/r/language/, written by tests/fixtures/r/language.R).
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

const root = resolve(__dirname, '../..');
const bin = join(root, 'bin/warrant.js');
const data = join(root, 'tests/fixtures/r/language');
const work = mkdtempSync(join(tmpdir(), 'warrant-labels-'));

const NOT_CLAIMS = `
title: Selections that leave values out
organisation: Test
adjust: none
sources:
  survey:
    file: ${join(data, 'respondents.csv')}
    shape: respondents
    questions: [Q01, Q02, Q03]
    question_column: Question
    period: Year
    not_applicable: [9]
  sector:
    file: ${join(data, 'summary.csv')}
    shape: summary
    respondents: Respondents
    agree: Agreeing
    period: Year
  periods:
    file: ${join(data, 'periods.csv')}
    shape: summary
    respondents: Respondents
    agree: Agreeing
    period: Year
claims:
  - id: compare-not
    claim: Students outside Harrowfen and Tollwick agree on Q01 about as often as Harrowfen students.
    kind: compare
    source: survey
    where: { Year: 2026, Question: Q01 }
    focus: { Campus: { not: [Harrowfen, Tollwick] } }
    against: { Campus: Harrowfen }
    expect: different
  - id: change-not
    claim: Outside Harrowfen, agreement on Q01 rose.
    kind: change
    source: survey
    where: { Campus: { not: Harrowfen }, Question: Q01 }
    from: 2025
    to: 2026
    expect: higher
  - id: target-not
    claim: Outside Harrowfen, more than half agree on the questions other than Q02.
    kind: target
    source: survey
    where: { Year: 2026, Question: { not: Q02 } }
    select: { Campus: { not: Harrowfen } }
    value: 50%
    expect: higher
  - id: estimate-not
    claim: How many students who are not part-time agree on Q01.
    kind: estimate
    source: survey
    where: { Year: 2026, Question: Q01 }
    select: { Mode: { not: part-time } }
  - id: trend-not
    claim: Outside Vellmoor, agreement on Q01 rose steadily.
    kind: trend
    source: periods
    where: { Institution: { not: Vellmoor Institute }, Question: Q01 }
    last: 5
    expect: rising
  - id: crosstab-not
    claim: Agreement differs between campuses other than Tollwick.
    kind: crosstab
    source: survey
    where: { Year: 2026, Question: Q01, Campus: { not: Tollwick } }
    rows: Campus
    columns: agreement
    expect: related
  - id: means-not
    claim: Students who are not part-time give higher scores on Q01.
    kind: means
    source: survey
    where: { Year: 2026, Question: Q01 }
    focus: { Mode: { not: part-time } }
    against: { Mode: part-time }
    expect: higher
  - id: equivalence-not
    claim: Outside Harrowfen, agreement on Q01 is within 10 points of Harrowfen's.
    kind: equivalence
    source: survey
    where: { Year: 2026, Question: Q01 }
    focus: { Campus: { not: Harrowfen } }
    against: { Campus: Harrowfen }
    margin: 10 points
  - id: association-not
    claim: Outside Cadderly Hall, departments agreeing more on Q01 agree more on the other questions.
    kind: association
    source: sector
    where: { Year: 2026, Institution: { not: Cadderly Hall } }
    units: Department
    x: { Question: Q01 }
    y: { Question: { not: [Q01, Q03] } }
    expect: positive
  - id: rest-not
    claim: Harrowfen differs from the other campuses but Tollwick.
    kind: compare
    source: survey
    where: { Year: 2026, Question: Q01, Campus: { not: Tollwick } }
    focus: { Campus: Harrowfen }
    against: rest
    expect: different
`;

function fold(s: string): string {
  return s.replace(/\s+/g, ' ').trim();
}

/** Respondents of the fixture with a valid answer (1-5) to a question, counted from the CSV's rows. */
function answered(where: (row: Record<string, string>) => boolean, question: string): number {
  const [head, ...lines] = readFileSync(join(data, 'respondents.csv'), 'utf8').trim().split('\n');
  const cols = (head as string).split(',');
  return lines
    .map((l) => Object.fromEntries(l.split(',').map((v, i) => [cols[i] as string, v])))
    .filter((r) => where(r) && /^[1-5]$/.test(r[question] ?? '')).length;
}

let pack: string;
let results: { claims: Array<Record<string, any>> };
let text: string;

beforeAll(() => {
  writeFileSync(join(work, 'claims.yaml'), NOT_CLAIMS);
  const r = spawnSync(process.execPath, [bin, 'build', 'claims.yaml', '--out', 'out', '--quiet'], { cwd: work, encoding: 'utf8' });
  expect(r.stderr).toBe('');
  expect(r.status).toBe(0);
  pack = join(work, 'out', readdirSync(join(work, 'out')).find((d) => d !== 'latest') as string);
  results = JSON.parse(readFileSync(join(pack, 'results.json'), 'utf8'));
  text = fold(execFileSync('pdftotext', ['-enc', 'UTF-8', join(pack, 'pack.pdf'), '-'], { encoding: 'utf8' }));
}, 120_000);

afterAll(() => rmSync(work, { recursive: true, force: true }));

describe('selections that leave values out ({ not: ... })', () => {
  it('are never shown as "[object Object]" in the PDF, results.json, results.xlsx or the charts', () => {
    expect(results.claims).toHaveLength(10);
    expect(text).not.toContain('object Object');
    expect(readFileSync(join(pack, 'results.json'), 'utf8')).not.toContain('object Object');
    const xlsx = execFileSync('unzip', ['-p', join(pack, 'results.xlsx')], { encoding: 'utf8', maxBuffer: 1 << 26 });
    expect(xlsx).toContain('Harrowfen');
    expect(xlsx).not.toContain('object Object');
    for (const f of readdirSync(join(pack, 'charts'))) expect(readFileSync(join(pack, 'charts', f), 'utf8'), f).not.toContain('object Object');
  });

  it('name the values left out, with the respondents counted from the rows', () => {
    const n = answered((r) => r.Year === '2026' && r.Campus !== 'Harrowfen' && r.Campus !== 'Tollwick', 'Q01');
    const c = results.claims.find((x) => x.id === 'compare-not')!;
    expect(c.selections[0].label).toBe('all but Harrowfen and Tollwick');
    expect(c.n[0]).toBe(n);
    expect(text).toContain(`All but Harrowfen and Tollwick (${n} respondents) against Harrowfen`);
    const notPartTime = answered((r) => r.Year === '2026' && r.Mode !== 'part-time', 'Q01');
    const e = results.claims.find((x) => x.id === 'estimate-not')!;
    expect(e.selections[0].n).toBe(notPartTime);
    expect(e.selections[0].label).toBe('all but part-time on Q01 in 2026');
    expect(text).toContain('all but part-time');
    // The scope of a change claim, the rest within a where that leaves a campus out, and a trend's institution.
    expect(text).toContain('all but Harrowfen on Q01');
    expect(text).toContain('all but Vellmoor Institute');
    const rest = results.claims.find((x) => x.id === 'rest-not')!;
    expect(rest.n[1]).toBe(answered((r) => r.Year === '2026' && r.Campus !== 'Harrowfen' && r.Campus !== 'Tollwick', 'Q01'));
  });
});
