/**
 * Case → engine inputs. Converts every quantity to internal SI units (m, d, mg/L; src/core/units.ts),
 * derives the transport parameters from the field values with the core's textbook relations,
 * places the source plane and the receptors in the flow-aligned frame (src/geo), and checks every
 * value, throwing the core's ValidationError with the case's own field path
 * (e.g. 'aquifer.effectivePorosity', 'site.receptors[2].screenTop') and the accepted range.
 *
 * Derivations (formulas in src/core/hydro.ts, with their sources there):
 *   v  = K·i/nₑ                    seepage velocity (not divided by R)
 *   Kd = Koc·foc  (or Kd given)     ρb given, or 2.65 (1 − n) g/cm³ (quartz grains; common practice)
 *   R  = 1 + ρb·Kd/n                n = total porosity
 *   λ  = ln 2 / t½                  source decline γ = ln 2 / (source half-life)
 *   αL given, or from the distance to the farthest receptor by the chosen scale relation;
 *   αT = αL·(transverse ratio), αV = αL·(vertical ratio)
 *   De = D0·τ when diffusion is included, else 0
 * Flow: azimuth and gradient as given, or a plane fitted to three or more head readings.
 */
import type { Case, Position, ReceptorKind } from './schema';
import { unitDef } from '../core/units';
import type { ScreeningModel } from '../core/model';
import {
  ValidationError,
  bulkDensityFromPorosity,
  decayRateFromHalfLife,
  effectiveDiffusion,
  fitHeadPlane,
  kdFromKoc,
  longitudinalDispersivity,
  modelWarnings,
  retardationFactor,
  seepageVelocity,
  transverseDispersivities,
  validateModel,
  type Warning,
} from '../core';
import { makeLocalFrame, type LocalFrame } from '../geo/projection';
import { fromFlow, toFlow } from '../geo/flowFrame';
import { footprintSourcePlane } from '../geo/footprint';
import { normalizeDeg } from '../geo/angles';
import { FIELD_RANGES, contaminantPreset, provenanceLabel } from './presets';

export interface PreparedReceptor {
  readonly id: string;
  readonly name: string;
  readonly kind: ReceptorKind;
  /** flow frame: downgradient from the source plane, m */
  readonly x: number;
  /** flow frame: across the flow, positive to the left looking downgradient, m */
  readonly y: number;
  /** screen top and bottom, depth below the water table, m */
  readonly zTop: number;
  readonly zBottom: number;
  /** local east/north metres from the site datum */
  readonly en: [number, number];
  /** horizontal distance from the centre of the source plane, m */
  readonly distance: number;
  readonly pumping: boolean;
}

