/**
 * The lateral factors of a whole row of evenly spaced y values from the lattice error function:
 * the single entry point of this folder (see README.md).
 */
import { ERF_TABLE_SPLIT, erfLattice } from './erfLattice';

let latA = new Float64Array(0);
let latB = new Float64Array(0);

/** First j in [0, n] with u0 + j·du > lim (strict) or ≥ lim, du > 0, as erfLattice classifies. */
function firstPast(u0: number, du: number, n: number, lim: number, strict: boolean): number {
  let j = Math.min(n, Math.max(0, Math.floor((lim - u0) / du)));
  if (strict) {
    while (j > 0 && u0 + (j - 1) * du > lim) j--;
    while (j < n && !(u0 + j * du > lim)) j++;
  } else {
    while (j > 0 && u0 + (j - 1) * du >= lim) j--;
    while (j < n && !(u0 + j * du >= lim)) j++;
  }
  return j;
}

const cuts = new Int32Array(6);

/**
 * erf(u) from a split value v by its class (0: u ≤ −S, v = erfc(−u); 1: |u| < S, v = erf(u);
 * 2: u ≥ S, v = erfc(u)) is K + σ·v with these K and σ. Differences within one tail class have K = 0
 * exactly, so the far field keeps its relative accuracy.
 */
const CLASS_K = [-1, 0, 1];
const CLASS_SIGN = [1, 1, -1];

/**
 * factor·[erf(a_j) − erf(b_j)], a_j = (y_j + h)/s, b_j = (y_j − h)/s, for j ≥ jStart on the evenly
 * spaced y values y0 + j·dy (s > 0), into out[row + j], from erfLattice (erfLattice.ts:
 * 5e-13 relative; the lattice arguments differ from (y_j ± h)/s by the rounding of the y values).
 * With `mirrored` (the y values symmetric about 0) only the b lattice is formed, a_j = −b_{n−1−j},
 * and out[row + n − 1 − j] gets the same value (the whole row is written). Values are kept in
 * [0, 2·factor], the range of the exact difference, against rounding.
 * The row is cut where a_j or b_j changes class, so each segment is one fused multiply–add form.
 */
export function lateralLattice(y0: number, dy: number, ny: number, h: number, s: number, mirrored: boolean, jStart: number, factor: number, out: Float64Array, row: number): void {
  if (latB.length < ny) {
    latA = new Float64Array(ny);
    latB = new Float64Array(ny);
  }
  const S = ERF_TABLE_SPLIT;
  const inv = 1 / s;
  const du = dy * inv;
  const b0 = (y0 - h) * inv;
  erfLattice(b0, du, ny, latB);
  const jb1 = firstPast(b0, du, ny, -S, true);
  const jb2 = firstPast(b0, du, ny, S, false);
  let ja1: number;
  let ja2: number;
  if (mirrored) {
    // a_j = −b_m, m = n − 1 − j: class(a_j) = 2 − class(b_m)
    ja1 = ny - jb2;
    ja2 = ny - jb1;
  } else {
    const a0 = (y0 + h) * inv;
    erfLattice(a0, du, ny, latA);
    ja1 = firstPast(a0, du, ny, -S, true);
    ja2 = firstPast(a0, du, ny, S, false);
  }
  // segment ends, sorted (insertion sort of six values)
  cuts[0] = jStart;
  cuts[1] = Math.max(jStart, ja1);
  cuts[2] = Math.max(jStart, ja2);
  cuts[3] = Math.max(jStart, jb1);
  cuts[4] = Math.max(jStart, jb2);
  cuts[5] = ny;
  for (let i = 1; i < 6; i++) {
    const v = cuts[i];
    let k = i - 1;
    while (k >= 0 && cuts[k] > v) {
      cuts[k + 1] = cuts[k];
      k--;
    }
    cuts[k + 1] = v;
  }
  const B = latB;
  const A = latA;
  // erf(a) − erf(b) lies in [0, 2] for a ≥ b: rounding is kept inside it
  const cap = 2 * factor;
  for (let c = 0; c < 5; c++) {
    const lo = cuts[c];
    const hi = cuts[c + 1];
    if (hi <= lo) continue;
    const ca = lo < ja1 ? 0 : lo < ja2 ? 1 : 2;
    const cb = lo < jb1 ? 0 : lo < jb2 ? 1 : 2;
    const K = factor * (CLASS_K[ca] - CLASS_K[cb]);
    const sb = -factor * CLASS_SIGN[cb];
    if (mirrored) {
      // the split value of a_j from b_m: erfc(|a|) = v_m in the tail, erf(a) = −v_m in the middle
      const sa = factor * CLASS_SIGN[ca] * (ca === 1 ? -1 : 1);
      for (let j = lo; j < hi; j++) {
        const m = ny - 1 - j;
        let f = K + sa * B[m] + sb * B[j];
        f = f > 0 ? (f < cap ? f : cap) : 0;
        out[row + j] = f;
        out[row + m] = f;
      }
    } else {
      const sa = factor * CLASS_SIGN[ca];
      for (let j = lo; j < hi; j++) {
        const f = K + sa * A[j] + sb * B[j];
        out[row + j] = f > 0 ? (f < cap ? f : cap) : 0;
      }
    }
  }
}
