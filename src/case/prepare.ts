/**
 * Case → engine inputs: the one seam between the case file and the engine. Converts every
 * quantity to internal SI units (m, d, mg/L; src/core/units.ts), places the source plane and the
 * receptors in the flow-aligned frame (geometry.ts), derives the transport parameters from the
 * field values (physics.ts), and checks every value, throwing the core's ValidationError with the
 * case's own field path (e.g. 'aquifer.effectivePorosity', 'site.receptors[2].screenTop') and the
 * accepted range (checked.ts). To re-evaluate a prepared case with other physical inputs without
 * redoing the geometry, use physics.ts `modelFor(prepared, overrides)`. See src/case/README.md.
 */
import type { Case, Position } from './schema';
import { modelWarnings, type ScreeningModel, type Warning } from '../core';
import type { LocalFrame } from '../geo/projection';
import { fromFlow, toFlow } from '../geo/flowFrame';
import { FIELD_RANGES, contaminantPreset, provenanceLabel } from './presets';
import { readQuantity, ruleFor, caseFieldOf, inWordsOf } from './checked';
import { bounds, fieldLabel, writtenNumber, POSITIVE } from './fields';
import { roundSig } from './numbers';
import { prepareFlow, prepareFrame, prepareReceptors, prepareSourcePlane, receptorReach, type Flow, type HeadFit, type PreparedReceptor, type SourcePlane } from './geometry';
import { derivePhysics, readPhysicalInputs, validateAtCase, type DerivedPhysics, type PhysicalInputs, type PhysicsBasis } from './physics';

export type { HeadFit, PreparedReceptor } from './geometry';
export type { DispersivityDerivation, PhysicalInputs } from './physics';
export { modelFor } from './physics';

export interface Derived extends DerivedPhysics {
  readonly gradient: number;
  /** flow direction, degrees clockwise from true north at the source */
  readonly azimuthDeg: number;
  /** the same direction in the site datum's east/north plane (differs by the meridian convergence) */
  readonly planeAzimuthDeg: number;
  readonly width: number;
  readonly widthFromFootprint: boolean;
  readonly headFit: HeadFit | null;
}

export interface PreparedCase extends PhysicsBasis {
  readonly model: ScreeningModel;
  readonly receptors: PreparedReceptor[];
  readonly derived: Derived;
  /** concentration limit, mg/L */
  readonly limit: number;
  /** evaluation horizon, d */
  readonly horizon: number;
  /** time shown on the map, d (Infinity: steady state) */
  readonly viewTime: number;
  /** depth below the water table of the map slice, m */
  readonly depth: number;
  /** centre of the source plane, local east/north metres */
  readonly sourceEN: [number, number];
  readonly frame: LocalFrame;
  /** flow frame (x, y) → map position */
  toMap(x: number, y: number): Position;
  /** map position → flow frame */
  fromMap(p: Position): { x: number; y: number };
  readonly warnings: Warning[];
}

/** The evaluation settings: limit, horizon, the map's time and depth (internal units). */
export function prepareEvaluation(c: Case): { limit: number; horizon: number; viewTime: number; depth: number } {
  const e = c.evaluation;
  const limit = readQuantity(c.contaminant.limit, ruleFor('contaminant.limit'));
  const horizon = readQuantity(e.horizon, ruleFor('evaluation.horizon'));
  // the map's time lies within the horizon
  const viewTime = e.viewTime === null ? Infinity : readQuantity(e.viewTime, ruleFor('evaluation.viewTime', bounds(POSITIVE.min, true, horizon, false)));
  const depth = readQuantity(e.depth, ruleFor('evaluation.depth'));
  return { limit, horizon, viewTime, depth };
}

/** The case prepared for the engine; a refusal names the case field in the screen's words (checked.ts `inCaseWords`). */
export function prepareCase(c: Case): PreparedCase {
  return inWordsOf(c, () => prepareChecked(c));
}

