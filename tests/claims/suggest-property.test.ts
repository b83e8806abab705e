import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { closest, editDistance } from '../../src/suggest.js';

/**
 * The optimal string alignment distance written straight from its recurrence over a full table (insertion, deletion,
 * substitution, and a swap of two adjacent characters, each costing one; common practice), with no early stop.
 */
function osaByDefinition(a: string, b: string): number {
  const d: number[][] = Array.from({ length: a.length + 1 }, (_, i) => Array.from({ length: b.length + 1 }, (_, j) => (i === 0 ? j : j === 0 ? i : 0)));
  for (let i = 1; i <= a.length; i++) {
    for (let j = 1; j <= b.length; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      d[i]![j] = Math.min(d[i - 1]![j]! + 1, d[i]![j - 1]! + 1, d[i - 1]![j - 1]! + cost);
      if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1]) d[i]![j] = Math.min(d[i]![j]!, d[i - 2]![j - 2]! + 1);
    }
  }
  return d[a.length]![b.length]!;
}

/** The suggestion rule as documented on closest(), applied to every candidate with the full distance. */
function closestByDefinition(word: string, candidates: readonly string[]): string | undefined {
  const squash = (s: string): string => s.toLowerCase().replace(/[\s_-]+/g, '');
  const w = squash(word);
  let best: string | undefined;
  let bestScore = Infinity;
  for (const c of candidates) {
    const cc = squash(c);
    if (cc === w) return c;
    const d = osaByDefinition(w, cc);
    const contains = w.length > 0 && (cc.includes(w) || w.includes(cc));
    const limit = Math.max(2, Math.floor(Math.max(w.length, cc.length) / 3));
    const score = contains ? d / 2 : d;
    if (score < bestScore && (contains || d <= limit)) {
      best = c;
      bestScore = score;
    }
  }
  return best;
}

// Small alphabets make near misses, swaps and containment common.
const word = fc.string({ unit: fc.constantFrom('a', 'b', 'c', 'd', '_', '-', ' ', 'A', 'ŵ'), maxLength: 14 });

describe('suggestions stop early without changing the answer', () => {
  it('editDistance equals the recurrence computed in full', () => {
    fc.assert(fc.property(word, word, (a, b) => editDistance(a, b) === osaByDefinition(a, b)), { numRuns: 3000 });
    // Longer strings than the scratch rows first hold.
    const long = 'ab'.repeat(80);
    expect(editDistance(long, `${long}c`)).toBe(1);
    expect(editDistance(long, long.split('').reverse().join(''))).toBe(osaByDefinition(long, long.split('').reverse().join('')));
  });

  it('closest gives the candidate the documented rule gives', () => {
    fc.assert(
      fc.property(word, fc.array(word, { maxLength: 12 }), (w, cs) => closest(w, cs) === closestByDefinition(w, cs)),
      { numRuns: 3000 },
    );
  });

  it('closest on real key names', () => {
    const keys = ['title', 'organisation', 'min_respondents', 'min_response_rate', 'adjust', 'claims', 'sources', 'confidence'];
    for (const w of ['minrespondent', 'min_respnse_rate', 'clams', 'source', 'confidnce', 'q12345', 'titel', 'adjsut', '']) {
      expect(closest(w, keys)).toBe(closestByDefinition(w, keys));
    }
    expect(closest('titel', keys)).toBe('title');
  });
});
