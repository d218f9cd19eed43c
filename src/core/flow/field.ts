/**
 * Steady two-dimensional flow: uniform regional flow plus pumping or injecting wells, with
 * straight boundaries represented by image wells. One flow description serves the capture zones,
 * the particles and the warnings.
 *
 * Method: superposition of complex potentials (Strack 1989, Groundwater Mechanics, ch. 3 and 4).
 * In the flow-aligned frame (+x the regional flow direction), with Q₀ = q·B the regional discharge
 * per unit width (q the Darcy flux, B the saturated thickness) and Q_j the rate of well j
 * (> 0 extraction),
 *     Ω(z) = −Q₀·z + Σ_j (Q_j / 2π) · ln(z − z_j),   Qx − i·Qy = −dΩ/dz,
 * so the discharge per unit width is
 *     Qx = Q₀ − Σ_j s_j (x − x_j)/r_j²,   Qy = −Σ_j s_j (y − y_j)/r_j²,   s_j = Q_j/2π,
 * and the seepage velocity is v = (Qx, Qy)/(nₑ·B).
 *
 * Aquifer: confined, or unconfined with the saturated thickness taken as constant (the drawdown
 * small against B). Velocities need only q, nₑ and B; heads need the conductivity K as well
 * (transmissivity T = K·B, head = Φ/T + constant).
 *
 * Boundaries (the image method; Ferris, Knowles, Brown & Stallman 1962, USGS Water-Supply Paper
 * 1536-E): a straight line held at constant head (a fully penetrating stream or lake shore) is
 * represented by an image well of opposite sign mirrored across it; a straight impermeable line
 * by an image of the same sign. Two boundaries must be parallel or at right angles (then the
 * images close: four wells for a corner; a truncated series of MAX_IMAGE_DEPTH reflections for a
 * strip). The image method makes the wells' part of the flow satisfy the boundary exactly; the
 * regional uniform flow satisfies it only when a constant-head line lies across the flow or an
 * impermeable line along it, which `flowWarnings` checks.
 *
 * Singularity: inside a well's radius rw the 1/r² of that well is replaced by 1/rw² (the velocity
 * falls linearly to 0 at the centre), so no point of the plane gives NaN or Infinity; the tracers
 * stop on entering a well's radius anyway (a pumping well is a sink: what reaches it leaves).
 */
import { ValidationError, requireFinite, requireInRange, requireNonNegative, requirePositive, type Warning } from '../validation';

export interface FlowWell {
  readonly x: number;
  readonly y: number;
  /** volumetric rate, > 0 extraction, < 0 injection (L³/T) */
  readonly rate: number;
  /** well radius (L); default DEFAULT_WELL_RADIUS */
  readonly radius?: number;
  readonly label?: string;
}

export type BoundaryKind = 'constant-head' | 'no-flow';

/** A straight boundary through (x1, y1) and (x2, y2); the aquifer lies to the LEFT of 1 → 2. */
export interface FlowBoundary {
  readonly kind: BoundaryKind;
  readonly x1: number;
  readonly y1: number;
  readonly x2: number;
  readonly y2: number;
  readonly label?: string;
}

export interface FlowInput {
  /** regional Darcy flux q = K·i along +x (L/T), ≥ 0 */
  readonly darcyFlux: number;
  /** effective porosity nₑ in (0, 1] */
  readonly porosity: number;
  /** saturated thickness B (L), > 0 */
  readonly thickness: number;
  readonly wells: readonly FlowWell[];
  readonly boundaries?: readonly FlowBoundary[];
}

/** 0.1 m: a typical supply-well radius (common practice), used when a well gives none. */
export const DEFAULT_WELL_RADIUS = 0.1;
/** reflections generated for a pair of parallel boundaries (a strip): images out to 2·8 strip widths */
export const MAX_IMAGE_DEPTH = 8;

export interface Line {
  readonly kind: BoundaryKind;
  /** a point on the line and the unit normal pointing into the aquifer */
  readonly px: number;
  readonly py: number;
  readonly nx: number;
  readonly ny: number;
  readonly source: FlowBoundary;
}

