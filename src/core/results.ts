/**
 * Results a screening needs, in mg/L and days: concentration at a point or well screen,
 * breakthrough curves, the first time a well reaches a limit (root-finding), peak and its time,
 * the steady-state value, the steady-state plume length to a limit, and grids for the map.
 *
 * Root-finding: Brent's method (Brent 1973, "Algorithms for Minimization without Derivatives",
 * ch. 4) on a bracket. For a continuous, constant source the concentration at a fixed point
 * increases monotonically in time (the integrand of the exact solution is positive; each factor
 * of Domenico's x-term increases) and decreases monotonically downgradient along the centreline,
 * so brackets are [0, horizon] and [x, 2x]; with Domenico the first time at a limit then has a
 * closed form instead (only the x-term depends on time: solutions/domenico.ts domenicoLevelTime),
 * exact to rounding, where Brent stops within 1e-6 of the horizon. For pulses and declining sources the curve rises and
 * falls: the first crossing is bracketed on a sampled curve (160 times, log and linear spaced);
 * a rise shorter than the sample spacing could be missed there, which the result notes.
 */
import type { ScreeningModel, SolutionKind } from './model';
import { domenicoClosedForm, domenicoRelative, relativeAt, relativeGrid, relativePoint, relativeSeries, kinetics, type Kinetics } from './transport';
import { domenicoLevelTime, domenicoSpread } from './solutions/domenico';
import type { ExactOptions } from './solutions/patchSource';
import { domenicoAdmits, validateModel } from './validateModel';
import { ValidationError, inWorkingRange, requireFinite, requireFiniteEach, requireNonNegative, requirePositive, requireTime, type Warning } from './validation';

export interface Receptor {
  /** what warnings call it (the receptor's name); they say "this point" without one */
  readonly label?: string;
  readonly x: number;
  readonly y: number;
  /** screen top and bottom, depth below the water table (equal for a point) */
  readonly zTop: number;
  readonly zBottom: number;
}

export interface PointLike {
  readonly x: number;
  readonly y: number;
  readonly z: number;
}

const fine = (v: unknown): boolean => typeof v === 'number' && Number.isFinite(v) && inWorkingRange(v);

function checkReceptor(r: Receptor, field = 'receptor'): void {
  // the common case first, without building field names (this runs per receptor and realisation)
  if (fine(r?.x) && fine(r.y) && fine(r.zTop) && r.zTop >= 0 && fine(r.zBottom) && r.zBottom >= r.zTop) return;
  requireFinite(`${field}.x`, r?.x);
  requireFinite(`${field}.y`, r?.y);
  requireNonNegative(`${field}.zTop`, r.zTop);
  requireNonNegative(`${field}.zBottom`, r.zBottom);
  if (r.zBottom < r.zTop) throw new ValidationError(`${field}.zBottom`, r.zBottom, `≥ screen top (${r.zTop})`);
}

/** mg/L from C/C0: negative rounding and non-finite values (never expected) read as 0 */
function mgPerL(m: ScreeningModel, relative: number): number {
  const c = m.c0 * relative;
  return c > 0 && Number.isFinite(c) ? c : 0;
}

function cAt(m: ScreeningModel, kind: SolutionKind, r: Receptor, t: number, opts?: ExactOptions): number {
  return mgPerL(m, relativeAt(m, kind, r.x, r.y, r, t, opts));
}

/** Concentration (mg/L) at a receptor as a function of time, its time-independent parts worked out once (transport.ts relativePoint). */
function concentrationCurve(m: ScreeningModel, kind: SolutionKind, r: Receptor, k?: Kinetics): ConcentrationCurve {
  const rel = relativePoint(m, kind, r.x, r.y, r, undefined, k);
  const levelTime = rel.levelTime;
  return {
    at: (t) => mgPerL(m, rel.at(t)),
    timeAt: levelTime ? (limit) => levelTime(limit / m.c0) : null,
  };
}

/** A receptor's concentration curve (mg/L) and, where there is one, the closed form of its first time at a limit. */
interface ConcentrationCurve {
  readonly at: (t: number) => number;
  /** first time at `limit` (mg/L) in closed form (null: never); the property null: search `at` */
  readonly timeAt: ((limit: number) => number | null) | null;
}

