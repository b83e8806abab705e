/**
 * The intersection–union test: a claim that holds only if every one of several statements holds ("the focus is above
 * each other unit", "each unit is above the value") is shown when each statement's own test rejects at level alpha.
 * Its p-value is the largest of the component p-values; no correction for multiplicity is needed within the claim,
 * because the claim's null hypothesis is the union of the components' null hypotheses and the test keeps its level
 * at every point of that union.
 *
 * Sources: R. L. Berger (1982), "Multiparameter hypothesis testing and acceptance sampling", Technometrics 24,
 * 295–300, Theorem 1; R. L. Berger and J. C. Hsu (1996), "Bioequivalence trials, intersection–union tests and
 * equivalence confidence sets", Statistical Science 11, 283–319, §2.
 *
 * Components are one-sided tests in the claimed direction. With `sided: 'two-sided'` each is held to the two-sided
 * level (its one-sided p-value doubled, capped at 1), the same as testing each at alpha / 2; a component whose
 * estimate lies the other way then has p = 1. A component that could not be run (a unit with too few respondents)
 * is passed as `missing`: the statement it stands for is not shown, so the test cannot reject and its p-value is 1.
 */
import type { Alternative, TestResult } from './result.js';

export interface IntersectionUnionOptions {
  /** Machine name of the combined test, e.g. 'rank-iut' (an entry in src/stats/methods.ts). */
  method: string;
  /** 'two-sided': each component at the two-sided level (p doubled). Default 'one-sided'. */
  sided?: 'one-sided' | 'two-sided';
  /** Components that could not be run; any makes the p-value 1. Default 0. */
  missing?: number;
  /** What the combined estimate is, with its value (e.g. the smallest lead over a rival). */
  estimate: { name: string; value: number };
}

export interface IntersectionUnionResult {
  test: TestResult;
  /** Each component's p-value as the test used it (doubled and capped for two-sided), in the order given. */
  componentP: number[];
  /** Index of the component with the largest p-value (the first, when several tie): the one that decides. */
  deciding: number;
}

/**
 * Combine one-sided component tests, all in the same direction ('less' or 'greater'), into an intersection–union
 * test: p = max over components. The statistic reported is the deciding component's.
 *
 * @throws Error when no component is given, or the components' alternatives are two-sided or differ.
 */
export function intersectionUnion(components: readonly TestResult[], options: IntersectionUnionOptions): IntersectionUnionResult {
  const fn = 'intersectionUnion';
  if (components.length === 0) throw new Error(`${fn}: no component tests were given; an intersection–union test needs at least one`);
  const direction = components[0]!.alternative;
  if (direction === 'two-sided') throw new Error(`${fn}: components must be one-sided tests in the claimed direction, not two-sided`);
  for (const c of components) {
    if (c.alternative !== direction) throw new Error(`${fn}: components test different directions (${direction} and ${c.alternative})`);
    if (!(c.p >= 0 && c.p <= 1)) throw new Error(`${fn}: a component p-value is ${c.p}, not a probability`);
  }
  const missing = options.missing ?? 0;
  if (!(Number.isInteger(missing) && missing >= 0)) throw new Error(`${fn}: missing must be a whole number of components, not ${missing}`);
  const twoSided = options.sided === 'two-sided';
  const componentP = components.map((c) => (twoSided ? Math.min(1, 2 * c.p) : c.p));
  let deciding = 0;
  componentP.forEach((p, i) => {
    if (p > (componentP[deciding] as number)) deciding = i;
  });
  const worst = componentP[deciding] as number;
  const alternative: Alternative = twoSided ? 'two-sided' : direction;
  const d = components[deciding] as TestResult;
  const warnings = [...new Set(components.flatMap((c) => c.warnings))];
  return {
    test: {
      method: options.method,
      ...(d.statistic !== undefined ? { statistic: d.statistic } : {}),
      p: missing > 0 ? 1 : worst,
      alternative,
      nullValue: d.nullValue,
      estimate: options.estimate,
      n: components.flatMap((c) => c.n),
      warnings,
    },
    componentP,
    deciding,
  };
}
