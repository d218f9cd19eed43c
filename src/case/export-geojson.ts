/**
 * GeoJSON (RFC 7946) of a screened case, so the result opens in any GIS: the release (a point,
 * and the traced footprint as a polygon), the receptors with their results (each named with the
 * method that gave it: the analytical solution, and the particle figures of a complete particle
 * run when there is one), the flow arrow, the monitoring wells with their latest result, the
 * pumping wells' capture zones, time-of-travel marks and lines of equal water level (export-wells.ts), and the plume contours
 * at the map's view time. Coordinates are WGS 84 [longitude, latitude] in
 * decimal degrees (RFC 7946 §4), rounded to 7 decimals (about 1 cm; §11.2 discusses precision).
 * Polygon exteriors are counter-clockwise (§3.1.6). Properties carry their unit in each key:
 * lengths and velocities in the case's unit system (m and m/d, or ft and ft/d in a US customary
 * case: src/case/unitSystem.ts), times in days, concentrations in mg/L; the collection's
 * `downgradient.units` member names them too. The screening caution rides along as a foreign member of the collection
 * (§6.1) and in each receptor's properties.
 *
 * A case drawn on a local site grid (metres east/north of a datum with no geographic position)
 * has no WGS 84 coordinates, so it cannot be written as RFC 7946 GeoJSON: the export says so and
 * points the way (place the case on the basemap). `geojsonNeedsPlacement` is that one rule, which
 * the Files view also reads for its captions and its "place on the basemap" button.
 */
import type { Feature, FeatureCollection, Geometry, Position as GeoPosition } from 'geojson';
import type { Case, Position } from './schema';
import { prepareCase } from './prepare';
import { closedCounterClockwise } from '../geo/rings';
import { SOLUTION_LABEL, analyticalMethod, type ExportResults } from './export-results';
import { monitoringWellFeatures } from './export-observations';
import type { ExceedanceContours } from './exceedanceMap';
import { probabilisticCaution } from './uncertainty';
import { packedPolygons } from '../geo/contours';
import { resultUnit, unitSystem } from './unitSystem';
import { fileNumber } from './numbers';
import { fromInternal } from '../core/units';
import { captureZoneFeatures, headContourFeatures, particleProperties, wellFieldProperties } from './export-wells';

/** `placeOnMap`: the refusal is geojsonNeedsPlacement's (the way forward is to place the case on the basemap) */
export type GeoJsonExport = { ok: true; geojson: FeatureCollection; text: string } | { ok: false; error: string; placeOnMap?: boolean };

/**
 * Why this case cannot be GeoJSON until it is placed on the basemap, or null when it can: a case on
 * a local site grid has no longitude and latitude, and RFC 7946 requires WGS 84. Every GeoJSON of a
 * case (its layers, the capture zones and travel-time marks among them) goes by this one rule.
 */
export function geojsonNeedsPlacement(c: Pick<Case, 'site'>): string | null {
  if (c.site.frame === 'geographic') return null;
  return (
    'GeoJSON export: this case is drawn on a local site grid (metres from a datum), which has no longitude and latitude; ' +
    'RFC 7946 GeoJSON needs WGS 84 coordinates, for the release, receptors, plume contours and any capture zones and travel-time marks alike. ' +
    'Place the site on the map (give the datum its longitude and latitude) to export GeoJSON, or export the CSV tables, which keep the site grid\'s east/north coordinates.'
  );
}

const round7 = (v: number) => Math.round(v * 1e7) / 1e7;
const pos = (p: readonly number[]): GeoPosition => [round7(p[0]), round7(p[1])];

function closedCcw(ring: readonly Position[]): GeoPosition[] {
  return closedCounterClockwise(ring.map(pos));
}

function feature(geometry: Geometry, properties: Record<string, unknown>): Feature {
  return { type: 'Feature', geometry, properties };
}

export interface GeoJsonOptions {
  appVersion?: string;
  exported?: Date;
  /** the probability contours of a Monte Carlo run of this case as it is, with its run count and seed */
  probability?: { contours: ExceedanceContours; runs: number; seed: number } | null;
}

/**
 * The lines where P(C > limit) at the map's time is each level (the outlines of the run's
 * probability bands, exceedanceMap.ts): one MultiLineString per level that has any, every ring
 * closed, with the level, the time, the realisations mapped, the run's count and seed (enough to
 * repeat it), the largest Monte Carlo standard error and the probabilistic caution.
 */
export function exceedanceFeatures(p: NonNullable<GeoJsonOptions['probability']>, position: (q: readonly number[]) => GeoPosition = pos): Feature[] {
  const m = p.contours;
  const features: Feature[] = [];
  m.levels.forEach((level, k) => {
    const lines = packedPolygons(m.bands, k).flatMap((poly) => poly.map((ring) => ring.map(position)));
    if (!lines.length) return;
    features.push(
      feature(
        { type: 'MultiLineString', coordinates: lines },
        {
          role: 'exceedance-contour',
          name: `P(C > limit) = ${Math.round(100 * level)} %`,
          'probability of exceeding the limit': level,
          'view time (d)': Number.isFinite(m.time) ? m.time : 'steady state',
          'realisations mapped': m.realisations,
          runs: p.runs,
          seed: p.seed,
          'largest standard error': m.maxStandardError,
          caution: probabilisticCaution(p.runs, p.seed),
        },
      ),
    );
  });
  return features;
}

