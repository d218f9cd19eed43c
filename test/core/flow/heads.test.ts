/**
 * Heads of the well field (src/core/flow/heads.ts), confined and unconfined (Dupuit–Forchheimer),
 * against sources outside the project, named beside each check:
 * - The Dupuit problem: steady flow between two fully penetrating boundaries a distance D apart with
 *   heads Ho and HD above the base: discharge per unit width K(Ho² − HD²)/(2D) and
 *   h(x) = √((HD² − Ho²)x/D + Ho²) (Dupuit 1863), with the parameters of the worked exercise in
 *   BYU CE 544 "Exercise - Analytical Solutions", Part 1 (byu-ce544.readthedocs.io: K = 0.001 cm/s,
 *   D = 100 m, Ho = 5 m, HD = 1 m); the answer is computed here from their formulas (their key is a
 *   spreadsheet not read here).
 * - Dupuit–Thiem for one well: h₂² − h₁² = (Q/(πK))·ln(r₂/r₁) unconfined, h₂ − h₁ = Q/(2πKB)·ln(r₂/r₁)
 *   confined (Thiem 1906; the textbook forms, recalled, not looked up).
 * - A well a distance d from a stream held at stage H (image well, Ferris et al. 1962, USGS WSP
 *   1536-E): at the well face H² − h_w² = (Q/(πK))·ln(2d/r_w) for r_w ≪ d (the image method applied
 *   to Φ = ½Kh²; derived here).
 * - confinedHeadLattice: Thiem again (confined form) at lattice nodes, held at the clip radius inside it.
 * - An independent computation: Darcy's law −K·h·∂h/∂s = Q·ŝ (discharge per unit width along a
 *   path) integrated numerically by classical Runge–Kutta along a bent path through a field of a
 *   well, uniform flow and a stream, from the stream's stage; it uses the field's discharge, never
 *   its potential (tolerance 1e-7 relative with 4000 steps).
 */
import { describe, expect, it } from 'vitest';
import { confinedHead, confinedHeadLattice, dewatered, prepareFlow, unconfinedHead } from '../../../src/core/index';
import { discharge } from '../../../src/core/flow/field';

describe('Dupuit problem (BYU CE 544 exercise parameters)', () => {
  const K = 0.001 * 864; // 0.001 cm/s in m/d (exact: 1 cm/s = 864 m/d)
  const D = 100;
  const Ho = 5;
  const HD = 1;
  const Q0 = (K * (Ho * Ho - HD * HD)) / (2 * D); // 0.10368 m²/d
  // uniform flow of that discharge per unit width: darcyFlux × thickness = Q0
  const f = prepareFlow({ darcyFlux: Q0 / Ho, porosity: 0.3, thickness: Ho, wells: [] });
  const ref = { x: 0, y: 0, head: Ho };

  it('discharge per unit width K(Ho² − HD²)/(2D) = 0.10368 m²/d (computed from their formula)', () => {
    expect(Q0).toBeCloseTo(0.10368, 12);
  });

  it('the water table h(x) = √((HD² − Ho²)x/D + Ho²) at 0, 25, 50, 75, 100 m (1e-12 relative)', () => {
    for (const x of [0, 25, 50, 75, 100]) {
      const h = unconfinedHead(f, K, ref, x, 7);
      expect(h / Math.sqrt(((HD * HD - Ho * Ho) * x) / D + Ho * Ho)).toBeCloseTo(1, 12);
    }
    expect(unconfinedHead(f, K, ref, D, 0)).toBeCloseTo(HD, 12);
  });

  it('beyond the downstream end the parabola dries out: head 0, flagged, no NaN', () => {
    const x = 110; // h² = 25 − 24·1.1 < 0
    expect(unconfinedHead(f, K, ref, x, 0)).toBe(0);
    expect(dewatered(f, K, ref, x, 0)).toBe(true);
    expect(dewatered(f, K, ref, 50, 0)).toBe(false);
  });
});

describe('one pumping well (Thiem, Dupuit–Thiem) and a well beside a stream (image well)', () => {
  const K = 30;
  const B = 20;
  const Q = 1500;

  it('no regional flow: h₂² − h₁² = (Q/πK)·ln(r₂/r₁) unconfined, h₂ − h₁ = Q/(2πKB)·ln(r₂/r₁) confined (1e-12)', () => {
    const f = prepareFlow({ darcyFlux: 0, porosity: 0.25, thickness: B, wells: [{ x: 0, y: 0, rate: Q }] });
    const ref = { x: 500, y: 0, head: B };
    for (const r of [0.5, 3, 40, 200]) {
      const h = unconfinedHead(f, K, ref, 0, r);
      expect((B * B - h * h) / ((Q / (Math.PI * K)) * Math.log(500 / r))).toBeCloseTo(1, 12);
      const hc = confinedHead(f, K, ref, r, 0);
      expect((B - hc) / ((Q / (2 * Math.PI * K * B)) * Math.log(500 / r))).toBeCloseTo(1, 12);
    }
  });

  it('a well d from a stream at stage H: H² − h_w² = (Q/πK)·ln(2d/r_w) at the well face (1e-12 for the exact image distance, 1e-3 for the textbook form)', () => {
    const d = 80;
    const rw = 0.15;
    const f = prepareFlow({
      darcyFlux: 0,
      porosity: 0.25,
      thickness: B,
      wells: [{ x: 0, y: 0, rate: Q, radius: rw }],
      boundaries: [{ kind: 'constant-head', x1: d, y1: 0, x2: d, y2: 1 }],
    });
    const ref = { x: d, y: 0, head: B };
    const hw = unconfinedHead(f, K, ref, -rw, 0);
    // the face point on the far side from the stream lies 2d + r_w from the image: ln((2d + r_w)/r_w) exactly,
    // of which the textbook ln(2d/r_w) is the limit for r_w ≪ d
    expect((B * B - hw * hw) / ((Q / (Math.PI * K)) * Math.log((2 * d + rw) / rw))).toBeCloseTo(1, 12);
    expect((B * B - hw * hw) / ((Q / (Math.PI * K)) * Math.log((2 * d) / rw))).toBeCloseTo(1, 3);
    // the stream line is at its stage everywhere along it
    for (const y of [-300, -20, 0, 45, 1000]) expect(unconfinedHead(f, K, ref, d, y)).toBeCloseTo(B, 10);
  });

  it('a rate the aquifer cannot deliver: the well face dewatered, head 0 there, no NaN', () => {
    const f = prepareFlow({ darcyFlux: 0, porosity: 0.25, thickness: 2, wells: [{ x: 0, y: 0, rate: 1e5 }] });
    const ref = { x: 500, y: 0, head: 2 };
    expect(unconfinedHead(f, 1, ref, 0, 0)).toBe(0);
    expect(dewatered(f, 1, ref, 0, 0)).toBe(true);
  });

  it('refuses a conductivity ≤ 0 and a reference head that is not finite, naming the field', () => {
    const f = prepareFlow({ darcyFlux: 0.1, porosity: 0.25, thickness: B, wells: [] });
    expect(() => unconfinedHead(f, 0, { x: 0, y: 0, head: B }, 1, 1)).toThrow(/conductivity/);
    expect(() => confinedHead(f, 10, { x: 0, y: 0, head: NaN }, 1, 1)).toThrow(/reference\.head/);
  });
});

