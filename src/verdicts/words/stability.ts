/**
 * Words for the verdict-stability row (src/verdicts/stability.ts): the cells with their verdict words, the row's
 * labels and one sentence saying the whole row.
 */
import * as fmt from '../../format/numbers.js';
import type { VerdictKind, VerdictStability } from '../../render/model.js';
import type { Stability } from '../stability.js';
import type { Templates } from '../templates.js';

/** "supported at 90% and 95%, not supported at 99%"; "supported at all three levels" when they agree. */
function phrase(cells: Array<{ level: number; verdict: VerdictKind }>, word: (v: VerdictKind) => string): string {
  const groups: Array<{ verdict: VerdictKind; levels: string[] }> = [];
  for (const c of cells) {
    const last = groups[groups.length - 1];
    if (last && last.verdict === c.verdict) last.levels.push(fmt.level(c.level));
    else groups.push({ verdict: c.verdict, levels: [fmt.level(c.level)] });
  }
  if (groups.length === 1) return `${word(groups[0]!.verdict)} at all three levels`;
  return groups.map((g) => `${word(g.verdict)} at ${g.levels.length > 1 ? `${g.levels.slice(0, -1).join(', ')} and ${g.levels[g.levels.length - 1]}` : g.levels[0]}`).join(', ');
}

export function stabilityView(s: Stability, ownLevel: number, claimsTested: number, t: Templates): VerdictStability {
  const label = (v: VerdictKind) => t.render(`verdict.${v}`, {});
  const lower = (v: VerdictKind) => label(v).toLowerCase();
  const adjusted = s.adjustmentApplies;
  const same = !s.dependsOnLevel && !s.dependsOnAdjustment;
  const view = {
    adjusted,
    claimsTested,
    verdict: label(s.cells[0]!.adjusted),
    adjustedPhrase: phrase(s.cells.map((c) => ({ level: c.level, verdict: c.adjusted })), lower),
    unadjustedPhrase: phrase(s.cells.map((c) => ({ level: c.level, verdict: c.unadjusted })), lower),
  };
  const text = t.render(same ? 'stability.same' : 'stability.varies', view);
  return {
    cells: s.cells.map((c) => ({
      level: fmt.level(c.level),
      own: Math.abs(c.level - ownLevel) < 1e-9,
      adjusted: c.adjusted,
      adjustedLabel: label(c.adjusted),
      unadjusted: c.unadjusted,
      unadjustedLabel: label(c.unadjusted),
    })),
    adjustmentApplies: adjusted,
    dependsOnLevel: s.dependsOnLevel,
    dependsOnAdjustment: s.dependsOnAdjustment,
    heading: t.render('stability.heading', {}),
    adjustedLabel: t.render('stability.row-adjusted', view),
    unadjustedLabel: t.render('stability.row-unadjusted', view),
    text: text.length > 0 ? text[0]!.toUpperCase() + text.slice(1) : text,
  };
}
