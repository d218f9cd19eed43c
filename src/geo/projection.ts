/**
 * Map positions ↔ local east/north metres at the site datum.
 *
 * geographic: positions are [longitude, latitude] in degrees on WGS 84 (a = 6378137 m,
 *   f = 1/298.257223563; NIMA TR8350.2, 3rd ed., Table 3.1), heights taken as 0 on the ellipsoid.
 *   toEN: geodetic → Earth-centred Earth-fixed (ECEF) → local tangent plane at the datum
 *   (east, north; the up component is dropped). This is the orthographic projection of the
 *   ellipsoid onto the tangent plane along the datum's normal: exact as a mapping, and fromEN is
 *   its exact inverse (the point on the ellipsoid whose tangent-plane coordinates are (e, n) on the
 *   near side), so a round trip returns the position to rounding error (sub-micrometre at 100 km).
 *   Distances measured in the plane shrink by about s²/(6R²) relative (4e-7 at 10 km; see
 *   geodesy.ts for a corrected distance). The plane's north is true north at the datum only:
 *   elsewhere true north is turned by the meridian convergence γ ≈ −Δλ·sin φ (convergenceDeg).
 *   fromEN: point on the tangent plane → move along the datum's up axis onto the ellipsoid
 *   (a quadratic, solved in its cancellation-free form) → ECEF → geodetic by Bowring's 1976 iteration
 *   (Survey Review 23(181)), which converges to machine precision in ≤ 3 steps near the surface.
 * local: positions already are [east, north] in metres from the datum; both maps are the identity.
 */
import type { Position } from '../case/schema';

export type Frame = 'geographic' | 'local';

export interface LocalFrame {
  readonly frame: Frame;
  readonly datum: Position;
  /** map position → [east, north] metres from the datum */
  toEN(p: Position): [number, number];
  /** [east, north] metres from the datum → map position */
  fromEN(en: readonly [number, number]): Position;
  /**
   * Meridian convergence at p, degrees: the angle, clockwise, from the plane's north to the
   * direction of true north at p. A direction with true azimuth α at p has azimuth α + γ in the
   * plane (to first order; the plane's angular distortion is ~(r/R)², 1e-8 rad at 1 km).
   * γ ≈ −Δλ·sin φ (Δλ: longitude east of the datum): −0.025° for a point 1 km east of the datum
   * at 70° N, where true north leans west towards the pole; 0 in a local frame.
   */
  convergenceDeg(p: Position): number;
}

/** WGS 84 defining constants (NIMA TR8350.2, Table 3.1) */
export const WGS84 = Object.freeze({ a: 6378137, f: 1 / 298.257223563 });
const A = WGS84.a;
const F = WGS84.f;
const B = A * (1 - F);
const E2 = F * (2 - F); // first eccentricity squared
const EP2 = E2 / (1 - E2); // second eccentricity squared
const RAD = Math.PI / 180;

/** Largest offset from the datum accepted by toEN (straight-line) and fromEN (in the plane):
 * far beyond any site, well inside the horizon, so every accepted value inverts exactly. */
export const MAX_LOCAL_OFFSET_M = 1_000_000;

function checkLonLat(p: readonly number[], what: string): void {
  if (!Array.isArray(p) || p.length < 2) throw new RangeError(`${what} must be a [longitude, latitude] pair`);
  const [lon, lat] = p;
  if (!Number.isFinite(lon) || lon < -180 || lon > 180)
    throw new RangeError(`the ${what}'s longitude must lie between −180° and 180° (it is ${lon})`);
  if (!Number.isFinite(lat) || lat < -90 || lat > 90)
    throw new RangeError(`the ${what}'s latitude must lie between −90° and 90° (it is ${lat})`);
}

function checkEN(en: readonly number[], what: string): void {
  if (!Array.isArray(en) || en.length < 2 || !Number.isFinite(en[0]) || !Number.isFinite(en[1]))
    throw new RangeError(`${what} must be a pair of finite [east, north] metres, got ${JSON.stringify(en)}`);
}

/** geodetic (degrees, height 0) → ECEF metres */
export function geodeticToEcef(lonDeg: number, latDeg: number, h = 0): [number, number, number] {
  const lam = lonDeg * RAD;
  const phi = latDeg * RAD;
  const sp = Math.sin(phi);
  const cp = Math.cos(phi);
  const n = A / Math.sqrt(1 - E2 * sp * sp);
  return [(n + h) * cp * Math.cos(lam), (n + h) * cp * Math.sin(lam), (n * (1 - E2) + h) * sp];
}

