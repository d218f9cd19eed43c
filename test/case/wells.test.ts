/**
 * Pumping wells and boundaries of a case (src/case/wells.ts, src/case/particles.ts) and the command
 * line's particle method, on the invented demo case cases/riverside-supply-well.json and variants.
 * References: Javandel & Tsang 1986 (Ground Water 24(5)) for one well in uniform flow — capture
 * width far upgradient Q/(qB); travel time along the upgradient axis t = (nB/Q₀)[r − a ln(1 + r/a)],
 * a = Q/(2πQ₀) (the elementary integral of dr/v, see test/core/flow.test.ts).
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { parseCaseFile } from '../../src/case/io';
import { migrateCase } from '../../src/case/migrate';
import { screenCase } from '../../src/case/screen';
import { runCaseParticles } from '../../src/case/particles';
import { run } from '../../src/cli/screen';
import type { Case } from '../../src/case/schema';

function demo(): Case {
  const r = parseCaseFile(readFileSync('cases/riverside-supply-well.json', 'utf8'));
  if (!r.ok) throw new Error(r.errors.join('; '));
  return r.case;
}

describe('a case with a pumping well and a river', () => {
  it('the demo opens as version 3 with the saturated thickness and the river line', () => {
    const c = demo();
    expect(c.version).toBe(3);
    expect(c.aquifer.saturatedThickness).toEqual({ value: 15, unit: 'm' });
    expect(c.site.boundaries?.[0].kind).toBe('constant-head');
  });

  it('a v2 file migrates with no boundaries and no saturated thickness; its pumping well stays unmodelled with a warning', () => {
    const c = structuredClone(demo()) as unknown as Record<string, any>;
    c.version = 2;
    delete c.site.boundaries;
    delete c.aquifer.saturatedThickness;
    const m = migrateCase(c);
    expect(m.site.boundaries ?? []).toEqual([]);
    expect(m.aquifer.saturatedThickness ?? null).toBeNull();
    const s = screenCase(m);
    expect(s.wells.field).toBeNull();
    expect(s.captures).toEqual([]);
    expect(s.warnings.map((w) => w.code)).toContain('pumping-not-represented');
  });

  it('the supply well captures the source; travel time matches the axis closed form without the river (5e-4)', () => {
    const c = demo();
    const s = screenCase(c);
    const w = s.captures[0];
    expect(w.capturesSource).toBe(true);
    expect(w.travelTimeFromSource).toBeGreaterThan(0);
    // without the river and with the well on the source's flow line: Javandel & Tsang / the axis integral
    const straight = structuredClone(c);
    straight.site.boundaries = [];
    straight.site.receptors[0].position = [350, 0];
    const s2 = screenCase(straight);
    const w2 = s2.captures[0];
    const q = 40 * 0.003;
    const B = 15;
    const Q0 = q * B;
    const a = 800 / (2 * Math.PI * Q0);
    const r = 350;
    const t = ((0.25 * B) / Q0) * (r - a * Math.log(1 + r / a));
    expect((w2.waterTravelTime as number) / t).toBeCloseTo(1, 3);
    expect((w2.travelTimeFromSource as number) / (w2.waterTravelTime as number)).toBeCloseTo(s2.prepared.model.R, 12);
    expect(w2.singleWell?.widthFarUpgradient).toBeCloseTo(800 / Q0, 10);
  });

  it('a well far off to the side does not capture the source: travel time null', () => {
    const c = demo();
    c.site.receptors[0].position = [350, 600];
    const s = screenCase(c);
    expect(s.captures[0].capturesSource).toBe(false);
    expect(s.captures[0].travelTimeFromSource).toBeNull();
  });

  it('a well on the river line is refused with a message naming the receptor', () => {
    const c = demo();
    c.site.receptors[0].position = [470, 30];
    expect(() => screenCase(c)).toThrow(/site\.receptors\[0\]/);
  });

  it('particles: seeded and reproducible; the pumped water is the captured flux over Q, within the mass balance', () => {
    const c = demo();
    const s = screenCase(c);
    const a = runCaseParticles(c, s.prepared, s.wells, { particles: 2000, seed: 4 });
    const b = runCaseParticles(c, s.prepared, s.wells, { particles: 2000, seed: 4 });
    expect(b.receptors[0].c).toEqual(a.receptors[0].c);
    const m = a.mass;
    expect(Math.abs(m.released - m.captured - m.outflow - m.decayed - m.inAquifer) / m.released).toBeLessThan(1e-12);
    expect(a.receptors[0].concentrationAtHorizon).toBeGreaterThan(0);
    expect(a.receptors[0].estimator).toMatch(/pumping rate/);
  });
});

describe('command line: --method particles', () => {
  it('json gives per receptor particles {concentrationAtHorizon, standardError, arrival} and per pumping well capturesSource, travelTimeFromSource', () => {
    let out = '';
    const code = run(['cases/riverside-supply-well.json', '--method', 'particles', '--particles', '1000', '--seed', '5', '--format', 'json'], (s) => (out += s), () => {});
    expect(code).toBe(0);
    const j = JSON.parse(out);
    const well = j.receptors[0];
    expect(well.method).toBe('analytical');
    expect(well.capturesSource).toBe(true);
    expect(well.travelTimeFromSource).toBeGreaterThan(0);
    expect(typeof well.particles.concentrationAtHorizon).toBe('number');
    expect(typeof well.particles.standardError).toBe('number');
    expect(well.particles.method).toBe('particles');
    expect(j.receptors[1].capturesSource).toBeUndefined();
    expect(j.particles.seed).toBe(5);
    expect(j.assumptions.map((a: { id: string }) => a.id)).toContain('wells-penetrating');
  });

  it('a bad --method is a usage error', () => {
    let err = '';
    expect(run(['cases/riverside-supply-well.json', '--method', 'fast'], () => {}, (s) => (err += s))).toBe(2);
    expect(err).toMatch(/--method must be analytical or particles/);
  });
});
