/**
 * Worker entry (Comlink): screening and plume contours off the main thread, so typing and
 * dragging never wait for the engine. The screen runs two of these, one for the plume and one
 * for the receptor results, so a slow exact-solution evaluation never holds up the contours.
 * The lattice is kept per case edit and time-independent, so moving the time slider recomputes
 * only the values on it.
 */
import { expose } from 'comlink';
import type { Case } from '../case/schema';
import { prepareCase } from '../case/prepare';
import { evaluateCase, plumeForCase, latticeFor, type Lattice } from './compute';
import type { Evaluation, PlumeLayer } from './protocol';

let cached: { key: string; lattice: Lattice } | null = null;

/** Everything but the view time decides the lattice. */
function latticeKey(c: Case, gridSize: number): string {
  return JSON.stringify([c.id, c.site, c.aquifer, c.contaminant, c.source, c.evaluation.solution, c.evaluation.horizon, c.evaluation.depth, c.evaluation.viewTime === null, gridSize]);
}

const api = {
  evaluate(c: Case): Evaluation {
    return evaluateCase(c);
  },
  plume(c: Case, time: number | null, gridSize: number): PlumeLayer {
    const key = latticeKey(c, gridSize);
    if (!cached || cached.key !== key) cached = { key, lattice: latticeFor(prepareCase(c), gridSize) };
    return plumeForCase(c, time, gridSize, cached.lattice);
  },
};

export type ScreeningApi = typeof api;
expose(api);
