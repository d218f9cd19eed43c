/**
 * Error functions on an evenly spaced lattice u_j = u0 + j·du (j = 0 … n−1): the spreading factors
 * of map grids, where every column needs erf at evenly spaced arguments (y_j ± W/2)/s.
 *
 * Representation ("split values", as erfTable.ts): for |u| < ERF_TABLE_SPLIT (≈ 0.496) the value is
 * erf(u), signed; from there on erfc(|u|). Each keeps its relative accuracy where it is small, and
 * differences erf(a) − erf(b) formed from two of them within one tail keep it too (lateralLattice in
 * lateral.ts; as erfDiff in ../special/erf.ts does).
 *
 * Method: in the middle (|u| < the split) erf(u) comes point by point from its Taylor series
 * (erfNearZero, a few ulp: a dozen multiply–adds, cheaper there than starting a run). In each tail
 * neighbouring lattice values differ by (2/√π)∫ e^{−t²} dt over one step, accumulated in the
 * direction in which the value grows (erfc from the outer tail inwards), so every sum is of
 * positive terms. Each step integral is an m-point Gauss–Legendre rule
 * (m = 4, 6 or 8, the smallest whose remainder bound below is met, per chunk of points). At the
 * nodes a_k + j·s of step j the Gaussian factorises,
 *   e^{−(a_k + js)²} = [e^{−a_k²}·(e^{−2a_k s})^j] · e^{−s²j²},
 * so a step costs m + 2 multiplications and no exponential: the bracket is carried per node, the
 * last factor (shared by all nodes) by Q ← Q·Qr, Qr ← Qr·e^{−2s²}. A run is cut into segments of
 * at most SEGMENT = 192 steps; a segment starts from a value of the table (erfTable.ts, a few ulp)
 * with m + 1 exponentials (e^{−2a_k s} = e^{−2ws s}·e^{−2c_k s²}, the second factor once per step
 * size), and goes on in chunks of at most CHUNK = 64 steps, each of which forms Q and Qr afresh
 * (two exponentials) from the number J of steps since the seed. A segment ends where the rule
 * would change, and is shortened so that no carried factor leaves [e^{−600}, e^{600}].
 *
 * Error (stated; test/core/lattice/erfLattice.test.ts measures it against @stdlib's erf and erfc):
 *  - quadrature: Gauss–Legendre's remainder δ^{2m+1}(m!)⁴/((2m+1)((2m)!)³)·f^{(2m)}(ξ), with
 *    f^{(2m)} = H_{2m}(t)e^{−t²} and |H_{2m}(t)| ≤ Σ_k |h_k|·|t|^k (H_{2m}'s coefficients taken
 *    positive: a bound that increases with |t|); relative to the step's integral (whose integrand
 *    differs from e^{−ξ²} by at most e^{δ(2|t| + δ)}) the rule is used only where that bound is
 *    ≤ 1e-14 (a value, a sum of positive step integrals, then carries at most that), checked
 *    against a table of the largest step per rule at |t| = 0, 1/16, 2/16, … 14 (a step's |t|
 *    rounded up to the table, so the check errs on the safe side);
 *  - carried products: the node values P_k are multiplied by the same rounded B_k at every step
 *    (≤ 2.5 ε each, plus ε/2 per product), so after J ≤ 192 steps they carry ≤ 3Jε ≈ 1.3e-13; the
 *    rounding of Qr repeats within a chunk, so Q carries about j²ε/2 ≤ 2.3e-13 after j < 64 steps;
 *    the exponents of the fresh factors are rounded to ε·600 ≈ 7e-14 at most (the room above);
 *  - the seed: a few ulp; the running sum adds positive terms (≤ Jε ≈ 2e-14).
 *  So each value is within 0.1 + 1.3 + 2.3 + 0.7 + 0.2 ≈ 4.6e-13 < 5e-13 of its own magnitude.
 *  Chunks for which no rule meets the bound (coarse lattices) are evaluated point by point from the table (a few ulp); |u| > LATTICE_CUT = 10
 *  by Cody's single-exponential erfcTail (../special/erf.ts), within 2u²ε ≤ 1.6e-13 relative (u < 27).
 */
