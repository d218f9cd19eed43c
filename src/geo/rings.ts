/** Planar ring helpers shared by footprint.ts and contours.ts. */

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
