import { describe, expect, it } from 'vitest';
import { check } from '@placemarkio/check-geojson';
import { clipLines, contourBands, contourLines, contoursToGeoJSON, packContours, packedPolygons, packedToGeoJSON, packedTransferables, ringArea, type PolygonSet } from '../../src/geo/contours';
import { makeLocalFrame } from '../../src/geo/projection';
import { fromFlow } from '../../src/geo/flowFrame';

/** core-grid layout: index i*ys.length + j, xs along the flow */
function sample(xs: number[], ys: number[], f: (x: number, y: number) => number): Float64Array {
  const v = new Float64Array(xs.length * ys.length);
  xs.forEach((x, i) => ys.forEach((y, j) => (v[i * ys.length + j] = f(x, y))));
  return v;
}
const range = (a: number, b: number, n: number) => Array.from({ length: n }, (_, k) => a + ((b - a) * k) / (n - 1));
const area = (ps: PolygonSet) => ps.reduce((s, poly) => s + poly.reduce((t, r) => t + ringArea(r), 0), 0);

describe('contourBands on an analytic field', () => {
  // Elliptical Gaussian bump C = exp(−x²/2σx² − y²/2σy²): the level set C = t is the ellipse with
  // semi-axes σ·√(−2 ln t) (exact, elementary). σx ≠ σy so a transposed lattice would fail.
  const sx = 30, sy = 10;
  const bump = (x: number, y: number) => Math.exp(-(x * x) / (2 * sx * sx) - (y * y) / (2 * sy * sy));
  const levels = [0.1, 0.5, 0.9];

  function checkEllipses(xs: number[], ys: number[], areaTol: number, radiusTol: number) {
    let worstArea = 0, worstRadius = 0;
    const bands = contourBands({ values: sample(xs, ys, bump), xs, ys, thresholds: levels });
    expect(bands.map((b) => b.threshold)).toEqual(levels);
    for (const band of bands) {
      const k = Math.sqrt(-2 * Math.log(band.threshold));
      const a = sx * k, b = sy * k;
      expect(band.polygons.length).toBe(1);
      expect(band.polygons[0].length).toBe(1); // no holes
      const got = area(band.polygons);
      const want = Math.PI * a * b;
      const rel = Math.abs(got - want) / want;
      worstArea = Math.max(worstArea, rel);
      expect(rel).toBeLessThan(areaTol);
      for (const [x, y] of band.polygons[0][0]) {
        const dr = Math.abs(Math.hypot(x / a, y / b) - 1);
        worstRadius = Math.max(worstRadius, dr);
        expect(dr).toBeLessThan(radiusTol);
      }
    }
    console.log(`ellipse level sets: worst relative area error ${worstArea.toExponential(2)}, radius ${worstRadius.toExponential(2)}`);
  }

  it('uniform lattice: ellipse areas within 0.3 %, every vertex within 0.5 % of the ellipse', () => {
    // tolerance from the O(h²) error of linear interpolation: spacing 0.5 m × 0.2 m against
    // semi-axes ≥ 13.8 m × 4.6 m (the C = 0.9 level), i.e. ≥ 23 samples per semi-axis
    checkEllipses(range(-120, 120, 481), range(-40, 40, 401), 3e-3, 5e-3);
  });

  it('non-uniform lattice (spacing growing away from the centre): same tolerances', () => {
    const stretch = (n: number, L: number) => range(-1, 1, n).map((u) => L * Math.sinh(2 * u) / Math.sinh(2));
    checkEllipses(stretch(301, 120), stretch(121, 40), 3e-3, 5e-3);
  });

  it('a linear field is contoured exactly, also on a non-uniform lattice (transpose check)', () => {
    // C = x: the band C ≥ 12.5 is the rectangle [12.5, xmax] × [ymin, ymax]; linear interpolation is exact
    const xs = [0, 1, 3, 7, 10, 15, 21, 30];
    const ys = [-5, -4.5, 0, 2, 8];
    const [band] = contourBands({ values: sample(xs, ys, (x) => x), xs, ys, thresholds: [12.5] });
    expect(band.polygons.length).toBe(1);
    const ring = band.polygons[0][0];
    for (const [x, y] of ring) {
      // on the rectangle's boundary (intermediate vertices sit where lattice columns meet it)
      expect(x).toBeGreaterThanOrEqual(12.5);
      expect(x).toBeLessThanOrEqual(30);
      expect(x === 12.5 || x === 30 || y === -5 || y === 8).toBe(true);
    }
    expect(Math.min(...ring.map((p) => p[0]))).toBe(12.5);
    expect(ringArea(ring)).toBeCloseTo((30 - 12.5) * 13, 10);
    // and C = y: the band C ≥ 1 is [0, 30] × [1, 8]
    const [bandY] = contourBands({ values: sample(xs, ys, (_x, y) => y), xs, ys, thresholds: [1] });
    expect(ringArea(bandY.polygons[0][0])).toBeCloseTo(30 * 7, 10);
  });

  it('a band that fills the lattice is closed along its edge', () => {
    const xs = range(0, 50, 11), ys = range(-10, 10, 5);
    const [band] = contourBands({ values: sample(xs, ys, () => 1), xs, ys, thresholds: [0.5] });
    expect(area(band.polygons)).toBeCloseTo(50 * 20, 10);
    const [none] = contourBands({ values: sample(xs, ys, () => 1), xs, ys, thresholds: [2] });
    expect(none.polygons).toEqual([]);
  });

  it('an annulus gives one polygon with a hole: exterior counter-clockwise, hole clockwise', () => {
    // C = exp(−(r − 20)²/2·3²): C ≥ 0.5 between radii 20 ∓ 3·√(2 ln 2)
    const xs = range(-40, 40, 321), ys = range(-40, 40, 321);
    const f = (x: number, y: number) => Math.exp(-((Math.hypot(x, y) - 20) ** 2) / 18);
    const [band] = contourBands({ values: sample(xs, ys, f), xs, ys, thresholds: [0.5] });
    expect(band.polygons.length).toBe(1);
    const [outer, hole] = band.polygons[0];
    expect(band.polygons[0].length).toBe(2);
    expect(ringArea(outer)).toBeGreaterThan(0);
    expect(ringArea(hole)).toBeLessThan(0);
    const w = 3 * Math.sqrt(2 * Math.log(2));
    const want = Math.PI * ((20 + w) ** 2 - (20 - w) ** 2);
    expect(Math.abs(area(band.polygons) - want) / want).toBeLessThan(3e-3); // as above, h = 0.25 m
    for (const ring of band.polygons[0]) expect(ring[0]).toEqual(ring[ring.length - 1]);
  });

  it('two separate bumps give two polygons', () => {
    const xs = range(0, 100, 101), ys = range(-20, 20, 41);
    const f = (x: number, y: number) => Math.exp(-((x - 25) ** 2 + y * y) / 50) + Math.exp(-((x - 75) ** 2 + y * y) / 50);
    const [band] = contourBands({ values: sample(xs, ys, f), xs, ys, thresholds: [0.5] });
    expect(band.polygons.length).toBe(2);
  });

  it('rejects bad lattices and values, naming the field', () => {
    const xs = [0, 1, 2], ys = [0, 1];
    const v = new Float64Array(6);
    expect(() => contourBands({ values: v, xs: [0, 2, 1], ys, thresholds: [0.5] })).toThrow(/xs must be strictly increasing/);
    expect(() => contourBands({ values: v, xs, ys: [0], thresholds: [0.5] })).toThrow(/ys must hold at least 2/);
    expect(() => contourBands({ values: new Float64Array(5), xs, ys, thresholds: [0.5] })).toThrow(/values must hold .* 6/);
    const bad = new Float64Array(6); bad[3] = NaN;
    expect(() => contourBands({ values: bad, xs, ys, thresholds: [0.5] })).toThrow(/values\[3\] \(x = 1, y = 1\)/);
    expect(() => contourBands({ values: v, xs, ys, thresholds: [Infinity] })).toThrow(/thresholds\[0\]/);
  });
});

