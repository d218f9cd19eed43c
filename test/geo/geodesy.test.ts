import { describe, expect, it } from 'vitest';
import { azimuthDeg, distanceMetres } from '../../src/geo/geodesy';
import { makeLocalFrame } from '../../src/geo/projection';
import type { Position } from '../../src/case/schema';
import { angleDiff, geodesicDirect, geodesicInverse } from './reference';

// Reference: geographiclib-geodesic (Karney 2013, J. Geodesy 87), geodesics on WGS 84.
// Requirement (issue 3): distances better than 0.1 % over 10 km. We also hold the method to the
// much tighter bounds stated in src/geo/geodesy.ts and print the measured worst errors.
const LATITUDES = [0, 45, 70, -45, -70];
const RANGES = [1_000, 10_000, 30_000];
const LONGITUDES = [-179.5, -60, 0, 33.3, 150];

describe('distanceMetres / azimuthDeg (geographic) against geographiclib', () => {
  const worst: Record<string, { dist: number; azi: number }> = {};
  for (const lat of LATITUDES) {
    for (const s of RANGES) {
      it(`latitude ${lat}°, ${s / 1000} km, all directions`, () => {
        let wd = 0, wa = 0;
        for (const lon of LONGITUDES) {
          const a: Position = [lon, lat];
          for (let az = 0; az < 360; az += 7.5) {
            // the far point from the reference Direct problem, then the reference Inverse
            const b = geodesicDirect(a, az, s);
            const ref = geodesicInverse(a, b);
            const d = distanceMetres(a, b, 'geographic');
            const z = azimuthDeg(a, b, 'geographic');
            const rel = Math.abs(d - ref.s) / ref.s;
            const da = angleDiff(z, ref.azi);
            if (!(rel < 1e-9) || !(da < 2e-6))
              throw new Error(`a=${a} az=${az} s=${s}: distance ${d} vs ${ref.s} (rel ${rel}), azimuth ${z} vs ${ref.azi} (Δ ${da}°)`);
            wd = Math.max(wd, rel);
            wa = Math.max(wa, da);
          }
        }
        worst[`${lat}° ${s / 1000} km`] = { dist: wd, azi: wa };
        expect(wd).toBeLessThan(1e-3); // issue 3 requirement
        expect(wd).toBeLessThan(1e-9); // stated accuracy of the method
        expect(wa).toBeLessThan(2e-6); // degrees, stated accuracy
      });
    }
  }
  it('prints the measured worst errors', () => {
    console.log('geodesy vs geographiclib, worst relative distance error and azimuth error (deg):');
    for (const [k, v] of Object.entries(worst)) console.log(`  ${k}: ${v.dist.toExponential(2)}  ${v.azi.toExponential(2)}`);
    expect(Object.keys(worst).length).toBe(LATITUDES.length * RANGES.length);
  });

  it('tangent-plane distance alone (hypot of toEN) also meets 0.1 % at 10 km, with the s²/6R² shrink', () => {
    // a cross-check of projection.ts against the same reference: relative shrink ≈ (s/R)²/6
    // (series of R·sin(s/R); spherical estimate with R = 6371 km, so ± 1 % of the shrink itself)
    for (const lat of [0, 45, 70]) {
      const a: Position = [10, lat];
      const f = makeLocalFrame('geographic', a);
      const b = geodesicDirect(a, 30, 10_000);
      const [e, n] = f.toEN(b);
      const rel = (geodesicInverse(a, b).s - Math.hypot(e, n)) / 10_000;
      expect(rel).toBeLessThan(1e-3);
      expect(rel).toBeGreaterThan(0);
      expect(rel).toBeLessThan(2 * (10 / 6371) ** 2 / 6);
    }
  });
});

describe('edge cases', () => {
  it('coincident points: distance 0, azimuth refused', () => {
    expect(distanceMetres([5, 5], [5, 5], 'geographic')).toBe(0);
    expect(() => azimuthDeg([5, 5], [5, 5], 'geographic')).toThrow(/coincident/);
    expect(() => azimuthDeg([5, 5], [5, 5], 'local')).toThrow(/coincident/);
  });
  it('across the antimeridian', () => {
    const a: Position = [179.99, -16];
    const b: Position = [-179.99, -16];
    const ref = geodesicInverse(a, b);
    expect(Math.abs(distanceMetres(a, b, 'geographic') - ref.s) / ref.s).toBeLessThan(1e-8);
    expect(angleDiff(azimuthDeg(a, b, 'geographic'), ref.azi)).toBeLessThan(1e-5);
  });
  it('local frame: Euclidean, azimuth clockwise from north', () => {
    expect(distanceMetres([0, 0], [3, 4], 'local')).toBe(5);
    expect(azimuthDeg([0, 0], [0, 10], 'local')).toBe(0);
    expect(azimuthDeg([0, 0], [10, 0], 'local')).toBe(90);
    expect(azimuthDeg([0, 0], [0, -10], 'local')).toBe(180);
    expect(azimuthDeg([0, 0], [-10, 0], 'local')).toBe(270);
    expect(azimuthDeg([0, 0], [-1, 1], 'local')).toBeCloseTo(315, 12);
  });
  it('rejects bad input with the field and range named', () => {
    expect(() => distanceMetres([0, 95], [0, 0], 'geographic')).toThrow(/first position latitude.*\[-90, 90\]/);
    expect(() => distanceMetres([0, 0], [NaN, 0], 'local')).toThrow(/second position/);
    expect(() => distanceMetres([0, 0], [20, 0], 'geographic')).toThrow(/within 1000 km/);
    expect(() => distanceMetres([0, 0], [1, 0], 'polar' as never)).toThrow(/frame/);
  });
});
