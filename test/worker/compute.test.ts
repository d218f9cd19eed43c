// The workers' computations (src/worker/compute.ts) on the demo cases: the contour crop, the
// lattice extent, the map mapping of the contours, and the GeoJSON they produce.
// Outside references: d3-contour on the full, uncropped lattice (through src/geo/contours.ts);
// @placemarkio/check-geojson for RFC 7946 validity; the engine's own root-finding plume length
// (core plumeLength, Brent 1973) for where the limit contour crosses the centreline.
import { describe, expect, it } from 'vitest';
import { readFileSync, readdirSync } from 'node:fs';
import { check } from '@placemarkio/check-geojson';
import { migrateCase } from '../../src/case/migrate';
import { prepareCase } from '../../src/case/prepare';
import { screenCase } from '../../src/case/screen';
import { concentrationGrid } from '../../src/core';
import { contourBands, ringArea } from '../../src/geo/contours';
import { bandThresholds, cropToBands, evaluateCase, latticeFor, plumeForCase } from '../../src/worker/compute';
import { plumeGeoJSON } from '../../src/ui/results';
import type { Case } from '../../src/case/schema';

const demos: [string, Case][] = readdirSync('cases')
  .filter((f) => f.endsWith('.json'))
  .map((f) => [f, migrateCase(JSON.parse(readFileSync(`cases/${f}`, 'utf8')))]);

// the demo cases, and each with a tenth of its limit (more bands, reaching the lattice edge more often)
const bandCases: [string, Case][] = demos.flatMap(([f, c]): [string, Case][] => {
  const low = structuredClone(c);
  low.contaminant.limit.value /= 10;
  return [[f, c], [`${f}, limit / 10`, low]];
});

describe('cropToBands', () => {
  it.each(bandCases)('gives the same bands as the full lattice (%s)', (_, c) => {
    const p = prepareCase(c);
    const lat = latticeFor(p, 96);
    const values = concentrationGrid(p.model, lat.xs, lat.ys, p.depth, p.viewTime);
    const thresholds = bandThresholds(p.limit, p.model.c0);
    const full = contourBands({ values, xs: lat.xs, ys: lat.ys, thresholds });
    const crop = cropToBands(values, lat.xs, lat.ys, thresholds[0]);
    if (!crop) {
      for (const b of full) expect(b.polygons).toEqual([]);
      return;
    }
    expect(crop.values.length).toBeLessThanOrEqual(values.length);
    const cropped = contourBands({ ...crop, thresholds });
    for (let k = 0; k < full.length; k++) {
      const areas = (b: typeof full[0]) => b.polygons.flatMap((poly) => poly.map((r) => ringArea(r))).sort((a, b) => a - b);
      const verts = (b: typeof full[0]) =>
        b.polygons.flatMap((poly) => poly.flatMap((r) => r.slice(1))).sort((p, q) => p[0] - q[0] || p[1] - q[1]);
      // same rings: the same vertices to rounding (d3 interpolates from shifted cell indices,
      // so coordinates may differ in the last bits: 1e-9 of the lattice extent), same areas
      const tol = 1e-9 * (lat.extent.x1 - lat.extent.x0);
      const vf = verts(full[k]);
      const vc = verts(cropped[k]);
      expect(vc.length).toBe(vf.length);
      vf.forEach((v, i) => {
        expect(Math.abs(vc[i][0] - v[0])).toBeLessThanOrEqual(tol);
        expect(Math.abs(vc[i][1] - v[1])).toBeLessThanOrEqual(tol);
      });
      const a = areas(full[k]);
      const b = areas(cropped[k]);
      expect(b.length).toBe(a.length);
      a.forEach((v, i) => expect(Math.abs(b[i] - v)).toBeLessThanOrEqual(1e-9 * Math.abs(v) + 1e-9));
    }
  });

  it('returns null when nothing reaches the threshold', () => {
    const xs = Float64Array.of(0, 1, 2);
    const ys = Float64Array.of(-1, 0, 1);
    expect(cropToBands(new Float64Array(9).fill(0.5), xs, ys, 1)).toBeNull();
  });
});

describe('plume layer', () => {
  it.each(demos)('is valid RFC 7946 GeoJSON and its limit band ends where the plume length says (%s)', (_, c) => {
    const grid = 160;
    const layer = plumeForCase(c, null, grid);
    const geojson = plumeGeoJSON(layer);
    expect(() => check(JSON.stringify(geojson))).not.toThrow();
    const s = screenCase(c);
    const p = s.prepared;
    const reach = s.plumeLength.atViewTime;
    const limitBand = geojson.features.find((f) => f.properties.multiple === 1);
    if (reach === null) {
      expect(limitBand).toBeUndefined();
      return;
    }
    expect(limitBand).toBeDefined();
    // farthest downgradient point of the limit band, back in the flow frame
    let far = -Infinity;
    for (const poly of limitBand!.geometry.coordinates)
      for (const [lon, lat] of poly[0]) far = Math.max(far, p.fromMap([lon, lat]).x);
    const dx = (layer.extent.x1 - layer.extent.x0) / (grid - 1);
    // piecewise-linear contour vs root-finding: within one lattice spacing (the contour's own
    // error is O(dx²); the band may reach a little farther off the centreline than on it)
    expect(far).toBeGreaterThanOrEqual(reach - dx);
    expect(far).toBeLessThanOrEqual(reach + 1.5 * dx);
  });

  it.each(demos)('lattice holds every receptor and the plume at the horizon (%s)', (_, c) => {
    const p = prepareCase(c);
    const lat = latticeFor(p, 64);
    for (const r of p.receptors) {
      if (r.x < 0) continue;
      expect(r.x).toBeLessThanOrEqual(lat.extent.x1);
      expect(Math.abs(r.y)).toBeLessThanOrEqual(lat.extent.y1);
    }
    expect(lat.extent.x0).toBeLessThan(0); // a little upgradient, where the solutions give zero
    expect(lat.xs.length).toBe(64);
  });
});

describe('evaluateCase', () => {
  it.each(demos)('carries the screening figures and finite curves for every receptor (%s)', (_, c) => {
    const e = evaluateCase(c);
    const s = screenCase(c);
    expect(e.receptors.map((r) => r.id)).toEqual(s.results.map((r) => r.receptor.id));
    e.receptors.forEach((r, i) => {
      const ref = s.results[i].result;
      expect(r.arrival).toBe(ref.arrival);
      expect(r.peak).toEqual(ref.peak);
      expect(r.status).toBe(ref.status);
      expect(r.curve.length).toBe(e.curveTimes.length);
      expect(r.curve.every(Number.isFinite)).toBe(true);
      // the curve reaches the limit by the arrival time (it is sampled, so at the next sample)
      if (r.arrival !== null) {
        const k = e.curveTimes.findIndex((t) => t >= r.arrival!);
        expect(Math.max(...r.curve.slice(k))).toBeGreaterThanOrEqual(e.limit * (1 - 1e-9));
      }
    });
    expect(e.profile.values.every(Number.isFinite)).toBe(true);
    expect(e.caution).toMatch(/Screening-level/);
  });
});

describe('map lattice', () => {
  it('is exactly symmetric across the flow (bit for bit), so the engine mirrors the lateral term', () => {
    for (const [name, c] of demos) {
      for (const n of [64, 129, 256]) {
        const { ys } = latticeFor(prepareCase(c), n);
        for (let j = 0; j < ys.length; j++) expect(ys[j] === -ys[ys.length - 1 - j], `${name} n=${n} j=${j}: ${ys[j]}`).toBe(true);
      }
    }
  });
});
