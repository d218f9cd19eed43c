/**
 * Error functions on an evenly spaced lattice u_j = u0 + j·du (j = 0 … n−1): the spreading factors
 * of map grids, where every column needs erf at evenly spaced arguments (y_j ± W/2)/s.
 *
 * Representation ("split values", as erfTable.ts): for |u| < ERF_TABLE_SPLIT (≈ 0.496) the value is
 * erf(u), signed; from there on erfc(|u|). Each keeps its relative accuracy where it is small, and
 * differences erf(a) − erf(b) formed from two of them within one tail keep it too (lateralLattice in
 * solutions/spread.ts; as erfDiff in erf.ts does).
 *
 * Method: neighbouring lattice values differ by (2/√π)∫ e^{−t²} dt over one step, accumulated in
 * the direction in which the value grows (erfc from the outer tail inwards, erf from 0 outwards),
 * so every sum is of positive terms. Each step integral is an m-point Gauss–Legendre rule
 * (m = 4, 6 or 8, the smallest whose remainder bound below is met, per chunk of points). At the
 * nodes a_k + j·s of step j the Gaussian factorises,
 *   e^{−(a_k + js)²} = [e^{−a_k²}·(e^{−2a_k s})^j] · e^{−s²j²},
 * so a step costs m + 2 multiplications and no exponential: the bracket is carried per node, the
 * last factor (shared by all nodes) by Q ← Q·Qr, Qr ← Qr·e^{−2s²}; a chunk starts with m + 1
 * exponentials (e^{−2a_k s} = e^{−2 ws s}·e^{−2c_k s²}, the second factor once per run). Every chunk of at most
 * CHUNK = 64 points restarts from a value of the table (erfTable.ts, a few ulp) and fresh
 * exponentials, and is shortened so that no carried factor leaves [e^{−600}, e^{600}].
 *
 * Error (stated; test/core/erf-lattice.test.ts measures it against 40-digit decimal.js values):
 *  - quadrature: Gauss–Legendre's remainder δ^{2m+1}(m!)⁴/((2m+1)((2m)!)³)·f^{(2m)}(ξ), with
 *    f^{(2m)} = H_{2m}(t)e^{−t²} and |H_{2m}(t)| ≤ (2|t| + 2√(2m))^{2m}; relative to the step's
 *    integral (whose integrand differs from e^{−ξ²} by at most e^{δ(2|t| + δ)}) the rule is used
 *    only where that bound is ≤ 1e-15;
 *  - carried products: their rounding repeats systematically, so after j steps a factor carries up
 *    to about j²·ε/2 relative error, ≤ 2.3e-13 for j < 64;
 *  - the seed: a few ulp.
 *  So each value is within 5e-13 of its own magnitude. Chunks for which no rule meets the bound
 *  (coarse lattices) are evaluated point by point from the table (a few ulp); |u| > LATTICE_CUT = 10
 *  by Cody's single-exponential erfcTail (erf.ts), within 2u²ε ≤ 1.6e-13 relative (u < 27).
 */
import { ERF_TABLE_SPLIT, splitValue } from './erfTable';
import { erfcTail } from './erf';

export { ERF_TABLE_SPLIT };
export const LATTICE_CUT = 10;
const CHUNK = 64;
/** carried factors stay within e^{±EXP_ROOM} */
const EXP_ROOM = 600;
const TWO_OVER_SQRT_PI = 1.1283791670955126;
const S = ERF_TABLE_SPLIT;

interface Rule {
  readonly m: number;
  /** nodes on [0, 1] and weights summing to 1 */
  readonly c: Float64Array;
  readonly w: Float64Array;
  /** C_m = (m!)⁴/((2m+1)((2m)!)³) */
  readonly Cm: number;
}

