/**
 * Fitting chosen case parameters to the monitoring data, and adopting the fitted values as a
 * what-if variant of the case (never into the case itself).
 *
 * Parameters (any subset): the source concentration C₀, the half-life t½, the longitudinal
 * dispersivity αL (αT and αV follow in proportion) and the flow direction. C₀, t½ and αL are
 * fitted as logarithms (they are positive and act multiplicatively); the direction in degrees,
 * rotating the monitoring wells about the source (the source width is kept).
 *
 * Objective: least squares on natural-log concentration, Σ (ln C_measured − ln C_model)² over the
 * detected results, by Levenberg–Marquardt (src/core/fit). Non-detects are censored values, not
 * dropped: the fit maximises the censored-normal ("Tobit") likelihood of ln C by EM (Dempster,
 * Laird & Rubin 1977): each non-detect with limit L is replaced by its expected value below the
 * limit, μ − σ·φ(a)/Φ(a) with a = (ln L − μ)/σ, the least squares are redone, and so on (at most
 * 8 rounds). The first fit, which starts it, uses a one-sided (hinge) residual
 * max(0, ln C_model − ln L) for each non-detect. The model is floored at 1e-15 mg/L before the
 * logarithm.
 * Intervals are the linearised ones of the fit (Cov ≈ s²(JᵀJ)⁻¹, s² from the residuals, n − p
 * degrees of freedom counting detected results only), mapped back through exp for the log
 * parameters; they carry the scatter of the data, not the error of the model's form.
 */
import type { ScreeningModel } from '../core/model';
import { screenAverage } from '../core/results';
import { fromInternal, toInternal } from '../core/units';
import { levenbergMarquardt } from '../core/fit/levenbergMarquardt';
import { ValidationError } from '../core/validation';
import { normalCdf } from '../core/uncertainty/normal';

const normalPdf = (z: number) => Math.exp(-0.5 * z * z) / Math.sqrt(2 * Math.PI);
import type { Case } from './schema';
import { prepareCase, type PreparedCase } from './prepare';
import { comparedAnalyte, dayNumber, resultMgL, wellSeries } from './monitoring';

export const FIT_PARAMETERS = ['sourceConcentration', 'halfLife', 'longitudinalDispersivity', 'flowDirection'] as const;
export type FitParameter = (typeof FIT_PARAMETERS)[number];

export const FIT_LABELS: Record<FitParameter, string> = {
  sourceConcentration: 'source concentration',
  halfLife: 'half-life',
  longitudinalDispersivity: 'longitudinal dispersivity',
  flowDirection: 'flow direction',
};

export interface FitObservation {
  readonly x: number;
  readonly y: number;
  readonly zTop: number;
  readonly zBottom: number;
  /** model time, d (Infinity: steady state) */
  readonly t: number;
  readonly mgL: number;
  readonly nonDetect: boolean;
  readonly wellId: string;
  readonly date: string;
}

export interface FittedValue {
  readonly parameter: FitParameter;
  /** internal units: mg/L, d, m, degrees clockwise from north */
  readonly start: number;
  readonly value: number;
  readonly interval: readonly [number, number] | null;
}

export interface FitResult {
  readonly values: FittedValue[];
  readonly confidence: number;
  /** ln residuals at the fit (detected) and hinge residuals (non-detects), per observation */
  readonly residuals: { wellId: string; date: string; residual: number; nonDetect: boolean }[];
  /** root-mean-square ln residual over detected results; as a factor e^rms */
  readonly rmsLn: number;
  readonly startRmsLn: number;
  readonly detected: number;
  readonly nonDetects: number;
  readonly converged: boolean;
  readonly iterations: number;
  readonly warnings: string[];
}

const FLOOR = 1e-15;

