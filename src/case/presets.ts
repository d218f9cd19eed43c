/**
 * Presets: published starting values for contaminants and aquifer materials, each with the
 * publication it comes from exactly as recorded in docs/field-values.md (in this repository), and whether the
 * number was read in that publication ('seen'), is from memory and must be checked before it is
 * shown as published ('recalled, to verify'), or is a rule of thumb ('common practice').
 *
 * A preset only fills in a starting value; the site's own values and the limit that applies
 * locally always govern. Internal units: Koc and Kd L/kg, half-lives d, limits mg/L, K m/d.
 * Anything marked 'recalled, to verify' must say so to the user wherever it is shown
 * (`provenanceLabel` gives the words).
 */

export type Provenance = 'seen' | 'recalled, to verify' | 'common practice';

export interface Sourced {
  /** the publication, as named in docs/field-values.md */
  readonly source: string;
  readonly provenance: Provenance;
}

export interface SourcedValue extends Sourced {
  readonly value: number;
}

export interface SourcedRange extends Sourced {
  readonly min: number;
  readonly max: number;
}

export interface DrinkingWaterLimit extends Sourced {
  /** who sets it, in a few words */
  readonly authority: string;
  /** mg/L */
  readonly value: number;
  /** the chemical basis of the value when it matters (nitrate: as N or as NO₃⁻) */
  readonly basis: string | null;
}

export interface ContaminantPreset {
  readonly id: string;
  readonly name: string;
  readonly group: string;
  /** Koc (L/kg), or null when sorption is given as Kd instead */
  readonly koc: SourcedValue | null;
  /** Kd (L/kg) given directly (nitrate: ≈ 0), or null */
  readonly kd: SourcedValue | null;
  /** first-order half-life range in groundwater, d; null when no published range is on record */
  readonly halfLife: SourcedRange | null;
  /** example drinking-water limits (mg/L); the user's own limit always rules */
  readonly limits: readonly DrinkingWaterLimit[];
  /** what a user must know before using the preset */
  readonly notes: readonly string[];
}

const YR = 365.25;

// Table K-1 ('Values Used for Koc/Kow Correlation', measured geometric means) was seen in a reproduction of
// Appendix K (docs/field-values.md says where and when); the recalled values are not in that table.
const EPA_SSG = 'US EPA 1996, Soil Screening Guidance: Technical Background Document, Appendix K, Table K-1 (measured geometric mean)';
const EPA_SSG_RECALLED = 'US EPA 1996, Soil Screening Guidance: Technical Background Document';
const HOWARD = 'Howard et al. 1991, Handbook of Environmental Degradation Rates';
const EPA_MCL = 'US EPA National Primary Drinking Water Regulations (maximum contaminant level)';
const WHO = 'WHO Guidelines for Drinking-water Quality';

const seen = (value: number, source: string): SourcedValue => ({ value, source, provenance: 'seen' });
const recalled = (value: number, source: string): SourcedValue => ({ value, source, provenance: 'recalled, to verify' });
const mcl = (value: number, basis: string | null = null): DrinkingWaterLimit => ({
  authority: 'US EPA MCL',
  value,
  basis,
  source: EPA_MCL,
  provenance: 'seen',
});
const HALF_LIFE_NOTE = 'Half-lives are site-specific: the range is a guide; enter the value for your site.';

