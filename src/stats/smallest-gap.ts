/**
 * The smallest gap at which a power function reaches a target power, shared by the minimum-detectable-gap searches
 * of the one- and two-proportion tests.
 *
 * Source: bisection on a bracketed monotone function, as in W. H. Press et al. (2007), Numerical Recipes, 3rd ed.,
 * section 9.1; halving stops when the midpoint no longer falls strictly inside the bracket, which is full double
 * precision.
 */

/**
 * The smallest delta in (0, max] with power(delta) >= target, for a power function that rises with delta; null when
 * even power(max) falls short. Returns the upper end of the final bracket, so the power there is at least the target.
 */
export function smallestGapReaching(power: (delta: number) => number, max: number, target: number): number | null {
  if (power(max) < target) return null;
  let lo = 0;
  let hi = max;
  for (let i = 0; i < 200; i++) {
    const mid = lo + (hi - lo) / 2;
    if (mid <= lo || mid >= hi) break;
    if (power(mid) < target) lo = mid;
    else hi = mid;
  }
  return hi;
}
