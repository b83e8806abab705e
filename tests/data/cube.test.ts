// Reading sources into a cube of counts. References: the values the fixture generator wrote (make-fixtures.mjs:
// summary.expected.json, respondents.rows.json), tallied here by plain loops; GNU coreutils `sha256sum` for the file
// hash; percentages worked by hand.
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { readCube } from '../../src/data/cube.js';
import type { CubeSource } from '../../src/data/cube.js';
import { respondentsSource, summarySource } from './sources.js';
import type { Cube } from '../../src/data/types.js';
import { InputError } from '../../src/errors.js';

const fx = (name: string) => join(import.meta.dirname, '../fixtures/data', name);
const tmp = mkdtempSync(join(tmpdir(), 'warrant-cube-'));

function csv(name: string, text: string): string {
  const path = join(tmp, name);
  writeFileSync(path, text);
  return path;
}

async function failure(p: Promise<unknown>): Promise<InputError> {
  const e = await p.then(
    () => undefined,
    (err: unknown) => err,
  );
  expect(e).toBeInstanceOf(InputError);
  return e as InputError;
}

interface SummaryRow {
  provider: string;
  region: string;
  year: number;
  question: string;
  respondents: number;
  agreeing: number;
  population: number;
}
const summary = JSON.parse(readFileSync(fx('summary.expected.json'), 'utf8')) as SummaryRow[];

function cellsAsRows(cube: Cube) {
  return cube.cells.map((c) => ({
    provider: c.dims['Provider'],
    region: c.dims['Region'],
    year: Number(c.dims['Year']),
    question: c.dims['Question'],
    respondents: c.n,
    agreeing: c.agree,
    population: c.population,
  }));
}

describe('readCube, summary sources', () => {
  it('reads summary.xlsx (header on row 3, rich text, formulas) into one cell per row', async () => {
    const cube = await readCube(summarySource(fx('summary.xlsx'), { population: 'Population' }), ['Provider', 'Year'], 'data/summary.xlsx');
    expect(cube.sheet).toBe('Results');
    expect(cube.rows).toBe(summary.length);
    expect(cube.dimensions).toEqual(['Provider', 'Region', 'Year', 'Question']);
    expect(cellsAsRows(cube)).toEqual(summary);
    expect(cube.cells.map((c) => c.firstRow)).toEqual(summary.map((_, i) => i + 4));
    expect(cube.hasPopulation).toBe(true);
    expect(cube.approximate).toBe(false);
    expect(cube.values['Provider']).toEqual([...new Set(summary.map((r) => r.provider))]);
    // Reference: GNU coreutils sha256sum.
    const reference = execFileSync('sha256sum', [fx('summary.xlsx')], { encoding: 'utf8' }).split(' ')[0];
    expect(cube.sha256).toBe(reference);
  });

  it('reads the semicolon CSV to the same counts at every chunk boundary', async () => {
    const expected = summary.map((r) => ({ ...r, provider: r.provider === 'Szkoła Łąkowa' ? 'Szkoła; Łąkowa' : r.provider }));
    for (const chunkSize of [undefined, 1, 3, 8]) {
      const cube = await readCube(summarySource(fx('summary-semicolon.csv'), { population: 'Population' }), [], 'x.csv', chunkSize === undefined ? {} : { chunkSize });
      expect(cellsAsRows(cube)).toEqual(expected);
      expect(cube.cells.map((c) => c.firstRow)).toEqual(summary.map((_, i) => i + 2));
    }
  });

  it('derives approximate counts from a percent column written as 72%, 64 or 72.4', async () => {
    const cube = await readCube(summarySource(fx('percent.csv'), { agree: undefined, agreePercent: '% agree' }), [], 'percent.csv');
    // Worked by hand: round(72% × 50) = 36, round(64% × 50) = 32, round(72.4% × 37) = round(26.788) = 27,
    // 0% × 37 = 0, 100% × 120 = 120.
    expect(cube.cells.map((c) => [c.dims['Department'], c.dims['Question'], c.n, c.agree])).toEqual([
      ['Hanes', 'Q01', 50, 36],
      ['Hanes', 'Q02', 50, 32],
      ['Cerddoriaeth', 'Q01', 37, 27],
      ['Cerddoriaeth', 'Q02', 37, 0],
      ['Mathemateg', 'Q01', 120, 120],
    ]);
    expect(cube.cells.every((c) => c.approximate)).toBe(true);
    expect(cube.approximate).toBe(true);
    expect(cube.notes?.join(' ')).toMatch(/approximate/);
    expect(cube.notes?.join(' ')).not.toMatch(/fractions/);
  });

  it('reads a percent column of fractions as fractions and says so', async () => {
    const cube = await readCube(summarySource(fx('fractions.xlsx'), { agree: undefined, agreePercent: 'Agree share' }), [], 'fractions.xlsx');
    // Worked by hand: 0.72 × 50 = 36, 0.55 × 37 = 20.35 -> 20, 1 × 120 = 120.
    expect(cube.cells.map((c) => [c.dims['Department'], c.n, c.agree])).toEqual([
      ['Hanes', 50, 36],
      ['Cerddoriaeth', 37, 20],
      ['Mathemateg', 120, 120],
    ]);
    expect(cube.notes?.[0]).toMatch(/"Agree share".*fractions/);
  });

  it('skips blank rows, accepts thousands separators, and counts only data rows', async () => {
    const path = csv('blank.csv', 'Group,Respondents,Agreeing\n\nA,"1,204",600\n,,\nB,30,0\n');
    const cube = await readCube(summarySource(path), ['Group'], 'blank.csv');
    expect(cube.rows).toBe(2);
    expect(cube.cells.map((c) => [c.dims['Group'], c.n, c.agree, c.firstRow])).toEqual([
      ['A', 1204, 600, 3],
      ['B', 30, 0, 5],
    ]);
  });
});

