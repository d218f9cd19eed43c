/**
 * Monte Carlo screening of a case against exact answers.
 *
 * Exceedance: with one uncertain input (lognormal K) and a receptor whose peak concentration
 * within the horizon rises monotonically with K, P(reaching the limit) = P(K > K*), where K* is
 * the conductivity at which the deterministic model's peak equals the limit (found here by
 * bisection on the engine's deterministic result) and P(K > K*) = ½·erfc(z* / √2) with
 * z* = ln(K* / median)/ln(gsd), evaluated with @stdlib's erfc (an outside implementation).
 * Agreement within 4 Monte Carlo standard errors, for the three demo cases and both solutions.
 *
 * Percentiles: the peak is a known monotone function g(K) of the one lognormal input, so its
 * q-quantile is g(K_q) with K_q = median·gsd^Φ⁻¹(q) (Φ⁻¹ from the scipy fixture values); the
 * sample percentile must lie between g(K) at q ∓ 2/n (the order statistics a Latin hypercube of n
 * realisations can straddle).
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { normalQuantileRef, upperTail } from './normal-tail';
import { migrateCase } from '../../src/case/migrate';
import type { Case } from '../../src/case/schema';
import {
  breakthroughBands,
  designOf,
  joinBlocks,
  realisationValues,
  planUncertainty,
  realisationModel,
  runRealisations,
  runUncertainty,
  summariseRun,
  type UncertaintyPlan,
} from '../../src/case/uncertainty';
import { peakConcentration } from '../../src/core';
import { prepareCase } from '../../src/case/prepare';

const load = (f: string): Case => migrateCase(JSON.parse(readFileSync(`cases/${f}`, 'utf8')));
/** a demo case, with the limit replaced where given (the nitrate demo's wells stay below 10 mg/L with Domenico at any K) */
const loadWith = (f: string, limitMgL?: number): Case => {
  const c = load(f);
  return limitMgL === undefined ? c : { ...c, contaminant: { ...c.contaminant, limit: { value: limitMgL, unit: 'mg/L' } } };
};

function withK(c: Case, median: number, gsd: number, runs: number, solution: 'domenico' | 'exact'): Case {
  return {
    ...c,
    evaluation: { ...c.evaluation, solution },
    uncertainty: { runs, seed: 2026, headFit: false, inputs: { hydraulicConductivity: { kind: 'lognormal', median, gsd, unit: 'K:m/d' } } },
  };
}

/** the deterministic peak at receptor j for a conductivity K (m/d) */
function peakAt(plan: UncertaintyPlan, j: number, K: number): number {
  const { model, receptors } = realisationModel(plan, { hydraulicConductivity: K });
  return peakConcentration(model, receptors[j], plan.prepared.horizon).c;
}

/** K* with peak(K*) = limit, by bisection in ln K (60 halvings of a 1e-6…1e6 bracket) */
function thresholdK(plan: UncertaintyPlan, j: number): number | null {
  const limit = plan.prepared.limit;
  let lo = Math.log(1e-4);
  let hi = Math.log(1e5);
  if (peakAt(plan, j, Math.exp(hi)) < limit || peakAt(plan, j, Math.exp(lo)) >= limit) return null;
  for (let it = 0; it < 60; it++) {
    const mid = 0.5 * (lo + hi);
    if (peakAt(plan, j, Math.exp(mid)) >= limit) hi = mid;
    else lo = mid;
  }
  return Math.exp(hi);
}


