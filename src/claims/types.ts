/**
 * The claims file, in two forms: what the user writes (YAML, validated by schema/claims.schema.json) and the
 * normalized form the rest of the pipeline uses (defaults filled in, paths resolved, confidence as a fraction).
 *
 * Example of what a user writes:
 *
 *   # yaml-language-server: $schema=../schema/claims.schema.json
 *   title: Student voice 2026
 *   organisation: Tarnquill Students' Guild
 *   confidence: 95%
 *   sources:
 *     results:
 *       file: data/summary.xlsx
 *       sheet: Results
 *       shape: summary
 *       respondents: Respondents      # column holding the number who answered
 *       agree: Agreeing               # column holding the number who agreed (or agree_percent: "% agree")
 *   claims:
 *     - id: feedback-below-region
 *       claim: Our rate of agreement on feedback is below the rest of the region.
 *       kind: compare
 *       source: results
 *       where: { year: 2026, question: Q09 }
 *       focus: { provider: Tarnquill College }
 *       against: { region: Glimmerholt Vale }
 *       expect: lower
 */

/** One value or a list of values; values compare as text ("2026" equals 2026). */
export type FilterScalar = string | number;
/**
 * A filter on one column: a single value, any of a list, or everything but some values (`{ not: ... }`).
 * On the source's period column the words `latest`, `previous` and `latest-N` (N periods before the newest) name
 * periods relative to the newest one in the data, so the same claims file works next year.
 */
export type FilterValue = FilterScalar | FilterScalar[] | { not: FilterScalar | FilterScalar[] };
/** Filters on several columns at once; a row is selected when every column matches. */
export type Filter = Record<string, FilterValue>;

/**
 * How a claim's selections are named in the pack: the period column (named last, "in 2026"), the question column,
 * and each question's wording (from the source's `wording`), so that labels say the group, then the question, then
 * the period, and speak in the wording with the code beside it.
 */
export interface Naming {
  period?: string;
  question?: string;
  wording?: Record<string, string>;
  /** Answer code -> its wording (the source's `answer_wording`). */
  answers?: Record<string, string>;
  /** Column -> value -> its wording (the source's `wording: { Campus: { GQ: Gleddrith Quay } }`). */
  values?: Record<string, Record<string, string>>;
}

/** Where something was written in the claims file (1-based), for error messages and the pack. */
export interface Place {
  line: number;
  column: number;
}

export type SourceShape = 'summary' | 'respondents';

export interface SourceSpec {
  id: string;
  /** Absolute path, resolved relative to the claims file. */
  path: string;
  /** The path as written in the claims file. */
  file: string;
  format: 'csv' | 'xlsx';
  /** Worksheet name for XLSX (default: the first visible sheet). */
  sheet?: string;
  /** The survey's name as the pack should give it, e.g. "Lanternfield Student Opinion Survey 2026". */
  title?: string;
  /**
   * Who ran the survey: 'independent' (a release by an independent body) or 'own' (the organisation's own survey).
   * The pack names it on each claim's page; unset, it says the claims file does not state it.
   */
  origin?: 'independent' | 'own';
  shape: SourceShape;
  /** summary: column with the number who answered. */
  respondents?: string;
  /** summary: column with the number who agreed. */
  agree?: string;
  /** summary: column with the percent who agreed (0-100, or "72%"); the count is then approximate. */
  agreePercent?: string;
  /** summary: column with the number eligible (cohort size), for the finite-population correction. */
  population?: string;
  /** respondents: the answer columns, one per question. */
  questions?: string[];
  /** respondents: name of the column the question codes appear under (default "question"). */
  questionColumn: string;
  /** respondents: codes that count as agreeing (default [4, 5]). */
  agreeCodes: number[];
  /** respondents: codes that mean "not applicable" and are left out of the base (default none; blanks always are). */
  notApplicableCodes: number[];
  /** Column holding the survey period (e.g. Year); enables `latest` / `previous` and the change and trend kinds. */
  period?: string;
  /**
   * summary: further numeric columns (e.g. a staff-to-student ratio, a mean score) that claims may use as measures.
   * A selection's value is the respondent-weighted mean of the column over its rows.
   */
  numeric?: string[];
  /** 1-based row holding the column names (default: the first non-empty row). */
  headerRow?: number;
  /** Rows the header spans: 1, or 2 (codes above wording, or group headings above names). Default: detected. */
  headerRows?: 1 | 2;
  /** Last row of the table (1-based); rows below it are notes. Default: detected (see src/data/table.ts). */
  lastRow?: number;
  /** summary: markers this release uses for withheld cells, read as suppressed besides the common ones. */
  suppressed?: string[];
  /** Question code -> its wording, as the pack should say it (`wording` in the claims file). */
  wording?: Record<string, string>;
  /** Column -> value -> its wording (`wording: { Campus: { GQ: Gleddrith Quay } }`), for values that are codes. */
  valueWording?: Record<string, Record<string, string>>;
  /** respondents: answer code -> its wording (`answer_wording`), used where answers are named (crosstab of answers). */
  answerWording?: Record<string, string>;
  place: Place;
}