describe('contoursToGeoJSON', () => {
  const xs = range(-20, 200, 111), ys = range(-60, 60, 61);
  // an invented plume-like field: decays along x, spreads across it
  const plume = (x: number, y: number) => {
    const s = 5 + 0.15 * Math.max(x, 0);
    return Math.exp(-Math.max(x, 0) / 120) * Math.exp(-(y * y) / (2 * s * s)) * (x < -5 ? Math.exp((x + 5) / 3) : 1);
  };
  const bands = contourBands({ values: sample(xs, ys, plume), xs, ys, thresholds: [0.01, 0.1, 0.5] });

  it('writes valid RFC 7946 (check-geojson), [lon, lat], CCW exteriors, CW holes, closed rings', () => {
    const frame = makeLocalFrame('geographic', [-3.2, 55.9]);
    const sourceEN: [number, number] = [120, -40];
    const toMap = (x: number, y: number) => frame.fromEN(fromFlow(sourceEN, 137, { x, y }));
    const fc = contoursToGeoJSON(bands, toMap);
    expect(() => check(JSON.stringify(fc))).not.toThrow();
    expect(fc.features.length).toBe(3);
    for (const f of fc.features) {
      expect(f.properties).toMatchObject({ unit: 'mg/L' });
      for (const poly of f.geometry.coordinates) {
        expect(ringArea(poly[0])).toBeGreaterThan(0);
        for (const hole of poly.slice(1)) expect(ringArea(hole)).toBeLessThan(0);
        for (const ring of poly) {
          expect(ring.length).toBeGreaterThanOrEqual(4);
          expect(ring[0]).toEqual(ring[ring.length - 1]);
          for (const [lon, lat] of ring) {
            expect(Math.abs(lon + 3.2)).toBeLessThan(0.01);
            expect(Math.abs(lat - 55.9)).toBeLessThan(0.01);
          }
        }
      }
    }
    expect(fc.features.map((f) => f.properties?.label)).toEqual(['≥ 0.01 mg/L', '≥ 0.1 mg/L', '≥ 0.5 mg/L']);
  });

  it('re-checks the winding when the map mirrors the frame', () => {
    const fc = contoursToGeoJSON(bands, (x, y) => [-x, y]);
    for (const f of fc.features) for (const poly of f.geometry.coordinates) expect(ringArea(poly[0])).toBeGreaterThan(0);
  });

  it('nested bands: a higher threshold covers less', () => {
    const areas = bands.map((b) => area(b.polygons));
    expect(areas[0]).toBeGreaterThan(areas[1]);
    expect(areas[1]).toBeGreaterThan(areas[2]);
  });

  it('merges caller properties, leaves out empty bands, rejects a bad map', () => {
    const withEmpty = [...bands, { threshold: 5, polygons: [] }];
    const fc = contoursToGeoJSON(withEmpty, (x, y) => [x, y], (b, i) => ({ index: i, label: `${b.threshold} units` }));
    expect(fc.features.length).toBe(3);
    expect(fc.features[1].properties).toEqual({ threshold: 0.1, unit: 'mg/L', label: '0.1 units', index: 1 });
    expect(() => contoursToGeoJSON(bands, () => [NaN, 0])).toThrow(/toMap/);
  });
});

