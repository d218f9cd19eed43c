/**
 * A particle run in a pool of web workers (one per core, at most 4), with progress, time left,
 * cancel and a picture that refines as it goes. The walk is planned on the main thread first (so
 * bad input is refused at once with its message). The particles are split into `stride`
 * interleaved subsets (offset, offset + stride, …), each spanning the whole release period, handed
 * to whichever worker is free; after each subset the figures and the density layer are those of
 * the particles walked so far, scaled to the whole run (core scaledTally), with standard errors to
 * match. Cancel terminates the workers and keeps that partial result, said to be partial. Results
 * record the case they belong to (particleCaseKey), so an edit marks them out of date.
 * The map and the analytical results stay live meanwhile: the walk runs in its own workers.
 */
import { effect } from '@preact/signals';
import type { Case } from '../case/schema';
import { prepareCase } from '../case/prepare';
import { prepareCaseWells } from '../case/wells';
import { caseWalk, particleDensity, particleFigures, particleGrid, subsetStride } from '../case/particles';
import { emptyTally, mergeTally, scaledTally, toInternal, type PreparedWalk, type WalkTally } from '../core';
import { contourBands, packContours } from '../geo/contours';
import { bandThresholds } from '../worker/compute';
import type { ParticleReply, ParticleRequest } from '../worker/particles';
import { IDLE_PARTICLES, particleCaseKey, particleLayer, particleRun, type ParticleRunState } from './particleState';
import { currentCase } from './state';
import { playTime } from './view';

let active: { cancel: () => void } | null = null;
/** the latest run's walk and tally (for the density layer at another time) */
let last: { walk: PreparedWalk; tally: WalkTally; toMap: (x: number, y: number) => [number, number]; caseKey: string; limit: number; c0: number } | null = null;

export function cancelParticles(): void {
  active?.cancel();
}

export function startParticles(c: Case, particles: number, seed: number): void {
  cancelParticles();
  let plan: ReturnType<typeof caseWalk>;
  let p: ReturnType<typeof prepareCase>;
  try {
    p = prepareCase(c);
    plan = caseWalk(c, p, prepareCaseWells(c, p), { particles, seed, grid: particleGrid(p) });
  } catch (e) {
    particleRun.value = { ...IDLE_PARTICLES, status: 'failed', error: e instanceof Error ? e.message : String(e) };
    return;
  }
  const { walk, pumpingReceptors } = plan;
  const N = walk.input.particles;
  const stride = subsetStride(N);
  const n = Math.max(1, Math.min(4, navigator.hardwareConcurrency || 2, stride));
  const caseKey = particleCaseKey(c);
  const startedAt = performance.now();
  const total = emptyTally(walk);
  let next = 0;
  let subsetsDone = 0;
  let finished = false;
  let shownAt = 0;
  const prepared = p;
  last = { walk, tally: total, toMap: (x, y) => prepared.toMap(x, y) as [number, number], caseKey, limit: p.limit, c0: p.model.c0 };
  const workers = Array.from({ length: n }, () => new Worker(new URL('../worker/particles.ts', import.meta.url), { type: 'module', name: 'downgradient-particles' }));
  const publish = (extra: Partial<ParticleRunState>) => {
    const done = total.particlesDone;
    const scaled = done > 0 ? scaledTally(total, N / done) : null;
    const figures = scaled ? particleFigures(prepared, walk, scaled, pumpingReceptors, c) : null;
    particleRun.value = {
      ...particleRun.peek(),
      done,
      receptors: figures ? figures.map((f, i) => ({ ...f, id: prepared.receptors[i].id, name: prepared.receptors[i].name || prepared.receptors[i].id })) : null,
      mass: scaled
        ? { released: scaled.released, captured: scaled.captured, outflow: scaled.outflow, decayed: scaled.decayed, inAquifer: scaled.aquiferMass[scaled.aquiferMass.length - 1] }
        : null,
      warnings: [...plan.warnings.map((w) => w.message), ...(total.stalled > 0 ? [`${total.stalled} particle(s) reached the step limit and were left where they were.`] : [])],
      ...extra,
    };
    drawLayer();
  };
  const stop = (status: ParticleRunState['status'], error: string | null = null) => {
    if (finished) return;
    finished = true;
    for (const w of workers) w.terminate();
    active = null;
    if (status === 'failed') particleRun.value = { ...particleRun.peek(), status, error, secondsLeft: null };
    else publish({ status, error, secondsLeft: null });
  };
  active = { cancel: () => stop('cancelled') };
  particleRun.value = { ...IDLE_PARTICLES, status: 'running', caseKey, particles: N, seed: walk.input.seed, workers: n };
  particleLayer.value = null;
  const snapshot = structuredClone(c);
  const give = (w: Worker) => {
    if (next >= stride) return;
    w.postMessage({ type: 'subset', offset: next++, stride } satisfies ParticleRequest);
  };
  for (const w of workers) {
    w.onmessage = (e: MessageEvent<ParticleReply>) => {
      if (finished) return;
      const m = e.data;
      if (m.type === 'error') return stop('failed', m.message);
      if (m.type === 'planned') return give(w);
      mergeTally(total, m.tally);
      subsetsDone++;
      const now = performance.now();
      const elapsed = (now - startedAt) / 1000;
      const done = total.particlesDone;
      if (subsetsDone >= stride) return stop('done');
      give(w);
      // a new picture at most four times a second (figures and contours of the particles so far)
      if (now - shownAt > 250) {
        shownAt = now;
        publish({ secondsLeft: (elapsed / done) * (N - done) });
      } else particleRun.value = { ...particleRun.peek(), done: total.particlesDone, secondsLeft: (elapsed / done) * (N - done) };
    };
    w.onerror = (e) => stop('failed', e.message || 'a worker failed');
    w.postMessage({ type: 'plan', case: snapshot, particles: N, seed: walk.input.seed } satisfies ParticleRequest);
  }
}

/** The density layer of the latest run at the time shown (the slider while it moves, else the view time). */
function drawLayer(): void {
  const r = last;
  if (!r || r.tally.particlesDone === 0) {
    particleLayer.value = null;
    return;
  }
  const c = currentCase.peek();
  const horizon = r.walk.times[r.walk.times.length - 1];
  const vt = c.evaluation.viewTime;
  const t = playTime.peek() ?? (vt === null ? horizon : Math.min(horizon, toInternal(vt.value, vt.unit)));
  const scaled = scaledTally(r.tally, r.walk.input.particles / r.tally.particlesDone);
  const d = particleDensity(r.walk, scaled, t);
  const thresholds = bandThresholds(r.limit, r.c0);
  const bands = contourBands({ values: d.values, xs: d.xs, ys: d.ys, thresholds });
  particleLayer.value = { caseKey: r.caseKey, time: d.time, thresholds, bands: packContours(bands, r.toMap), particlesDone: r.tally.particlesDone };
}

// the layer follows the time shown
effect(() => {
  void playTime.value;
  void currentCase.value.evaluation.viewTime;
  if (last) drawLayer();
});
