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
 * leaving out |w| > W_WIN = 6.5 loses at most erfc(6.5) ≈ 3.8e-20 (×2, both ends) of C/C0 per column
 * (before the column's scale). At a finite horizon the top of the s-axis is cut where the remaining
 * time t·exp(−e^s) carries at most (2/√π)·(x + ut)/(4√(Dx t))·exp(−e^s) ≤ 3e-20; both bounds are
 * added to the column's error estimate.
 *
 * Accuracy (stated): nested trapezoidal sums, spacing halved per column (each level adds only the
 * new midpoints) from a start of at least MIN_NODES nodes in the window, until
 *   max over y |T_h − T_2h| ≤ relTol · (largest C/C0 in the column) + absTol
 * (relTol = 1e-6, absTol = 1e-18 by default, EXACT_TOLERANCES, as for the point method). For a geometrically
 * convergent rule the error of T_h is far below |T_h − T_2h|, which is therefore a conservative
 * estimate. The spacing never goes below the grid's finest level, set from the narrowest
 * first-passage peak: in s it has a standard deviation of about √(2Dx/(u·x)) (the inverse
 * Gaussian's coefficient of variation), and the finest spacing is a quarter of it or less.
 */
import { depthFactor, spreadFactor, uniformStep, type DepthSpan } from './spread';
import { lateralLattice } from '../lattice';
import { exactColumn, exactTolerances, tauOf, type ExactOptions, type PatchParams } from './patchSource';
import { uMinusV } from './oneD';

const W_WIN = 6.5;
const ERFC_W_WIN = 3.8421483271206475e-20; // erfc(6.5)
const MIN_NODES = 16;
const INV_TWO_SQRT_PI = 0.28209479177387814; // 1/(2√π)
const TWO_OVER_SQRT_PI = 1.1283791670955126;
/** finest spacing limit (2^−FINEST_CAP in s) for a degenerate, extremely narrow peak */
const FINEST_CAP = 24;
/** most nodes one column may use before it is handed to the per-column method */
const MAX_NODES = 4096;
/** longest fine-index range of one grid (beyond it the per-column method is used) */
const ARRAY_STORE = 1 << 20;

/** What a shared-node grid did: its largest error estimate and how many columns it handed on. */
export interface SharedGridReport {
  errorEstimate: number;
  /** columns evaluated by the per-column method (too few nodes in the window, or no convergence) */
  fallbackColumns: number;
}

/** The time variable s of a horizon t: τ(s), dτ/ds and s(τ). */
interface TimeMap {
  tau(s: number): number;
  dTau(s: number): number;
  s(tau: number): number;
}

/** τ = t·(1 − exp(−e^s)) for a finite horizon t, τ = e^s at steady state (t = Infinity). */
function timeMap(t: number): TimeMap {
  if (t === Infinity) return { tau: (s) => Math.exp(s), dTau: (s) => Math.exp(s), s: (tau) => Math.log(tau) };
  return {
    tau: (s) => -t * Math.expm1(-Math.exp(s)),
    dTau: (s) => t * Math.exp(s - Math.exp(s)),
    s: (tau) => Math.log(-Math.log1p(-tau / t)),
  };
}

/** The finest spacing in s: 2^−level, a quarter of the narrowest first-passage peak's width or less. */
function finestSpacing(xs: ArrayLike<number>, Dx: number, u: number): number {
  let sigmaMin = 1;
  for (let i = 0; i < xs.length; i++) {
    const x = xs[i];
    if (x > 0 && u > 0) sigmaMin = Math.min(sigmaMin, Math.sqrt((2 * Dx) / (u * x)));
  }
  let level = 2;
  while (level < FINEST_CAP && Math.pow(2, -level) > 0.25 * sigmaMin) level++;
  return Math.pow(2, -level);
}

/** Each column's window in fine steps [kLo, kHi] (kLo NaN: empty), truncation bound and scale. */
interface ColumnWindows {
  readonly kLo: Float64Array;
  readonly kHi: Float64Array;
  readonly trunc: Float64Array;
  readonly scale: Float64Array;
  /** the node range the columns with enough nodes use (kMin > kMax: none) */
  readonly kMin: number;
  readonly kMax: number;
}

/** The window |w| ≤ W_WIN of every column in s, with its bounded truncation (see the header). */
function columnWindows(xs: ArrayLike<number>, t: number, p: PatchParams, logScale: number, hFine: number, map: TimeMap): ColumnWindows {
  const Dx = p.Dx;
  const w0 = uMinusV(p.v, Dx, p.lam);
  const u = p.v + w0;
  const sqrtDx = Math.sqrt(Dx);
  const finite = t !== Infinity;
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
      const E = Math.max(45, Math.log(Math.max(coef, 1)) + 45);
      sHi = Math.log(E);
      trunc += coef * Math.exp(-E);
    } else {
      sHi = map.s(tauHi);
    }
    scales[i] = scale;
    truncs[i] = trunc;
    if (!(scale > 0) || !(tauLo < tauHi)) continue;
    const kLo = Math.ceil(map.s(tauLo) / hFine);
    const kHi = Math.floor(sHi / hFine);
    kLos[i] = kLo;
    kHis[i] = kHi;
    if (kHi - kLo >= 2 * MIN_NODES) {
      kMin = Math.min(kMin, kLo);
      kMax = Math.max(kMax, kHi);
    }
  }
  return { kLo: kLos, kHi: kHis, trunc: truncs, scale: scales, kMin, kMax };
}