export const CONTAMINANT_PRESETS: readonly ContaminantPreset[] = Object.freeze([
  {
    id: 'benzene',
    name: 'benzene',
    group: 'fuel aromatic',
    koc: seen(61.7, EPA_SSG),
    kd: null,
    halfLife: { min: 10, max: 2 * YR, source: HOWARD, provenance: 'recalled, to verify' },
    limits: [mcl(0.005), { authority: 'WHO guideline', value: 0.01, basis: null, source: WHO, provenance: 'seen' }],
    notes: [HALF_LIFE_NOTE],
  },
  {
    id: 'mtbe',
    name: 'methyl tert-butyl ether (MTBE)',
    group: 'fuel oxygenate',
    koc: recalled(11, EPA_SSG_RECALLED),
    kd: null,
    halfLife: null,
    limits: [],
    notes: [
      'No US federal maximum contaminant level; some states set their own. Enter the limit that applies at your site.',
      'No published half-life range is on record here; MTBE often degrades slowly. Leave decay off unless your site has a measured rate.',
    ],
  },
  {
    id: 'tce',
    name: 'trichloroethylene (TCE)',
    group: 'chlorinated solvent',
    koc: seen(94.3, EPA_SSG),
    kd: null,
    halfLife: { min: 0.9 * YR, max: 4.5 * YR, source: HOWARD, provenance: 'recalled, to verify' },
    limits: [mcl(0.005)],
    notes: [HALF_LIFE_NOTE, 'Degradation produces cis-1,2-dichloroethylene and vinyl chloride, which are not modelled here; screen them as separate cases.'],
  },
  {
    id: 'pce',
    name: 'tetrachloroethylene (PCE)',
    group: 'chlorinated solvent',
    koc: seen(265, EPA_SSG),
    kd: null,
    halfLife: { min: 1 * YR, max: 2 * YR, source: HOWARD, provenance: 'recalled, to verify' },
    limits: [mcl(0.005)],
    notes: [HALF_LIFE_NOTE, 'Degradation produces trichloroethylene and its daughters, which are not modelled here; screen them as separate cases.'],
  },
  {
    id: 'cis-dce',
    name: 'cis-1,2-dichloroethylene',
    group: 'chlorinated daughter product',
    koc: recalled(35.5, EPA_SSG_RECALLED),
    kd: null,
    halfLife: null,
    limits: [mcl(0.07)],
    notes: ['No published half-life range is on record here; enter a site-specific value or leave decay off.'],
  },
  {
    id: 'vinyl-chloride',
    name: 'vinyl chloride',
    group: 'chlorinated daughter product',
    koc: recalled(18.6, EPA_SSG_RECALLED),
    kd: null,
    halfLife: null,
    limits: [mcl(0.002)],
    notes: ['No published half-life range is on record here; enter a site-specific value or leave decay off.'],
  },
  {
    id: 'nitrate',
    name: 'nitrate',
    group: 'non-sorbing anion',
    koc: null,
    kd: { value: 0, source: 'nitrate is an anion and is taken as non-sorbing (R = 1)', provenance: 'common practice' },
    halfLife: null,
    limits: [
      mcl(10, 'as N'),
      { authority: 'WHO guideline', value: 50, basis: 'as NO₃⁻', source: WHO, provenance: 'seen' },
    ],
    notes: [
      'The two limits are on different bases: 10 mg/L as N equals about 44 mg/L as NO₃⁻ (molar masses 62.00 / 14.01). Enter the source concentration on the same basis as the limit.',
      'Denitrification is site-specific and needs low oxygen; leave decay off unless your site has a measured rate.',
    ],
  },
]);

export function contaminantPreset(id: string): ContaminantPreset | undefined {
  return CONTAMINANT_PRESETS.find((p) => p.id === id);
}

/** Words to show beside a preset value: '' for seen values, otherwise the caveat. */
export function provenanceLabel(p: Sourced): string {
  switch (p.provenance) {
    case 'seen':
      return '';
    case 'recalled, to verify':
      // not confirmed against the publication in this project (issue 13 item 12): say how it is known
      return 'as commonly cited, attributed to this source; not confirmed against the publication';
    case 'common practice':
      return 'common practice (rule of thumb)';
  }
}

/** "value (source; caveat)" for help texts and the report. */
export function citeValue(v: SourcedValue | SourcedRange, unit: string): string {
  const figure = 'value' in v ? `${v.value} ${unit}` : `${v.min} – ${v.max} ${unit}`;
  const caveat = provenanceLabel(v);
  return `${figure} (${v.source}${caveat ? '; ' + caveat : ''})`;
}

// ---------------------------------------------------------------------------------------------
// Aquifer materials

export interface MaterialPreset {
  readonly id: string;
  readonly name: string;
  /** hydraulic conductivity range, m/d */
  readonly conductivity: SourcedRange;
  /** total porosity range, when on record */
  readonly totalPorosity: SourcedRange | null;
}

const BOUWER = 'Bouwer 1978, Groundwater Hydrology, as tabulated in Canter, Knox & Fairchild 1988, Table 2.1';
const FREEZE_CHERRY = 'Freeze & Cherry 1979, Groundwater, Table 2.2';
const MS_TO_MD = 86400;

const bouwer = (min: number, max: number): SourcedRange => ({ min, max, source: BOUWER, provenance: 'seen' });
const fcK = (minMs: number, maxMs: number): SourcedRange => ({
  min: minMs * MS_TO_MD,
  max: maxMs * MS_TO_MD,
  source: FREEZE_CHERRY + ' (given in m/s, converted here)',
  provenance: 'recalled, to verify',
});
const fcN = (min: number, max: number): SourcedRange => ({ min, max, source: FREEZE_CHERRY, provenance: 'recalled, to verify' });

