/**
 * The probability-of-exceedance map (src/case/exceedanceMap.ts) against exact answers.
 *
 * With one uncertain input, lognormal K, and a node where the concentration at the map's time
 * rises with K, P(C > limit) = P(K > K*), K* the conductivity at which the deterministic model's
 * concentration there equals the limit (found here by bisection on the engine's point value), and
 * P(K > K*) = ½·erfc(z* / √2), z* = ln(K* / median) / ln(gsd), with @stdlib's erfc (an outside
 * implementation). Agreement within 4 Monte Carlo standard errors at every such node tried.
 * A realisation whose frame "turns" by nothing gives the map of the lattice path exactly (to
 * rounding): the node placement of a turned flow is the flow frame's own rotation.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import stdlibErfc from '@stdlib/math-base-special-erfc';
import { migrateCase } from '../../src/case/migrate';
import type { Case } from '../../src/case/schema';
import { exceedanceMapOf, joinBlocks, planUncertainty, realisationModel, runRealisations } from '../../src/case/uncertainty';
import { countExceedance, exceedanceScratch } from '../../src/case/exceedanceMap';
import { concentration } from '../../src/core';

const load = (f: string): Case => migrateCase(JSON.parse(readFileSync(`cases/${f}`, 'utf8')));

describe('P(C > limit) on the map', () => {
  it('with one lognormal K equals P(K > K*) at centreline nodes (within 4 standard errors)', () => {
    const c = load('fuel-release-farm-well.json');
    const median = 12;
    const gsd = 2.5;
    const u: Case = { ...c, uncertainty: { runs: 1500, seed: 77, headFit: false, inputs: { hydraulicConductivity: { kind: 'lognormal', median, gsd, unit: 'K:m/d' } } } };
    const plan = planUncertainty(u, { map: true });
    const g = plan.map!;
    expect(g.mapped).toBe(1500);
    const block = joinBlocks(plan, [runRealisations(plan, 750, 1500), runRealisations(plan, 0, 750)]);
    expect(block.mapped).toBe(1500);
    const j0 = g.ys.findIndex((y, j) => y <= 0 && g.ys[j + 1] > 0);
    const at = (K: number, i: number, j: number) => concentration(realisationModel(plan, { hydraulicConductivity: K }).model, { x: g.xs[i], y: g.ys[j], z: g.depth }, g.time);
    let checked = 0;
    for (let i = 2; i < g.xs.length; i += 3) {
      const p = block.mapCounts![i * g.ys.length + j0] / block.mapped;
      if (p < 0.05 || p > 0.95) continue;
      let lo = Math.log(1e-3);
      let hi = Math.log(1e4);
      if (!(at(Math.exp(hi), i, j0) > g.limit) || at(Math.exp(lo), i, j0) > g.limit) continue;
      for (let it = 0; it < 60; it++) {
        const mid = 0.5 * (lo + hi);
        if (at(Math.exp(mid), i, j0) > g.limit) hi = mid;
        else lo = mid;
      }
      const exact = 0.5 * stdlibErfc(Math.log(Math.exp(hi) / median) / Math.log(gsd) / Math.SQRT2);
      const se = Math.sqrt((exact * (1 - exact)) / block.mapped);
      expect(Math.abs(p - exact), `node x = ${g.xs[i]} m: p̂ ${p}, exact ${exact}`).toBeLessThanOrEqual(4 * se);
      checked++;
    }
    expect(checked).toBeGreaterThanOrEqual(3);
    const contours = exceedanceMapOf(plan, block)!;
    expect(contours.realisations).toBe(1500);
    expect(contours.maxStandardError).toBeCloseTo(0.5 / Math.sqrt(1500), 12);
    expect(contours.bands.bandPolygons[contours.levels.length]).toBeGreaterThan(0);
  });

  it('a frame turned by nothing maps like the prepared lattice (node placement is the flow frame rotation)', () => {
    const c = load('fuel-release-farm-well.json');
    const plan = planUncertainty(c, { runs: 50, map: true });
    const g = plan.map!;
    const { model } = realisationModel(plan, {});
    const a = new Uint32Array(g.xs.length * g.ys.length);
    const b = new Uint32Array(a.length);
    countExceedance(g, model, null, a, exceedanceScratch(g));
    countExceedance(g, model, { sourceEN: plan.prepared.sourceEN, planeAzimuthDeg: plan.prepared.derived.planeAzimuthDeg }, b, exceedanceScratch(g));
    expect(a.reduce((s, v) => s + v, 0)).toBeGreaterThan(10);
    // nodes within rounding of the limit may differ; none did here
    expect(Array.from(b)).toEqual(Array.from(a));
  });

  it('only the first `mapped` realisations are mapped, and a run without the option has no map', () => {
    const c = load('fuel-release-farm-well.json');
    const exact: Case = { ...c, evaluation: { ...c.evaluation, solution: 'exact' } };
    expect(planUncertainty(exact, { runs: 5000, map: true }).map!.mapped).toBe(400);
    const plan = planUncertainty(c, { runs: 100 });
    expect(plan.map).toBeNull();
    expect(runRealisations(plan, 0, 10).mapCounts).toBeNull();
  });
});
