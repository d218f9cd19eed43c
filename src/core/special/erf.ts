/**
 * Error function erf, complementary error function erfc and the scaled complementary error
 * function erfcx(x) = exp(x²)·erfc(x).
 *
 * Method: W. J. Cody's rational Chebyshev approximations (Cody 1969, "Rational Chebyshev
 * approximations for the error function", Math. Comp. 23, 631–637; coefficients as in his
 * public-domain SPECFUN routine CALERF):
 *   |x| ≤ 0.46875        erf(x)  = x·P₄(x²)/Q₄(x²)
 *   0.46875 < |x| ≤ 4    erfc(x) = exp(−x²)·P₈(x)/Q₈(x)
 *   |x| > 4              erfc(x) = exp(−x²)/x·(1/√π + R₅(1/x²))
 * In erfc, exp(−x²) is formed as exp(−x̃²)·exp(−(x−x̃)(x+x̃)) with x̃ = x rounded down to 1/16, so
 * the rounding of x² does not enter (Cody's device); erf, which needs erfc only to absolute
 * accuracy, uses one exp.
 *
 * Accuracy (Cody): relative error below 6e-19 in the approximations themselves; in double
 * precision the functions are good to a few ulp. The tests check them against a 40-digit
 * decimal.js evaluation and against @stdlib's independent implementations.
 *
 * Domain: all doubles. erfc underflows to 0 above x ≈ 26.55; erfcx(x) for x < −26.63 overflows
 * and returns Infinity (callers that can reach that range must avoid it; the transport
 * solutions only call erfcx with x ≥ 0). NaN in gives NaN out.
 */

const THRESH = 0.46875;
const INV_SQRT_PI = 0.56418958354775628695;
/** above this erfc(x) underflows to zero */
const XBIG = 26.543;
/** above this the 1/(x√π) term alone is exact in double precision */
const XHUGE = 6.71e7;

// The rational functions in Horner form with Cody's coefficients written out (CALERF's A, B; C, D;
// P, Q, highest degree first). Literal constants rather than a loop over coefficient arrays: the
// same operations in the same order (so the same values to the last bit), about twice as fast in
// V8, and the error function is the inner cost of every Domenico point and screen average.

/** erf(x) for |x| ≤ 0.46875: x·P₄(x²)/Q₄(x²). */
function erfSmall(x: number): number {
  const z = x * x;
  const num = (((0.185777706184603153 * z + 3.1611237438705656) * z + 113.864154151050156) * z + 377.485237685302021) * z + 3209.37758913846947;
  const den = (((z + 23.6012909523441209) * z + 244.024637934444173) * z + 1282.61652607737228) * z + 2844.23683343917062;
  return (x * num) / den;
}

/** exp(y²)·erfc(y) for 0.46875 < y ≤ 4 (unscaled rational part). */
function erfcxMid(y: number): number {
  const num =
    (((((((2.15311535474403846e-8 * y + 0.564188496988670089) * y + 8.88314979438837594) * y + 66.1191906371416295) * y + 298.635138197400131) * y +
      881.95222124176909) *
      y +
      1712.04761263407058) *
      y +
      2051.07837782607147) *
      y +
    1230.33935479799725;
  const den =
    (((((((y + 15.7449261107098347) * y + 117.693950891312499) * y + 537.181101862009858) * y + 1621.38957456669019) * y + 3290.79923573345963) * y +
      4362.61909014324716) *
      y +
      3439.36767414372164) *
      y +
    1230.33935480374942;
  return num / den;
}

/** exp(y²)·erfc(y) for y > 4. */
function erfcxLarge(y: number): number {
  if (y >= XHUGE) return INV_SQRT_PI / y;
  const z = 1 / (y * y);
  const num = ((((0.0163153871373020978 * z + 0.305326634961232344) * z + 0.360344899949804439) * z + 0.125781726111229246) * z + 0.0160837851487422766) * z + 6.58749161529837803e-4;
  const den = ((((z + 2.56852019228982242) * z + 1.87295284992346047) * z + 0.527905102951428412) * z + 0.0605183413124413191) * z + 0.00233520497626869185;
  const r = (z * num) / den;
  return (INV_SQRT_PI - r) / y;
}

/** exp(−y²) without the rounding error of forming y² (Cody's splitting), y ≥ 0. */
function expNegSquare(y: number): number {
  const ys = Math.floor(y * 16) / 16;
  const del = (y - ys) * (y + ys);
  return Math.exp(-ys * ys) * Math.exp(-del);
}

