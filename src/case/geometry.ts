/**
 * The case's geometry in the flow-aligned frame: the map frame, the flow direction and gradient
 * (given, or a plane fitted to head readings), the source plane (a point and a width, or the
 * across-flow extent of a traced footprint) and the receptors. These steps are the costly part of
 * preparing a case (projections, polygon work, the head fit); physics.ts's `modelFor` reuses them
 * when only physical inputs change. Each throws ValidationError on the case field it reads.
 */
import type { Case, Position, ReceptorKind } from './schema';
import { ValidationError, fitHeadPlane, type Warning } from '../core';
import { makeLocalFrame, type LocalFrame } from '../geo/projection';
import { toFlow } from '../geo/flowFrame';
import { cleanRing, footprintSourcePlane, planeAcross } from '../geo/footprint';
import { normalizeDeg } from '../geo/angles';
import { CaseFieldError, atField, readFraction, readQuantity, ruleFor } from './checked';
import { bounds, NON_NEGATIVE } from './fields';

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

/** The site frame and a checked conversion of map positions into it. */
export interface SiteFrame {
  readonly frame: LocalFrame;
  /** map position → local east/north metres, a ValidationError on `field` when it cannot be placed */
  toEN(field: string, p: Position): [number, number];
  /** meridian convergence at a map position, degrees (0 in a local frame) */
  convergenceDeg(field: string, p: Position): number;
}

/** What a position must be, in the case's frame (the accepted range of a position field). */
export function positionRange(frame: Case['site']['frame']): string {
  return frame === 'geographic' ? 'a [longitude, latitude] pair in degrees within 1000 km of the datum' : 'a pair of finite [east, north] metres';
}

/** What the site datum must be, in the case's frame. */
export function datumRange(frame: Case['site']['frame']): string {
  return frame === 'geographic' ? '[longitude, latitude] in degrees' : '[east, north] metres';
}

export function prepareFrame(c: Case): SiteFrame {
  const site = c.site;
  const frame = atField('site.datum', site.datum, datumRange(site.frame), () => makeLocalFrame(site.frame, site.datum));
  const posRange = positionRange(site.frame);
  return {
    frame,
    toEN: (field, p) => atField(field, p, posRange, () => frame.toEN(p)),
    convergenceDeg: (field, p) => atField(field, p, posRange, () => frame.convergenceDeg(p)),
  };
}

export interface Flow {
  readonly gradient: number;
  /** true azimuth at the source (what the user reads and enters), degrees clockwise from north */
  readonly azimuthDeg: number;
  /** the same direction in the datum's tangent plane: true azimuth + meridian convergence */
  readonly planeAzimuthDeg: number;
  readonly headFit: HeadFit | null;
  readonly warnings: Warning[];
}

export const GRADIENT_RULE = ruleFor('site.flow.gradient');

export function prepareFlow(c: Case, sf: SiteFrame): Flow {
  const site = c.site;
  const convergence = sf.convergenceDeg('site.source.position', site.source.position);
  if (site.flow.method === 'direction') {
    const azimuthDeg = normalizeDeg(readFraction(site.flow.azimuthDeg, ruleFor('site.flow.azimuthDeg')));
    return {
      azimuthDeg,
      planeAzimuthDeg: normalizeDeg(azimuthDeg + convergence),
      gradient: readFraction(site.flow.gradient, GRADIENT_RULE),
      headFit: null,
      warnings: [],
    };
  }
  const readings = site.flow.readings;
  if (readings.length < 3)
    throw new CaseFieldError('site.flow.readings', undefined, null, 'at least 3', `the flow direction needs at least 3 water levels (not all on one line); ${readings.length} ${readings.length === 1 ? 'is' : 'are'} given`);
  const points = readings.map((r, i) => {
    const [x, y] = sf.toEN(`site.flow.readings[${i}].position`, r.position);
    const head = readQuantity(r.head, ruleFor(`site.flow.readings[${i}].head`));
    return { x, y, head };
  });
  const fit = atField('site.flow.readings', undefined, 'at least 3 head readings not all on one line, with heads that differ', () => fitHeadPlane(points));
  const gradient = fit.gradient;
  const planeAzimuthDeg = normalizeDeg(fit.azimuthDeg);
  if (!(gradient > 0 && gradient < 1))
    throw new CaseFieldError('site.flow.readings', undefined, null, 'readings whose fitted gradient lies above 0 and below 1', `the water levels give a gradient of ${gradient}; it must lie above 0 and below 1 (are the levels all equal, or in the wrong unit?)`);
  return {
    gradient,
    planeAzimuthDeg,
    azimuthDeg: normalizeDeg(planeAzimuthDeg - convergence),
    headFit: { residuals: [...fit.residuals], readingIds: readings.map((r) => r.id) },
    warnings: fit.warnings.map((w) => ({ ...w, field: w.field ?? 'site.flow.readings' })),
  };
}