/** The prepared field: real wells first (indices 0 … wells.length−1), then their images. */
export interface FlowField {
  readonly darcyFlux: number;
  readonly porosity: number;
  readonly thickness: number;
  /** regional discharge per unit width Q₀ = q·B */
  readonly q0: number;
  /** nₑ·B: divides discharge per unit width into seepage velocity */
  readonly nB: number;
  readonly wells: readonly FlowWell[];
  readonly lines: readonly Line[];
  /** all singularities: x, y, s = Q/2π, rw² (real wells then images), and which real well each images */
  readonly sx: Float64Array;
  readonly sy: Float64Array;
  readonly ss: Float64Array;
  readonly sr2: Float64Array;
  readonly parent: Int32Array;
}

/** Signed distance of (x, y) from the line, positive inside the aquifer. */
export function lineDistance(l: Line, x: number, y: number): number {
  return (x - l.px) * l.nx + (y - l.py) * l.ny;
}

function prepareLine(b: FlowBoundary, i: number): Line {
  const f = `boundaries[${i}]`;
  if (b === null || typeof b !== 'object') throw new ValidationError(f, b, 'an object { kind, x1, y1, x2, y2 }');
  if (b.kind !== 'constant-head' && b.kind !== 'no-flow')
    throw new ValidationError(`${f}.kind`, b.kind, "'constant-head' or 'no-flow'");
  const x1 = requireFinite(`${f}.x1`, b.x1);
  const y1 = requireFinite(`${f}.y1`, b.y1);
  const dx = requireFinite(`${f}.x2`, b.x2) - x1;
  const dy = requireFinite(`${f}.y2`, b.y2) - y1;
  const len = Math.hypot(dx, dy);
  if (!(len > 0)) throw new ValidationError(`${f}.x2`, b.x2, 'a second point distinct from the first', 'the two points of a boundary line coincide');
  // left of the direction 1 → 2: normal (−dy, dx)
  return { kind: b.kind, px: x1, py: y1, nx: -dy / len, ny: dx / len, source: b };
}

interface Singularity {
  x: number;
  y: number;
  s: number;
  r2: number;
  parent: number;
}

function reflect(p: Singularity, l: Line): Singularity {
  const d = lineDistance(l, p.x, p.y);
  return { x: p.x - 2 * d * l.nx, y: p.y - 2 * d * l.ny, s: l.kind === 'constant-head' ? -p.s : p.s, r2: p.r2, parent: p.parent };
}

/** Validates the input and builds the field with its image wells. Throws ValidationError. */
export function prepareFlow(input: FlowInput): FlowField {
  if (input === null || typeof input !== 'object') throw new ValidationError('flow', input, 'an object');
  const darcyFlux = requireNonNegative('darcyFlux', input.darcyFlux);
  const porosity = requireInRange('porosity', input.porosity, 0, 1, true, false);
  const thickness = requirePositive('thickness', input.thickness);
  if (!Array.isArray(input.wells)) throw new ValidationError('wells', input.wells, 'an array of { x, y, rate }');
  const wells: FlowWell[] = input.wells.map((w, j) => {
    const f = `wells[${j}]`;
    if (w === null || typeof w !== 'object') throw new ValidationError(f, w, 'an object { x, y, rate }');
    const radius = w.radius === undefined ? DEFAULT_WELL_RADIUS : requirePositive(`${f}.radius`, w.radius);
    return { x: requireFinite(`${f}.x`, w.x), y: requireFinite(`${f}.y`, w.y), rate: requireFinite(`${f}.rate`, w.rate), radius, label: w.label };
  });
  const boundaries = input.boundaries ?? [];
  if (!Array.isArray(boundaries)) throw new ValidationError('boundaries', boundaries, 'an array of boundary lines');
  const lines = boundaries.map(prepareLine);
  checkLineAngles(lines);
  wells.forEach((w, j) => {
    lines.forEach((l, i) => {
      const d = lineDistance(l, w.x, w.y);
      const name = w.label ? `well ${j + 1} (${w.label})` : `well ${j + 1}`;
      if (d <= (w.radius as number))
        throw new ValidationError(
          `wells[${j}]`,
          { x: w.x, y: w.y },
          `inside the aquifer, farther than its radius from boundary ${i + 1}`,
          d <= 0
            ? `${name} lies ${d === 0 ? 'on' : 'beyond'} boundary line ${i + 1} (${l.kind}); a well must lie on the aquifer side`
            : `${name} lies on boundary line ${i + 1} (${l.kind}), ${fmt(d)} from it, within its own radius`,
        );
    });
  });
  for (let a = 0; a < wells.length; a++)
    for (let b = a + 1; b < wells.length; b++) {
      const d = Math.hypot(wells[a].x - wells[b].x, wells[a].y - wells[b].y);
      if (d <= (wells[a].radius as number) + (wells[b].radius as number))
        throw new ValidationError(`wells[${b}]`, { x: wells[b].x, y: wells[b].y }, `apart from well ${a + 1} by more than the two radii`, `wells ${a + 1} and ${b + 1} overlap (${fmt(d)} apart)`);
    }
  const sing = images(
    wells.map((w, j) => ({ x: w.x, y: w.y, s: w.rate / (2 * Math.PI), r2: (w.radius as number) ** 2, parent: j })),
    lines,
  );
  const n = sing.length;
  const sx = new Float64Array(n);
  const sy = new Float64Array(n);
  const ss = new Float64Array(n);
  const sr2 = new Float64Array(n);
  const parent = new Int32Array(n);
  sing.forEach((p, k) => {
    sx[k] = p.x;
    sy[k] = p.y;
    ss[k] = p.s;
    sr2[k] = p.r2;
    parent[k] = p.parent;
  });
  return { darcyFlux, porosity, thickness, q0: darcyFlux * thickness, nB: porosity * thickness, wells, lines, sx, sy, ss, sr2, parent };
}

