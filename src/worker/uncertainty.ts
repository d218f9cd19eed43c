/**
 * Worker entry for Monte Carlo screening: plans the case's run once, then screens each range of
 * realisations it is sent and posts the block back (typed arrays moved, not copied). The pool in
 * src/ui/uncertaintyRun.ts hands out ranges, so any worker may compute any realisation: realisation
 * i depends only on (seed, runs, i), and the results are the same however the work is split.
 */
import type { Case } from '../case/schema';
import { designOf, planUncertainty, runRealisations, type RealisationBlock, type UncertaintyPlan } from '../case/uncertainty';
import type { LatinHypercube } from '../core/uncertainty';

export type UncertaintyRequest = { type: 'plan'; case: Case; runs: number; seed: number; curves: boolean; map: boolean; wells: boolean } | { type: 'range'; from: number; to: number };
export type UncertaintyReply = { type: 'planned' } | { type: 'block'; block: RealisationBlock } | { type: 'error'; message: string };

let plan: UncertaintyPlan | null = null;
let lhs: LatinHypercube | null = null;

self.onmessage = (e: MessageEvent<UncertaintyRequest>) => {
  const msg = e.data;
  try {
    if (msg.type === 'plan') {
      plan = planUncertainty(msg.case, { runs: msg.runs, seed: msg.seed, curves: msg.curves, map: msg.map, wells: msg.wells });
      lhs = designOf(plan);
      post({ type: 'planned' });
      return;
    }
    const block = runRealisations(plan!, msg.from, msg.to, lhs!);
    const moved = [block.arrival.buffer, block.atHorizon.buffer, block.peak.buffer, ...(block.curves ? [block.curves.buffer] : []), ...(block.mapCounts ? [block.mapCounts.buffer] : []), ...(block.wellCurves ? [block.wellCurves.buffer] : [])] as ArrayBuffer[];
    post({ type: 'block', block }, moved);
  } catch (err) {
    post({ type: 'error', message: err instanceof Error ? err.message : String(err) });
  }
};

function post(m: UncertaintyReply, transfer: Transferable[] = []): void {
  (self as unknown as { postMessage(m: unknown, t: Transferable[]): void }).postMessage(m, transfer);
}
