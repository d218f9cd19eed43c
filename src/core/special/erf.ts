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

const A = [3.1611237438705656, 113.864154151050156, 377.485237685302021, 3209.37758913846947, 0.185777706184603153];
const B = [23.6012909523441209, 244.024637934444173, 1282.61652607737228, 2844.23683343917062];
const C = [
  0.564188496988670089, 8.88314979438837594, 66.1191906371416295, 298.635138197400131, 881.95222124176909,
  1712.04761263407058, 2051.07837782607147, 1230.33935479799725, 2.15311535474403846e-8,
];
const D = [
  15.7449261107098347, 117.693950891312499, 537.181101862009858, 1621.38957456669019, 3290.79923573345963,
  4362.61909014324716, 3439.36767414372164, 1230.33935480374942,
];
const P = [
  0.305326634961232344, 0.360344899949804439, 0.125781726111229246, 0.0160837851487422766,
  6.58749161529837803e-4, 0.0163153871373020978,
];
const Q = [2.56852019228982242, 1.87295284992346047, 0.527905102951428412, 0.0605183413124413191, 0.00233520497626869185];

const THRESH = 0.46875;
const INV_SQRT_PI = 0.56418958354775628695;
/** above this erfc(x) underflows to zero */
const XBIG = 26.543;
/** above this the 1/(x√π) term alone is exact in double precision */
const XHUGE = 6.71e7;

/** erf(x)/x·… for |x| ≤ 0.46875: returns erf(x). */
function erfSmall(x: number): number {
  const z = x * x;
  let num = A[4] * z;
  let den = z;
  for (let i = 0; i < 3; i++) {
    num = (num + A[i]) * z;
    den = (den + B[i]) * z;
  }
  return (x * (num + A[3])) / (den + B[3]);
}

/** exp(y²)·erfc(y) for 0.46875 < y ≤ 4 (unscaled rational part). */
function erfcxMid(y: number): number {
  let num = C[8] * y;
  let den = y;
  for (let i = 0; i < 7; i++) {
    num = (num + C[i]) * y;
    den = (den + D[i]) * y;
  }
  return (num + C[7]) / (den + D[7]);
}

/** exp(y²)·erfc(y) for y > 4. */
function erfcxLarge(y: number): number {
  if (y >= XHUGE) return INV_SQRT_PI / y;
  const z = 1 / (y * y);
  let num = P[5] * z;
  let den = z;
  for (let i = 0; i < 4; i++) {
    num = (num + P[i]) * z;
    den = (den + Q[i]) * z;
  }
  const r = (z * (num + P[4])) / (den + Q[4]);
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
