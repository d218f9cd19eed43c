/**
 * Exports of the well field and the particle view (issue 16), in the forms of the other exports
 * (export-csv.ts: RFC 4180 records, the units in each header, the caution as the last record;
 * export-geojson.ts: RFC 7946 features in WGS 84):
 * - capture zones: per pumping well its zone (a polygon, as far as traced) and its time-of-travel
 *   marks (lines, each with its travel time, for water and for the contaminant × R), as GeoJSON
 *   features and as a CSV of vertices in the case's map coordinates;
 * - particle figures per receptor (method = particles, concentration at the horizon, its standard
 *   error, first arrival at the limit, estimator, particle count and seed), as CSV columns and as
 *   GeoJSON receptor properties under the same names, and the particle curves as CSV.
 * Every figure says which method produced it. Lengths and pumping rates in the case's system (m and
 * m³/d, or ft and US gal/min: unitSystem.ts), times in d, concentrations in mg/L, named in each key.
 */
import type { Feature, Position as GeoPosition } from 'geojson';
import type { Case, Position } from './schema';
import type { ExportParticles, ExportResults, ExportWells } from './export-results';
import { withCaution, type Cell } from './csv-write';
import { fileNumber } from './numbers';
import { resultUnit } from './unitSystem';
import { UNITS, fromInternal } from '../core/units';
import { closedCounterClockwise } from '../geo/rings';

const YEAR_D = 365.25;
const time = (v: number | null) => (v === null ? null : fileNumber(v, 'time'));
const conc = (v: number) => fileNumber(v, 'concentration');

export const WELL_FIELD_METHOD =
  'steady well field: uniform regional flow plus the pumping wells and straight boundaries (superposition, image wells; Strack 1989, Ferris et al. 1962), streamlines traced back from each well';
export const PARTICLE_METHOD = 'particles: random walk in the well field (Kinzelbach 1988; LaBolle et al. 1996), depth-averaged over the saturated thickness';

/** how far each zone is traced, years of water travel (4 × the longest mark; case/wells.ts mapCaptureZones) */
const TRACED_YEARS = 100;

/**
 * A unit of the case's system as an export's key writes it (ASCII: 'm', 'ft', 'm3/d', 'gal/min')
 * and the value converted to it: pumping rates in m³/d or US gal/min, lengths in m or ft.
 */
function fileQuantity(c: Pick<Case, 'units'>, dimension: 'length' | 'flowRate'): { name: string; value: (internal: number) => number } {
  const u = resultUnit(c, dimension);
  const name = UNITS[u].label.replace('³', '3');
  return { name, value: (v) => fileNumber(v, dimension === 'length' ? 'length' : 'ratio', fromInternal(v, u)) };
}

function wellName(c: Case, id: string): string {
  const r = c.site.receptors.find((x) => x.id === id);
  return r?.name || id;
}

/** The particle figures of one receptor, under the names both the CSV and the GeoJSON use. */
export function particleProperties(p: ExportParticles, receptorId: string): Record<string, string | number | null> {
  const f = p.receptors.find((x) => x.id === receptorId);
  if (!f) return {};
  return {
    'particles: method': PARTICLE_METHOD,
    'particles: concentration at horizon (mg/L)': conc(f.concentrationAtHorizon),
    'particles: standard error (mg/L)': conc(f.standardError),
    'particles: first reaches limit (d)': time(f.arrival),
    'particles: estimator': f.estimator,
    'particles: count': p.particles,
    'particles: seed': p.seed,
  };
}

const PARTICLE_COLUMNS = [
  'particles: method',
  'particles: concentration at horizon (mg/L)',
  'particles: standard error (mg/L)',
  'particles: first reaches limit (d)',
  'particles: estimator',
  'particles: count',
  'particles: seed',
] as const;

/**
 * The receptor table's columns from the well field and a complete particle run (export-csv.ts
 * receptorTableCsv appends them after the analytical ones): for a pumping well, whether the release
 * lies in its capture zone and the contaminant's advective travel time from it, with their method;
 * the particle figures under the names the particle CSV and GeoJSON use. Empty where they do not apply.
 */
const WELL_FIELD_COLUMNS = ['well field: release in its capture zone', 'well field: contaminant travel time from the release (d)', 'well field: method'] as const;

export const RECEPTOR_WELL_COLUMNS = [...WELL_FIELD_COLUMNS, ...PARTICLE_COLUMNS] as const;

