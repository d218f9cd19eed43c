/**
 * Case versions and migrations. `migrateCase` takes the parsed JSON of any known version, checks
 * it against that version's schema, migrates it forward one version at a time and returns a
 * valid current case. Anything else is a `CaseFormatError` listing every problem in plain words.
 *
 * Versions: 1 — the compact hand-written form (see v1.ts); 2 — quantities with units, receptors;
 * 3 — current (schema.ts): adds the uncertain inputs (`uncertainty`, default: none) and the
 * monitoring wells and sampling results (`monitoring`, default: none).
 */
import { CASE_FORMAT, CASE_VERSION, DEFAULT_UNCERTAINTY, caseSchema, caseSchemaV2, type Case, type CaseV2, type Dispersivity, type Receptor } from './schema';
import { caseSchemaV1, type CaseV1 } from './v1';
import { issueMessages } from './issues';
import { DEFAULT_MONITORING } from './monitoring';
import { contaminantPreset, CONTAMINANT_PRESETS } from './presets';
import { DEFAULT_DIFFUSION, DEFAULT_DISPERSIVITY } from './defaults';

export class CaseFormatError extends Error {
  readonly errors: readonly string[];
  constructor(errors: string[]) {
    super(errors.join('\n'));
    this.name = 'CaseFormatError';
    this.errors = errors;
  }
}

export const KNOWN_VERSIONS = [1, 2, 3] as const;

/** Stable short hash (FNV-1a, 32 bit) so a migrated v1 case gets the same id every time. */
function fnv1a(text: string): string {
  let h = 0x811c9dc5;
  for (let i = 0; i < text.length; i++) {
    h ^= text.charCodeAt(i);
    h = Math.imul(h, 0x01000193) >>> 0;
  }
  return h.toString(16).padStart(8, '0');
}

const m = (value: number) => ({ value, unit: 'm' });
const d = (value: number) => ({ value, unit: 'd' });

/** v1 (plain numbers in internal units) → v2 ({ value, unit } quantities, receptors). */
export function migrateV1toV2(v1: CaseV1): CaseV2 {
  const errors: string[] = [];
  const c = v1.contaminant;
  let preset = undefined as ReturnType<typeof contaminantPreset>;
  if (c.preset !== undefined) {
    preset = contaminantPreset(c.preset);
    if (!preset)
      errors.push(
        `contaminant.preset: ${JSON.stringify(c.preset)} is not a known preset; accepted values: ${CONTAMINANT_PRESETS.map((p) => JSON.stringify(p.id)).join(', ')}`,
      );
  }
  let sorption: CaseV2['contaminant']['sorption'] | null = null;
  if (c.koc !== undefined && c.kd !== undefined) errors.push('contaminant: give either koc or kd (L/kg), not both');
  else if (c.koc !== undefined) sorption = { mode: 'koc', koc: { value: c.koc, unit: 'L/kg' } };
  else if (c.kd !== undefined) sorption = { mode: 'kd', kd: { value: c.kd, unit: 'L/kg' } };
  else if (preset?.koc) sorption = { mode: 'koc', koc: { value: preset.koc.value, unit: 'L/kg' } };
  else if (preset?.kd) sorption = { mode: 'kd', kd: { value: preset.kd.value, unit: 'L/kg' } };
  else if (!c.preset) errors.push('contaminant: give koc or kd (L/kg), or a preset to take Koc from');
  if (errors.length || !sorption) throw new CaseFormatError(errors);

  const a = v1.aquifer;
  let dispersivity: Dispersivity;
  if (Array.isArray(a.dispersivity)) {
    const [l, t, v] = a.dispersivity;
    dispersivity = { mode: 'given', longitudinal: m(l), transverse: m(t), vertical: m(v) };
  } else {
    const e = a.dispersivity ?? {};
    const def = DEFAULT_DISPERSIVITY as Extract<Dispersivity, { mode: 'estimate' }>;
    dispersivity = {
      mode: 'estimate',
      relation: e.relation ?? def.relation,
      transverseRatio: e.transverseRatio ?? def.transverseRatio,
      verticalRatio: e.verticalRatio ?? def.verticalRatio,
    };
  }
  const diffusion: CaseV2['aquifer']['diffusion'] = a.diffusion
    ? { include: true, freeWater: { value: a.diffusion.freeWater, unit: 'm2/d' }, tortuosity: a.diffusion.tortuosity }
    : { ...DEFAULT_DIFFUSION, freeWater: { ...DEFAULT_DIFFUSION.freeWater } };

  const flow: CaseV2['site']['flow'] =
    'heads' in v1.flow
      ? {
          method: 'heads',
          readings: v1.flow.heads.map((h, i) => ({
            id: `head-${i + 1}`,
            name: h.name ?? `Head ${i + 1}`,
            position: h.position,
            head: m(h.head),
          })),
        }
      : { method: 'direction', azimuthDeg: v1.flow.azimuth, gradient: v1.flow.gradient };

  const receptors: Receptor[] = v1.wells.map((w, i) => {
    const top = w.screenTop ?? 0;
    return {
      id: w.id ?? `well-${i + 1}`,
      name: w.name ?? `Well ${i + 1}`,
      kind: w.kind ?? 'well',
      position: w.position,
      screenTop: m(top),
      screenBottom: m(w.screenBottom ?? top),
      pumping: false,
      pumpingRate: null,
    };
  });

  const stamp = v1.created ?? '';
  const local = v1.frame === 'local';
  return {
    format: CASE_FORMAT,
    version: 2,
    id: v1.id ?? 'v1-' + fnv1a(JSON.stringify(v1)),
    name: v1.name,
    created: stamp,
    modified: stamp,
    parentId: null,
    notes: v1.notes ?? '',
    site: {
      frame: v1.frame,
      datum: local ? [0, 0] : (v1.datum ?? v1.source.position),
      source: { position: v1.source.position, footprint: v1.source.footprint ?? null, width: m(v1.source.width) },
      flow,
      receptors,
    },
    aquifer: {
      hydraulicConductivity: { value: a.K, unit: 'K:m/d' },
      effectivePorosity: a.effectivePorosity,
      totalPorosity: a.totalPorosity,
      bulkDensity: a.bulkDensity == null ? null : { value: a.bulkDensity, unit: 'g/cm3' },
      fractionOrganicCarbon: a.foc,
      dispersivity,
      diffusion,
    },
    contaminant: {
      name: c.name ?? preset?.name ?? 'unnamed contaminant',
      presetId: preset?.id ?? null,
      sorption,
      halfLife: c.halfLife == null ? null : d(c.halfLife),
      decayPhase: c.decayPhase ?? 'dissolved-and-sorbed',
      limit: { value: c.limit, unit: 'mg/L' },
      limitNote: c.limitNote ?? '',
    },
    source: {
      concentration: { value: v1.source.concentration, unit: 'mg/L' },
      thickness: m(v1.source.thickness),
      duration: v1.source.duration == null ? null : d(v1.source.duration),
      sourceHalfLife: v1.source.halfLife == null ? null : d(v1.source.halfLife),
    },
    evaluation: {
      solution: v1.solution ?? 'domenico',
      horizon: d(v1.horizon),
      // absent: the map shows the horizon; null: steady state
      viewTime: v1.viewTime === undefined ? d(v1.horizon) : v1.viewTime === null ? null : d(v1.viewTime),
      depth: m(v1.depth ?? 0),
    },
  };
}