/** Concentration (mg/L) at a point; t = Infinity for steady state. */
export function concentration(m: ScreeningModel, p: PointLike, t: number): number {
  validateModel(m);
  requireNonNegative('z', p?.z);
  const r = { x: requireFinite('x', p.x), y: requireFinite('y', p.y), zTop: p.z, zBottom: p.z };
  return cAt(m, m.solution, r, requireTime('t', t));
}

/** Concentration (mg/L) averaged over a well screen. */
export function screenAverage(m: ScreeningModel, r: Receptor, t: number): number {
  validateModel(m);
  checkReceptor(r);
  return cAt(m, m.solution, r, requireTime('t', t));
}

/** Concentration (mg/L) at a receptor for each time. */
export function breakthroughCurve(m: ScreeningModel, r: Receptor, times: ArrayLike<number>, kind: SolutionKind = m.solution): Float64Array {
  validateModel(m);
  checkReceptor(r);
  for (let k = 0; k < times.length; k++) requireTime(`times[${k}]`, times[k]);
  const out = relativeSeries(m, kind, r.x, r.y, r, times);
  for (let k = 0; k < out.length; k++) out[k] = mgPerL(m, out[k]);
  return out;
}

/** Brent's method for f(a)·f(b) ≤ 0; returns x with |bracket| ≤ tol. */
export function brentRoot(f: (x: number) => number, a: number, b: number, fa: number, fb: number, tol: number, maxIter = 100): number {
  if (fa === 0) return a;
  if (fb === 0) return b;
  let c = a;
  let fc = fa;
  let d = b - a;
  let e = d;
  for (let it = 0; it < maxIter; it++) {
    if ((fb > 0 && fc > 0) || (fb < 0 && fc < 0)) {
      c = a;
      fc = fa;
      d = b - a;
      e = d;
    }
    if (Math.abs(fc) < Math.abs(fb)) {
      a = b;
      b = c;
      c = a;
      fa = fb;
      fb = fc;
      fc = fa;
    }
    const tol1 = 2e-16 * Math.abs(b) + 0.5 * tol;
    const xm = 0.5 * (c - b);
    if (Math.abs(xm) <= tol1 || fb === 0) return b;
    if (Math.abs(e) >= tol1 && Math.abs(fa) > Math.abs(fb)) {
      const s = fb / fa;
      let p: number;
      let q: number;
      if (a === c) {
        p = 2 * xm * s;
        q = 1 - s;
      } else {
        const qq = fa / fc;
        const r = fb / fc;
        p = s * (2 * xm * qq * (qq - r) - (b - a) * (r - 1));
        q = (qq - 1) * (r - 1) * (s - 1);
      }
      if (p > 0) q = -q;
      else p = -p;
      if (2 * p < Math.min(3 * xm * q - Math.abs(tol1 * q), Math.abs(e * q))) {
        e = d;
        d = p / q;
      } else {
        d = xm;
        e = d;
      }
    } else {
      d = xm;
      e = d;
    }
    a = b;
    fa = fb;
    b += Math.abs(d) > tol1 ? d : xm > 0 ? tol1 : -tol1;
    fb = f(b);
  }
  return b;
}

/** 160 sample times in (0, horizon]: 80 log-spaced from horizon·1e-4 and 80 evenly spaced. */
export function sampleTimes(horizon: number, n = 80): number[] {
  const ts = new Set<number>();
  for (let k = 0; k < n; k++) ts.add(horizon * Math.pow(10, -4 + (4 * k) / (n - 1)));
  for (let k = 1; k <= n; k++) ts.add((horizon * k) / n);
  return [...ts].sort((a, b) => a - b);
}

/** First time (d) the receptor reaches `limit` (mg/L) within the horizon, or null. */
export function firstTimeAtLimit(
  m: ScreeningModel,
  r: Receptor,
  limit: number,
  horizon: number,
  kind: SolutionKind = m.solution,
): number | null {
  validateModel(m);
  checkReceptor(r);
  checkLimitAndHorizon(limit, horizon);
  return arrivalOn(concentrationCurve(m, kind, r), kinetics(m).continuousConstant, limit, horizon);
}

