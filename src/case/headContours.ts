/**
 * Lines of equal water level (equipotentials) of the steady well field, for the map: the
 * potentiometric surface where wells pump, drawn beside the capture zones.
 *
 * What is contoured: the head relative to the release (0 there) in the confined form the capture
 * zones and particles use (saturated thickness B held constant; core flow/heads.ts
 * `confinedHeadLattice`): the regional slope plus every well's cone with its images. Not drawdown:
 * the lines are the water table's (or piezometric surface's) shape, so the flow crosses them at
 * right angles. `unconfined`: the same for an unconfined aquifer by Dupuit–Forchheimer, the water
 * table relative to the release h − B with h = √(B² + 2B·Δh) (Δh the confined head; both forms are
 * functions of the discharge potential alone, so its lines lie on the confined ones' lattice, at
 * its own round levels, converted to confined heads Δh = ((B + d)² − B²)/(2B) and contoured there);
 * where B² + 2B·Δh ≤ 0 the aquifer would be dewatered and no unconfined level is drawn (`dewatered`).
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

/** Lines of one form: their interval (in the unit of HeadContours) and levels. */
export interface HeadLineSet {
  readonly step: number;
  readonly levels: HeadLevel[];
}

export interface HeadContours {
  /** the form of `levels` and `step` (see the header) */
  readonly form: 'confined';
  /** the water table of an unconfined aquifer (Dupuit–Forchheimer), relative to the release: levels' `head` is h − B, m */
  readonly unconfined: HeadLineSet & { readonly dewatered: boolean };
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
  const B = f.thickness;
  const empty = { form: 'confined', unit: u.unit, clipRadius, heldWithin, gridSize: n, halfSide: half } as const;
  if (!(hi - lo > 1e-9)) return { ...empty, step: 0, levels: [], unconfined: { step: 0, levels: [], dewatered: false } };
  // Dupuit: d = √(B² + 2B·Δh) − B, monotone in Δh; dewatered below Δh = −B/2
  const dupuit = (dh: number) => Math.sqrt(Math.max(0, B * B + 2 * B * dh)) - B;
  const lines = (levels: number[], toConfined: (v: number) => number, labelOf: (k: number) => string): HeadLevel[] =>
    contourLines({ values, xs, ys, levels: levels.map(toConfined) })
      .map((s, idx): HeadLevel => ({
        head: levels[idx],
        label: labelOf(idx),
        lines: s.lines.flatMap((l) => clipLines(l, halfPlanes, disks)).map((l) => l.map(([x, y]) => p.toMap(x, y))),
      }))
      .filter((l) => l.lines.length > 0);
  const roundLevels = (a: number, b: number, min = -Infinity): { stepM: number; ks: number[] } => {
    const stepM = gridStep(b - a, LINES_WANTED, system);
    const ks: number[] = [];
    for (let k = Math.ceil(a / stepM); k <= Math.floor(b / stepM) && ks.length < MAX_LINES; k++) if (k * stepM > min) ks.push(k);
    return { stepM, ks };
  };
  const c = roundLevels(lo, hi);
  const step = c.stepM / u.metres;
  const levels = lines(c.ks.map((k) => k * c.stepM), (v) => v, (i) => levelLabel(c.ks[i] * step, step, u.unit));
  const d = roundLevels(dupuit(lo), dupuit(hi), -B);
  const dStep = d.stepM / u.metres;
  const unconfined = {
    step: dStep,
    levels: lines(d.ks.map((k) => k * d.stepM), (v) => ((B + v) ** 2 - B * B) / (2 * B), (i) => levelLabel(d.ks[i] * dStep, dStep, u.unit)),
    dewatered: B * B + 2 * B * lo <= 0,
  };
  return { ...empty, step, levels, unconfined };
}
