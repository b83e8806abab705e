/**
 * Data as published: suppressed cells, footnote markers, notes under the table, two header rows, a notes sheet before
 * the data sheet. The fixtures and what they hold (release.expected.json, codes-wording.expected.json) are written by
 * tests/fixtures/release/make-release.mjs; the counts are checked against what the generator wrote, not against the
 * reader's own output.
 */
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { readCube } from '../../src/data/cube.js';
import { pool } from '../../src/data/select.js';
import { scanTable } from '../../src/claims/scan.js';
import { shortfall } from '../../src/analyse/thresholds.js';
import { isSuppressedMarker, markerSet, splitFootnote, twoRowHeader } from '../../src/data/table.js';
import { InputError } from '../../src/errors.js';
import type { Claim } from '../../src/claims/types.js';
import { respondentsSource, summarySource } from './sources.js';

const fx = (name: string) => join(import.meta.dirname, '../fixtures/release', name);
const expected = JSON.parse(readFileSync(fx('release.expected.json'), 'utf8')) as {
  rows: Array<{ provider: string; year: string; question: string; respondents: number | null; agree: number | null; suppressed: boolean }>;
  notes: string[];
};
const tmp = mkdtempSync(join(tmpdir(), 'warrant-release-'));

describe('a release with every habit, as CSV and as a workbook with a notes sheet first', () => {
  for (const [file, extra] of [
    ['release.csv', {}],
    ['release.xlsx', { sheet: 'Data' }],
  ] as const) {
    it(`${file}: suppressed rows kept as suppressed groups, footnotes read off, notes left out, two header rows`, async () => {
      const cube = await readCube(summarySource(fx(file), extra), ['Provider', 'Year', 'Question'], file);
      expect(cube.headerRows).toBe(2);
      expect(cube.dimensions).toEqual(['Provider', 'Year', 'Question']);
      expect(cube.rows).toBe(expected.rows.length);
      expect(cube.cells.map((c) => [c.dims['Provider'], c.dims['Year'], c.dims['Question'], c.suppressed === true ? null : c.n, c.suppressed === true ? null : c.agree])).toEqual(
        expected.rows.map((r) => [r.provider, r.year, r.question, r.respondents, r.agree]),
      );
      // Never a guessed number: suppressed cells hold no counts.
      for (const c of cube.cells.filter((x) => x.suppressed)) expect([c.n, c.agree]).toEqual([0, 0]);
      expect(cube.suppressedRows).toBe(expected.rows.filter((r) => r.suppressed).length);
      expect(cube.footnotes?.map((f) => [f.marker, f.cells, f.row])).toEqual([
        ['*', 1, 4],
        ['†', 1, 8],
      ]);
      // The table ends at the blank row after the last data row (3 header lines + rows); the notes follow it.
      const lastRow = 3 + expected.rows.length;
      expect(cube.tableEnd).toEqual({ lastRow, noteRows: expected.notes.length, firstNoteRow: lastRow + 2, firstNote: 'Notes:', by: 'detected' });
    });
  }

  it('pools only rows with numbers and counts the suppressed ones in the selection', async () => {
    const cube = await readCube(summarySource(fx('release.csv')), ['Provider', 'Year', 'Question'], 'r.csv');
    const q3 = pool(cube, { Question: 'Q03' });
    const rows = expected.rows.filter((r) => r.question === 'Q03');
    expect(q3.cells).toBe(rows.length);
    expect(q3.suppressed).toBe(rows.filter((r) => r.suppressed).length);
    expect(q3.n).toBe(rows.reduce((a, r) => a + (r.respondents ?? 0), 0));
    expect(q3.agree).toBe(rows.reduce((a, r) => a + (r.agree ?? 0), 0));
    const claim = { minRespondents: 10 } as Claim;
    const bram = pool(cube, { Provider: 'Bramblecote Institute', Year: '2026' });
    expect(bram).toMatchObject({ n: 0, cells: 3, suppressed: 3 });
    expect(shortfall(claim, [{ label: 'Bramblecote Institute', pooled: bram }])).toBe(
      'the release suppressed all 3 of its rows for Bramblecote Institute (withheld as too small to publish), so there are no figures to test',
    );
  });

  it('the quick scan behind check and init sees the same table', async () => {
    for (const [file, sheet] of [
      ['release.csv', undefined],
      ['release.xlsx', 'Data'],
    ] as const) {
      const scan = await scanTable(fx(file), file.endsWith('.xlsx') ? 'xlsx' : 'csv', { displayPath: file, ...(sheet !== undefined ? { sheet } : {}) });
      expect(scan.headerRows).toBe(2);
      expect(scan.rows).toBe(expected.rows.length);
      expect(scan.tableEnd).toMatchObject({ noteRows: expected.notes.length, firstNote: 'Notes:' });
      const resp = scan.columns.find((c) => c.name === 'Respondents')!;
      expect(resp.alias).toBe('Responses');
      expect(resp.integer).toBe(true);
      const markers = expected.rows.filter((r) => r.suppressed).length;
      expect(Object.values(resp.markers).reduce((a, b) => a + b, 0)).toBe(markers);
      const provider = scan.columns.find((c) => c.name === 'Provider')!;
      expect(provider.values).toEqual([...new Set(expected.rows.map((r) => r.provider))]);
      expect(provider.counts).toEqual(provider.values.map((p) => expected.rows.filter((r) => r.provider === p).length));
    }
  });
});

