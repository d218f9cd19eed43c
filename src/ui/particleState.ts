/**
 * What the map and the report read of a particle run (the run itself, src/ui/particleRun.ts, is
 * loaded with the wells panel): its state and figures, and the density layer at the time shown.
 * Screen-only: a run is never saved with the case; its seed and particle count are printed with
 * every figure, so the run can be repeated (npm run screen -- case.json --method particles …).
 */
import { signal } from '@preact/signals';
import type { PackedBands } from '../geo/contours';
import type { ParticleFigures } from '../case/particles';

export interface ParticleRunState {
  readonly status: 'idle' | 'running' | 'done' | 'cancelled' | 'failed';
  /** the case text the figures belong to (out of date when the case differs; caseKeyOf) */
  readonly caseKey: string | null;
  readonly particles: number;
  readonly seed: number;
  /** particles walked so far */
  readonly done: number;
  /** seconds left, from the pace so far (null: not known yet) */
  readonly secondsLeft: number | null;
  readonly workers: number;
  readonly error: string | null;
  /** per receptor (the case's order, with its id), scaled from the particles walked to the whole run */
  readonly receptors: (ParticleFigures & { id: string; name: string })[] | null;
  /** mass balance of the particles walked, scaled to the whole run (mg/L·m³ = g) */
  readonly mass: { released: number; captured: number; outflow: number; decayed: number; inAquifer: number } | null;
  readonly warnings: string[];
}

export const IDLE_PARTICLES: ParticleRunState = {
  status: 'idle',
  caseKey: null,
  particles: 0,
  seed: 0,
  done: 0,
  secondsLeft: null,
  workers: 0,
  error: null,
  receptors: null,
  mass: null,
  warnings: [],
};

export const particleRun = signal<ParticleRunState>(IDLE_PARTICLES);

/** The particle plume on the map: bands C ≥ limit, 10×, … at the grid frame nearest the time shown. */
export interface ParticleLayer {
  readonly caseKey: string;
  readonly time: number;
  readonly thresholds: number[];
  readonly bands: PackedBands;
  readonly particlesDone: number;
}
export const particleLayer = signal<ParticleLayer | null>(null);
/** whether the particle plume is drawn on the map */
export const showParticleLayer = signal(true);

/**
 * The particle run of this very case (its figures, partial while it runs or when cancelled), or
 * null when there is none or the case changed since; `complete` asks for a finished run only.
 */
export function particleRunFor(c: import('../case/schema').Case, complete = false): ParticleRunState | null {
  const run = particleRun.value;
  if (!run.receptors || run.caseKey !== particleCaseKey(c)) return null;
  return complete && run.status !== 'done' ? null : run;
}

/** A receptor's particle curve for the breakthrough chart (charts/Charts.tsx ParticleCurve), from the run of this case. */
export function particleCurveFor(c: import('../case/schema').Case, receptorId: string, complete = false) {
  const run = particleRunFor(c, complete);
  const f = run?.receptors?.find((x) => x.id === receptorId);
  return run && f ? { times: f.times, c: f.c, se: f.se, pumped: f.pumped, label: particleRunLabel(run) } : null;
}

/** The run in words for a chart's key: count (done of total while partial), seed, state. */
export function particleRunLabel(run: ParticleRunState): string {
  const count = run.done < run.particles ? `${run.done.toLocaleString('en')} of ${run.particles.toLocaleString('en')}` : run.particles.toLocaleString('en');
  const state = run.status === 'running' ? ', refining' : run.status === 'done' ? '' : ', partial';
  return `particles (${count}, seed ${run.seed}${state})`;
}

/** What particle figures depend on: the case without its name, notes, stamps, view time and map depth. */
export function particleCaseKey(c: import('../case/schema').Case): string {
  const { viewTime: _v, depth: _d, ...evaluation } = c.evaluation;
  return JSON.stringify([c.site, c.aquifer, c.contaminant, c.source, evaluation]);
}
