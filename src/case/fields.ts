/**
 * The case's fields as a user meets them: for each case field path, the label the screen shows,
 * the dimension of its unit and its accepted range. One mapping, used by the input panels (their
 * labels), every refusal message (checked.ts), the comparison of two cases and the report.
 *
 * Accepted ranges are stored in internal units (m, d, mg/L, g/cm³, L/kg, m/d; src/core/units.ts)
 * and put into words in whatever unit the value was entered in (`acceptedWords`). Besides its
 * physical range every quantity stays within the engine's working range (src/core/validation.ts:
 * magnitudes 1e-30 … 1e30, or 0), so a value the engine could not work with is refused on the
 * field the user typed it in, not on an internal quantity.
 */
import { UNITS, type Dimension } from '../core/units';
import { WORKING_MAX, WORKING_MIN } from '../core/validation';
import { formatSig } from './numbers';

/** An interval in internal units; each end open or closed. */
export interface Bounds {
  readonly min: number;
  readonly minOpen: boolean;
  readonly max: number;
  readonly maxOpen: boolean;
}

export interface FieldInfo {
  /** as the screen labels the field */
  readonly label: string;
  /** the dimension of its unit; null: a plain number (fraction, ratio, angle) */
  readonly dimension: Dimension | null;
  /** accepted values in internal units; absent: not a number, or checked elsewhere */
  readonly bounds?: Bounds;
}

export const bounds = (min: number, minOpen: boolean, max: number, maxOpen: boolean): Bounds => ({ min, minOpen, max, maxOpen });
/** > 0 (up to the working range) */
export const POSITIVE = bounds(0, true, WORKING_MAX, false);
/** ≥ 0 (up to the working range) */
export const NON_NEGATIVE = bounds(0, false, WORKING_MAX, false);
const ANY = bounds(-WORKING_MAX, false, WORKING_MAX, false);
const OPEN_FRACTION = bounds(0, true, 1, true);

/** The internal unit of each dimension (src/core/units.ts). */
export const INTERNAL_UNIT: Readonly<Record<Dimension, string>> = {
  length: 'm',
  time: 'd',
  velocity: 'm/d',
  conductivity: 'K:m/d',
  concentration: 'mg/L',
  density: 'g/cm3',
  partition: 'L/kg',
  diffusion: 'm2/d',
  rate: '1/d',
  flowRate: 'm3/d',
  dimensionless: '-',
};

const f = (label: string, dimension: Dimension | null, b?: Bounds): FieldInfo => ({ label, dimension, bounds: b });

