/**
 * Random-walk particle tracking of a dissolved solute in the steady well field (flow/field.ts),
 * two-dimensional: the solute is mixed over the saturated thickness B (depth-averaged), which is
 * what a fully penetrating well draws.
 *
 * Step (Itô form; Kinzelbach 1988, in Custodio et al. (eds.), Groundwater Flow and Quality
 * Modelling, NATO ASI C 224; LaBolle, Fogg & Tompson 1996, WRR 32(3)):
 *     X ← X + (u + ∇·D)·Δt + B·ξ·√Δt,   B·Bᵀ = 2D,   ξ ~ N(0, I),
 * with u = v/R the retarded seepage velocity and D = ((αT|u| + De/R)·I + (αL − αT)·u·uᵀ/|u|) the
 * retarded dispersion tensor (Scheidegger's form), B = [e_L·√(2D_L), e_T·√(2D_T)] (e_L along u).
 * ∇·D comes from the analytical velocity gradient (field.ts). In uniform flow D is constant and
 * the step is exact in distribution whatever its length; elsewhere Δt ≤ ε/‖∇u‖ (the velocity
 * changes by about ε over a step) and, near a pumping well, the advective move is at most ε and
 * the random move's standard deviation at most half of the distance to the well's capture circle. ε = 0.1 by default.
 *
 * Source: particles released on the source plane x = 0, |y| ≤ W/2, at stratified random times
 * over the active period (continuous, finite or declining C₀·e^{−γt}) and positions; particle j's
 * mass is the source mass flux C₀(t)·q_x(0, y)·H·W over its share of the period (q_x the Darcy
 * flux at the plane, H the source thickness) — a mass-flux source in the whole plane, against the
 * analytical solutions' concentration held on the plane of a half-space: the two agree where
 * x ≫ αL (the flux and resident forms differ by O(αL/x); van Genuchten & Parker 1984, SSSAJ 48).
 *
 * First-order decay acts on particle mass (m = m₀·e^{−λ'(t − t₀)}, λ' = λ, or λ/R for dissolved-
 * only decay); particles are never deleted for it. A particle within the capture radius r_c of a
 * pumping well leaves the aquifer into it: r_c = max(r_w, min(0.2·Q/(2πqB), 10 m)), where the
 * well's inflow is at least five times the regional velocity and every streamline ends in the well
 * (an approximation: a particle could still disperse out of that circle, which the walk does not
 * follow; inside it dispersion would otherwise need ever shorter steps); its arrival time is early
 * by about the advective time across r_c, at most π·r_c²·nₑ·B·R/Q.
 * A particle crossing a constant-head line leaves the aquifer there; one crossing an impermeable
 * line is reflected back across it.
 *
 * Concentration at an observation point: disk (box-kernel) estimator of radius h,
 * C = Σ m_i /(π h² nₑ B R) over the particles inside, biased by about (h²/8)·∇²C (second order in h),
 * with standard error √(Σ m_i²)/(π h² nₑ B R) (the particle count as a Poisson sample).
 * Concentration in a pumping well's water: the captured mass per interval / (Q · interval), with
 * the standard error √(Σ m_i²)/(Q · interval).
 *
 * Reproducible: particle j draws from its own stream (stream.ts: xoshiro128** seeded with the
 * Philox block (seed, purpose 3, j), normal deviates by the ziggurat method); the result does not
 * depend on how particles are split across workers (sums in another order differ by round-off).
 */
import { ParticleStream } from './stream';
import { insideAquifer, lineDistance, velocityGradient, type FlowField, type VelocityGradient } from '../flow/field';
import { ValidationError, requireInRange, requireNonNegative, requirePositive, requireTime } from '../validation';

export interface WalkSource {
  /** source width across the flow (m), centred on y = 0 at x = 0 */
  readonly width: number;
  /** source thickness H (m), ≤ the saturated thickness */
  readonly thickness: number;
  /** C₀ (mg/L) */
  readonly c0: number;
  /** decline rate γ of C₀ (1/d), 0 for constant */
  readonly sourceDecay: number;
  /** release duration (d), Infinity for continuous */
  readonly duration: number;
}

