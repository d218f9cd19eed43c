/**
 * The case's physics: its physical inputs in internal units, and the engine model derived from
 * them with the core's textbook relations (formulas and sources in src/core/hydro.ts):
 *   v  = K·i/nₑ                    seepage velocity (not divided by R)
 *   Kd = Koc·foc  (or Kd given)     ρb given, or 2.65 (1 − n) g/cm³ (quartz grains; common practice)
 *   R  = 1 + ρb·Kd/n                n = total porosity
 *   λ  = ln 2 / t½                  source decline γ = ln 2 / (source half-life)
 *   αL given, or from the distance to the farthest receptor by the chosen scale relation (from the
 *   retarded advective travel distance over the horizon when no receptor lies downgradient);
 *   αT = αL·(transverse ratio), αV = αL·(vertical ratio)
 *   De = D0·τ when diffusion is included, else 0
 *
 * `modelFor(prepared, overrides)` is the seam for work that re-evaluates one case with other
 * physical inputs (a Monte Carlo realisation, a sensitivity run): it reuses the prepared geometry
 * and redoes only this derivation, a few dozen floating-point operations, checking each
 * substituted value against the same rule the case file's value is checked against.
 */
import type { Case } from './schema';
import type { DecayPhase, ScreeningModel, SolutionKind } from '../core/model';
import {
  ValidationError,
  bulkDensityFromPorosity,
  decayRateFromHalfLife,
  domenicoSourceDecayLimit,
  effectiveDiffusion,
  kdFromKoc,
  longitudinalDispersivity,
  retardationFactor,
  seepageVelocity,
  transverseDispersivities,
  validateModel,
  type DispersivityRelation,
  type Warning,
} from '../core';
import { CaseFieldError, atCaseField, checkRule, readFraction, readQuantity, ruleFor, type Rule } from './checked';
import { GRADIENT_RULE, WIDTH_RULE } from './geometry';
import { POSITIVE, writtenNumber } from './fields';
import { roundSig } from './numbers';

/** Sorption as the case states it: Koc (Kd = Koc·foc) or Kd, L/kg. */
export type SorptionInput = { readonly mode: 'koc'; readonly koc: number } | { readonly mode: 'kd'; readonly kd: number };

/** Dispersivity as the case states it: three values (m), or an estimate from the scale distance. */
export type DispersivityInput =
  | { readonly mode: 'given'; readonly longitudinal: number; readonly transverse: number; readonly vertical: number }
  | { readonly mode: 'estimate'; readonly relation: DispersivityRelation; readonly transverseRatio: number; readonly verticalRatio: number };

/** Every physical input of a case, checked, in internal units (m, d, mg/L, kg/L, L/kg). */
export interface PhysicalInputs {
  /** hydraulic conductivity K, m/d */
  readonly hydraulicConductivity: number;
  /** hydraulic gradient i (given, or fitted to the head readings) */
  readonly gradient: number;
  readonly totalPorosity: number;
  readonly effectivePorosity: number;
  readonly fractionOrganicCarbon: number;
  /** dry bulk density ρb, kg/L; null: estimated from the total porosity */
  readonly bulkDensity: number | null;
  readonly sorption: SorptionInput;
  /** contaminant half-life, d; null: no decay */
  readonly halfLife: number | null;
  readonly decayPhase: DecayPhase;
  readonly dispersivity: DispersivityInput;
  /** effective molecular diffusion De = D0·τ, m²/d (0: not included) */
  readonly diffusion: number;
  /** source concentration C0, mg/L */
  readonly c0: number;
  /** source plane width across the flow and thickness below the water table, m */
  readonly width: number;
  readonly thickness: number;
  /** release duration, d (Infinity: continuous) */
  readonly duration: number;
  /** half-life of the source concentration, d; null: constant */
  readonly sourceHalfLife: number | null;
}

/** The accepted ranges of the physical inputs, each with its case field (one definition, checked.ts). */
export const PHYSICS_RULES = {
  hydraulicConductivity: ruleFor('aquifer.hydraulicConductivity'),
  totalPorosity: ruleFor('aquifer.totalPorosity'),
  effectivePorosity: ruleFor('aquifer.effectivePorosity'),
  fractionOrganicCarbon: ruleFor('aquifer.fractionOrganicCarbon'),
  bulkDensity: ruleFor('aquifer.bulkDensity'),
  koc: ruleFor('contaminant.sorption.koc'),
  kd: ruleFor('contaminant.sorption.kd'),
  halfLife: ruleFor('contaminant.halfLife'),
  longitudinal: ruleFor('aquifer.dispersivity.longitudinal'),
  transverse: ruleFor('aquifer.dispersivity.transverse'),
  vertical: ruleFor('aquifer.dispersivity.vertical'),
  transverseRatio: ruleFor('aquifer.dispersivity.transverseRatio'),
  verticalRatio: ruleFor('aquifer.dispersivity.verticalRatio'),
  freeWater: ruleFor('aquifer.diffusion.freeWater'),
  tortuosity: ruleFor('aquifer.diffusion.tortuosity'),
  diffusion: ruleFor('aquifer.diffusion'),
  c0: ruleFor('source.concentration'),
  thickness: ruleFor('source.thickness'),
  duration: ruleFor('source.duration'),
  sourceHalfLife: ruleFor('source.sourceHalfLife'),
} as const satisfies Record<string, Rule>;

