/**
 * A case's uncertain inputs → a Monte Carlo run: each realisation is the case with the sampled
 * inputs substituted, mapped to an engine model, and screened at every receptor (first arrival at
 * the limit within the horizon, concentration at the horizon, peak within it; the case's solution).
 *
 * Sampling: a Latin hypercube over the uncertain inputs (src/core/uncertainty), each input
 * sampled in the unit its distribution states and converted to internal units at this edge, as a
 * fixed value is. Realisation i depends only on (seed, runs, i), so a run split across workers
 * gives the same numbers as one worker (tested). Inputs are sampled independently: correlation
 * between inputs is not represented, and every result says so.
 *
 * Physical limits: a distribution that puts probability outside an input's physical range is
 * refused when the run is planned (message naming the input); a realisation the engine still
 * refuses (e.g. a source declining faster than Domenico can represent) is counted and reported,
 * never silently dropped or clipped.
 *
 * Mapping: the case-to-engine seam's `modelFor(prepared, overrides)` (physics.ts) derives each
 * realisation's model from the sampled physical inputs exactly as prepareCase does, checking each
 * against the case file's rule; the dispersivity factor then scales αL, αT and αV; the flow
 * direction turns the geometry as prepareCase would (a traced footprint's source plane, the
 * receptors in the flow frame, the scale distance of an estimated dispersivity).
 * Flow from four or more head readings (the head-fit option): the plane's slope (a, b) is sampled
 * from the least-squares covariance of the fit (core/uncertainty/planeFit.ts) through two more
 * Latin hypercube columns, giving each realisation's gradient and direction.
 */
import type { Case, UncertainInput, UncertainValue } from './schema';
import { UNCERTAIN_INPUTS } from './schema';
import { prepareCase, type PreparedCase, type PreparedReceptor } from './prepare';
import { modelFor, type PhysicalInputs } from './physics';
import { footprintPlaneFor, prepareFrame, receptorReach, type SourcePlane } from './geometry';
import { convert, unitDef, type Dimension } from '../core/units';
import type { ScreeningModel } from '../core/model';
import { ValidationError, breakthroughCurve, screenAverage, screenReceptorsInto, type Receptor } from '../core';
import { toInternal } from '../core/units';
import { comparedAnalyte, monitoringWellKey, wellCurveSpan, wellSeries } from './monitoring';
import {
  LatinHypercube,
  checkRuns,
  exceedance,
  makeSampler,
  normalQuantile,
  percentiles,
  planeSlopeCovariance,
  ranks,
  samplePlaneSlope,
  spearman,
  thirdsExceedance,
  type PhysicalRange,
  type PlaneSlopeCovariance,
  type Sampler,
} from '../core/uncertainty';
import { checkSeed } from '../core/random';
import { SCREENING_CAUTION } from './caution';
import { countExceedance, exceedanceContours, exceedanceGrid, exceedanceScratch, type ExceedanceContours, type ExceedanceGrid, type TurnedFrame } from './exceedanceMap';
import { normalizeDeg, sinCosDeg } from '../geo/angles';
import { fieldInfo } from './fields';
import { fieldUnit } from './unitSystem';
import { CONVERTED_DIGITS, roundSig } from './numbers';

export interface InputDefinition {
  /** as the screen labels the field (src/case/fields.ts, the one list of labels) */
  readonly label: string;
  /** the case field it replaces (or, for the dispersivity factor, its own field) */
  readonly field: string;
  /** null: dimensionless (or degrees for the flow direction); the field's own (fields.ts) */
  readonly dimension: Dimension | null;
  /** what would narrow it: the measurement, in words a case officer can act on */
  readonly measure: string;
}

/** An input's definition: its label and unit dimension from the field it replaces (fields.ts), with what would narrow it. */
function definition(field: string, measure: string): InputDefinition {
  const info = fieldInfo(field);
  if (!info) throw new Error(`no field ${field} in fields.ts`);
  return { label: info.label, field, dimension: info.dimension, measure };
}

export const INPUT_DEFINITIONS: Record<UncertainInput, InputDefinition> = {
  hydraulicConductivity: definition('aquifer.hydraulicConductivity', 'slug or pumping tests in wells between the release and the receptors'),
  gradient: definition('site.flow.gradient', 'water levels measured on one day in at least three surveyed wells'),
  flowDirection: definition('site.flow.azimuthDeg', 'water levels measured on one day in at least three surveyed wells around the release'),
  effectivePorosity: definition('aquifer.effectivePorosity', 'grain-size or core analysis of the aquifer material'),
  totalPorosity: definition('aquifer.totalPorosity', 'bulk density and grain density of undisturbed core samples (the porosity follows from both)'),
  fractionOrganicCarbon: definition('aquifer.fractionOrganicCarbon', 'laboratory organic-carbon analysis of aquifer samples from below the water table'),
  koc: definition('contaminant.sorption.koc', 'a site-specific sorption (batch) test'),
  kd: definition('contaminant.sorption.kd', 'a site-specific sorption (batch) test'),
  halfLife: definition('contaminant.halfLife', 'concentrations along the plume over several monitoring rounds, to fit a degradation rate'),
  sourceHalfLife: definition('source.sourceHalfLife', 'repeated sampling in the source area over time'),
  dispersivityFactor: definition('uncertainty.inputs.dispersivityFactor', 'a transect of wells across the plume (or a tracer test) to see how far it spreads'),
  sourceConcentration: definition('source.concentration', 'groundwater samples from the source area'),
  sourceWidth: definition('site.source.width', 'soil borings or direct-push sampling around the release'),
  sourceThickness: definition('source.thickness', 'depth-discrete sampling at the source'),
  releaseDuration: definition('source.duration', 'site records of when the release started and stopped'),
};

const POSITIVE: PhysicalRange = { min: 0, max: Infinity, minOpen: true, maxOpen: true };
const NON_NEGATIVE: PhysicalRange = { min: 0, max: Infinity, minOpen: false, maxOpen: true };