export function caseToGeoJSON(c: Case, results: ExportResults | null, opts: GeoJsonOptions = {}): GeoJsonExport {
  const placement = geojsonNeedsPlacement(c);
  if (placement) return { ok: false, error: placement, placeOnMap: true };
  let prepared;
  try {
    prepared = prepareCase(c);
  } catch (e) {
    return { ok: false, error: `GeoJSON export: the inputs are not valid yet — ${e instanceof Error ? e.message : String(e)}` };
  }
  const { derived, toMap } = prepared;
  const features: Feature[] = [];
  // lengths and velocities in the case's system, the unit in each property's name
  const lu = resultUnit(c, 'length');
  const vu = resultUnit(c, 'velocity');
  const len = (m: number) => fileNumber(m, 'length', fromInternal(m, lu));

  features.push(
    feature(
      { type: 'Point', coordinates: pos(c.site.source.position) },
      {
        role: 'source',
        name: `Release: ${c.contaminant.name}`,
        contaminant: c.contaminant.name,
        'source concentration (mg/L)': prepared.model.c0,
        [`source width across flow (${lu})`]: len(derived.width),
        [`source thickness (${lu})`]: len(prepared.model.thickness),
      },
    ),
  );
  if (c.site.source.footprint && c.site.source.footprint.length >= 3) {
    features.push(
      feature(
        { type: 'Polygon', coordinates: [closedCcw(c.site.source.footprint)] },
        { role: 'source-footprint', name: 'Traced release footprint' },
      ),
    );
  }

  const byId = new Map((results?.receptors ?? []).map((r) => [r.id, r]));
  for (const rc of c.site.receptors) {
    const r = byId.get(rc.id);
    features.push(
      feature(
        { type: 'Point', coordinates: pos(rc.position) },
        {
          role: 'receptor',
          name: rc.name,
          kind: rc.kind,
          ...(r
            ? {
                method: analyticalMethod(results!.solution),
                result: r.status,
                'first reaches limit (d)': r.arrival,
                'at horizon (mg/L)': r.atHorizon,
                'peak (mg/L)': r.peak.c,
                'time of peak (d)': r.peak.t,
                'steady state (mg/L)': r.steady,
                [`distance from source (${lu})`]: len(r.distance),
              }
            : { result: null }),
          ...wellFieldProperties(results?.wells, rc.id),
          ...(results?.particles ? particleProperties(results.particles, rc.id) : {}),
        },
      ),
    );
  }

  features.push(...monitoringWellFeatures(c, pos));
  if (results?.wells) features.push(...captureZoneFeatures(c, results.wells, pos), ...headContourFeatures(results.wells, pos));

  // Flow arrow from the centre of the source plane, as long as the plume or the farthest receptor.
  const reach = Math.max(
    results?.plumeLength ?? 0,
    ...prepared.receptors.map((r) => Math.max(r.x, 0)),
    10 * derived.width,
    50,
  );
  const head = Math.min(0.1 * reach, 50);
  const tip = toMap(reach, 0);
  features.push(
    feature(
      {
        type: 'MultiLineString',
        coordinates: [
          [pos(toMap(0, 0)), pos(tip)],
          [pos(toMap(reach - head, head / 2)), pos(tip), pos(toMap(reach - head, -head / 2))],
        ],
      },
      {
        role: 'flow-direction',
        name: 'Groundwater flow direction',
        'azimuth (degrees clockwise from north)': derived.azimuthDeg,
        'hydraulic gradient': derived.gradient,
        [`seepage velocity (${vu})`]: fileNumber(derived.v, 'velocity', fromInternal(derived.v, vu)),
        [`arrow length (${lu})`]: len(reach),
      },
    ),
  );

  if (results?.plume) {
    for (const f of results.plume.geojson.features) {
      const coords = f.geometry.coordinates.map((poly) => poly.map((ring) => ring.map(pos)));
      features.push(
        feature(
          { type: 'MultiPolygon', coordinates: coords },
          {
            ...f.properties,
            role: 'plume-contour',
            'view time (d)': Number.isFinite(results.plume.time) ? results.plume.time : 'steady state',
            solution: SOLUTION_LABEL[results.solution],
            method: analyticalMethod(results.solution),
          },
        ),
      );
    }
  }

  if (opts.probability) features.push(...exceedanceFeatures(opts.probability));

  const geojson: FeatureCollection & Record<string, unknown> = {
    type: 'FeatureCollection',
    features,
    // RFC 7946 §6.1 foreign member: what this is and the caution that goes with it
    downgradient: {
      case: c.name,
      caseId: c.id,
      exported: (opts.exported ?? new Date()).toISOString(),
      appVersion: opts.appVersion ?? null,
      limit_mg_L: results?.limit ?? null,
      unitSystem: unitSystem(c) === 'US' ? 'US customary' : 'SI',
      units: { length: lu, velocity: vu, time: 'd', concentration: 'mg/L' },
      solution: results ? SOLUTION_LABEL[results.solution] : null,
      caution: results?.caution ?? null,
    },
  };
  return { ok: true, geojson, text: JSON.stringify(geojson) };
}
