/**
 * Pumping wells and straight boundaries of a case → the engine's steady well field (src/core/flow),
 * in the flow-aligned frame of the prepared case (x downgradient from the source plane, y to the
 * left looking downgradient). Regional Darcy flux q = K·i from the case; the saturated thickness B
 * (aquifer.saturatedThickness, version 3) is the thickness over which a well draws (confined, or
 * unconfined with B taken constant: the drawdown must stay small against B). A pumping receptor
 * with a rate becomes an extraction well of radius DEFAULT_WELL_RADIUS (0.1 m). Each boundary
 * line is oriented so the source lies on the aquifer side.
 *
 * Per pumping well: whether the source lies in its capture zone (the water at the source centre
 * traced forward ends in the well), the share of the source width whose water it draws (11 points
 * across the plane), and the travel time from the source: the water's, and the contaminant's
 * (× R, advection only; dispersion brings the first traces earlier).
 */
import type { Case, Position } from './schema';
import type { PreparedCase } from './prepare';
import {
  ValidationError,
  captureZone,
  captureZoneSingleWell,
  confinedHead,
  dewatered,
  unconfinedHead,
  flowWarnings,
  prepareFlow,
  sourceCapture,
  DEFAULT_WELL_RADIUS,
  type FlowBoundary,
  type FlowField,
  type Warning,
} from '../core';
import { CaseFieldError, atCaseField, detailOf, readQuantity, ruleFor } from './checked';
import { resultText } from './unitSystem';

export const SATURATED_THICKNESS_RULE = ruleFor('aquifer.saturatedThickness');
export const SATURATED_THICKNESS_HELP =
  'Saturated thickness B: from the water table (or the top of a confined aquifer) down to the base of the water-bearing layer. A pumping well draws over this thickness, so it sets the reach of its capture zone (width far upgradient Q/(K·i·B)). Needed to model pumping wells; taken as constant (a confined aquifer, or an unconfined one whose drawdown is small against B).';

export interface CaseBoundary {
  readonly id: string;
  readonly name: string;
  readonly kind: 'constant-head' | 'no-flow';
  /** the line in the flow frame, oriented with the aquifer (and the source) on its left */
  readonly line: FlowBoundary;
}

export interface CaseWells {
  /** null: nothing to model (no pumping well with a rate, no boundary) or no saturated thickness */
  readonly field: FlowField | null;
  /** saturated thickness B (m), or null when not given */
  readonly thickness: number | null;
  /** receptor index of each well of the field */
  readonly receptorOf: number[];
  readonly boundaries: CaseBoundary[];
  readonly warnings: Warning[];
}

export function readSaturatedThickness(c: Case): number | null {
  const q = c.aquifer.saturatedThickness;
  return q == null ? null : readQuantity(q, SATURATED_THICKNESS_RULE);
}

export function prepareCaseWells(c: Case, p: PreparedCase): CaseWells {
  const thickness = readSaturatedThickness(c);
  const warnings: Warning[] = [];
  const receptorOf: number[] = [];
  const wells = c.site.receptors.flatMap((r, i) => {
    if (!r.pumping || r.pumpingRate === null) return [];
    const rate = readQuantity(r.pumpingRate, ruleFor(`site.receptors[${i}].pumpingRate`));
    const pr = p.receptors[i];
    receptorOf.push(i);
    return [{ x: pr.x, y: pr.y, rate, radius: DEFAULT_WELL_RADIUS, label: r.name || r.id }];
  });
  const boundaries = (c.site.boundaries ?? []).map((b, i): CaseBoundary => {
    const f = `site.boundaries[${i}]`;
    const a = flowPoint(p, `${f}.points[0]`, b.points[0]);
    const z = flowPoint(p, `${f}.points[1]`, b.points[1]);
    // the source (0, 0) on the left of a → z: cross((z − a), (0 − a)) > 0
    const cross = (z.x - a.x) * -a.y - (z.y - a.y) * -a.x;
    const len = Math.hypot(z.x - a.x, z.y - a.y);
    if (!(len > 0)) throw new CaseFieldError(`${f}.points`, b.points, null, 'two distinct points', 'its two ends are at the same place; draw the line again');
    if (Math.abs(cross) / len < 1e-6)
      throw new CaseFieldError(`${f}.points`, b.points, null, 'a line that does not pass through the source', `the source lies on boundary line ${b.name || b.id}; a boundary must lie beside the aquifer, not through the release`);
    const line = cross > 0 ? { kind: b.kind, x1: a.x, y1: a.y, x2: z.x, y2: z.y, label: b.name || b.id } : { kind: b.kind, x1: z.x, y1: z.y, x2: a.x, y2: a.y, label: b.name || b.id };
    return { id: b.id, name: b.name, kind: b.kind, line };
  });
  if (wells.length === 0 && boundaries.length === 0) return { field: null, thickness, receptorOf, boundaries, warnings };
  if (thickness === null) {
    if (boundaries.length)
      warnings.push({
        code: 'boundaries-need-thickness',
        message: "Boundary lines are drawn, but the aquifer's saturated thickness is not given, so they and any pumping are not modelled.",
        field: 'aquifer.saturatedThickness',
      });
    return { field: null, thickness, receptorOf: [], boundaries, warnings };
  }
  const q = p.derived.K * p.derived.gradient;
  let field: FlowField;
  try {
    field = prepareFlow({ darcyFlux: q, porosity: p.inputs.effectivePorosity, thickness, wells, boundaries: boundaries.map((b) => b.line) });
  } catch (e) {
    throw e instanceof ValidationError ? restate(e, receptorOf) : e;
  }
  const length = (m: number) => resultText(c, m, 'length', 'length', 3);
  for (const w of flowWarnings(field, length)) warnings.push({ ...w, field: caseField(w.field, receptorOf) });
  if (thickness < p.model.thickness)
    warnings.push({
      code: 'source-thicker-than-aquifer',
      message: `The source thickness (${length(p.model.thickness)}) exceeds the saturated thickness (${length(thickness)}); the particle walk releases the source over the saturated thickness.`,
      field: 'aquifer.saturatedThickness',
    });
  return { field, thickness, receptorOf, boundaries, warnings };
}

