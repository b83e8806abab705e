/**
 * Headings extract as words. A pack is built through the command line (`node bin/warrant.js build`) from a claims
 * file whose ids are full of letter pairs that fonts kern (TT, AT, AV, LT, TY, WA, YO), and its text is read back
 * with poppler's pdftotext, a tool outside the project. Every claim's label ("CLAIM BUTTON-SETTLE") and every
 * continuation line must come out exactly as the id it shows, and every section heading as its title: a label split
 * into "BUT TON-SET TLE" breaks search, copy-paste and screen readers.
 */
import { execFileSync } from 'node:child_process';
import { copyFileSync, mkdirSync, mkdtempSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

const root = resolve(__dirname, '../..');
const work = mkdtempSync(join(tmpdir(), 'warrant-headings-'));
/** pdftotext's lines, trimmed, blank lines dropped. */
let lines: string[];
/** The same run with -raw (content-stream order), which splits words by a different rule. */
let rawLines: string[];

const IDS = ['button-settle', 'attain-little-tally', 'wave-avatar-typology', 'yoyo-attempt-lattice', 'waltz-tty-flat'];

beforeAll(() => {
  mkdirSync(join(work, 'data'));
  copyFileSync(join(root, 'demo/data/2026/summary.xlsx'), join(work, 'data/summary.xlsx'));
  const claim = (id: string, question: string, verb: string): string => `
  - id: ${id}
    claim: ${verb}
    kind: estimate
    source: lanternfield
    where: { Year: latest, Question: ${question} }
    select: { Institution: Quarrendell University }
    select_label: Quarrendell University
`;
  writeFileSync(
    join(work, 'claims.yaml'),
    `title: Heading extraction check
organisation: Tottering Attic Trust
data_date: 2026-03-03
confidence: 95%
sources:
  lanternfield:
    file: data/summary.xlsx
    sheet: Results
    shape: summary
    respondents: Respondents
    agree: Agreeing
    period: Year
claims:
${IDS.map((id, i) => claim(id, `Q0${i + 1}`, `About half of our students agree with statement ${i + 1}.`)).join('')}`,
  );
  execFileSync(process.execPath, [join(root, 'bin/warrant.js'), 'build', 'claims.yaml', '--out', 'out'], { cwd: work, encoding: 'utf8' });
  const folder = readdirSync(join(work, 'out')).find((f) => f !== 'latest')!;
  const pdf = join(work, 'out', folder, 'pack.pdf');
  const read = (args: string[]): string[] =>
    execFileSync('pdftotext', ['-enc', 'UTF-8', ...args, pdf, '-'], { encoding: 'utf8' })
      .split('\n')
      .map((l) => l.trim())
      .filter((l) => l.length > 0);
  lines = read([]);
  rawLines = read(['-raw']);
}, 120_000);

afterAll(() => rmSync(work, { recursive: true, force: true }));

describe('letter-spaced headings', () => {
  it('print each claim label as the id it shows, in both extraction modes', () => {
    for (const text of [lines, rawLines]) {
      const labels = text.filter((l) => l.startsWith('CLAIM '));
      expect(labels).toEqual(IDS.map((id) => `CLAIM ${id.toUpperCase()}`));
    }
  });

  it('print the section headings as their titles', () => {
    for (const title of ['Summary', 'Data sources', 'General cautions', 'Method notes', 'Glossary', 'Reproducibility']) {
      expect(lines).toContain(title);
    }
    expect(lines).toContain('Heading extraction check');
  });
});