describe("independent computation: Darcy's law integrated along a path (Runge–Kutta 4)", () => {
  it('well + uniform flow + stream: h from the integral of −Q·ŝ/(K·h) equals the Dupuit form (1e-7)', () => {
    const K = 25;
    const B = 12;
    const f = prepareFlow({
      darcyFlux: 0.05,
      porosity: 0.25,
      thickness: B,
      wells: [{ x: 0, y: 0, rate: 400 }],
      boundaries: [{ kind: 'constant-head', x1: 150, y1: 0, x2: 150, y2: 1 }],
    });
    const ref = { x: 150, y: -60, head: B };
    // path: from the stream point to (−40, 30) via (60, 90), straight legs
    const legs = [
      [150, -60, 60, 90],
      [60, 90, -40, 30],
    ];
    let h = B;
    const o = { x: 0, y: 0 };
    const dhds = (x: number, y: number, ux: number, uy: number, hh: number) => {
      discharge(f, x, y, o);
      return -(o.x * ux + o.y * uy) / (K * hh);
    };
    for (const [x0, y0, x1, y1] of legs) {
      const L = Math.hypot(x1 - x0, y1 - y0);
      const ux = (x1 - x0) / L;
      const uy = (y1 - y0) / L;
      const n = 4000;
      const ds = L / n;
      for (let i = 0; i < n; i++) {
        const x = x0 + i * ds * ux;
        const y = y0 + i * ds * uy;
        const k1 = dhds(x, y, ux, uy, h);
        const k2 = dhds(x + 0.5 * ds * ux, y + 0.5 * ds * uy, ux, uy, h + 0.5 * ds * k1);
        const k3 = dhds(x + 0.5 * ds * ux, y + 0.5 * ds * uy, ux, uy, h + 0.5 * ds * k2);
        const k4 = dhds(x + ds * ux, y + ds * uy, ux, uy, h + ds * k3);
        h += (ds / 6) * (k1 + 2 * k2 + 2 * k3 + k4);
      }
    }
    expect(unconfinedHead(f, K, ref, -40, 30) / h).toBeCloseTo(1, 7);
  });
});

describe('confinedHeadLattice: the confined head on a map lattice, clipped at a stated radius around each well', () => {
  const K = 30;
  const B = 20;
  const Q = 1500;
  const a = Q / (2 * Math.PI * K * B);
  const f = prepareFlow({ darcyFlux: 0, porosity: 0.25, thickness: B, wells: [{ x: 0, y: 0, rate: Q }] });
  const ref = { x: 100, y: 0, head: 0 };

  it('outside the clip radius: Thiem, h = (Q/2πKB)·ln(r/r_ref) (1e-12); inside: held at the clip radius; node order values[i·ny + j]', () => {
    const xs = [-60, -3, 0, 2, 45];
    const ys = [-30, 0, 1, 80];
    const clip = 5;
    const v = confinedHeadLattice(f, K, ref, xs, ys, clip);
    expect(v.length).toBe(xs.length * ys.length);
    xs.forEach((x, i) =>
      ys.forEach((y, j) => {
        const r = Math.max(Math.hypot(x, y), clip);
        const want = a * Math.log(r / 100);
        expect(Number.isFinite(v[i * ys.length + j])).toBe(true);
        expect(Math.abs(v[i * ys.length + j] - want)).toBeLessThanOrEqual(1e-12 * Math.max(1, Math.abs(want)));
      }),
    );
    // the pointwise confinedHead agrees where no clipping applies
    expect(v[4 * ys.length + 3]).toBeCloseTo(confinedHead(f, K, ref, 45, 80), 12);
  });

  it('refuses a negative or non-finite clip radius and non-finite coordinates, naming the field', () => {
    expect(() => confinedHeadLattice(f, K, ref, [0, 1], [0, 1], -1)).toThrow(/clipRadius/);
    expect(() => confinedHeadLattice(f, K, ref, [0, Number.NaN], [0, 1], 1)).toThrow(/xs\[1\]/);
    expect(() => confinedHeadLattice(f, K, ref, [0, 1], [Infinity], 1)).toThrow(/ys\[0\]/);
  });
});
