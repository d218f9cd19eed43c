/**
 * Streamlines in the steady well field: traced forward (where water goes) or backward (where it
 * came from) with the Dormand–Prince 5(4) pair (dopri.ts) in time, so the time along a streamline
 * is the water's travel time (multiply by R for a sorbing solute). Stated error: each accepted
 * step's local position error ≤ tol (default 1e-6 of the field's length scale, at least 1e-6 m).
 *
 * A streamline ends when it enters a well that takes it (forward: an extraction well; backward: an
 * injection well), leaves the aquifer across a boundary line (backward to a constant-head line:
 * the well draws that water from the stream; the crossing point is found by bisection to tol),
 * passes the far distance, reaches its time limit, stalls at a stagnation point (speed below 1e-9
 * of the regional seepage speed) or runs out of steps.
 *
 * Stagnation points: the zeros of the complex discharge W(z) = Q₀ − Σ s_j/(z − z_j), by Newton's
 * method from seeds (each well's own Javandel–Tsang point, the midpoints between wells, the points
 * between a well and each boundary), converged to 1e-12 relative.
 */
import { dopriStep, type StepResult, type StepState } from './dopri';
import { insideAquifer, lineDistance, velocity, velocityGradient, type FlowField, type VelocityGradient } from './field';
import { ValidationError, requirePositive } from '../validation';

export type StreamEnd = 'well' | 'boundary' | 'far' | 'time' | 'stagnation' | 'steps';

export interface Streamline {
  /** positions and travel times (water) from the start, in tracing order */
  readonly x: number[];
  readonly y: number[];
  readonly t: number[];
  readonly end: StreamEnd;
  /** index of the real well (end 'well') or boundary line (end 'boundary'), else −1 */
  readonly endIndex: number;
}

export interface TraceOptions {
  direction: 'forward' | 'backward';
  /** longest travel time of water to trace (T) */
  maxTime?: number;
  /** stop beyond this distance from the field's centre (L) */
  maxDistance?: number;
  /** local error per step (L) */
  tol?: number;
  maxSteps?: number;
  /** times at which the streamline must have a point (the isochrone marks), ascending */
  marks?: readonly number[];
  /** a well to ignore as a sink (the one the trace starts from) */
  skipWell?: number;
}

export interface FieldScale {
  /** length scale: stagnation distances, spacing of wells and boundaries (L) */
  length: number;
  /** centre of the wells (L) */
  cx: number;
  cy: number;
  /** regional seepage speed q/nₑ, or a typical well-induced one when there is no regional flow */
  speed: number;
}

/** Length and speed scales of a field, for default limits and tolerances. */
export function fieldScale(f: FlowField): FieldScale {
  let cx = 0;
  let cy = 0;
  let n = 0;
  let L = 0;
  for (const w of f.wells) {
    cx += w.x;
    cy += w.y;
    n++;
    if (f.q0 > 0) L = Math.max(L, Math.abs(w.rate) / (2 * Math.PI * f.q0));
  }
  if (n > 0) {
    cx /= n;
    cy /= n;
  }
  for (const w of f.wells) L = Math.max(L, Math.hypot(w.x - cx, w.y - cy));
  for (const l of f.lines) L = Math.max(L, Math.abs(lineDistance(l, cx, cy)));
  if (!(L > 0)) L = 1;
  let speed = f.darcyFlux / f.porosity;
  if (!(speed > 0)) {
    let qmax = 0;
    for (const w of f.wells) qmax = Math.max(qmax, Math.abs(w.rate));
    speed = qmax / (2 * Math.PI * L * f.nB);
  }
  if (!(speed > 0)) speed = 1;
  return { length: L, cx, cy, speed };
}

const vtmp = { x: 0, y: 0 };