/** Field paths with list indices written `[]` (site.receptors[].screenTop). */
export const CASE_FIELDS: Readonly<Record<string, FieldInfo>> = {
  'site.frame': f('Map frame', null),
  'site.datum': f('Site datum', null),
  'site.source.position': f('Release position', null),
  'site.source.footprint': f('Release outline', null),
  'site.source.footprint[]': f('Release outline corner', null),
  'site.source.width': f('Source width across the flow', 'length', POSITIVE),
  'site.flow': f('Flow', null),
  'site.flow.method': f('Flow from', null),
  'site.flow.azimuthDeg': f('Flow towards (degrees clockwise from north)', null, ANY),
  'site.flow.gradient': f('Hydraulic gradient i', null, OPEN_FRACTION),
  'site.flow.readings': f('Water levels in wells', null),
  'site.flow.readings[]': f('Water-level well', null),
  'site.flow.readings[].position': f('Position of the water-level well', null),
  'site.flow.readings[].head': f('Water level', 'length', ANY),
  'site.receptors': f('Receptors', null),
  'site.receptors[]': f('Receptor', null),
  'site.receptors[].kind': f('Kind', null),
  'site.receptors[].position': f('Receptor position', null),
  'site.receptors[].screenTop': f('Screen top below water table', 'length', NON_NEGATIVE),
  'site.receptors[].screenBottom': f('Screen bottom', 'length', NON_NEGATIVE),
  'site.receptors[].pumping': f('Pumps', null),
  // shown in m³/d (SI) or US gallons per minute (US customary: the unit US well records give; unitSystem.ts)
  'site.receptors[].pumpingRate': f('Pumping rate', 'flowRate', POSITIVE),
  'site.boundaries': f('Boundary lines', null),
  'site.boundaries[]': f('Boundary line', null),
  'site.boundaries[].points': f('Boundary line ends', null),
  'aquifer.hydraulicConductivity': f('Hydraulic conductivity K', 'conductivity', POSITIVE),
  'aquifer.effectivePorosity': f('Effective porosity nₑ', null, OPEN_FRACTION),
  'aquifer.totalPorosity': f('Total porosity n', null, OPEN_FRACTION),
  'aquifer.bulkDensity': f('Dry bulk density ρb', 'density', bounds(0, true, 3, false)),
  'aquifer.fractionOrganicCarbon': f('Fraction of organic carbon foc', null, bounds(0, false, 1, false)),
  'aquifer.saturatedThickness': f('Saturated thickness of the aquifer', 'length', bounds(0, true, 10_000, false)),
  'aquifer.dispersivity': f('Dispersivity', null),
  'aquifer.dispersivity.mode': f('Dispersivity', null),
  'aquifer.dispersivity.relation': f('Scale relation for αL', null),
  'aquifer.dispersivity.transverseRatio': f('αT / αL', null, bounds(0, true, 1, false)),
  'aquifer.dispersivity.verticalRatio': f('αV / αL', null, bounds(0, true, 1, false)),
  'aquifer.dispersivity.longitudinal': f('Longitudinal αL', 'length', POSITIVE),
  'aquifer.dispersivity.transverse': f('Transverse horizontal αT', 'length', POSITIVE),
  'aquifer.dispersivity.vertical': f('Transverse vertical αV', 'length', POSITIVE),
  'aquifer.diffusion': f('Molecular diffusion', 'diffusion', NON_NEGATIVE),
  'aquifer.diffusion.include': f('Molecular diffusion', null),
  'aquifer.diffusion.freeWater': f('Free-water diffusion D₀', 'diffusion', NON_NEGATIVE),
  'aquifer.diffusion.tortuosity': f('Tortuosity factor τ', null, bounds(0, true, 1, false)),
  'contaminant.name': f('Contaminant', null),
  'contaminant.presetId': f('Contaminant preset', null),
  'contaminant.sorption': f('Sorption', null),
  'contaminant.sorption.mode': f('Sorption given as', null),
  'contaminant.sorption.koc': f('Organic-carbon partition coefficient Koc', 'partition', NON_NEGATIVE),
  'contaminant.sorption.kd': f('Distribution coefficient Kd', 'partition', NON_NEGATIVE),
  'contaminant.halfLife': f('Biodegradation half-life', 'time', POSITIVE),
  'contaminant.decayPhase': f('Decay acts on', null),
  'contaminant.limit': f('Limit at the receptors', 'concentration', POSITIVE),
  'contaminant.limitNote': f('Limit note', null),
  'source.concentration': f('Source concentration C₀', 'concentration', POSITIVE),
  'source.thickness': f('Source thickness below the water table', 'length', POSITIVE),
  'source.duration': f('Release duration', 'time', POSITIVE),
  'source.sourceHalfLife': f('Source half-life', 'time', POSITIVE),
  'evaluation.solution': f('Solution', null),
  'evaluation.horizon': f('Time horizon', 'time', POSITIVE),
  'evaluation.viewTime': f('Time shown on the map', 'time', POSITIVE),
  'evaluation.depth': f('Depth shown on the map', 'length', NON_NEGATIVE),
  'monitoring.wells': f('Monitoring wells', null),
  'monitoring.wells[]': f('Monitoring well', null),
  'monitoring.wells[].position': f('Position of the monitoring well', null),
  'uncertainty.inputs.dispersivityFactor': f('Dispersivity factor (on αL, αT and αV)', null, POSITIVE),
};

/**
 * The words the screen shows for each choice of a field that is a choice, in the order the screen
 * offers them: the panels' switches and the comparison of two cases read these, never the codes.
 */
export const CHOICE_WORDS: Readonly<Record<string, Readonly<Record<string, string>>>> = {
  'site.frame': { geographic: 'On the basemap (longitude, latitude)', local: 'Local site grid (from a datum)' },
  'site.flow.method': { direction: 'Arrow and gradient', heads: 'Water levels in wells' },
  'aquifer.dispersivity.mode': { estimate: 'Estimate from distance', given: 'My values' },
  'contaminant.sorption.mode': { koc: 'Koc (with foc)', kd: 'Kd directly' },
  'contaminant.decayPhase': { 'dissolved-and-sorbed': 'Dissolved and sorbed', 'dissolved-only': 'Dissolved only' },
  'evaluation.solution': { domenico: 'Domenico (1987, approximate)', exact: 'Exact rectangular source' },
  'units.system': { SI: 'SI (metres)', US: 'US (feet)' },
};

/** A choice in the screen's words (a value the field does not list: as it is). */
export function choiceText(path: string, value: string): string {
  return CHOICE_WORDS[fieldPattern(path)]?.[value] ?? value;
}

/** A choice field's options for a switch on the screen: [{ id, label }] in the screen's order. */
export function choiceOptions<T extends string>(path: string): { id: T; label: string }[] {
  return Object.entries(CHOICE_WORDS[path] ?? {}).map(([id, label]) => ({ id: id as T, label }));
}

/** 'site.receptors[2].screenTop' → 'site.receptors[].screenTop' */
export const fieldPattern = (path: string): string => path.replace(/\[\d+\]/g, '[]');

