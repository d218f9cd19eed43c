/**
 * Uncertainty of a water-table plane fitted to head readings: the least-squares covariance of the
 * fitted slope (a, b) = (∂h/∂x, ∂h/∂y) of h = a·x + b·y + c,
 *
 *   Cov(â, b̂) = s²·(XcᵀXc)⁻¹,   s² = Σ rᵢ² / (n − 3),
 *
 * with Xc the well positions centred on their mean (which separates the intercept) and rᵢ the
 * residuals (e.g. Draper & Smith 1998, Applied Regression Analysis, §5.2). It needs four or more
 * readings (n − 3 ≥ 1 degrees of freedom); with three the plane passes through every head and the
 * residuals say nothing about its uncertainty.
 *
 * Sampling it as a bivariate normal (â, b̂) + L·(z₁, z₂), L the Cholesky factor, is the usual
 * large-sample approximation; with few readings s² is itself uncertain (Student t with n − 3
 * degrees of freedom), so the spread is understated, and the result says so.
 */
import { ValidationError } from '../validation';
import { fitHeadPlane, headPlaneCovariance, type HeadPoint } from '../headPlane';

export interface PlaneSlopeCovariance {
  readonly a: number;
  readonly b: number;
  readonly caa: number;
  readonly cab: number;
  readonly cbb: number;
  /** n − 3 */
  readonly dof: number;
  /** residual standard deviation s, in the heads' unit */
  readonly s: number;
}

export function planeSlopeCovariance(points: readonly HeadPoint[]): PlaneSlopeCovariance {
  const n = points.length;
  if (n < 4) throw new ValidationError('headReadings', n, 'at least 4 head readings', 'the uncertainty of a fitted plane needs at least 4 head readings (3 fix the plane exactly)');
  // the fit and its covariance σ²·S⁻¹ are the head plane's own (headPlane.ts), with σ² estimated by s²
  const fit = fitHeadPlane([...points]);
  const s2 = fit.residuals.reduce((sum, r) => sum + r * r, 0) / (n - 3);
  const [[caa, cab], [, cbb]] = headPlaneCovariance([...points], Math.sqrt(s2));
  return { a: fit.a, b: fit.b, caa, cab, cbb, dof: n - 3, s: Math.sqrt(s2) };
}

/** (a, b) from two standard normal deviates through the Cholesky factor of the covariance. */
export function samplePlaneSlope(c: PlaneSlopeCovariance, z1: number, z2: number): { a: number; b: number } {
  const l11 = Math.sqrt(c.caa);
  const l21 = l11 > 0 ? c.cab / l11 : 0;
  const l22 = Math.sqrt(Math.max(0, c.cbb - l21 * l21));
  return { a: c.a + l11 * z1, b: c.b + l21 * z1 + l22 * z2 };
}