/** Traces one streamline from (x0, y0). */
export function traceStreamline(f: FlowField, x0: number, y0: number, opts: TraceOptions): Streamline {
  const sc = fieldScale(f);
  const sign = opts.direction === 'backward' ? -1 : 1;
  const maxDistance = opts.maxDistance ?? 50 * sc.length + Math.hypot(x0 - sc.cx, y0 - sc.cy);
  const maxTime = opts.maxTime ?? Infinity;
  const tol = opts.tol ?? Math.max(1e-6, 1e-6 * sc.length);
  const maxSteps = opts.maxSteps ?? 20000;
  const marks = opts.marks ?? [];
  const stall = 1e-9 * sc.speed;
  const F = (x: number, y: number, o: { x: number; y: number }) => velocity(f, x, y, o);
  const xs = [x0];
  const ys = [y0];
  const ts = [0];
  const s: StepState = { x: x0, y: y0, fx: 0, fy: 0 };
  F(x0, y0, vtmp);
  s.fx = vtmp.x;
  s.fy = vtmp.y;
  const res: StepResult = { accepted: false, err: 0, hNext: 0 };
  let t = 0;
  let speed0 = Math.hypot(s.fx, s.fy);
  let h = speed0 > 0 ? (0.01 * sc.length) / speed0 : 1;
  let mark = 0;
  while (mark < marks.length && marks[mark] <= 0) mark++;
  const done = (end: StreamEnd, endIndex = -1): Streamline => ({ x: xs, y: ys, t: ts, end, endIndex });
  for (let steps = 0; steps < maxSteps; steps++) {
    const speed = Math.hypot(s.fx, s.fy);
    if (speed < stall) return done('stagnation');
    if (t >= maxTime) return done('time');
    const target = mark < marks.length ? Math.min(maxTime, marks[mark]) : maxTime;
    const hTry = Math.min(h, target - t);
    const px = s.x;
    const py = s.y;
    dopriStep(F, s, hTry, tol, sign, res);
    if (!res.accepted) {
      h = res.hNext;
      if (!(h > 0) || h < 1e-300) return done('steps');
      continue;
    }
    t = hTry === target - t ? target : t + hTry;
    h = res.hNext;
    while (mark < marks.length && marks[mark] <= t) mark++;
    // leaving the aquifer: bisect the crossing on the chord (within tol)
    if (!insideAquifer(f, s.x, s.y)) {
      let lo = 0;
      let hi = 1;
      while ((hi - lo) * Math.hypot(s.x - px, s.y - py) > tol) {
        const mid = 0.5 * (lo + hi);
        if (insideAquifer(f, px + mid * (s.x - px), py + mid * (s.y - py))) lo = mid;
        else hi = mid;
      }
      const cx = px + hi * (s.x - px);
      const cy = py + hi * (s.y - py);
      let li = 0;
      let best = Infinity;
      f.lines.forEach((l, i) => {
        const d = Math.abs(lineDistance(l, cx, cy));
        if (d < best) {
          best = d;
          li = i;
        }
      });
      xs.push(cx);
      ys.push(cy);
      ts.push(ts[ts.length - 1] + hi * (t - ts[ts.length - 1]));
      return done('boundary', li);
    }
    xs.push(s.x);
    ys.push(s.y);
    ts.push(t);
    // a sink for this direction: forward an extraction well, backward an injection well
    for (let j = 0; j < f.wells.length; j++) {
      if (j === opts.skipWell) continue;
      const w = f.wells[j];
      if (w.rate * sign <= 0) continue;
      const dx = s.x - w.x;
      const dy = s.y - w.y;
      const rw = w.radius as number;
      if (dx * dx + dy * dy <= rw * rw * 1.0000001 + tol * tol) return done('well', j);
    }
    if (Math.hypot(s.x - sc.cx, s.y - sc.cy) > maxDistance) return done('far');
  }
  return done('steps');
}