function fmt(v: number): string {
  return `${Number(v.toPrecision(3))} length units`;
}

/** Two lines must be parallel or at right angles (within 0.5°) for the images to close. */
function checkLineAngles(lines: Line[]): void {
  const tol = Math.sin((0.5 * Math.PI) / 180);
  for (let a = 0; a < lines.length; a++)
    for (let b = a + 1; b < lines.length; b++) {
      const cross = Math.abs(lines[a].nx * lines[b].ny - lines[a].ny * lines[b].nx);
      if (cross > tol && cross < 1 - tol * tol)
        throw new ValidationError(
          `boundaries[${b}]`,
          lines[b].source,
          `parallel or at right angles to boundary ${a + 1}`,
          `boundary lines ${a + 1} and ${b + 1} meet at an angle the image-well method cannot represent; draw them parallel or at right angles`,
        );
    }
  if (lines.length > 4) throw new ValidationError('boundaries', lines.length, 'at most 4 straight lines');
}

/**
 * The image set: reflect every singularity across every line, repeatedly, keeping new positions
 * (a corner closes after two rounds; a strip is cut at MAX_IMAGE_DEPTH rounds). An image may never
 * fall inside the aquifer (which happens only for angles the check above refuses).
 */
function images(real: Singularity[], lines: Line[]): Singularity[] {
  if (lines.length === 0) return real;
  const all = [...real];
  const key = (p: Singularity) => `${p.parent}:${Math.round(p.x * 1e6)}:${Math.round(p.y * 1e6)}`;
  const seen = new Set(all.map(key));
  let frontier = real;
  for (let depth = 0; depth < MAX_IMAGE_DEPTH && frontier.length > 0; depth++) {
    const next: Singularity[] = [];
    for (const p of frontier)
      for (const l of lines) {
        if (lineDistance(l, p.x, p.y) <= 0) continue; // already beyond this line: its reflection comes back
        const q = reflect(p, l);
        const k = key(q);
        if (seen.has(k)) continue;
        seen.add(k);
        next.push(q);
      }
    all.push(...next);
    frontier = next;
  }
  return all;
}

/** Inside the aquifer (on the inner side of every boundary line, or on it)? */
export function insideAquifer(f: FlowField, x: number, y: number): boolean {
  for (const l of f.lines) if (lineDistance(l, x, y) < 0) return false;
  return true;
}

/**
 * Discharge per unit width (Qx, Qy) at (x, y) into `out` (L²/T). Inside a well's radius the well's
 * own term uses rw² for r² (finite, see the header).
 */
