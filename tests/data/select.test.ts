// Selections and pooling on a cube, checked against plain loops over the rows the fixture generator wrote
// (summary.expected.json). A pooled rate is sum(agree) / sum(n) over respondents (common practice: never an average
// of the groups' percentages).
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { readCube } from '../../src/data/cube.js';
import { matches, matching, pool, poolByUnit, relate } from '../../src/data/select.js';
import fc from 'fast-check';
import type { Cube } from '../../src/data/types.js';
import { InputError } from '../../src/errors.js';
import { summarySource } from './sources.js';

const fx = (name: string) => join(import.meta.dirname, '../fixtures/data', name);

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

/** Plain loop: counts summed over the generated rows a predicate keeps. */
function tally(keep: (r: SummaryRow) => boolean) {
  let n = 0;
  let agree = 0;
  let population = 0;
  let cells = 0;
  for (const r of summary) {
    if (!keep(r)) continue;
    n += r.respondents;
    agree += r.agreeing;
    population += r.population;
    cells += 1;
  }
  return { n, agree, population, approximate: false, cells };
}

let cube: Cube;
beforeAll(async () => {
  cube = await readCube(summarySource(fx('summary.xlsx'), { population: 'Population' }), [], 'summary.xlsx');
});

const focusName = 'Łąka Academy';
const focusRegion = () => summary.find((r) => r.provider === focusName)!.region;

describe('matches', () => {
  it('compares as text, and a list means any of', () => {
    const cell = { dims: { Year: '2026', Provider: 'Tŷ Dysgu Cefnŷdd' }, n: 1, agree: 0, approximate: false, firstRow: 2 };
    expect(matches(cell, { Year: 2026 })).toBe(true);
    expect(matches(cell, { Year: '2026', Provider: 'Tŷ Dysgu Cefnŷdd' })).toBe(true);
    expect(matches(cell, { Year: [2024, 2025] })).toBe(false);
    expect(matches(cell, { Year: [2025, ' 2026 '] })).toBe(true);
    expect(matches(cell, { Region: 'x' })).toBe(false);
    expect(matches(cell, {})).toBe(true);
  });
});

describe('matching', () => {
  it('finds through its index exactly the cells a scan with matches finds, in the same order', () => {
    const dims = cube.dimensions;
    const valueOf = (col: string) => fc.constantFrom(...(cube.values[col] ?? []), 'no such value');
    const filter = fc.dictionary(fc.constantFrom(...dims), fc.constant(0)).chain((cols) =>
      fc.record(
        Object.fromEntries(
          Object.keys(cols).map((col) => [
            col,
            fc.oneof(valueOf(col), fc.array(valueOf(col), { maxLength: 3 }), fc.record({ not: fc.oneof(valueOf(col), fc.array(valueOf(col), { maxLength: 2 })) })),
          ]),
        ),
      ),
    );
    fc.assert(
      fc.property(filter, (f) => {
        expect(matching(cube, f)).toEqual(cube.cells.filter((c) => matches(c, f)));
      }),
      { numRuns: 200 },
    );
  });

  it('finds a value written in two Unicode forms, and cells without a column, as a scan does', () => {
    // "Brithŵyr" composed (U+0175) and decomposed (w + U+0302): one value under NFC (Unicode Standard Annex #15).
    const composed = 'G\u0175yr';
    const decomposed = 'Gw\u0302yr';
    const names = [composed, 'Hanes', decomposed, 'Hanes', composed, decomposed];
    const cells = names.map((unit, i) => ({ dims: i === 3 ? { year: '2026' } : { unit, year: i % 2 === 0 ? '2025' : '2026' }, n: 10, agree: 5, approximate: false, firstRow: i + 2 }));
    const small: Cube = { ...cube, dimensions: ['unit', 'year'], cells, values: { unit: ['Hanes', composed, decomposed], year: ['2025', '2026'] } };
    const unit = fc.constantFrom(composed, decomposed, 'Hanes');
    const filter = fc.oneof(
      fc.record({ unit }),
      fc.record({ unit, year: fc.constantFrom('2025', '2026') }),
      fc.record({ unit: fc.array(unit, { minLength: 1, maxLength: 3 }) }),
      fc.record({ year: fc.constantFrom('2025', '2026'), unit: fc.record({ not: unit }) }),
    );
    fc.assert(
      fc.property(filter, (f) => {
        expect(matching(small, f)).toEqual(small.cells.filter((c) => matches(c, f)));
      }),
    );
    expect(matching(small, { unit: decomposed }).map((c) => c.firstRow)).toEqual([2, 4, 6, 7]);
  });
});

