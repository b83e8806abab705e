/** Loads tests/fixtures/r/proportions.json, written by tests/fixtures/r/proportions.R (GNU R 4.2). */
import { readFileSync } from 'node:fs';

export type Row = Record<string, number | string | boolean | null>;
export interface ProportionsFixture {
  r_version: string;
  one_sample: Row[];
  binom: Row[];
  wilson: Row[];
  two_sample: Row[];
  newcombe: Row[];
  fisher: Row[];
  power: Row[];
  detectable: Row[];
  cohens_h: Row[];
  tost: Row[];
}

export const fixture: ProportionsFixture = JSON.parse(
  readFileSync(new URL('../fixtures/r/proportions.json', import.meta.url), 'utf8'),
) as ProportionsFixture;

export function num(row: Row, key: string): number {
  const v = row[key];
  if (typeof v !== 'number') throw new Error(`fixture row has no number "${key}": ${JSON.stringify(row)}`);
  return v;
}

export function optNum(row: Row, key: string): number | undefined {
  const v = row[key];
  return v === null || v === undefined ? undefined : (v as number);
}

export function describeRow(row: Row): string {
  return Object.entries(row)
    .filter(([, v]) => typeof v !== 'number' || Number.isInteger(v) || String(v).length < 8)
    .map(([k, v]) => `${k}=${String(v)}`)
    .join(' ');
}