import { ERF_TABLE_SPLIT, splitValue } from './erfTable';
import { erfcTail } from '../special/erf';

export { ERF_TABLE_SPLIT };
export const LATTICE_CUT = 10;
const CHUNK = 64;
/** steps of one segment (one seed from the table) at most */
const SEGMENT = 192;
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
/**
 * Carried state of the chunk kernels, shared through this array rather than passed as arguments:
 * V8 boxes a floating-point argument of a call it does not inline into a fresh heap number.
 * [0, 8) node values P_k, [8, 16) their step factors B_k, then the running value, the scale
 * (2/√π)·|s|, s², e^{−s²} and e^{−2s²}.
 */
const ST = new Float64Array(21);
const P_VAL = 16;
const P_SCALE = 17;
const P_S2 = 18;
const P_QR0 = 19;
const P_Q2 = 20;
/** D_k = e^{−2c_k s²} per rule, and the |s| they were formed for (every run of a lattice shares |s|) */
const D = RULES.map((r) => new Float64Array(r.m));
const dStep = [NaN, NaN, NaN];

/** coefficients h_0 … h_n of the Hermite polynomial H_n (H_{k+1} = 2t·H_k − 2k·H_{k−1}) */
function hermiteCoefficients(n: number): number[] {
  let prev = [1];
  let cur = [0, 2];
  if (n === 0) return prev;
  for (let k = 1; k < n; k++) {
    const next = new Array<number>(k + 2).fill(0);
    for (let i = 0; i < cur.length; i++) next[i + 1] += 2 * cur[i];
    for (let i = 0; i < prev.length; i++) next[i] -= 2 * k * prev[i];
    prev = cur;
    cur = next;
  }
  return cur;
}

/** the step table's |t| grid: STEP_CELLS points per unit, up to STEP_TOP */
const STEP_CELLS = 16;
const STEP_TOP = 14;
const STEP_POINTS = STEP_TOP * STEP_CELLS + 1;
/**
 * STEP_MAX[r·STEP_POINTS + g]: the largest step δ for which rule r's bound above,
 * C_m·δ^{2m}·Σ|h_k|t^k·e^{δ(2t + δ)} ≤ 1e-14, holds at t = g/STEP_CELLS (by bisection, once).
 */
let STEP_MAX: Float64Array | null = null;

/**
 * STEP_MAX, built on first use (40 000 logarithms, a few ms: not charged to loading the module),
 * in one plain loop (a closure per point cost about twice as much).
 */
function stepTable(): Float64Array {
  const table = new Float64Array(RULES.length * STEP_POINTS);
  const logTarget = Math.log(1e-14);
  for (let k = 0; k < RULES.length; k++) {
    const r = RULES[k];
    const twoM = 2 * r.m;
    const h = hermiteCoefficients(twoM).map(Math.abs);
    const logCm = Math.log(r.Cm);
    for (let g = 0; g < STEP_POINTS; g++) {
      const t = g / STEP_CELLS;
      let major = 0;
      for (let i = h.length - 1; i >= 0; i--) major = major * t + h[i];
      const base = logCm + Math.log(major) - logTarget;
      let lo = 1e-9;
      let hi = 50;
      for (let it = 0; it < 60; it++) {
        const mid = 0.5 * (lo + hi);
        if (base + twoM * Math.log(mid) + mid * (2 * t + mid) <= 0) lo = mid;
        else hi = mid;
      }
      table[k * STEP_POINTS + g] = lo;
    }
  }
  return table;
}

/** The step table, built on first use. */
function stepMax(): Float64Array {
  if (STEP_MAX === null) STEP_MAX = stepTable();
  return STEP_MAX;
}

