/**
 * Student's t for the regression intervals (the normal distribution is in uncertainty/normal.ts).
 *
 * - Student's t with an integer number of degrees of freedom ν: the central probability
 *   A(t|ν) = P(|T| ≤ t) by the finite series of Abramowitz & Stegun (1964) 26.7.3 (ν odd) and
 *   26.7.4 (ν even) in θ = atan(t/√ν), exact up to rounding (a sum of ⌈ν/2⌉ positive terms).
 *   The quantile inverts A by bisection.
 */
import { ValidationError } from '../validation';

function requireDegrees(nu: number): void {
  if (!Number.isInteger(nu) || nu < 1 || nu > 1e6)
    throw new ValidationError('degreesOfFreedom', nu, 'a whole number from 1 to 1e6');
}

/** Student's t central probability A(t|ν) = P(|T| ≤ |t|) (Abramowitz & Stegun 26.7.3–4). */
export function studentTCentral(t: number, nu: number): number {
  requireDegrees(nu);
  const theta = Math.atan(Math.abs(t) / Math.sqrt(nu));
  const s = Math.sin(theta);
  const c = Math.cos(theta);
  const c2 = c * c;
  if (nu % 2 === 0) {
    // sinθ·[1 + ½cos²θ + (1·3)/(2·4)cos⁴θ + … + (1·3…(ν−3))/(2·4…(ν−2))cos^(ν−2)θ]
    let term = 1;
    let sum = 1;
    for (let k = 2; k <= nu - 2; k += 2) {
      term *= ((k - 1) / k) * c2;
      sum += term;
    }
    return Math.min(1, s * sum);
  }
  if (nu === 1) return (2 / Math.PI) * theta;
  // (2/π)·[θ + sinθcosθ·(1 + (2/3)cos²θ + … + (2·4…(ν−3))/(1·3…(ν−2))cos^(ν−3)θ)]
  let term = 1;
  let sum = 1;
  for (let k = 2; k <= nu - 3; k += 2) {
    term *= (k / (k + 1)) * c2;
    sum += term;
  }
  return Math.min(1, (2 / Math.PI) * (theta + s * c * sum));
}

/** Student's t two-sided p-value for |t|: P(|T| ≥ |t|). */
export function studentTTwoSided(t: number, nu: number): number {
  return Math.max(0, 1 - studentTCentral(t, nu));
}

/**
 * The t value with central probability `central` (e.g. 0.95 → the 97.5 % quantile), ν integer.
 */
export function studentTQuantile(central: number, nu: number): number {
  requireDegrees(nu);
  if (!(central > 0 && central < 1))
    throw new ValidationError('confidence', central, 'a number strictly between 0 and 1');
  let a = 0;
  let b = 1;
  while (studentTCentral(b, nu) < central && b < 1e12) b *= 2;
  for (let i = 0; i < 200 && b - a > 4e-16 * b; i++) {
    const m = 0.5 * (a + b);
    if (studentTCentral(m, nu) < central) a = m;
    else b = m;
  }
  return 0.5 * (a + b);
}
