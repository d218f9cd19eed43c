/**
 * The exact rectangular-source solution (patchSource.ts, Wexler 1992) on a whole flow-aligned grid,
 * with quadrature nodes shared by every column.
 *
 * Per column the engine's point method maps the time integral onto a variable that depends on x,
 * so each column needs its own lateral factors Y(y, τ) at its own nodes: (nodes × ny) error
 * function pairs per column. Here the variable depends on t only, so Y(y, τ_k) is computed once per
 * node for the whole grid and each column costs one multiply–add per (node, y):
 *
 *   C/C0(x, y) = e^{−x(u−v)/(2Dx)} ∫ g_x(τ(s)) · τ′(s) · e^{−γ(t−τ)} · Z(τ) · Y(y, τ) ds
 *   g_x(τ) = x/(2√(πDxτ³)) · exp(−(x − uτ)²/(4Dxτ)),  u = √(v² + 4λDx)
 *
 * (the first-passage density with the decay folded into u, as in oneD.ts), with
 *   τ = t·(1 − exp(−e^s)) for a finite horizon t, and τ = e^s at steady state.
 * For τ ≪ t the map is τ ≈ t·e^s, a logarithmic time; near τ = t it closes double-exponentially
 * (1 − τ/t = exp(−e^s)), so the integrand is smooth and decays double-exponentially at both ends
 * of the s-axis and the trapezoidal rule converges geometrically (Trefethen & Weideman 2014, SIAM
 * Review 56(3), "The exponentially convergent trapezoidal rule"; the end map is of the kind
 * Takahasi & Mori 1974 introduced).
 *
 * Window (truncation, bounded): in the Gaussian variable w = (x − uτ)/(2√(Dxτ)) the measure
 * g_x dτ is (2/√π)e^{−w²}·x/(x + uτ) dw ≤ (2/√π)e^{−w²} dw and 0 ≤ Y, Z, e^{−γ(t−τ)} ≤ 1, so
 * leaving out |w| > W_WIN = 5.5 loses at most erfc(5.5) ≈ 7.4e-15 (×2, both ends) of C/C0 per column
 * (before the column's scale). At a finite horizon the top of the s-axis is cut where the remaining
 * time t·exp(−e^s) carries at most (2/√π)·(x + ut)/(4√(Dx t))·exp(−e^s) ≤ 1e-18; both bounds are
 * added to the column's error estimate.
 *
 * Accuracy (stated): nested trapezoidal sums, spacing halved per column (each level adds only the
 * new midpoints) from a start of at least MIN_NODES nodes in the window, until
 *   max over y |T_h − T_2h| ≤ relTol · (largest C/C0 in the column) + absTol
 * (relTol = 1e-6, absTol = 1e-13 by default, as for the point method). For a geometrically
 * convergent rule the error of T_h is far below |T_h − T_2h|, which is therefore a conservative
 * estimate. The spacing never goes below the grid's finest level, set from the narrowest
 * first-passage peak: in s it has a standard deviation of about √(2Dx/(u·x)) (the inverse
 * Gaussian's coefficient of variation), and the finest spacing is a quarter of it or less.
 */
import { depthFactor, lateralLattice, spreadFactor, uniformStep, type DepthSpan } from './spread';
import { exactColumn, tauOf, type PatchParams } from './patchSource';
import { uMinusV } from './oneD';

const W_WIN = 5.5;
const ERFC_W_WIN = 7.357847917974398e-15; // erfc(5.5)
const MIN_NODES = 16;
const INV_TWO_SQRT_PI = 0.28209479177387814; // 1/(2√π)
const TWO_OVER_SQRT_PI = 1.1283791670955126;
/** finest spacing limit (2^−FINEST_CAP in s) for a degenerate, extremely narrow peak */
const FINEST_CAP = 24;
/** most nodes one column may use before it is handed to the per-column method */
const MAX_NODES = 4096;
/** longest fine-index range of one grid (beyond it the per-column method is used) */
const ARRAY_STORE = 1 << 20;

