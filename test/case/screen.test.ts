/**
 * Whole-case screening, end to end from a case in mixed units to receptor figures, checked
 * against the published steady-state centreline form of Domenico's solution, evaluated here with
 * erfc from @stdlib/math-base-special-erfc (an independent reference library):
 *
 *   C/C0 = exp[ x/(2αx) · (1 − √(1 + 4λ·αx·R/v)) ] · erf( W / (4√(αy·x)) ) · erf( H / (2√(αz·x)) )
 *
 * at y = 0, z = 0 as t → ∞ (Domenico 1987, J. Hydrology 91, with the source thickness H taken down
 * from the water table and a mirror at it; the x-term is the Ogata–Banks front term at steady
 * state; the form is recalled from the paper, not re-read). Tolerance 1e-9 relative: the engine
 * evaluates the same closed form, so only rounding and erf's own ~1e-16 error separate them.
 */
import { describe, expect, test } from 'vitest';
import erfc from '@stdlib/math-base-special-erfc';
import { screenCase } from '../../src/case/screen';
import { newCase } from '../../src/case/defaults';
import { SCREENING_CAUTION } from '../../src/case/caution';
import type { Case } from '../../src/case/schema';
import { migrateCase } from '../../src/case/migrate';
import { readFileSync } from 'node:fs';

const erf = (x: number) => 1 - erfc(x);

function domenicoSteadyCentreline(x: number, p: { v: number; R: number; lambda: number; ax: number; ay: number; az: number; W: number; H: number }): number {
  const xTerm = Math.exp((x / (2 * p.ax)) * (1 - Math.sqrt(1 + (4 * p.lambda * p.ax * p.R) / p.v)));
  return xTerm * erf(p.W / (4 * Math.sqrt(p.ay * x))) * erf(p.H / (2 * Math.sqrt(p.az * x)));
}

/** K 20 ft/d, i 0.004, nₑ 0.25, n 0.3, ρb 1.6 g/cm³, Kd 0.3 L/kg, t½ 2 yr, αL/αT/αV 10/2/0.5 ft,
 * W 40 ft, H 12 ft, C0 2000 µg/L, flow towards 90°, receptor 150 m downgradient at the water table. */
function mixedUnits(): Case {
  const c = newCase({ name: 'screen test', now: new Date('2026-01-01T00:00:00Z') });
  c.site.flow = { method: 'direction', azimuthDeg: 90, gradient: 0.004 };
  c.site.source.width = { value: 40, unit: 'ft' };
  c.site.receptors = [
    { id: 'r', name: 'Centreline point', kind: 'well', position: [150, 0], screenTop: { value: 0, unit: 'm' }, screenBottom: { value: 0, unit: 'm' }, pumping: false, pumpingRate: null },
  ];
  c.aquifer.hydraulicConductivity = { value: 20, unit: 'K:ft/d' };
  c.aquifer.effectivePorosity = 0.25;
  c.aquifer.totalPorosity = 0.3;
  c.aquifer.bulkDensity = { value: 1.6, unit: 'g/cm3' };
  c.aquifer.dispersivity = { mode: 'given', longitudinal: { value: 10, unit: 'ft' }, transverse: { value: 2, unit: 'ft' }, vertical: { value: 0.5, unit: 'ft' } };
  c.contaminant.sorption = { mode: 'kd', kd: { value: 0.3, unit: 'L/kg' } };
  c.contaminant.halfLife = { value: 2, unit: 'yr' };
  c.contaminant.limit = { value: 5, unit: 'ug/L' };
  c.source.concentration = { value: 2000, unit: 'ug/L' };
  c.source.thickness = { value: 12, unit: 'ft' };
  c.evaluation.horizon = { value: 100, unit: 'yr' };
  c.evaluation.viewTime = null;
  return c;
}

// the same case by hand in SI (international foot 0.3048 m, Julian year 365.25 d)
const FT = 0.3048;
const HAND = {
  v: (20 * FT * 0.004) / 0.25,
  R: 1 + (1.6 * 0.3) / 0.3,
  lambda: Math.LN2 / (2 * 365.25),
  ax: 10 * FT,
  ay: 2 * FT,
  az: 0.5 * FT,
  W: 40 * FT,
  H: 12 * FT,
};
const C0 = 2; // mg/L

