/**
 * Lines of equal head of the well field on the map (src/case/headContours.ts), against closed forms
 * written out here by hand, independent of the flow code:
 * - Thiem (1906) for one well with no regional flow: the confined head rises as
 *   h(r) = (Q/2πKB)·ln(r/r₀) from the reference distance r₀, so the line of level L is the circle
 *   r = r₀·exp(2πKB·L/Q) about the well (the textbook steady form, recalled, not looked up);
 * - one well in uniform flow (Javandel & Tsang 1986's setting): along the flow axis through the
 *   well the head is h(x) = −i·x + (Q/2πKB)·ln(|x − x_w|/x_w) relative to the release at x = 0;
 *   each line crosses the axis where that equals its level (roots found here by bisection);
 * - the riverside demo: Thiem with an image well across the river (Ferris et al. 1962, USGS WSP
 *   1536-E) plus the regional gradient (the same formula the water-level table's test uses).
 * Tolerance of a line vertex: marching squares interpolates linearly along a lattice edge of length
 * h, so the field at a vertex differs from the level by at most h²/8·max|∂²h/∂s²| along the edge;
 * for a ln r cone that is (h²/8)·(Q/2πKB)/r² at the nearest approach r of the edge to the well (no
 * line is drawn within one cell diagonal of the held circle, so r ≥ the held radius), plus the
 * image's term. A chord between two vertices crosses a cell: (2h²/8)·… there. The bound is computed
 * in each test beside the check.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { parseCaseFile } from '../../src/case/io';
import { screenCase } from '../../src/case/screen';
import { mapHeadContours, levelLabel, CLIP_CELLS } from '../../src/case/headContours';
import { prepareFlow, confinedHeadLattice } from '../../src/core';
import type { PreparedCase } from '../../src/case/prepare';
import type { CaseWells } from '../../src/case/wells';
import type { Case } from '../../src/case/schema';

function demo(): Case {
  const r = parseCaseFile(readFileSync('cases/riverside-supply-well.json', 'utf8'));
  if (!r.ok) throw new Error(r.errors.join('; '));
  return r.case;
}

/** The two things mapHeadContours reads from a prepared case: K and the map of the flow frame (identity here). */
function fieldCase(K: number, flow: Parameters<typeof prepareFlow>[0]): { p: PreparedCase; w: CaseWells } {
  const p = { derived: { K }, toMap: (x: number, y: number) => [x, y] } as unknown as PreparedCase;
  const w = { field: prepareFlow(flow), thickness: flow.thickness, receptorOf: [0], boundaries: [], warnings: [] } as unknown as CaseWells;
  return { p, w };
}

const NICE = (v: number) => {
  const m = v / 10 ** Math.floor(Math.log10(v) + 1e-12);
  return [1, 2, 5, 10].some((k) => Math.abs(m - k) < 1e-9);
};