/** The physical range of each input in its distribution's unit (only 0 and pure numbers as bounds, so unit-free). */
function physicalRange(input: UncertainInput, c: Case): PhysicalRange {
  switch (input) {
    case 'gradient':
      return { min: 0, max: 1, minOpen: true, maxOpen: true };
    case 'flowDirection':
      return { min: -Infinity, max: Infinity, minOpen: true, maxOpen: true };
    case 'effectivePorosity':
      // at most the total porosity; when that varies too, each realisation is checked (modelFor)
      return c.uncertainty.inputs.totalPorosity ? { min: 0, max: 1, minOpen: true, maxOpen: true } : { min: 0, max: c.aquifer.totalPorosity, minOpen: true, maxOpen: false };
    case 'totalPorosity':
      return { min: 0, max: 1, minOpen: true, maxOpen: true };
    case 'fractionOrganicCarbon':
      return { min: 0, max: 1, minOpen: false, maxOpen: false };
    case 'koc':
    case 'kd':
      return NON_NEGATIVE;
    default:
      return POSITIVE;
  }
}

/** The unit a distribution is read in: its own, else the fixed field's unit. */
export function defaultUnit(input: UncertainInput, c: Case): string | undefined {
  const s = c.contaminant.sorption;
  switch (input) {
    case 'hydraulicConductivity':
      return c.aquifer.hydraulicConductivity.unit;
    case 'koc':
      return s.mode === 'koc' ? s.koc.unit : 'L/kg';
    case 'kd':
      return s.mode === 'kd' ? s.kd.unit : 'L/kg';
    case 'halfLife':
      return c.contaminant.halfLife?.unit ?? 'd';
    case 'sourceHalfLife':
      return c.source.sourceHalfLife?.unit ?? 'd';
    case 'sourceConcentration':
      return c.source.concentration.unit;
    case 'sourceWidth':
      return c.site.source.width.unit;
    case 'sourceThickness':
      return c.source.thickness.unit;
    case 'releaseDuration':
      return c.source.duration?.unit ?? 'd';
    default:
      return undefined;
  }
}

/**
 * The unit a distribution is shown and edited in, by the rule of the field it replaces
 * (unitSystem.ts fieldUnit): that field's override, else the case's system (ft/d in a US customary
 * case), else the unit it is stored in. `stored` is the distribution's own unit (or defaultUnit).
 */
export function shownDistributionUnit(c: Pick<Case, 'units'>, input: UncertainInput, stored: string | undefined): string | undefined {
  return stored === undefined ? undefined : fieldUnit(c, INPUT_DEFINITIONS[input].field, { value: 0, unit: stored });
}

/** The parameters of a distribution that carry its unit (gsd and percentile are pure numbers). */
const UNIT_KEYS = ['low', 'high', 'mode', 'mean', 'sd', 'median'] as const;

/**
 * A distribution stated in `unit` instead of its own (`from`): each parameter and truncation bound
 * converted and rounded to CONVERTED_DIGITS significant digits, the way a converted input field
 * shows it. The same distribution when no conversion is needed, so a value typed in the unit shown
 * stays exactly as typed. Editing works on what this returns: a parameter typed into a converted
 * distribution stores the whole distribution in the unit shown, the typed value exact and the
 * others as they were shown; the stored unit changes only then, never by switching the system.
 */
export function distributionIn(d: UncertainValue, from: string | undefined, unit: string | undefined): UncertainValue {
  if (!from || !unit || from === unit) return d;
  const conv = (v: number) => roundSig(convert(v, from, unit), CONVERTED_DIGITS);
  const out: Record<string, unknown> = { ...d, unit };
  for (const k of UNIT_KEYS) if (typeof out[k] === 'number') out[k] = conv(out[k] as number);
  if (d.truncate) out.truncate = Object.fromEntries(Object.entries(d.truncate).map(([k, v]) => [k, typeof v === 'number' ? conv(v) : v]));
  return out as UncertainValue;
}

/** A case's distribution of `input` as the screen shows it: in the unit of shownDistributionUnit. */
export function shownDistribution(c: Case, input: UncertainInput, d: UncertainValue): UncertainValue {
  const from = d.unit ?? defaultUnit(input, c);
  return distributionIn(d, from, shownDistributionUnit(c, input, from));
}

/** A distribution stated in `stored` in words, in the unit the case's system shows it (the report, the CSV export). */
export function describeInSystem(c: Pick<Case, 'units'>, input: UncertainInput, d: UncertainValue, stored: string | undefined): string {
  const unit = shownDistributionUnit(c, input, stored);
  return describeDistribution(distributionIn(d, stored, unit), unit, input);
}

/** A case's distribution in words, in the unit the screen shows it (the panel, the report). */
export function describeShown(c: Case, input: UncertainInput, d: UncertainValue): string {
  return describeInSystem(c, input, d, d.unit ?? defaultUnit(input, c));
}

export interface PlannedInput {
  readonly input: UncertainInput;
  readonly definition: InputDefinition;
  readonly distribution: UncertainValue;
  /** the unit the distribution is stated in (undefined: dimensionless) */
  readonly unit: string | undefined;
  readonly sampler: Sampler;
  /** internal units per distribution unit */
  readonly factor: number;
}

export interface UncertaintyPlan {
  readonly prepared: PreparedCase;
  readonly runs: number;
  readonly seed: number;
  readonly inputs: readonly PlannedInput[];
  /** heads with the head-fit option: the fitted slope's covariance (two more sampled columns) */
  readonly headPlane: PlaneSlopeCovariance | null;
  /** sampled columns of the Latin hypercube: one per input, two for the head plane */
  readonly columns: number;
  /** times of each realisation's breakthrough curves (d), null: curves not computed */
  readonly curveTimes: Float64Array | null;
  /** the lattice of the exceedance map, null: not mapped */
  readonly map: ExceedanceGrid | null;
  /** a traced footprint: its source plane (centre and width) for a flow direction of the datum plane (geometry.ts); null: a point release */
  readonly sourcePlaneFor: ((planeAzimuthDeg: number) => SourcePlane) | null;
  /** the monitoring wells each realisation's curve is computed at (the `wells` option; empty: none) */
  readonly wells: readonly PlannedWell[];
  /** times per monitoring-well curve: BAND_TIMES, or 1 (the steady state, without a release date) */
  readonly wellSteps: number;
  /** realisations 0 … wellRealisations − 1 are evaluated at the monitoring wells (WELL_BAND_REALISATIONS) */
  readonly wellRealisations: number;
}