/** Peak concentration (mg/L) within [0, horizon] and its time. */
export function peakConcentration(
  m: ScreeningModel,
  r: Receptor,
  horizon: number,
  kind: SolutionKind = m.solution,
): { c: number; t: number } {
  validateModel(m);
  checkReceptor(r);
  requirePositive('horizon', horizon);
  if (!Number.isFinite(horizon)) throw new ValidationError('horizon', horizon, 'a finite number > 0');
  return peakOn(concentrationCurve(m, kind, r), kinetics(m).continuousConstant, horizon);
}

function checkLimitAndHorizon(limit: number, horizon: number): void {
  requirePositive('limit', limit);
  requirePositive('horizon', horizon);
  if (!Number.isFinite(horizon)) throw new ValidationError('horizon', horizon, 'a finite number > 0');
}

/** The first crossing of `limit` by the curve c(t) within (0, horizon] (see the header), or null. */
function arrivalOn(curve: ConcentrationCurve, continuousConstant: boolean, limit: number, horizon: number, atHorizon = curve.at(horizon)): number | null {
  const c = curve.at;
  const f = (t: number) => c(t) - limit;
  const tol = Math.max(1e-6 * horizon, 1e-6);
  if (continuousConstant) {
    const fH = atHorizon - limit;
    if (fH < 0) return null;
    if (curve.timeAt) return reachedBy(curve.timeAt(limit), horizon);
    return brentRoot(f, 0, horizon, -limit, fH, tol);
  }
  const ts = sampleTimes(horizon);
  let prevT = 0;
  let prevF = -limit;
  for (const t of ts) {
    const ft = f(t);
    if (ft >= 0) return brentRoot(f, prevT, t, prevF, ft, tol);
    prevT = t;
    prevF = ft;
  }
  return null;
}

/** A closed-form first time at the limit (Domenico) where the value at the horizon reaches it: a time past the horizon (or none) is rounding. */
function reachedBy(t: number | null, horizon: number): number {
  return t === null ? horizon : Math.min(t, horizon);
}

/** The largest value of the curve c(t) on [0, horizon] and its time (see the header). */
function peakOn(curve: ConcentrationCurve, continuousConstant: boolean, horizon: number): { c: number; t: number } {
  const c = curve.at;
  if (continuousConstant) return { c: c(horizon), t: horizon };
  const ts = sampleTimes(horizon);
  let best = 0;
  let bestC = -1;
  const cs = ts.map((t) => c(t));
  cs.forEach((v, k) => {
    if (v > bestC) {
      bestC = v;
      best = k;
    }
  });
  if (!(bestC > 0)) return { c: 0, t: horizon };
  // golden-section refinement between the neighbouring samples
  let a = best > 0 ? ts[best - 1] : 0;
  let b = best < ts.length - 1 ? ts[best + 1] : ts[best];
  const g = 0.6180339887498949;
  let x1 = b - g * (b - a);
  let x2 = a + g * (b - a);
  let f1 = c(x1);
  let f2 = c(x2);
  for (let it = 0; it < 60 && b - a > 1e-7 * horizon; it++) {
    if (f1 < f2) {
      a = x1;
      x1 = x2;
      f1 = f2;
      x2 = a + g * (b - a);
      f2 = c(x2);
    } else {
      b = x2;
      x2 = x1;
      f2 = f1;
      x1 = b - g * (b - a);
      f1 = c(x1);
    }
  }
  const tm = f1 > f2 ? x1 : x2;
  const cm = Math.max(f1, f2);
  return cm >= bestC ? { c: cm, t: tm } : { c: bestC, t: ts[best] };
}

/**
 * Concentration (mg/L) at scattered points (xs[k], ys[k]) at depth z and time t (Infinity: steady
 * state), into `out`: the model validated once and its kinetics worked out once, each point's
 * value the one `concentration` gives. For a map of points that are not a lattice of the flow frame
 * (a Monte Carlo realisation whose flow direction turned).
 */
export function concentrationsAt(m: ScreeningModel, xs: ArrayLike<number>, ys: ArrayLike<number>, z: number, t: number, out: Float64Array): Float64Array {
  validateModel(m);
  requireNonNegative('z', z);
  requireTime('t', t);
  requireFiniteEach('xs', xs);
  requireFiniteEach('ys', ys);
  if (ys.length !== xs.length || out.length !== xs.length) throw new RangeError('xs, ys and out must have the same length');
  const k = kinetics(m);
  const depth = { zTop: z, zBottom: z };
  for (let q = 0; q < xs.length; q++) out[q] = mgPerL(m, relativePoint(m, m.solution, xs[q], ys[q], depth, undefined, k).at(t));
  return out;
}

