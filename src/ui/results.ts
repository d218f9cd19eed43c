/** The results the screen shows; the shapes live with the worker that produces them. */
import type { FeatureCollection, MultiPolygon } from 'geojson';
import { packedToGeoJSON } from '../geo/contours';
import type { PlumeLayer } from '../worker/protocol';

export type { Evaluation, PlumeLayer, ReceptorRow, ReceptorStatus, WarningItem, WellsLayer } from '../worker/protocol';

export type PlumeGeoJSON = FeatureCollection<MultiPolygon, { threshold: number; multiple: number; label: string; unit: string }>;

const geojsonOf = new WeakMap<PlumeLayer, PlumeGeoJSON>();

/**
 * The plume's bands as an RFC 7946 FeatureCollection (one MultiPolygon feature per non-empty band,
 * properties { threshold, unit, label, multiple = threshold / limit }), built from the packed
 * arrays on first use (export, report) and kept with the layer; the map draws from the arrays.
 */
export function plumeGeoJSON(p: PlumeLayer): PlumeGeoJSON {
  let g = geojsonOf.get(p);
  if (!g) {
    g = packedToGeoJSON(p.bands, (b) => ({ multiple: b.threshold / p.limit })) as PlumeGeoJSON;
    geojsonOf.set(p, g);
  }
  return g;
}
