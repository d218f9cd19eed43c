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
import { resultUnit } from './unitSystem';
import type { ScreeningModel } from '../core/model';
import { screenAverage } from '../core/results';
import { fromInternal, toInternal } from '../core/units';
import { levenbergMarquardt } from '../core/fit/levenbergMarquardt';
import { ValidationError } from '../core/validation';
import { normalCdf } from '../core/uncertainty/normal';

const normalPdf = (z: number) => Math.exp(-0.5 * z * z) / Math.sqrt(2 * Math.PI);
import type { Case, UncertainInput, UncertainValue } from './schema';
import type { ObservationSummary } from './observations';
import { distributionFromEstimate } from './uncertainty';
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
  /** linearised standard error in the same units (delta method for the log-fitted ones: value × SE of ln), null with the interval */
  readonly standardError: number | null;
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

/** How far a fit has gone: least-squares round (the hinge start, then up to 8 EM rounds) and model evaluations. */
export interface FitProgress {
  readonly round: number;
  readonly maxRounds: number;
  readonly evaluations: number;
}

/** Rounds of least squares at most: the hinge start and 8 EM rounds. */
export const FIT_MAX_ROUNDS = 9;

export function fitCase(c: Case, chosen: readonly FitParameter[], confidence = 0.95, onProgress?: (p: FitProgress) => void): FitResult {
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
  let lsRound = 1;
  let evaluations = 0;
  const residuals = (theta: readonly number[]): number[] => {
    evaluations++;
    onProgress?.({ round: lsRound, maxRounds: FIT_MAX_ROUNDS, evaluations });
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
  for (let em = 0; nd && em < FIT_MAX_ROUNDS - 1; em++) {
    lsRound = em + 2;
    const mu = lnModel(fit.theta);
    const det = obs.map((o, i) => (o.nonDetect ? null : lnObs[i] - mu[i])).filter((v): v is number => v !== null);
    let sigma2 = det.reduce((a, v) => a + v * v, 0) / Math.max(1, det.length);
    if (em > 0) {
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
    const se = fit.stdErrors[i];
    return {
      standardError: se === null || !iv ? null : (q.log ? value : 1) * se * scale,
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

/** `v` (an edited copy of `c`) made a what-if variant of `c`: a new id, `c` as its parent, a name and a note that say where it came from. */
function markVariant(v: Case, c: Case, newId: string, now: string, suffix: string, note: string[]): Case {
  v.id = newId;
  v.parentId = c.id;
  v.name = `${c.name} — ${suffix}`.slice(0, 200);
  v.created = now;
  v.modified = now;
  v.notes = (note.join('\n') + (c.notes ? `\n\n${c.notes}` : '')).slice(0, 20000);
  return v;
}

/** The percentile a `confidence` interval's ends stand at (2.5 for 95 %). */
const endPercentile = (confidence: number) => round(50 * (1 - confidence), 6);

/**
 * The fitted values as distributions of the uncertain inputs (src/case/uncertainty.ts reads them),
 * each from its estimate and linearised standard error by `distributionFromEstimate` (the one rule:
 * log-normal about the estimate with ln gsd = SE/estimate, normal for the flow direction), in the
 * units the case uses; the longitudinal dispersivity as the dispersivity factor about the fitted
 * value (estimate 1, αT and αV follow in proportion). Values without a standard error are left
 * out. The errors carry the data's scatter only (fitLines says so), so these spreads are a lower
 * bound on the uncertainty of each input.
 */
export function fitDistributions(c: Case, fit: FitResult): Partial<Record<UncertainInput, UncertainValue>> {
  const out: Partial<Record<UncertainInput, UncertainValue>> = {};
  const note = 'fitted to the monitoring data: linearised standard error of the fit (the data\'s scatter only)';
  for (const f of fit.values) {
    const se = f.standardError;
    if (se === null || !(se > 0)) continue;
    if (f.parameter === 'sourceConcentration' || f.parameter === 'halfLife') {
      const unit = f.parameter === 'sourceConcentration' ? c.source.concentration.unit : (c.contaminant.halfLife?.unit ?? 'yr');
      out[f.parameter] = distributionFromEstimate(f.parameter, round(fromInternal(f.value, unit)), round(fromInternal(se, unit)), unit, note);
    } else if (f.parameter === 'longitudinalDispersivity') {
      out.dispersivityFactor = distributionFromEstimate('dispersivityFactor', 1, round(se / f.value), undefined, note);
    } else {
      out.flowDirection = distributionFromEstimate('flowDirection', round(((f.value % 360) + 360) % 360, 5), round(se), undefined, note);
    }
  }
  return out;
}

/**
 * The case with the fitted values, as a what-if variant: a new id, the case as parent, a name and
 * note that say what was fitted. Values are written in the units the case already uses. With
 * `withIntervals`, the fitted values with their standard errors also become the variant's
 * uncertain inputs (fitDistributions), replacing any the case gave those inputs, and the note says so.
 */
export function adoptFitAsVariant(c: Case, fit: FitResult, newId: string, now: string, withIntervals = false): Case {
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
      // the case's own unit, or with estimated dispersivities the system's length unit (m or ft)
      const unit = d.mode === 'given' ? d.longitudinal.unit : resultUnit(c, 'length');
      const q = (m: number) => ({ value: round(fromInternal(m, unit)), unit });
      v.aquifer.dispersivity = { mode: 'given', longitudinal: q(f.value), transverse: q(p.derived.ay * k), vertical: q(p.derived.az * k) };
    } else {
      v.site.flow = { method: 'direction', azimuthDeg: round(((f.value % 360) + 360) % 360, 5), gradient: p.derived.gradient };
      if (c.site.flow.method === 'heads') lines.push('The flow direction now replaces the head-reading fit (gradient kept from it).');
    }
    const iv = f.interval ? `, ${Math.round(fit.confidence * 100)} % interval ${round(f.interval[0], 3)} to ${round(f.interval[1], 3)}` : '';
    lines.push(`${FIT_LABELS[f.parameter]}: ${round(f.start, 4)} → ${round(f.value, 4)} (internal units: mg/L, d, m, degrees${iv})`);
  }
  if (withIntervals) {
    const dist = fitDistributions(c, fit);
    const names = Object.keys(dist) as UncertainInput[];
    for (const k of names) v.uncertainty.inputs[k] = dist[k];
    if (names.length) lines.push(`Uncertain inputs from the fit's standard errors (a lower bound on their uncertainty): ${names.join(', ')}.`);
  }
  return markVariant(v, c, newId, now, 'fitted to monitoring data', [
    `Fitted to ${fit.detected} detected results and ${fit.nonDetects} below the reporting limit on ${now.slice(0, 10)} ` +
      `(least squares on ln concentration; typical misfit ×${Math.exp(fit.rmsLn).toFixed(2)}, was ×${Math.exp(fit.startRmsLn).toFixed(2)}).`,
    ...lines,
  ]);
}

/**
 * The case with the biodegradation rate of Buscheck & Alcantar (1995) as its half-life, as a
 * what-if variant (the summary's `adoptableHalfLife`, which already allows for decay acting on the
 * dissolved phase only), written in the unit of the case's half-life field (years when it has
 * none). With `withInterval`, the rate's interval becomes the half-life's uncertain input (a
 * log-normal whose end percentiles are the interval's, when both ends are positive rates). The note
 * carries the caution: the bulk attenuation rate itself is not a biodegradation rate, and the
 * method assumes a steady plume, a centreline transect and a constant source.
 */
export function adoptBiodegradationAsVariant(c: Case, s: ObservationSummary, newId: string, now: string, withInterval = false): Case {
  const b = s.biodegradationRate;
  if (!b || s.adoptableHalfLife === null)
    throw new ValidationError('monitoring.results', null, 'a positive biodegradation rate from at least two centreline wells', s.ratesNote ?? 'no biodegradation rate could be formed');
  const unit = c.contaminant.halfLife?.unit ?? 'yr';
  const v = markVariant(structuredClone(c), c, newId, now, 'biodegradation rate from monitoring data', [
    `Half-life from the biodegradation rate of Buscheck & Alcantar (1995), as set out by Newell et al. (2002), on ${now.slice(0, 10)}: ` +
      `λ = ${round(b.rate, 3)} /d` +
      (b.interval ? ` (${Math.round(b.confidence * 100)} % interval ${round(b.interval[0], 3)} to ${round(b.interval[1], 3)} /d)` : '') +
      ` from ${s.bulkRate?.used ?? 0} centreline wells; the case's half-life was ${c.contaminant.halfLife ? `${c.contaminant.halfLife.value} ${c.contaminant.halfLife.unit}` : 'none (no decay)'}.`,
    'Caution: the bulk attenuation rate along the centreline is not a biodegradation rate (it includes dispersion); the biodegradation rate derived from it assumes a steady plume and a constant source, and may overestimate degradation for a source narrow against the plume (Newell et al. 2002). Use it as a what-if, not as a site value, until the data support it.',
  ]);
  v.contaminant.halfLife = { value: round(fromInternal(s.adoptableHalfLife, unit)), unit };
  if (withInterval && b.interval && b.interval[0] > 0) {
    const k = s.adoptableHalfLife * b.rate; // ln 2 (or ln 2 / R for dissolved-only decay): t½ = k / λ
    v.uncertainty.inputs.halfLife = {
      kind: 'lognormal-range',
      low: round(fromInternal(k / b.interval[1], unit)),
      high: round(fromInternal(k / b.interval[0], unit)),
      percentile: endPercentile(b.confidence),
      unit,
      note: `from the Buscheck & Alcantar rate's ${Math.round(b.confidence * 100)} % interval (monitoring data)`,
    };
    v.notes = `${v.notes.split('\n')[0]}\nThe half-life is also an uncertain input from the rate's interval.\n${v.notes.split('\n').slice(1).join('\n')}`.slice(0, 20000);
  }
  return v;
}