export interface WalkObserver {
  readonly x: number;
  readonly y: number;
  /** estimator radius h (m) */
  readonly radius: number;
}

export interface WalkGrid {
  readonly x0: number;
  readonly y0: number;
  readonly dx: number;
  readonly dy: number;
  readonly nx: number;
  readonly ny: number;
  /** record the grid at every `every`-th output time only (frames at output times every−1, 2·every−1, …); default 1 */
  readonly every?: number;
}

export interface WalkInput {
  readonly field: FlowField;
  readonly source: WalkSource;
  /** dispersivities (m), effective molecular diffusion (m²/d) */
  readonly ax: number;
  readonly ay: number;
  readonly diffusion: number;
  readonly R: number;
  /** first-order decay rate (1/d) and its phase */
  readonly decay: number;
  readonly decayDissolvedOnly: boolean;
  /** output times (d), ascending, > 0; the last is the horizon */
  readonly times: readonly number[];
  readonly particles: number;
  readonly seed: number;
  readonly observers?: readonly WalkObserver[];
  readonly grid?: WalkGrid;
  /** step control ε (default 0.1) */
  readonly epsilon?: number;
  /** particles released at given points and times instead of the source (tests: a point release) */
  readonly release?: (j: number, rand: () => number) => { x: number; y: number; t: number; mass: number };
  /** called with each particle's position at each output time it is in the aquifer (tracks, tests) */
  readonly onPosition?: (j: number, k: number, x: number, y: number, mass: number) => void;
}

/** Accumulated sums; partial runs over particle ranges add up (merge). */
export interface WalkTally {
  /** per observer × time: Σm and Σm² inside the disk */
  obsMass: Float64Array;
  obsMass2: Float64Array;
  /** per extraction well × time interval (0, t₀], (t₀, t₁], …: captured mass, Σm² */
  wellMass: Float64Array;
  wellMass2: Float64Array;
  /** per grid frame × grid cell: mass (frames: see WalkGrid.every) */
  gridMass: Float64Array;
  /** mass in the aquifer at each output time */
  aquiferMass: Float64Array;
  released: number;
  captured: number;
  outflow: number;
  decayed: number;
  /** particles that hit the step limit (reported; none expected) */
  stalled: number;
  steps: number;
  particlesDone: number;
}

export interface PreparedWalk {
  readonly input: WalkInput;
  readonly times: Float64Array;
  readonly lam: number;
  readonly activeEnd: number;
  /** extraction wells: index into field.wells and capture radius² */
  readonly sinks: { index: number; x: number; y: number; rc2: number; rc: number }[];
  readonly eps: number;
  readonly dm: number;
}