/** Where screenReceptorsInto writes: index offset + j for receptor j. */
export interface ReceptorFiguresInto {
  /** first time at the limit within the horizon, d (Infinity: not within it) */
  readonly arrival: Float64Array;
  /** concentration at the horizon, mg/L */
  readonly atHorizon: Float64Array;
  /** peak within the horizon, mg/L */
  readonly peak: Float64Array;
  /** with `times`: the concentration (mg/L) at each time, index (offset + j)·times.length + k */
  readonly curves?: Float32Array | Float64Array;
  readonly times?: ArrayLike<number>;
}

/**
 * The three figures of a probabilistic screening at each receptor (concentration at the horizon,
 * peak within it, first arrival at the limit: the values screenAverage, peakConcentration and
 * firstTimeAtLimit give), with the model validated once for all receptors and each receptor's
 * time-independent factors worked out once: a Monte Carlo realisation's inner loop. The arrival is
 * searched only where the peak reaches the limit. With `out.times` (checked by the caller as times
 * ≥ 0) also each receptor's breakthrough curve at those times. Throws ValidationError like those functions.
 */
export function screenReceptorsInto(m: ScreeningModel, receptors: readonly Receptor[], limit: number, horizon: number, out: ReceptorFiguresInto, offset: number): void {
  validateModel(m);
  checkLimitAndHorizon(limit, horizon);
  const k = kinetics(m);
  const continuousConstant = k.continuousConstant;
  const domenico = m.solution === 'domenico';
  const { curves, times } = out;
  for (let j = 0; j < receptors.length; j++) {
    const r = receptors[j];
    checkReceptor(r);
    const at = offset + j;
    if (domenico && domenicoClosedForm(k, r.x)) {
      // the common case of a Monte Carlo realisation: Domenico's closed forms without a curve
      // (the values concentrationCurve's would give, with no closure per receptor)
      const x = r.x;
      const spread = domenicoSpread(x, r.y, r, k.dom);
      const c = mgPerL(m, domenicoRelative(k, x, spread, horizon));
      out.atHorizon[at] = c;
      out.peak[at] = c; // continuous and constant: rising at a fixed point, so the peak is the value at the horizon
      out.arrival[at] = c >= limit ? reachedBy(domenicoLevelTime(x, spread, k.dom, limit / m.c0), horizon) : Infinity;
      if (curves && times) for (let q = 0, i = at * times.length; q < times.length; q++) curves[i + q] = mgPerL(m, domenicoRelative(k, x, spread, times[q]));
      continue;
    }
    const curve = concentrationCurve(m, m.solution, r, k);
    const c = curve.at;
    const atHorizon = c(horizon);
    // a continuous, constant source rises monotonically at a fixed point: its peak is the value at the horizon
    const peak = continuousConstant ? atHorizon : peakOn(curve, false, horizon).c;
    out.atHorizon[at] = atHorizon;
    out.peak[at] = peak;
    out.arrival[at] = peak >= limit ? (arrivalOn(curve, continuousConstant, limit, horizon, atHorizon) ?? Infinity) : Infinity;
    if (curves && times) for (let q = 0, i = at * times.length; q < times.length; q++) curves[i + q] = c(times[q]);
  }
}

/**
 * Distance (m) along the centreline (y = 0, depth z) to which the plume at time t (default steady
 * state) reaches `limit` (mg/L): the last crossing of the limit downgradient; null when no point
 * reaches it. The profile is sampled at 120 log-spaced distances (out to where a constant source's
 * profile is far below the limit, or for a pulse or declining source to the front's reach plus ten
 * spreading lengths), then Brent's method refines the last bracket; a pulse shorter than the sample
 * spacing there (8 % of the distance or more) could be missed.
 */
