/**
 * The state of the probabilistic run, apart from the code that runs it (uncertaintyRun.ts), so
 * the results panel and the map can show the run's bands and contours without loading the
 * Monte Carlo code on the first screen: this module imports types only.
 */
import { signal } from '@preact/signals';
import type { Case } from '../case/schema';
import type { BreakthroughBands, UncertaintyResult, WellBands } from '../case/uncertainty';
import type { ExceedanceContours } from '../case/exceedanceMap';

export interface RunState {
  readonly status: 'idle' | 'running' | 'done' | 'cancelled' | 'failed';
  readonly result: UncertaintyResult | null;
  /** the case text the result belongs to (out of date when the case differs) */
  readonly caseKey: string | null;
  readonly done: number;
  readonly runs: number;
  readonly startedAt: number;
  /** seconds left, estimated from the pace so far (null: not known yet) */
  readonly secondsLeft: number | null;
  readonly error: string | null;
  readonly workers: number;
  /** percentile bands of each receptor's breakthrough curve (refreshed during a run, at most once a second; final when it is done or cancelled) */
  readonly bands: BreakthroughBands[] | null;
  /** the same bands at each placed monitoring well with results, over its chart's times (refreshed with them) */
  readonly wellBands: WellBands[] | null;
  /** contours of P(C > limit) on the map at the map's time, from the realisations mapped so far */
  readonly map: ExceedanceContours | null;
}

export const uncertaintyRun = signal<RunState>({ status: 'idle', result: null, caseKey: null, done: 0, runs: 0, startedAt: 0, secondsLeft: null, error: null, workers: 0, bands: null, wellBands: null, map: null });

/** What a result depends on: everything but the case's name, notes and time stamps. */
export function caseKeyOf(c: Case): string {
  let key = keys.get(c);
  if (key === undefined) {
    key = JSON.stringify([c.site, c.aquifer, c.contaminant, c.source, c.evaluation, c.uncertainty]);
    keys.set(c, key);
  }
  return key;
}
/** a case object is never changed in place (edits make a new one), so its key can be kept */
const keys = new WeakMap<Case, string>();

/** The run's results for this case as it is now (null: no run, or the case changed since). */
export function currentRunFor(c: Case): RunState | null {
  const run = uncertaintyRun.value;
  return run.result && run.caseKey === caseKeyOf(c) ? run : null;
}
