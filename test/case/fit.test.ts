/**
 * Fitting case parameters to monitoring data (src/case/fit.ts, src/core/fit).
 *
 * - Levenberg–Marquardt against SciPy's curve_fit (method 'lm', MINPACK) on y = a·e^(−bx) + c with
 *   noise (fixture test/fixtures/trends/trends.json, generator committed): parameters to 1e-6
 *   relative and standard errors to 1e-4 relative (both minimise the same sum of squares; the
 *   tolerances cover the two stopping rules and forward-difference Jacobians).
 * - Turning the flow direction in the fit matches prepareCase with the case's azimuth turned (the
 *   project's own projection, an independent path): screen concentrations to 1e-9 relative.
 * - Recovery (non-detects handled by the censored-normal EM): synthetic data from the project's Domenico model with known C₀, t½ and αL, ln-normal
 *   noise σ = 0.3, non-detects below a reporting limit; over 30 seeded trials the 95 % interval of
 *   each parameter covers the true value in at least 24 (80 %). The linearised interval is
 *   approximate, so the bound is set below the nominal 95 %: with a true coverage of 95 % the
 *   chance of fewer than 24 of 30 is 0.1 % (binomial).
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import fixture from '../fixtures/trends/trends.json';
import { levenbergMarquardt, screenAverage } from '../../src/core/index';
import { migrateCase } from '../../src/case/migrate';
import { prepareCase } from '../../src/case/prepare';
import { adoptBiodegradationAsVariant, adoptFitAsVariant, fitCase, fitDistributions, fitObservations, modelledAt } from '../../src/case/fit';
import { analyseObservations } from '../../src/case/observations';
import { planUncertainty } from '../../src/case/uncertainty';
import { fromInternal, toInternal } from '../../src/core/units';
import { isoFromDay, dayNumber, type SamplingResult } from '../../src/case/monitoring';
import type { Case } from '../../src/case/schema';
import { Prng } from '../core/helpers/check';
import { normalQuantile } from '../../src/core/index';

const depot = (): Case => migrateCase(JSON.parse(readFileSync('cases/depot-benzene-monitoring.json', 'utf8')));

describe('Levenberg–Marquardt against scipy.optimize.curve_fit', () => {
  it('a·e^(−bx) + c: parameters and standard errors', () => {
    const { x, y, theta, stderr } = fixture.nonlinear;
    const fit = levenbergMarquardt({
      residuals: ([a, b, c]) => x.map((xi, i) => y[i] - (a * Math.exp(-b * xi) + c)),
      start: [1, 0.1, 0],
      steps: [1e-7, 1e-7, 1e-7],
    }, { tolerance: 1e-14, maxIterations: 500 });
    expect(fit.converged).toBe(true);
    theta.forEach((t, i) => expect(Math.abs(fit.theta[i] - t)).toBeLessThan(1e-6 * Math.abs(t)));
    stderr.forEach((s, i) => expect(Math.abs(fit.stdErrors[i]! - s)).toBeLessThan(1e-4 * s));
  });
});

describe('the flow direction in the fit', () => {
  it('turning by δ matches the case prepared with the azimuth turned', () => {
    const c = depot();
    const p = prepareCase(c);
    const obs = fitObservations(c, p).slice(0, 40);
    const turned = prepareCase({ ...c, site: { ...c.site, flow: { method: 'direction', azimuthDeg: 90 + 7, gradient: 0.005 } } });
    const got = modelledAt(p.model, obs, 7);
    obs.forEach((o, i) => {
      const w = c.monitoring.wells.find((x) => x.id === o.wellId)!;
      const f = turned.fromMap(w.position!);
      const ref = screenAverage(turned.model, { x: f.x, y: f.y, zTop: o.zTop, zBottom: o.zBottom }, o.t);
      expect(Math.abs(got[i] - ref)).toBeLessThanOrEqual(1e-9 * ref + 1e-300);
    });
  });
});

describe('recovery of known parameters', () => {
  function synthetic(seed: number, truth: { c0: number; halfLifeD: number; ax: number }): Case {
    const c = depot();
    c.source.sourceHalfLife = null;
    const p = prepareCase(c);
    const k = truth.ax / p.model.ax;
    const model = { ...p.model, c0: truth.c0, decay: Math.LN2 / truth.halfLifeD, ax: truth.ax, ay: p.model.ay * k, az: p.model.az * k };
    const rng = new Prng(seed);
    const release = dayNumber(c.monitoring.releaseDate!)!;
    const results: SamplingResult[] = [];
    for (const w of c.monitoring.wells) {
      const f = p.fromMap(w.position!);
      for (let q = 0; q < 10; q++) {
        const t = 900 + 182 * q;
        const true_ = screenAverage(model, { x: f.x, y: f.y, zTop: w.screenTop.value, zBottom: w.screenBottom.value }, t);
        const noisy = true_ * Math.exp(0.3 * normalQuantile(Math.min(1 - 1e-12, Math.max(1e-12, rng.uniform()))));
        const limit = 0.001;
        results.push({ wellId: w.id, date: isoFromDay(release + t), analyte: 'benzene', value: noisy < limit ? limit : noisy, unit: 'mg/L', nonDetect: noisy < limit });
      }
    }
    return { ...c, monitoring: { ...c.monitoring, results } };
  }

  it('C₀, t½ and αL from 30 seeded noisy data sets: each interval covers the truth in ≥ 24 of 30', () => {
    const truth = { c0: 3, halfLifeD: 200, ax: 4 };
    const covered = { sourceConcentration: 0, halfLife: 0, longitudinalDispersivity: 0 };
    let withNonDetects = 0;
    for (let seed = 1; seed <= 30; seed++) {
      const c = synthetic(seed, truth);
      if (c.monitoring.results.some((r) => r.nonDetect)) withNonDetects++;
      const fit = fitCase(c, ['sourceConcentration', 'halfLife', 'longitudinalDispersivity']);
      const want = { sourceConcentration: truth.c0, halfLife: truth.halfLifeD, longitudinalDispersivity: truth.ax };
      for (const v of fit.values) {
        const key = v.parameter as keyof typeof covered;
        if (v.interval && v.interval[0] <= want[key] && want[key] <= v.interval[1]) covered[key]++;
      }
    }
    expect(withNonDetects).toBeGreaterThan(0); // the censored residuals are exercised
    for (const [k, n] of Object.entries(covered)) expect(n, k).toBeGreaterThanOrEqual(24);
  });
});

describe('adopting a fit', () => {
  it('makes a what-if variant (new id, parent, note), leaving the case itself unchanged', () => {
    const c = depot();
    const before = JSON.stringify(c);
    const fit = fitCase(c, ['sourceConcentration', 'halfLife']);
    expect(fit.rmsLn).toBeLessThan(fit.startRmsLn);
    const v = adoptFitAsVariant(c, fit, 'variant-1', '2026-12-03T10:00:00.000Z');
    expect(JSON.stringify(c)).toBe(before);
    expect(v.parentId).toBe(c.id);
    expect(v.id).toBe('variant-1');
    expect(v.notes).toMatch(/^Fitted to \d+ detected results/);
    expect(v.contaminant.halfLife!.unit).toBe('yr');
    expect(v.contaminant.halfLife!.value).not.toBe(c.contaminant.halfLife!.value);
    expect(() => migrateCase(JSON.parse(JSON.stringify(v)))).not.toThrow();
  });
});

describe('fitted values into the case: variants and uncertain inputs', () => {
  // Reference: the interval of a parameter fitted as a logarithm is symmetric in the logarithm, so
  // the log-normal whose 2.5th and 97.5th percentiles are its ends has the fitted value as median
  // (exp of the mean of the ends' logarithms); z(0.975) = 1.959964 (standard normal table).
  const depotCase = (): Case => migrateCase(JSON.parse(readFileSync('cases/depot-benzene-monitoring.json', 'utf8')));

  it('the fitted values become distributions about them (distributionFromEstimate), which a Monte Carlo run accepts', () => {
    const c = depotCase();
    const fit = fitCase(c, ['sourceConcentration', 'halfLife', 'longitudinalDispersivity', 'flowDirection']);
    const d = fitDistributions(c, fit);
    const byName = Object.fromEntries(fit.values.map((v) => [v.parameter, v]));
    const c0 = d.sourceConcentration!;
    if (c0.kind !== 'lognormal') throw new Error('source concentration: expected a log-normal');
    expect(c0.median / fromInternal(byName.sourceConcentration.value, c0.unit!)).toBeCloseTo(1, 3);
    // the log-fitted interval is exp(ln value ± t·SE_ln): ln(hi/lo) / (2 ln gsd) is Student's t at 95 %
    // for the fit's degrees of freedom (between z = 1.960 and t(30) = 2.042, statistical tables)
    const [lo, hi] = byName.sourceConcentration.interval!;
    const t = Math.log(hi / lo) / (2 * Math.log(c0.gsd));
    expect(t).toBeGreaterThan(1.959);
    expect(t).toBeLessThan(2.05);
    const hl = d.halfLife!;
    if (hl.kind !== 'lognormal') throw new Error('half-life: expected a log-normal');
    expect(hl.median / fromInternal(byName.halfLife.value, hl.unit!)).toBeCloseTo(1, 3);
    const f = d.dispersivityFactor!;
    if (f.kind !== 'lognormal') throw new Error('dispersivity: expected a log-normal');
    expect(f.median).toBe(1);
    const dir = d.flowDirection!;
    if (dir.kind !== 'normal') throw new Error('direction: expected a normal distribution');
    expect(dir.sd).toBeCloseTo(byName.flowDirection.standardError!, 3);
    const v = adoptFitAsVariant(c, fit, 'v-1', '2026-01-02T00:00:00.000Z', true);
    expect(Object.keys(v.uncertainty.inputs).sort()).toEqual(['dispersivityFactor', 'flowDirection', 'halfLife', 'sourceConcentration']);
    expect(v.notes).toMatch(/Uncertain inputs from the fit's standard errors/);
    const plan = planUncertainty(v, { runs: 50, seed: 3 });
    expect(plan.inputs.length).toBe(4);
    expect(c.uncertainty.inputs).toEqual(depotCase().uncertainty.inputs); // the case itself unchanged
  });

  it('the biodegradation rate becomes the half-life of a variant, in the field\'s own unit, with the caution', () => {
    const c = depotCase();
    const s = analyseObservations(c);
    const v = adoptBiodegradationAsVariant(c, s, 'v-2', '2026-01-02T00:00:00.000Z', true);
    expect(v.parentId).toBe(c.id);
    expect(v.contaminant.halfLife!.unit).toBe(c.contaminant.halfLife!.unit);
    expect(toInternal(v.contaminant.halfLife!.value, v.contaminant.halfLife!.unit)).toBeCloseTo(s.adoptableHalfLife!, -1);
    expect(v.notes).toMatch(/not a biodegradation rate/);
    const hl = v.uncertainty.inputs.halfLife!;
    if (hl.kind !== 'lognormal-range') throw new Error('expected a log-normal range');
    const [lo, hi] = s.biodegradationRate!.interval!;
    expect(toInternal(hl.low, hl.unit!)).toBeCloseTo((s.adoptableHalfLife! * s.biodegradationRate!.rate) / hi, -1);
    expect(toInternal(hl.high, hl.unit!)).toBeCloseTo((s.adoptableHalfLife! * s.biodegradationRate!.rate) / lo, -1);
    expect(c.contaminant.halfLife).toEqual(depotCase().contaminant.halfLife);
    expect(() => adoptBiodegradationAsVariant(c, { ...s, biodegradationRate: null, adoptableHalfLife: null }, 'x', 'now')).toThrow(/biodegradation rate/);
  });
});
