/**
 * A claim's own words against its fields (src/claims/wording.ts): each rule speaks when the words plainly say
 * something the fields do not, and keeps quiet when they agree or the words are not plain (a negation, agreeing as the
 * unwelcome answer, two directions). The words read are common practice in survey reporting ("below", "fell", "at
 * least 80%", "within 5 points", "since last year"); the demo's claims and every claims file in README.md, written to
 * agree with their fields, raise none.
 */
import { readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseClaimsText, readClaims } from '../../src/claims/read.js';
import type { Claim } from '../../src/claims/types.js';
import { wordsAgainstFields, wordsProblems } from '../../src/claims/wording.js';

const root = resolve(__dirname, '../..');
const base = { id: 'c', source: 's', where: {}, confidence: 0.95, confidenceWritten: '95%', sided: 'two-sided', minRespondents: 10, place: { line: 1, column: 1 } } as const;
const pair = (kind: unknown): Record<string, unknown> => (kind === 'compare' || kind === 'means' || kind === 'equivalence' ? { focus: {}, against: {} } : kind === 'target' || kind === 'estimate' ? { select: {} } : {});
const claim = (c: Record<string, unknown>): Claim => ({ ...base, ...pair(c.kind), ...c }) as unknown as Claim;
const fields = (c: Record<string, unknown>): string[] => wordsAgainstFields(claim(c)).map((m) => m.field);

describe('words against fields: each rule speaks when the words plainly disagree', () => {
  const cases: Array<[string, Record<string, unknown>, string, string]> = [
    ['compare: "below" tested as higher', { kind: 'compare', statement: 'Our score on feedback is below the regional figure.', expect: 'higher' }, 'expect', 'set expect: lower'],
    ['compare: "below" tested as any difference', { kind: 'compare', statement: 'Our score on feedback is below the regional figure.', expect: 'different' }, 'expect', 'Set expect: lower'],
    ['change: "fell" tested as higher', { kind: 'change', statement: 'Engineering fell since last year.', expect: 'higher', from: 'previous', to: 'latest' }, 'expect', 'set expect: lower'],
    ['means: "lower" tested as higher', { kind: 'means', statement: 'Part-time students score lower than full-time students.', expect: 'higher' }, 'expect', 'set expect: lower'],
    ['target: "at least" tested as lower', { kind: 'target', statement: 'At least 80% of our students are satisfied.', expect: 'lower', value: 0.8, valueWritten: '80%' }, 'expect', 'set expect: higher'],
    ['trend: "more and more" tested as falling', { kind: 'trend', statement: 'More and more of our students say feedback helps.', expect: 'falling', periods: { last: 3 } }, 'expect', 'set expect: rising'],
    ['target: the words name 80%, value 75%', { kind: 'target', statement: 'At least 80% of our students are satisfied.', expect: 'higher', value: 0.75, valueWritten: '75%' }, 'value', 'value: 80%'],
    ['target: "80 per cent", value 0.85', { kind: 'target', statement: 'We are still below the 80 per cent target.', expect: 'lower', value: 0.85, valueWritten: '0.85' }, 'value', 'value: 80%'],
    ['equivalence: "5 points", margin 3', { kind: 'equivalence', statement: 'History is within 5 points of the rest of the university.', margin: 0.03 }, 'margin', 'margin: 5 points'],
    ['association: "better ... higher" tested as negative', { kind: 'association', statement: 'Departments with better resources report higher overall satisfaction.', expect: 'negative' }, 'expect', 'set expect: positive'],
    ['association: "more ... fewer" tested as positive', { kind: 'association', statement: 'Departments with more students per tutor have fewer students content.', expect: 'positive' }, 'expect', 'set expect: negative'],
    ['association: "inversely" tested as any', { kind: 'association', statement: 'Class size is inversely related to satisfaction.', expect: 'any' }, 'expect', 'set expect: negative'],
    ['compare: "no real difference" tested for a difference', { kind: 'compare', statement: 'There is no real difference between the two campuses.', expect: 'different' }, 'kind', 'kind: equivalence'],
    ['means: "about the same" tested for a difference', { kind: 'means', statement: 'Part-time and full-time students score about the same.', expect: 'different' }, 'kind', 'kind: equivalence'],
    ['trend: "four surveys", last 3', { kind: 'trend', statement: 'Satisfaction has risen over four surveys.', expect: 'rising', periods: { last: 3 } }, 'last', 'last: 4'],
    ['trend: "three years", last 5', { kind: 'trend', statement: 'Satisfaction has risen over three years.', expect: 'rising', periods: { last: 5 } }, 'last', 'last: 3'],
    ['change: "since last year", two periods apart', { kind: 'change', statement: 'Engineering fell since last year.', expect: 'lower', from: 'latest-2', to: 'latest' }, 'from', 'from: previous'],
    ['change: the words name 2024, from 2025', { kind: 'change', statement: 'Engineering fell between 2024 and 2026.', expect: 'lower', from: 2025, to: 2026 }, 'from', 'Set from'],
  ];
  for (const [name, c, field, fix] of cases) {
    it(name, () => {
      const got = wordsAgainstFields(claim(c));
      expect(got.map((m) => m.field)).toEqual([field]);
      expect(got[0]!.fix).toContain(fix);
      expect(got[0]!.said.length).toBeGreaterThan(0);
    });
  }
});

