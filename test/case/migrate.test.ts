/**
 * Migrations: every field of the hand-written v1 form lands in its v2 place with the unit v1
 * implies (m, d, mg/L, K m/d, L/kg, g/cm³, m²/d — the v1 definition in src/case/v1.ts), the result
 * passes the current schema, and unknown or future versions and foreign files fail with a
 * message that names the problem.
 */
import { describe, expect, test } from 'vitest';
import { CaseFormatError, migrateCase } from '../../src/case/migrate';
import { caseSchema, CASE_VERSION } from '../../src/case/schema';

const minimalV1 = () => ({
  format: 'downgradient-case',
  version: 1,
  name: 'Minimal',
  source: { position: [0, 0], width: 5, thickness: 2, concentration: 3 },
  flow: { azimuth: 90, gradient: 0.01 },
  aquifer: { K: 10, effectivePorosity: 0.2, totalPorosity: 0.3, foc: 0.001 },
  contaminant: { koc: 50, limit: 0.01 },
  wells: [{ position: [50, 0] }],
  horizon: 3650,
});

const fullV1 = {
  format: 'downgradient-case',
  version: 1,
  id: 'hand-1',
  name: 'Every field',
  created: '2026-11-30T08:00:00.000Z',
  notes: 'all v1 fields set',
  frame: 'geographic',
  datum: [11.5, 48.1],
  source: {
    position: [11.5001, 48.1001],
    width: 7,
    thickness: 2.5,
    concentration: 12,
    footprint: [[11.5, 48.1], [11.5002, 48.1], [11.5002, 48.1002], [11.5, 48.1002]],
    duration: 1000,
    halfLife: 2000,
  },
  flow: { heads: [{ position: [11.49, 48.1], head: 20.5, name: 'P1' }, { position: [11.51, 48.1], head: 20.1 }, { position: [11.5, 48.11], head: 20.4 }] },
  aquifer: {
    K: 25,
    effectivePorosity: 0.22,
    totalPorosity: 0.31,
    foc: 0.0007,
    bulkDensity: 1.75,
    dispersivity: [4, 0.4, 0.04],
    diffusion: { freeWater: 8.64e-5, tortuosity: 0.6 },
  },
  contaminant: {
    name: 'toluene (hand entry)',
    preset: 'benzene',
    kd: 0.2,
    halfLife: 90,
    decayPhase: 'dissolved-only',
    limit: 0.7,
    limitNote: 'local limit',
  },
  wells: [
    { id: 'w-a', name: 'Well A', kind: 'spring', position: [11.503, 48.1], screenTop: 1, screenBottom: 4 },
    { position: [11.504, 48.0995], screenTop: 2 },
  ],
  horizon: 7300,
  viewTime: null,
  depth: 1.5,
  solution: 'exact',
};

