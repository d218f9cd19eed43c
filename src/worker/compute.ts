/**
 * What the workers compute, as plain functions (tested in Node, run in the workers):
 * - evaluateCase: whole-case screening (src/case/screen.ts) plus breakthrough curves at every
 *   receptor and the centreline profile, both solutions, in internal units.
 * - plumeForCase: the concentration lattice at the view time on the flow-aligned frame
 *   (core concentrationGrid), filled contours at the limit and its multiples (src/geo/contours.ts
 *   over d3-contour), mapped to the case's map coordinates and packed into typed arrays.
 * No DOM here: both run under the WebWorker lib (tsconfig.worker.json).
 */
import type { Case } from '../case/schema';
import { screenCase } from '../case/screen';
import { prepareCase, type PreparedCase } from '../case/prepare';
import { breakthroughCurve, concentrationGrid, plumeLength, sampleTimes, concentration, type ScreeningModel } from '../core';
import { contourBands, packContours } from '../geo/contours';
import type { Evaluation, PlumeLayer, ReceptorRow, WellsLayer } from './protocol';
import { headWarnings as headWarningsOf, mapCaptureZones, receptorHeads } from '../case/wells';
import { mapHeadContours } from '../case/headContours';
import { unitSystem } from '../case/unitSystem';

const now = (): number => (typeof performance !== 'undefined' ? performance.now() : Date.now());

/** The limit and these multiples of it are drawn (when below the source concentration). */
export const BAND_MULTIPLES = [1, 10, 100, 1000] as const;

export function evaluateCase(c: Case): Evaluation {
  const t0 = now();
  const s = screenCase(c);
  const p = s.prepared;
  const t1 = now();
  const other = p.model.solution === 'domenico' ? 'exact' : 'domenico';
  const otherApplies = other === 'exact' || p.model.v > 0;
  const curveTimes = sampleTimes(p.horizon, 60);
  const receptors: ReceptorRow[] = s.results.map(({ receptor, result }) => {
    const { en: _en, pumping: _pumping, ...place } = receptor;
    return {
      ...place,
      ...result,
      warnings: result.warnings.map((w) => ({ ...w })),
      curve: Array.from(breakthroughCurve(p.model, receptor, curveTimes)),
      curveAlternate: otherApplies ? Array.from(breakthroughCurve(p.model, receptor, curveTimes, other)) : null,
    };
  });
  const profile = centrelineProfile(p, s.plumeLength.atViewTime, otherApplies ? other : null);
  const t2 = now();
  const dr = p.derived.dispersivityRelation;
  return {
    caseId: c.id,
    caseStamp: c.modified,
    solution: p.model.solution,
    limit: p.limit,
    horizon: p.horizon,
    viewTime: p.viewTime,
    derived: {
      v: p.derived.v,
      R: p.derived.R,
      kd: p.derived.kd,
      ax: p.derived.ax,
      ay: p.derived.ay,
      az: p.derived.az,
      decay: p.derived.decay,
      gradient: p.derived.gradient,
      azimuthDeg: p.derived.azimuthDeg,
      width: p.derived.width,
      dispersivityRelation: dr.mode === 'estimate' ? (dr.citation ?? dr.relation) : null,
      dispersivityScale: dr.scaleDistance,
      widthFromFootprint: p.derived.widthFromFootprint,
      headFit: p.derived.headFit ? { residuals: [...p.derived.headFit.residuals], readingIds: [...p.derived.headFit.readingIds] } : null,
    },
    curveTimes,
    receptors,
    plumeLength: s.plumeLength.atViewTime,
    plumeLengthSteady: s.plumeLength.steady,
    profile,
    plume: null,
    wells: wellsLayer(s, c),
    warnings: s.warnings.map((w) => ({ ...w })),
    caution: s.caution,
    timing: { screenMs: t1 - t0, curvesMs: t2 - t1 },
  };
}

