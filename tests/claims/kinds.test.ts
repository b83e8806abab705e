/**
 * Every claim kind parses to the normalized object the pipeline uses; every new rule names line:column and a fix.
 * Expected objects are written from the claims language described in schema/claims.schema.json (no statistics here).
 */
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { InputError, type Problem } from '../../src/errors.js';
import { parseClaimsText, readClaims } from '../../src/claims/read.js';
import type { Claim } from '../../src/claims/types.js';
import { readPoints, readShare } from '../../src/claims/amounts.js';
import { orderPeriods, resolvePeriod } from '../../src/claims/periods.js';

const here = dirname(fileURLToPath(import.meta.url));
const fixtures = resolve(here, '../fixtures/claims');
const fx = (name: string): string => join(fixtures, name);

describe('every kind of claim normalizes', async () => {
  const file = await readClaims(fx('valid-kinds.yaml'));
  const byId = new Map(file.claims.map((c) => [c.id, c]));
  const claim = (id: string): Claim => {
    const c = byId.get(id);
    if (c === undefined) throw new Error(`no claim ${id}`);
    return c;
  };
  const common = { confidence: 0.95, confidenceWritten: 'default', minResponseRate: 0.5, smallestDifference: 0.03, minRespondents: 10 };

  it('pack-wide settings and source keys', () => {
    expect(file.minResponseRate).toBe(0.5);
    expect(file.smallestDifference).toBe(0.03);
    expect(file.sources[0]).toMatchObject({ id: 'results', period: 'year', numeric: ['StaffRatio'], population: 'Eligible' });
    expect(file.sources[1]).toMatchObject({ id: 'people', period: 'Year', headerRow: 1, notApplicableCodes: [9] });
    expect(file.sources[1]!.numeric).toBeUndefined();
  });

  it('compare with { not: ... }, a relative period, a one-sided test and its own minimum', () => {
    const { place: _p, ...c } = claim('compare-not');
    expect(c).toEqual({
      ...common,
      id: 'compare-not',
      naming: { period: 'year' },
      statement: 'Tarnquill agrees less on feedback than the other providers.',
      kind: 'compare',
      source: 'results',
      where: { year: 'latest', question: 'Q09' },
      focus: { provider: 'Tarnquill College' },
      against: { provider: { not: 'Tarnquill College' } },
      expect: 'lower',
      sided: 'one-sided',
      minRespondents: 30,
    });
  });

  it('association with measures, controls and weights', () => {
    expect(claim('ratio-association')).toMatchObject({
      kind: 'association',
      units: ['provider'],
      xMeasure: { type: 'column', column: 'StaffRatio' },
      yMeasure: { type: 'agree' },
      controls: [
        { label: 'Feedback', filter: { question: 'Q09' }, measure: { type: 'agree' } },
        { label: 'Staff ratio', filter: {}, measure: { type: 'column', column: 'StaffRatio' } },
      ],
      weighted: true,
      expect: 'positive',
      sided: 'two-sided',
    });
  });

  it('change defaults `to` to latest and takes its own response rate', () => {
    const { place: _p, statement: _s, ...c } = claim('fell-since-last-year');
    expect(c).toEqual({
      ...common,
      id: 'fell-since-last-year',
      naming: { period: 'year' },
      kind: 'change',
      source: 'results',
      where: { question: 'Q09' },
      from: 'previous',
      to: 'latest',
      expect: 'lower',
      sided: 'two-sided',
      minResponseRate: 0.6,
    });
  });

  it('trend by last N or by named periods', () => {
    expect(claim('rising-three-years')).toMatchObject({ kind: 'trend', periods: { last: 3 }, expect: 'rising', sided: 'one-sided', where: { provider: ['Tarnquill College', 'Ashwren Hall'] } });
    expect(claim('trend-named')).toMatchObject({ kind: 'trend', periods: ['latest-2', 2025, 'latest'], expect: 'any' });
  });

  it('target reads "80%" as 0.8 and keeps how it was written; smallest difference 5 -> 0.05', () => {
    expect(claim('above-target')).toMatchObject({
      kind: 'target',
      select: { provider: 'Tarnquill College' },
      selectLabel: 'Tarnquill',
      value: 0.8,
      valueWritten: '80%',
      valueLabel: 'the 80% target',
      expect: 'higher',
      smallestDifference: 0.05,
    });
  });

  it('crosstab defaults its columns to agreement and its expectation to related', () => {
    expect(claim('region-by-agreement')).toMatchObject({ kind: 'crosstab', rows: ['region'], columns: 'agreement', expect: 'related' });
    expect(claim('campus-by-department')).toMatchObject({ kind: 'crosstab', rows: ['Department'], columns: ['Campus'], expect: 'related' });
  });

  it('means: method becomes test, measure defaults to mean', () => {
    expect(claim('music-scores-lower')).toMatchObject({ kind: 'means', measure: { type: 'mean' }, test: 'rank', expect: 'lower', sided: 'two-sided' });
    expect(claim('ratio-means')).toMatchObject({ kind: 'means', measure: { type: 'column', column: 'StaffRatio' }, test: 'welch', expect: 'different' });
  });

  it('equivalence reads "5 points" as 0.05', () => {
    const c = claim('campuses-alike');
    expect(c).toMatchObject({ kind: 'equivalence', margin: 0.05, focusLabel: 'Central campus', focus: { Campus: 'Central' }, against: { Campus: 'Riverside' } });
    expect('expect' in c).toBe(false);
  });

  it('estimate defaults its measure to agree and keeps its own confidence', () => {
    expect(claim('overall-estimate')).toMatchObject({ kind: 'estimate', select: { Year: 'latest' }, measure: { type: 'agree' }, confidence: 0.9, confidenceWritten: '90%' });
  });
});

