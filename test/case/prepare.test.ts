/**
 * Case → engine inputs. Unit conversions are checked against the exact definitions (named at each
 * check), derived parameters against hand calculations from the published formulas, geometry
 * against geographiclib (an independent geodesic library), and every invalid value against its
 * case field path and accepted range.
 *
 * Tolerance policy: exact definitions and short hand calculations to 1e-12 relative (a few
 * roundings); geodesic placement to 1e-6 relative (tangent-plane shrink ≈ s²/6R², 4e-7 at 10 km).
 */
import { describe, expect, test } from 'vitest';
import { prepareCase } from '../../src/case/prepare';
import { newCase } from '../../src/case/defaults';
import type { Case } from '../../src/case/schema';
import { ValidationError } from '../../src/core';
import { geodesicDirect } from '../geo/reference';

const REL = 1e-12;
const close = (a: number, b: number, rel = REL) => expect(Math.abs(a - b)).toBeLessThanOrEqual(rel * Math.abs(b));

/** A local case with one receptor 100 m downgradient on the centreline (flow towards east). */
function base(): Case {
  const c = newCase({ name: 'prepare', now: new Date('2026-01-01T00:00:00Z') });
  c.site.flow = { method: 'direction', azimuthDeg: 90, gradient: 0.005 };
  c.site.receptors = [
    { id: 'r1', name: 'R1', kind: 'well', position: [100, 0], screenTop: { value: 0, unit: 'm' }, screenBottom: { value: 5, unit: 'm' }, pumping: false, pumpingRate: null },
  ];
  return c;
}

function fieldError(c: Case): ValidationError {
  try {
    prepareCase(c);
  } catch (e) {
    expect(e).toBeInstanceOf(ValidationError);
    return e as ValidationError;
  }
  throw new Error('expected a ValidationError');
}

describe('unit conversions against exact definitions', () => {
  test('hydraulic conductivity', () => {
    const c = base();
    // international foot = 0.3048 m exactly (NIST SP 811, Appendix B)
    c.aquifer.hydraulicConductivity = { value: 10, unit: 'K:ft/d' };
    close(prepareCase(c).derived.K, 3.048);
    // 1 cm/s = 0.01 m × 86 400 s/d = 864 m/d (SI definitions of the centimetre and the day)
    c.aquifer.hydraulicConductivity = { value: 1e-3, unit: 'K:cm/s' };
    close(prepareCase(c).derived.K, 0.864);
    // 1 m/s = 86 400 m/d
    c.aquifer.hydraulicConductivity = { value: 1e-4, unit: 'K:m/s' };
    close(prepareCase(c).derived.K, 8.64);
    // 1 gal/d/ft² = 231 in³ × (0.0254 m/in)³ / (0.3048 m)² per day (US gallon = 231 in³ exactly, NIST Handbook 44)
    c.aquifer.hydraulicConductivity = { value: 100, unit: 'K:gpd/ft2' };
    close(prepareCase(c).derived.K, (100 * 231 * 0.0254 ** 3) / 0.3048 ** 2);
  });

  test('lengths, times, concentrations, density, diffusion', () => {
    const c = base();
    c.source.thickness = { value: 10, unit: 'ft' }; // 0.3048 m/ft exactly
    c.site.source.width = { value: 250, unit: 'cm' };
    c.evaluation.horizon = { value: 2, unit: 'yr' }; // Julian year = 365.25 d (IAU)
    c.evaluation.viewTime = { value: 36, unit: 'h' };
    c.source.concentration = { value: 1500, unit: 'ug/L' }; // 1 µg = 1e-3 mg
    c.contaminant.limit = { value: 0.002, unit: 'g/L' }; // 1 g = 1000 mg
    c.aquifer.bulkDensity = { value: 1700, unit: 'kg/m3' }; // 1 kg/m³ = 1e-3 g/cm³
    c.aquifer.diffusion = { include: true, freeWater: { value: 1e-9, unit: 'm2/s' }, tortuosity: 0.5 };
    const p = prepareCase(c);
    close(p.model.thickness, 3.048);
    close(p.model.width, 2.5);
    close(p.horizon, 730.5);
    close(p.viewTime, 1.5);
    close(p.model.c0, 1.5);
    close(p.limit, 2);
    close(p.derived.bulkDensity, 1.7);
    // De = D0·τ; 1 m²/s = 86 400 m²/d
    close(p.model.diffusion, 1e-9 * 86400 * 0.5);
    // pound avoirdupois 0.45359237 kg, foot 0.3048 m (both exact): 1 lb/ft³ = 0.45359237/0.3048³ kg/m³
    c.aquifer.bulkDensity = { value: 110, unit: 'lb/ft3' };
    close(prepareCase(c).derived.bulkDensity, (110 * 0.45359237) / 0.3048 ** 3 / 1000);
  });
});

