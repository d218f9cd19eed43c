/**
 * Checked reading of case values (src/case/checked.ts, src/case/fields.ts): conversions against
 * exact unit definitions; every refusal names the field as the screen labels it, quotes the value
 * as the user entered it with its unit, and states the accepted range in that unit (issue 13
 * item 6, issue 14 item 5); engine quantities are restated on the case field they come from.
 */
import { describe, expect, test } from 'vitest';
import { readFileSync } from 'node:fs';
import { CaseFieldError, atCaseField, caseFieldOf, checkRule, readQuantity, ruleFor } from '../../src/case/checked';
import { acceptedWords, bounds, fieldLabel, POSITIVE } from '../../src/case/fields';
import { parseCaseFile } from '../../src/case/io';
import { screenCase } from '../../src/case/screen';
import { caseProblem } from '../../src/case/check';
import type { Case } from '../../src/case/schema';
import { ValidationError } from '../../src/core';

function demo(): Case {
  const r = parseCaseFile(readFileSync('cases/fuel-release-farm-well.json', 'utf8'));
  if (!r.ok) throw new Error(r.errors.join('\n'));
  return r.case;
}

function refusal(c: Case): ValidationError {
  try {
    screenCase(c);
  } catch (e) {
    return e as ValidationError;
  }
  throw new Error('accepted');
}

describe('checked reading', () => {
  const thickness = ruleFor('source.thickness');

  test('a quantity is converted to internal units before its rule is applied', () => {
    // international foot = 0.3048 m exactly (NIST SP 811, Appendix B)
    expect(readQuantity({ value: 10, unit: 'ft' }, thickness)).toBeCloseTo(3.048, 14);
    let e: unknown;
    try {
      readQuantity({ value: -2, unit: 'ft' }, thickness);
    } catch (x) {
      e = x;
    }
    // the value as written, its unit and the range in that unit, on the case field
    expect(e).toBeInstanceOf(ValidationError);
    expect((e as ValidationError).field).toBe('source.thickness');
    expect((e as ValidationError).message).toBe('Source thickness below the water table −2 ft is not accepted: enter a value above 0 ft');
  });

  test('an unknown unit is an error on the unit field, listing the units of its dimension', () => {
    expect(() => readQuantity({ value: 1, unit: 'furlong' }, thickness)).toThrow(
      'Unit of source thickness below the water table “furlong” is not accepted: it is not a unit the app knows; choose one of m, cm, km, ft, mi',
    );
  });

  test('ranges in words: open and closed ends, in the unit entered, the working range only where passed', () => {
    expect(acceptedWords(bounds(0, true, 1, true), null)).toBe('above 0 and below 1');
    expect(acceptedWords(bounds(0, false, 1, false), null)).toBe('from 0 to 1');
    expect(acceptedWords(bounds(0, true, 1, false), null)).toBe('above 0 and at most 1');
    expect(acceptedWords(POSITIVE, 'ft')).toBe('above 0 ft');
    // 1e30 m in feet: 1e30 / 0.3048 = 3.281e30 (NIST SP 811: ft = 0.3048 m exactly)
    expect(acceptedWords(POSITIVE, 'ft', 1e31)).toBe('above 0 ft and at most 3.281e30 ft');
    // bulk density (0, 3] g/cm³ in kg/m³: 3000
    expect(acceptedWords(bounds(0, true, 3, false), 'kg/m3')).toBe('above 0 kg/m³ and at most 3000 kg/m³');
  });

  test('a substituted value in internal units is checked by the same rule', () => {
    const r = ruleFor('aquifer.totalPorosity');
    expect(() => checkRule(r, 1)).toThrow('Total porosity n 1 is not accepted: enter a value above 0 and below 1');
    expect(checkRule(r, 0.3)).toBe(0.3);
  });

  test('list items are labelled by their name, or their place in the list', () => {
    expect(fieldLabel('site.receptors[2].screenTop')).toBe('Screen top below water table of receptor 3');
    expect(fieldLabel('site.receptors[0].screenTop', () => 'Farm well')).toBe('Screen top below water table of “Farm well”');
    expect(fieldLabel('site.flow.readings[1]')).toBe('Water-level well 2');
  });

  test('engine fields are restated on the case field a user edits', () => {
    expect(caseFieldOf('v')).toBe('aquifer.hydraulicConductivity');
    expect(caseFieldOf('receptors[2].zTop')).toBe('site.receptors[2].zTop');
    expect(caseFieldOf('something.else')).toBe('something.else');
    const e = atCaseField(new ValidationError('R', 0.5, 'a number ≥ 1'));
    expect(e).toBeInstanceOf(CaseFieldError);
    expect([e.field, e.range]).toEqual(['contaminant.sorption', 'a number ≥ 1']);
  });
});