describe('v1 → v2 migration', () => {
  test('every v1 field is carried to its v2 place with the v1 unit', () => {
    const c = migrateCase(structuredClone(fullV1));
    expect(c.version).toBe(CASE_VERSION);
    expect(c.id).toBe('hand-1');
    expect(c.name).toBe('Every field');
    expect(c.created).toBe('2026-11-30T08:00:00.000Z');
    expect(c.modified).toBe('2026-11-30T08:00:00.000Z');
    expect(c.notes).toBe('all v1 fields set');
    expect(c.parentId).toBeNull();
    expect(c.site.frame).toBe('geographic');
    expect(c.site.datum).toEqual([11.5, 48.1]);
    expect(c.site.source).toEqual({
      position: [11.5001, 48.1001],
      footprint: fullV1.source.footprint,
      width: { value: 7, unit: 'm' },
    });
    expect(c.site.flow).toEqual({
      method: 'heads',
      readings: [
        { id: 'head-1', name: 'P1', position: [11.49, 48.1], head: { value: 20.5, unit: 'm' } },
        { id: 'head-2', name: 'Head 2', position: [11.51, 48.1], head: { value: 20.1, unit: 'm' } },
        { id: 'head-3', name: 'Head 3', position: [11.5, 48.11], head: { value: 20.4, unit: 'm' } },
      ],
    });
    expect(c.site.receptors).toEqual([
      { id: 'w-a', name: 'Well A', kind: 'spring', position: [11.503, 48.1], screenTop: { value: 1, unit: 'm' }, screenBottom: { value: 4, unit: 'm' }, pumping: false, pumpingRate: null },
      // screenBottom defaults to screenTop (a point); id and name are numbered
      { id: 'well-2', name: 'Well 2', kind: 'well', position: [11.504, 48.0995], screenTop: { value: 2, unit: 'm' }, screenBottom: { value: 2, unit: 'm' }, pumping: false, pumpingRate: null },
    ]);
    expect(c.aquifer).toEqual({
      hydraulicConductivity: { value: 25, unit: 'K:m/d' },
      effectivePorosity: 0.22,
      totalPorosity: 0.31,
      bulkDensity: { value: 1.75, unit: 'g/cm3' },
      fractionOrganicCarbon: 0.0007,
      dispersivity: { mode: 'given', longitudinal: { value: 4, unit: 'm' }, transverse: { value: 0.4, unit: 'm' }, vertical: { value: 0.04, unit: 'm' } },
      diffusion: { include: true, freeWater: { value: 8.64e-5, unit: 'm2/d' }, tortuosity: 0.6 },
    });
    // an explicit kd wins over the preset's Koc; the given name wins over the preset's
    expect(c.contaminant).toEqual({
      name: 'toluene (hand entry)',
      presetId: 'benzene',
      sorption: { mode: 'kd', kd: { value: 0.2, unit: 'L/kg' } },
      halfLife: { value: 90, unit: 'd' },
      decayPhase: 'dissolved-only',
      limit: { value: 0.7, unit: 'mg/L' },
      limitNote: 'local limit',
    });
    expect(c.source).toEqual({
      concentration: { value: 12, unit: 'mg/L' },
      thickness: { value: 2.5, unit: 'm' },
      duration: { value: 1000, unit: 'd' },
      sourceHalfLife: { value: 2000, unit: 'd' },
    });
    expect(c.evaluation).toEqual({ solution: 'exact', horizon: { value: 7300, unit: 'd' }, viewTime: null, depth: { value: 1.5, unit: 'm' } });
    expect(caseSchema.safeParse(c).success).toBe(true);
  });

  test('defaults of the minimal v1 form', () => {
    const c = migrateCase(minimalV1());
    expect(c.site.frame).toBe('local');
    expect(c.site.datum).toEqual([0, 0]);
    expect(c.site.source.footprint).toBeNull();
    expect(c.site.flow).toEqual({ method: 'direction', azimuthDeg: 90, gradient: 0.01 });
    expect(c.aquifer.bulkDensity).toBeNull();
    expect(c.aquifer.dispersivity).toEqual({ mode: 'estimate', relation: 'xu-eckstein-1995', transverseRatio: 0.1, verticalRatio: 0.01 });
    expect(c.aquifer.diffusion.include).toBe(false);
    expect(c.contaminant).toMatchObject({ name: 'unnamed contaminant', presetId: null, sorption: { mode: 'koc', koc: { value: 50, unit: 'L/kg' } }, halfLife: null, decayPhase: 'dissolved-and-sorbed', limitNote: '' });
    expect(c.source.duration).toBeNull();
    expect(c.source.sourceHalfLife).toBeNull();
    // viewTime absent → the horizon; depth 0; Domenico
    expect(c.evaluation).toEqual({ solution: 'domenico', horizon: { value: 3650, unit: 'd' }, viewTime: { value: 3650, unit: 'd' }, depth: { value: 0, unit: 'm' } });
    expect(c.site.receptors[0]).toMatchObject({ id: 'well-1', name: 'Well 1', kind: 'well', screenTop: { value: 0, unit: 'm' }, screenBottom: { value: 0, unit: 'm' } });
    // geographic without a datum: the datum is the source position
    const g = migrateCase({ ...minimalV1(), frame: 'geographic', source: { ...minimalV1().source, position: [7, 50] }, wells: [{ position: [7.001, 50] }] });
    expect(g.site.datum).toEqual([7, 50]);
  });

  test('estimated dispersivity options and a preset supplying Koc and the name', () => {
    const v1 = minimalV1() as Record<string, any>;
    v1.aquifer.dispersivity = { relation: 'tenth-of-distance', verticalRatio: 0.05 };
    v1.contaminant = { preset: 'tce', limit: 0.005 };
    const c = migrateCase(v1);
    expect(c.aquifer.dispersivity).toEqual({ mode: 'estimate', relation: 'tenth-of-distance', transverseRatio: 0.1, verticalRatio: 0.05 });
    // US EPA 1996 Soil Screening Guidance: TCE Koc 94.3 L/kg (the preset's value)
    expect(c.contaminant.sorption).toEqual({ mode: 'koc', koc: { value: 94.3, unit: 'L/kg' } });
    expect(c.contaminant.name).toBe('trichloroethylene (TCE)');
    expect(c.contaminant.presetId).toBe('tce');
    // nitrate: the preset gives Kd = 0
    const n = migrateCase({ ...minimalV1(), contaminant: { preset: 'nitrate', limit: 10 } });
    expect(n.contaminant.sorption).toEqual({ mode: 'kd', kd: { value: 0, unit: 'L/kg' } });
  });

  test('a v1 case without an id gets the same id every time', () => {
    expect(migrateCase(minimalV1()).id).toBe(migrateCase(minimalV1()).id);
    expect(migrateCase(minimalV1()).id).toMatch(/^v1-[0-9a-f]{8}$/);
    expect(migrateCase({ ...minimalV1(), name: 'Other' }).id).not.toBe(migrateCase(minimalV1()).id);
  });

  test('a current (v2) case passes through unchanged', () => {
    const c = migrateCase(minimalV1());
    expect(migrateCase(structuredClone(c))).toEqual(c);
  });
});

