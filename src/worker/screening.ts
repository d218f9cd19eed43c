/**
 * Worker entry (Comlink): screening and plume contours off the main thread, so typing and
 * dragging never wait for the engine. The screen runs two of these, one for the plume and one
 * for the receptor results, so a slow exact-solution evaluation never holds up the contours.
 * The case is prepared here, once per request (the page prepares it too, only for the inline
 * field message). The lattice is kept per case edit and time-independent, so moving the time
 * slider recomputes only the values on it. The contours go back as typed arrays in the transfer
 * list (moved, not copied).
 */
import { expose, transfer } from 'comlink';
import type { Case } from '../case/schema';
import { prepareCase } from '../case/prepare';
import { evaluateCase, plumeForCase, latticeFor, epochNow, type Lattice } from './compute';
import { packedTransferables } from '../geo/contours';
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
    const startedAt = epochNow();
    const t0 = performance.now();
    const p = prepareCase(c);
    const key = latticeKey(c, gridSize);
    if (!cached || cached.key !== key) cached = { key, lattice: latticeFor(p, gridSize) };
    const before = performance.now() - t0;
    const layer = plumeForCase(c, time, gridSize, cached.lattice, p);
    // the job's timing includes the preparation and lattice done here
    layer.timing = { ...layer.timing, prepareMs: layer.timing.prepareMs + before, totalMs: layer.timing.totalMs + before, startedAt };
    return transfer(layer, packedTransferables(layer.bands));
  },
};

export type ScreeningApi = typeof api;
expose(api);