/** Position at travel time T along a streamline (linear between its points; its end if shorter). */
export function positionAt(s: Streamline, T: number): { x: number; y: number; reached: boolean } {
  const n = s.t.length;
  if (T >= s.t[n - 1]) return { x: s.x[n - 1], y: s.y[n - 1], reached: T === s.t[n - 1] };
  let lo = 0;
  let hi = n - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (s.t[mid] <= T) lo = mid;
    else hi = mid;
  }
  const a = (T - s.t[lo]) / (s.t[hi] - s.t[lo] || 1);
  return { x: s.x[lo] + a * (s.x[hi] - s.x[lo]), y: s.y[lo] + a * (s.y[hi] - s.y[lo]), reached: true };
}

export interface StagnationPoint {
  readonly x: number;
  readonly y: number;
}

/** Stagnation points inside the aquifer (see the header). */
export function stagnationPoints(f: FlowField): StagnationPoint[] {
  const seeds: [number, number][] = [];
  const W = f.wells;
  for (const w of W) {
    if (w.rate === 0) continue;
    const d = f.q0 > 0 ? w.rate / (2 * Math.PI * f.q0) : 0;
    seeds.push([w.x + d, w.y], [w.x - d, w.y], [w.x, w.y + d], [w.x, w.y - d]);
    for (const l of f.lines) {
      const dist = lineDistance(l, w.x, w.y);
      for (const a of [0.1, 0.3, 0.5, 0.7, 0.9, 1]) seeds.push([w.x - a * dist * l.nx, w.y - a * dist * l.ny]);
      // along the line on either side of the foot of the perpendicular
      const fx = w.x - dist * l.nx;
      const fy = w.y - dist * l.ny;
      for (const a of [0.5, 1, 2, 4]) seeds.push([fx - a * dist * l.ny, fy + a * dist * l.nx], [fx + a * dist * l.ny, fy - a * dist * l.nx]);
    }
  }
  for (let a = 0; a < W.length; a++)
    for (let b = a + 1; b < W.length; b++) seeds.push([(W[a].x + W[b].x) / 2, (W[a].y + W[b].y) / 2]);
  const sc = fieldScale(f);
  const found: StagnationPoint[] = [];
  for (const [sx, sy] of seeds) {
    const p = newtonZero(f, sx, sy);
    if (!p) continue;
    // on a boundary line counts as inside (a constant-head line can carry stagnation points)
    if (f.lines.some((l) => lineDistance(l, p.x, p.y) < -1e-9 * sc.length)) continue;
    let nearWell = false;
    for (const w of W) if (Math.hypot(p.x - w.x, p.y - w.y) <= (w.radius as number)) nearWell = true;
    if (nearWell) continue;
    if (found.some((q) => Math.hypot(q.x - p.x, q.y - p.y) < 1e-7 * sc.length)) continue;
    found.push(p);
  }
  return found;
}

function newtonZero(f: FlowField, x0: number, y0: number): StagnationPoint | null {
  let x = x0;
  let y = y0;
  const sc = fieldScale(f);
  for (let it = 0; it < 100; it++) {
    // W = Q₀ − Σ s/(z − z_j);  W' = Σ s/(z − z_j)²
    let wr = f.q0;
    let wi = 0;
    let dr = 0;
    let di = 0;
    for (let k = 0; k < f.sx.length; k++) {
      const ax = x - f.sx[k];
      const ay = y - f.sy[k];
      const r2 = ax * ax + ay * ay;
      if (r2 === 0) return null;
      const s = f.ss[k];
      // 1/(z−z_j) = (ax − i ay)/r²; 1/(z−z_j)² = (ax² − ay² − 2i ax ay)/r⁴
      wr -= (s * ax) / r2;
      wi += (s * ay) / r2;
      const r4 = r2 * r2;
      dr += (s * (ax * ax - ay * ay)) / r4;
      di -= (s * 2 * ax * ay) / r4;
    }
    const den = dr * dr + di * di;
    if (!(den > 0)) return null;
    // step = W/W'
    const stepX = (wr * dr + wi * di) / den;
    const stepY = (wi * dr - wr * di) / den;
    x -= stepX;
    y -= stepY;
    if (!Number.isFinite(x) || !Number.isFinite(y)) return null;
    if (Math.hypot(stepX, stepY) <= 1e-12 * (sc.length + Math.hypot(x, y))) return { x, y };
  }
  return null;
}

