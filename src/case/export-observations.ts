/**
 * Exports of the monitoring data: a CSV of every sampling result (RFC 4180, the same cell rules
 * as the other CSV exports, and headers the observation import maps back by itself, so an
 * exported table re-imports to the same results), and the GeoJSON features of the monitoring
 * wells with their latest result of the compared analyte.
 */
import type { Feature } from 'geojson';
import type { Case, Quantity } from './schema';
import { resultUnit } from './unitSystem';
import { fileNumber } from './numbers';
import { convert, toInternal } from '../core/units';
import { csvRecords, type Cell } from './csv-write';
import { comparedAnalyte, resultMgL, wellSeries } from './monitoring';

/**
 * The results as a table, one row per result, sorted by well, analyte and date. Screen depths and a
 * local case's easting/northing in metres in every unit system: the observation import reads these
 * columns as metres, so the file re-imports to the same wells.
 */
export function observationsCsv(c: Case): string {
  const geo = c.site.frame === 'geographic';
  const header: Cell[] = [
    'well',
    'date',
    'analyte',
    'qualifier',
    'value',
    'unit',
    'value in mg/L',
    'screen top (m below water table)',
    'screen bottom (m below water table)',
    geo ? 'longitude' : 'easting',
    geo ? 'latitude' : 'northing',
  ];
  const wells = new Map(c.monitoring.wells.map((w) => [w.id, w]));
  const rows = [...c.monitoring.results]
    .sort((a, b) => (a.wellId + '\u0000' + a.analyte.toLowerCase() + a.date < b.wellId + '\u0000' + b.analyte.toLowerCase() + b.date ? -1 : 1))
    .map((r): Cell[] => {
      const w = wells.get(r.wellId);
      return [
        w?.name ?? r.wellId,
        r.date,
        r.analyte,
        r.nonDetect ? '<' : '',
        r.value,
        r.unit,
        resultMgL(r),
        // in metres whatever unit they were typed in: the observation import reads these columns as metres
        w ? fileNumber(toInternal(w.screenTop.value, w.screenTop.unit), 'length') : null,
        w ? fileNumber(toInternal(w.screenBottom.value, w.screenBottom.unit), 'length') : null,
        w?.position?.[0] ?? null,
        w?.position?.[1] ?? null,
      ];
    });
  return csvRecords([header, ...rows]);
}

/** GeoJSON points of the placed monitoring wells with their latest result of the compared analyte. */
export function monitoringWellFeatures(c: Case, round: (p: readonly number[]) => number[]): Feature[] {
  const analyte = comparedAnalyte(c.monitoring, c.contaminant.name);
  // screen depths in the case's length unit (m or ft), named in the key
  const lu = resultUnit(c, 'length');
  const depth = (q: Quantity) => fileNumber(toInternal(q.value, q.unit), 'length', convert(q.value, q.unit, lu));
  const out: Feature[] = [];
  for (const w of c.monitoring.wells) {
    if (!w.position) continue;
    const series = wellSeries(c.monitoring, w.id, analyte);
    const last = series.length ? series[series.length - 1] : null;
    out.push({
      type: 'Feature',
      geometry: { type: 'Point', coordinates: round(w.position) },
      properties: {
        role: 'monitoring-well',
        name: w.name,
        [`screen top (${lu} below water table)`]: depth(w.screenTop),
        [`screen bottom (${lu} below water table)`]: depth(w.screenBottom),
        analyte,
        'sampling rounds': series.length,
        'latest date': last?.date ?? null,
        'latest result': last ? `${last.nonDetect ? '<' : ''}${last.value} ${last.unit}` : null,
        'latest below reporting limit': last ? last.nonDetect : null,
        'latest (mg/L)': last ? resultMgL(last) : null,
      },
    });
  }
  return out;
}
