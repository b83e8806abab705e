/**
 * "Did you mean ...?" for misspelt keys and values. Distance is the optimal string alignment distance (Levenshtein
 * distance with adjacent transpositions; Damerau, Communications of the ACM 7(3), 1964), compared case-insensitively.
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
 * The closest candidate to `word`, or undefined when none is close enough to be a plausible slip
 * (distance at most 2, or a third of the word's length for longer words).
 */
export function closest(word: string, candidates: readonly string[]): string | undefined {
  const w = squash(word);
  let best: string | undefined;
  let bestDistance = Infinity;
  for (const c of candidates) {
    const d = editDistance(w, squash(c));
    if (d < bestDistance) {
      bestDistance = d;
      best = c;
    }
  }
  if (best === undefined) return undefined;
  const limit = Math.max(2, Math.floor(Math.max(w.length, squash(best).length) / 3));
  return bestDistance <= limit ? best : undefined;
}
