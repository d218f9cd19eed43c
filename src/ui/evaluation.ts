/**
 * The evaluation loop: every change of the case (or of the time shown) is checked on the main
 * thread (case preparation is cheap and gives the field-named message for the inline error), then
 * sent to two workers — one draws the plume, one screens the receptors.
 * - Each worker has at most one job in flight; a newer request replaces any waiting one, so fast
 *   typing or dragging never piles up work and the screen always converges on the latest inputs.
 * - The plume goes first: the contours come back as transferred typed arrays and the map updates
 *   its band paths at once; the results signal (plume included, for export and the report) is
 *   republished when that edit's contours are painted, and the receptor job for the edit starts
 *   RECEPTOR_PAUSE_MS later unless a newer edit came first, so on a two-core tablet the receptor
 *   work does not slow the contours down while the user types or drags.
 * - A receptor job overtaken by a newer edit is cancelled when it has already run for
 *   CANCEL_AFTER_MS (the exact solution at many receptors can take seconds; its result would be
 *   thrown away): its worker is terminated and replaced when the next receptor job starts. A
 *   younger job is left to finish and its result dropped: terminating a busy worker blocks the
 *   page for several milliseconds and a new worker starts cold (measured in headless Chromium:
 *   about 8 ms to terminate and 4 ms to create, against 4–20 ms for a whole demo case's receptor
 *   job), so cancelling short jobs would cost the screen more than it saves.
 */
import { effect, signal } from '@preact/signals';
import { wrap, type Remote } from 'comlink';
import type { Case } from '../case/schema';
import { prepareCase, type PreparedCase } from '../case/prepare';
import { placementProblem } from '../case/check';
import { ValidationError } from '../core';
import type { ScreeningApi } from '../worker/screening';
import type { Evaluation, PlumeLayer } from './results';
import { currentCase, currentResults, publishResults } from './state';
import { playTime } from './view';
import { settings } from './settings';
import { inputIssue } from './validity';
import { particleRun } from './particleState';

/** 'busy' while a worker job for the current inputs is running */
export const evaluationState = signal<'idle' | 'busy' | 'error'>('idle');
export const evaluationError = signal<string | null>(null);
/** The current case prepared for the engine (null while an input is invalid): map geometry. */
export const preparedCase = signal<PreparedCase | null>(null);
/**
 * Derived values shown beside the inputs (width across the flow, flow, v, R, dispersivities, in
 * internal units) for the case on screen: from its preparation on the main thread, done with every
 * edit, or the last results' while an input is invalid. Reading it subscribes the component to both.
 */
export function derivedForScreen(): Pick<Evaluation['derived'], 'v' | 'R' | 'ax' | 'ay' | 'az' | 'gradient' | 'azimuthDeg' | 'width'> | null {
  return preparedCase.value?.derived ?? currentResults.value?.derived ?? null;
}

/** The contours on the map (they arrive before the receptor results). */
export const currentPlume = signal<PlumeLayer | null>(null);

class Cancelled extends Error {}

/** A receptor job younger than this is left to finish when a newer edit arrives (see the header). */
export const CANCEL_AFTER_MS = 250;
/**
 * The receptor job for an edit starts this long after its contours are painted, unless a newer
 * edit arrives first: while the user types or drags, each change redraws the contours with the
 * tablet's second core to itself, and the receptor table follows when they pause.
 */
export const RECEPTOR_PAUSE_MS = 120;

/**
 * A worker that can be stopped mid-job (terminated). A cancelled worker is replaced only when the
 * next job needs it, so nothing boots while the contours for the newer edit are being computed.
 */
class ScreeningWorker {
  private worker: Worker | null = null;
  private api: Remote<ScreeningApi> | null = null;
  private abort: ((e: Error) => void) | null = null;
  private startedAt = 0;
  constructor() {
    this.start();
  }
  private start(): Remote<ScreeningApi> {
    this.worker = new Worker(new URL('../worker/screening.ts', import.meta.url), { type: 'module', name: 'downgradient-screening' });
    this.api = wrap<ScreeningApi>(this.worker);
    return this.api;
  }
  run<R>(job: (api: Remote<ScreeningApi>) => Promise<R>): Promise<R> {
    const api = this.api ?? this.start();
    this.startedAt = performance.now();
    return new Promise<R>((resolve, reject) => {
      this.abort = reject;
      job(api).then(resolve, reject);
    }).finally(() => (this.abort = null));
  }
  /** Stop the running job if it has run for at least minAgeMs (then true). */
  cancel(minAgeMs = 0): boolean {
    if (!this.abort || performance.now() - this.startedAt < minAgeMs) return false;
    this.abort(new Cancelled());
    this.terminate();
    return true;
  }
  terminate(): void {
    this.worker?.terminate();
    this.worker = null;
    this.api = null;
  }
}

