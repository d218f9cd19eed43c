/**
 * The particle view of a case: the random walk (src/core/particles/walk.ts) in the case's well
 * field, or in uniform flow when there are no wells, with the case's transport parameters.
 * Two-dimensional: the solute is mixed over the saturated thickness (or over the source thickness
 * when the saturated thickness is not given, said in a warning), so a receptor's figure is a
 * depth average, not the concentration at its screen depth.
 *
 * Per receptor, at 100 evenly spaced output times to the horizon:
 * - a pumping well modelled in the field: the concentration of the water it delivers, captured
 *   mass per interval / (Q · interval), with its standard error;
 * - any other receptor: the disk estimator of radius h = max(0.5 m, min(0.3·σ, 0.1·distance)),
 *   σ = √(2·αT·x + W²/12) the plume's lateral spread there (so the smoothing bias (h²/8)·∇²C stays
 *   a few per cent), with its standard error.
 * The arrival is the first output time whose estimate reaches the limit (the statistical noise can
 * make it early or late by the spread of the estimate near the limit).
 */
import type { Case } from './schema';
import type { PreparedCase } from './prepare';
import {
  ValidationError,
  checkSeed,
  gridConcentration,
  gridFrames,
  plumeLength,
  type WalkGrid,
  emptyTally,
  observerConcentrations,
  prepareFlow,
  prepareWalk,
  walkParticles,
  wellConcentrations,
  type PreparedWalk,
  type WalkTally,
  type Warning,
} from '../core';
import type { CaseWells } from './wells';
import { resultText } from './unitSystem';

export const OUTPUT_TIMES = 100;
export const DEFAULT_PARTICLES = 20_000;
/** particles per interleaved subset handed to a worker (about 30–50 ms of work on the demo cases) */
export const PARTICLE_SUBSET = 2000;

/**
 * The number of interleaved subsets a run of N particles is split into (subset `offset` walks
 * particles offset, offset + stride, …; walk.ts walkParticles): each spans the whole release
 * period, so the particles walked after any number of subsets give an unbiased picture of the
 * run (core scaledTally).
 */
export function subsetStride(particles: number): number {
  return Math.max(1, Math.ceil(particles / PARTICLE_SUBSET));
}

export interface ParticleFigures {
  readonly method: 'particles';
  /** mg/L at the horizon (depth-averaged; for a pumping well, its water over the last output interval) */
  readonly concentrationAtHorizon: number;
  readonly standardError: number;
  /** first output time (d) at which the estimate reaches the limit, or null */
  readonly arrival: number | null;
  /** how the figure was estimated, in words */
  readonly estimator: string;
  /** a pumping well's water (c[k] the mean over the output interval (t_{k−1}, t_k]), not a point estimate at t_k */
  readonly pumped: boolean;
  /** the whole curve: output times (d), estimates and standard errors (mg/L) */
  readonly times: number[];
  readonly c: number[];
  readonly se: number[];
}

export interface CaseParticles {
  readonly particles: number;
  readonly seed: number;
  readonly receptors: ParticleFigures[];
  readonly mass: { released: number; captured: number; outflow: number; decayed: number; inAquifer: number; stalled: number };
  readonly steps: number;
  readonly warnings: Warning[];
}

export interface ParticleRunOptions {
  particles?: number;
  seed?: number;
  /** grid for a density layer (flow frame), optional */
  grid?: { x0: number; y0: number; dx: number; dy: number; nx: number; ny: number };
}

/** The walk for a case (validated), ready to run over particle ranges (workers) or at once. */
export function caseWalk(c: Case, p: PreparedCase, w: CaseWells, opts: ParticleRunOptions = {}): { walk: PreparedWalk; warnings: Warning[]; pumpingReceptors: Map<number, number> } {
  const particles = opts.particles ?? DEFAULT_PARTICLES;
  if (!Number.isInteger(particles) || particles < 100 || particles > 5_000_000) throw new ValidationError('particles', particles, 'a whole number from 100 to 5 000 000');
  const seed = checkSeed(opts.seed ?? c.uncertainty?.seed ?? 1);
  const m = p.model;
  const warnings: Warning[] = [];
  let field = w.field;
  if (!field) {
    const B = w.thickness ?? m.thickness;
    if (w.thickness === null)
      warnings.push({
        code: 'particles-source-thickness',
        message: `The saturated thickness is not given, so the particles mix the solute over the source thickness (${resultText(c, m.thickness, 'length', 'length', 3)}); give the saturated thickness for a depth average over the aquifer.`,
        field: 'aquifer.saturatedThickness',
      });
    field = prepareFlow({ darcyFlux: p.derived.K * p.derived.gradient, porosity: p.inputs.effectivePorosity, thickness: B, wells: [] });
  }
  const horizon = p.horizon;
  const times = Array.from({ length: OUTPUT_TIMES }, (_, k) => ((k + 1) / OUTPUT_TIMES) * horizon);
  times[OUTPUT_TIMES - 1] = horizon;
  const pumpingReceptors = new Map<number, number>(); // receptor index → sink index
  w.receptorOf.forEach((ri, j) => {
    if (w.field && w.field.wells[j].rate > 0) pumpingReceptors.set(ri, pumpingReceptors.size);
  });
  const observers = p.receptors.map((r) => {
    const sigma = Math.sqrt(2 * m.ay * Math.max(r.x, 0) + (m.width * m.width) / 12);
    return { x: r.x, y: r.y, radius: Math.max(0.5, Math.min(0.3 * sigma, 0.1 * Math.max(r.distance, 5))) };
  });
  const walk = prepareWalk({
    field,
    source: { width: m.width, thickness: Math.min(m.thickness, field.thickness), c0: m.c0, sourceDecay: m.sourceDecay, duration: m.duration },
    ax: m.ax,
    ay: m.ay,
    diffusion: m.diffusion,
    R: m.R,
    decay: m.decay,
    decayDissolvedOnly: m.decayPhase === 'dissolved-only',
    times,
    particles,
    seed,
    observers,
    grid: opts.grid,
  });
  return { walk, warnings, pumpingReceptors };
}

