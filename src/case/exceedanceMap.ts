/**
 * The probability that the concentration exceeds the limit on the map, at the map's time and
 * depth, from a Monte Carlo run's realisations: P(C > limit) at each node of a fixed lattice in the
 * case's own flow frame, estimated as the share of realisations above the limit there, and its
 * contours (5, 50 and 95 %) in map coordinates.
 *
 * The lattice is fixed for the whole run, so counts from any realisations add up (a worker counts
 * its ranges; the page sums them). A realisation whose flow direction (or traced source plane)
 * turned is evaluated at the same places on the ground: each node is carried into that
 * realisation's flow frame, as prepareCase would place a receptor there. Each node's estimate is a
 * binomial proportion over the realisations mapped, so its Monte Carlo standard error is
 * √(p(1 − p)/n), at most 0.5/√n (at p = ½); the legend states it.
 *
 * Cost: a lattice of EXCEEDANCE_GRID² nodes per realisation (the engine's separable grid when the
 * flow keeps its direction, point values when it turns). Only the first `mapped` realisations of
 * a run are mapped (MAP_REALISATIONS with the Domenico solution, fewer with the exact one): those
 * are still draws from the distributions (which strata a realisation uses does not depend on its
 * index), so the map is unbiased, with the standard error of that many.
 * Approximation: the lattice covers a few times the deterministic plume at the map's time; a
 * probability contour reaching its edge is closed along the edge (the legend says the extent).
 */
import type { ScreeningModel } from '../core/model';
import { concentrationGrid, concentrationsAt, plumeLength } from '../core';
import { sinCosDeg } from '../geo/angles';
import { contourBands, packContours, type PackedBands } from '../geo/contours';
import type { PreparedCase } from './prepare';

/** nodes along each side of the probability lattice */
export const EXCEEDANCE_GRID = 48;
/** realisations mapped at most (Domenico; a fifth of it with the exact solution) */
export const MAP_REALISATIONS = 2000;
/** the probability contours drawn */
export const EXCEEDANCE_LEVELS = [0.05, 0.5, 0.95] as const;

export interface ExceedanceGrid {
  /** flow-frame lattice of the case as prepared, m (node i·ys.length + j at xs[i], ys[j]) */
  readonly xs: Float64Array;
  readonly ys: Float64Array;
  /** each node's east/north position, m, for realisations whose frame turned */
  readonly east: Float64Array;
  readonly north: Float64Array;
  /** map time (d; Infinity: steady state), depth (m), limit (mg/L) */
  readonly time: number;
  readonly depth: number;
  readonly limit: number;
  /** realisations 0 … mapped − 1 of the run are mapped */
  readonly mapped: number;
}

/** A realisation's flow frame, when it differs from the prepared case's. */
export interface TurnedFrame {
  readonly sourceEN: readonly [number, number];
  readonly planeAzimuthDeg: number;
}

/** The lattice of a run: a few times the deterministic plume at the map's time, every receptor, and the source. */
export function exceedanceGrid(p: PreparedCase, runs: number): ExceedanceGrid {
  const m = p.model;
  const n = EXCEEDANCE_GRID;
  const length = plumeLength(m, p.limit, p.depth, p.viewTime) ?? 0;
  const far = Math.max(0, ...p.receptors.map((r) => r.x));
  const x1 = Math.max(3 * length, 1.3 * far, 20 * m.width, 50);
  const x0 = -x1 / (n - 1); // one step upgradient, so the contours close along the source plane
  const side = Math.max(0, ...p.receptors.map((r) => 1.3 * Math.abs(r.y)));
  const y1 = Math.max(m.width / 2 + 2 * 4 * Math.sqrt(m.ay * x1), side, m.width);
  const xs = Float64Array.from({ length: n }, (_, i) => x0 + ((x1 - x0) * i) / (n - 1));
  const ys = Float64Array.from({ length: n }, (_, j) => -y1 + (2 * y1 * j) / (n - 1));
  const east = new Float64Array(n * n);
  const north = new Float64Array(n * n);
  const [s, c] = sinCosDeg(p.derived.planeAzimuthDeg);
  for (let i = 0; i < n; i++)
    for (let j = 0; j < n; j++) {
      // geo/flowFrame.ts fromFlow about the prepared source
      east[i * n + j] = p.sourceEN[0] + xs[i] * s - ys[j] * c;
      north[i * n + j] = p.sourceEN[1] + xs[i] * c + ys[j] * s;
    }
  const cap = m.solution === 'exact' ? MAP_REALISATIONS / 5 : MAP_REALISATIONS;
  return { xs, ys, east, north, time: p.viewTime, depth: p.depth, limit: p.limit, mapped: Math.min(runs, cap) };
}

/** Scratch of one counter (a worker keeps one). */
export interface ExceedanceScratch {
  values: Float64Array;
  px: Float64Array;
  py: Float64Array;
}

export function exceedanceScratch(g: ExceedanceGrid): ExceedanceScratch {
  const n = g.xs.length * g.ys.length;
  return { values: new Float64Array(n), px: new Float64Array(n), py: new Float64Array(n) };
}

/** Add one realisation: counts[node] += 1 where its concentration exceeds the limit. */
export function countExceedance(g: ExceedanceGrid, model: ScreeningModel, turned: TurnedFrame | null, counts: Uint32Array, scratch: ExceedanceScratch): void {
  const { values } = scratch;
  if (!turned) concentrationGrid(model, g.xs, g.ys, g.depth, g.time, { into: values });
  else {
    // each node carried into the realisation's flow frame (geo/flowFrame.ts toFlow)
    const [s, c] = sinCosDeg(turned.planeAzimuthDeg);
    const [e0, n0] = turned.sourceEN;
    const { px, py } = scratch;
    for (let q = 0; q < px.length; q++) {
      const de = g.east[q] - e0;
      const dn = g.north[q] - n0;
      px[q] = de * s + dn * c;
      py[q] = -de * c + dn * s;
    }
    concentrationsAt(model, px, py, g.depth, g.time, values);
  }
  for (let q = 0; q < values.length; q++) if (values[q] > g.limit) counts[q]++;
}

export interface ExceedanceContours {
  readonly levels: readonly number[];
  /** contours of P ≥ each level, in map coordinates */
  readonly bands: PackedBands;
  /** realisations mapped (done, not refused) */
  readonly realisations: number;
  /** the largest Monte Carlo standard error of a node's probability, 0.5/√n */
  readonly maxStandardError: number;
  readonly time: number;
  /** the lattice's reach downgradient, m */
  readonly extent: number;
}

/** Contours of P(C > limit) from the summed counts over `realisations` mapped realisations. */
export function exceedanceContours(g: ExceedanceGrid, counts: Uint32Array, realisations: number, toMap: PreparedCase['toMap']): ExceedanceContours | null {
  if (realisations < 1) return null;
  const p = Float64Array.from(counts, (k) => k / realisations);
  const bands = packContours(contourBands({ values: p, xs: g.xs, ys: g.ys, thresholds: EXCEEDANCE_LEVELS }), toMap);
  return { levels: EXCEEDANCE_LEVELS, bands, realisations, maxStandardError: 0.5 / Math.sqrt(realisations), time: g.time, extent: g.xs[g.xs.length - 1] };
}