describe('derived parameters against hand calculations', () => {
  test('seepage velocity, Kd, bulk density, retardation, decay', () => {
    const c = base();
    c.aquifer.hydraulicConductivity = { value: 10, unit: 'K:m/d' };
    c.aquifer.effectivePorosity = 0.25;
    c.aquifer.totalPorosity = 0.3;
    c.aquifer.fractionOrganicCarbon = 0.001;
    c.aquifer.bulkDensity = null;
    c.contaminant.sorption = { mode: 'koc', koc: { value: 61.7, unit: 'L/kg' } }; // benzene, US EPA 1996 SSG
    c.contaminant.halfLife = { value: 1, unit: 'yr' };
    const d = prepareCase(c).derived;
    // Darcy's law, seepage velocity v = K·i/nₑ (Freeze & Cherry 1979): 10 × 0.005 / 0.25 = 0.2 m/d
    close(d.v, 0.2);
    // Kd = Koc·foc (Karickhoff et al. 1979): 61.7 × 0.001 = 0.0617 L/kg
    close(d.kd, 0.0617);
    // ρb = 2.65 (1 − n) (quartz grain density; common practice): 2.65 × 0.7 = 1.855 g/cm³
    close(d.bulkDensity, 1.855);
    // R = 1 + ρb·Kd/n (Freeze & Cherry 1979): 1 + 1.855 × 0.0617 / 0.3 = 1 + 0.1144535/0.3 = 1.381511666…
    close(d.R, 1.3815116666666667);
    // λ = ln 2 / t½ with t½ = 365.25 d: 0.693147180559945 / 365.25
    close(d.decay, 0.6931471805599453 / 365.25);
  });

  test('Kd given directly, no decay, dissolved-only phase passed through', () => {
    const c = base();
    c.contaminant.sorption = { mode: 'kd', kd: { value: 0.5, unit: 'mL/g' } }; // 1 mL/g = 1 L/kg
    c.aquifer.bulkDensity = { value: 1.6, unit: 'g/cm3' };
    c.aquifer.totalPorosity = 0.4;
    c.aquifer.effectivePorosity = 0.3;
    c.contaminant.decayPhase = 'dissolved-only';
    const p = prepareCase(c);
    close(p.derived.R, 1 + (1.6 * 0.5) / 0.4); // = 3
    expect(p.model.decay).toBe(0);
    expect(p.model.decayPhase).toBe('dissolved-only');
  });

  test('dispersivity: given, Xu & Eckstein 1995, tenth of distance, ratios', () => {
    const c = base();
    c.site.receptors.push({ ...c.site.receptors[0], id: 'r2', position: [250, 30] });
    // Xu & Eckstein 1995, Ground Water 33(6): αL = 0.83 (log10 L)^2.414, L = farthest downgradient receptor (250 m)
    c.aquifer.dispersivity = { mode: 'estimate', relation: 'xu-eckstein-1995', transverseRatio: 0.1, verticalRatio: 0.01 };
    let p = prepareCase(c);
    close(p.derived.ax, 0.83 * Math.log10(250) ** 2.414, 1e-12);
    close(p.derived.ay, 0.1 * p.derived.ax);
    close(p.derived.az, 0.01 * p.derived.ax);
    expect(p.derived.dispersivityRelation).toMatchObject({ mode: 'estimate', relation: 'xu-eckstein-1995', scaleDistance: 250 });
    // αL = L/10 (common practice, after Pickens & Grisak 1981)
    c.aquifer.dispersivity = { mode: 'estimate', relation: 'tenth-of-distance', transverseRatio: 1 / 3, verticalRatio: 0.05 };
    p = prepareCase(c);
    close(p.derived.ax, 25);
    close(p.derived.ay, 25 / 3);
    close(p.derived.az, 1.25);
    c.aquifer.dispersivity = { mode: 'given', longitudinal: { value: 10, unit: 'ft' }, transverse: { value: 1, unit: 'm' }, vertical: { value: 5, unit: 'cm' } };
    p = prepareCase(c);
    close(p.derived.ax, 3.048);
    close(p.derived.ay, 1);
    close(p.derived.az, 0.05);
    expect(p.derived.dispersivityRelation.mode).toBe('given');
  });

  test('no receptor downgradient: dispersivity scaled from the travel distance, with a warning', () => {
    const c = base();
    c.site.receptors = [];
    c.aquifer.dispersivity = { mode: 'estimate', relation: 'tenth-of-distance', transverseRatio: 0.1, verticalRatio: 0.01 };
    const p = prepareCase(c);
    const L = (p.derived.v / p.derived.R) * p.horizon;
    close(p.derived.ax, L / 10);
    expect(p.warnings.map((w) => w.code)).toContain('dispersivity-scale-from-travel');
  });

  test('source decline and release duration', () => {
    const c = base();
    c.source.sourceHalfLife = { value: 5, unit: 'yr' };
    c.source.duration = { value: 3, unit: 'yr' };
    const m = prepareCase(c).model;
    close(m.sourceDecay, Math.LN2 / (5 * 365.25));
    close(m.duration, 3 * 365.25);
    c.source.duration = null;
    expect(prepareCase(c).model.duration).toBe(Infinity);
  });
});