/** The smallest rule whose remainder bound is ≤ 1e-14 for steps δ at |t| ≤ tmax, or −1. */
function ruleFor(delta: number, tmax: number): number {
  if (!(tmax <= STEP_TOP)) return -1;
  const g = Math.ceil(tmax * STEP_CELLS);
  const table = STEP_MAX ?? stepMax();
  for (let r = 0; r < RULES.length; r++) if (delta <= table[r * STEP_POINTS + g]) return r;
  return -1;
}

/** Steps J from a seed that keep every carried factor within e^{±EXP_ROOM} (|t| ≤ tmax, step δ). */
function roomFor(delta: number, tmax: number): number {
  return Math.min(Math.sqrt(EXP_ROOM) / delta, EXP_ROOM / (2 * tmax * delta));
}

// The three chunk kernels are the same loop written out per rule on purpose: with the node state
// in scalar locals it runs several times faster than with the state in arrays (measured with
// npm run bench). A kernel takes `steps` steps on from the state in ST (the value at out[o]),
// writing out[o + di], …, out[o + steps·di]; J0 is the number of steps already taken since the
// seed, which fixes the Gaussian factor Q = scale·e^{−s²J0²} and its ratio e^{−s²(2J0+1)}.

/** Q and its ratio at J0 steps from the seed, into QQ[0], QQ[1]. */
const QQ = new Float64Array(2);
function gaussAt(J0: number): void {
  const st = ST;
  if (J0 === 0) {
    QQ[0] = st[P_SCALE];
    QQ[1] = st[P_QR0];
  } else {
    const s2 = st[P_S2];
    QQ[0] = st[P_SCALE] * Math.exp(-s2 * J0 * J0);
    QQ[1] = Math.exp(-s2 * (2 * J0 + 1));
  }
}

/** Kernel for the 4-point rule. */
function chunk4(steps: number, out: Float64Array, o: number, di: number, J0: number): void {
  const st = ST;
  gaussAt(J0);
  let Q = QQ[0];
  let Qr = QQ[1];
  const q2 = st[P_Q2];
  let P0 = st[0], P1 = st[1], P2 = st[2], P3 = st[3];
  const B0 = st[8], B1 = st[9], B2 = st[10], B3 = st[11];
  let val = st[P_VAL];
  for (let r = 0; r < steps; r++) {
    val += Q * ((P0 + P1) + (P2 + P3));
    o += di;
    out[o] = val;
    P0 *= B0; P1 *= B1; P2 *= B2; P3 *= B3;
    Q *= Qr;
    Qr *= q2;
  }
  st[0] = P0; st[1] = P1; st[2] = P2; st[3] = P3;
  st[P_VAL] = val;
}

/** Kernel for the 6-point rule. */
function chunk6(steps: number, out: Float64Array, o: number, di: number, J0: number): void {
  const st = ST;
  gaussAt(J0);
  let Q = QQ[0];
  let Qr = QQ[1];
  const q2 = st[P_Q2];
  let P0 = st[0], P1 = st[1], P2 = st[2], P3 = st[3], P4 = st[4], P5 = st[5];
  const B0 = st[8], B1 = st[9], B2 = st[10], B3 = st[11], B4 = st[12], B5 = st[13];
  let val = st[P_VAL];
  for (let r = 0; r < steps; r++) {
    val += Q * (((P0 + P1) + (P2 + P3)) + (P4 + P5));
    o += di;
    out[o] = val;
    P0 *= B0; P1 *= B1; P2 *= B2; P3 *= B3; P4 *= B4; P5 *= B5;
    Q *= Qr;
    Qr *= q2;
  }
  st[0] = P0; st[1] = P1; st[2] = P2; st[3] = P3; st[4] = P4; st[5] = P5;
  st[P_VAL] = val;
}

