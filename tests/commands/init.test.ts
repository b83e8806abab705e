/**
 * warrant init on a CSV and an XLSX fixture: the written file parses, every example passes warrant check once
 * uncommented, and a second run without --force refuses to overwrite.
 * Data: tests/fixtures/claims/data/kinds-* (written by make-kinds.mjs beside them).
 */
import { spawnSync } from 'node:child_process';
import { copyFileSync, existsSync, mkdirSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
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
const KINDS = ['compare', 'association', 'change', 'gap', 'trend', 'target', 'crosstab', 'means', 'equivalence', 'estimate'];

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

async function starter(file: string, sheet?: string, from: (name: string) => string = data): Promise<{ dir: string; out: string; text: string; said: string }> {
  const dir = mkdtempSync(join(tmpdir(), 'warrant-init-'));
  copyFileSync(from(file), join(dir, file));
  const out = join(dir, 'claims.yaml');
  let said = '';
  const code = await init({ data: join(dir, file), out, ...(sheet !== undefined ? { sheet } : {}), write: (t) => (said += t) });
  expect(code).toBe(0);
  expect(said).toContain('an example of every kind of claim');
  return { dir, out, text: readFileSync(out, 'utf8'), said };
}

describe('warrant init', () => {
  it('CSV of summary counts: measures guessed, values listed, every example passes check', async () => {
    const { dir, out, text } = await starter('kinds-summary.csv');
    expect(text.split('\n')[0]).toMatch(/^# yaml-language-server: \$schema=.*schema\/claims\.schema\.json$/);
    // The population column is not switched on silently: it is a commented line saying what it would change.
    expect(text).toContain('    shape: summary\n    respondents: Respondents\n    agree: Agreeing\n    # population: Eligible   # the number eligible; uncomment to apply the finite-population correction');
    expect(text).toContain('    numeric: [StaffRatio]\n    period: year\n');
    // Values as a YAML list, sorted, each with the rows holding it.
    expect(text).toMatch(/#   provider:\n#     - Ashwren Hall   # \d+ rows\n#     - Corrowdeen Institute   # \d+ rows\n#     - Tarnquill College   # \d+ rows\n#     - Wendlemere Academy   # \d+ rows\n/);
    for (const kind of KINDS) expect(text).toContain(`  # - id: ${kind}-example`);
    // All commented: the file is not yet a claims file (no claims).
    await expect(readClaims(out)).rejects.toBeInstanceOf(InputError);
    for (const kind of KINDS) {
      const path = join(dir, `${kind}.yaml`);
      writeFileSync(path, uncomment(text, kind));
      const report = await checkClaimsFile(path);
      expect(report.problems, `${kind}: ${JSON.stringify(report.problems)}`).toEqual([]);
      // The gap example is a change claim with focus and against, read as the gap-change kind.
      expect((await readClaims(path)).claims[0]!.kind).toBe(kind === 'gap' ? 'gap-change' : kind);
    }
  });

  it('XLSX of respondents (second sheet): answer columns and not-applicable code found, every example passes check', async () => {
    const { dir, text } = await starter('kinds-respondents.xlsx', 'Answers');
    expect(text).toContain('    sheet: Answers\n    shape: respondents\n    questions: [Q01, Q02, Q03]\n    agree_codes: [4, 5]\n    not_applicable: [9]\n    period: Year\n');
    expect(text).toContain('#   ID: 96 distinct values');
    expect(text).toContain('    sheet: Answers\n');
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

const release = (name: string): string => join(resolve(here, '../fixtures/release'), name);

/** Every example of the starter file uncommented in turn passes check with no problem (those the data can support). */
async function everyExamplePasses(dir: string, text: string, kinds: string[] = KINDS): Promise<void> {
  for (const kind of kinds) {
    const path = join(dir, `${kind}.yaml`);
    writeFileSync(path, uncomment(text, kind));
    const report = await checkClaimsFile(path);
    expect(report.problems, `${kind}: ${JSON.stringify(report.problems)}`).toEqual([]);
  }
}

describe('warrant init on releases as published (tests/fixtures/release, made by make-release.mjs)', () => {
  it('a workbook whose first sheet is notes: the data sheet is chosen, the notes sheet named as passed over, and the detected shape written', async () => {
    const { dir, text, said } = await starter('release.xlsx', undefined, release);
    expect(text).toContain('    sheet: Data   # the sheet with the table; passed over: "About" (text in single cells only, no header row of column names: notes or a cover sheet)\n');
    expect(said).toContain('sheet "Data"; passed over "About"');
    expect(text).toContain('    respondents: Respondents\n    agree: Agreeing\n');
    expect(text).toContain('    header_rows: 2   # detected: rows 2 and 3 are both header rows (group headings above the column names)');
    // 3 header lines and the 24 rows of release.expected.json end at row 27; the notes start after the blank row.
    expect(text).toContain('    last_row: 27   # detected: the table ends at row 27; the 4 rows from row 29 ("Notes:") are notes');
    expect(text).toMatch(/# Read as suppressed \(withheld in the release; never given a number\): Respondents: "\*" 1, "\[c\]" 1, "\.\." 1, "DP" 1;/);
    // A provider name with a comma stays one value, quoted.
    expect(text).toContain('#     - "Dunmarsh College, North"   # 6 rows\n');
    // Two years and no numeric column: the trend (three periods) and means examples say what they need, so are left out.
    await everyExamplePasses(dir, text, KINDS.filter((k) => k !== 'trend' && k !== 'means'));
  });

  it('the same release as CSV: title line passed over, two header rows, notes and markers seen through', async () => {
    const { dir, text } = await starter('release.csv', undefined, release);
    expect(text).not.toContain('COLUMN   #');
    expect(text).toContain('    header_row: 2   # detected');
    expect(text).toContain('    header_rows: 2   #');
    expect(text).toContain('    last_row: 27   #');
    await everyExamplePasses(dir, text, KINDS.filter((k) => k !== 'trend' && k !== 'means'));
  });

  it("a release's own marker in the count columns is written as suppressed:, said to be assumed", async () => {
    const dir = mkdtempSync(join(tmpdir(), 'warrant-init-own-'));
    const rows = ['Provider,Question,Respondents,Agreeing'];
    ['Ashmere College', 'Bramblecote Institute', 'Corrow Academy'].forEach((p, i) => ['Q01', 'Q02'].forEach((q, j) => rows.push(i === 1 && j === 1 ? `${p},${q},~,~` : `${p},${q},${40 + 10 * i + j},${20 + i}`)));
    writeFileSync(join(dir, 'own.csv'), rows.join('\n') + '\n');
    const out = join(dir, 'claims.yaml');
    await init({ data: join(dir, 'own.csv'), out, write: () => {} });
    const text = readFileSync(out, 'utf8');
    expect(text).toContain('    respondents: Respondents\n    agree: Agreeing\n    suppressed: ["~"]   # assumed');
    // No period column and no numeric column: the change, trend and means examples say what they need.
    await everyExamplePasses(dir, text, KINDS.filter((k) => k !== 'trend' && k !== 'change' && k !== 'gap' && k !== 'means'));
  });

  it('writes claims.yaml in the current folder, not beside the data, and never over an existing file', () => {
    const root = resolve(here, '../..');
    const work = mkdtempSync(join(tmpdir(), 'warrant-init-cwd-'));
    const dataDir = join(work, 'data');
    mkdirSync(dataDir);
    copyFileSync(release('release.csv'), join(dataDir, 'release.csv'));
    const run = () => spawnSync(process.execPath, [join(root, 'bin/warrant.js'), 'init', 'data/release.csv'], { cwd: work, encoding: 'utf8' });
    const first = run();
    expect(first.status, first.stderr).toBe(0);
    expect(existsSync(join(work, 'claims.yaml'))).toBe(true);
    expect(existsSync(join(dataDir, 'claims.yaml'))).toBe(false);
    expect(readFileSync(join(work, 'claims.yaml'), 'utf8')).toContain('    file: data/release.csv\n');
    const before = readFileSync(join(work, 'claims.yaml'), 'utf8');
    writeFileSync(join(work, 'claims.yaml'), before + '# my edit\n');
    const second = run();
    expect(second.status).toBe(2);
    expect(second.stderr + second.stdout).toMatch(/already exists/);
    expect(readFileSync(join(work, 'claims.yaml'), 'utf8')).toBe(before + '# my edit\n');
  });
});
