/**
 * results.json: every claim's numbers and verdict in a machine-readable form, described by
 * schema/results.schema.json. It holds no clock time, so the same claims and data give the same bytes.
 */
import type { Analysis, RateSummary } from '../analyse/types.js';
import type { ClaimsFile } from '../claims/types.js';
import type { Cube } from '../data/types.js';
import type { ClaimSection } from '../render/model.js';
import type { Interval, TestResult } from '../stats/result.js';
import type { Decision } from '../verdicts/decide.js';

export const RESULTS_FORMAT = 1;

export interface SelectionResult {
  label: string;
  n: number;
  agree: number;
  rate: number;
  interval: Interval;
  population?: number;
  approximate: boolean;
}

export interface ClaimResult {
  id: string;
  statement: string;
  kind: string;
  method: string | null;
  methods: string[];
  hypotheses: { null: string; alternative: string };
  confidence: number;
  sided: 'two-sided' | 'one-sided';
  expect: string;
  verdict: string;
  verdictText: string;
  estimate: { name: string; value: number } | null;
  interval: Interval | null;
  statistic: { symbol: string; value: number } | null;
  df: number | [number, number] | null;
  p: number | null;
  pAdjusted: number | null;
  n: number[];
  /** Selections (compare) with their rates; empty when data were too few (nothing suppressed is shown). */
  selections: SelectionResult[];
  /** Units (association) with their two measures; empty when data were too few. */
  units: Array<{ unit: string; x: number; y: number; nx: number; ny: number }>;
  /** Smallest difference (proportion) or correlation detectable with 80% power. */
  detectable: number | null;
  comparedWithRest: boolean;
  cautions: string[];
}

export interface ResultsFile {
  format: number;
  tool: { name: 'warrant'; version: string };
  title: string;
  organisation: string;
  date: string;
  claimsFile: { file: string; sha256: string };
  settings: { confidence: number; adjust: string; minRespondents: number };
  sources: Array<{ id: string; file: string; shape: string; sha256: string; rows: number }>;
  claims: ClaimResult[];
}

function selection(r: RateSummary): SelectionResult {
  return {
    label: r.label,
    n: r.n,
    agree: r.agree,
    rate: r.rate,
    interval: r.interval,
    ...(r.population !== undefined ? { population: r.population } : {}),
    approximate: r.approximate,
  };
}

function testFields(test: TestResult | undefined) {
  return {
    method: test?.method ?? null,
    estimate: test ? test.estimate : null,
    statistic: test?.statistic ?? null,
    df: test?.df ?? null,
    n: test?.n ?? [],
  };
}

export function claimResult(a: Analysis, decision: Decision, section: ClaimSection): ClaimResult {
  const tested = a.status === 'tested';
  const base = {
    id: a.claim.id,
    statement: a.claim.statement,
    kind: a.kind,
    ...testFields(a.test),
    methods: a.methods,
    hypotheses: section.hypotheses,
    confidence: a.claim.confidence,
    sided: a.claim.sided,
    expect: a.claim.expect,
    verdict: decision.verdict,
    verdictText: section.verdictText,
    p: decision.p ?? null,
    pAdjusted: decision.pAdjusted ?? null,
    detectable: tested ? a.detectable ?? null : null,
    cautions: section.cautions,
  };
  if (a.kind === 'compare') {
    return {
      ...base,
      // For a comparison the interval of interest is the difference's (Newcombe), not the test's.
      interval: a.difference?.interval ?? null,
      selections: tested && a.focus && a.against ? [selection(a.focus), selection(a.against)] : [],
      units: [],
      comparedWithRest: a.relation !== 'separate',
    };
  }
  return {
    ...base,
    interval: a.test?.interval ?? null,
    selections: [],
    units: tested ? a.points.map((p) => ({ ...p })) : [],
    comparedWithRest: false,
  };
}

export function resultsFile(input: {
  version: string;
  claims: ClaimsFile;
  claimsDisplay: string;
  date: string;
  cubes: Cube[];
  results: ClaimResult[];
}): ResultsFile {
  const { claims } = input;
  return {
    format: RESULTS_FORMAT,
    tool: { name: 'warrant', version: input.version },
    title: claims.title,
    organisation: claims.organisation,
    date: input.date,
    claimsFile: { file: input.claimsDisplay, sha256: claims.sha256 },
    settings: { confidence: claims.confidence, adjust: claims.adjust, minRespondents: claims.minRespondents },
    sources: input.cubes.map((c) => {
      const spec = claims.sources.find((s) => s.id === c.sourceId);
      return { id: c.sourceId, file: c.file, shape: spec?.shape ?? 'summary', sha256: c.sha256, rows: c.rows };
    }),
    claims: input.results,
  };
}
