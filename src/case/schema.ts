/**
 * The case file: one release at one site, with its receptors and parameters. Versioned JSON,
 * validated with zod. `CASE_VERSION` is the current version; older versions migrate forward in
 * `migrate.ts`. Quantities carry their unit ({ value, unit }) so the unit a user chose per field
 * survives saving; the engine converts to SI at the edge (see `prepare.ts`). Physical ranges
 * (porosity in (0, 1), K > 0, …) are checked there, not here, so a case being edited can always
 * be stored and reopened; the schema checks shape, types, units and sizes.
 *
 * Positions are [x, y] pairs: in a geographic case [longitude, latitude] in degrees (WGS 84,
 * the GeoJSON order of RFC 7946); in a local case [east, north] in metres from the site datum.
 */
import './zodConfig';
import { z } from 'zod';

export const CASE_FORMAT = 'downgradient-case';
export const CASE_VERSION = 3;

export { quantity } from './quantity';
import { quantity } from './quantity';
import { DEFAULT_MONITORING, monitoringSchema } from './monitoring';
export type Quantity = { value: number; unit: string };

const finite = z.number().refine(Number.isFinite, { message: 'must be a finite number' });
export const position = z.tuple([finite, finite]);
export type Position = [number, number];

const id = z.string().min(1).max(64);
const name = z.string().max(200);

export const headReading = z.object({
  id,
  name,
  position,
  head: quantity('length'),
});
export type HeadReading = z.infer<typeof headReading>;

export const flow = z.discriminatedUnion('method', [
  z.object({
    method: z.literal('direction'),
    /** direction groundwater flows towards, degrees clockwise from north */
    azimuthDeg: finite,
    gradient: z.number().nonnegative(),
  }),
  z.object({
    method: z.literal('heads'),
    readings: z.array(headReading).max(200),
  }),
]);
export type Flow = z.infer<typeof flow>;

export const receptorKind = z.enum(['well', 'spring', 'surface-water', 'property-line', 'other']);
export type ReceptorKind = z.infer<typeof receptorKind>;

export const receptor = z.object({
  id,
  name,
  kind: receptorKind,
  position,
  /** depth below the water table of the top and bottom of the screen (or the point, when equal) */
  screenTop: quantity('length'),
  screenBottom: quantity('length'),
  pumping: z.boolean().default(false),
  /** pumping rate; only used once pumping wells are represented */
  pumpingRate: quantity('flowRate').nullable().default(null),
});
export type Receptor = z.infer<typeof receptor>;

export const dispersivity = z.discriminatedUnion('mode', [
  z.object({
    mode: z.literal('estimate'),
    /** scale relation for αL from the distance to the farthest receptor */
    relation: z.enum(['xu-eckstein-1995', 'tenth-of-distance']),
    /** αT/αL and αV/αL */
    transverseRatio: z.number().positive().max(1),
    verticalRatio: z.number().positive().max(1),
  }),
  z.object({
    mode: z.literal('given'),
    longitudinal: quantity('length'),
    transverse: quantity('length'),
    vertical: quantity('length'),
  }),
]);
export type Dispersivity = z.infer<typeof dispersivity>;

export const caseSchemaV2 = z.object({
  format: z.literal(CASE_FORMAT),
  version: z.literal(2),
  id,
  name: z.string().min(1).max(200),
  created: z.string().max(40),
  modified: z.string().max(40),
  /** id of the case this one was duplicated from as a what-if variant */
  parentId: id.nullable().default(null),
  notes: z.string().max(20000).default(''),
  site: z.object({
    frame: z.enum(['geographic', 'local']),
    /** geographic: the map's reference point [lon, lat]; local: always [0, 0] */
    datum: position,
    source: z.object({
      /** the release point (centre of the source plane) */
      position,
      /** traced footprint; when null the release is a point with `width` across the flow */
      footprint: z.array(position).max(500).nullable(),
      width: quantity('length'),
    }),
    flow,
    receptors: z.array(receptor).max(200),
  }),
  aquifer: z.object({
    hydraulicConductivity: quantity('conductivity'),
    effectivePorosity: z.number(),
    totalPorosity: z.number(),
    /** null: estimated from total porosity as 2.65 (1 − n) g/cm³ (quartz grains; common practice) */
    bulkDensity: quantity('density').nullable(),
    fractionOrganicCarbon: z.number(),
    dispersivity,
    diffusion: z.object({
      include: z.boolean(),
      freeWater: quantity('diffusion'),
      tortuosity: z.number(),
    }),
  }),
  contaminant: z.object({
    name: z.string().max(200),
    /** id of the preset it came from, if any (presets carry the published sources) */
    presetId: z.string().max(64).nullable(),
    /** sorption: Koc (then Kd = Koc·foc) or Kd given directly */
    sorption: z.discriminatedUnion('mode', [
      z.object({ mode: z.literal('koc'), koc: quantity('partition') }),
      z.object({ mode: z.literal('kd'), kd: quantity('partition') }),
    ]),
    /** null: no degradation */
    halfLife: quantity('time').nullable(),
    decayPhase: z.enum(['dissolved-and-sorbed', 'dissolved-only']),
    limit: quantity('concentration'),
    limitNote: z.string().max(500).default(''),
  }),
  source: z.object({
    concentration: quantity('concentration'),
    thickness: quantity('length'),
    /** null: continuous release; otherwise the release stops after this long */
    duration: quantity('time').nullable(),
    /** null: constant source; otherwise the source concentration halves in this time */
    sourceHalfLife: quantity('time').nullable(),
  }),
  evaluation: z.object({
    solution: z.enum(['domenico', 'exact']),
    horizon: quantity('time'),
    /** the time shown on the map (≤ horizon); null: steady state */
    viewTime: quantity('time').nullable(),
    depth: quantity('length'),
  }),
});