/**
 * Realisations evaluated at the monitoring wells at most (Domenico; a fifth of it with the exact
 * solution): a band drawn on a chart needs no more (the 5th percentile of 1000 draws has a standard
 * error of 0.7 % in probability), and a well's curve costs about what a receptor's does, so a run
 * of many realisations is not slowed in proportion to the wells. The first realisations of a Latin
 * hypercube run are independent draws from the distributions (which stratum a realisation takes
 * does not depend on its index), as for the exceedance map.
 */
export const WELL_BAND_REALISATIONS = 1000;

/**
 * A monitoring well a run evaluates at, for the band on its chart: placed, with results of the
 * compared analyte. Its curve's times are the chart's (monitoring.ts `wellCurveSpan`).
 */
export interface PlannedWell {
  readonly id: string;
  /** what the band depends on besides the case's physics (monitoringWellKey) */
  readonly key: string;
  /** local east/north metres (turned with a sampled flow direction) */
  readonly en: [number, number];
  /** the screen in the prepared case's flow frame, m */
  readonly screen: Receptor;
  /** d since the release; one Infinity: the steady state (no release date) */
  readonly times: Float64Array;
}

/** The Latin hypercube of a plan (each worker builds its own; the same numbers everywhere). */
export function designOf(plan: UncertaintyPlan): LatinHypercube {
  return new LatinHypercube(plan.seed, plan.runs, plan.columns);
}

const MORE_HEADS = 'more water levels, in wells spread around the release and measured on one day';
export const HEAD_FIT_DRIVERS = {
  gradient: { label: `${INPUT_DEFINITIONS.gradient.label} (from the head readings)`, measure: MORE_HEADS },
  flowDirection: { label: `${INPUT_DEFINITIONS.flowDirection.label} (from the head readings)`, measure: MORE_HEADS },
} as const;

export interface RunOptions {
  runs?: number;
  seed?: number;
  /** also each realisation's breakthrough curve at every receptor (BAND_TIMES times), for the percentile bands */
  curves?: boolean;
  /** also the map of P(C > limit) at the map's time and depth (exceedanceMap.ts) */
  map?: boolean;
  /**
   * also each realisation's curve at every placed monitoring well with results of the compared
   * analyte, over its chart's times (for the band on its chart: monitoringWellBands); a case with
   * no such well costs nothing more
   */
  wells?: boolean;
}

/** Times of the percentile bands of the breakthrough curves: this many, evenly spaced in (0, horizon]. */
export const BAND_TIMES = 48;

/** Why an input cannot be uncertain in this case (null: it can): the case gives it another way. */
export function notApplicable(c: Case, input: UncertainInput): string | null {
  const label = INPUT_DEFINITIONS[input].label;
  if ((input === 'gradient' || input === 'flowDirection') && c.site.flow.method !== 'direction') return `${label}: the flow comes from head readings; use the head-fit uncertainty instead`;
  if (input === 'koc' && c.contaminant.sorption.mode !== 'koc') return 'Koc: the case gives sorption as Kd; make Kd uncertain instead';
  if (input === 'kd' && c.contaminant.sorption.mode !== 'kd') return 'Kd: the case gives sorption as Koc; make Koc (or foc) uncertain instead';
  if (input === 'sourceWidth' && c.site.source.footprint) return 'source width: the width comes from the traced footprint; make it a point release with a width to vary it';
  return null;
}

/**
 * One uncertain input checked and ready to sample: applicable to the case, its unit of the
 * input's dimension, its distribution valid and inside the input's physical range. Throws
 * ValidationError naming the input (`uncertainty.inputs.<name>…`) with the reason in words.
 */
export function planInput(c: Case, input: UncertainInput, distribution: UncertainValue): PlannedInput {
  const field = `uncertainty.inputs.${input}`;
  const definition = INPUT_DEFINITIONS[input];
  const why = notApplicable(c, input);
  if (why) throw new ValidationError(field, distribution.kind, 'an input the case gives as a value', why);
  let unit: string | undefined;
  let factor = 1;
  if (definition.dimension) {
    unit = distribution.unit ?? defaultUnit(input, c);
    let def;
    try {
      def = unitDef(unit ?? '');
    } catch {
      def = undefined;
    }
    if (!def || def.dimension !== definition.dimension)
      throw new ValidationError(`${field}.unit`, unit, `a ${definition.dimension} unit`, `${definition.label}: "${unit}" is not a ${definition.dimension} unit`);
    factor = def.factor;
  } else if (distribution.unit) {
    throw new ValidationError(`${field}.unit`, distribution.unit, 'no unit', `${definition.label} has no unit`);
  }
  const sampler = makeSampler(field, definition.label, distribution, physicalRange(input, c));
  return { input, definition, distribution, unit, sampler, factor };
}

/**
 * Where new truncation bounds start in the editor: the 1st and 99th percentiles of the distribution
 * (its own bounds kept) restricted to the input's physical range, so truncating a distribution that
 * spills outside that range (a normal K below 0) starts inside it; when its own bounds leave
 * nothing, from the distribution without them. Null when nothing of the distribution lies inside
 * the range, or its parameters are invalid (the row's message says why).
 */
export function truncationStart(c: Case, input: UncertainInput, d: UncertainValue): { low: number; high: number } | null {
  const own = startWithin(c, input, d, d.truncate ?? {});
  // bounds that leave nothing of it: start the other side from the distribution without them
  return own ?? (d.truncate ? startWithin(c, input, d, {}) : null);
}

function startWithin(c: Case, input: UncertainInput, d: UncertainValue, t: { low?: number | null; high?: number | null }): { low: number; high: number } | null {
  const range = physicalRange(input, c);
  const low = Math.max(t.low ?? -Infinity, range.min);
  const high = Math.min(t.high ?? Infinity, range.max);
  const inside = { ...d, truncate: { ...(Number.isFinite(low) ? { low } : {}), ...(Number.isFinite(high) ? { high } : {}) } };
  try {
    const s = makeSampler(`uncertainty.inputs.${input}`, INPUT_DEFINITIONS[input].label, inside, { min: -Infinity, max: Infinity, minOpen: true, maxOpen: true });
    return { low: s.sample(0.01), high: s.sample(0.99) };
  } catch {
    return null;
  }
}