describe('geometry', () => {
  test('flow from head readings: the three-point problem on a plane h = 20 − 0.01·e', () => {
    const c = base();
    // heads on a plane falling eastwards by 0.01 m/m: gradient 0.01, flow towards 90° (east)
    c.site.flow = {
      method: 'heads',
      readings: [
        { id: 'a', name: 'A', position: [0, 0], head: { value: 20, unit: 'm' } },
        { id: 'b', name: 'B', position: [100, 50], head: { value: 19, unit: 'm' } },
        { id: 'c', name: 'C', position: [20, -80], head: { value: 19.8, unit: 'm' } },
      ],
    };
    const p = prepareCase(c);
    close(p.derived.gradient, 0.01, 1e-12);
    expect(Math.abs(p.derived.azimuthDeg - 90)).toBeLessThan(1e-9);
    expect(p.derived.headFit?.residuals.every((r) => Math.abs(r) < 1e-12)).toBe(true);
    close(p.receptors[0].x, 100, 1e-12);
    // heads in feet: the same plane
    c.site.flow.readings.forEach((r) => (r.head = { value: r.head.value / 0.3048, unit: 'ft' }));
    close(prepareCase(c).derived.gradient, 0.01, 1e-12);
  });

  test('receptors in the flow frame: x downgradient, y to the left looking downgradient', () => {
    const c = base();
    c.site.flow = { method: 'direction', azimuthDeg: 0, gradient: 0.005 }; // towards north
    c.site.receptors[0].position = [-30, 200]; // west of the centreline = left looking north
    const r = prepareCase(c).receptors[0];
    close(r.x, 200);
    close(r.y, 30);
    close(r.distance, Math.hypot(30, 200));
  });

  test('footprint: source plane on the downgradient edge, width across the flow', () => {
    const c = base();
    // 20 m (east) × 10 m (north) rectangle centred on the origin, flow towards east
    c.site.source.footprint = [[-10, -5], [10, -5], [10, 5], [-10, 5]];
    const p = prepareCase(c);
    close(p.model.width, 10);
    expect(p.sourceEN).toEqual([10, 0]);
    close(p.receptors[0].x, 90); // 100 m east of the origin, 90 m beyond the downgradient edge
    expect(p.derived.widthFromFootprint).toBe(true);
    // flow towards north: width is the east–west extent
    c.site.flow = { method: 'direction', azimuthDeg: 0, gradient: 0.005 };
    close(prepareCase(c).model.width, 20);
  });

  test('geographic frame: a receptor s metres along the flow azimuth (geographiclib) lands at x = s', () => {
    const source: [number, number] = [-2.731, 52.413];
    for (const datum of [source, [-2.74, 52.42] as [number, number]]) {
      for (const az of [30, 110, 250]) {
        const c = base();
        c.site.frame = 'geographic';
        c.site.datum = datum;
        c.site.source.position = source;
        c.site.flow = { method: 'direction', azimuthDeg: az, gradient: 0.005 };
        c.site.receptors[0].position = geodesicDirect(source, az, 500);
        const p = prepareCase(c);
        expect(Math.abs(p.receptors[0].x - 500) / 500).toBeLessThan(1e-6);
        expect(Math.abs(p.receptors[0].y)).toBeLessThan(2e-6 * 500);
        // toMap/fromMap are inverse
        const q = p.fromMap(p.toMap(123, -45));
        expect(Math.abs(q.x - 123)).toBeLessThan(1e-6);
        expect(Math.abs(q.y + 45)).toBeLessThan(1e-6);
      }
    }
  });
});

