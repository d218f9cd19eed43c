/**
 * Exports of the well field and the particle view (src/case/export-wells.ts, through
 * caseToGeoJSON and the CSV writers), on the fuel demo with its farm well made to pump (an invented
 * variant: 60 m³/d, saturated thickness 12 m) and on the riverside demo (local frame):
 * - the GeoJSON passes the RFC 7946 validator @placemarkio/check-geojson with no issues;
 * - the capture zone's polygon is the traced zone moved to WGS 84 (every vertex within the 1e-7°
 *   rounding), and it is where Javandel & Tsang (1986, Ground Water 24(5)) put a single well's
 *   zone in uniform flow: no wider than Q/(B·q), the far-upgradient width, and reaching
 *   downgradient of the well to the stagnation point Q/(2π·B·q) (within 3 %: the traced outline's
 *   stated accuracy is the fan's spacing, 72 streamlines);
 * - the travel-time marks are lines carrying their time, for water and for the contaminant;
 * - particle figures ride on each receptor under the names of the particle CSV, with method, count
 *   and seed; the CSV files are RFC 4180 records (read by the reader written from the RFC's ABNF).
 */
import { describe, expect, it } from 'vitest';
import { check, getIssues } from '@placemarkio/check-geojson';
import type { Polygon, MultiLineString } from 'geojson';
import { caseToGeoJSON } from '../../src/case/export-geojson';
import { captureZonesCsv, particleCurvesCsv, particleFiguresCsv } from '../../src/case/export-wells';
import { receptorTableCsv } from '../../src/case/export-csv';
import { screenCase } from '../../src/case/screen';
import { mapCaptureZones } from '../../src/case/wells';
import { runCaseParticles } from '../../src/case/particles';
import type { Case } from '../../src/case/schema';
import type { ExportParticles, ExportResults } from '../../src/case/export-results';
import { demoCase, exportResultsFor, readRfc4180 } from './export-fixture';
import { withUnitSystem } from '../../src/case/unitSystem';

function pumpingFuelCase(): Case {
  const c = structuredClone(demoCase('fuel-release-farm-well.json'));
  c.aquifer.saturatedThickness = { value: 12, unit: 'm' };
  c.site.receptors[0].pumping = true;
  c.site.receptors[0].pumpingRate = { value: 60, unit: 'm3/d' };
  return c;
}

function withWellsAndParticles(c: Case): { results: ExportResults; s: ReturnType<typeof screenCase>; particles: ExportParticles } {
  const s = screenCase(c);
  const run = runCaseParticles(c, s.prepared, s.wells, { particles: 1000, seed: 11 });
  const particles: ExportParticles = { particles: run.particles, seed: run.seed, receptors: run.receptors.map((f, i) => ({ ...f, id: s.prepared.receptors[i].id })) };
  const results = { ...exportResultsFor(c), wells: { captures: s.captures, zones: mapCaptureZones(s.prepared, s.wells) }, particles };
  return { results, s, particles };
}

/** within the files' 10 significant digits */
function expectRel(got: number, want: number): void {
  expect(Math.abs(got - want)).toBeLessThanOrEqual(1e-9 * Math.abs(want));
}

/** ray casting (even–odd rule) */
function inside(ring: number[][], x: number, y: number): boolean {
  let on = false;
  for (let i = 0, j = ring.length - 1; i < ring.length; j = i++) {
    const [xi, yi] = ring[i];
    const [xj, yj] = ring[j];
    if (yi > y !== yj > y && x < ((xj - xi) * (y - yi)) / (yj - yi) + xi) on = !on;
  }
  return on;
}

