/**
 * Validated claims-file data (snake_case, shorthands, defaults left out) -> the normalized ClaimsFile the pipeline
 * uses. Called only after the schema and the cross-field rules have passed, so shapes are trusted here.
 */
import { extname, resolve } from 'node:path';
import { readConfidence } from './confidence.js';
import { DATA_EXTENSIONS, DEFAULT_AGREE_CODES } from './rules.js';
import type { AssociationClaim, Claim, ClaimsFile, CompareClaim, Filter, Place, SourceSpec } from './types.js';
import { locate, type ParsedYaml } from './yaml.js';

/** Defaults, in one place. */
export const DEFAULTS = {
  confidence: 0.95,
  confidenceWritten: 'default',
  adjust: 'holm',
  minRespondents: 10,
  questionColumn: 'question',
  agreeCodes: DEFAULT_AGREE_CODES,
  notApplicableCodes: [] as number[],
  sided: 'two-sided',
} as const;

type Rec = Record<string, unknown>;

export function normalize(parsed: ParsedYaml, absPath: string, sha256: string): ClaimsFile {
  const data = parsed.data as Rec;
  const claimsDir = resolve(absPath, '..');
  const placeAt = (path: Array<string | number>, prefer: 'key' | 'value'): Place => {
    const l = locate(parsed, path);
    const p = prefer === 'key' ? (l.key ?? l.value ?? l.nearest) : (l.value ?? l.key ?? l.nearest);
    return { line: p.line, column: p.column };
  };
  const confidenceOf = (raw: Rec, fallback: { value: number; written: string }): { value: number; written: string } => {
    if (!('confidence' in raw)) return fallback;
    const r = readConfidence(raw.confidence);
    if (!r.ok) throw new Error(`confidence ${r.written} passed validation but cannot be read`);
    return { value: r.value, written: r.written };
  };
  const top = confidenceOf(data, { value: DEFAULTS.confidence, written: DEFAULTS.confidenceWritten });

  const sourcesRaw = data.sources as Record<string, Rec>;
  const sources: SourceSpec[] = Object.entries(sourcesRaw).map(([id, s]) => {
    const file = s.file as string;
    const spec: SourceSpec = {
      id,
      path: resolve(claimsDir, file),
      file,
      format: DATA_EXTENSIONS[extname(file).toLowerCase()]!,
      shape: s.shape as SourceSpec['shape'],
      questionColumn: (s.question_column as string | undefined) ?? DEFAULTS.questionColumn,
      agreeCodes: [...((s.agree_codes as number[] | undefined) ?? DEFAULTS.agreeCodes)],
      notApplicableCodes: [...((s.not_applicable as number[] | undefined) ?? DEFAULTS.notApplicableCodes)],
      place: placeAt(['sources', id], 'key'),
    };
    if (typeof s.sheet === 'string') spec.sheet = s.sheet;
    if (typeof s.respondents === 'string') spec.respondents = s.respondents;
    if (typeof s.agree === 'string') spec.agree = s.agree;
    if (typeof s.agree_percent === 'string') spec.agreePercent = s.agree_percent;
    if (typeof s.population === 'string') spec.population = s.population;
    if (Array.isArray(s.questions)) spec.questions = [...(s.questions as string[])];
    return spec;
  });

  const onlySource = sources.length === 1 ? sources[0]!.id : undefined;
  const claims: Claim[] = (data.claims as Rec[]).map((c, i) => {
    const conf = confidenceOf(c, top);
    const base = {
      id: c.id as string,
      statement: (c.claim as string).trim(),
      source: (c.source as string | undefined) ?? onlySource!,
      where: copyFilter(c.where as Filter | undefined),
      confidence: conf.value,
      confidenceWritten: conf.written,
      sided: ((c.test as string | undefined) ?? DEFAULTS.sided) as Claim['sided'],
      minRespondents: (c.min_respondents as number | undefined) ?? (data.min_respondents as number | undefined) ?? DEFAULTS.minRespondents,
      place: placeAt(['claims', i], 'value'),
    };
    if (c.kind === 'compare') {
      const claim: CompareClaim = {
        ...base,
        kind: 'compare',
        focus: copyFilter(c.focus as Filter),
        against: copyFilter(c.against as Filter),
        expect: c.expect as CompareClaim['expect'],
      };
      if (typeof c.focus_label === 'string') claim.focusLabel = c.focus_label;
      if (typeof c.against_label === 'string') claim.againstLabel = c.against_label;
      return claim;
    }
    const claim: AssociationClaim = {
      ...base,
      kind: 'association',
      units: c.units as string,
      x: copyFilter(c.x as Filter),
      y: copyFilter(c.y as Filter),
      xMeasure: { type: 'agree' },
      yMeasure: { type: 'agree' },
      controls: [],
      weighted: false,
      expect: c.expect as AssociationClaim['expect'],
    };
    if (typeof c.x_label === 'string') claim.xLabel = c.x_label;
    if (typeof c.y_label === 'string') claim.yLabel = c.y_label;
    return claim;
  });

  const out: ClaimsFile = {
    path: absPath,
    sha256,
    title: (data.title as string).trim(),
    organisation: (data.organisation as string).trim(),
    confidence: top.value,
    confidenceWritten: top.written,
    adjust: ((data.adjust as string | undefined) ?? DEFAULTS.adjust) as ClaimsFile['adjust'],
    minRespondents: (data.min_respondents as number | undefined) ?? DEFAULTS.minRespondents,
    sources,
    claims,
  };
  if (typeof data.description === 'string') out.description = data.description.trim();
  if (data.data_date !== undefined) out.dataDate = String(data.data_date);
  return out;
}

function copyFilter(f: Filter | undefined): Filter {
  const out: Filter = {};
  for (const [k, v] of Object.entries(f ?? {})) out[k] = Array.isArray(v) ? [...v] : v;
  return out;
}
