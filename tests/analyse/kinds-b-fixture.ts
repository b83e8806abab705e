/** Shared pieces for the kinds-b tests: the R reference fixture (tests/fixtures/r/kinds-b.R) and small hand-made cubes. */
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import type { Cell, Cube } from '../../src/data/types.js';

const path = fileURLToPath(new URL('../fixtures/r/kinds-b.json', import.meta.url));

type Num = number | null | 'Inf' | '-Inf';
export function n(v: Num): number {
  return v === null ? NaN : v === 'Inf' ? Infinity : v === '-Inf' ? -Infinity : v;
}

export interface CrosstabCase {
  name: string;
  rows: string[];
  columns: string[];
  table: number[][];
  extra_rows: Array<{ row: string; counts: number[] }>;
  statistic: number;
  df: number;
  p: number;
  stdres: number[][];
  cramers_v: number;
  min_expected: number;
  fisher_p: number | null;
}
interface TPart {
  statistic: number;
  df: number;
  p: number;
  lower: Num;
  upper: Num;
}
export interface MeansCase {
  name: string;
  codes: number[];
  focus: number[];
  against: number[];
  focus_mean: number;
  focus_sd: number;
  against_mean: number;
  against_sd: number;
  focus_ci: number[];
  against_ci: number[];
  tests: Array<{ alternative: string; welch: TPart; student: TPart; wilcox: { statistic: number; p: number } }>;
}
export interface EquivalenceCase {
  name: string;
  x1: number;
  n1: number;
  x2: number;
  n2: number;
  margin: number;
  alpha: number;
  difference: number;
  p_lower: number;
  p_upper: number;
  p: number;
  tost_lower: number;
  tost_upper: number;
  newcombe_lower: number;
  newcombe_upper: number;
}
interface Corr {
  alternative: string;
  r: number;
  statistic: number;
  df: number;
  p: number;
  lower: Num;
  upper: Num;
}
export interface AssociationCase {
  units: string[];
  nx: number[];
  ax: number[];
  ny: number[];
  ay: number[];
  nz: number[];
  az: number[];
  ycodes: number[][];
  x: number[];
  y: number[];
  z: number[];
  y_mean: number[];
  pearson: Corr[];
  spearman: Array<{ alternative: string; rho: number; p: number }>;
  partial: Corr[];
  weights: number[];
  weighted: Corr[];
  mean_pearson: Corr[];
  mean_partial: Corr[];
  fit: { intercept: number; slope: number; r_squared: number };
  partial_spearman: Array<{ alternative: string; rho: number; p: number }>;
  partial_kendall: number;
  x_residual: number[];
  y_residual: number[];
  partial_fit: { intercept: number; slope: number; slope_with_z: number; r_squared: number };
  mean_partial_slope: number;
}

export const ref = JSON.parse(readFileSync(path, 'utf8')) as {
  r_version: string;
  crosstab: CrosstabCase[];
  means: MeansCase[];
  equivalence: EquivalenceCase[];
  association: AssociationCase;
};

export function find<T extends { name: string }>(list: T[], name: string): T {
  const c = list.find((x) => x.name === name);
  if (!c) throw new Error(`no reference case "${name}"`);
  return c;
}

/** R's alternative name to ours. */
export function ourAlternative(alt: string): 'two-sided' | 'less' | 'greater' {
  return alt === 'two.sided' ? 'two-sided' : (alt as 'less' | 'greater');
}

/** A cube from cells given as dims plus counts; dimensions and values are derived. */
export function cubeOf(cells: Array<Partial<Cell> & { dims: Record<string, string>; n: number; agree: number }>): Cube {
  const full: Cell[] = cells.map((c, i) => ({ approximate: false, firstRow: i + 2, ...c }));
  const dimensions = [...new Set(full.flatMap((c) => Object.keys(c.dims)))];
  const values: Record<string, string[]> = {};
  for (const d of dimensions) values[d] = [...new Set(full.map((c) => c.dims[d]).filter((v): v is string => v !== undefined))];
  return { sourceId: 'test', file: 'test.csv', sha256: '0', rows: full.length, dimensions, cells: full, values, approximate: false, hasPopulation: false };
}

/** Counts per code 1..k as a codes record. */
export function codes(counts: number[], first = 1): Record<string, number> {
  const out: Record<string, number> = {};
  counts.forEach((c, i) => {
    out[String(first + i)] = c;
  });
  return out;
}

export const ctx = { minRespondents: 10, claimsFile: 'claims.yaml' };

export const base = {
  statement: 'A claim.',
  source: 'test',
  where: {},
  confidence: 0.95,
  confidenceWritten: '95%',
  sided: 'two-sided' as const,
  minRespondents: 10,
  place: { line: 3, column: 5 },
};