describe('shares, points and periods as written', () => {
  it('shares: 0.8, 80 and "80%" are the same; out of range is refused', () => {
    for (const w of [0.8, 80, '80%', ' 80 % ']) expect(readShare(w)).toMatchObject({ ok: true, value: 0.8 });
    expect(readShare(0, true)).toMatchObject({ ok: true, value: 0 });
    expect(readShare(0).ok).toBe(false);
    expect(readShare(150).ok).toBe(false);
    expect(readShare('eighty').ok).toBe(false);
  });
  it('points: 5 and "5 points" are 0.05; "0.5 points" is half a point; a bare 0.05 is ambiguous', () => {
    for (const w of [5, '5 points', '5 pts', '5point']) expect(readPoints(w)).toMatchObject({ ok: true, value: 0.05 });
    expect(readPoints('0.5 points')).toMatchObject({ ok: true, value: 0.005 });
    const r = readPoints(0.05);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.reason).toContain('ambiguous');
    expect(readPoints(100).ok).toBe(false);
  });
  it('periods order as numbers, else with digit runs compared by value', () => {
    expect(orderPeriods(['2026', '2024', '2025', '2025'])).toEqual(['2024', '2025', '2026']);
    expect(orderPeriods(['Wave 10', 'Wave 9', 'Wave 11'])).toEqual(['Wave 9', 'Wave 10', 'Wave 11']);
    const ordered = ['2023', '2024', '2025', '2026'];
    expect(resolvePeriod('latest', ordered)).toEqual({ ok: true, period: '2026' });
    expect(resolvePeriod('previous', ordered)).toEqual({ ok: true, period: '2025' });
    expect(resolvePeriod('latest-3', ordered)).toEqual({ ok: true, period: '2023' });
    expect(resolvePeriod(2024, ordered)).toEqual({ ok: true, period: '2024' });
    expect(resolvePeriod('latest-4', ordered).ok).toBe(false);
  });
});

/** Parse text (as if written beside the fixtures folder; return its problems. */
function problems(text: string): Problem[] {
  try {
    parseClaimsText(text, { absPath: fx('inline.yaml'), file: 'claims.yaml', sha256: '' });
  } catch (e) {
    expect(e).toBeInstanceOf(InputError);
    return (e as InputError).problems;
  }
  throw new Error('accepted but should have been rejected');
}

const HEAD = `title: T
organisation: O
sources:
  results:
    file: data/kinds-summary.csv
    shape: summary
    respondents: Respondents
    agree: Agreeing
    numeric: [StaffRatio]
claims:
`;