/**
 * Each uncertain input checked as the screen shows it (in the case's units, shownDistribution):
 * throws the first refusal, its figures in those units (a bound in ft/d in a US customary case, as
 * the input's row says it), before planUncertainty checks the stored values themselves.
 */
export function checkInputsAsShown(c: Case): void {
  for (const input of UNCERTAIN_INPUTS) {
    const d = c.uncertainty.inputs[input];
    if (d) planInput(c, input, shownDistribution(c, input, d));
  }
}

/**
 * Check a case's uncertain inputs and prepare a run. Throws ValidationError naming the input
 * (`uncertainty.inputs.<name>…`) or the run settings (`uncertainty.runs`, `uncertainty.seed`).
 */
export function planUncertainty(c: Case, opts: RunOptions = {}): UncertaintyPlan {
  const prepared = prepareCase(c);
  const runs = checkRuns(opts.runs ?? c.uncertainty.runs, 'uncertainty.runs');
  const seed = checkSeed(opts.seed ?? c.uncertainty.seed, 'uncertainty.seed');
  const inputs: PlannedInput[] = [];
  for (const input of UNCERTAIN_INPUTS) {
    const distribution = c.uncertainty.inputs[input];
    if (distribution) inputs.push(planInput(c, input, distribution));
  }
  let headPlane: PlaneSlopeCovariance | null = null;
  if (c.uncertainty.headFit) {
    const flow = c.site.flow;
    if (flow.method !== 'heads' || flow.readings.length < 4)
      throw new ValidationError('uncertainty.headFit', true, 'a flow fitted to 4 or more head readings', 'the flow direction and gradient uncertainty from the plane fit needs the flow from at least 4 head readings (3 fix the plane exactly)');
    headPlane = planeSlopeCovariance(
      flow.readings.map((r) => {
        const [x, y] = prepared.frame.toEN(r.position);
        return { x, y, head: r.head.value * unitDef(r.head.unit).factor };
      }),
    );
  }
  if (!inputs.length && !headPlane)
    throw new ValidationError('uncertainty.inputs', 'none', 'at least one uncertain input', 'no input has a distribution: give at least one uncertain input a distribution to run a Monte Carlo screening');
  const sourcePlaneFor = footprintPlaneFor(c, prepareFrame(c));
  const curveTimes = opts.curves ? Float64Array.from({ length: BAND_TIMES }, (_, k) => (prepared.horizon * (k + 1)) / BAND_TIMES) : null;
  const map = opts.map ? exceedanceGrid(prepared, runs) : null;
  const wells = opts.wells ? plannedWells(c, prepared) : [];
  const wellRealisations = wells.length ? Math.min(runs, prepared.model.solution === 'exact' ? WELL_BAND_REALISATIONS / 5 : WELL_BAND_REALISATIONS) : 0;
  return { prepared, runs, seed, inputs, headPlane, columns: inputs.length + (headPlane ? 2 : 0), curveTimes, map, sourcePlaneFor, wells, wellSteps: wells[0]?.times.length ?? 0, wellRealisations };
}

/** The case's placed monitoring wells with results of the compared analyte, in the prepared flow frame (a well the engine cannot evaluate is left out). */
function plannedWells(c: Case, prepared: PreparedCase): PlannedWell[] {
  const mon = c.monitoring;
  const analyte = comparedAnalyte(mon, c.contaminant.name);
  const out: PlannedWell[] = [];
  for (const w of mon.wells) {
    const dates = wellSeries(mon, w.id, analyte).map((r) => r.date);
    if (!w.position || dates.length === 0) continue;
    const { tEnd, sinceRelease } = wellCurveSpan(mon, dates);
    const zTop = toInternal(w.screenTop.value, w.screenTop.unit);
    const zBottom = Math.max(zTop, toInternal(w.screenBottom.value, w.screenBottom.unit));
    try {
      const { x, y } = prepared.fromMap(w.position);
      const screen = { x, y, zTop, zBottom };
      screenAverage(prepared.model, screen, Infinity); // the engine's checks of the screen, once
      const times = sinceRelease ? Float64Array.from({ length: BAND_TIMES }, (_, k) => (tEnd * (k + 1)) / BAND_TIMES) : Float64Array.of(Infinity);
      out.push({ id: w.id, key: monitoringWellKey(mon, w), en: prepared.frame.toEN(w.position), screen, times });
    } catch (e) {
      if (!(e instanceof ValidationError)) throw e;
    }
  }
  return out;
}

/** Internal-unit values of one realisation's inputs (by input name). */
export type RealisationValues = Partial<Record<UncertainInput, number>>;

/** The sampled values of realisation i (internal units; degrees for the flow direction). */
export function realisationValues(plan: UncertaintyPlan, lhs: LatinHypercube, i: number): RealisationValues {
  const out: RealisationValues = {};
  plan.inputs.forEach((p, k) => {
    out[p.input] = p.sampler.sample(lhs.uniform(i, k)) * p.factor;
  });
  if (plan.headPlane) {
    const k = plan.inputs.length;
    const { a, b } = samplePlaneSlope(plan.headPlane, normalQuantile(lhs.uniform(i, k)), normalQuantile(lhs.uniform(i, k + 1)));
    const d = plan.prepared.derived;
    out.gradient = Math.hypot(a, b);
    // down the slope, degrees clockwise from north in the datum plane, then true (less the meridian convergence)
    out.flowDirection = normalizeDeg((Math.atan2(-a, -b) * 180) / Math.PI - (d.planeAzimuthDeg - d.azimuthDeg));
  }
  return out;
}

interface RealisationGeometry {
  readonly model: ScreeningModel;
  readonly receptors: readonly Receptor[];
  /** the realisation's flow frame when the flow direction turned (null: the prepared case's) */
  readonly turned: TurnedFrame | null;
}

/**
 * The engine model and receptor positions of one realisation, through the case-to-engine seam
 * (physics.ts modelFor): the sampled physical inputs, the dispersivity factor and, for a turned
 * flow direction, the receptors' new positions in the flow frame and the new scale distance of an
 * estimated dispersivity. Each sampled value lies inside its physical range (the plan checked every
 * distribution's support once), so only what depends on several inputs at once is checked here:
 * effective ≤ total porosity and the engine's own limits. Throws ValidationError (on the case
 * field) when the realisation is physically invalid; runRealisations counts and reports those.
 */