function prepareChecked(c: Case): PreparedCase {
  const sf = prepareFrame(c);
  const flow = prepareFlow(c, sf);
  const plane = prepareSourcePlane(c, sf, flow.planeAzimuthDeg);
  const inputs = readPhysicalInputs(c, flow.gradient, plane.width);
  const { limit, horizon, viewTime, depth } = prepareEvaluation(c);
  const placed = prepareReceptors(c, sf, plane.sourceEN, flow.planeAzimuthDeg);
  const receptors = placed.receptors;
  const reach = receptorReach(receptors);
  const physics = derivePhysics(inputs, reach, horizon, c.evaluation.solution);
  const model = physics.model;
  validateAtCase(model, c.source.sourceHalfLife ? c.source.sourceHalfLife.value : null);

  const warnings: Warning[] = [...flow.warnings, ...placed.warnings, ...physics.warnings];
  warnings.push(...fieldRangeWarnings(c, inputs), ...presetWarnings(c));
  warnings.push(
    ...modelWarnings(
      model,
      receptors.map((r) => ({ label: r.name || r.id, x: r.x, y: r.y, zTop: r.zTop, zBottom: r.zBottom })),
      limit,
      horizon,
    ).map((w) => ({ ...w, field: caseFieldOf(w.field) })),
  );

  const { frame } = sf;
  const { sourceEN } = plane;
  const az = flow.planeAzimuthDeg;
  return {
    model,
    inputs,
    receptorReach: reach,
    receptors,
    derived: derivedRecord(physics.derived, flow, plane),
    limit,
    horizon,
    viewTime,
    depth,
    sourceEN,
    frame,
    toMap: (x, y) => frame.fromEN(fromFlow(sourceEN, az, { x, y })),
    fromMap: (p) => toFlow(sourceEN, az, frame.toEN(p)),
    warnings,
  };
}

/** The derived parameters, keys in the order the command line's JSON has always printed them. */
function derivedRecord(d: DerivedPhysics, flow: Flow, plane: SourcePlane): Derived {
  return {
    v: d.v,
    K: d.K,
    R: d.R,
    kd: d.kd,
    bulkDensity: d.bulkDensity,
    bulkDensityEstimated: d.bulkDensityEstimated,
    ax: d.ax,
    ay: d.ay,
    az: d.az,
    decay: d.decay,
    sourceDecay: d.sourceDecay,
    diffusion: d.diffusion,
    gradient: flow.gradient,
    azimuthDeg: flow.azimuthDeg,
    planeAzimuthDeg: flow.planeAzimuthDeg,
    width: plane.width,
    widthFromFootprint: plane.widthFromFootprint,
    headFit: flow.headFit,
    dispersivityRelation: d.dispersivityRelation,
  };
}

/** A sorption value taken unchanged from a preset whose figure is recalled must say so. */
function presetWarnings(c: Case): Warning[] {
  const preset = c.contaminant.presetId ? contaminantPreset(c.contaminant.presetId) : undefined;
  if (!preset) return [];
  const s = c.contaminant.sorption;
  const used = s.mode === 'koc' ? preset.koc : preset.kd;
  const q = s.mode === 'koc' ? s.koc : s.kd;
  if (!used || used.provenance === 'seen' || q.unit !== 'L/kg' || q.value !== used.value) return [];
  const name = s.mode === 'koc' ? 'Koc' : 'Kd';
  return [
    {
      code: 'preset-value-unverified',
      message: `${name} = ${used.value} L/kg for ${preset.name} is ${provenanceLabel(used)} (${used.source}); replace it with a checked or site value before relying on the result.`,
      field: `contaminant.sorption.${s.mode}`,
    },
  ];
}

/** Values accepted but outside the usual published field ranges (presets.ts FIELD_RANGES). */
function fieldRangeWarnings(c: Case, inputs: PhysicalInputs): Warning[] {
  const values: Record<string, number> = {
    'aquifer.hydraulicConductivity': inputs.hydraulicConductivity,
    'aquifer.totalPorosity': c.aquifer.totalPorosity,
    'aquifer.fractionOrganicCarbon': c.aquifer.fractionOrganicCarbon,
  };
  const out: Warning[] = [];
  for (const r of FIELD_RANGES) {
    const v = values[r.field];
    if (v === undefined || (v >= r.min && v <= r.max)) continue;
    const caveat = provenanceLabel(r);
    out.push({
      code: 'outside-usual-range',
      message: `${fieldLabel(r.field)} ${writtenNumber(roundSig(v, 4))} ${r.unit} is outside the usual range ${r.min} – ${r.max} ${r.unit} (${r.source}${caveat ? '; ' + caveat : ''}). Check the value and its unit.`,
      field: r.field,
    });
  }
  return out;
}