export interface HeadFit {
  readonly residuals: number[];
  readonly readingIds: string[];
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

export interface Derived {
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
  readonly gradient: number;
  /** flow direction, degrees clockwise from true north at the source */
  readonly azimuthDeg: number;
  /** the same direction in the site datum's east/north plane (differs by the meridian convergence) */
  readonly planeAzimuthDeg: number;
  readonly width: number;
  readonly widthFromFootprint: boolean;
  readonly headFit: HeadFit | null;
  readonly dispersivityRelation: DispersivityDerivation;
}

export interface PreparedCase {
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

// ---------------------------------------------------------------------------------------------
// checked conversions

type Q = { value: number; unit: string };

function quantityIn(field: string, q: Q, check: (v: number) => boolean, range: string): number {
  if (!q || typeof q.value !== 'number' || !Number.isFinite(q.value)) throw new ValidationError(field, q?.value, range);
  let def;
  try {
    def = unitDef(q.unit);
  } catch {
    throw new ValidationError(`${field}.unit`, q.unit, 'a known unit');
  }
  const v = q.value * def.factor;
  // every range given here is either unit-free (> 0, ≥ 0) or states its own unit
  if (!check(v)) throw new ValidationError(field, q.value, range);
  return v;
}

const positive = (v: number) => Number.isFinite(v) && v > 0;
const nonNegative = (v: number) => Number.isFinite(v) && v >= 0;

function fraction(field: string, v: number, lo: number, hi: number, loOpen: boolean, hiOpen: boolean): number {
  const ok = typeof v === 'number' && Number.isFinite(v) && (loOpen ? v > lo : v >= lo) && (hiOpen ? v < hi : v <= hi);
  if (!ok) throw new ValidationError(field, v, `in ${loOpen ? '(' : '['}${lo}, ${hi}${hiOpen ? ')' : ']'}`);
  return v;
}

/** The reason of an error, without a core ValidationError's own "field = value is not accepted:" head. */
function detailOf(e: unknown): string {
  if (e instanceof ValidationError) return e.message.replace(/^[\s\S]*? is not accepted: /, '');
  return e instanceof Error ? e.message : String(e);
}

/** Run a geo/core step; any error it throws becomes a ValidationError on the case field. */
function at<T>(field: string, value: unknown, range: string, f: () => T): T {
  try {
    return f();
  } catch (e) {
    throw new ValidationError(field, value, range, detailOf(e));
  }
}

// ---------------------------------------------------------------------------------------------

export function prepareCase(c: Case): PreparedCase {
  const warnings: Warning[] = [];
  const site = c.site;
  const frame = at('site.datum', site.datum, site.frame === 'geographic' ? '[longitude, latitude] in degrees' : '[east, north] metres', () =>
    makeLocalFrame(site.frame, site.datum),
  );
  const posRange = site.frame === 'geographic' ? 'a [longitude, latitude] pair in degrees within 1000 km of the datum' : 'a pair of finite [east, north] metres';
  const toEN = (field: string, p: Position) => at(field, p, posRange, () => frame.toEN(p));

  // flow
  let gradient: number;
  /** true azimuth at the source (what the user reads and enters) */
  let azimuthDeg: number;
  /** the same direction in the datum's tangent plane: true azimuth + meridian convergence γ */
  let planeAzimuthDeg: number;
  let headFit: HeadFit | null = null;
  const convergence = at('site.source.position', site.source.position, posRange, () => frame.convergenceDeg(site.source.position));
  if (site.flow.method === 'direction') {
    if (!Number.isFinite(site.flow.azimuthDeg)) throw new ValidationError('site.flow.azimuthDeg', site.flow.azimuthDeg, 'degrees clockwise from north');
    azimuthDeg = normalizeDeg(site.flow.azimuthDeg);
    planeAzimuthDeg = normalizeDeg(azimuthDeg + convergence);
    gradient = fraction('site.flow.gradient', site.flow.gradient, 0, 1, true, true);
  } else {
    const readings = site.flow.readings;
    if (readings.length < 3) throw new ValidationError('site.flow.readings', readings.length, 'at least 3 head readings (not all on one line)');
    const points = readings.map((r, i) => {
      const [x, y] = toEN(`site.flow.readings[${i}].position`, r.position);
      const head = quantityIn(`site.flow.readings[${i}].head`, r.head, Number.isFinite, 'a finite head');
      return { x, y, head };
    });
    const fit = at('site.flow.readings', readings.length, 'at least 3 head readings not all on one line, with heads that differ', () => fitHeadPlane(points));
    gradient = fit.gradient;
    planeAzimuthDeg = normalizeDeg(fit.azimuthDeg);
    azimuthDeg = normalizeDeg(planeAzimuthDeg - convergence);
    if (!(gradient > 0 && gradient < 1))
      throw new ValidationError('site.flow.readings', gradient, 'readings whose fitted gradient lies in (0, 1)', `the head readings give a gradient of ${gradient}; it must lie in (0, 1) (are the heads all equal, or in the wrong unit?)`);
    headFit = { residuals: [...fit.residuals], readingIds: readings.map((r) => r.id) };
    for (const w of fit.warnings) warnings.push({ ...w, field: w.field ?? 'site.flow.readings' });
  }

  // source plane
  let sourceEN: [number, number];
  let width: number;
  const widthFromFootprint = !!site.source.footprint;
  if (site.source.footprint) {
    const fp = site.source.footprint.map((p, i) => toEN(`site.source.footprint[${i}]`, p));
    const plane = at('site.source.footprint', site.source.footprint.length, 'a simple polygon of at least 3 vertices with non-zero area', () =>
      footprintSourcePlane(fp, planeAzimuthDeg),
    );
    sourceEN = plane.centreEN;
    width = plane.width;
    if (!(width > 0)) throw new ValidationError('site.source.footprint', width, 'a footprint with non-zero width across the flow');
  } else {
    sourceEN = toEN('site.source.position', site.source.position);
    width = quantityIn('site.source.width', site.source.width, positive, 'a length > 0');
  }

  // aquifer
  const a = c.aquifer;
  const K = quantityIn('aquifer.hydraulicConductivity', a.hydraulicConductivity, positive, 'a conductivity > 0');
  const n = fraction('aquifer.totalPorosity', a.totalPorosity, 0, 1, true, true);
  const ne = fraction('aquifer.effectivePorosity', a.effectivePorosity, 0, 1, true, true);
  if (ne > n) throw new ValidationError('aquifer.effectivePorosity', ne, `≤ the total porosity (${n})`);
  const foc = fraction('aquifer.fractionOrganicCarbon', a.fractionOrganicCarbon, 0, 1, false, false);
  const bulkDensityEstimated = a.bulkDensity === null;
  const rhoB = a.bulkDensity === null ? bulkDensityFromPorosity(n) : quantityIn('aquifer.bulkDensity', a.bulkDensity, (v) => v > 0 && v <= 3, 'a density in (0, 3] g/cm³');

  const s = c.contaminant.sorption;
  const kd =
    s.mode === 'koc'
      ? kdFromKoc(quantityIn('contaminant.sorption.koc', s.koc, nonNegative, 'a partition coefficient ≥ 0 L/kg'), foc)
      : quantityIn('contaminant.sorption.kd', s.kd, nonNegative, 'a partition coefficient ≥ 0 L/kg');
  const R = retardationFactor(rhoB, kd, n);
  const v = seepageVelocity(K, gradient, ne);

  const halfLife = c.contaminant.halfLife === null ? null : quantityIn('contaminant.halfLife', c.contaminant.halfLife, positive, 'a time > 0 (or none for no decay)');
  const decay = decayRateFromHalfLife(halfLife);

  // source term
  const c0 = quantityIn('source.concentration', c.source.concentration, positive, 'a concentration > 0');
  const thickness = quantityIn('source.thickness', c.source.thickness, positive, 'a length > 0');
  const duration = c.source.duration === null ? Infinity : quantityIn('source.duration', c.source.duration, positive, 'a time > 0 (or none for a continuous release)');
  const sourceHalfLife = c.source.sourceHalfLife === null ? null : quantityIn('source.sourceHalfLife', c.source.sourceHalfLife, positive, 'a time > 0 (or none for a constant source)');
  const sourceDecay = decayRateFromHalfLife(sourceHalfLife);

  // evaluation
  const e = c.evaluation;
  const limit = quantityIn('contaminant.limit', c.contaminant.limit, positive, 'a concentration > 0');
  const horizon = quantityIn('evaluation.horizon', e.horizon, positive, 'a time > 0');
  const viewTime = e.viewTime === null ? Infinity : quantityIn('evaluation.viewTime', e.viewTime, (t) => t > 0 && t <= horizon, `a time in (0, horizon = ${horizon} d]`);
  const depth = quantityIn('evaluation.depth', e.depth, nonNegative, 'a depth ≥ 0 below the water table');

  // receptors
  const receptors: PreparedReceptor[] = site.receptors.map((r, i) => {
    const f = `site.receptors[${i}]`;
    const en = toEN(`${f}.position`, r.position);
    const { x, y } = toFlow(sourceEN, planeAzimuthDeg, en);
    const zTop = quantityIn(`${f}.screenTop`, r.screenTop, nonNegative, 'a depth ≥ 0 below the water table');
    const zBottom = quantityIn(`${f}.screenBottom`, r.screenBottom, (z) => Number.isFinite(z) && z >= zTop, `a depth ≥ the screen top (${zTop} m)`);
    if (r.pumping)
      warnings.push({
        code: 'pumping-not-represented',
        message: `${r.name || r.id} is marked as pumping, but pumping is not represented: its capture would draw the plume towards it, so arrival may be earlier and concentrations higher than shown.`,
        field: `${f}.pumping`,
      });
    return { id: r.id, name: r.name, kind: r.kind, x, y, zTop, zBottom, en, distance: Math.hypot(en[0] - sourceEN[0], en[1] - sourceEN[1]), pumping: r.pumping };
  });

  // dispersivity
  let ax: number, ay: number, az: number;
  let dispersivityRelation: DispersivityDerivation;
  const disp = a.dispersivity;
  if (disp.mode === 'given') {
    ax = quantityIn('aquifer.dispersivity.longitudinal', disp.longitudinal, positive, 'a length > 0');
    ay = quantityIn('aquifer.dispersivity.transverse', disp.transverse, positive, 'a length > 0');
    az = quantityIn('aquifer.dispersivity.vertical', disp.vertical, positive, 'a length > 0');
    dispersivityRelation = { mode: 'given', relation: null, citation: null, scaleDistance: null, transverseRatio: null, verticalRatio: null };
  } else {
    const downgradient = receptors.filter((r) => r.x > 0).map((r) => r.x);
    let L: number;
    if (downgradient.length) L = Math.max(...downgradient);
    else {
      // no receptor downgradient: scale from the retarded advective travel distance over the horizon
      L = Math.max((v / R) * horizon, 1);
      warnings.push({
        code: 'dispersivity-scale-from-travel',
        message: `No receptor lies downgradient, so dispersivity was scaled from the advective travel distance over the horizon (${L.toPrecision(3)} m).`,
        field: 'aquifer.dispersivity',
      });
    }
    const est = longitudinalDispersivity(L, disp.relation);
    ax = est.value;
    ({ ay, az } = transverseDispersivities(ax, fraction('aquifer.dispersivity.transverseRatio', disp.transverseRatio, 0, 1, true, false), fraction('aquifer.dispersivity.verticalRatio', disp.verticalRatio, 0, 1, true, false)));
    dispersivityRelation = {
      mode: 'estimate',
      relation: est.relation,
      citation: est.citation,
      scaleDistance: L,
      transverseRatio: disp.transverseRatio,
      verticalRatio: disp.verticalRatio,
    };
  }

  let diffusion = 0;
  if (a.diffusion.include) {
    const d0 = quantityIn('aquifer.diffusion.freeWater', a.diffusion.freeWater, nonNegative, 'a diffusion coefficient ≥ 0');
    const tau = fraction('aquifer.diffusion.tortuosity', a.diffusion.tortuosity, 0, 1, true, false);
    diffusion = effectiveDiffusion(d0, tau);
  }

  const model: ScreeningModel = {
    v,
    ax,
    ay,
    az,
    diffusion,
    R,
    decay,
    decayPhase: c.contaminant.decayPhase,
    width,
    thickness,
    c0,
    sourceDecay,
    duration,
    solution: e.solution,
  };
  try {
    validateModel(model); // its warnings come again with modelWarnings below

  } catch (err) {
    if (!(err instanceof ValidationError)) throw err;
    if (err.field === 'sourceDecay' && c.source.sourceHalfLife) {
      // the engine states its bound as a decline rate; say it as the half-life the user entered
      const vr = v / R;
      const Dx = (ax * v + diffusion) / R;
      const lamBase = c.contaminant.decayPhase === 'dissolved-only' ? decay / R : decay;
      const shortest = Math.LN2 / (lamBase + (vr * vr) / (4 * Dx));
      throw new ValidationError(
        'source.sourceHalfLife',
        c.source.sourceHalfLife.value,
        `longer than ${shortest.toPrecision(3)} d`,
        `with this velocity and dispersion the solutions cannot represent a source halving faster than every ${shortest.toPrecision(3)} d (decline rate must stay below λ + v²/(4·Dx), retarded); lengthen the source half-life`,
      );
    }
    throw new ValidationError(caseFieldOf(err.field) ?? err.field, err.value, err.range, detailOf(err));
  }
  warnings.push(...fieldRangeWarnings(c, K), ...presetWarnings(c));
  warnings.push(
    ...modelWarnings(
      model,
      receptors.map((r) => ({ label: r.name || r.id, x: r.x, y: r.y, zTop: r.zTop, zBottom: r.zBottom })),
      limit,
      horizon,
    ).map((w) => ({ ...w, field: caseFieldOf(w.field) })),
  );

  const toMap = (x: number, y: number): Position => frame.fromEN(fromFlow(sourceEN, planeAzimuthDeg, { x, y }));
  const fromMap = (p: Position) => toFlow(sourceEN, planeAzimuthDeg, frame.toEN(p));

  return {
    model,
    receptors,
    derived: {
      v,
      K,
      R,
      kd,
      bulkDensity: rhoB,
      bulkDensityEstimated,
      ax,
      ay,
      az,
      decay,
      sourceDecay,
      diffusion,
      gradient,
      azimuthDeg,
      planeAzimuthDeg,
      width,
      widthFromFootprint,
      headFit,
      dispersivityRelation,
    },
    limit,
    horizon,
    viewTime,
    depth,
    sourceEN,
    frame,
    toMap,
    fromMap,
    warnings,
  };
}

/** Engine field names → the case field a user edits. */
const MODEL_TO_CASE: Record<string, string> = {
  v: 'aquifer.hydraulicConductivity',
  ax: 'aquifer.dispersivity',
  ay: 'aquifer.dispersivity',
  az: 'aquifer.dispersivity',
  diffusion: 'aquifer.diffusion',
  R: 'contaminant.sorption',
  decay: 'contaminant.halfLife',
  width: 'site.source.width',
  thickness: 'source.thickness',
  c0: 'source.concentration',
  sourceDecay: 'source.sourceHalfLife',
  duration: 'source.duration',
  limit: 'contaminant.limit',
  horizon: 'evaluation.horizon',
};

function caseFieldOf(field: string | undefined): string | undefined {
  if (field === undefined) return undefined;
  const rec = /^receptors?\[(\d+)\](.*)$/.exec(field);
  if (rec) return `site.receptors[${rec[1]}]${rec[2]}`;
  return MODEL_TO_CASE[field] ?? field;
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
function fieldRangeWarnings(c: Case, K: number): Warning[] {
  const values: Record<string, number> = {
    'aquifer.hydraulicConductivity': K,
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
      message: `${r.field} = ${v} ${r.unit} is outside the usual range ${r.min} – ${r.max} ${r.unit} (${r.source}${caveat ? '; ' + caveat : ''}). Check the value and its unit.`,
      field: r.field,
    });
  }
  return out;
}