describe('packContours (typed arrays for the worker → page transfer)', () => {
  const xs = range(-20, 200, 111), ys = range(-60, 60, 61);
  // an invented field with a hole: a ring-shaped ridge around (80, 0) inside a broad low plateau
  const field = (x: number, y: number) => {
    const r = Math.hypot(x - 80, y);
    return 0.2 * Math.exp(-(x * x + y * y) / 5000) + Math.exp(-((r - 25) ** 2) / 50);
  };
  const thresholds = [0.05, 0.5, 2];
  const bands = contourBands({ values: sample(xs, ys, field), xs, ys, thresholds });

  it('keeps every band (empty ones too) and every ring of contourBands, vertex for vertex under a translation', () => {
    // a translation keeps the winding, so the rings must come out as contourBands wrote them
    const packed = packContours(bands, (x, y) => [x + 1000, y - 500]);
    expect(Array.from(packed.thresholds)).toEqual(thresholds);
    expect(bands[2].polygons).toEqual([]); // the ridge stays below 2: an empty band
    expect(packed.bandPolygons[3] - packed.bandPolygons[2]).toBe(0);
    expect(bands[1].polygons.some((poly) => poly.length > 1)).toBe(true); // the ridge band has a hole
    for (let k = 0; k < thresholds.length; k++) {
      const polys = packedPolygons(packed, k);
      expect(polys.length).toBe(bands[k].polygons.length);
      polys.forEach((poly, q) => {
        expect(poly.length).toBe(bands[k].polygons[q].length);
        poly.forEach((ring, r) => expect(ring).toEqual(bands[k].polygons[q][r].map(([x, y]) => [x + 1000, y - 500])));
      });
    }
    expect(packed.coords.length).toBe(2 * packed.ringVertices[packed.ringVertices.length - 1]);
  });

  it('writes the same GeoJSON from the arrays as from the bands, valid RFC 7946, holes clockwise', () => {
    const toMap = (x: number, y: number): [number, number] => [-x, y]; // mirrors: every ring re-oriented
    const fc = packedToGeoJSON(packContours(bands, toMap), (b, k) => ({ k, multiple: b.threshold / 0.05 }));
    expect(() => check(JSON.stringify(fc))).not.toThrow();
    // mirrored, every ring comes out reversed (then closed again) against contourBands'
    fc.features.forEach((f, k) =>
      f.geometry.coordinates.forEach((poly, q) =>
        poly.forEach((ring, r) => {
          const open = bands[k].polygons[q][r].slice(0, -1).map(([x, y]) => toMap(x, y)).reverse();
          expect(ring).toEqual([...open, open[0]]);
        }),
      ),
    );
    expect(fc.features.map((f) => f.properties?.k)).toEqual([0, 1]);
    for (const f of fc.features)
      for (const poly of f.geometry.coordinates) {
        expect(ringArea(poly[0])).toBeGreaterThan(0);
        for (const hole of poly.slice(1)) expect(ringArea(hole)).toBeLessThan(0);
      }
  });

  it('drops rings the map collapses, and survives a transfer (structuredClone with the buffers moved)', () => {
    // everything mapped onto one line: no area left, so no polygons
    const flat = packContours(bands, (x) => [x, 0]);
    expect(Array.from(flat.bandPolygons)).toEqual([0, 0, 0, 0]);
    const packed = packContours(bands, (x, y) => [x, y]);
    const copy = Array.from(packed.coords);
    const buffers = packedTransferables(packed);
    expect(new Set(buffers).size).toBe(5); // five separate, whole buffers
    const moved = structuredClone(packed, { transfer: buffers });
    expect(packed.coords.length).toBe(0); // detached: moved, not copied
    expect(Array.from(moved.coords)).toEqual(copy);
  });
});

