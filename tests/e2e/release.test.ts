/**
 * End to end: a release with every habit of published data (a notes sheet first, a title line, group headings merged
 * over the column names, withheld cells, footnote markers, notes under the table), written by
 * tests/fixtures/release/make-release.mjs, builds a pack with no editing of the data; the pack (read back with
 * poppler's pdftotext) says what was suppressed and what was taken as notes. Expected counts come from
 * release.expected.json, written by the generator.
 */
import { execFileSync } from 'node:child_process';
import { copyFileSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { build } from '../../src/pipeline.js';
import { checkClaimsFile } from '../../src/commands/check.js';

const root = resolve(__dirname, '../..');
const work = mkdtempSync(join(tmpdir(), 'warrant-release-e2e-'));
afterAll(() => rmSync(work, { recursive: true, force: true }));
const expected = JSON.parse(readFileSync(join(root, 'tests/fixtures/release/release.expected.json'), 'utf8')) as {
  rows: Array<{ provider: string; year: string; question: string; respondents: number | null; agree: number | null; suppressed: boolean }>;
};

const CLAIMS = `title: A release as published
organisation: Test
sources:
  release:
    file: release.xlsx
    shape: summary
    respondents: Respondents
    agree: Agreeing
    period: Year
claims:
  - id: q03-ashmere
    claim: Ashmere College agrees less than the other providers on Q03.
    kind: compare
    where: { Question: Q03, Year: 2025 }
    focus: { Provider: Ashmere College }
    against: { Provider: [Bramblecote Institute, Corrow Academy, "Dunmarsh College, North"] }
    expect: lower
  - id: bramblecote-latest
    claim: Bramblecote Institute is below Corrow Academy this year.
    kind: compare
    where: { Year: latest }
    focus: { Provider: Bramblecote Institute }
    against: { Provider: Corrow Academy }
    expect: lower
`;

describe('a release as published builds a pack with no editing', () => {
  it('reads the data sheet after the notes sheet, and says what was suppressed and taken as notes', async () => {
    copyFileSync(join(root, 'tests/fixtures/release/release.xlsx'), join(work, 'release.xlsx'));
    writeFileSync(join(work, 'claims.yaml'), CLAIMS.replace('    shape: summary', '    sheet: Data\n    shape: summary'));
    const report = await checkClaimsFile(join(work, 'claims.yaml'));
    expect(report.problems).toEqual([]);
    const suppressed = expected.rows.filter((r) => r.suppressed);
    expect(report.reading?.[0]?.notes.join('\n')).toContain(`${suppressed.length} of the ${expected.rows.length} rows were suppressed in the release`);
    const result = await build({ claimsPath: join(work, 'claims.yaml'), outDir: join(work, 'out'), cwd: work, date: '2026-12-03' });
    const text = execFileSync('pdftotext', ['-enc', 'UTF-8', result.files.pdf, '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ');
    expect(text).toContain(`${expected.rows.length} rows were read, to row 27; the 4 rows below the table, from row 29 ("Notes:"), were taken as notes, not data.`);
    expect(text).toContain(`${suppressed.length} of the ${expected.rows.length} rows were suppressed in the release`);
    expect(text).toContain('The footnote marker "*" after numbers was read off');
    // What a marker stands for is in the release's own notes: the pack says where to look.
    expect(text).toMatch(/What the marker stands for is said in the release itself \(its notes under the table, from row 29\)/);
    // results.json counts what was withheld and the notes on how the table was read, per source and per claim.
    const json = JSON.parse(readFileSync(result.files.results, 'utf8')) as {
      sources: Array<{ suppressedRows: number; suppressedMarkers: Record<string, number>; footnoteMarkers: Array<{ marker: string; cells: number }>; readingNotes: string[] }>;
      claims: Array<{ id: string; suppression: { groups: number; inRelease: Array<{ label: string; rows: number; of: number }>; leftOut: string[] }; sourceReadingNotes: number }>;
    };
    const src = json.sources[0]!;
    expect(src.suppressedRows).toBe(suppressed.length);
    expect(Object.keys(src.suppressedMarkers).length).toBeGreaterThan(0);
    expect(src.footnoteMarkers.map((f) => f.marker)).toContain('*');
    expect(src.readingNotes.some((n) => n.startsWith(`${suppressed.length} of the ${expected.rows.length} rows were suppressed`))).toBe(true);
    for (const c of json.claims) expect(c.sourceReadingNotes, c.id).toBe(src.readingNotes.length);
    // Q03 in 2025: one withheld row (Corrow Academy) among the other providers' rows.
    const others = expected.rows.filter((r) => r.question === 'Q03' && r.year === '2025' && r.provider !== 'Ashmere College');
    const withheld = others.filter((r) => r.suppressed).length;
    expect(withheld).toBe(1);
    expect(text).toContain(`1 of the ${others.length} rows in Bramblecote Institute or Corrow Academy or Dunmarsh College, North was suppressed in the release`);
    expect(text).toContain(`the figures cover the other ${others.length - withheld}`);
    const q03 = json.claims.find((c) => c.id === 'q03-ashmere')!;
    expect(q03.suppression).toEqual({ groups: 1, inRelease: [{ label: 'Bramblecote Institute or Corrow Academy or Dunmarsh College, North', rows: 1, of: others.length }], leftOut: [] });
    // Every 2026 row of Bramblecote Institute was withheld: Too little data, saying why.
    const bram = expected.rows.filter((r) => r.provider === 'Bramblecote Institute' && r.year === '2026');
    expect(bram.every((r) => r.suppressed)).toBe(true);
    const at = result.claims.claims.findIndex((c) => c.id === 'bramblecote-latest');
    expect(result.decisions[at]?.verdict).toBe('too-little-data');
    expect(text).toContain(`Too little data: the release suppressed all ${bram.length} of its rows for Bramblecote Institute`);
  });
});