describe('head contours of one well with no regional flow: Thiem’s circles', () => {
  const K = 40, B = 15, Q = 800, d = 200;
  const { p, w } = fieldCase(K, { darcyFlux: 0, porosity: 0.25, thickness: B, wells: [{ x: d, y: 0, rate: Q }] });
  const hc = mapHeadContours(p, w, 'SI')!;
  const a = Q / (2 * Math.PI * K * B);

  it('lines at round levels (1, 2, 5 × 10ⁿ m), one circle per level about the well of radius r₀·exp(L/a)', () => {
    expect(hc.form).toBe('confined');
    expect(NICE(hc.step)).toBe(true);
    expect(hc.levels.length).toBeGreaterThanOrEqual(4);
    const cell = (2 * hc.halfSide) / (hc.gridSize - 1);
    expect(hc.heldWithin).toBeCloseTo(CLIP_CELLS * cell, 9);
    expect(hc.clipRadius).toBeCloseTo(hc.heldWithin + Math.SQRT2 * cell, 9);
    // bound on the head error at a vertex (header): h²/8 · a/r², r ≥ the held radius
    const headTol = ((cell * cell) / 8) * (a / hc.heldWithin ** 2);
    let worst = 0;
    for (const lv of hc.levels) {
      expect(Math.abs(lv.head / hc.step - Math.round(lv.head / hc.step))).toBeLessThan(1e-9);
      const radius = d * Math.exp(lv.head / a); // Thiem: the line of level L
      for (const line of lv.lines)
        for (const [x, y] of line) {
          const r = Math.hypot(x - d, y);
          if (r > radius * 1.5) continue; // none should be
          worst = Math.max(worst, Math.abs(a * Math.log(r / d) - lv.head));
          expect(Math.abs(a * Math.log(r / d) - lv.head)).toBeLessThanOrEqual(headTol);
          expect(r).toBeGreaterThanOrEqual(hc.clipRadius - 1e-9);
        }
      // wholly inside the lattice: the circle is closed
      const cx = d / 2; // the lattice is centred between the release and the well
      if (d + radius < cx + hc.halfSide - cell && radius < hc.halfSide - cell) {
        expect(lv.lines.length).toBe(1);
        const l = lv.lines[0];
        expect(l[0]).toEqual(l[l.length - 1]);
      }
    }
    console.log(`Thiem circles: ${hc.levels.length} lines every ${hc.step} m, worst head error at a vertex ${worst.toExponential(2)} m (bound ${headTol.toExponential(2)} m)`);
  });

  it('labels in the case’s length unit: feet for a US case, at a round interval in feet', () => {
    const us = mapHeadContours(p, w, 'US')!;
    expect(us.unit).toBe('ft');
    expect(NICE(us.step)).toBe(true);
    for (const lv of us.levels) {
      expect(lv.label).toMatch(/^-?\d+(\.\d+)? ft$/);
      expect(Math.abs(lv.head / 0.3048 - Number(lv.label.replace(' ft', '')))).toBeLessThan(1e-6 + us.step * 1e-9);
    }
  });
});

describe('head contours of one well in uniform flow', () => {
  const K = 40, B = 15, Q = 800, i = 0.003, xw = 300;
  const { p, w } = fieldCase(K, { darcyFlux: K * i, porosity: 0.25, thickness: B, wells: [{ x: xw, y: 0, rate: Q }] });
  const hc = mapHeadContours(p, w, 'SI')!;
  const a = Q / (2 * Math.PI * K * B);
  const h = (x: number) => -i * x + a * Math.log(Math.abs(x - xw) / xw);

  /** roots of h(x) = L on (lo, hi) where h − L changes sign, by bisection to 1e-9 m */
  function root(L: number, lo: number, hi: number): number {
    let fa = h(lo) - L;
    for (let k = 0; k < 200 && hi - lo > 1e-9; k++) {
      const m = (lo + hi) / 2;
      const fm = h(m) - L;
      if (fa * fm <= 0) hi = m;
      else (lo = m), (fa = fm);
    }
    return (lo + hi) / 2;
  }

  it('each line crosses the flow axis where −i·x + (Q/2πKB)·ln(|x − x_w|/x_w) equals its level (within the interpolation bound of a chord)', () => {
    const cell = (2 * hc.halfSide) / (hc.gridSize - 1);
    let checked = 0;
    let worstPos = 0;
    for (const lv of hc.levels)
      for (const line of lv.lines)
        for (let k = 0; k + 1 < line.length; k++) {
          const [x1, y1] = line[k], [x2, y2] = line[k + 1];
          if (y1 === y2 || Math.sign(y1) === Math.sign(y2)) continue;
          const x = x1 + ((x2 - x1) * (0 - y1)) / (y2 - y1); // where the line crosses y = 0
          // the closed form's crossing in the same stretch of the axis (upgradient of the well, or beyond it)
          const lo = x < xw ? -hc.halfSide * 2 : xw + hc.clipRadius / 2;
          const hi = x < xw ? xw - hc.clipRadius / 2 : hc.halfSide * 3;
          const cands = [] as number[];
          // h is monotone on each side except beyond the stagnation point a/i downgradient: split there
          const xs = x < xw ? [lo, hi] : [lo, xw + a / i, hi];
          for (let s = 0; s + 1 < xs.length; s++) if ((h(xs[s]) - lv.head) * (h(xs[s + 1]) - lv.head) <= 0) cands.push(root(lv.head, xs[s], xs[s + 1]));
          const best = Math.min(...cands.map((c) => Math.abs(c - x)));
          // a chord across a cell (length ≤ h√2) at distance ≥ r − h√2 from the well: (2h²/8)·a/r²
          const r = Math.max(Math.abs(x - xw) - Math.SQRT2 * cell, hc.heldWithin);
          const tol = ((2 * cell * cell) / 8) * (a / (r * r));
          expect(Math.abs(h(x) - lv.head)).toBeLessThanOrEqual(tol);
          worstPos = Math.max(worstPos, best / cell);
          checked++;
        }
    expect(checked).toBeGreaterThanOrEqual(4);
    console.log(`uniform flow: ${checked} axis crossings, farthest ${worstPos.toFixed(3)} lattice spacings from the closed form's root`);
  });

  it('the line through the release is the 0 line, labelled 0 m', () => {
    const zero = hc.levels.find((l) => l.head === 0);
    expect(zero?.label).toBe('0 m');
  });
});

