/**
 * Filled concentration bands on the flow-aligned lattice, and their GeoJSON for the map and export.
 *
 * contourBands: marching squares with linear interpolation along cell edges (d3-contour 4). Each
 * band is the region where C ≥ threshold, as a MultiPolygon in the flow frame (x downgradient,
 * y to the left, metres). The lattice is the core grid's: values[i·ys.length + j] is C at
 * (xs[i], ys[j]); xs and ys strictly increasing, possibly non-uniform. d3-contour wants a
 * row-major width × height array with sample (i, j) at pixel (i + ½, j + ½), so the values are
 * transposed (width = xs.length) and each pixel coordinate p maps back by linear interpolation on
 * xs (or ys) at fractional index p − ½. Outside the lattice counts as below every threshold, so a
 * band reaching the lattice edge is closed along that edge (clamped to xs[0] … xs[n−1]).
 * Approximation: the band boundary is piecewise linear between lattice lines; for a smooth field
 * the boundary error is O(h²) in the spacing h (test/geo/contours.test.ts: level sets of a
 * Gaussian: area error 5e-4 measured, 3e-3 held, at ≥ 23 samples per semi-axis).
 * Rings come out counter-clockwise (exterior) and clockwise (holes), closed, without repeated
 * consecutive vertices; slivers collapsed to zero area by the edge clamping are dropped.
 *
 * packContours: maps each vertex with toMap(x, y) → [lon, lat] (or local metres), re-checks the
 * winding after mapping, and packs the rings into flat typed arrays (PackedBands) that a worker
 * can hand to the page by transfer; packedToGeoJSON writes them out as GeoJSON.
 * contoursToGeoJSON (packContours, then packedToGeoJSON): an RFC 7946 FeatureCollection, one MultiPolygon Feature per non-empty band (empty bands are left
 * out), with the winding re-checked after mapping (RFC 7946 §3.1.6: exterior counter-clockwise,
 * holes clockwise) and properties { threshold, unit: 'mg/L', label, ...props }.
 * Not handled: rings crossing the antimeridian are not cut (RFC 7946 §3.1.9); sites within a plume
 * length of ±180° longitude will draw badly.
 */
import { contours } from 'd3-contour';
import type { Feature, FeatureCollection, MultiPolygon, Position as GeoPosition } from 'geojson';
import type { Position } from '../case/schema';
import { openRing, ringArea } from './rings';

export { ringArea };

export type Ring = [number, number][];
/** MultiPolygon coordinates: polygons, each [exterior, ...holes] */
export type PolygonSet = Ring[][];

export interface ContourBand {
  /** concentration threshold, mg/L; the band covers C ≥ threshold */
  threshold: number;
  /** flow-frame MultiPolygon coordinates, metres */
  polygons: PolygonSet;
}

export interface ContourInput {
  values: ArrayLike<number>;
  xs: ArrayLike<number>;
  ys: ArrayLike<number>;
  thresholds: ArrayLike<number>;
}

function checkAxis(a: ArrayLike<number>, name: string): void {
  if (!a || typeof a.length !== 'number' || a.length < 2)
    throw new RangeError(`${name} must hold at least 2 lattice coordinates`);
  for (let k = 0; k < a.length; k++) {
    if (!Number.isFinite(a[k])) throw new RangeError(`${name}[${k}] must be a finite number, got ${a[k]}`);
    if (k > 0 && !(a[k] > a[k - 1]))
      throw new RangeError(`${name} must be strictly increasing (${name}[${k}] = ${a[k]} after ${a[k - 1]})`);
  }
}

/** linear interpolation on a strictly increasing axis at fractional index f, clamped to the ends */
function axisAt(axis: ArrayLike<number>, f: number): number {
  const last = axis.length - 1;
  if (f <= 0) return axis[0];
  if (f >= last) return axis[last];
  const k = Math.floor(f);
  const t = f - k;
  return t === 0 ? axis[k] : axis[k] + t * (axis[k + 1] - axis[k]);
}

