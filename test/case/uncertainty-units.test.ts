/**
 * Uncertain inputs in the case's unit system (issue 13 item 4): in a US customary case the
 * starting distributions, their descriptions (panel, report, CSV export, command line) and the
 * editor read in ft/d, ft …; a value typed in ft stays exactly as typed however often the system
 * is switched; switching never rewrites a stored distribution.
 *
 * Conversion factors: NIST SP 811 (2008), Appendix B (foot = 0.3048 m exactly). The Bouwer (1978)
 * range for coarse sand, 20–100 m/d, is the presets' own (src/case/presets.ts, docs/field-values.md);
 * here it is only converted: 20/0.3048 = 65.6168… and 100/0.3048 = 328.0839… ft/d, shown to 4
 * significant digits.
 */
import { describe, expect, test } from 'vitest';
import { readFileSync } from 'node:fs';
import { migrateCase } from '../../src/case/migrate';
import type { Case, UncertainValue } from '../../src/case/schema';
import { checkInputsAsShown, describeShown, distributionIn, planInput, runUncertainty, shownDistribution } from '../../src/case/uncertainty';
import { defaultDistribution, noteAfterEdit } from '../../src/case/uncertaintyDefaults';
import { withFieldUnit, withUnitSystem } from '../../src/case/unitSystem';
import { uncertaintyCsv } from '../../src/case/export-uncertainty';
import { serializeCase } from '../../src/case/io';

const FT = 0.3048;
const nitrate = (): Case => migrateCase(JSON.parse(readFileSync('cases/nitrate-field-supply.json', 'utf8')));
const inUS = (c: Case): Case => ({ ...c, units: withUnitSystem(c, 'US') });

