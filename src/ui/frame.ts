/**
 * Moving a case between coordinate frames: map positions in longitude/latitude (WGS 84), or
 * metres east and north of a site datum. Every position goes through the local tangent plane at
 * the datum (src/geo/projection.ts), so distances and directions on the ground are kept.
 */
import { makeLocalFrame } from '../geo/projection';
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
