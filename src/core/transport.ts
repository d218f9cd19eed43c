/**
 * From a ScreeningModel to concentrations: retardation, decay phase, declining source and
 * finite release duration applied around the two 3-D solutions.
 *
 * - Retardation and the decay phase: retarded.ts (v/R, D/R, λ or λ/R).
 * - A source declining as C0·e^{−γt} (Duhamel's principle): the exact solution carries the factor
 *   e^{−γ(t − τ)} inside its time integral; Domenico's closed form becomes e^{−γt}·S(λ − γ), the
 *   constant-source form with the rate reduced by γ, which needs v² + 4(λ − γ)Dx > 0 (retarded),
 *   checked in validation for Domenico only.
 * - A release of finite duration T is the superposition C(t) = U(t) − e^{−γT}·U(t − T), where U is
 *   the response to the (declining) source switched on at 0.
 * - Steady state (t = Infinity) exists for a continuous constant source only; otherwise it is 0.
 */
import type { DepthSpan } from './solutions/spread';
import { depthFactor, spreadFactor } from './solutions/spread';
import { domenicoAtSpread, domenicoGridInto, domenicoLevelTime, domenicoSpread, isSymmetric, type DomenicoParams } from './solutions/domenico';
import { exactColumn, exactSeries, type ExactOptions, type PatchParams } from './solutions/patchSource';
import { exactGridShared } from './solutions/patchGrid';
import type { ScreeningModel, SolutionKind } from './model';
import { retardedParameters } from './retarded';

export interface Kinetics {
  readonly patch: PatchParams;
  readonly dom: DomenicoParams;
  /** source decline rate γ */
  readonly gamma: number;
  /** release duration */
  readonly duration: number;
  readonly continuousConstant: boolean;
}

export function kinetics(m: ScreeningModel): Kinetics {
  const { v, Dx, Dy, Dz, lam: lamBase } = retardedParameters(m);
  const De = m.diffusion;
  const gamma = m.sourceDecay;
  // exact solution: the decline enters the integrand; Domenico: folded into the rate (closed form)
  const patch: PatchParams = { v, Dx, Dy, Dz, lam: lamBase, gamma, width: m.width, thickness: m.thickness };
  const lam = lamBase - gamma;
  const dom: DomenicoParams = {
    v,
    Dx,
    ay: m.v > 0 ? m.ay + De / m.v : m.ay,
    az: m.v > 0 ? m.az + De / m.v : m.az,
    lam,
    width: m.width,
    thickness: m.thickness,
  };
  return {
    patch,
    dom,
    gamma: m.sourceDecay,
    duration: m.duration,
    continuousConstant: m.sourceDecay === 0 && m.duration === Infinity,
  };
}

/** C/C0 of the constant-concentration solution started at time 0, times e^{logScale}, on a grid. */
function unitGrid(
  kind: SolutionKind,
  k: Kinetics,
  xs: ArrayLike<number>,
  ys: ArrayLike<number>,
  depth: DepthSpan,
  t: number,
  logScale: number,
  out: Float64Array,
  opts?: ExactOptions,
): number {
  const ny = ys.length;
  if (!(t > 0)) {
    out.fill(0);
    return 0;
  }
  if (kind === 'domenico') {
    domenicoGridInto(xs, ys, depth, t, k.dom, logScale - (t === Infinity ? 0 : k.gamma * t), out);
    return 0;
  }
  const p = k.patch;
  const sym = ny > 1 && isSymmetric(ys);
  const half = sym ? Math.floor(ny / 2) : 0;
  const ysEval = sym ? Array.prototype.slice.call(ys, half) : ys;
  // nodes shared by all columns (patchGrid.ts); the per-column method where that does not apply
  const report = { errorEstimate: 0, fallbackColumns: 0 };
  const shared = p.Dx > 0 && exactGridShared(xs, ysEval, depth, t, p, logScale, out, ny, half, opts, report);
  let worst = report.errorEstimate;
  for (let i = 0; i < xs.length; i++) {
    const x = xs[i];
    const row = i * ny;
    if (x <= 0 || p.Dx === 0) {
      // Boundary (x = 0), upgradient (x < 0: no transport represented) or no longitudinal spreading.
      for (let j = 0; j < ny; j++) out[row + j] = limitCase(x, ys[j], depth, t, p, logScale);
      continue;
    }
    if (!shared) {
      const r = exactColumn(x, ysEval, depth, t, p, logScale, out, row + half, 1, opts);
      if (r.errorEstimate > worst) worst = r.errorEstimate;
    }
    if (sym) for (let j = 0; j < half; j++) out[row + j] = out[row + ny - 1 - j];
  }
  return worst;
}

/** Exact solution where the quadrature does not apply: x ≤ 0 or Dx = 0 (a sharp front). */
function limitCase(x: number, y: number, depth: DepthSpan, t: number, p: PatchParams, logScale: number): number {
  if (x < 0) return 0;
  const decline = (age: number) => (p.gamma > 0 ? p.gamma * age : 0);
  if (x === 0) return Math.exp(logScale - decline(t)) * spreadFactor(y, 0.5 * p.width, 0) * depthFactor(depth, p.thickness, 0);
  if (!(p.v > 0)) return 0;
  const arrival = x / p.v;
  if (t < arrival) return 0;
  const w = t === arrival ? 0.5 : 1;
  const tau = arrival;
  return (
    w *
    Math.exp(logScale - p.lam * arrival - decline(t - arrival)) *
    spreadFactor(y, 0.5 * p.width, 2 * Math.sqrt(p.Dy * tau)) *
    depthFactor(depth, p.thickness, 2 * Math.sqrt(p.Dz * tau))
  );
}

