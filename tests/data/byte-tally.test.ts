// Respondent tallies taken straight from a CSV file's bytes (the plain-line path of readCube) against the same table
// with every field quoted, which papaparse (an outside parser) splits into rows that are tallied row by row: the same
// cube, or the same InputError, whatever the chunk size. The tables mix multi-byte and padded group names, blank and
// whitespace-only lines (also non-ASCII spaces), short and long lines, carriage returns inside fields, codes that are
// not applicable, out of range, padded or not numbers at all.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { readCube } from '../../src/data/cube.js';
import { respondentsSource, tempFiles } from './sources.js';

const file = tempFiles('warrant-byte-tally-');

async function outcome(path: string, chunkSize: number): Promise<unknown> {
  const src = respondentsSource(path, { questions: ['Q1', 'Q2'], notApplicableCodes: [0, 9] });
  try {
    const cube = await readCube(src, ['Dept', 'Site'], 'r.csv', { chunkSize });
    return { rows: cube.rows, cells: cube.cells, values: cube.values };
  } catch (e) {
    return { error: (e as Error).message };
  }
}

describe('respondent tallies from the bytes', () => {
  // 'Aa' and 'BB' have the same 31-multiplier hash of their bytes: told apart by the bytes themselves.
  const group = fc.constantFrom('Łąka', ' Łąka', 'Brithŵyr ', 'Hanes', '', '\u00a0', 'a\rb', 'Département', 'Aa', 'BB');
  const answer = fc.constantFrom('1', '2', '3', '4', '5', '9', '0', '', ' 3', '7', 'x', '4.0', '12', '\u3000', '5 ');
  const note = fc.constantFrom('', 'x', '\u00a0', ' ', 'ŵ');
  const line = fc.oneof(
    { weight: 8, arbitrary: fc.tuple(fc.nat(99), group, answer, note, answer, group).map((t) => t.map(String)) },
    { weight: 1, arbitrary: fc.constantFrom([''], ['  '], ['\u00a0'], ['', '', '', '', '', ''], [' ', '', '\u3000', '', '', '']) },
    // Text only in a column left out, or only non-ASCII spaces: a row, or a blank line.
    { weight: 1, arbitrary: fc.tuple(fc.constantFrom('', ' '), note, fc.constantFrom('', '\u3000')).map(([a, n, b]) => [a, '', '', n, b, '']) },
    { weight: 1, arbitrary: fc.tuple(fc.nat(99), group, answer).map((t) => t.map(String)) },
    { weight: 1, arbitrary: fc.tuple(fc.nat(99), group, answer, note, answer, group, note).map((t) => t.map(String)) },
  );

  it('equal the tallies of the quoted table read by papaparse, at every chunk size', async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.array(line, { minLength: 1, maxLength: 60 }),
        fc.constantFrom(',', ';'),
        fc.constantFrom('\n', '\r\n'),
        fc.integer({ min: 1, max: 200 }),
        async (table, d, nl, chunkSize) => {
          const header = ['ID', 'Dept', 'Q1', 'Note', 'Q2', 'Site'].join(d);
          const plain = file([header, ...table.map((r) => r.join(d))].join(nl) + nl);
          const quoted = file([header, ...table.map((r) => r.map((v) => `"${v}"`).join(d))].join(nl) + nl);
          expect(await outcome(plain, chunkSize)).toEqual(await outcome(quoted, chunkSize));
          expect(await outcome(plain, 1 << 16)).toEqual(await outcome(quoted, 1 << 16));
        },
      ),
      { numRuns: 150 },
    );
  });

  it('keep thousands of groups apart (the group table grows as it fills)', async () => {
    // Reference: the generated table tallied here by a plain loop over its values.
    const lines = ['ID,Dept,Q1,Note,Q2,Site'];
    const expected = new Map<string, number>();
    for (let i = 0; i < 12000; i++) {
      const dept = `Unit ${(i * 7919) % 3001}`;
      const code = (i % 5) + 1;
      lines.push(`${i},${dept},${code},,,North`);
      expected.set(dept, (expected.get(dept) ?? 0) + (code >= 4 ? 1 : 0));
    }
    const path = file(lines.join('\n') + '\n');
    const src = respondentsSource(path, { questions: ['Q1', 'Q2'], notApplicableCodes: [9] });
    const cube = await readCube(src, ['Dept', 'Site'], 'r.csv');
    const q1 = cube.cells.filter((c) => c.dims['question'] === 'Q1');
    expect(q1.length).toBe(3001);
    for (const cell of q1) expect(cell.agree).toBe(expected.get(cell.dims['Dept']!));
    expect(q1.reduce((s, c) => s + c.n, 0)).toBe(12000);
  });

  it('count the answers of a clean table as a plain tally of the table does', async () => {
    // Reference: the generated table tallied here by plain loops over its values.
    // 'Aa' and 'BB' have the same 31-multiplier hash of their bytes.
    const depts = ['Łąka', 'Brithŵyr', 'Aa', 'BB'];
    const lines = ['ID,Dept,Q1,Note,Q2,Site'];
    const expected = new Map<string, number[]>();
    for (let i = 0; i < 5000; i++) {
      const dept = depts[(i * 7) % 4]!;
      const site = i % 3 === 0 ? 'North' : 'South';
      const a = [(i % 5) + 1, ((i * 3) % 6) + 1];
      lines.push(`${i},${dept},${a[0]},,${a[1] === 6 ? 9 : a[1]},${site}`);
      a.forEach((code, k) => {
        if (code === 6) return;
        const key = `${dept}|${site}|Q${k + 1}`;
        const t = expected.get(key) ?? [0, 0, 0, 0, 0, 0];
        t[code]! += 1;
        expected.set(key, t);
      });
    }
    const path = file(lines.join('\n') + '\n');
    for (const chunkSize of [5, 333, 1 << 16]) {
      const src = respondentsSource(path, { questions: ['Q1', 'Q2'], notApplicableCodes: [9] });
      const cube = await readCube(src, ['Dept', 'Site'], 'r.csv', { chunkSize });
      expect(cube.rows).toBe(5000);
      expect(cube.cells.length).toBe(expected.size);
      for (const cell of cube.cells) {
        const t = expected.get(`${cell.dims['Dept']}|${cell.dims['Site']}|${cell.dims['question']}`)!;
        const codes: Record<string, number> = {};
        t.forEach((k, c) => {
          if (k > 0) codes[String(c)] = k;
        });
        expect(cell.codes).toEqual(codes);
        expect(cell.n).toBe(t.reduce((s, k) => s + k, 0));
        expect(cell.agree).toBe(t[4]! + t[5]!);
      }
    }
  });
});