/** closed ring with the requested winding (ccw: counter-clockwise), or null for a zero-area ring */
function orientRing<P extends readonly number[]>(ring: readonly P[], ccw: boolean): P[] | null {
  const open = openRing(ring);
  if (open.length < 3) return null;
  const a = ringArea(open);
  if (!(a !== 0) || !Number.isFinite(a)) return null;
  if (a > 0 !== ccw) open.reverse();
  open.push(open[0]);
  return open;
}

let transposed = new Float64Array(0);

/** Filled bands C ≥ threshold for each threshold, in the order given (see the module header). */
export function contourBands({ values, xs, ys, thresholds }: ContourInput): ContourBand[] {
  checkAxis(xs, 'xs');
  checkAxis(ys, 'ys');
  const nx = xs.length, ny = ys.length;
  if (!values || values.length !== nx * ny)
    throw new RangeError(`values must hold xs.length × ys.length = ${nx * ny} concentrations, got ${values?.length}`);
  if (!thresholds || typeof thresholds.length !== 'number')
    throw new RangeError('thresholds must be a list of concentrations');
  for (let k = 0; k < thresholds.length; k++)
    if (!Number.isFinite(thresholds[k])) throw new RangeError(`thresholds[${k}] must be a finite number, got ${thresholds[k]}`);
  // transpose: core index i*ny + j (x-major) → d3 row-major index j*nx + i, into a buffer kept
  // between calls (d3 reads it only during the call; it holds no result)
  if (transposed.length < nx * ny) transposed = new Float64Array(nx * ny);
  const grid = transposed.subarray(0, nx * ny);
  for (let i = 0; i < nx; i++) {
    for (let j = 0; j < ny; j++) {
      const v = values[i * ny + j];
      if (!Number.isFinite(v))
        throw new RangeError(`values[${i * ny + j}] (x = ${xs[i]}, y = ${ys[j]}) must be a finite concentration, got ${v}`);
      grid[j * nx + i] = v;
    }
  }
  const gen = contours().size([nx, ny]);
  const bands: ContourBand[] = [];
  for (let k = 0; k < thresholds.length; k++) {
    const threshold = thresholds[k];
    const mp = gen.contour(grid as unknown as number[], threshold);
    const polygons: PolygonSet = [];
    for (const poly of mp.coordinates) {
      const rings: Ring[] = [];
      for (let r = 0; r < poly.length; r++) {
        const mapped = poly[r].map((p): [number, number] => [axisAt(xs, p[0] - 0.5), axisAt(ys, p[1] - 0.5)]);
        const oriented = orientRing(mapped, r === 0);
        if (oriented) rings.push(oriented);
        else if (r === 0) break; // exterior collapsed: drop the polygon with its holes
      }
      if (rings.length > 0) polygons.push(rings);
    }
    bands.push({ threshold, polygons });
  }
  return bands;
}

/** default label: "≥ 0.005 mg/L" (four significant digits at most) */
export function bandLabel(threshold: number): string {
  return `≥ ${Number(threshold.toPrecision(4))} mg/L`;
}

export type BandProperties = Record<string, unknown>;

/**
 * The bands in map coordinates as flat typed arrays, for sending between threads by transfer
 * instead of structured clone, and for drawing without building GeoJSON objects. Every band of
 * the input has an entry (empty bands have no polygons). Indices:
 *   band k's polygons      p ∈ [bandPolygons[k], bandPolygons[k + 1])
 *   polygon p's rings      r ∈ [polygonRings[p], polygonRings[p + 1]); the first is the exterior
 *   ring r's vertices      v ∈ [ringVertices[r], ringVertices[r + 1]), at coords[2v], coords[2v + 1]
 * Rings as contoursToGeoJSON writes them: mapped by toMap, winding re-checked after mapping
 * (exterior counter-clockwise, holes clockwise), closed (last vertex = first), no repeated
 * consecutive vertices; zero-area rings dropped (an exterior with its holes).
 */
export interface PackedBands {
  thresholds: Float64Array;
  bandPolygons: Uint32Array;
  polygonRings: Uint32Array;
  ringVertices: Uint32Array;
  coords: Float64Array;
}