/** A pumping well's figures from the well field, under the names the receptor CSV and GeoJSON use ({} for any other receptor). */
export function wellFieldProperties(w: ExportWells | null | undefined, receptorId: string): Record<string, string | number | null> {
  const cap = w?.captures.find((x) => x.receptorId === receptorId);
  if (!cap) return {};
  return {
    [WELL_FIELD_COLUMNS[0]]: cap.capturesSource ? 'yes' : 'no',
    [WELL_FIELD_COLUMNS[1]]: time(cap.travelTimeFromSource),
    [WELL_FIELD_COLUMNS[2]]: WELL_FIELD_METHOD,
  };
}

export function receptorWellCells(r: Pick<ExportResults, 'wells' | 'particles'>, receptorId: string): Cell[] {
  const props = { ...wellFieldProperties(r.wells, receptorId), ...(r.particles ? particleProperties(r.particles, receptorId) : {}) };
  return RECEPTOR_WELL_COLUMNS.map((k) => props[k] ?? null);
}

/** Particle figures per receptor: one row per receptor, the analytical figure beside for reference. */
export function particleFiguresCsv(r: Pick<ExportResults, 'receptors' | 'solution' | 'limit' | 'horizon' | 'caution'>, p: ExportParticles): string {
  const header: Cell[] = ['receptor', 'kind', ...PARTICLE_COLUMNS, 'limit (mg/L)', 'horizon (d)', `analytical at horizon (mg/L, ${r.solution})`];
  const rows: Cell[][] = r.receptors.map((x) => {
    const props = particleProperties(p, x.id);
    return [x.name, x.kind, ...PARTICLE_COLUMNS.map((k) => props[k] ?? null), conc(r.limit), time(r.horizon), conc(x.atHorizon)];
  });
  return withCaution(header, rows, `${r.caution} Particle figures are statistical estimates, each with its standard error; the same count and seed repeat them.`);
}

/** Particle curves: one row per output time, per receptor its estimate and standard error. */
export function particleCurvesCsv(r: Pick<ExportResults, 'receptors' | 'caution'>, p: ExportParticles): string {
  const curves = r.receptors.map((x) => ({ x, f: p.receptors.find((f) => f.id === x.id) })).filter((e) => e.f && e.f.times.length);
  const times = curves[0]?.f?.times ?? [];
  const header: Cell[] = ['time (d)', 'time (yr)'];
  for (const { x, f } of curves) header.push(`${x.name} (mg/L, particles${f!.pumped ? ', water pumped over the interval ending then' : ''})`, `${x.name} standard error (mg/L)`);
  const rows: Cell[][] = times.map((t, k) => [time(t), fileNumber(t, 'time', t / YEAR_D), ...curves.flatMap(({ f }) => [conc(f!.c[k]), conc(f!.se[k])])]);
  return withCaution(header, rows, `${r.caution} Particle run: ${p.particles} particles, seed ${p.seed}.`);
}

/**
 * Capture zones as a table of vertices: per pumping well its zone's outline and each travel-time
 * mark's lines (water, contaminant), in the case's map coordinates (east/north metres of a local
 * case (or feet in a US customary case), longitude/latitude of a geographic one).
 */
export function captureZonesCsv(c: Case, w: ExportWells, caution: string): string {
  const geographic = c.site.frame === 'geographic';
  const rate = fileQuantity(c, 'flowRate');
  const len = fileQuantity(c, 'length');
  const header: Cell[] = [
    'pumping well',
    'feature',
    'travelling',
    'travel time (yr)',
    'travel time (d)',
    'part',
    'vertex',
    geographic ? 'longitude (degrees)' : `east (${len.name})`,
    geographic ? 'latitude (degrees)' : `north (${len.name})`,
    `pumping rate (${rate.name})`,
    'release in this zone',
    'method',
  ];
  const coord = (v: number) => (geographic ? Math.round(v * 1e7) / 1e7 : len.value(v));
  const rows: Cell[][] = [];
  for (const z of w.zones) {
    const name = wellName(c, z.receptorId);
    const cap = w.captures.find((x) => x.receptorId === z.receptorId);
    const tail: Cell[] = [cap ? rate.value(cap.rate) : null, cap ? (cap.capturesSource ? 'yes' : 'no') : null, WELL_FIELD_METHOD];
    const vertices = (feature: string, travelling: string | null, years: number | null, parts: readonly (readonly Position[])[]) =>
      parts.forEach((part, i) =>
        part.forEach((p, k) => rows.push([name, feature, travelling, years, years === null ? null : time(years * YEAR_D), i + 1, k + 1, coord(p[0]), coord(p[1]), ...tail])),
      );
    vertices(`capture zone (traced to ${TRACED_YEARS} years of water travel)`, null, null, [z.envelope]);
    for (const [travelling, marks] of [
      ['water', z.water],
      ['contaminant (retarded, × R)', z.contaminant],
    ] as const)
      for (const m of marks) vertices('travel-time mark', travelling, m.years, m.front);
  }
  return withCaution(header, rows, caution);
}