const R_ = PHYSICS_RULES;

/** ne ≤ n (the one rule across two inputs). */
function checkPorosities(n: number, ne: number, value: unknown = ne): void {
  if (ne > n) throw new CaseFieldError('aquifer.effectivePorosity', value, null, `at most the total porosity n (${writtenNumber(roundSig(n, 4))})`);
}

/** Aquifer, sorption, decay, dispersivity, diffusion and source term of a case, read and checked. */
export function readPhysicalInputs(c: Case, gradient: number, width: number): PhysicalInputs {
  const a = c.aquifer;
  const hydraulicConductivity = readQuantity(a.hydraulicConductivity, R_.hydraulicConductivity);
  const totalPorosity = readFraction(a.totalPorosity, R_.totalPorosity);
  const effectivePorosity = readFraction(a.effectivePorosity, R_.effectivePorosity);
  checkPorosities(totalPorosity, effectivePorosity);
  const fractionOrganicCarbon = readFraction(a.fractionOrganicCarbon, R_.fractionOrganicCarbon);
  const bulkDensity = a.bulkDensity === null ? null : readQuantity(a.bulkDensity, R_.bulkDensity);
  const s = c.contaminant.sorption;
  const sorption: SorptionInput = s.mode === 'koc' ? { mode: 'koc', koc: readQuantity(s.koc, R_.koc) } : { mode: 'kd', kd: readQuantity(s.kd, R_.kd) };
  const halfLife = c.contaminant.halfLife === null ? null : readQuantity(c.contaminant.halfLife, R_.halfLife);
  const src = c.source;
  const c0 = readQuantity(src.concentration, R_.c0);
  const thickness = readQuantity(src.thickness, R_.thickness);
  const duration = src.duration === null ? Infinity : readQuantity(src.duration, R_.duration);
  const sourceHalfLife = src.sourceHalfLife === null ? null : readQuantity(src.sourceHalfLife, R_.sourceHalfLife);
  const d = a.dispersivity;
  const dispersivity: DispersivityInput =
    d.mode === 'given'
      ? {
          mode: 'given',
          longitudinal: readQuantity(d.longitudinal, R_.longitudinal),
          transverse: readQuantity(d.transverse, R_.transverse),
          vertical: readQuantity(d.vertical, R_.vertical),
        }
      : { mode: 'estimate', relation: d.relation, transverseRatio: readFraction(d.transverseRatio, R_.transverseRatio), verticalRatio: readFraction(d.verticalRatio, R_.verticalRatio) };
  const diffusion = a.diffusion.include
    ? effectiveDiffusion(readQuantity(a.diffusion.freeWater, R_.freeWater), readFraction(a.diffusion.tortuosity, R_.tortuosity))
    : 0;
  return {
    hydraulicConductivity,
    gradient,
    totalPorosity,
    effectivePorosity,
    fractionOrganicCarbon,
    bulkDensity,
    sorption,
    halfLife,
    decayPhase: c.contaminant.decayPhase,
    dispersivity,
    diffusion,
    c0,
    width,
    thickness,
    duration,
    sourceHalfLife,
  };
}

/** Physical inputs in internal units checked against the same rules as the case file's values. */
export function checkPhysicalInputs(p: PhysicalInputs): void {
  checkRule(R_.hydraulicConductivity, p.hydraulicConductivity);
  checkRule(GRADIENT_RULE, p.gradient);
  checkRule(R_.totalPorosity, p.totalPorosity);
  checkRule(R_.effectivePorosity, p.effectivePorosity);
  checkPorosities(p.totalPorosity, p.effectivePorosity);
  checkRule(R_.fractionOrganicCarbon, p.fractionOrganicCarbon);
  if (p.bulkDensity !== null) checkRule(R_.bulkDensity, p.bulkDensity);
  if (p.sorption.mode === 'koc') checkRule(R_.koc, p.sorption.koc);
  else checkRule(R_.kd, p.sorption.kd);
  if (p.halfLife !== null) checkRule(R_.halfLife, p.halfLife);
  const d = p.dispersivity;
  if (d.mode === 'given') {
    checkRule(R_.longitudinal, d.longitudinal);
    checkRule(R_.transverse, d.transverse);
    checkRule(R_.vertical, d.vertical);
  } else {
    checkRule(R_.transverseRatio, d.transverseRatio);
    checkRule(R_.verticalRatio, d.verticalRatio);
  }
  checkRule(R_.diffusion, p.diffusion);
  checkRule(R_.c0, p.c0);
  checkRule(WIDTH_RULE, p.width);
  checkRule(R_.thickness, p.thickness);
  if (p.duration !== Infinity) checkRule(R_.duration, p.duration);
  if (p.sourceHalfLife !== null) checkRule(R_.sourceHalfLife, p.sourceHalfLife);
}

