/**
 * Exact solution for a vertical rectangular source plane at x = 0 (width W centred on y = 0,
 * thickness H down from the water table) held at C0 from t = 0 — or at C0·e^{−γt}, a declining
 * source, which multiplies the integrand by e^{−γ(t − τ)} (Duhamel's principle) — in a
 * semi-infinite aquifer x > 0 with uniform flow along x, first-order decay and no flux across the
 * water table z = 0 (an image source above it, so the source spans −H…H in an infinite medium):
 *
 *   C/C0 = ∫₀ᵗ f(τ) · Y(y, τ) · Z(z, τ) dτ
 *   f(τ) = x/(2√(πDxτ³)) exp(−(x − vτ)²/(4Dxτ) − λτ)          (first-passage density, see oneD.ts)
 *   Y    = ½[erf((y + W/2)/(2√(Dyτ))) − erf((y − W/2)/(2√(Dyτ)))]
 *   Z    = ½[erf((z + H)/(2√(Dzτ))) − erf((z − H)/(2√(Dzτ)))]
 *
 * (Wexler 1992, "Analytical solutions for one-, two-, and three-dimensional solute transport in
 * ground-water systems with uniform flow", USGS TWRI 3-B7, the finite patch source, with v and D
 * divided by R). For W, H → ∞ it is the Ogata–Banks solution.
 *
 * Method: with u = √(v² + 4λDx), the substitution w = (x − uτ)/(2√(Dxτ)) turns the measure into a
 * Gaussian,  f(τ)dτ = e^{−x(u−v)/(2Dx)} · (2/√π)·e^{−w²}·x/(x + uτ(w)) dw,  with τ(w) in closed
 * form (the positive root of a quadratic in √τ). Y and Z are smooth in w at both ends: early
 * arrivals (w → +∞) enter as Gaussians in w, late arrivals (w → −∞) under the Gaussian weight, so
 * no end-point singularity and no sharp arrival peak remains, whatever the Peclet number (very
 * near the source the factor x/(x + uτ) has a feature of width √(ux/(4Dx)) around w = 0, met by a
 * geometric ladder of initial panels there). The w
 * integral over [max(w(t), −W_CUT), W_CUT] (W_CUT = 8.5: the neglected weight is below e^{−72})
 * is computed by adaptive 7/15-point Gauss–Kronrod quadrature (Piessens et al. 1983, QUADPACK),
 * vector-valued over a whole column of y values at one x, so every cell of a column shares the
 * same nodes. Panels are bisected, worst first, until the summed |Kronrod − Gauss| estimate is
 * below relTol·max(column) + absTol. (The same substitution is used by bench/numpy_grids.py with a
 * fixed rule; the tests check this engine against independent quadratures and particle walks.)
 *
 * Stated accuracy: error estimate ≤ relTol × (largest C/C0 in the column) + absTol, with
 * relTol = 1e-6 and absTol = 1e-18 by default (EXACT_TOLERANCES). A point value is a column of one,
 * so it is within 1e-6 of itself (+1e-18): 1e-6 relative for every value ≥ 1e-12, the advancing
 * front included (test/core/solutions/patchSource.front.test.ts checks 40-digit mpmath values there). Cells of a
 * longer column far below its largest value carry the same absolute, not relative, accuracy.
 * (absTol was 1e-13 until issue 12: values below 1e-7 then carried only 1e-13 absolute, up to
 * 1e-2 relative at 1e-12.)
 */
import { depthFactor, erfRatioSafe, type DepthSpan } from './spread';
import { erfDiff } from '../special/erf';
import { GAUSS_W, KRONROD_W, panelNodes } from '../special/gaussKronrod';
import { uMinusV } from './oneD';

export interface PatchParams {
  /** retarded seepage velocity v/R */
  readonly v: number;
  /** retarded dispersion coefficients D/R (including diffusion) */
  readonly Dx: number;
  readonly Dy: number;
  readonly Dz: number;
  /** effective first-order decay rate λ ≥ 0 */
  readonly lam: number;
  /** first-order decline of the source concentration γ ≥ 0: the source is C0·e^{−γt'} */
  readonly gamma: number;
  readonly width: number;
  readonly thickness: number;
}

export type { DepthSpan };

export interface ExactOptions {
  readonly relTol?: number;
  readonly absTol?: number;
  readonly maxPanels?: number;
}

/** The exact solution's default error control (the stated accuracy above), shared by the point,
 * series and grid methods: relTol, absTol in C/C0, and the per-column panel budget. */
export const EXACT_TOLERANCES = Object.freeze({ relTol: 1e-6, absTol: 1e-18, maxPanels: 500 });

/** opts with every tolerance filled in from EXACT_TOLERANCES. */
export function exactTolerances(opts: ExactOptions = {}): Required<ExactOptions> {
  return {
    relTol: opts.relTol ?? EXACT_TOLERANCES.relTol,
    absTol: opts.absTol ?? EXACT_TOLERANCES.absTol,
    maxPanels: opts.maxPanels ?? EXACT_TOLERANCES.maxPanels,
  };
}

