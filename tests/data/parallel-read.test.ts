// A respondent CSV file read in two halves at once (the second by a worker thread, dist/data/read-worker.js, so these
// tests run against the compiled build that `npm test` makes first) gives the same cube, or the same InputError with
// the same row, as the file read in one. Files are random: quoted names holding commas, doubled quotes or line breaks
// (also across the split point), CRLF or LF, a byte-order mark, blank lines and answers, bad answers, a last line with
// no line break. The split must be taken for clean files, so that the comparison is not of one path with itself.
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { readCube as readCubeSrc } from '../../src/data/cube.js';
import type { ReadCubeOptions } from '../../src/data/cube.js';
import { respondentsSource } from './sources.js';

// The build's own module, so that the worker script resolves beside it (as in the installed package).
const built = (await import('../../dist/data/cube.js')) as { readCube: typeof readCubeSrc };

const tmp = mkdtempSync(join(tmpdir(), 'warrant-parallel-read-'));
let counter = 0;
const file = (text: string) => {
  const path = join(tmp, `f${counter++}.csv`);
  writeFileSync(path, text);
  return path;
};

async function outcome(read: typeof readCubeSrc, path: string, options: ReadCubeOptions): Promise<unknown> {
  const src = respondentsSource(path, { questions: ['q1', 'q2', 'q3'], notApplicableCodes: [9], period: 'year' });
  try {
    const cube = await read(src, ['unit', 'year'], 'r.csv', options);
    return { rows: cube.rows, cells: cube.cells, values: cube.values };
  } catch (e) {
    return { error: (e as Error).message };
  }
}

const written = (v: string, quote: boolean): string => (quote || /[",\r\n]/.test(v) ? `"${v.replace(/"/g, '""')}"` : v);

describe('a respondent file read in two halves at once', () => {
  const unit = fc.constantFrom('Farrowdale 1', 'Llyn Naïf, Tŷ Ŵern 2', 'Łąkowo, Cwm-ŷd 3', 'Ashmere 4', 'Ivelwick 5', ' Padded ', 'Aa', 'BB');
  const odd = fc.constantFrom('Say "hi" 6', 'Two\nlines 7', 'Three\r\nlines\n8');
  const year = fc.constantFrom('2025', '2026');
  const answer = fc.constantFrom('1', '2', '3', '4', '5', '5', '4', '', '', '9');
  const bad = fc.constantFrom('7', 'x', ' 3', '4.0');
  const line = (withOdd: boolean, withBad: boolean) =>
    fc.oneof(
      { weight: 20, arbitrary: fc.tuple(unit, fc.boolean(), year, answer, answer, answer) },
      { weight: withOdd ? 2 : 0, arbitrary: fc.tuple(odd, fc.constant(true), year, answer, answer, answer) },
      { weight: withBad ? 1 : 0, arbitrary: fc.tuple(unit, fc.boolean(), year, bad, answer, answer) },
      { weight: 1, arbitrary: fc.constant('blank' as const) },
    );
  const table = fc.tuple(fc.boolean(), fc.boolean()).chain(([o, b]) => fc.array(line(o, b), { minLength: 40, maxLength: 120 }));

  it('gives the cube or the error of the file read in one, and takes the second half when it is clean', async () => {
    let clean = 0;
    let taken = 0;
    await fc.assert(
      fc.asyncProperty(table, fc.constantFrom('\n', '\r\n'), fc.boolean(), fc.boolean(), fc.integer({ min: 16, max: 120 }), async (rows, nl, bom, lastBreak, chunkSize) => {
        const lines = rows.map((t) => (t === 'blank' ? '' : [written(t[0], t[1]), 'Subject A', t[2], t[3], t[4], t[5]].join(',')));
        const path = file((bom ? '\ufeff' : '') + ['unit,subject,year,q1,q2,q3', ...lines].join(nl) + (lastBreak ? nl : ''));
        const splits: boolean[] = [];
        const reference = await outcome(readCubeSrc, path, { parallelFrom: Infinity });
        expect(await outcome(built.readCube, path, { parallelFrom: 0, chunkSize, onSplit: (t) => splits.push(t) })).toEqual(reference);
        const plain = rows.every((t) => t === 'blank' || (!/["\n]/.test(t[0]) && ['', '1', '2', '3', '4', '5', '9'].includes(t[3])));
        if (plain) {
          clean += 1;
          if (splits[0] === true) taken += 1;
        }
      }),
      { numRuns: 120 },
    );
    // Clean files: the split point lies past the first pieces read (40 lines or more, pieces of 120 bytes or fewer),
    // so the worker's tally is used in all of them.
    expect(clean).toBeGreaterThan(10);
    expect(taken).toBe(clean);
  });

  it('names the earliest bad row when bad rows lie in both halves', async () => {
    const lines = Array.from({ length: 400 }, (_, i) => `Unit ${i % 7},S,2026,${i === 350 || i === 120 ? 7 : (i % 5) + 1},2,3`);
    const path = file(['unit,subject,year,q1,q2,q3', ...lines].join('\n') + '\n');
    const result = (await outcome(built.readCube, path, { parallelFrom: 0, chunkSize: 512 })) as { error: string };
    // Row numbers as a spreadsheet shows them: the header is row 1, line i of the table row i + 2.
    expect(result.error).toContain('row 122');
    expect(result.error).toContain('row 352');
    expect(result).toEqual(await outcome(readCubeSrc, path, { parallelFrom: Infinity }));
  });

  it('leaves no worker running after a read that fails in its first half', async () => {
    const lines = Array.from({ length: 4000 }, (_, i) => `Unit ${i % 7},S,2026,${i === 3 ? 'x' : (i % 5) + 1},2,3`);
    const path = file(['unit,subject,year,q1,q2,q3', ...lines].join('\n') + '\n');
    const result = (await outcome(built.readCube, path, { parallelFrom: 0, chunkSize: 256 })) as { error: string };
    expect(result.error).toContain('row 5');
    await new Promise((r) => setTimeout(r, 200));
    expect(process.getActiveResourcesInfo().filter((r) => /worker|messageport/i.test(r))).toEqual([]);
  });
});