/** erfc(y) for y ≥ 0.46875 */
function erfcPositive(y: number): number {
  if (y >= XBIG) return 0;
  const scaled = y <= 4 ? erfcxMid(y) : erfcxLarge(y);
  return expNegSquare(y) * scaled;
}

/** The error function erf(x) = 2/√π ∫₀ˣ exp(−t²) dt. */
export function erf(x: number): number {
  if (x !== x) return NaN;
  const y = Math.abs(x);
  if (y <= THRESH) return erfSmall(x);
  // erfc(5.93) < 1.1e-16 = ε/2: erf rounds to ±1 from here on
  if (y >= 5.93) return x < 0 ? -1 : 1;
  // erf needs erfc only to absolute accuracy: a single exp(−y²) (relative error ≤ y²·ε) costs
  // at most 36ε·erfc(y) ≤ 4e-15 absolute here, below an ulp of erf for y > 0.46875.
  const r = 1 - Math.exp(-y * y) * (y <= 4 ? erfcxMid(y) : erfcxLarge(y));
  return x < 0 ? -r : r;
}

/**
 * w·erf(w) + e^{−w²}/√π, the antiderivative of erf (∫erf(w)dw) that screen averages take
 * differences of: the same value as writing it out with erf, with erf's own e^{−w²} serving the
 * second term too (one exponential instead of two).
 */
export function erfIntegral(w: number): number {
  const y = Math.abs(w); // w·erf(w) = |w|·erf(|w|)
  if (y <= THRESH) return w * erfSmall(w) + INV_SQRT_PI * Math.exp(-w * w);
  const e = Math.exp(-y * y);
  if (y >= 5.93) return y + INV_SQRT_PI * e; // erf rounds to ±1 (see erf)
  return y * (1 - e * (y <= 4 ? erfcxMid(y) : erfcxLarge(y))) + INV_SQRT_PI * e;
}

/** The complementary error function erfc(x) = 1 − erf(x), accurate in relative terms for large x. */
export function erfc(x: number): number {
  if (x !== x) return NaN;
  const y = Math.abs(x);
  if (y <= THRESH) return 1 - erfSmall(x);
  const r = erfcPositive(y);
  return x < 0 ? 2 - r : r;
}

/** The scaled complementary error function erfcx(x) = exp(x²)·erfc(x); no overflow for x ≥ 0. */
export function erfcx(x: number): number {
  if (x !== x) return NaN;
  const y = Math.abs(x);
  let r: number;
  if (y <= THRESH) {
    return Math.exp(x * x) * (1 - erfSmall(x));
  }
  r = y <= 4 ? erfcxMid(y) : erfcxLarge(y);
  if (x < 0) {
    if (x < -26.628) return Infinity;
    const ys = Math.floor(x * 16) / 16; // rounds toward −∞ for negative x; any split works
    const del = (x - ys) * (x + ys);
    const e = Math.exp(ys * ys) * Math.exp(del);
    r = e + e - r;
  }
  return r;
}

/**
 * erfc(y) for y ≥ 0.46875 with a single exp(−y²): relative error ≤ (y² + 4)·ε, i.e. below 1e-13 for
 * y < 27. Used where differences of error functions are formed (see erfDiff), where the last ulp
 * of Cody's split exponential is not worth its second exp.
 */
export function erfcTail(y: number): number {
  if (y >= XBIG) return 0;
  return Math.exp(-y * y) * (y <= 4 ? erfcxMid(y) : erfcxLarge(y));
}

/**
 * erf(a) − erf(b) without cancellation: when a and b lie on the same side beyond ±0.46875 the
 * difference is taken between complementary error functions, erfc(b) − erfc(a) (or the mirrored
 * form), so a difference of two numbers near ±1 keeps its relative accuracy (to ~1e-13). When
 * both arguments lie beyond ±10 the difference is below erfc(10) ≈ 2.1e-45 and is returned as 0.
 */
export function erfDiff(a: number, b: number): number {
  if (a > THRESH && b > THRESH) {
    // both beyond 10: |difference| < erfc(10) ≈ 2.1e-45, returned as 0
    if (a > 10 && b > 10) return 0;
    return erfcTail(b) - erfcTail(a);
  }
  if (a < -THRESH && b < -THRESH) {
    if (a < -10 && b < -10) return 0;
    return erfcTail(-a) - erfcTail(-b);
  }
  return erf(a) - erf(b);
}