/** v2 → v3: no uncertain inputs (every input fixed, as v2 screened it), no monitoring data, no
 * boundary lines and no saturated thickness (both optional: absent means none, so pumping wells
 * stay unmodelled, as in v2). */
export function migrateV2toV3(v2: CaseV2): Case {
  return {
    ...v2,
    version: 3,
    uncertainty: structuredClone(DEFAULT_UNCERTAINTY),
    monitoring: structuredClone(DEFAULT_MONITORING),
  };
}

function isPlainObject(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}

/** Any known version → a valid current case; throws CaseFormatError with every problem found. */
export function migrateCase(raw: unknown): Case {
  if (!isPlainObject(raw)) throw new CaseFormatError(['the file must hold one JSON object { … } describing a case']);
  if (raw.format !== CASE_FORMAT) {
    throw new CaseFormatError([
      raw.format === undefined
        ? `format is missing: a Downgradient case file has "format": "${CASE_FORMAT}"`
        : `format: ${JSON.stringify(raw.format)} is not accepted; this is not a Downgradient case file (expected "${CASE_FORMAT}")`,
    ]);
  }
  const version = raw.version;
  const known = `known versions: ${KNOWN_VERSIONS.join(', ')}`;
  if (typeof version !== 'number' || !Number.isInteger(version)) {
    throw new CaseFormatError([
      version === undefined ? `version is missing (${known})` : `version: ${JSON.stringify(version)} is not accepted; ${known}`,
    ]);
  }
  if (version > CASE_VERSION) {
    throw new CaseFormatError([
      `version ${version} is newer than this copy of Downgradient reads (${known}); open the file in an updated app`,
    ]);
  }
  if (!(KNOWN_VERSIONS as readonly number[]).includes(version)) {
    throw new CaseFormatError([`version: ${version} is not a known case version (${known})`]);
  }

  let current: unknown = raw;
  if (version === 1) {
    const r = caseSchemaV1.safeParse(raw, { reportInput: true });
    if (!r.success) throw new CaseFormatError(issueMessages(r.error));
    current = migrateV1toV2(r.data);
  }
  if (version <= 2) {
    const r = caseSchemaV2.safeParse(current, { reportInput: true });
    if (!r.success) throw new CaseFormatError(issueMessages(r.error));
    current = migrateV2toV3(r.data);
  }
  const r = caseSchema.safeParse(current, { reportInput: true });
  if (!r.success) throw new CaseFormatError(issueMessages(r.error));
  return r.data;
}
