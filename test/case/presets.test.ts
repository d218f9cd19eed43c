/**
 * Presets carry the published values of the shared field-value notes with their sources, and
 * every value from memory says so. The expected numbers below are written out from the sources
 * named beside them (as recorded in the project's field-value notes), not read from presets.ts.
 */
import { describe, expect, test } from 'vitest';
import { newCase } from '../../src/case/defaults';
import { materialOfConductivity, typicalConductivity, CONTAMINANT_PRESETS, MATERIAL_PRESETS, MATERIAL_RANGES_FREEZE_CHERRY, FIELD_RANGES, contaminantPreset, provenanceLabel, citeValue } from '../../src/case/presets';

const YR = 365.25;

describe('contaminant presets', () => {
  test('a new case is named after the preset whose values it holds (issue 13 item 19: not "my own values")', () => {
    const k = newCase().contaminant;
    const p = contaminantPreset(k.presetId!)!;
    expect(k.name).toBe(p.name);
    expect(k.sorption).toEqual({ mode: 'koc', koc: { value: p.koc!.value, unit: 'L/kg' } });
    expect(k.limit).toEqual({ value: p.limits[0].value, unit: 'mg/L' });
    expect(k.halfLife).toBeNull(); // a preset leaves decay off (the cautious choice)
  });

  test('the seven screening contaminants are there', () => {
    expect(CONTAMINANT_PRESETS.map((p) => p.id).sort()).toEqual(['benzene', 'cis-dce', 'mtbe', 'nitrate', 'pce', 'tce', 'vinyl-chloride'].sort());
  });

  test.each([
    // US EPA 1996 Soil Screening Guidance, measured geometric means (seen)
    ['benzene', 61.7, 'seen'],
    ['tce', 94.3, 'seen'],
    ['pce', 265, 'seen'],
    // recalled in the field-value notes, to verify
    ['cis-dce', 35.5, 'recalled, to verify'],
    ['vinyl-chloride', 18.6, 'recalled, to verify'],
    ['mtbe', 11, 'recalled, to verify'],
  ])('%s Koc = %s L/kg (%s)', (id, koc, provenance) => {
    const p = contaminantPreset(id)!;
    expect(p.koc?.value).toBe(koc);
    expect(p.koc?.provenance).toBe(provenance);
    expect(p.koc?.source).toMatch(/US EPA 1996, Soil Screening Guidance/);
    // only the values seen in Appendix K, Table K-1 (measured geometric means) cite that table;
    // the others are not in it and are shown 'as commonly cited', not confirmed
    if (provenance === 'seen') expect(p.koc?.source).toMatch(/Appendix K, Table K-1/);
    else {
      expect(p.koc?.source).not.toMatch(/Table K-1/);
      expect(provenanceLabel(p.koc!)).toMatch(/^as commonly cited, attributed to this source; not confirmed against the publication$/);
    }
  });

  test('nitrate does not sorb: Kd 0, marked common practice', () => {
    const n = contaminantPreset('nitrate')!;
    expect(n.koc).toBeNull();
    expect(n.kd).toMatchObject({ value: 0, provenance: 'common practice' });
  });

  test.each([
    // US EPA National Primary Drinking Water Regulations, maximum contaminant levels (seen), mg/L
    ['benzene', 0.005],
    ['tce', 0.005],
    ['pce', 0.005],
    ['cis-dce', 0.07],
    ['vinyl-chloride', 0.002],
    ['nitrate', 10],
  ])('%s US EPA MCL %s mg/L', (id, mcl) => {
    const l = contaminantPreset(id)!.limits.find((x) => x.authority === 'US EPA MCL')!;
    expect(l.value).toBe(mcl);
    expect(l.provenance).toBe('seen');
  });

  test('WHO guideline values that were seen: benzene 0.01, nitrate 50 as NO₃⁻', () => {
    expect(contaminantPreset('benzene')!.limits.find((l) => l.authority === 'WHO guideline')?.value).toBe(0.01);
    const who = contaminantPreset('nitrate')!.limits.find((l) => l.authority === 'WHO guideline')!;
    expect(who).toMatchObject({ value: 50, basis: 'as NO₃⁻', provenance: 'seen' });
    expect(contaminantPreset('nitrate')!.limits.find((l) => l.authority === 'US EPA MCL')?.basis).toBe('as N');
  });

  test('nitrate note: 10 mg/L as N ≈ 44 mg/L as NO₃⁻ (IUPAC standard atomic weights N 14.007, O 15.999)', () => {
    const asNitrate = (10 * (14.007 + 3 * 15.999)) / 14.007;
    expect(Math.round(asNitrate)).toBe(44);
    expect(contaminantPreset('nitrate')!.notes.join(' ')).toMatch(/10 mg\/L as N equals about 44 mg\/L as NO₃⁻/);
  });

  test('MTBE has no federal limit and says so', () => {
    const m = contaminantPreset('mtbe')!;
    expect(m.limits).toEqual([]);
    expect(m.notes.join(' ')).toMatch(/No US federal maximum contaminant level/);
  });

  test.each([
    // Howard et al. 1991, Handbook of Environmental Degradation Rates — recalled, to verify
    ['benzene', 10, 2 * YR],
    ['tce', 0.9 * YR, 4.5 * YR],
    ['pce', 1 * YR, 2 * YR],
  ])('%s half-life range %s – %s d, recalled', (id, min, max) => {
    const h = contaminantPreset(id)!.halfLife!;
    expect(h.min).toBeCloseTo(min, 10);
    expect(h.max).toBeCloseTo(max, 10);
    expect(h.provenance).toBe('recalled, to verify');
    expect(h.source).toMatch(/Howard et al\. 1991/);
  });

  test('no half-life is invented where the notes give none', () => {
    for (const id of ['mtbe', 'cis-dce', 'vinyl-chloride', 'nitrate']) expect(contaminantPreset(id)!.halfLife).toBeNull();
  });

  test('every recalled value tells the user so', () => {
    for (const p of CONTAMINANT_PRESETS) {
      for (const v of [p.koc, p.kd, p.halfLife, ...p.limits]) {
        if (!v) continue;
        if (v.provenance === 'seen') expect(provenanceLabel(v)).toBe('');
        else expect(provenanceLabel(v)).toMatch(v.provenance === 'common practice' ? /common practice/ : /as commonly cited/);
      }
    }
    expect(citeValue(contaminantPreset('mtbe')!.koc!, 'L/kg')).toMatch(/^11 L\/kg \(US EPA 1996.*; as commonly cited, attributed to this source; not confirmed against the publication\)$/);
  });
});

