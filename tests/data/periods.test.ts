// Period order and relative period words, checked on measures.csv (periods 2024, 2025, 2026, written by
// make-measures.mjs) and on hand-made cubes whose order is stated in the test. The ordering of "2024-25" and
// "Wave 9"/"Wave 10" follows numeric collation (Unicode Technical Standard #10 with numeric ordering; common practice).
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { readCube } from '../../src/data/cube.js';
import { lastPeriods, periodsBack, periodsOf, resolvePeriod } from '../../src/data/periods.js';
import type { Cube } from '../../src/data/types.js';
import { InputError } from '../../src/errors.js';
import { summarySource } from './sources.js';

const fx = (name: string) => join(import.meta.dirname, '../fixtures/data', name);

const cubeWith = (values: string[]): Cube => ({
  sourceId: 's',
  file: 'p.csv',
  sha256: '',
  rows: values.length,
  dimensions: ['Period'],
  cells: [],
  values: { Period: values },
  approximate: false,
  hasPopulation: false,
});

function thrown(f: () => unknown): InputError {
  try {
    f();
  } catch (e) {
    expect(e).toBeInstanceOf(InputError);
    return e as InputError;
  }
  throw new Error('expected an InputError');
}

describe('periods', () => {
  it('resolves latest, previous and latest-N from the data', async () => {
    const cube = await readCube(summarySource(fx('measures.csv'), { period: 'Year' }), ['Year'], 'm.csv');
    expect(periodsOf(cube, 'Year')).toEqual(['2024', '2025', '2026']);
    expect(resolvePeriod(cube, 'Year', 'latest')).toBe('2026');
    expect(resolvePeriod(cube, 'Year', 'previous')).toBe('2025');
    expect(resolvePeriod(cube, 'Year', 'latest-2')).toBe('2024');
    expect(resolvePeriod(cube, 'Year', 2025)).toBe('2025');
    expect(lastPeriods(cube, 'Year', 2)).toEqual(['2025', '2026']);
    const e = thrown(() => resolvePeriod(cube, 'Year', 'latest-3'));
    expect(e.message).toContain('measures.csv: The data have 3 periods in "Year", so "latest-3" names none');
    const e2 = thrown(() => resolvePeriod(cube, 'Year', 2027));
    expect(e2.problems[0]).toMatchObject({ field: 'Year', found: '2027' });
    expect(thrown(() => lastPeriods(cube, 'Year', 4)).message).toMatch(/last 4 periods but the data have 3/);
  });

  it('orders numbers as numbers and text with numeric runs', () => {
    expect(periodsOf(cubeWith(['2026', '998', '2025']), 'Period')).toEqual(['998', '2025', '2026']);
    expect(periodsOf(cubeWith(['2025-26', '2023-24', '2024-25']), 'Period')).toEqual(['2023-24', '2024-25', '2025-26']);
    expect(periodsOf(cubeWith(['Wave 10', 'Wave 9', 'Wave 11']), 'Period')).toEqual(['Wave 9', 'Wave 10', 'Wave 11']);
    expect(periodsBack(' Latest - 4 ')).toBe(4);
    expect(periodsBack('lately')).toBeUndefined();
    expect(periodsBack(2026)).toBeUndefined();
  });
});