export function discharge(f: FlowField, x: number, y: number, out: { x: number; y: number }): void {
  let qx = f.q0;
  let qy = 0;
  const n = f.sx.length;
  for (let k = 0; k < n; k++) {
    const dx = x - f.sx[k];
    const dy = y - f.sy[k];
    let r2 = dx * dx + dy * dy;
    if (r2 < f.sr2[k]) r2 = f.sr2[k];
    const c = f.ss[k] / r2;
    qx -= c * dx;
    qy -= c * dy;
  }
  out.x = qx;
  out.y = qy;
}

/** Seepage velocity (vx, vy) = discharge/(nₑB) at (x, y), not divided by retardation. */
export function velocity(f: FlowField, x: number, y: number, out: { x: number; y: number }): void {
  discharge(f, x, y, out);
  out.x /= f.nB;
  out.y /= f.nB;
}

export interface VelocityGradient {
  vx: number;
  vy: number;
  /** ∂vx/∂x, ∂vx/∂y, ∂vy/∂x, ∂vy/∂y */
  dxx: number;
  dxy: number;
  dyx: number;
  dyy: number;
}

/**
 * Velocity and its gradient at (x, y). From the potential: ∂Qx/∂x = −Σ s(dy² − dx²)/r⁴,
 * ∂Qx/∂y = ∂Qy/∂x = Σ 2s·dx·dy/r⁴, ∂Qy/∂y = −∂Qx/∂x (divergence-free outside the wells). Inside
 * a well's radius that well's term is the regularised linear one (gradient −s/rw² on the diagonal).
 */
export function velocityGradient(f: FlowField, x: number, y: number, out: VelocityGradient): void {
  let qx = f.q0;
  let qy = 0;
  let axx = 0;
  let axy = 0;
  let ayy = 0;
  const n = f.sx.length;
  for (let k = 0; k < n; k++) {
    const dx = x - f.sx[k];
    const dy = y - f.sy[k];
    const r2 = dx * dx + dy * dy;
    const s = f.ss[k];
    if (r2 < f.sr2[k]) {
      const c = s / f.sr2[k];
      qx -= c * dx;
      qy -= c * dy;
      axx -= c;
      ayy -= c;
      continue;
    }
    const c = s / r2;
    qx -= c * dx;
    qy -= c * dy;
    const c2 = c / r2;
    axx -= c2 * (dy * dy - dx * dx);
    ayy -= c2 * (dx * dx - dy * dy);
    axy += 2 * c2 * dx * dy;
  }
  const inv = 1 / f.nB;
  out.vx = qx * inv;
  out.vy = qy * inv;
  out.dxx = axx * inv;
  out.dxy = axy * inv;
  out.dyx = axy * inv;
  out.dyy = ayy * inv;
}

/**
 * Discharge potential Φ = −Q₀x + Σ s_j ln r_j (L³/T, up to a constant); Φ/T is head up to a
 * constant in a confined aquifer (T = K·B). Inside a well's radius r is taken as rw; with
 * `clipRadius` > rw, r is taken as at least clipRadius for every well and image (a clipped
 * potential, finite on a map lattice whose nodes may fall on a well: the well's own cone is then
 * flat inside clipRadius, the other terms exact).
 */
export function potential(f: FlowField, x: number, y: number, clipRadius = 0): number {
  let phi = -f.q0 * x;
  const n = f.sx.length;
  const c2 = clipRadius * clipRadius;
  for (let k = 0; k < n; k++) {
    const dx = x - f.sx[k];
    const dy = y - f.sy[k];
    phi += 0.5 * f.ss[k] * Math.log(Math.max(dx * dx + dy * dy, f.sr2[k], c2));
  }
  return phi;
}

/**
 * Steady drawdown from pumping (confined, or unconfined with constant B; L):
 * s = Σ_j Q_j/(2π·K·B) · ln(R/r_j) over wells and images. When the rates of wells and images sum
 * to zero (every well has a constant-head image) R cancels and need not be given; otherwise the
 * radius of influence R is required (a steady drawdown in an unbounded aquifer exists only
 * relative to one — Thiem's assumption).
 */
