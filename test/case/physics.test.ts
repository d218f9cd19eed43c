/**
 * The case's physics (src/case/physics.ts) and the seam `modelFor`: each derivation step against
 * hand calculations from the published formulas (sources beside each check), `modelFor(p, {})`
 * against prepareCase on every demo case (the same doubles), and substituted values against the
 * case file's rules (errors on case fields).
 *
 * Tolerance: short hand calculations to 1e-12 relative (a few roundings).
 */
import { describe, expect, test } from 'vitest';
import { readFileSync, readdirSync } from 'node:fs';
import { prepareCase, modelFor } from '../../src/case/prepare';
import { dispersivities, sorptionAndDecay, checkPhysicalInputs, type PhysicalInputs } from '../../src/case/physics';
import { parseCaseFile } from '../../src/case/io';
import { newCase } from '../../src/case/defaults';
import type { Case } from '../../src/case/schema';
import { ValidationError } from '../../src/core';

const close = (a: number, b: number, rel = 1e-12) => expect(Math.abs(a - b)).toBeLessThanOrEqual(rel * Math.abs(b));

function base(): Case {
  const c = newCase({ name: 'physics', now: new Date('2026-01-01T00:00:00Z') });
  c.site.flow = { method: 'direction', azimuthDeg: 90, gradient: 0.005 };
  c.site.receptors = [
    { id: 'r1', name: 'R1', kind: 'well', position: [100, 0], screenTop: { value: 0, unit: 'm' }, screenBottom: { value: 5, unit: 'm' }, pumping: false, pumpingRate: null },
  ];
  return c;
}

function errorOf(f: () => unknown): ValidationError {
  try {
    f();
  } catch (e) {
    expect(e).toBeInstanceOf(ValidationError);
    return e as ValidationError;
  }
  throw new Error('expected a ValidationError');
}

describe('modelFor: the seam for re-evaluating a prepared case', () => {
  test('with no overrides it is prepareCase’s own model, on every demo case (the same doubles)', () => {
    for (const f of readdirSync('cases').filter((n) => n.endsWith('.json'))) {
      const parsed = parseCaseFile(readFileSync(`cases/${f}`, 'utf8'));
      if (!parsed.ok) throw new Error(f);
      const p = prepareCase(parsed.case);
      expect(modelFor(p, {}), f).toEqual(p.model);
    }
  });

  test('substituted inputs are derived as prepareCase derives them', () => {
    const c = base();
    c.aquifer.bulkDensity = null;
    c.contaminant.sorption = { mode: 'koc', koc: { value: 61.7, unit: 'L/kg' } };
    const p = prepareCase(c);
    // Darcy's law v = K·i/nₑ (Freeze & Cherry 1979, eq. 2.82): 20 × 0.005 / 0.25 = 0.4 m/d
    close(modelFor(p, { hydraulicConductivity: 20 }).v, 0.4);
    // R = 1 + ρb·Kd/n with ρb = 2.65(1 − n) (Freeze & Cherry 1979, eq. 9.14; quartz grains, common
    // practice) and Kd = Koc·foc (Karickhoff et al. 1979): n = 0.4, foc = 0.002 →
    // 1 + 2.65·0.6·(61.7·0.002)/0.4 = 1 + 1.59·0.1234/0.4 = 1.490515
    close(modelFor(p, { totalPorosity: 0.4, fractionOrganicCarbon: 0.002 }).R, 1.490515);
    // λ = ln 2 / t½: t½ = 200 d
    close(modelFor(p, { halfLife: 200 }).decay, Math.LN2 / 200);
    // a given dispersivity replaces the estimate
    const m = modelFor(p, { dispersivity: { mode: 'given', longitudinal: 3, transverse: 0.3, vertical: 0.03 } });
    expect([m.ax, m.ay, m.az]).toEqual([3, 0.3, 0.03]);
    // the same geometry: the case's own width unless replaced
    expect(modelFor(p, { c0: 2 }).width).toBe(p.model.width);
    expect(modelFor(p, { width: 7 }).width).toBe(7);
  });

  test('substituted values are checked against the case file’s rules, named by case field', () => {
    const p = prepareCase(base());
    expect(errorOf(() => modelFor(p, { hydraulicConductivity: -1 })).field).toBe('aquifer.hydraulicConductivity');
    expect(errorOf(() => modelFor(p, { effectivePorosity: 0.35 })).field).toBe('aquifer.effectivePorosity'); // > n = 0.3
    expect(errorOf(() => modelFor(p, { gradient: 1.5 })).field).toBe('site.flow.gradient');
    expect(errorOf(() => modelFor(p, { sorption: { mode: 'kd', kd: Number.NaN } })).field).toBe('contaminant.sorption.kd');
    expect(errorOf(() => modelFor(p, { thickness: 0 })).field).toBe('source.thickness');
    expect(errorOf(() => modelFor(p, { sourceHalfLife: 0 })).field).toBe('source.sourceHalfLife');
    // a source decline beyond Domenico's limit λ + v²/(4·Dx) is said as the source half-life
    const e = errorOf(() => modelFor(p, { sourceHalfLife: 1e-3 }));
    expect(e.field).toBe('source.sourceHalfLife');
    expect(e.range).toMatch(/^longer than /);
  });
});

