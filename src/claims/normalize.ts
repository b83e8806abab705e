/**
 * Validated claims-file data (snake_case, shorthands, defaults left out) -> the normalized ClaimsFile the pipeline
 * uses. Called only after the schema and the cross-field rules have passed, so shapes are trusted here.
 */
import { extname, resolve } from 'node:path';
import { readConfidence } from './confidence.js';
import { DATA_EXTENSIONS, DEFAULT_AGREE_CODES } from './rules.js';
import { readPoints, readShare, readWorth, worthMeasureOf, type AmountReading, type WorthMeasure } from './amounts.js';
import type {
  AssociationClaim,
  AssociationExpect,
  Claim,
  ClaimKind,
  ClaimsFile,
  CompareClaim,
  CompareExpect,
  CrosstabClaim,
  EquivalenceClaim,
  EstimateClaim,
  Filter,
  FilterScalar,
  FilterValue,
  GapChangeClaim,
  GapExpect,
  MeansClaim,
  RankClaim,
  EveryClaim,
  RankExpect,
  Measure,
  Place,
  SourceSpec,
  TargetClaim,
  TrendExpect,
} from './types.js';
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

/**
 * @param lenient for `warrant check` only: amounts that cannot be read (already reported as problems) fall back to
 *   their defaults instead of throwing, so that the rest of the file can still be checked against the data
 */
export function normalize(parsed: ParsedYaml, absPath: string, sha256: string, lenient = false): ClaimsFile {
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
    if (!r.ok && lenient) return fallback;
    if (!r.ok) throw new Error(`confidence ${r.written} passed validation but cannot be read`);
    return { value: r.value, written: r.written };
  };
  const top = confidenceOf(data, { value: DEFAULTS.confidence, written: DEFAULTS.confidenceWritten });
  const share = (raw: unknown): number | undefined => amount(readShare(raw), lenient);
  const points = (raw: unknown): number | undefined => amount(readPoints(raw), lenient);
  const topRate = data.min_response_rate !== undefined ? share(data.min_response_rate) : undefined;
  const topSmallest = data.smallest_difference !== undefined ? points(data.smallest_difference) : undefined;
  const worthOf = (raw: unknown, measure: WorthMeasure): number | undefined => amount(readWorth(raw, measure), lenient);
  const topWorthRaw = data.worth_reporting !== null && typeof data.worth_reporting === 'object' && !Array.isArray(data.worth_reporting) ? (data.worth_reporting as Rec) : {};
  const topWorth: Partial<Record<WorthMeasure, number>> = {};
  for (const m of ['rates', 'mean_scores', 'correlations'] as const) {
    const v = topWorthRaw[m] !== undefined ? worthOf(topWorthRaw[m], m) : undefined;
    if (v !== undefined) topWorth[m] = v;
  }

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
    if (typeof s.title === 'string') spec.title = s.title;
    if (s.origin === 'independent' || s.origin === 'own') spec.origin = s.origin;
    if (typeof s.respondents === 'string') spec.respondents = s.respondents;
    if (typeof s.agree === 'string') spec.agree = s.agree;
    if (typeof s.agree_percent === 'string') spec.agreePercent = s.agree_percent;
    if (typeof s.population === 'string') spec.population = s.population;
    if (Array.isArray(s.questions)) spec.questions = [...(s.questions as string[])];
    if (typeof s.period === 'string') spec.period = s.period;
    if (Array.isArray(s.numeric)) spec.numeric = [...(s.numeric as string[])];
    if (typeof s.header_row === 'number') spec.headerRow = s.header_row;
    if (s.wording !== null && typeof s.wording === 'object') {
      // A text is a question's wording; a mapping words the values of the column it is written under.
      const entries = Object.entries(s.wording as Record<string, unknown>);
      const questions = entries.filter(([, v]) => v === null || typeof v !== 'object');
      const columns = entries.filter(([, v]) => v !== null && typeof v === 'object');
      if (questions.length > 0) spec.wording = Object.fromEntries(questions.map(([k, v]) => [k.trim(), String(v).trim()]));
      if (columns.length > 0) {
        spec.valueWording = Object.fromEntries(
          columns.map(([col, m]) => [col.trim(), Object.fromEntries(Object.entries(m as Record<string, unknown>).map(([k, v]) => [k.trim(), String(v).trim()]))]),
        );
      }
    }
    if (s.answer_wording !== null && typeof s.answer_wording === 'object') spec.answerWording = Object.fromEntries(Object.entries(s.answer_wording as Record<string, unknown>).map(([k, v]) => [String(Number(k.trim())), String(v).trim()]));
    if (s.header_rows === 1 || s.header_rows === 2) spec.headerRows = s.header_rows;
    if (typeof s.last_row === 'number') spec.lastRow = s.last_row;
    if (Array.isArray(s.suppressed)) spec.suppressed = (s.suppressed as unknown[]).map(String);
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
    } as Base;
    const rate = c.min_response_rate !== undefined ? share(c.min_response_rate) : topRate;
    if (rate !== undefined) base.minResponseRate = rate;
    const smallest = c.smallest_difference !== undefined ? points(c.smallest_difference) : topSmallest;
    if (smallest !== undefined) base.smallestDifference = smallest;
    const measure = worthMeasureOf(c.kind);
    const ownWorth = measure !== undefined && c.worth_reporting !== undefined ? worthOf(c.worth_reporting, measure) : undefined;
    const fileWorth = measure !== undefined ? topWorth[measure] : undefined;
    if (ownWorth !== undefined) base.worthReporting = { value: ownWorth, from: 'claim' };
    else if (fileWorth !== undefined) base.worthReporting = { value: fileWorth, from: 'file' };
    const src = sources.find((x) => x.id === base.source);
    if (src !== undefined && (src.period !== undefined || src.wording !== undefined || src.valueWording !== undefined || src.shape === 'respondents')) {
      base.naming = {
        ...(src.period !== undefined ? { period: src.period } : {}),
        ...(src.shape === 'respondents' ? { question: src.questionColumn } : {}),
        ...(src.wording !== undefined ? { wording: src.wording } : {}),
        ...(src.answerWording !== undefined ? { answers: src.answerWording } : {}),
        ...(src.valueWording !== undefined ? { values: src.valueWording } : {}),
      };
    }
    const fpc = c.finite_population_correction ?? data.finite_population_correction;
    if (typeof fpc === 'boolean') base.finitePopulation = fpc;
    return claimOfKind(c, base, lenient);
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
  if (topRate !== undefined) out.minResponseRate = topRate;
  if (topSmallest !== undefined) out.smallestDifference = topSmallest;
  if (Object.keys(topWorth).length > 0) {
    out.worthReporting = {
      ...(topWorth.rates !== undefined ? { rates: topWorth.rates } : {}),
      ...(topWorth.mean_scores !== undefined ? { meanScores: topWorth.mean_scores } : {}),
      ...(topWorth.correlations !== undefined ? { correlations: topWorth.correlations } : {}),
    };
  }
  if (typeof data.finite_population_correction === 'boolean') out.finitePopulation = data.finite_population_correction;
  if (typeof data.description === 'string') out.description = data.description.trim();
  if (data.data_date !== undefined) out.dataDate = String(data.data_date);
  return out;
}