export function prepareWalk(input: WalkInput): PreparedWalk {
  const f = input.field;
  const s = input.source;
  requirePositive('source.width', s.width);
  requirePositive('source.thickness', s.thickness);
  requireNonNegative('source.c0', s.c0);
  requireNonNegative('source.sourceDecay', s.sourceDecay);
  const duration = requireTime('source.duration', s.duration);
  requireNonNegative('ax', input.ax);
  requireNonNegative('ay', input.ay);
  requireNonNegative('diffusion', input.diffusion);
  requirePositive('R', input.R);
  if (input.R < 1) throw new ValidationError('R', input.R, '≥ 1');
  requireNonNegative('decay', input.decay);
  const n = input.particles;
  if (!Number.isInteger(n) || n < 1 || n > 50_000_000) throw new ValidationError('particles', n, 'a whole number from 1 to 50 000 000');
  const times = Float64Array.from(input.times ?? []);
  if (times.length === 0) throw new ValidationError('times', input.times, 'at least one output time > 0');
  for (let k = 0; k < times.length; k++) {
    requirePositive(`times[${k}]`, times[k]);
    if (k > 0 && !(times[k] > times[k - 1])) throw new ValidationError(`times[${k}]`, times[k], `> times[${k - 1}] (ascending)`);
  }
  const eps = input.epsilon === undefined ? 0.1 : requireInRange('epsilon', input.epsilon, 0, 1, true, false);
  for (const [i, o] of (input.observers ?? []).entries()) requirePositive(`observers[${i}].radius`, o.radius);
  const g = input.grid;
  if (g) {
    requirePositive('grid.dx', g.dx);
    requirePositive('grid.dy', g.dy);
    for (const [k, v] of [['grid.nx', g.nx], ['grid.ny', g.ny]] as const) if (!Number.isInteger(v) || v < 1 || v > 4096) throw new ValidationError(k, v, 'a whole number from 1 to 4096');
    if (g.every !== undefined && (!Number.isInteger(g.every) || g.every < 1 || g.every > times.length))
      throw new ValidationError('grid.every', g.every, `a whole number from 1 to ${times.length} (the output times)`);
  }
  const sinks = f.wells
    .map((w, index) => ({ w, index }))
    .filter(({ w }) => w.rate > 0)
    .map(({ w, index }) => {
      const stag = f.q0 > 0 ? w.rate / (2 * Math.PI * f.q0) : Infinity;
      const rc = Math.max(w.radius as number, Math.min(0.2 * stag, 10));
      return { index, x: w.x, y: w.y, rc, rc2: rc * rc };
    });
  return {
    input,
    times,
    lam: input.decayDissolvedOnly ? input.decay / input.R : input.decay,
    activeEnd: Math.min(duration, times[times.length - 1]),
    sinks,
    eps,
    dm: input.diffusion / input.R,
  };
}

export function emptyTally(p: PreparedWalk): WalkTally {
  const nt = p.times.length;
  const no = p.input.observers?.length ?? 0;
  const g = p.input.grid;
  return {
    obsMass: new Float64Array(no * nt),
    obsMass2: new Float64Array(no * nt),
    wellMass: new Float64Array(p.sinks.length * nt),
    wellMass2: new Float64Array(p.sinks.length * nt),
    gridMass: new Float64Array(g ? g.nx * g.ny * gridFrames(p) : 0),
    aquiferMass: new Float64Array(nt),
    released: 0,
    captured: 0,
    outflow: 0,
    decayed: 0,
    stalled: 0,
    steps: 0,
    particlesDone: 0,
  };
}

/** Number of grid frames kept (output times every−1, 2·every−1, … of the walk). */
export function gridFrames(p: PreparedWalk): number {
  const g = p.input.grid;
  return g ? Math.floor(p.times.length / gridEvery(g)) : 0;
}

function gridEvery(g: WalkGrid): number {
  return g.every === undefined ? 1 : g.every;
}

/**
 * A tally of part of the particles, scaled to stand for all of them: masses × f, sums of squared
 * masses × f² (so standard errors scale by f). With particles walked in an interleaved subset
 * (walkParticles' stride), f = N / particles walked gives an unbiased estimate of the whole run:
 * every subset spans the whole release period. The counts (particlesDone, steps, stalled) are kept.
 */
export function scaledTally(t: WalkTally, f: number): WalkTally {
  const mul = (a: Float64Array, k: number) => a.map((v) => v * k);
  return {
    ...t,
    obsMass: mul(t.obsMass, f),
    obsMass2: mul(t.obsMass2, f * f),
    wellMass: mul(t.wellMass, f),
    wellMass2: mul(t.wellMass2, f * f),
    gridMass: mul(t.gridMass, f),
    aquiferMass: mul(t.aquiferMass, f),
    released: t.released * f,
    captured: t.captured * f,
    outflow: t.outflow * f,
    decayed: t.decayed * f,
  };
}

export function mergeTally(into: WalkTally, t: WalkTally): void {
  const add = (a: Float64Array, b: Float64Array) => {
    for (let i = 0; i < a.length; i++) a[i] += b[i];
  };
  add(into.obsMass, t.obsMass);
  add(into.obsMass2, t.obsMass2);
  add(into.wellMass, t.wellMass);
  add(into.wellMass2, t.wellMass2);
  add(into.gridMass, t.gridMass);
  add(into.aquiferMass, t.aquiferMass);
  into.released += t.released;
  into.captured += t.captured;
  into.outflow += t.outflow;
  into.decayed += t.decayed;
  into.stalled += t.stalled;
  into.steps += t.steps;
  into.particlesDone += t.particlesDone;
}