export interface SourcePlane {
  /** centre of the source plane, local east/north metres */
  readonly sourceEN: [number, number];
  /** width across the flow, m */
  readonly width: number;
  readonly widthFromFootprint: boolean;
}

export const WIDTH_RULE = ruleFor('site.source.width');

export function prepareSourcePlane(c: Case, sf: SiteFrame, planeAzimuthDeg: number): SourcePlane {
  const src = c.site.source;
  if (!src.footprint) {
    return { sourceEN: sf.toEN('site.source.position', src.position), width: readQuantity(src.width, WIDTH_RULE), widthFromFootprint: false };
  }
  const fp = src.footprint.map((p, i) => sf.toEN(`site.source.footprint[${i}]`, p));
  const plane = atField('site.source.footprint', undefined, 'a simple polygon of at least 3 vertices with non-zero area', () =>
    footprintSourcePlane(fp, planeAzimuthDeg),
  );
  if (!(plane.width > 0)) throw new CaseFieldError('site.source.footprint', undefined, null, 'an outline with a width across the flow', 'the traced outline has no width across the flow; trace it again');
  return { sourceEN: plane.centreEN, width: plane.width, widthFromFootprint: true };
}

/**
 * A traced footprint's source plane for any flow direction of the datum plane, the footprint
 * projected and checked once (prepareSourcePlane's result for that direction, without redoing the
 * projection and the polygon checks): for a Monte Carlo run whose flow direction varies. Null for a
 * point release.
 */
export function footprintPlaneFor(c: Case, sf: SiteFrame): ((planeAzimuthDeg: number) => SourcePlane) | null {
  const fp = c.site.source.footprint;
  if (!fp) return null;
  prepareSourcePlane(c, sf, 0); // the footprint's own checks, once
  const ring = cleanRing(fp.map((p, i) => sf.toEN(`site.source.footprint[${i}]`, p)));
  return (az) => {
    const plane = planeAcross(ring, az);
    if (!(plane.width > 0)) throw new CaseFieldError('site.source.footprint', undefined, null, 'an outline with a width across the flow', 'the traced outline has no width across the flow; trace it again');
    return { sourceEN: plane.centreEN, width: plane.width, widthFromFootprint: true };
  };
}

/** Receptors in the flow frame, with the warning that pumping is not represented. */
export function prepareReceptors(c: Case, sf: SiteFrame, sourceEN: [number, number], planeAzimuthDeg: number): { receptors: PreparedReceptor[]; warnings: Warning[] } {
  const warnings: Warning[] = [];
  const receptors = c.site.receptors.map((r, i): PreparedReceptor => {
    const f = `site.receptors[${i}]`;
    const en = sf.toEN(`${f}.position`, r.position);
    const { x, y } = toFlow(sourceEN, planeAzimuthDeg, en);
    const zTop = readQuantity(r.screenTop, ruleFor(`${f}.screenTop`));
    const zBottom = readQuantity(r.screenBottom, ruleFor(`${f}.screenBottom`, bounds(zTop, false, NON_NEGATIVE.max, false)));
    const modelled = r.pumping && r.pumpingRate !== null && c.aquifer.saturatedThickness != null;
    if (r.pumping && !modelled)
      warnings.push({
        code: 'pumping-not-represented',
        message: `${r.name || r.id} is marked as pumping, but ${r.pumpingRate === null ? 'its pumping rate' : "the aquifer's saturated thickness"} is not given, so pumping is not represented: its capture would draw the plume towards it, so arrival may be earlier and concentrations higher than shown.`,
        field: `${f}.pumping`,
      });
    else if (modelled)
      warnings.push({
        code: 'pumping-analytical-only',
        message: `${r.name || r.id} pumps: its capture zone, whether it captures the source, and the particle figures account for the pumping; the analytical (uniform-flow) figures for it do not, so they may show a later arrival and a different concentration than the well's water will have.`,
        field: `${f}.pumpingRate`,
      });
    return { id: r.id, name: r.name, kind: r.kind, x, y, zTop, zBottom, en, distance: Math.hypot(en[0] - sourceEN[0], en[1] - sourceEN[1]), pumping: r.pumping };
  });
  return { receptors, warnings };
}

/** The distance to the farthest downgradient receptor (x > 0), the scale of an estimated dispersivity; null when none lies downgradient. */
export function receptorReach(receptors: readonly { readonly x: number }[]): number | null {
  const downgradient = receptors.filter((r) => r.x > 0).map((r) => r.x);
  return downgradient.length ? Math.max(...downgradient) : null;
}
