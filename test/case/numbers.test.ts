// The one number-writing rule (src/case/numbers.ts). Reference values are exact decimal
// arithmetic worked by hand; the resolutions are the module's own stated choices (common practice).
import { describe, expect, it } from 'vitest';
import { dateTimeText, fileNumber, formatDuration, formatSig, isRoundOffZero, roundSig, screenNumber, timeUnitFor } from '../../src/case/numbers';
import { convert } from '../../src/core/units';

describe('number rule', () => {
  it('noise of double arithmetic does not reach a file', () => {
    expect(fileNumber(149.99999999999994, 'length')).toBe(150);
    expect(fileNumber(0.1 + 0.2, 'concentration')).toBe(0.3);
    // 150 m → ft → m, the round trip (1 ft = 0.3048 m exactly, NIST SP 811)
    const back = convert(convert(150, 'm', 'ft'), 'ft', 'm');
    expect(fileNumber(back, 'length')).toBe(150);
    expect(fileNumber(123456.78912345, 'length')).toBe(123456.7891);
  });

  it('a value zero within round-off is written 0, on screen and in files', () => {
    expect(screenNumber(3.55e-15, 'length')).toBe('0');
    expect(fileNumber(3.55e-15, 'length')).toBe(0);
    expect(fileNumber(-3.55e-15, 'length')).toBe(0);
    expect(Object.is(fileNumber(-1e-20, 'length'), 0)).toBe(true); // no "-0"
    expect(isRoundOffZero(1e-13, 'concentration')).toBe(true);
    // a real small concentration is kept: 1 ng/L = 1e-6 mg/L
    expect(screenNumber(1e-6, 'concentration')).toBe('1e-6');
    expect(fileNumber(1.23456789012e-6, 'concentration')).toBe(1.23456789e-6);
  });

  it('screen digits per kind; plain notation where it reads well', () => {
    expect(screenNumber(1234.567, 'length')).toBe('1235');
    expect(screenNumber(0.27945, 'time')).toBe('0.279');
    expect(screenNumber(9.7449, 'concentration')).toBe('9.74');
    expect(formatSig(2.5e-7, 3)).toBe('2.5e-7');
    expect(formatSig(12000000, 3)).toBe('1.2e+7');
    expect(formatSig(-0.5)).toBe('-0.5');
    expect(roundSig(-0, 3)).toBe(0);
    expect(formatSig(NaN)).toBe('NaN');
  });

  it('the unit written is separate from the internal value that decides zero', () => {
    // 1 mm in ft is 0.00328 ft: not zero; 1e-9 m in ft is zero within round-off
    expect(screenNumber(0.001, 'length', convert(0.001, 'm', 'ft'))).toBe('0.003281');
    expect(screenNumber(1e-9, 'length', convert(1e-9, 'm', 'ft'))).toBe('0');
  });
});

describe('one time unit per screen, one date format (issue 13 items 17 and 19)', () => {
  it('years when the horizon is over two Julian years (730.5 d), else days; every time on the screen in it', () => {
    expect(timeUnitFor(730.5)).toBe('d');
    expect(timeUnitFor(731)).toBe('yr');
    // the field trial's pair: 102 d beside 0.279 years on a 10-year horizon
    expect(formatDuration(102, undefined, timeUnitFor(3652.5))).toBe('0.279 yr'); // 102 / 365.25 = 0.27926
    expect(formatDuration(7305, undefined, 'yr')).toBe('20 yr');
    expect(formatDuration(100, undefined, 'd')).toBe('100 d');
    expect(formatDuration(102)).toBe('102 d'); // without a screen unit: days below a year, as before
  });

  it('moments as YYYY-MM-DD HH:MM in local time', () => {
    expect(dateTimeText(new Date(2026, 11, 3, 9, 5))).toBe('2026-12-03 09:05');
    expect(dateTimeText('not a date')).toBe('not a date');
  });
});