/** Kernel for the 8-point rule. */
function chunk8(steps: number, out: Float64Array, o: number, di: number, J0: number): void {
  const st = ST;
  gaussAt(J0);
  let Q = QQ[0];
  let Qr = QQ[1];
  const q2 = st[P_Q2];
  let P0 = st[0], P1 = st[1], P2 = st[2], P3 = st[3], P4 = st[4], P5 = st[5], P6 = st[6], P7 = st[7];
  const B0 = st[8], B1 = st[9], B2 = st[10], B3 = st[11], B4 = st[12], B5 = st[13], B6 = st[14], B7 = st[15];
  let val = st[P_VAL];
  for (let r = 0; r < steps; r++) {
    val += Q * (((P0 + P1) + (P2 + P3)) + ((P4 + P5) + (P6 + P7)));
    o += di;
    out[o] = val;
    P0 *= B0; P1 *= B1; P2 *= B2; P3 *= B3; P4 *= B4; P5 *= B5; P6 *= B6; P7 *= B7;
    Q *= Qr;
    Qr *= q2;
  }
  st[0] = P0; st[1] = P1; st[2] = P2; st[3] = P3; st[4] = P4; st[5] = P5; st[6] = P6; st[7] = P7;
  st[P_VAL] = val;
}

function kernel(rule: number, steps: number, out: Float64Array, o: number, di: number, J0: number): void {
  if (rule === 0) chunk4(steps, out, o, di, J0);
  else if (rule === 1) chunk6(steps, out, o, di, J0);
  else chunk8(steps, out, o, di, J0);
}

/** Split value at u (signed erf for |u| < split, erfc(|u|) beyond; single-exponential past the cut). */
function pointValue(u: number): number {
  const y = Math.abs(u);
  const v = y > LATTICE_CUT ? erfcTail(y) : splitValue(y);
  return y < S && u < 0 ? -v : v;
}

/**
 * erf(u) for |u| < ERF_TABLE_SPLIT (≈ 0.496) from its Taylor series, erf(u) = (2/√π)·Σ (−1)^n
 * u^{2n+1}/(n!(2n+1)) (Abramowitz & Stegun 7.1.5), terms n = 0 … 11 (the first omitted one is
 * below 4e-18 of the value there), coefficients correctly rounded (computed in 50-digit
 * arithmetic), summed by Estrin's scheme in z = u²: a few ulp.
 */
const ERF0 = [
  1.1283791670955126, -0.37612638903183754, 0.11283791670955126, -0.026866170645131252, 0.005223977625442188,
  -0.0008548327023450853, 0.00012055332981789664, -1.492565035840625e-5, 1.6462114365889248e-6,
  -1.6365844691234924e-7, 1.4807192815879218e-8, -1.2290555301717928e-9,
];
const [E0, E1, E2, E3, E4, E5, E6, E7, E8, E9, E10, E11] = ERF0;
export function erfNearZero(u: number): number {
  const z = u * u;
  const z2 = z * z;
  const z4 = z2 * z2;
  const p03 = E0 + E1 * z + (E2 + E3 * z) * z2;
  const p47 = E4 + E5 * z + (E6 + E7 * z) * z2;
  const p811 = E8 + E9 * z + (E10 + E11 * z) * z2;
  return u * (p03 + (p47 + p811 * z4) * z4);
}

/**
 * Seeds the node values of rule r at the point w (step s) into ST: P_k = w_k·e^{−(w + c_k s)²} and
 * B_k = e^{−2(w + c_k s)s} = e^{−2ws}·D_k.
 */
function seedNodes(r: number, w: number, s: number, val: number): void {
  const st = ST;
  const rule = RULES[r];
  const c = rule.c;
  const wt = rule.w;
  const d = D[r];
  const s2 = s * s;
  if (dStep[r] !== s2) {
    for (let k = 0; k < rule.m; k++) d[k] = Math.exp(-2 * c[k] * s2);
    dStep[r] = s2;
  }
  const E = Math.exp(-2 * w * s);
  for (let k = 0; k < rule.m; k++) {
    const a = w + c[k] * s;
    st[k] = wt[k] * Math.exp(-a * a);
    st[8 + k] = E * d[k];
  }
  st[P_VAL] = val;
}