export interface ColumnResult {
  /** the largest error estimate over the column, in C/C0 */
  errorEstimate: number;
  panels: number;
}

const TWO_OVER_SQRT_PI = 1.1283791670955126;
/** the w range kept: e^{−W_CUT²} ≈ 1.7e-32 of the weight is left out at either end */
const W_CUT = 8.5;
/** initial panel width in w (about two standard deviations of the Gaussian weight) */
const PANEL_W = 2.125;

/**
 * Initial panel breaks on [lo, hi]: every PANEL_W, plus 0 and a geometric ladder ±δ·4^k when
 * δ = √(u·x/(4Dx)) is small. Near the source (small u·x/Dx) the factor x/(x + uτ(w)) falls from 1
 * to 0 like 1/(1 + (w/δ)²) for w < 0 and rises like 1/(1 + (δ/w)²) for w > 0, a feature of width δ
 * around w = 0 that a coarse first panel would step over.
 */
function initialCuts(lo: number, hi: number, delta: number): number[] {
  const cuts = [lo, hi];
  for (let w = lo + PANEL_W; w < hi - 1e-9; w += PANEL_W) cuts.push(w);
  if (lo < 0 && hi > 0) cuts.push(0);
  if (delta > 0 && delta < PANEL_W / 2) {
    const reach = Math.max(-lo, hi);
    for (let d = delta; d < reach; d *= 4) {
      if (-d > lo && -d < hi) cuts.push(-d);
      if (d > lo && d < hi) cuts.push(d);
    }
  }
  cuts.sort((a, b) => a - b);
  return cuts.filter((w, i) => i === 0 || w > cuts[i - 1]);
}

interface Panel {
  a: number;
  b: number;
  kron: Float64Array;
  err: number;
}

/** The column's fixed quantities: x, u, √Dx and the declining-source reference time. */
export interface ColumnSetup {
  x: number;
  u: number;
  sqrtDx: number;
  /** time t for the declining-source factor e^{−γ(t − τ)} (unused when γ = 0) */
  t: number;
}

/** τ(w): the positive root s = √τ of u·s² + 2w√Dx·s − x = 0, without cancellation (∞ for w < 0 when u = 0). */
export function tauOf(w: number, c: ColumnSetup): number {
  const wd = w * c.sqrtDx;
  const q = Math.sqrt(wd * wd + c.u * c.x);
  const s = w >= 0 ? c.x / (wd + q) : (q - wd) / c.u;
  return s * s;
}

/** w(τ) = (x − uτ)/(2√(Dxτ)) */
function wOf(tau: number, c: ColumnSetup): number {
  return (c.x - c.u * tau) / (2 * c.sqrtDx * Math.sqrt(tau));
}

const nodeBuf = new Float64Array(15);
const zBuf = new Float64Array(15);
const sBuf = new Float64Array(15);

function evalPanel(a: number, b: number, c: ColumnSetup, ys: ArrayLike<number>, depth: DepthSpan, p: PatchParams): Panel {
  panelNodes(a, b, nodeBuf);
  const halfW = 0.5 * p.width;
  const h = 0.5 * (b - a);
  for (let k = 0; k < 15; k++) {
    const w = nodeBuf[k];
    const tau = tauOf(w, c);
    let weight = TWO_OVER_SQRT_PI * Math.exp(-w * w) * (c.x / (c.x + c.u * tau));
    if (p.gamma > 0) weight *= Math.exp(-p.gamma * (c.t - tau));
    zBuf[k] = weight === 0 ? 0 : weight * depthFactor(depth, p.thickness, 2 * Math.sqrt(p.Dz * tau));
    sBuf[k] = 2 * Math.sqrt(p.Dy * tau);
  }
  const ny = ys.length;
  const kron = new Float64Array(ny);
  let err = 0;
  for (let j = 0; j < ny; j++) {
    const y = ys[j];
    let K = 0;
    let G = 0;
    for (let k = 0; k < 15; k++) {
      const zf = zBuf[k];
      if (zf === 0) continue;
      const s = sBuf[k];
      const g = 0.5 * (s > 0 ? erfDiff((y + halfW) / s, (y - halfW) / s) : erfRatioSafe(y + halfW, s) - erfRatioSafe(y - halfW, s)) * zf;
      K += KRONROD_W[k] * g;
      G += GAUSS_W[k] * g;
    }
    K *= h;
    G *= h;
    kron[j] = K;
    const e = Math.abs(K - G);
    if (e > err) err = e;
  }
  return { a, b, kron, err };
}

/**
 * C/C0 of the exact solution along one column x (for each y in ys, at depth or screen `depth`),
 * at time t (Infinity: steady state, only with γ = 0), times e^{logScale}. Writes into
 * out[offset + j·stride]. Inputs are already retarded; x > 0, t > 0, Dx > 0 (callers handle the limits).
 */