describe('readCube, respondent-level sources', () => {
  interface Person {
    id: string;
    department: string;
    campus: string;
    year: string;
    [q: string]: string;
  }
  const people = JSON.parse(readFileSync(fx('respondents.rows.json'), 'utf8')) as Person[];

  /** Plain loop over the generated rows: the base leaves out blanks and code 9; agree is code 4 or 5. */
  function tally(dim: (p: Person) => string[]): Map<string, { n: number; agree: number }> {
    const out = new Map<string, { n: number; agree: number }>();
    for (const p of people) {
      for (const q of ['Q01', 'Q02', 'Q03', 'Q04', 'Q05']) {
        const a = p[q];
        if (a === '' || a === '9') continue;
        const key = JSON.stringify([...dim(p), q]);
        const t = out.get(key) ?? { n: 0, agree: 0 };
        t.n += 1;
        if (a === '4' || a === '5') t.agree += 1;
        out.set(key, t);
      }
    }
    return out;
  }

  function asMap(cube: Cube, dims: string[]): Map<string, { n: number; agree: number }> {
    const out = new Map<string, { n: number; agree: number }>();
    for (const c of cube.cells) out.set(JSON.stringify([...dims.map((d) => c.dims[d]), c.dims['question']]), { n: c.n, agree: c.agree });
    return out;
  }

  it('aggregates respondents.csv by department and campus like a plain tally', async () => {
    for (const chunkSize of [undefined, 7]) {
      const cube = await readCube(respondentsSource(fx('respondents.csv')), ['Department', 'Campus', 'question'], 'r.csv', chunkSize === undefined ? {} : { chunkSize });
      expect(cube.rows).toBe(people.length);
      expect(cube.dimensions).toEqual(['Department', 'Campus', 'question']);
      const expected = tally((p) => [p.department, p.campus]);
      expect(asMap(cube, ['Department', 'Campus'])).toEqual(expected);
      expect(cube.values['question']).toEqual(['Q01', 'Q02', 'Q03', 'Q04', 'Q05']);
    }
  });

  it('aggregates respondents.xlsx by year (numbers read as text) like a plain tally', async () => {
    const cube = await readCube(respondentsSource(fx('respondents.xlsx')), ['Year'], 'r.xlsx');
    expect(asMap(cube, ['Year'])).toEqual(tally((p) => [p.year]));
    expect(cube.sheet).toBe('Responses');
  });

  it('names row, column and value for an answer code out of range or not a number', async () => {
    const path = csv('codes.csv', 'ID,Dept,Q01,Q02\n1,A,4,5\n2,A,7,x\n3,A,9,\n');
    const e = await failure(readCube(respondentsSource(path, { questions: ['Q01', 'Q02'] }), ['Dept'], 'codes.csv'));
    expect(e.problems).toHaveLength(2);
    expect(e.problems[0]).toMatchObject({ file: 'codes.csv', row: 3, field: 'Q01', found: '7' });
    expect(e.problems[1]).toMatchObject({ row: 3, field: 'Q02', found: 'x' });
    expect(e.message).toContain('codes.csv, row 3: An answer code is outside 1 to 5 (field "Q01", found "7")');
  });

  it('refuses a question column name that is already a real column, and an unknown dimension', async () => {
    const path = csv('qcol.csv', 'ID,question,Q01\n1,x,4\n');
    const e = await failure(readCube(respondentsSource(path, { questions: ['Q01'] }), [], 'qcol.csv'));
    expect(e.problems[0]).toMatchObject({ row: 1, field: 'question_column', found: 'question' });
    const e2 = await failure(readCube(respondentsSource(fx('respondents.csv')), ['Departmnt'], 'r.csv'));
    expect(e2.problems[0]).toMatchObject({ row: 1, field: 'Departmnt', found: 'Departmnt' });
    expect(e2.message).toContain('Did you mean "Department"?');
  });
});

