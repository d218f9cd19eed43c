// GeoJSON export checked against RFC 7946 by an independent validator from the npm registry
// (@placemarkio/check-geojson: structure, positions, ring closure and winding per §3.1.6) plus the
// RFC's rules it does not check itself (WGS 84 ranges §4, no crs member §4).
import { describe, expect, it } from 'vitest';
import { check, getIssues } from '@placemarkio/check-geojson';
import { caseToGeoJSON, geojsonNeedsPlacement } from '../../src/case/export-geojson';
import { screenCase } from '../../src/case/screen';
import { mapCaptureZones } from '../../src/case/wells';
import { mapHeadContours } from '../../src/case/headContours';
import { convertFrame } from '../../src/ui/frame';
import { demoCase, exportResultsFor } from './export-fixture';
import { ringArea } from '../../src/geo/rings';

describe('caseToGeoJSON', () => {
  const c = demoCase('fuel-release-farm-well.json');
  const results = exportResultsFor(c);
  const out = caseToGeoJSON(c, results, { appVersion: '0.1.0', exported: new Date('2026-12-01T00:00:00Z') });

  it('writes a FeatureCollection the RFC 7946 validator accepts with no issues', () => {
    expect(out.ok).toBe(true);
    if (!out.ok) return;
    expect(getIssues(out.text)).toEqual([]);
    expect(() => check(out.text)).not.toThrow();
  });

  it('holds the source, its footprint, every receptor, the flow arrow and plume contours', () => {
    if (!out.ok) throw new Error(out.error);
    const roles = out.geojson.features.map((f) => f.properties?.role);
    expect(roles.filter((r) => r === 'source')).toHaveLength(1);
    expect(roles.filter((r) => r === 'source-footprint')).toHaveLength(1);
    expect(roles.filter((r) => r === 'receptor')).toHaveLength(c.site.receptors.length);
    expect(roles.filter((r) => r === 'flow-direction')).toHaveLength(1);
    expect(roles.filter((r) => r === 'plume-contour').length).toBeGreaterThan(0);
    const well = out.geojson.features.find((f) => f.properties?.name === c.site.receptors[0].name);
    expect(well?.properties?.result).toBe(results.receptors[0].status);
  });

  it('all positions are WGS 84 longitude/latitude in range, with no crs member (RFC 7946 §4)', () => {
    if (!out.ok) throw new Error(out.error);
    expect('crs' in out.geojson).toBe(false);
    const flat = JSON.stringify(out.geojson.features.map((f) => f.geometry));
    const nums = [...flat.matchAll(/\[(-?[\d.e-]+),(-?[\d.e-]+)\]/g)].map((m) => [Number(m[1]), Number(m[2])]);
    expect(nums.length).toBeGreaterThan(10);
    for (const [lon, lat] of nums) {
      expect(Math.abs(lon)).toBeLessThanOrEqual(180);
      expect(Math.abs(lat)).toBeLessThanOrEqual(90);
    }
  });

  it('polygon exteriors are counter-clockwise and closed (RFC 7946 §3.1.6)', () => {
    if (!out.ok) throw new Error(out.error);
    for (const f of out.geojson.features) {
      const polys = f.geometry.type === 'Polygon' ? [f.geometry.coordinates] : f.geometry.type === 'MultiPolygon' ? f.geometry.coordinates : [];
      for (const p of polys) {
        const ext = p[0];
        expect(ext[0]).toEqual(ext[ext.length - 1]);
        expect(ringArea(ext)).toBeGreaterThan(0);
      }
    }
  });

  it('the flow arrow points along the case azimuth (110° clockwise from north: east-south-east)', () => {
    if (!out.ok) throw new Error(out.error);
    const arrow = out.geojson.features.find((f) => f.properties?.role === 'flow-direction');
    if (arrow?.geometry.type !== 'MultiLineString') throw new Error('no arrow');
    const [[a, b]] = arrow.geometry.coordinates;
    const dE = (b[0] - a[0]) * Math.cos((a[1] * Math.PI) / 180);
    const dN = b[1] - a[1];
    const az = ((Math.atan2(dE, dN) * 180) / Math.PI + 360) % 360;
    expect(Math.abs(az - 110)).toBeLessThan(0.5); // equirectangular estimate, fine at < 1 km
  });

  it('a local-grid case is refused with a message naming why, and the way forward (place it on the basemap)', () => {
    const local = demoCase('nitrate-field-supply.json');
    const r = caseToGeoJSON(local, null);
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.error).toMatch(/local site grid.*RFC 7946/);
      expect(r.placeOnMap).toBe(true);
    }
    expect(geojsonNeedsPlacement(local)).toBe(r.ok ? null : r.error);
    expect(geojsonNeedsPlacement(c)).toBeNull();
  });

  it('capture zones of a local-grid case go by the same rule: refused until placed; placed, they are written (RFC 7946 check)', () => {
    const local = demoCase('riverside-supply-well.json');
    const s = screenCase(local);
    const wells = { captures: s.captures, zones: mapCaptureZones(s.prepared, s.wells) };
    const r = caseToGeoJSON(local, { ...exportResultsFor(local), wells });
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.placeOnMap).toBe(true);
      expect(r.error).toMatch(/capture zones and travel-time marks/);
    }
    // placed on the basemap (the Settings button's conversion), the zones are in the GeoJSON
    const g = convertFrame(local, 'geographic', [-2.731, 52.413]);
    const sg = screenCase(g);
    const headContours = mapHeadContours(sg.prepared, sg.wells, 'SI')!;
    const placed = caseToGeoJSON(g, { ...exportResultsFor(g), wells: { captures: sg.captures, zones: mapCaptureZones(sg.prepared, sg.wells), headContours } });
    expect(placed.ok).toBe(true);
    if (!placed.ok) return;
    expect(getIssues(placed.text)).toEqual([]);
    const roles = placed.geojson.features.map((f) => f.properties?.role);
    expect(roles).toContain('capture-zone');
    expect(roles.filter((x) => x === 'travel-time-mark').length).toBe(8);
    // the lines of equal water level as drawn on the map: one per level, its value a multiple of the interval
    const heads = placed.geojson.features.filter((f) => f.properties?.role === 'head-contour');
    expect(heads).toHaveLength(headContours.levels.length);
    for (const f of heads) {
      const v = f.properties?.['water level relative to the release (m)'];
      expect(Math.abs(v / 0.2 - Math.round(v / 0.2))).toBeLessThan(1e-6);
      expect(f.properties?.['interval (m)']).toBe(0.2);
      expect(f.properties?.method).toMatch(/^steady well field/);
      expect(f.geometry.type).toBe('MultiLineString');
    }
  });

  it('an invalid case is refused with the field named, not written half-way', () => {
    const bad = structuredClone(c);
    bad.aquifer.effectivePorosity = 1.5;
    const r = caseToGeoJSON(bad, null);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.error).toMatch(/Effective porosity nₑ 1\.5 is not accepted: enter a value above 0 and below 1/);
  });
});