export function plumeLength(m: ScreeningModel, limit: number, z: number, t = Infinity, kind: SolutionKind = m.solution): number | null {
  validateModel(m);
  requirePositive('limit', limit);
  requireNonNegative('z', z);
  requireTime('t', t);
  const k = kinetics(m);
  if (t === Infinity && !k.continuousConstant) return null;
  const r = (x: number): Receptor => ({ x, y: 0, zTop: z, zBottom: z });
  const f = (x: number) => cAt(m, kind, r(x), t) - limit;
  const scale = Math.max(m.width, m.thickness, 1);
  // extent worth searching: past the advective front at finite t, else until far below the limit
  const front = t === Infinity ? Infinity : k.patch.v * t + 10 * Math.sqrt(2 * k.patch.Dx * t) + scale;
  // A pulse or a declining source can have left the source plane behind (the profile rises to a
  // peak downgradient and falls on both sides), so the search spans the whole reach of the front;
  // a continuous constant source only falls downgradient, and the span doubles until far below.
  let xMax = k.continuousConstant ? scale : Math.max(front, scale);
  for (let it = 0; it < 60 && k.continuousConstant; it++) {
    if (xMax > front || f(xMax) < -0.999 * limit) break;
    xMax *= 2;
  }
  const n = 120;
  const xs: number[] = [];
  const xMin = Math.min(1e-3 * scale, xMax / 1e4);
  for (let i = 0; i < n; i++) xs.push(xMin * Math.pow(xMax / xMin, i / (n - 1)));
  // The scan evaluates all n points as one grid line (y = 0): for the exact solution the grid
  // shares its quadrature nodes across the points (solutions/patchGrid.ts), several times cheaper
  // than n separate evaluations. Grid and point values agree to the quadrature tolerance, so the
  // bracket found on the line is re-checked with point values, and where the two disagree (a value
  // within that tolerance of the limit) the scan is redone point by point.
  const line = new Float64Array(n);
  relativeGrid(m, kind, xs, [0], { zTop: z, zBottom: z }, t, line);
  let fs = Array.from(line, (u) => mgPerL(m, u) - limit);
  let last = lastAtLimit(fs);
  const confirmed = (i: number): boolean => {
    if (i < 0) return fs.every((d) => d < -1e-4 * limit);
    const a = f(xs[i]);
    if (i === n - 1) return a >= 0;
    const b = f(xs[i + 1]);
    fs[i] = a;
    fs[i + 1] = b;
    return a >= 0 && b < 0;
  };
  if (!confirmed(last)) {
    fs = xs.map(f);
    last = lastAtLimit(fs);
  }
  if (last < 0) return null;
  if (last === n - 1) return xMax;
  return brentRoot(f, xs[last], xs[last + 1], fs[last], fs[last + 1], Math.max(1e-6 * xs[last], 1e-6));
}

/** index of the last value ≥ 0, or −1 */
function lastAtLimit(fs: readonly number[]): number {
  for (let i = fs.length - 1; i >= 0; i--) if (fs[i] >= 0) return i;
  return -1;
}

/**
 * Concentration grid (mg/L) on the flow-aligned lattice, index i·ys.length + j. With `into` (of
 * exactly xs.length × ys.length values) the grid is written there and returned, so a caller that
 * redraws often can keep one buffer instead of allocating a new grid each time.
 */
export function concentrationGrid(
  m: ScreeningModel,
  xs: ArrayLike<number>,
  ys: ArrayLike<number>,
  z: number,
  t: number,
  opts?: ExactOptions & { solution?: SolutionKind; into?: Float64Array },
): Float64Array {
  validateModel(m);
  requireNonNegative('z', z);
  requireTime('t', t);
  requireFiniteEach('xs', xs);
  requireFiniteEach('ys', ys);
  const n = xs.length * ys.length;
  const into = opts?.into;
  if (into !== undefined && !(into instanceof Float64Array && into.length === n))
    throw new RangeError(`into must be a Float64Array of xs.length × ys.length = ${n} values`);
  const out = into ?? new Float64Array(n);
  relativeGrid(m, opts?.solution ?? m.solution, xs, ys, { zTop: z, zBottom: z }, t, out, opts);
  for (let i = 0; i < out.length; i++) out[i] = mgPerL(m, out[i]);
  return out;
}

export type ReceptorStatus = 'reaches-limit' | 'below-limit' | 'not-reached-in-horizon';

