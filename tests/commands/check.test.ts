/**
 * warrant check on a clean claims file and on one with every kind of problem: the exact places, fields and fixes.
 * Data: tests/fixtures/claims/data/kinds-*.csv (written by make-kinds.mjs beside them).
 */
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { check, checkClaimsFile } from '../../src/commands/check.js';

const here = dirname(fileURLToPath(import.meta.url));
const fx = (name: string): string => join(resolve(here, '../fixtures/claims'), name);

describe('warrant check', () => {
  it('a clean file with every kind: exit 0 and a one-line summary', async () => {
    let out = '';
    const code = await check({ claims: fx('valid-kinds.yaml'), write: (t) => (out += t) });
    expect(out).toMatch(/valid-kinds\.yaml: 12 claims, 2 sources, all good\.\n$/);
    expect(code).toBe(0);
  });

  it('a file with problems: every one listed, in file order, exit 2', async () => {
    const report = await checkClaimsFile(fx('check-bad.yaml'), 'claims.yaml');
    const got = report.problems.map((p) => ({ line: p.line, column: p.column, field: p.field, found: p.found }));
    expect(got).toEqual([
      { line: 20, column: 14, field: 'provder', found: 'provder' }, // unknown column
      { line: 27, column: 20, field: 'year', found: 'latest-7' }, // further back than the data go
      { line: 28, column: 24, field: 'provider', found: 'Tarnquil College' }, // unknown value
      { line: 29, column: 53, field: 'provider', found: 'Ashwren Hal' }, // unknown value inside { not: [...] }
      { line: 35, column: 5, field: 'select', found: undefined }, // matches no rows
      { line: 43, column: 5, field: 'against', found: undefined }, // overlap, neither inside the other
      { line: 45, column: 17, field: 'confidence', found: '1.5' },
      { line: 46, column: 9, field: 'id', found: 'overlapping' },
      { line: 50, column: 21, field: 'Year', found: 'previous' }, // relative word, source has no period
    ]);
    const text = report.problems.map((p) => p.fix).join('\n');
    expect(text).toContain('Did you mean "provider"?');
    expect(text).toContain('Did you mean "Tarnquill College"?');
    expect(text).toContain('Did you mean "Ashwren Hall"?');
    expect(text).toContain('Use one of the periods found: 2023, 2024, 2025, 2026');
    expect(report.problems[5]!.problem).toContain('neither lies inside the other');
    let out = '';
    expect(await check({ claims: fx('check-bad.yaml'), write: (t) => (out += t) })).toBe(2);
    expect(out).toMatch(/9 problems found in .*check-bad\.yaml\.\n$/);
    expect(out).toMatch(/check-bad\.yaml:20:14: the data of source "results" have no column "provder"/);
  });

  it('--json gives the same problems as data', async () => {
    let out = '';
    const code = await check({ claims: fx('check-bad.yaml'), json: true, write: (t) => (out += t) });
    const parsed = JSON.parse(out) as { ok: boolean; claims: number; problems: unknown[] };
    expect(code).toBe(2);
    expect(parsed.ok).toBe(false);
    expect(parsed.claims).toBe(5);
    expect(parsed.problems).toHaveLength(9);
  });

  it("a claim whose words and fields disagree: a warning at the claim, exit 0 (words are read, never certain)", async () => {
    let out = '';
    const code = await check({ claims: fx('check-words.yaml'), write: (t) => (out += t) });
    expect(code).toBe(0);
    expect(out).toMatch(/^warning: .*check-words\.yaml:11:5: the claim's words say "less" \(lower\), but expect is higher, so the pack tests the opposite of what the words say, in claim "below-tested-higher" \(field "expect", found "less"\)\. Fix: If the words are right, set expect: lower/);
    // Against the data: the words name a provider the selection does not pick.
    expect(out).toContain('check-words.yaml:25:5: the claim\'s words name "Ashwren Hall", a value of column "provider", but select picks "Tarnquill College" there, which the words do not name, in claim "names-another-provider" (field "select", found "Ashwren Hall"). Fix: Select the provider the words name (select: { provider: Ashwren Hall }), or correct the words.');
    expect(out).toMatch(/check-words\.yaml: 3 claims, 1 source, no problems, 2 warnings \(a claim's words and its fields say different things; the pack repeats each on the claim's page\)\.\n$/);
    expect(out).not.toContain('agrees-with-itself');
    let json = '';
    expect(await check({ claims: fx('check-words.yaml'), json: true, write: (t) => (json += t) })).toBe(0);
    const parsed = JSON.parse(json) as { ok: boolean; problems: unknown[]; warnings: Array<Record<string, unknown>> };
    expect(parsed.ok).toBe(true);
    expect(parsed.problems).toEqual([]);
    expect(parsed.warnings).toHaveLength(2);
    expect(parsed.warnings[0]).toMatchObject({ line: 11, column: 5, field: 'expect', found: 'less' });
  });

  it('a change from a later period to an earlier one, and a trend listed newest first, are refused with the order to write', async () => {
    const report = await checkClaimsFile(fx('check-order.yaml'), 'claims.yaml');
    expect(report.problems.map((p) => ({ line: p.line, column: p.column, field: p.field, found: p.found }))).toEqual([
      { line: 15, column: 11, field: 'from', found: 'latest' },
      { line: 22, column: 14, field: 'periods', found: '2026, 2025, 2024' },
    ]);
    expect(report.problems[0]!.problem).toContain('runs from 2026 to 2025, but 2026 comes after 2025');
    expect(report.problems[0]!.fix).toBe('Swap them: from: previous, to: latest');
    expect(report.problems[1]!.fix).toBe('List them oldest first: periods: [2024, 2025, 2026]');
  });

  it('a file the schema rejects reports the schema problems and exit 2', async () => {
    let out = '';
    expect(await check({ claims: fx('errors/unknown-kind.yaml'), write: (t) => (out += t) })).toBe(2);
    expect(out).toContain('Fix:');
  });
});
