/**
 * `worth_reporting`: the size of a difference worth reporting, pack-wide (one size per measure) and per claim (one
 * size in the claim's own measure), read into the normalized claims and refused with a message naming the line and
 * a fix when it is nonsense. The ranges are rules of this project (common practice): points above 0 and below 100
 * (as smallest_difference), standard deviations above 0 and at most 2 (Cohen's "large" d is 0.8; Cohen 1988, ch. 2,
 * from memory), correlations above 0 and below 1 (a correlation cannot reach 1 in an interval's open end).
 */
import { describe, expect, it } from 'vitest';
import { InputError } from '../../src/errors.js';
import { parseClaimsText } from '../../src/claims/read.js';
import { inlineOpts, problems } from '../helpers/claims-text.js';

const opts = inlineOpts;

/** A file with one claim of each split kind, `top` lines after organisation and `extra` lines in the claim `id`. */
function file(top: string, extra: Record<string, string> = {}): string {
  const more = (id: string): string => (extra[id] ? `\n    ${extra[id]}` : '');
  return `title: A
organisation: B
${top}sources:
  results: { file: data/summary.csv, shape: summary, respondents: Respondents, agree: Agreeing, numeric: [Score] }
claims:
  - id: gap
    claim: c
    kind: compare
    focus: { q: 1 }
    against: { q: 2 }
    expect: lower${more('gap')}
  - id: together
    claim: c
    kind: association
    units: dept
    x: { q: 1 }
    y: { q: 2 }
    expect: positive${more('together')}
  - id: scores
    claim: c
    kind: means
    measure: { column: Score }
    focus: { q: 1 }
    against: { q: 2 }
    expect: lower${more('scores')}
  - id: same
    claim: c
    kind: equivalence
    focus: { q: 1 }
    against: { q: 2 }
    margin: 5 points${more('same')}
`;
}

describe('worth_reporting read from the claims file', () => {
  it('pack-wide sizes go to every claim of their measure; a claim its own size wins; unset means the defaults', () => {
    const got = parseClaimsText(file('worth_reporting: { rates: 3 points, mean_scores: "0.3 SD", correlations: 0.25 }\n', { together: 'worth_reporting: r = 0.4' }), opts);
    expect(got.worthReporting).toEqual({ rates: 0.03, meanScores: 0.3, correlations: 0.25 });
    const by = Object.fromEntries(got.claims.map((c) => [c.id, c.worthReporting]));
    expect(by).toEqual({
      gap: { value: 0.03, from: 'file' },
      together: { value: 0.4, from: 'claim' },
      scores: { value: 0.3, from: 'file' },
      same: undefined,
    });
    const none = parseClaimsText(file(''), opts);
    expect(none.worthReporting).toBeUndefined();
    expect(none.claims.every((c) => c.worthReporting === undefined)).toBe(true);
  });

  it('reads points as smallest_difference does: 5, "5 points", "0.5 points"', () => {
    for (const [written, value] of [['5', 0.05], ['"5 points"', 0.05], ['"0.5 points"', 0.005], ['12.5', 0.125]] as const) {
      const got = parseClaimsText(file('', { gap: `worth_reporting: ${written}` }), opts);
      expect(got.claims[0]!.worthReporting, written).toEqual({ value, from: 'claim' });
    }
  });

  it('refuses nonsense sizes with the line, what was found and a fix', () => {
    const cases: Array<[string, Record<string, string>, string, number, string, string]> = [
      // [top lines, claim lines, expected found, line, problem part, fix part]
      ['worth_reporting: { rates: -5 }\n', {}, '-5', 3, 'is negative', 'Write it as 5 or "5 points"'],
      ['worth_reporting: { rates: 150 points }\n', {}, '150 points', 3, 'outside the accepted range (above 0 and below 100 points)', 'e.g. 5 points'],
      ['worth_reporting: { rates: 0.05 }\n', {}, '0.05', 3, 'is ambiguous', '"5 points"'],
      ['worth_reporting: { mean_scores: 3 }\n', {}, '3', 3, 'at most 2 standard deviations', 'e.g. 0.2'],
      ['worth_reporting: { correlations: 1 }\n', {}, '1', 3, 'a correlation above 0 and below 1', 'e.g. 0.3'],
      ['', { gap: 'worth_reporting: "-3 points"' }, '-3 points', 12, 'is negative', 'e.g. 5 points'],
      ['', { scores: 'worth_reporting: 0' }, '0', 26, 'above 0 and at most 2', 'e.g. 0.2'],
      ['', { together: 'worth_reporting: lots' }, 'lots', 19, 'is not a correlation', 'e.g. 0.3'],
    ];
    for (const [top, extra, found, line, problem, fix] of cases) {
      const ps = problems(file(top, extra));
      expect(ps, found).toHaveLength(1);
      const p = ps[0]!;
      expect(p.field, found).toBe('worth_reporting');
      expect(p.found, found).toBe(found);
      expect(p.line, found).toBe(line);
      expect(p.problem, found).toContain(problem);
      expect(p.fix, found).toContain(fix);
    }
  });

  it('says where a size does not belong: one size at the top, a mapping on a claim, a kind not split, beside smallest_difference', () => {
    const top = problems(file('worth_reporting: 5 points\n'));
    expect(top.map((p) => [p.line, p.problem])).toEqual([[3, 'at the top of the claims file, worth_reporting gives a size for each measure, not one size']]);
    expect(top[0]!.fix).toContain('worth_reporting: { rates: 5 points, mean_scores: 0.2, correlations: 0.3 }');

    const mapping = problems(file('', { gap: 'worth_reporting: { rates: 5 }' }));
    expect(mapping[0]!.problem).toContain("on a claim, worth_reporting is one size in the claim's own measure");
    expect(mapping[0]!.fix).toContain('worth_reporting: 5 points');

    const equivalence = problems(file('', { same: 'worth_reporting: 5 points' }));
    expect(equivalence.map((p) => [p.line, p.problem])).toEqual([[32, 'worth_reporting does not apply to claim "same" (kind equivalence): its margin already sets the size that counts']]);

    const both = problems(file('', { gap: 'smallest_difference: 3 points\n    worth_reporting: 5 points' }));
    expect(both[0]!.problem).toContain('sets both smallest_difference (line 12) and worth_reporting');

    const dead = problems(file('smallest_difference: 3 points\nworth_reporting: { rates: 5 points }\n'));
    expect(dead[0]!.line).toBe(4);
    expect(dead[0]!.problem).toContain('smallest_difference (line 3) already sets the size that counts for every claim on rates');

    const typo = problems(file('worth_reporting: { rate: 5 points }\n'));
    expect(typo[0]!.fix).toContain('Did you mean "rates"?');
  });

  it('every problem reads as one paragraph naming the file and line', () => {
    const msg = new InputError(problems(file('worth_reporting: { rates: -5 }\n'))).message;
    expect(msg).toContain('inline.yaml');
    expect(msg).toMatch(/line 3|:3:/);
    expect(msg).not.toContain('\n\n');
  });
});