function flowPoint(p: PreparedCase, field: string, pos: Position): { x: number; y: number } {
  try {
    return p.fromMap(pos);
  } catch {
    throw new CaseFieldError(field, pos, null, 'a map position near the site', 'it cannot be placed on the site map; move it near the site');
  }
}

/** An engine field ('wells[2]', 'boundaries[0]') → the case field a user edits. */
function caseField(f: string | undefined, receptorOf: number[]): string | undefined {
  if (!f) return f;
  const m = /^wells\[(\d+)\](.*)$/.exec(f);
  if (m) return `site.receptors[${receptorOf[Number(m[1])]}]${m[2] === '.rate' ? '.pumpingRate' : '.position'}`;
  const b = /^boundaries\[(\d+)\]/.exec(f);
  if (b) return `site.boundaries[${b[1]}]`;
  return f;
}

function restate(e: ValidationError, receptorOf: number[]): ValidationError {
  const f = caseField(e.field, receptorOf) ?? e.field;
  return atCaseField(new ValidationError(f, e.value, e.range, detailOf(e)));
}

export interface WellCapture {
  readonly receptorIndex: number;
  readonly receptorId: string;
  /** m³/d */
  readonly rate: number;
  /** the water at the source centre ends in this well */
  readonly capturesSource: boolean;
  /** share of the source plane's width whose water this well draws (11 points across it) */
  readonly sourceShare: number;
  /** advective travel time of the contaminant (water time × R) from the source centre, d; null when not captured */
  readonly travelTimeFromSource: number | null;
  /** the same for water (R = 1), d */
  readonly waterTravelTime: number | null;
  /** Javandel & Tsang (1986) figures for this well alone in the regional flow, m */
  readonly singleWell: { stagnationDistance: number; widthAtWell: number; widthFarUpgradient: number } | null;
}

export function wellCaptures(p: PreparedCase, w: CaseWells): WellCapture[] {
  const f = w.field;
  if (!f) return [];
  const R = p.model.R;
  const centre = sourceCapture(f, 0, 0);
  const across = Array.from({ length: 11 }, (_, k) => sourceCapture(f, 0, (k / 10 - 0.5) * p.model.width).well);
  return f.wells.map((well, j) => {
    const captured = centre.well === j;
    const ti = p.receptors[w.receptorOf[j]];
    return {
      receptorIndex: w.receptorOf[j],
      receptorId: ti.id,
      rate: well.rate,
      capturesSource: captured,
      sourceShare: across.filter((k) => k === j).length / across.length,
      travelTimeFromSource: captured ? (centre.travelTime as number) * R : null,
      waterTravelTime: captured ? centre.travelTime : null,
      singleWell: f.q0 > 0 ? captureZoneSingleWell({ pumpingRate: well.rate, thickness: f.thickness, darcyFlux: f.darcyFlux }) : null,
    };
  });
}

/**
 * Water levels at each receptor in the steady well field, referred to the release, where the
 * saturated thickness is the given B (flow/heads.ts):
 * - confined form (the form the capture zones and particles use: B constant): the head relative to
 *   the release, (Φ − Φ_release)/(K·B), the regional gradient and every well's cone with its images;
 * - unconfined, Dupuit–Forchheimer: the saturated thickness h = √(B² + 2(Φ − Φ_release)/K), and
 *   whether the aquifer would be dewatered there (the well cannot deliver its rate).
 * Where h departs from B by more than a fifth (program's judgement, not a published rule), the
 * constant-thickness picture is doubtful and a warning says so. At a pumping well the level is the
 * one at its face (radius 0.1 m).
 */
