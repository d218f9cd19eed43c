/**
 * A Monte Carlo run's band at the monitoring wells (src/case/uncertainty.ts, the `wells` option),
 * for the band on a monitoring well's chart.
 *
 * Against analytical quantiles: with the source concentration C0 the one uncertain input
 * (lognormal, median m, geometric SD g), every concentration is C0 times a fixed function of
 * position and time (the solutions are linear in C0), so the q-quantile of the concentration at a
 * well and time is curve(t)·g^Φ⁻¹(q), curve the deterministic breakthrough at the well. Φ⁻¹ is
 * found by bisection on @stdlib's erfc (an outside implementation); the sample percentile of a
 * Latin hypercube of n realisations must lie between the quantiles at q ∓ 2/n (the order
 * statistics it can straddle), as test/case/uncertainty.test.ts does for the receptors' peaks.
 * The deterministic curve is taken at the well's position from analyseObservations, a path
 * independent of the run's own planning of the wells.
 *
 * Consistency with the receptors' path: a well placed at a receptor, with the receptor's screen,
 * and a chart span equal to the horizon, has the receptor's band at every time under a sampled flow
 * direction (the turned flow frame) — the wells follow the same geometry as the receptors.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { normalQuantileRef } from './normal-tail';
import { migrateCase } from '../../src/case/migrate';
import type { Case } from '../../src/case/schema';
import { WELL_BAND_REALISATIONS, breakthroughBands, joinBlocks, monitoringWellBands, planUncertainty, runRealisations } from '../../src/case/uncertainty';
import { analyseObservations } from '../../src/case/observations';
import { prepareCase } from '../../src/case/prepare';
import { breakthroughCurve, screenAverage } from '../../src/core';

const DEMO = 'depot-benzene-monitoring.json';
const load = (f: string): Case => migrateCase(JSON.parse(readFileSync(`cases/${f}`, 'utf8')));
const zOf = normalQuantileRef;

function withC0(c: Case, gsd: number, runs: number): Case {
  const c0 = c.source.concentration;
  return { ...c, uncertainty: { runs, seed: 17, headFit: false, inputs: { sourceConcentration: { kind: 'lognormal', median: c0.value, gsd, unit: c0.unit } } } };
}

describe('the band at each monitoring well against analytical quantiles (C0 lognormal)', () => {
  it.each(['domenico', 'exact'] as const)('depot demo, %s', (solution) => {
    const demo = load(DEMO);
    // the exact solution at two of the wells (its curves cost far more than Domenico's)
    const base = solution === 'exact' ? { ...demo, monitoring: { ...demo.monitoring, wells: demo.monitoring.wells.filter((w) => w.id === 'mw-1' || w.id === 'mw-3') } } : demo;
    const runs = solution === 'exact' ? 60 : 400;
    const gsd = 2;
    const c = withC0({ ...base, evaluation: { ...base.evaluation, solution } }, gsd, runs);
    const plan = planUncertainty(c, { wells: true });
    // every placed well with results of the compared analyte
    expect(plan.wells.map((w) => w.id)).toEqual(base.monitoring.wells.map((w) => w.id));
    const bands = monitoringWellBands(plan, runRealisations(plan, 0, runs))!;
    const prep = prepareCase(c);
    const obs = analyseObservations(c, prep);
    const ratio = (q: number) => Math.pow(gsd, zOf(q));
    for (const b of bands) {
      const w = obs.wells.find((x) => x.id === b.id)!;
      expect(b.realisations).toBe(runs);
      expect(b.times).toHaveLength(48);
      const curve = breakthroughCurve(prep.model, { x: w.x!, y: w.y!, zTop: w.zTop, zBottom: Math.max(w.zTop, w.zBottom) }, b.times);
      for (let k = 0; k < b.times.length; k++) {
        for (const [q, v] of [
          [0.05, b.p5[k]],
          [0.25, b.p25[k]],
          [0.5, b.p50[k]],
          [0.75, b.p75[k]],
          [0.95, b.p95[k]],
        ] as const) {
          // Float32 storage of each realisation's value: 1e-6 relative, and values below its
          // smallest normal number (1.2e-38) may be stored as 0
          const lo = curve[k] * ratio(q - 2 / runs) * (1 - 1e-6) - 1.2e-38;
          const hi = curve[k] * ratio(q + 2 / runs) * (1 + 1e-6) + 1e-30;
          expect(v, `${b.id} t=${b.times[k]} q=${q}: ${v} not in [${lo}, ${hi}]`).toBeGreaterThanOrEqual(lo);
          expect(v).toBeLessThanOrEqual(hi);
        }
      }
    }
  });
});

describe('the band at a monitoring well follows a turned flow like a receptor', () => {
  it('a well at a receptor, same screen and span, has the receptor band (flow direction sampled)', () => {
    const base = load(DEMO);
    const rec = base.site.receptors[1]; // the property line, 180 m downgradient
    const release = '2016-04-01';
    // results from the release to 3650 d after it: the chart's span is 1.2 × 3650 = 4380 d, set as the horizon
    const c: Case = {
      ...base,
      evaluation: { ...base.evaluation, horizon: { value: 4380, unit: 'd' }, viewTime: { value: 2000, unit: 'd' } },
      monitoring: {
        releaseDate: release,
        analyte: null,
        wells: [{ id: 'at-fence', name: 'At the fence', position: rec.position, screenTop: rec.screenTop, screenBottom: rec.screenBottom }],
        results: [
          { wellId: 'at-fence', date: '2018-01-10', analyte: 'benzene', value: 0.01, unit: 'mg/L', nonDetect: false },
          { wellId: 'at-fence', date: '2026-03-30', analyte: 'benzene', value: 0.02, unit: 'mg/L', nonDetect: false },
        ],
      },
      uncertainty: { runs: 120, seed: 5, headFit: false, inputs: { flowDirection: { kind: 'normal', mean: base.site.flow.method === 'direction' ? base.site.flow.azimuthDeg : 90, sd: 12 } } },
    };
    const plan = planUncertainty(c, { curves: true, wells: true });
    expect(plan.wells).toHaveLength(1);
    Array.from(plan.wells[0].times).forEach((t, k) => expect(t).toBeCloseTo(plan.curveTimes![k], 9));
    const block = runRealisations(plan, 0, plan.runs);
    const well = monitoringWellBands(plan, block)![0];
    const fence = breakthroughBands(plan, block)![1];
    for (const q of ['p5', 'p25', 'p50', 'p75', 'p95'] as const)
      for (let k = 0; k < well.times.length; k++) expect(well[q][k]).toBeCloseTo(fence[q][k], 12);
    // the sampled direction does move the well: its band is not one curve
    expect(well.p95[47]).toBeGreaterThan(1.01 * well.p5[47]);
  });
});

describe('what the wells option costs and keeps', () => {
  const c = withC0(load(DEMO), 2, 60);
  it('nothing without the option, or without placed wells with results', () => {
    expect(runRealisations(planUncertainty(c), 0, 10).wellCurves).toBeNull();
    const none: Case = { ...c, monitoring: { ...c.monitoring, wells: c.monitoring.wells.map((w) => ({ ...w, position: null })) } };
    const plan = planUncertainty(none, { wells: true });
    expect(plan.wells).toEqual([]);
    expect(runRealisations(plan, 0, 10).wellCurves).toBeNull();
    expect(monitoringWellBands(plan, runRealisations(plan, 0, 10))).toBeNull();
  });
  it('the same bands however the run is split', () => {
    const plan = planUncertainty(c, { wells: true });
    const whole = monitoringWellBands(plan, runRealisations(plan, 0, 60));
    expect(monitoringWellBands(plan, joinBlocks(plan, [runRealisations(plan, 40, 60), runRealisations(plan, 0, 40)]))).toEqual(whole);
  });
  it('without a release date, the steady state (one value per well, as the chart draws it)', () => {
    const steady: Case = { ...c, source: { ...c.source, sourceHalfLife: null }, monitoring: { ...c.monitoring, releaseDate: null } };
    const plan = planUncertainty(steady, { wells: true });
    const bands = monitoringWellBands(plan, runRealisations(plan, 0, 60))!;
    const prep = prepareCase(steady);
    const obs = analyseObservations(steady, prep);
    for (const b of bands) {
      expect(Array.from(b.times)).toEqual([Infinity]);
      const w = obs.wells.find((x) => x.id === b.id)!;
      const det = screenAverage(prep.model, { x: w.x!, y: w.y!, zTop: w.zTop, zBottom: Math.max(w.zTop, w.zBottom) }, Infinity);
      expect(det).toBeGreaterThan(0);
      // the median between the quantiles at 0.5 ∓ 2/n of C0 (gsd 2), as above
      expect(b.p50[0]).toBeGreaterThanOrEqual(det * Math.pow(2, zOf(0.5 - 2 / 60)) * (1 - 1e-6));
      expect(b.p50[0]).toBeLessThanOrEqual(det * Math.pow(2, zOf(0.5 + 2 / 60)) * (1 + 1e-6));
    }
  });
  it('the wells are evaluated in the first WELL_BAND_REALISATIONS realisations only (a fifth with the exact solution)', () => {
    const many = { ...c, uncertainty: { ...c.uncertainty, runs: 5000 } };
    const plan = planUncertainty(many, { wells: true });
    expect(plan.wellRealisations).toBe(WELL_BAND_REALISATIONS);
    expect(planUncertainty({ ...many, evaluation: { ...many.evaluation, solution: 'exact' } }, { wells: true }).wellRealisations).toBe(WELL_BAND_REALISATIONS / 5);
    const per = plan.wells.length * plan.wellSteps;
    expect(runRealisations(plan, WELL_BAND_REALISATIONS - 10, WELL_BAND_REALISATIONS + 10).wellCurves).toHaveLength(10 * per);
    expect(runRealisations(plan, WELL_BAND_REALISATIONS, WELL_BAND_REALISATIONS + 10).wellCurves).toBeNull();
    const partial = joinBlocks(plan, [runRealisations(plan, 0, 20)]);
    expect(partial.wellCurves).toHaveLength(WELL_BAND_REALISATIONS * per);
    expect(monitoringWellBands(plan, partial)!.every((b) => b.realisations === 20)).toBe(true);
  });
  it('each band carries the key of the well it was computed for', () => {
    const plan = planUncertainty(c, { wells: true });
    const moved: Case = { ...c, monitoring: { ...c.monitoring, wells: c.monitoring.wells.map((w, i) => (i === 0 ? { ...w, position: [w.position![0] + 1, w.position![1]] as [number, number] } : w)) } };
    const replanned = planUncertainty(moved, { wells: true });
    expect(replanned.wells[0].key).not.toBe(plan.wells[0].key);
    expect(replanned.wells[1].key).toBe(plan.wells[1].key);
  });
});