/**
 * The dividing streamlines through a stagnation point, traced backward: the two branches that
 * arrive there (along the eigenvector of the velocity gradient with the negative eigenvalue;
 * the gradient is symmetric and trace-free, so the eigenvalues are ±λ), started `offset` from it.
 */
export function dividingStreamlines(f: FlowField, p: StagnationPoint, opts: Omit<TraceOptions, 'direction'> & { offset?: number } = {}): Streamline[] {
  const g: VelocityGradient = { vx: 0, vy: 0, dxx: 0, dxy: 0, dyx: 0, dyy: 0 };
  velocityGradient(f, p.x, p.y, g);
  const a = g.dxx;
  const b = g.dxy;
  const lam = Math.hypot(a, b);
  // eigenvector of [[a, b], [b, −a]] for −lam: (b, −(a + lam)) from the first row or (lam − a, −b)
  // from the second; the longer of the two is the better conditioned
  let ex = b;
  let ey = -(a + lam);
  if (Math.hypot(lam - a, b) > Math.hypot(ex, ey)) {
    ex = lam - a;
    ey = -b;
  }
  if (!(Math.hypot(ex, ey) > 0)) {
    ex = 0; // no gradient (a degenerate point): any direction
    ey = 1;
  }
  const n = Math.hypot(ex, ey);
  ex /= n;
  ey /= n;
  const off = opts.offset ?? 1e-6 * fieldScale(f).length;
  return [1, -1].map((sgn) => traceStreamline(f, p.x + sgn * off * ex, p.y + sgn * off * ey, { ...opts, direction: 'backward' }));
}

export interface Isochrone {
  /** travel time to the well (T; water time times R for a sorbing solute) */
  readonly time: number;
  /** each streamline's position at that time, in the fan's angle order, x and y interleaved */
  readonly polygon: Float64Array;
  /** the outline of the ground from which water reaches the well within that time (sweptOutline) */
  readonly outline: Float64Array;
  /** the mark as drawn: the front at that time (isochroneFront) */
  readonly front: { pieces: Float64Array[]; closed: boolean };
}

export interface CaptureZone {
  readonly well: number;
  /** the fan of streamlines traced backward from the well, evenly spaced in angle */
  readonly streamlines: Streamline[];
  /** the steady capture zone as far as traced: the streamline end points, in angle order */
  readonly envelope: Float64Array;
  /** the outline of the capture zone as far as traced (sweptOutline at the longest time traced) */
  readonly outline: Float64Array;
  /** time-of-travel zones (time in the solute's time when a retardation factor is given) */
  readonly isochrones: Isochrone[];
  /** share of the well's water that enters the aquifer across each boundary line (constant head) */
  readonly fromBoundary: number[];
  /** share still in the aquifer beyond the far distance or the time limit (regional groundwater) */
  readonly fromRegional: number;
}

export interface CaptureOptions {
  /** streamlines in the fan (default 72) */
  count?: number;
  /** isochrone times (T), in solute time when R > 1 */
  times?: readonly number[];
  /** retardation factor for the isochrones (1: water) */
  retardation?: number;
  /** longest water travel time traced (default: the longest mark × 4, or unlimited without marks) */
  maxTime?: number;
  maxDistance?: number;
  tol?: number;
}

/**
 * Capture zone of real well j (must extract): M streamlines started on the well's radius at evenly
 * spaced angles — near the well the flow is radial, so each carries Q/M of the well's water —
 * traced backward. The isochrone for time T joins each streamline's position at water time T/R.
 */
