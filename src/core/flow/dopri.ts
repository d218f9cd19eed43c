/**
 * One adaptive step of the Dormand–Prince 5(4) pair for an autonomous planar system
 * dp/dt = F(p) (Dormand & Prince 1980, J. Comput. Appl. Math. 6(1); coefficients as tabulated in
 * Hairer, Nørsett & Wanner 1993, Solving Ordinary Differential Equations I, table 5.2).
 *
 * The fifth-order solution is kept (local extrapolation); the difference to the embedded fourth-
 * order one estimates the local error of the fourth-order step, an upper estimate for the kept one.
 * A step is accepted when that estimate ≤ tol (absolute, in length units); the next step size is
 * h·min(5, max(0.2, 0.9·(tol/err)^{1/5})) (the usual safety factor and limits, Hairer et al. §II.4).
 * Stated error: each accepted step's local error ≤ tol (as estimated); a streamline of n steps
 * carries at most about n·tol.
 */

export type Field2 = (x: number, y: number, out: { x: number; y: number }) => void;

const A21 = 1 / 5;
const A31 = 3 / 40, A32 = 9 / 40;
const A41 = 44 / 45, A42 = -56 / 15, A43 = 32 / 9;
const A51 = 19372 / 6561, A52 = -25360 / 2187, A53 = 64448 / 6561, A54 = -212 / 729;
const A61 = 9017 / 3168, A62 = -355 / 33, A63 = 46732 / 5247, A64 = 49 / 176, A65 = -5103 / 18656;
const B1 = 35 / 384, B3 = 500 / 1113, B4 = 125 / 192, B5 = -2187 / 6784, B6 = 11 / 84;
// B − B* (fifth minus embedded fourth order weights)
const E1 = 71 / 57600, E3 = -71 / 16695, E4 = 71 / 1920, E5 = -17253 / 339200, E6 = 22 / 525, E7 = -1 / 40;

export interface StepState {
  x: number;
  y: number;
  /** F at (x, y) (first-same-as-last: reused as k1 of the next step) */
  fx: number;
  fy: number;
}

export interface StepResult {
  accepted: boolean;
  /** error estimate of the attempted step */
  err: number;
  /** suggested next step size */
  hNext: number;
}

const k = { x: 0, y: 0 };

/**
 * Attempts one step of size h from s (F at s already in s.fx, s.fy). On acceptance s is moved to
 * the new point with its F; on rejection s is unchanged. `sign` = −1 integrates backward.
 */
export function dopriStep(F: Field2, s: StepState, h: number, tol: number, sign: number, res: StepResult): void {
  const hs = h * sign;
  const x0 = s.x, y0 = s.y;
  const k1x = s.fx, k1y = s.fy;
  F(x0 + hs * A21 * k1x, y0 + hs * A21 * k1y, k);
  const k2x = k.x, k2y = k.y;
  F(x0 + hs * (A31 * k1x + A32 * k2x), y0 + hs * (A31 * k1y + A32 * k2y), k);
  const k3x = k.x, k3y = k.y;
  F(x0 + hs * (A41 * k1x + A42 * k2x + A43 * k3x), y0 + hs * (A41 * k1y + A42 * k2y + A43 * k3y), k);
  const k4x = k.x, k4y = k.y;
  F(x0 + hs * (A51 * k1x + A52 * k2x + A53 * k3x + A54 * k4x), y0 + hs * (A51 * k1y + A52 * k2y + A53 * k3y + A54 * k4y), k);
  const k5x = k.x, k5y = k.y;
  F(x0 + hs * (A61 * k1x + A62 * k2x + A63 * k3x + A64 * k4x + A65 * k5x), y0 + hs * (A61 * k1y + A62 * k2y + A63 * k3y + A64 * k4y + A65 * k5y), k);
  const k6x = k.x, k6y = k.y;
  const x1 = x0 + hs * (B1 * k1x + B3 * k3x + B4 * k4x + B5 * k5x + B6 * k6x);
  const y1 = y0 + hs * (B1 * k1y + B3 * k3y + B4 * k4y + B5 * k5y + B6 * k6y);
  F(x1, y1, k);
  const k7x = k.x, k7y = k.y;
  const ex = hs * (E1 * k1x + E3 * k3x + E4 * k4x + E5 * k5x + E6 * k6x + E7 * k7x);
  const ey = hs * (E1 * k1y + E3 * k3y + E4 * k4y + E5 * k5y + E6 * k6y + E7 * k7y);
  const err = Math.hypot(ex, ey);
  const factor = err === 0 ? 5 : Math.min(5, Math.max(0.2, 0.9 * Math.pow(tol / err, 0.2)));
  res.err = err;
  res.hNext = h * factor;
  res.accepted = err <= tol && Number.isFinite(x1) && Number.isFinite(y1);
  if (res.accepted) {
    s.x = x1;
    s.y = y1;
    s.fx = k7x;
    s.fy = k7y;
  }
}
