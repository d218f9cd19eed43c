/**
 * Ordinary least-squares straight line y = a + b·x with the textbook standard error of the slope
 * and its Student-t confidence interval (e.g. Draper & Smith 1998, Applied Regression Analysis,
 * ch. 1): b = Sxy/Sxx, s² = SSE/(n − 2), SE(b) = s/√Sxx, b ± t(ν = n − 2)·SE(b). Sums are formed
 * about the means so that large offsets (dates in days) do not cancel.
 */
import { ValidationError, requireFiniteEach } from '../validation';
import { studentTQuantile } from './distributions';

export interface LineFit {
  readonly n: number;
  readonly slope: number;
  readonly intercept: number;
  /** standard error of the slope; null when n = 2 (no residual degrees of freedom) */
  readonly slopeStdError: number | null;
  /** confidence interval of the slope at `confidence`; null when n = 2 */
  readonly slopeInterval: readonly [number, number] | null;
  readonly confidence: number;
  /** coefficient of determination R² (1 when the points lie on the line) */
  readonly rSquared: number;
  /** residual standard deviation s (null when n = 2) */
  readonly residualStd: number | null;
  readonly meanX: number;
}

export function fitLine(xs: ArrayLike<number>, ys: ArrayLike<number>, confidence = 0.95): LineFit {
  const n = xs.length;
  if (ys.length !== n) throw new ValidationError('values', ys.length, `as many values as positions (${n})`);
  if (n < 2) throw new ValidationError('points', n, 'at least 2 points');
  requireFiniteEach('x', xs);
  requireFiniteEach('y', ys);
  let mx = 0;
  let my = 0;
  for (let i = 0; i < n; i++) {
    mx += xs[i];
    my += ys[i];
  }
  mx /= n;
  my /= n;
  let sxx = 0;
  let sxy = 0;
  let syy = 0;
  for (let i = 0; i < n; i++) {
    const dx = xs[i] - mx;
    const dy = ys[i] - my;
    sxx += dx * dx;
    sxy += dx * dy;
    syy += dy * dy;
  }
  if (!(sxx > 0)) throw new ValidationError('x', xs[0], 'at least two different positions (all points are at one x)');
  const slope = sxy / sxx;
  const intercept = my - slope * mx;
  const sse = Math.max(0, syy - slope * sxy);
  const rSquared = syy > 0 ? Math.min(1, Math.max(0, 1 - sse / syy)) : 1;
  if (n === 2)
    return { n, slope, intercept, slopeStdError: null, slopeInterval: null, confidence, rSquared, residualStd: null, meanX: mx };
  const s = Math.sqrt(sse / (n - 2));
  const se = s / Math.sqrt(sxx);
  const t = studentTQuantile(confidence, n - 2);
  return {
    n,
    slope,
    intercept,
    slopeStdError: se,
    slopeInterval: [slope - t * se, slope + t * se],
    confidence,
    rSquared,
    residualStd: s,
    meanX: mx,
  };
}
