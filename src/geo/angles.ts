/**
 * Angles in degrees, reduced exactly. `sinDeg`/`cosDeg` reduce the angle modulo 360 before
 * converting to radians, so multiples of 90° give exact 0 and ±1 (Math.sin(Math.PI) is 1.2e-16,
 * not 0) and a flow towards due east puts a point exactly on the axis.
 */

/** angle in [0, 360) */
export function normalizeDeg(deg: number): number {
  const r = deg % 360;
  const n = r < 0 ? r + 360 : r;
  // (-1e-17) + 360 rounds to 360; keep the half-open range
  return n >= 360 ? 0 : n;
}

const RAD = Math.PI / 180;

/** sin and cos of an angle in degrees, exact at multiples of 90° */
export function sinCosDeg(deg: number): [number, number] {
  if (!Number.isFinite(deg)) throw new RangeError(`angle must be a finite number of degrees, got ${deg}`);
  const a = normalizeDeg(deg);
  if (a === 0) return [0, 1];
  if (a === 90) return [1, 0];
  if (a === 180) return [0, -1];
  if (a === 270) return [-1, 0];
  return [Math.sin(a * RAD), Math.cos(a * RAD)];
}

/** azimuth (degrees clockwise from north = +n, in [0, 360)) of the vector (dE, dN) */
export function azimuthOfVector(dE: number, dN: number): number {
  return normalizeDeg(Math.atan2(dE, dN) / RAD);
}