describe('GeoJSON of capture zones and particle figures', () => {
  const c = pumpingFuelCase();
  const { results, s, particles } = withWellsAndParticles(c);
  const out = caseToGeoJSON(c, results, { appVersion: '0.1.0', exported: new Date('2026-12-03T00:00:00Z') });
  if (!out.ok) throw new Error(out.error);
  const zone = out.geojson.features.find((f) => f.properties?.role === 'capture-zone')!;

  it('passes the RFC 7946 validator with no issues', () => {
    expect(getIssues(out.text)).toEqual([]);
    expect(() => check(out.text)).not.toThrow();
  });

  it('the zone is the traced one, in WGS 84, named after its well with its rate and method', () => {
    expect(zone.geometry.type).toBe('Polygon');
    expect(zone.properties).toMatchObject({ well: 'Farm supply well', 'pumping rate (m3/d)': 60, name: 'Capture zone of Farm supply well' });
    expect(zone.properties?.method).toMatch(/steady well field/);
    const ring = (zone.geometry as Polygon).coordinates[0];
    const traced = results.wells!.zones[0].envelope;
    const closed = traced[0][0] === traced[traced.length - 1][0] && traced[0][1] === traced[traced.length - 1][1];
    expect(ring.length).toBe(traced.length + (closed ? 0 : 1));
    const set = traced.map((p) => `${Math.round(p[0] * 1e7)},${Math.round(p[1] * 1e7)}`);
    for (const p of ring) expect(set).toContain(`${Math.round(p[0] * 1e7)},${Math.round(p[1] * 1e7)}`);
    const well = c.site.receptors[0].position;
    expect(inside(ring, well[0], well[1])).toBe(true);
  });

  it('lies where Javandel & Tsang (1986) put one well’s zone: width ≤ Q/(Bq), stagnation point Q/(2πBq) downgradient', () => {
    const Q = 60;
    const B = 12;
    const q = s.prepared.derived.K * s.prepared.derived.gradient;
    const ring = (zone.geometry as Polygon).coordinates[0].map((p) => s.prepared.fromMap([p[0], p[1]]));
    const w = s.prepared.receptors[0];
    const ys = ring.map((p) => p.y);
    expect(Math.max(...ys) - Math.min(...ys)).toBeLessThanOrEqual((Q / (B * q)) * 1.001);
    const downgradient = Math.max(...ring.map((p) => p.x)) - w.x;
    expect(Math.abs(downgradient / (Q / (2 * Math.PI * B * q)) - 1)).toBeLessThan(0.03);
  });

  it('travel-time marks are lines with their time, for water and for the contaminant', () => {
    const marks = out.geojson.features.filter((f) => f.properties?.role === 'travel-time-mark');
    expect(marks.length).toBeGreaterThan(0);
    for (const m of marks) {
      expect(m.geometry.type).toBe('MultiLineString');
      expect((m.geometry as MultiLineString).coordinates.every((l) => l.length >= 2)).toBe(true);
      expect([1, 5, 10, 25]).toContain(m.properties?.['travel time (yr)']);
      expect(m.properties?.['travel time (d)']).toBeCloseTo(m.properties?.['travel time (yr)'] * 365.25, 9);
    }
    expect(new Set(marks.map((m) => m.properties?.travelling))).toEqual(new Set(['water', 'contaminant (retarded, × R)']));
  });

  it('each receptor carries its analytical method and its particle figures with count and seed', () => {
    const rs = out.geojson.features.filter((f) => f.properties?.role === 'receptor');
    expect(rs).toHaveLength(2);
    rs.forEach((f, i) => {
      const p = particles.receptors[i];
      expect(f.properties?.method).toMatch(/^analytical: /);
      // the pumping well (receptor 0) carries the well field's capture figures with their method
      if (i === 0) {
        expect(f.properties?.['well field: release in its capture zone']).toBe(results.wells!.captures[0].capturesSource ? 'yes' : 'no');
        expect(f.properties?.['well field: method']).toMatch(/^steady well field/);
      } else expect(f.properties?.['well field: method']).toBeUndefined();
      expect(f.properties?.['particles: method']).toMatch(/^particles: random walk/);
      // files carry 10 significant digits (src/case/numbers.ts fileNumber)
      expectRel(f.properties?.['particles: concentration at horizon (mg/L)'], p.concentrationAtHorizon);
      expectRel(f.properties?.['particles: standard error (mg/L)'], p.standardError);
      if (p.arrival === null) expect(f.properties?.['particles: first reaches limit (d)']).toBeNull();
      else expectRel(f.properties?.['particles: first reaches limit (d)'], p.arrival);
      expect(f.properties?.['particles: count']).toBe(1000);
      expect(f.properties?.['particles: seed']).toBe(11);
    });
  });
});