describe('new rules name line:column and give a fix', () => {
  const cases: Array<{ name: string; claim: string; at: string; field: string; phrases: string[] }> = [
    {
      name: 'change needs a period column on its source',
      claim: '  - { id: a, claim: c, kind: change, from: 2025, expect: lower }',
      at: 'change',
      field: 'kind',
      phrases: ['source "results" does not say which column holds the period', 'Fix: Add period:'],
    },
    {
      name: 'trend needs a period column on its source',
      claim: '  - { id: a, claim: c, kind: trend, last: 3, expect: rising }',
      at: 'trend',
      field: 'kind',
      phrases: ['compares periods', 'Add period:'],
    },
    {
      name: 'a relative period word on a source without period',
      claim: '  - { id: a, claim: c, kind: estimate, select: { year: latest } }',
      at: 'latest',
      field: 'year',
      phrases: ['"latest" names a period relative to the newest', 'or write the period itself'],
    },
    {
      name: 'one-sided trend without a direction',
      claim: '  - { id: a, claim: c, kind: crosstab, rows: region, test: one-sided }',
      at: 'one-sided',
      field: 'test',
      phrases: ['a crosstab claim (related or not) has no direction', 'Delete the test line'],
    },
    {
      name: 'one-sided means expecting "different"',
      claim: '  - { id: a, claim: c, kind: means, focus: { region: A }, against: { region: B }, measure: { column: StaffRatio }, expect: different, test: one-sided }',
      at: 'one-sided',
      field: 'test',
      phrases: ['expects "different", which has no direction', 'Set expect to lower or higher'],
    },
    {
      name: 'target value out of range',
      claim: '  - { id: a, claim: c, kind: target, select: { region: A }, value: 180%, expect: higher }',
      at: '180%',
      field: 'value',
      phrases: ['the value 180% is read as 180%', 'Write it as 0.8, 80 or "80%"'],
    },
    {
      name: 'equivalence margin written as a bare fraction',
      claim: '  - { id: a, claim: c, kind: equivalence, focus: { region: A }, against: { region: B }, margin: 0.05 }',
      at: '0.05',
      field: 'margin',
      phrases: ['is ambiguous', '0.5 points for half a point'],
    },
    {
      name: 'trend with neither periods nor last',
      claim: '  - { id: a, claim: c, kind: trend, expect: rising, source: results }',
      at: '{ id: a',
      field: 'periods',
      phrases: ['neither which periods to follow', 'last: 3'],
    },
    {
      name: 'mean score on a summary source',
      claim: '  - { id: a, claim: c, kind: estimate, select: { region: A }, measure: mean }',
      at: 'mean }',
      field: 'measure',
      phrases: ['a mean score needs one row per respondent', '{ column: NAME }'],
    },
    {
      name: 'numeric column not listed under numeric',
      claim: '  - { id: a, claim: c, kind: estimate, select: { region: A }, measure: { column: StafRatio } }',
      at: 'StafRatio',
      field: 'column',
      phrases: ['is not listed under numeric', 'Did you mean "StaffRatio"?'],
    },
    {
      name: 'measure that is not a measure',
      claim: '  - { id: a, claim: c, kind: estimate, select: { region: A }, measure: agreed }',
      at: 'agreed',
      field: 'measure',
      phrases: ['is not a measure warrant knows', 'did you mean agree?'],
    },
    {
      name: 'expect on an equivalence claim',
      claim: '  - { id: a, claim: c, kind: equivalence, focus: { region: A }, against: { region: B }, margin: 5, expect: lower }',
      at: 'expect: lower',
      field: 'expect',
      phrases: ['does not apply to an equivalence claim, which tests no direction', 'Remove expect'],
    },
    {
      name: 'an expect value of another kind',
      claim: '  - { id: a, claim: c, kind: trend, last: 3, expect: higher }',
      at: 'higher',
      field: 'expect',
      phrases: ['not an allowed value of expect for a trend claim', 'rising, falling, any'],
    },
    {
      name: 'a key of another kind',
      claim: '  - { id: a, claim: c, kind: estimate, select: { region: A }, margin: 5 }',
      at: 'margin',
      field: 'margin',
      phrases: ['does not apply when kind is estimate (it belongs with kind: equivalence)'],
    },
    {
      name: 'a kind called by another name (correlation)',
      claim: '  - { id: a, claim: c, kind: correlation, units: provider, x: { question: Q01 }, y: { question: Q09 } }',
      at: 'correlation',
      field: 'kind',
      phrases: ['"correlation" is not an allowed value of kind', 'Did you mean association (two measures across units, a correlation)? Write kind: association'],
    },
    {
      name: 'a place in a ranking other than first or last, which no kind can claim',
      claim: '  - { id: a, claim: c, kind: top-third, select: { provider: A } }',
      at: 'top-third',
      field: 'kind',
      phrases: ['warrant has no claim of a place in a ranking other than first or last', 'kind: rank (expect: highest or lowest)', 'kind: compare with against: rest', 'kind: target'],
    },
    {
      name: 'a ranking is a rank claim',
      claim: '  - { id: a, claim: c, kind: ranking, focus: { provider: A }, expect: highest }',
      at: 'ranking',
      field: 'kind',
      phrases: ['did you mean rank'],
    },
    {
      name: 'a gap that narrowed written as a kind leads to the change claim with focus and against',
      claim: '  - { id: a, claim: c, kind: narrowed, focus: { region: A }, against: { region: B } }',
      at: 'narrowed',
      field: 'kind',
      phrases: ['is a change claim with focus and against', 'Write kind: change with from and to', 'expect: narrowed or widened'],
    },
    {
      name: 'every unit within a margin, which no kind can claim',
      claim: '  - { id: a, claim: c, kind: none, focus: { region: A }, against: rest, margin: 5 }',
      at: 'none',
      field: 'kind',
      phrases: ['no kind tests that every unit lies within a margin', 'one equivalence claim per unit', 'kind: every'],
    },
    {
      name: 'a kind of no known meaning lists the kinds with what each claims',
      claim: '  - { id: a, claim: c, kind: sideways }',
      at: 'sideways',
      field: 'kind',
      phrases: ["Use one of: compare (two selections' rates), association (two measures across units, a correlation), change (one selection between two periods)"],
    },
    {
      name: 'a direction in other words (below)',
      claim: '  - { id: a, claim: c, kind: compare, focus: { region: A }, against: { region: B }, expect: below }',
      at: 'below',
      field: 'expect',
      phrases: ['Did you mean lower? Write expect: lower (one of: lower, higher, different)'],
    },
    {
      name: 'a trend direction in other words (fell)',
      claim: '  - { id: a, claim: c, kind: trend, last: 3, expect: fell }',
      at: 'fell',
      field: 'expect',
      phrases: ['Did you mean falling? Write expect: falling'],
    },
    {
      name: 'expect: same asks for an equivalence claim',
      claim: '  - { id: a, claim: c, kind: compare, focus: { region: A }, against: { region: B }, expect: same }',
      at: 'same',
      field: 'expect',
      phrases: ['use kind: equivalence with a margin'],
    },
    {
      name: 'a change claim with focus but no against',
      claim: '  - { id: a, claim: c, kind: change, focus: { Mode: part-time }, from: previous, expect: narrowed }',
      at: 'focus',
      field: 'against',
      phrases: ['gives focus but no against', 'follows the gap between two selections', 'Add against:', 'against: rest'],
    },
    {
      name: 'a gap that narrowed on a change claim with no two groups',
      claim: '  - { id: a, claim: c, kind: change, where: { Mode: part-time }, from: previous, expect: narrowed }',
      at: 'narrowed',
      field: 'expect',
      phrases: ['expects the gap narrowed, but names no two selections', 'Add focus and against'],
    },
    {
      name: 'a one-sided test of a gap that narrowed',
      claim: '  - { id: a, claim: c, kind: change, focus: { Mode: part-time }, against: { Mode: full-time }, from: previous, expect: narrowed, test: one-sided }',
      at: 'one-sided',
      field: 'test',
      phrases: ['always held to the two-sided level', 'Delete the test line', 'expect: lower or higher with test: one-sided'],
    },
    {
      name: 'a trend claim with two groups',
      claim: '  - { id: a, claim: c, kind: trend, focus: { Mode: part-time }, against: { Mode: full-time }, last: 3, expect: rising }',
      at: 'focus',
      field: 'focus',
      phrases: ['does not apply to a trend claim, which follows one selection (where) over three or more periods', 'write a trend claim for each', 'that the gap between them changed between two periods, use kind: change with focus and against'],
    },
    {
      name: 'a control with both where and column',
      claim: '  - { id: a, claim: c, kind: association, units: provider, x: { question: Q01 }, y: { question: Q09 }, expect: any, controls: [{ label: L, column: StaffRatio, where: { question: Q12 } }] }',
      at: '{ label: L',
      field: 'controls',
      phrases: ['gives both where and column', "{ label: ..., column: NAME }"],
    },
  ];
  for (const c of cases) {
    it(c.name, () => {
      const got = problems(HEAD + c.claim + '\n');
      const hit = got.find((p) => p.field === c.field);
      expect(hit, JSON.stringify(got, null, 1)).toBeDefined();
      // The place is where `at` starts in the claim's line (line 11 of the text).
      expect({ line: hit!.line, column: hit!.column }).toEqual({ line: 11, column: c.claim.indexOf(c.at) + 1 });
      const text = new InputError(hit!).message;
      for (const phrase of c.phrases) expect(text).toContain(phrase);
      expect(hit!.fix.length).toBeGreaterThan(0);
    });
  }
});

