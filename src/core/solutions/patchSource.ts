/**
 * Exact solution for a vertical rectangular source plane at x = 0 (width W centred on y = 0,
 * thickness H down from the water table) held at C0 from t = 0 (or at C0·e^{−γt}, a declining
 * source, which multiplies the integrand by e^{−γ(t − τ)} — Duhamel's principle), in a semi-infinite aquifer
 * x > 0 with uniform flow along x, first-order decay and no flux across the water table z = 0
 * (an image source above it, so the source spans −H…H in an infinite medium):
 *
 *   C/C0 = ∫₀ᵗ f(τ) · Y(y, τ) · Z(z, τ) dτ
 *   f(τ) = x/(2√(πDxτ³)) exp(−(x − vτ)²/(4Dxτ) − λτ)          (first-passage density, see oneD.ts)
 *   Y    = ½[erf((y + W/2)/(2√(Dyτ))) − erf((y − W/2)/(2√(Dyτ)))]
 *   Z    = ½[erf((z + H)/(2√(Dzτ))) − erf((z − H)/(2√(Dzτ)))]
 *
 * (Wexler 1992, "Analytical solutions for one-, two-, and three-dimensional solute transport in
 * ground-water systems with uniform flow", USGS TWRI 3-B7, the finite patch source, with v and D
 * divided by R). For W, H → ∞ it is the Ogata–Banks solution exactly.
 *
 * Method: the change of variables q = F(τ)/F(t), where F is the closed-form cumulative of f
 * (oneD.ts), turns the integral into  F(t) · ∫₀¹ Y·Z dq  with a bounded integrand in [0, 1]
 * whatever the Peclet number; the sharp arrival peak of f disappears into the measure. Near
 * q = 0 (τ → 0) Y·Z behaves like a fractional power of q, so the integral is taken in σ = −ln q,
 * ∫ e^{−σ}·Y·Z dσ, where that end becomes a smooth exponential tail (cut at σ = 40); likewise the
 * late arrivals (q → 1, where Y·Z can be far larger than at typical times for points far off the
 * axis or below the source) are integrated in ρ = −ln(1 − q), ∫ e^{−ρ}·Y·Z dρ (cut at ρ = 36). Both
 * pieces is computed by adaptive 7/15-point Gauss–Kronrod quadrature, vector-valued over a
 * whole column of y values at one x, so every cell of a column shares the same nodes τ(q) (each
 * τ from a safeguarded Newton solve of ln F(τ) = ln F(t) − σ). Panels are bisected, worst first,
 * until the summed QUADPACK error estimate (from |Kronrod − Gauss|) is below relTol·max(column) + absTol.
 *
 * Stated accuracy: error estimate ≤ relTol × (largest C/C0 in the column) + absTol, with
 * relTol = 1e-6 and absTol = 1e-13 by default (per panel the QUADPACK estimate resasc·min(1, (200|K − G|/resasc)^1.5), Piessens et al. 1983).
 */
import { depthFactor, erfRatioSafe, spreadFactor, type DepthSpan } from './spread';
import { erfDiff } from '../special/erf';
import { GAUSS_W, KRONROD_W, panelNodes } from '../special/gaussKronrod';
import { invertLnCdf, lnCdf } from './oneD';

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

export interface ColumnResult {
  /** the largest error estimate over the column, in C/C0 */
  errorEstimate: number;
  panels: number;
}

interface Panel {
  a: number;
  b: number;
  kron: Float64Array;
  err: number;
  /** true: a late-arrival panel in ρ = −ln(1 − q); false: an early-arrival panel in σ = −ln q */
  late: boolean;
}

/** the early piece covers q ∈ (0, ½] (σ ∈ [ln 2, 40]), the late piece q ∈ [½, 1) (ρ ∈ [ln 2, 36];
 * beyond ρ = 36, 1 − e^{−ρ} rounds to 1 and the neglected mass e^{−36} ≈ 2e-16) */
const RHO_MAX = 36;

/** the σ = −ln q range integrated; the neglected part of ∫₀¹ dq is e^{−40} ≈ 4e-18 */
const SIGMA_MAX = 40;

/** initial panels: graded so that the usual columns need little or no bisection */
const EARLY_CUTS = [Math.LN2, 2, 5, 12, SIGMA_MAX];
const LATE_CUTS = [Math.LN2, 2, 5, 12, RHO_MAX];

const nodeBuf = new Float64Array(15);
const zBuf = new Float64Array(15);
const sBuf = new Float64Array(15);
const gBuf = new Float64Array(15);

