import { describe, expect, it } from 'vitest';
import { ringArea, ringCentroid, openRing, pointInRing } from '../../src/geo/rings';

// References are exact elementary geometry, independent of the shoelace formula under test:
// - a triangle's centroid is the mean of its vertices, its area ½|base × height|;
// - a composite shape's area is the sum of its parts' and its centroid the area-weighted mean of
//   theirs (the method of composite areas of any statics text);
// - a regular n-gon inscribed in a circle of radius r has area (n/2)·r²·sin(2π/n) and its centroid
//   at the circle's centre.
// Tolerances: relative 1e-12 (rounding only); 1e-6 m where coordinates are map-sized (≈ 1e6 m).

describe('ringArea (shoelace)', () => {
  it('signs the area by orientation: counter-clockwise positive', () => {
    const sq = [[0, 0], [4, 0], [4, 3], [0, 3]];
    expect(ringArea(sq)).toBe(12);
    expect(ringArea([...sq].reverse())).toBe(-12);
  });

  it('regular 12-gon: (n/2)·r²·sin(2π/n)', () => {
    const n = 12, r = 7.5;
    const ring = Array.from({ length: n }, (_, k) => [r * Math.cos((2 * Math.PI * k) / n), r * Math.sin((2 * Math.PI * k) / n)]);
    expect(ringArea(ring)).toBeCloseTo((n / 2) * r * r * Math.sin((2 * Math.PI) / n), 12);
  });

  it('fewer than three vertices: no area', () => {
    expect(ringArea([[0, 0], [1, 1]])).toBe(0);
  });
});

describe('ringCentroid', () => {
  it('triangle: the mean of its vertices', () => {
    const c = ringCentroid([[0, 0], [9, 0], [3, 6]]);
    expect(c[0]).toBeCloseTo(4, 12);
    expect(c[1]).toBeCloseTo(2, 12);
  });

  it('L-shape: area-weighted mean of its two rectangles, either orientation, open or closed', () => {
    // 10 × 2 along the bottom (centroid (5, 1), area 20) and 2 × 6 standing on its left end
    // (x 0–2, y 2–8: centroid (1, 5), area 12) → ((5·20 + 1·12)/32, (1·20 + 5·12)/32) = (3.5, 2.5)
    const L = [[0, 0], [10, 0], [10, 2], [2, 2], [2, 8], [0, 8]];
    for (const ring of [L, [...L].reverse(), [...L, L[0]]]) {
      const c = ringCentroid(ring);
      expect(c[0]).toBeCloseTo(3.5, 12);
      expect(c[1]).toBeCloseTo(2.5, 12);
    }
    expect(ringArea(L)).toBeCloseTo(32, 12);
  });

  it('keeps its accuracy far from the origin (map-sized coordinates)', () => {
    const off = [612_345.25, 5_432_109.75];
    const ring = [[0, 0], [9, 0], [3, 6]].map(([x, y]) => [x + off[0], y + off[1]]);
    const c = ringCentroid(ring);
    expect(Math.abs(c[0] - (off[0] + 4))).toBeLessThan(1e-6);
    expect(Math.abs(c[1] - (off[1] + 2))).toBeLessThan(1e-6);
  });

  it('a ring without area (collinear or repeated points) gives the mean of its distinct vertices', () => {
    expect(ringCentroid([[0, 0], [2, 0], [4, 0]])).toEqual([2, 0]);
    expect(ringCentroid([[5, 5], [5, 5]])).toEqual([5, 5]);
    expect(() => ringCentroid([])).toThrow(/no vertices/);
  });

  it('openRing drops repeated and closing vertices', () => {
    expect(openRing([[0, 0], [0, 0], [1, 0], [1, 1], [0, 0]])).toEqual([[0, 0], [1, 0], [1, 1]]);
  });
});

describe('pointInRing (even–odd rule)', () => {
  // the L-shape above: its notch (x 2–10, y 2–8) is outside, each arm inside (elementary geometry)
  const L = [[0, 0], [10, 0], [10, 2], [2, 2], [2, 8], [0, 8]];
  it('inside each arm, outside the notch and beyond the shape, either orientation, open or closed', () => {
    for (const ring of [L, [...L].reverse(), [...L, L[0]]]) {
      expect(pointInRing([5, 1], ring)).toBe(true);
      expect(pointInRing([1, 6], ring)).toBe(true);
      expect(pointInRing([6, 5], ring)).toBe(false);
      expect(pointInRing([-1, 1], ring)).toBe(false);
      expect(pointInRing([11, 1], ring)).toBe(false);
    }
  });
  it('the centroid of a convex ring is inside it; the L-shape\'s centroid (3.5, 2.5) lies in its notch, outside', () => {
    const tri = [[0, 0], [9, 0], [3, 6]];
    expect(pointInRing(ringCentroid(tri), tri)).toBe(true);
    expect(pointInRing(ringCentroid(L), L)).toBe(false);
  });
});