export function drawdown(f: FlowField, conductivity: number, x: number, y: number, radiusOfInfluence?: number): number {
  const K = requirePositive('conductivity', conductivity);
  let net = 0;
  let total = 0;
  for (let k = 0; k < f.ss.length; k++) {
    net += f.ss[k];
    total += Math.abs(f.ss[k]);
  }
  let s = 0;
  if (Math.abs(net) > 1e-12 * total) {
    const R = requirePositive('radiusOfInfluence', radiusOfInfluence);
    s = net * Math.log(R);
  }
  s -= potential(f, x, y) + f.q0 * x;
  return s / (K * f.thickness);
}

/**
 * Doubtful geometry, in plain words (thresholds are screening judgement, not a published rule):
 * - a well closer to a boundary than twice its own stagnation distance Q/(2πqB), or than 5 m:
 *   the idealised straight, fully penetrating boundary decides the capture zone there, and a real
 *   stream bed (partial penetration, a clogging layer) can change it; near an impermeable line the
 *   steady state takes long to reach;
 * - two wells closer than the larger of their stagnation distances: their cones of depression and
 *   capture zones merge, and the steady picture holds only after both have pumped long;
 * - a constant-head line that does not lie across the regional flow, or an impermeable line not
 *   along it (more than 20° off): uniform regional flow cannot meet that boundary condition, so the
 *   picture is exact for the wells' part only.
 */
/** `length` writes a distance (m) with its unit; default: the number of metres, 3 significant digits, no unit. */
export function flowWarnings(f: FlowField, length: (m: number) => string = (m) => String(Number(m.toPrecision(3)))): Warning[] {
  const out: Warning[] = [];
  const stag = (w: FlowWell) => (f.q0 > 0 ? Math.abs(w.rate) / (2 * Math.PI * f.q0) : Infinity);
  const name = (j: number) => (f.wells[j].label ? `Well ${j + 1} (${f.wells[j].label})` : `Well ${j + 1}`);
  f.wells.forEach((w, j) => {
    if (w.rate === 0) return;
    f.lines.forEach((l, i) => {
      const d = lineDistance(l, w.x, w.y);
      const near = Math.max(5, Math.min(2 * stag(w), 1e6));
      if (d < near)
        out.push({
          code: 'well-near-boundary',
          message: `${name(j)} is ${length(d)} from boundary line ${i + 1} (${l.kind === 'constant-head' ? 'constant head' : 'impermeable'}): the boundary, idealised as a straight fully penetrating line, shapes its capture zone; a real stream bed or barrier may behave differently${l.kind === 'no-flow' ? ', and the steady state takes long to reach' : ''}.`,
          field: `wells[${j}]`,
        });
    });
  });
  for (let a = 0; a < f.wells.length; a++)
    for (let b = a + 1; b < f.wells.length; b++) {
      const A = f.wells[a];
      const B = f.wells[b];
      if (A.rate === 0 || B.rate === 0) continue;
      const d = Math.hypot(A.x - B.x, A.y - B.y);
      if (d < Math.max(stag(A), stag(B), 5))
        out.push({
          code: 'wells-close',
          message: `${name(a)} and ${name(b)} are ${length(d)} apart: their drawdown cones and capture zones merge, and the steady picture holds only after both have pumped for long.`,
          field: `wells[${b}]`,
        });
    }
  const off = Math.sin((20 * Math.PI) / 180);
  f.lines.forEach((l, i) => {
    // constant head should lie across the flow (normal along ±x); impermeable along it (normal along ±y)
    const mis = l.kind === 'constant-head' ? Math.abs(l.ny) : Math.abs(l.nx);
    if (f.q0 > 0 && mis > off)
      out.push({
        code: 'boundary-regional-flow',
        message: `Boundary line ${i + 1} (${l.kind === 'constant-head' ? 'constant head' : 'impermeable'}) is more than 20° off ${l.kind === 'constant-head' ? 'square to' : 'parallel to'} the regional flow: uniform regional flow cannot meet that boundary, so the flow near it is approximate (the wells' part is exact).`,
        field: `boundaries[${i}]`,
      });
  });
  return out;
}