describe('contourLines: the isolines of the same marching squares, without the lattice edge', () => {
  it('a linear field C = x gives the straight line x = level across the lattice, open at its ends (exact: linear interpolation)', () => {
    const xs = [0, 1, 3, 7, 10, 15, 21, 30];
    const ys = [-5, -4.5, 0, 2, 8];
    const [set] = contourLines({ values: sample(xs, ys, (x) => x), xs, ys, levels: [12.5] });
    expect(set.level).toBe(12.5);
    expect(set.lines.length).toBe(1);
    const line = set.lines[0];
    for (const [x] of line) expect(x).toBe(12.5);
    const yEnds = [line[0][1], line[line.length - 1][1]].sort((a, b) => a - b);
    expect(yEnds).toEqual([-5, 8]);
  });

  it('C = x² at level 4: two open lines, x = −2 and x = 2 (within the O(h²) of linear interpolation: h = 0.1, error ≤ h²/4·|f″|/|f′| = 0.0025)', () => {
    const xs = range(-5, 5, 101), ys = range(-3, 3, 7);
    const [set] = contourLines({ values: sample(xs, ys, (x) => x * x), xs, ys, levels: [4] });
    expect(set.lines.length).toBe(2);
    const xsOf = set.lines.map((l) => l.map((p) => p[0]));
    for (const l of xsOf) for (const x of l) expect(Math.abs(Math.abs(x) - 2)).toBeLessThan(2.5e-3);
    expect(xsOf.map((l) => Math.sign(l[0])).sort()).toEqual([-1, 1]);
  });

  it('the ellipse level sets of a Gaussian bump are closed lines on the ellipse (within 0.5 %, as the bands)', () => {
    const sx = 30, sy = 10;
    const xs = range(-120, 120, 481), ys = range(-40, 40, 401);
    const sets = contourLines({ values: sample(xs, ys, (x, y) => Math.exp(-(x * x) / (2 * sx * sx) - (y * y) / (2 * sy * sy))), xs, ys, levels: [0.1, 0.5] });
    for (const set of sets) {
      const k = Math.sqrt(-2 * Math.log(set.level));
      expect(set.lines.length).toBe(1);
      const l = set.lines[0];
      expect(l[0]).toEqual(l[l.length - 1]);
      for (const [x, y] of l) expect(Math.abs(Math.hypot(x / (sx * k), y / (sy * k)) - 1)).toBeLessThan(5e-3);
    }
  });

  it('a level no node reaches gives no line', () => {
    const xs = range(0, 10, 5), ys = range(0, 10, 5);
    const [set] = contourLines({ values: sample(xs, ys, (x) => x), xs, ys, levels: [20] });
    expect(set.lines).toEqual([]);
  });
});

