/**
 * Reader for the NIST Statistical Reference Datasets (StRD) .dat files in ../shared/reference/nist-strd beside the
 * repository
 * (format described in that folder's README.md): certified values are found by their labels, data rows by the line
 * range the header states.
 */
import { existsSync, readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';

/**
 * The StRD folder: shared/ lies beside the repository (in a working copy and in CI alike). A missing folder is an
 * error, not a skip: these checks must run.
 */
export const STRD_DIR = (() => {
  const candidates = [resolve(__dirname, '../../../shared/reference/nist-strd'), '/work/shared/reference/nist-strd'];
  const found = candidates.find((dir) => existsSync(dir));
  if (!found) throw new Error(`NIST StRD files not found; looked in ${candidates.join(' and ')}`);
  return found;
})();

export type Difficulty = 'lower' | 'average' | 'higher';

export interface StrdFile {
  name: string;
  /** Level stated in the header; undefined when the header has none (Michelso). */
  difficulty: Difficulty | undefined;
  lines: string[];
  /** Data rows as whitespace-separated decimal tokens. */
  rows: string[][];
}

/** A certified number as printed: 1.2E+00, 557028453333333., Infinity, 4.0 (exact). */
export function certifiedNumber(token: string): number {
  const t = token.trim();
  if (/^[+-]?Infinity$/i.test(t)) return t.startsWith('-') ? -Infinity : Infinity;
  if (!/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(t)) throw new Error(`not a certified number: "${token}"`);
  return Number(t);
}

export function readStrd(group: 'univariate' | 'linreg' | 'anova', name: string): StrdFile {
  const text = readFileSync(join(STRD_DIR, group, `${name}.dat`), 'latin1');
  const lines = text.split('\n').map((l) => l.replace(/\r$/, ''));
  const header = lines.slice(0, 60).join('\n');
  const range = /Data\s*:?\s*\(?\s*lines\s+(\d+)\s+to\s+(\d+)/.exec(header);
  if (!range) throw new Error(`${name}: no data line range in the header`);
  const first = Number(range[1]);
  const last = Number(range[2]);
  const rows = lines
    .slice(first - 1, last)
    .map((l) => l.trim())
    .filter((l) => l.length > 0)
    .map((l) => l.split(/\s+/));
  const level = /(Lower|Average|Higher) Level of Difficulty/i.exec(header);
  const difficulty = level ? (level[1]!.toLowerCase() as Difficulty) : undefined;
  return { name, difficulty, lines, rows };
}

/** Tokens of the first header line matching re (searched in lines 1-60). */
function lineTokens(f: StrdFile, re: RegExp): string[] {
  const line = f.lines.slice(0, 60).find((l) => re.test(l));
  if (line === undefined) throw new Error(`${f.name}: no line matching ${re}`);
  return line.trim().split(/\s+/);
}

export interface UnivariateCertified {
  mean: number;
  sd: number;
  r1: number;
  n: number;
}

export function univariateCertified(f: StrdFile): UnivariateCertified {
  const after = (re: RegExp): number => {
    const line = f.lines.slice(0, 60).find((l) => re.test(l));
    if (line === undefined) throw new Error(`${f.name}: no line matching ${re}`);
    const rest = line.slice(line.lastIndexOf(':') + 1).trim().split(/\s+/)[0]!;
    return certifiedNumber(rest);
  };
  return {
    mean: after(/Sample Mean/),
    sd: after(/Sample Standard Deviation/),
    r1: after(/Sample Autocorrelation Coefficient/),
    n: after(/Number of Observations/),
  };
}

export interface LinregCertified {
  parameters: { name: string; estimate: number; sd: number }[];
  residualSd: number;
  rSquared: number;
  regression: { df: number; ss: number; ms: number; f: number };
  residual: { df: number; ss: number; ms: number };
}

export function linregCertified(f: StrdFile): LinregCertified {
  const parameters = f.lines
    .slice(0, 60)
    .filter((l) => /^\s+B\d+\s/.test(l))
    .map((l) => {
      const [name, est, sd] = l.trim().split(/\s+/);
      return { name: name!, estimate: certifiedNumber(est!), sd: certifiedNumber(sd!) };
    });
  const sdTokens = lineTokens(f, /^\s+Standard Deviation\s/);
  const r2Tokens = lineTokens(f, /^\s+R-Squared\s/);
  const reg = lineTokens(f, /^Regression\s+\d/).slice(1).map(certifiedNumber);
  const res = lineTokens(f, /^Residual\s+\d/).slice(1).map(certifiedNumber);
  return {
    parameters,
    regression: { df: reg[0]!, ss: reg[1]!, ms: reg[2]!, f: reg[3]! },
    residual: { df: res[0]!, ss: res[1]!, ms: res[2]! },
    residualSd: certifiedNumber(sdTokens[sdTokens.length - 1]!),
    rSquared: certifiedNumber(r2Tokens[r2Tokens.length - 1]!),
  };
}

export interface AnovaCertified {
  between: { df: number; ss: number; ms: number; f: number };
  within: { df: number; ss: number; ms: number };
  rSquared: number;
  residualSd: number;
}

export function anovaCertified(f: StrdFile): AnovaCertified {
  const b = lineTokens(f, /^Between /).slice(2).map(certifiedNumber);
  const w = lineTokens(f, /^Within /).slice(2).map(certifiedNumber);
  const r2 = lineTokens(f, /Certified R-Squared/);
  const sd = lineTokens(f, /^\s+Standard Deviation\s/);
  return {
    between: { df: b[0]!, ss: b[1]!, ms: b[2]!, f: b[3]! },
    within: { df: w[0]!, ss: w[1]!, ms: w[2]! },
    rSquared: certifiedNumber(r2[r2.length - 1]!),
    residualSd: certifiedNumber(sd[sd.length - 1]!),
  };
}

/** A decimal token as an integer and a power-of-ten scale: "-12.50" -> { digits: -1250n, scale: 2 }. */
function parseDecimal(token: string): { digits: bigint; scale: number } {
  const m = /^([+-]?)(\d*)\.?(\d*)$/.exec(token);
  if (!m) throw new Error(`not a plain decimal: "${token}"`);
  const digits = BigInt(`${m[1]}${m[2] || '0'}${m[3]}`);
  return { digits, scale: m[3]!.length };
}

/**
 * The data less an exact decimal offset (the first value), each difference computed exactly in decimal and then
 * rounded once to double. Every certified quantity that is shift-invariant (standard deviation, autocorrelation, ANOVA
 * sums of squares) is the same for the shifted data; this keeps the constant leading digits of NumAcc3/4 and
 * SmLs04-09 from being lost when the decimal text is rounded to binary, which no algorithm could recover.
 */
export function shiftedExactly(tokens: readonly string[]): { offset: number; values: number[] } {
  const parsed = tokens.map(parseDecimal);
  const scale = Math.max(...parsed.map((p) => p.scale));
  const aligned = parsed.map((p) => p.digits * 10n ** BigInt(scale - p.scale));
  const base = aligned[0]!;
  const div = 10 ** scale;
  return { offset: Number(tokens[0]), values: aligned.map((a) => Number(a - base) / div) };
}
