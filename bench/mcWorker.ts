/**
 * A Monte Carlo worker for `npm run bench` (worker_threads; the app uses web workers over the same
 * code): plans a case's run once, then screens the realisation ranges it is sent.
 */
import { parentPort } from 'node:worker_threads';
import { parseCaseFile } from '../src/case/io';
import { designOf, planUncertainty, runRealisations, type UncertaintyPlan } from '../src/case/uncertainty';
import type { LatinHypercube } from '../src/core/uncertainty';

let plan: UncertaintyPlan | null = null;
let lhs: LatinHypercube | null = null;

parentPort!.on('message', (msg: { type: 'init'; text: string; runs: number; seed: number } | { type: 'run'; from: number; to: number }) => {
  if (msg.type === 'init') {
    const parsed = parseCaseFile(msg.text);
    if (!parsed.ok) throw new Error(parsed.errors.join('; '));
    plan = planUncertainty(parsed.case, { runs: msg.runs, seed: msg.seed });
    lhs = designOf(plan);
    runRealisations(plan, 0, Math.min(50, msg.runs), lhs); // warm-up (JIT), untimed
    parentPort!.postMessage({ type: 'ready' });
    return;
  }
  const t0 = performance.now();
  const b = runRealisations(plan!, msg.from, msg.to, lhs!);
  const seconds = (performance.now() - t0) / 1000;
  parentPort!.postMessage({ type: 'done', seconds, block: b }, [b.arrival.buffer as ArrayBuffer, b.atHorizon.buffer as ArrayBuffer, b.peak.buffer as ArrayBuffer]);
});