const MAX_STEPS_PER_PARTICLE = 200_000;

/**
 * Walks particles j0, j0 + stride, … below j1 into `tally`. `shouldStop` is polled every 256
 * particles (cancel). Returns the number walked. A stride > 1 walks an interleaved subset that
 * spans the whole release period (particles are stratified in release time by j), so a run split
 * into offsets 0 … stride−1 gives a usable partial result after each (scaledTally).
 */
export function walkParticles(p: PreparedWalk, j0: number, j1: number, tally: WalkTally, shouldStop?: () => boolean, stride = 1): number {
  if (!Number.isInteger(stride) || stride < 1) throw new ValidationError('stride', stride, 'a whole number ≥ 1');
  const inp = p.input;
  const f = inp.field;
  const src = inp.source;
  const N = inp.particles;
  const R = inp.R;
  const times = p.times;
  const nt = times.length;
  const horizon = times[nt - 1];
  const lam = p.lam;
  const eps = p.eps;
  const aL = inp.ax;
  const aT = inp.ay;
  const dm = p.dm;
  const obs = inp.observers ?? [];
  const no = obs.length;
  const grid = inp.grid;
  const every = grid ? gridEvery(grid) : 1;
  const frames = gridFrames(p);
  const sinks = p.sinks;
  const ns = sinks.length;
  const lines = f.lines;
  const rng = new ParticleStream(inp.seed);
  const g: VelocityGradient = { vx: 0, vy: 0, dxx: 0, dxy: 0, dyx: 0, dyy: 0 };
  const obsArea = obs.map((o) => 1 / (Math.PI * o.radius * o.radius));
  const obsR2 = obs.map((o) => o.radius * o.radius);
  const rand = () => rng.next();
  const onPosition = inp.onPosition;
  const active = p.activeEnd;
  const massScale = src.c0 * src.thickness * src.width * (active / N);
  const invR = 1 / R;
  // decay over each output interval, e^{−λ'(t_k − t_{k−1})}, for the mass at successive output times
  const decayOver = times.map((tk, k) => (k === 0 ? 1 : Math.exp(-lam * (tk - times[k - 1]))));
  let done = 0;
  let moves = 0;
  for (let j = j0; j < j1; j += stride) {
    if ((done & 255) === 0 && done > 0 && shouldStop?.()) break;
    done++;
    rng.reset(j);
    let x: number;
    let y: number;
    let t: number;
    let m0: number;
    if (inp.release) {
      const r = inp.release(j, rand);
      x = r.x;
      y = r.y;
      t = r.t;
      m0 = r.mass;
    } else {
      // stratified in time; position uniform across the source width
      t = ((j + rng.next()) / N) * active;
      x = 0;
      y = (rng.next() - 0.5) * src.width;
      velocityGradient(f, x, y, g);
      const qx = Math.max(0, g.vx) * f.porosity; // Darcy flux normal to the plane
      m0 = massScale * qx * Math.exp(-src.sourceDecay * t);
    }
    if (!(t < horizon) || !(m0 > 0)) continue;
    const t0 = t;
    tally.released += m0;
    let k = 0;
    while (k < nt && times[k] <= t) k++;
    let fate = 0; // 0 in aquifer, 1 captured, 2 outflow, 3 stalled
    let steps = 0;
    let mRecorded = -1;
    while (k < nt) {
      // record at output time k when reached
      velocityGradient(f, x, y, g);
      const ux = g.vx * invR;
      const uy = g.vy * invR;
      const sp = Math.sqrt(ux * ux + uy * uy);
      let dt = times[k] - t;
      const gx = g.dxx * invR;
      const gxy = g.dxy * invR;
      const gyx = g.dyx * invR;
      const gy = g.dyy * invR;
      // Δt ≤ ε/‖∇u‖, compared squared: most steps end on an output time before that limit binds
      const gn2 = gx * gx + gxy * gxy + gyx * gyx + gy * gy;
      if (gn2 * dt * dt > eps * eps) dt = eps / Math.sqrt(gn2);
      const DL = aL * sp + dm;
      const DT = aT * sp + dm;
      // drift ∇·D
      let driftX = 0;
      let driftY = 0;
      let eLx = 1;
      let eLy = 0;
      if (sp > 0) {
        eLx = ux / sp;
        eLy = uy / sp;
        const dspx = eLx * gx + eLy * gyx; // ∂|u|/∂x
        const dspy = eLx * gxy + eLy * gy; // ∂|u|/∂y
        const b = aL - aT;
        const div = gx + gy;
        const uGradSp = eLx * dspx + eLy * dspy; // u·∇|u| / |u|
        driftX = aT * dspx + b * (gx * eLx + gxy * eLy + eLx * div - eLx * uGradSp);
        driftY = aT * dspy + b * (gyx * eLx + gy * eLy + eLy * div - eLy * uGradSp);
      }
      // distance to the nearest capture circle limits the step near wells
      let captured = -1;
      const ax2 = ux + driftX;
      const ay2 = uy + driftY;
      const adv = ns > 0 ? Math.sqrt(ax2 * ax2 + ay2 * ay2) : 0; // the advective speed, drift included
      for (let w = 0; w < ns; w++) {
        const s = sinks[w];
        const ddx = x - s.x;
        const ddy = y - s.y;
        const d = Math.sqrt(ddx * ddx + ddy * ddy) - s.rc;
        // within 1.05·r_c counts as arrived: steps shrink with the distance, so the circle itself would never be reached
        if (d <= 0.05 * s.rc) {
          captured = w;
          break;
        }
        const e = eps * d;
        if (adv * dt > e) dt = e / adv;
        // the random move (standard deviation √(2·D_L·Δt)) at most half the distance: no tunnelling past the circle
        if (8 * DL * dt > d * d) dt = (d * d) / (8 * DL);
      }
      if (captured >= 0) {
        const m = m0 * Math.exp(-lam * (t - t0));
        tally.wellMass[captured * nt + k] += m;
        tally.wellMass2[captured * nt + k] += m * m;
        tally.captured += m;
        tally.decayed += m0 - m;
        fate = 1;
        break;
      }
      if (++steps > MAX_STEPS_PER_PARTICLE) {
        fate = 3;
        break;
      }
      const zL = rng.normal() * Math.sqrt(2 * DL * dt);
      const zT = rng.normal() * Math.sqrt(2 * DT * dt);
      let nx = x + (ux + driftX) * dt + eLx * zL - eLy * zT;
      let ny = y + (uy + driftY) * dt + eLy * zL + eLx * zT;
      t = dt === times[k] - t ? times[k] : t + dt;
      if (lines.length > 0 && !insideAquifer(f, nx, ny)) {
        let out = false;
        for (const l of lines) {
          const d = lineDistance(l, nx, ny);
          if (d >= 0) continue;
          if (l.kind === 'constant-head') out = true;
          else {
            nx -= 2 * d * l.nx;
            ny -= 2 * d * l.ny;
          }
        }
        if (out) {
          const m = m0 * Math.exp(-lam * (t - t0));
          tally.outflow += m;
          tally.decayed += m0 - m;
          fate = 2;
          break;
        }
      }
      x = nx;
      y = ny;
      moves++;
      while (k < nt && times[k] <= t) {
        // its mass at output time k: decayed from release to the first, then interval by interval
        const m = mRecorded < 0 ? m0 * Math.exp(-lam * (times[k] - t0)) : mRecorded * decayOver[k];
        mRecorded = m;
        tally.aquiferMass[k] += m;
        onPosition?.(j, k, x, y, m);
        for (let o = 0; o < no; o++) {
          const dx = x - obs[o].x;
          const dy = y - obs[o].y;
          if (dx * dx + dy * dy <= obsR2[o]) {
            tally.obsMass[o * nt + k] += m * obsArea[o];
            tally.obsMass2[o * nt + k] += m * m * obsArea[o] * obsArea[o];
          }
        }
        if (grid && (k + 1) % every === 0 && (k + 1) / every <= frames) {
          const ix = Math.floor((x - grid.x0) / grid.dx);
          const iy = Math.floor((y - grid.y0) / grid.dy);
          const frame = (k + 1) / every - 1;
          if (ix >= 0 && iy >= 0 && ix < grid.nx && iy < grid.ny) tally.gridMass[(frame * grid.ny + iy) * grid.nx + ix] += m;
        }
        k++;
      }
    }
    if (fate === 0) tally.decayed += m0 - m0 * Math.exp(-lam * (horizon - t0));
    else if (fate === 3) {
      tally.stalled++;
      tally.decayed += m0 - m0 * Math.exp(-lam * (horizon - t0)); // its mass stays in the aquifer
      for (let kk = k; kk < nt; kk++) tally.aquiferMass[kk] += m0 * Math.exp(-lam * (times[kk] - t0));
    }
  }
  tally.particlesDone += done;
  tally.steps += moves;
  return done;
}