function copyValue(v: FilterValue): FilterValue {
  if (Array.isArray(v)) return [...v];
  if (typeof v === 'object') return { not: Array.isArray(v.not) ? [...v.not] : v.not };
  return v;
}

function copyFilter(f: Filter | undefined): Filter {
  const out: Filter = {};
  for (const [k, v] of Object.entries(f ?? {})) out[k] = copyValue(v);
  return out;
}

/** A read amount's value; one that cannot be read was reported by the rules (undefined when lenient). */
function amount(r: AmountReading, lenient: boolean): number | undefined {
  if (r.ok) return r.value;
  if (lenient) return undefined;
  throw new Error(`${r.written} passed validation but cannot be read`);
}

/** One column name or a list of them, as a list. */
function columnList(raw: unknown): string[] {
  return (Array.isArray(raw) ? raw : [raw]).map((v) => String(v));
}

/** "agree" | "mean" | { column } -> Measure. */
function measureOf(raw: unknown, fallback: Measure): Measure {
  if (raw === 'agree') return { type: 'agree' };
  if (raw === 'mean') return { type: 'mean' };
  if (raw !== null && typeof raw === 'object' && typeof (raw as Rec).column === 'string') return { type: 'column', column: (raw as Rec).column as string };
  return fallback;
}

type Base = Omit<CompareClaim, 'kind' | 'focus' | 'against' | 'expect' | 'focusLabel' | 'againstLabel'>;

/** Labels written as snake_case keys, copied when present. */
function labels<T extends object>(claim: T, c: Rec, keys: Record<string, string>): T {
  for (const [from, to] of Object.entries(keys)) if (typeof c[from] === 'string') (claim as Rec)[to] = c[from];
  return claim;
}

const PAIR_LABELS = { focus_label: 'focusLabel', against_label: 'againstLabel' };

/** `against` as a filter; `against: rest` is the whole of the claim's `where` (the focus is then taken out of it). */
function againstOf(c: Rec): { against: Filter; againstRest?: true } {
  return c.against === 'rest' ? { against: {}, againstRest: true } : { against: copyFilter(c.against as Filter) };
}

