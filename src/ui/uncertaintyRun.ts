/**
 * A Monte Carlo run in a pool of web workers (one per core, navigator.hardwareConcurrency), with
 * progress, time left, cancel and partial results. The run is planned on the main thread first
 * (so a bad distribution is refused at once, with its message), then ranges of realisations are
 * handed to whichever worker is free; every finished range updates the partial result. Cancel
 * terminates the workers and keeps what was done. The result records the case it was computed
 * for, so an edit marks it out of date instead of silently keeping it.
 */
import type { Case } from '../case/schema';
import { breakthroughBands, checkInputsAsShown, exceedanceMapOf, joinBlocks, monitoringWellBands, planUncertainty, summariseRun, type RealisationBlock, type UncertaintyPlan } from '../case/uncertainty';
import { caseKeyOf, uncertaintyRun, type RunState } from './uncertaintyState';

export { caseKeyOf, uncertaintyRun, type RunState };
import type { UncertaintyReply, UncertaintyRequest } from '../worker/uncertainty';

const RANGE = 200;
let active: { workers: Worker[]; cancel: () => void } | null = null;

export function cancelUncertainty(): void {
  active?.cancel();
}

export function startUncertainty(c: Case): void {
  cancelUncertainty();
  let plan: UncertaintyPlan;
  try {
    // a refusal in the units on screen (as the input's row words it), then the stored values' own check
    checkInputsAsShown(c);
    plan = planUncertainty(c, { curves: true, map: true, wells: true });
  } catch (e) {
    uncertaintyRun.value = { ...uncertaintyRun.peek(), status: 'failed', error: e instanceof Error ? e.message : String(e) };
    return;
  }
  const runs = plan.runs;
  // one core is left to the page and the deterministic view, which stay live while a run goes on
  const n = Math.max(1, Math.min(8, (navigator.hardwareConcurrency || 2) - 1, Math.ceil(runs / RANGE)));
  const caseKey = caseKeyOf(c);
  const startedAt = performance.now();
  const blocks: RealisationBlock[] = [];
  let next = 0;
  let done = 0;
  let finished = false;
  let summarisedAt = 0;
  let summaryMs = 0;
  let bandsAt = 0;
  let bandsMs = 0;
  const workers = Array.from({ length: n }, () => new Worker(new URL('../worker/uncertainty.ts', import.meta.url), { type: 'module', name: 'downgradient-monte-carlo' }));
  const stop = (status: RunState['status'], error: string | null = null) => {
    if (finished) return;
    finished = true;
    for (const w of workers) w.terminate();
    active = null;
    uncertaintyRun.value = { ...uncertaintyRun.peek(), status, error, secondsLeft: null };
  };
  active = {
    workers,
    cancel: () => {
      // keep what was done: the partial result over the finished ranges
      if (!finished && blocks.length) {
        const joined = joinBlocks(plan, blocks);
        uncertaintyRun.value = { ...uncertaintyRun.peek(), result: summariseRun(plan, joined), bands: breakthroughBands(plan, joined), wellBands: monitoringWellBands(plan, joined), map: exceedanceMapOf(plan, joined) };
      }
      stop('cancelled');
    },
  };
  uncertaintyRun.value = { status: 'running', result: null, caseKey, done: 0, runs, startedAt, secondsLeft: null, error: null, workers: n, bands: null, wellBands: null, map: null };
  const snapshot = structuredClone(c);
  const give = (w: Worker) => {
    if (next >= runs) return;
    const from = next;
    next = Math.min(runs, next + RANGE);
    w.postMessage({ type: 'range', from, to: next } satisfies UncertaintyRequest);
  };
  for (const w of workers) {
    w.onmessage = (e: MessageEvent<UncertaintyReply>) => {
      if (finished) return;
      const m = e.data;
      if (m.type === 'error') return stop('failed', m.message);
      if (m.type === 'planned') return give(w);
      blocks.push(m.block);
      done += m.block.to - m.block.from;
      const now = performance.now();
      const elapsed = (now - startedAt) / 1000;
      const last = done >= runs;
      // partial results at most twice a second, and the page spends at most a fifth of its time on them
      const due = last || now - summarisedAt > Math.max(500, 4 * summaryMs);
      // the bands sort every receptor's values at every time: refreshed at most once a second and
      // within a fifth of the page's time too, so a long run's bands grow as its figures do
      const bandsDue = last || (due && now - bandsAt > Math.max(1000, 4 * bandsMs));
      const prev = uncertaintyRun.peek();
      const joined = due ? joinBlocks(plan, blocks, { curves: bandsDue }) : null;
      const result = joined ? summariseRun(plan, joined) : prev.result;
      if (joined) {
        summarisedAt = performance.now();
        summaryMs = summarisedAt - now;
      }
      let bands = prev.bands;
      let wellBands = prev.wellBands;
      if (joined && bandsDue) {
        const t0 = performance.now();
        bands = breakthroughBands(plan, joined);
        wellBands = monitoringWellBands(plan, joined);
        bandsAt = performance.now();
        bandsMs = bandsAt - t0;
      }
      // the probability map grows with the realisations mapped (contouring its lattice is cheap)
      const map = joined ? exceedanceMapOf(plan, joined) : uncertaintyRun.peek().map;
      uncertaintyRun.value = { ...prev, result, bands, wellBands, map, done, secondsLeft: done > 0 ? (elapsed / done) * (runs - done) : null };
      if (last) stop('done');
      else give(w);
    };
    w.onerror = (e) => stop('failed', e.message || 'a worker failed');
    w.postMessage({ type: 'plan', case: snapshot, runs: plan.runs, seed: plan.seed, curves: true, map: true, wells: true } satisfies UncertaintyRequest);
  }
}
