/**
 * The case's unit system (src/case/unitSystem.ts). Conversion factors from NIST SP 811 (2008),
 * Appendix B: foot = 0.3048 m exactly, US gallon = 3.785411784 L exactly. A value taken
 * m → ft → m must read exactly as typed (issue 13 item 4: it came back as 9.99999999999 m).
 */
import { describe, expect, test } from 'vitest';
import { readFileSync } from 'node:fs';
import { fieldUnit, gridStep, niceScaleLength, positionShown, positionTyped, resultUnit, scaleLabel, shownQuantity, unitSystem, withFieldUnit, withUnitSystem } from '../../src/case/unitSystem';
import { parseCaseFile, serializeCase } from '../../src/case/io';
import { prepareCase } from '../../src/case/prepare';
import type { Case } from '../../src/case/schema';

function demo(): Case {
  const r = parseCaseFile(readFileSync('cases/fuel-release-farm-well.json', 'utf8'));
  if (!r.ok) throw new Error(r.errors.join('\n'));
  return r.case;
}

describe('unit system', () => {
  test('absent: SI, each field in the unit it was typed in (the old behaviour)', () => {
    const c = demo();
    expect(c.units).toBeUndefined();
    expect(unitSystem(c)).toBe('SI');
    expect(resultUnit(c, 'length')).toBe('m');
    expect(fieldUnit(c, 'source.thickness', { value: 10, unit: 'ft' })).toBe('ft');
  });

  test('US customary: lengths in ft, conductivity in ft/d, pumping in gal/min; exact factors', () => {
    const c = { ...demo(), units: { system: 'US' as const, fields: {} } };
    expect(resultUnit(c, 'length')).toBe('ft');
    expect(resultUnit(c, 'velocity')).toBe('ft/d');
    // 3.048 m = 10 ft exactly (0.3048 m/ft)
    expect(shownQuantity(c, 'source.thickness', { value: 3.048, unit: 'm' })).toEqual({ value: 10, unit: 'ft' });
    // 1 m³/d = 1000 L / (3.785411784 L/gal × 1440 min/d) = 0.18345 gal/min
    const q = shownQuantity(c, 'site.receptors[0].pumpingRate', { value: 1, unit: 'm3/d' });
    expect(q.unit).toBe('gpm');
    expect(q.value).toBeCloseTo(1000 / (3.785411784 * 1440), 14);
    // concentrations are not switched
    expect(fieldUnit(c, 'source.concentration', { value: 5, unit: 'ug/L' })).toBe('ug/L');
  });

  test('a field override wins over the system', () => {
    const c = demo();
    c.units = withFieldUnit(c, 'source.thickness', 'cm');
    expect(fieldUnit(c, 'source.thickness', c.source.thickness)).toBe('cm');
    expect(fieldUnit(c, 'site.source.width', c.site.source.width)).toBe(c.site.source.width.unit);
  });

  test('m → ft → m: the stored value is never rewritten, so it reads exactly as typed', () => {
    const c = demo();
    c.source.thickness = { value: 10, unit: 'm' };
    const before = serializeCase(c);
    const model = prepareCase(c).model;
    c.units = withUnitSystem(c, 'US');
    const inFeet = shownQuantity(c, 'source.thickness', c.source.thickness);
    expect(inFeet.unit).toBe('ft');
    expect(inFeet.value).toBeCloseTo(10 / 0.3048, 12);
    c.units = withUnitSystem(c, 'SI');
    expect(shownQuantity(c, 'source.thickness', c.source.thickness)).toEqual({ value: 10, unit: 'm' });
    // and by a field's own unit: m → ft → m
    c.units = withFieldUnit(c, 'source.thickness', 'ft');
    c.units = withFieldUnit(c, 'source.thickness', 'm');
    expect(shownQuantity(c, 'source.thickness', c.source.thickness)).toEqual({ value: 10, unit: 'm' });
    expect(c.source.thickness).toEqual({ value: 10, unit: 'm' });
    // the engine sees the same inputs whatever the system
    expect(prepareCase(c).model).toEqual(model);
    expect(serializeCase({ ...c, units: undefined })).toBe(before);
  });

  test('the unit system survives the case file', () => {
    const c = demo();
    c.units = withFieldUnit({ ...c, units: withUnitSystem(c, 'US') }, 'source.thickness', 'm');
    const back = parseCaseFile(serializeCase(c));
    expect(back.ok && back.case.units).toEqual({ system: 'US', fields: { 'source.thickness': 'm' } });
  });

  test('map scales, grids and positions in the system: m and km, or ft and mi (NIST SP 811: ft = 0.3048 m)', () => {
    expect(scaleLabel(250, 'SI')).toBe('250 m');
    expect(scaleLabel(2000, 'SI')).toBe('2 km');
    expect(scaleLabel(3.048 * 50, 'US')).toBe('500 ft');
    expect(scaleLabel(5280 * 0.3048, 'US')).toBe('1 mi');
    // a grid line at 10,000 ft on a 5,000 ft step stays in ft; round-off at the datum reads 0
    expect(scaleLabel(10000 * 0.3048, 'US', 5000 * 0.3048)).toBe('10000 ft');
    expect(scaleLabel(1e-13, 'US', 100 * 0.3048)).toBe('0 ft');
    expect(scaleLabel(-400, 'SI', 200)).toBe('-400 m');
    // scale bars: the shortest 1-2-5 length at least as long as asked
    expect(niceScaleLength(130, 'SI')).toEqual({ metres: 200, label: '200 m' });
    expect(niceScaleLength(130, 'US')).toEqual({ metres: 500 * 0.3048, label: '500 ft' });
    expect(niceScaleLength(1000, 'US')).toEqual({ metres: 5000 * 0.3048, label: '5000 ft' });
    // past a mile (2000 m = 1.24 mi), counted in miles
    expect(niceScaleLength(2000, 'US')).toEqual({ metres: 2 * 5280 * 0.3048, label: '2 mi' });
    expect(niceScaleLength(2000, 'SI')).toEqual({ metres: 2000, label: '2 km' });
    expect(niceScaleLength(6000, 'US')).toEqual({ metres: 5 * 5280 * 0.3048, label: '5 mi' });
    // grid steps are whole 1-2-5 numbers of the unit
    expect(gridStep(1000, 5, 'SI')).toBe(200);
    expect(gridStep(1000, 5, 'US') / 0.3048).toBeCloseTo(1000, 9);
    // positions: shown to the centimetre (or hundredth of a foot), typed back in metres
    expect(positionShown(30.48, 'US')).toBe(100);
    expect(positionTyped(100, 'US')).toBeCloseTo(30.48, 12);
    expect(positionShown(12.345, 'SI')).toBe(12.35);
  });
});
