import { describe, expect, it } from 'vitest';
import { InputError, type Problem } from '../../src/errors.js';
import { parseClaimsText } from '../../src/claims/read.js';
import { inlineOpts, problems } from '../helpers/claims-text.js';

const opts = inlineOpts;

const head = `title: A
organisation: B
sources:
  results: { file: data/summary.csv, shape: summary, respondents: Respondents, agree: Agreeing }
claims:
`;

const places = (ps: Problem[]): string[] => ps.map((p) => `${p.line}:${p.column} ${p.field ?? ''}`);

describe('more checks', () => {
  it('anchors, aliases and merge keys may be used to share filters', () => {
    const got = parseClaimsText(
      head +
        `  - &base
    id: a
    claim: first
    kind: compare
    where: &w { year: 2026, question: [Q01, Q02] }
    focus: { provider: X }
    against: { region: R }
    expect: lower
  - <<: *base
    id: b
    claim: second
    where: *w
    expect: higher
`,
      opts,
    );
    expect(got.claims.map((c) => [c.id, c.kind, c.expect, c.source])).toEqual([
      ['a', 'compare', 'lower', 'results'],
      ['b', 'compare', 'higher', 'results'],
    ]);
    expect(got.claims[1]!.where).toEqual({ year: 2026, question: ['Q01', 'Q02'] });
    expect(got.confidenceWritten).toBe('default');
  });

  it('a list item that is not a claim, a nested bad filter value reported once, a typo in shape', () => {
    const ps = problems(`title: A
organisation: B
sources:
  results: { file: data/summary.csv, shape: sumary, respondents: R, agree: A }
claims:
  - just text
  - id: b
    claim: c
    kind: association
    units: d
    x: { q: [1, { a: 1 }] }
    y: { q: 2 }
    expect: up
`);
    expect(places(ps)).toEqual(['4:45 shape', '6:5 claims', '11:13 q', '13:13 expect']);
    const msg = new InputError(ps).message;
    expect(msg).toContain('(did you mean summary?)');
    expect(msg).toContain('item 1 of claims should be a mapping');
    expect(msg).toContain('for an association claim');
  });

  it('sheet named for a CSV file, a code both agreeing and not applicable, a source that is missing', () => {
    const ps = problems(`title: A
organisation: B
sources:
  results:
    file: data/summary.csv
    sheet: Results
    shape: summary
    respondents: R
    agree: A
  people:
    file: data/respondents.csv
    shape: respondents
    questions: [Q01]
    not_applicable: [5, 9]
claims:
  - id: a
    claim: c
    kind: compare
    source: peple
    focus: { q: 1 }
    against: { q: 2 }
    expect: lower
`);
    expect(places(ps)).toEqual(['6:5 sheet', '14:21 not_applicable', '19:13 source']);
    const msg = new InputError(ps).message;
    expect(msg).toContain('a .csv file has no sheets');
    expect(msg).toContain('code 5 is listed both as agreeing and as not applicable in source "people" (agree_codes is not written, so the default [4, 5] applies)');
    expect(msg).toContain('Did you mean "people"?');
  });

  it('a key that belongs to the other kind of source', () => {
    const ps = problems(head.replace('agree: Agreeing', 'agree: Agreeing, agree_codes: [5]') + `  - { id: a, claim: c, kind: compare, focus: { q: 1 }, against: { q: 2 }, expect: lower }\n`);
    expect(places(ps)).toEqual(['4:97 agree_codes']);
    expect(new InputError(ps).message).toContain('"agree_codes" does not apply when shape is summary (it belongs with shape: respondents)');
  });

  it('a claim file that is only a number or a list', () => {
    expect(places(problems('42\n'))).toEqual(['1:1 ']);
    expect(places(problems('- a\n- b\n'))).toEqual(['1:1 ']);
  });

  it('a mapping key that breaks its rule is named, at the key, with what keys must be (answer_wording codes)', () => {
    const text = `title: A
organisation: B
sources:
  pulse:
    file: data/respondents.csv
    shape: respondents
    answer_wording: { one: Strongly disagree, 5: Strongly agree }
claims:
  - { id: a, claim: first, kind: estimate, source: pulse, where: { question: Q01 } }
`;
    // The file has other gaps (no questions, no select); about the key there is one problem, not the rule's error and
    // its 'propertyNames' wrapper as two vague ones.
    const ps = problems(text).filter((p) => p.field === 'answer_wording');
    expect(ps).toHaveLength(1);
    expect(places(ps)).toEqual(['7:23 answer_wording']);
    expect(ps[0]!.found).toBe('one');
    expect(ps[0]!.problem).toBe('the key "one" under "answer_wording" is not one this mapping can hold');
    expect(ps[0]!.fix).toContain('Each key is an answer code, a whole number such as 1 or 5');
  });
});