// Issue 14 item 5: the refusals the fault trial found quoted internal quantities ("kd = 8e-34",
// "horizon = 2e+31", "t = 5e-31", "receptor.zBottom = 1e+300"). Each now names the field as typed.
describe('refusals name the field the user typed, in the unit typed', () => {
  const cases: [string, (c: Case) => void, string, string][] = [
    [
      'Koc of 1e-30 (Kd below the working range)',
      (c) => void (c.contaminant.sorption = { mode: 'koc', koc: { value: 1e-30, unit: 'L/kg' } }),
      'contaminant.sorption.koc',
      'Organic-carbon partition coefficient Koc 1e-30 L/kg is not accepted: it gives a distribution coefficient Kd of 8e-34 L/kg, outside the range the calculation works in (0, or magnitudes from 1e-30 to 1e30 L/kg)',
    ],
    [
      'horizon of 1e30 years',
      (c) => {
        c.evaluation.horizon = { value: 1e30, unit: 'yr' };
        c.evaluation.viewTime = null;
      },
      'evaluation.horizon',
      // 1e30 d / 365.25 d = 2.738e27 years (the Julian year, src/core/units.ts)
      'Time horizon 1e30 years is not accepted: enter a value above 0 years and at most 2.738e27 years',
    ],
    [
      'view time of 5e-31 d',
      (c) => void (c.evaluation.viewTime = { value: 5e-31, unit: 'd' }),
      'evaluation.viewTime',
      'Time shown on the map 5e-31 days is not accepted: enter a value of at least 1e-30 days and at most 10960 days',
    ],
    [
      'screen bottom of 1e300 m',
      (c) => void (c.site.receptors[0].screenBottom = { value: 1e300, unit: 'm' }),
      'site.receptors[0].screenBottom',
      'Screen bottom of “Farm supply well” 1e300 m is not accepted: enter a value of at least 6 m and at most 1e30 m',
    ],
    [
      'effective porosity −0.3',
      (c) => void (c.aquifer.effectivePorosity = -0.3),
      'aquifer.effectivePorosity',
      'Effective porosity nₑ −0.3 is not accepted: enter a value above 0 and below 1',
    ],
    [
      'conductivity 1e40 ft/d',
      (c) => void (c.aquifer.hydraulicConductivity = { value: 1e40, unit: 'K:ft/d' }),
      'aquifer.hydraulicConductivity',
      'Hydraulic conductivity K 1e40 ft/d is not accepted: enter a value above 0 ft/d and at most 3.281e30 ft/d',
    ],
    [
      'receptor 1400 km from the datum',
      (c) => void (c.site.receptors[0].position = [c.site.datum[0] + 20, c.site.datum[1]]),
      'site.receptors[0].position',
      'Receptor position of “Farm supply well” [17.269, 52.413] is not accepted: it must lie within 1000 km of the site datum [-2.731, 52.413]',
    ],
  ];
  test.each(cases)('%s', (_label, edit, field, message) => {
    const c = demo();
    edit(c);
    const e = refusal(c);
    expect(e.field).toBe(field);
    expect(e.message).toBe(message);
    // the import check says the same, before anything is stored
    expect(caseProblem(c)?.message).toBe(message);
  });
});
