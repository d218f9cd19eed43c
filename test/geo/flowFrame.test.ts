import { describe, expect, it } from 'vitest';
import { fromFlow, toFlow } from '../../src/geo/flowFrame';

// Conventions under test (DEVELOPERS.md, "Flow-aligned frame"): azimuth clockwise from north,
// x downgradient, y positive to the left looking downgradient.
describe('flow frame sign conventions', () => {
  it('flow to the north: north is +x, west is +y (left looking north)', () => {
    expect(toFlow([0, 0], 0, [0, 10])).toEqual({ x: 10, y: 0 });
    expect(toFlow([0, 0], 0, [-3, 0])).toEqual({ x: 0, y: 3 });
  });
  it('flow to the east: east is +x, north is +y', () => {
    expect(toFlow([0, 0], 90, [5, 0])).toEqual({ x: 5, y: 0 });
    expect(toFlow([0, 0], 90, [0, 2])).toEqual({ x: 0, y: 2 });
  });
  it('flow to the south-west: a point to the south-west is downgradient, north-west is on the right', () => {
    const s = Math.SQRT1_2;
    const down = toFlow([100, 200], 225, [100 - 10 * s, 200 - 10 * s]);
    expect(down.x).toBeCloseTo(10, 12);
    expect(down.y).toBeCloseTo(0, 12);
    const nw = toFlow([100, 200], 225, [100 - s, 200 + s]);
    expect(nw.x).toBeCloseTo(0, 12);
    expect(nw.y).toBeCloseTo(-1, 12);
  });
  it('treats azimuths modulo 360', () => {
    expect(toFlow([0, 0], 450, [0, 2])).toEqual(toFlow([0, 0], 90, [0, 2]));
    expect(toFlow([0, 0], -270, [0, 2])).toEqual(toFlow([0, 0], 90, [0, 2]));
  });
});

describe('flow frame symmetry and inverses', () => {
  it('fromFlow inverts toFlow and preserves distances (a rotation), to 1e-9 m at kilometre range', () => {
    for (let az = 0; az < 360; az += 17.3) {
      for (const p of [[1234.5, -987.25], [-3, 4], [0, 0]] as [number, number][]) {
        const src: [number, number] = [50, -20];
        const f = toFlow(src, az, p);
        const back = fromFlow(src, az, f);
        expect(Math.abs(back[0] - p[0])).toBeLessThan(1e-9);
        expect(Math.abs(back[1] - p[1])).toBeLessThan(1e-9);
        expect(Math.hypot(f.x, f.y)).toBeCloseTo(Math.hypot(p[0] - src[0], p[1] - src[1]), 9);
      }
    }
  });
  it('a point mirrored across the flow line flips the sign of y only', () => {
    const az = 37;
    const a = toFlow([0, 0], az, [30, 10]);
    const back1 = fromFlow([0, 0], az, { x: a.x, y: -a.y });
    const b = toFlow([0, 0], az, back1);
    expect(b.x).toBeCloseTo(a.x, 12);
    expect(b.y).toBeCloseTo(-a.y, 12);
  });
  it('reversing the flow negates both x and y', () => {
    const a = toFlow([0, 0], 60, [7, -2]);
    const b = toFlow([0, 0], 240, [7, -2]);
    expect(b.x).toBeCloseTo(-a.x, 12);
    expect(b.y).toBeCloseTo(-a.y, 12);
  });
  it('rejects non-finite input', () => {
    expect(() => toFlow([0, 0], NaN, [1, 1])).toThrow(/angle/);
    expect(() => toFlow([0, 0], 0, [1, Infinity])).toThrow(/point position/);
    expect(() => fromFlow([0, 0], 0, { x: NaN, y: 0 })).toThrow(/flow-frame point/);
  });
});

describe('map → tangent plane → flow frame chain (reference: geographiclib geodesics)', () => {
  it('a point placed s metres along the flow azimuth (true north at the source) lands on the centreline at x = s', async () => {
    const { makeLocalFrame } = await import('../../src/geo/projection');
    const { geodesicDirect } = await import('./reference');
    // tolerance: relative 1e-6 in x (tangent-plane shrink ≈ s²/6R² = 4e-7 at 10 km), and
    // |y| ≤ 2e-6·s (normal-section vs geodesic azimuth, < 1e-4°)
    for (const datum of [[0, 0], [-58.4, -34.6], [18.1, 69.6]] as [number, number][]) {
      const f = makeLocalFrame('geographic', datum);
      const source: [number, number] = [datum[0] + 0.002, datum[1] - 0.001];
      const sourceEN = f.toEN(source);
      // the source is off the datum's meridian: its true north is turned by the convergence
      const gamma = f.convergenceDeg(source);
      for (const az of [0, 45, 123.4, 200, 315]) {
        for (const s of [50, 1000, 10_000]) {
          const p = geodesicDirect(source, az, s);
          const { x, y } = toFlow(sourceEN, az + gamma, f.toEN(p));
          expect(Math.abs(x - s) / s).toBeLessThan(1e-6);
          expect(Math.abs(y)).toBeLessThan(2e-6 * s);
          // and back to the map, to sub-millimetre
          const back = f.fromEN(fromFlow(sourceEN, az + gamma, { x, y }));
          expect(Math.abs(back[1] - p[1])).toBeLessThan(1e-8);
        }
      }
    }
  });
});