describe('modelFor: what a Monte Carlo realisation varies besides the physical inputs', () => {
  test('a dispersivity factor scales the three dispersivities, given or estimated; a factor ≤ 0 is refused', () => {
    const p = prepareCase(base());
    const m = modelFor(p, {}, { dispersivityFactor: 3 });
    expect([m.ax, m.ay, m.az]).toEqual([3 * p.model.ax, 3 * p.model.ay, 3 * p.model.az]);
    const g = modelFor(p, { dispersivity: { mode: 'given', longitudinal: 4, transverse: 0.4, vertical: 0.04 } }, { dispersivityFactor: 0.5 });
    expect([g.ax, g.ay, g.az]).toEqual([2, 0.2, 0.02]);
    expect(errorOf(() => modelFor(p, {}, { dispersivityFactor: 0 })).field).toBe('aquifer.dispersivity');
  });

  test('a new scale distance for an estimated dispersivity (receptors moved by a turned flow)', () => {
    const c = base();
    c.aquifer.dispersivity = { mode: 'estimate', relation: 'tenth-of-distance', transverseRatio: 0.1, verticalRatio: 0.01 };
    const p = prepareCase(c);
    // αL = L/10 (common practice, after Pickens & Grisak 1981): the receptor 100 m out gives 10 m, a reach of 250 m gives 25 m
    close(p.model.ax, 10);
    close(modelFor(p, {}, { receptorReach: 250 }).ax, 25);
    // none downgradient: the retarded advective travel distance over the horizon, as prepareCase does
    const none = modelFor(p, {}, { receptorReach: null });
    close(none.ax, Math.max((p.model.v / p.model.R) * p.horizon, 1) / 10);
  });

  test('a changed total porosity re-estimates the bulk density; effective above total is refused whichever changed', () => {
    const c = base();
    c.aquifer.bulkDensity = null;
    c.contaminant.sorption = { mode: 'kd', kd: { value: 0.5, unit: 'L/kg' } };
    const p = prepareCase(c);
    // R = 1 + ρb·Kd/n with ρb = 2.65(1 − n) (quartz grains, common practice): n = 0.35 → 1 + 2.65·0.65·0.5/0.35
    close(modelFor(p, { totalPorosity: 0.35 }, { rangesChecked: true }).R, 1 + (2.65 * 0.65 * 0.5) / 0.35);
    // the case's effective porosity is 0.25: a total porosity of 0.2 leaves it above
    expect(errorOf(() => modelFor(p, { totalPorosity: 0.2 }, { rangesChecked: true })).field).toBe('aquifer.effectivePorosity');
    expect(errorOf(() => modelFor(p, { effectivePorosity: 0.32 }, { rangesChecked: true })).field).toBe('aquifer.effectivePorosity');
    // with the ranges already checked, a single-input rule is not checked again, but the engine's limits still are
    expect(() => modelFor(p, { hydraulicConductivity: -1 }, { rangesChecked: true })).toThrow(ValidationError);
  });
});

describe('derivation steps', () => {
  const inputs = (): PhysicalInputs => prepareCase(base()).inputs;

  test('sorptionAndDecay: Kd given, ρb given, no decay', () => {
    const r = sorptionAndDecay({ ...inputs(), sorption: { mode: 'kd', kd: 0.5 }, bulkDensity: 1.6, totalPorosity: 0.4, halfLife: null, sourceHalfLife: 3650 });
    // R = 1 + 1.6·0.5/0.4 = 3 (Freeze & Cherry 1979, eq. 9.14)
    close(r.R, 3);
    expect(r.decay).toBe(0);
    close(r.sourceDecay, Math.LN2 / 3650);
  });

  test('dispersivities: given, scaled from the reach, and from the travel distance with a warning', () => {
    const given = dispersivities({ mode: 'given', longitudinal: 5, transverse: 0.5, vertical: 0.05 }, 100, 0.1, 3650);
    expect([given.ax, given.ay, given.az, given.warnings.length]).toEqual([5, 0.5, 0.05, 0]);
    const est = { mode: 'estimate', relation: 'tenth-of-distance', transverseRatio: 0.1, verticalRatio: 0.01 } as const;
    // αL = L/10 (common practice, after Pickens & Grisak 1981)
    const byReach = dispersivities(est, 250, 0.1, 3650);
    close(byReach.ax, 25);
    close(byReach.ay, 2.5);
    expect(byReach.relation.scaleDistance).toBe(250);
    // no receptor downgradient: L = (v/R)·horizon = 0.1 × 3650 = 365 m
    const byTravel = dispersivities(est, null, 0.1, 3650);
    close(byTravel.ax, 36.5);
    expect(byTravel.warnings.map((w) => w.code)).toEqual(['dispersivity-scale-from-travel']);
  });

  test('checkPhysicalInputs accepts a prepared case’s own inputs', () => {
    expect(() => checkPhysicalInputs(inputs())).not.toThrow();
  });
});
