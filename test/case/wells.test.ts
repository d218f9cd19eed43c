/**
 * Pumping wells and boundaries of a case (src/case/wells.ts, src/case/particles.ts) and the command
 * line's particle method, on the invented demo case cases/riverside-supply-well.json and variants.
 * References: Javandel & Tsang 1986 (Ground Water 24(5)) for one well in uniform flow — capture
 * width far upgradient Q/(qB); travel time along the upgradient axis t = (nB/Q₀)[r − a ln(1 + r/a)],
 * a = Q/(2πQ₀) (the elementary integral of dr/v, see test/core/flow/field.test.ts).
 * Water levels: Thiem's steady drawdown Q/(2πKB)·ln(r'/r) of a well beside a constant-head line,
 * r' the distance to its image across the line (Ferris et al. 1962, USGS WSP 1536-E), plus the
 * regional gradient, written out here by hand from the case's geometry; the unconfined form from
 * the Dupuit–Forchheimer potential ½Kh² (Strack 1989, Groundwater Mechanics §8): h² = B² + 2B·Δh.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { parseCaseFile } from '../../src/case/io';
import { migrateCase } from '../../src/case/migrate';
import { screenCase } from '../../src/case/screen';
import { runCaseParticles } from '../../src/case/particles';
import { headWarnings, mapCaptureZones, receptorHeads } from '../../src/case/wells';
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
    expect(() => screenCase(c)).toThrow('Receptor position of “Town supply well” [470, 30] is not accepted: well 1 (Town supply well) lies on boundary line 1');
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

describe('mapCaptureZones: the capture zone drawn on the map against Javandel & Tsang (1986)', () => {
  // one well pumping Q in uniform flow, no boundary: stagnation point x_s = Q/(2πBq) downgradient,
  // capture width Q/(2Bq) through the well and Q/(Bq) far upgradient (Javandel & Tsang 1986,
  // Ground Water 24(5); restated in docs/field-values.md); the exact dividing streamline
  // y = (Q/(2πBq))·θ, θ the polar angle about the well from the downgradient direction (same paper).
  const c = demo();
  c.site.boundaries = [];
  c.site.receptors[0].position = [350, 0];
  c.site.flow = { method: 'direction', azimuthDeg: 90, gradient: 0.003 };
  const s = screenCase(c);
  const zone = mapCaptureZones(s.prepared, s.wells)[0];
  const Q = 800;
  const B = 15;
  const q = 40 * 0.003;
  const W = Q / (B * q);
  const xs = Q / (2 * Math.PI * B * q);
  // the outline in the flow frame relative to the well
  const pts = zone.envelope.map((pos) => {
    const f = s.prepared.fromMap(pos);
    return { x: f.x - 350, y: f.y };
  });
  /** the outline's extent across the flow at distance x from the well (crossings of the vertical line) */
  const across = (x: number) => {
    const ys: number[] = [];
    for (let i = 0; i < pts.length; i++) {
      const a = pts[i];
      const b = pts[(i + 1) % pts.length];
      if ((a.x - x) * (b.x - x) <= 0 && a.x !== b.x) ys.push(a.y + ((x - a.x) / (b.x - a.x)) * (b.y - a.y));
    }
    return Math.max(...ys) - Math.min(...ys);
  };
  const spacing = W / 72; // each of the 72 traced streamlines carries Q/72

  it('the tip of the zone lies at the stagnation point Q/(2πBq) downgradient, on the axis (1e-6 relative)', () => {
    const tip = pts.reduce((a, b) => (b.x > a.x ? b : a));
    expect(Math.abs(tip.x - xs) / xs).toBeLessThan(1e-6);
    expect(Math.abs(tip.y) / xs).toBeLessThan(1e-6);
  });

  it('width across the well line Q/(2Bq) (within 2 streamline spacings)', () => {
    expect(Math.abs(across(0) - W / 2)).toBeLessThan(2 * spacing);
  });

  it('width upgradient: the exact dividing streamline at 5, 25 and 45 x_s (2 spacings), approaching Q/(Bq)', () => {
    for (const k of [5, 25, 45]) {
      const x = -k * xs;
      // y = (Q/(2πBq))·θ with θ = atan2(y, x): fixed-point iteration (a contraction here)
      let y = W / 2;
      for (let i = 0; i < 200; i++) y = (Q / (2 * Math.PI * B * q)) * Math.atan2(y, x);
      expect(Math.abs(across(x) - 2 * y)).toBeLessThan(2 * spacing);
    }
    // far upgradient the width tends to Q/(Bq) as W·(1 − x_s/|x|) (the first term of the expansion of
    // the dividing streamline in x_s/|x|, derived here): at 45 x_s within 2 spacings of that, and within
    // 4 % of W itself (1/45 = 2.2 % for the finite distance, 2.8 % for the fan's spacing)
    const w45 = across(-45 * xs);
    expect(Math.abs(w45 - W * (1 - 1 / 45))).toBeLessThan(2 * spacing);
    expect(Math.abs(w45 - W) / W).toBeLessThan(1 / 45 + (2 * spacing) / W);
  });

  it('time-of-travel marks: each outline lies inside the next, the contaminant zone inside the water zone (R > 1)', () => {
    const extent = (ring: { 0: number; 1: number }[]) => Math.min(...ring.map((p) => s.prepared.fromMap(p as [number, number]).x));
    for (let k = 1; k < zone.water.length; k++) expect(extent(zone.water[k].ring)).toBeLessThan(extent(zone.water[k - 1].ring));
    for (let k = 0; k < zone.water.length; k++) expect(extent(zone.contaminant[k].ring)).toBeGreaterThan(extent(zone.water[k].ring));
  });
});