/**
 * What is measured for a selection:
 * - agree: the pooled agreement rate (agreeing / respondents);
 * - mean: the mean answer score (respondent-level sources; answers as coded, not-applicable left out);
 * - column: a numeric column of a summary source, respondent-weighted mean over the selection's rows.
 */
export type Measure = { type: 'agree' } | { type: 'mean' } | { type: 'column'; column: string };

export type CompareExpect = 'lower' | 'higher' | 'different';
export type AssociationExpect = 'positive' | 'negative' | 'any';
export type Sided = 'two-sided' | 'one-sided';

interface ClaimBase {
  id: string;
  /** The claim in the user's own words. */
  statement: string;
  source: string;
  /** Filters applied to every selection of this claim. */
  where: Filter;
  /** Confidence level as a fraction, e.g. 0.95. */
  confidence: number;
  /** How the confidence was written, e.g. "95%", to say what was understood. */
  confidenceWritten: string;
  sided: Sided;
  /** Selections with fewer respondents than this are not tested (pack default unless the claim overrides it). */
  minRespondents: number;
  /** Where the number eligible is known, selections answered by a smaller share than this are not tested. */
  minResponseRate?: number;
  /** The smallest difference that matters, as a fraction (0.05 = 5 points); a smaller significant one is not "supported". */
  smallestDifference?: number;
  /**
   * The difference worth reporting (`worth_reporting`), in the unit of the claim's measure: a fraction for rates
   * (0.05 = 5 points), standard deviations for mean scores, r for correlations. `from` says whether the claim set it or
   * the file's `worth_reporting` did for the claim's measure. It only splits "not supported" into ruled out and
   * inconclusive (src/verdicts/advice.ts); unset, the pack's default for the measure is used.
   */
  worthReporting?: { value: number; from: 'claim' | 'file' };
  /**
   * finite_population_correction as written on the claim, else pack-wide; undefined when neither says: the correction
   * is then used wherever the source gives the number eligible. Either way it applies to every figure or to none.
   */
  finitePopulation?: boolean;
  /** How selections are named (from the claim's source); display only, not part of what the claim commits to. */
  naming?: Naming;
  place: Place;
}

/** Agreement rate of one selection compared with another's. */
export interface CompareClaim extends ClaimBase {
  kind: 'compare';
  focus: Filter;
  against: Filter;
  /** Direction fixed in advance: the focus is lower than, higher than, or different from the comparison. */
  expect: CompareExpect;
  /** Optional labels for the two selections in the pack (default: built from the filters). */
  focusLabel?: string;
  againstLabel?: string;
  /** `against: rest`: everyone else the claim's `where` selects (against is then empty, the whole of `where`). */
  againstRest?: true;
}

