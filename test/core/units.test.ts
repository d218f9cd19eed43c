/**
 * src/core/units.ts against the exact definitions.
 *
 * Sources (all exact by definition):
 *  - international foot = 0.3048 m, inch = 2.54 cm (NIST SP 811, 2008, Appendix B.8; NIST Handbook 44,
 *    Appendix C; the 1959 international yard and pound agreement); statute mile = 5280 ft.
 *  - US liquid gallon = 231 in³ = 3.785411784 L (NIST Handbook 44, Appendix C).
 *  - pound avoirdupois = 0.45359237 kg (same agreement; NIST SP 811).
 *  - Julian year = 365.25 d of 86 400 s (IAU; the "yr" of the app).
 * Exact values are formed in decimal.js from those definitions; the stored double factor must be
 * the nearest double to the exact value within 1 ulp (|factor − exact| ≤ ε·exact).
 */
import { describe, expect, it } from 'vitest';
import Decimal from 'decimal.js';
import { UNITS, convert, fromInternal, toInternal, unitDef, unitsOf, type Dimension } from '../../src/core/units';
import { EPS, MismatchLog, Prng } from './helpers/check';

const D = Decimal.clone({ precision: 40 });
const FT = new D('0.3048');
const INCH = new D('0.0254');
const GAL_L = INCH.pow(3).times(231).times(1000); // litres
const YR = new D('365.25');
const LB = new D('0.45359237');

/** Exact factor (unit → internal m, d, mg/L, kg/L, L/kg, m/d, m²/d, 1/d) from the definitions. */
const exact: Record<string, Decimal> = {
  m: new D(1),
  cm: new D('0.01'),
  km: new D(1000),
  ft: FT,
  mi: FT.times(5280),
  d: new D(1),
  yr: YR,
  h: new D(1).div(24),
  s: new D(1).div(86400),
  'm/d': new D(1),
  'm/yr': new D(1).div(YR),
  'ft/d': FT,
  'ft/yr': FT.div(YR),
  'K:m/d': new D(1),
  'K:m/s': new D(86400),
  'K:cm/s': new D(864),
  'K:ft/d': FT,
  'K:gpd/ft2': GAL_L.div(1000).div(FT.pow(2)), // (gal/d)/ft² = m³/d per m²
  'mg/L': new D(1),
  'ug/L': new D('0.001'),
  'g/L': new D(1000),
  'g/cm3': new D(1),
  'kg/m3': new D('0.001'),
  'lb/ft3': LB.div(FT.pow(3).times(1000)), // kg per litre
  'L/kg': new D(1),
  'mL/g': new D(1),
  'm2/d': new D(1),
  'm2/s': new D(86400),
  'cm2/s': new D('8.64'),
  'ft2/d': FT.pow(2),
  '1/d': new D(1),
  '1/yr': new D(1).div(YR),
  'm3/d': new D(1),
  'm3/h': new D(24),
  'L/s': new D('86.4'), // 1 L/s = 1e-3 m³ × 86400 s/d
  gpm: GAL_L.div(1000).times(1440), // US gal/min in m³/d
  '-': new D(1),
};

describe('exact definitions', () => {
  it('the gallon built from 231 in³ is 3.785411784 L exactly (NIST Handbook 44)', () => {
    expect(GAL_L.eq('3.785411784')).toBe(true);
  });

  it('every unit with a known definition has the exact factor to 1 ulp', () => {
    const log = new MismatchLog();
    for (const [id, value] of Object.entries(exact)) {
      const def = UNITS[id];
      expect(def, `unit ${id} missing from UNITS`).toBeDefined();
      const e = value.toNumber();
      log.check('factor', id, def.factor, e, EPS * e);
    }
    log.assertNone();
  });

  it('spot values a field user would check by hand', () => {
    expect(toInternal(100, 'ft')).toBeCloseTo(30.48, 12);
    expect(toInternal(1, 'mi')).toBeCloseTo(1609.344, 9);
    expect(toInternal(2, 'yr')).toBe(730.5);
    expect(toInternal(1e-4, 'K:m/s')).toBeCloseTo(8.64, 12);
    expect(fromInternal(0.005, 'ug/L')).toBeCloseTo(5, 12); // 5 µg/L = 0.005 mg/L
    expect(convert(1, 'K:gpd/ft2', 'K:m/d')).toBeCloseTo(0.0407458, 7); // 3.785411784e-3 / 0.09290304
  });

  it('every unit in the table is covered by a definition above, with a finite positive factor', () => {
    for (const [id, def] of Object.entries(UNITS)) {
      expect(Number.isFinite(def.factor) && def.factor > 0, id).toBe(true);
      expect(def.id).toBe(id);
      expect(exact[id], `no exact definition written for unit ${id}`).toBeDefined();
    }
  });
});

describe('round trips and conversions (relative 4ε)', () => {
  const rng = new Prng(811);
  it('fromInternal(toInternal(v, u), u) returns v', () => {
    const log = new MismatchLog();
    for (const id of Object.keys(UNITS)) {
      for (let k = 0; k < 50; k++) {
        const v = rng.logBetween(1e-9, 1e9) * (rng.uniform() < 0.2 ? -1 : 1);
        log.check('round trip', { id, v }, fromInternal(toInternal(v, id), id), v, 4 * EPS * Math.abs(v));
      }
    }
    log.assertNone();
  });

  it('convert(v, a, b) then back returns v, and equals v·factor(a)/factor(b), within every dimension', () => {
    const log = new MismatchLog();
    const dims = new Set(Object.values(UNITS).map((d) => d.dimension));
    for (const dim of dims) {
      const units = unitsOf(dim as Dimension);
      for (const a of units) {
        for (const b of units) {
          const v = rng.logBetween(1e-6, 1e6);
          const there = convert(v, a.id, b.id);
          const e = exact[a.id].times(v).div(exact[b.id]).toNumber();
          log.check('convert vs exact', { v, from: a.id, to: b.id }, there, e, 4 * EPS * e);
          log.check('convert back', { v, from: a.id, to: b.id }, convert(there, b.id, a.id), v, 4 * EPS * v);
        }
      }
    }
    log.assertNone();
  });
});

describe('errors', () => {
  it('converting across dimensions throws, naming both units', () => {
    expect(() => convert(1, 'm', 'd')).toThrow(/length.*m.*time.*d/);
    expect(() => convert(1, 'K:m/d', 'm/d')).toThrow(/conductivity/);
  });
  it('an unknown unit throws, naming it', () => {
    expect(() => toInternal(1, 'furlong')).toThrow(/furlong/);
    expect(() => unitDef('')).toThrow();
  });
  it('unitsOf returns only units of that dimension', () => {
    for (const d of unitsOf('time')) expect(d.dimension).toBe('time');
    expect(unitsOf('time').map((d) => d.id)).toEqual(expect.arrayContaining(['d', 'yr', 'h', 's']));
  });
});