// Issue 13 item 6 / 14 item 5: each refusal names the field as the screen labels it, the value as
// entered with its unit, and the accepted range in that unit; the field path stays on the error.
describe('invalid values → ValidationError on the case field, in the screen\'s words', () => {
  const rows: [string, (c: Case) => void, string, string][] = [
    ['effective porosity 0', (c) => (c.aquifer.effectivePorosity = 0), 'aquifer.effectivePorosity', "Effective porosity nₑ 0 is not accepted: enter a value above 0 and below 1"],
    ['effective above total porosity', (c) => { c.aquifer.effectivePorosity = 0.35; c.aquifer.totalPorosity = 0.3; }, 'aquifer.effectivePorosity', "Effective porosity nₑ 0.35 is not accepted: enter a value at most the total porosity n (0.3)"],
    ['total porosity 1', (c) => (c.aquifer.totalPorosity = 1), 'aquifer.totalPorosity', "Total porosity n 1 is not accepted: enter a value above 0 and below 1"],
    ['negative K', (c) => (c.aquifer.hydraulicConductivity = { value: -3, unit: 'K:m/d' }), 'aquifer.hydraulicConductivity', "Hydraulic conductivity K −3 m/d is not accepted: enter a value above 0 m/d"],
    ['zero K in m/s', (c) => (c.aquifer.hydraulicConductivity = { value: 0, unit: 'K:m/s' }), 'aquifer.hydraulicConductivity', "Hydraulic conductivity K 0 m/s is not accepted: enter a value above 0 m/s"],
    ['source declining too fast for the solutions', (c) => (c.source.sourceHalfLife = { value: 1, unit: 'd' }), 'source.sourceHalfLife', "Source half-life 1 day is not accepted: with this velocity and dispersion the solutions cannot represent a source halving faster than every 84.7 d (decline rate must stay below λ + v²/(4·Dx), retarded); lengthen the source half-life"],
    ['foc above 1', (c) => (c.aquifer.fractionOrganicCarbon = 2), 'aquifer.fractionOrganicCarbon', "Fraction of organic carbon foc 2 is not accepted: enter a value from 0 to 1"],
    ['negative Koc', (c) => (c.contaminant.sorption = { mode: 'koc', koc: { value: -1, unit: 'L/kg' } }), 'contaminant.sorption.koc', "Organic-carbon partition coefficient Koc −1 L/kg is not accepted: enter a value of 0 L/kg or more"],
    ['zero half-life', (c) => (c.contaminant.halfLife = { value: 0, unit: 'd' }), 'contaminant.halfLife', "Biodegradation half-life 0 days is not accepted: enter a value above 0 days"],
    ['zero limit', (c) => (c.contaminant.limit = { value: 0, unit: 'mg/L' }), 'contaminant.limit', "Limit at the receptors 0 mg/L is not accepted: enter a value above 0 mg/L"],
    ['zero source concentration', (c) => (c.source.concentration = { value: 0, unit: 'mg/L' }), 'source.concentration', "Source concentration C₀ 0 mg/L is not accepted: enter a value above 0 mg/L"],
    ['view time after horizon', (c) => (c.evaluation.viewTime = { value: 40, unit: 'yr' }), 'evaluation.viewTime', "Time shown on the map 40 years is not accepted: enter a value above 0 years and at most 30 years"],
    ['negative depth', (c) => (c.evaluation.depth = { value: -1, unit: 'm' }), 'evaluation.depth', "Depth shown on the map −1 m is not accepted: enter a value of 0 m or more"],
    ['screen bottom above top', (c) => { c.site.receptors.push({ ...c.site.receptors[0], id: 'r2', screenTop: { value: 4, unit: 'm' }, screenBottom: { value: 2, unit: 'm' } }); }, 'site.receptors[1].screenBottom', "Screen bottom of “R1” 2 m is not accepted: enter a value of at least 4 m"],
    ['gradient 0', (c) => (c.site.flow = { method: 'direction', azimuthDeg: 90, gradient: 0 }), 'site.flow.gradient', "Hydraulic gradient i 0 is not accepted: enter a value above 0 and below 1"],
    ['two head readings', (c) => (c.site.flow = { method: 'heads', readings: [{ id: 'a', name: 'a', position: [0, 0], head: { value: 1, unit: 'm' } }, { id: 'b', name: 'b', position: [1, 0], head: { value: 0, unit: 'm' } }] }), 'site.flow.readings', "Water levels in wells: the flow direction needs at least 3 water levels (not all on one line); 2 are given"],
    ['collinear head readings', (c) => (c.site.flow = { method: 'heads', readings: [0, 1, 2].map((i) => ({ id: `h${i}`, name: '', position: [i * 10, i * 10] as [number, number], head: { value: 10 - i, unit: 'm' } })) }), 'site.flow.readings', "Water levels in wells: the wells lie on one line (or coincide), so they cannot define the water-table plane and the flow direction is undetermined; add a well off that line"],
    ['equal heads', (c) => (c.site.flow = { method: 'heads', readings: [[0, 0], [50, 0], [0, 50]].map((p, i) => ({ id: `h${i}`, name: '', position: p as [number, number], head: { value: 10, unit: 'm' } })) }), 'site.flow.readings', "Water levels in wells: the water levels give a gradient of 0; it must lie above 0 and below 1 (are the levels all equal, or in the wrong unit?)"],
    ['unknown unit (bypassing the schema)', (c) => (c.source.thickness = { value: 3, unit: 'furlong' }), 'source.thickness.unit', "Unit of source thickness below the water table “furlong” is not accepted: it is not a unit the app knows; choose one of m, cm, km, ft, mi"],
    ['latitude out of range', (c) => { c.site.frame = 'geographic'; c.site.datum = [10, 50]; c.site.source.position = [10, 50]; c.site.receptors[0].position = [10, 95]; }, 'site.receptors[0].position', "Receptor position of “R1” [10, 95] is not accepted: the position's latitude must lie between −90° and 90° (it is 95)"],
    ['self-crossing footprint', (c) => (c.site.source.footprint = [[0, 0], [10, 10], [10, 0], [0, 10]]), 'site.source.footprint', "Release outline: source footprint crosses itself (edge 1 meets edge 3); trace its outline without crossings"],
    ['zero given dispersivity', (c) => (c.aquifer.dispersivity = { mode: 'given', longitudinal: { value: 1, unit: 'm' }, transverse: { value: 0, unit: 'm' }, vertical: { value: 0.01, unit: 'm' } }), 'aquifer.dispersivity.transverse', "Transverse horizontal αT 0 m is not accepted: enter a value above 0 m"],
    ['tortuosity 0 with diffusion on', (c) => (c.aquifer.diffusion = { include: true, freeWater: { value: 1e-9, unit: 'm2/s' }, tortuosity: 0 }), 'aquifer.diffusion.tortuosity', "Tortuosity factor τ 0 is not accepted: enter a value above 0 and at most 1"],
  ];
  test.each(rows)('%s', (_label, edit, field, message) => {
    const c = base();
    edit(c);
    const e = fieldError(c);
    expect(e.field).toBe(field);
    expect(e.message).toBe(message);
  });
});