export interface DispersivityDerivation {
  readonly mode: 'given' | 'estimate';
  /** estimate only: the relation, its citation and the distance it was scaled from */
  readonly relation: string | null;
  readonly citation: string | null;
  readonly scaleDistance: number | null;
  readonly transverseRatio: number | null;
  readonly verticalRatio: number | null;
}

/** The derived physical parameters (internal units), as the case screen and report show them. */
export interface DerivedPhysics {
  readonly v: number;
  readonly K: number;
  readonly R: number;
  readonly kd: number;
  readonly bulkDensity: number;
  readonly bulkDensityEstimated: boolean;
  readonly ax: number;
  readonly ay: number;
  readonly az: number;
  readonly decay: number;
  readonly sourceDecay: number;
  readonly diffusion: number;
  readonly dispersivityRelation: DispersivityDerivation;
}

/** Sorption and decay: Kd, ρb, R and the decay rates. */
export function sorptionAndDecay(p: PhysicalInputs): { kd: number; bulkDensity: number; R: number; decay: number; sourceDecay: number } {
  const bulkDensity = p.bulkDensity === null ? bulkDensityFromPorosity(p.totalPorosity) : p.bulkDensity;
  const kd = p.sorption.mode === 'koc' ? kdFromKoc(p.sorption.koc, p.fractionOrganicCarbon) : p.sorption.kd;
  return {
    kd,
    bulkDensity,
    R: retardationFactor(bulkDensity, kd, p.totalPorosity),
    decay: decayRateFromHalfLife(p.halfLife),
    sourceDecay: decayRateFromHalfLife(p.sourceHalfLife),
  };
}

/**
 * Dispersivities: given, or estimated from the scale distance `reach` (the farthest downgradient
 * receptor; null: none, then the retarded advective travel distance over the horizon, with a
 * warning).
 */
export function dispersivities(
  d: DispersivityInput,
  reach: number | null,
  retardedVelocity: number,
  horizon: number,
): { ax: number; ay: number; az: number; relation: DispersivityDerivation; warnings: Warning[] } {
  if (d.mode === 'given') {
    return {
      ax: d.longitudinal,
      ay: d.transverse,
      az: d.vertical,
      relation: { mode: 'given', relation: null, citation: null, scaleDistance: null, transverseRatio: null, verticalRatio: null },
      warnings: [],
    };
  }
  const warnings: Warning[] = [];
  let L: number;
  if (reach !== null) L = reach;
  else {
    // no receptor downgradient: scale from the retarded advective travel distance over the horizon
    L = Math.max(retardedVelocity * horizon, 1);
    warnings.push({
      code: 'dispersivity-scale-from-travel',
      message: `No receptor lies downgradient, so dispersivity was scaled from the advective travel distance over the horizon (${L.toPrecision(3)} m).`,
      field: 'aquifer.dispersivity',
    });
  }
  const est = longitudinalDispersivity(L, d.relation);
  const { ay, az } = transverseDispersivities(est.value, d.transverseRatio, d.verticalRatio);
  return {
    ax: est.value,
    ay,
    az,
    relation: { mode: 'estimate', relation: est.relation, citation: est.citation, scaleDistance: L, transverseRatio: d.transverseRatio, verticalRatio: d.verticalRatio },
    warnings,
  };
}

/**
 * Physical inputs → the engine model and the derived parameters (not yet validated as a model).
 * `dispersivityFactor` scales all three dispersivities, given or estimated (a realisation's
 * sampled factor; published field dispersivities scatter over orders of magnitude at one scale).
 */
