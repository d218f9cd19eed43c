/**
 * Case file version 1: the compact form a user writes by hand for the command line.
 *
 * Every number is plain (no { value, unit } objects) and in the internal units:
 *   lengths m · times d · concentrations mg/L · hydraulic conductivity m/d · Koc and Kd L/kg ·
 *   bulk density g/cm³ · free-water diffusion coefficient m²/d · porosities and foc as fractions.
 * Receptors are listed as `wells` (each may say another `kind`). Unknown keys are errors, so a
 * misspelt field is reported instead of silently ignored. Example: cases/v1-compact-example.json.
 *
 * {
 *   "format": "downgradient-case", "version": 1,
 *   "name": "…",                        required
 *   "id", "created", "notes":           optional
 *   "frame": "local" | "geographic",    default "local"; geographic positions are [lon, lat]
 *   "datum": [x, y],                    geographic only; default: the source position
 *   "source": { "position": [x, y], "width": m, "thickness": m, "concentration": mg/L,
 *               "footprint"?: [[x, y], …], "duration"?: d | null, "halfLife"?: d | null },
 *   "flow": { "azimuth": degrees clockwise from north (towards where water flows), "gradient": – }
 *        or { "heads": [ { "position": [x, y], "head": m, "name"? }, … ] },
 *   "aquifer": { "K": m/d, "effectivePorosity", "totalPorosity", "foc",
 *                "bulkDensity"?: g/cm³ (default 2.65 (1 − n)),
 *                "dispersivity"?: [αL, αT, αV] m  or  { "relation"?, "transverseRatio"?, "verticalRatio"? },
 *                "diffusion"?: { "freeWater": m²/d, "tortuosity" } },
 *   "contaminant": { "name"?, "preset"?: preset id, "koc"? | "kd"?, "halfLife"?: d | null,
 *                    "decayPhase"?, "limit": mg/L (required: the local limit governs), "limitNote"? },
 *   "wells": [ { "name"?, "id"?, "kind"?, "position": [x, y], "screenTop"?: m, "screenBottom"?: m } ],
 *   "horizon": d, "viewTime"?: d | null (null: steady state), "depth"?: m, "solution"?: "domenico" | "exact"
 * }
 */
import './zodConfig';
import { z } from 'zod';
import { CASE_FORMAT } from './schema';

const finite = z.number().refine(Number.isFinite, { message: 'must be a finite number' });
const pos = z.tuple([finite, finite]);

export const caseSchemaV1 = z.strictObject({
  format: z.literal(CASE_FORMAT),
  version: z.literal(1),
  id: z.string().min(1).max(64).optional(),
  name: z.string().min(1).max(200),
  created: z.string().max(40).optional(),
  notes: z.string().max(20000).optional(),
  frame: z.enum(['local', 'geographic']).default('local'),
  datum: pos.optional(),
  source: z.strictObject({
    position: pos,
    width: finite,
    thickness: finite,
    concentration: finite,
    footprint: z.array(pos).max(500).nullable().optional(),
    duration: finite.nullable().optional(),
    halfLife: finite.nullable().optional(),
  }),
  flow: z.union([
    z.strictObject({ azimuth: finite, gradient: finite }),
    z.strictObject({
      heads: z
        .array(z.strictObject({ position: pos, head: finite, name: z.string().max(200).optional() }))
        .max(200),
    }),
  ]),
  aquifer: z.strictObject({
    K: finite,
    effectivePorosity: finite,
    totalPorosity: finite,
    foc: finite,
    bulkDensity: finite.nullable().optional(),
    dispersivity: z
      .union([
        z.tuple([finite, finite, finite]),
        z.strictObject({
          relation: z.enum(['xu-eckstein-1995', 'tenth-of-distance']).optional(),
          transverseRatio: finite.optional(),
          verticalRatio: finite.optional(),
        }),
      ])
      .optional(),
    diffusion: z.strictObject({ freeWater: finite, tortuosity: finite }).nullable().optional(),
  }),
  contaminant: z.strictObject({
    name: z.string().max(200).optional(),
    preset: z.string().max(64).optional(),
    koc: finite.optional(),
    kd: finite.optional(),
    halfLife: finite.nullable().optional(),
    decayPhase: z.enum(['dissolved-and-sorbed', 'dissolved-only']).optional(),
    limit: finite,
    limitNote: z.string().max(500).optional(),
  }),
  wells: z
    .array(
      z.strictObject({
        id: z.string().min(1).max(64).optional(),
        name: z.string().max(200).optional(),
        kind: z.enum(['well', 'spring', 'surface-water', 'property-line', 'other']).optional(),
        position: pos,
        screenTop: finite.optional(),
        screenBottom: finite.optional(),
      }),
    )
    .max(200),
  horizon: finite,
  viewTime: finite.nullable().optional(),
  depth: finite.optional(),
  solution: z.enum(['domenico', 'exact']).optional(),
});

export type CaseV1 = z.infer<typeof caseSchemaV1>;