export function captureZone(f: FlowField, j: number, opts: CaptureOptions = {}): CaptureZone {
  const w = f.wells[j];
  if (!w) throw new ValidationError('well', j, `an index of a well (0 … ${f.wells.length - 1})`);
  if (!(w.rate > 0)) throw new ValidationError(`wells[${j}].rate`, w.rate, '> 0 (a capture zone belongs to an extraction well)');
  const M = Math.max(8, Math.floor(opts.count ?? 72));
  const R = opts.retardation === undefined ? 1 : requirePositive('retardation', opts.retardation);
  const times = [...(opts.times ?? [])].sort((a, b) => a - b);
  const waterMarks = times.map((T) => T / R);
  const maxTime = opts.maxTime ?? (waterMarks.length ? 4 * waterMarks[waterMarks.length - 1] : Infinity);
  const r0 = (w.radius as number) * 1.001;
  const streamlines: Streamline[] = [];
  const counts = new Array<number>(f.lines.length).fill(0);
  let regional = 0;
  for (let k = 0; k < M; k++) {
    const th = (2 * Math.PI * (k + 0.5)) / M;
    const s = traceStreamline(f, w.x + r0 * Math.cos(th), w.y + r0 * Math.sin(th), {
      direction: 'backward',
      maxTime,
      marks: waterMarks,
      maxDistance: opts.maxDistance,
      tol: opts.tol,
      skipWell: j,
    });
    streamlines.push(s);
    if (s.end === 'boundary' && f.lines[s.endIndex].kind === 'constant-head') counts[s.endIndex]++;
    else if (s.end === 'far' || s.end === 'time' || s.end === 'steps') regional++;
  }
  // the stagnation point between two streamlines that split around it (within their distance apart)
  const tip = (p: { x: number; y: number }, q: { x: number; y: number }): StagnationPoint | null => {
    const z = newtonZero(f, (p.x + q.x) / 2, (p.y + q.y) / 2);
    return z && insideAquifer(f, z.x, z.y) && Math.hypot(z.x - p.x, z.y - p.y) + Math.hypot(z.x - q.x, z.y - q.y) <= 3 * Math.hypot(p.x - q.x, p.y - q.y) ? z : null;
  };
  const envelope = new Float64Array(2 * M);
  streamlines.forEach((s, k) => {
    envelope[2 * k] = s.x[s.x.length - 1];
    envelope[2 * k + 1] = s.y[s.y.length - 1];
  });
  const isochrones = times.map((T, i) => {
    const poly = new Float64Array(2 * M);
    streamlines.forEach((s, k) => {
      const p = positionAt(s, waterMarks[i]);
      poly[2 * k] = p.x;
      poly[2 * k + 1] = p.y;
    });
    return { time: T, polygon: poly, outline: sweptOutline(streamlines, waterMarks[i], tip), front: isochroneFront(streamlines, waterMarks[i]) };
  });
  return { well: j, streamlines, envelope, outline: sweptOutline(streamlines, Infinity, tip), isochrones, fromBoundary: counts.map((c) => c / M), fromRegional: regional / M };
}

export interface SourceCapture {
  /** the real well the source's water reaches, or −1 */
  readonly well: number;
  /** water travel time from the source to that well (T), or null */
  readonly travelTime: number | null;
  readonly streamline: Streamline;
}

/**
 * Where the water at the source goes: traced forward; `well` ≥ 0 when it ends in an extraction
 * well (the source lies inside that well's capture zone), with the water travel time (multiply by
 * R for the solute's advective time).
 */
export function sourceCapture(f: FlowField, x: number, y: number, opts: Omit<TraceOptions, 'direction'> = {}): SourceCapture {
  const s = traceStreamline(f, x, y, { ...opts, direction: 'forward' });
  if (s.end === 'well') return { well: s.endIndex, travelTime: s.t[s.t.length - 1], streamline: s };
  return { well: -1, travelTime: null, streamline: s };
}

/** Adjacent streamlines whose ends lie this many times the median spacing apart split at a stagnation point. */
const SPLIT_FACTOR = 4;