export function realisationModel(plan: UncertaintyPlan, v: RealisationValues): RealisationGeometry {
  const { prepared } = plan;
  let receptors: readonly Receptor[] = prepared.receptors;
  let reach: number | null | undefined;
  let turned: TurnedFrame | null = null;
  const o: { -readonly [K in keyof PhysicalInputs]?: PhysicalInputs[K] } = {};
  if (v.flowDirection !== undefined) {
    // the geometry of the turned flow, as prepareCase derives it: a traced footprint's source
    // plane (centre and width across the new direction), the receptors in the new flow frame, and
    // the scale distance of an estimated dispersivity
    const d = prepared.derived;
    const planeAzimuthDeg = v.flowDirection + (d.planeAzimuthDeg - d.azimuthDeg);
    let sourceEN = prepared.sourceEN;
    if (plan.sourcePlaneFor) {
      const plane = plan.sourcePlaneFor(planeAzimuthDeg);
      sourceEN = plane.sourceEN;
      o.width = plane.width;
    }
    receptors = receptorsInFlowFrame(prepared.receptors, sourceEN, planeAzimuthDeg);
    reach = receptorReach(receptors);
    turned = { sourceEN, planeAzimuthDeg };
  }
  if (v.hydraulicConductivity !== undefined) o.hydraulicConductivity = v.hydraulicConductivity;
  if (v.gradient !== undefined) o.gradient = v.gradient;
  if (v.effectivePorosity !== undefined) o.effectivePorosity = v.effectivePorosity;
  if (v.totalPorosity !== undefined) o.totalPorosity = v.totalPorosity;
  if (v.fractionOrganicCarbon !== undefined) o.fractionOrganicCarbon = v.fractionOrganicCarbon;
  if (v.koc !== undefined) o.sorption = { mode: 'koc', koc: v.koc };
  if (v.kd !== undefined) o.sorption = { mode: 'kd', kd: v.kd };
  if (v.halfLife !== undefined) o.halfLife = v.halfLife;
  if (v.sourceHalfLife !== undefined) o.sourceHalfLife = v.sourceHalfLife;
  if (v.sourceConcentration !== undefined) o.c0 = v.sourceConcentration;
  if (v.sourceWidth !== undefined) o.width = v.sourceWidth;
  if (v.sourceThickness !== undefined) o.thickness = v.sourceThickness;
  if (v.releaseDuration !== undefined) o.duration = v.releaseDuration;
  const model = modelFor(prepared, o, { dispersivityFactor: v.dispersivityFactor, receptorReach: reach, rangesChecked: true });
  return { model, receptors, turned };
}

/**
 * Receptors in the flow frame about `sourceEN` for flow towards `planeAzimuthDeg` (datum plane):
 * the rotation of geo/flowFrame.ts toFlow, its sine and cosine once for all receptors.
 */
function receptorsInFlowFrame(receptors: readonly { en: readonly [number, number]; zTop: number; zBottom: number }[], sourceEN: readonly [number, number], planeAzimuthDeg: number): Receptor[] {
  const [s, c] = sinCosDeg(planeAzimuthDeg);
  const [e0, n0] = sourceEN;
  return receptors.map((r) => {
    const de = r.en[0] - e0;
    const dn = r.en[1] - n0;
    return { x: de * s + dn * c, y: -de * c + dn * s, zTop: r.zTop, zBottom: r.zBottom };
  });
}

/** Per-realisation results of realisations [from, to), receptor-major: index (i − from)·receptors + r. */
export interface RealisationBlock {
  readonly from: number;
  readonly to: number;
  readonly receptors: number;
  /** first time at the limit, d (Infinity: not within the horizon; NaN: realisation refused) */
  readonly arrival: Float64Array;
  /** concentration at the horizon, mg/L (NaN: refused) */
  readonly atHorizon: Float64Array;
  /** peak within the horizon, mg/L (NaN: refused) */
  readonly peak: Float64Array;
  /** with the plan's curve times: concentration (mg/L) at each, index ((i − from)·receptors + r)·times + k (NaN: refused) */
  readonly curves: Float32Array | null;
  /** with the plan's map: per lattice node, how many of the block's mapped realisations exceed the limit there */
  readonly mapCounts: Uint32Array | null;
  /**
   * with the plan's monitoring wells: concentration (mg/L) at each well's times for the block's
   * realisations below the plan's wellRealisations, index ((i − from)·wells + w)·wellSteps + k (NaN: refused)
   */
  readonly wellCurves: Float32Array | null;
  /** realisations of the block mapped (below the plan's map.mapped, not refused) */
  readonly mapped: number;
  /** the engine's message for each refused realisation (at most the first five) */
  readonly refusals: { realisation: number; message: string }[];
  readonly refusedCount: number;
  /** realisations computed in the block (screened or refused); a joined partial run has NaN rows for the rest */
  readonly evaluated: number;
}

/** Screen realisations [from, to) of a planned run. */
export function runRealisations(plan: UncertaintyPlan, from: number, to: number, lhs = designOf(plan)): RealisationBlock {
  const nr = plan.prepared.receptors.length;
  const count = to - from;
  const times = plan.curveTimes ?? undefined;
  const nt = times?.length ?? 0;
  const out = {
    arrival: new Float64Array(count * nr),
    atHorizon: new Float64Array(count * nr),
    peak: new Float64Array(count * nr),
    curves: times ? new Float32Array(count * nr * nt) : undefined,
    times,
  };
  const refusals: RealisationBlock['refusals'] = [];
  let refusedCount = 0;
  const { limit, horizon } = plan.prepared;
  const map = plan.map;
  const mapCounts = map ? new Uint32Array(map.xs.length * map.ys.length) : null;
  const scratch = map ? exceedanceScratch(map) : null;
  let mapped = 0;
  const nw = plan.wells.length * plan.wellSteps;
  const wellCurves = nw && from < plan.wellRealisations ? new Float32Array((Math.min(to, plan.wellRealisations) - from) * nw) : null;
  for (let i = from; i < to; i++) {
    const row = (i - from) * nr;
    try {
      const { model, receptors, turned } = realisationModel(plan, realisationValues(plan, lhs, i));
      screenReceptorsInto(model, receptors, limit, horizon, out, row);
      if (map && mapCounts && scratch && i < map.mapped) {
        countExceedance(map, model, turned, mapCounts, scratch);
        mapped++;
      }
      if (wellCurves && i < plan.wellRealisations) wellCurvesInto(plan, model, turned, wellCurves, (i - from) * nw);
    } catch (e) {
      if (!(e instanceof ValidationError)) throw e;
      refusedCount++;
      if (refusals.length < 5) refusals.push({ realisation: i, message: e.message });
      out.arrival.fill(Number.NaN, row, row + nr);
      out.atHorizon.fill(Number.NaN, row, row + nr);
      out.peak.fill(Number.NaN, row, row + nr);
      out.curves?.fill(Number.NaN, row * nt, (row + nr) * nt);
      if (wellCurves && i < plan.wellRealisations) wellCurves.fill(Number.NaN, (i - from) * nw, (i - from + 1) * nw);
    }
  }
  const { arrival, atHorizon, peak, curves } = out;
  return { from, to, receptors: nr, arrival, atHorizon, peak, curves: curves ?? null, mapCounts, wellCurves, mapped, refusals, refusedCount, evaluated: count };
}