/** The buffers of a PackedBands, for postMessage's transfer list. */
export function packedTransferables(p: PackedBands): ArrayBuffer[] {
  return [p.thresholds, p.bandPolygons, p.polygonRings, p.ringVertices, p.coords].map((a) => a.buffer as ArrayBuffer);
}

/** growable Float64Array / Uint32Array (amortised doubling) */
class Grow<A extends Float64Array | Uint32Array> {
  n = 0;
  constructor(public a: A, private make: (n: number) => A) {}
  push(v: number): void {
    if (this.n === this.a.length) {
      const b = this.make(this.a.length * 2);
      b.set(this.a);
      this.a = b;
    }
    this.a[this.n++] = v;
  }
  done(): A {
    return this.a.slice(0, this.n) as A;
  }
}

/** Map every vertex with toMap(x, y) → [x′, y′] and pack the bands (see PackedBands). */
export function packContours(bands: readonly ContourBand[], toMap: (x: number, y: number) => Position): PackedBands {
  let vertices = 0, rings = 0, polys = 0;
  for (const b of bands)
    for (const poly of b.polygons) {
      polys++;
      for (const r of poly) (rings++), (vertices += r.length);
    }
  const coords = new Grow(new Float64Array(Math.max(8, 2 * vertices)), (n) => new Float64Array(n));
  const ringV = new Grow(new Uint32Array(rings + 1), (n) => new Uint32Array(n));
  const polyR = new Grow(new Uint32Array(polys + 1), (n) => new Uint32Array(n));
  const bandP = new Uint32Array(bands.length + 1);
  const thresholds = new Float64Array(bands.length);
  ringV.push(0);
  polyR.push(0);
  bands.forEach((band, k) => {
    thresholds[k] = band.threshold;
    for (const poly of band.polygons) {
      const ringsBefore = ringV.n;
      for (let r = 0; r < poly.length; r++) {
        if (!pushRing(coords, poly[r], toMap, r === 0)) {
          if (r === 0) break; // exterior collapsed: drop the polygon with its holes
          continue;
        }
        ringV.push(coords.n / 2);
      }
      if (ringV.n > ringsBefore) polyR.push(ringV.n - 1);
    }
    bandP[k + 1] = polyR.n - 1;
  });
  return { thresholds, bandPolygons: bandP, polygonRings: polyR.done(), ringVertices: ringV.done(), coords: coords.done() };
}

/**
 * Append one ring, mapped by toMap and oriented by orientRing (ccw for an exterior, closed), to
 * coords; false (and nothing appended) when orientRing finds under 3 distinct vertices or no area.
 */
function pushRing(out: Grow<Float64Array>, ring: Ring, toMap: (x: number, y: number) => Position, ccw: boolean): boolean {
  const mapped = ring.map(([x, y]): [number, number] => {
    const p = toMap(x, y);
    if (!Array.isArray(p) || !Number.isFinite(p[0]) || !Number.isFinite(p[1]))
      throw new RangeError(`toMap(${x}, ${y}) must return a pair of finite numbers, got ${JSON.stringify(p)}`);
    return [p[0], p[1]];
  });
  const oriented = orientRing(mapped, ccw);
  if (!oriented) return false;
  for (const [x, y] of oriented) {
    out.push(x);
    out.push(y);
  }
  return true;
}

/** The packed bands' rings as GeoJSON positions: polygons of band k. */
export function packedPolygons(p: PackedBands, k: number): GeoPosition[][][] {
  const polys: GeoPosition[][][] = [];
  for (let q = p.bandPolygons[k]; q < p.bandPolygons[k + 1]; q++) {
    const rings: GeoPosition[][] = [];
    for (let r = p.polygonRings[q]; r < p.polygonRings[q + 1]; r++) {
      const ring: GeoPosition[] = [];
      for (let v = p.ringVertices[r]; v < p.ringVertices[r + 1]; v++) ring.push([p.coords[2 * v], p.coords[2 * v + 1]]);
      rings.push(ring);
    }
    polys.push(rings);
  }
  return polys;
}