/** Gauss–Legendre nodes by Newton's method on the three-term recurrence. */
function legendreRule(m: number): Rule {
  const c = new Float64Array(m);
  const w = new Float64Array(m);
  for (let i = 0; i < m; i++) {
    let x = Math.cos((Math.PI * (i + 0.75)) / (m + 0.5));
    let dp = 0;
    for (let it = 0; it < 100; it++) {
      let p0 = 1;
      let p1 = x;
      for (let k = 2; k <= m; k++) {
        const p2 = ((2 * k - 1) * x * p1 - (k - 1) * p0) / k;
        p0 = p1;
        p1 = p2;
      }
      dp = (m * (x * p1 - p0)) / (x * x - 1);
      const dx = p1 / dp;
      x -= dx;
      if (Math.abs(dx) < 1e-17) break;
    }
    c[i] = 0.5 * (1 - x);
    w[i] = 1 / ((1 - x * x) * dp * dp); // (2/((1−x²)P′²))/2 on [0, 1]
  }
  let fact = 1;
  for (let k = 2; k <= m; k++) fact *= k;
  let fact2 = fact;
  for (let k = m + 1; k <= 2 * m; k++) fact2 *= k;
  return { m, c, w, Cm: fact ** 4 / ((2 * m + 1) * fact2 ** 3) };
}

const RULES = [legendreRule(4), legendreRule(6), legendreRule(8)];
/** D_k of the rule in use (see run) */
const D = new Float64Array(8);

/**
 * Per rule, the largest X = δ·(2|t| + 2√(2m)) with C_m·X^{2m}·e^{X} ≤ 1e-15 (e^{X} ≥ e^{δ(2|t| + δ)}
 * covers the integrand's variation over a step, as δ ≤ 2√(2m)); by bisection, once.
 */
const REACH = RULES.map((r) => {
  const f = (X: number) => Math.log(r.Cm) + 2 * r.m * Math.log(X) + X - Math.log(1e-15);
  let lo = 1e-6;
  let hi = 50;
  for (let k = 0; k < 200; k++) {
    const mid = 0.5 * (lo + hi);
    if (f(mid) <= 0) lo = mid;
    else hi = mid;
  }
  return lo;
});
const NODE_PAD = RULES.map((r) => 2 * Math.sqrt(2 * r.m));

/** The smallest rule whose remainder bound is ≤ 1e-15 for steps δ at |t| ≤ tmax, or −1. */
function ruleFor(delta: number, tmax: number): number {
  for (let r = 0; r < RULES.length; r++) if (delta * (2 * tmax + NODE_PAD[r]) <= REACH[r] && delta <= NODE_PAD[r]) return r;
  return -1;
}

// The three chunk functions are the same loop written out per rule on purpose: with the node state
// in scalar locals it runs several times faster than with the state in arrays (measured with
// npm run bench). `steps` step integrals from the seed value `val` at out[o].

/** One chunk with the 4-point rule. */
function chunk4(ws: number, s: number, steps: number, val: number, out: Float64Array, o: number, di: number, scale: number, D: Float64Array, Qr0: number): void {
  const c = RULES[0].c;
  const w = RULES[0].w;
  const E = Math.exp(-2 * ws * s);
  let a = 0;
  a = ws + c[0] * s;
  let P0 = w[0] * Math.exp(-a * a);
  const B0 = E * D[0];
  a = ws + c[1] * s;
  let P1 = w[1] * Math.exp(-a * a);
  const B1 = E * D[1];
  a = ws + c[2] * s;
  let P2 = w[2] * Math.exp(-a * a);
  const B2 = E * D[2];
  a = ws + c[3] * s;
  let P3 = w[3] * Math.exp(-a * a);
  const B3 = E * D[3];
  let Q = scale;
  let Qr = Qr0;
  const q2 = Qr0 * Qr0;
  for (let r = 0; r < steps; r++) {
    val += Q * ((P0 + P1) + (P2 + P3));
    o += di;
    out[o] = val;
    P0 *= B0; P1 *= B1; P2 *= B2; P3 *= B3;
    Q *= Qr;
    Qr *= q2;
  }
}