export function exactColumn(
  x: number,
  ys: ArrayLike<number>,
  depth: DepthSpan,
  t: number,
  p: PatchParams,
  logScale: number,
  out: Float64Array,
  offset: number,
  stride: number,
  opts: ExactOptions = {},
): ColumnResult {
  const { relTol, absTol, maxPanels } = exactTolerances(opts);
  const ny = ys.length;
  const w0 = uMinusV(p.v, p.Dx, p.lam);
  const u = p.v + w0;
  const c: ColumnSetup = { x, u, sqrtDx: Math.sqrt(p.Dx), t };
  // lower end of w: the time horizon, or −∞ (cut) at steady state; w > 0 always when u = 0
  let lo = t === Infinity ? (u > 0 ? -W_CUT : 0) : Math.max(wOf(t, c), -W_CUT);
  if (u === 0) lo = Math.max(lo, 0);
  const hi = W_CUT;
  const scale = Math.exp(logScale - (x * w0) / (2 * p.Dx));
  if (!(lo < hi) || !(scale > 0)) {
    for (let j = 0; j < ny; j++) out[offset + j * stride] = 0;
    return { errorEstimate: 0, panels: 0 };
  }
  const r = adaptiveW(lo, hi, c, ys, depth, p, relTol, absTol / scale, maxPanels, 0);
  const total = r.total;
  const e = r.err;
  for (let j = 0; j < ny; j++) {
    const val = total[j] * scale;
    out[offset + j * stride] = val > 0 ? val : 0;
  }
  return { errorEstimate: e * scale, panels: r.panels };
}

/**
 * ∫ over w ∈ [lo, hi] for every y, adaptively: panels bisected worst first until the summed
 * |Kronrod − Gauss| estimate ≤ relTol·max(max over the column, ref) + absTol (unscaled units).
 */
function adaptiveW(
  lo: number,
  hi: number,
  c: ColumnSetup,
  ys: ArrayLike<number>,
  depth: DepthSpan,
  p: PatchParams,
  relTol: number,
  absTol: number,
  maxPanels: number,
  ref: number,
): { total: Float64Array; err: number; panels: number } {
  const ny = ys.length;
  const cuts = initialCuts(lo, hi, Math.sqrt((c.u * c.x) / (4 * p.Dx)));
  const panels: Panel[] = [];
  for (let i = 0; i + 1 < cuts.length; i++) panels.push(evalPanel(cuts[i], cuts[i + 1], c, ys, depth, p));
  const total = new Float64Array(ny);
  let e = 0;
  let m = 0;
  const sumUp = () => {
    total.fill(0);
    e = 0;
    for (const pn of panels) {
      for (let j = 0; j < ny; j++) total[j] += pn.kron[j];
      e += pn.err;
    }
    m = ref;
    for (let j = 0; j < ny; j++) if (total[j] > m) m = total[j];
  };
  sumUp();
  while (e > relTol * m + absTol && panels.length < maxPanels) {
    let worst = 0;
    for (let i = 1; i < panels.length; i++) if (panels[i].err > panels[worst].err) worst = i;
    const pw = panels[worst];
    const mid = 0.5 * (pw.a + pw.b);
    if (!(mid > pw.a && mid < pw.b)) break;
    panels[worst] = evalPanel(pw.a, mid, c, ys, depth, p);
    panels.push(evalPanel(mid, pw.b, c, ys, depth, p));
    sumUp();
  }
  return { total, err: e, panels: panels.length };
}

/**
 * C/C0 of the exact solution at one point or screen for many times (a breakthrough curve), for a
 * source that does not decline (γ = 0): the integrand does not depend on t, only the lower limit
 * w(t) does, so the curve is accumulated over the intervals [w(t_k), w(t_{k−1})] of the times in
 * ascending order, each integrated once to relTol against the value reached. x > 0, Dx > 0,
 * finite times ≥ 0 (t = 0 gives 0). Writes out[k] for times[k] (any order), times e^{logScale}.
 */
export function exactSeries(
  x: number,
  y: number,
  depth: DepthSpan,
  times: ArrayLike<number>,
  p: PatchParams,
  logScale: number,
  out: Float64Array,
  opts: ExactOptions = {},
): void {
  const { relTol, absTol, maxPanels } = exactTolerances(opts);
  const w0 = uMinusV(p.v, p.Dx, p.lam);
  const u = p.v + w0;
  const order = Array.from({ length: times.length }, (_, k) => k).sort((a, b) => times[a] - times[b]);
  const scale = Math.exp(logScale - (x * w0) / (2 * p.Dx));
  const floor = u > 0 ? -W_CUT : 0;
  let prevW = W_CUT;
  let acc = 0;
  const ys = [y];
  for (const k of order) {
    const t = times[k];
    if (!(t > 0) || !(scale > 0)) {
      out[k] = 0;
      continue;
    }
    const c: ColumnSetup = { x, u, sqrtDx: Math.sqrt(p.Dx), t };
    const w = Math.max(wOf(t, c), floor);
    if (w < prevW) {
      acc += adaptiveW(w, prevW, c, ys, depth, p, relTol, absTol / scale, maxPanels, acc).total[0];
      prevW = w;
    }
    const val = acc * scale;
    out[k] = val > 0 ? val : 0;
  }
}
