import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { adjustP, ADJUST_METHODS, type AdjustMethod } from '../../src/stats/p-adjust.js';
import { expectClose } from '../helpers/tolerance.js';

interface PadjustCase {
  p: Array<number | null>;
  n: number | null;
  adjusted: Record<AdjustMethod, Array<number | null>>;
}
const fixture = JSON.parse(readFileSync(new URL('../fixtures/r/tables.json', import.meta.url), 'utf8')) as {
  r_version: string;
  padjust: PadjustCase[];
};
const nan = (v: number | null): number => (v === null ? Number.NaN : v);

describe('adjustP against R p.adjust', () => {
  // Source: GNU R 4.2 stats::p.adjust, fixture tests/fixtures/r/tables.R -> tables.json.
  fixture.padjust.forEach((c, k) => {
    for (const method of ADJUST_METHODS) {
      it(`case ${k + 1}, ${method}`, () => {
        const got = adjustP(c.p.map(nan), method, c.n === null ? {} : { n: c.n });
        const want = c.adjusted[method];
        expect(got).toHaveLength(want.length);
        want.forEach((w, i) => {
          if (w === null) expect(Number.isNaN(got[i])).toBe(true);
          else expectClose(got[i] as number, w, 'closed', `${method}[${i}]`);
        });
      });
    }
  });

  it('a published worked example: Benjamini & Hochberg (1995), section 4, fifteen p-values', () => {
    // Source: Benjamini Y., Hochberg Y. (1995), JRSS B 57, p. 295 (from memory): with q* = 0.05 the BH procedure
    // rejects the four smallest hypotheses, Bonferroni (0.05/15) rejects three.
    const p = [0.0001, 0.0004, 0.0019, 0.0095, 0.0201, 0.0278, 0.0298, 0.0344, 0.0459, 0.324, 0.4262, 0.5719, 0.6528,
      0.759, 1.0];
    const bh = adjustP(p, 'benjamini-hochberg');
    expect(bh.filter((v) => v <= 0.05)).toHaveLength(4);
    expect(adjustP(p, 'bonferroni').filter((v) => v <= 0.05)).toHaveLength(3);
    // The fourth: 0.0095 * 15 / 4 = 0.035625, exact arithmetic.
    expectClose(bh[3] as number, (0.0095 * 15) / 4, 'closed', 'BH adjusted p of the fourth');
  });

  it('rejects values outside [0, 1] and an n smaller than the count', () => {
    expect(() => adjustP([0.2, 1.5], 'holm')).toThrow(/p-value 2 is 1.5/);
    expect(() => adjustP([0.2, -0.1], 'none')).toThrow(/\[0, 1\]/);
    expect(() => adjustP([0.2, 0.3], 'holm', { n: 1 })).toThrow(/smaller than the 2/);
  });

  it('all absent gives all absent; nothing given gives nothing', () => {
    expect(adjustP([], 'holm')).toEqual([]);
    expect(adjustP([Number.NaN], 'benjamini-hochberg').every(Number.isNaN)).toBe(true);
  });

  it('does not change its input', () => {
    const p = Object.freeze([0.03, 0.01, 0.2]);
    adjustP(p, 'hochberg');
    expect(p).toEqual([0.03, 0.01, 0.2]);
  });
});

describe('adjustP properties', () => {
  const pvals = fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: 1, maxLength: 40 });
  const method = fc.constantFrom(...ADJUST_METHODS);

  it('adjusted p-values are in [0, 1], at least the raw value, and keep the raw order', () => {
    fc.assert(
      fc.property(pvals, method, (p, m) => {
        const a = adjustP(p, m);
        for (let i = 0; i < p.length; i++) {
          const ai = a[i] as number;
          if (!(ai >= 0 && ai <= 1)) return false;
          if (ai < (p[i] as number)) return false;
          for (let j = 0; j < p.length; j++) {
            if ((p[i] as number) < (p[j] as number) && ai > (a[j] as number)) return false;
          }
        }
        return true;
      }),
      { seed: 20260114, numRuns: 300 },
    );
  });

  it('Holm and Hochberg never exceed Bonferroni; BH never exceeds Holm nor BY', () => {
    fc.assert(
      fc.property(pvals, (p) => {
        const bonf = adjustP(p, 'bonferroni');
        const holm = adjustP(p, 'holm');
        const hoch = adjustP(p, 'hochberg');
        const bh = adjustP(p, 'benjamini-hochberg');
        const by = adjustP(p, 'benjamini-yekutieli');
        return p.every(
          (_, i) =>
            (holm[i] as number) <= (bonf[i] as number) &&
            (hoch[i] as number) <= (holm[i] as number) &&
            (bh[i] as number) <= (hoch[i] as number) &&
            (bh[i] as number) <= (by[i] as number),
        );
      }),
      { seed: 20260115, numRuns: 300 },
    );
  });
});