describe('caseToGeoJSON in a US customary case (issue 13 item 4)', () => {
  const si = demoCase('fuel-release-farm-well.json');
  const c = { ...si, units: { system: 'US' as const, fields: {} } };
  const results = exportResultsFor(si);
  const out = caseToGeoJSON(c, results, { exported: new Date('2026-12-01T00:00:00Z') });

  it('writes lengths in ft and the seepage velocity in ft/d, the unit in each property name', () => {
    if (!out.ok) throw new Error(out.error);
    const rec = out.geojson.features.find((f) => f.properties?.name === si.site.receptors[0].name)!.properties!;
    expect(rec['distance from source (m)']).toBeUndefined();
    // foot = 0.3048 m exactly (NIST SP 811 (2008), Appendix B); files keep 10 significant digits
    expect(Math.abs((rec['distance from source (ft)'] * 0.3048) / results.receptors[0].distance - 1)).toBeLessThanOrEqual(5e-10);
    const flow = out.geojson.features.find((f) => f.properties?.role === 'flow-direction')!.properties!;
    expect(flow['seepage velocity (ft/d)']).toBeGreaterThan(0);
    const siOut = caseToGeoJSON(si, results);
    if (!siOut.ok) throw new Error(siOut.error);
    const siFlow = siOut.geojson.features.find((f) => f.properties?.role === 'flow-direction')!.properties!;
    expect(Math.abs((flow['seepage velocity (ft/d)'] * 0.3048) / siFlow['seepage velocity (m/d)'] - 1)).toBeLessThanOrEqual(5e-10);
    const src = out.geojson.features.find((f) => f.properties?.role === 'source')!.properties!;
    expect(Object.keys(src)).toContain('source width across flow (ft)');
    // times and concentrations stay in days and mg/L; the collection names the units
    expect(rec['first reaches limit (d)']).toBe(results.receptors[0].arrival);
    const meta = (out.geojson as unknown as { downgradient: { unitSystem: string; units: Record<string, string> } }).downgradient;
    expect(meta.unitSystem).toBe('US customary');
    expect(meta.units).toEqual({ length: 'ft', velocity: 'ft/d', time: 'd', concentration: 'mg/L' });
    expect(getIssues(out.text)).toEqual([]);
  });

  it('keeps metres in an SI case', () => {
    const siOut = caseToGeoJSON(si, results);
    if (!siOut.ok) throw new Error(siOut.error);
    const meta = (siOut.geojson as unknown as { downgradient: { units: Record<string, string> } }).downgradient;
    expect(meta.units.length).toBe('m');
    const rec = siOut.geojson.features.find((f) => f.properties?.role === 'receptor')!.properties!;
    expect(Object.keys(rec)).toContain('distance from source (m)');
  });
});

