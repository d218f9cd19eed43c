// Case comparison: differences found in internal units (unit factors from src/core/units.ts, whose
// definitions cite NIST), bookkeeping fields ignored, receptors matched by id then name.
import { describe, expect, it } from 'vitest';
import { inputDifferences, receptorChanges, describeChange, comparePairOrder, quantityText, label, type ReceptorOutcome } from '../../../src/ui/library/compare';
import { newCase } from '../../../src/case/defaults';
import type { Case } from '../../../src/case/schema';

function withWell(c: Case): Case {
  c.site.receptors.push({
    id: 'w1',
    name: 'Supply well',
    kind: 'well',
    position: [100, 0],
    screenTop: { value: 2, unit: 'm' },
    screenBottom: { value: 8, unit: 'm' },
    pumping: false,
    pumpingRate: null,
  });
  return c;
}

describe('inputDifferences', () => {
  const base = withWell(newCase({ name: 'Base' }));

  it('a copy with new id, name, dates and notes has no input differences', () => {
    const v = { ...structuredClone(base), id: 'other', name: 'Variant', parentId: base.id, notes: 'what if', created: 'x', modified: 'y' };
    expect(inputDifferences(base, v)).toEqual([]);
  });

  it('the same quantity in another unit is not a difference (10 m/d = 10/86400 m/s exactly)', () => {
    const v = structuredClone(base);
    v.aquifer.hydraulicConductivity = { value: 10 / 86400, unit: 'K:m/s' };
    v.source.thickness = { value: 3 / 0.3048, unit: 'ft' }; // international foot = 0.3048 m exactly (NIST)
    expect(inputDifferences(base, v)).toEqual([]);
  });

  it('lists changed inputs with labels and both values, and receptor changes by name', () => {
    const v = structuredClone(base);
    v.aquifer.hydraulicConductivity = { value: 25, unit: 'K:m/d' };
    v.contaminant.halfLife = { value: 1, unit: 'yr' };
    v.site.receptors[0].screenBottom = { value: 12, unit: 'm' };
    v.site.receptors.push({ ...v.site.receptors[0], id: 'w2', name: 'Garden well' });
    const d = inputDifferences(base, v);
    expect(d.map((x) => x.label)).toEqual([
      'Hydraulic conductivity K',
      'Biodegradation half-life',
      'Screen bottom of “Supply well”',
      'Receptor “Garden well”',
    ]);
    expect(d[0]).toMatchObject({ a: '10 m/d', b: '25 m/d' });
    expect(d[1]).toMatchObject({ a: 'none', b: '1 year' });
    expect(d[3]).toMatchObject({ a: 'absent', b: 'present' });
  });

  it('an input without a label of its own is named in words, never by its code (issue 13 item 19)', () => {
    expect(label('uncertainty.inputs.hydraulicConductivity')).toBe('How sure: distribution of hydraulic conductivity');
    expect(label('uncertainty.seed')).toBe('How sure: seed');
    expect(label('site.saturatedThickness')).toBe('Site: saturated thickness');
    const v = structuredClone(base);
    v.uncertainty.seed = base.uncertainty.seed + 1;
    for (const d of inputDifferences(base, v)) expect(d.label).not.toMatch(/\.|[a-z][A-Z]/);
  });

  it('a switch of dispersivity mode is one labelled difference plus the new fields', () => {
    const v = structuredClone(base);
    v.aquifer.dispersivity = {
      mode: 'given',
      longitudinal: { value: 5, unit: 'm' },
      transverse: { value: 0.5, unit: 'm' },
      vertical: { value: 0.05, unit: 'm' },
    };
    const d = inputDifferences(base, v);
    // the choice in the words of the panel's switch (src/case/fields.ts CHOICE_WORDS), not its code
    expect(d[0]).toMatchObject({ label: 'Dispersivity', a: 'Estimate from distance', b: 'My values' });
    expect(d.some((x) => x.label === 'Longitudinal αL' && x.a === 'none' && x.b === '5 m')).toBe(true);
  });
});

