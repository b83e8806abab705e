// Respondent files with quoted values (group names holding the delimiter, doubled quotes, line breaks inside quotes),
// CRLF or LF, a byte-order mark, blank answers and bad rows: tallied from the bytes by readCube, against the same file
// with a last column on every data line that only papaparse (an outside parser) can split (an unquoted value holding
// a quote), so that every row there is split by papaparse and tallied row by row. The same cube or the same
// InputError, whatever the chunk size.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { readCube } from '../../src/data/cube.js';
import { respondentsSource, tempFiles } from './sources.js';

const file = tempFiles('warrant-quoted-tally-');

async function outcome(path: string, chunkSize: number): Promise<unknown> {
  const src = respondentsSource(path, { questions: ['q1', 'q2', 'q3'], notApplicableCodes: [9], period: 'year' });
  try {
    const cube = await readCube(src, ['unit', 'year'], 'r.csv', { chunkSize });
    return { rows: cube.rows, cells: cube.cells, values: cube.values };
  } catch (e) {
    return { error: (e as Error).message };
  }
}

/** A value as written in the file: plain, or quoted with its quotes doubled. */
const written = (v: string, quote: boolean): string => (quote || /[",\r\n]/.test(v) ? `"${v.replace(/"/g, '""')}"` : v);

describe('quoted respondent lines tallied from the bytes', () => {
  const unit = fc.constantFrom('Farrowdale 1', 'Llyn Naïf, Tŷ Ŵern 2', 'Łąkowo, Cwm-ŷd 3', 'Say "hi" 4', 'Two\nlines 5', ' Padded ', '', 'Aa', 'BB');
  const year = fc.constantFrom('2025', '2026', ' 2026');
  const answer = fc.constantFrom('1', '2', '3', '4', '5', '5', '4', '', '', '9', ' 3', '7', 'x');
  const line = fc.oneof(
    { weight: 12, arbitrary: fc.tuple(unit, fc.boolean(), year, answer, answer, answer, fc.boolean()) },
    { weight: 1, arbitrary: fc.constant('blank' as const) },
  );

  it('equal the rows split by papaparse, at every chunk size', async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.array(line, { minLength: 1, maxLength: 50 }),
        fc.constantFrom('\n', '\r\n'),
        fc.boolean(),
        fc.integer({ min: 7, max: 300 }),
        async (table, nl, bom, chunkSize) => {
          const header = 'unit,subject,year,q1,q2,q3';
          const rows = table.map((t) => {
            if (t === 'blank') return [''];
            const [u, quote, y, a1, a2, a3, quoteAnswer] = t;
            return [written(u, quote), 'Subject A', y, written(a1, quoteAnswer), a2, a3];
          });
          const start = bom ? '\ufeff' : '';
          const ours = file(start + [header, ...rows.map((r) => r.join(','))].join(nl) + nl);
          const theirs = file(start + [header, ...rows.map((r) => (r.length === 1 ? '' : [...r, 'only"papaparse'].join(',')))].join(nl) + nl);
          const reference = await outcome(theirs, 1 << 16);
          expect(await outcome(ours, chunkSize)).toEqual(reference);
          expect(await outcome(ours, 1 << 16)).toEqual(reference);
        },
      ),
      { numRuns: 150 },
    );
  });

  it('count a known table of quoted names', async () => {
    // Reference: the table's answers counted here by hand (3 lines).
    const path = file('unit,subject,year,q1,q2,q3\r\n"Tŷ, Ŵern",S,2026,4,5,\r\nPlain,S,2026,1,"2",3\r\n"Tŷ, Ŵern",S,2026,5,,9\r\n');
    const src = respondentsSource(path, { questions: ['q1', 'q2', 'q3'], notApplicableCodes: [9], period: 'year' });
    const cube = await readCube(src, ['unit', 'year'], 'r.csv');
    expect(cube.rows).toBe(3);
    const cell = (u: string, q: string) => cube.cells.find((c) => c.dims['unit'] === u && c.dims['question'] === q);
    expect(cell('Tŷ, Ŵern', 'q1')).toMatchObject({ n: 2, agree: 2, codes: { '4': 1, '5': 1 }, firstRow: 2 });
    expect(cell('Tŷ, Ŵern', 'q2')).toMatchObject({ n: 1, agree: 1, codes: { '5': 1 }, blank: 1 });
    expect(cell('Tŷ, Ŵern', 'q3')).toBeUndefined();
    expect(cell('Plain', 'q2')).toMatchObject({ n: 1, agree: 0, codes: { '2': 1 }, firstRow: 3 });
  });
});
