/**
 * One-dimensional advection–dispersion with first-order decay from a constant-concentration
 * boundary at x = 0 switched on at t = 0, semi-infinite column (Ogata & Banks 1961, USGS Prof.
 * Paper 411-A; with decay: van Genuchten & Alves 1982, USDA Tech. Bull. 1661, solution A1/B…):
 *
 *   F(x, t) = ½ [ e^{x(v−u)/2D} erfc((x − ut)/(2√(Dt))) + e^{x(v+u)/2D} erfc((x + ut)/(2√(Dt))) ],
 *   u = √(v² + 4λD)
 *
 * F is also the cumulative distribution (with the decay weight e^{−λτ}) of the first-passage time
 * of a particle to x, whose density is f(τ) = x/(2√(πDτ³))·exp(−(x − vτ)²/(4Dτ) − λτ). The exact
 * three-dimensional solution integrates against that measure (see patchSource.ts).
 *
 * Stability: with a = (x − ut)/(2√(Dt)), b = (x + ut)/(2√(Dt)) and w = u − v = 4λD/(u + v),
 * both terms share the factor e^{−a² − xw/2D}:  F = ½ e^{−xw/2D − a²} [erfcx(a) + erfcx(b)] for a ≥ 0,
 * and F = ½ e^{−xw/2D} erfc(a) + ½ e^{−xw/2D − a²} erfcx(b) for a < 0. No exp(large)·erfc(large)
 * product is ever formed, so the result is accurate at any Peclet number. scaledCdf multiplies it by
 * e^{logScale} inside that one exponential (a declining source's e^{−γt}), which Domenico's x-term uses.
 *
 * Inputs here are already retarded (v/R, D/R) and λ is the effective rate; no validation
 * (callers validate). λ may be negative (a declining source folded into the decay) provided
 * v² + 4λD > 0; then w < 0.
 */
import { erfc, erfcx } from '../special/erf';

export interface OneDParams {
  readonly v: number;
  readonly D: number;
  readonly lam: number;
}

/** u − v computed without cancellation. Requires v² + 4λD ≥ 0. */
export function uMinusV(v: number, D: number, lam: number): number {
  if (lam === 0 || D === 0) return 0;
  const u = Math.sqrt(v * v + 4 * lam * D);
  return (4 * lam * D) / (u + v);
}

/**
 * e^{logScale}·F(x, t) for x > 0, t > 0 (t may be Infinity), D > 0, the scale folded into the one
 * exponential (so a large factor and a small F never meet as separate numbers). `firstTermOnly`
 * gives the Domenico x-term (the first term alone).
 */
export function scaledCdf(x: number, t: number, v: number, D: number, lam: number, logScale: number, firstTermOnly = false): number {
  const w = uMinusV(v, D, lam);
  const u = v + w;
  const decayLog = logScale - (x * w) / (2 * D);
  if (t === Infinity) {
    // erfc(−∞) = 2 (when u > 0); second term → 0. With u = 0 (v = 0, λ = 0): ½·(1 + 1) = 1.
    return Math.exp(u > 0 ? decayLog : logScale);
  }
  const s = 2 * Math.sqrt(D * t);
  const a = (x - u * t) / s;
  if (a >= 0) {
    const sum = firstTermOnly ? erfcx(a) : erfcx(a) + erfcx((x + u * t) / s);
    return 0.5 * Math.exp(decayLog - a * a) * sum;
  }
  const first = erfc(a);
  const second = firstTermOnly ? 0 : Math.exp(-a * a) * erfcx((x + u * t) / s);
  return 0.5 * Math.exp(decayLog) * (first + second);
}

/** F(x, t) itself (0 ≤ F; F ≤ 1 when λ ≥ 0), with the edge cases D = 0, x = 0, t = 0. */
export function cdf(x: number, t: number, v: number, D: number, lam: number, firstTermOnly = false): number {
  if (!(t > 0)) return x <= 0 ? 1 : 0;
  if (x <= 0) return 1;
  if (D === 0) return pistonCdf(x, t, v, lam);
  return scaledCdf(x, t, v, D, lam, 0, firstTermOnly);
}

/** D = 0: a sharp front at x = v t carrying e^{−λx/v}; half height at the front itself. */
export function pistonCdf(x: number, t: number, v: number, lam: number): number {
  if (!(v > 0)) return 0;
  const arrival = x / v;
  const level = Math.exp((-lam * x) / v);
  if (t > arrival) return level;
  if (t === arrival) return 0.5 * level;
  return 0;
}
