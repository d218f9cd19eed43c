/**
 * A particle worker for `npm run bench` (worker_threads; the app's web worker, src/worker/particles.ts,
 * does the same over the same code): plans a case's walk once, as the app does (with the density
 * grid), then walks each interleaved subset it is sent and returns its tally.
 */
import { parentPort } from 'node:worker_threads';
import { parseCaseFile } from '../src/case/io';
import { prepareCase } from '../src/case/prepare';
import { prepareCaseWells } from '../src/case/wells';
import { caseWalk, particleGrid } from '../src/case/particles';
import { emptyTally, walkParticles, type PreparedWalk } from '../src/core';

let walk: PreparedWalk | null = null;

parentPort!.on('message', (msg: { type: 'plan'; text: string; particles: number; seed: number } | { type: 'subset'; offset: number; stride: number }) => {
  if (msg.type === 'plan') {
    const parsed = parseCaseFile(msg.text);
    if (!parsed.ok) throw new Error(parsed.errors.join('; '));
    const p = prepareCase(parsed.case);
    walk = caseWalk(parsed.case, p, prepareCaseWells(parsed.case, p), { particles: msg.particles, seed: msg.seed, grid: particleGrid(p) }).walk;
    walkParticles(walk, 0, Math.min(200, msg.particles), emptyTally(walk)); // warm-up (JIT), untimed
    parentPort!.postMessage({ type: 'planned' });
    return;
  }
  const tally = emptyTally(walk!);
  walkParticles(walk!, msg.offset, walk!.input.particles, tally, undefined, msg.stride);
  parentPort!.postMessage({ type: 'tally', tally });
});
