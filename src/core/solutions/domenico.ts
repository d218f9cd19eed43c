/**
 * Domenico (1987) approximation for a vertical rectangular source plane at the water table
 * (Domenico 1987, J. Hydrology 91, 49–58; Domenico & Robbins 1985, Ground Water 23(4)),
 * with retardation and first-order decay:
 *
 *   C/C0 = ⅛ · exp[x(v − u)/(2Dx)] · erfc[(x − ut)/(2√(Dx t))]
 *            · [erf((y + W/2)/(2√(αy x))) − erf((y − W/2)/(2√(αy x)))]
 *            · [erf((z + H)/(2√(αz x))) − erf((z − H)/(2√(αz x)))],     u = √(v² + 4λDx)
 *
 * with v, Dx already divided by R. Approximation, and what it departs from: only the first
 * Ogata–Banks term is kept, and the lateral/vertical spreading is evaluated at the advective
 * time x/v instead of the true travel time (the "x for vt" substitution). Departures from the
 * exact solution grow with αx/x, at early times and off the centreline (West, Kueper & Ungs
 * 2007, Ground Water 45(2); Srinivasan, Clement & Lee 2007, Ground Water 45(2)); the engine
 * therefore reports the exact figure beside it. Molecular diffusion enters as an effective
 * dispersivity αᵢ + De/v (an approximation, stated in the report).
 *
 * On the flow-aligned grid the three factors separate: an x-only term (one erfc per column), an
 * x–z term (two erf per column) and an x–y term (two erf per cell; one when the y values are
 * symmetric about 0, by mirroring). So a grid costs at most two error-function calls per cell.
 * When the y values are evenly spaced (as on map lattices) the lateral arguments of a column are
 * themselves a lattice, and its error functions come from the lattice error function (../lattice):
 * no exponential per cell, 5e-13 relative accuracy (instead of Cody's few ulp), with the lattice
 * arguments u0 + j·du differing from (y_j ± W/2)/s by the rounding of the y values (≤ 8ε·max|y|).
 */
import { depthFactor, erfRatioSafe, spreadFactor, uniformStep, type DepthSpan } from './spread';
import { lateralLattice } from '../lattice';
import { erfDiff } from '../special/erf';
import { pistonCdf, scaledCdf, uMinusV } from './oneD';
import { normalQuantile } from '../uncertainty/normal';

export interface DomenicoParams {
  /** retarded velocity v/R (> 0) */
  readonly v: number;
  /** retarded longitudinal dispersion coefficient Dx/R (αx·v/R + De/R) */
  readonly Dx: number;
  /** effective transverse dispersivities αy + De/v, αz + De/v (m) */
  readonly ay: number;
  readonly az: number;
  readonly lam: number;
  readonly width: number;
  readonly thickness: number;
}

/** The x-only factor: ½·e^{x(v−u)/2Dx}·erfc((x − ut)/(2√(Dx t))) times e^{logScale}; 1 at steady state limit. */
export function domenicoXTerm(x: number, t: number, p: DomenicoParams, logScale = 0): number {
  if (!(t > 0) || x < 0) return 0; // upgradient of the source plane: no transport represented
  if (x === 0) return Math.exp(logScale);
  if (p.Dx === 0) return Math.exp(logScale) * pistonCdf(x, t, p.v, p.lam);
  return scaledCdf(x, t, p.v, p.Dx, p.lam, logScale, true);
}

/** Lateral factor at (x, y): ½[erf((y + W/2)/(2√(αy x))) − erf((y − W/2)/(2√(αy x)))]. */
export function domenicoYTerm(x: number, y: number, p: DomenicoParams): number {
  const s = 2 * Math.sqrt(p.ay * Math.max(x, 0));
  const h = 0.5 * p.width;
  return spreadFactor(y, h, s);
}

/** Vertical factor at x for a depth or screen. */
export function domenicoZTerm(x: number, depth: DepthSpan, p: DomenicoParams): number {
  const s = 2 * Math.sqrt(p.az * Math.max(x, 0));
  return depthFactor(depth, p.thickness, s);
}

/**
 * The lateral and vertical factors of a point or screen at x (their product, which does not
 * depend on time): a breakthrough, an arrival or a peak computes it once and then one x-term per
 * time (domenicoAtSpread).
 */
export function domenicoSpread(x: number, y: number, depth: DepthSpan, p: DomenicoParams): number {
  return domenicoYTerm(x, y, p) * domenicoZTerm(x, depth, p);
}

