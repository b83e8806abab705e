import { describe, expect, it } from 'vitest';
import { diffPacks, isEmptyDiff } from '../../src/history/diff.js';
import { changeSection, diffText } from '../../src/history/words.js';
import { claimFingerprint } from '../../src/history/fingerprint.js';
import { Templates } from '../../src/verdicts/templates.js';
import type { ClaimResult, ResultsFile } from '../../src/results/results.js';
import type { CompareClaim } from '../../src/claims/types.js';

// The comparison rules are this project's own; each test pins one of them with hand-made results.

function claim(id: string, over: Partial<ClaimResult> = {}): ClaimResult {
  return {
    id,
    statement: `Statement ${id}`,
    kind: 'compare',
    source: 'survey',
    fingerprint: `f-${id}`,
    method: 'two-proportion-z',
    methods: ['two-proportion-z'],
    hypotheses: { null: 'n', alternative: 'a' },
    confidence: 0.95,
    sided: 'two-sided',
    expect: 'lower',
    verdict: 'supported',
    verdictText: 'x',
    estimate: { name: 'difference in proportions', value: -0.06 },
    interval: { lower: -0.09, upper: -0.03, level: 0.95, method: 'newcombe-hybrid' },
    statistic: { symbol: 'z', value: -4 },
    df: null,
    p: 0.0001,
    pAdjusted: 0.0004,
    n: [800, 900],
    selections: [],
    units: [],
    detectable: 0.02,
    comparedWithRest: false,
    cautions: [],
    ...over,
  };
}

function pack(claims: ClaimResult[], over: Partial<ResultsFile> = {}): ResultsFile {
  return {
    format: 1,
    tool: { name: 'warrant', version: '0.1.0' },
    fingerprint: '000000000000',
    title: 't',
    organisation: 'o',
    date: '2025-03-03',
    claimsFile: { file: 'claims.yaml', sha256: 'a'.repeat(64) },
    settings: { confidence: 0.95, adjust: 'holm', minRespondents: 10 },
    sources: [{ id: 'survey', file: 'data.xlsx', shape: 'summary', sha256: 'b'.repeat(64), rows: 100 }],
    claims,
    ...over,
  };
}

describe('diffPacks', () => {
  it('finds nothing between a pack and itself', () => {
    const p = pack([claim('a'), claim('b')]);
    expect(isEmptyDiff(diffPacks(p, p))).toBe(true);
  });

  it('explains a verdict change by new data when only the data file changed', () => {
    const before = pack([claim('a')]);
    const after = pack([claim('a', { verdict: 'not-supported', estimate: { name: 'difference in proportions', value: -0.01 } })], {
      date: '2026-03-03',
      sources: [{ id: 'survey', file: 'data.xlsx', shape: 'summary', sha256: 'c'.repeat(64), rows: 120 }],
    });
    const d = diffPacks(before, after, { before: '2025-03-04-aaaaaaaaaaaa' });
    expect(d.verdicts).toEqual([{ id: 'a', statement: 'Statement a', before: 'supported', after: 'not-supported', reasons: ['new data'] }]);
    expect(d.data).toEqual([{ id: 'survey', file: 'data.xlsx', change: 'changed', rowsBefore: 100, rowsAfter: 120 }]);
    // -0.01 lies outside the earlier interval (-0.09 to -0.03): the estimate moved beyond its interval.
    expect(d.moved).toEqual([{ id: 'a', name: 'difference in proportions', before: -0.06, after: -0.01, beforeInterval: [-0.09, -0.03] }]);
    const t = new Templates();
    const section = changeSection(d, t);
    expect(section.heading).toBe('What changed since 3 March 2025');
    expect(section.verdicts[0]).toEqual({ claim: 'Statement a (a)', before: 'Supported', after: 'Not supported', why: 'new data' });
    expect(section.intro).toContain('Different people answer each survey, so a verdict changed by new data may reflect a different group of respondents');
    expect(section.notes.some((n) => n.includes('moved from \u22126.0 points to \u22121.0 points'))).toBe(true);
    expect(diffText(d, t)).toContain('a: Supported -> Not supported (new data)');
  });

  it('names the earlier pack by its data date, or by its build day when the data date is the same (a corrected file)', () => {
    const t = new Templates();
    const newRelease = diffPacks(pack([claim('a')]), pack([claim('a')], { date: '2026-03-03' }), { before: '2025-03-04-aaaaaaaaaaaa' });
    expect(changeSection(newRelease, t).heading).toBe('What changed since 3 March 2025');
    const corrected = diffPacks(pack([claim('a')]), pack([claim('a')]), { before: '2025-03-04-aaaaaaaaaaaa' });
    expect(changeSection(corrected, t).heading).toBe('What changed since the pack built on 4 March 2025');
  });

  it('explains a verdict change by an edited claim and by changed thresholds', () => {
    const before = pack([claim('a')]);
    const after = pack([claim('a', { fingerprint: 'changed', verdict: 'too-little-data', estimate: null, interval: null })], {
      settings: { confidence: 0.95, adjust: 'holm', minRespondents: 1000 },
    });
    const d = diffPacks(before, after);
    expect(d.verdicts[0]?.reasons).toEqual(['changed claim', 'changed threshold']);
    // The same data: no word of different people answering, which would explain the change by a cause it did not have.
    const intro = changeSection(d, new Templates()).intro;
    expect(intro).toContain('1 verdict changed.');
    expect(intro).not.toContain('Different people answer');
    expect(d.edited).toEqual(['a']);
    expect(d.becameUntestable).toEqual(['a']);
    expect(d.settings).toEqual([{ name: 'minRespondents', before: '10', after: '1000' }]);
  });

  it('lists claims added and removed, and claims that became testable', () => {
    const d = diffPacks(pack([claim('a', { verdict: 'too-little-data' }), claim('gone')]), pack([claim('a'), claim('new')]));
    expect(d.added).toEqual(['new']);
    expect(d.removed).toEqual(['gone']);
    expect(d.becameTestable).toEqual(['a']);
  });
});

describe('claim fingerprints', () => {
  const base: CompareClaim = {
    kind: 'compare', id: 'c', statement: 'Our rate is lower.', source: 's', where: { Year: 2026 }, focus: { Unit: 'A' },
    against: { Unit: 'B' }, expect: 'lower', sided: 'two-sided', confidence: 0.95, confidenceWritten: '95%', minRespondents: 10,
    place: { line: 3, column: 5 },
  };
  it('ignore where the claim sits in the file and how its level was written', () => {
    expect(claimFingerprint({ ...base, place: { line: 40, column: 5 }, confidenceWritten: '0.95' })).toBe(claimFingerprint(base));
  });
  it('change when the words, direction, confidence or selections change', () => {
    const f = claimFingerprint(base);
    expect(claimFingerprint({ ...base, statement: 'Our rate is much lower.' })).not.toBe(f);
    expect(claimFingerprint({ ...base, expect: 'different' })).not.toBe(f);
    expect(claimFingerprint({ ...base, confidence: 0.99 })).not.toBe(f);
    expect(claimFingerprint({ ...base, against: { Unit: 'C' } })).not.toBe(f);
  });
});
