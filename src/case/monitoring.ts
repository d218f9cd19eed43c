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

/** The analytes present, in first-seen order, spelled as first seen. */
export function analytesOf(m: Monitoring): string[] {
  const out: string[] = [];
  for (const r of m.results) if (!out.some((a) => sameAnalyte(a, r.analyte))) out.push(r.analyte);
  return out;
}