/** One job in flight, the newest waiting request wins; optionally cancel a running one. */
class LatestOnly<A, R> {
  private running = false;
  private next: A | null = null;
  constructor(
    private run: (a: A) => Promise<R>,
    private done: (r: R, a: A) => void,
    private fail: (e: unknown) => void,
    private cancelRunning: (() => void) | null = null,
  ) {}
  request(a: A): void {
    this.next = a;
    if (this.running) this.cancelRunning?.();
    else void this.pump();
  }
  get busy(): boolean {
    return this.running || this.next !== null;
  }
  private async pump(): Promise<void> {
    while (this.next !== null) {
      const a = this.next;
      this.next = null;
      this.running = true;
      try {
        const r = await this.run(a);
        // a newer request is waiting: these results are already out of date
        if (this.next === null) this.done(r, a);
      } catch (e) {
        if (!(e instanceof Cancelled)) this.fail(e);
      } finally {
        this.running = false;
      }
    }
  }
}

/** One edit's way to the screen; performance.now() times on the page's clock. */
export interface LatencySample {
  /** when the edit reached the evaluation loop */
  inputAt: number;
  /** when the request was posted to the plume worker (later than inputAt if a job was running) */
  postedAt: number;
  /** when the worker started and finished the job (its epoch times on the page's clock) */
  workerStartAt: number;
  workerEndAt: number;
  /** when the worker's contours arrived on the main thread */
  receivedAt: number;
  /** when the band paths were updated in the DOM (the map draws synchronously) */
  layerAt: number;
  /** after the browser painted the frame with the contours (next animation frame + a task) */
  drawnAt: number;
  gridSize: number;
  solution: string;
  timing: PlumeLayer['timing'];
}

/**
 * True only in a build made for measurement: bench/ui-latency.mjs and the browser tests build with
 * `define: { __DG_INSTRUMENTED__: 'true' }`; vite.config.ts defines it false, so `npm run build`
 * leaves the samples and the `__downgradient` hook out of the bundle (unit tests leave it undefined).
 */
declare const __DG_INSTRUMENTED__: boolean | undefined;
const INSTRUMENTED = typeof __DG_INSTRUMENTED__ !== 'undefined' && __DG_INSTRUMENTED__;

/** Input-to-contours latencies, newest last (kept only in an instrumented build). */
export const latencySamples: LatencySample[] = [];

function describe(e: unknown): string {
  return e instanceof Error ? e.message : String(e);
}

interface PlumeJob {
  c: Case;
  time: number | null;
  grid: number;
  key: string;
  inputAt: number;
  postedAt?: number;
}