/** ECEF metres → [lon, lat] degrees and ellipsoidal height (Bowring's iteration) */
export function ecefToGeodetic(x: number, y: number, z: number): { lon: number; lat: number; h: number } {
  const p = Math.hypot(x, y);
  const lon = p === 0 ? 0 : Math.atan2(y, x) / RAD;
  if (p === 0) {
    // on the polar axis
    return { lon, lat: z >= 0 ? 90 : -90, h: Math.abs(z) - B };
  }
  // reduced latitude as the starting value, then Bowring's formula iterated
  let beta = Math.atan2(z, (1 - F) * p);
  let phi = 0;
  for (let k = 0; k < 5; k++) {
    const sb = Math.sin(beta);
    const cb = Math.cos(beta);
    const next = Math.atan2(z + EP2 * B * sb * sb * sb, p - E2 * A * cb * cb * cb);
    const done = k > 0 && Math.abs(next - phi) < 1e-15;
    phi = next;
    beta = Math.atan2((1 - F) * Math.sin(phi), Math.cos(phi));
    if (done) break;
  }
  const sp = Math.sin(phi);
  const cp = Math.cos(phi);
  const n = A / Math.sqrt(1 - E2 * sp * sp);
  const h = p * cp + z * sp - A * A / n; // = p cosφ + z sinφ − a²/N, stable at all latitudes
  return { lon, lat: phi / RAD, h };
}

/** The local frame at the datum (see the module header). */
export function makeLocalFrame(frame: Frame, datum: Position): LocalFrame {
  if (frame === 'local') {
    checkEN(datum, 'local datum');
    const d: Position = [datum[0], datum[1]];
    return {
      frame,
      datum: d,
      toEN(p) {
        checkEN(p, 'local position');
        return [p[0], p[1]];
      },
      fromEN(en) {
        checkEN(en, 'east/north offset');
        return [en[0], en[1]];
      },
      convergenceDeg(p) {
        checkEN(p, 'local position');
        return 0;
      },
    };
  }
  if (frame !== 'geographic') throw new RangeError(`frame must be 'geographic' or 'local', got ${String(frame)}`);
  checkLonLat(datum, 'datum');
  const d: Position = [datum[0], datum[1]];
  const lam = d[0] * RAD;
  const phi = d[1] * RAD;
  const sl = Math.sin(lam), cl = Math.cos(lam), sp = Math.sin(phi), cp = Math.cos(phi);
  const o = geodeticToEcef(d[0], d[1]);
  // unit vectors of the local frame in ECEF
  const east = [-sl, cl, 0];
  const north = [-sp * cl, -sp * sl, cp];
  const up = [cp * cl, cp * sl, sp];
  // quadratic coefficient of the ellipsoid along `up` (constant for the frame)
  const qa = (up[0] * up[0] + up[1] * up[1]) / (A * A) + (up[2] * up[2]) / (B * B);

  return {
    frame,
    datum: d,
    toEN(p) {
      checkLonLat(p, 'position');
      const q = geodeticToEcef(p[0], p[1]);
      const dx = q[0] - o[0], dy = q[1] - o[1], dz = q[2] - o[2];
      // beyond site scale (or on the far side of the Earth, where the tangent plane folds back
      // and two positions share one east/north) the result would not invert: refuse it
      if (Math.hypot(dx, dy, dz) > MAX_LOCAL_OFFSET_M)
        throw new RangeError(
          `it must lie within ${MAX_LOCAL_OFFSET_M / 1000} km of the site datum [${d[0]}, ${d[1]}]`,
        );
      return [east[0] * dx + east[1] * dy, north[0] * dx + north[1] * dy + north[2] * dz];
    },
    fromEN(en) {
      checkEN(en, 'east/north offset');
      const [e, n] = en;
      if (Math.hypot(e, n) > MAX_LOCAL_OFFSET_M)
        throw new RangeError(
          `east/north offset must lie within ${MAX_LOCAL_OFFSET_M / 1000} km of the datum, got ${Math.hypot(e, n).toFixed(0)} m`,
        );
      // offsets from the datum along east and north (small numbers, kept apart from the
      // large ECEF origin so the constant term of the quadratic does not cancel)
      const rx = e * east[0] + n * north[0];
      const ry = e * east[1] + n * north[1];
      const rz = n * north[2];
      // point = o + r + u·up on the ellipsoid:  qa u² + qb u + qc = 0, with
      // qc = |o + r|² (scaled) − 1 = (2 o·r + r·r)(scaled), since o is on the ellipsoid
      const qb = 2 * (((o[0] + rx) * up[0] + (o[1] + ry) * up[1]) / (A * A) + ((o[2] + rz) * up[2]) / (B * B));
      const qc = ((2 * o[0] + rx) * rx + (2 * o[1] + ry) * ry) / (A * A) + ((2 * o[2] + rz) * rz) / (B * B);
      const disc = qb * qb - 4 * qa * qc;
      if (!(disc >= 0)) throw new RangeError('east/north offset lies beyond the horizon of the datum');
      const u = (-2 * qc) / (qb + Math.sqrt(disc)); // the near-side root, without cancellation
      const g = ecefToGeodetic(o[0] + rx + u * up[0], o[1] + ry + u * up[1], o[2] + rz + u * up[2]);
      return [g.lon, g.lat];
    },
    convergenceDeg(p) {
      checkLonLat(p, 'position');
      const lp = p[0] * RAD, fp = p[1] * RAD;
      // true north at p in ECEF, expressed in the plane's east/north
      const nx = -Math.sin(fp) * Math.cos(lp), ny = -Math.sin(fp) * Math.sin(lp), nz = Math.cos(fp);
      const e = east[0] * nx + east[1] * ny;
      const n = north[0] * nx + north[1] * ny + north[2] * nz;
      return Math.atan2(e, n) / RAD;
    },
  };
}
