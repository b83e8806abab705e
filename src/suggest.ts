/**
 * "Did you mean ...?" for misspelt keys, column names and values, shared by the claims reader and the data readers.
 * Distance is the optimal string alignment distance (Levenshtein distance with adjacent transpositions; Damerau,
 * Communications of the ACM 7(3), 1964), compared case-insensitively with separators ignored.
 */

/** Rows of the distance table, kept between calls (suggestions are asked for once per problem, possibly thousands). */
let rows = [new Int32Array(64), new Int32Array(64), new Int32Array(64)];

/** Optimal string alignment distance between a and b (insertions, deletions, substitutions, adjacent swaps). */
export function editDistance(a: string, b: string): number {
  return boundedDistance(a, b, Infinity);
}

/**
 * The optimal string alignment distance between a and b when it is at most `bound`, else some number above `bound`
 * (the work stops as soon as the distance is known to exceed it).
 */
function boundedDistance(a: string, b: string, bound: number): number {
  const m = a.length;
  const n = b.length;
  if (m === 0) return n;
  if (n === 0) return m;
  // The distance is at least the difference in length (each extra character costs one insertion).
  if (Math.abs(m - n) > bound) return bound + 1;
  if (rows[0]!.length <= n) rows = [new Int32Array(2 * n + 2), new Int32Array(2 * n + 2), new Int32Array(2 * n + 2)];
  // Three rolling rows: two back (for transpositions), previous, current.
  let [prev2, prev, cur] = rows as [Int32Array, Int32Array, Int32Array];
  for (let j = 0; j <= n; j++) prev[j] = j;
  let prevMin = 0;
  for (let i = 1; i <= m; i++) {
    cur[0] = i;
    let rowMin = i;
    const ai = a.charCodeAt(i - 1);
    for (let j = 1; j <= n; j++) {
      const cost = ai === b.charCodeAt(j - 1) ? 0 : 1;
      let best = Math.min(prev[j]! + 1, cur[j - 1]! + 1, prev[j - 1]! + cost);
      if (i > 1 && j > 1 && ai === b.charCodeAt(j - 2) && a.charCodeAt(i - 2) === b.charCodeAt(j - 1)) {
        best = Math.min(best, prev2[j - 2]! + 1);
      }
      cur[j] = best;
      if (best < rowMin) rowMin = best;
    }
    // Each cell of a row is at least the smallest cell of one of the two rows before it: once two rows in a row
    // exceed the bound, so does every later row, and the distance with them.
    if (rowMin > bound && prevMin > bound) return bound + 1;
    prevMin = rowMin;
    const t = prev2;
    prev2 = prev;
    prev = cur;
    cur = t;
  }
  return prev[n]!;
}

/** Squashed candidates, remembered: the same few key and column names are candidates for every problem. */
const SQUASHED_KEPT = 10_000;
const squashed = new Map<string, string>();

/** Lower case with separators removed, so that minRespondents, min-respondents and min_respondents compare equal. */
function squashText(s: string): string {
  return s.toLowerCase().replace(/[\s_-]+/g, '');
}

/** squashText of a candidate, remembered. */
function squash(s: string): string {
  let t = squashed.get(s);
  if (t === undefined) {
    t = squashText(s);
    if (squashed.size >= SQUASHED_KEPT) squashed.clear();
    squashed.set(s, t);
  }
  return t;
}

/**
 * The candidate closest to `word`, or undefined when none is close enough to be a plausible slip: a candidate equal
 * but for case and separators always counts; otherwise the distance may be at most 2, or a third of the longer name
 * for longer names. A candidate that contains the word (or is contained in it) counts at half its distance, so that
 * "Computing" suggests "Computing and Informatics".
 */
export function closest(word: string, candidates: readonly string[]): string | undefined {
  // The word itself is not remembered: each problem brings a new one.
  const w = squashText(word);
  let best: string | undefined;
  let bestScore = Infinity;
  for (const c of candidates) {
    const cc = squash(c);
    if (cc === w) return c;
    const contains = w.length > 0 && (cc.includes(w) || w.includes(cc));
    // One name inside the other: the distance is the difference in length (deletions only, and no fewer edits can
    // make up the difference).
    if (contains) {
      const score = Math.abs(w.length - cc.length) / 2;
      if (score < bestScore) {
        best = c;
        bestScore = score;
      }
      continue;
    }
    const limit = Math.max(2, Math.floor(Math.max(w.length, cc.length) / 3));
    // Only a distance within the limit and below the best so far can change the answer.
    const bound = Math.min(limit, Math.ceil(bestScore) - 1);
    if (bound < 0) continue;
    const d = boundedDistance(w, cc, bound);
    if (d <= bound && d < bestScore) {
      best = c;
      bestScore = d;
    }
  }
  return best;
}

/** "A", "B", "C" (at most `max` names, then "and N more"). */
export function listNames(names: readonly string[], max = 30): string {
  const shown = names.slice(0, max).map((n) => JSON.stringify(n));
  const more = names.length > max ? `, and ${names.length - max} more` : '';
  return shown.join(', ') + more;
}

// eslint-disable-next-line no-control-regex
const NON_ASCII = /[^\u0000-\u007f]/;

/**
 * A name in Unicode normalization form C (Unicode Standard Annex #15): "ŷ" typed as one character and "y" followed by
 * a combining circumflex (as some systems save it) become the same text. Names from the claims file and from the
 * data are compared in this form on both sides; each keeps its own spelling for display.
 */
export function nfc(s: string): string {
  return NON_ASCII.test(s) ? s.normalize('NFC') : s;
}

/** The name in `known` equal to `wanted` once both are in normalization form C, preferring an exact match. */
export function findName(wanted: string, known: readonly string[]): string | undefined {
  if (known.includes(wanted)) return wanted;
  const w = nfc(wanted);
  return known.find((k) => nfc(k) === w);
}

/**
 * Why two names that look alike do not match, when the only difference is in their Unicode form beyond canonical
 * equivalence (compatibility characters: a ligature, a non-breaking or other special space, full-width letters,
 * invisible characters such as a zero-width space): undefined when they differ in visible letters.
 */
export function unicodeOnlyDifference(a: string, b: string): string | undefined {
  const fold = (s: string): string => s.normalize('NFKC').replace(/[\u200B-\u200D\u2060\uFEFF\u00AD]/g, '').replace(/\s+/g, ' ');
  if (a === b || fold(a) !== fold(b)) return undefined;
  return 'they look the same but differ in their Unicode form (special spaces, invisible characters, ligatures or full-width letters)';
}

/** A fix sentence: use the closest name if there is one, and list the choices. */
export function fixFor(wanted: string, known: readonly string[], what: string): string {
  if (known.length === 0) return `Check the file: no ${what} were found in it`;
  const near = closest(wanted, known);
  const list = listNames(known);
  const why = near !== undefined ? unicodeOnlyDifference(wanted, near) : undefined;
  if (near !== undefined && why !== undefined) return `Did you mean ${JSON.stringify(near)}? ${why[0]!.toUpperCase()}${why.slice(1)}: retype the name. The ${what} found are ${list}`;
  return near !== undefined ? `Did you mean ${JSON.stringify(near)}? The ${what} found are ${list}` : `Use one of the ${what} found: ${list}`;
}
