/**
 * Independent reference for the exact rectangular-source solution (Wexler 1992, USGS TWRI 3-B7,
 * finite patch source with an image about the water table z = 0; v and D divided by R):
 *
 *   C/C0 = ∫₀ᵗ f(τ) · Y(y, τ) · Z(z, τ) dτ
 *   f(τ) = x/(2√(πDxτ³)) · exp(−λτ − (x − vτ)²/(4Dxτ))
 *   Y    = ½[erf((y + W/2)/(2√(Dyτ))) − erf((y − W/2)/(2√(Dyτ)))]
 *   Z    = ½[erf((z + H)/(2√(Dzτ))) − erf((z − H)/(2√(Dzτ)))]
 *
 * Quadrature: tanh-sinh (Takahasi & Mori 1974) on subintervals of (0, t] split around the mode
 * of f (an inverse-Gaussian density, mode μ[√(1 + 9μ²/4κ²) − 3μ/2κ] with μ = x/v, κ = x²/(2Dx),
 * spread √(μ³/κ)), the step halved until two levels agree to 1e-12 relative per piece. Written
 * here, sharing nothing with src/core: the error function is @stdlib's, the variable is τ itself
 * (the engine substitutes its cumulative), the rule is double-exponential (the engine's is
 * Gauss–Kronrod). Its own accuracy is checked against the decimal.js Ogata–Banks reference.
 */
import stdlibErfc from '@stdlib/math-base-special-erfc';
import type { patchSourceExact } from '../../../src/core/index';

/** The contract's input shape (a type only; no engine code is used here). */
export type PatchCase = { -readonly [K in keyof Parameters<typeof patchSourceExact>[0]]: Parameters<typeof patchSourceExact>[0][K] };

/** ½[erf((c + h)/s) − erf((c − h)/s)] without cancellation, h ≥ 0, s > 0. */
export function spreadFactor(c: number, h: number, s: number): number {
  const a = (c - h) / s;
  const b = (c + h) / s;
  if (a >= 0) return 0.5 * (stdlibErfc(a) - stdlibErfc(b));
  if (b <= 0) return 0.5 * (stdlibErfc(-b) - stdlibErfc(-a));
  return 0.5 * (2 - stdlibErfc(-a) - stdlibErfc(b));
}

export interface Retarded {
  v: number;
  Dx: number;
  Dy: number;
  Dz: number;
  lam: number;
}

export function retarded(p: PatchCase): Retarded {
  const R = p.R ?? 1;
  const v = p.v / R;
  return { v, Dx: p.ax * v, Dy: p.ay * v, Dz: p.az * v, lam: p.decay ?? 0 };
}

/** First-passage density f(τ) with the decay weight. */
export function passageDensity(tau: number, x: number, r: Retarded): number {
  if (!(tau > 0)) return 0;
  const lnf =
    Math.log(x) - Math.LN2 - 0.5 * Math.log(Math.PI * r.Dx) - 1.5 * Math.log(tau) - r.lam * tau - (x - r.v * tau) ** 2 / (4 * r.Dx * tau);
  return Math.exp(lnf);
}

/** Lateral × vertical factor at travel time τ. */
export function spreadAt(tau: number, p: PatchCase, r: Retarded): number {
  const Y = spreadFactor(p.y, p.width / 2, 2 * Math.sqrt(r.Dy * tau));
  const Z = spreadFactor(p.z, p.thickness, 2 * Math.sqrt(r.Dz * tau));
  return Y * Z;
}

/** tanh-sinh on [a, b] to `rel` relative (or `abs`), returns the estimate. */
export function tanhSinh(g: (t: number) => number, a: number, b: number, rel = 1e-12, abs = 1e-300): number {
  const half = 0.5 * (b - a);
  const HALF_PI = Math.PI / 2;
  const term = (u: number) => {
    const sh = HALF_PI * Math.sinh(u);
    const ch = Math.cosh(sh);
    const w = (HALF_PI * Math.cosh(u)) / (ch * ch);
    if (!(w > 0)) return 0;
    // distance of the node from the nearer end, half·(1 − tanh|sh|), formed without cancellation
    const d = half / (Math.exp(Math.abs(sh)) * ch);
    const node = sh >= 0 ? b - d : a + d;
    const fx = node > a && node < b ? g(node) : 0;
    return half * w * fx;
  };
  const U = 3.5; // |u| ≤ 3.5: weights below 1e-300 beyond
  let h = 0.5;
  let sum = term(0);
  for (let k = 1; k * h <= U; k++) sum += term(k * h) + term(-k * h);
  let estimate = h * sum;
  for (let level = 0; level < 14; level++) {
    h /= 2;
    for (let k = 1; k * h <= U; k += 2) sum += term(k * h) + term(-k * h);
    const next = h * sum;
    if (Math.abs(next - estimate) <= rel * Math.abs(next) + abs && level >= 2) return next;
    estimate = next;
  }
  throw new Error(`tanhSinh: no convergence on [${a}, ${b}] (last ${estimate})`);
}

/** Breakpoints around the bulk of f on (0, t). */
export function breakpoints(x: number, r: Retarded, t: number): number[] {
  const mu = x / r.v;
  const kappa = (x * x) / (2 * r.Dx);
  const mode = mu * (Math.sqrt(1 + (9 * mu * mu) / (4 * kappa * kappa)) - (3 * mu) / (2 * kappa));
  const spread = Math.sqrt((mu * mu * mu) / kappa);
  const pts = new Set<number>();
  for (const k of [-16, -8, -4, -2, -1, -0.5, 0, 0.5, 1, 2, 4, 8, 16, 32, 64]) pts.add(mode + k * spread);
  for (let e = -10; e <= 12; e++) pts.add(mode * 2 ** e);
  return [...pts].filter((p) => p > 0 && p < t).sort((p, q) => p - q);
}

/** Reference C/C0 of the exact patch-source solution (relative accuracy ~1e-10 and better). */
export function patchReference(p: PatchCase): number {
  const r = retarded(p);
  if (!(p.t > 0) || !(p.x > 0)) throw new Error('reference needs x > 0 and t > 0');
  const g = (tau: number) => {
    const f = passageDensity(tau, p.x, r);
    return f === 0 ? 0 : f * spreadAt(tau, p, r);
  };
  const cuts = [0, ...breakpoints(p.x, r, p.t), p.t];
  let total = 0;
  for (let i = 0; i + 1 < cuts.length; i++) total += tanhSinh(g, cuts[i], cuts[i + 1]);
  return total;
}
