/** Words for Monte Carlo figures, shared by the panel and the printed report. */
import type { ReceptorUncertainty } from '../case/uncertainty';
import { fmtConc, fmtTime } from './format';

/** a probability as a percentage: one decimal below 10 %, none above */
export const pc = (p: number): string => `${(100 * p).toFixed(p > 0 && p < 0.1 ? 1 : 0)}\u00a0%`;

/** "193 d / not within horizon / not within horizon" */
export const arrivalPercentiles = (x: ReceptorUncertainty): string =>
  [x.arrival.p5, x.arrival.p50, x.arrival.p95].map((t) => (t === null ? 'not within horizon' : fmtTime(t))).join(' / ');

export const peakPercentiles = (x: ReceptorUncertainty): string => [x.peak.p5, x.peak.p50, x.peak.p95].map((v) => (v === null ? '—' : fmtConc(v))).join(' / ');

export const intervalText = (x: ReceptorUncertainty): string => `95 %: ${pc(x.pExceedInterval[0])}–${pc(x.pExceedInterval[1])}`;