describe('warnings where the steady picture needs care (wells near a boundary or each other)', () => {
  // thresholds are the program's screening judgement (src/core/flow/field.ts flowWarnings): closer to a
  // boundary than twice the well's stagnation distance Q/(2πqB) (Javandel & Tsang 1986) or 5 m; two
  // wells closer than the larger stagnation distance. Riverside: Q/(2πqB) = 800/(2π·0.12·15) = 70.7 m.
  it('the riverside supply well, 120 m from the river (< 2 × 70.7 m), is warned about, on its receptor field', () => {
    const s = screenCase(demo());
    const w = s.warnings.find((x) => x.code === 'well-near-boundary');
    expect(w?.message).toMatch(/Town supply well\) is 120 m from boundary line 1 \(constant head\)/);
    expect(w?.field).toBe('site.receptors[0].position');
  });

  it('a second pumping well 40 m away: the cones and zones merge, and the steady picture needs both to have pumped long', () => {
    const c = structuredClone(demo());
    c.site.receptors.push({ ...structuredClone(c.site.receptors[0]), id: 'second', name: 'Second well', position: [350, 70] });
    const s = screenCase(c);
    const w = s.warnings.find((x) => x.code === 'wells-close');
    expect(w?.message).toMatch(/Town supply well\) and Well 2 \(Second well\) are 40 m apart: .*steady picture holds only after both have pumped for long/);
    expect(w?.field).toBe('site.receptors[2].position');
  });

  it('a well beside an impermeable line: the steady state takes long to reach, and the warning says so', () => {
    const c = structuredClone(demo());
    c.site.boundaries = [{ id: 'wall', name: 'Clay wall', kind: 'no-flow', points: [[-1000, 60], [1000, 60]] }];
    const s = screenCase(c);
    expect(s.warnings.find((x) => x.code === 'well-near-boundary')?.message).toMatch(/impermeable.*steady state takes long to reach/);
  });
});

describe('water levels in the well field (confined and Dupuit forms)', () => {
  it('riverside demo: heads at the receptors from Thiem with an image well and the regional gradient; Dupuit thickness from the same potential', () => {
    const c = demo();
    const s = screenCase(c);
    const heads = receptorHeads(s.prepared, s.wells);
    // flow frame: +x east (azimuth 90°), the river line at x = 470 m, the well at (350, 30), Q 800 m³/d
    const K = 40;
    const B = 15;
    const i = 0.003;
    const Q = 800;
    const well = { x: 350, y: 30 };
    const image = { x: 2 * 470 - well.x, y: well.y };
    const rw = 0.1;
    const dist = (a: { x: number; y: number }, b: { x: number; y: number }) => Math.max(Math.hypot(a.x - b.x, a.y - b.y), rw);
    const source = { x: 0, y: 0 };
    const dh = (p: { x: number; y: number }) =>
      -i * (p.x - source.x) + (Q / (2 * Math.PI * K * B)) * (Math.log(dist(p, well) / dist(source, well)) - Math.log(dist(p, image) / dist(source, image)));
    s.prepared.receptors.forEach((r, k) => {
      const want = dh(r);
      expect(Math.abs(heads[k].confined - want)).toBeLessThan(1e-9 * Math.max(1, Math.abs(want)));
      expect(Math.abs(heads[k].unconfined - Math.sqrt(B * B + 2 * B * want))).toBeLessThan(1e-9 * B);
      expect(heads[k].dewatered).toBe(false);
    });
    // at the pumping well's face the level is lowest: below the release by the gradient and the cone
    expect(heads[0].confined).toBeLessThan(-i * 350);
    expect(headWarnings(s.prepared, s.wells, heads)).toEqual([]);
  });

  it('a well pumping far beyond what the aquifer yields dewaters it in the Dupuit form, and says so', () => {
    const c = structuredClone(demo());
    c.site.receptors[0].pumpingRate = { value: 40_000, unit: 'm3/d' };
    const s = screenCase(c);
    const heads = receptorHeads(s.prepared, s.wells);
    expect(heads[0].dewatered).toBe(true);
    expect(heads[0].unconfined).toBe(0);
    expect(Number.isFinite(heads[0].confined)).toBe(true);
    expect(headWarnings(s.prepared, s.wells, heads).map((w) => w.message).join(' ')).toMatch(/At Town supply well the pumping would dewater an unconfined aquifer/);
  });

  it('a US customary case words the well field’s lengths in ft (NIST SP 811: ft = 0.3048 m)', () => {
    const c = structuredClone(demo());
    c.site.receptors[0].pumpingRate = { value: 2000, unit: 'm3/d' };
    c.units = { system: 'US', fields: {} };
    const s = screenCase(c);
    const heads = receptorHeads(s.prepared, s.wells);
    // B = 15 m at the release = 49.21 ft, to 3 significant digits 49.2 ft
    const words = headWarnings(s.prepared, s.wells, heads, c).map((w) => w.message).join(' ');
    expect(words).toMatch(/would be [\d.]+ ft against 49\.2 ft at the release/);
    expect(words).not.toMatch(/\d m\b/);
    // the well 120 m from the river: 393.7 ft, written 394 ft
    expect(s.wells.warnings.map((w) => w.message).join(' ')).toMatch(/is 394 ft from boundary line 1/);
  });
});