/**
 * Capture zones as GeoJSON features (a geographic case: map positions are longitude/latitude):
 * per pumping well its zone as a Polygon and each travel-time mark as a MultiLineString.
 */
export function captureZoneFeatures(c: Case, w: ExportWells, round: (p: readonly number[]) => GeoPosition): Feature[] {
  const out: Feature[] = [];
  const rate = fileQuantity(c, 'flowRate');
  for (const z of w.zones) {
    const name = wellName(c, z.receptorId);
    const cap = w.captures.find((x) => x.receptorId === z.receptorId);
    const ring = closedCounterClockwise(z.envelope.map(round));
    if (ring.length >= 4)
      out.push({
        type: 'Feature',
        geometry: { type: 'Polygon', coordinates: [ring] },
        properties: {
          role: 'capture-zone',
          name: `Capture zone of ${name}`,
          well: name,
          [`pumping rate (${rate.name})`]: cap ? rate.value(cap.rate) : null,
          'release in this zone': cap ? cap.capturesSource : null,
          'share of the source width (%)': cap ? fileNumber(100 * cap.sourceShare, 'ratio') : null,
          'contaminant travel time from the release (d)': cap ? time(cap.travelTimeFromSource) : null,
          'traced to (years of water travel)': TRACED_YEARS,
          method: WELL_FIELD_METHOD,
        },
      });
    for (const [travelling, marks] of [
      ['water', z.water],
      ['contaminant (retarded, × R)', z.contaminant],
    ] as const)
      for (const m of marks) {
        const lines = m.front.map((piece) => piece.map(round)).filter((l) => l.length >= 2);
        if (lines.length === 0) continue;
        out.push({
          type: 'Feature',
          geometry: { type: 'MultiLineString', coordinates: lines },
          properties: {
            role: 'travel-time-mark',
            name: `${m.years} years of ${travelling === 'water' ? 'water' : 'contaminant'} travel to ${name}`,
            well: name,
            travelling,
            'travel time (yr)': m.years,
            'travel time (d)': time(m.years * YEAR_D),
            method: WELL_FIELD_METHOD,
          },
        });
      }
  }
  return out;
}

/**
 * The lines of equal water level drawn on the map (headContours.ts), as GeoJSON: one
 * MultiLineString per level, with the level relative to the release in the unit of the map's labels
 * (the case's system), the interval, the form (confined: saturated thickness held constant, as the
 * capture zones), how near a pumping well no line is drawn, and the method.
 */
export function headContourFeatures(w: ExportWells, round: (p: readonly number[]) => GeoPosition): Feature[] {
  const h = w.headContours;
  if (!h) return [];
  const perUnit = h.unit === 'ft' ? UNITS.ft.factor : 1;
  return h.levels.flatMap((lv): Feature[] => {
    const lines = lv.lines.map((piece) => piece.map(round)).filter((l) => l.length >= 2);
    if (lines.length === 0) return [];
    return [
      {
        type: 'Feature',
        geometry: { type: 'MultiLineString', coordinates: lines },
        properties: {
          role: 'head-contour',
          name: `Water level ${lv.label} relative to the release`,
          [`water level relative to the release (${h.unit})`]: fileNumber(lv.head, 'length', lv.head / perUnit),
          [`interval (${h.unit})`]: h.step,
          form: 'confined (saturated thickness held constant, as for the capture zones); the unconfined (Dupuit–Forchheimer) lines lie in the same places with other values',
          [`not drawn within (${h.unit}) of a pumping well`]: fileNumber(h.clipRadius, 'length', h.clipRadius / perUnit),
          method: WELL_FIELD_METHOD,
        },
      },
    ];
  });
}