/**
 * The outline of the ground swept by a fan of streamlines traced backward from a well (in angle
 * order) within water travel time T (Infinity: as far as traced): the region from which water
 * reaches the well within T. Where two neighbouring streamlines stay together, the outline joins
 * their positions at T. Where those lie more than SPLIT_FACTOR times the median spacing apart,
 * either one stopped short beside the other (it lingered by a stagnation point; both traced for
 * T), and the outline follows the longer one back (or forward) to beside the shorter one's end; or they split around a
 * stagnation point (each end far from the other's path), and the outline runs back along the first of them to its
 * slowest point (the one nearest the stagnation point), through the stagnation point itself when
 * `tip` finds it (captureZone: Newton on the complex discharge from between the two slowest
 * points), and out along the second from its own slowest point, so the outline follows the
 * dividing streamline into the stagnation point instead of cutting across the zone. Exact to
 * within the fan's spacing (each streamline carries Q/M) and, beside the stagnation point, the
 * chord from it to where the two straddling streamlines pass it. x and y interleaved, not closed
 * (the last point is not the first).
 */
export function sweptOutline(
  streamlines: readonly Streamline[],
  T: number,
  tip?: (a: { x: number; y: number }, b: { x: number; y: number }) => StagnationPoint | null,
): Float64Array {
  const M = streamlines.length;
  const ends = streamlines.map((s) => positionAt(s, T));
  const gaps = ends.map((e, k) => Math.hypot(ends[(k + 1) % M].x - e.x, ends[(k + 1) % M].y - e.y));
  const median = [...gaps].sort((a, b) => a - b)[Math.floor(M / 2)];
  const out: number[] = [];
  for (let k = 0; k < M; k++) {
    out.push(ends[k].x, ends[k].y);
    const next = (k + 1) % M;
    if (!(gaps[k] > SPLIT_FACTOR * median) || M < 3) continue;
    const a = truncated(streamlines[k], T);
    const b = truncated(streamlines[next], T);
    const na = nearest(a, ends[next]);
    const nb = nearest(b, ends[k]);
    if (na.d > SPLIT_FACTOR * median && nb.d > SPLIT_FACTOR * median) {
      // they split around a stagnation point: back along a, through it, out along b
      const ia = slowest(a);
      const ib = slowest(b);
      for (let i = a.x.length - 2; i >= ia; i--) out.push(a.x[i], a.y[i]);
      const z = tip?.({ x: a.x[ia], y: a.y[ia] }, { x: b.x[ib], y: b.y[ib] });
      if (z) out.push(z.x, z.y);
      for (let j = ib; j < b.x.length - 1; j++) out.push(b.x[j], b.y[j]);
    } else if (na.d <= nb.d) {
      // b ends beside a, short of a's end (at a boundary or a well, or at T after lingering by a
      // stagnation point): back along a to there; an end set by the tracing limits is not followed
      if (realEnd(streamlines[next], T)) for (let i = a.x.length - 2; i > na.i; i--) out.push(a.x[i], a.y[i]);
    } else if (realEnd(streamlines[k], T)) {
      // a ends beside b, short of b's end: along b from there
      for (let j = nb.i + 1; j < b.x.length - 1; j++) out.push(b.x[j], b.y[j]);
    }
  }
  return Float64Array.from(out);
}

/** Whether a streamline's position at T is a real end: reached at T, or where it met a well, a boundary or a stagnation point. */
function realEnd(s: Streamline, T: number): boolean {
  return (Number.isFinite(T) && s.t[s.t.length - 1] >= T) || s.end === 'well' || s.end === 'boundary' || s.end === 'stagnation';
}

/** The point of a path (its points joined by straight segments) nearest to p: the segment's first index and the distance. */
function nearest(path: { x: number[]; y: number[] }, p: { x: number; y: number }): { i: number; d: number } {
  let i = 0;
  let d = Math.hypot(path.x[0] - p.x, path.y[0] - p.y);
  for (let k = 0; k + 1 < path.x.length; k++) {
    const ex = path.x[k + 1] - path.x[k];
    const ey = path.y[k + 1] - path.y[k];
    const len2 = ex * ex + ey * ey;
    const u = len2 > 0 ? Math.max(0, Math.min(1, ((p.x - path.x[k]) * ex + (p.y - path.y[k]) * ey) / len2)) : 0;
    const e = Math.hypot(path.x[k] + u * ex - p.x, path.y[k] + u * ey - p.y);
    if (e < d) {
      d = e;
      i = k;
    }
  }
  return { i, d };
}

