/**
 * Whole-case robustness: seeded random cases across and beyond the usual field ranges either
 * screen to finite, non-negative figures or fail with a ValidationError naming a case field —
 * never NaN, Infinity or another exception. Seeded (mulberry32), so a failure replays exactly.
 */
import { expect, test } from 'vitest';
import { screenCase } from '../../src/case/screen';
import { newCase } from '../../src/case/defaults';
import { ValidationError } from '../../src/core';
import type { Case } from '../../src/case/schema';

function mulberry32(seed: number) {
  return () => {
    seed |= 0;
    seed = (seed + 0x6d2b79f5) | 0;
    let t = Math.imul(seed ^ (seed >>> 15), 1 | seed);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

function randomCase(rnd: () => number): Case {
  const logU = (lo: number, hi: number) => 10 ** (Math.log10(lo) + rnd() * (Math.log10(hi) - Math.log10(lo)));
  const pick = <T,>(xs: T[]) => xs[Math.floor(rnd() * xs.length)];
  const c = newCase({ name: 'fuzz', now: new Date('2026-01-01T00:00:00Z') });
  c.site.flow = { method: 'direction', azimuthDeg: rnd() * 720 - 360, gradient: rnd() < 0.9 ? logU(1e-5, 0.2) : pick([0, 1.5]) };
  c.aquifer.hydraulicConductivity = { value: logU(1e-6, 5000), unit: pick(['K:m/d', 'K:ft/d', 'K:cm/s']) };
  c.aquifer.totalPorosity = rnd() < 0.92 ? 0.05 + rnd() * 0.6 : pick([0, 1.2]);
  c.aquifer.effectivePorosity = c.aquifer.totalPorosity * (rnd() < 0.92 ? 0.3 + rnd() * 0.7 : 1.1);
  c.aquifer.fractionOrganicCarbon = logU(1e-5, 0.05);
  c.contaminant.sorption = { mode: 'koc', koc: { value: logU(0.1, 5000), unit: 'L/kg' } };
  c.contaminant.halfLife = rnd() < 0.5 ? null : { value: logU(1, 1e5), unit: 'd' };
  c.contaminant.decayPhase = pick(['dissolved-and-sorbed', 'dissolved-only']);
  c.contaminant.limit = { value: logU(1e-4, 50), unit: 'mg/L' };
  c.source.concentration = { value: logU(1e-3, 1000), unit: 'mg/L' };
  c.source.thickness = { value: logU(0.1, 30), unit: 'm' };
  c.site.source.width = { value: logU(0.5, 500), unit: 'm' };
  c.source.duration = rnd() < 0.7 ? null : { value: logU(10, 1e4), unit: 'd' };
  c.source.sourceHalfLife = rnd() < 0.7 ? null : { value: logU(10, 1e5), unit: 'd' };
  c.aquifer.dispersivity =
    rnd() < 0.5
      ? { mode: 'estimate', relation: pick(['xu-eckstein-1995', 'tenth-of-distance'] as const), transverseRatio: pick([0.1, 0.33]), verticalRatio: pick([0.01, 0.05]) }
      : { mode: 'given', longitudinal: { value: logU(0.01, 100), unit: 'm' }, transverse: { value: logU(0.001, 10), unit: 'm' }, vertical: { value: logU(1e-4, 1), unit: 'm' } };
  c.evaluation.horizon = { value: logU(1, 200), unit: 'yr' };
  c.evaluation.viewTime = null;
  c.site.receptors = Array.from({ length: 1 + Math.floor(rnd() * 3) }, (_, i) => {
    const top = rnd() * 10;
    return {
      id: `r${i}`,
      name: `R${i}`,
      kind: 'well' as const,
      position: [(rnd() - 0.3) * 2000, (rnd() - 0.5) * 400] as [number, number],
      screenTop: { value: top, unit: 'm' },
      screenBottom: { value: top + rnd() * 10, unit: 'm' },
      pumping: false,
      pumpingRate: null,
    };
  });
  return c;
}

test('300 random cases (seed 7): finite figures or a ValidationError on a case field', () => {
  const rnd = mulberry32(7);
  let screened = 0;
  let refused = 0;
  for (let k = 0; k < 300; k++) {
    const c = randomCase(rnd);
    let s;
    try {
      s = screenCase(c);
    } catch (e) {
      if (!(e instanceof ValidationError)) throw new Error(`case ${k}: ${(e as Error).stack}\n${JSON.stringify(c)}`);
      expect(e.field, `case ${k}`).toMatch(/^(site|aquifer|contaminant|source|evaluation)\./);
      refused++;
      continue;
    }
    screened++;
    for (const { result: r } of s.results) {
      for (const v of [r.atHorizon, r.peak.c, r.peak.t, r.steady]) {
        expect(Number.isFinite(v), `case ${k}: ${JSON.stringify(r)}`).toBe(true);
        expect(v).toBeGreaterThanOrEqual(0);
      }
      if (r.arrival !== null) expect(r.arrival >= 0 && r.arrival <= s.prepared.horizon, `case ${k}`).toBe(true);
    }
    for (const L of [s.plumeLength.atViewTime, s.plumeLength.steady]) if (L !== null) expect(Number.isFinite(L) && L >= 0, `case ${k}`).toBe(true);
  }
  // both paths are exercised
  expect(screened).toBeGreaterThan(50);
  expect(refused).toBeGreaterThan(20);
});
