/**
 * The benchmark's inputs: one invented screening scenario (not a real site), built before any clock
 * starts. Values are plausible for a sandy aquifer (K, porosity within the ranges in
 * docs/field-values.md; dispersivity ratios αy = αx/10, αz = αx/100, common practice).
 */
import type { ScreeningModel } from '../src/core/model';

/** seepage velocity v = K·i/nₑ with K = 12 m/d, i = 0.004, nₑ = 0.2 → 0.24 m/d */
export const V = (12 * 0.004) / 0.2;
export const AX = 10;
export const AY = 1;
export const AZ = 0.1;
export const R = 1.8;
/** half-life 2 years (730 d) */
export const DECAY = Math.LN2 / 730;
export const WIDTH = 30;
export const THICKNESS = 4;
/** evaluation depth below the water table, m, and time, d (10 years) */
export const Z = 1;
export const T = 3652.5;
export const X_MAX = 800;
export const Y_HALF = 150;

/** nx columns at x = X_MAX·(i + 1)/nx (x = 0 is the source plane itself, left out). */
export function gridXs(nx: number): Float64Array {
  const xs = new Float64Array(nx);
  for (let i = 0; i < nx; i++) xs[i] = (X_MAX * (i + 1)) / nx;
  return xs;
}

/**
 * ny values across the flow. symmetric: exactly mirrored about y = 0 (ys[j] = −ys[ny−1−j], bit for
 * bit), as a map grid centred on the plume axis is; otherwise the same spacing shifted by 0.37 of
 * a step, so no value mirrors another.
 */
export function gridYs(ny: number, symmetric: boolean): Float64Array {
  const ys = new Float64Array(ny);
  const dy = (2 * Y_HALF) / (ny - 1);
  for (let j = 0; j < ny; j++) {
    const k = j - (ny - 1) / 2;
    ys[j] = symmetric ? k * dy : (k + 0.37) * dy;
  }
  if (symmetric) for (let j = 0; j < ny >> 1; j++) ys[j] = -ys[ny - 1 - j];
  return ys;
}

/** The scenario as a ScreeningModel (internal units m, d, mg/L). */
export function benchModel(solution: ScreeningModel['solution']): ScreeningModel {
  return {
    v: V,
    ax: AX,
    ay: AY,
    az: AZ,
    diffusion: 0,
    R,
    decay: DECAY,
    decayPhase: 'dissolved-and-sorbed',
    width: WIDTH,
    thickness: THICKNESS,
    c0: 5,
    sourceDecay: 0,
    duration: Infinity,
    solution,
  };
}

export interface BenchWell {
  readonly x: number;
  readonly y: number;
  readonly zTop: number;
  readonly zBottom: number;
}

/** Ten invented monitoring and supply wells downgradient, with screens of 1–6 m. */
export function benchWells(): BenchWell[] {
  const wells: BenchWell[] = [];
  for (let k = 0; k < 10; k++) {
    wells.push({
      x: 40 + 55 * k,
      y: ((k % 5) - 2) * 9,
      zTop: 0.5 + 0.3 * (k % 3),
      zBottom: 0.5 + 0.3 * (k % 3) + 1 + (k % 6),
    });
  }
  return wells;
}

/** n times from 30 d to 30 years, evenly spaced. */
export function benchTimes(n: number): Float64Array {
  const times = new Float64Array(n);
  const t0 = 30;
  const t1 = 30 * 365.25;
  for (let k = 0; k < n; k++) times[k] = t0 + ((t1 - t0) * k) / (n - 1);
  return times;
}