function errorsOf(raw: unknown): string[] {
  try {
    migrateCase(raw);
  } catch (e) {
    expect(e).toBeInstanceOf(CaseFormatError);
    return [...(e as CaseFormatError).errors];
  }
  throw new Error('expected a CaseFormatError');
}

describe('versions and formats that cannot be read', () => {
  const table: [string, unknown, RegExp][] = [
    ['not an object', [1, 2], /one JSON object/],
    ['null', null, /one JSON object/],
    ['format missing', { version: 2 }, /format is missing/],
    ['foreign format', { format: 'something-else', version: 1 }, /"something-else" is not accepted.*not a Downgradient case file/],
    ['version missing', { format: 'downgradient-case' }, /version is missing \(known versions: 1, 2, 3\)/],
    ['version as text', { format: 'downgradient-case', version: '2' }, /version: "2" is not accepted; known versions: 1, 2, 3/],
    ['fractional version', { format: 'downgradient-case', version: 1.5 }, /version: 1.5 is not accepted/],
    ['future version', { format: 'downgradient-case', version: 4 }, /version 4 is newer than this copy of Downgradient reads \(known versions: 1, 2, 3\)/],
    ['version 0', { format: 'downgradient-case', version: 0 }, /version: 0 is not a known case version/],
    ['v1 typo in a field name', { ...minimalV1(), horizn: 3 }, /horizn: unknown field/],
    ['v1 both koc and kd', { ...minimalV1(), contaminant: { koc: 1, kd: 1, limit: 1 } }, /give either koc or kd/],
    ['v1 neither koc nor kd', { ...minimalV1(), contaminant: { limit: 1 } }, /give koc or kd \(L\/kg\), or a preset/],
    ['v1 unknown preset', { ...minimalV1(), contaminant: { preset: 'kryptonite', limit: 1 } }, /contaminant.preset: "kryptonite" is not a known preset; accepted values: "benzene"/],
    ['v1 limit missing', { ...minimalV1(), contaminant: { koc: 1 } }, /Limit at the receptors \(contaminant\.limit\) is missing: expected a number/],
    ['v1 flow neither form', { ...minimalV1(), flow: { azimuth: 90 } }, /flow: does not match any accepted form/],
    ['v1 well position wrong', { ...minimalV1(), wells: [{ position: [1] }] }, /wells\[0\]\.position/],
  ];
  test.each(table)('%s', (_label, raw, message) => {
    const errors = errorsOf(raw);
    expect(errors.join('\n')).toMatch(message);
  });
});

