/**
 * Reference geodesics from geographiclib-geodesic (npm; C. F. F. Karney 2013, "Algorithms for
 * geodesics", J. Geodesy 87, 43–55), accurate to about 15 nm on WGS 84: an implementation
 * wholly independent of src/geo.
 */
import { Geodesic } from 'geographiclib-geodesic';
import type { Position } from '../../src/case/schema';

const G = Geodesic.WGS84;

/** point at distance s (m) from `from` along initial azimuth azi (deg) */
export function geodesicDirect(from: Position, azi: number, s: number): Position {
  const r = G.Direct(from[1], from[0], azi, s);
  return [r.lon2 as number, r.lat2 as number];
}

/** geodesic distance (m) and initial azimuth (deg, in [0, 360)) from a to b */
export function geodesicInverse(a: Position, b: Position): { s: number; azi: number } {
  const r = G.Inverse(a[1], a[0], b[1], b[0]);
  const azi = ((r.azi1 as number) % 360 + 360) % 360;
  return { s: r.s12 as number, azi };
}

/** smallest difference of two angles in degrees */
export function angleDiff(a: number, b: number): number {
  const d = (((a - b) % 360) + 540) % 360 - 180;
  return Math.abs(d);
}
