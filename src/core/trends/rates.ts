/**
 * First-order attenuation rates from monitoring data, as distinguished by Newell et al. (2002,
 * US EPA/540/S-02/500, Calculation and Use of First-Order Rate Constants for Monitored Natural
 * Attenuation Studies):
 *
 * - point decay rate k_point: −slope of ln C against time at one well (how fast that well cleans
 *   up, mostly source depletion). It is NOT a biodegradation rate and must not be used as one in
 *   the transport solutions.
 * - bulk attenuation rate k: from ln C against distance along the plume centreline (one value per
 *   well, steady plume): with m = −d ln C/dx (1/m), k = m·v_c, v_c the contaminant velocity
 *   (seepage velocity / R). It lumps dispersion, sorption and biodegradation.
 * - biodegradation rate λ by Buscheck & Alcantar (1995), as given by Newell et al. (2002):
 *   λ = (v_c / (4αx))·([1 + 2αx·m]² − 1), with αx the longitudinal dispersivity and m = k/v_c.
 *   It is the exact inverse of the steady one-dimensional advection–dispersion–decay solution
 *   C = C₀·exp[(x/2αx)(1 − √(1 + 4λαx/v_c))], so it is exact for a plume whose centreline is
 *   diluted only longitudinally. Transverse spreading of a source of finite width also lowers the
 *   centreline, which this method reads as decay: λ is then OVERESTIMATED (Newell et al. 2002
 *   note the method omits transverse dispersion).
 *
 * Each slope is an ordinary least-squares line on ln C with its Student-t interval; λ's interval
 * is the slope interval mapped through the (increasing) formula, so it carries the scatter of the
 * concentrations only, not the uncertainty of v_c or αx. Non-detects are left out of the lines
 * (a "<" value has no logarithm to fit) and counted in the warnings.
 */
import { ValidationError, requirePositive, type Warning } from '../validation';
import { fitLine, type LineFit } from '../stats/regression';
import type { TimedResult } from './censoring';

export const POINT_RATE_CAUTION =
  'A point decay rate (concentration against time at one well) measures how fast that well cleans up, mostly through source depletion; it is not a biodegradation rate and must not be used as one in the transport solutions (Newell et al. 2002).';

export interface RateEstimate {
  /** the rate, 1/d (positive: concentrations fall) */
  readonly rate: number;
  /** confidence interval of the rate, null with only two points */
  readonly interval: readonly [number, number] | null;
  readonly confidence: number;
  /** points used in the line (detected results) and left out (non-detects) */
  readonly used: number;
  readonly leftOut: number;
  readonly rSquared: number;
  readonly warnings: Warning[];
}

function detectedOnly<T extends { value: number; nonDetect: boolean }>(rows: readonly T[], what: string): { kept: T[]; warnings: Warning[] } {
  const kept = rows.filter((r) => !r.nonDetect && r.value > 0);
  const warnings: Warning[] = [];
  const out = rows.length - kept.length;
  if (out > 0)
    warnings.push({ code: 'rate-non-detects', message: `${out} result${out === 1 ? '' : 's'} below the reporting limit (or zero) left out of the ${what} line.` });
  return { kept, warnings };
}

function lnLine(xs: number[], values: number[], confidence: number): LineFit {
  return fitLine(xs, values.map(Math.log), confidence);
}

/** Point decay rate at one well: −slope of ln C against time (days). */
export function pointDecayRate(results: readonly TimedResult[], confidence = 0.95): RateEstimate {
  const { kept, warnings } = detectedOnly(results, 'concentration-against-time');
  if (kept.length < 2) throw new ValidationError('results', kept.length, 'at least 2 detected results at different dates for a point decay rate');
  const fit = lnLine(kept.map((r) => r.t), kept.map((r) => r.value), confidence);
  if (fit.slopeInterval === null) warnings.push({ code: 'rate-two-points', message: 'Only two detected results: the rate has no confidence interval.' });
  warnings.push({ code: 'point-rate-not-biodegradation', message: POINT_RATE_CAUTION });
  return {
    rate: -fit.slope,
    interval: fit.slopeInterval && [-fit.slopeInterval[1], -fit.slopeInterval[0]],
    confidence,
    used: kept.length,
    leftOut: results.length - kept.length,
    rSquared: fit.rSquared,
    warnings,
  };
}

/** One well's concentration at its distance downgradient of the source along the centreline. */
export interface CentrelinePoint {
  /** distance downgradient from the source, m */
  readonly distance: number;
  readonly value: number;
  readonly nonDetect: boolean;
}

