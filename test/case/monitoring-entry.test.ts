/**
 * Monitoring data typed by hand (src/case/monitoring.ts checkResultDraft, newMonitoringWell;
 * src/case/check.ts positionProblem) and the model drawn at a monitoring well (observations.ts
 * wellCurve) with the scatter's summary figures (compareWithModel).
 *
 * References: the unit table's exact factors (1 µg/L = 1e-3 mg/L, SI); the model at the well is the
 * engine's own screen average (an identity: the curve must pass through screenAverage at each of its
 * times); the log-ratio statistics are checked on hand-worked numbers (ratios 10, 1, 0.5 → log10
 * 1, 0, −0.30103; mean 0.23299, rms sqrt((1 + 0 + 0.090619)/3) = 0.60301).
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { migrateCase } from '../../src/case/migrate';
import { newCase } from '../../src/case/defaults';
import { checkResultDraft, draftOf, indexOfResult, newMonitoringWell, type Monitoring } from '../../src/case/monitoring';
import { positionProblem, placementProblem } from '../../src/case/check';
import { analyseObservations, compareWithModel, wellCurve, type WellObservations } from '../../src/case/observations';
import { prepareCase } from '../../src/case/prepare';
import { screenAverage } from '../../src/core/index';
import type { Case } from '../../src/case/schema';

const depot = (): Case => migrateCase(JSON.parse(readFileSync('cases/depot-benzene-monitoring.json', 'utf8')));
const mon: Monitoring = {
  releaseDate: null,
  analyte: null,
  wells: [{ id: 'a', name: 'MW-1', position: [10, 0], screenTop: { value: 0, unit: 'm' }, screenBottom: { value: 3, unit: 'm' } }],
  results: [{ wellId: 'a', date: '2024-05-02', analyte: 'Benzene', value: 12, unit: 'ug/L', nonDetect: false }],
};
const draft = { date: '2024-08-01', value: '4.5', nonDetect: false, unit: 'ug/L', analyte: 'benzene' };

describe('a result typed by hand', () => {
  it('a good result is stored as typed; "<" marks a non-detect and keeps the limit', () => {
    expect(checkResultDraft(mon, 'a', draft)).toEqual({ ok: true, result: { wellId: 'a', date: '2024-08-01', analyte: 'benzene', value: 4.5, unit: 'ug/L', nonDetect: false } });
    const nd = checkResultDraft(mon, 'a', { ...draft, value: '< 0,5' });
    expect(nd.ok && nd.result).toMatchObject({ value: 0.5, nonDetect: true });
    const ticked = checkResultDraft(mon, 'a', { ...draft, value: '1e-3', nonDetect: true, unit: 'mg/L' });
    expect(ticked.ok && ticked.result).toMatchObject({ value: 0.001, nonDetect: true, unit: 'mg/L' });
  });

  it('each bad field is named with what it accepts', () => {
    const bad = (patch: object) => checkResultDraft(mon, 'a', { ...draft, ...patch });
    expect(bad({ date: '' })).toMatchObject({ ok: false, field: 'date', message: expect.stringMatching(/^Sampling date: enter a calendar date \(YYYY-MM-DD\)/) });
    expect(bad({ date: '2023-02-29' })).toMatchObject({ ok: false, field: 'date' }); // 2023 is not a leap year
    expect(bad({ value: 'twelve' })).toMatchObject({ ok: false, field: 'value', message: expect.stringMatching(/^Measured value: enter a number ≥ 0/) });
    expect(bad({ value: '-3' })).toMatchObject({ ok: false, field: 'value' });
    expect(bad({ value: '' })).toMatchObject({ ok: false, field: 'value' });
    expect(bad({ value: '<0' })).toMatchObject({ ok: false, field: 'value', message: expect.stringMatching(/^Reporting limit: enter the limit/) });
    expect(bad({ value: '2e6', unit: 'mg/L' })).toMatchObject({ ok: false, field: 'value', message: expect.stringMatching(/at most 1000000 mg\/L/) });
    expect(bad({ unit: 'm' })).toMatchObject({ ok: false, field: 'unit' });
    expect(bad({ analyte: '  ' })).toMatchObject({ ok: false, field: 'analyte' });
    expect(checkResultDraft(mon, 'nope', draft)).toMatchObject({ ok: false });
  });

  it('a second result for the same well, date and analyte is refused, naming the stored one', () => {
    const r = checkResultDraft(mon, 'a', { ...draft, date: '2024-05-02', analyte: ' BENZENE ' });
    expect(r).toMatchObject({ ok: false, field: 'date', message: expect.stringMatching(/already has a BENZENE result at this well \(12 µg\/L\)/) });
  });
});

describe('a stored result edited in place', () => {
  const two: Monitoring = { ...mon, results: [...mon.results, { wellId: 'a', date: '2024-08-01', analyte: 'benzene', value: 0.5, unit: 'ug/L', nonDetect: true }] };
  it('its own fields give back the result itself (String and Number round-trip a double exactly)', () => {
    for (const [k, r] of two.results.entries()) {
      expect(indexOfResult(two, r)).toBe(k);
      expect(checkResultDraft(two, 'a', draftOf(r), k)).toEqual({ ok: true, result: { ...r, analyte: r.analyte.trim() } });
    }
    expect(draftOf({ ...two.results[0], value: 1e-7 }).value).toBe('1e-7');
    expect(checkResultDraft(two, 'a', draftOf({ ...two.results[0], value: 1e-7 }), 0)).toMatchObject({ ok: true, result: { value: 1e-7 } });
    expect(indexOfResult(two, { ...two.results[0], unit: 'mg/L' })).toBe(-1);
  });
  it('a changed value, unit, flag or date is checked like a new result; only another stored result on the date is a duplicate', () => {
    const edit = (patch: object) => checkResultDraft(two, 'a', { ...draftOf(two.results[1]), ...patch }, 1);
    expect(edit({ value: '2.5', nonDetect: false })).toMatchObject({ ok: true, result: { date: '2024-08-01', value: 2.5, nonDetect: false } });
    expect(edit({ date: '2024-08-02', unit: 'mg/L' })).toMatchObject({ ok: true, result: { date: '2024-08-02', unit: 'mg/L', nonDetect: true } });
    expect(edit({ value: 'x' })).toMatchObject({ ok: false, field: 'value', message: expect.stringMatching(/^Reporting limit: enter a number ≥ 0/) });
    expect(edit({ value: '2e9', nonDetect: false })).toMatchObject({ ok: false, field: 'value', message: expect.stringMatching(/^Measured value: at most 1000000 mg\/L/) });
    expect(edit({ date: '2024-05-02' })).toMatchObject({ ok: false, field: 'date', message: expect.stringMatching(/2024-05-02 already has a benzene result at this well \(12 µg\/L\); edit or delete that one first/) });
    // without the index, its own date is a duplicate (a new result, not an edit)
    expect(checkResultDraft(two, 'a', draftOf(two.results[1]))).toMatchObject({ ok: false, field: 'date' });
  });
});

describe('monitoring wells placed or typed', () => {
  it('a new well takes the lowest free MW-n name and a neutral screen', () => {
    expect(newMonitoringWell(mon, [1, 2], 'x')).toEqual({ id: 'x', name: 'MW-2', position: [1, 2], screenTop: { value: 0, unit: 'm' }, screenBottom: { value: 3, unit: 'm' } });
    expect(newMonitoringWell({ ...mon, wells: [] }, null, 'y').name).toBe('MW-1');
  });

  it('typed coordinates outside the frame are refused with the accepted range; monitoring wells are checked with the case', () => {
    const c = newCase({ frame: 'geographic', at: [5, 52] });
    expect(c.site.frame).toBe('geographic');
    expect(positionProblem(c, [5.001, 52.001])).toBeNull();
    expect(positionProblem(c, [5, 95])).toMatch(/accepted: a \[longitude, latitude\] pair in degrees within 1000 km of the datum/);
  });

  it('an unplaceable monitoring well is named by placementProblem', () => {
    const c = newCase({ frame: 'geographic', at: [5, 52] });
    c.monitoring = { ...mon, wells: [{ ...mon.wells[0], position: [5, 91] }] };
    expect(placementProblem(c)?.field).toBe('monitoring.wells[0].position');
    c.monitoring.wells[0].position = [5.0003, 52.0002];
    expect(placementProblem(c)).toBeNull();
  });
});

describe('the model at a monitoring well', () => {
  it('passes through the engine\'s screen average at every time, and carries the measured series on the same axis', () => {
    const c = depot();
    const p = prepareCase(c);
    const s = analyseObservations(c, p);
    const w = s.wells.find((x) => x.id === 'mw-3')!;
    const curve = wellCurve(c, p, w)!;
    expect(curve.sinceRelease).toBe(true);
    expect(curve.points).toHaveLength(w.series.length);
    expect(curve.times[curve.times.length - 1]).toBeGreaterThanOrEqual(Math.max(...curve.points.map((q) => q.t)));
    for (const k of [0, 40, 119]) {
      const want = screenAverage(p.model, { x: w.x!, y: w.y!, zTop: w.zTop, zBottom: w.zBottom }, curve.times[k]);
      expect(curve.values[k]).toBeCloseTo(want, 15);
    }
    const exact = wellCurve(c, p, w, 'exact')!;
    expect(exact.alternate).toHaveLength(120);
    // without a release date: the steady state, flat, from the first result's date
    const steady = wellCurve({ ...c, monitoring: { ...c.monitoring, releaseDate: null } }, p, w)!;
    expect(steady.sinceRelease).toBe(false);
    expect(new Set(steady.values).size).toBe(1);
    expect(Math.min(...steady.points.map((q) => q.t))).toBe(0);
    expect(wellCurve(c, p, { ...w, placed: false, x: null, y: null })).toBeNull();
  });

  it('the scatter figures: bias, typical misfit, within two and ten (hand-worked)', () => {
    const pt = (mgL: number, modelled: number) => ({ date: '2024-01-01', t: 1, mgL, nonDetect: false, modelled });
    const k = compareWithModel([{ series: [pt(10, 1), pt(2, 2), pt(1, 2)] } as unknown as WellObservations]);
    expect(k.detected).toBe(3);
    expect(k.withinTen).toBe(3);
    expect(k.withinTwo).toBe(2);
    expect(k.meanLog10Ratio).toBeCloseTo((1 - Math.log10(2)) / 3, 12);
    expect(k.rmsLog10Ratio).toBeCloseTo(Math.sqrt((1 + Math.log10(2) ** 2) / 3), 12);
    expect(k.medianLog10Ratio).toBe(0);
  });
});

describe('the centreline period for the bulk rate', () => {
  it('one centreline well sampled a year after the others leaves the period (and the rate) where the others are', () => {
    const c = depot();
    const before = analyseObservations(c);
    c.monitoring.results.push({ wellId: 'mw-3', date: '2025-06-01', analyte: 'benzene', value: 0.5, unit: 'ug/L', nonDetect: true });
    const after = analyseObservations(c);
    expect(after.bulkRate?.used).toBe(before.bulkRate!.used);
    expect(after.biodegradationRate!.rate).toBeCloseTo(before.biodegradationRate!.rate, 12);
  });
});