/** The monitoring results of the compared analyte in the flow frame, with their model times. */
export function fitObservations(c: Case, p: PreparedCase): FitObservation[] {
  const mon = c.monitoring;
  const analyte = comparedAnalyte(mon, c.contaminant.name);
  const release = mon.releaseDate ? dayNumber(mon.releaseDate) : null;
  const out: FitObservation[] = [];
  for (const w of mon.wells) {
    if (!w.position) continue;
    const f = p.fromMap(w.position);
    const zTop = toInternal(w.screenTop.value, w.screenTop.unit);
    const zBottom = Math.max(zTop, toInternal(w.screenBottom.value, w.screenBottom.unit));
    for (const r of wellSeries(mon, w.id, analyte)) {
      const t = release === null ? Infinity : dayNumber(r.date)! - release;
      if (!(t > 0)) continue;
      out.push({ x: f.x, y: f.y, zTop, zBottom, t, mgL: resultMgL(r), nonDetect: r.nonDetect, wellId: w.id, date: r.date });
    }
  }
  return out;
}

interface Param {
  readonly name: FitParameter;
  readonly log: boolean;
  readonly start: number;
  readonly step: number;
}

/** The model and the wells for parameter values `v` (internal units; direction as a change in degrees). */
function apply(base: ScreeningModel, names: FitParameter[], v: number[]): { model: ScreeningModel; turn: number } {
  let m = base;
  let turn = 0;
  names.forEach((n, i) => {
    if (n === 'sourceConcentration') m = { ...m, c0: v[i] };
    else if (n === 'halfLife') m = { ...m, decay: Math.LN2 / v[i] };
    else if (n === 'longitudinalDispersivity') {
      const k = v[i] / base.ax;
      m = { ...m, ax: v[i], ay: base.ay * k, az: base.az * k };
    } else turn = v[i];
  });
  return { model: m, turn };
}

/** Modelled mg/L at each observation for a model and a turn of the flow direction (degrees). */
export function modelledAt(model: ScreeningModel, obs: readonly FitObservation[], turnDeg: number): number[] {
  const a = (turnDeg * Math.PI) / 180;
  const ca = Math.cos(a);
  const sa = Math.sin(a);
  return obs.map((o) => {
    // turning the flow clockwise by a: a well at angle ψ clockwise from the flow axis is then at ψ − a
    // (x = d·cos ψ, y = −d·sin ψ, y positive to the left looking downgradient)
    const x = o.x * ca - o.y * sa;
    const y = o.x * sa + o.y * ca;
    return screenAverage(model, { x, y, zTop: o.zTop, zBottom: o.zBottom }, o.t);
  });
}

