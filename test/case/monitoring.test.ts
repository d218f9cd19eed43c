/**
 * Monitoring data in the case file (version 3, src/case/monitoring.ts): kept through save and
 * reopen; v1 and v2 files open with none; a malformed result is refused with its path.
 * Calendar arithmetic checked against the Gregorian calendar (1970-01-01 is day 0; 2000 was a leap
 * year, 1900 was not).
 */
import { describe, expect, it } from 'vitest';
import { migrateCase } from '../../src/case/migrate';
import { newCase } from '../../src/case/defaults';
import { parseCaseFile, serializeCase } from '../../src/case/io';
import { dayNumber, isoFromDay, resultMgL, resultText, wellSeries, type Monitoring } from '../../src/case/monitoring';

const monitoring: Monitoring = {
  releaseDate: '2019-05-01',
  analyte: null,
  wells: [
    { id: 'mw-1', name: 'MW-1', position: [5.1, 52.2], screenTop: { value: 1, unit: 'm' }, screenBottom: { value: 4, unit: 'm' } },
    { id: 'mw-2', name: 'MW-2', position: null, screenTop: { value: 0, unit: 'm' }, screenBottom: { value: 0, unit: 'm' } },
  ],
  results: [
    { wellId: 'mw-1', date: '2021-06-10', analyte: 'Benzene', value: 410, unit: 'ug/L', nonDetect: false },
    { wellId: 'mw-1', date: '2021-03-14', analyte: 'benzene', value: 0.52, unit: 'mg/L', nonDetect: false },
    { wellId: 'mw-2', date: '2021-03-14', analyte: 'Benzene', value: 5, unit: 'ug/L', nonDetect: true },
  ],
};

describe('monitoring data in the case file', () => {
  it('survive save and reopen unchanged; non-detects stay "<" values', () => {
    const c = { ...newCase(), monitoring };
    const back = parseCaseFile(serializeCase(c));
    expect(back.ok).toBe(true);
    if (!back.ok) return;
    expect(back.case.monitoring).toEqual(monitoring);
    expect(resultText(back.case.monitoring.results[2])).toBe('< 5 µg/L');
    expect(resultMgL(back.case.monitoring.results[2])).toBe(0.005); // 5 µg/L = 0.005 mg/L exactly as the unit table gives it
  });

  it('a malformed result is refused with its path', () => {
    const bad = (r: object) => () => migrateCase(JSON.parse(JSON.stringify({ ...newCase(), monitoring: { ...monitoring, results: [r] } })));
    expect(bad({ ...monitoring.results[0], date: '2021-02-30' })).toThrow(/monitoring\.results\[0\]\.date/);
    expect(bad({ ...monitoring.results[0], unit: 'm' })).toThrow(/monitoring\.results\[0\]\.unit/);
    expect(bad({ ...monitoring.results[0], value: -1 })).toThrow(/monitoring\.results\[0\]\.value/);
  });

  it('series are per well and analyte (any letter case), in date order', () => {
    expect(wellSeries(monitoring, 'mw-1', 'BENZENE').map((r) => r.date)).toEqual(['2021-03-14', '2021-06-10']);
  });

  it('calendar days (Gregorian)', () => {
    expect(dayNumber('1970-01-01')).toBe(0);
    expect(dayNumber('2000-02-29')).toBe(11016);
    expect(dayNumber('1900-02-29')).toBeNull();
    expect(isoFromDay(11016)).toBe('2000-02-29');
  });
});
