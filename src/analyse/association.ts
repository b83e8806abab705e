/**
 * Claim kind "association": two measures across units (one point per department, institution...).
 *
 * Each unit's measure is its pooled agreement rate on the selection (respondent-weighted within the unit), its mean
 * answer score (from the answer-code counts), or the respondent-weighted mean of a numeric column. Units where a
 * measure (or a control) has fewer respondents than the minimum are left out and named.
 *
 * Test: Pearson's r with its t test and Fisher-z interval; with controls, the partial correlation of the residuals
 * after a straight-line fit on the controls (t on n − 2 − k degrees of freedom; Fisher (1924), Metron 3, 329–332),
 * which removes only the controls' straight-line effect. Optionally units are weighted by their respondents (the
 * smaller of the two measures' counts) in the correlation; the number of units stays the sample size. Spearman's rho
 * and Kendall's tau-b over the same units are reported as checks that rest on neither straight lines nor a few
 * extreme units. The least-squares line for the chart; the smallest |r| the number of units could detect with 80%
 * power, for claims that are not supported.
 *
 * With controls every figure is about the controlled relation: the rank checks are the partial Spearman rho (t test
 * on n − 2 − k df) and, for one control, Kendall's partial tau (a description, no test); each unit carries its
 * residuals of x and y on the controls, and the line is that of y's residuals on x's residuals (its slope is x's
 * coefficient in the regression of y on x and the controls: Frisch and Waugh, Econometrica 1 (1933) 387-401).
 * A check that cannot be computed is left out with the reason, never replaced by its unpartialled form.
 */
import type { AssociationClaim, Measure } from '../claims/types.js';
import type { Cube, Pooled } from '../data/types.js';
import { InputError } from '../errors.js';
import type { Alternative, TestResult } from '../stats/result.js';
import { pearson } from '../stats/pearson.js';
import { partialCorrelation } from '../stats/partial-correlation.js';
import { spearman } from '../stats/spearman.js';
import { kendall } from '../stats/kendall.js';
import { exactRankPValues } from '../stats/rank-exact.js';
import { partialSpearman } from '../stats/partial-spearman.js';
import { partialKendall, type PartialKendall } from '../stats/partial-kendall.js';
import { leastSquares, simpleLinearFit } from '../stats/least-squares.js';
import { minDetectableCorrelation } from '../stats/power-correlation.js';
import type { CompareContext } from './compare.js';
import type { AssociationAnalysis, RankCheckLeftOut, UnitPoint } from './types.js';
import { sign, unitNamer } from './labels.js';
import { measureValue, requireMeasure } from './measures.js';
import { poolByUnit } from '../data/select.js';
import { shortfall } from './thresholds.js';

/** Fewest units for which r, its t test and the Fisher-z interval (n - 3 > 0) can all be computed. */
export const MIN_UNITS = 4;

function alternativeFor(claim: AssociationClaim, opposite = false): Alternative {
  if (claim.sided === 'two-sided' || claim.expect === 'any') return 'two-sided';
  const positive = claim.expect === 'positive' ? !opposite : opposite;
  return positive ? 'greater' : 'less';
}

/** Respondents behind a measure for suppression: the weight of a numeric column, else those who answered. */
function respondents(p: Pooled, m: Measure): number {
  if (m.type === 'column') return p.numeric?.[m.column]?.weight ?? 0;
  if (m.type === 'mean') return Object.values(p.codes ?? {}).reduce((s, v) => s + v, 0);
  return p.n;
}