describe('distributions in a US customary case', () => {
  test('the starting K distribution is offered in ft/d (the published m/d range converted, 4 significant digits)', () => {
    const si = defaultDistribution(nitrate(), 'hydraulicConductivity')!;
    expect(si).toMatchObject({ kind: 'log-uniform', low: 20, high: 100, unit: 'K:m/d' });
    const us = defaultDistribution(inUS(nitrate()), 'hydraulicConductivity')!;
    expect(us).toMatchObject({ kind: 'log-uniform', low: 65.62, high: 328.1, unit: 'K:ft/d' });
    expect(us.note).toBe(si.note);
    // within the 4-digit rounding of the exact conversion
    expect(Math.abs((us as { low: number }).low * FT - 20) / 20).toBeLessThan(5e-4);
  });

  test('around the case’s own value: a source width typed in m starts in ft', () => {
    const c = inUS(nitrate());
    const d = defaultDistribution(c, 'sourceWidth')!;
    expect(d.unit).toBe('ft');
    const w = c.site.source.width;
    expect(w.unit).toBe('m');
    expect((d as { mode: number }).mode).toBeCloseTo(Number((w.value / FT).toPrecision(4)), 10);
  });

  test('descriptions read in the case’s units; SI unchanged', () => {
    const si = nitrate();
    const us = inUS(si);
    const d = si.uncertainty.inputs.hydraulicConductivity!;
    expect(describeShown(si, 'hydraulicConductivity', d)).toContain('m/d');
    const text = describeShown(us, 'hydraulicConductivity', d);
    expect(text).toContain('ft/d');
    expect(text).not.toContain('m/d');
    // dimensionless inputs carry no unit in either system
    expect(describeShown(us, 'effectivePorosity', si.uncertainty.inputs.effectivePorosity!)).toBe(describeShown(si, 'effectivePorosity', si.uncertainty.inputs.effectivePorosity!));
  });

  test('a lognormal in m/d reads in ft/d: the median converted, the geometric SD (a pure number) not', () => {
    const d: UncertainValue = { kind: 'lognormal', median: 40, gsd: 3, unit: 'K:m/d', truncate: { low: 1 } };
    const s = distributionIn(d, 'K:m/d', 'K:ft/d') as Extract<UncertainValue, { kind: 'lognormal' }>;
    expect(s.median).toBe(131.2); // 40/0.3048 = 131.2336
    expect(s.gsd).toBe(3);
    expect(s.truncate).toEqual({ low: 3.281 }); // 1/0.3048 = 3.2808
    expect(s.unit).toBe('K:ft/d');
    expect(distributionIn(d, 'K:m/d', 'K:m/d')).toBe(d);
  });

  test('the sampler of the shown distribution is the stored one (to the shown rounding)', () => {
    const us = inUS(nitrate());
    const stored = us.uncertainty.inputs.hydraulicConductivity!;
    const a = planInput(us, 'hydraulicConductivity', stored);
    const b = planInput(us, 'hydraulicConductivity', shownDistribution(us, 'hydraulicConductivity', stored));
    expect(b.unit).toBe('K:ft/d');
    expect(Math.abs(b.sampler.median * b.factor - a.sampler.median * a.factor) / (a.sampler.median * a.factor)).toBeLessThan(1e-3);
  });

  test('a value typed in ft/d stays exactly as typed after switching the system back and forth', () => {
    let c = inUS(nitrate());
    // the editor edits what it shows: the median typed as 123.45 ft/d, the rest as shown
    const shown = shownDistribution(c, 'hydraulicConductivity', c.uncertainty.inputs.hydraulicConductivity!);
    const typed = { ...shown, kind: 'lognormal', median: 123.45, gsd: 2.5 } as UncertainValue;
    c = { ...c, uncertainty: { ...c.uncertainty, inputs: { ...c.uncertainty.inputs, hydraulicConductivity: typed } } };
    const file = serializeCase(c);
    for (const system of ['SI', 'US', 'SI', 'US'] as const) {
      c = { ...c, units: withUnitSystem(c, system) };
      const s = shownDistribution(c, 'hydraulicConductivity', c.uncertainty.inputs.hydraulicConductivity!) as Extract<UncertainValue, { kind: 'lognormal' }>;
      if (system === 'US') expect(s).toBe(c.uncertainty.inputs.hydraulicConductivity); // no conversion at all
      else expect(s.median).toBe(Number((123.45 * FT).toPrecision(4))); // 37.63 m/d
    }
    expect(c.uncertainty.inputs.hydraulicConductivity).toMatchObject({ median: 123.45, gsd: 2.5, unit: 'K:ft/d' });
    // the stored distribution is byte for byte as it was, apart from the system itself
    expect(JSON.parse(serializeCase(c)).uncertainty).toEqual(JSON.parse(file).uncertainty);
  });

  test('a field override of K applies to its distribution too', () => {
    const c = nitrate();
    c.units = withFieldUnit({ ...c, units: withUnitSystem(c, 'US') }, 'aquifer.hydraulicConductivity', 'K:m/s');
    expect(describeShown(c, 'hydraulicConductivity', { kind: 'uniform', low: 8.64, high: 86.4, unit: 'K:m/d' })).toBe('uniform from 0.0001 to 0.001 m/s');
  });

  test('the starting distribution still counts as cited after an edit back to it in a US case', () => {
    const c = inUS(nitrate());
    const start = defaultDistribution(c, 'hydraulicConductivity')!;
    const changed = { ...start, high: 400 } as UncertainValue;
    expect(noteAfterEdit(c, 'hydraulicConductivity', start, changed)).toMatch(/^my own values \(changed from: /);
    expect(noteAfterEdit(c, 'hydraulicConductivity', changed, { ...start })).toBe(start.note);
  });

  test('the probabilities CSV describes the distributions in the case’s system', () => {
    const c = nitrate();
    c.uncertainty = { ...c.uncertainty, runs: 40, inputs: { hydraulicConductivity: c.uncertainty.inputs.hydraulicConductivity } };
    const u = runUncertainty(c);
    const si = uncertaintyCsv(u, c);
    const us = uncertaintyCsv(u, inUS(c));
    const line = (csv: string) => csv.split('\r\n').find((l) => l.startsWith('uncertain input'))!;
    expect(line(si)).toContain('m/d');
    expect(line(us)).toContain('ft/d');
    expect(line(us)).not.toContain('m/d');
    // the figures themselves (days, mg/L, named in their columns) are the same in both systems
    expect(us.split('\r\n').slice(6, 9)).toEqual(si.split('\r\n').slice(6, 9));
  });
});

describe('a refused distribution at the start of a run', () => {
  test('is worded in the units on screen, as its row says it (a US case: the truncation bounds in ft/d)', () => {
    const bad: UncertainValue = { kind: 'lognormal', median: 40, gsd: 3, unit: 'K:m/d', truncate: { low: 30, high: 10 } };
    const c = inUS(nitrate());
    c.uncertainty.inputs.hydraulicConductivity = bad;
    const message = (f: () => unknown) => {
      try {
        f();
      } catch (e) {
        return (e as Error).message;
      }
      return null;
    };
    const stored = message(() => planInput(c, 'hydraulicConductivity', bad));
    const shown = message(() => checkInputsAsShown(c));
    // the row's own check (DistributionEditor: planInput on the shown distribution) and the run's agree
    expect(shown).toBe(message(() => planInput(c, 'hydraulicConductivity', shownDistribution(c, 'hydraulicConductivity', bad))));
    expect(stored).toMatch(/\(30\).*\(10\)/);
    // 30 and 10 m/d are 98.43 and 32.81 ft/d (NIST SP 811: 1 ft = 0.3048 m), to 4 significant digits
    expect(shown).toMatch(/\(98\.43\).*\(32\.81\)/);
    // an SI case words it as stored
    const si = nitrate();
    si.uncertainty.inputs.hydraulicConductivity = bad;
    expect(message(() => checkInputsAsShown(si))).toBe(stored);
  });
});