describe('clipLines', () => {
  it('keeps the part of a segment inside a half-plane, cut exactly at the line', () => {
    const got = clipLines([[0, 0], [10, 0]], [{ px: 4, py: 0, nx: -1, ny: 0 }], []);
    expect(got).toEqual([[[0, 0], [4, 0]]]);
  });

  it('cuts a disk out of a segment, in two pieces ending on the circle', () => {
    const got = clipLines([[-10, 1], [10, 1]], [], [{ x: 0, y: 0, r: 2 }]);
    expect(got.length).toBe(2);
    const cut = Math.sqrt(3); // x² + 1 = 4
    expect(got[0][1][0]).toBeCloseTo(-cut, 12);
    expect(got[1][0][0]).toBeCloseTo(cut, 12);
  });

  it('a closed line cut once by a half-plane comes back as one open piece', () => {
    const n = 64;
    const circle = Array.from({ length: n + 1 }, (_, k): [number, number] => [Math.cos((2 * Math.PI * k) / n), Math.sin((2 * Math.PI * k) / n)]);
    circle[n] = circle[0];
    const got = clipLines(circle, [{ px: 0.5, py: 0, nx: -1, ny: 0 }], []);
    expect(got.length).toBe(1);
    for (const [x] of got[0]) expect(x).toBeLessThanOrEqual(0.5 + 1e-12);
    expect(got[0][0][0]).toBeCloseTo(0.5, 12);
    expect(got[0][got[0].length - 1][0]).toBeCloseTo(0.5, 12);
  });

  it('a line wholly outside is dropped; wholly inside is kept as it was', () => {
    expect(clipLines([[0, 0], [1, 0], [2, 0]], [{ px: 5, py: 0, nx: 1, ny: 0 }], [])).toEqual([]);
    expect(clipLines([[0, 0], [1, 0], [2, 0]], [{ px: -5, py: 0, nx: 1, ny: 0 }], [{ x: 9, y: 9, r: 1 }])).toEqual([[[0, 0], [1, 0], [2, 0]]]);
  });
});
