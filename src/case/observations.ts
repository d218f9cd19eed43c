/**
 * The case's monitoring data beside its model: per monitoring well, the measured series of the
 * compared analyte, its trend (Mann–Kendall, Sen's slope; src/core/trends) and point decay rate;
 * along the centreline, the bulk attenuation rate and the Buscheck & Alcantar biodegradation rate;
 * and every result against the modelled concentration at its well screen and sampling time.
 *
 * Choices (stated where the results are shown):
 * - Time: a result's model time is its date minus the case's release date; without a release date
 *   results are compared with the steady state.
 * - Centreline wells for the bulk rate: placed wells downgradient (x > 0) within max(W/2, 0.1·x)
 *   of the centreline (W the source width). Each well contributes the geometric mean of its
 *   detected results in the 365 days up to the second-latest of those wells' last sampling dates
 *   (so one well sampled after the others does not shift the period away from them; a well with only non-detects there is
 *   left out and counted); Newell et al. (2002) ask for concentrations from one period.
 * - The biodegradation rate is λ in the engine's sense; for a case whose decay acts on the
 *   dissolved phase only, the case half-life that reproduces it is ln 2/(λ·R).
 * - Model against data: log10(measured/modelled) per detected result; a non-detect counts as
 *   agreeing when the model is at or below its reporting limit, as the model being too high
 *   otherwise.
 */
import type { Warning } from '../core/validation';
import { breakthroughCurve, screenAverage } from '../core/results';
import { toInternal } from '../core/units';
import {
  analyseTrend,
  biodegradationRate,
  bulkAttenuationRate,
  pointDecayRate,
  type BiodegradationRate,
  type BulkRate,
  type CentrelinePoint,
  type RateEstimate,
  type TrendResult,
} from '../core/trends/index';
import type { Case } from './schema';
import { prepareCase, type PreparedCase } from './prepare';
import { comparedAnalyte, dayNumber, resultMgL, wellCurveSpan, wellSeries, type SamplingResult } from './monitoring';

export interface ObservedPoint {
  readonly date: string;
  /** days since the release began (null: no release date) */
  readonly t: number | null;
  /** mg/L (the reporting limit when nonDetect) */
  readonly mgL: number;
  readonly nonDetect: boolean;
  /** modelled mg/L at the screen at this time (steady state without a release date); null: not placed or before the release */
  readonly modelled: number | null;
}

export interface WellObservations {
  readonly id: string;
  readonly name: string;
  readonly placed: boolean;
  /** flow frame, m (null when not placed) */
  readonly x: number | null;
  readonly y: number | null;
  readonly zTop: number;
  readonly zBottom: number;
  readonly series: ObservedPoint[];
  readonly latest: SamplingResult | null;
  readonly trend: TrendResult;
  /** null with a reason when it cannot be formed */
  readonly pointRate: RateEstimate | null;
  readonly pointRateNote: string | null;
  readonly onCentreline: boolean;
}

export interface ModelComparison {
  /** detected results compared */
  readonly detected: number;
  /** of them, within a factor of ten of the model */
  readonly withinTen: number;
  /** median of log10(measured/modelled) over detected results (positive: the model is low) */
  readonly medianLog10Ratio: number | null;
  /** mean of log10(measured/modelled) over detected results: the bias, 10^mean the geometric-mean ratio */
  readonly meanLog10Ratio: number | null;
  /** root-mean-square of log10(measured/modelled): the typical misfit, a factor of 10^rms either way */
  readonly rmsLog10Ratio: number | null;
  /** of the detected results, within a factor of two of the model */
  readonly withinTwo: number;
  /** detected where the model gives (practically) nothing, < 1e-12 mg/L */
  readonly modelNothing: number;
  readonly nonDetects: number;
  /** non-detects where the model is above the reporting limit */
  readonly nonDetectsModelAbove: number;
  readonly words: string;
}

export interface ObservationSummary {
  readonly analyte: string;
  readonly releaseDate: string | null;
  readonly wells: WellObservations[];
  readonly bulkRate: BulkRate | null;
  readonly biodegradationRate: BiodegradationRate | null;
  /** the case half-life (days) that reproduces the biodegradation rate, null when there is none */
  readonly adoptableHalfLife: number | null;
  readonly ratesNote: string | null;
  readonly comparison: ModelComparison;
  readonly warnings: Warning[];
}

const MODEL_NOTHING = 1e-12;

function factorWords(log10: number): string {
  const f = Math.pow(10, Math.abs(log10));
  return f < 1.05 ? 'about right' : `${f < 10 ? f.toFixed(1) : Math.round(f)} times too ${log10 > 0 ? 'low' : 'high'}`;
}

