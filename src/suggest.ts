/**
 * "Did you mean ...?" for misspelt keys, column names and values, shared by the claims reader and the data readers.
 * Distance is the optimal string alignment distance (Levenshtein distance with adjacent transpositions; Damerau,
 * Communications of the ACM 7(3), 1964), compared case-insensitively with separators ignored.
 */

/** Optimal string alignment distance between a and b (insertions, deletions, substitutions, adjacent swaps). */
export function editDistance(a: string, b: string): number {
  const m = a.length;
  const n = b.length;
  if (m === 0) return n;
  if (n === 0) return m;
  // Three rolling rows: two back (for transpositions), previous, current.
  let prev2 = new Array<number>(n + 1).fill(0);
  let prev = Array.from({ length: n + 1 }, (_, j) => j);
  let cur = new Array<number>(n + 1).fill(0);
  for (let i = 1; i <= m; i++) {
    cur[0] = i;
    for (let j = 1; j <= n; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      let best = Math.min(prev[j]! + 1, cur[j - 1]! + 1, prev[j - 1]! + cost);
      if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1]) {
        best = Math.min(best, prev2[j - 2]! + 1);
      }
      cur[j] = best;
    }
    [prev2, prev, cur] = [prev, cur, prev2];
  }
  return prev[n]!;
}

/** Lower case with separators removed, so that minRespondents, min-respondents and min_respondents compare equal. */
function squash(s: string): string {
  return s.toLowerCase().replace(/[\s_-]+/g, '');
}

/**
 * The candidate closest to `word`, or undefined when none is close enough to be a plausible slip: a candidate equal
 * but for case and separators always counts; otherwise the distance may be at most 2, or a third of the longer name
 * for longer names. A candidate that contains the word (or is contained in it) counts at half its distance, so that
 * "Computing" suggests "Computing and Informatics".
 */
export function closest(word: string, candidates: readonly string[]): string | undefined {
  const w = squash(word);
  let best: string | undefined;
  let bestScore = Infinity;
  for (const c of candidates) {
    const cc = squash(c);
    if (cc === w) return c;
    const d = editDistance(w, cc);
    const contains = w.length > 0 && (cc.includes(w) || w.includes(cc));
    const limit = Math.max(2, Math.floor(Math.max(w.length, cc.length) / 3));
    const score = contains ? d / 2 : d;
    if (score < bestScore && (contains || d <= limit)) {
      best = c;
      bestScore = score;
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