/**
 * C/C0 for the model on a grid at time t (Infinity: steady state), index i·ys.length + j.
 * Returns the exact solution's largest quadrature error estimate (0 for Domenico).
 */
export function relativeGrid(
  m: ScreeningModel,
  kind: SolutionKind,
  xs: ArrayLike<number>,
  ys: ArrayLike<number>,
  depth: DepthSpan,
  t: number,
  out: Float64Array,
  opts?: ExactOptions,
): number {
  const k = kinetics(m);
  if (t === Infinity) {
    if (!k.continuousConstant) {
      out.fill(0);
      return 0;
    }
    return unitGrid(kind, k, xs, ys, depth, Infinity, 0, out, opts);
  }
  let err = unitGrid(kind, k, xs, ys, depth, t, 0, out, opts);
  if (k.duration < t) {
    const later = new Float64Array(out.length);
    err += unitGrid(kind, k, xs, ys, depth, t - k.duration, -k.gamma * k.duration, later, opts);
    for (let i = 0; i < out.length; i++) out[i] = Math.max(0, out[i] - later[i]);
  }
  return err;
}

const one = new Float64Array(1);

/** C/C0 for the model at one point or screen. */
export function relativeAt(
  m: ScreeningModel,
  kind: SolutionKind,
  x: number,
  y: number,
  depth: DepthSpan,
  t: number,
  opts?: ExactOptions,
): number {
  return relativePoint(m, kind, x, y, depth, opts).at(t);
}

/**
 * Domenico's C/C0 at x ≥ 0 and time t (Infinity: steady state) given the point's lateral and
 * vertical factors (`spread`, domenicoSpread): the source decline folded into the rate, a release
 * of finite duration by superposition. relativePoint's curve, and the receptor screening without
 * a closure per receptor (results.ts screenReceptorsInto).
 */
export function domenicoRelative(k: Kinetics, x: number, spread: number, t: number): number {
  const p = k.dom;
  if (t === Infinity) return k.continuousConstant ? domenicoAtSpread(x, spread, Infinity, p, 0) : 0;
  let c = domenicoAtSpread(x, spread, t, p, -k.gamma * t);
  if (k.duration < t && c > 0) c = Math.max(0, c - domenicoAtSpread(x, spread, t - k.duration, p, -k.gamma * t));
  return c;
}

/** Whether Domenico's first time at a level has its closed form at x (domenicoLevelTime): a continuous constant source, downgradient, with dispersion and flow. */
export function domenicoClosedForm(k: Kinetics, x: number): boolean {
  return k.continuousConstant && x > 0 && k.dom.Dx > 0 && k.dom.v > 0;
}

export interface RelativePoint {
  /** C/C0 at time t */
  readonly at: (t: number) => number;
  /**
   * The first time C/C0 reaches a level, in closed form where the solution has one (Domenico,
   * continuous constant source, downgradient: domenicoLevelTime), null: never reached; the
   * property itself null where there is no closed form (search `at` instead).
   */
  readonly levelTime: ((level: number) => number | null) | null;
}

/**
 * C/C0 at one point or screen as a function of time, for searches over time (first arrival at a
 * limit, the peak), with the closed-form time to a level where there is one: the model's kinetics
 * are worked out once, and for Domenico the lateral and vertical factors too (they do not depend
 * on time). Each value is the one relativeAt gives.
 */
export function relativePoint(
  m: ScreeningModel,
  kind: SolutionKind,
  x: number,
  y: number,
  depth: DepthSpan,
  opts?: ExactOptions,
  k: Kinetics = kinetics(m),
): RelativePoint {
  if (kind === 'domenico') {
    if (x < 0) return { at: () => 0, levelTime: null };
    const spread = domenicoSpread(x, y, depth, k.dom);
    const closed = domenicoClosedForm(k, x);
    return { at: (t) => domenicoRelative(k, x, spread, t), levelTime: closed ? (level) => domenicoLevelTime(x, spread, k.dom, level) : null };
  }
  const xs = [x];
  const ys = [y];
  return {
    at: (t) => {
      relativeGrid(m, kind, xs, ys, depth, t, one, opts);
      return one[0];
    },
    levelTime: null,
  };
}

/**
 * C/C0 at one point or screen for many times. For the exact solution with a source that does not
 * decline, the curve is accumulated in one pass (exactSeries), pulses by the same superposition;
 * otherwise point by point.
 */
export function relativeSeries(
  m: ScreeningModel,
  kind: SolutionKind,
  x: number,
  y: number,
  depth: DepthSpan,
  times: ArrayLike<number>,
  opts?: ExactOptions,
): Float64Array {
  const out = new Float64Array(times.length);
  const k = kinetics(m);
  let finite = true;
  for (let i = 0; i < times.length; i++) if (!Number.isFinite(times[i])) finite = false;
  if (kind === 'exact' && k.gamma === 0 && x > 0 && k.patch.Dx > 0 && finite) {
    exactSeries(x, y, depth, times, k.patch, 0, out, opts);
    if (k.duration < Infinity) {
      const earlier = Array.from(times, (t) => Math.max(0, t - k.duration));
      const later = new Float64Array(times.length);
      exactSeries(x, y, depth, earlier, k.patch, 0, later, opts);
      for (let i = 0; i < out.length; i++) if (times[i] > k.duration) out[i] = Math.max(0, out[i] - later[i]);
    }
    return out;
  }
  for (let i = 0; i < times.length; i++) out[i] = relativeAt(m, kind, x, y, depth, times[i], opts);
  return out;
}
