/**
 * Claim kind "association": two measures across units (one point per department, institution...).
 *
 * Each unit's measure is its pooled agreement rate on the selection (respondent-weighted within the unit). Units
 * where either measure has fewer respondents than the minimum are left out and named. Pearson's r with its t test
 * and Fisher-z interval; the least-squares line for the chart; the smallest |r| the number of units could detect with
 * 80% power, for claims that are not supported.
 */
import type { AssociationClaim } from '../claims/types.js';
import type { Cube } from '../data/types.js';
import { poolByUnit } from '../data/select.js';
import type { Alternative } from '../stats/result.js';
import { pearson } from '../stats/pearson.js';
import { simpleLinearFit } from '../stats/least-squares.js';
import { minDetectableCorrelation } from '../stats/power-correlation.js';
import type { AnalysisSettings, AssociationAnalysis, UnitPoint } from './types.js';
import { sign } from './labels.js';
import { shortfall } from './thresholds.js';

/** Fewest units for which r, its t test and the Fisher-z interval (n - 3 > 0) can all be computed. */
export const MIN_UNITS = 4;

function alternativeFor(claim: AssociationClaim, opposite = false): Alternative {
  if (claim.sided === 'two-sided' || claim.expect === 'any') return 'two-sided';
  const positive = claim.expect === 'positive' ? !opposite : opposite;
  return positive ? 'greater' : 'less';
}

export function analyseAssociation(claim: AssociationClaim, cube: Cube, _settings: AnalysisSettings): AssociationAnalysis {
  const xs = poolByUnit(cube, { ...claim.where, ...claim.x }, claim.units);
  const ys = poolByUnit(cube, { ...claim.where, ...claim.y }, claim.units);
  const expectSign = claim.expect === 'positive' ? 1 : claim.expect === 'negative' ? -1 : 0;
  const points: UnitPoint[] = [];
  const suppressedUnits: string[] = [];
  const units = [...new Set([...xs.keys(), ...ys.keys()])].sort((a, b) => a.localeCompare(b, 'en'));
  for (const unit of units) {
    const px = xs.get(unit);
    const py = ys.get(unit);
    if (!px || !py || shortfall(claim, [{ label: unit, pooled: px }, { label: unit, pooled: py }]) !== undefined) {
      suppressedUnits.push(unit);
      continue;
    }
    points.push({ unit, x: px.agree / px.n, y: py.agree / py.n, nx: px.n, ny: py.n });
  }
  const base = {
    kind: 'association' as const,
    claim,
    points,
    suppressedUnits,
    expectSign: expectSign as 1 | -1 | 0,
    methods: [] as string[],
  };
  if (points.length < MIN_UNITS) {
    return {
      ...base,
      points: [],
      status: 'too-little-data',
      shortfall: `only ${points.length} ${points.length === 1 ? 'unit has' : 'units have'} enough respondents on both measures (at least ${claim.minRespondents}), and at least ${MIN_UNITS} are needed`,
      observedSign: 0,
    };
  }
  const x = points.map((p) => p.x);
  const y = points.map((p) => p.y);
  const alternative = alternativeFor(claim);
  const test = pearson(x, y, { alternative, level: claim.confidence });
  const pOpposite =
    alternative === 'two-sided' ? undefined : pearson(x, y, { alternative: alternativeFor(claim, true), level: claim.confidence }).p;
  const line = simpleLinearFit(x, y);
  const sided = alternative === 'two-sided' ? 'two-sided' : 'one-sided';
  return {
    ...base,
    status: 'tested',
    test,
    ...(pOpposite !== undefined ? { pOpposite } : {}),
    observedSign: sign(test.estimate.value),
    fit: { intercept: line.intercept, slope: line.slope, rSquared: line.rSquared },
    detectable: minDetectableCorrelation(points.length, 1 - claim.confidence, 0.8, sided),
    totals: {
      x: points.reduce((s, p) => s + p.nx, 0),
      y: points.reduce((s, p) => s + p.ny, 0),
    },
    methods: ['pearson', 'least-squares', 'power-correlation'],
  };
}
