/**
 * End to end through the command line: the labels the pack builds from what a claim selects. A selection that leaves
 * values out (`{ not: ... }`) is named in words ("all but Harrowfen and Tollwick"), never as "[object Object]", in
 * every kind of claim, in the PDF (read back with poppler's pdftotext), results.json, results.xlsx and the charts.
 * The respondent counts the labels carry are counted here straight from the fixture's rows
 * (tests/fixtures/r/language/, written by tests/fixtures/r/language.R).
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildPack } from '../helpers/cli.js';

const root = resolve(__dirname, '../..');
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
  ({ folder: pack, results, text } = buildPack(work, NOT_CLAIMS));
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

describe('wording for column values and from a second header row', () => {
  const dir = join(work, 'wording');
  const campuses = { HF: 'Harrowfen', QM: 'Quillby Marsh', TW: 'Tollwick' } as const;
  /** Invented respondents: campus and mode codes, answers 1-5 (9 not applicable) spread by a fixed rule. */
  const rows: string[][] = [];
  const codes = ['1', '2', '3', '4', '4', '5', '5', '9'];
  for (let i = 0; i < 480; i++) {
    const campus = (['HF', 'QM', 'TW'] as const)[Math.floor(i / 2) % 3]!;
    const answer = (q: number): string => codes[(i * 7 + q * 3 + (i >> 3) + (campus === 'HF' ? q : 0)) % 8]!;
    rows.push([`R${i}`, String(2025 + (i % 2)), campus, i % 5 === 0 ? 'PT' : 'FT', answer(1), answer(2), answer(3)]);
  }
  const answered = (keep: (r: string[]) => boolean, q: number): number => rows.filter((r) => keep(r) && /^[1-5]$/.test(r[q]!)).length;
  let results: { claims: Array<Record<string, any>> };
  let text: string;

  beforeAll(() => {
    execFileSync('mkdir', ['-p', dir]);
    const header = 'RespondentID,Year,Campus,Mode,Q01,Q02,Q03\n,,,,Teaching staff explain things clearly,My timetable works well for me,Marking is fair\n';
    writeFileSync(join(dir, 'respondents.csv'), header + rows.map((r) => r.join(',')).join('\n') + '\n');
    ({ results, text } = buildPack(
      dir,
      `title: Wording
organisation: Test
adjust: none
sources:
  survey:
    file: respondents.csv
    shape: respondents
    questions: [Q01, Q02, Q03]
    question_column: Question
    period: Year
    not_applicable: [9]
    header_rows: 2
    wording:
      Q03: Marking is fair and clear
      Campus: { HF: Harrowfen, QM: Quillby Marsh, TW: Tollwick }
      Mode: { FT: full-time, PT: part-time }
claims:
  - id: hf-against-qm
    claim: Harrowfen students agree on Q01 more often than Quillby Marsh students.
    kind: compare
    where: { Year: 2026, Question: Q01 }
    focus: { Campus: HF }
    against: { Campus: QM }
    expect: higher
  - id: hf-against-rest
    claim: Harrowfen students find marking fairer than everyone else.
    kind: compare
    where: { Year: 2026, Question: Q03 }
    focus: { Campus: HF }
    against: rest
    against_label: the college
    expect: higher
  - id: campus-and-mode
    claim: Answers on Q02 differ by campus and mode.
    kind: crosstab
    where: { Year: 2026, Question: Q02 }
    rows: [Campus, Mode]
    columns: answers
    expect: related
  - id: ft-scores
    claim: Full-time students score Q01 higher than part-time students.
    kind: means
    where: { Year: 2026, Question: Q01 }
    focus: { Mode: FT }
    against: { Mode: PT }
    expect: higher
`,
    ));
  }, 120_000);

  it('names a coded value in its wording with the code beside it, in sentences, tables and results.json', () => {
    const hf = answered((r) => r[1] === '2026' && r[2] === 'HF', 4);
    const qm = answered((r) => r[1] === '2026' && r[2] === 'QM', 4);
    const c = results.claims.find((x) => x.id === 'hf-against-qm')!;
    expect(c.selections.map((s: { label: string; n: number }) => [s.label, s.n])).toEqual([
      [`${campuses.HF} (HF)`, hf],
      [`${campuses.QM} (QM)`, qm],
    ]);
    expect(text).toContain(`Harrowfen (HF) (${hf} respondents) against Quillby Marsh (QM) (${qm} respondents)`);
    // Crosstab rows made of two coded columns: each value in its wording.
    const cross = results.claims.find((x) => x.id === 'campus-and-mode')!;
    expect(cross.table.rows).toContain('Harrowfen (HF), full-time (FT)');
    expect(text).toContain('Tollwick (TW), part-time (PT)');
    const means = results.claims.find((x) => x.id === 'ft-scores')!;
    expect(means.means.map((m: { label: string }) => m.label)[0]).toContain('full-time (FT)');
    expect(text).not.toMatch(/“Harrowfen”|“full-time”/);
  });

  it('takes question wording from the second header row, and the claims file\'s wording before it', () => {
    expect(text).toContain('for “Teaching staff explain things clearly” (Q01) in 2026');
    // Q03 is worded in both places: the claims file wins.
    expect(text).toContain('“Marking is fair and clear” (Q03)');
    expect(text).not.toContain('“Marking is fair” (Q03)');
    expect(text).toContain('the answer to “My timetable works well for me” (Q02)');
    const rest = results.claims.find((x) => x.id === 'hf-against-rest')!;
    expect(rest.n).toEqual([answered((r) => r[1] === '2026' && r[2] === 'HF', 6), answered((r) => r[1] === '2026' && r[2] !== 'HF', 6)]);
    expect(text).toContain('against the rest of the college');
  });
});