export function derivePhysics(
  p: PhysicalInputs,
  reach: number | null,
  horizon: number,
  solution: SolutionKind,
  dispersivityFactor = 1,
): { model: ScreeningModel; derived: DerivedPhysics; warnings: Warning[] } {
  const sd = sorptionAndDecay(p);
  const v = seepageVelocity(p.hydraulicConductivity, p.gradient, p.effectivePorosity);
  const disp = dispersivities(p.dispersivity, reach, v / sd.R, horizon);
  const f = dispersivityFactor;
  const model: ScreeningModel = {
    v,
    ax: disp.ax * f,
    ay: disp.ay * f,
    az: disp.az * f,
    diffusion: p.diffusion,
    R: sd.R,
    decay: sd.decay,
    decayPhase: p.decayPhase,
    width: p.width,
    thickness: p.thickness,
    c0: p.c0,
    sourceDecay: sd.sourceDecay,
    duration: p.duration,
    solution,
  };
  const derived: DerivedPhysics = {
    v,
    K: p.hydraulicConductivity,
    R: sd.R,
    kd: sd.kd,
    bulkDensity: sd.bulkDensity,
    bulkDensityEstimated: p.bulkDensity === null,
    ax: model.ax,
    ay: model.ay,
    az: model.az,
    decay: sd.decay,
    sourceDecay: sd.sourceDecay,
    diffusion: p.diffusion,
    dispersivityRelation: disp.relation,
  };
  return { model, derived, warnings: disp.warnings };
}

/**
 * validateModel with its errors on case fields. A source decline too fast for Domenico's closed
 * form is said as the source half-life (`sourceHalfLifeValue`: the value to quote, as entered).
 */
export function validateAtCase(model: ScreeningModel, sourceHalfLifeValue: number | null): void {
  try {
    validateModel(model); // its warnings come again with modelWarnings (prepare.ts)
  } catch (err) {
    if (!(err instanceof ValidationError)) throw err;
    if (err.field === 'sourceDecay' && sourceHalfLifeValue !== null) {
      // the engine states its bound as a decline rate; say it as the half-life the user entered
      const shortest = Math.LN2 / domenicoSourceDecayLimit(model);
      throw new CaseFieldError(
        'source.sourceHalfLife',
        sourceHalfLifeValue,
        null,
        `longer than ${shortest.toPrecision(3)} d`,
        `with this velocity and dispersion the solutions cannot represent a source halving faster than every ${shortest.toPrecision(3)} d (decline rate must stay below λ + v²/(4·Dx), retarded); lengthen the source half-life`,
      );
    }
    throw atCaseField(err);
  }
}

/** What `modelFor` needs of a prepared case (prepare.ts PreparedCase has it all). */
export interface PhysicsBasis {
  readonly inputs: PhysicalInputs;
  /** the distance an estimated dispersivity is scaled from: the farthest downgradient receptor, m (null: none) */
  readonly receptorReach: number | null;
  readonly horizon: number;
  readonly model: ScreeningModel;
}

/** What a Monte Carlo realisation or a sensitivity run may change besides the physical inputs. */
export interface ModelVariation {
  /** a factor > 0 on the three dispersivities, given or estimated (absent: 1) */
  readonly dispersivityFactor?: number;
  /**
   * the scale distance of an estimated dispersivity when the receptors have moved in the flow
   * frame (a turned flow direction), m; null: none lies downgradient (absent: the prepared case's)
   */
  readonly receptorReach?: number | null;
  /**
   * true: every override is known to lie inside its rule's range (a Monte Carlo plan checks each
   * distribution's support against the physical range once), so only the rule across inputs
   * (effective ≤ total porosity) and the engine's own limits are checked per call
   */
  readonly rangesChecked?: boolean;
}

export const DISPERSIVITY_FACTOR_RULE: Rule = ruleFor('aquifer.dispersivity', POSITIVE);

/**
 * The engine model of a prepared case with some physical inputs replaced (internal units): the
 * seam for Monte Carlo realisations and sensitivity runs. Geometry (frame, source plane,
 * receptors) is the prepared case's; everything physical is derived again exactly as prepareCase
 * derives it (a bulk density estimated from the total porosity follows a changed porosity), so
 * `modelFor(p, {})` equals `p.model`. Each replaced value is checked against the case file's rule
 * and a ValidationError names its case field: effective above total porosity is refused here
 * whichever of the two was replaced. An estimated dispersivity keeps its scale distance (the
 * receptors) unless `variation.receptorReach` gives the new one; when none lies downgradient it
 * follows the realisation's retarded velocity, as prepareCase does.
 */
export function modelFor(p: PhysicsBasis, overrides: Partial<PhysicalInputs> = {}, variation: ModelVariation = {}): ScreeningModel {
  const inputs: PhysicalInputs = { ...p.inputs, ...overrides };
  if (!variation.rangesChecked) checkPhysicalInputs(inputs);
  else if (overrides.totalPorosity !== undefined || overrides.effectivePorosity !== undefined) checkPorosities(inputs.totalPorosity, inputs.effectivePorosity);
  const factor = variation.dispersivityFactor ?? 1;
  if (factor !== 1) checkRule(DISPERSIVITY_FACTOR_RULE, factor);
  const reach = variation.receptorReach === undefined ? p.receptorReach : variation.receptorReach;
  const { model } = derivePhysics(inputs, reach, p.horizon, p.model.solution, factor);
  validateAtCase(model, inputs.sourceHalfLife);
  return model;
}
