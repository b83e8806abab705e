import type { Claim, Filter } from '../claims/types.js';
import type { Cube } from '../data/types.js';
import { analyseAssociation } from './association.js';
import { analyseCompare, type CompareContext } from './compare.js';
import { analyseChange } from './change.js';
import { analyseGapChange } from './gap-change.js';
import { analyseEstimate } from './estimate.js';
import { analyseTarget } from './target.js';
import { analyseTrend } from './trend.js';
import { analyseCrosstab } from './crosstab.js';
import { analyseEquivalence } from './equivalence.js';
import { analyseMeans } from './means.js';
import { analyseRank } from './rank.js';
import { analyseEvery } from './every.js';
import type { Analysis } from './types.js';

/** Test one claim on its source's cube. Adding a claim kind means adding a case here and a file beside this one. */
export function analyse(written: Claim, cube: Cube, ctx: CompareContext): Analysis {
  const claim = withHeaderWording(written, cube);
  switch (claim.kind) {
    case 'compare':
      return analyseCompare(claim, cube, ctx);
    case 'association':
      return analyseAssociation(claim, cube, ctx);
    case 'crosstab':
      return analyseCrosstab(claim, cube, ctx);
    case 'means':
      return analyseMeans(claim, cube, ctx);
    case 'equivalence':
      return analyseEquivalence(claim, cube, ctx);
    case 'change':
      return analyseChange(claim, cube, ctx);
    case 'gap-change':
      return analyseGapChange(claim, cube, ctx);
    case 'trend':
      return analyseTrend(claim, cube, ctx);
    case 'target':
      return analyseTarget(claim, cube, ctx);
    case 'estimate':
      return analyseEstimate(claim, cube, ctx);
    case 'rank':
      return analyseRank(claim, cube, ctx);
    case 'every':
      return analyseEvery(claim, cube, ctx);
    default:
      throw new Error(`internal: claims of kind "${(claim as Claim).kind}" cannot be analysed yet`);
  }
}

/**
 * A table with two header rows (question codes above their wording) words its questions itself: that wording is the
 * claim's question wording wherever the claims file gives none. Only the codes of the question column are taken,
 * so the wording of count columns (Respondents, Agreeing) never names anything.
 */
function withHeaderWording(claim: Claim, cube: Cube): Claim {
  const codes = cube.questionColumn !== undefined ? new Set(cube.values[cube.questionColumn] ?? []) : undefined;
  if (cube.labels === undefined || codes === undefined) return claim;
  const fromHeader = Object.entries(cube.labels).filter(([code]) => codes.has(code));
  if (fromHeader.length === 0) return claim;
  const wording = { ...Object.fromEntries(fromHeader), ...claim.naming?.wording };
  return { ...claim, naming: { ...claim.naming, wording } };
}

/** The columns a claim's selections use, so a respondent-level source keeps only those in its cube. */
export function columnsUsed(claim: Claim): string[] {
  const filters: Filter[] = [claim.where];
  if ('focus' in claim) filters.push(claim.focus);
  if ('against' in claim) filters.push(claim.against);
  if ('select' in claim) filters.push(claim.select);
  if (claim.kind === 'association') filters.push(claim.x, claim.y, ...claim.controls.map((c) => c.filter));
  const cols = new Set(filters.flatMap((f) => Object.keys(f)));
  if (claim.kind === 'association' || claim.kind === 'rank' || claim.kind === 'every') for (const u of [claim.units].flat()) cols.add(u);
  if (claim.kind === 'crosstab') {
    for (const r of [claim.rows].flat()) cols.add(r);
    if (Array.isArray(claim.columns)) for (const c of claim.columns) cols.add(c);
  }
  return [...cols];
}
