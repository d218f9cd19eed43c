/**
 * Nonlinear least squares by Levenberg–Marquardt (Levenberg 1944; Marquardt 1963, with Marquardt's
 * scaling of the damping by diag(JᵀJ)), for a handful of parameters: minimise Σ rᵢ(θ)².
 *
 * The Jacobian is formed by forward differences with a step per parameter given by the caller.
 * Each iteration solves (JᵀJ + μ·diag(JᵀJ))·δ = −Jᵀr by Gaussian elimination with partial
 * pivoting; a step that lowers the sum of squares is taken and μ divided by 3, otherwise μ is
 * multiplied by 4. It stops when the relative drop of the sum of squares and every step are below
 * `tolerance` (relative to the parameter scale), or after `maxIterations`.
 *
 * Approximate covariance (the usual linearisation, e.g. Bates & Watts 1988, §2.3):
 * Cov(θ) ≈ s²·(JᵀJ)⁻¹ with s² = SSE/(n − p), J at the solution; the intervals θ ± t(n − p)·SE are
 * linearised, so they are only as good as the model is close to linear in θ over them.
 */
import { ValidationError } from '../validation';
import { studentTQuantile } from '../stats/distributions';

export interface LeastSquaresProblem {
  /** residuals at θ (a fixed-length list) */
  residuals(theta: readonly number[]): number[];
  /** starting values */
  readonly start: readonly number[];
  /** finite-difference step per parameter */
  readonly steps: readonly number[];
  /** optional bounds per parameter (steps are clipped into them) */
  readonly lower?: readonly number[];
  readonly upper?: readonly number[];
}

export interface LeastSquaresFit {
  readonly theta: number[];
  readonly sse: number;
  readonly residuals: number[];
  readonly iterations: number;
  readonly converged: boolean;
  /** residual degrees of freedom n − p */
  readonly dof: number;
  /** standard errors (null when JᵀJ is singular or n ≤ p) */
  readonly stdErrors: (number | null)[];
  /** confidence intervals at `confidence` (null where the standard error is) */
  readonly intervals: ([number, number] | null)[];
  readonly confidence: number;
  /** correlation matrix of the estimates (null when singular) */
  readonly correlation: number[][] | null;
}

/** Solves A·x = b (A square, copied) by Gaussian elimination with partial pivoting; null if singular. */
export function solveLinear(a: readonly (readonly number[])[], b: readonly number[]): number[] | null {
  const n = b.length;
  const m = a.map((row, i) => [...row, b[i]]);
  for (let k = 0; k < n; k++) {
    let piv = k;
    for (let i = k + 1; i < n; i++) if (Math.abs(m[i][k]) > Math.abs(m[piv][k])) piv = i;
    const scale = Math.max(...m.map((r) => Math.abs(r[k])));
    if (!(Math.abs(m[piv][k]) > 1e-14 * scale) || !Number.isFinite(m[piv][k])) return null;
    [m[k], m[piv]] = [m[piv], m[k]];
    for (let i = k + 1; i < n; i++) {
      const f = m[i][k] / m[k][k];
      for (let j = k; j <= n; j++) m[i][j] -= f * m[k][j];
    }
  }
  const x = new Array<number>(n).fill(0);
  for (let i = n - 1; i >= 0; i--) {
    let s = m[i][n];
    for (let j = i + 1; j < n; j++) s -= m[i][j] * x[j];
    x[i] = s / m[i][i];
  }
  return x;
}

function inverse(a: number[][]): number[][] | null {
  const n = a.length;
  const cols: number[][] = [];
  for (let j = 0; j < n; j++) {
    const e = new Array<number>(n).fill(0);
    e[j] = 1;
    const x = solveLinear(a, e);
    if (!x) return null;
    cols.push(x);
  }
  return a.map((_, i) => cols.map((c) => c[i]));
}

const sumSq = (r: readonly number[]) => r.reduce((s, v) => s + v * v, 0);

function clip(theta: number[], lo?: readonly number[], hi?: readonly number[]): number[] {
  return theta.map((t, i) => Math.min(hi?.[i] ?? Infinity, Math.max(lo?.[i] ?? -Infinity, t)));
}