/**
 * Points p = 0 … count−1 at w_p = w0 + p·s (s = ±du, the direction in which the value grows; all
 * |w_p| on one side of the split and ≤ LATTICE_CUT) into out[i0 + p·di], as splitValue(|w_p|).
 * The run is cut into segments, each seeded from the table at its first point and continued in
 * chunks of at most CHUNK steps (fresh Q at each chunk) while the rule stays the same, the carried
 * factors keep their room and the segment is at most SEGMENT steps long.
 */
function run(w0: number, s: number, count: number, out: Float64Array, i0: number, di: number): void {
  const as = Math.abs(s);
  const st = ST;
  st[P_SCALE] = TWO_OVER_SQRT_PI * as;
  let p = 0;
  while (p < count) {
    const ws = w0 + p * s;
    const o = i0 + p * di;
    const val = splitValue(Math.abs(ws));
    out[o] = val;
    if (p === count - 1) return;
    // the first chunk decides the rule; its steps are shortened to the room of the carried factors
    const t0 = Math.abs(ws);
    let len = Math.min(count - 1 - p, CHUNK);
    const tmax = Math.max(t0, Math.abs(w0 + (p + len) * s)) + as;
    const room = roomFor(as, tmax);
    if (room < len) len = Math.max(1, Math.floor(room));
    const r = ruleFor(as, tmax);
    if (r < 0) {
      for (let q = 1; q <= len; q++) out[o + q * di] = splitValue(Math.abs(ws + q * s));
      p += len;
      continue;
    }
    seedNodes(r, ws, s, val);
    kernel(r, len, out, o, di, 0);
    let J = len;
    p += len;
    // further chunks of the same segment
    while (p < count - 1 && J < SEGMENT) {
      const steps = Math.min(count - 1 - p, CHUNK, SEGMENT - J);
      const tEnd = Math.abs(w0 + (p + steps) * s);
      if (ruleFor(as, Math.max(Math.abs(w0 + p * s), tEnd) + as) !== r) break;
      if (J + steps > roomFor(as, Math.max(t0, tEnd) + as)) break;
      kernel(r, steps, out, i0 + p * di, di, J);
      J += steps;
      p += steps;
    }
    // the next segment is seeded afresh at p (whose value the last chunk wrote)
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
  // index boundaries: [0, jc) below −cut, [jc, jL) left tail, [jL, jR) middle (|u| < split),
  // [jR, jC) right tail, [jC, n) beyond the cut
  const jc = boundary(u0, du, n, -LATTICE_CUT, 0, false);
  const jL = boundary(u0, du, n, -S, jc, true);
  const jR = boundary(u0, du, n, S, jL, false);
  const jC = boundary(u0, du, n, LATTICE_CUT, jR, true);
  for (let j = 0; j < jc; j++) out[j] = pointValue(u0 + j * du);
  for (let j = jC; j < n; j++) out[j] = pointValue(u0 + j * du);
  // per-step constants shared by the four runs (all step by ±du)
  const s2 = du * du;
  if (ST[P_S2] !== s2) {
    ST[P_S2] = s2;
    ST[P_QR0] = Math.exp(-s2);
    ST[P_Q2] = Math.exp(-2 * s2);
  }
  // left tail: erfc(−u) grows with j (−u falls by du per step)
  if (jL > jc) run(-(u0 + jc * du), -du, jL - jc, out, jc, 1);
  // middle (|u| < split): erf(u) point by point from its Taylor series
  for (let j = jL; j < jR; j++) out[j] = erfNearZero(u0 + j * du);
  // right tail: erfc(u) grows as j falls
  if (jC > jR) run(u0 + (jC - 1) * du, -du, jC - jR, out, jC - 1, -1);
}
