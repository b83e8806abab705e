/**
 * warrant init on a CSV and an XLSX fixture: the written file parses, every example passes warrant check once
 * uncommented, and a second run without --force refuses to overwrite.
 * Data: tests/fixtures/claims/data/kinds-* (written by make-kinds.mjs beside them).
 */
import { copyFileSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { InputError } from '../../src/errors.js';
import { init } from '../../src/commands/init.js';
import { checkClaimsFile } from '../../src/commands/check.js';
import { readClaims } from '../../src/claims/read.js';

const here = dirname(fileURLToPath(import.meta.url));
const data = (name: string): string => join(resolve(here, '../fixtures/claims/data'), name);
const KINDS = ['compare', 'association', 'change', 'trend', 'target', 'crosstab', 'means', 'equivalence', 'estimate'];

/** The text with the example of one kind uncommented (its "  # - id:" line and the "  #   " lines below it). */
function uncomment(text: string, kind: string): string {
  const lines = text.split('\n');
  const start = lines.findIndex((l) => l === `  # - id: ${kind}-example`);
  expect(start, `example of ${kind}`).toBeGreaterThan(0);
  for (let i = start; i < lines.length && lines[i]!.startsWith('  # ') && (i === start || lines[i]!.startsWith('  #   ')); i++) {
    lines[i] = '  ' + lines[i]!.slice(4);
  }
  return lines.join('\n');
}

async function starter(file: string, sheet?: string): Promise<{ dir: string; out: string; text: string }> {
  const dir = mkdtempSync(join(tmpdir(), 'warrant-init-'));
  copyFileSync(data(file), join(dir, file));
  const out = join(dir, 'claims.yaml');
  let said = '';
  const code = await init({ data: join(dir, file), out, ...(sheet !== undefined ? { sheet } : {}), write: (t) => (said += t) });
  expect(code).toBe(0);
  expect(said).toContain('an example of every kind of claim');
  return { dir, out, text: readFileSync(out, 'utf8') };
}

describe('warrant init', () => {
  it('CSV of summary counts: measures guessed, values listed, every example passes check', async () => {
    const { dir, out, text } = await starter('kinds-summary.csv');
    expect(text.split('\n')[0]).toMatch(/^# yaml-language-server: \$schema=.*schema\/claims\.schema\.json$/);
    expect(text).toContain('    shape: summary\n    respondents: Respondents\n    agree: Agreeing\n    population: Eligible\n    numeric: [StaffRatio]\n    period: year\n');
    expect(text).toContain('#   provider: Tarnquill College, Ashwren Hall, Corrowdeen Institute, Wendlemere Academy');
    for (const kind of KINDS) expect(text).toContain(`  # - id: ${kind}-example`);
    // All commented: the file is not yet a claims file (no claims).
    await expect(readClaims(out)).rejects.toBeInstanceOf(InputError);
    for (const kind of KINDS) {
      const path = join(dir, `${kind}.yaml`);
      writeFileSync(path, uncomment(text, kind));
      const report = await checkClaimsFile(path);
      expect(report.problems, `${kind}: ${JSON.stringify(report.problems)}`).toEqual([]);
      expect((await readClaims(path)).claims[0]!.kind).toBe(kind);
    }
  });

  it('XLSX of respondents (second sheet): answer columns and not-applicable code found, every example passes check', async () => {
    const { dir, text } = await starter('kinds-respondents.xlsx', 'Answers');
    expect(text).toContain('    sheet: Answers\n    shape: respondents\n    questions: [Q01, Q02, Q03]\n    agree_codes: [4, 5]\n    not_applicable: [9]\n    period: Year\n');
    expect(text).toContain('#   ID: 96 distinct values');
    for (const kind of KINDS) {
      const path = join(dir, `${kind}.yaml`);
      writeFileSync(path, uncomment(text, kind));
      const report = await checkClaimsFile(path);
      expect(report.problems, `${kind}: ${JSON.stringify(report.problems)}`).toEqual([]);
    }
  });

  it('does not overwrite an existing file without --force', async () => {
    const { dir, out } = await starter('kinds-respondents.csv');
    const again = init({ data: join(dir, 'kinds-respondents.csv'), out, write: () => {} });
    await expect(again).rejects.toBeInstanceOf(InputError);
    await expect(again).rejects.toThrow(/already exists.*Fix: Choose another name with --out, or add --force/s);
    expect(await init({ data: join(dir, 'kinds-respondents.csv'), out, force: true, write: () => {} })).toBe(0);
  });
});
