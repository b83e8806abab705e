// Property: random small CSV tables (random delimiter, BOM, line ends, quoting, multi-byte names, chunk size) either
// read correctly, with counts equal to a plain tally of the generated table, or fail with an InputError; never any
// other exception. Tables built only from valid values must always read.
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { readCube } from '../../src/data/cube.js';
import { InputError } from '../../src/errors.js';
import { respondentsSource, summarySource } from './sources.js';

const tmp = mkdtempSync(join(tmpdir(), 'warrant-prop-'));
let counter = 0;

const names = ['Brithŵyr', 'Tŷ', 'Łąka', 'Naïve', 'A,B', 'say "x"', 'ok', '🌱'];
const layout = fc.record({
  delimiter: fc.constantFrom(',', ';', '\t'),
  newline: fc.constantFrom('\n', '\r\n'),
  bom: fc.boolean(),
  chunkSize: fc.integer({ min: 1, max: 9 }),
});

function field(v: string, delimiter: string): string {
  return v.includes(delimiter) || v.includes('"') || v.includes('\n') || v.includes('\r') ? `"${v.replace(/"/g, '""')}"` : v;
}

function write(header: string[], rows: string[][], l: { delimiter: string; newline: string; bom: boolean }): string {
  const path = join(tmp, `t${counter++}.csv`);
  const text = [header, ...rows].map((r) => r.map((v) => field(v, l.delimiter)).join(l.delimiter)).join(l.newline) + l.newline;
  writeFileSync(path, (l.bom ? '\uFEFF' : '') + text);
  return path;
}

/** Runs the read; returns the cube, or 'input-error'. Any other exception fails the property. */
async function attempt<T>(p: Promise<T>): Promise<T | 'input-error'> {
  try {
    return await p;
  } catch (e) {
    if (e instanceof InputError) return 'input-error';
    throw e;
  }
}

describe('random CSV tables', () => {
  const countText = fc.oneof(
    fc.integer({ min: 0, max: 500 }).map(String),
    fc.constantFrom('', '-3', '2.5', 'n/a', ' 7 ', '1e2', '0x10', '∞'),
  );

  it('summary tables: an exact tally, or an InputError', async () => {
    const row = fc.tuple(fc.constantFrom(...names), fc.constantFrom('2025', '2026'), countText, countText);
    await fc.assert(
      fc.asyncProperty(fc.array(row, { maxLength: 8 }), layout, async (rows, l) => {
        const path = write(['Group', 'Year', 'Respondents', 'Agreeing'], rows, l);
        const got = await attempt(readCube(summarySource(path), [], 'p.csv', { chunkSize: l.chunkSize }));
        if (got === 'input-error') return;
        // Success: every generated row is one cell with exactly its counts; a row with the marker "n/a" in a count
        // is a suppressed cell with no counts (src/data/table.ts), never a guessed number.
        const marker = (t: string) => t.trim() === 'n/a';
        expect(got.cells.map((c) => [c.dims['Group'], c.dims['Year'], c.n, c.agree, c.suppressed === true])).toEqual(
          rows.map((r) => (marker(r[2]) || marker(r[3]) ? [r[0], r[1], 0, 0, true] : [r[0], r[1], Number(r[2]), Number(r[3]), false])),
        );
        for (const c of got.cells) expect(c.agree).toBeLessThanOrEqual(c.n);
      }),
      { numRuns: 150, seed: 20260115 },
    );
  });

  it('valid summary tables always read', async () => {
    const valid = fc
      .uniqueArray(fc.tuple(fc.constantFrom(...names), fc.constantFrom('2025', '2026')), { minLength: 1, maxLength: 8, selector: (t) => t.join('|') })
      .chain((keys) =>
        fc.tuple(fc.constant(keys), fc.array(fc.tuple(fc.nat(400), fc.double({ min: 0, max: 1, noNaN: true })), { minLength: keys.length, maxLength: keys.length })),
      );
    await fc.assert(
      fc.asyncProperty(valid, layout, async ([keys, counts], l) => {
        const rows = keys.map((k, i) => {
          const [n, share] = counts[i]!;
          return [k[0], k[1], String(n), String(Math.floor(n * share))];
        });
        const path = write(['Group', 'Year', 'Respondents', 'Agreeing'], rows, l);
        const got = await readCube(summarySource(path), ['Group'], 'p.csv', { chunkSize: l.chunkSize });
        expect(got.cells.map((c) => [c.dims['Group'], c.dims['Year'], String(c.n), String(c.agree)])).toEqual(rows);
      }),
      { numRuns: 100, seed: 115 },
    );
  });

  it('respondent tables: a tally of codes 4 and 5 over valid answers, or an InputError', async () => {
    const answer = fc.constantFrom('', '1', '2', '3', '4', '5', '9', '4', '5', '0', '6', 'x', '3.0');
    const person = fc.tuple(fc.constantFrom(...names), answer, answer);
    await fc.assert(
      fc.asyncProperty(fc.array(person, { maxLength: 12 }), layout, async (people, l) => {
        const path = write(['Unit', 'QA', 'QB'], people, l);
        const got = await attempt(
          readCube(respondentsSource(path, { questions: ['QA', 'QB'] }), ['Unit'], 'p.csv', { chunkSize: l.chunkSize }),
        );
        // Plain tally: blanks and 9 (not applicable) are left out; 1-5 count; "3.0" is the whole number 3.
        const tally = new Map<string, { n: number; agree: number }>();
        let bad = false;
        for (const [unit, ...answers] of people) {
          answers.forEach((a, k) => {
            if (a === '' || a === '9') return;
            const code = Number(a);
            if (!(code >= 1 && code <= 5 && Number.isInteger(code))) {
              bad = true;
              return;
            }
            const key = JSON.stringify([unit, k === 0 ? 'QA' : 'QB']);
            const t = tally.get(key) ?? { n: 0, agree: 0 };
            t.n += 1;
            if (code >= 4) t.agree += 1;
            tally.set(key, t);
          });
        }
        if (got === 'input-error') {
          // An error is expected exactly when some answer is invalid, or there are no data rows.
          expect(bad || people.length === 0).toBe(true);
          return;
        }
        expect(bad).toBe(false);
        const seen = new Map(got.cells.map((c) => [JSON.stringify([c.dims['Unit'], c.dims['question']]), { n: c.n, agree: c.agree }]));
        expect(seen).toEqual(tally);
      }),
      { numRuns: 150, seed: 7 },
    );
  });
});
