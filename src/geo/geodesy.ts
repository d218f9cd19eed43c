/**
 * Distance and direction between two map positions at site scale.
 *
 * geographic ([lon, lat] on WGS 84): the normal section from a to b. Both points go to ECEF; the
 * direction is the azimuth of b in the tangent plane at a (the normal-section azimuth), and the
 * distance is the arc of a circle through a and b with the ellipsoid's radius of curvature at a
 * in that azimuth (Euler: 1/Rα = cos²α/M + sin²α/N), from the chord c: s = 2Rα·asin(c / 2Rα).
 * This is an approximation to the geodesic; against geographiclib (Karney 2013, J. Geodesy 87)
 * the measured worst relative distance error up to 30 km at latitudes 0–70° is 4e-11 (bound held: 1e-9) and
 * the azimuth error 7e-7° (bound held: 2e-6°; test/geo/geodesy.test.ts prints the figures). Accepted range:
 * points up to 1000 km apart (site scale; beyond that the approximation is not checked).
 * local ([east, north] metres): Euclidean distance and the azimuth of the difference vector.
 *
 * azimuthDeg: degrees clockwise from north in [0, 360); throws for coincident points, where the
 * direction is undefined.
 */
import type { Position } from '../case/schema';
import { azimuthOfVector } from './angles';
import { geodeticToEcef, WGS84, type Frame } from './projection';

const E2 = WGS84.f * (2 - WGS84.f);
const RAD = Math.PI / 180;
/** largest separation accepted, m */
export const MAX_SEPARATION_M = 1_000_000;

function check(p: Position, what: string, frame: Frame): void {
  if (!Array.isArray(p) || p.length < 2 || !Number.isFinite(p[0]) || !Number.isFinite(p[1]))
    throw new RangeError(`${what} must be a pair of finite numbers, got ${JSON.stringify(p)}`);
  if (frame === 'geographic') {
    if (p[0] < -180 || p[0] > 180) throw new RangeError(`${what} longitude must be in [-180, 180] degrees, got ${p[0]}`);
    if (p[1] < -90 || p[1] > 90) throw new RangeError(`${what} latitude must be in [-90, 90] degrees, got ${p[1]}`);
  } else if (frame !== 'local') {
    throw new RangeError(`frame must be 'geographic' or 'local', got ${String(frame)}`);
  }
}

interface Section {
  /** east, north of b in the tangent plane at a, m */
  e: number;
  n: number;
  /** chord |b − a|, m */
  chord: number;
  /** latitude of a, radians */
  phi: number;
}

function section(a: Position, b: Position): Section {
  const pa = geodeticToEcef(a[0], a[1]);
  const pb = geodeticToEcef(b[0], b[1]);
  const dx = pb[0] - pa[0], dy = pb[1] - pa[1], dz = pb[2] - pa[2];
  const chord = Math.hypot(dx, dy, dz);
  if (chord > MAX_SEPARATION_M)
    throw new RangeError(`positions must lie within ${MAX_SEPARATION_M / 1000} km of each other (site scale)`);
  const lam = a[0] * RAD, phi = a[1] * RAD;
  const sl = Math.sin(lam), cl = Math.cos(lam), sp = Math.sin(phi), cp = Math.cos(phi);
  return { e: -sl * dx + cl * dy, n: -sp * cl * dx - sp * sl * dy + cp * dz, chord, phi };
}

/** distance between a and b in metres (see the module header for the method and accuracy) */
export function distanceMetres(a: Position, b: Position, frame: Frame): number {
  check(a, 'first position', frame);
  check(b, 'second position', frame);
  if (frame === 'local') return Math.hypot(b[0] - a[0], b[1] - a[1]);
  const { e, n, chord, phi } = section(a, b);
  if (chord === 0) return 0;
  const sp = Math.sin(phi);
  const w2 = 1 - E2 * sp * sp;
  const N = WGS84.a / Math.sqrt(w2); // prime vertical radius of curvature
  const M = (WGS84.a * (1 - E2)) / (w2 * Math.sqrt(w2)); // meridian radius of curvature
  const h2 = e * e + n * n;
  const cos2 = h2 === 0 ? 1 : (n * n) / h2;
  const r = (M * N) / (N * cos2 + M * (1 - cos2));
  return 2 * r * Math.asin(Math.min(1, chord / (2 * r)));
}

/** direction from a to b, degrees clockwise from north in [0, 360) */
export function azimuthDeg(a: Position, b: Position, frame: Frame): number {
  check(a, 'first position', frame);
  check(b, 'second position', frame);
  if (frame === 'local') {
    const de = b[0] - a[0], dn = b[1] - a[1];
    if (de === 0 && dn === 0) throw new RangeError('azimuth is undefined for coincident positions');
    return azimuthOfVector(de, dn);
  }
  const { e, n } = section(a, b);
  if (e === 0 && n === 0) throw new RangeError('azimuth is undefined for coincident positions');
  return azimuthOfVector(e, n);
}
