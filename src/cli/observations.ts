/**
 * The command line's observation summary (monitoring data beside the model, trend per well, rates)
 * in each output format. Rates per day; concentrations in mg/L in json and csv; the wording of the
 * table is the report's (src/case/observations-text.ts).
 */
import type { Case } from '../case/schema';
import type { PreparedCase } from '../case/prepare';
import type { Cell } from '../case/csv-write';
import { analyseObservations, type ObservationSummary } from '../case/observations';
import { OBSERVATION_TABLE_HEADER, observationLines, observationTableRows } from '../case/observations-text';
export { fitLines } from '../case/observations-text';
import { resultMgL } from '../case/monitoring';
import type { FitResult } from '../case/fit';

export function observationSummary(c: Case, prepared: PreparedCase): ObservationSummary | null {
  return c.monitoring.results.length === 0 ? null : analyseObservations(c, prepared);
}

const interval = (iv: readonly [number, number] | null) => (iv ? [iv[0], iv[1]] : null);

export function observationsJson(s: ObservationSummary) {
  return {
    analyte: s.analyte,
    releaseDate: s.releaseDate,
    wells: s.wells
      .filter((w) => w.series.length > 0)
      .map((w) => {
        const mk = w.trend.mannKendall;
        const sen = w.trend.sen;
        return {
          id: w.id,
          name: w.name,
          placed: w.placed,
          x: w.x,
          y: w.y,
          rounds: w.trend.rounds,
          nonDetects: w.trend.nonDetects,
          latest: w.latest && { date: w.latest.date, value: resultMgL(w.latest), nonDetect: w.latest.nonDetect },
          trend: {
            s: mk?.s ?? null,
            varS: mk?.varS ?? null,
            tau: mk?.tau ?? null,
            p: mk?.p ?? null,
            pMethod: mk?.pMethod ?? null,
            senSlope: sen?.slope ?? null,
            senSlopeInterval: sen ? [sen.lower, sen.upper] : null,
            coefficientOfVariation: w.trend.coefficientOfVariation,
            verdict: w.trend.verdict,
            warnings: w.trend.warnings,
          },
          pointRate: w.pointRate && {
            rate: w.pointRate.rate,
            interval: interval(w.pointRate.interval),
            confidence: w.pointRate.confidence,
            used: w.pointRate.used,
            leftOut: w.pointRate.leftOut,
          },
          pointRateNote: w.pointRateNote,
          onCentreline: w.onCentreline,
          modelled: w.series.map((p) => ({ date: p.date, t: p.t, measured: p.mgL, nonDetect: p.nonDetect, modelled: p.modelled })),
        };
      }),
    bulkRate: s.bulkRate && {
      rate: s.bulkRate.rate,
      interval: interval(s.bulkRate.interval),
      perMetre: s.bulkRate.perMetre,
      contaminantVelocity: s.bulkRate.contaminantVelocity,
      wells: s.bulkRate.used,
      confidence: s.bulkRate.confidence,
    },
    biodegradationRate: s.biodegradationRate && {
      rate: s.biodegradationRate.rate,
      interval: interval(s.biodegradationRate.interval),
      halfLife: s.biodegradationRate.halfLife,
      caseHalfLife: s.adoptableHalfLife,
      method: 'Buscheck & Alcantar (1995), as set out in Newell et al. (2002), US EPA/540/S-02/500',
    },
    ratesNote: s.ratesNote,
    comparison: s.comparison,
    notes: observationLines(s),
  };
}

/** Lines for the table format. */
export function observationsTable(c: Case, s: ObservationSummary, pad: (rows: string[][]) => string[], wrap: (t: string, w: number, indent: string) => string[]): string[] {
  const L: string[] = ['Monitoring data'];
  const rows = observationTableRows(c, s);
  if (rows.length) L.push(...pad([OBSERVATION_TABLE_HEADER, ...rows]).map((l) => '  ' + l));
  else L.push(`  no results of ${s.analyte} at the monitoring wells`);
  for (const line of observationLines(s)) L.push(...wrap(`- ${line}`, 96, '  ').map((l, i) => (i ? '  ' + l : l)));
  return L;
}

/** Records appended to the csv format, padded to `width` columns. */
export function observationsCsvRows(s: ObservationSummary, width: number): Cell[][] {
  const padRow = (r: Cell[]) => [...r, ...Array(Math.max(0, width - r.length)).fill('')];
  const rows: Cell[][] = [
    padRow(['observations', 'well', 'rounds', 'verdict', 'mk_s', 'mk_tau', 'mk_p', 'sen_slope_mg_per_L_per_d', 'sen_low', 'sen_high', 'point_rate_per_d', 'point_rate_low', 'point_rate_high']),
  ];
  for (const w of s.wells.filter((x) => x.series.length > 0)) {
    const mk = w.trend.mannKendall;
    const sen = w.trend.sen;
    const pr = w.pointRate;
    rows.push(padRow(['observations', w.name, w.trend.rounds, w.trend.verdict, mk?.s ?? null, mk?.tau ?? null, mk?.p ?? null, sen?.slope ?? null, sen?.lower ?? null, sen?.upper ?? null, pr?.rate ?? null, pr?.interval?.[0] ?? null, pr?.interval?.[1] ?? null]));
  }
  if (s.bulkRate) rows.push(padRow(['bulk attenuation rate', 'per day', s.bulkRate.rate, s.bulkRate.interval?.[0] ?? null, s.bulkRate.interval?.[1] ?? null]));
  if (s.biodegradationRate)
    rows.push(padRow(['biodegradation rate', 'per day (Buscheck & Alcantar)', s.biodegradationRate.rate, s.biodegradationRate.interval?.[0] ?? null, s.biodegradationRate.interval?.[1] ?? null]));
  rows.push(padRow(['model against measurements', s.comparison.words]));
  return rows;
}

export function fitJson(f: FitResult) {
  return {
    values: f.values.map((v) => ({ parameter: v.parameter, start: v.start, value: v.value, interval: interval(v.interval) })),
    units: { sourceConcentration: 'mg/L', halfLife: 'd', longitudinalDispersivity: 'm', flowDirection: 'degrees clockwise from north' },
    confidence: f.confidence,
    rmsLn: f.rmsLn,
    startRmsLn: f.startRmsLn,
    detected: f.detected,
    nonDetects: f.nonDetects,
    converged: f.converged,
    warnings: f.warnings,
    method: 'Levenberg–Marquardt on ln concentration; non-detects by the censored-normal likelihood (EM)',
  };
}
