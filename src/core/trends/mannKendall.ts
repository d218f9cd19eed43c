/**
 * The Mann–Kendall test for a monotonic trend (Mann 1945; Kendall 1975), as set out in Gilbert
 * (1987, Statistical Methods for Environmental Pollution Monitoring, ch. 16):
 *
 *   S = Σ_{i<j} sgn(t_j − t_i)·sgn(x_j − x_i)   (with distinct times: Σ_{i<j} sgn(x_j − x_i))
 *   Var(S) = [n(n−1)(2n+5) − Σ_p t_p(t_p−1)(2t_p+5) − Σ_q u_q(u_q−1)(2u_q+5)]/18
 *          + [Σ t_p(t_p−1)(t_p−2)]·[Σ u_q(u_q−1)(u_q−2)] / [9n(n−1)(n−2)]
 *          + [Σ t_p(t_p−1)]·[Σ u_q(u_q−1)] / [2n(n−1)]
 *   where t_p are the sizes of groups of tied values and u_q of groups of tied times (Kendall 1975;
 *   Gilbert eq. 16.5; with no tied times it is Gilbert's eq. 16.4),
 *   Z = (S − sgn S)/√Var(S) (continuity correction), two-sided p = 2·(1 − Φ(|Z|)).
 *
 * For n ≤ 10 with no ties at all, the exact null distribution is used instead (every ordering of n
 * distinct values equally likely; the count of orderings with k discordant pairs is the Mahonian
 * number, built by the recurrence M(n, k) = Σ_{j=0}^{min(k, n−1)} M(n−1, k−j)); it is the
 * distribution Gilbert tabulates (his Table A18, one-sided). With ties and n ≤ 10 the normal
 * approximation is used and the result says so.
 *
 * Kendall's tau is reported as τ_b = S/√[(N₀ − N_t)(N₀ − N_u)], N₀ = n(n−1)/2, N_t = Σ t_p(t_p−1)/2,
 * N_u = Σ u_q(u_q−1)/2 (Kendall 1975), which equals S/N₀ without ties.
 */
import { ValidationError } from '../validation';
import { normalCdf } from '../uncertainty/normal';

export interface MannKendallResult {
  readonly n: number;
  readonly s: number;
  readonly varS: number;
  readonly tau: number;
  /** continuity-corrected normal deviate (0 when S = 0) */
  readonly z: number;
  /** two-sided p-value */
  readonly p: number;
  /** 'exact': the permutation distribution (n ≤ 10, no ties); 'normal': the approximation above */
  readonly pMethod: 'exact' | 'normal';
  /** groups of tied values (sizes ≥ 2) */
  readonly tiedGroups: number[];
}

/** Sizes (≥ 2) of the groups of equal values. */
export function tieGroups(values: readonly number[]): number[] {
  const sorted = [...values].sort((a, b) => a - b);
  const groups: number[] = [];
  let run = 1;
  for (let i = 1; i <= sorted.length; i++) {
    if (i < sorted.length && sorted[i] === sorted[i - 1]) run++;
    else {
      if (run > 1) groups.push(run);
      run = 1;
    }
  }
  return groups;
}

const sum = (g: number[], f: (t: number) => number): number => g.reduce((a, t) => a + f(t), 0);

/** Var(S) with ties in the values (groups `tv`) and in the times (groups `tt`) — the formula above. */
export function mannKendallVariance(n: number, tv: number[], tt: number[]): number {
  const base =
    (n * (n - 1) * (2 * n + 5) - sum(tv, (t) => t * (t - 1) * (2 * t + 5)) - sum(tt, (u) => u * (u - 1) * (2 * u + 5))) / 18;
  if (n < 3) return base;
  const c1 = (sum(tv, (t) => t * (t - 1) * (t - 2)) * sum(tt, (u) => u * (u - 1) * (u - 2))) / (9 * n * (n - 1) * (n - 2));
  const c2 = (sum(tv, (t) => t * (t - 1)) * sum(tt, (u) => u * (u - 1))) / (2 * n * (n - 1));
  return base + c1 + c2;
}

/** Mahonian numbers M(n, k), k = 0 … n(n−1)/2: orderings of n distinct values with k discordant pairs. */
function mahonian(n: number): number[] {
  let row = [1];
  for (let m = 2; m <= n; m++) {
    const next = new Array<number>(row.length + m - 1).fill(0);
    for (let k = 0; k < next.length; k++) {
      let s = 0;
      for (let j = 0; j <= Math.min(k, m - 1); j++) if (k - j < row.length) s += row[k - j];
      next[k] = s;
    }
    row = next;
  }
  return row;
}

/** Exact P(S ≥ s) for n distinct values under no trend (Gilbert's Table A18 is this for n ≤ 10). */
export function mannKendallExactUpperTail(n: number, s: number): number {
  if (!Number.isInteger(n) || n < 2 || n > 30) throw new ValidationError('n', n, 'a whole number from 2 to 30');
  const m = mahonian(n);
  const total = m.reduce((a, b) => a + b, 0);
  const nPairs = (n * (n - 1)) / 2;
  // S = N₀ − 2k, so S ≥ s ⇔ k ≤ (N₀ − s)/2
  const kMax = Math.floor((nPairs - s) / 2);
  let count = 0;
  for (let k = 0; k <= Math.min(kMax, m.length - 1); k++) count += m[k];
  return Math.min(1, count / total);
}

/** Mann–Kendall test on values in time order (`times` give the order and reveal tied times). */
export function mannKendall(values: readonly number[], times?: readonly number[]): MannKendallResult {
  const n = values.length;
  if (n < 3) throw new ValidationError('results', n, 'at least 3 sampling rounds for a trend test');
  const ts = times ?? values.map((_, i) => i);
  if (ts.length !== n) throw new ValidationError('times', ts.length, `one time per value (${n})`);
  let s = 0;
  for (let i = 0; i < n - 1; i++)
    for (let j = i + 1; j < n; j++) s += Math.sign(ts[j] - ts[i]) * Math.sign(values[j] - values[i]);
  const tv = tieGroups([...values]);
  const tt = tieGroups([...ts]);
  const varS = mannKendallVariance(n, tv, tt);
  const n0 = (n * (n - 1)) / 2;
  const nt = sum(tv, (t) => (t * (t - 1)) / 2);
  const nu = sum(tt, (u) => (u * (u - 1)) / 2);
  const denom = Math.sqrt((n0 - nt) * (n0 - nu));
  const tau = denom > 0 ? s / denom : 0;
  const z = s === 0 || !(varS > 0) ? 0 : (s - Math.sign(s)) / Math.sqrt(varS);
  let p: number;
  let pMethod: 'exact' | 'normal' = 'normal';
  if (n <= 10 && tv.length === 0 && tt.length === 0) {
    pMethod = 'exact';
    p = s === 0 ? 1 : Math.min(1, 2 * mannKendallExactUpperTail(n, Math.abs(s)));
  } else {
    p = Math.min(1, 2 * normalCdf(-Math.abs(z)));
  }
  return { n, s, varS, tau, z, p, pMethod, tiedGroups: tv };
}