/**
 * The nodes s = k·hFine of one grid, k in [kBase, kBase + range), computed on first use and kept
 * for every column: τ, 1/τ, the factor common to all columns (dτ/ds · decline · Z / τ^{3/2}) and
 * the offset in `pool` of the node's ny lateral factors ½[erf((y + W/2)/S) − erf((y − W/2)/S)],
 * S = 2√(Dy τ). One store per grid call: nothing is shared between calls.
 */
class NodeStore {
  readonly slot: Int32Array;
  readonly tau: Float64Array;
  readonly invTau: Float64Array;
  readonly common: Float64Array;
  pool = new Float64Array(0);
  private poolUsed = 0;
  private readonly dyUniform: number;

  constructor(
    private readonly kBase: number,
    range: number,
    private readonly hFine: number,
    private readonly map: TimeMap,
    private readonly t: number,
    private readonly ys: ArrayLike<number>,
    private readonly depth: DepthSpan,
    private readonly p: PatchParams,
  ) {
    this.slot = new Int32Array(range).fill(-1);
    this.tau = new Float64Array(range);
    this.invTau = new Float64Array(range);
    this.common = new Float64Array(range);
    this.dyUniform = uniformStep(ys);
  }

  /** the index of node k, computing it on first use */
  at(k: number): number {
    const idx = k - this.kBase;
    if (this.slot[idx] >= 0) return idx;
    const { p, ys, t } = this;
    const ny = ys.length;
    const s = k * this.hFine;
    const tau = this.map.tau(s);
    let common = 0;
    const off = this.poolUsed;
    this.poolUsed += ny;
    if (this.pool.length < this.poolUsed) {
      const grown = new Float64Array(Math.max(this.poolUsed, 2 * this.pool.length));
      grown.set(this.pool.subarray(0, off));
      this.pool = grown;
    }
    const Y = this.pool.subarray(off, off + ny);
    if (tau > 0) {
      const decline = p.gamma > 0 && t !== Infinity ? Math.exp(-p.gamma * (t - tau)) : 1;
      const Z = depthFactor(this.depth, p.thickness, 2 * Math.sqrt(p.Dz * tau));
      common = (this.map.dTau(s) * decline * Z) / (tau * Math.sqrt(tau));
      if (common > 0) {
        const halfW = 0.5 * p.width;
        const S = 2 * Math.sqrt(p.Dy * tau);
        if (S > 0 && this.dyUniform > 0) {
          lateralLattice(ys[0], this.dyUniform, ny, halfW, S, false, 0, 0.5, Y, 0);
        } else {
          for (let j = 0; j < ny; j++) Y[j] = spreadFactor(ys[j], halfW, S);
        }
      }
    }
    this.tau[idx] = tau;
    this.invTau[idx] = 1 / tau;
    this.common[idx] = common;
    this.slot[idx] = off;
    return idx;
  }
}