describe('P(exceed) with one uncertain lognormal K equals P(K > K*) (within 4 standard errors)', () => {
  const gsd = 2.5;
  // The solvent demo's source halves every 10 years, faster than Domenico's closed form can
  // represent at low K (those realisations are refused), so it is checked with the exact solution.
  const cases: [string, 'domenico' | 'exact', number | undefined][] = [
    ['fuel-release-farm-well.json', 'domenico', undefined],
    ['fuel-release-farm-well.json', 'exact', undefined],
    ['nitrate-field-supply.json', 'domenico', 5],
    ['nitrate-field-supply.json', 'exact', 5],
    ['v1-compact-example.json', 'domenico', undefined],
    ['v1-compact-example.json', 'exact', undefined],
    ['solvent-release-creek.json', 'exact', undefined],
  ];
  it.each(cases)('%s, %s, limit %s mg/L (undefined: the demo\'s)', (file, solution, limit) => {
    const c = loadWith(file, limit);
    const runs = solution === 'exact' ? 200 : 600;
    // find K* at the base case's conductivity scale, then centre the distribution so P is moderate
    const probe = planUncertainty(withK(c, 10, gsd, runs, solution));
    const j = probe.prepared.receptors.findIndex((_r, jj) => thresholdK(probe, jj) !== null);
    expect(j).toBeGreaterThanOrEqual(0);
    const Kstar = thresholdK(probe, j)!;
    for (const z0 of [-0.6, 0.8]) {
      // median placed so that z* = ln(K* / median)/ln(gsd) = z0
      const median = Kstar / Math.pow(gsd, z0);
      const result = runUncertainty(withK(c, median, gsd, runs, solution));
      const r = result.receptors[j];
      const exact = upperTail(Math.log(Kstar / median) / Math.log(gsd));
      const se = Math.sqrt((exact * (1 - exact)) / runs);
      expect(result.refusedCount).toBe(0);
      expect(Math.abs(r.pExceed - exact), `${file} ${solution} z0=${z0}: p̂ ${r.pExceed}, exact ${exact}, SE ${se}`).toBeLessThanOrEqual(4 * se);
    }
  });
});

describe('percentiles of the peak, a monotone function of one lognormal K, against analytical quantiles', () => {
  // Φ⁻¹ at 0.05 ∓ 2/n etc. from scipy.special.ndtri would need n fixed; instead bracket by the
  // engine's own map g at lognormal quantiles computed with the inverse of @stdlib's erfc by bisection
  const zOf = normalQuantileRef;
  it.each(['domenico', 'exact'] as const)('nitrate demo, %s', (solution) => {
    const c = load('nitrate-field-supply.json');
    const runs = solution === 'exact' ? 200 : 500;
    const median = 15;
    const gsd = 2;
    const plan = planUncertainty(withK(c, median, gsd, runs, solution));
    const res = runUncertainty(withK(c, median, gsd, runs, solution));
    const Kq = (q: number) => median * Math.pow(gsd, zOf(q));
    for (const j of [0, 1]) {
      const g = (q: number) => peakAt(plan, j, Kq(q));
      const got = res.receptors[j].peak;
      for (const [q, v] of [
        [0.05, got.p5],
        [0.5, got.p50],
        [0.95, got.p95],
      ] as const) {
        const lo = g(q - 2 / runs);
        const hi = g(q + 2 / runs);
        expect(v!, `receptor ${j} q=${q}: ${v} not in [${lo}, ${hi}]`).toBeGreaterThanOrEqual(lo * (1 - 1e-9));
        expect(v!).toBeLessThanOrEqual(hi * (1 + 1e-9));
      }
    }
  });
});

describe('a run is the same however it is split', () => {
  it('one worker against four (blocks in any order) give identical results', () => {
    const c = load('fuel-release-farm-well.json');
    const u: Case = {
      ...c,
      uncertainty: {
        runs: 240,
        seed: 11,
        headFit: false,
        inputs: {
          hydraulicConductivity: { kind: 'lognormal', median: 8, gsd: 3, unit: 'K:m/d' },
          halfLife: { kind: 'log-uniform', low: 100, high: 1000, unit: 'd' },
          dispersivityFactor: { kind: 'lognormal-range', low: 0.3, high: 3, percentile: 5 },
          flowDirection: { kind: 'normal', mean: c.site.flow.method === 'direction' ? c.site.flow.azimuthDeg : 0, sd: 10 },
        },
      },
    };
    const plan = planUncertainty(u);
    const one = summariseRun(plan, runRealisations(plan, 0, 240));
    const blocks = [
      [180, 240],
      [0, 60],
      [120, 180],
      [60, 120],
    ].map(([a, b]) => runRealisations(planUncertainty(u), a, b, designOf(plan)));
    const four = summariseRun(plan, joinBlocks(plan, blocks));
    expect(four).toEqual(one);
    // a partial run (two of the four blocks back): only their realisations count
    const partial = summariseRun(plan, joinBlocks(plan, [blocks[0], blocks[2]]));
    expect(partial.done).toBe(120);
    const rows = [...blocks[0].arrival.filter((_t, k) => k % 2 === 0), ...blocks[2].arrival.filter((_t, k) => k % 2 === 0)];
    expect(partial.receptors[0].pExceed).toBe(rows.filter(Number.isFinite).length / 120);
    expect(one.receptors[0].drivers.map((d) => d.input)).toContain('hydraulicConductivity');
  });
});

