// The standard normal distribution from an outside implementation (@stdlib's erfc), for tests that
// check Monte Carlo percentiles against analytical quantiles.
import stdlibErfc from '@stdlib/math-base-special-erfc';

/** P(Z > z) for a standard normal Z: ½·erfc(z/√2). */
export const upperTail = (z: number): number => 0.5 * stdlibErfc(z / Math.SQRT2);

/** Φ⁻¹(q), by bisection on upperTail (200 halvings of [−10, 10]). */
export function normalQuantileRef(q: number): number {
  let lo = -10;
  let hi = 10;
  for (let it = 0; it < 200; it++) {
    const mid = 0.5 * (lo + hi);
    if (1 - upperTail(mid) < q) lo = mid;
    else hi = mid;
  }
  return 0.5 * (lo + hi);
}