describe('CSV of capture zones and particle figures', () => {
  it('capture zones: one record per vertex of the zone and of every mark, in the case’s map coordinates', () => {
    const c = pumpingFuelCase();
    const { results } = withWellsAndParticles(c);
    const z = results.wells!.zones[0];
    const rows = readRfc4180(captureZonesCsv(c, results.wells!, results.caution));
    const header = rows[0];
    expect(header.slice(0, 9)).toEqual(['pumping well', 'feature', 'travelling', 'travel time (yr)', 'travel time (d)', 'part', 'vertex', 'longitude (degrees)', 'latitude (degrees)']);
    for (const r of rows) expect(r).toHaveLength(header.length);
    const marks = [...z.water, ...z.contaminant].reduce((n, m) => n + m.front.reduce((k, piece) => k + piece.length, 0), 0);
    expect(rows.length).toBe(1 + z.envelope.length + marks + 1);
    expect(rows[rows.length - 1][0]).toBe('screening caution');
    const first = rows[1];
    expect(first[0]).toBe('Farm supply well');
    expect(first[1]).toMatch(/^capture zone/);
    expect(Number(first[7])).toBeCloseTo(z.envelope[0][0], 7);
    expect(Number(first[8])).toBeCloseTo(z.envelope[0][1], 7);
    const mark = rows.find((r) => r[1] === 'travel-time mark' && r[2] === 'water')!;
    expect(Number(mark[4])).toBeCloseTo(Number(mark[3]) * 365.25, 6);
  });

  it('the receptor table names the method of every figure: analytical, the well field’s capture and travel time, the particles’', () => {
    const c = demoCase('riverside-supply-well.json');
    const { results, s, particles } = withWellsAndParticles(c);
    const rows = readRfc4180(receptorTableCsv(results));
    const h = rows[0];
    const col = (name: string) => h.indexOf(name);
    const [well, garden] = [rows[1], rows[2]];
    for (const row of [well, garden]) {
      expect(row[col('method')]).toMatch(/^analytical: Domenico 1987 approximation, uniform regional flow/);
      expect(row[col('particles: method')]).toMatch(/^particles: random walk/);
      expect(row[col('particles: seed')]).toBe('11');
    }
    expect(well[col('well field: release in its capture zone')]).toBe('yes');
    expectRel(Number(well[col('well field: contaminant travel time from the release (d)')]), s.captures[0].travelTimeFromSource!);
    expect(well[col('well field: method')]).toMatch(/^steady well field: uniform regional flow plus the pumping wells/);
    expectRel(Number(well[col('particles: concentration at horizon (mg/L)')]), particles.receptors[0].concentrationAtHorizon);
    // the garden well does not pump: no well-field figures of its own
    expect(garden[col('well field: release in its capture zone')]).toBe('');
    expect(garden[col('well field: method')]).toBe('');
  });

  it('a local case writes east and north in metres', () => {
    const c = demoCase('riverside-supply-well.json');
    const { results } = withWellsAndParticles(c);
    const rows = readRfc4180(captureZonesCsv(c, results.wells!, results.caution));
    expect(rows[0].slice(7, 9)).toEqual(['east (m)', 'north (m)']);
    expect(rows.filter((r) => r[0] === 'Town supply well').length).toBeGreaterThan(50);
  });

  it('a US customary case writes east and north in ft and the pumping rate in US gal/min (NIST SP 811: ft = 0.3048 m, gal = 3.785411784 L)', () => {
    const si = demoCase('riverside-supply-well.json');
    const c = { ...si, units: withUnitSystem(si, 'US') };
    const { results } = withWellsAndParticles(c);
    const us = readRfc4180(captureZonesCsv(c, results.wells!, results.caution));
    const m = readRfc4180(captureZonesCsv(si, results.wells!, results.caution));
    expect(us[0].slice(7, 10)).toEqual(['east (ft)', 'north (ft)', 'pumping rate (gal/min)']);
    expect(m[0][9]).toBe('pumping rate (m3/d)');
    // the demo's 800 m³/d = 800 000 L/d / (3.785411784 L/gal × 1440 min/d) = 146.764… gal/min
    expectRel(Number(us[1][9]), 800_000 / (3.785411784 * 1440));
    expectRel(Number(us[1][7]), Number(m[1][7]) / 0.3048);
    expectRel(Number(us[1][8]), Number(m[1][8]) / 0.3048);
  });

  it('the zone in a US customary case names its rate in gal/min', () => {
    const c = pumpingFuelCase();
    const { results } = withWellsAndParticles(c);
    const u = { ...c, units: withUnitSystem(c, 'US') };
    const out = caseToGeoJSON(u, results, { appVersion: '0.1.0', exported: new Date('2026-12-03T00:00:00Z') });
    if (!out.ok) throw new Error(out.error);
    const z = out.geojson.features.find((f) => f.properties?.role === 'capture-zone')!;
    // 60 m³/d = 60 000 L/d / (3.785411784 L/gal × 1440 min/d) = 11.007… gal/min
    expectRel(z.properties!['pumping rate (gal/min)'] as number, 60_000 / (3.785411784 * 1440));
    expect(z.properties!['pumping rate (m3/d)']).toBeUndefined();
  });

  it('particle figures: one record per receptor, method, concentration ± SE, arrival, count and seed; curves per output time', () => {
    const c = demoCase('riverside-supply-well.json');
    const { results, particles } = withWellsAndParticles(c);
    const rows = readRfc4180(particleFiguresCsv(results, particles));
    const h = rows[0];
    expect(rows).toHaveLength(1 + 2 + 1);
    const col = (name: string) => h.indexOf(name);
    const well = rows[1];
    expect(well[0]).toBe('Town supply well');
    expect(well[col('particles: method')]).toMatch(/^particles/);
    expectRel(Number(well[col('particles: concentration at horizon (mg/L)')]), particles.receptors[0].concentrationAtHorizon);
    expectRel(Number(well[col('particles: standard error (mg/L)')]), particles.receptors[0].standardError);
    expect(well[col('particles: count')]).toBe('1000');
    expect(well[col('particles: seed')]).toBe('11');
    expect(well[col('particles: estimator')]).toMatch(/captured particle mass per interval \/ pumping rate/);
    const curves = readRfc4180(particleCurvesCsv(results, particles));
    expect(curves).toHaveLength(1 + 100 + 1);
    expect(curves[0]).toEqual([
      'time (d)',
      'time (yr)',
      'Town supply well (mg/L, particles, water pumped over the interval ending then)',
      'Town supply well standard error (mg/L)',
      'Garden well (not pumped) (mg/L, particles)',
      'Garden well (not pumped) standard error (mg/L)',
    ]);
    expect(Number(curves[100][0])).toBeCloseTo(results.horizon, 9);
    expectRel(Number(curves[100][2]), particles.receptors[0].concentrationAtHorizon);
  });
});