describe('material presets', () => {
  test('a material fills in the geometric mean of its range and stays named while K is that value (issue 13 item 19)', () => {
    const medium = MATERIAL_PRESETS.find((m) => m.id === 'medium-sand')!;
    expect(typicalConductivity(medium)).toBe(10); // √(5 × 20) = 10 m/d
    expect(typicalConductivity(MATERIAL_PRESETS.find((m) => m.id === 'fine-sand')!)).toBe(2.2); // √5 = 2.236
    for (const m of MATERIAL_PRESETS) expect(materialOfConductivity(typicalConductivity(m))?.id).toBe(m.id);
    expect(materialOfConductivity(10 * (1 + 1e-9))?.id).toBe('medium-sand'); // a unit round trip's last digits
    expect(materialOfConductivity(11)).toBeUndefined();
  });

  test.each([
    // Bouwer 1978, Groundwater Hydrology, as tabulated in Canter et al. 1988 (seen), m/d
    ['fine-sand', 1, 5],
    ['medium-sand', 5, 20],
    ['coarse-sand', 20, 100],
    ['gravel', 100, 1000],
    ['sand-and-gravel', 5, 100],
    ['till', 0.001, 0.1],
    ['clay', 1e-8, 1e-2],
    ['sandstone', 0.001, 1],
  ])('%s K %s – %s m/d (Bouwer 1978, seen)', (id, min, max) => {
    const m = MATERIAL_PRESETS.find((p) => p.id === id)!;
    expect([m.conductivity.min, m.conductivity.max]).toEqual([min, max]);
    expect(m.conductivity.provenance).toBe('seen');
  });

  test('Freeze & Cherry 1979 Table 2.2 ranges converted from m/s (1 m/s = 86 400 m/d) and marked recalled', () => {
    const gravel = MATERIAL_RANGES_FREEZE_CHERRY.find((p) => p.id === 'fc-gravel')!;
    expect(gravel.conductivity.min).toBeCloseTo(1e-3 * 86400, 9);
    expect(gravel.conductivity.max).toBe(86400);
    for (const m of MATERIAL_RANGES_FREEZE_CHERRY) {
      expect(m.conductivity.provenance).toBe('recalled, to verify');
      expect(m.conductivity.min).toBeLessThan(m.conductivity.max);
    }
    const clay = MATERIAL_PRESETS.find((p) => p.id === 'clay')!;
    expect(clay.totalPorosity).toMatchObject({ min: 0.4, max: 0.7, provenance: 'recalled, to verify' });
  });

  test('field ranges name their case field and source', () => {
    for (const r of FIELD_RANGES) {
      expect(r.field).toMatch(/^aquifer\./);
      expect(r.source.length).toBeGreaterThan(5);
      expect(r.min).toBeLessThan(r.max);
    }
  });
});