/** Index of the point after the slowest stretch of a traced path (distance per travel time). */
function slowest(p: { x: number[]; y: number[]; t: number[] }): number {
  let best = Infinity;
  let at = p.x.length - 1;
  for (let i = 1; i < p.x.length; i++) {
    const dt = p.t[i] - p.t[i - 1];
    if (!(dt > 0)) continue;
    const v = Math.hypot(p.x[i] - p.x[i - 1], p.y[i] - p.y[i - 1]) / dt;
    if (v < best) {
      best = v;
      at = i;
    }
  }
  return at;
}

/** The streamline's points up to water time T (its position at T last). */
function truncated(s: Streamline, T: number): { x: number[]; y: number[]; t: number[] } {
  const x: number[] = [];
  const y: number[] = [];
  const t: number[] = [];
  for (let i = 0; i < s.t.length && s.t[i] < T; i++) {
    x.push(s.x[i]);
    y.push(s.y[i]);
    t.push(s.t[i]);
  }
  const e = positionAt(s, T);
  x.push(e.x);
  y.push(e.y);
  t.push(Math.min(T, s.t[s.t.length - 1]));
  return { x, y, t };
}

/**
 * The time-of-travel mark at water time T as drawn: the fan's positions at T in angle order (each
 * streamline's point from which water takes T to reach the well), leaving out streamlines that
 * ended before T (at a boundary line, another well or the tracing limit: their water reaches the
 * well sooner from anywhere along them) and broken where neighbours split around a stagnation
 * point (as in sweptOutline). One closed ring while every streamline reaches T and none split
 * (a small T: a ring around the well); otherwise the longest open piece, the front across the
 * zone (x, y interleaved). The pieces left out run along the zone's sides towards a stagnation
 * point, where travel times grow without bound; drawn, they would double the zone's outline.
 */
export function isochroneFront(streamlines: readonly Streamline[], T: number): { pieces: Float64Array[]; closed: boolean } {
  const M = streamlines.length;
  const at = streamlines.map((s) => positionAt(s, T));
  const reached = streamlines.map((s) => s.t[s.t.length - 1] >= T);
  const gap = (k: number) => Math.hypot(at[(k + 1) % M].x - at[k].x, at[(k + 1) % M].y - at[k].y);
  const gaps = at.map((_, k) => gap(k));
  const median = [...gaps].sort((a, b) => a - b)[Math.floor(M / 2)];
  const breakAfter = (k: number) => !reached[k] || !reached[(k + 1) % M] || gaps[k] > SPLIT_FACTOR * median;
  const breaks = at.map((_, k) => breakAfter(k));
  if (!breaks.some(Boolean) && reached.every(Boolean)) return { pieces: [Float64Array.from(at.flatMap((p) => [p.x, p.y]))], closed: true };
  // start just after a break, so no piece wraps around the fan's ends
  const start = (breaks.indexOf(true) + 1) % M;
  const pieces: Float64Array[] = [];
  let cur: number[] = [];
  for (let i = 0; i < M; i++) {
    const k = (start + i) % M;
    if (reached[k]) cur.push(at[k].x, at[k].y);
    if (breaks[k]) {
      if (cur.length >= 4) pieces.push(Float64Array.from(cur));
      cur = [];
    }
  }
  if (cur.length >= 4) pieces.push(Float64Array.from(cur));
  const longest = pieces.reduce<Float64Array | null>((a, b) => (!a || b.length > a.length ? b : a), null);
  return { pieces: longest ? [longest] : [], closed: false };
}