export interface BulkRate extends RateEstimate {
  /** m = −d ln C/dx, 1/m, and its interval */
  readonly perMetre: number;
  readonly perMetreInterval: readonly [number, number] | null;
  readonly contaminantVelocity: number;
}

/** Bulk attenuation rate k = m·v_c from ln C against distance (Newell et al. 2002). */
export function bulkAttenuationRate(points: readonly CentrelinePoint[], contaminantVelocity: number, confidence = 0.95): BulkRate {
  requirePositive('contaminantVelocity', contaminantVelocity);
  const { kept, warnings } = detectedOnly(points, 'concentration-against-distance');
  if (kept.length < 2) throw new ValidationError('wells', kept.length, 'at least 2 wells with detected concentrations at different distances along the centreline');
  const fit = lnLine(kept.map((p) => p.distance), kept.map((p) => p.value), confidence);
  const m = -fit.slope;
  const mi = fit.slopeInterval && ([-fit.slopeInterval[1], -fit.slopeInterval[0]] as const);
  if (mi === null) warnings.push({ code: 'rate-two-points', message: 'Only two wells: the bulk rate has no confidence interval.' });
  if (m <= 0) warnings.push({ code: 'bulk-not-attenuating', message: 'Concentrations do not fall with distance along these wells: no attenuation rate can be derived.' });
  warnings.push({
    code: 'bulk-assumptions',
    message: 'The bulk rate assumes the wells lie on the plume centreline and the plume is at steady state; it lumps dispersion, sorption and biodegradation.',
  });
  return {
    rate: m * contaminantVelocity,
    interval: mi && [mi[0] * contaminantVelocity, mi[1] * contaminantVelocity],
    perMetre: m,
    perMetreInterval: mi,
    contaminantVelocity,
    confidence,
    used: kept.length,
    leftOut: points.length - kept.length,
    rSquared: fit.rSquared,
    warnings,
  };
}

/** λ = (v_c/(4αx))·([1 + 2αx·m]² − 1) (Buscheck & Alcantar 1995), for m in 1/m. */
export function buscheckAlcantar(perMetre: number, contaminantVelocity: number, longitudinalDispersivity: number): number {
  requirePositive('contaminantVelocity', contaminantVelocity);
  requirePositive('longitudinalDispersivity', longitudinalDispersivity);
  const a = longitudinalDispersivity;
  const g = 1 + 2 * a * perMetre;
  // (g² − 1) = (g − 1)(g + 1) = 2a·m·(g + 1): no cancellation for small a·m
  return (contaminantVelocity / (4 * a)) * (2 * a * perMetre) * (g + 1);
}

export interface BiodegradationRate {
  /** λ, 1/d, in the engine's convention (the rate in the retarded equation) */
  readonly rate: number;
  readonly interval: readonly [number, number] | null;
  readonly confidence: number;
  readonly halfLife: number | null;
  readonly warnings: Warning[];
}

/** Biodegradation rate from a bulk attenuation line by Buscheck & Alcantar, with the mapped interval. */
export function biodegradationRate(bulk: BulkRate, longitudinalDispersivity: number): BiodegradationRate {
  const vc = bulk.contaminantVelocity;
  const warnings: Warning[] = [
    {
      code: 'biodegradation-overestimate',
      message:
        'Buscheck & Alcantar assume the centreline is diluted only along the flow; spreading across the flow from a source of finite width also lowers it, so this rate can overstate biodegradation. The interval carries the scatter of the concentrations, not the uncertainty of the velocity or dispersivity.',
    },
  ];
  if (bulk.perMetre <= 0) {
    warnings.push({ code: 'biodegradation-none', message: 'Concentrations do not fall with distance: no biodegradation rate can be derived.' });
    return { rate: 0, interval: null, confidence: bulk.confidence, halfLife: null, warnings };
  }
  const f = (m: number): number => (m > 0 ? buscheckAlcantar(m, vc, longitudinalDispersivity) : 0);
  const rate = f(bulk.perMetre);
  const mi = bulk.perMetreInterval;
  if (mi && mi[0] <= 0)
    warnings.push({ code: 'biodegradation-includes-zero', message: 'The confidence interval reaches zero: the data do not show biodegradation at this confidence.' });
  return {
    rate,
    interval: mi && [f(mi[0]), f(mi[1])],
    confidence: bulk.confidence,
    halfLife: Math.LN2 / rate,
    warnings,
  };
}
