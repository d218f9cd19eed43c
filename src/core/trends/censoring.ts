/**
 * Results below the reporting limit ("non-detects") in the trend statistics.
 *
 * Gilbert (1987, Statistical Methods for Environmental Pollution Monitoring, §16.4) treats values
 * below the detection limit as tied with one another at a common value smaller than the smallest
 * measured value. Where the limit changed between rounds, a "< 5" and a measured 3 cannot be
 * ordered, so every non-detect and every measured value below the HIGHEST reporting limit L is
 * censored at L and all of them form one tied group below L (the usual extension of Gilbert's
 * rule; it discards order information but never invents it).
 *
 * For Sen's slope, whose size depends on the value the censored group stands at, the group is
 * given L/2 (common practice, not from Gilbert); the result says how many values were censored so
 * that a slope resting on them is not over-read.
 */
import { ValidationError, requireNonNegative } from '../validation';

/** One sampling result: time (days on any consistent origin), the value, and whether it is "<" a limit. */
export interface TimedResult {
  readonly t: number;
  /** the measured concentration, or the reporting limit when `nonDetect` */
  readonly value: number;
  readonly nonDetect: boolean;
}

export interface CensoredSeries {
  /** values in time order, the censored group replaced by `censoredAt` (L/2) */
  readonly values: number[];
  readonly times: number[];
  /** which entries belong to the censored group */
  readonly censored: boolean[];
  /** the highest reporting limit among the non-detects, null when there are none */
  readonly highestLimit: number | null;
  /** measured values below the highest limit that were censored with it */
  readonly detectsCensored: number;
  readonly nonDetects: number;
}

/** Sorts by time and applies the highest-limit censoring described above. */
export function censorAtHighestLimit(results: readonly TimedResult[]): CensoredSeries {
  results.forEach((r, i) => {
    if (typeof r.t !== 'number' || !Number.isFinite(r.t)) throw new ValidationError(`results[${i}].t`, r.t, 'a finite time');
    requireNonNegative(`results[${i}].value`, r.value);
    if (r.nonDetect && !(r.value > 0))
      throw new ValidationError(`results[${i}].value`, r.value, 'a reporting limit > 0 for a result below the limit');
  });
  const sorted = [...results].sort((a, b) => a.t - b.t);
  let limit: number | null = null;
  for (const r of sorted) if (r.nonDetect && (limit === null || r.value > limit)) limit = r.value;
  const censored = sorted.map((r) => limit !== null && (r.nonDetect || r.value < limit));
  const detectsCensored = sorted.filter((r, i) => censored[i] && !r.nonDetect).length;
  const sub = limit === null ? 0 : limit / 2;
  return {
    values: sorted.map((r, i) => (censored[i] ? sub : r.value)),
    times: sorted.map((r) => r.t),
    censored,
    highestLimit: limit,
    detectsCensored,
    nonDetects: sorted.filter((r) => r.nonDetect).length,
  };
}
