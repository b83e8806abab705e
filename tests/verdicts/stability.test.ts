import { describe, expect, it } from 'vitest';
import { Templates } from '../../src/verdicts/templates.js';
import { stabilityView } from '../../src/verdicts/words/stability.js';
import type { Stability } from '../../src/verdicts/stability.js';

const t = new Templates();
const cells = (adjusted: string[], unadjusted: string[]) =>
  [0.9, 0.95, 0.99].map((level, i) => ({ level, adjusted: adjusted[i], unadjusted: unadjusted[i] })) as Stability['cells'];

describe('verdict stability words', () => {
  it('says a stable verdict once, naming the adjustment', () => {
    const s: Stability = { cells: cells(['supported', 'supported', 'supported'], ['supported', 'supported', 'supported']), adjustmentApplies: true, dependsOnLevel: false, dependsOnAdjustment: false };
    const v = stabilityView(s, 0.95, 13, t);
    expect(v.text).toBe('Supported at 90%, 95% and 99% confidence, with or without the adjustment for 13 claims.');
    expect(v.cells.map((c) => c.own)).toEqual([false, true, false]);
    expect(v.cells.map((c) => c.level)).toEqual(['90%', '95%', '99%']);
  });
  it('groups the levels that agree and gives the unadjusted row its own clause', () => {
    const s: Stability = { cells: cells(['supported', 'supported', 'not-supported'], ['supported', 'supported', 'supported']), adjustmentApplies: true, dependsOnLevel: true, dependsOnAdjustment: true };
    const v = stabilityView(s, 0.95, 13, t);
    expect(v.text).toBe('Adjusted for 13 claims: supported at 90% and 95%, not supported at 99%. Not adjusted: supported at all three levels.');
    expect(v.adjustedLabel).toBe('Adjusted for 13 claims');
    expect(v.cells[2]?.adjustedLabel).toBe('Not supported');
  });
  it('leaves the adjustment out when none applies', () => {
    const s: Stability = { cells: cells(['supported', 'not-supported', 'not-supported'], ['supported', 'not-supported', 'not-supported']), adjustmentApplies: false, dependsOnLevel: true, dependsOnAdjustment: false };
    expect(stabilityView(s, 0.9, 1, t).text).toBe('Supported at 90%, not supported at 95% and 99%.');
  });
});
