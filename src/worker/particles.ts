/**
 * Worker entry for the random walk: plans the case's walk once (src/case/particles.ts caseWalk,
 * with the density grid), then walks each interleaved subset it is sent (particles offset,
 * offset + stride, …; src/core/particles/walk.ts) and posts its tally back (typed arrays moved,
 * not copied). The pool in src/ui/particleRun.ts hands out the subsets; particle j draws from its
 * own stream, so the result is the same however the work is split.
 */
import type { Case } from '../case/schema';
import { prepareCase } from '../case/prepare';
import { prepareCaseWells } from '../case/wells';
import { caseWalk, particleGrid } from '../case/particles';
import { emptyTally, walkParticles, type PreparedWalk, type WalkTally } from '../core';

export type ParticleRequest = { type: 'plan'; case: Case; particles: number; seed: number } | { type: 'subset'; offset: number; stride: number };
export type ParticleReply = { type: 'planned' } | { type: 'tally'; offset: number; tally: WalkTally } | { type: 'error'; message: string };

let walk: PreparedWalk | null = null;

self.onmessage = (e: MessageEvent<ParticleRequest>) => {
  const msg = e.data;
  try {
    if (msg.type === 'plan') {
      const p = prepareCase(msg.case);
      walk = caseWalk(msg.case, p, prepareCaseWells(msg.case, p), { particles: msg.particles, seed: msg.seed, grid: particleGrid(p) }).walk;
      post({ type: 'planned' });
      return;
    }
    const tally = emptyTally(walk!);
    walkParticles(walk!, msg.offset, walk!.input.particles, tally, undefined, msg.stride);
    const arrays = [tally.obsMass, tally.obsMass2, tally.wellMass, tally.wellMass2, tally.gridMass, tally.aquiferMass];
    post({ type: 'tally', offset: msg.offset, tally }, arrays.map((a) => a.buffer as ArrayBuffer));
  } catch (err) {
    post({ type: 'error', message: err instanceof Error ? err.message : String(err) });
  }
};

function post(m: ParticleReply, transfer: Transferable[] = []): void {
  (self as unknown as { postMessage(m: unknown, t: Transferable[]): void }).postMessage(m, transfer);
}