describe('warnings', () => {
  test('pumping receptor, unverified preset value, value outside the usual range', () => {
    const c = base();
    c.site.receptors[0].pumping = true;
    c.contaminant.presetId = 'vinyl-chloride';
    c.contaminant.sorption = { mode: 'koc', koc: { value: 18.6, unit: 'L/kg' } }; // recalled in docs/field-values.md
    c.aquifer.hydraulicConductivity = { value: 5000, unit: 'K:m/d' }; // above Bouwer's 1978 gravel range (≤ 1000 m/d)
    const w = prepareCase(c).warnings;
    const byCode = Object.fromEntries(w.map((x) => [x.code, x]));
    expect(byCode['pumping-not-represented'].field).toBe('site.receptors[0].pumping');
    expect(byCode['preset-value-unverified'].message).toMatch(/as commonly cited/);
    expect(byCode['outside-usual-range'].message).toMatch(/^Hydraulic conductivity K 5000 m\/d is outside the usual range .*Bouwer 1978/);
  });

  test('a seen preset value unchanged gives no provenance warning', () => {
    const c = base();
    c.contaminant.presetId = 'benzene';
    expect(prepareCase(c).warnings.map((w) => w.code)).not.toContain('preset-value-unverified');
  });

  test('model warnings come with case field paths', () => {
    const c = base();
    c.contaminant.limit = { value: 20, unit: 'mg/L' }; // ≥ source 10 mg/L
    c.site.receptors[0].position = [-50, 0]; // upgradient
    const w = prepareCase(c).warnings;
    expect(w.find((x) => x.code === 'limit-above-source')?.field).toBe('contaminant.limit');
    expect(w.find((x) => x.code === 'upgradient')?.field).toBe('site.receptors[0]');
  });
});

test('all demo-case derived numbers are finite', async () => {
  const { readFileSync, readdirSync } = await import('node:fs');
  const { parseCaseFile } = await import('../../src/case/io');
  for (const f of readdirSync('cases').filter((n) => n.endsWith('.json'))) {
    const r = parseCaseFile(readFileSync(`cases/${f}`, 'utf8'));
    expect(r.ok, f).toBe(true);
    if (!r.ok) continue;
    const p = prepareCase(r.case);
    for (const [k, v] of Object.entries(p.model)) if (typeof v === 'number' && k !== 'duration') expect(Number.isFinite(v), `${f} ${k}`).toBe(true);
    for (const rec of p.receptors) expect(Number.isFinite(rec.x) && Number.isFinite(rec.y)).toBe(true);
  }
});
