/**
 * The habits of tables as published, read the same way by the cube (src/data/cube.ts), the quick scan behind `check`
 * and `init` (src/claims/scan.ts) and the starter file:
 *
 * - Suppressed cells: a count withheld from publication is replaced by a marker. The common markers below are read
 *   as "suppressed" (never as a number, never guessed); a source can add its own with `suppressed:`.
 * - Footnote markers on numbers ("120*", "72%†", "1,204[a]"): the number is read and the marker reported once.
 * - Notes under the table: the table ends at the first completely blank row when no row after it looks like data
 *   (a row with a number or a marker in a column of numbers); the rows after it are notes. A source can set the last
 *   row of the table with `last_row:`.
 * - Two header rows: a row of codes above a row of wording (Q01 over "The teaching is good"), or group headings above
 *   column names (merged across columns in a workbook, so read as one cell and empty cells). A source can say
 *   `header_rows: 2`, or it is detected (see secondHeaderRow).
 *
 * All of this is common practice in published survey releases; none of it is a standard.
 */

/**
 * Markers that mean a cell was withheld or is not available, compared after trimming and ignoring case: asterisks,
 * bracketed codes ([c] confidential, [x] not available, [z] not applicable, [u] low reliability, [low]), dots, dashes,
 * DP (data protection), n/a, low, supp, and "<5"-style small counts.
 */
export const COMMON_MARKERS: readonly string[] = ['*', '**', '***', '[c]', '[x]', '[z]', '[u]', '[low]', '..', '...', '.', '-', '–', '—', ':', 'x', 'c', 'z', 'dp', 'n/a', 'na', 'n.a.', 'low', 'supp', 'suppressed', 'withheld', 'n<10', 'n<5'];

const SMALL_COUNT = /^[<≤]\s?\d{1,3}$/;

/** A set of markers for one source: the common ones and the source's own (case ignored, trimmed). */
export function markerSet(own: readonly string[] | undefined): ReadonlySet<string> {
  const set = new Set(COMMON_MARKERS);
  for (const m of own ?? []) set.add(m.trim().toLowerCase());
  return set;
}

/** True when the (trimmed) text is a suppression marker. */
export function isSuppressedMarker(text: string, markers: ReadonlySet<string>): boolean {
  if (text === '' || text.length > 12) return false;
  // Fast refusal for the common case, a number: no marker starts with a digit.
  const c0 = text.charCodeAt(0);
  if (c0 >= 48 && c0 <= 57) return false;
  const t = text.toLowerCase();
  return markers.has(t) || SMALL_COUNT.test(t);
}

/**
 * A number followed by a footnote marker ("120*", "72%†", "1,204 [a]", "64¹"): the number's text and the marker;
 * undefined when the text is not of that form. The number part is checked by the caller.
 */