/**
 * One realisation's curve at each planned monitoring well into `out` from `at`: the well where the
 * realisation's flow frame puts it (turned with a sampled flow direction), the case's solution. A
 * well the engine refuses in this realisation alone is NaN there (left out of its band only).
 */
function wellCurvesInto(plan: UncertaintyPlan, model: ScreeningModel, turned: TurnedFrame | null, out: Float32Array, at: number): void {
  const screens = turned ? receptorsInFlowFrame(plan.wells.map((w) => ({ en: w.en, zTop: w.screen.zTop, zBottom: w.screen.zBottom })), turned.sourceEN, turned.planeAzimuthDeg) : plan.wells.map((w) => w.screen);
  const nt = plan.wellSteps;
  plan.wells.forEach((w, j) => {
    const o = at + j * nt;
    try {
      if (w.times[0] === Infinity) out[o] = screenAverage(model, screens[j], Infinity);
      else out.set(breakthroughCurve(model, screens[j], w.times), o);
    } catch (e) {
      if (!(e instanceof ValidationError)) throw e;
      out.fill(Number.NaN, o, o + nt);
    }
  });
}

/**
 * Blocks in any order and split → one block of the whole run in realisation order; realisations
 * not yet computed stay NaN and are left out of the statistics (a partial run's realisations are
 * still draws from the distributions: which strata a realisation uses does not depend on its index).
 */
export function joinBlocks(plan: UncertaintyPlan, blocks: readonly RealisationBlock[], opts: { curves?: boolean } = {}): RealisationBlock {
  const nr = plan.prepared.receptors.length;
  const n = plan.runs;
  const arrival = new Float64Array(n * nr).fill(Number.NaN);
  const atHorizon = new Float64Array(n * nr).fill(Number.NaN);
  const peak = new Float64Array(n * nr).fill(Number.NaN);
  const nt = plan.curveTimes?.length ?? 0;
  // the curves (runs × receptors × times) only when asked: a partial summary does not need them
  const curves = plan.curveTimes && opts.curves !== false ? new Float32Array(n * nr * nt).fill(Number.NaN) : null;
  const mapCounts = plan.map ? new Uint32Array(plan.map.xs.length * plan.map.ys.length) : null;
  const nw = plan.wells.length * plan.wellSteps;
  const wellCurves = nw && opts.curves !== false ? new Float32Array(plan.wellRealisations * nw).fill(Number.NaN) : null;
  let mapped = 0;
  const refusals: RealisationBlock['refusals'] = [];
  let refusedCount = 0;
  let evaluated = 0;
  for (const b of [...blocks].sort((a, b) => a.from - b.from)) {
    if (mapCounts && b.mapCounts) for (let q = 0; q < mapCounts.length; q++) mapCounts[q] += b.mapCounts[q];
    mapped += b.mapped;
    arrival.set(b.arrival, b.from * nr);
    atHorizon.set(b.atHorizon, b.from * nr);
    peak.set(b.peak, b.from * nr);
    if (curves && b.curves) curves.set(b.curves, b.from * nr * nt);
    if (wellCurves && b.wellCurves) wellCurves.set(b.wellCurves, b.from * nw);
    refusals.push(...b.refusals);
    refusedCount += b.refusedCount;
    evaluated += b.evaluated;
  }
  return { from: 0, to: n, receptors: nr, arrival, atHorizon, peak, curves, mapCounts, wellCurves, mapped, refusals: refusals.slice(0, 5), refusedCount, evaluated };
}

export interface Percentiles {
  readonly p5: number | null;
  readonly p50: number | null;
  readonly p95: number | null;
}

export interface Driver {
  readonly input: UncertainInput;
  readonly label: string;
  /** Spearman rank correlation of the input with the receptor's peak concentration within the horizon */
  readonly rankCorrelation: number;
  readonly pExceedLowThird: number;
  readonly pExceedHighThird: number;
  readonly measure: string;
}

export interface ReceptorUncertainty {
  readonly id: string;
  readonly name: string;
  /** realisations screened (runs minus refused) */
  readonly evaluated: number;
  /** P(reaching the limit within the horizon), its Monte Carlo standard error and 95 % Wilson interval */
  readonly pExceed: number;
  readonly pExceedSE: number;
  readonly pExceedInterval: [number, number];
  /** days; null: not within the horizon */
  readonly arrival: Percentiles;
  /** mg/L */
  readonly concentrationAtHorizon: Percentiles;
  readonly peak: Percentiles;
  /** uncertain inputs, the strongest driver (largest |rank correlation|) first */
  readonly drivers: Driver[];
}

export interface UncertaintyResult {
  readonly runs: number;
  readonly seed: number;
  /** realisations done so far (a partial result while a run is going) */
  readonly done: number;
  readonly refusedCount: number;
  readonly refusals: RealisationBlock['refusals'];
  readonly solution: ScreeningModel['solution'];
  readonly inputs: readonly { input: UncertainInput; label: string; unit: string | undefined; distribution: UncertainValue }[];
  /** the head-fit option: the fitted slope's covariance (null: not used) */
  readonly headPlane: PlaneSlopeCovariance | null;
  readonly receptors: ReceptorUncertainty[];
  readonly caution: string;
}

