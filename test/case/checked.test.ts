/**
 * Checked reading of case values (src/case/checked.ts): conversions against exact unit
 * definitions, the accepted range stated as the user sees it, engine fields restated as case fields.
 */
import { describe, expect, test } from 'vitest';
import { atCaseField, caseFieldOf, checkRule, fractionRule, positive, readQuantity, rule } from '../../src/case/checked';
import { ValidationError } from '../../src/core';

describe('checked reading', () => {
  const length = rule('source.thickness', positive, 'a length > 0');

  test('a quantity is converted to internal units before its rule is applied', () => {
    // international foot = 0.3048 m exactly (NIST SP 811, Appendix B)
    expect(readQuantity({ value: 10, unit: 'ft' }, length)).toBeCloseTo(3.048, 14);
    const e = (() => {
      try {
        readQuantity({ value: -2, unit: 'ft' }, length);
      } catch (x) {
        return x as ValidationError;
      }
    })();
    // the message quotes the value as written, on the case field, with the range
    expect(e).toBeInstanceOf(ValidationError);
    expect([e!.field, e!.value, e!.range]).toEqual(['source.thickness', -2, 'a length > 0']);
  });

  test('an unknown unit is an error on the unit field', () => {
    expect(() => readQuantity({ value: 1, unit: 'furlong' }, length)).toThrow(/source\.thickness\.unit/);
  });

  test('fraction ranges state their open and closed ends', () => {
    const r = fractionRule('aquifer.totalPorosity', 0, 1, true, true);
    expect(r.range).toBe('in (0, 1)');
    expect(fractionRule('x', 0, 1, false, false).range).toBe('in [0, 1]');
    expect(() => checkRule(r, 1)).toThrow(ValidationError);
    expect(checkRule(r, 0.3)).toBe(0.3);
  });

  test('engine fields are restated on the case field a user edits', () => {
    expect(caseFieldOf('v')).toBe('aquifer.hydraulicConductivity');
    expect(caseFieldOf('receptors[2].zTop')).toBe('site.receptors[2].zTop');
    expect(caseFieldOf('something.else')).toBe('something.else');
    const e = atCaseField(new ValidationError('R', 0.5, 'a number ≥ 1'));
    expect([e.field, e.range]).toEqual(['contaminant.sorption', 'a number ≥ 1']);
  });
});