function claimOfKind(c: Rec, base: Base, lenient: boolean): Claim {
  switch (c.kind as Exclude<ClaimKind, 'gap-change'>) {
    case 'compare':
      return labels<CompareClaim>(
        { ...base, kind: 'compare', focus: copyFilter(c.focus as Filter), ...againstOf(c), expect: c.expect as CompareExpect },
        c,
        PAIR_LABELS,
      );
    case 'association': {
      const controls = ((c.controls as Rec[] | undefined) ?? []).map((ctl) => ({
        label: ctl.label as string,
        filter: copyFilter(ctl.where as Filter | undefined),
        measure: typeof ctl.column === 'string' ? ({ type: 'column', column: ctl.column } as Measure) : measureOf(ctl.measure, { type: 'agree' }),
      }));
      return labels<AssociationClaim>(
        {
          ...base,
          kind: 'association',
          units: columnList(c.units),
          x: copyFilter(c.x as Filter),
          y: copyFilter(c.y as Filter),
          xMeasure: measureOf(c.x_measure, { type: 'agree' }),
          yMeasure: measureOf(c.y_measure, { type: 'agree' }),
          controls,
          weighted: c.weighted === true,
          expect: c.expect as AssociationExpect,
        },
        c,
        { x_label: 'xLabel', y_label: 'yLabel' },
      );
    }
    case 'change':
      // With focus and against a change claim is about the gap between the two selections (rules.ts asks for both).
      if (c.focus !== undefined || c.against !== undefined) {
        return labels<GapChangeClaim>(
          { ...base, kind: 'gap-change', from: c.from as FilterScalar, to: (c.to as FilterScalar | undefined) ?? 'latest', focus: copyFilter(c.focus as Filter | undefined), ...againstOf(c), expect: c.expect as GapExpect },
          c,
          PAIR_LABELS,
        );
      }
      return { ...base, kind: 'change', from: c.from as FilterScalar, to: (c.to as FilterScalar | undefined) ?? 'latest', expect: c.expect as CompareExpect };
    case 'trend':
      return {
        ...base,
        kind: 'trend',
        periods: Array.isArray(c.periods) ? [...(c.periods as FilterScalar[])] : { last: c.last as number },
        expect: c.expect as TrendExpect,
      };
    case 'target': {
      const v = readShare(c.value, true);
      const value = amount(v, lenient) ?? 0;
      return labels<TargetClaim>(
        { ...base, kind: 'target', select: copyFilter(c.select as Filter), value, valueWritten: v.written, expect: c.expect as CompareExpect },
        c,
        { select_label: 'selectLabel', value_label: 'valueLabel' },
      );
    }
    case 'crosstab': {
      const cols = c.columns ?? 'agreement';
      const claim: CrosstabClaim = {
        ...base,
        kind: 'crosstab',
        rows: columnList(c.rows),
        columns: cols === 'agreement' || cols === 'answers' ? cols : columnList(cols),
        expect: 'related',
      };
      if (Array.isArray(c.scale)) claim.scale = [...(c.scale as number[])];
      return claim;
    }
    case 'means':
      return labels<MeansClaim>(
        {
          ...base,
          kind: 'means',
          focus: copyFilter(c.focus as Filter),
          ...againstOf(c),
          measure: measureOf(c.measure, { type: 'mean' }),
          test: ((c.method as string | undefined) ?? 'welch') as MeansClaim['test'],
          expect: c.expect as CompareExpect,
        },
        c,
        PAIR_LABELS,
      );
    case 'equivalence':
      return labels<EquivalenceClaim>(
        { ...base, kind: 'equivalence', focus: copyFilter(c.focus as Filter), ...againstOf(c), margin: amount(readPoints(c.margin), lenient) ?? 0 },
        c,
        PAIR_LABELS,
      );
    case 'rank': {
      // units defaults to the focus's one column (rules.ts asks for units when the focus names several).
      const focus = copyFilter(c.focus as Filter);
      const units = typeof c.units === 'string' ? c.units : (Object.keys(focus)[0] ?? '');
      return labels<RankClaim>({ ...base, kind: 'rank', units, focus, expect: c.expect as RankExpect }, c, { focus_label: 'focusLabel' });
    }
    case 'every': {
      const v = readShare(c.value, true);
      return labels<EveryClaim>(
        { ...base, kind: 'every', units: String(c.units), value: amount(v, lenient) ?? 0, valueWritten: v.written, expect: c.expect as EveryClaim['expect'] },
        c,
        { value_label: 'valueLabel' },
      );
    }
    case 'estimate':
      return labels<EstimateClaim>(
        { ...base, kind: 'estimate', select: copyFilter(c.select as Filter), measure: measureOf(c.measure, { type: 'agree' }) },
        c,
        { select_label: 'selectLabel' },
      );
  }
}