describe('where the table ends, and markers of a source', () => {
  const write = (name: string, text: string) => {
    const path = join(tmp, name);
    writeFileSync(path, text);
    return path;
  };

  it('rows after a blank row that look like data are still table rows', async () => {
    const path = write('gap.csv', 'G,Respondents,Agreeing\nA,10,5\n\nB,20,7\n\nNote: invented\n');
    const cube = await readCube(summarySource(path), [], 'gap.csv');
    expect(cube.cells.map((c) => [c.dims['G'], c.n, c.agree])).toEqual([
      ['A', 10, 5],
      ['B', 20, 7],
    ]);
    expect(cube.tableEnd).toMatchObject({ lastRow: 4, noteRows: 1, firstNoteRow: 6 });
  });

  it('a note row with no blank row above it is an error that suggests last_row; last_row then reads it as a note', async () => {
    const path = write('nogap.csv', 'G,Respondents,Agreeing\nA,10,5\nB,20,7\nSource: invented,,\n');
    const e = await readCube(summarySource(path), [], 'nogap.csv').catch((x: unknown) => x);
    expect(e).toBeInstanceOf(InputError);
    expect((e as InputError).message).toContain('last_row: 3');
    const cube = await readCube(summarySource(path, { lastRow: 3 }), [], 'nogap.csv');
    expect(cube.rows).toBe(2);
    expect(cube.tableEnd).toMatchObject({ lastRow: 3, noteRows: 1, by: 'source' });
  });

  it("a source's own marker is read as suppressed; an unknown text in a count is still an error", async () => {
    const path = write('own.csv', 'G,Respondents,Agreeing\nA,10,5\nB,~~,~~\n');
    await expect(readCube(summarySource(path), [], 'own.csv')).rejects.toThrow(/not a number/);
    const cube = await readCube(summarySource(path, { suppressed: ['~~'] }), [], 'own.csv');
    expect(cube.suppressedRows).toBe(1);
    expect(cube.suppressedMarkers).toEqual({ '~~': 2 });
  });

  it('a withheld number eligible leaves the pooled number eligible unknown, not a partial sum', async () => {
    const path = write('pop.csv', 'G,Respondents,Agreeing,Eligible\nA,10,5,20\nB,20,7,*\n');
    const cube = await readCube(summarySource(path, { population: 'Eligible' }), [], 'pop.csv');
    expect(pool(cube, { G: 'A' }).population).toBe(20);
    expect(pool(cube, { G: ['A', 'B'] }).population).toBeUndefined();
    expect(pool(cube, { G: ['A', 'B'] }).n).toBe(30);
  });

  it('header_rows: 1 turns the detection off, header_rows: 2 names a header the detection would not see', async () => {
    const path = write('h2.csv', 'Area,Responses,\nG,Respondents,Agreeing\nA,10,5\n');
    expect((await readCube(summarySource(path), [], 'h2.csv')).headerRows).toBe(2);
    await expect(readCube(summarySource(path, { headerRows: 1 }), [], 'h2.csv')).rejects.toThrow(/no column with this name/);
    const plain = write('h2b.csv', 'G,N,A\nG,Respondents,Agreeing\nA,10,5\n');
    expect((await readCube(summarySource(plain), [], 'h2b.csv').catch((x: unknown) => x)) instanceof InputError).toBe(true);
    expect((await readCube(summarySource(plain, { headerRows: 2 }), [], 'h2b.csv')).cells[0]).toMatchObject({ n: 10, agree: 5 });
  });
});

describe('question codes above their wording', () => {
  it('the codes name the answer columns and the wording is kept as their labels', async () => {
    const { wording, people } = JSON.parse(readFileSync(fx('codes-wording.expected.json'), 'utf8')) as { wording: Record<string, string>; people: string[][] };
    const cube = await readCube(respondentsSource(fx('codes-wording.csv'), { questions: ['Q01', 'Q02', 'Q03'], notApplicableCodes: [] }), ['Campus'], 'c.csv');
    expect(cube.headerRows).toBe(2);
    expect(cube.labels).toEqual(wording);
    expect(cube.rows).toBe(people.length);
    const north = cube.cells.find((c) => c.dims['Campus'] === 'North' && c.dims['question'] === 'Q02')!;
    const answers = people.filter((p) => p[1] === 'North').map((p) => Number(p[3]));
    expect(north.n).toBe(answers.length);
    expect(north.agree).toBe(answers.filter((a) => a >= 4).length);
  });
});

describe('the rules for markers, footnotes and header names (common practice)', () => {
  const markers = markerSet(undefined);
  it('reads the common markers, and not numbers or words', () => {
    for (const m of ['*', '[c]', '[x]', '..', '-', 'DP', 'n/a', 'low', '<5', 'N/A']) expect(isSuppressedMarker(m, markers)).toBe(true);
    for (const t of ['12', '0', 'North', 'lower', '1,204']) expect(isSuppressedMarker(t, markers)).toBe(false);
  });
  it('takes a footnote marker off a number', () => {
    expect(splitFootnote('120*')).toEqual({ number: '120', marker: '*' });
    expect(splitFootnote('72%†')).toEqual({ number: '72%', marker: '†' });
    expect(splitFootnote('1,204[a]')).toEqual({ number: '1,204', marker: '[a]' });
    expect(splitFootnote('*')).toBeUndefined();
    expect(splitFootnote('120')).toBeUndefined();
  });
  it('names columns from two header rows', () => {
    const h = twoRowHeader(['Group', '', 'Responses', '', 'Q01'], ['Provider', 'Year', 'Respondents', 'Agreeing', 'Staff are helpful']);
    expect(h.names).toEqual(['Provider', 'Year', 'Respondents', 'Agreeing', 'Q01']);
    expect(h.labels).toEqual({ Q01: 'Staff are helpful' });
    expect([...h.aliases]).toEqual([
      ['Group', 0],
      ['Responses', 2],
      ['Staff are helpful', 4],
    ]);
  });
});