/** Start the loop; returns a function that stops it and releases the workers. */
export function startEvaluation(): () => void {
  const plumeWorker = new ScreeningWorker();
  const resultWorker = new ScreeningWorker();
  let latestPlume: PlumeLayer | null = null;
  /** the case the plume on the map was computed for */
  let plumeCaseId = '';
  let latestEval: Evaluation | null = null;
  let waitingEval: Case | null = null;

  const publishEval = () => {
    if (latestEval) publishResults({ ...latestEval, plume: latestPlume });
  };
  const onFail = (e: unknown) => {
    evaluationState.value = 'error';
    evaluationError.value = `The engine could not finish: ${describe(e)}`;
  };
  const settle = () => {
    if (!plumes.busy && !evals.busy && evaluationState.peek() !== 'error') evaluationState.value = 'idle';
  };
  let pauseTimer: ReturnType<typeof setTimeout> | null = null;
  const clearPause = () => {
    if (pauseTimer !== null) clearTimeout(pauseTimer);
    pauseTimer = null;
  };
  const startWaitingEval = () => {
    clearPause();
    if (waitingEval) evals.request(waitingEval);
    waitingEval = null;
  };
  /** start the waiting receptor job after a pause in editing (see RECEPTOR_PAUSE_MS) */
  const startAfterPause = () => {
    if (waitingEval && pauseTimer === null) pauseTimer = setTimeout(startWaitingEval, RECEPTOR_PAUSE_MS);
  };

  const plumes: LatestOnly<PlumeJob, PlumeLayer> = new LatestOnly(
    (j) => {
      const r = plumeWorker.run((api) => api.plume(j.c, j.time, j.grid));
      j.postedAt = performance.now(); // the message is posted synchronously
      return r;
    },
    (p, j) => {
      // another case was opened meanwhile (one that cannot be prepared sends no newer job)
      if (j.c.id !== currentCase.peek().id) return settle();
      const receivedAt = performance.now();
      latestPlume = p;
      plumeCaseId = j.c.id;
      currentPlume.value = p; // the map updates the band paths synchronously in its effect
      const layerAt = performance.now();
      afterPaint(() => {
        if (INSTRUMENTED) recordSample(j, p, receivedAt, layerAt, performance.now());
        // the results (which carry the plume for export and the report) re-render after the
        // contours are on screen; the receptor job starts after a pause in editing
        publishEval();
        startAfterPause();
        settle();
      });
    },
    (e) => {
      onFail(e);
      startWaitingEval();
    },
  );
  const evals: LatestOnly<Case, Evaluation> = new LatestOnly(
    (c) => resultWorker.run((api) => api.evaluate(c)),
    (e) => {
      if (e.caseId !== currentCase.peek().id) return settle();
      latestEval = e;
      publishEval();
      settle();
    },
    onFail,
    () => resultWorker.cancel(CANCEL_AFTER_MS),
  );

  let lastEvalStamp = '';
  const stop = effect(() => {
    const c = currentCase.value;
    const grid = settings.value.gridSize;
    const time = playTime.value;
    const inputAt = performance.now();
    try {
      const unplaced = placementProblem(c);
      if (unplaced) throw unplaced;
      preparedCase.value = prepareCase(c);
      inputIssue.value = null;
    } catch (e) {
      inputIssue.value = e instanceof ValidationError ? { field: e.field, message: e.message } : { field: '', message: describe(e) };
      preparedCase.value = null;
      // results and plume of another case are never shown beside this one's inputs
      if (latestEval && latestEval.caseId !== c.id) {
        latestEval = null;
        publishResults(null);
      }
      if (latestPlume && plumeCaseId !== c.id) {
        latestPlume = null;
        currentPlume.value = null;
      }
      return;
    }
    evaluationError.value = null;
    evaluationState.value = 'busy';
    plumes.request({ c, time, grid, key: c.modified, inputAt });
    if (c.modified !== lastEvalStamp) {
      lastEvalStamp = c.modified;
      waitingEval = c;
      // a newer edit: the pause starts again after its contours are painted
      clearPause();
    }
  });
  // read by the latency benchmark (bench/ui-latency.mjs) and the browser tests: the samples and the
  // case on screen; absent from production builds
  if (INSTRUMENTED) (globalThis as { __downgradient?: unknown }).__downgradient = { latencySamples, currentCase: () => currentCase.peek(), particleRun: () => particleRun.peek() };
  return () => {
    stop();
    clearPause();
    plumeWorker.terminate();
    resultWorker.terminate();
  };
}

function recordSample(j: PlumeJob, p: PlumeLayer, receivedAt: number, layerAt: number, drawnAt: number): void {
  const origin = performance.timeOrigin;
  latencySamples.push({
    inputAt: j.inputAt,
    postedAt: j.postedAt ?? j.inputAt,
    workerStartAt: p.timing.startedAt - origin,
    workerEndAt: p.timing.finishedAt - origin,
    receivedAt,
    layerAt,
    drawnAt,
    gridSize: p.gridSize,
    solution: p.solution,
    timing: p.timing,
  });
  if (latencySamples.length > 200) latencySamples.splice(0, 100);
}

/** Run after the browser has painted the current frame. */
function afterPaint(f: () => void): void {
  requestAnimationFrame(() => setTimeout(f, 0));
}