function evalPanel(
  a: number,
  b: number,
  x: number,
  ys: ArrayLike<number>,
  depth: DepthSpan,
  lnFt: number,
  p: PatchParams,
  tMax: number,
  late: boolean,
): Panel {
  panelNodes(a, b, nodeBuf);
  const halfW = 0.5 * p.width;
  const h = 0.5 * (b - a);
  // centre first, as the Newton start for the others. Early piece: q = e^{−σ}, dq = e^{−σ}dσ;
  // late piece: q = 1 − e^{−ρ}, dq = e^{−ρ}dρ (ln q = log1p(−e^{−ρ}))
  const lnQ = (u: number) => (late ? Math.log1p(-Math.exp(-u)) : -u);
  const tc = invertLnCdf(lnFt + lnQ(nodeBuf[14]), x, p.v, p.Dx, p.lam, tMax);
  for (let k = 0; k < 15; k++) {
    const u = nodeBuf[k];
    const tau = k === 14 ? tc : invertLnCdf(lnFt + lnQ(u), x, p.v, p.Dx, p.lam, tMax, tc);
    // a declining source contributes C0·e^{−γ(t − τ)} for the mass arriving after travel time τ
    const decline = p.gamma > 0 ? Math.exp(-p.gamma * (tMax - tau)) : 1;
    zBuf[k] = decline * Math.exp(-u) * depthFactor(depth, p.thickness, 2 * Math.sqrt(p.Dz * tau));
    sBuf[k] = 2 * Math.sqrt(p.Dy * tau);
  }
  const ny = ys.length;
  const kron = new Float64Array(ny);
  let mean = 0;
  let err = 0;
  for (let j = 0; j < ny; j++) {
    const y = ys[j];
    let K = 0;
    let G = 0;
    let A = 0;
    for (let k = 0; k < 15; k++) {
      const zf = zBuf[k];
      if (zf === 0) {
        gBuf[k] = 0;
        continue;
      }
      const s = sBuf[k];
      const g = 0.5 * (s > 0 ? erfDiff((y + halfW) / s, (y - halfW) / s) : erfRatioSafe(y + halfW, s) - erfRatioSafe(y - halfW, s)) * zf;
      gBuf[k] = g;
      K += KRONROD_W[k] * g;
      G += GAUSS_W[k] * g;
    }
    // QUADPACK's error scaling (Piessens et al. 1983, QK15): resasc = ∫|g − mean|,
    // err = resasc·min(1, (200|K − G|/resasc)^1.5)
    mean = 0.5 * K;
    for (let k = 0; k < 15; k++) A += KRONROD_W[k] * Math.abs(gBuf[k] - mean);
    K *= h;
    G *= h;
    const resasc = A * h;
    kron[j] = K;
    let e = Math.abs(K - G);
    if (resasc > 0 && e > 0) e = resasc * Math.min(1, Math.pow((200 * e) / resasc, 1.5));
    if (e > err) err = e;
  }
  return { a, b, kron, err, late };
}

/**
 * C/C0 of the exact solution along one column x (for each y in ys, at depth or screen `depth`),
 * at time t (Infinity: steady state), times e^{logScale}. Writes into out[offset + j·stride].
 * Inputs are already retarded; x > 0, t > 0, Dx > 0 (callers handle the limits).
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
  const relTol = opts.relTol ?? 1e-6;
  const absTol = opts.absTol ?? 1e-13;
  const maxPanels = opts.maxPanels ?? 500;
  const ny = ys.length;
  const lnFt = lnCdf(x, t, p.v, p.Dx, p.lam);
  const scale = Math.exp(logScale + lnFt);
  if (!(scale > 0)) {
    for (let j = 0; j < ny; j++) out[offset + j * stride] = 0;
    return { errorEstimate: 0, panels: 0 };
  }
  // Early arrivals in σ = −ln q, late arrivals in ρ = −ln(1 − q): both ends of the q interval
  // become smooth exponential tails, where Y·Z can still carry most of the concentration (points
  // near the source edge at early arrivals; far off the axis or below the source at late ones).
  const panels: Panel[] = [];
  for (let i = 0; i + 1 < EARLY_CUTS.length; i++) panels.push(evalPanel(EARLY_CUTS[i], EARLY_CUTS[i + 1], x, ys, depth, lnFt, p, t, false));
  for (let i = 0; i + 1 < LATE_CUTS.length; i++) panels.push(evalPanel(LATE_CUTS[i], LATE_CUTS[i + 1], x, ys, depth, lnFt, p, t, true));
  const total = new Float64Array(ny);
  const sumUp = () => {
    total.fill(0);
    let e = 0;
    for (const pn of panels) {
      for (let j = 0; j < ny; j++) total[j] += pn.kron[j];
      e += pn.err;
    }
    let m = 0;
    for (let j = 0; j < ny; j++) if (total[j] > m) m = total[j];
    return { e, m };
  };
  let { e, m } = sumUp();
  // Tolerances apply to the scaled result: err·scale ≤ relTol·m·scale + absTol.
  while (e * scale > relTol * m * scale + absTol && panels.length < maxPanels) {
    let worst = 0;
    for (let i = 1; i < panels.length; i++) if (panels[i].err > panels[worst].err) worst = i;
    const pw = panels[worst];
    const mid = 0.5 * (pw.a + pw.b);
    if (!(mid > pw.a && mid < pw.b)) break;
    panels[worst] = evalPanel(pw.a, mid, x, ys, depth, lnFt, p, t, pw.late);
    panels.push(evalPanel(mid, pw.b, x, ys, depth, lnFt, p, t, pw.late));
    ({ e, m } = sumUp());
  }
  for (let j = 0; j < ny; j++) {
    const val = total[j] * scale;
    out[offset + j * stride] = val > 0 ? val : 0;
  }
  return { errorEstimate: e * scale, panels: panels.length };
}
