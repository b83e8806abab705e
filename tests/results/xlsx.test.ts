/**
 * results.xlsx read back with exceljs (and its XML read with unzip, a tool outside the project) against the
 * ResultsFile it was written from.
 */
import { describe, it, expect, beforeAll } from 'vitest';
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import ExcelJS from 'exceljs';
import { writeResultsXlsx, neutralise } from '../../src/results/xlsx.js';
import type { ResultsFile } from '../../src/results/results.js';

const interval = (lower: number, upper: number, method: string) => ({ lower, upper, level: 0.95, method });

/** Invented results; statements and cautions include text a spreadsheet would take for a formula. */
const results: ResultsFile = {
  format: 1,
  tool: { name: 'warrant', version: '0.1.0' },
  title: 'Student voice review 2026',
  organisation: 'Coleg Ŵennalt',
  date: '2026-03-03',
  claimsFile: { file: 'claims.yaml', sha256: 'ab'.repeat(32) },
  settings: { confidence: 0.95, adjust: 'holm', minRespondents: 10 },
  sources: [{ id: 's', file: 'data/summary.xlsx', shape: 'summary', sha256: 'cd'.repeat(32), rows: 100 }],
  claims: [
    {
      id: 'feedback-below-region',
      statement: '=HYPERLINK("http://example.invalid","click") our feedback rate is below the region',
      kind: 'compare',
      method: 'two-proportion-z',
      methods: ['two-proportion-z', 'wilson'],
      hypotheses: { null: 'equal', alternative: 'lower' },
      confidence: 0.95,
      sided: 'two-sided',
      expect: 'lower',
      verdict: 'supported',
      verdictText: 'Supported.',
      verdictLabel: 'Supported',
      verdictDetail: null,
      advice: { action: 'quote', label: 'Quote as written', reason: 'The data give clear evidence for the claim.' },
      estimate: { name: 'difference in proportions', value: -0.11863073049375916 },
      interval: interval(-0.14249277736928878, -0.0949950762122753, 'newcombe-hybrid'),
      statistic: { symbol: 'z', value: -10.18 },
      df: null,
      p: 2.3418875484047322e-24,
      pAdjusted: 1.8735100387237858e-23,
      n: [2052, 6603],
      selections: [
        { label: 'Coleg Ŵennalt', n: 2052, agree: 1238, rate: 0.6033138401559455, interval: interval(0.5900409147958127, 0.6164363879748175, 'wilson'), population: 3358, approximate: false },
        { label: '+rest of region', n: 6603, agree: 4767, rate: 0.7219445706497046, interval: interval(0.715121871168112, 0.7286658676422942, 'wilson'), approximate: true },
      ],
      units: [],
      detectable: 0.032,
      comparedWithRest: true,
      cautions: ['-1 point is small.', '@SUM(A1:A2) is not a formula here.', 'Plain caution.'],
    },
    {
      id: 'resources-go-with-contentment',
      statement: 'Departments with better resources are more content.',
      kind: 'association',
      method: 'pearson',
      methods: ['pearson'],
      hypotheses: { null: 'r = 0', alternative: 'r > 0' },
      confidence: 0.95,
      sided: 'two-sided',
      expect: 'higher',
      verdict: 'not-supported',
      verdictText: 'Not supported.',
      verdictLabel: 'Not supported: ruled out',
      verdictDetail: 'ruled-out',
      advice: {
        action: 'reword',
        label: 'Reword',
        reason: 'The interval excludes a correlation of 0.30 or more.',
        wording: '-0.1 to 0.2 is the range of the correlation the data allow.',
      },
      estimate: { name: 'Pearson r', value: 0.8836016283027729 },
      interval: interval(0.6283227118673996, 0.9670910061102276, 'fisher-z'),
      statistic: { symbol: 't', value: 5.97 },
      df: 10,
      p: 0.0001379800208159245,
      pAdjusted: 0.000551920083263698,
      n: [12],
      selections: [],
      units: [],
      detectable: 0.73,
      comparedWithRest: false,
      cautions: ['\tTabbed caution.'],
    },
    {
      id: 'part-time-music-feedback',
      statement: 'Part-time students get less timely comments.',
      kind: 'compare',
      method: null,
      methods: [],
      hypotheses: { null: 'equal', alternative: 'lower' },
      confidence: 0.95,
      sided: 'two-sided',
      expect: 'lower',
      verdict: 'too-little-data',
      verdictText: 'Too little data.',
      verdictLabel: 'Too little data',
      verdictDetail: null,
      advice: { action: 'drop', label: 'Drop', reason: 'Too few people answered to test the claim.' },
      estimate: null,
      interval: null,
      statistic: null,
      df: null,
      p: null,
      pAdjusted: null,
      n: [],
      selections: [],
      units: [],
      detectable: null,
      comparedWithRest: false,
      cautions: [],
    },
  ],
};