const FOOTNOTED = /^([+-]?[\d.,]*\d%?)\s?(\*{1,3}|[†‡§¶#]{1,2}|\[[a-z0-9]{1,3}\]|\([a-z]\)|[¹²³⁴⁵⁶⁷⁸⁹⁰]{1,2})$/i;

export function splitFootnote(text: string): { number: string; marker: string } | undefined {
  if (text.length === 0) return undefined;
  const last = text.charCodeAt(text.length - 1);
  // Fast refusal: a number with no marker ends in a digit or '%'.
  if ((last >= 48 && last <= 57) || last === 37) return undefined;
  const m = FOOTNOTED.exec(text);
  return m === null ? undefined : { number: m[1]!, marker: m[2]! };
}

/** Plain decimal text, a percent, or a number with thousands separators: what a cell of numbers holds. */
const NUMBERISH = /^[+-]?(\d{1,3}(,\d{3})+|\d+)?([.,]\d+)?%?$/;

/** True when the (trimmed) cell reads as a number, a footnoted number or a suppression marker. */
export function isNumberLike(text: string, markers: ReadonlySet<string>): boolean {
  if (text === '') return false;
  if (NUMBERISH.test(text) && /\d/.test(text)) return true;
  const f = splitFootnote(text);
  if (f !== undefined) return true;
  return isSuppressedMarker(text, markers);
}

/** A question code as used in column headers: Q01, Q7a, B12, KPI_3 (letters, an optional separator, digits). */
const CODE = /^[A-Za-z]{1,4}[ _.-]?\d{1,3}[a-z]?$/;

export function looksLikeCode(text: string): boolean {
  return CODE.test(text);
}

/** The column names made from a header of one or two rows, and what else each column may be called. */
export interface Header {
  /** One name per column ('' for an unnamed column). */
  names: string[];
  /** Other names a column answers to (the other header row's text), when no column has that name already. */
  aliases: Map<string, number>;
  /** Wording for a column from the second header row, by column name (codes above wording only). */
  labels: Record<string, string>;
  /** Rows the header spans (1 or 2). */
  rows: 1 | 2;
}

/** A one-row header. */
export function oneRowHeader(values: readonly string[]): Header {
  return { names: values.map((v) => v.trim()), aliases: new Map(), labels: {}, rows: 1 };
}

/**
 * Names from two header rows: where one row is empty the other names the column; where the top row holds a code
 * (Q01) the code names the column and the wording below it is its label; otherwise the top row holds a group heading
 * (often merged across several columns, so read only in the first) and the row below names the column. The other
 * row's text is kept as a second name for the column when it is not ambiguous.
 */
export function twoRowHeader(topValues: readonly string[], bottomValues: readonly string[]): Header {
  const width = Math.max(topValues.length, bottomValues.length);
  const names: string[] = [];
  const other: string[] = [];
  const labels: Record<string, string> = {};
  for (let i = 0; i < width; i++) {
    const t = (topValues[i] ?? '').trim();
    const b = (bottomValues[i] ?? '').trim();
    if (t === '' || b === '' || t === b) {
      names.push(b !== '' ? b : t);
      other.push('');
    } else if (looksLikeCode(t)) {
      names.push(t);
      other.push(b);
      labels[t] = b;
    } else {
      names.push(b);
      other.push(t);
    }
  }
  const taken = new Set(names.filter((n) => n !== ''));
  const counts = new Map<string, number>();
  for (const o of other) if (o !== '') counts.set(o, (counts.get(o) ?? 0) + 1);
  const aliases = new Map<string, number>();
  other.forEach((o, i) => {
    if (o !== '' && !taken.has(o) && counts.get(o) === 1) aliases.set(o, i);
  });
  return { names, aliases, labels, rows: 2 };
}

/**
 * True when the row after the first header row is a second header row: it is the very next row, holds text in at
 * least half of the named columns and no number or marker at all (a data row of a table always has counts or answer
 * codes), and either it names columns the top row leaves empty (merged group headings), or at least two columns have
 * a code on top and different text below (codes above wording). Common practice; `header_rows:` overrides it.
 */
export function secondHeaderRow(top: readonly string[], next: readonly string[], markers: ReadonlySet<string>): boolean {
  const t = top.map((v) => v.trim());
  const b = next.map((v) => v.trim());
  const named = Math.max(t.filter((v) => v !== '').length, 1);
  const filled = b.filter((v) => v !== '');
  if (filled.length < Math.ceil(named / 2)) return false;
  if (filled.some((v) => isNumberLike(v, markers))) return false;
  let underEmpty = 0;
  let codes = 0;
  for (let i = 0; i < Math.max(t.length, b.length); i++) {
    const top1 = t[i] ?? '';
    const below = b[i] ?? '';
    if (below === '') continue;
    if (top1 === '') underEmpty += 1;
    else if (looksLikeCode(top1) && !looksLikeCode(below) && below !== top1) codes += 1;
  }
  return underEmpty > 0 || codes >= 2;
}

/**
 * True when a row under a blank row looks like a row of the table rather than a note: a number or a marker in one of
 * the columns of numbers (`numberColumns`), in a row with at least two non-blank cells.
 */
export function looksLikeDataRow(values: readonly string[], numberColumns: readonly number[], markers: ReadonlySet<string>): boolean {
  let filled = 0;
  for (const v of values) if (v.trim() !== '') filled += 1;
  if (filled < 2) return false;
  return numberColumns.some((i) => isNumberLike((values[i] ?? '').trim(), markers));
}

/** True for a title line above a table: exactly one non-blank cell (a header names at least two columns). */
export function isTitleRow(values: readonly string[]): boolean {
  let filled = 0;
  for (const v of values) if (v.trim() !== '' && ++filled > 1) return false;
  return filled === 1;
}

/** Rows held after a blank row while deciding whether they are notes; past this they are read as table rows. */
export const MAX_NOTE_ROWS = 200;

/** A short quote of a note row, for messages: its non-blank cells joined, cut at 60 characters. */
export function quoteRow(values: readonly string[]): string {
  const text = values.map((v) => v.trim()).filter((v) => v !== '').join(' ');
  return text.length > 60 ? `${text.slice(0, 57)}...` : text;
}