/** RFC 7946 FeatureCollection of packed bands (see the module header); props get the band's threshold and index. */
export function packedToGeoJSON(
  p: PackedBands,
  props?: BandProperties | ((band: { threshold: number }, index: number) => BandProperties),
): FeatureCollection<MultiPolygon> {
  const features: Feature<MultiPolygon>[] = [];
  for (let k = 0; k < p.thresholds.length; k++) {
    if (p.bandPolygons[k + 1] === p.bandPolygons[k]) continue;
    const threshold = p.thresholds[k];
    const extra = typeof props === 'function' ? props({ threshold }, k) : props ?? {};
    features.push({
      type: 'Feature',
      geometry: { type: 'MultiPolygon', coordinates: packedPolygons(p, k) },
      properties: { threshold, unit: 'mg/L', label: bandLabel(threshold), ...extra },
    });
  }
  return { type: 'FeatureCollection', features };
}

/** RFC 7946 FeatureCollection of the bands (see the module header): packContours, then packedToGeoJSON. */
export function contoursToGeoJSON(
  bands: readonly ContourBand[],
  toMap: (x: number, y: number) => Position,
  props?: BandProperties | ((band: ContourBand, index: number) => BandProperties),
): FeatureCollection<MultiPolygon> {
  return packedToGeoJSON(packContours(bands, toMap), typeof props === 'function' ? (_b, k) => props(bands[k], k) : props);
}

/** An open polyline (or a closed one: last vertex = first) in the flow frame, metres. */
export type Polyline = [number, number][];

export interface ContourLineSet {
  level: number;
  /** the lines where the field equals `level`, open where they leave the lattice */
  lines: Polyline[];
}

/**
 * Contour lines (isolines) at each level, from the same marching squares as the bands: the
 * boundary of the band C ≥ level is the isoline plus, where the band reaches the lattice's edge,
 * stretches along that edge (contourBands closes bands there). Those stretches — segments with
 * both ends on one edge of the lattice (x = xs[0], x = xs[n−1], y = ys[0] or y = ys[m−1]) — are
 * cut out; what remains is the isoline, open where it leaves the lattice and closed (last vertex =
 * first) where it loops inside it. A level line lying exactly along an edge of the lattice would
 * be cut out with it (a degenerate case: the field equal to the level along a whole edge).
 */
export function contourLines({ values, xs, ys, levels }: { values: ArrayLike<number>; xs: ArrayLike<number>; ys: ArrayLike<number>; levels: ArrayLike<number> }): ContourLineSet[] {
  const bands = contourBands({ values, xs, ys, thresholds: levels });
  const x0 = xs[0], x1 = xs[xs.length - 1], y0 = ys[0], y1 = ys[ys.length - 1];
  const onEdge = (a: [number, number], b: [number, number]) =>
    (a[0] === x0 && b[0] === x0) || (a[0] === x1 && b[0] === x1) || (a[1] === y0 && b[1] === y0) || (a[1] === y1 && b[1] === y1);
  return bands.map((band) => {
    const lines: Polyline[] = [];
    for (const poly of band.polygons)
      for (const ring of poly) {
        const n = ring.length - 1; // closed: ring[n] = ring[0]
        let cut = -1;
        for (let k = 0; k < n && cut < 0; k++) if (onEdge(ring[k], ring[k + 1])) cut = k;
        if (cut < 0) {
          lines.push(ring.map((p): [number, number] => [p[0], p[1]]));
          continue;
        }
        // walk the ring from just after an edge stretch, all the way round to it
        let piece: Polyline = [];
        for (let s = 1; s <= n; s++) {
          const k = (cut + s) % n;
          const a = ring[k], b = ring[k + 1];
          if (onEdge(a, b)) {
            if (piece.length >= 2) lines.push(piece);
            piece = [];
            continue;
          }
          if (piece.length === 0) piece.push([a[0], a[1]]);
          piece.push([b[0], b[1]]);
        }
        if (piece.length >= 2) lines.push(piece);
      }
    return { level: band.threshold, lines };
  });
}