const dir = mkdtempSync(join(tmpdir(), 'warrant-xlsx-'));
let bytes: Buffer;
let wb: ExcelJS.Workbook;

beforeAll(async () => {
  bytes = await writeResultsXlsx(results, join(dir, 'results.xlsx'));
  wb = new ExcelJS.Workbook();
  await wb.xlsx.load(bytes as unknown as ArrayBuffer);
});

describe('writeResultsXlsx', () => {
  it('writes the same bytes it returns, and the same bytes on a second write a moment later', async () => {
    expect(Buffer.compare(readFileSync(join(dir, 'results.xlsx')), bytes)).toBe(0);
    await new Promise((r) => setTimeout(r, 2100)); // past the 2-second resolution of zip times
    const again = await writeResultsXlsx(results);
    expect(Buffer.compare(again, bytes)).toBe(0);
  });

  it('has one row per claim whose values match the results', () => {
    const sheet = wb.getWorksheet('Claims')!;
    expect(sheet.rowCount).toBe(1 + results.claims.length);
    results.claims.forEach((c, i) => {
      const row = sheet.getRow(i + 2);
      expect(row.getCell(1).value).toBe(c.id);
      expect(row.getCell(2).value).toBe(neutralise(c.statement));
      expect(row.getCell(3).value).toBe(c.kind);
      expect(row.getCell(10).value ?? null).toBe(c.estimate?.value ?? null);
      expect(row.getCell(11).value ?? null).toBe(c.interval?.lower ?? null);
      expect(row.getCell(12).value ?? null).toBe(c.interval?.upper ?? null);
      expect(row.getCell(14).value ?? null).toBe(c.p);
      expect(row.getCell(15).value ?? null).toBe(c.pAdjusted);
      const cautions = row.getCell(17).value ?? '';
      expect(cautions).toBe(c.cautions.length ? neutralise(c.cautions.join('\n')) : '');
    });
    // Differences in proportions are percentages; a correlation is not.
    expect(sheet.getRow(2).getCell(10).numFmt).toBe('0.0%');
    expect(sheet.getRow(3).getCell(10).numFmt).toBe('0.000');
    expect(sheet.getRow(2).getCell(16).value).toBe('2,052; 6,603');
  });

  it("gives each claim the verdict, its detail and the advice of the claim's page, not the bare verdict code", () => {
    const sheet = wb.getWorksheet('Claims')!;
    expect([4, 5, 6, 7, 8].map((k) => sheet.getRow(1).getCell(k).value)).toEqual(['Verdict', 'Verdict detail', 'What to do', 'Why', 'Suggested wording']);
    const cells = (r: number) => [4, 5, 6, 7, 8].map((k) => sheet.getRow(r).getCell(k).value ?? '');
    expect(cells(2)).toEqual(['Supported', '', 'Quote as written', 'The data give clear evidence for the claim.', '']);
    // The split of "not supported" and the suggested wording; a wording that starts like a formula is neutralised.
    expect(cells(3)).toEqual([
      'Not supported',
      'ruled out',
      'Reword',
      'The interval excludes a correlation of 0.30 or more.',
      "'-0.1 to 0.2 is the range of the correlation the data allow.",
    ]);
    expect(cells(4)).toEqual(['Too little data', '', 'Drop', 'Too few people answered to test the claim.', '']);
  });

  it('lists every selection with its n, agreeing count, rate and interval', () => {
    const sheet = wb.getWorksheet('Selections')!;
    const expected = results.claims.flatMap((c) => c.selections.map((s) => ({ id: c.id, ...s })));
    expect(sheet.rowCount).toBe(1 + expected.length);
    expected.forEach((s, i) => {
      const row = sheet.getRow(i + 2);
      expect(row.getCell(1).value).toBe(s.id);
      expect(row.getCell(2).value).toBe(neutralise(s.label));
      expect(row.getCell(3).value).toBe(s.n);
      expect(row.getCell(4).value).toBe(s.agree);
      expect(row.getCell(5).value).toBe(s.rate);
      expect(row.getCell(5).numFmt).toBe('0.0%');
      expect(row.getCell(6).value).toBe(s.interval.lower);
      expect(row.getCell(7).value).toBe(s.interval.upper);
      expect(row.getCell(9).value ?? null).toBe(s.population ?? null);
    });
    expect(sheet.getRow(3).getCell(2).value).toBe("'+rest of region");
  });

  it('freezes the header row, sets widths and wraps long text', () => {
    for (const name of ['Claims', 'Selections']) {
      const sheet = wb.getWorksheet(name)!;
      expect(sheet.views[0]).toMatchObject({ state: 'frozen', ySplit: 1 });
      expect(sheet.getRow(1).font?.bold).toBe(true);
      expect(sheet.getColumn(2).width).toBeGreaterThan(30);
    }
    expect(wb.getWorksheet('Claims')!.getRow(2).getCell(2).alignment?.wrapText).toBe(true);
  });

  it('neutralises text starting with = + - @ or a tab, and no cell anywhere is a formula', () => {
    expect(neutralise('=1+1')).toBe("'=1+1");
    expect(neutralise('+44')).toBe("'+44");
    expect(neutralise('-3 points')).toBe("'-3 points");
    expect(neutralise('@cmd')).toBe("'@cmd");
    expect(neutralise('\tx')).toBe("'\tx");
    expect(neutralise('Plain')).toBe('Plain');
    let cells = 0;
    wb.eachSheet((sheet) =>
      sheet.eachRow((row) =>
        row.eachCell((cell) => {
          cells++;
          expect(cell.type).not.toBe(ExcelJS.ValueType.Formula);
          if (typeof cell.value === 'string') expect(cell.value).not.toMatch(/^[=+\-@\t]/);
        }),
      ),
    );
    expect(cells).toBeGreaterThan(40);
    // The sheet XML, read with unzip: no <f> (formula) element at all.
    const xml = execFileSync('unzip', ['-p', join(dir, 'results.xlsx'), 'xl/worksheets/*.xml'], { encoding: 'utf8' });
    expect(xml).toContain('<sheetData>');
    expect(xml).not.toMatch(/<f[ >]/);
  });

  it('stamps the pack date, not the clock, into the workbook and every zip entry', () => {
    expect(wb.created.toISOString()).toBe('2026-03-03T00:00:00.000Z');
    expect(wb.modified.toISOString()).toBe('2026-03-03T00:00:00.000Z');
    // unzip -Z -T lists each entry's date as yyyymmdd.hhmmss (Info-ZIP zipinfo).
    const listing = execFileSync('unzip', ['-Z', '-T', join(dir, 'results.xlsx')], { encoding: 'utf8' });
    const stamps = [...listing.matchAll(/\s(\d{8}\.\d{6})\s/g)].map((m) => m[1]);
    expect(stamps.length).toBeGreaterThan(5);
    for (const s of stamps) expect(s).toBe('20260303.000000');
  });
});
