import { describe, expect, it } from 'vitest';
import { decide } from '../../src/verdicts/decide.js';
import type { CompareAnalysis } from '../../src/analyse/types.js';
import type { CompareClaim } from '../../src/claims/types.js';
import type { Alternative } from '../../src/stats/result.js';

// The verdict rules are this project's own (common practice for reporting a directional claim against a
// significance test); these tests pin each branch.

function claim(expect: CompareClaim['expect'], sided: CompareClaim['sided'] = 'two-sided'): CompareClaim {
  return {
    kind: 'compare',
    id: 'c',
    statement: 's',
    source: 'x',
    where: {},
    focus: { a: 1 },
    against: { a: 2 },
    expect,
    sided,
    confidence: 0.95,
    confidenceWritten: '95%',
    place: { line: 1, column: 1 },
  };
}

function analysis(opts: { expect: CompareClaim['expect']; sided?: CompareClaim['sided']; p: number; sign: 1 | -1 | 0; alternative?: Alternative; pOpposite?: number }): CompareAnalysis {
  const c = claim(opts.expect, opts.sided);
  return {
    kind: 'compare',
    claim: c,
    status: 'tested',
    relation: 'separate',
    expectSign: opts.expect === 'lower' ? -1 : opts.expect === 'higher' ? 1 : 0,
    observedSign: opts.sign,
    methods: [],
    ...(opts.pOpposite !== undefined ? { pOpposite: opts.pOpposite } : {}),
    test: {
      method: 'two-proportion-z',
      p: opts.p,
      alternative: opts.alternative ?? 'two-sided',
      nullValue: 0,
      estimate: { name: 'difference', value: opts.sign * 0.05 },
      n: [100, 100],
      warnings: [],
    },
  };
}

describe('decide (verdict rules)', () => {
  it('supports a two-sided claim that is significant in the claimed direction', () => {
    expect(decide(analysis({ expect: 'lower', p: 0.01, sign: -1 }), 0.02).verdict).toBe('supported');
  });
  it('uses the adjusted p-value, not the raw one', () => {
    expect(decide(analysis({ expect: 'lower', p: 0.01, sign: -1 }), 0.06).verdict).toBe('not-supported');
  });
  it('says the data point the other way when significant in the opposite direction', () => {
    expect(decide(analysis({ expect: 'lower', p: 0.001, sign: 1 }), 0.003).verdict).toBe('opposite');
  });
  it('supports an undirected claim in either direction', () => {
    expect(decide(analysis({ expect: 'different', p: 0.001, sign: 1 }), 0.001).verdict).toBe('supported');
    expect(decide(analysis({ expect: 'different', p: 0.001, sign: -1 }), 0.001).verdict).toBe('supported');
  });
  it('treats p exactly at alpha as not significant', () => {
    expect(decide(analysis({ expect: 'higher', p: 0.05, sign: 1 }), 0.05).verdict).toBe('not-supported');
  });
  it('one-sided: significant in the claimed direction is supported', () => {
    const a = analysis({ expect: 'higher', sided: 'one-sided', p: 0.02, sign: 1, alternative: 'greater', pOpposite: 0.98 });
    expect(decide(a, 0.04).verdict).toBe('supported');
  });
  it('one-sided: a clear result the other way, scaled by the same adjustment, points the other way', () => {
    const a = analysis({ expect: 'higher', sided: 'one-sided', p: 0.999, sign: -1, alternative: 'greater', pOpposite: 0.001 });
    expect(decide(a, 1).verdict).toBe('opposite');
    const weak = analysis({ expect: 'higher', sided: 'one-sided', p: 0.9, sign: -1, alternative: 'greater', pOpposite: 0.1 });
    expect(decide(weak, 0.9).verdict).toBe('not-supported');
  });
  it('too little data wins over everything and carries no p-value', () => {
    const a: CompareAnalysis = { ...analysis({ expect: 'lower', p: 0.001, sign: -1 }), status: 'too-little-data', shortfall: 'x' };
    const d = decide(a, 0.001);
    expect(d.verdict).toBe('too-little-data');
    expect(d.p).toBeUndefined();
  });
  it('reports alpha as 1 - confidence', () => {
    expect(decide(analysis({ expect: 'lower', p: 0.01, sign: -1 }), 0.01).alpha).toBeCloseTo(0.05, 15);
  });
  it('carries the effective threshold of a tested claim, and none for an untested one', () => {
    // Holm over three claims, the smallest p: 0.05 / 3 (textbook step-down, see tests/stats/thresholds.test.ts).
    expect(decide(analysis({ expect: 'lower', p: 0.01, sign: -1 }), 0.03, 0.05 / 3).effectiveAlpha).toBe(0.05 / 3);
    const a: CompareAnalysis = { ...analysis({ expect: 'lower', p: 0.001, sign: -1 }), status: 'too-little-data', shortfall: 'x' };
    expect(decide(a, undefined, 0.01).effectiveAlpha).toBeUndefined();
  });
});