/** Figures per receptor from a finished (or merged) tally. */
/** `units`: the case's system for the lengths in the estimator's words (m, or ft). */
export function particleFigures(p: PreparedCase, walk: PreparedWalk, tally: WalkTally, pumpingReceptors: Map<number, number>, units: Pick<Case, 'units'> = {}): ParticleFigures[] {
  const obs = observerConcentrations(walk, tally);
  const wells = wellConcentrations(walk, tally);
  const times = Array.from(walk.times);
  const nt = times.length;
  return p.receptors.map((r, i) => {
    const sink = pumpingReceptors.get(i);
    const est = sink !== undefined ? wells[sink] : obs[i];
    const c = Array.from(est.c);
    const se = Array.from(est.se);
    const k = c.findIndex((v) => v >= p.limit);
    const h = walk.input.observers?.[i].radius ?? 0;
    return {
      method: 'particles',
      concentrationAtHorizon: c[nt - 1],
      standardError: se[nt - 1],
      arrival: k >= 0 ? times[k] : null,
      estimator:
        sink !== undefined
          ? `water pumped: captured particle mass per interval / pumping rate (intervals of ${Number((times[0]).toPrecision(3))} d)`
          : `depth-averaged, particle mass within ${resultText(units, h, 'length', 'length', 2)} of the receptor (disk estimator)`,
      pumped: sink !== undefined,
      times,
      c,
      se,
    };
  });
}

/** Runs the whole walk in this thread (command line, tests). */
export function runCaseParticles(c: Case, p: PreparedCase, w: CaseWells, opts: ParticleRunOptions = {}): CaseParticles {
  const { walk, warnings, pumpingReceptors } = caseWalk(c, p, w, opts);
  const tally = emptyTally(walk);
  walkParticles(walk, 0, walk.input.particles, tally);
  if (tally.stalled > 0)
    warnings.push({ code: 'particles-stalled', message: `${tally.stalled} particle(s) reached the step limit and were left where they were.` });
  return {
    particles: walk.input.particles,
    seed: walk.input.seed,
    receptors: particleFigures(p, walk, tally, pumpingReceptors, c),
    mass: {
      released: tally.released,
      captured: tally.captured,
      outflow: tally.outflow,
      decayed: tally.decayed,
      inAquifer: tally.aquiferMass[tally.aquiferMass.length - 1],
      stalled: tally.stalled,
    },
    steps: tally.steps,
    warnings,
  };
}

/** The density layer keeps the grid at every GRID_EVERY-th output time (20 frames over the horizon). */
export const GRID_EVERY = 5;

/**
 * The flow-frame grid of the particle density layer: from 20 % of its length upgradient of the
 * source (dispersion and a pumping well upgradient draw solute back) to past the analytical
 * plume's reach at the horizon and the farthest receptor; across, the source width plus four
 * transverse spreading lengths and every receptor. size × size cells.
 */
export function particleGrid(p: PreparedCase, size = 64): WalkGrid {
  const m = p.model;
  const reach = plumeLength(m, p.limit, 0, p.horizon) ?? 0;
  const far = Math.max(0, ...p.receptors.map((r) => r.x));
  const X = Math.max(1.2 * reach, 1.15 * far, 4 * m.width, 20);
  const x0 = -0.2 * X;
  const Y = Math.max(m.width / 2 + 8 * Math.sqrt(m.ay * X), 1.15 * Math.max(0, ...p.receptors.map((r) => Math.abs(r.y))), m.width);
  return { x0, y0: -Y, dx: (X - x0) / size, dy: (2 * Y) / size, nx: size, ny: size, every: GRID_EVERY };
}

/**
 * The density layer at the grid frame nearest time t (d): depth-averaged concentration (mg/L) on
 * the cell centres, laid out as the map lattice (values[i·ny + j] at (xs[i], ys[j])), and the
 * frame's time.
 */
export function particleDensity(walk: PreparedWalk, tally: WalkTally, t: number): { xs: Float64Array; ys: Float64Array; values: Float64Array; time: number } {
  const g = walk.input.grid;
  if (!g) throw new ValidationError('grid', g, 'a grid given to the walk');
  const every = g.every ?? 1;
  const frames = gridFrames(walk);
  let k = 0;
  for (let f = 0; f < frames; f++) if (Math.abs(walk.times[(f + 1) * every - 1] - t) < Math.abs(walk.times[(k + 1) * every - 1] - t)) k = f;
  const c = gridConcentration(walk, tally, k);
  const xs = Float64Array.from({ length: g.nx }, (_, i) => g.x0 + (i + 0.5) * g.dx);
  const ys = Float64Array.from({ length: g.ny }, (_, j) => g.y0 + (j + 0.5) * g.dy);
  const values = new Float64Array(g.nx * g.ny);
  for (let i = 0; i < g.nx; i++) for (let j = 0; j < g.ny; j++) values[i * g.ny + j] = c[j * g.nx + i];
  return { xs, ys, values, time: walk.times[(k + 1) * every - 1] };
}