export type CaseV2 = z.infer<typeof caseSchemaV2>;

// ---------------------------------------------------------------------------------------------
// Version 3: everything this version adds is optional with a default, so a v2 file migrates by
// taking the defaults (migrate.ts).

/** The inputs that can carry a distribution instead of a fixed value (src/case/uncertainty.ts maps them). */
export const UNCERTAIN_INPUTS = [
  'hydraulicConductivity',
  'gradient',
  'flowDirection',
  'effectivePorosity',
  'fractionOrganicCarbon',
  'koc',
  'kd',
  'halfLife',
  'sourceHalfLife',
  'dispersivityFactor',
  'sourceConcentration',
  'sourceWidth',
  'sourceThickness',
  'releaseDuration',
  // appended, so the Latin hypercube columns of the inputs above (and so every stored run) stay as they were
  'totalPorosity',
] as const;
export type UncertainInput = (typeof UNCERTAIN_INPUTS)[number];

const truncate = z.object({ low: finite.nullable().optional(), high: finite.nullable().optional() }).nullable().optional();
/** Numbers are finite here; their order and physical sense are checked when a run is prepared. */
export const distribution = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('uniform'), low: finite, high: finite }),
  z.object({ kind: z.literal('log-uniform'), low: finite, high: finite }),
  z.object({ kind: z.literal('triangular'), low: finite, mode: finite, high: finite }),
  z.object({ kind: z.literal('normal'), mean: finite, sd: finite }),
  z.object({ kind: z.literal('lognormal'), median: finite, gsd: finite }),
  /** low and high read as the `percentile`-th and (100 − percentile)-th percentiles */
  z.object({ kind: z.literal('lognormal-range'), low: finite, high: finite, percentile: finite }),
]);
/** A distribution in the unit of `unit` (a unit of the input's dimension; none for dimensionless inputs). */
export const uncertainValue = z.intersection(distribution, z.object({ unit: z.string().max(20).optional(), truncate, note: z.string().max(500).optional() }));
export type UncertainValue = z.infer<typeof uncertainValue>;

export const uncertaintySettings = z.object({
  /** realisations per run; checked (1 … 50 000) when a run starts */
  runs: finite.default(2000),
  /** a whole number ≥ 0; the same seed and runs give the same results everywhere */
  seed: finite.default(1),
  inputs: z
    .object(Object.fromEntries(UNCERTAIN_INPUTS.map((k) => [k, uncertainValue.optional()])) as Record<UncertainInput, z.ZodOptional<typeof uncertainValue>>)
    .strict()
    .default({}),
  /** heads with ≥ 4 readings: sample gradient and direction from the plane fit's least-squares covariance */
  headFit: z.boolean().default(false),
});
export type UncertaintySettings = z.infer<typeof uncertaintySettings>;
export const DEFAULT_UNCERTAINTY: UncertaintySettings = { runs: 2000, seed: 1, inputs: {}, headFit: false };

/**
 * A straight boundary of the aquifer drawn on the map (version 3; the image-well method,
 * src/core/flow): a stream or lake shore held at constant head, or an impermeable boundary. The
 * line through its two points is taken as infinitely long; the aquifer is the side holding the source.
 */
export const boundaryLine = z.object({
  id,
  name,
  kind: z.enum(['constant-head', 'no-flow']),
  points: z.tuple([position, position]),
});
export type BoundaryLine = z.infer<typeof boundaryLine>;

export const caseSchemaV3 = caseSchemaV2.extend({
  version: z.literal(CASE_VERSION),
  site: caseSchemaV2.shape.site.extend({
    /** straight aquifer boundaries (version 3; absent: none) */
    boundaries: z.array(boundaryLine).max(4).optional(),
  }),
  aquifer: caseSchemaV2.shape.aquifer.extend({
    /** saturated thickness B (version 3; absent or null: not given, so pumping wells are not modelled) */
    saturatedThickness: quantity('length').nullable().optional(),
  }),
  uncertainty: uncertaintySettings.default(DEFAULT_UNCERTAINTY),
  /**
   * the unit system everything is shown in, with per-field overrides (version 3; unitSystem.ts;
   * absent: SI, each field shown in the unit it was typed in). Stored quantities keep their typed unit.
   */
  units: z
    .object({
      system: z.enum(['SI', 'US']),
      /** case field path → the unit that field is shown in */
      fields: z.record(z.string().max(120), z.string().max(20)).default({}),
    })
    .optional(),
  /** monitoring wells and sampling results (monitoring.ts); default: none */
  monitoring: monitoringSchema.default(DEFAULT_MONITORING),
});

export type Case = z.infer<typeof caseSchemaV3>;
export const caseSchema = caseSchemaV3;
