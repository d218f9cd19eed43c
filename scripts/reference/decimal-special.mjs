/**
 * Arbitrary-precision reference evaluations with decimal.js, independent of the engine in src/core.
 * Used by erf-fixtures.mjs (to write test/fixtures/erf.json) and directly by the tests in test/core.
 *
 * Methods (textbook, no code shared with src/core):
 *  - erf(a), |a| < 5: the all-positive Maclaurin-type series
 *      erf(a) = (2a/√π) e^{−a²} Σ_{n≥0} (2a²)ⁿ / (1·3·5···(2n+1))        (Abramowitz & Stegun 7.1.6)
 *    summed at a working precision raised by a²/ln 10 digits, so 1 − erf keeps its digits.
 *  - erfcx(a) = e^{a²} erfc(a), a ≥ 5: the continued fraction
 *      2 e^{a²} ∫_a^∞ e^{−t²} dt = 1/(a+ (1/2)/(a+ 1/(a+ (3/2)/(a+ 2/(a+ …)))))   (A&S 7.1.14)
 *    evaluated backwards with N terms, N doubled until two evaluations agree to the working precision.
 *  - negative arguments by reflection: erfc(−a) = 2 − erfc(a), erfcx(−a) = 2e^{a²} − erfcx(a).
 *  - exactDecimal(x): the exact decimal value of a binary64 number (BigInt mantissa · 5^k / 10^k),
 *    so the reference is the function at the double the engine actually receives.
 */
import Decimal from 'decimal.js';

const SERIES_LIMIT = 5;

/** A decimal.js constructor with `digits` significant digits and no exponent-range clipping. */
export function makeDecimal(digits) {
  return Decimal.clone({
    precision: digits,
    rounding: Decimal.ROUND_HALF_EVEN,
    toExpNeg: -9e15,
    toExpPos: 9e15,
    maxE: 9e15,
    minE: -9e15,
  });
}

/** Exact decimal value of the binary64 number x (finite). */
export function exactDecimal(D, x) {
  if (!Number.isFinite(x)) throw new Error(`exactDecimal: non-finite ${x}`);
  if (x === 0) return new D(0);
  const view = new DataView(new ArrayBuffer(8));
  view.setFloat64(0, x);
  const hi = view.getUint32(0);
  const lo = view.getUint32(4);
  const negative = hi >>> 31 === 1;
  const expBits = (hi >>> 20) & 0x7ff;
  let mant = (BigInt(hi & 0xfffff) << 32n) | BigInt(lo);
  let e;
  if (expBits === 0) e = -1074;
  else {
    mant |= 1n << 52n;
    e = expBits - 1075;
  }
  let text;
  if (e >= 0) text = (mant << BigInt(e)).toString();
  else text = `${(mant * 5n ** BigInt(-e)).toString()}e${e}`;
  const v = new D(text); // decimal.js keeps a constructed value unrounded
  return negative ? v.neg() : v;
}

function sqrtPi(D) {
  return D.acos(-1).sqrt();
}

/** erf(a) for |a| < SERIES_LIMIT by the positive series, at D's precision (relative). */
function erfSeries(D, a) {
  const extra = Math.ceil(a.toNumber() ** 2 / Math.LN10) + 10;
  const W = D.clone({ precision: D.precision + extra });
  const x = new W(a);
  if (x.isZero()) return new D(0);
  const x2 = x.times(x);
  const twoX2 = x2.times(2);
  const eps = new W(10).pow(-(W.precision + 2));
  let term = new W(1);
  let sum = new W(1);
  for (let n = 1; n < 1e6; n++) {
    term = term.times(twoX2).div(2 * n + 1);
    sum = sum.plus(term);
    if (term.lt(sum.times(eps))) break;
  }
  const r = x.times(2).div(sqrtPi(W)).times(x2.neg().exp()).times(sum);
  return new D(r);
}

/** erfcx(a) for a ≥ SERIES_LIMIT by the continued fraction. */
function erfcxFraction(D, a) {
  const W = D.clone({ precision: D.precision + 10 });
  const x = new W(a);
  const evaluate = (N) => {
    let t = x;
    for (let n = N; n >= 1; n--) t = x.plus(new W(n).div(2).div(t));
    return new W(1).div(sqrtPi(W).times(t));
  };
  let N = 16;
  let prev = evaluate(N);
  const tol = new W(10).pow(-(D.precision + 4));
  for (;;) {
    N *= 2;
    const next = evaluate(N);
    if (next.minus(prev).abs().lte(next.abs().times(tol))) return new D(next);
    if (N > 1 << 22) throw new Error(`erfcxFraction: no convergence at ${a}`);
    prev = next;
  }
}

/** erfc(a), a a Decimal (any sign), relative accuracy ≈ D.precision digits. */
export function erfcD(D, a) {
  const x = new D(a);
  if (x.isNeg()) return new D(2).minus(erfcD(D, x.neg()));
  if (x.lt(SERIES_LIMIT)) {
    const W = D.clone({ precision: D.precision + 12 });
    return new D(new W(1).minus(erfSeries(W, x)));
  }
  const W = D.clone({ precision: D.precision + 5 });
  return new D(erfcxFraction(W, x).times(new W(x).times(x).neg().exp()));
}

/** erf(a), relative accuracy ≈ D.precision digits. */
export function erfD(D, a) {
  const x = new D(a);
  if (x.isNeg()) return erfD(D, x.neg()).neg();
  if (x.lt(SERIES_LIMIT)) return erfSeries(D, x);
  return new D(1).minus(erfcD(D, x));
}

/** erfcx(a) = e^{a²} erfc(a), relative accuracy ≈ D.precision digits. */
export function erfcxD(D, a) {
  const x = new D(a);
  const W = D.clone({ precision: D.precision + 8 });
  if (x.isNeg()) {
    const y = new W(x).neg();
    return new D(y.times(y).exp().times(2).minus(erfcxD(W, y)));
  }
  if (x.lt(SERIES_LIMIT)) {
    const W2 = D.clone({ precision: D.precision + 12 });
    const y = new W2(x);
    return new D(erfcD(W2, y).times(y.times(y).exp()));
  }
  return erfcxFraction(D, x);
}

/** Both evaluation paths at one argument (for the generator's self-check in the overlap 4 ≤ a < 5). */
export function erfcBothWays(D, a) {
  const x = new D(a);
  const W = D.clone({ precision: D.precision + 12 });
  const bySeries = new D(new W(1).minus(erfSeries(W, x)));
  const byFraction = new D(erfcxFraction(D, x).times(x.times(x).neg().exp()));
  return { bySeries, byFraction };
}