/** The field's entry, or that of the nearest enclosing field that has one. */
export function fieldInfo(path: string): FieldInfo | undefined {
  let p = fieldPattern(path);
  for (;;) {
    const hit = CASE_FIELDS[p];
    if (hit) return hit;
    const cut = Math.max(p.lastIndexOf('.'), p.endsWith('[]') ? p.length - 2 : -1);
    if (cut <= 0) return undefined;
    p = p.slice(0, cut);
  }
}

/** Names of the list items a path runs through ("receptor 3", or its name from the case). */
export type ItemNamer = (list: string, index: number) => string | undefined;

const LIST_WORDS: Record<string, string> = {
  'site.receptors': 'receptor',
  'site.flow.readings': 'water-level well',
  'site.boundaries': 'boundary line',
  'site.source.footprint': 'corner',
  'monitoring.wells': 'monitoring well',
};

/**
 * The label of a case field as the screen shows it, with the list item it belongs to:
 * 'site.receptors[1].screenTop' → 'Screen top below water table of “Farm well”'. Unknown paths
 * are returned as they are.
 */
export function fieldLabel(path: string, nameOf?: ItemNamer): string {
  const info = CASE_FIELDS[fieldPattern(path)];
  const m = /^(site\.receptors|site\.flow\.readings|site\.boundaries|site\.source\.footprint|monitoring\.wells)\[(\d+)\](.*)$/.exec(path);
  if (!m) return info?.label ?? (path.endsWith('.unit') ? `Unit of ${lower(fieldLabel(path.slice(0, -5), nameOf))}` : path);
  const [, list, idx, rest] = m;
  const i = Number(idx);
  const name = nameOf?.(list, i);
  const item = name ? `“${name}”` : `${LIST_WORDS[list]} ${i + 1}`;
  if (rest.endsWith('.unit')) return `Unit of ${lower(fieldLabel(path.slice(0, -5), nameOf))}`;
  if (!rest) return list === 'site.source.footprint' ? `Release outline ${item}` : capital(name ? `${LIST_WORDS[list]} ${item}` : item);
  return `${info?.label ?? rest.replace(/^\./, '')} of ${item}`;
}

const capital = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);
const lower = (s: string) => s.charAt(0).toLowerCase() + s.slice(1);

/** A number as a person writes it: 1e30 (not 1e+30), a true minus sign. */
export function writtenNumber(v: number): string {
  return (Number.isFinite(v) ? String(v) : v > 0 ? 'infinity' : v < 0 ? '−infinity' : 'not a number').replace('e+', 'e').replace(/^-/, '−');
}

function bound(v: number, unit: string | null): string {
  const factor = unit ? (UNITS[unit]?.factor ?? 1) : 1;
  const shown = writtenNumber(Number(formatSig(v / factor, 4)));
  const label = unit && unit !== '-' ? ` ${UNITS[unit]?.label ?? unit}` : '';
  return shown + label;
}

/**
 * The accepted range in words, in `unit` (null: a plain number): "above 0 and below 1",
 * "0 or more m", "above 0 m/d". The working range's ends are said only where the value passed
 * them (or the range has no other end), so a usual message stays short.
 */
export function acceptedWords(b: Bounds, unit: string | null, value?: number): string {
  const v = value === undefined || Number.isNaN(value) ? undefined : value * (unit ? (UNITS[unit]?.factor ?? 1) : 1);
  const tiny = v !== undefined && v !== 0 && Math.abs(v) < WORKING_MIN;
  const zeroOrMore = b.min === 0 && !b.minOpen;
  let low: string | null;
  if (b.min === -WORKING_MAX) low = v !== undefined && v < b.min ? `at least ${bound(b.min, unit)}` : null;
  else if (tiny && b.min === 0) low = `${b.minOpen ? '' : '0 or '}at least ${bound(WORKING_MIN, unit)}`;
  else if (zeroOrMore) low = null;
  else low = `${b.minOpen ? 'above' : 'at least'} ${bound(b.min, unit)}`;
  const showHigh = b.max !== WORKING_MAX || (v !== undefined && v > b.max);
  const high = showHigh ? `${b.maxOpen ? 'below' : 'at most'} ${bound(b.max, unit)}` : null;
  const words = low && high ? `${low} and ${high}` : (low ?? (high && zeroOrMore ? `from 0 to ${bound(b.max, unit)}` : high));
  if (words) return words.startsWith('at ') ? `of ${words}` : words;
  return zeroOrMore ? `of ${bound(0, unit)} or more` : 'that is a finite number';
}

/** Is `v` (internal units) inside the bounds and the engine's working range? */
export function withinBounds(b: Bounds, v: number): boolean {
  if (typeof v !== 'number' || !Number.isFinite(v)) return false;
  if (v !== 0 && Math.abs(v) < WORKING_MIN) return false;
  return (b.minOpen ? v > b.min : v >= b.min) && (b.maxOpen ? v < b.max : v <= b.max);
}
