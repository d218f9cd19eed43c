/**
 * Site monitoring data in the case (added in case version 3): monitoring wells — points with a
 * screen, observed rather than protected — and sampling results. A result below the detection or
 * reporting limit is kept as such: `nonDetect: true` and `value` holding the limit ("< value"),
 * never a number equal to the limit or zero without saying so. Values keep the unit they came in
 * (a known concentration unit); they are converted to mg/L at the edge (`resultMgL`).
 *
 * Dates are calendar days, 'YYYY-MM-DD'. The model's time zero is `releaseDate` (when the release
 * began); without it measured series are compared with the steady state.
 */
import './zodConfig';
import { z } from 'zod';
import { UNITS, toInternal } from '../core/units';
import { quantity } from './quantity';

const finite = z.number().refine(Number.isFinite, { message: 'must be a finite number' });
export const ISO_DATE = /^\d{4}-\d{2}-\d{2}$/;
const isoDate = z.string().regex(ISO_DATE, { message: 'must be a date written YYYY-MM-DD' }).refine((s) => dayNumber(s) !== null, {
  message: 'must be a real calendar date',
});

export const monitoringWell = z.object({
  id: z.string().min(1).max(64),
  name: z.string().min(1).max(200),
  /** null: not placed on the map yet (e.g. imported from a results table without coordinates) */
  position: z.tuple([finite, finite]).nullable(),
  screenTop: quantity('length'),
  screenBottom: quantity('length'),
});
export type MonitoringWell = z.infer<typeof monitoringWell>;

export const samplingResult = z.object({
  wellId: z.string().min(1).max(64),
  date: isoDate,
  analyte: z.string().min(1).max(100),
  /** the measured value, or the reporting limit when `nonDetect` */
  value: z.number().refine((v) => Number.isFinite(v) && v >= 0, { message: 'must be a finite number ≥ 0' }),
  unit: z.string().refine((u) => UNITS[u]?.dimension === 'concentration', { message: 'must be a concentration unit (mg/L, ug/L, g/L)' }),
  nonDetect: z.boolean(),
});
export type SamplingResult = z.infer<typeof samplingResult>;

export const MAX_MONITORING_WELLS = 200;
export const MAX_RESULTS = 20_000;

export const monitoringSchema = z.object({
  /** the date the release began: the model's t = 0; null → compare with the steady state */
  releaseDate: isoDate.nullable().default(null),
  /** the analyte compared with the model; null → the case's contaminant name */
  analyte: z.string().max(100).nullable().default(null),
  wells: z.array(monitoringWell).max(MAX_MONITORING_WELLS).default([]),
  results: z.array(samplingResult).max(MAX_RESULTS).default([]),
});
export type Monitoring = z.infer<typeof monitoringSchema>;
export const DEFAULT_MONITORING: Monitoring = { releaseDate: null, analyte: null, wells: [], results: [] };

/** Days since 1970-01-01 of a 'YYYY-MM-DD' date (proleptic Gregorian), or null if it is not a real date. */
export function dayNumber(iso: string): number | null {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(iso);
  if (!m) return null;
  const y = +m[1];
  const mo = +m[2];
  const d = +m[3];
  const t = Date.UTC(y, mo - 1, d);
  const back = new Date(t);
  if (back.getUTCFullYear() !== y || back.getUTCMonth() !== mo - 1 || back.getUTCDate() !== d) return null;
  return t / 86_400_000;
}

/** 'YYYY-MM-DD' of a day number. */
export function isoFromDay(day: number): string {
  return new Date(day * 86_400_000).toISOString().slice(0, 10);
}

/** The value in mg/L (the reporting limit for a non-detect). */
export function resultMgL(r: SamplingResult): number {
  return toInternal(r.value, r.unit);
}

/** How a result reads: "< 0.005 mg/L" for a non-detect. */
export function resultText(r: SamplingResult): string {
  return `${r.nonDetect ? '< ' : ''}${r.value} ${UNITS[r.unit]?.label ?? r.unit}`;
}

/** Analyte names compare without case and surrounding space. */
export function sameAnalyte(a: string, b: string): boolean {
  return a.trim().toLowerCase() === b.trim().toLowerCase();
}

/** The analyte compared with the model. */
export function comparedAnalyte(m: Monitoring, contaminantName: string): string {
  return m.analyte ?? contaminantName;
}

/** One well's results for one analyte, in date order. */
export function wellSeries(m: Monitoring, wellId: string, analyte: string): SamplingResult[] {
  return m.results
    .filter((r) => r.wellId === wellId && sameAnalyte(r.analyte, analyte))
    .sort((a, b) => (a.date < b.date ? -1 : a.date > b.date ? 1 : 0));
}

/**
 * The time axis of a monitoring well's chart (d): t = 0 at the release date (or, without one, the
 * first of `dates`) and its end a fifth past the last of `dates`, at least a year. The modelled
 * curve at the well (observations.ts `wellCurve`) and a Monte Carlo run's band there
 * (uncertainty.ts) share it.
 */
export function wellCurveSpan(m: Monitoring, dates: readonly string[]): { origin: number; tEnd: number; sinceRelease: boolean } {
  const release = m.releaseDate ? dayNumber(m.releaseDate) : null;
  const days = dates.map((d) => dayNumber(d)!);
  const origin = release ?? Math.min(...days);
  return { origin, tEnd: Math.max(365.25, 1.2 * (Math.max(...days) - origin)), sinceRelease: release !== null };
}