describe('readCube errors name the file, row, field and value', () => {
  const cases: Array<[string, string, Partial<CubeSource>, Record<string, unknown>, RegExp]> = [
    ['text in a count', 'G,Respondents,Agreeing\nA,10,5\nB,ten,3\n', {}, { row: 3, field: 'Respondents', found: 'ten' }, /not a number/],
    ['hexadecimal count', 'G,Respondents,Agreeing\nA,0x10,5\n', {}, { row: 2, field: 'Respondents', found: '0x10' }, /not a number/],
    ['negative count', 'G,Respondents,Agreeing\nA,10,-5\n', {}, { row: 2, field: 'Agreeing', found: '-5' }, /negative/],
    ['fractional count', 'G,Respondents,Agreeing\nA,10.5,5\n', {}, { row: 2, field: 'Respondents', found: '10.5' }, /whole number/],
    ['agree above respondents', 'G,Respondents,Agreeing\nA,10,11\n', {}, { row: 2, field: 'Agreeing', found: '11' }, /More people agreed/],
    ['group with no counts', 'G,Respondents,Agreeing\nA,10,5\nB,,\n', {}, { row: 3, field: 'Respondents', found: '' }, /no counts/],
    ['one count blank', 'G,Respondents,Agreeing\nA,,5\n', {}, { row: 2, field: 'Respondents', found: '' }, /blank/],
    ['duplicate group', 'G,Y,Respondents,Agreeing\nA,1,10,5\nB,1,10,5\nA,1,12,6\n', {}, { row: 4, field: 'G, Y', found: 'G = A, Y = 1' }, /repeats the group of row 2/],
    ['percent above 100', 'G,Respondents,Pct\nA,10,120%\n', { agree: undefined, agreePercent: 'Pct' }, { row: 2, field: 'Pct', found: '120%' }, /outside 0 to 100/],
    ['respondents above population', 'G,Respondents,Agreeing,Pop\nA,10,5,8\n', { population: 'Pop' }, { row: 2, field: 'Pop', found: '8' }, /eligible/],
    ['missing column', 'G,Respondants,Agreeing\nA,10,5\n', {}, { row: 1, field: 'respondents', found: 'Respondents' }, /Did you mean "Respondants"\? The columns found are "G", "Respondants", "Agreeing"/],
    ['duplicate header', 'G,G,Respondents,Agreeing\nA,B,10,5\n', {}, { row: 1, field: 'G' }, /same name/],
    ['header only', 'G,Respondents,Agreeing\n', {}, { row: 1 }, /no data rows/],
    ['blank lines only', '\n\n,,\n', {}, {}, /no rows with any text/],
  ];
  for (const [what, text, extra, problem, message] of cases) {
    it(what, async () => {
      const path = csv(`${what.replace(/ /g, '-')}.csv`, text);
      const e = await failure(readCube(summarySource(path, extra), [], 'in.csv'));
      expect(e.problems[0]).toMatchObject({ file: 'in.csv', ...problem });
      expect(e.message).toMatch(message);
      expect(e.message).toMatch(/Fix: /);
    });
  }

  it('reports every bad row at once', async () => {
    const path = csv('many.csv', 'G,Respondents,Agreeing\nA,xy,1\nB,2,3\nC,4,y\n');
    const e = await failure(readCube(summarySource(path), [], 'many.csv'));
    expect(e.problems.map((p) => p.row)).toEqual([2, 3, 4]);
  });

  it('empty files, 0-byte workbooks and files that are not workbooks', async () => {
    const empty = await failure(readCube(summarySource(fx('empty.csv')), [], 'empty.csv'));
    expect(empty.message).toMatch(/^empty\.csv: The file is empty/);
    const headerOnly = await failure(readCube(summarySource(fx('header-only.csv')), [], 'h.csv'));
    expect(headerOnly.problems[0]).toMatchObject({ row: 1 });
    const zeroXlsx = csv('zero.xlsx', '');
    const z = await failure(readCube(summarySource(zeroXlsx), [], 'zero.xlsx'));
    expect(z.message).toMatch(/not an XLSX workbook/);
    const notZip = await failure(readCube(summarySource(fx('not-a-zip.xlsx')), [], 'n.xlsx'));
    expect(notZip.message).toMatch(/^n\.xlsx: The file is not an XLSX workbook/);
  });

  it('a formula with no cached value names sheet, row and cell', async () => {
    const e = await failure(readCube(summarySource(fx('formula-no-cache.xlsx')), [], 'f.xlsx'));
    expect(e.message).toContain('f.xlsx, sheet "Results", row 3: A formula cell has no saved result');
    expect(e.problems[0]?.field).toBe('cell C3');
  });

  it('a claim column the summary file does not have', async () => {
    const e = await failure(readCube(summarySource(fx('summary.xlsx')), ['Provder'], 's.xlsx'));
    expect(e.problems[0]).toMatchObject({ sheet: 'Results', row: 3, field: 'Provder' });
    expect(e.message).toContain('Did you mean "Provider"?');
  });

  it('a title line above the header: the semicolon delimiter is still found, and the title (one cell of text) is passed over', async () => {
    const path = csv('title.csv', 'Results 2026\r\n\r\nG;Respondents;Agreeing\r\nA;10;5\r\n');
    const found = await readCube(summarySource(path), ['G'], 'title.csv');
    expect(found.cells.map((c) => [c.dims['G'], c.n, c.agree, c.firstRow])).toEqual([['A', 10, 5, 4]]);
    const cube = await readCube({ ...summarySource(path), headerRow: 3 }, ['G'], 'title.csv');
    expect(cube.cells.map((c) => [c.dims['G'], c.n, c.agree, c.firstRow])).toEqual([['A', 10, 5, 4]]);
  });

  it('a header row named explicitly', async () => {
    const path = csv('titled.csv', 'Results 2026\n\nG,Respondents,Agreeing\nA,10,5\n');
    const cube = await readCube({ ...summarySource(path), headerRow: 3 }, [], 't.csv');
    expect(cube.cells.map((c) => [c.dims['G'], c.n, c.agree, c.firstRow])).toEqual([['A', 10, 5, 4]]);
    const e = await failure(readCube({ ...summarySource(path), headerRow: 2 }, [], 't.csv'));
    expect(e.problems[0]).toMatchObject({ row: 2, field: 'header_row' });
  });
});