export interface ReceptorHead {
  readonly receptorId: string;
  /** m, relative to the release (negative: lower) */
  readonly confined: number;
  /** m above the aquifer base (Dupuit–Forchheimer); 0 where dewatered */
  readonly unconfined: number;
  readonly dewatered: boolean;
}

export function receptorHeads(p: PreparedCase, w: CaseWells): ReceptorHead[] {
  const f = w.field;
  if (!f) return [];
  const K = p.derived.K;
  const confinedRef = { x: 0, y: 0, head: 0 };
  const unconfinedRef = { x: 0, y: 0, head: f.thickness };
  return p.receptors.map((r) => ({
    receptorId: r.id,
    confined: confinedHead(f, K, confinedRef, r.x, r.y),
    unconfined: unconfinedHead(f, K, unconfinedRef, r.x, r.y),
    dewatered: dewatered(f, K, unconfinedRef, r.x, r.y),
  }));
}

/** The receptors where the Dupuit thickness departs from B by more than a fifth, or is dewatered, in words. */
/** Lengths in the words are in the case's system (`units`: m, or ft in a US customary case). */
export function headWarnings(p: PreparedCase, w: CaseWells, heads: readonly ReceptorHead[], units: Pick<Case, 'units'> = {}): Warning[] {
  const length = (m: number) => resultText(units, m, 'length', 'length', 3);
  const B = w.thickness;
  if (B === null) return [];
  return heads.flatMap((h) => {
    const name = p.receptors.find((r) => r.id === h.receptorId)?.name || h.receptorId;
    if (h.dewatered)
      return [{ code: 'well-dewaters', message: `At ${name} the pumping would dewater an unconfined aquifer (Dupuit–Forchheimer): the rate cannot be delivered there, and the well field's figures do not hold.` }];
    if (Math.abs(h.unconfined - B) > 0.2 * B)
      return [
        {
          code: 'thickness-changes',
          message: `At ${name} the saturated thickness of an unconfined aquifer would be ${length(h.unconfined)} against ${length(B)} at the release (Dupuit–Forchheimer): the capture zones and particles take it as constant, which is doubtful there.`,
        },
      ];
    return [];
  });
}

export const TRAVEL_TIME_MARKS_YEARS = [1, 5, 10, 25] as const;

export interface TravelMark {
  readonly years: number;
  readonly ring: Position[];
  readonly front: Position[][];
  readonly closed: boolean;
}

export interface MapCaptureZone {
  readonly receptorId: string;
  /** the traced zone's outline (map positions; core sweptOutline, as far as 4 × 25 years of water travel) */
  readonly envelope: Position[];
  /**
   * time-of-travel marks for water and for the contaminant (× R), each at 1, 5, 10 and 25 years:
   * the ground within that travel time (`ring`, core sweptOutline) and the front as drawn
   * (`front`: its pieces, `closed` when it is one ring around the well; core isochroneFront)
   */
  readonly water: TravelMark[];
  readonly contaminant: TravelMark[];
  readonly fromBoundary: number[];
}

/** Capture zones with their time-of-travel marks, on the map (72 streamlines per well). */
export function mapCaptureZones(p: PreparedCase, w: CaseWells): MapCaptureZone[] {
  const f = w.field;
  if (!f) return [];
  const days = TRAVEL_TIME_MARKS_YEARS.map((y) => y * 365.25);
  const ring = (a: Float64Array): Position[] => {
    const out: Position[] = [];
    for (let i = 0; i < a.length; i += 2) out.push(p.toMap(a[i], a[i + 1]));
    return out;
  };
  const mark = (iso: { outline: Float64Array; front: { pieces: Float64Array[]; closed: boolean } }, k: number): TravelMark => ({
    years: TRAVEL_TIME_MARKS_YEARS[k],
    ring: ring(iso.outline),
    front: iso.front.pieces.map(ring),
    closed: iso.front.closed,
  });
  return f.wells.map((_, j) => {
    const water = captureZone(f, j, { times: days, maxTime: 4 * days[days.length - 1] });
    const solute = captureZone(f, j, { times: days, retardation: p.model.R, maxTime: 4 * days[days.length - 1] });
    return {
      receptorId: p.receptors[w.receptorOf[j]].id,
      envelope: ring(water.outline),
      water: water.isochrones.map((iso, k) => mark(iso, k)),
      contaminant: solute.isochrones.map((iso, k) => mark(iso, k)),
      fromBoundary: water.fromBoundary,
    };
  });
}
