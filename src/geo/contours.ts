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
