/**
 * erf (near 0) and erfc (beyond) from a table of local Taylor polynomials: the seeds and
 * point-by-point values of the lattice error function (erfLattice.ts).
 *
 * Method (approximation, with its error bound): nodes x_k = k·h, h = 1/128, on [0, 10). At a node
 * the table holds the Taylor coefficients of degree 0…8 of
 *   erf(x)  about x_k for k < 64  (x < 0.49609375), where erf keeps its relative accuracy, and
 *   erfc(x) about x_k for k ≥ 64, where erfc keeps its relative accuracy in the tail,
 * with the derivatives d^n/dx^n erfc(x) = −(2/√π)·(−1)^{n−1}·H_{n−1}(x)·e^{−x²} (physicists'
 * Hermite polynomials, three-term recurrence; Abramowitz & Stegun 7.1.19 and 22.7.13), and the
 * degree-0 values from Cody's erf/erfc (../special/erf.ts). An argument is evaluated at its nearest node,
 * |d| = |x − x_k| ≤ h/2 = 1/256 (d is exact in binary64 by Sterbenz's lemma).
 *
 * Truncation: the first omitted term, relative to the value, is about (2x·|d|)⁹/9! in the erfc
 * range (≤ 3e-16 at x = 10) and about 2^{9/2}·|d|⁹/√9! in the erf range (≤ 1e-22): below the
 * rounding of the polynomial sum, so the table functions carry a few ulp, like Cody's (the tests
 * check them against @stdlib's erf and erfc, test/core/lattice/erfLattice.test.ts). Above x = 10 the table is
 * not used: erfc there comes from Cody's erfc (../special/erf.ts, with its split exponential, a few ulp).
 *
 * Cost: one table index and a degree-8 polynomial (Estrin's scheme; no exp, no division), against
 * Cody's exp and degree-8 rational function.
 */
import { erf, erfc } from '../special/erf';

const INV_H = 128;
const H = 1 / INV_H;
/** coefficients per node: degrees 0…8 */
const STRIDE = 9;
/** nodes 0 … NODES−1 cover [0, 10 − h/2); above that the Cody fallback */
const NODES = 10 * INV_H;
/** round(x·128) ≥ 64 ⇔ x ≥ 63.5/128: the erfc nodes */
const SPLIT = 64;
/** |x| above this lies in the erfc part of the table (or beyond it) */
export const ERF_TABLE_SPLIT = (SPLIT - 0.5) / INV_H;
const TABLE_TOP = (NODES - 0.5) / INV_H;
const TWO_OVER_SQRT_PI = 1.1283791670955126;

function buildTable(): Float64Array {
  const t = new Float64Array(NODES * STRIDE);
  const herm = new Float64Array(STRIDE);
  for (let k = 0; k < NODES; k++) {
    const x = k * H; // exact; x² exact too
    // H_0 … H_7 at x
    herm[0] = 1;
    herm[1] = 2 * x;
    for (let n = 1; n < STRIDE - 2; n++) herm[n + 1] = 2 * x * herm[n] - 2 * n * herm[n - 1];
    const g = TWO_OVER_SQRT_PI * Math.exp(-x * x);
    const isErf = k < SPLIT;
    const base = k * STRIDE;
    t[base] = isErf ? erf(x) : erfc(x);
    let fact = 1;
    for (let n = 1; n < STRIDE; n++) {
      fact *= n;
      // d^n erf / dx^n = (2/√π)(−1)^{n−1} H_{n−1}(x) e^{−x²}; erfc's is its negative
      const dn = (n % 2 === 1 ? 1 : -1) * g * herm[n - 1];
      t[base + n] = (isErf ? dn : -dn) / fact;
    }
  }
  return t;
}

const T = buildTable();

/**
 * The table polynomial at x (0 ≤ x < TABLE_TOP): erf(x) below the split, erfc(x) above it. Estrin's
 * scheme (pairs of terms, then d² and d⁴): the same polynomial as Horner's with about half its chain of
 * dependent operations; with |d| ≤ 1/256 each term is far below the one before, so the rounding
 * is that of the last additions, a few ulp as Horner's.
 */
function tablePoly(x: number): number {
  const k = (x * INV_H + 0.5) | 0;
  const d = x - k * H;
  const b = k * STRIDE;
  const d2 = d * d;
  const d4 = d2 * d2;
  const p01 = T[b] + T[b + 1] * d;
  const p23 = T[b + 2] + T[b + 3] * d;
  const p45 = T[b + 4] + T[b + 5] * d;
  const p67 = T[b + 6] + T[b + 7] * d;
  const p03 = p01 + p23 * d2;
  const p47 = p45 + p67 * d2;
  return p03 + (p47 + T[b + 8] * d4) * d4;
}

/**
 * The split value at y ≥ 0: erf(y) below ERF_TABLE_SPLIT, erfc(y) from it on (relative accuracy
 * either way; erfLattice.ts builds on it).
 */
export function splitValue(y: number): number {
  return y < TABLE_TOP ? tablePoly(y) : erfc(y);
}