export function fitCase(c: Case, chosen: readonly FitParameter[], confidence = 0.95): FitResult {
  if (chosen.length === 0) throw new ValidationError('fit.parameters', chosen, 'at least one parameter to fit');
  const p = prepareCase(c);
  const obs = fitObservations(c, p);
  const detected = obs.filter((o) => !o.nonDetect).length;
  const names = FIT_PARAMETERS.filter((n) => chosen.includes(n));
  if (detected <= names.length)
    throw new ValidationError('monitoring.results', detected, `more detected results at placed wells after the release date than parameters fitted (${names.length})`);
  const base = p.model;
  const params: Param[] = names.map((n) => {
    if (n === 'sourceConcentration') return { name: n, log: true, start: base.c0, step: 1e-4 };
    if (n === 'halfLife') return { name: n, log: true, start: base.decay > 0 ? Math.LN2 / base.decay : 3652.5, step: 1e-4 };
    if (n === 'longitudinalDispersivity') return { name: n, log: true, start: base.ax, step: 1e-4 };
    return { name: n, log: false, start: 0, step: 0.01 };
  });
  const toValues = (theta: readonly number[]) => theta.map((t, i) => (params[i].log ? Math.exp(t) : t));
  const lnModel = (theta: readonly number[]): number[] => {
    const { model, turn } = apply(base, names, toValues(theta));
    return modelledAt(model, obs, turn).map((m) => Math.log(Math.max(m, FLOOR)));
  };
  const lnObs = obs.map((o) => Math.log(o.mgL));
  // ystar[i]: the expected ln concentration of a non-detect given it lies below its limit (EM step)
  let ystar: (number | null)[] = obs.map(() => null);
  const residuals = (theta: readonly number[]): number[] => {
    const lm = lnModel(theta);
    return obs.map((o, i) => {
      if (!o.nonDetect) return lnObs[i] - lm[i];
      const y = ystar[i];
      return y === null ? Math.max(0, lm[i] - lnObs[i]) : y - lm[i];
    });
  };
  const start = params.map((q) => (q.log ? Math.log(q.start) : q.start));
  const r0 = residuals(start);
  const problem = (from: number[]) => ({
    residuals,
    start: from,
    steps: params.map((q) => q.step),
    // keep the direction within ±90° of the case's and the positive values within e^±14 of the start
    lower: params.map((q, i) => (q.log ? start[i] - 14 : -90)),
    upper: params.map((q, i) => (q.log ? start[i] + 14 : 90)),
  });
  // 1) hinge start: a non-detect costs only while the model is above its limit
  let fit = levenbergMarquardt(problem(start), { confidence });
  // 2) censored-normal (Tobit) likelihood by EM (Dempster, Laird & Rubin 1977): replace each
  //    non-detect by E[ln C | ln C < ln L] = μ − σ·φ(a)/Φ(a), a = (ln L − μ)/σ, refit, repeat
  const nd = obs.some((o) => o.nonDetect);
  for (let round = 0; nd && round < 8; round++) {
    const mu = lnModel(fit.theta);
    const det = obs.map((o, i) => (o.nonDetect ? null : lnObs[i] - mu[i])).filter((v): v is number => v !== null);
    let sigma2 = det.reduce((a, v) => a + v * v, 0) / Math.max(1, det.length);
    if (round > 0) {
      // M-step variance including the censored values' conditional second moments
      let sum = det.reduce((a, v) => a + v * v, 0);
      obs.forEach((o, i) => {
        if (!o.nonDetect) return;
        const sd = Math.sqrt(sigma2);
        const a = (lnObs[i] - mu[i]) / sd;
        const lam = normalPdf(a) / Math.max(normalCdf(a), 1e-300);
        const e = -sd * lam;
        sum += e * e + sigma2 * Math.max(0, 1 - a * lam - lam * lam);
      });
      sigma2 = sum / obs.length;
    }
    const sd = Math.sqrt(Math.max(sigma2, 1e-12));
    ystar = obs.map((o, i) => {
      if (!o.nonDetect) return null;
      const a = (lnObs[i] - mu[i]) / sd;
      return mu[i] - (sd * normalPdf(a)) / Math.max(normalCdf(a), 1e-300);
    });
    const next = levenbergMarquardt(problem(fit.theta), { confidence });
    const moved = next.theta.some((t, i) => Math.abs(t - fit.theta[i]) > 1e-5 * Math.max(1, Math.abs(t)));
    fit = next;
    if (!moved) break;
  }
  // degrees of freedom from the detected results only (a non-detect is an inequality)
  const dof = detected - names.length;
  const scale = fit.dof > 0 && dof > 0 ? Math.sqrt(fit.dof / dof) : 1;
  const values: FittedValue[] = params.map((q, i) => {
    const iv = fit.intervals[i];
    const th = fit.theta[i];
    const widened = iv && ([th - (th - iv[0]) * scale, th + (iv[1] - th) * scale] as const);
    const back = (t: number) => (q.log ? Math.exp(t) : t);
    const value = back(th);
    return {
      parameter: q.name,
      start: q.name === 'flowDirection' ? p.derived.azimuthDeg : q.start,
      value: q.name === 'flowDirection' ? p.derived.azimuthDeg + value : value,
      interval: widened && (q.name === 'flowDirection' ? [p.derived.azimuthDeg + widened[0], p.derived.azimuthDeg + widened[1]] : [back(widened[0]), back(widened[1])]),
    };
  });
  const rms = (r: number[]) => {
    const d = r.filter((_, i) => !obs[i].nonDetect);
    return Math.sqrt(d.reduce((s, v) => s + v * v, 0) / Math.max(1, d.length));
  };
  const warnings: string[] = [];
  if (!fit.converged) warnings.push('The fit stopped before it settled; the values are the best found.');
  if (fit.correlation)
    for (let i = 0; i < names.length; i++)
      for (let j = i + 1; j < names.length; j++)
        if (Math.abs(fit.correlation[i][j]) > 0.95)
          warnings.push(`The ${FIT_LABELS[names[i]]} and the ${FIT_LABELS[names[j]]} trade off against each other (correlation ${fit.correlation[i][j].toFixed(2)}): the data cannot tell them apart well.`);
  values.forEach((v, i) => {
    if (params[i].log && (Math.abs(fit.theta[i] - start[i]) > 13.9)) warnings.push(`The ${FIT_LABELS[v.parameter]} ran to the edge of its search range: the data do not determine it.`);
    if (!params[i].log && Math.abs(fit.theta[i]) > 89.9) warnings.push('The flow direction ran 90° from the case\'s: check the well positions and the direction.');
  });
  if (c.monitoring.releaseDate === null) warnings.push('No release date: the fit compares the measurements with the steady-state model.');
  return {
    values,
    confidence,
    residuals: obs.map((o, i) => ({ wellId: o.wellId, date: o.date, residual: fit.residuals[i], nonDetect: o.nonDetect })),
    rmsLn: rms(fit.residuals),
    startRmsLn: rms(r0),
    detected,
    nonDetects: obs.length - detected,
    converged: fit.converged,
    iterations: fit.iterations,
    warnings,
  };
}