// A source with a period column: a claim that names no period pools every period in the data (common practice in
// survey reporting: a figure is for one survey round unless rounds are pooled on purpose and said to be).
const HEAD_PERIOD = HEAD.replace('    numeric: [StaffRatio]\n', '    numeric: [StaffRatio]\n    period: year\n');

describe('a claim on a source with periods says which periods it covers', () => {
  const refused: Array<{ name: string; claim: string; at: string; field: string; phrases: string[] }> = [
    {
      name: 'an estimate with no period anywhere',
      claim: '  - { id: a, claim: c, kind: estimate, where: { question: Q09 }, select: { provider: Tarnquill College } }',
      at: 'where',
      field: 'where',
      phrases: ['claim "a" does not say which period it covers', 'column "year"', 'no year in where or select it pools every period', 'Add year: latest to where', 'year: [previous, latest]'],
    },
    {
      name: 'a compare claim whose focus names the period but whose against does not',
      claim: '  - { id: a, claim: c, kind: compare, focus: { provider: Tarnquill College, year: latest }, against: { region: Glimmerholt Vale }, expect: lower }',
      at: 'against',
      field: 'against',
      phrases: ['the selection under against of claim "a" does not say which period', 'no year in where or under against'],
    },
    {
      name: 'against: rest with the period only in the focus (the rest would span every period)',
      claim: '  - { id: a, claim: c, kind: compare, where: { question: Q09 }, focus: { provider: Tarnquill College, year: latest }, against: rest, expect: lower }',
      at: 'where',
      field: 'where',
      phrases: ['claim "a" does not say which period', 'no year in where it pools'],
    },
    {
      name: 'a crosstab over every period',
      claim: '  - { id: a, claim: c, kind: crosstab, where: { question: Q09 }, rows: region }',
      at: 'where',
      field: 'where',
      phrases: ['does not say which period', "or make the periods the table's rows (rows: year)"],
    },
    {
      name: 'an association whose control column spans every period',
      claim: '  - { id: a, claim: c, kind: association, units: provider, x: { question: Q01, year: latest }, y: { question: Q09, year: latest }, expect: any, controls: [{ label: L, column: StaffRatio }] }',
      at: '{ label: L',
      field: 'controls',
      phrases: ['control 1 of claim "a" does not say which period', 'where or the control', 'adding year to units'],
    },
  ];
  for (const c of refused) {
    it(`refused: ${c.name}`, () => {
      const got = problems(HEAD_PERIOD + c.claim + '\n');
      const hit = got.find((p) => p.field === c.field);
      expect(hit, JSON.stringify(got, null, 1)).toBeDefined();
      expect({ line: hit!.line, column: hit!.column }).toEqual({ line: 12, column: c.claim.indexOf(c.at) + 1 });
      const text = new InputError(hit!).message;
      for (const phrase of c.phrases) expect(text).toContain(phrase);
    });
  }
  const accepted: Array<{ name: string; claim: string }> = [
    { name: 'the period in where', claim: '  - { id: a, claim: c, kind: estimate, where: { year: latest }, select: { provider: Tarnquill College } }' },
    { name: 'periods pooled on purpose', claim: '  - { id: a, claim: c, kind: estimate, where: { year: [previous, latest] }, select: { provider: Tarnquill College } }' },
    { name: 'every period but one', claim: '  - { id: a, claim: c, kind: estimate, select: { provider: Tarnquill College, year: { not: 2023 } } }' },
    { name: 'the period in both selections', claim: '  - { id: a, claim: c, kind: compare, focus: { provider: Tarnquill College, year: latest }, against: { provider: Tarnquill College, year: previous }, expect: lower }' },
    { name: 'periods as a crosstab\'s rows', claim: '  - { id: a, claim: c, kind: crosstab, where: { question: Q09 }, rows: year }' },
    { name: 'a period in each unit', claim: '  - { id: a, claim: c, kind: association, units: [provider, year], x: { question: Q01 }, y: { question: Q09 }, expect: any }' },
    { name: 'a change sets its own periods', claim: '  - { id: a, claim: c, kind: change, where: { question: Q09 }, from: previous, expect: lower }' },
  ];
  for (const c of accepted) {
    it(`accepted: ${c.name}`, () => {
      const file = parseClaimsText(HEAD_PERIOD + c.claim + '\n', { absPath: fx('inline.yaml'), file: 'claims.yaml', sha256: '' });
      expect(file.claims).toHaveLength(1);
    });
  }
});