describe('v2 → v3 migration (uncertain inputs)', () => {
  test('a v1 and a v2 file open as v3 with every input fixed (no distributions), nothing else changed', async () => {
    const { readFileSync } = await import('node:fs');
    const v2 = JSON.parse(readFileSync('test/case/fixtures/v2-case.json', 'utf8'));
    const c = migrateCase(structuredClone(v2));
    expect(c.version).toBe(3);
    expect(c.uncertainty).toEqual({ runs: 2000, seed: 1, inputs: {}, headFit: false });
    expect(c.monitoring).toEqual({ releaseDate: null, analyte: null, wells: [], results: [] });
    const { uncertainty: _u, monitoring: _m, version: _v, ...rest } = c;
    const { version: _v2, ...restV2 } = v2;
    expect(JSON.parse(JSON.stringify(rest))).toEqual(JSON.parse(JSON.stringify({ ...restV2, parentId: restV2.parentId ?? null })));
    const fromV1 = migrateCase(structuredClone(fullV1));
    expect(fromV1.version).toBe(3);
    expect(fromV1.uncertainty.inputs).toEqual({});
    expect(fromV1.monitoring.results).toEqual([]);
  });

  test('a v3 file keeps its distributions, units, truncation, seed and runs', () => {
    const v3 = {
      ...migrateCase(structuredClone(fullV1)),
      uncertainty: {
        runs: 5000,
        seed: 77,
        headFit: false,
        inputs: {
          hydraulicConductivity: { kind: 'lognormal', median: 12, gsd: 3, unit: 'K:m/d' },
          effectivePorosity: { kind: 'normal', mean: 0.25, sd: 0.05, truncate: { low: 0.05, high: 0.4 } },
        },
      },
    };
    const c = migrateCase(JSON.parse(JSON.stringify(v3)));
    expect(c.uncertainty.runs).toBe(5000);
    expect(c.uncertainty.seed).toBe(77);
    expect(c.uncertainty.inputs.hydraulicConductivity).toEqual({ kind: 'lognormal', median: 12, gsd: 3, unit: 'K:m/d' });
    expect(c.uncertainty.inputs.effectivePorosity).toEqual({ kind: 'normal', mean: 0.25, sd: 0.05, truncate: { low: 0.05, high: 0.4 } });
  });

  test('a distribution of an unknown kind or with a missing parameter is refused with its path', () => {
    const base = migrateCase(structuredClone(fullV1));
    const bad = (inputs: unknown) => () => migrateCase(JSON.parse(JSON.stringify({ ...base, uncertainty: { runs: 10, seed: 1, inputs } })));
    expect(bad({ halfLife: { kind: 'gamma', shape: 2 } })).toThrow(/uncertainty\.inputs\.halfLife/);
    expect(bad({ halfLife: { kind: 'normal', mean: 2 } })).toThrow(/uncertainty\.inputs\.halfLife/);
    expect(bad({ porosity: { kind: 'normal', mean: 2, sd: 1 } })).toThrow(/porosity/);
  });
});
