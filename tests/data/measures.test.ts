// Answer-code counts (respondents sources), numeric columns (summary sources), `not` filters and pooling of both,
// checked against GNU R 4.2 (weighted.mean and table in tests/fixtures/data/measures.R, which writes measures.json;
// measures-semicolon.csv is read there with read.csv2, so R also checks the decimal-comma reading).
import { readFileSync, mkdtempSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { tmpdir } from 'node:os';
import { describe, expect, it } from 'vitest';
import { readCube } from '../../src/data/cube.js';
import { checkFilter, matches, pool, poolByUnit, relate } from '../../src/data/select.js';
import type { Pooled } from '../../src/data/types.js';
import { InputError } from '../../src/errors.js';
import { expectClose } from '../helpers/tolerance.js';
import { respondentsSource, summarySource } from './sources.js';

const fx = (name: string) => join(import.meta.dirname, '../fixtures/data', name);
const tmp = mkdtempSync(join(tmpdir(), 'warrant-measures-'));

interface Reference {
  r_version: string;
  numeric: Array<{ department: string; respondents: number; ratio_weight: number; ratio_mean: number | 'none'; score_mean: number | 'none' }>;
  codes: Array<{ department: string; question: string; codes: Record<string, number>; mean: number | 'none' }>;
}
const ref = JSON.parse(readFileSync(fx('measures.json'), 'utf8')) as Reference;

const numericSource = (file: string) => summarySource(fx(file), { numeric: ['Staff ratio', 'Mean score'], period: 'Year' });
const mean = (p: Pooled, col: string) => p.numeric![col]!.weightedSum / p.numeric![col]!.weight;

async function failure(p: Promise<unknown>): Promise<InputError> {
  const e = await p.then(
    () => undefined,
    (err: unknown) => err,
  );
  expect(e).toBeInstanceOf(InputError);
  return e as InputError;
}

describe('numeric columns of a summary source', () => {
  for (const file of ['measures.csv', 'measures-semicolon.csv']) {
    it(`${file}: respondent-weighted means per department equal R's weighted.mean`, async () => {
      expect(ref.r_version).toBe('4.2.2');
      const cube = await readCube(numericSource(file), ['Department', 'Year'], file);
      expect(cube.numericColumns).toEqual(['Staff ratio', 'Mean score']);
      // Numeric columns are measures, not dimensions.
      expect(cube.dimensions).toEqual(['Department', 'Year']);
      const byDept = poolByUnit(cube, {}, 'Department');
      for (const r of ref.numeric) {
        const p = byDept.get(r.department)!;
        expect(p.n).toBe(r.respondents);
        // R: sum(Respondents) over rows with a ratio (blank rows are left out of that column only).
        expect(p.numeric!['Staff ratio']!.weight).toBe(r.ratio_weight);
        expect(p.numeric!['Mean score']!.weight).toBe(r.respondents);
        if (r.ratio_mean !== 'none') expectClose(mean(p, 'Staff ratio'), r.ratio_mean, 'closed', `${r.department} ratio`);
        if (r.score_mean !== 'none') expectClose(mean(p, 'Mean score'), r.score_mean, 'closed', `${r.department} score`);
      }
    });
  }

  it('pools numeric sums for a selection and for the rest of a larger one', async () => {
    const cube = await readCube(numericSource('measures.csv'), ['Department'], 'm.csv');
    const all = pool(cube, {});
    const related = relate(cube, { Department: 'Hanes' }, {});
    expect(related.relation).toBe('focus-inside');
    const hanes = ref.numeric.find((r) => r.department === 'Hanes')!;
    const others = ref.numeric.filter((r) => r.department !== 'Hanes');
    // Rest = the whole table without Hanes: weights add up from R's per-department sums.
    expect(related.rest!.numeric!['Staff ratio']!.weight).toBe(others.reduce((s, r) => s + r.ratio_weight, 0));
    expect(related.rest!.n + related.focus.n).toBe(all.n);
    expectClose(related.rest!.numeric!['Mean score']!.weightedSum + related.focus.numeric!['Mean score']!.weightedSum, all.numeric!['Mean score']!.weightedSum, 'closed', 'sums add up');
    expectClose(mean(related.focus, 'Mean score'), hanes.score_mean as number, 'closed', 'Hanes score');
    // An empty selection still carries every numeric column, with no weight.
    expect(pool(cube, { Department: { not: cube.values['Department']! } }).numeric).toEqual({
      'Staff ratio': { weightedSum: 0, weight: 0 },
      'Mean score': { weightedSum: 0, weight: 0 },
    });
  });

  it('names the row and value of text in a numeric column, and a numeric column the file lacks', async () => {
    const path = join(tmp, 'text.csv');
    writeFileSync(path, 'Dept,Respondents,Agreeing,Ratio\nA,10,5,12.5\nB,20,5,twelve\nC,5,1,\n');
    const e = await failure(readCube(summarySource(path, { numeric: ['Ratio'] }), [], 'text.csv'));
    expect(e.problems).toHaveLength(1);
    expect(e.problems[0]).toMatchObject({ file: 'text.csv', row: 3, field: 'Ratio', found: 'twelve' });
    expect(e.message).toContain('text.csv, row 3: A value in a numeric column is not a number (field "Ratio", found "twelve").');
    expect(e.message).toContain('leave the cell blank');
    const e2 = await failure(readCube(summarySource(path, { numeric: ['Ration'] }), [], 'text.csv'));
    expect(e2.problems[0]).toMatchObject({ row: 1, field: 'numeric', found: 'Ration' });
    expect(e2.message).toContain('Did you mean "Ratio"?');
    const e3 = await failure(readCube(summarySource(path, { numeric: ['Ratio'] }), ['Ratio'], 'text.csv'));
    expect(e3.message).toMatch(/holds counts, not groups/);
  });
});

describe('answer codes of a respondents source', () => {
  it("count each valid code per department and question like R's table, not-applicable left out", async () => {
    for (const chunkSize of [undefined, 5]) {
      const cube = await readCube(respondentsSource(fx('respondents.csv')), ['Department'], 'r.csv', chunkSize === undefined ? {} : { chunkSize });
      expect(cube.hasCodes).toBe(true);
      for (const r of ref.codes) {
        const p = pool(cube, { Department: r.department, question: r.question });
        expect(p.codes, `${r.department} ${r.question}`).toEqual(r.codes);
        expect(p.n).toBe(Object.values(r.codes).reduce((s, k) => s + k, 0));
        // Agreeing = codes 4 and 5 (the default agree codes).
        expect(p.agree).toBe((r.codes['4'] ?? 0) + (r.codes['5'] ?? 0));
        if (r.mean !== 'none') {
          const m = Object.entries(p.codes!).reduce((s, [c, k]) => s + Number(c) * k, 0) / p.n;
          expectClose(m, r.mean, 'closed', `${r.department} ${r.question} mean`);
        }
      }
    }
  });

  it('codes are pooled and the rest of a larger selection subtracts them', async () => {
    const cube = await readCube(respondentsSource(fx('respondents.csv')), ['Department'], 'r.csv');
    const related = relate(cube, { Department: 'Hanes', question: 'Q01' }, { question: 'Q01' });
    expect(related.relation).toBe('focus-inside');
    const expected: Record<string, number> = {};
    for (const r of ref.codes) {
      if (r.question !== 'Q01' || r.department === 'Hanes') continue;
      for (const [c, k] of Object.entries(r.codes)) expected[c] = (expected[c] ?? 0) + k;
    }
    expect(related.rest!.codes).toEqual(expected);
    // Summary sources carry no codes.
    const summary = await readCube(numericSource('measures.csv'), [], 'm.csv');
    expect(pool(summary, {}).codes).toBeUndefined();
  });
});

describe('not filters', () => {
  it('match every value but those named, on one column or with others', async () => {
    const cell = { dims: { Year: '2026', Dept: 'Hanes' }, n: 1, agree: 0, approximate: false, firstRow: 2 };
    expect(matches(cell, { Year: { not: 2025 } })).toBe(true);
    expect(matches(cell, { Year: { not: [2025, ' 2026'] } })).toBe(false);
    expect(matches(cell, { Year: { not: '2026' } })).toBe(false);
    expect(matches(cell, { Year: 2026, Dept: { not: 'Łacina' } })).toBe(true);
    // A cell without the column matches no filter on it.
    expect(matches(cell, { Region: { not: 'x' } })).toBe(false);
  });

  it('pool the complement, and a misspelt value under not is an error', async () => {
    const cube = await readCube(numericSource('measures.csv'), ['Department', 'Year'], 'm.csv');
    const notHanes = pool(cube, { Department: { not: 'Hanes' } });
    const others = ref.numeric.filter((r) => r.department !== 'Hanes');
    expect(notHanes.n).toBe(others.reduce((s, r) => s + r.respondents, 0));
    const e = (() => {
      try {
        checkFilter(cube, { Department: { not: 'Hanse' } });
      } catch (err) {
        return err;
      }
      return undefined;
    })();
    expect(e).toBeInstanceOf(InputError);
    expect((e as InputError).problems[0]).toMatchObject({ field: 'Department', found: 'Hanse' });
    expect((e as InputError).message).toContain('Did you mean "Hanes"?');
  });
});