/** Association between two measures across units (one point per value of `units`). */
export interface AssociationClaim extends ClaimBase {
  kind: 'association';
  /**
   * Columns whose values are the units, e.g. ["Department"]; with several columns each combination of their values is
   * a unit (each institution's departments), labelled by its values in this order.
   */
  units: string[];
  /** Filters that define the first measure (horizontal axis), on top of `where`. */
  x: Filter;
  /** Filters that define the second measure (vertical axis), on top of `where`. */
  y: Filter;
  xLabel?: string;
  yLabel?: string;
  /** What each axis measures (default: agreement rate). */
  xMeasure: Measure;
  yMeasure: Measure;
  /** Third variables to control for (partial correlation), each a measure across the same units. */
  controls: Array<{ filter: Filter; measure: Measure; label: string }>;
  /** Weight units by their respondents (default false: every unit counts once). */
  weighted: boolean;
  expect: AssociationExpect;
}

/** The same selection in two periods ("this fell since last year"). Uses the source's period column. */
export interface ChangeClaim extends ClaimBase {
  kind: 'change';
  /** Earlier period: a value or a relative word (`previous`, `latest-2`). */
  from: FilterScalar;
  /** Later period (default `latest`). */
  to: FilterScalar;
  expect: CompareExpect;
}

/**
 * The direction of a gap's change: narrowed (its size fell: the two selections closer together, whichever is ahead),
 * widened (its size grew), lower or higher (focus minus against fell or rose), or different (changed either way).
 */
export type GapExpect = CompareExpect | 'narrowed' | 'widened';

/**
 * The gap between two selections in two periods ("the gap between part-time and full-time students narrowed since
 * 2024"): written as a change claim with focus and against. The gap is focus minus against in each period.
 */
export interface GapChangeClaim extends ClaimBase {
  kind: 'gap-change';
  /** Earlier period: a value or a relative word (`previous`, `latest-2`). */
  from: FilterScalar;
  /** Later period (default `latest`). */
  to: FilterScalar;
  focus: Filter;
  against: Filter;
  focusLabel?: string;
  againstLabel?: string;
  /** `against: rest`: everyone else the claim's `where` selects, in each period. */
  againstRest?: true;
  expect: GapExpect;
}

export type TrendExpect = 'rising' | 'falling' | 'any';

/** A trend in the agreement rate over three or more ordered periods. */
export interface TrendClaim extends ClaimBase {
  kind: 'trend';
  /** The periods, oldest first, as values or relative words; or the last N periods in the data. */
  periods: FilterScalar[] | { last: number };
  expect: TrendExpect;
}

/** A selection against a fixed value: a target or a published benchmark figure. */
export interface TargetClaim extends ClaimBase {
  kind: 'target';
  /** The selection, on top of `where`. */
  select: Filter;
  selectLabel?: string;
  /** The fixed value as a fraction (0.8 for 80%). */
  value: number;
  /** How the value was written, e.g. "80%". */
  valueWritten: string;
  /** What the value is, e.g. "the 80% target" or "the national benchmark". */
  valueLabel?: string;
  expect: CompareExpect;
}

export type RankExpect = 'highest' | 'lowest';

/**
 * One unit the highest (or lowest) of all the units under `where` ("Quarrendell has the highest rate of the
 * institutions in Glasvane Reach"): shown only if its rate is shown above (below) each other unit's.
 */
export interface RankClaim extends ClaimBase {
  kind: 'rank';
  /** The column whose values are the units ranked, e.g. "Institution" (default: the focus's one column). */
  units: string;
  /** The unit the claim is about, as a filter on the units column, e.g. { Institution: Quarrendell }. */
  focus: Filter;
  focusLabel?: string;
  expect: RankExpect;
}

/**
 * Every unit under `where` on one side of a fixed value ("every department is at or above the 70% benchmark"): shown
 * only if each unit's rate is shown above (below) the value.
 */