export function compareWithModel(wells: readonly WellObservations[]): ModelComparison {
  const logs: number[] = [];
  let modelNothing = 0;
  let nonDetects = 0;
  let ndAbove = 0;
  for (const w of wells)
    for (const p of w.series) {
      if (p.modelled === null) continue;
      if (p.nonDetect) {
        nonDetects++;
        if (p.modelled > p.mgL) ndAbove++;
      } else if (p.modelled < MODEL_NOTHING) modelNothing++;
      else logs.push(Math.log10(p.mgL / p.modelled));
    }
  logs.sort((a, b) => a - b);
  const n = logs.length;
  const median = n === 0 ? null : n % 2 ? logs[(n - 1) / 2] : 0.5 * (logs[n / 2 - 1] + logs[n / 2]);
  const withinTen = logs.filter((l) => Math.abs(l) <= 1).length;
  const withinTwo = logs.filter((l) => Math.abs(l) <= Math.log10(2)).length;
  const mean = n === 0 ? null : logs.reduce((a, l) => a + l, 0) / n;
  const rms = n === 0 ? null : Math.sqrt(logs.reduce((a, l) => a + l * l, 0) / n);
  const parts: string[] = [];
  if (n + modelNothing === 0 && nonDetects === 0) parts.push('No result can be compared with the model yet (place the monitoring wells on the map).');
  else {
    if (n > 0)
      parts.push(
        `Of ${n} detected result${n === 1 ? '' : 's'}, ${withinTen} (${Math.round((100 * withinTen) / n)} %) lie within a factor of ten of the model; typically the model is ${factorWords(median!)}.`,
      );
    if (modelNothing > 0) parts.push(`At ${modelNothing} detected result${modelNothing === 1 ? '' : 's'} the model predicts practically nothing: the plume may be wider, faster or older than modelled.`);
    if (nonDetects > 0)
      parts.push(`${nonDetects} result${nonDetects === 1 ? ' was' : 's were'} below the reporting limit; at ${ndAbove} of them the model is above that limit.`);
  }
  return { detected: n, withinTen, withinTwo, medianLog10Ratio: median, meanLog10Ratio: mean, rmsLog10Ratio: rms, modelNothing, nonDetects, nonDetectsModelAbove: ndAbove, words: parts.join(' ') };
}

function geometricMean(values: number[]): number {
  return Math.exp(values.reduce((a, v) => a + Math.log(v), 0) / values.length);
}

/** Every observation figure of a case; `prepared` may be passed when the caller has it. */
export function analyseObservations(c: Case, prepared?: PreparedCase): ObservationSummary {
  const mon = c.monitoring;
  const analyte = comparedAnalyte(mon, c.contaminant.name);
  const warnings: Warning[] = [];
  let prep: PreparedCase | null = prepared ?? null;
  if (!prep) {
    try {
      prep = prepareCase(c);
    } catch (e) {
      warnings.push({ code: 'observations-no-model', message: `The model cannot be evaluated yet (${e instanceof Error ? e.message : String(e)}); measured data are shown without it.` });
    }
  }
  const release = mon.releaseDate ? dayNumber(mon.releaseDate) : null;
  if (release === null && mon.results.length > 0)
    warnings.push({
      code: 'observations-no-release-date',
      message:
        'No release date: measurements are compared with the steady-state model' +
        (c.source.sourceHalfLife || c.source.duration ? ', which is zero for a declining or ended source; enter the release date.' : '.'),
    });
  const model = prep?.model ?? null;
  const width = prep?.derived.width ?? 0;

  let beforeRelease = 0;
  const wells: WellObservations[] = [];
  for (const w of mon.wells) {
    const rows = wellSeries(mon, w.id, analyte);
    const zTop = toInternal(w.screenTop.value, w.screenTop.unit);
    const zBottom = toInternal(w.screenBottom.value, w.screenBottom.unit);
    const flow = w.position && prep ? prep.fromMap(w.position) : null;
    const series: ObservedPoint[] = rows.map((r) => {
      const day = dayNumber(r.date)!;
      const t = release === null ? null : day - release;
      let modelled: number | null = null;
      if (model && flow && (t === null || t > 0)) {
        try {
          modelled = screenAverage(model, { x: flow.x, y: flow.y, zTop, zBottom: Math.max(zBottom, zTop) }, t === null ? Infinity : t);
        } catch {
          modelled = null;
        }
      }
      if (t !== null && t <= 0) beforeRelease++;
      return { date: r.date, t, mgL: resultMgL(r), nonDetect: r.nonDetect, modelled };
    });
    const timed = rows.map((r) => ({ t: dayNumber(r.date)!, value: resultMgL(r), nonDetect: r.nonDetect }));
    const trend = analyseTrend(timed);
    let pointRate: RateEstimate | null = null;
    let pointRateNote: string | null = null;
    try {
      pointRate = pointDecayRate(timed);
    } catch (e) {
      pointRateNote = e instanceof Error ? e.message.replace(/^[\s\S]*? is not accepted: /, '') : String(e);
    }
    const onCentreline = !!flow && flow.x > 0 && Math.abs(flow.y) <= Math.max(width / 2, 0.1 * flow.x);
    wells.push({
      id: w.id,
      name: w.name,
      placed: !!w.position,
      x: flow?.x ?? null,
      y: flow?.y ?? null,
      zTop,
      zBottom,
      series,
      latest: rows.length ? rows[rows.length - 1] : null,
      trend,
      pointRate,
      pointRateNote,
      onCentreline,
    });
  }
  if (beforeRelease > 0)
    warnings.push({ code: 'observations-before-release', message: `${beforeRelease} result${beforeRelease === 1 ? ' is' : 's are'} dated on or before the release date and not compared with the model.` });
  const unplaced = wells.filter((w) => !w.placed && w.series.length > 0).length;
  if (unplaced > 0) warnings.push({ code: 'observations-unplaced', message: `${unplaced} monitoring well${unplaced === 1 ? ' is' : 's are'} not placed on the map; ${unplaced === 1 ? 'its' : 'their'} results are not compared with the model.` });

  // bulk attenuation along the centreline
  let bulkRate: BulkRate | null = null;
  let bio: BiodegradationRate | null = null;
  let adoptableHalfLife: number | null = null;
  let ratesNote: string | null = null;
  // the period ends at the second-latest of the centreline wells' last sampling dates, so one well
  // sampled later than the others (a result added by hand) does not leave the rest out of the period
  const lastDates = wells
    .filter((w) => w.onCentreline && w.series.length > 0)
    .map((w) => Math.max(...w.series.map((p) => dayNumber(p.date)!)))
    .sort((a, b) => b - a);
  const lastDay = lastDates.length ? lastDates[Math.min(1, lastDates.length - 1)] : 0;
  const points: CentrelinePoint[] = [];
  for (const w of wells) {
    if (!w.onCentreline) continue;
    const recent = w.series.filter((p) => dayNumber(p.date)! > lastDay - 365);
    if (recent.length === 0) continue;
    const detected = recent.filter((p) => !p.nonDetect && p.mgL > 0).map((p) => p.mgL);
    points.push(
      detected.length
        ? { distance: w.x!, value: geometricMean(detected), nonDetect: false }
        : { distance: w.x!, value: Math.max(...recent.map((p) => p.mgL)), nonDetect: true },
    );
  }
  if (!model) ratesNote = 'The bulk and biodegradation rates need a valid model (velocity, retardation, dispersivity).';
  else if (points.filter((p) => !p.nonDetect).length < 2)
    ratesNote = `The bulk attenuation rate needs at least two placed wells with detections on the plume centreline (within half the source width, or a tenth of the distance, of it); ${points.filter((p) => !p.nonDetect).length} found.`;
  else {
    try {
      bulkRate = bulkAttenuationRate(points, model.v / model.R);
      bio = biodegradationRate(bulkRate, model.ax);
      if (bio.rate > 0) adoptableHalfLife = Math.LN2 / (model.decayPhase === 'dissolved-only' ? bio.rate * model.R : bio.rate);
    } catch (e) {
      ratesNote = e instanceof Error ? e.message : String(e);
    }
  }
  return {
    analyte,
    releaseDate: mon.releaseDate,
    wells,
    bulkRate,
    biodegradationRate: bio,
    adoptableHalfLife,
    ratesNote,
    comparison: compareWithModel(wells),
    warnings,
  };
}