/** The well field's figures and capture zones for the screen (see WellsLayer). */
function wellsLayer(s: ReturnType<typeof screenCase>, c: Case): WellsLayer | null {
  const w = s.wells;
  if (!w.field || w.thickness === null) return null;
  let zones: WellsLayer['zones'] = [];
  let zoneError: string | null = null;
  try {
    zones = mapCaptureZones(s.prepared, w);
  } catch (e) {
    zoneError = e instanceof Error ? e.message : String(e);
  }
  const heads = receptorHeads(s.prepared, w);
  const headWarnings = headWarningsOf(s.prepared, w, heads, c).map((x) => x.message);
  const t0 = now();
  const headContours = mapHeadContours(s.prepared, w, unitSystem(c));
  const headContoursMs = now() - t0;
  return { thickness: w.thickness, captures: s.captures.map((x) => ({ ...x })), zones, zoneError, heads, headWarnings, headContours, headContoursMs };
}

/**
 * Centreline (y = 0, map depth) concentrations at the view time, out to half as far again as the
 * plume at the limit at that time, and to the receptors within four times that distance (a
 * receptor farther out would squeeze the plume against the axis; the chart lists it at its end).
 * With no plume above the limit: out to the farthest receptor, or ten source widths.
 */
function centrelineProfile(p: PreparedCase, viewLength: number | null, other: 'domenico' | 'exact' | null): Evaluation['profile'] {
  const xs0 = p.receptors.map((r) => r.x).filter((x) => x > 0);
  const near = viewLength === null ? xs0 : xs0.filter((x) => x <= 4 * viewLength);
  const far = Math.max(...near, 0);
  const x1 = viewLength !== null ? Math.max(1.5 * viewLength, 1.1 * far, 10) : Math.max(1.1 * far, 10 * p.model.width, 10);
  const n = 120;
  const xs: number[] = [];
  for (let k = 1; k <= n; k++) xs.push((x1 * k) / n);
  const t = p.viewTime;
  const at = (m: ScreeningModel) => xs.map((x) => concentration(m, { x, y: 0, z: p.depth }, t));
  return {
    xs,
    values: at(p.model),
    alternate: other ? at({ ...p.model, solution: other }) : null,
    time: t,
  };
}

export interface Lattice {
  xs: Float64Array;
  ys: Float64Array;
  extent: PlumeLayer['extent'];
}

/**
 * The flow-aligned lattice for the map: x from a hair upgradient of the source plane (where the
 * solutions give zero, so the bands close along the plane) to past the plume's reach at the
 * horizon (or steady state) and the farthest receptor; y symmetric, wide enough for the source
 * width plus four transverse spreading lengths 2·√(αT·x) at the far end and every receptor.
 * Sized for the horizon, so the frame stays put while the time slider moves.
 */
export function latticeFor(p: PreparedCase, gridSize: number): Lattice {
  const m = p.model;
  const reachT = Number.isFinite(p.viewTime) ? p.horizon : Infinity;
  const reach = plumeLength(m, p.limit, p.depth, reachT) ?? 0;
  const far = Math.max(0, ...p.receptors.map((r) => r.x));
  const x1 = Math.max(1.15 * reach, 1.1 * far, 4 * m.width, 20);
  // the first column lies a hair upgradient of the source plane (where the solutions give 0), so the
  // bands close along the plane itself rather than a whole lattice step upgradient of it
  const n0 = Math.max(8, Math.floor(gridSize));
  const x0 = -x1 / (1000 * (n0 - 1));
  const spread = 4 * 2 * Math.sqrt(m.ay * x1);
  const side = Math.max(...p.receptors.map((r) => Math.abs(r.y) * 1.15), 0);
  const y1 = Math.max(m.width / 2 + spread, side, m.width);
  const n = Math.max(8, Math.floor(gridSize));
  const xs = new Float64Array(n);
  const ys = new Float64Array(n);
  for (let i = 0; i < n; i++) xs[i] = x0 + ((x1 - x0) * i) / (n - 1);
  // exactly symmetric (ys[j] = −ys[n−1−j] bit for bit), so the engine mirrors the lateral term
  for (let j = 0; j < Math.ceil(n / 2); j++) {
    const y = -y1 + (2 * y1 * j) / (n - 1);
    ys[j] = y;
    ys[n - 1 - j] = -y;
  }
  if (n % 2 === 1) ys[(n - 1) / 2] = 0;
  return { xs, ys, extent: { x0, x1, y0: -y1, y1 } };
}

/** cropToBands' output buffer, reused from call to call */
let cropBuffer = new Float64Array(0);