describe('choices in the screen\'s words (issue 13 item 3: the comparison showed "kd", "heads")', () => {
  const base = withWell(newCase({ name: 'Base' }));
  it('sorption, flow, solution, decay phase and a receptor kind', () => {
    const v = structuredClone(base);
    v.contaminant.sorption = { mode: 'kd', kd: { value: 0.5, unit: 'L/kg' } };
    v.site.flow = { method: 'heads', readings: [] };
    v.evaluation.solution = 'exact';
    v.contaminant.decayPhase = 'dissolved-only';
    v.site.receptors[0].kind = 'surface-water';
    const d = inputDifferences(base, v);
    const at = (l: string) => d.find((x) => x.label === l);
    expect(at('Sorption given as')).toMatchObject({ a: 'Koc (with foc)', b: 'Kd directly' });
    expect(at('Flow from')).toMatchObject({ a: 'Arrow and gradient', b: 'Water levels in wells' });
    expect(at('Solution')).toMatchObject({ a: 'Domenico (1987, approximate)', b: 'Exact rectangular source' });
    expect(at('Decay acts on')).toMatchObject({ a: 'Dissolved and sorbed', b: 'Dissolved only' });
    expect(d.find((x) => x.label.startsWith('Kind'))).toMatchObject({ a: 'Well', b: 'Creek, pond or river' });
    const codes = /^(kd|koc|heads|direction|exact|domenico|dissolved-only|dissolved-and-sorbed|surface-water|well)$/;
    for (const x of d) {
      expect(x.a, x.label).not.toMatch(codes);
      expect(x.b, x.label).not.toMatch(codes);
    }
  });
});

describe('receptorChanges', () => {
  const r = (id: string, name: string, arrival: number | null, peak: number): ReceptorOutcome => ({
    id,
    name,
    status: arrival === null ? 'below-limit' : 'reaches-limit',
    arrival,
    peak: { c: peak, t: 1000 },
    atHorizon: peak,
  });

  it('says in words what changed at each receptor', () => {
    expect(describeChange(r('a', 'A', 3652.5, 0.01), r('a', 'A', 1826.25, 0.02))).toBe('reaches the limit 5 yr sooner; peak ×2');
    expect(describeChange(r('a', 'A', null, 0.001), r('a', 'A', 400, 0.01))).toMatch(/^now reaches the limit, after 1.1 yr/);
    expect(describeChange(r('a', 'A', 400, 0.01), r('a', 'A', null, 0.001))).toMatch(/no longer reaches/);
    expect(describeChange(r('a', 'A', 400, 0.01), r('a', 'A', 400, 0.01))).toBe('no change');
  });

  it('matches by id, then by name, and keeps receptors only in one case', () => {
    const out = receptorChanges([r('1', 'Well', 10, 1), r('2', 'Creek', null, 0)], [r('x', 'Well', 10, 1), r('3', 'Spring', null, 0)]);
    expect(out.map((o) => [o.name, o.effect])).toEqual([
      ['Well', 'no change'],
      ['Creek', 'only in the first case'],
      ['Spring', 'only in the second case'],
    ]);
  });
});

describe('comparePairOrder (base case first, what-if second)', () => {
  const list = [
    { id: 'base', parentId: null },
    { id: 'whatif', parentId: 'base' },
    { id: 'other', parentId: null },
  ];
  it('nothing chosen: the open what-if after its base', () => {
    expect(comparePairOrder(list, [null, null], 'whatif')).toEqual(['base', 'whatif']);
    expect(comparePairOrder(list, [null, null], 'base')).toEqual(['base', 'whatif']);
    expect(comparePairOrder(list, [null, null], 'other')).toEqual(['other', 'base']);
  });
  it('a pair chosen what-if first is turned round; others are kept', () => {
    expect(comparePairOrder(list, ['whatif', 'base'], 'whatif')).toEqual(['base', 'whatif']);
    expect(comparePairOrder(list, ['other', 'base'], 'base')).toEqual(['other', 'base']);
    // a chosen case no longer stored: the other is kept, a partner found, base first
    expect(comparePairOrder(list, ['gone', 'base'], 'base')).toEqual(['base', 'whatif']);
  });
  it('one year, not "1 years"', () => {
    expect(quantityText(1, 'yr')).toBe('1 year');
    expect(quantityText(2, 'yr')).toBe('2 years');
    expect(quantityText(1, 'm')).toBe('1 m');
  });
});