/** One chunk with the 6-point rule. */
function chunk6(ws: number, s: number, steps: number, val: number, out: Float64Array, o: number, di: number, scale: number, D: Float64Array, Qr0: number): void {
  const c = RULES[1].c;
  const w = RULES[1].w;
  const E = Math.exp(-2 * ws * s);
  let a = 0;
  a = ws + c[0] * s;
  let P0 = w[0] * Math.exp(-a * a);
  const B0 = E * D[0];
  a = ws + c[1] * s;
  let P1 = w[1] * Math.exp(-a * a);
  const B1 = E * D[1];
  a = ws + c[2] * s;
  let P2 = w[2] * Math.exp(-a * a);
  const B2 = E * D[2];
  a = ws + c[3] * s;
  let P3 = w[3] * Math.exp(-a * a);
  const B3 = E * D[3];
  a = ws + c[4] * s;
  let P4 = w[4] * Math.exp(-a * a);
  const B4 = E * D[4];
  a = ws + c[5] * s;
  let P5 = w[5] * Math.exp(-a * a);
  const B5 = E * D[5];
  let Q = scale;
  let Qr = Qr0;
  const q2 = Qr0 * Qr0;
  for (let r = 0; r < steps; r++) {
    val += Q * (((P0 + P1) + (P2 + P3)) + (P4 + P5));
    o += di;
    out[o] = val;
    P0 *= B0; P1 *= B1; P2 *= B2; P3 *= B3; P4 *= B4; P5 *= B5;
    Q *= Qr;
    Qr *= q2;
  }
}

/** One chunk with the 8-point rule. */
function chunk8(ws: number, s: number, steps: number, val: number, out: Float64Array, o: number, di: number, scale: number, D: Float64Array, Qr0: number): void {
  const c = RULES[2].c;
  const w = RULES[2].w;
  const E = Math.exp(-2 * ws * s);
  let a = 0;
  a = ws + c[0] * s;
  let P0 = w[0] * Math.exp(-a * a);
  const B0 = E * D[0];
  a = ws + c[1] * s;
  let P1 = w[1] * Math.exp(-a * a);
  const B1 = E * D[1];
  a = ws + c[2] * s;
  let P2 = w[2] * Math.exp(-a * a);
  const B2 = E * D[2];
  a = ws + c[3] * s;
  let P3 = w[3] * Math.exp(-a * a);
  const B3 = E * D[3];
  a = ws + c[4] * s;
  let P4 = w[4] * Math.exp(-a * a);
  const B4 = E * D[4];
  a = ws + c[5] * s;
  let P5 = w[5] * Math.exp(-a * a);
  const B5 = E * D[5];
  a = ws + c[6] * s;
  let P6 = w[6] * Math.exp(-a * a);
  const B6 = E * D[6];
  a = ws + c[7] * s;
  let P7 = w[7] * Math.exp(-a * a);
  const B7 = E * D[7];
  let Q = scale;
  let Qr = Qr0;
  const q2 = Qr0 * Qr0;
  for (let r = 0; r < steps; r++) {
    val += Q * (((P0 + P1) + (P2 + P3)) + ((P4 + P5) + (P6 + P7)));
    o += di;
    out[o] = val;
    P0 *= B0; P1 *= B1; P2 *= B2; P3 *= B3; P4 *= B4; P5 *= B5; P6 *= B6; P7 *= B7;
    Q *= Qr;
    Qr *= q2;
  }
}

/** Split value at u (signed erf for |u| < split, erfc(|u|) beyond; single-exponential past the cut). */
function pointValue(u: number): number {
  const y = Math.abs(u);
  const v = y > LATTICE_CUT ? erfcTail(y) : splitValue(y);
  return y < S && u < 0 ? -v : v;
}

/**
 * Points p = 0 … count−1 at w_p = w0 + p·s (s = ±du, the direction in which the value grows; all
 * |w_p| on one side of the split and ≤ LATTICE_CUT) into out[i0 + p·di], as sign·splitValue(|w_p|).
 */
