/**
 * Sen's (1968) slope estimator with its nonparametric confidence interval, as set out in Gilbert
 * (1987, §16.5): the median of the N′ slopes (x_j − x_i)/(t_j − t_i) over all pairs with t_j > t_i;
 * with C = z_{1−α/2}·√Var(S) (Var(S) of the Mann–Kendall test, ties included), M₁ = (N′ − C)/2
 * and M₂ = (N′ + C)/2, the limits are the M₁-th and (M₂ + 1)-th smallest slopes. Gilbert
 * interpolates when M₁, M₂ are not whole; here they are rounded to the nearest rank (halves to
 * even), which is what scipy.stats.theilslopes does, so the two can be compared rank for rank.
 */
import { ValidationError } from '../validation';
import { normalQuantile } from '../uncertainty/normal';

export interface SenSlope {
  /** median pairwise slope, value units per time unit */
  readonly slope: number;
  readonly lower: number;
  readonly upper: number;
  readonly confidence: number;
  /** number of pairwise slopes N′ */
  readonly pairs: number;
}

function roundHalfEven(x: number): number {
  const r = Math.round(x);
  return Math.abs(x % 1) === 0.5 && r % 2 !== 0 ? r - 1 : r;
}

function median(sorted: Float64Array): number {
  const m = sorted.length;
  return m % 2 === 1 ? sorted[(m - 1) / 2] : 0.5 * (sorted[m / 2 - 1] + sorted[m / 2]);
}

/** Sen's slope of `values` against `times`; `varS` is the Mann–Kendall Var(S) of the same series. */
export function senSlope(values: readonly number[], times: readonly number[], varS: number, confidence = 0.95): SenSlope {
  const n = values.length;
  if (times.length !== n) throw new ValidationError('times', times.length, `one time per value (${n})`);
  if (!(confidence > 0 && confidence < 1)) throw new ValidationError('confidence', confidence, 'between 0 and 1');
  const slopes: number[] = [];
  for (let i = 0; i < n - 1; i++)
    for (let j = i + 1; j < n; j++) {
      const dt = times[j] - times[i];
      if (dt > 0) slopes.push((values[j] - values[i]) / dt);
      else if (dt < 0) slopes.push((values[i] - values[j]) / -dt);
    }
  if (slopes.length === 0) throw new ValidationError('times', times[0], 'at least two different sampling dates');
  const sorted = Float64Array.from(slopes).sort();
  const np = sorted.length;
  const c = normalQuantile(0.5 + confidence / 2) * Math.sqrt(Math.max(0, varS));
  const lowerIndex = Math.max(roundHalfEven((np - c) / 2) - 1, 0);
  const upperIndex = Math.min(roundHalfEven((np + c) / 2), np - 1);
  return { slope: median(sorted), lower: sorted[lowerIndex], upper: sorted[upperIndex], confidence, pairs: np };
}
