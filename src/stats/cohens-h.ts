/**
 * Cohen's h, the effect size for the difference of two proportions on the arcsine scale.
 *
 * Source: J. Cohen (1988), Statistical Power Analysis for the Behavioral Sciences, 2nd ed., Lawrence Erlbaum,
 * chapter 6: h = 2 asin(sqrt(p1)) - 2 asin(sqrt(p2)), with |h| of 0.2, 0.5 and 0.8 called small, medium and large.
 */

/** Cohen's h for rates p1 and p2 (each in [0, 1]); positive when p1 is above p2. Ranges over [-pi, pi]. */
export function cohensH(p1: number, p2: number): number {
  for (const [name, v] of [
    ['p1', p1],
    ['p2', p2],
  ] as const) {
    if (!(v >= 0 && v <= 1)) throw new Error(`cohensH: ${name} must be a proportion between 0 and 1, got ${v}`);
  }
  return 2 * Math.asin(Math.sqrt(p1)) - 2 * Math.asin(Math.sqrt(p2));
}

export type EffectSizeLabel = 'negligible' | 'small' | 'medium' | 'large';

/** Cohen's (1988) conventional label for |h|: below 0.2 negligible, then small, medium (0.5), large (0.8). */
export function cohensHLabel(h: number): EffectSizeLabel {
  if (Number.isNaN(h)) throw new Error('cohensHLabel: h is NaN; a number is required');
  const a = Math.abs(h);
  return a < 0.2 ? 'negligible' : a < 0.5 ? 'small' : a < 0.8 ? 'medium' : 'large';
}
