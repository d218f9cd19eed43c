import { describe, expect, it } from 'vitest';
import { footprintSourcePlane } from '../../src/geo/footprint';

// Widths are exact geometry (the extent of a polygon across a direction is attained at its
// vertices); tolerances of 1e-9 m only absorb rounding of the rotations.
const TOL = 9;

function rotated(rect: [number, number][], deg: number, about: [number, number] = [0, 0]): [number, number][] {
  const c = Math.cos((deg * Math.PI) / 180), s = Math.sin((deg * Math.PI) / 180);
  return rect.map(([e, n]) => [about[0] + c * e - s * n, about[1] + s * e + c * n]);
}

describe('footprintSourcePlane', () => {
  it('axis-aligned rectangle, flow to the east: width is the north–south side, centre on the east edge', () => {
    const r: [number, number][] = [[0, 0], [20, 0], [20, 10], [0, 10]];
    const sp = footprintSourcePlane(r, 90);
    expect(sp.width).toBeCloseTo(10, TOL);
    expect(sp.upgradientLength).toBeCloseTo(20, TOL);
    expect(sp.centreEN[0]).toBeCloseTo(20, TOL);
    expect(sp.centreEN[1]).toBeCloseTo(5, TOL);
    expect(sp.area).toBeCloseTo(200, TOL);
  });

  it('same rectangle, flow to the north: width 20, centre on the north edge', () => {
    const sp = footprintSourcePlane([[0, 0], [20, 0], [20, 10], [0, 10]], 0);
    expect(sp.width).toBeCloseTo(20, TOL);
    expect(sp.upgradientLength).toBeCloseTo(10, TOL);
    expect(sp.centreEN).toEqual([10, 10]);
  });

  it('square under diagonal flow: width is the diagonal s·√2, the source plane at the far corner', () => {
    const sp = footprintSourcePlane([[0, 0], [10, 0], [10, 10], [0, 10]], 45);
    expect(sp.width).toBeCloseTo(10 * Math.SQRT2, TOL);
    expect(sp.upgradientLength).toBeCloseTo(10 * Math.SQRT2, TOL);
    expect(sp.centreEN[0]).toBeCloseTo(10, TOL);
    expect(sp.centreEN[1]).toBeCloseTo(10, TOL);
  });

  it('rotated rectangle with flow along its long side: width is the short side, for any rotation', () => {
    const base: [number, number][] = [[0, 0], [40, 0], [40, 15], [0, 15]];
    for (const rot of [0, 12, 33.3, 90, 145, 271]) {
      const poly = rotated(base, rot, [500, -300]);
      // the long side points along math angle `rot` (counter-clockwise from east) = azimuth 90 − rot
      const sp = footprintSourcePlane(poly, 90 - rot);
      expect(sp.width).toBeCloseTo(15, TOL);
      expect(sp.upgradientLength).toBeCloseTo(40, TOL);
      // centre: midpoint of the downgradient short side
      const mid = rotated([[40, 7.5]], rot, [500, -300])[0];
      expect(sp.centreEN[0]).toBeCloseTo(mid[0], TOL);
      expect(sp.centreEN[1]).toBeCloseTo(mid[1], TOL);
    }
  });

  it('triangle: width across the flow and orientation do not depend on the vertex order', () => {
    const tri: [number, number][] = [[0, 0], [10, 0], [4, 6]];
    const a = footprintSourcePlane(tri, 0);
    const b = footprintSourcePlane([...tri].reverse(), 0);
    expect(a.width).toBeCloseTo(10, TOL);
    expect(a.upgradientLength).toBeCloseTo(6, TOL);
    expect(a.centreEN[0]).toBeCloseTo(5, TOL); // across-flow midpoint, not the apex at e = 4
    expect(a.centreEN[1]).toBeCloseTo(6, TOL);
    expect(b).toEqual(a);
    expect(a.area).toBeCloseTo(30, TOL);
  });

  it('accepts a closed ring and repeated vertices', () => {
    const sp = footprintSourcePlane([[0, 0], [0, 0], [20, 0], [20, 10], [0, 10], [0, 0]], 90);
    expect(sp.width).toBeCloseTo(10, TOL);
  });

  it('rejects degenerate footprints with a clear message', () => {
    expect(() => footprintSourcePlane([[0, 0], [1, 1]], 0)).toThrow(/at least 3 distinct vertices, got 2/);
    expect(() => footprintSourcePlane([[0, 0], [1, 1], [0, 0]], 0)).toThrow(/at least 3/);
    expect(() => footprintSourcePlane([[0, 0], [1, 1], [2, 2]], 0)).toThrow(/zero area/);
    // bow tie
    expect(() => footprintSourcePlane([[0, 0], [10, 10], [10, 0], [0, 10]], 0)).toThrow(/crosses itself/);
    // a vertex touching a non-adjacent edge
    expect(() => footprintSourcePlane([[0, 0], [10, 0], [10, 10], [5, 0], [0, 10]], 0)).toThrow(/crosses itself/);
    // an edge folding back on its neighbour (spike)
    expect(() => footprintSourcePlane([[0, 0], [10, 0], [10, 10], [10, 5], [0, 10]], 0)).toThrow(/crosses itself/);
    expect(() => footprintSourcePlane([[0, 0], [1, NaN], [2, 0]], 0)).toThrow(/vertex 2/);
    expect(() => footprintSourcePlane([[0, 0], [1, 0], [0, 1]], Infinity)).toThrow(/azimuth/);
  });
});