function run(w0: number, s: number, count: number, out: Float64Array, i0: number, di: number, sign: number): void {
  const as = Math.abs(s);
  const scale = TWO_OVER_SQRT_PI * as * sign;
  // per-run constants: e^{−s²} and, for the rule in use, D_k = e^{−2c_k s²} (B_k = e^{−2 ws s}·D_k)
  const Qr0 = Math.exp(-s * s);
  let dRule = -1;
  let p = 0;
  while (p < count) {
    const ws = w0 + p * s;
    const o = i0 + p * di;
    let val = sign * splitValue(Math.abs(ws));
    out[o] = val;
    // chunk length: CHUNK points, fewer where a carried factor would leave e^{±EXP_ROOM}
    const tStart = Math.abs(ws);
    let len = Math.min(count - p, CHUNK);
    const tEnd = Math.abs(w0 + (p + len - 1) * s);
    const tmax = Math.max(tStart, tEnd) + as;
    const room = Math.min(Math.sqrt(EXP_ROOM) / as, EXP_ROOM / (2 * tmax * as));
    if (room < len) len = Math.max(2, Math.floor(room));
    const r = len > 1 ? ruleFor(as, tmax) : -1;
    if (r < 0) {
      for (let q = 1; q < len; q++) out[o + q * di] = sign * splitValue(Math.abs(ws + q * s));
    } else {
      if (r !== dRule) {
        const c = RULES[r].c;
        for (let k = 0; k < c.length; k++) D[k] = Math.exp(-2 * c[k] * s * s);
        dRule = r;
      }
      if (r === 0) chunk4(ws, s, len - 1, val, out, o, di, scale, D, Qr0);
      else if (r === 1) chunk6(ws, s, len - 1, val, out, o, di, scale, D, Qr0);
      else chunk8(ws, s, len - 1, val, out, o, di, scale, D, Qr0);
    }
    p += len;
  }
}

/**
 * First j ≥ from (and ≤ n) with u0 + j·du > lim (inclusive = true: the points equal to lim stay
 * below) or ≥ lim (inclusive = false).
 */
function boundary(u0: number, du: number, n: number, lim: number, from: number, inclusive: boolean): number {
  let j = Math.min(n, Math.max(from, Math.floor((lim - u0) / du)));
  if (inclusive) {
    while (j > from && u0 + (j - 1) * du > lim) j--;
    while (j < n && u0 + j * du <= lim) j++;
  } else {
    while (j > from && u0 + (j - 1) * du >= lim) j--;
    while (j < n && u0 + j * du < lim) j++;
  }
  return j;
}

/**
 * Split values (see the header) at u_j = u0 + j·du, j = 0 … n−1, into out[0 … n−1]; du > 0.
 */
export function erfLattice(u0: number, du: number, n: number, out: Float64Array): void {
  if (n <= 0) return;
  if (!(du > 0) || n < 4) {
    for (let j = 0; j < n; j++) out[j] = pointValue(u0 + j * du);
    return;
  }
  // index boundaries: [0, jc) below −cut, [jc, jL) left tail, [jL, j0) middle negative,
  // [j0, jR) middle non-negative, [jR, jC) right tail, [jC, n) beyond the cut
  const jc = boundary(u0, du, n, -LATTICE_CUT, 0, false);
  const jL = boundary(u0, du, n, -S, jc, true);
  const j0 = boundary(u0, du, n, 0, jL, false);
  const jR = boundary(u0, du, n, S, j0, false);
  const jC = boundary(u0, du, n, LATTICE_CUT, jR, true);
  for (let j = 0; j < jc; j++) out[j] = pointValue(u0 + j * du);
  for (let j = jC; j < n; j++) out[j] = pointValue(u0 + j * du);
  // left tail: erfc(−u) grows with j (−u falls by du per step)
  if (jL > jc) run(-(u0 + jc * du), -du, jL - jc, out, jc, 1, 1);
  // middle, negative side: −erf(−u); |u| grows as j falls
  if (j0 > jL) run(-(u0 + (j0 - 1) * du), du, j0 - jL, out, j0 - 1, -1, -1);
  // middle, non-negative side: erf(u) grows with j
  if (jR > j0) run(u0 + j0 * du, du, jR - j0, out, j0, 1, 1);
  // right tail: erfc(u) grows as j falls
  if (jC > jR) run(u0 + (jC - 1) * du, -du, jC - jR, out, jC - 1, -1, 1);
}