/**
 * The part of the lattice that holds every node at or above `lowest`, with one more node on each
 * side (clamped to the lattice). The bands it gives are the full lattice's exactly: marching
 * squares only draws through cells with a node at or above the threshold, and every such cell is
 * inside the crop. Contouring then costs in proportion to the plume, not the lattice.
 * The cropped values live in a buffer that the next call reuses: use them before cropping again.
 */
export function cropToBands(
  values: Float64Array,
  xs: Float64Array,
  ys: Float64Array,
  lowest: number,
): { values: Float64Array; xs: Float64Array; ys: Float64Array } | null {
  const nx = xs.length, ny = ys.length;
  let i0 = nx, i1 = -1, j0 = ny, j1 = -1;
  for (let i = 0; i < nx; i++) {
    const row = i * ny;
    for (let j = 0; j < ny; j++) {
      if (values[row + j] >= lowest) {
        if (i < i0) i0 = i;
        if (i > i1) i1 = i;
        if (j < j0) j0 = j;
        if (j > j1) j1 = j;
      }
    }
  }
  if (i1 < 0) return null;
  i0 = Math.max(0, i0 - 1);
  i1 = Math.min(nx - 1, i1 + 1);
  j0 = Math.max(0, j0 - 1);
  j1 = Math.min(ny - 1, j1 + 1);
  const cx = i1 - i0 + 1, cy = j1 - j0 + 1;
  if (cx < 2 || cy < 2) return { values, xs, ys };
  if (cropBuffer.length < cx * cy) cropBuffer = new Float64Array(Math.max(cx * cy, values.length));
  const out = cropBuffer.subarray(0, cx * cy);
  for (let i = 0; i < cx; i++) out.set(values.subarray((i0 + i) * ny + j0, (i0 + i) * ny + j1 + 1), i * cy);
  return { values: out, xs: xs.subarray(i0, i1 + 1), ys: ys.subarray(j0, j1 + 1) };
}

export function bandThresholds(limit: number, c0: number): number[] {
  return BAND_MULTIPLES.map((k) => k * limit).filter((t) => t < c0);
}

/** performance.now() as milliseconds since the epoch, comparable across the page and its workers */
export const epochNow = (): number => (typeof performance !== 'undefined' ? performance.timeOrigin + performance.now() : Date.now());

/** The lattice values of the last plume, kept for the next (a worker redraws many times a second). */
let gridBuffer = new Float64Array(0);

/**
 * Contours at time t (d; Infinity: steady state) on a gridSize × gridSize lattice, as packed map
 * coordinates (src/geo/contours.ts PackedBands: typed arrays the worker transfers, not clones);
 * `plumeGeoJSON(layer)` (src/ui/results.ts) gives them as RFC 7946 GeoJSON for export.
 * `prepared` and `lattice` may be passed in when the caller already has them for this case.
 */
export function plumeForCase(c: Case, t: number | null, gridSize: number, lattice?: Lattice, prepared?: PreparedCase): PlumeLayer {
  const startedAt = epochNow();
  const t0 = now();
  const p = prepared ?? prepareCase(c);
  const time = t ?? p.viewTime;
  const lat = lattice ?? latticeFor(p, gridSize);
  const t1 = now();
  const n = lat.xs.length * lat.ys.length;
  if (gridBuffer.length !== n) gridBuffer = new Float64Array(n);
  const values = concentrationGrid(p.model, lat.xs, lat.ys, p.depth, time, { into: gridBuffer });
  const t2 = now();
  const thresholds = bandThresholds(p.limit, p.model.c0);
  const crop = thresholds.length ? cropToBands(values, lat.xs, lat.ys, thresholds[0]) : null;
  const bands = crop ? contourBands({ ...crop, thresholds }) : thresholds.map((threshold) => ({ threshold, polygons: [] }));
  const packed = packContours(bands, p.toMap);
  const t3 = now();
  return {
    caseStamp: c.modified,
    solution: p.model.solution,
    time,
    depth: p.depth,
    limit: p.limit,
    thresholds,
    bands: packed,
    extent: lat.extent,
    gridSize: lat.xs.length,
    timing: { prepareMs: t1 - t0, gridMs: t2 - t1, contourMs: t3 - t2, totalMs: t3 - t0, startedAt, finishedAt: epochNow() },
  };
}
