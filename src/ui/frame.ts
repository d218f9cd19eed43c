/**
 * Moving a case between coordinate frames: map positions in longitude/latitude (WGS 84), or
 * metres east and north of a site datum. Every position goes through the local tangent plane at
 * the datum (src/geo/projection.ts), so distances and directions on the ground are kept.
 */
import { makeLocalFrame } from '../geo/projection';
import { pointInRing, ringCentroid } from '../geo/rings';
import type { Case, Position } from '../case/schema';

/** Convert every position of the case to another frame (exact, through the tangent plane). */
export function convertFrame(c: Case, to: 'geographic' | 'local', geoDatum: Position): Case {
  const from = makeLocalFrame(c.site.frame, c.site.datum);
  // local → geographic: the local datum [0, 0] lands on geoDatum; geographic → local: metres from the current datum
  const target = makeLocalFrame(to, to === 'geographic' ? geoDatum : [0, 0]);
  const conv = (p: Position): Position => target.fromEN(from.toEN(p));
  const d = structuredClone(c);
  d.site.frame = to;
  d.site.datum = to === 'geographic' ? [geoDatum[0], geoDatum[1]] : [0, 0];
  d.site.source.position = conv(d.site.source.position);
  if (d.site.source.footprint) d.site.source.footprint = d.site.source.footprint.map(conv);
  d.site.receptors.forEach((r) => (r.position = conv(r.position)));
  if (d.site.flow.method === 'heads') d.site.flow.readings.forEach((h) => (h.position = conv(h.position)));
  // boundary lines (version 3) and placed monitoring wells move with the rest
  for (const b of d.site.boundaries ?? []) b.points = [conv(b.points[0]), conv(b.points[1])];
  for (const w of d.monitoring.wells) if (w.position) w.position = conv(w.position);
  return d;
}


/** Move the release point to `to` (map position); a traced footprint moves with it, unchanged in shape. */
export function moveSource(d: Case, to: Position): void {
  const lf = makeLocalFrame(d.site.frame, d.site.datum);
  const [e0, n0] = lf.toEN(d.site.source.position);
  const [e1, n1] = lf.toEN(to);
  d.site.source.position = to;
  if (d.site.source.footprint)
    d.site.source.footprint = d.site.source.footprint.map((p) => {
      const [e, n] = lf.toEN(p);
      return lf.fromEN([e + e1 - e0, n + n1 - n0]);
    });
}

/**
 * The release point of a case while it has a traced outline that does not hold it, as an offset
 * from the outline's centroid (east, north metres), by case id, for this session: tracing an
 * outline away from the release moves the release into the outline, and going back to a point
 * with a width puts it back where it was (moved along with the outline if that was dragged since).
 */
const pointOffsetFromOutline = new Map<string, [number, number]>();

/** Where the release point is when the case goes back to a point with a width (map position). */
function pointRelease(d: Case): Position {
  const off = pointOffsetFromOutline.get(d.id);
  if (!off || !d.site.source.footprint) return d.site.source.position;
  const lf = makeLocalFrame(d.site.frame, d.site.datum);
  const c = ringCentroid(d.site.source.footprint.map((p) => lf.toEN(p)));
  return lf.fromEN([c[0] + off[0], c[1] + off[1]]);
}

/** A traced outline becomes the release's: the release stays where it is if the outline holds it, else moves to its centroid. */
export function setFootprint(d: Case, ring: Position[]): void {
  const lf = makeLocalFrame(d.site.frame, d.site.datum);
  const point = lf.toEN(pointRelease(d));
  const ringEN = ring.map((p) => lf.toEN(p));
  d.site.source.footprint = ring;
  if (pointInRing(point, ringEN)) {
    pointOffsetFromOutline.delete(d.id);
    d.site.source.position = lf.fromEN(point);
    return;
  }
  const c = ringCentroid(ringEN);
  pointOffsetFromOutline.set(d.id, [point[0] - c[0], point[1] - c[1]]);
  d.site.source.position = lf.fromEN(c);
}

/** Back to a point with a width: the outline goes, the release point is where it was before it. */
export function dropFootprint(d: Case): void {
  d.site.source.position = pointRelease(d);
  d.site.source.footprint = null;
  pointOffsetFromOutline.delete(d.id);
}