/** One column's trapezoidal sums over y (per-call scratch, reused from column to column). */
class ColumnSums {
  readonly sums: Float64Array;
  readonly prev: Float64Array;
  private readonly gs: Float64Array;
  private readonly offs: Int32Array;
  private readonly u: number;
  private readonly inv4Dx: number;

  constructor(ny: number, maxNodes: number, p: PatchParams) {
    this.sums = new Float64Array(ny);
    this.prev = new Float64Array(ny);
    this.gs = new Float64Array(maxNodes);
    this.offs = new Int32Array(maxNodes);
    this.u = p.v + uMinusV(p.v, p.Dx, p.lam);
    this.inv4Dx = 1 / (4 * p.Dx);
  }

  /**
   * sums[j] += Σ g_k·Y_kj over the nodes k ≡ 0 (mod step) in [kLo, kHi], leaving out multiples of
   * skip, g_k = cx·common_k·exp(−(x − uτ_k)²/(4Dxτ_k)); four nodes per pass over the y values (a
   * quarter of the loads and stores of the sums).
   */
  addNodes(nodes: NodeStore, x: number, cx: number, kLo: number, kHi: number, step: number, skip: number): void {
    const { gs, offs, sums, u, inv4Dx } = this;
    const ny = sums.length;
    let m = 0;
    for (let k = Math.ceil(kLo / step) * step; k <= kHi; k += step) {
      if (skip > 0 && k % skip === 0) continue;
      const idx = nodes.at(k);
      const common = nodes.common[idx];
      if (common === 0) continue;
      const d = x - u * nodes.tau[idx];
      const g = cx * common * Math.exp(-d * d * inv4Dx * nodes.invTau[idx]);
      if (!(g > 0)) continue;
      gs[m] = g;
      offs[m++] = nodes.slot[idx];
    }
    const P = nodes.pool; // read after the loop: computing a node may have grown it
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
  }
}

/**
 * One column by nested trapezoidal sums: from the coarsest power-of-two stride with at least
 * MIN_NODES nodes in [kLo, kHi], halved until max over y |T_h − T_2h| + trunc ≤ relTol·(column max)
 * + absTolScaled, within MAX_NODES nodes. On success the column's sums (times the spacing) are in
 * acc.sums; returns the spacing h and the estimate, or null when it did not converge.
 */
function trapezoidColumn(
  nodes: NodeStore,
  acc: ColumnSums,
  x: number,
  cx: number,
  kLo: number,
  kHi: number,
  hFine: number,
  trunc: number,
  relTol: number,
  absTolScaled: number,
): { h: number; est: number } | null {
  const { sums, prev } = acc;
  const ny = sums.length;
  let stride = 1;
  while (stride < 1 << 30 && (kHi - kLo) / (stride * 2) >= MIN_NODES) stride *= 2;
  if (!(stride > 1)) return null;
  sums.fill(0);
  acc.addNodes(nodes, x, cx, kLo, kHi, stride, 0);
  while (stride > 1 && (kHi - kLo) / (stride >> 1) < MAX_NODES) {
    const hOld = stride * hFine;
    for (let j = 0; j < ny; j++) prev[j] = sums[j] * hOld;
    acc.addNodes(nodes, x, cx, kLo, kHi, stride >> 1, stride);
    stride >>= 1;
    const h = stride * hFine;
    let est = 0;
    let colMax = 0;
    for (let j = 0; j < ny; j++) {
      const T = sums[j] * h;
      const dd = Math.abs(T - prev[j]);
      if (dd > est) est = dd;
      if (T > colMax) colMax = T;
    }
    if (est + trunc <= relTol * colMax + absTolScaled) return { h, est };
  }
  return null;
}