export function analyseAssociation(claim: AssociationClaim, cube: Cube, ctx: CompareContext): AssociationAnalysis {
  const controls = claim.controls ?? [];
  const xMeasure: Measure = claim.xMeasure ?? { type: 'agree' };
  const yMeasure: Measure = claim.yMeasure ?? { type: 'agree' };
  if (claim.weighted && controls.length > 0) {
    throw new InputError({
      file: ctx.claimsFile,
      line: claim.place.line,
      column: claim.place.column,
      field: `claims.${claim.id}.weighted`,
      problem: `claim "${claim.id}" asks for both controls and weighting by respondents; a weighted partial correlation is not available`,
      fix: 'remove weighted: true (every unit then counts once), or remove the controls',
    });
  }
  const name = unitNamer(claim.naming);
  const xs = poolByUnit(cube, { ...claim.where, ...claim.x }, claim.units, name);
  const ys = poolByUnit(cube, { ...claim.where, ...claim.y }, claim.units, name);
  const zs = controls.map((c) => poolByUnit(cube, { ...claim.where, ...c.filter }, claim.units, name));
  const expectSign = claim.expect === 'positive' ? 1 : claim.expect === 'negative' ? -1 : 0;
  const points: UnitPoint[] = [];
  const suppressedUnits: string[] = [];
  const units = [...new Set([...xs.keys(), ...ys.keys()])].sort((a, b) => a.localeCompare(b, 'en'));
  const mctx = (field: string) => ({ claimsFile: ctx.claimsFile, claimId: claim.id, field, place: claim.place });
  requireMeasure(cube, xMeasure, mctx('xMeasure'));
  requireMeasure(cube, yMeasure, mctx('yMeasure'));
  controls.forEach((c, j) => requireMeasure(cube, c.measure, mctx(`controls[${j}].measure`)));
  for (const unit of units) {
    const px = xs.get(unit);
    const py = ys.get(unit);
    const pz = zs.map((m) => m.get(unit));
    const parts: Array<[Pooled | undefined, Measure]> = [[px, xMeasure], [py, yMeasure], ...pz.map((p, j): [Pooled | undefined, Measure] => [p, (controls[j] as (typeof controls)[number]).measure])];
    const short = parts.some(
      ([p, m]) => !p || respondents(p, m) <= 0 || shortfall(claim, [{ label: unit, pooled: { ...p, n: respondents(p, m) } }]) !== undefined,
    );
    if (short || !px || !py) {
      suppressedUnits.push(unit);
      continue;
    }
    const point: UnitPoint = {
      unit,
      x: measureValue(px, xMeasure, mctx('x')),
      y: measureValue(py, yMeasure, mctx('y')),
      nx: respondents(px, xMeasure),
      ny: respondents(py, yMeasure),
    };
    if (controls.length > 0) point.controls = pz.map((p, j) => measureValue(p as Pooled, (controls[j] as (typeof controls)[number]).measure, mctx(`controls[${j}]`)));
    points.push(point);
  }
  const base = {
    kind: 'association' as const,
    claim,
    points,
    suppressedUnits,
    expectSign: expectSign as 1 | -1 | 0,
    methods: [] as string[],
    ...(controls.length > 0 ? { controlled: controls.map((c) => c.label) } : {}),
    ...(claim.weighted ? { weighted: true } : {}),
  };
  const needed = MIN_UNITS + controls.length;
  if (points.length < needed) {
    return {
      ...base,
      points: [],
      status: 'too-little-data',
      shortfall: `only ${points.length} ${points.length === 1 ? 'unit has' : 'units have'} enough respondents on every measure (at least ${claim.minRespondents}), and at least ${needed} are needed`,
      observedSign: 0,
    };
  }
  const x = points.map((p) => p.x);
  const y = points.map((p) => p.y);
  // A measure with the same value in every unit has no association with anything: said as such, not tested.
  const flat = [x, y].findIndex((v) => v.every((a) => a === v[0]));
  if (flat >= 0) {
    const label = flat === 0 ? (claim.xLabel ?? 'the first measure') : (claim.yLabel ?? 'the second measure');
    return {
      ...base,
      points: [],
      status: 'too-little-data',
      shortfall: `every one of the ${points.length} units has the same value of ${label} (no variation to relate to the other measure)`,
      observedSign: 0,
    };
  }
  const weights = claim.weighted ? points.map((p) => Math.min(p.nx, p.ny)) : undefined;
  const z = controls.map((_, j) => points.map((p) => (p.controls as number[])[j] as number));
  const run = (alternative: Alternative): TestResult =>
    controls.length > 0
      ? partialCorrelation(x, y, z, { alternative, level: claim.confidence })
      : pearson(x, y, { alternative, level: claim.confidence, ...(weights ? { weights } : {}) });
  const alternative = alternativeFor(claim);
  const test = run(alternative);
  const pOpposite = alternative === 'two-sided' ? undefined : run(alternativeFor(claim, true)).p;
  // With controls, the line and the chart are of the residuals: each measure less its straight-line fit on the controls.
  if (controls.length > 0) {
    const names = controls.map((c) => c.label);
    const rx = leastSquares(z, x, { names }).residuals;
    const ry = leastSquares(z, y, { names }).residuals;
    points.forEach((p, i) => {
      p.xResidual = rx[i] as number;
      p.yResidual = ry[i] as number;
    });
  }
  const line = controls.length > 0 ? simpleLinearFit(points.map((p) => p.xResidual as number), points.map((p) => p.yResidual as number)) : simpleLinearFit(x, y);
  // When unit sizes differ a lot (the largest at least three times the smallest: common practice), the correlation
  // weighted by respondents is shown beside the unweighted one, so a reader can see whether small units drive it.
  const sizes = points.map((p) => Math.min(p.nx, p.ny));
  const uneven = Math.max(...sizes) >= 3 * Math.min(...sizes);
  const weightedCheck =
    !claim.weighted && controls.length === 0 && uneven ? pearson(x, y, { alternative, level: claim.confidence, weights: sizes }) : undefined;
  const sided = alternative === 'two-sided' ? 'two-sided' : 'one-sided';
  const leftOut: RankCheckLeftOut[] = [];
  let rho: TestResult | undefined;
  try {
    rho = controls.length > 0 ? partialSpearman(x, y, z, { alternative }) : spearman(x, y, { alternative });
  } catch {
    // Ranks all tied on one measure, or (with controls) one measure's ranks fully explained by the controls' ranks:
    // the check is left out and the page says so; the main test stands.
    rho = undefined;
    leftOut.push({ check: 'spearman', reason: controls.length > 0 ? 'undefined-partial' : 'undefined' });
  }
  let tau: TestResult | undefined;
  let partialTau: PartialKendall | undefined;
  if (controls.length === 0) {
    try {
      tau = kendall(x, y, { alternative });
    } catch {
      leftOut.push({ check: 'kendall', reason: 'undefined' }); // as for Spearman: every unit tied on one measure
    }
  } else if (controls.length === 1) {
    try {
      partialTau = partialKendall(x, y, z[0] as number[]);
    } catch {
      leftOut.push({ check: 'kendall', reason: 'undefined-partial' });
    }
  } else {
    leftOut.push({ check: 'kendall', reason: 'several-controls' });
  }
  // With a few units and no ties the rank checks' p-values are exact (src/stats/rank-exact.ts): the t and normal
  // approximations are far off there (four units in perfect order: p < 0.001 by t, 0.083 exactly).
  const exact = controls.length === 0 ? exactRankPValues(x, y, alternative) : undefined;
  if (exact && rho) rho = { ...rho, p: exact.spearman, warnings: [] };
  if (exact && tau) tau = { ...tau, p: exact.kendall, warnings: [] };
  return {
    ...base,
    status: 'tested',
    test,
    ...(pOpposite !== undefined ? { pOpposite } : {}),
    observedSign: sign(test.estimate.value),
    fit: { intercept: line.intercept, slope: line.slope, rSquared: line.rSquared },
    ...(weightedCheck ? { weightedCheck } : {}),
    detectable: minDetectableCorrelation(points.length - controls.length, { alpha: 1 - claim.confidence, power: 0.8, sided }),
    totals: {
      x: points.reduce((s, p) => s + p.nx, 0),
      y: points.reduce((s, p) => s + p.ny, 0),
    },
    ...(rho ? { spearman: rho } : {}),
    ...(tau ? { kendall: tau } : {}),
    ...(partialTau ? { partialKendall: partialTau } : {}),
    ...(leftOut.length > 0 ? { rankChecksLeftOut: leftOut } : {}),
    methods: [
      controls.length > 0 ? 'partial-pearson' : 'pearson',
      controls.length > 0 ? 'partial-line' : 'least-squares',
      'power-correlation',
      ...(rho ? [rho.method] : []),
      ...(tau ? ['kendall-tau-b'] : []),
      ...(partialTau ? ['partial-kendall'] : []),
      ...(exact && (rho || tau) ? ['rank-exact'] : []),
    ],
  };
}