describe('screenCase end to end', () => {
  test('steady state at a centreline point equals the Domenico closed form (SI by hand)', () => {
    const s = screenCase(mixedUnits());
    const r = s.results[0].result;
    expect(r.solution).toBe('domenico');
    const expected = C0 * domenicoSteadyCentreline(150, HAND);
    expect(Math.abs(r.steady - expected) / expected).toBeLessThan(1e-9);
    // continuous constant source: the concentration only rises, so the peak is at the horizon
    expect(r.peak.c).toBeLessThanOrEqual(r.steady * (1 + 1e-9));
  });

  test('plume length: the Domenico closed form equals the limit at the reported distance', () => {
    const s = screenCase(mixedUnits());
    const L = s.plumeLength.steady;
    expect(L).not.toBeNull();
    const atL = C0 * domenicoSteadyCentreline(L!, HAND);
    // root tolerance of the engine's Brent search: 1e-6 relative in distance, here checked in concentration
    expect(Math.abs(atL - 0.005) / 0.005).toBeLessThan(1e-4);
    expect(C0 * domenicoSteadyCentreline(L! * 0.9, HAND)).toBeGreaterThan(0.005);
    expect(C0 * domenicoSteadyCentreline(L! * 1.1, HAND)).toBeLessThan(0.005);
  });

  test('exact solution for a very wide and thick source, no decay: steady state → C0 (Ogata–Banks limit)', () => {
    const c = mixedUnits();
    c.evaluation.solution = 'exact';
    c.contaminant.halfLife = null;
    c.site.source.width = { value: 1, unit: 'km' };
    c.source.thickness = { value: 1, unit: 'km' };
    const r = screenCase(c).results[0].result;
    // without decay or a finite source every solution tends to C0 far behind the front
    // (fact of the advection–dispersion equation); erf(1000/(4√(0.61·150))) = 1 − 1e-300
    expect(Math.abs(r.steady - C0) / C0).toBeLessThan(1e-6);
  });

  test('status, arrival and the caution', () => {
    const s = screenCase(mixedUnits());
    const r = s.results[0].result;
    if (r.steady > 0.005) {
      expect(r.status === 'reaches-limit' || r.status === 'not-reached-in-horizon').toBe(true);
    } else expect(r.status).toBe('below-limit');
    if (r.arrival !== null) {
      expect(r.arrival).toBeGreaterThan(0);
      expect(r.arrival).toBeLessThanOrEqual(100 * 365.25);
    }
    expect(s.caution).toBe(SCREENING_CAUTION);
    expect(s.caution).toMatch(/Screening-level estimates only/);
    expect(s.caution).toMatch(/local regulators and licensed hydrogeologists decide/i);
  });

  test('a receptor upgradient is warned about once, with its case field', () => {
    const c = mixedUnits();
    c.site.receptors[0].position = [-40, 0];
    const s = screenCase(c);
    const up = s.warnings.filter((w) => w.code === 'upgradient');
    expect(up).toHaveLength(1);
    expect(up[0].field).toBe('site.receptors[0]');
    expect(s.results[0].result.atHorizon).toBe(0);
  });

  test('a source halving just slower than the bound is accepted; faster is refused', () => {
    const c = mixedUnits();
    const vr = HAND.v / HAND.R;
    const Dx = HAND.ax * vr; // retarded, no diffusion
    const shortest = Math.LN2 / (HAND.lambda + (vr * vr) / (4 * Dx));
    c.source.sourceHalfLife = { value: shortest * 1.01, unit: 'd' };
    expect(() => screenCase(c)).not.toThrow();
    c.source.sourceHalfLife = { value: shortest * 0.99, unit: 'd' };
    expect(() => screenCase(c)).toThrow(/^Source half-life [\d.]+ days is not accepted: .* cannot represent a source halving faster than every/);
  });

  test('nitrate demo: the spring stays below the limit by Domenico but reaches it by the exact solution, so both are shown, with a warning naming it', () => {
    const c = migrateCase(JSON.parse(readFileSync('cases/nitrate-field-supply.json', 'utf8')));
    const s = screenCase(c);
    const spring = s.results.find((r) => r.receptor.name === 'Spring below the lane')!;
    const { model: m, limit } = s.prepared;
    const x = spring.receptor.x, y = spring.receptor.y;
    // Domenico's steady state off the centreline at the water table, no decay (the full form of the
    // closed form in this file's header: ½·[erf((y + W/2)/(2√(αy·x))) − erf((y − W/2)/(2√(αy·x)))]·erf(H/(2√(αz·x)))),
    // erf from @stdlib; 1e-9 relative as above
    const sq = (a: number) => 2 * Math.sqrt(a * x);
    const domSteady = m.c0 * 0.5 * (erf((y + m.width / 2) / sq(m.ay)) - erf((y - m.width / 2) / sq(m.ay))) * erf(m.thickness / sq(m.az));
    expect(m.solution).toBe('domenico');
    expect(Math.abs(spring.result.steady - domSteady) / domSteady).toBeLessThan(1e-9);
    expect(domSteady).toBeLessThan(limit); // 9.74 mg/L against 10
    expect(spring.result.status).toBe('below-limit');
    const alt = spring.result.alternate!;
    expect(alt.solution).toBe('exact');
    expect(alt.status).toBe('reaches-limit');
    expect(alt.arrival).not.toBeNull();
    expect(alt.relDiff).toBeLessThan(0.05); // the concentrations alone would not have shown it
    expect(alt.showBoth).toBe(true);
    expect(alt.differing).toEqual(['status', 'arrival']);
    const w = s.warnings.filter((x) => x.code === 'solutions-differ');
    expect(w.map((x) => x.field)).toEqual(['site.receptors[1]']);
    expect(w[0].message).toMatch(/^Spring below the lane: the Domenico approximation stays below the limit, the exact solution reaches the limit within the horizon/);
    // the supply well agrees within 5 % on every figure: no second line, no warning
    expect(s.results[0].result.alternate!.showBoth).toBe(false);
  });

  test('an upgradient receptor is named in its warning', () => {
    const c = mixedUnits();
    c.site.receptors[0].position = [-40, 0];
    const up = screenCase(c).warnings.find((w) => w.code === 'upgradient')!;
    expect(up.message).toMatch(/^Centreline point lies upgradient of the source/);
  });
});