describe('head contours of the riverside demo (well beside a river)', () => {
  const c = demo();
  const s = screenCase(c);
  const hc = mapHeadContours(s.prepared, s.wells, 'SI')!;
  // flow frame = the demo's east/north (flow to azimuth 90°); the river line at x = 470 m
  const K = 40, B = 15, i = 0.003, Q = 800;
  const well = { x: 350, y: 30 };
  const image = { x: 2 * 470 - well.x, y: well.y };
  const a = Q / (2 * Math.PI * K * B);
  const dh = (x: number, y: number) =>
    -i * x + a * (Math.log(Math.hypot(x - well.x, y - well.y) / Math.hypot(well.x, well.y)) - Math.log(Math.hypot(x - image.x, y - image.y) / Math.hypot(image.x, image.y)));

  it('every vertex lies on its level by Thiem with the image well plus the regional gradient (within the interpolation bound); none beyond the river or inside the clip circle', () => {
    const cell = (2 * hc.halfSide) / (hc.gridSize - 1);
    const rImage = 470 - 350; // nearest approach of a drawn point to the image: the river line
    const headTol = ((cell * cell) / 8) * a * (1 / hc.heldWithin ** 2 + 1 / rImage ** 2);
    expect(hc.levels.length).toBeGreaterThanOrEqual(6);
    let worst = 0;
    for (const lv of hc.levels)
      for (const line of lv.lines)
        line.forEach(([x, y], k) => {
          expect(Number.isFinite(x) && Number.isFinite(y)).toBe(true);
          expect(x).toBeLessThanOrEqual(470 + 1e-9);
          expect(Math.hypot(x - well.x, y - well.y)).toBeGreaterThanOrEqual(hc.clipRadius - 1e-9);
          // ends cut by the river or the clip circle lie between lattice edges: checked against the line's geometry above
          if (k === 0 || k === line.length - 1) return;
          const err = Math.abs(dh(x, y) - lv.head);
          worst = Math.max(worst, err);
          expect(err).toBeLessThanOrEqual(headTol);
        });
    console.log(`riverside: ${hc.levels.length} lines every ${hc.step} m, clip ${hc.clipRadius.toFixed(1)} m, worst ${worst.toExponential(2)} m (bound ${headTol.toExponential(2)} m)`);
  });

  it('unconfined (Dupuit–Forchheimer) levels: the water table h − B = √(B² + 2B·Δh) − B (Strack 1989 §8, Δh from the same hand formula) at every vertex, at its own round interval', () => {
    const cell = (2 * hc.halfSide) / (hc.gridSize - 1);
    const rImage = 470 - 350;
    // the confined bound (above) carried through dd/dΔh = B/h ≤ B/h_min, h_min ≥ B − 2 m here
    const headTol = ((cell * cell) / 8) * a * (1 / hc.heldWithin ** 2 + 1 / rImage ** 2) * (B / (B - 2));
    const u = hc.unconfined;
    expect(NICE(u.step)).toBe(true);
    expect(u.dewatered).toBe(false);
    expect(u.levels.length).toBeGreaterThanOrEqual(6);
    for (const lv of u.levels) {
      expect(Math.abs(lv.head / u.step - Math.round(lv.head / u.step))).toBeLessThan(1e-9);
      expect(lv.label).toMatch(/^-?\d+(\.\d)? m$/);
      for (const line of lv.lines)
        line.forEach(([x, y], k) => {
          if (k === 0 || k === line.length - 1) return;
          const d = Math.sqrt(B * B + 2 * B * dh(x, y)) - B;
          expect(Math.abs(d - lv.head)).toBeLessThanOrEqual(headTol);
        });
    }
  });

  it('a well pumping far beyond what the aquifer yields: finite lines in both forms, no unconfined level at or below a dry base (h − B > −B)', () => {
    const c2 = structuredClone(c);
    c2.site.receptors[0].pumpingRate = { value: 40_000, unit: 'm3/d' };
    const s2 = screenCase(c2);
    const h2 = mapHeadContours(s2.prepared, s2.wells, 'SI')!;
    expect(h2.levels.length).toBeGreaterThan(0);
    for (const lv of h2.unconfined.levels) expect(lv.head).toBeGreaterThan(-B);
    for (const lv of [...h2.levels, ...h2.unconfined.levels]) for (const line of lv.lines) for (const p of line) expect(Number.isFinite(p[0]) && Number.isFinite(p[1])).toBe(true);
  });

  it('the lattice holds no NaN or Infinity even with a node on the well (clipped to the clip radius, as its header says)', () => {
    const f = s.wells.field!;
    const xs = [340, 350, 360], ys = [20, 30, 40];
    const v = confinedHeadLattice(f, K, { x: 0, y: 0, head: 0 }, xs, ys, 12);
    for (const x of v) expect(Number.isFinite(x)).toBe(true);
    // at the well's centre the well's own term is held at r = 12 m
    expect(v[1 * 3 + 1]).toBeCloseTo(-i * 350 + a * (Math.log(12 / Math.hypot(350, 30)) - Math.log(240 / Math.hypot(590, 30))), 12);
  });

  it('cost (printed, not asserted: timings are never test conditions here)', () => {
    const ms: number[] = [];
    for (let k = 0; k < 9; k++) {
      const t0 = performance.now();
      mapHeadContours(s.prepared, s.wells, 'SI');
      ms.push(performance.now() - t0);
    }
    ms.sort((x, y) => x - y);
    console.log(`riverside head contours on ${hc.gridSize}²: median ${ms[4].toFixed(1)} ms (lattice, contouring, clipping, mapping), in the receptor worker`);
    expect(ms.length).toBe(9);
  });

  it('no pumping well (the river line alone): no lines, the regional slope being the flow arrow', () => {
    const c2 = structuredClone(c);
    c2.site.receptors[0].pumping = false;
    c2.site.receptors[0].pumpingRate = null;
    const s2 = screenCase(c2);
    expect(s2.wells.field).not.toBeNull();
    expect(mapHeadContours(s2.prepared, s2.wells, 'SI')).toBeNull();
  });

  it('labels: round levels in metres with the decimals of the interval', () => {
    expect(levelLabel(-0.4000000001, 0.2, 'm')).toBe('-0.4 m');
    expect(levelLabel(-1e-17, 0.2, 'm')).toBe('0 m');
    expect(levelLabel(15, 5, 'ft')).toBe('15 ft');
    expect(levelLabel(0.05, 0.05, 'm')).toBe('0.05 m');
    for (const lv of hc.levels) expect(lv.label).toMatch(/^-?\d+(\.\d)? m$/);
  });
});