export const UNCERTAINTY_CAUTION =
  'The probabilities are conditional on the chosen distributions and on the model’s assumptions; inputs are sampled independently (correlation between inputs is not represented). They are not a site-specific risk figure.';

/**
 * The caution wherever probabilistic results appear: the screening caution, then what the
 * probabilistic figures are (seeded, how many realisations, with their Monte Carlo standard error,
 * the distributions being the user's assumptions), then UNCERTAINTY_CAUTION.
 */
export function probabilisticCaution(runs: number, seed: number): string {
  return (
    `${SCREENING_CAUTION} The probabilistic figures come from ${runs} Monte Carlo realisations (Latin hypercube, seed ${seed}: the same case, seed and run count give the same figures), ` +
    `each probability with its Monte Carlo standard error; the distributions are the user’s assumptions, not measurements. ${UNCERTAINTY_CAUTION}`
  );
}

const Q = [0.05, 0.5, 0.95];
function pct(values: Float64Array): Percentiles {
  const [p5, p50, p95] = percentiles(values, Q);
  return { p5, p50, p95 };
}

/**
 * Statistics of the realisations done so far (`block` from joinBlocks or runRealisations starting
 * at 0). A realisation not yet done or refused (NaN) is left out; "never arrives" (Infinity) is
 * counted as such.
 */
export function summariseRun(plan: UncertaintyPlan, block: RealisationBlock, lhs = designOf(plan)): UncertaintyResult {
  const nr = block.receptors;
  const n = block.to - block.from;
  const receptors = plan.prepared.receptors.map((rec: PreparedReceptor, j): ReceptorUncertainty => {
    const idx: number[] = [];
    for (let i = 0; i < n; i++) if (!Number.isNaN(block.peak[i * nr + j])) idx.push(i);
    const m = idx.length;
    const arrival = Float64Array.from(idx, (i) => block.arrival[i * nr + j]);
    const atH = Float64Array.from(idx, (i) => block.atHorizon[i * nr + j]);
    const pk = Float64Array.from(idx, (i) => block.peak[i * nr + j]);
    const exceeds = Uint8Array.from(arrival, (t) => (Number.isFinite(t) ? 1 : 0));
    const k = exceeds.reduce((s, e) => s + e, 0);
    const ex = exceedance(k, m);
    const drivers = plan.inputs
      .map((p, col): Driver => {
        const u = Float64Array.from(idx, (i) => lhs.uniform(block.from + i, col));
        const thirds = thirdsExceedance(u, exceeds);
        return {
          input: p.input,
          label: p.definition.label,
          rankCorrelation: m > 2 ? spearman(u, pk) : 0,
          pExceedLowThird: thirds.low.p,
          pExceedHighThird: thirds.high.p,
          measure: p.definition.measure,
        };
      })
      .concat(headPlaneDrivers(plan, lhs, block.from, idx, pk, exceeds))
      .sort((a, b) => Math.abs(b.rankCorrelation) - Math.abs(a.rankCorrelation));
    return {
      id: rec.id,
      name: rec.name,
      evaluated: m,
      pExceed: ex.p,
      pExceedSE: ex.se,
      pExceedInterval: [ex.low, ex.high],
      arrival: pct(arrival),
      concentrationAtHorizon: pct(atH),
      peak: pct(pk),
      drivers,
    };
  });
  return {
    runs: plan.runs,
    seed: plan.seed,
    done: block.evaluated,
    refusedCount: block.refusedCount,
    refusals: block.refusals,
    solution: plan.prepared.model.solution,
    inputs: plan.inputs.map((p) => ({ input: p.input, label: p.definition.label, unit: p.unit, distribution: p.distribution })),
    headPlane: plan.headPlane,
    receptors,
    caution: probabilisticCaution(plan.runs, plan.seed),
  };
}

/** Drivers for the head-fit gradient and direction: rank correlation and thirds by their sampled values. */
function headPlaneDrivers(plan: UncertaintyPlan, lhs: LatinHypercube, from: number, idx: number[], pk: Float64Array, exceeds: Uint8Array): Driver[] {
  if (!plan.headPlane || idx.length < 3) return [];
  const values = idx.map((i) => realisationValues(plan, lhs, from + i));
  return (['gradient', 'flowDirection'] as const).map((input) => {
    const x = Float64Array.from(values, (v) => v[input]!);
    const r = ranks(x);
    const thirds = thirdsExceedance(Float64Array.from(r, (q) => (q - 0.5) / r.length), exceeds);
    return {
      input,
      label: HEAD_FIT_DRIVERS[input].label,
      rankCorrelation: spearman(x, pk),
      pExceedLowThird: thirds.low.p,
      pExceedHighThird: thirds.high.p,
      measure: HEAD_FIT_DRIVERS[input].measure,
    };
  });
}

/** Percentile bands of one receptor's breakthrough curves over the realisations (mg/L at each of `times`). */
export interface BreakthroughBands {
  readonly id: string;
  /** d */
  readonly times: Float64Array;
  readonly p5: Float64Array;
  readonly p25: Float64Array;
  readonly p50: Float64Array;
  readonly p75: Float64Array;
  readonly p95: Float64Array;
  /** realisations the bands are taken over (done and not refused) */
  readonly realisations: number;
}

const BAND_QUANTILES = [0.05, 0.25, 0.5, 0.75, 0.95];

/**
 * The 5th, 25th, 50th, 75th and 95th percentiles of each receptor's concentration at each of the
 * plan's curve times, over the realisations done and not refused (percentiles as summariseRun's;
 * statistics.ts). Null when the run has no curves.
 */
export function breakthroughBands(plan: UncertaintyPlan, block: RealisationBlock): BreakthroughBands[] | null {
  const times = plan.curveTimes;
  const curves = block.curves;
  if (!times || !curves) return null;
  const nr = block.receptors;
  return plan.prepared.receptors.map((rec, j) => ({ id: rec.id, ...bandsOf(curves, block.to - block.from, nr, j, times, (i) => !Number.isNaN(block.peak[i * nr + j])) }));
}

/** A Monte Carlo band at a monitoring well (times on its chart's axis; one Infinity: the steady state). */
export interface WellBands extends BreakthroughBands {
  /** the well's position, screen and the release date it was computed for (monitoringWellKey) */
  readonly key: string;
}