/** What a model figure at a monitoring well depends on besides the case's physics (a Monte Carlo band's key): its position, screen and the release date. */
export function monitoringWellKey(m: Monitoring, w: MonitoringWell): string {
  return JSON.stringify([w.position, w.screenTop, w.screenBottom, m.releaseDate]);
}

/** The analytes present, in first-seen order, spelled as first seen. */
export function analytesOf(m: Monitoring): string[] {
  const out: string[] = [];
  for (const r of m.results) if (!out.some((a) => sameAnalyte(a, r.analyte))) out.push(r.analyte);
  return out;
}

/**
 * A new monitoring well at a map position (null: not placed yet), named MW-n with the lowest n
 * not in use, screened from the water table to 3 m below it (a neutral start, common practice for
 * a shallow well screened across the water table; the user replaces it with the well's own log).
 */
export function newMonitoringWell(m: Monitoring, position: [number, number] | null, id: string): MonitoringWell {
  const names = new Set(m.wells.map((w) => w.name.trim().toLowerCase()));
  let n = 1;
  while (names.has(`mw-${n}`)) n++;
  return { id, name: `MW-${n}`, position, screenTop: { value: 0, unit: 'm' }, screenBottom: { value: 3, unit: 'm' } };
}

/** Where a stored result is in `m.results` (all its fields equal), or −1. */
export function indexOfResult(m: Monitoring, r: SamplingResult): number {
  return m.results.findIndex((x) => x.wellId === r.wellId && x.date === r.date && x.analyte === r.analyte && x.value === r.value && x.unit === r.unit && x.nonDetect === r.nonDetect);
}

/** A stored result as the entry form shows it, to edit. */
export function draftOf(r: SamplingResult): ResultDraft {
  return { date: r.date, value: String(r.value), nonDetect: r.nonDetect, unit: r.unit, analyte: r.analyte };
}

/** A result typed by hand, as the user wrote it. */
export interface ResultDraft {
  readonly date: string;
  /** the value as typed ('12.5', '1e-3'; a leading '<' marks a non-detect too) */
  readonly value: string;
  readonly nonDetect: boolean;
  readonly unit: string;
  readonly analyte: string;
}

/** The largest concentration accepted by hand, mg/L (pure benzene's solubility is ~1,800 mg/L; 1e6 mg/L is a litre of pure substance). */
export const MAX_RESULT_MGL = 1e6;

/**
 * Check a result typed by hand for well `wellId`: either the result to store or a message naming
 * the field and what is accepted. Nothing is stored until it passes; an identical result already
 * stored (same well, date, analyte) is refused with the one stored shown. `replacing`: the index in
 * `m.results` of a stored result the draft is to replace (an edit in place), which is not counted
 * as a duplicate of it.
 */
export function checkResultDraft(
  m: Monitoring,
  wellId: string,
  d: ResultDraft,
  replacing: number | null = null,
): { ok: true; result: SamplingResult } | { ok: false; field: keyof ResultDraft; message: string } {
  if (!m.wells.some((w) => w.id === wellId)) return { ok: false, field: 'date', message: 'Choose the monitoring well first.' };
  if (!ISO_DATE.test(d.date) || dayNumber(d.date) === null) return { ok: false, field: 'date', message: 'Sampling date: enter a calendar date (YYYY-MM-DD).' };
  const analyte = d.analyte.trim();
  if (analyte === '' || analyte.length > 100) return { ok: false, field: 'analyte', message: 'Analyte: enter its name (1 to 100 characters), e.g. benzene.' };
  if (UNITS[d.unit]?.dimension !== 'concentration') return { ok: false, field: 'unit', message: 'Unit: choose a concentration unit (mg/L, µg/L, g/L).' };
  let text = d.value.trim().replace(/\s/g, '').replace(',', '.');
  let nonDetect = d.nonDetect;
  if (text.startsWith('<')) {
    nonDetect = true;
    text = text.slice(1);
  }
  const ok = /^[+]?(\d+\.?\d*|\.\d+)(e[-+]?\d+)?$/i.test(text);
  const value = ok ? Number(text) : NaN;
  const label = nonDetect ? 'Reporting limit' : 'Measured value';
  if (!Number.isFinite(value) || value < 0)
    return { ok: false, field: 'value', message: `${label}: enter a number ≥ 0 (e.g. 12.5 or 1e-3; for a result below the reporting limit tick “below the limit” and enter the limit).` };
  if (nonDetect && value === 0) return { ok: false, field: 'value', message: 'Reporting limit: enter the limit the laboratory reported (> 0); a non-detect is kept as “< limit”.' };
  if (toInternal(value, d.unit) > MAX_RESULT_MGL)
    return { ok: false, field: 'value', message: `${label}: at most ${MAX_RESULT_MGL} mg/L (${value} ${UNITS[d.unit].label} is more than pure substance); check the unit.` };
  if (replacing === null && m.results.length >= MAX_RESULTS) return { ok: false, field: 'date', message: `A case holds at most ${MAX_RESULTS} results.` };
  const same = m.results.find((r, i) => i !== replacing && r.wellId === wellId && r.date === d.date && sameAnalyte(r.analyte, analyte));
  if (same) return { ok: false, field: 'date', message: `Sampling date: ${d.date} already has a ${analyte} result at this well (${resultText(same)}); edit or delete that one first.` };
  return { ok: true, result: { wellId, date: d.date, analyte, value, unit: d.unit, nonDetect } };
}
