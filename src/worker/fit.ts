/**
 * Worker entry for fitting a case to its monitoring data (src/case/fit.ts), so the screen keeps
 * responding while the exact solution is evaluated at every result for every trial of the fit
 * (about a second for the invented depot demo; longer with more results or parameters). Posts
 * progress at most five times a second; the page cancels by terminating the worker.
 */
import type { Case } from '../case/schema';
import { fitCase, type FitParameter, type FitProgress, type FitResult } from '../case/fit';

export type FitRequest = { case: Case; chosen: FitParameter[] };
export type FitReply = { type: 'progress'; progress: FitProgress } | { type: 'done'; result: FitResult } | { type: 'error'; message: string };

const post = (m: FitReply) => (self as unknown as { postMessage(m: unknown): void }).postMessage(m);

self.onmessage = (e: MessageEvent<FitRequest>) => {
  let last = 0;
  try {
    const result = fitCase(e.data.case, e.data.chosen, 0.95, (progress) => {
      const now = Date.now();
      if (now - last < 200) return;
      last = now;
      post({ type: 'progress', progress });
    });
    post({ type: 'done', result });
  } catch (err) {
    post({ type: 'error', message: err instanceof Error ? err.message : String(err) });
  }
};