/** A modelled breakthrough curve at a monitoring well's screen, to draw its measured series on. */
export interface WellCurve {
  /** days since the release began (or, without a release date, days since the first result's date) */
  readonly times: number[];
  /** modelled mg/L at the screen (the steady state, flat, when there is no release date) */
  readonly values: number[];
  /** the case's other solution at the same times, when it applies to the case (else null) */
  readonly alternate: number[] | null;
  /** the measured series on the same time axis */
  readonly points: { t: number; mgL: number; nonDetect: boolean; date: string }[];
  /** day number of t = 0 (the release date, or the first result's date) */
  readonly origin: number;
  /** whether t counts from the release (false: from the first result, model at steady state) */
  readonly sinceRelease: boolean;
}

/**
 * The model at a placed monitoring well over the span of its results: 120 times from the release to
 * a fifth past the last result (at least a year), so the measured series fills the chart. Null
 * when the well is not placed, has no results of the compared analyte, or the case cannot be
 * prepared.
 */
export function wellCurve(c: Case, prep: PreparedCase, well: WellObservations, alternateKind: 'domenico' | 'exact' | null = null): WellCurve | null {
  if (!well.placed || well.x === null || well.y === null || well.series.length === 0) return null;
  const { origin, tEnd, sinceRelease } = wellCurveSpan(c.monitoring, well.series.map((p) => p.date));
  const times = Array.from({ length: 120 }, (_, k) => (tEnd * (k + 1)) / 120);
  const screen = { x: well.x, y: well.y, zTop: well.zTop, zBottom: Math.max(well.zTop, well.zBottom) };
  let values: number[];
  let alternate: number[] | null = null;
  if (sinceRelease) {
    values = Array.from(breakthroughCurve(prep.model, screen, times));
    if (alternateKind && alternateKind !== prep.model.solution) alternate = Array.from(breakthroughCurve(prep.model, screen, times, alternateKind));
  } else {
    const steady = screenAverage(prep.model, screen, Infinity);
    values = times.map(() => steady);
  }
  const points = well.series.map((p) => ({ t: dayNumber(p.date)! - origin, mgL: p.mgL, nonDetect: p.nonDetect, date: p.date }));
  return { times, values, alternate, points, origin, sinceRelease };
}