/** Hydraulic conductivity (Bouwer 1978, seen) with total porosity where Freeze & Cherry give it (recalled). */
export const MATERIAL_PRESETS: readonly MaterialPreset[] = Object.freeze([
  { id: 'fine-sand', name: 'fine sand', conductivity: bouwer(1, 5), totalPorosity: fcN(0.25, 0.5) },
  { id: 'medium-sand', name: 'medium sand', conductivity: bouwer(5, 20), totalPorosity: fcN(0.25, 0.5) },
  { id: 'coarse-sand', name: 'coarse sand', conductivity: bouwer(20, 100), totalPorosity: fcN(0.25, 0.5) },
  { id: 'gravel', name: 'gravel', conductivity: bouwer(100, 1000), totalPorosity: fcN(0.25, 0.4) },
  { id: 'sand-and-gravel', name: 'sand and gravel mixes', conductivity: bouwer(5, 100), totalPorosity: null },
  { id: 'till', name: 'till', conductivity: bouwer(0.001, 0.1), totalPorosity: null },
  { id: 'clay', name: 'clay', conductivity: bouwer(1e-8, 1e-2), totalPorosity: fcN(0.4, 0.7) },
  { id: 'sandstone', name: 'sandstone', conductivity: bouwer(0.001, 1), totalPorosity: null },
]);

/** The wider ranges of Freeze & Cherry 1979 Table 2.2 (recalled, to verify), K in m/d. */
export const MATERIAL_RANGES_FREEZE_CHERRY: readonly MaterialPreset[] = Object.freeze([
  { id: 'fc-gravel', name: 'gravel', conductivity: fcK(1e-3, 1), totalPorosity: fcN(0.25, 0.4) },
  { id: 'fc-clean-sand', name: 'clean sand', conductivity: fcK(1e-6, 1e-2), totalPorosity: fcN(0.25, 0.5) },
  { id: 'fc-silty-sand', name: 'silty sand', conductivity: fcK(1e-7, 1e-3), totalPorosity: null },
  { id: 'fc-silt', name: 'silt', conductivity: fcK(1e-9, 1e-5), totalPorosity: fcN(0.35, 0.5) },
  { id: 'fc-till', name: 'glacial till', conductivity: fcK(1e-12, 1e-6), totalPorosity: null },
]);

export function materialPreset(id: string): MaterialPreset | undefined {
  return MATERIAL_PRESETS.find((p) => p.id === id) ?? MATERIAL_RANGES_FREEZE_CHERRY.find((p) => p.id === id);
}

/**
 * The conductivity a material fills in, m/d: the geometric mean of its published range (the
 * middle of a log-spread quantity), to two significant digits.
 */
export function typicalConductivity(m: MaterialPreset): number {
  return Number(Math.sqrt(m.conductivity.min * m.conductivity.max).toPrecision(2));
}

/**
 * The material whose typical conductivity K (m/d) is, so the picker keeps showing the material
 * that filled K in (derived, not stored); undefined once K is anything else.
 */
export function materialOfConductivity(kMd: number): MaterialPreset | undefined {
  return MATERIAL_PRESETS.find((m) => Math.abs(typicalConductivity(m) - kMd) <= 1e-6 * Math.abs(kMd));
}

// ---------------------------------------------------------------------------------------------
// Usual field ranges: values outside them are accepted but warned about ("doubtful input").

export interface FieldRange extends SourcedRange {
  /** case field path the range applies to */
  readonly field: string;
  readonly unit: string;
}

export const FIELD_RANGES: readonly FieldRange[] = Object.freeze([
  {
    field: 'aquifer.hydraulicConductivity',
    unit: 'm/d',
    min: 1e-8,
    max: 1000,
    source: BOUWER + ' (clay to gravel)',
    provenance: 'seen',
  },
  {
    field: 'aquifer.totalPorosity',
    unit: '–',
    min: 0.25,
    max: 0.7,
    source: FREEZE_CHERRY + ' (unconsolidated deposits, gravel to clay)',
    provenance: 'recalled, to verify',
  },
  {
    field: 'aquifer.fractionOrganicCarbon',
    unit: '–',
    min: 0.0001,
    max: 0.001,
    source: 'foc of clean sand',
    provenance: 'common practice',
  },
]);