describe('each realisation goes through the case-to-engine seam', () => {
  it('a turned flow direction gives the model and receptor positions prepareCase gives the case turned that way', () => {
    const c = load('fuel-release-farm-well.json');
    if (c.site.flow.method !== 'direction') throw new Error('the fuel demo gives its flow as a direction');
    const u: Case = { ...c, uncertainty: { runs: 10, seed: 1, headFit: false, inputs: { flowDirection: { kind: 'normal', mean: c.site.flow.azimuthDeg, sd: 20 } } } };
    const plan = planUncertainty(u);
    for (const turn of [-35, 12, 70]) {
      const az = c.site.flow.azimuthDeg + turn;
      const turned = prepareCase({ ...c, site: { ...c.site, flow: { ...c.site.flow, azimuthDeg: az } } });
      const r = realisationModel(plan, { flowDirection: az });
      expect(r.model, `turn ${turn}°`).toEqual(turned.model);
      r.receptors.forEach((p, j) => {
        expect(p.x).toBeCloseTo(turned.receptors[j].x, 9);
        expect(p.y).toBeCloseTo(turned.receptors[j].y, 9);
      });
    }
  });

  it('realisations with the effective porosity above the total porosity are refused, counted and reported', () => {
    const c = load('fuel-release-farm-well.json');
    const u: Case = {
      ...c,
      uncertainty: {
        runs: 400,
        seed: 3,
        headFit: false,
        inputs: { totalPorosity: { kind: 'uniform', low: 0.2, high: 0.4 }, effectivePorosity: { kind: 'uniform', low: 0.15, high: 0.35 } },
      },
    };
    const plan = planUncertainty(u);
    const lhs = designOf(plan);
    let invalid = 0;
    for (let i = 0; i < plan.runs; i++) {
      const v = realisationValues(plan, lhs, i);
      if (v.effectivePorosity! > v.totalPorosity!) invalid++;
    }
    expect(invalid).toBeGreaterThan(0);
    const res = runUncertainty(u);
    expect(res.refusedCount).toBe(invalid);
    expect(res.refusals[0].message).toMatch(/^Effective porosity nₑ [\d.]+ is not accepted: enter a value at most the total porosity n/);
    expect(res.receptors[0].evaluated).toBe(plan.runs - invalid);
  });
});

describe('percentile bands of the breakthrough curves', () => {
  it('at the horizon equal the percentiles of the concentration at the horizon (Float32 curves: 1e-6 relative), and are ordered; split-independent', () => {
    const c = load('nitrate-field-supply.json');
    const u = withK(c, 15, 2, 300, 'domenico');
    const plan = planUncertainty(u, { curves: true });
    const block = runRealisations(plan, 0, plan.runs);
    const sum = summariseRun(plan, block);
    const bands = breakthroughBands(plan, block)!;
    expect(bands).toHaveLength(plan.prepared.receptors.length);
    expect(plan.curveTimes![plan.curveTimes!.length - 1]).toBe(plan.prepared.horizon);
    bands.forEach((b, j) => {
      const last = b.times.length - 1;
      const h = sum.receptors[j].concentrationAtHorizon;
      for (const [got, want] of [
        [b.p5[last], h.p5!],
        [b.p50[last], h.p50!],
        [b.p95[last], h.p95!],
      ])
        expect(Math.abs(got - want)).toBeLessThanOrEqual(1e-6 * want + 1e-30);
      for (let k = 0; k < b.times.length; k++) {
        expect(b.p5[k]).toBeLessThanOrEqual(b.p25[k]);
        expect(b.p25[k]).toBeLessThanOrEqual(b.p50[k]);
        expect(b.p50[k]).toBeLessThanOrEqual(b.p75[k]);
        expect(b.p75[k]).toBeLessThanOrEqual(b.p95[k]);
      }
    });
    const split = joinBlocks(plan, [runRealisations(plan, 150, 300), runRealisations(plan, 0, 150)]);
    expect(breakthroughBands(plan, split)).toEqual(bands);
    // without the option, no curves are computed
    expect(runRealisations(planUncertainty(u), 0, 10).curves).toBeNull();
  });
});