function jacobian(p: LeastSquaresProblem, theta: number[], r0: number[]): number[][] {
  const J = r0.map(() => new Array<number>(theta.length).fill(0));
  theta.forEach((t, k) => {
    let h = p.steps[k];
    if (p.upper && t + h > p.upper[k]) h = -h;
    const th = [...theta];
    th[k] = t + h;
    const r = p.residuals(th);
    for (let i = 0; i < r0.length; i++) J[i][k] = (r[i] - r0[i]) / h;
  });
  return J;
}

function normal(J: number[][], r: number[]): { jtj: number[][]; jtr: number[] } {
  const p = J[0]?.length ?? 0;
  const jtj = Array.from({ length: p }, () => new Array<number>(p).fill(0));
  const jtr = new Array<number>(p).fill(0);
  for (let i = 0; i < J.length; i++)
    for (let a = 0; a < p; a++) {
      jtr[a] += J[i][a] * r[i];
      for (let b = 0; b < p; b++) jtj[a][b] += J[i][a] * J[i][b];
    }
  return { jtj, jtr };
}

export function levenbergMarquardt(p: LeastSquaresProblem, opts: { maxIterations?: number; tolerance?: number; confidence?: number } = {}): LeastSquaresFit {
  const maxIt = opts.maxIterations ?? 100;
  const tol = opts.tolerance ?? 1e-9;
  const confidence = opts.confidence ?? 0.95;
  let theta = clip([...p.start], p.lower, p.upper);
  let r = p.residuals(theta);
  const n = r.length;
  const np = theta.length;
  if (np === 0) throw new ValidationError('parameters', 0, 'at least one parameter to fit');
  if (r.some((v) => !Number.isFinite(v))) throw new ValidationError('start', p.start, 'starting values at which every residual is finite');
  let sse = sumSq(r);
  let mu = 1e-3;
  let converged = false;
  let it = 0;
  for (; it < maxIt && !converged; it++) {
    const J = jacobian(p, theta, r);
    const { jtj, jtr } = normal(J, r);
    let stepped = false;
    for (let tries = 0; tries < 30 && !stepped; tries++) {
      const a = jtj.map((row, i) => row.map((v, j) => (i === j ? v + mu * Math.max(v, 1e-12) : v)));
      const delta = solveLinear(a, jtr.map((v) => -v));
      if (!delta) {
        mu *= 4;
        continue;
      }
      const trial = clip(theta.map((t, i) => t + delta[i]), p.lower, p.upper);
      const rt = p.residuals(trial);
      const st = sumSq(rt);
      if (Number.isFinite(st) && st <= sse) {
        const small = trial.every((t, i) => Math.abs(t - theta[i]) <= tol * Math.max(1, Math.abs(theta[i]))) || sse - st <= tol * Math.max(sse, 1e-300);
        theta = trial;
        r = rt;
        sse = st;
        mu = Math.max(mu / 3, 1e-12);
        stepped = true;
        if (small) converged = true;
      } else mu *= 4;
    }
    if (!stepped) converged = true; // no descent direction left: at a minimum to working precision
  }
  const dof = n - np;
  const J = jacobian(p, theta, r);
  const { jtj } = normal(J, r);
  const inv = dof > 0 ? inverse(jtj) : null;
  const s2 = dof > 0 ? sse / dof : NaN;
  const stdErrors = theta.map((_, i) => (inv && inv[i][i] > 0 ? Math.sqrt(s2 * inv[i][i]) : null));
  const t = dof > 0 ? studentTQuantile(confidence, dof) : NaN;
  const intervals = theta.map((th, i) => {
    const se = stdErrors[i];
    return se === null ? null : ([th - t * se, th + t * se] as [number, number]);
  });
  const correlation = inv ? inv.map((row, i) => row.map((v, j) => v / Math.sqrt(inv[i][i] * inv[j][j]))) : null;
  return { theta, sse, residuals: r, iterations: it, converged, dof, stdErrors, intervals, confidence, correlation };
}