describe('caseToGeoJSON with a Monte Carlo run’s probability contours', () => {
  it('one MultiLineString per level (5, 50, 95 %) with the level, runs and seed, closed rings the RFC 7946 validator accepts; the lines are the run’s band outlines', async () => {
    const { planUncertainty, runRealisations, exceedanceMapOf } = await import('../../src/case/uncertainty');
    const { packedPolygons } = await import('../../src/geo/contours');
    const c = demoCase('fuel-release-farm-well.json');
    const plan = planUncertainty(c, { runs: 300, seed: 9, map: true });
    const contours = exceedanceMapOf(plan, runRealisations(plan, 0, 300))!;
    const out = caseToGeoJSON(c, exportResultsFor(c), { exported: new Date('2026-12-01T00:00:00Z'), probability: { contours, runs: 300, seed: 9 } });
    if (!out.ok) throw new Error(out.error);
    expect(getIssues(out.text)).toEqual([]);
    const lines = out.geojson.features.filter((f) => f.properties?.role === 'exceedance-contour');
    expect(lines.map((f) => f.properties?.['probability of exceeding the limit'])).toEqual([0.05, 0.5, 0.95].filter((_, k) => packedPolygons(contours.bands, k).length > 0));
    expect(lines.length).toBeGreaterThanOrEqual(2);
    for (const f of lines) {
      expect(f.geometry.type).toBe('MultiLineString');
      expect(f.properties).toMatchObject({ runs: 300, seed: 9, 'realisations mapped': 300 });
      expect(f.properties?.caution).toMatch(/seed 9/);
      for (const line of (f.geometry as { coordinates: number[][][] }).coordinates) expect(line[0]).toEqual(line[line.length - 1]);
    }
    const k = 1; // the 50 % line: the rings of the 50 % band, rounded to 7 decimals (about 1 cm)
    const rings = packedPolygons(contours.bands, k).flat();
    const fifty = lines.find((f) => f.properties?.['probability of exceeding the limit'] === 0.5)!;
    expect((fifty.geometry as { coordinates: number[][][] }).coordinates.length).toBe(rings.length);
    expect((fifty.geometry as { coordinates: number[][][] }).coordinates[0][0][0]).toBeCloseTo(rings[0][0][0], 7);
  });
});