describe('bad settings are refused with a message naming the input', () => {
  const c = load('nitrate-field-supply.json');
  const run = (uncertainty: Partial<Case['uncertainty']>) => () =>
    planUncertainty({ ...c, uncertainty: { runs: 100, seed: 1, headFit: false, inputs: { hydraulicConductivity: { kind: 'lognormal', median: 10, gsd: 2 } }, ...uncertainty } });
  it.each([
    ['zero runs', { runs: 0 }, /uncertainty\.runs = 0 is not accepted: must be a whole number of realisations from 1 to 50000/],
    ['a non-integer seed', { seed: 2.5 }, /uncertainty\.seed = 2\.5 is not accepted: must be a whole number/],
    ['low above high', { inputs: { halfLife: { kind: 'uniform', low: 900, high: 300, unit: 'd' } } }, /uncertainty\.inputs\.halfLife\.high .*Biodegradation half-life: the low value \(900\) is not below the high value \(300\)/],
    ['a negative standard deviation', { inputs: { sourceConcentration: { kind: 'normal', mean: 50, sd: -5 } } }, /Source concentration C₀: the standard deviation must be above 0/],
    ['a normal porosity with a tail below 0', { inputs: { effectivePorosity: { kind: 'normal', mean: 0.2, sd: 0.1 } } }, /Effective porosity nₑ: this normal distribution puts 2\.3 % of its probability below 0/],
    ['porosity above the total porosity', { inputs: { effectivePorosity: { kind: 'uniform', low: 0.1, high: 0.9 } } }, /Effective porosity nₑ: .* above 0\.3/],
    ['a length in a time unit', { inputs: { sourceThickness: { kind: 'uniform', low: 1, high: 2, unit: 'd' } } }, /Source thickness below the water table: "d" is not a length unit/],
    ['no distribution at all', { inputs: {} }, /no input has a distribution/],
    ['gradient with flow from heads', { inputs: { gradient: { kind: 'uniform', low: 0.001, high: 0.01 } } }, /Hydraulic gradient i: the flow comes from head readings/],
    ['truncation bounds in the wrong order', { inputs: { hydraulicConductivity: { kind: 'lognormal', median: 10, gsd: 2, truncate: { low: 30, high: 5 } } } }, /Hydraulic conductivity K: the lower truncation bound \(30\) is not below the upper one \(5\)/],
    // lognormal median 10, gsd 2: its 0.1st and 99.9th percentiles are 10·2^(∓3.090) = 1.17 and 85.2 (Φ⁻¹(0.999) = 3.090, standard normal table)
    ['truncation bounds that leave nothing', { inputs: { hydraulicConductivity: { kind: 'lognormal', median: 10, gsd: 2, truncate: { low: 1e6, high: 2e6 } } } }, /Hydraulic conductivity K: the truncation bounds \[1000000, 2000000\] leave \(almost\) none of the distribution, which lies from 1\.17 to 85\.2/],
    ['a truncated normal porosity still below 0', { inputs: { effectivePorosity: { kind: 'normal', mean: 0.2, sd: 0.1, truncate: { low: -0.1, high: 0.3 } } } }, /Effective porosity nₑ: this normal distribution puts .* below 0, outside the physical range \(in \(0, 0\.3\]\)/],
  ])('%s', (_n, u, msg) => {
    expect(run(u as Partial<Case['uncertainty']>)).toThrow(msg);
  });
});

