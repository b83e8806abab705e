/**
 * The claims file, in two forms: what the user writes (YAML, validated by schema/claims.schema.json) and the
 * normalized form the rest of the pipeline uses (defaults filled in, paths resolved, confidence as a fraction).
 *
 * Example of what a user writes:
 *
 *   # yaml-language-server: $schema=../schema/claims.schema.json
 *   title: Student voice 2026
 *   organisation: Tarnmoor Students' Guild
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
 *       focus: { provider: Tarnmoor College }
 *       against: { region: Ellerby Vale }
 *       expect: lower
 */

/** A filter on one column: a single value or any of a list. Values compare as text ("2026" equals 2026). */
export type FilterValue = string | number | Array<string | number>;
/** Filters on several columns at once; a row is selected when every column matches. */
export type Filter = Record<string, FilterValue>;

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
  place: Place;
}

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
}

/** Association between two measures across units (one point per value of `units`). */
export interface AssociationClaim extends ClaimBase {
  kind: 'association';
  /** Column whose values are the units, e.g. "department". */
  units: string;
  /** Filters that define the first measure (horizontal axis), on top of `where`. */
  x: Filter;
  /** Filters that define the second measure (vertical axis), on top of `where`. */
  y: Filter;
  xLabel?: string;
  yLabel?: string;
  expect: AssociationExpect;
}

export type Claim = CompareClaim | AssociationClaim;
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
  adjust: 'holm' | 'benjamini-hochberg' | 'none';
  /** Selections with fewer respondents than this are not tested (common practice: 10). */
  minRespondents: number;
  sources: SourceSpec[];
  claims: Claim[];
}