describe('pool', () => {
  it('sums respondents, agreeing and population over the matched cells', () => {
    expect(pool(cube, { Provider: focusName, Year: 2026 })).toEqual(tally((r) => r.provider === focusName && r.year === 2026));
    expect(pool(cube, { Question: ['Q01', 'Q09'] })).toEqual(tally((r) => r.question === 'Q01' || r.question === 'Q09'));
    expect(pool(cube, {})).toEqual(tally(() => true));
  });

  it('an unknown column names it and lists the known ones', () => {
    let err: unknown;
    try {
      pool(cube, { Provder: focusName });
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(InputError);
    const e = err as InputError;
    expect(e.problems[0]).toMatchObject({ file: 'summary.xlsx', field: 'Provder' });
    expect(e.message).toContain('Did you mean "Provider"? The columns found are "Provider", "Region", "Year", "Question"');
  });

  it('a value that appears nowhere in the column suggests the nearest', () => {
    expect(() => pool(cube, { Provider: 'Laka Academy' })).toThrow(/Did you mean "Łąka Academy"\?/);
    expect(() => pool(cube, { Year: [2026, 2062] })).toThrow(/found "2062"/);
  });
});

describe('poolByUnit', () => {
  it('pools each provider over the filter', () => {
    const byUnit = poolByUnit(cube, { Year: 2026, Question: 'Q09' }, 'Provider');
    const providers = [...new Set(summary.map((r) => r.provider))];
    expect([...byUnit.keys()]).toEqual(providers);
    for (const p of providers) {
      expect(byUnit.get(p)).toEqual(tally((r) => r.provider === p && r.year === 2026 && r.question === 'Q09'));
    }
  });

  it('leaves out units with no matching cell, and checks the unit column', () => {
    const byUnit = poolByUnit(cube, { Provider: focusName }, 'Region');
    expect([...byUnit.keys()]).toEqual([focusRegion()]);
    expect(() => poolByUnit(cube, {}, 'Department')).toThrow(InputError);
  });
});

describe('relate', () => {
  it('a provider inside its region: the rest of the region without the provider', () => {
    const region = focusRegion();
    const r = relate(cube, { Provider: focusName, Year: 2026 }, { Region: region, Year: 2026 });
    expect(r.relation).toBe('focus-inside');
    expect(r.focus).toEqual(tally((x) => x.provider === focusName && x.year === 2026));
    expect(r.against).toEqual(tally((x) => x.region === region && x.year === 2026));
    expect(r.rest).toEqual(tally((x) => x.region === region && x.year === 2026 && x.provider !== focusName));
  });

  it('the other way round: against inside focus', () => {
    const region = focusRegion();
    const r = relate(cube, { Region: region }, { Provider: focusName });
    expect(r.relation).toBe('against-inside');
    expect(r.rest).toEqual(tally((x) => x.region === region && x.provider !== focusName));
  });

  it('separate, same and overlapping selections', () => {
    const providers = [...new Set(summary.map((r) => r.provider))];
    const sep = relate(cube, { Provider: providers[0]! }, { Provider: providers[1]! });
    expect(sep.relation).toBe('separate');
    expect(sep.rest).toBeUndefined();
    expect(relate(cube, { Year: 2026 }, { Year: '2026' }).relation).toBe('same');
    const over = relate(cube, { Year: 2026 }, { Question: 'Q09' });
    expect(over.relation).toBe('overlap');
    expect(over.rest).toBeUndefined();
    expect(over.focus).toEqual(tally((x) => x.year === 2026));
    expect(over.against).toEqual(tally((x) => x.question === 'Q09'));
    // An empty selection shares no cell with anything.
    const empty = relate(cube, { Provider: focusName, Region: summary.find((x) => x.region !== focusRegion())!.region }, { Year: 2026 });
    expect(empty.relation).toBe('separate');
    expect(empty.focus.cells).toBe(0);
  });
});
