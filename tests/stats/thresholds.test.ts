import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { adjustP, ADJUST_METHODS, type AdjustMethod } from '../../src/stats/p-adjust.js';
import { effectiveThresholds } from '../../src/stats/p-adjust-thresholds.js';
import { expectClose } from '../helpers/tolerance.js';

interface Case {
  p: Array<number | null>;
  alpha: number[];
  n: number | null;
  methods: Record<AdjustMethod, { adjusted: Array<number | null>; threshold: Array<number | null> }>;
}
// Source: GNU R 4.2.2 stats::p.adjust for the adjusted p-values; the thresholds from the textbook step procedures
// written out in base R beside it. Fixture tests/fixtures/r/thresholds.R -> thresholds.json.
const fixture = JSON.parse(readFileSync(new URL('../fixtures/r/thresholds.json', import.meta.url), 'utf8')) as { r_version: string; cases: Case[] };
const nan = (v: number | null): number => (v === null ? Number.NaN : v);

describe('effective thresholds against R', () => {
  it('the fixture was made by R', () => {
    expect(fixture.r_version).toMatch(/^R version 4\./);
    expect(fixture.cases.length).toBeGreaterThanOrEqual(20);
  });
  fixture.cases.forEach((c, k) => {
    for (const method of ADJUST_METHODS) {
      it(`case ${k + 1} (${c.p.length} claims), ${method}: R's adjusted p < alpha exactly when p < threshold`, () => {
        const p = c.p.map(nan);
        const opts = c.n === null ? {} : { n: c.n };
        const got = effectiveThresholds(p, c.alpha, method, opts);
        const R = c.methods[method];
        R.threshold.forEach((w, i) => {
          if (w === null) expect(Number.isNaN(got[i])).toBe(true);
          else expectClose(got[i] as number, w, 'closed', `${method} threshold[${i}]`);
        });
        // R 4.2.2 p.adjust decides; the threshold must agree with it claim by claim.
        R.adjusted.forEach((adj, i) => {
          if (adj === null) return;
          const pi = p[i] as number;
          expect({ i, rejected: adj < (c.alpha[i] as number) }).toEqual({ i, rejected: pi < (got[i] as number) });
        });
        // Our own adjustP agrees with R (tested elsewhere) and so with the thresholds.
        const ours = adjustP(p, method, opts);
        ours.forEach((adj, i) => {
          if (Number.isNaN(adj)) return;
          expect(adj < (c.alpha[i] as number)).toBe((p[i] as number) < (got[i] as number));
        });
      });
    }
  });

  it("Holm's worked case: three claims, the smallest fails its step, so the others are decided at that step", () => {
    // Textbook step-down: 0.02 > 0.05/3 fails at step 1; 0.021 < 0.05/2 would pass its own step but is not reached.
    const t = effectiveThresholds([0.02, 0.021, 0.04], 0.05, 'holm');
    t.forEach((v) => expectClose(v, 0.05 / 3, 'closed', 'Holm threshold'));
    // Bonferroni: alpha / m for all; none: alpha.
    expect(effectiveThresholds([0.02, 0.021, 0.04], 0.05, 'bonferroni')).toEqual([0.05 / 3, 0.05 / 3, 0.05 / 3]);
    expect(effectiveThresholds([0.02, 0.021, 0.04], 0.05, 'none')).toEqual([0.05, 0.05, 0.05]);
    // Hochberg: 0.04 < 0.05/1 passes at the top step, so every claim is decided there at alpha itself.
    expect(effectiveThresholds([0.02, 0.021, 0.04], 0.05, 'hochberg')).toEqual([0.05, 0.05, 0.05]);
  });

  it('rejects bad alphas and mismatched lengths', () => {
    expect(() => effectiveThresholds([0.1, 0.2], [0.05], 'holm')).toThrow(/1 alphas given for 2/);
    expect(() => effectiveThresholds([0.1], 1, 'holm')).toThrow(/strictly between 0 and 1/);
    expect(() => effectiveThresholds([1.2], 0.05, 'holm')).toThrow(/\[0, 1\]/);
  });
});

describe('effective thresholds, properties', () => {
  const pvals = fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: 1, maxLength: 30 });
  const level = fc.constantFrom(0.1, 0.05, 0.01);
  it('adjusted p < alpha exactly when p < threshold; alpha/m <= threshold <= alpha (FWER methods)', () => {
    fc.assert(
      fc.property(pvals, level, fc.constantFrom(...ADJUST_METHODS), (p, a, method) => {
        const adj = adjustP(p, method);
        const t = effectiveThresholds(p, a, method);
        return p.every((pi, i) => {
          const ti = t[i] as number;
          // Away from the exact boundary (where rounding in m·p can tip either way).
          const onEdge = Math.abs((adj[i] as number) - a) < 1e-12 || Math.abs(pi - ti) < 1e-15;
          const within = method === 'benjamini-yekutieli' ? ti <= a : ti >= a / p.length - 1e-18 && ti <= a;
          return within && (onEdge || (adj[i] as number) < a === pi < ti);
        });
      }),
      { seed: 20261203, numRuns: 400 },
    );
  });
});