/**
 * The same percentiles at each planned monitoring well over its chart's times (the `wells` option),
 * over the realisations done (of the first WELL_BAND_REALISATIONS) where the well was evaluated.
 * Null when the run has no well curves.
 */
export function monitoringWellBands(plan: UncertaintyPlan, block: RealisationBlock): WellBands[] | null {
  const curves = block.wellCurves;
  if (!curves || plan.wells.length === 0) return null;
  const nw = plan.wells.length;
  const nt = plan.wellSteps;
  const n = Math.max(0, Math.min(block.to, plan.wellRealisations) - block.from);
  return plan.wells.map((w, j) => ({ id: w.id, key: w.key, ...bandsOf(curves, n, nw, j, w.times, (i) => !Number.isNaN(curves[(i * nw + j) * nt])) }));
}

/** Percentiles of series j of `curves` (index (i·series + j)·times + k) at each time, over the realisations i < n that `kept` accepts. */
function bandsOf(curves: Float32Array, n: number, series: number, j: number, times: Float64Array, kept: (i: number) => boolean): Omit<BreakthroughBands, 'id'> {
  const nt = times.length;
  const rows: number[] = [];
  for (let i = 0; i < n; i++) if (kept(i)) rows.push(i);
  const q = BAND_QUANTILES.map(() => new Float64Array(nt));
  const values = new Float64Array(rows.length);
  for (let k = 0; k < nt; k++) {
    rows.forEach((i, m) => (values[m] = curves[(i * series + j) * nt + k]));
    percentiles(values, BAND_QUANTILES).forEach((v, b) => (q[b][k] = v ?? 0));
  }
  return { times, p5: q[0], p25: q[1], p50: q[2], p75: q[3], p95: q[4], realisations: rows.length };
}

/** Contours of P(C > limit) on the map from a run's mapped realisations (null: not mapped, or none done). */
export function exceedanceMapOf(plan: UncertaintyPlan, block: RealisationBlock): ExceedanceContours | null {
  if (!plan.map || !block.mapCounts) return null;
  return exceedanceContours(plan.map, block.mapCounts, block.mapped, plan.prepared.toMap);
}

/** A whole run in this thread: plan, screen every realisation, summarise. */
export function runUncertainty(c: Case, opts: RunOptions = {}): UncertaintyResult {
  const plan = planUncertainty(c, opts);
  const lhs = designOf(plan);
  return summariseRun(plan, runRealisations(plan, 0, plan.runs, lhs), lhs);
}

/**
 * A distribution for an input from an estimate and its standard error, both in `unit` (a value
 * fitted to site data, for example: src/case/fit.ts gives its fitted values with intervals). The
 * flow direction (degrees) as a normal distribution (mean, sd = the standard error); every other
 * input is positive, so a lognormal with the estimate as median and ln(gsd) = SE/estimate, the
 * first-order standard error of the logarithm (delta method). Refused with a message naming the
 * input when the estimate or its error cannot make a distribution. `planInput` checks the result
 * against the input's physical range like any other (a wide error on a porosity may need truncating).
 */
export function distributionFromEstimate(input: UncertainInput, estimate: number, standardError: number, unit?: string, note?: string): UncertainValue {
  const label = INPUT_DEFINITIONS[input].label;
  const field = `uncertainty.inputs.${input}`;
  if (!Number.isFinite(standardError) || !(standardError > 0))
    throw new ValidationError(field, standardError, 'a standard error > 0', `${label}: the standard error must be a number above 0 (got ${standardError})`);
  const extra = { ...(unit ? { unit } : {}), ...(note ? { note } : {}) };
  if (input === 'flowDirection') {
    if (!Number.isFinite(estimate)) throw new ValidationError(field, estimate, 'a direction in degrees', `${label}: the estimate must be a number of degrees`);
    return { kind: 'normal', mean: estimate, sd: standardError, ...extra };
  }
  if (!Number.isFinite(estimate) || !(estimate > 0)) throw new ValidationError(field, estimate, 'an estimate > 0', `${label}: the estimate must be above 0 (got ${estimate})`);
  return { kind: 'lognormal', median: estimate, gsd: Math.exp(standardError / estimate), ...extra };
}

/** A screen label inside a sentence: its first letter lower-case unless it starts an abbreviation ("Koc …"). */
export const inSentence = (label: string): string => (/^[A-Z][^A-Z]/.test(label) ? label.charAt(0).toLowerCase() + label.slice(1) : label);

/** "if hydraulic conductivity K is in its low third, 3 %; in its high third, 61 %" */
export function driverSentence(d: Driver): string {
  const pc = (p: number) => `${(100 * p).toFixed(p < 0.1 && p > 0 ? 1 : 0)} %`;
  return `if ${inSentence(d.label)} is in its low third, ${pc(d.pExceedLowThird)}; in its high third, ${pc(d.pExceedHighThird)}`;
}

/** A distribution in words, with its unit: "lognormal, median 12 m/d, geometric SD 3". */
export function describeDistribution(d: UncertainValue, unit: string | undefined, input?: UncertainInput): string {
  const u = unit ? ` ${unitDef(unit).label}` : input === 'flowDirection' ? '° from north' : '';
  let s: string;
  switch (d.kind) {
    case 'uniform':
      s = `uniform from ${d.low} to ${d.high}${u}`;
      break;
    case 'log-uniform':
      s = `log-uniform from ${d.low} to ${d.high}${u}`;
      break;
    case 'triangular':
      s = `triangular from ${d.low} to ${d.high}${u}, most likely ${d.mode}`;
      break;
    case 'normal':
      s = `normal, mean ${d.mean}${u}, standard deviation ${d.sd}${input === 'flowDirection' ? '°' : u}`;
      break;
    case 'lognormal':
      s = `lognormal, median ${d.median}${u}, geometric standard deviation ${d.gsd}`;
      break;
    case 'lognormal-range':
      s = `lognormal with ${d.percentile}th–${100 - d.percentile}th percentiles ${d.low} to ${d.high}${u}`;
      break;
  }
  const t = d.truncate;
  if (t && (t.low != null || t.high != null)) s += `, truncated to [${t.low ?? '−∞'}, ${t.high ?? '∞'}]`;
  return s;
}
