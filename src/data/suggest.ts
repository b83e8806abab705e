/** Helpers for error messages: the closest known name to a misspelt one, and lists of names. */

/** Levenshtein edit distance (insertions, deletions, substitutions), by the usual two-row dynamic programme. */
export function editDistance(a: string, b: string): number {
  const x = [...a];
  const y = [...b];
  let prev = Array.from({ length: y.length + 1 }, (_, j) => j);
  for (let i = 1; i <= x.length; i++) {
    const cur = [i];
    for (let j = 1; j <= y.length; j++) {
      const cost = x[i - 1] === y[j - 1] ? 0 : 1;
      cur.push(Math.min(prev[j]! + 1, cur[j - 1]! + 1, prev[j - 1]! + cost));
    }
    prev = cur;
  }
  return prev[y.length]!;
}

/**
 * The known name closest to `wanted` (ignoring case and surrounding spaces), or undefined when nothing is close:
 * a name that differs only in case always counts; otherwise at most a third of the longer name may differ.
 */
export function closest(wanted: string, known: readonly string[]): string | undefined {
  const w = wanted.trim().toLowerCase();
  let best: string | undefined;
  let bestScore = Infinity;
  for (const k of known) {
    const kk = k.trim().toLowerCase();
    if (kk === w) return k;
    const d = editDistance(w, kk);
    const contains = kk.includes(w) || w.includes(kk);
    const score = contains ? d / 2 : d;
    if (score < bestScore && (contains || d <= Math.max(1, Math.floor(Math.max(w.length, kk.length) / 3)))) {
      best = k;
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

/** A fix sentence: use the closest name if there is one, and list the choices. */
export function fixFor(wanted: string, known: readonly string[], what: string): string {
  if (known.length === 0) return `Check the file: no ${what} were found in it`;
  const near = closest(wanted, known);
  const list = listNames(known);
  return near !== undefined ? `Did you mean ${JSON.stringify(near)}? The ${what} found are ${list}` : `Use one of the ${what} found: ${list}`;
}
