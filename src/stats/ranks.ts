/**
 * Ranks with ties given the average of the ranks they span (the "mid-rank" convention of Kendall, "Rank Correlation
 * Methods", 4th ed., 1970, section 3.8), as R's rank(ties.method = "average").
 */
export function averageRanks(v: readonly number[]): number[] {
  const order = v.map((_, i) => i).sort((a, b) => v[a]! - v[b]! || a - b);
  const ranks = new Array<number>(v.length);
  let i = 0;
  while (i < order.length) {
    let j = i;
    while (j + 1 < order.length && v[order[j + 1]!] === v[order[i]!]) j++;
    const rank = (i + j + 2) / 2;
    for (let k = i; k <= j; k++) ranks[order[k]!] = rank;
    i = j + 1;
  }
  return ranks;
}

/** Sizes of the groups of tied values (only groups of 2 or more). */
export function tieGroupSizes(v: readonly number[]): number[] {
  const counts = new Map<number, number>();
  for (const a of v) counts.set(a, (counts.get(a) ?? 0) + 1);
  return [...counts.values()].filter((c) => c > 1);
}
