/**
 * One well's trend for one analyte: Gilbert's non-detect censoring, the Mann–Kendall test, Sen's
 * slope with its interval and a plain verdict.
 *
 * The verdict rule (common practice in natural-attenuation monitoring; the thresholds are a
 * convention, not a theorem). p is the two-sided Mann–Kendall p-value, CV the coefficient of
 * variation (sample standard deviation / mean, the censored group at half the highest limit):
 *   p ≤ 0.05                      → increasing / decreasing (by the sign of S)
 *   0.05 < p ≤ 0.10               → probably increasing / probably decreasing
 *   p > 0.10, S ≤ 0 and CV < 1    → stable
 *   p > 0.10 otherwise            → no trend
 * A weak upward S is never called stable: for a receptor, an increase missed is the costly error.
 * Fewer than 4 rounds give no verdict (with 4, the smallest possible two-sided p is 1/12, so the
 * test can at most say "probably"); fewer than 8 carry a warning (at least 8 rounds is the common
 * recommendation for trend tests on groundwater data, e.g. US EPA 2009 Unified Guidance,
 * EPA 530/R-09-007 — from memory).
 */
import type { Warning } from '../validation';
import { censorAtHighestLimit, type TimedResult } from './censoring';
import { mannKendall, type MannKendallResult } from './mannKendall';
import { senSlope, type SenSlope } from './senSlope';

export type TrendVerdict =
  | 'increasing'
  | 'probably increasing'
  | 'stable'
  | 'probably decreasing'
  | 'decreasing'
  | 'no trend'
  | 'too few rounds';

export const MIN_ROUNDS_FOR_VERDICT = 4;
export const ROUNDS_ADVISED = 8;

export interface TrendResult {
  readonly rounds: number;
  readonly mannKendall: MannKendallResult | null;
  /** Sen's slope in value units per time unit (mg/L per day with the case's units) */
  readonly sen: SenSlope | null;
  readonly coefficientOfVariation: number | null;
  readonly verdict: TrendVerdict;
  readonly nonDetects: number;
  readonly highestLimit: number | null;
  readonly warnings: Warning[];
}

export function trendVerdict(s: number, p: number, cv: number): TrendVerdict {
  const up = s > 0;
  if (p <= 0.05 && s !== 0) return up ? 'increasing' : 'decreasing';
  if (p <= 0.1 && s !== 0) return up ? 'probably increasing' : 'probably decreasing';
  return !up && cv < 1 ? 'stable' : 'no trend';
}

function coefficientOfVariation(values: number[]): number {
  const n = values.length;
  const mean = values.reduce((a, b) => a + b, 0) / n;
  if (!(mean > 0)) return 0;
  const ss = values.reduce((a, b) => a + (b - mean) * (b - mean), 0);
  return Math.sqrt(ss / (n - 1)) / mean;
}

/** Trend of a series of results (times in days; any order; non-detects carry their reporting limit). */
export function analyseTrend(results: readonly TimedResult[], confidence = 0.95): TrendResult {
  const series = censorAtHighestLimit(results);
  const n = series.values.length;
  const warnings: Warning[] = [];
  const base = { rounds: n, nonDetects: series.nonDetects, highestLimit: series.highestLimit };
  if (n < MIN_ROUNDS_FOR_VERDICT) {
    warnings.push({
      code: 'trend-too-few',
      message: `Only ${n} sampling round${n === 1 ? '' : 's'}: a trend test needs at least ${MIN_ROUNDS_FOR_VERDICT} (${ROUNDS_ADVISED} or more advised).`,
    });
    return { ...base, mannKendall: null, sen: null, coefficientOfVariation: null, verdict: 'too few rounds', warnings };
  }
  if (n < ROUNDS_ADVISED)
    warnings.push({
      code: 'trend-few',
      message: `The trend rests on ${n} sampling rounds; ${ROUNDS_ADVISED} or more are advised before relying on it.`,
    });
  if (series.highestLimit !== null) {
    const cens = series.censored.filter(Boolean).length;
    warnings.push({
      code: 'trend-censored',
      message:
        `${cens} of ${n} results are below the highest reporting limit (${series.highestLimit}) and are treated as tied below it` +
        (series.detectsCensored > 0 ? ` (including ${series.detectsCensored} measured value${series.detectsCensored === 1 ? '' : 's'} under that limit)` : '') +
        '; Sen\'s slope puts them at half the limit.',
    });
    if (cens === n) warnings.push({ code: 'trend-all-censored', message: 'Every result is below the reporting limit: no trend can be measured.' });
  }
  const mk = mannKendall(series.values, series.times);
  const sen = senSlope(series.values, series.times, mk.varS, confidence);
  const cv = coefficientOfVariation(series.values);
  return { ...base, mannKendall: mk, sen, coefficientOfVariation: cv, verdict: trendVerdict(mk.s, mk.p, cv), warnings };
}
