/**
 * A claims file with thousands of mistakes (a data file given as the claims file, a generated file gone wrong): every
 * problem is kept for --json, but the message spells out only the first ones and counts the rest, naming where the
 * next one is. The limit of 30 is warrant's own choice (common practice: compilers stop listing after a few dozen).
 */
import { describe, expect, it } from 'vitest';
import { parseClaimsText } from '../../src/claims/read.js';
import { formatProblems, InputError, PROBLEMS_SHOWN } from '../../src/errors.js';
import { inlineOpts } from '../helpers/claims-text.js';

function rejected(text: string): InputError {
  try {
    parseClaimsText(text, inlineOpts);
  } catch (e) {
    if (e instanceof InputError) return e;
    throw e;
  }
  throw new Error('accepted');
}

describe('a claims file with more problems than a message can show', () => {
  const keys = 2000;
  const text = Array.from({ length: keys }, (_, i) => `unknown_${i}: x`).join('\n') + '\n';
  const e = rejected(text);

  it('keeps every problem: four missing required keys and one per unknown key', () => {
    expect(e.problems).toHaveLength(keys + 4);
    expect(e.problems.filter((p) => /is not a key warrant knows/.test(p.problem))).toHaveLength(keys);
  });

  it('spells out the first 30 and counts the rest, naming the place of the next', () => {
    const paragraphs = e.message.split('\n\n');
    expect(PROBLEMS_SHOWN).toBe(30);
    expect(paragraphs).toHaveLength(31);
    const next = e.problems[30];
    expect(next?.line).toBeDefined();
    expect(paragraphs[30]).toBe(
      `... and ${(keys + 4 - 30).toLocaleString('en-GB')} more problems, the next at inline.yaml:${next?.line}:${next?.column}. Fix: Correct the ones above first and run again; warrant check --json lists every one.`,
    );
    expect(paragraphs[30]).toContain('1,974 more problems');
  });

  it('shows every problem, with no count paragraph, when there are 30 or fewer', () => {
    const some = e.problems.slice(0, 30);
    expect(formatProblems(some).split('\n\n')).toHaveLength(30);
    expect(formatProblems(some)).not.toContain('more problem');
    expect(formatProblems(e.problems.slice(0, 31)).split('\n\n')[30]).toMatch(/^\.\.\. and 1 more problem, the next at inline\.yaml:/);
  });
});
