/** Planar ring helpers shared by footprint.ts, contours.ts and the map (a traced outline's centre). */

/** signed area (> 0: counter-clockwise) of a ring, open or closed; shoelace about the first vertex
 * to limit cancellation when coordinates are large */
export function ringArea(ring: readonly (readonly number[])[]): number {
  if (ring.length < 3) return 0;
  const x0 = ring[0][0], y0 = ring[0][1];
  let s = 0;
  for (let k = 1; k + 1 < ring.length; k++)
    s += (ring[k][0] - x0) * (ring[k + 1][1] - y0) - (ring[k + 1][0] - x0) * (ring[k][1] - y0);
  return s / 2;
}

/** the ring closed (last vertex = first) and counter-clockwise, as RFC 7946 §3.1.6 wants an exterior */
export function closedCounterClockwise<P extends readonly number[]>(ring: readonly P[]): P[] {
  const r = [...ring];
  const first = r[0];
  const last = r[r.length - 1];
  if (first && (first[0] !== last[0] || first[1] !== last[1])) r.push(first);
  return ringArea(r) < 0 ? r.reverse() : r;
}

/** the ring without repeated consecutive vertices and without a closing vertex equal to the first */
export function openRing<P extends readonly number[]>(ring: readonly P[]): P[] {
  const out: P[] = [];
  for (const p of ring) {
    const last = out[out.length - 1];
    if (!last || last[0] !== p[0] || last[1] !== p[1]) out.push(p);
  }
  while (out.length > 1 && out[0][0] === out[out.length - 1][0] && out[0][1] === out[out.length - 1][1]) out.pop();
  return out;
}

/**
 * Area-weighted centroid of a simple polygon given as an open or closed ring (shoelace formula,
 * taken about the first vertex to limit cancellation when coordinates are large). A ring with no
 * area (fewer than three distinct points, or all on one line) gives the mean of its vertices.
 */
export function ringCentroid(closedOrOpen: readonly (readonly number[])[]): [number, number] {
  const ring = openRing(closedOrOpen);
  if (ring.length === 0) throw new Error('ringCentroid: the ring has no vertices (accepted: one or more)');
  const x0 = ring[0][0], y0 = ring[0][1];
  let a = 0, cx = 0, cy = 0;
  for (let k = 1; k + 1 < ring.length; k++) {
    const xa = ring[k][0] - x0, ya = ring[k][1] - y0;
    const xb = ring[k + 1][0] - x0, yb = ring[k + 1][1] - y0;
    const w = xa * yb - xb * ya;
    a += w;
    cx += (xa + xb) * w;
    cy += (ya + yb) * w;
  }
  let span = 0;
  for (const p of ring) span = Math.max(span, Math.abs(p[0] - x0), Math.abs(p[1] - y0));
  if (!(Math.abs(a) > 1e-12 * span * span)) {
    let sx = 0, sy = 0;
    for (const p of ring) (sx += p[0] - x0), (sy += p[1] - y0);
    return [x0 + sx / ring.length, y0 + sy / ring.length];
  }
  return [x0 + cx / (3 * a), y0 + cy / (3 * a)];
}

/**
 * Whether a point lies inside a simple polygon given as an open or closed ring (even–odd rule by
 * a ray cast to +x; a point on the boundary may fall either way).
 */
export function pointInRing(p: readonly number[], ring: readonly (readonly number[])[]): boolean {
  let inside = false;
  for (let i = 0, j = ring.length - 1; i < ring.length; j = i++) {
    const [xi, yi] = ring[i], [xj, yj] = ring[j];
    if (yi > p[1] !== yj > p[1] && p[0] < xj + ((p[1] - yj) * (xi - xj)) / (yi - yj)) inside = !inside;
  }
  return inside;
}
