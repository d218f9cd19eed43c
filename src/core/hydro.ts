/**
 * Hydrogeology helpers: the textbook relations that turn field parameters into the transport
 * solutions' inputs. All inputs validated; units are whatever is consistent (internally m, d).
 */
import { ValidationError, requireFinite, requireInRange, requireNonNegative, requirePositive } from './validation';

/** Seepage (average linear) velocity from Darcy's law: v = K·i/nₑ (Freeze & Cherry 1979, eq. 2.82). */
export function seepageVelocity(K: number, gradient: number, effectivePorosity: number): number {
  requireNonNegative('hydraulicConductivity', K);
  requireNonNegative('gradient', gradient);
  requireInRange('effectivePorosity', effectivePorosity, 0, 1, true, false);
  return (K * gradient) / effectivePorosity;
}

/** Darcy flux q = K·i. */
export function darcyFlux(K: number, gradient: number): number {
  requireNonNegative('hydraulicConductivity', K);
  requireNonNegative('gradient', gradient);
  return K * gradient;
}

/** Retardation factor for linear equilibrium sorption: R = 1 + ρb·Kd/n (Freeze & Cherry 1979, eq. 9.14). */
export function retardationFactor(bulkDensity: number, Kd: number, porosity: number): number {
  requireNonNegative('bulkDensity', bulkDensity);
  requireNonNegative('kd', Kd);
  requireInRange('porosity', porosity, 0, 1, true, false);
  return 1 + (bulkDensity * Kd) / porosity;
}

/** Kd = Koc·foc (Karickhoff et al. 1979, Water Research 13). */
export function kdFromKoc(koc: number, foc: number): number {
  requireNonNegative('koc', koc);
  requireInRange('fractionOrganicCarbon', foc, 0, 1);
  return koc * foc;
}

/** First-order rate from a half-life: λ = ln 2 / t½. null or Infinity → 0 (no decay). */
export function decayRateFromHalfLife(halfLife: number | null): number {
  if (halfLife === null || halfLife === Infinity) return 0;
  requirePositive('halfLife', halfLife);
  return Math.LN2 / halfLife;
}

/** Effective molecular diffusion coefficient De = D0·τ with tortuosity factor τ in (0, 1]. */
export function effectiveDiffusion(freeWater: number, tortuosity: number): number {
  requireNonNegative('diffusion.freeWater', freeWater);
  requireInRange('diffusion.tortuosity', tortuosity, 0, 1, true, false);
  return freeWater * tortuosity;
}

/** Dry bulk density from total porosity assuming quartz grains: ρb = 2.65·(1 − n) g/cm³ (common practice). */
export function bulkDensityFromPorosity(totalPorosity: number): number {
  requireInRange('totalPorosity', totalPorosity, 0, 1, true, false);
  return 2.65 * (1 - totalPorosity);
}

export type DispersivityRelation = 'xu-eckstein-1995' | 'tenth-of-distance';

export interface DispersivityEstimate {
  readonly value: number;
  readonly relation: DispersivityRelation;
  readonly citation: string;
}

/**
 * Longitudinal dispersivity from the travel distance L (m):
 * - 'xu-eckstein-1995': αL = 0.83·(log10 L)^2.414 (Xu & Eckstein 1995, Ground Water 33(6)); defined for L > 1 m
 *   (below 1 m the log is negative, so L is clamped to a floor of 1.5 m, where αL ≈ 0.01 m).
 * - 'tenth-of-distance': αL = 0.1·L (common practice; attributed to Pickens & Grisak 1981, WRR 17(4)).
 */
export function longitudinalDispersivity(distance: number, relation: DispersivityRelation): DispersivityEstimate {
  requirePositive('distance', distance);
  if (relation === 'xu-eckstein-1995') {
    const L = Math.max(distance, 1.5);
    return {
      value: 0.83 * Math.pow(Math.log10(L), 2.414),
      relation,
      citation: 'Xu & Eckstein 1995, Ground Water 33(6): αL = 0.83 (log10 L)^2.414',
    };
  }
  if (relation === 'tenth-of-distance') {
    return { value: 0.1 * distance, relation, citation: 'αL = L/10, common practice (after Pickens & Grisak 1981, WRR 17(4))' };
  }
  throw new ValidationError('dispersivity.relation', relation, "'xu-eckstein-1995' or 'tenth-of-distance'");
}

/** Transverse and vertical dispersivities from αL by ratios (defaults αT = αL/10, Gelhar et al. 1992; αV = αL/100, common practice). */
export function transverseDispersivities(
  longitudinal: number,
  transverseRatio = 0.1,
  verticalRatio = 0.01,
): { ay: number; az: number } {
  requireFinite('dispersivity.longitudinal', longitudinal);
  requireInRange('dispersivity.transverseRatio', transverseRatio, 0, 1, true, false);
  requireInRange('dispersivity.verticalRatio', verticalRatio, 0, 1, true, false);
  return { ay: longitudinal * transverseRatio, az: longitudinal * verticalRatio };
}
