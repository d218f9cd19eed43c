/**
 * Lines of equal water level (equipotentials) of the steady well field, for the map: the
 * potentiometric surface where wells pump, drawn beside the capture zones.
 *
 * What is contoured: the head relative to the release (0 there) in the confined form the capture
 * zones and particles use (saturated thickness B held constant; core flow/heads.ts
 * `confinedHeadLattice`): the regional slope plus every well's cone with its images. Not drawdown:
 * the lines are the water table's (or piezometric surface's) shape, so the flow crosses them at
 * right angles. In the Dupuit–Forchheimer form (unconfined, thickness varying) the lines lie in the
 * same places (both forms are functions of the discharge potential alone), only their values
 * differ; the wells panel lists both at each receptor.
 *
 * Where: a square lattice around the release, the pumping wells and the nearest point of each
 * boundary line to each well, padded by the larger of 30 % of its span, twice the largest
 * stagnation distance Q/(2πqB) (Javandel & Tsang 1986) and 25 m.
 * Lines: at round intervals of the case's length unit (1, 2, 5 × 10ⁿ m or ft; about LINES_WANTED
 * over the head range of the lattice), drawn by the plume's own contouring (src/geo/contours.ts
 * `contourLines`: the band boundaries of d3-contour without the lattice edge), cut off beyond the
 * boundary lines (the image side has no meaning) and inside a clip circle around each pumping well.
 * Clip circle: the head falls as ln r towards a well (the line sink of the model is singular at its
 * centre); within CLIP_CELLS lattice spacings of a well (at least its radius) the lattice's head is
 * held at its value on that circle (core `potential`'s clipRadius), so the lattice has no NaN or
 * Infinity, and no line is drawn within one more diagonal of a lattice cell (`clipRadius`), where
 * marching squares would interpolate against a held node. So every drawn vertex comes from two
 * exact nodes, and the lines that crowd into the well are left out. The level at the well's face is
 * in the wells panel.
 */
import type { Position } from './schema';
import type { PreparedCase } from './prepare';
import type { CaseWells } from './wells';
import { confinedHeadLattice, DEFAULT_WELL_RADIUS, type FlowField } from '../core';
import { clipLines, contourLines, type Disk, type HalfPlane } from '../geo/contours';
import { gridStep, mapLengthUnit, type UnitSystem } from './unitSystem';

/** lattice nodes per side */
export const HEAD_LATTICE = 128;
/** the clip circle's radius in lattice spacings */
export const CLIP_CELLS = 2;
/** lines wanted over the head range (the interval is the 1-2-5 step at least range / LINES_WANTED) */
export const LINES_WANTED = 12;
/** never more lines than this (a very steep cone on a coarse interval cannot flood the map) */
const MAX_LINES = 40;

export interface HeadLevel {
  /** head relative to the release, m */
  readonly head: number;
  /** the level in the case's length unit, as written on the map: "-0.4 m", "0 ft" */
  readonly label: string;
  /** the line's pieces, map positions */
  readonly lines: Position[][];
}

export interface HeadContours {
  /** the form contoured (see the header) */
  readonly form: 'confined';
  /** the length unit of the labels and the interval */
  readonly unit: 'm' | 'ft';
  /** interval between lines, in `unit` */
  readonly step: number;
  /** no line within this distance of a pumping well, m */
  readonly clipRadius: number;
  /** the lattice's head is held at its value on the circle of this radius inside it, m */
  readonly heldWithin: number;
  readonly levels: HeadLevel[];
  /** lattice nodes per side */
  readonly gridSize: number;
  /** the lattice's half side, m (centred on the wells, the release and the boundary points near them) */
  readonly halfSide: number;
}

