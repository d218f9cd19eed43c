/**
 * A new, valid case to start from. The numbers are neutral starting values for a sandy aquifer
 * and a fuel aromatic, each within the published ranges in docs/field-values.md (Bouwer 1978 for K,
 * US EPA 1996 Soil Screening Guidance for benzene's Koc, US EPA MCL for benzene's limit). The user
 * is expected to replace them with site values; the limit note says the local limit governs.
 */
import { CASE_FORMAT, CASE_VERSION, DEFAULT_UNCERTAINTY, type Case, type Dispersivity, type HeadReading, type Position, type Receptor } from './schema';
import { DEFAULT_MONITORING } from './monitoring';

/** Dispersivity estimated from the farthest receptor: Xu & Eckstein 1995 for αL, αT = αL/10
 * (Gelhar et al. 1992 high-reliability data) and αV = αL/100 (αV ≈ αT/10, Gelhar et al. 1992). */
export const DEFAULT_DISPERSIVITY: Dispersivity = Object.freeze({
  mode: 'estimate',
  relation: 'xu-eckstein-1995',
  transverseRatio: 0.1,
  verticalRatio: 0.01,
});

/** Molecular diffusion off by default; 1e-9 m²/s is a typical free-water value for small organic
 * molecules (common practice), tortuosity factor 0.5 (common practice). */
export const DEFAULT_DIFFUSION: Case['aquifer']['diffusion'] = Object.freeze({
  include: false,
  freeWater: Object.freeze({ value: 1e-9, unit: 'm2/s' }),
  tortuosity: 0.5,
});

export function newId(): string {
  const c = (globalThis as { crypto?: { randomUUID?: () => string } }).crypto;
  if (c?.randomUUID) return c.randomUUID();
  return 'id-' + Date.now().toString(36) + '-' + Math.floor(Math.random() * 1e9).toString(36);
}

export interface NewCaseOptions {
  name?: string;
  frame?: 'geographic' | 'local';
  /** geographic: [lon, lat] of the release; local: ignored (the release is at the datum) */
  at?: Position;
  now?: Date;
}

export function newCase(opts: NewCaseOptions = {}): Case {
  const frame = opts.frame ?? 'local';
  const at: Position = frame === 'geographic' ? (opts.at ?? [0, 0]) : [0, 0];
  const stamp = (opts.now ?? new Date()).toISOString();
  return {
    format: CASE_FORMAT,
    version: CASE_VERSION,
    id: newId(),
    name: opts.name ?? 'New screening',
    created: stamp,
    modified: stamp,
    parentId: null,
    notes: '',
    site: {
      frame,
      datum: at,
      source: { position: at, footprint: null, width: { value: 10, unit: 'm' } },
      flow: { method: 'direction', azimuthDeg: 90, gradient: 0.005 },
      receptors: [],
    },
    aquifer: {
      hydraulicConductivity: { value: 10, unit: 'K:m/d' },
      effectivePorosity: 0.25,
      totalPorosity: 0.3,
      bulkDensity: null,
      fractionOrganicCarbon: 0.001,
      dispersivity: { ...DEFAULT_DISPERSIVITY },
      diffusion: { ...DEFAULT_DIFFUSION, freeWater: { ...DEFAULT_DIFFUSION.freeWater } },
    },
    contaminant: {
      // the benzene preset's values (presets.ts), so the preset picker names what the case holds
      name: 'benzene',
      presetId: 'benzene',
      sorption: { mode: 'koc', koc: { value: 61.7, unit: 'L/kg' } },
      halfLife: null,
      decayPhase: 'dissolved-and-sorbed',
      limit: { value: 0.005, unit: 'mg/L' },
      limitNote: 'Example only (US EPA MCL for benzene). The limit that applies at your site governs.',
    },
    source: {
      concentration: { value: 10, unit: 'mg/L' },
      thickness: { value: 3, unit: 'm' },
      duration: null,
      sourceHalfLife: null,
    },
    evaluation: {
      solution: 'domenico',
      horizon: { value: 30, unit: 'yr' },
      viewTime: { value: 10, unit: 'yr' },
      depth: { value: 0, unit: 'm' },
    },
    uncertainty: structuredClone(DEFAULT_UNCERTAINTY),
    monitoring: structuredClone(DEFAULT_MONITORING),
  };
}

/**
 * A new receptor at a map position: a well screened from the water table to 5 m below it (a
 * neutral start the user replaces with the well's own screen), not pumping. `index` is its place
 * in the list (0-based), for its default name.
 */
export function newReceptor(position: Position, index: number, id = newId()): Receptor {
  return {
    id,
    name: `Receptor ${index + 1}`,
    kind: 'well',
    position,
    screenTop: { value: 0, unit: 'm' },
    screenBottom: { value: 5, unit: 'm' },
    pumping: false,
    pumpingRate: null,
  };
}

/** A new head reading at a map position (a placeholder head of 10 m the user replaces); `index` 0-based. */
export function newHeadReading(position: Position, index: number, id = newId()): HeadReading {
  return { id, name: `MW-${index + 1}`, position, head: { value: 10, unit: 'm' } };
}