export interface ParticleEstimate {
  /** mg/L per output time */
  readonly c: Float64Array;
  readonly se: Float64Array;
}

/** Concentrations at the observers (mg/L) from a tally: disk estimator (see header). */
export function observerConcentrations(p: PreparedWalk, t: WalkTally): ParticleEstimate[] {
  const nt = p.times.length;
  const f = p.input.field;
  // mass (mg·m³/L … see below) per volume: m in mg/L·m³ units (C₀·m³) → divide by nₑ·B·R per m²
  const scale = 1 / (f.porosity * f.thickness * p.input.R);
  return (p.input.observers ?? []).map((_, o) => {
    const c = new Float64Array(nt);
    const se = new Float64Array(nt);
    for (let k = 0; k < nt; k++) {
      c[k] = t.obsMass[o * nt + k] * scale;
      se[k] = Math.sqrt(t.obsMass2[o * nt + k]) * scale;
    }
    return { c, se };
  });
}

/**
 * Concentration in each extraction well's water (mg/L) per output interval (t_{k−1}, t_k]
 * (t₋₁ = 0): captured mass / (Q · interval length), with its standard error.
 */
export function wellConcentrations(p: PreparedWalk, t: WalkTally): (ParticleEstimate & { well: number })[] {
  const nt = p.times.length;
  const f = p.input.field;
  return p.sinks.map((s, w) => {
    const Q = f.wells[s.index].rate;
    const c = new Float64Array(nt);
    const se = new Float64Array(nt);
    for (let k = 0; k < nt; k++) {
      const len = p.times[k] - (k > 0 ? p.times[k - 1] : 0);
      c[k] = t.wellMass[w * nt + k] / (Q * len);
      se[k] = Math.sqrt(t.wellMass2[w * nt + k]) / (Q * len);
    }
    return { well: s.index, c, se };
  });
}

/**
 * Depth-averaged concentration (mg/L) on the grid at frame k (output time k when the grid is
 * recorded at every output time; output time (k+1)·every − 1 otherwise). Box estimator: the mass
 * in a cell over its pore volume, nₑ·B·R·dx·dy.
 */
export function gridConcentration(p: PreparedWalk, t: WalkTally, k: number): Float64Array {
  const g = p.input.grid;
  if (!g) throw new ValidationError('grid', g, 'a grid given to the walk');
  if (!(k >= 0 && k < gridFrames(p))) throw new ValidationError('frame', k, `a grid frame from 0 to ${gridFrames(p) - 1}`);
  const n = g.nx * g.ny;
  const out = new Float64Array(n);
  const scale = 1 / (g.dx * g.dy * p.input.field.porosity * p.input.field.thickness * p.input.R);
  for (let i = 0; i < n; i++) out[i] = t.gridMass[k * n + i] * scale;
  return out;
}