/** The flow-frame square the lines are drawn on: centre and half side (see the header). */
export function headLatticeExtent(f: FlowField): { cx: number; cy: number; half: number } {
  const pts: [number, number][] = [[0, 0]];
  for (const w of f.wells) {
    pts.push([w.x, w.y]);
    for (const l of f.lines) {
      const d = (w.x - l.px) * l.nx + (w.y - l.py) * l.ny;
      pts.push([w.x - d * l.nx, w.y - d * l.ny]);
    }
  }
  const xs = pts.map((p) => p[0]);
  const ys = pts.map((p) => p[1]);
  const x0 = Math.min(...xs), x1 = Math.max(...xs), y0 = Math.min(...ys), y1 = Math.max(...ys);
  const span = Math.max(x1 - x0, y1 - y0) / 2;
  const stag = f.q0 > 0 ? Math.max(0, ...f.wells.map((w) => Math.abs(w.rate) / (2 * Math.PI * f.q0))) : 0;
  const pad = Math.max(0.3 * span, 2 * stag, 25);
  return { cx: (x0 + x1) / 2, cy: (y0 + y1) / 2, half: span + pad };
}

/** "-0.4 m", "0 m", "12 ft": the level in the unit with the decimals its interval needs. */
export function levelLabel(value: number, step: number, unit: string): string {
  const digits = Math.max(0, -Math.floor(Math.log10(step) + 1e-9));
  const v = Number(value.toFixed(digits));
  return `${v === 0 ? 0 : v} ${unit}`;
}

/**
 * The head contours of the case's well field on the map (see the header); null when there is no
 * field or no well pumps.
 */
export function mapHeadContours(p: PreparedCase, w: CaseWells, system: UnitSystem, gridSize = HEAD_LATTICE): HeadContours | null {
  const f = w.field;
  // only where wells pump (boundary lines alone leave the regional slope, which the flow arrow shows)
  if (!f || !f.wells.some((x) => x.rate !== 0)) return null;
  const { cx, cy, half } = headLatticeExtent(f);
  const n = Math.max(8, Math.floor(gridSize));
  const xs = new Float64Array(n);
  const ys = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    xs[i] = cx - half + (2 * half * i) / (n - 1);
    ys[i] = cy - half + (2 * half * i) / (n - 1);
  }
  const cell = (2 * half) / (n - 1);
  const heldWithin = Math.max(DEFAULT_WELL_RADIUS, ...f.wells.map((x) => x.radius ?? DEFAULT_WELL_RADIUS), CLIP_CELLS * cell);
  const clipRadius = heldWithin + Math.SQRT2 * cell;
  const values = confinedHeadLattice(f, p.derived.K, { x: 0, y: 0, head: 0 }, xs, ys, heldWithin);
  const halfPlanes: HalfPlane[] = f.lines.map((l) => ({ px: l.px, py: l.py, nx: l.nx, ny: l.ny }));
  const disks: Disk[] = f.wells.filter((x) => x.rate !== 0).map((x) => ({ x: x.x, y: x.y, r: clipRadius }));
  // the head range over the nodes where lines are drawn
  let lo = Infinity, hi = -Infinity;
  for (let i = 0; i < n; i++)
    for (let j = 0; j < n; j++) {
      const x = xs[i], y = ys[j];
      if (halfPlanes.some((h) => (x - h.px) * h.nx + (y - h.py) * h.ny < 0)) continue;
      if (disks.some((d) => Math.hypot(x - d.x, y - d.y) < d.r)) continue;
      const v = values[i * n + j];
      if (v < lo) lo = v;
      if (v > hi) hi = v;
    }
  const u = mapLengthUnit(system);
  if (!(hi - lo > 1e-9)) return { form: 'confined', unit: u.unit, step: 0, clipRadius, heldWithin, levels: [], gridSize: n, halfSide: half };
  const stepM = gridStep(hi - lo, LINES_WANTED, system);
  const step = stepM / u.metres;
  const kLo = Math.ceil(lo / stepM), kHi = Math.floor(hi / stepM);
  const ks: number[] = [];
  for (let k = kLo; k <= kHi && ks.length < MAX_LINES; k++) ks.push(k);
  const sets = contourLines({ values, xs, ys, levels: ks.map((k) => k * stepM) });
  const levels = sets.map((s, idx): HeadLevel => ({
    head: s.level,
    label: levelLabel(ks[idx] * step, step, u.unit),
    lines: s.lines.flatMap((l) => clipLines(l, halfPlanes, disks)).map((l) => l.map(([x, y]) => p.toMap(x, y))),
  }));
  return { form: 'confined', unit: u.unit, step, clipRadius, heldWithin, levels: levels.filter((l) => l.lines.length > 0), gridSize: n, halfSide: half };
}
