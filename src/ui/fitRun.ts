/**
 * A fit of the case to its monitoring data in a web worker (src/worker/fit.ts), so the screen keeps
 * responding; progress as it comes, cancel by terminating the worker (nothing of a cancelled fit
 * is kept, and the case is never touched by a fit).
 */
import type { Case } from '../case/schema';
import type { FitParameter, FitProgress, FitResult } from '../case/fit';
import type { FitReply, FitRequest } from '../worker/fit';

export interface FitRun {
  readonly done: Promise<FitResult>;
  cancel(): void;
}

export class FitCancelled extends Error {
  constructor() {
    super('The fit was cancelled.');
  }
}

export function startFit(c: Case, chosen: FitParameter[], onProgress: (p: FitProgress) => void): FitRun {
  const worker = new Worker(new URL('../worker/fit.ts', import.meta.url), { type: 'module', name: 'downgradient-fit' });
  let settle: { resolve: (r: FitResult) => void; reject: (e: Error) => void } | null = null;
  const done = new Promise<FitResult>((resolve, reject) => (settle = { resolve, reject }));
  const finish = (f: (s: NonNullable<typeof settle>) => void) => {
    worker.terminate();
    if (settle) f(settle);
    settle = null;
  };
  worker.onmessage = (e: MessageEvent<FitReply>) => {
    const m = e.data;
    if (m.type === 'progress') onProgress(m.progress);
    else if (m.type === 'done') finish((s) => s.resolve(m.result));
    else finish((s) => s.reject(new Error(m.message)));
  };
  worker.onerror = (e) => finish((s) => s.reject(new Error(e.message || 'The fit could not run.')));
  worker.postMessage({ case: c, chosen } satisfies FitRequest);
  return { done, cancel: () => finish((s) => s.reject(new FitCancelled())) };
}
