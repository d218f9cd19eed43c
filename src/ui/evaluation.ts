/**
 * The evaluation loop: every change of the case (or of the time shown) is checked on the main
 * thread (case preparation is cheap and gives the field-named message for the inline error), then
 * sent to two workers — one draws the plume, one screens the receptors. Each worker has at most
 * one job in flight; a newer request replaces any waiting one, so fast typing or dragging never
 * piles up work and the screen always converges on the latest inputs.
 */
import { effect, signal } from '@preact/signals';
import { wrap, type Remote } from 'comlink';
import type { Case } from '../case/schema';
import { prepareCase, type PreparedCase } from '../case/prepare';
import { ValidationError } from '../core';
import type { ScreeningApi } from '../worker/screening';
import type { Evaluation, PlumeLayer } from './results';
import { currentCase, publishResults } from './state';
import { playTime } from './view';
import { settings } from './settings';
import { inputIssue } from './validity';

/** 'busy' while a worker job for the current inputs is running */
export const evaluationState = signal<'idle' | 'busy' | 'error'>('idle');
export const evaluationError = signal<string | null>(null);

/** One worker, one job in flight, the newest waiting request wins. */
class LatestOnly<A extends unknown[], R> {
  private running = false;
  private next: A | null = null;
  constructor(private run: (...a: A) => Promise<R>, private done: (r: R, a: A) => void, private fail: (e: unknown) => void) {}
  request(...a: A): void {
    this.next = a;
    if (!this.running) void this.pump();
  }
  get busy(): boolean {
    return this.running;
  }
  private async pump(): Promise<void> {
    while (this.next) {
      const a = this.next;
      this.next = null;
      this.running = true;
      try {
        const r = await this.run(...a);
        // a newer request is waiting: these results are already out of date, skip publishing
        if (!this.next) this.done(r, a);
      } catch (e) {
        this.fail(e);
      } finally {
        this.running = false;
      }
    }
  }
}

export interface LatencySample {
  /** performance.now() when the input changed */
  inputAt: number;
  /** performance.now() after the contours were drawn (next animation frame) */
  drawnAt: number;
  gridSize: number;
  solution: string;
  timing: PlumeLayer['timing'];
}

/** Input-to-contours latencies, newest last (read by the latency benchmark). */
export const latencySamples: LatencySample[] = [];

let latestPlume: PlumeLayer | null = null;
let latestEval: Evaluation | null = null;
const pendingInputs = new Map<string, number>();

/** The current case prepared for the engine (null while an input is invalid): map geometry. */
export const preparedCase = signal<PreparedCase | null>(null);

/** The contours on the map (they can arrive before the receptor results). */
export const currentPlume = signal<PlumeLayer | null>(null);

function publish(): void {
  currentPlume.value = latestPlume;
  if (latestEval) publishResults({ ...latestEval, plume: latestPlume });
}

function describe(e: unknown): string {
  return e instanceof Error ? e.message : String(e);
}

/** Start the loop; returns a function that stops it and releases the workers. */
export function startEvaluation(): () => void {
  const mk = () => new Worker(new URL('../worker/screening.ts', import.meta.url), { type: 'module', name: 'downgradient-screening' });
  const plumeWorker = mk();
  const resultWorker = mk();
  const plumeApi: Remote<ScreeningApi> = wrap<ScreeningApi>(plumeWorker);
  const resultApi: Remote<ScreeningApi> = wrap<ScreeningApi>(resultWorker);
  const onFail = (e: unknown) => {
    evaluationState.value = 'error';
    evaluationError.value = `The engine could not finish: ${describe(e)}`;
  };

  const plumes = new LatestOnly(
    (c: Case, time: number | null, grid: number) => plumeApi.plume(c, time, grid),
    (p) => {
      latestPlume = p;
      const inputAt = pendingInputs.get(p.caseStamp + '|' + p.time);
      if (inputAt !== undefined) pendingInputs.delete(p.caseStamp + '|' + p.time);
      publish();
      if (inputAt !== undefined)
        afterPaint(() =>
          latencySamples.push({ inputAt, drawnAt: performance.now(), gridSize: p.gridSize, solution: p.solution, timing: p.timing }),
        );
      settle();
    },
    onFail,
  );
  const evals = new LatestOnly(
    (c: Case) => resultApi.evaluate(c),
    (e) => {
      latestEval = e;
      publish();
      settle();
    },
    onFail,
  );
  function settle() {
    if (!plumes.busy && !evals.busy) {
      if (evaluationState.peek() !== 'error') evaluationState.value = 'idle';
    }
  }

  let lastEvalStamp = '';
  const stop = effect(() => {
    const c = currentCase.value;
    const grid = settings.value.gridSize;
    const play = playTime.value;
    let viewTime: number;
    try {
      const prepared = prepareCase(c);
      viewTime = prepared.viewTime;
      preparedCase.value = prepared;
      inputIssue.value = null;
    } catch (e) {
      if (e instanceof ValidationError) inputIssue.value = { field: e.field, message: e.message };
      else inputIssue.value = { field: '', message: describe(e) };
      preparedCase.value = null;
      return;
    }
    evaluationError.value = null;
    evaluationState.value = 'busy';
    const time = play ?? null;
    // the key the worker's result will carry (time null: the case's own view time)
    pendingInputs.set(c.modified + '|' + (time ?? viewTime), performance.now());
    if (pendingInputs.size > 50) pendingInputs.delete(pendingInputs.keys().next().value!);
    plumes.request(c, time, grid);
    if (c.modified !== lastEvalStamp) {
      lastEvalStamp = c.modified;
      evals.request(c);
    }
  });
  (globalThis as { __downgradient?: unknown }).__downgradient = { latencySamples };
  return () => {
    stop();
    plumeWorker.terminate();
    resultWorker.terminate();
  };
}

/** Run after the browser has painted the current frame. */
function afterPaint(f: () => void): void {
  requestAnimationFrame(() => setTimeout(f, 0));
}