describe('flow from four or more heads: gradient and direction from the plane fit', () => {
  it('samples the direction with the spread the fit covariance gives (first-order propagation, within 10 %)', () => {
    const c = load('nitrate-field-supply.json');
    const plan = planUncertainty({ ...c, uncertainty: { runs: 2000, seed: 5, headFit: true, inputs: {} } });
    const hp = plan.headPlane!;
    expect(hp.dof).toBeGreaterThanOrEqual(1);
    const lhs = designOf(plan);
    const dirs: number[] = [];
    const grads: number[] = [];
    for (let i = 0; i < plan.runs; i++) {
      const v = realisationValues(plan, lhs, i);
      dirs.push(v.flowDirection!);
      grads.push(v.gradient!);
    }
    const mean = (x: number[]) => x.reduce((s, y) => s + y, 0) / x.length;
    const sd = (x: number[]) => Math.sqrt(mean(x.map((y) => (y - mean(x)) ** 2)));
    // θ = atan2(−a, −b): ∂θ/∂a = −b/g², ∂θ/∂b = a/g² (radians), g² = a² + b² (first-order / delta method)
    const g2 = hp.a * hp.a + hp.b * hp.b;
    const da = -hp.b / g2;
    const db = hp.a / g2;
    const sdTheta = (Math.sqrt(da * da * hp.caa + 2 * da * db * hp.cab + db * db * hp.cbb) * 180) / Math.PI;
    const unwrapped = dirs.map((d) => ((d - plan.prepared.derived.azimuthDeg + 540) % 360) - 180);
    expect(Math.abs(mean(unwrapped))).toBeLessThan(4 * (sdTheta / Math.sqrt(plan.runs)) + 0.05 * sdTheta);
    expect(sd(unwrapped) / sdTheta).toBeGreaterThan(0.9);
    expect(sd(unwrapped) / sdTheta).toBeLessThan(1.1);
    expect(mean(grads) / plan.prepared.derived.gradient).toBeCloseTo(1, 1);
  });

  it('ranks the head-fit gradient and direction among the drivers; refuses the option with a direction-given flow', () => {
    const c = load('nitrate-field-supply.json');
    const res = runUncertainty({ ...c, uncertainty: { runs: 300, seed: 5, headFit: true, inputs: { hydraulicConductivity: { kind: 'lognormal', median: 15, gsd: 2, unit: 'K:m/d' } } } });
    expect(res.receptors[0].drivers.map((d) => d.input).sort()).toEqual(['flowDirection', 'gradient', 'hydraulicConductivity']);
    const fuel = load('fuel-release-farm-well.json');
    expect(() => planUncertainty({ ...fuel, uncertainty: { runs: 10, seed: 1, headFit: true, inputs: {} } })).toThrow(/needs the flow from at least 4 head readings/);
  });
});

describe('demo cases with distributions', () => {
  it.each(['fuel-release-farm-well.json', 'nitrate-field-supply.json'])('%s plans and runs (100 realisations, none refused)', (f) => {
    const c = load(f);
    expect(Object.keys(c.uncertainty.inputs).length).toBeGreaterThanOrEqual(4);
    const res = runUncertainty(c, { runs: 100 });
    expect(res.refusedCount).toBe(0);
    expect(res.receptors.every((r) => r.pExceed >= 0 && r.pExceed <= 1 && r.drivers.length >= 4)).toBe(true);
  });
});