let nodeSlot = new Int32Array(0);
let nodeTau = new Float64Array(0);
let nodeInvTau = new Float64Array(0);
let nodeCommon = new Float64Array(0);
/** lateral factors ½[erf((y + W/2)/S) − erf((y − W/2)/S)] of the nodes, S = 2√(Dy τ), ny per node */
let pool = new Float64Array(0);
let poolUsed = 0;

/** What a shared-node grid did: its largest error estimate and how many columns it handed on. */
export interface SharedGridReport {
  errorEstimate: number;
  /** columns evaluated by the per-column method (too few nodes in the window, or no convergence) */
  fallbackColumns: number;
}

export interface GridOptions {
  readonly relTol?: number;
  readonly absTol?: number;
}

/**
 * C/C0 of the exact solution at (xs[i], ys[j]), times e^{logScale}, at time t (Infinity: steady
 * state, for a non-declining source only) into out[i·rowStride + offset + j]. Only columns with
 * x > 0 are written (and only when Dx > 0 and u > 0 or t is finite: returns false otherwise and
 * writes nothing, so the caller can use the per-column method). The largest error estimate (in
 * C/C0) and the number of columns handed to the per-column method come back through `report`.
 */
export function exactGridShared(
  xs: ArrayLike<number>,
  ys: ArrayLike<number>,
  depth: DepthSpan,
  t: number,
  p: PatchParams,
  logScale: number,
  out: Float64Array,
  rowStride: number,
  offset: number,
  opts: GridOptions = {},
  report?: SharedGridReport,
): boolean {
  const relTol = opts.relTol ?? 1e-6;
  const absTol = opts.absTol ?? 1e-13;
  const Dx = p.Dx;
  const w0 = uMinusV(p.v, Dx, p.lam);
  const u = p.v + w0;
  const finite = t !== Infinity;
  if (!(Dx > 0) || !(t > 0) || (!finite && !(u > 0)) || (!finite && p.gamma > 0)) return false;
  const ny = ys.length;
  const sqrtDx = Math.sqrt(Dx);
  const halfW = 0.5 * p.width;
  const dyUniform = uniformStep(ys);

  // finest spacing from the narrowest first-passage peak among the columns
  let sigmaMin = 1;
  for (let i = 0; i < xs.length; i++) {
    const x = xs[i];
    if (x > 0 && u > 0) sigmaMin = Math.min(sigmaMin, Math.sqrt((2 * Dx) / (u * x)));
  }
  let level = 2;
  while (level < FINEST_CAP && Math.pow(2, -level) > 0.25 * sigmaMin) level++;
  const hFine = Math.pow(2, -level);

  const tauOfS = finite ? (s: number) => -t * Math.expm1(-Math.exp(s)) : (s: number) => Math.exp(s);
  const dTauOfS = finite ? (s: number) => t * Math.exp(s - Math.exp(s)) : (s: number) => Math.exp(s);
  const sOfTau = finite ? (tau: number) => Math.log(-Math.log1p(-tau / t)) : (tau: number) => Math.log(tau);

  // nodes k (s = k·hFine) in [kBase, kBase + range): τ, 1/τ, the common factor, and the offset of
  // the lateral row in the pool (−1: not computed yet); module buffers, reused between calls
  let kBase = 0;
  const nodeAt = (k: number): number => {
    const idx = k - kBase;
    if (nodeSlot[idx] >= 0) return idx;
    const s = k * hFine;
    const tau = tauOfS(s);
    let common = 0;
    const off = poolUsed;
    poolUsed += ny;
    if (pool.length < poolUsed) {
      const grown = new Float64Array(Math.max(poolUsed, 2 * pool.length));
      grown.set(pool.subarray(0, off));
      pool = grown;
    }
    const Y = pool.subarray(off, off + ny);
    if (tau > 0) {
      const decline = p.gamma > 0 && finite ? Math.exp(-p.gamma * (t - tau)) : 1;
      const Z = depthFactor(depth, p.thickness, 2 * Math.sqrt(p.Dz * tau));
      common = (dTauOfS(s) * decline * Z) / (tau * Math.sqrt(tau));
      if (common > 0) {
        const S = 2 * Math.sqrt(p.Dy * tau);
        if (S > 0 && dyUniform > 0) {
          lateralLattice(ys[0], dyUniform, ny, halfW, S, false, 0, 0.5, Y, 0);
        } else {
          for (let j = 0; j < ny; j++) Y[j] = spreadFactor(ys[j], halfW, S);
        }
      }
    }
    nodeTau[idx] = tau;
    nodeInvTau[idx] = 1 / tau;
    nodeCommon[idx] = common;
    nodeSlot[idx] = off;
    return idx;
  };

  // windows in s per column: [kLo, kHi] in fine steps, the truncation bound, the column scale
  const nx = xs.length;
  const kLos = new Float64Array(nx);
  const kHis = new Float64Array(nx);
  const truncs = new Float64Array(nx);
  const scales = new Float64Array(nx);
  let kMin = Infinity;
  let kMax = -Infinity;
  for (let i = 0; i < nx; i++) {
    const x = xs[i];
    kLos[i] = NaN; // NaN: an empty window
    if (!(x > 0)) continue;
    const scale = Math.exp(logScale - (x * w0) / (2 * Dx));
    // τ at w = ±W_WIN, w = (x − uτ)/(2√(Dxτ))
    const setup = { x, u, sqrtDx, t };
    const tauLo = tauOf(W_WIN, setup);
    let tauHi = tauOf(-W_WIN, setup);
    let trunc = 2 * ERFC_W_WIN;
    let sHi: number;
    if (finite && !(tauHi < t)) {
      tauHi = t;
      // the remaining time t·exp(−e^s) carries ≤ coef·exp(−e^s): its w-length times the weight's peak
      const coef = (TWO_OVER_SQRT_PI * (x + u * t)) / (4 * sqrtDx * Math.sqrt(t));
      const E = Math.max(40, Math.log(Math.max(coef, 1)) + 41.5);
      sHi = Math.log(E);
      trunc += coef * Math.exp(-E);
    } else {
      sHi = sOfTau(tauHi);
    }
    scales[i] = scale;
    truncs[i] = trunc;
    if (!(scale > 0) || !(tauLo < tauHi)) continue;
    const kLo = Math.ceil(sOfTau(tauLo) / hFine);
    const kHi = Math.floor(sHi / hFine);
    kLos[i] = kLo;
    kHis[i] = kHi;
    if (kHi - kLo >= 2 * MIN_NODES) {
      kMin = Math.min(kMin, kLo);
      kMax = Math.max(kMax, kHi);
    }
  }
  // a node range beyond ARRAY_STORE (a first-passage peak narrower than ~1e-5 of its time, far
  // outside screening) is left to the per-column method
  if (kMin <= kMax && kMax - kMin >= ARRAY_STORE) return false;
  if (kMin <= kMax) {
    kBase = kMin;
    const range = kMax - kMin + 1;
    if (nodeSlot.length < range) {
      nodeSlot = new Int32Array(range);
      nodeTau = new Float64Array(range);
      nodeInvTau = new Float64Array(range);
      nodeCommon = new Float64Array(range);
    }
    nodeSlot.fill(-1, 0, range);
  }
  poolUsed = 0;

  const sums = new Float64Array(ny);
  const prev = new Float64Array(ny);
  let maxNodes = 0;
  for (let i = 0; i < nx; i++) if (kHis[i] - kLos[i] >= 0) maxNodes = Math.max(maxNodes, Math.min(MAX_NODES, kHis[i] - kLos[i] + 1));
  const gs = new Float64Array(maxNodes);
  const offs = new Int32Array(maxNodes);
  const inv4Dx = 1 / (4 * Dx);
  // Σ g_k·Y_kj over the nodes k ≡ 0 (mod step) in [kLo, kHi], leaving out multiples of skip;
  // four nodes per pass over the y values (a quarter of the loads and stores of the sums)
  const addNodes = (x: number, cx: number, kLo: number, kHi: number, step: number, skip: number): void => {
    let m = 0;
    for (let k = Math.ceil(kLo / step) * step; k <= kHi; k += step) {
      if (skip > 0 && k % skip === 0) continue;
      const idx = nodeAt(k);
      const common = nodeCommon[idx];
      if (common === 0) continue;
      const d = x - u * nodeTau[idx];
      const g = cx * common * Math.exp(-d * d * inv4Dx * nodeInvTau[idx]);
      if (!(g > 0)) continue;
      gs[m] = g;
      offs[m++] = nodeSlot[idx];
    }
    const P = pool;
    let q = 0;
    for (; q + 4 <= m; q += 4) {
      const g0 = gs[q], g1 = gs[q + 1], g2 = gs[q + 2], g3 = gs[q + 3];
      const o0 = offs[q], o1 = offs[q + 1], o2 = offs[q + 2], o3 = offs[q + 3];
      for (let j = 0; j < ny; j++) sums[j] += g0 * P[o0 + j] + g1 * P[o1 + j] + (g2 * P[o2 + j] + g3 * P[o3 + j]);
    }
    for (; q < m; q++) {
      const g = gs[q];
      const o = offs[q];
      for (let j = 0; j < ny; j++) sums[j] += g * P[o + j];
    }
  };
  let worst = 0;
  let fallback = 0;
  for (let i = 0; i < nx; i++) {
    const x = xs[i];
    if (!(x > 0)) continue;
    const row = i * rowStride + offset;
    const scale = scales[i];
    const kLo = kLos[i];
    const kHi = kHis[i];
    if (Number.isNaN(kLo)) {
      // the window is empty (the horizon comes before any arrival worth 1e-14 of C0): 0
      for (let j = 0; j < ny; j++) out[row + j] = 0;
      const e = scale > 0 ? truncs[i] * scale : 0;
      if (e > worst) worst = e;
      continue;
    }
    const trunc = truncs[i];
    // start stride: the coarsest power of two with at least MIN_NODES nodes in the window
    let stride = 1;
    while (stride < 1 << 30 && (kHi - kLo) / (stride * 2) >= MIN_NODES) stride *= 2;
    const cx = (x * INV_TWO_SQRT_PI) / sqrtDx;
    let converged = false;
    let est = 0;
    if (stride > 1) {
      sums.fill(0);
      addNodes(x, cx, kLo, kHi, stride, 0);
      while (stride > 1 && (kHi - kLo) / (stride >> 1) < MAX_NODES) {
        const hOld = stride * hFine;
        for (let j = 0; j < ny; j++) prev[j] = sums[j] * hOld;
        addNodes(x, cx, kLo, kHi, stride >> 1, stride);
        stride >>= 1;
        const h = stride * hFine;
        est = 0;
        let colMax = 0;
        for (let j = 0; j < ny; j++) {
          const T = sums[j] * h;
          const dd = Math.abs(T - prev[j]);
          if (dd > est) est = dd;
          if (T > colMax) colMax = T;
        }
        if (est + trunc <= relTol * colMax + absTol / scale) {
          converged = true;
          break;
        }
      }
    }
    if (!converged) {
      // too few fine nodes in the window, or not converged at the finest spacing (or within
      // MAX_NODES nodes): this column by
      // the per-column adaptive method (patchSource.ts), which has its own error control
      const r = exactColumn(x, ys, depth, t, p, logScale, out, row, 1, opts);
      if (r.errorEstimate > worst) worst = r.errorEstimate;
      fallback++;
      continue;
    }
    const h = stride * hFine;
    for (let j = 0; j < ny; j++) {
      const val = sums[j] * h * scale;
      out[row + j] = val > 0 ? val : 0;
    }
    const e = (est + trunc) * scale;
    if (e > worst) worst = e;
  }
  if (report) {
    report.errorEstimate = worst;
    report.fallbackColumns = fallback;
  }
  return true;
}
