/**
 * Spreading factors shared by the Domenico and exact solutions: the lateral/vertical term
 * ½[erf((c + h)/s) − erf((c − h)/s)] for a source of half-extent h spread over length s, its
 * s → 0 limit, and its average over a well screen.
 */
import { erf, erfDiff, erfIntegral } from '../special/erf';

/** Depth interval of a receptor: a point when zTop === zBottom. */
export interface DepthSpan {
  readonly zTop: number;
  readonly zBottom: number;
}

/** erf(q/s) with the s → 0 limit sign(q) (and 0 at q = 0). */
export function erfRatioSafe(q: number, s: number): number {
  if (s > 0) return erf(q / s);
  return q > 0 ? 1 : q < 0 ? -1 : 0;
}

/** ½[erf((c + h)/s) − erf((c − h)/s)]: the lateral or vertical factor at one point (h ≥ 0). */
export function spreadFactor(c: number, h: number, s: number): number {
  if (s > 0) return 0.5 * erfDiff((c + h) / s, (c - h) / s);
  return 0.5 * (erfRatioSafe(c + h, s) - erfRatioSafe(c - h, s));
}

const GL3_X = [-0.7745966692414834, 0, 0.7745966692414834];
const GL3_W = [5 / 9, 8 / 9, 5 / 9];

/**
 * The vertical factor averaged over a screen [z1, z2] (closed form through the integral of erf;
 * 3-point Gauss–Legendre when the screen is short against the spreading length s, where the
 * closed form would cancel). For z1 = z2 it is the point value.
 */
export function depthFactor(span: DepthSpan, H: number, s: number): number {
  const z1 = span.zTop;
  const z2 = span.zBottom;
  const len = z2 - z1;
  if (!(len > 0)) return spreadFactor(z1, H, s);
  if (!(s > 0)) {
    const overlap = Math.max(0, Math.min(z2, H) - Math.max(z1, -H));
    return overlap / len;
  }
  if (len < 0.2 * s) {
    const c = 0.5 * (z1 + z2);
    let acc = 0;
    for (let k = 0; k < 3; k++) acc += GL3_W[k] * spreadFactor(c + 0.5 * len * GL3_X[k], H, s);
    return 0.5 * acc;
  }
  const val = (s / (2 * len)) * (erfIntegral((z2 + H) / s) - erfIntegral((z1 + H) / s) - erfIntegral((z2 - H) / s) + erfIntegral((z1 - H) / s));
  return Math.min(1, Math.max(0, val));
}

/**
 * The step dy when ys is evenly spaced and increasing to rounding (|ys[j] − (ys[0] + j·dy)| ≤
 * 8ε·max|y| for every j, at least 4 values), else 0.
 */
export function uniformStep(ys: ArrayLike<number>): number {
  const n = ys.length;
  if (n < 4) return 0;
  const y0 = ys[0];
  const dy = (ys[n - 1] - y0) / (n - 1);
  if (!(dy > 0) || !Number.isFinite(dy)) return 0;
  const tol = 8 * Number.EPSILON * Math.max(Math.abs(y0), Math.abs(ys[n - 1]));
  for (let j = 1; j < n - 1; j++) if (Math.abs(ys[j] - (y0 + j * dy)) > tol) return 0;
  return dy;
}