describe('probabilistic CSV (src/case/export-uncertainty.ts)', () => {
  it('holds the run, every distribution, per-receptor figures, drivers and the caution, and reads back as RFC 4180', async () => {
    const { uncertaintyCsv } = await import('../../src/case/export-uncertainty');
    const res = runUncertainty(load('fuel-release-farm-well.json'), { runs: 120, seed: 8 });
    const text = uncertaintyCsv(res);
    const lines = text.split('\r\n');
    expect(lines[1]).toMatch(/^Monte Carlo,120,8,"?Latin hypercube/);
    expect(text).toContain('uncertain input,Hydraulic conductivity K,"lognormal, median 12 m/d, geometric standard deviation 3"');
    const farm = lines.find((l) => l.startsWith('Farm supply well,120,8,'))!;
    expect(Number(farm.split(',')[3])).toBe(res.receptors[0].pExceed);
    expect(lines.filter((l) => l.startsWith("Neighbour's garden well,")).length).toBe(1 + res.receptors[1].drivers.length);
    expect(text).toContain('probabilistic caution');
  });
});

describe('starting distributions offered in the app (src/case/uncertaintyDefaults.ts)', () => {
  it.each(['fuel-release-farm-well.json', 'nitrate-field-supply.json', 'solvent-release-creek.json', 'v1-compact-example.json'])('%s: every applicable input gets one that passes the plan’s checks, its source in the note', async (f) => {
    const { defaultDistribution } = await import('../../src/case/uncertaintyDefaults');
    const { notApplicable, planInput } = await import('../../src/case/uncertainty');
    const { UNCERTAIN_INPUTS } = await import('../../src/case/schema');
    const c = load(f);
    for (const input of UNCERTAIN_INPUTS) {
      if (notApplicable(c, input)) continue;
      const d = defaultDistribution(c, input);
      if (!d) continue;
      expect(() => planInput(c, input, d), input).not.toThrow();
      expect(d.note, input).toMatch(/\(.*\d{4}.*\)|assumption offered by Downgradient|common practice/);
    }
    const k = defaultDistribution(c, 'dispersivityFactor')!;
    expect(k.note).toContain('Gelhar, Welty & Rehfeldt 1992');
  });

  it('hydraulic conductivity: the tabulated range of the material holding the case’s K (Bouwer 1978, seen)', async () => {
    const { defaultDistribution } = await import('../../src/case/uncertaintyDefaults');
    const c = load('fuel-release-farm-well.json');
    const medium = { ...c, aquifer: { ...c.aquifer, hydraulicConductivity: { value: 12, unit: 'K:m/d' } } };
    // Bouwer 1978 as tabulated in Canter et al. 1988: medium sand 5 – 20 m/d (docs/field-values.md)
    expect(defaultDistribution(medium, 'hydraulicConductivity')).toMatchObject({ kind: 'log-uniform', low: 5, high: 20, unit: 'K:m/d' });
    expect(defaultDistribution(medium, 'hydraulicConductivity')!.note).toMatch(/medium sand \(Bouwer 1978/);
  });
});

describe('a distribution from an estimate and its standard error (for values fitted to site data)', () => {
  it('lognormal with ln(gsd) = SE/estimate (delta method), normal for the flow direction; refused without a usable error', async () => {
    const { distributionFromEstimate, planInput } = await import('../../src/case/uncertainty');
    const d = distributionFromEstimate('halfLife', 400, 40, 'd', 'fitted');
    expect(d).toEqual({ kind: 'lognormal', median: 400, gsd: Math.exp(0.1), unit: 'd', note: 'fitted' });
    // its sampled spread: the 84.1th/15.9th percentiles (±1 sd of ln x) are 400·e^±0.1, i.e. ≈ ±SE for a small relative error
    const c = load('fuel-release-farm-well.json');
    const s = planInput(c, 'halfLife', d).sampler;
    expect(s.sample(0.8413447460685429) / 400).toBeCloseTo(Math.exp(0.1), 9);
    expect(distributionFromEstimate('flowDirection', 110, 8)).toEqual({ kind: 'normal', mean: 110, sd: 8 });
    expect(() => distributionFromEstimate('sourceConcentration', 5, 0)).toThrow(/Source concentration C₀: the standard error must be a number above 0/);
    expect(() => distributionFromEstimate('hydraulicConductivity', -3, 1)).toThrow(/Hydraulic conductivity K: the estimate must be above 0/);
  });
});

describe('the source note after an edit (uncertaintyDefaults.ts noteAfterEdit)', () => {
  it('a cited starting range changed in type, parameter or bounds says "my own values" and where it started; back at the starting values, the citation again', async () => {
    const { defaultDistribution, noteAfterEdit, OWN_VALUES } = await import('../../src/case/uncertaintyDefaults');
    const c = load('fuel-release-farm-well.json');
    const start = defaultDistribution(c, 'hydraulicConductivity')!;
    expect(start.note).toMatch(/Bouwer 1978/);
    type D = typeof start;
    const typed: D = { kind: 'lognormal', median: 10, gsd: 2, unit: start.unit, note: start.note };
    const note = noteAfterEdit(c, 'hydraulicConductivity', start, typed);
    expect(note).toBe(`${OWN_VALUES} (changed from: ${start.note})`);
    // a second edit keeps the one note (no "changed from: my own values (changed from: …)")
    expect(noteAfterEdit(c, 'hydraulicConductivity', { ...typed, note }, { ...typed, gsd: 3, note } as D)).toBe(note);
    // new bounds on the cited range: no longer the cited distribution
    expect(noteAfterEdit(c, 'hydraulicConductivity', start, { ...start, truncate: { low: 6 } })).toMatch(/^my own values \(changed from: /);
    // the starting values again: the citation again
    expect(noteAfterEdit(c, 'hydraulicConductivity', { ...typed, note }, { ...start, note: undefined })).toBe(start.note);
    // the demo's own note, or none, becomes "my own values"
    const demo = c.uncertainty.inputs.halfLife!;
    const wider = { ...demo, high: 4 } as D;
    expect(noteAfterEdit(c, 'halfLife', demo, wider)).toBe(`my own values (changed from: ${demo.note})`);
    expect(noteAfterEdit(c, 'halfLife', { ...demo, note: undefined }, wider)).toBe('my own values');
  });
});

describe('labels of the uncertain inputs (one list: src/case/fields.ts)', () => {
  it('each input is labelled as the screen labels the field it replaces, with that field’s unit dimension', async () => {
    const { INPUT_DEFINITIONS, driverSentence } = await import('../../src/case/uncertainty');
    const { fieldInfo } = await import('../../src/case/fields');
    for (const [input, d] of Object.entries(INPUT_DEFINITIONS)) {
      expect(d.label, input).toBe(fieldInfo(d.field)!.label);
      expect(d.dimension, input).toBe(fieldInfo(d.field)!.dimension);
    }
    expect(INPUT_DEFINITIONS.hydraulicConductivity.label).toBe('Hydraulic conductivity K');
    const d = { input: 'hydraulicConductivity', label: 'Hydraulic conductivity K', rankCorrelation: 0.8, pExceedLowThird: 0.03, pExceedHighThird: 0.61, measure: '' } as const;
    expect(driverSentence(d)).toBe('if hydraulic conductivity K is in its low third, 3.0 %; in its high third, 61 %');
    expect(driverSentence({ ...d, label: 'Organic-carbon partition coefficient Koc' })).toMatch(/^if organic-carbon partition/);
  });
});

describe('where new truncation bounds start (truncationStart)', () => {
  it('a normal K spilling below 0: the 1st and 99th percentiles of its part above 0 (Φ from @stdlib erfc)', async () => {
    const { truncationStart } = await import('../../src/case/uncertainty');
    const c = load('fuel-release-farm-well.json');
    const d = { kind: 'normal', mean: 12, sd: 21.6, unit: 'K:m/d' } as const;
    const s = truncationStart(c, 'hydraulicConductivity', d)!;
    const phi = (x: number) => upperTail(-(x - d.mean) / d.sd); // Φ(z) = P(Z > −z), @stdlib erfc (normal-tail.ts)
    const F = (x: number) => (phi(x) - phi(0)) / (1 - phi(0)); // the normal truncated to (0, ∞)
    expect(s.low).toBeGreaterThan(0);
    expect(Math.abs(F(s.low) - 0.01)).toBeLessThan(1e-12);
    expect(Math.abs(F(s.high) - 0.99)).toBeLessThan(1e-12);
    // nothing inside the physical range: no starting bounds
    expect(truncationStart(c, 'effectivePorosity', { kind: 'uniform', low: 2, high: 3 })).toBeNull();
  });
});