export interface SolutionFigures {
  solution: SolutionKind;
  /** reaches the limit within the horizon; below it throughout; or only after the horizon */
  status: ReceptorStatus;
  arrival: number | null;
  atHorizon: number;
  peak: { c: number; t: number };
  steady: number;
}

/** A figure the receptor table shows for each solution. */
export type ReceptorFigure = 'status' | 'arrival' | 'atHorizon' | 'peak' | 'peakTime';

/**
 * The one rule for showing both solutions: the other solution's figures go beside the chosen
 * one's whenever the status or whether the limit is reached within the horizon differs, or any
 * figure (arrival time, concentration at the horizon, peak concentration, time of the peak)
 * differs by more than this fraction of the larger of the two.
 */
export const SOLUTIONS_DIFFER_ABOVE = 0.05;

export interface SolutionComparison {
  /** the largest relative difference over the figures both solutions give (|a − b| / max(a, b)) */
  relDiff: number;
  /** the figures that differ under the rule (SOLUTIONS_DIFFER_ABOVE), in table order */
  differing: ReceptorFigure[];
  /** show both solutions' figures: `differing` is not empty */
  showBoth: boolean;
}

export interface ReceptorResult extends SolutionFigures {
  /** the other solution's figures, where it applies (Domenico needs v > 0 and a source decline within its limit) */
  alternate: (SolutionFigures & SolutionComparison) | null;
  warnings: Warning[];
}

function figures(m: ScreeningModel, kind: SolutionKind, r: Receptor, limit: number, horizon: number): SolutionFigures {
  const arrival = firstTimeAtLimit(m, r, limit, horizon, kind);
  const steady = cAt(m, kind, r, Infinity);
  let status: ReceptorStatus;
  if (arrival !== null) status = 'reaches-limit';
  else {
    const later = kinetics(m).continuousConstant ? steady : peakConcentration(m, r, 20 * horizon, kind).c;
    status = later >= limit ? 'not-reached-in-horizon' : 'below-limit';
  }
  return { solution: kind, status, arrival, atHorizon: cAt(m, kind, r, horizon), peak: peakConcentration(m, r, horizon, kind), steady };
}

/** Relative difference |a − b| / max(a, b), 0 when both are negligible against the floor. */
export function relativeDifference(a: number, b: number, floor: number): number {
  const big = Math.max(Math.abs(a), Math.abs(b));
  if (big <= floor) return 0;
  return Math.abs(a - b) / big;
}

/**
 * Two solutions' figures for one receptor under the one rule (SOLUTIONS_DIFFER_ABOVE).
 * Concentrations below a thousandth of the limit count as equal (both negligible), and so do
 * their peak times; arrival times are compared where both reach the limit within the horizon.
 */
export function compareSolutions(a: SolutionFigures, b: SolutionFigures, limit: number): SolutionComparison {
  const floor = 1e-3 * limit;
  const peakMatters = Math.max(a.peak.c, b.peak.c) > floor;
  const rel: [ReceptorFigure, number][] = [
    ['arrival', a.arrival !== null && b.arrival !== null ? relativeDifference(a.arrival, b.arrival, 0) : 0],
    ['atHorizon', relativeDifference(a.atHorizon, b.atHorizon, floor)],
    ['peak', relativeDifference(a.peak.c, b.peak.c, floor)],
    ['peakTime', peakMatters ? relativeDifference(a.peak.t, b.peak.t, 0) : 0],
  ];
  const differing: ReceptorFigure[] = [];
  if (a.status !== b.status) differing.push('status');
  for (const [f, d] of rel) if (d > SOLUTIONS_DIFFER_ABOVE || (f === 'arrival' && (a.arrival === null) !== (b.arrival === null))) differing.push(f);
  return { relDiff: Math.max(...rel.map(([, d]) => d)), differing, showBoth: differing.length > 0 };
}

const FIGURE_WORDS: Record<Exclude<ReceptorFigure, 'status'>, string> = {
  arrival: 'time to reach the limit',
  atHorizon: 'concentration at the horizon',
  peak: 'peak concentration',
  peakTime: 'time of the peak',
};

const SOLUTION_NAME: Record<SolutionKind, string> = { domenico: 'the Domenico approximation', exact: 'the exact solution' };

/**
 * The receptor status in words: the one wording the receptor table, the report, the CSV export,
 * the command line and the engine's warnings all use (`statusText` gives it with a capital).
 */
