/**
 * The case's monitoring data beside its model (src/case/observations.ts) and their exports.
 *
 * References: the analysis is assembled from parts tested against outside references elsewhere
 * (Mann–Kendall and Sen against SciPy in test/core/trends/trend.test.ts; Buscheck & Alcantar on the
 * steady-state centreline in test/core/trends/rates.test.ts). Here: a case whose "measurements" are the
 * model's own concentrations must agree with the model exactly (log ratio 0, all within a factor of
 * ten) — an identity; the invented demo case (cases/depot-benzene-monitoring.json) gives the
 * verdicts its generator built in (a source declining with a 6-year half-life); the GeoJSON
 * passes the RFC 7946 validator @placemarkio/check-geojson; the observations CSV re-imports to
 * the same results.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { getIssues } from '@placemarkio/check-geojson';
import { migrateCase } from '../../src/case/migrate';
import { analyseObservations } from '../../src/case/observations';
import { prepareCase } from '../../src/case/prepare';
import { screenAverage } from '../../src/core/index';
import { dayNumber, isoFromDay, type Monitoring } from '../../src/case/monitoring';
import { observationsCsv } from '../../src/case/export-observations';
import { applyImport, importObservationsCsv } from '../../src/case/observations-import';
import { caseToGeoJSON } from '../../src/case/export-geojson';
import { demoCase, exportResultsFor } from './export-fixture';
import type { Case } from '../../src/case/schema';

const depot = (): Case => migrateCase(JSON.parse(readFileSync('cases/depot-benzene-monitoring.json', 'utf8')));

describe('model beside data', () => {
  it('measurements equal to the model: log ratio 0, every result within a factor of ten', () => {
    const c = depot();
    const p = prepareCase(c);
    const release = dayNumber(c.monitoring.releaseDate!)!;
    const results: Monitoring['results'] = [];
    for (const w of c.monitoring.wells) {
      const f = p.fromMap(w.position!);
      for (const t of [400, 800, 1600]) {
        const mgL = screenAverage(p.model, { x: f.x, y: f.y, zTop: w.screenTop.value, zBottom: w.screenBottom.value }, t);
        results.push({ wellId: w.id, date: isoFromDay(release + t), analyte: 'Benzene', value: mgL, unit: 'mg/L', nonDetect: false });
      }
    }
    const s = analyseObservations({ ...c, monitoring: { ...c.monitoring, results } });
    expect(s.comparison.detected).toBe(results.length);
    expect(s.comparison.withinTen).toBe(results.length);
    expect(Math.abs(s.comparison.medianLog10Ratio!)).toBeLessThan(1e-12);
    expect(s.comparison.words).toMatch(/about right/);
  });

  it('the invented demo: trends, rates and the plain-words summary', () => {
    const s = analyseObservations(depot());
    expect(s.wells).toHaveLength(5);
    const byName = Object.fromEntries(s.wells.map((w) => [w.name, w]));
    expect(byName['MW-2'].trend.verdict).toMatch(/decreasing/);
    expect(byName['MW-5'].trend.nonDetects).toBeGreaterThan(0);
    expect(byName['MW-5'].onCentreline).toBe(false);
    expect(s.bulkRate!.used).toBe(4);
    expect(s.biodegradationRate!.rate).toBeGreaterThan(0);
    expect(s.adoptableHalfLife).toBeCloseTo(Math.LN2 / s.biodegradationRate!.rate, 9);
    expect(s.comparison.words).toMatch(/within a factor of ten/);
    // every point rate carries the caution against using it as a biodegradation rate
    for (const w of s.wells) if (w.pointRate) expect(w.pointRate.warnings.map((x) => x.code)).toContain('point-rate-not-biodegradation');
  });

  it('without a release date results are compared with the steady state, and it says so', () => {
    const c = depot();
    // a constant source (the demo's declines, and a declining source has no steady plume)
    const s = analyseObservations({ ...c, source: { ...c.source, sourceHalfLife: null }, monitoring: { ...c.monitoring, releaseDate: null } });
    expect(s.warnings.map((w) => w.code)).toContain('observations-no-release-date');
    expect(s.wells[0].series[0].t).toBeNull();
    expect(s.wells[0].series[0].modelled).toBeGreaterThan(0);
  });
});

describe('exports', () => {
  it('the observations CSV re-imports to the same results (non-detects stay "<")', () => {
    const c = depot();
    const text = observationsCsv(c);
    const empty: Monitoring = { ...c.monitoring, wells: [], results: [] };
    const imp = importObservationsCsv(text, empty);
    expect(imp.fatal).toBeNull();
    expect(imp.problems).toEqual([]);
    const back = applyImport(empty, imp);
    const key = (m: Monitoring) =>
      m.results
        .map((r) => `${m.wells.find((w) => w.id === r.wellId)!.name}|${r.date}|${r.value}|${r.unit}|${r.nonDetect}`)
        .sort();
    expect(key(back)).toEqual(key(c.monitoring));
    expect(back.wells.map((w) => w.position)).toEqual(c.monitoring.wells.map((w) => w.position));
  });

  it('GeoJSON carries each placed monitoring well with its latest result (RFC 7946 validator clean)', () => {
    const c = demoCase('fuel-release-farm-well.json');
    const src = c.site.source.position;
    c.monitoring = {
      releaseDate: '2020-01-01',
      analyte: null,
      wells: [
        { id: 'mw-a', name: 'MW-A', position: [src[0] + 0.0003, src[1] - 0.0001], screenTop: { value: 1, unit: 'm' }, screenBottom: { value: 3, unit: 'm' } },
        { id: 'mw-b', name: 'MW-B', position: null, screenTop: { value: 1, unit: 'm' }, screenBottom: { value: 3, unit: 'm' } },
      ],
      results: [
        { wellId: 'mw-a', date: '2021-01-05', analyte: 'benzene', value: 40, unit: 'ug/L', nonDetect: false },
        { wellId: 'mw-a', date: '2021-04-05', analyte: 'benzene', value: 1, unit: 'ug/L', nonDetect: true },
      ],
    };
    const out = caseToGeoJSON(c, exportResultsFor(c));
    if (!out.ok) throw new Error(out.error);
    expect(getIssues(out.text)).toEqual([]);
    const wells = out.geojson.features.filter((f) => f.properties?.role === 'monitoring-well');
    expect(wells).toHaveLength(1); // the unplaced well has no position to write
    expect(wells[0].properties).toMatchObject({ name: 'MW-A', 'latest date': '2021-04-05', 'latest result': '<1 ug/L', 'latest below reporting limit': true });
  });
});
