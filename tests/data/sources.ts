import type { CubeSource } from '../../src/data/cube.js';

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