export const STATUS_WORDS: Readonly<Record<ReceptorStatus, string>> = Object.freeze({
  'reaches-limit': 'reaches the limit within the horizon',
  'below-limit': 'stays below the limit',
  'not-reached-in-horizon': 'reaches the limit only after the horizon',
});

/** STATUS_WORDS of a status (an unknown one as it is), with a capital first letter if asked (a table cell, the start of a sentence). */
export function statusText(status: string, capital = false): string {
  const w = (STATUS_WORDS as Record<string, string>)[status] ?? status;
  return capital ? w.charAt(0).toUpperCase() + w.slice(1) : w;
}

function statusWords(f: SolutionFigures): string {
  return STATUS_WORDS[f.status];
}

/** Everything the receptor table shows, with the other solution beside it. */
export function evaluateReceptor(m: ScreeningModel, r: Receptor, limit: number, horizon: number): ReceptorResult {
  validateModel(m);
  checkReceptor(r);
  requirePositive('limit', limit);
  const main = figures(m, m.solution, r, limit, horizon);
  const warnings: Warning[] = [];
  const otherKind: SolutionKind = m.solution === 'domenico' ? 'exact' : 'domenico';
  let alternate: ReceptorResult['alternate'] = null;
  if (otherKind === 'exact' || domenicoAdmits(m)) {
    const alt = figures(m, otherKind, r, limit, horizon);
    alternate = { ...alt, ...compareSolutions(main, alt, limit) };
  }
  const who = r.label ?? 'This point';
  if (r.x < 0)
    warnings.push({
      code: 'upgradient',
      message: `${who} is upgradient of the source plane; the solutions represent no transport against the flow, so it shows zero.`,
    });
  if (alternate?.showBoth) {
    const why: string[] = [];
    if (r.x > 0 && m.ax / r.x > 0.1) why.push('the longitudinal dispersivity is large against the distance');
    if (r.x > 0 && horizon < (r.x * m.R) / Math.max(m.v, 1e-300)) why.push('the horizon is earlier than the advective arrival');
    if (Math.abs(r.y) > m.width / 2) why.push('the point is off the source width');
    const what =
      alternate.status !== main.status || (alternate.arrival === null) !== (main.arrival === null)
        ? `${SOLUTION_NAME[main.solution]} ${statusWords(main)}, ${SOLUTION_NAME[alternate.solution]} ${statusWords(alternate)}`
        : `the solutions differ by ${(100 * alternate.relDiff).toFixed(1)} % (${alternate.differing
            .filter((f): f is Exclude<ReceptorFigure, 'status'> => f !== 'status')
            .map((f) => FIGURE_WORDS[f])
            .join(', ')})`;
    warnings.push({
      code: 'solutions-differ',
      message: `${who}: ${what}${why.length ? ` (${why.join('; ')})` : ''}; both are shown.`,
    });
  }
  return { ...main, alternate, warnings };
}

/** Model-level doubts for a set of receptors. */
export function modelWarnings(m: ScreeningModel, receptors: Receptor[], limit: number, horizon: number): Warning[] {
  const w: Warning[] = [...validateModel(m)];
  requirePositive('limit', limit);
  requirePositive('horizon', horizon);
  if (limit >= m.c0)
    w.push({
      code: 'limit-above-source',
      message: 'The limit is at or above the source concentration, so no receptor can exceed it. Check both values and their units.',
      field: 'limit',
    });
  receptors.forEach((r, i) => {
    const who = r.label ?? `Receptor ${i + 1}`;
    if (r.x < 0)
      w.push({ code: 'upgradient', message: `${who} lies upgradient of the source; it shows zero.`, field: `receptors[${i}]` });
    else if (r.x > 0 && m.solution === 'domenico' && m.ax / r.x > 0.1)
      w.push({
        code: 'domenico-large-dispersivity',
        message: `At ${who} the longitudinal dispersivity exceeds a tenth of the distance, where the Domenico approximation departs most from the exact solution.`,
        field: `receptors[${i}]`,
      });
  });
  if (m.R > 50)
    w.push({ code: 'strong-sorption', message: `The retardation factor is ${m.R.toFixed(0)}: the plume moves very slowly; check Koc and foc.`, field: 'R' });
  return w;
}