/** C/C0 at x and time t (and log scale), given the product of its lateral and vertical factors (domenicoSpread). */
export function domenicoAtSpread(x: number, spread: number, t: number, p: DomenicoParams, logScale: number): number {
  const X = domenicoXTerm(x, t, p, logScale);
  return X === 0 ? 0 : X * spread;
}

/**
 * The first time C/C0 reaches `level` at a point downgradient (x > 0) of a continuous source of
 * constant concentration, in closed form; null when it never does (level at or above the steady
 * value) or when the closed form does not apply (no dispersion, no transport: Dx = 0 or u = 0,
 * where the caller searches the curve instead).
 *
 * Only the x-term depends on t, and it rises monotonically, so with S = Y·Z (the `spread`, the
 * lateral and vertical factors at x) and w = u − v:
 *   ½·e^{−xw/(2Dx)}·erfc(a)·S = level  ⇔  erfc(a) = q = 2·level·e^{xw/(2Dx)}/S,
 *   a = −Φ⁻¹(q/2)/√2                      (erfc(a) = 2Φ(−a√2)),
 * and a = (x − u·t)/(2√(Dx·t)) gives, with s = √t, u·s² + 2a√Dx·s − x = 0, whose positive root is
 * taken in the form without cancellation (x / (a√Dx + √(a²Dx + ux)) for a ≥ 0). Accuracy: that
 * of Φ⁻¹ (AS 241, about 1e-16 relative) and of the few operations after it; the closed form
 * replaces a root search on the curve (its tolerance 1e-6 of the horizon).
 */
export function domenicoLevelTime(x: number, spread: number, p: DomenicoParams, level: number): number | null {
  const w = uMinusV(p.v, p.Dx, p.lam);
  const u = p.v + w;
  if (!(x > 0) || !(p.Dx > 0) || !(u > 0)) return null;
  const q = (2 * level * Math.exp((x * w) / (2 * p.Dx))) / spread;
  if (!(q < 2)) return null; // at or above the steady value (or spread 0): never reached
  const a = -normalQuantile(0.5 * q) * Math.SQRT1_2;
  const rootD = Math.sqrt(p.Dx);
  const disc = Math.sqrt(a * a * p.Dx + u * x);
  const s = a >= 0 ? x / (a * rootD + disc) : (disc - a * rootD) / u;
  return s * s;
}

/** True when ys is exactly symmetric about zero (ys[j] = −ys[n−1−j]). */
export function isSymmetric(ys: ArrayLike<number>): boolean {
  const n = ys.length;
  for (let j = 0; j < n; j++) if (ys[j] !== -ys[n - 1 - j]) return false;
  return true;
}

/**
 * Grid of C/C0 at (xs[i], ys[j]) → out[i·ny + j], each in [0, 1]: the x and z factors are ≤ 1 and
 * the lateral difference of error functions is kept in [0, 2] against rounding.
 */
export function domenicoGridInto(
  xs: ArrayLike<number>,
  ys: ArrayLike<number>,
  depth: DepthSpan,
  t: number,
  p: DomenicoParams,
  logScale: number,
  out: Float64Array,
): void {
  const nx = xs.length;
  const ny = ys.length;
  const sym = ny > 1 && isSymmetric(ys);
  const jStart = sym ? Math.floor(ny / 2) : 0;
  const dy = uniformStep(ys);
  const h = 0.5 * p.width;
  for (let i = 0; i < nx; i++) {
    const x = xs[i];
    const row = i * ny;
    const X = domenicoXTerm(x, t, p, logScale);
    const Z = X === 0 ? 0 : domenicoZTerm(x, depth, p);
    const XZ = 0.5 * Math.min(1, X * Z); // each factor ≤ 1; kept so against rounding
    if (XZ === 0) {
      for (let j = 0; j < ny; j++) out[row + j] = 0;
      continue;
    }
    const s = 2 * Math.sqrt(p.ay * Math.max(x, 0));
    if (s > 0 && dy > 0) {
      lateralLattice(ys[0], dy, ny, h, s, sym, jStart, XZ, out, row); // writes the mirrored half too
      continue;
    }
    if (s > 0) {
      const inv = 1 / s;
      for (let j = jStart; j < ny; j++) {
        const y = ys[j];
        const d = erfDiff((y + h) * inv, (y - h) * inv);
        out[row + j] = XZ * (d > 0 ? (d < 2 ? d : 2) : 0);
      }
    } else {
      for (let j = jStart; j < ny; j++) out[row + j] = XZ * (erfRatioSafe(ys[j] + h, s) - erfRatioSafe(ys[j] - h, s));
    }
    if (sym) for (let j = 0; j < jStart; j++) out[row + j] = out[row + ny - 1 - j];
  }
}