function round(v: number, digits = 4): number {
  return Number(v.toPrecision(digits));
}

/**
 * The case with the fitted values, as a what-if variant: a new id, the case as parent, a name and
 * note that say what was fitted. Values are written in the units the case already uses.
 */
export function adoptFitAsVariant(c: Case, fit: FitResult, newId: string, now: string): Case {
  const v: Case = structuredClone(c);
  const p = prepareCase(c);
  const lines: string[] = [];
  for (const f of fit.values) {
    if (f.parameter === 'sourceConcentration') {
      const u = c.source.concentration.unit;
      v.source.concentration = { value: round(fromInternal(f.value, u)), unit: u };
    } else if (f.parameter === 'halfLife') {
      const u = c.contaminant.halfLife?.unit ?? 'yr';
      v.contaminant.halfLife = { value: round(fromInternal(f.value, u)), unit: u };
    } else if (f.parameter === 'longitudinalDispersivity') {
      const k = f.value / p.derived.ax;
      const d = c.aquifer.dispersivity;
      const unit = d.mode === 'given' ? d.longitudinal.unit : 'm';
      const q = (m: number) => ({ value: round(fromInternal(m, unit)), unit });
      v.aquifer.dispersivity = { mode: 'given', longitudinal: q(f.value), transverse: q(p.derived.ay * k), vertical: q(p.derived.az * k) };
    } else {
      v.site.flow = { method: 'direction', azimuthDeg: round(((f.value % 360) + 360) % 360, 5), gradient: p.derived.gradient };
      if (c.site.flow.method === 'heads') lines.push('The flow direction now replaces the head-reading fit (gradient kept from it).');
    }
    const iv = f.interval ? `, ${Math.round(fit.confidence * 100)} % interval ${round(f.interval[0], 3)} to ${round(f.interval[1], 3)}` : '';
    lines.push(`${FIT_LABELS[f.parameter]}: ${round(f.start, 4)} → ${round(f.value, 4)} (internal units: mg/L, d, m, degrees${iv})`);
  }
  v.id = newId;
  v.parentId = c.id;
  v.name = `${c.name} — fitted to monitoring data`.slice(0, 200);
  v.created = now;
  v.modified = now;
  v.notes = (
    `Fitted to ${fit.detected} detected results and ${fit.nonDetects} below the reporting limit on ${now.slice(0, 10)} ` +
    `(least squares on ln concentration; typical misfit ×${Math.exp(fit.rmsLn).toFixed(2)}, was ×${Math.exp(fit.startRmsLn).toFixed(2)}).\n` +
    lines.join('\n') +
    (c.notes ? `\n\n${c.notes}` : '')
  ).slice(0, 20000);
  return v;
}