describe('words against fields: quiet when they agree or the words are not plain', () => {
  const quiet: Array<[string, Record<string, unknown>]> = [
    ['"below" tested as lower', { kind: 'compare', statement: 'Our score on feedback is below the regional figure.', expect: 'lower' }],
    ['agreeing is the unwelcome answer', { kind: 'compare', statement: 'Fewer of our students disagree that feedback is timely.', expect: 'higher' }],
    ['a negation', { kind: 'compare', statement: 'Engineering is no longer behind the region.', expect: 'higher' }],
    ['both directions', { kind: 'compare', statement: 'Fewer Law students are content, and more say so elsewhere.', expect: 'lower' }],
    ['no direction word', { kind: 'compare', statement: 'Ceramics students find topics clearer than Music students do.', expect: 'higher' }],
    ['a difference either way, worded so', { kind: 'compare', statement: 'The two campuses differ in how easily staff can be reached.', expect: 'different' }],
    ['"three years" over four periods', { kind: 'trend', statement: 'Satisfaction has risen over three years.', expect: 'rising', periods: { last: 4 } }],
    ['a trend either way', { kind: 'trend', statement: 'Agreement moved over 2024 to 2026.', expect: 'any', periods: ['latest-2', 2025, 'latest'] }],
    ['the value the words name', { kind: 'target', statement: 'We are still below the 80 per cent target.', expect: 'lower', value: 0.8, valueWritten: '80' }],
    ['"within 5%" with a margin of 5 points', { kind: 'equivalence', statement: 'History is within 5% of the rest.', margin: 0.05 }],
    ['"no more than 5 points" with its margin', { kind: 'equivalence', statement: 'No subject is more than 5 points from the institution.', margin: 0.05 }],
    ['"last year" one period apart', { kind: 'change', statement: 'More of our students know where to turn than last year.', expect: 'higher', from: 'previous', to: 'latest' }],
    ['an estimate', { kind: 'estimate', statement: 'About three in four of our students are content.' }],
    ['an association whose words agree', { kind: 'association', statement: 'Departments whose students rate study spaces higher have more students content overall.', expect: 'positive' }],
    ['an association of three direction words', { kind: 'association', statement: 'Where more students are content, more say feedback is timely and fewer leave.', expect: 'positive' }],
    ['an association either way, worded so', { kind: 'association', statement: 'Resources and satisfaction are related across departments.', expect: 'any' }],
  ];
  for (const [name, c] of quiet) it(name, () => expect(fields(c)).toEqual([]));

  it('the demo claims file and every claims file in README.md raise none', async () => {
    const demo = await readClaims(join(root, 'demo/claims.yaml'));
    expect(wordsProblems(demo, 'claims.yaml')).toEqual([]);
    const readme = readFileSync(join(root, 'README.md'), 'utf8');
    const blocks = [...readme.matchAll(/^```yaml\n([\s\S]*?)^```$/gm)].map((m) => m[1] as string).filter((b) => /^claims:/m.test(b) && /^sources:/m.test(b));
    expect(blocks.length).toBeGreaterThanOrEqual(2);
    for (const b of blocks) {
      const file = parseClaimsText(b, { absPath: join(root, 'demo/readme.yaml'), file: 'readme.yaml', sha256: '' });
      expect(wordsProblems(file, 'readme.yaml')).toEqual([]);
    }
  });

  it('a change claim between two groups (a gap over periods) is not read for a plain direction', () => {
    expect(fields({ kind: 'change', statement: 'Part-time students are less satisfied, but the gap narrowed.', expect: 'higher', focus: { Mode: 'part-time' }, against: { Mode: 'full-time' }, from: 'previous', to: 'latest' })).toEqual([]);
  });

  it('words that name a value no selection picks, and none that it does', () => {
    const data = { values: { Department: ['Business', 'Business and Management', 'Engineering', 'History', 'Law', 'Fine Art', 'Art'], Year: ['2025', '2026'] }, period: 'Year' };
    const c = (statement: string, over: Record<string, unknown>): Array<[string, string]> =>
      wordsAgainstFields(claim({ kind: 'compare', expect: 'lower', statement, ...over }), data).map((m) => [m.field, m.words]);
    // The words name Engineering; where picks Business.
    expect(c('Engineering fell since last year.', { kind: 'change', where: { Department: 'Business' }, from: 'previous', to: 'latest' })).toEqual([['where', 'Engineering']]);
    // against picks History, the words name Law (History is named nowhere; Engineering is the focus's own).
    expect(c('Engineering students are less satisfied than Law students.', { focus: { Department: 'Engineering' }, against: { Department: 'History' } })).toEqual([['against', 'Law']]);
    // A label names the value too.
    expect(c('Engineering students agree less.', { focus: { Department: 'Engineering' }, against: { Department: 'History' }, againstLabel: 'Law students' })).toEqual([['against', 'Law']]);
    // Quiet: the chosen value named; a longer value holding the chosen one; a value inside a chosen one; no value named;
    // "everything but"; the period column; a value in lower case ("by law").
    expect(c('Business and Management students agree less than History students.', { focus: { Department: 'Business and Management' }, against: { Department: 'History' } })).toEqual([]);
    expect(c('Fine Art students agree less than the rest.', { focus: { Department: 'Fine Art' }, against: {}, againstRest: true })).toEqual([]);
    expect(c('Our students agree less than the region.', { focus: { Department: 'Engineering' }, against: { Department: 'History' } })).toEqual([]);
    expect(c('Engineering agrees less than everyone else.', { focus: { Department: 'Engineering' }, against: { Department: { not: 'Engineering' } } })).toEqual([]);
    expect(c('Engineering agreed less in 2025.', { where: { Year: 2026 }, focus: { Department: 'Engineering' }, against: { Department: 'History' } })).toEqual([]);
    expect(c('Engineering students, as required by law, agree less than History students.', { focus: { Department: 'Engineering' }, against: { Department: 'History' } })).toEqual([]);
  });

  it('a value is named only as a whole word, by Unicode letters and digits either side, whatever the white space', () => {
    // Whole-word rule as in Unicode regular expressions (\p{L}, \p{N}): a letter such as ŵ, a digit or a letter outside
    // the basic plane (𝐀) beside the value makes it part of a longer word. common practice
    const data = { values: { Unit: ['Caerwen', 'Caerwenŵ', 'Bryn Ffos', 'Tal 7'] } };
    const c = (statement: string): string[] => wordsAgainstFields(claim({ kind: 'compare', expect: 'lower', statement, focus: { Unit: 'Tal 7' }, against: {}, againstRest: true }), data).map((m) => m.words);
    expect(c('Caerwenŵ agrees less.')).toEqual(['Caerwenŵ']);
    expect(c('Caerwen agrees less.')).toEqual(['Caerwen']);
    expect(c('𝐀Caerwen and Caerwen9 agree less.')).toEqual([]);
    expect(c('“Caerwen” agrees less.')).toEqual(['Caerwen']);
    // A value of two words is found across a line break or two spaces in the words, and not as part of "Bryn Ffosydd".
    expect(c('Bryn\n  Ffos agrees less.')).toEqual(['Bryn Ffos']);
    expect(c('Bryn Ffosydd agrees less.')).toEqual([]);
    // Found again after a first place that is part of a longer word.
    expect(c('Caerwenŵ, unlike Caerwen, agrees less.')).toEqual(['Caerwen, Caerwenŵ']);
  });

  it('years in the words are read against latest, previous and latest-N as the data resolve them', () => {
    const data = { values: { Year: ['2026', '2024', '2025'], Department: ['Engineering'] }, period: 'Year' };
    const c = (statement: string, from: unknown, to: unknown, withData = true): Array<[string, string]> =>
      wordsAgainstFields(claim({ kind: 'change', expect: 'lower', statement, where: { Department: 'Engineering' }, from, to }), withData ? data : undefined).map((m) => [m.field, m.said]);
    // Two years named: both ends must be among them; previous is 2025 in these data.
    expect(c('Engineering fell between 2024 and 2026.', 'previous', 'latest')).toEqual([['from', 'name 2024 and 2026, but the claim compared from previous (2025)']]);
    expect(c('Engineering fell between 2024 and 2026.', 'latest-2', 'latest')).toEqual([]);
    // Without the data the relative words cannot be read, so nothing is said of them.
    expect(c('Engineering fell between 2024 and 2026.', 'previous', 'latest', false)).toEqual([]);
    // One year named is one end: "since 2024" with from 2024 (or latest-2) and to latest agrees.
    expect(c('Engineering fell since 2024.', 2024, 'latest')).toEqual([]);
    expect(c('Engineering fell since 2024.', 'latest-2', 'latest')).toEqual([]);
    expect(c('Engineering fell in 2026.', 'previous', 'latest')).toEqual([]);
    // One year that is neither end: the nearer end is named.
    expect(c('Engineering fell since 2024.', 'previous', 'latest')).toEqual([['from', 'name 2024, but the claim compared from previous (2025)']]);
    expect(c('Engineering fell since 2023.', 2025, 2026)).toEqual([['from', 'name 2023, but the claim compared from 2025']]);
    // A year the data do not hold: the fix says which they do.
    expect(wordsAgainstFields(claim({ kind: 'change', expect: 'lower', statement: 'Engineering fell since 2023.', from: 'previous', to: 'latest' }), data).map((m) => m.fix)).toEqual(['The data hold 2024, 2025, 2026, not 2023: correct the words']);
    expect(wordsAgainstFields(claim({ kind: 'change', expect: 'lower', statement: 'Engineering fell since 2024.', from: 'previous', to: 'latest' }), data).map((m) => m.fix)).toEqual(['Set from to the year the words name (from: 2024), or correct the words']);
    expect(c('Engineering was lower in 2027 than in the year before.', 2025, 2026)).toEqual([['to', 'name 2027, but the claim compared to 2026']]);
  });

  it('problems are placed at the claim and name it', () => {
    const file = { claims: [claim({ id: 'x', kind: 'compare', statement: 'We are below the region.', expect: 'higher', place: { line: 12, column: 5 } })] } as never;
    const [p] = wordsProblems(file, 'claims.yaml');
    expect(p).toMatchObject({ file: 'claims.yaml', line: 12, column: 5, field: 'expect', found: 'below' });
    expect(p!.problem).toContain('in claim "x"');
  });
});