/**
 * C/C0 of the exact solution at (xs[i], ys[j]), times e^{logScale}, at time t (Infinity: steady
 * state, for a non-declining source only) into out[i·rowStride + offset + j]. Only columns with
 * x > 0 are written (and only when Dx > 0 and u > 0 or t is finite: returns false otherwise and
 * writes nothing, so the caller can use the per-column method). The largest error estimate (in
 * C/C0) and the number of columns handed to the per-column method come back through `report`.
 * All scratch belongs to the call, so grids may be computed side by side.
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
  opts: ExactOptions = {},
  report?: SharedGridReport,
): boolean {
  const { relTol, absTol } = exactTolerances(opts);
  const Dx = p.Dx;
  const u = p.v + uMinusV(p.v, Dx, p.lam);
  const finite = t !== Infinity;
  if (!(Dx > 0) || !(t > 0) || (!finite && !(u > 0)) || (!finite && p.gamma > 0)) return false;
  const ny = ys.length;
  const hFine = finestSpacing(xs, Dx, u);
  const map = timeMap(t);
  const win = columnWindows(xs, t, p, logScale, hFine, map);
  // a node range beyond ARRAY_STORE (a first-passage peak narrower than ~1e-5 of its time, far
  // outside screening) is left to the per-column method
  if (win.kMin <= win.kMax && win.kMax - win.kMin >= ARRAY_STORE) return false;
  const nodes = new NodeStore(win.kMin <= win.kMax ? win.kMin : 0, win.kMin <= win.kMax ? win.kMax - win.kMin + 1 : 0, hFine, map, t, ys, depth, p);

  const nx = xs.length;
  let maxNodes = 0;
  for (let i = 0; i < nx; i++) if (win.kHi[i] - win.kLo[i] >= 0) maxNodes = Math.max(maxNodes, Math.min(MAX_NODES, win.kHi[i] - win.kLo[i] + 1));
  const acc = new ColumnSums(ny, maxNodes, p);
  const sqrtDx = Math.sqrt(Dx);
  let worst = 0;
  let fallback = 0;
  for (let i = 0; i < nx; i++) {
    const x = xs[i];
    if (!(x > 0)) continue;
    const row = i * rowStride + offset;
    const scale = win.scale[i];
    const kLo = win.kLo[i];
    if (Number.isNaN(kLo)) {
      // the window is empty (the horizon comes before any arrival worth 1e-14 of C0): 0
      for (let j = 0; j < ny; j++) out[row + j] = 0;
      const e = scale > 0 ? win.trunc[i] * scale : 0;
      if (e > worst) worst = e;
      continue;
    }
    const trunc = win.trunc[i];
    const cx = (x * INV_TWO_SQRT_PI) / sqrtDx;
    const done = trapezoidColumn(nodes, acc, x, cx, kLo, win.kHi[i], hFine, trunc, relTol, absTol / scale);
    if (done === null) {
      // too few fine nodes in the window, or not converged at the finest spacing (or within
      // MAX_NODES nodes): this column by the per-column adaptive method (patchSource.ts), which
      // has its own error control
      const r = exactColumn(x, ys, depth, t, p, logScale, out, row, 1, opts);
      if (r.errorEstimate > worst) worst = r.errorEstimate;
      fallback++;
      continue;
    }
    const sums = acc.sums;
    for (let j = 0; j < ny; j++) {
      const val = sums[j] * done.h * scale;
      out[row + j] = val > 0 ? val : 0;
    }
    const e = (done.est + trunc) * scale;
    if (e > worst) worst = e;
  }
  if (report) {
    report.errorEstimate = worst;
    report.fallbackColumns = fallback;
  }
  return true;
}
