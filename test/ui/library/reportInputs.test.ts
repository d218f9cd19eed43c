// The report's inputs table names each value's source. Expected sources are the published values
// in docs/field-values.md as carried by src/case/presets.ts: benzene Koc 61.7 L/kg
// (US EPA 1996 Soil Screening Guidance, seen), benzene limit 0.005 mg/L (US EPA MCL, seen);
// bulk density 2.65 (1 − n) is common practice.
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { inputRows } from '../../../src/ui/library/reportInputs';
import { migrateCase } from '../../../src/case/migrate';
import { prepareCase } from '../../../src/case/prepare';

const demo = migrateCase(JSON.parse(readFileSync('cases/fuel-release-farm-well.json', 'utf8')));

describe('inputRows', () => {
  const rows = inputRows(demo, prepareCase(demo));
  const row = (input: string) => rows.find((r) => r.input.startsWith(input));

  it('cites the published Koc and limit for the benzene preset', () => {
    expect(demo.contaminant.presetId).toBe('benzene');
    expect(row('Koc')?.value).toBe('61.7 L/kg');
    expect(row('Koc')?.source).toMatch(/US EPA 1996, Soil Screening Guidance/);
    expect(row('Concentration limit')?.source).toMatch(/US EPA MCL/);
  });

  it('says a changed value is the site’s own, and marks recalled ranges and common practice', () => {
    const c = structuredClone(demo);
    if (c.contaminant.sorption.mode !== 'koc') throw new Error('demo uses Koc');
    c.contaminant.sorption.koc.value = 80;
    const r = inputRows(c, prepareCase(c));
    expect(r.find((x) => x.input.startsWith('Koc'))?.source).toBe('entered for this site');
    expect(r.find((x) => x.input.startsWith('Biodegradation'))?.source).toMatch(/as commonly cited/);
    if (c.aquifer.bulkDensity === null) expect(r.find((x) => x.input.startsWith('Bulk density'))?.source).toMatch(/common practice/);
  });

  it('lists every group with units, and works without prepared values (invalid inputs)', () => {
    expect([...new Set(rows.map((r) => r.group))]).toEqual(['Release', 'Flow', 'Aquifer', 'Contaminant', 'Evaluation']);
    expect(row('Hydraulic conductivity')?.value).toMatch(/m\/d$/);
    const bare = inputRows(demo, null);
    expect(bare.length).toBe(rows.length);
  });

  it('shows each value in the case\'s unit system, as its field does (issue 13 item 4)', () => {
    const us = { ...demo, units: { system: 'US' as const, fields: {} } };
    const r = inputRows(us, prepareCase(us));
    const v = (input: string) => r.find((x) => x.input.startsWith(input))?.value ?? '';
    // foot = 0.3048 m exactly (NIST SP 811 (2008), Appendix B)
    expect(v('Hydraulic conductivity')).toMatch(/ ft\/d$/);
    const k = demo.aquifer.hydraulicConductivity;
    expect(k.unit).toBe('K:m/d');
    expect(Number(v('Hydraulic conductivity').split(' ')[0])).toBeCloseTo(k.value / 0.3048, 3);
    expect(v('Source thickness')).toMatch(/ ft$/);
    expect(v('Dispersivity')).toMatch(/ ft$/);
    expect(v('Map depth')).toMatch(/ ft$/);
    // concentrations and times are not switched
    expect(v('Concentration limit')).toBe(row('Concentration limit')?.value);
    expect(v('Horizon')).toBe(row('Horizon')?.value);
    for (const x of r) expect(x.value, x.input).not.toMatch(/\d m(\/d)?$| m$/);
    // the estimated bulk density's rule in lb/ft³: 2.65 g/cm³ / (0.45359237 kg / 0.3048³ m³ / 1000) = 165.4 lb/ft³
    expect(demo.aquifer.bulkDensity).toBeNull();
    expect(r.find((x) => x.input.startsWith('Bulk density'))?.source).toMatch(/^estimated as 165\.4 lb\/ft³ × \(1 − n\)/);
  });
});
