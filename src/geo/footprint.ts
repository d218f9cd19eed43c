/**
 * A traced source footprint → the source plane of the solutions.
 *
 * The solutions take a vertical source plane across the flow. From a footprint polygon (local
 * east/north metres) and the flow azimuth we take:
 * - width: the polygon's extent across the flow (max y − min y in the flow frame);
 * - upgradientLength: its extent along the flow (max x − min x);
 * - centreEN: the point at the across-flow midpoint on the downgradient-most extent.
 * Placing the source plane on the footprint's downgradient edge is our choice and common practice
 * (the plume is taken to leave the source zone there); for an irregular footprint the centre can
 * lie outside the polygon. Exact for any polygon: only vertices matter, since the extents of a
 * polygon along a direction are attained at vertices.
 *
 * Degenerate footprints are rejected with an Error naming the problem: fewer than 3 distinct
 * vertices, non-finite coordinates, zero area, or edges that cross or touch (self-intersection).
 * A closing vertex equal to the first, and repeated consecutive vertices, are dropped first.
 */
import { fromFlow } from './flowFrame';
import { sinCosDeg } from './angles';
import { openRing, ringArea } from './rings';

export interface SourcePlane {
  /** across-flow midpoint on the downgradient-most extent of the footprint, [e, n] m */
  centreEN: [number, number];
  /** extent across the flow, m */
  width: number;
  /** extent along the flow, m */
  upgradientLength: number;
  /** polygon area, m² (shoelace formula) */
  area: number;
}

/** Footprint vertices, checked finite, without repeated consecutive points or a closing duplicate. */
export function cleanRing(footprintEN: readonly (readonly [number, number])[]): [number, number][] {
  if (!Array.isArray(footprintEN)) throw new Error('source footprint must be a list of [east, north] vertices');
  footprintEN.forEach((p, k) => {
    if (!Array.isArray(p) || p.length < 2 || !Number.isFinite(p[0]) || !Number.isFinite(p[1]))
      throw new Error(`source footprint vertex ${k + 1} must be a pair of finite [east, north] metres`);
  });
  return openRing(footprintEN.map((p): [number, number] => [p[0], p[1]]));
}

/** twice the signed area of triangle abc (> 0: counter-clockwise) */
function orient(a: readonly number[], b: readonly number[], c: readonly number[]): number {
  return (b[0] - a[0]) * (c[1] - a[1]) - (b[1] - a[1]) * (c[0] - a[0]);
}

function onSegment(a: readonly number[], b: readonly number[], p: readonly number[]): boolean {
  return (
    Math.min(a[0], b[0]) <= p[0] && p[0] <= Math.max(a[0], b[0]) &&
    Math.min(a[1], b[1]) <= p[1] && p[1] <= Math.max(a[1], b[1])
  );
}

/** closed segments ab and cd share at least one point */
export function segmentsIntersect(
  a: readonly number[], b: readonly number[], c: readonly number[], d: readonly number[],
): boolean {
  const o1 = orient(a, b, c), o2 = orient(a, b, d), o3 = orient(c, d, a), o4 = orient(c, d, b);
  if (((o1 > 0 && o2 < 0) || (o1 < 0 && o2 > 0)) && ((o3 > 0 && o4 < 0) || (o3 < 0 && o4 > 0))) return true;
  return (
    (o1 === 0 && onSegment(a, b, c)) || (o2 === 0 && onSegment(a, b, d)) ||
    (o3 === 0 && onSegment(c, d, a)) || (o4 === 0 && onSegment(c, d, b))
  );
}

/** The index of the first pair of non-adjacent edges that meet, or null for a simple polygon. O(n²). */
function firstSelfIntersection(ring: readonly [number, number][]): [number, number] | null {
  const n = ring.length;
  for (let i = 0; i < n; i++) {
    const a = ring[i], b = ring[(i + 1) % n];
    for (let j = i + 1; j < n; j++) {
      const adjacent = j === i + 1 || (i === 0 && j === n - 1);
      const c = ring[j], d = ring[(j + 1) % n];
      if (adjacent) {
        // adjacent edges share one vertex; they are bad only if they fold back onto each other
        const shared = j === i + 1 ? b : a;
        const other1 = j === i + 1 ? a : b;
        const other2 = j === i + 1 ? d : c;
        if (orient(other1, shared, other2) === 0 &&
            (other2[0] - shared[0]) * (other1[0] - shared[0]) + (other2[1] - shared[1]) * (other1[1] - shared[1]) > 0)
          return [i, j];
        continue;
      }
      if (segmentsIntersect(a, b, c, d)) return [i, j];
    }
  }
  return null;
}

/** The source plane of a footprint polygon for flow towards azimuthDeg (see the module header). */
export function footprintSourcePlane(
  footprintEN: readonly (readonly [number, number])[],
  azimuthDeg: number,
): SourcePlane {
  if (!Number.isFinite(azimuthDeg)) throw new Error(`flow azimuth must be a finite number of degrees, got ${azimuthDeg}`);
  const ring = cleanRing(footprintEN);
  if (ring.length < 3)
    throw new Error(`source footprint needs at least 3 distinct vertices, got ${ring.length}`);
  const area = ringArea(ring);
  let minE = Infinity, maxE = -Infinity, minN = Infinity, maxN = -Infinity;
  for (const [e, n] of ring) {
    minE = Math.min(minE, e); maxE = Math.max(maxE, e); minN = Math.min(minN, n); maxN = Math.max(maxN, n);
  }
  const span = Math.max(maxE - minE, maxN - minN);
  // all vertices on one line (to ~1e-12 relative rounding noise of the coordinates)
  const flat = 1e-12 * span * span;
  if (ring.every((p) => Math.abs(orient(ring[0], ring[1], p)) <= flat))
    throw new Error('source footprint has zero area (its vertices lie on one line)');
  const hit = firstSelfIntersection(ring);
  if (hit)
    throw new Error(
      `source footprint crosses itself (edge ${hit[0] + 1} meets edge ${hit[1] + 1}); trace its outline without crossings`,
    );
  // a simple polygon that is not flat has positive area; kept as a guard
  if (!(Math.abs(area) > flat / 2)) throw new Error('source footprint has zero area');

  return { ...planeAcross(ring, azimuthDeg), area: Math.abs(area) };
}

/**
 * The source plane of a footprint already checked by footprintSourcePlane (`ring` its vertices),
 * for another flow direction: only the extents along and across the flow, no checks. For work
 * that turns the flow many times (a Monte Carlo run with an uncertain direction).
 */
export function planeAcross(ring: readonly (readonly [number, number])[], azimuthDeg: number): Omit<SourcePlane, 'area'> {
  const origin = ring[0];
  const [s, c] = sinCosDeg(azimuthDeg);
  let minX = Infinity, maxX = -Infinity, minY = Infinity, maxY = -Infinity;
  for (const p of ring) {
    // geo/flowFrame.ts toFlow, its sine and cosine once for the ring
    const de = p[0] - origin[0], dn = p[1] - origin[1];
    const x = de * s + dn * c, y = -de * c + dn * s;
    minX = Math.min(minX, x); maxX = Math.max(maxX, x); minY = Math.min(minY, y); maxY = Math.max(maxY, y);
  }
  return {
    centreEN: fromFlow(origin as [number, number], azimuthDeg, { x: maxX, y: (minY + maxY) / 2 }),
    width: maxY - minY,
    upgradientLength: maxX - minX,
  };
}