export interface EveryClaim extends ClaimBase {
  kind: 'every';
  /** The column whose values are the units, e.g. "Department". */
  units: string;
  /** The fixed value as a fraction (0.7 for 70%). */
  value: number;
  /** How the value was written, e.g. "70%". */
  valueWritten: string;
  /** What the value is, e.g. "the 70% benchmark". */
  valueLabel?: string;
  expect: 'lower' | 'higher';
}

/** Two categorical variables related or not: a table of counts (e.g. campus by agreeing / not agreeing). */
export interface CrosstabClaim extends ClaimBase {
  kind: 'crosstab';
  /** Columns whose values (or combinations of values, with several) are the table's rows. */
  rows: string[];
  /**
   * The table's columns: `agreement` (agreeing / not agreeing on the selection); `answers` (respondent-level sources:
   * the answer codes of the one question the claim selects, `scale` giving the codes); or other columns whose values
   * (or combinations) split the respondents.
   */
  columns: 'agreement' | 'answers' | string[];
  /** columns `answers`: the codes shown as columns, in order (default 1 to 5). */
  scale?: number[];
  expect: 'related';
}

/** Mean scores of two selections compared (respondent-level answers, or a numeric column). */
export interface MeansClaim extends ClaimBase {
  kind: 'means';
  focus: Filter;
  against: Filter;
  focusLabel?: string;
  againstLabel?: string;
  /** `against: rest`: everyone else the claim's `where` selects. */
  againstRest?: true;
  measure: Measure;
  /** Welch's t test (default), Student's t, or the Mann–Whitney test on the answers' ranks. */
  test: 'welch' | 'student' | 'rank';
  expect: CompareExpect;
}

/** "No real difference": two selections' rates within a stated margin of each other. */
export interface EquivalenceClaim extends ClaimBase {
  kind: 'equivalence';
  focus: Filter;
  against: Filter;
  focusLabel?: string;
  againstLabel?: string;
  /** `against: rest`: everyone else the claim's `where` selects. */
  againstRest?: true;
  /** The margin as a fraction (0.05 = 5 points either way). */
  margin: number;
}

/** A plain estimate with its margin of error; no hypothesis is tested. */
export interface EstimateClaim extends ClaimBase {
  kind: 'estimate';
  select: Filter;
  selectLabel?: string;
  measure: Measure;
}

export type Claim =
  | CompareClaim
  | AssociationClaim
  | ChangeClaim
  | GapChangeClaim
  | TrendClaim
  | TargetClaim
  | CrosstabClaim
  | MeansClaim
  | EquivalenceClaim
  | EstimateClaim
  | RankClaim
  | EveryClaim;
export type ClaimKind = Claim['kind'];

export interface ClaimsFile {
  /** Absolute path of the claims file. */
  path: string;
  /** SHA-256 of the file's bytes, hex. */
  sha256: string;
  title: string;
  organisation: string;
  /** Optional free text shown on the cover, e.g. "National Student Voice Survey 2026 release". */
  description?: string;
  /** Date the data describe or were released (YYYY-MM-DD or free text), shown on the cover. */
  dataDate?: string;
  confidence: number;
  confidenceWritten: string;
  /** Adjustment for many claims. */
  adjust: 'holm' | 'benjamini-hochberg' | 'none' | 'hochberg' | 'bonferroni' | 'benjamini-yekutieli';
  /** Selections with fewer respondents than this are not tested (common practice: 10). */
  minRespondents: number;
  /** Pack default for the minimum response rate where the number eligible is known (fraction), if any. */
  minResponseRate?: number;
  /** Pack default for the smallest difference that matters (fraction), if any. */
  smallestDifference?: number;
  /** Pack-wide sizes of a difference worth reporting, per measure, as written (`worth_reporting`); unset ones use the defaults. */
  worthReporting?: { rates?: number; meanScores?: number; correlations?: number };
  /** Pack default for the finite-population correction (finite_population_correction), if written. */
  finitePopulation?: boolean;
  sources: SourceSpec[];
  claims: Claim[];
}
