/**
 * Statistics of a Monte Carlo run.
 *
 * Exceedance probability: p̂ = k/n with the standard error √(p̂(1 − p̂)/n) of independent sampling.
 * For Latin hypercube samples this is conservative when the output is monotone in each input
 * (McKay, Beckman & Conover 1979, Theorem 2: the variance of the LHS mean is then no larger than
 * that of random sampling). Beside it the Wilson score interval (Wilson 1927, JASA 22, 209–212),
 * which stays inside [0, 1] and is honest when k is 0 or n.
 *
 * Percentiles: the linear interpolation between order statistics at h = (n − 1)·q (Hyndman &
 * Fan 1996, definition 7; numpy's and R's default). A value that never happens (an arrival that
 * does not occur within the horizon) is ordered above every number; a percentile that reaches one
 * is "not within the horizon" (null), never a made-up time.
 *
 * Spearman's rank correlation: the Pearson correlation of the ranks, tied values given their
 * average rank (as scipy.stats.spearmanr); 0 when either variable is constant.
 */
import { normalQuantile } from './normal';

export interface Exceedance {
  readonly n: number;
  readonly k: number;
  readonly p: number;
  /** Monte Carlo standard error of p */
  readonly se: number;
  /** Wilson score interval at `level` */
  readonly low: number;
  readonly high: number;
  readonly level: number;
}

export function exceedance(k: number, n: number, level = 0.95): Exceedance {
  const p = n > 0 ? k / n : 0;
  const se = n > 0 ? Math.sqrt((p * (1 - p)) / n) : 0;
  const z = normalQuantile(0.5 + level / 2);
  const z2 = z * z;
  const denom = 1 + z2 / n;
  const centre = (p + z2 / (2 * n)) / denom;
  const half = (z / denom) * Math.sqrt((p * (1 - p)) / n + z2 / (4 * n * n));
  return { n, k, p, se, low: n > 0 ? Math.max(0, centre - half) : 0, high: n > 0 ? Math.min(1, centre + half) : 1, level };
}

/**
 * Percentiles (q in [0, 1]) of values where Infinity (or NaN) stands for "never"; null where the
 * percentile reaches a value that never happens. `values` is not changed.
 */
export function percentiles(values: ArrayLike<number>, qs: readonly number[]): (number | null)[] {
  const n = values.length;
  if (n === 0) return qs.map(() => null);
  const sorted = Float64Array.from(values, (v) => (Number.isNaN(v) ? Infinity : v)).sort();
  return qs.map((q) => {
    const h = (n - 1) * q;
    const lo = Math.floor(h);
    const hi = Math.min(n - 1, lo + 1);
    const a = sorted[lo];
    const b = sorted[hi];
    const f = h - lo;
    if (!Number.isFinite(a) || (f > 0 && !Number.isFinite(b))) return null;
    return f > 0 ? a + f * (b - a) : a;
  });
}

/** Ranks 1 … n, ties given their average rank. */
export function ranks(values: ArrayLike<number>): Float64Array {
  const n = values.length;
  const order = Array.from({ length: n }, (_, i) => i).sort((i, j) => values[i] - values[j]);
  const r = new Float64Array(n);
  let s = 0;
  while (s < n) {
    let e = s + 1;
    while (e < n && values[order[e]] === values[order[s]]) e++;
    const avg = (s + e + 1) / 2; // mean of ranks s+1 … e
    for (let t = s; t < e; t++) r[order[t]] = avg;
    s = e;
  }
  return r;
}

/** Pearson correlation; 0 when either variable is constant. */
export function pearson(x: ArrayLike<number>, y: ArrayLike<number>): number {
  const n = x.length;
  let mx = 0;
  let my = 0;
  for (let i = 0; i < n; i++) {
    mx += x[i];
    my += y[i];
  }
  mx /= n;
  my /= n;
  let sxy = 0;
  let sxx = 0;
  let syy = 0;
  for (let i = 0; i < n; i++) {
    const dx = x[i] - mx;
    const dy = y[i] - my;
    sxy += dx * dy;
    sxx += dx * dx;
    syy += dy * dy;
  }
  if (!(sxx > 0 && syy > 0)) return 0;
  return Math.max(-1, Math.min(1, sxy / Math.sqrt(sxx * syy)));
}

/** Spearman's rank correlation coefficient. */
export function spearman(x: ArrayLike<number>, y: ArrayLike<number>): number {
  return pearson(ranks(x), ranks(y));
}

/**
 * Exceedance probability among the realisations whose input lies in its lower third
 * (u < 1/3 of its own distribution) and its upper third (u > 2/3). `u` holds each realisation's
 * stratified uniform for the input, so the thirds are the input distribution's own terciles.
 */
export function thirdsExceedance(u: ArrayLike<number>, exceeds: ArrayLike<number | boolean>): { low: Exceedance; high: Exceedance } {
  let nl = 0;
  let kl = 0;
  let nh = 0;
  let kh = 0;
  for (let i = 0; i < u.length; i++) {
    if (u[i] < 1 / 3) {
      nl++;
      if (exceeds[i]) kl++;
    } else if (u[i] > 2 / 3) {
      nh++;
      if (exceeds[i]) kh++;
    }
  }
  return { low: exceedance(kl, nl), high: exceedance(kh, nh) };
}
