import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { CubeSource } from '../../src/data/cube.js';

/** A function writing each text it is given to a new file in a fresh temporary folder, returning the file's path. */
export function tempFiles(prefix: string): (text: string) => string {
  const dir = mkdtempSync(join(tmpdir(), prefix));
  let counter = 0;
  return (text: string): string => {
    const path = join(dir, `f${counter++}.csv`);
    writeFileSync(path, text);
    return path;
  };
}

/** Source specs as the claims reader would normalize them, for the fixtures in tests/fixtures/data. */
export function summarySource(path: string, extra: Partial<CubeSource> = {}): CubeSource {
  return {
    id: 'results',
    path,
    file: path.split('/').pop()!,
    format: path.endsWith('.xlsx') ? 'xlsx' : 'csv',
    shape: 'summary',
    respondents: 'Respondents',
    agree: 'Agreeing',
    questionColumn: 'question',
    agreeCodes: [4, 5],
    notApplicableCodes: [],
    place: { line: 1, column: 1 },
    ...extra,
  };
}

export function respondentsSource(path: string, extra: Partial<CubeSource> = {}): CubeSource {
  return summarySource(path, {
    shape: 'respondents',
    respondents: undefined,
    agree: undefined,
    questions: ['Q01', 'Q02', 'Q03', 'Q04', 'Q05'],
    notApplicableCodes: [9],
    ...extra,
  });
}