/** The side of a straight line kept by clipLines: points with (x − px)·nx + (y − py)·ny ≥ 0. */
export interface HalfPlane {
  px: number;
  py: number;
  nx: number;
  ny: number;
}

/** A disk cut out by clipLines (its interior removed). */
export interface Disk {
  x: number;
  y: number;
  r: number;
}

/**
 * The parts of a polyline inside every half-plane and outside every disk, exactly (each segment
 * clipped in its own parameter: linear for a half-plane, the roots of a quadratic for a circle).
 * Pieces shorter than two vertices are dropped; a closed line that survives whole stays closed.
 */
export function clipLines(line: readonly (readonly [number, number])[], halfPlanes: readonly HalfPlane[], disks: readonly Disk[]): Polyline[] {
  const out: Polyline[] = [];
  let piece: Polyline = [];
  const flush = () => {
    if (piece.length >= 2) out.push(piece);
    piece = [];
  };
  for (let k = 0; k + 1 < line.length; k++) {
    const [ax, ay] = line[k];
    const dx = line[k + 1][0] - ax, dy = line[k + 1][1] - ay;
    // kept parameter intervals of this segment
    let kept: [number, number][] = [[0, 1]];
    for (const h of halfPlanes) {
      const d0 = (ax - h.px) * h.nx + (ay - h.py) * h.ny;
      const dd = dx * h.nx + dy * h.ny;
      let lo = 0, hi = 1;
      if (dd === 0) {
        if (d0 < 0) hi = -1;
      } else if (dd > 0) lo = Math.max(0, -d0 / dd);
      else hi = Math.min(1, -d0 / dd);
      kept = kept.map(([a, b]): [number, number] => [Math.max(a, lo), Math.min(b, hi)]).filter(([a, b]) => b > a);
    }
    for (const c of disks) {
      // |A + t·D − C|² < r² for t in (t1, t2)
      const ex = ax - c.x, ey = ay - c.y;
      const qa = dx * dx + dy * dy;
      const qb = 2 * (ex * dx + ey * dy);
      const qc = ex * ex + ey * ey - c.r * c.r;
      const disc = qb * qb - 4 * qa * qc;
      if (!(qa > 0) || disc <= 0) {
        if (qc < 0) kept = []; // a zero-length segment inside the disk
        continue;
      }
      const sq = Math.sqrt(disc);
      // stable roots (no cancellation between qb and sq)
      const q = -0.5 * (qb + (qb >= 0 ? sq : -sq));
      const r1 = q / qa, r2 = qc / q;
      const t1 = Math.min(r1, r2), t2 = Math.max(r1, r2);
      kept = kept.flatMap(([a, b]): [number, number][] => {
        const parts: [number, number][] = [];
        if (Math.min(b, t1) > a) parts.push([a, Math.min(b, t1)]);
        if (b > Math.max(a, t2)) parts.push([Math.max(a, t2), b]);
        return parts;
      });
    }
    const at = (t: number): [number, number] => (t === 0 ? [ax, ay] : t === 1 ? [line[k + 1][0], line[k + 1][1]] : [ax + t * dx, ay + t * dy]);
    for (const [a, b] of kept) {
      if (a > 0 || piece.length === 0) {
        flush();
        piece.push(at(a));
      }
      piece.push(at(b));
      if (b < 1) flush();
    }
    if (kept.length === 0) flush();
  }
  flush();
  // a closed line cut somewhere: its last piece runs on into its first
  const first = line[0], last = line[line.length - 1];
  if (out.length >= 2 && first[0] === last[0] && first[1] === last[1]) {
    const a = out[0], z = out[out.length - 1];
    if (a[0][0] === first[0] && a[0][1] === first[1] && z[z.length - 1][0] === last[0] && z[z.length - 1][1] === last[1]) {
      out[0] = [...z, ...a.slice(1)];
      out.pop();
    }
  }
  return out;
}
