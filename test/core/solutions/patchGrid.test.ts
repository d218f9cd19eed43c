/**
 * The exact solution on grids with quadrature nodes shared by all columns (src/core/solutions/
 * patchGrid.ts), against outside references.
 *
 * References
 *  1. The independent tanh-sinh quadrature of the Wexler (1992, USGS TWRI 3-B7) patch-source
 *     integral in test/core/reference/patch-quadrature.ts (its own variable τ, @stdlib's erfc,
 *     checked against the decimal.js Ogata–Banks solution in patchSource.test.ts), cell by cell.
 *  2. Where that reference has no counterpart (a declining source, a well screen), the engine's
 *     per-column adaptive Gauss–Kronrod method (patchSource.ts), a different variable and rule,
 *     itself checked against references 1 and the Monte Carlo walks in patchSource.test.ts. This is a
 *     cross-check of two methods, said as such.
 *
 * Tolerances
 *  - the grid's stated accuracy (patchGrid.ts header) 1e-6 × column maximum + 1e-13, plus the
 *    reference's own 1e-9 × C (reference 1) or the per-column method's stated accuracy (reference 2);
 *  - steady state against reference 1 at a horizon where the neglected late tail is below e^{−50}
 *    of the value (decay 1e-3 per day over 5e4 days, or 200 travel times without decay).
 */
import { describe, expect, it } from 'vitest';
import { exactGridShared, type SharedGridReport } from '../../../src/core/solutions/patchGrid';
import { exactColumn, type PatchParams } from '../../../src/core/solutions/patchSource';
import { MismatchLog } from '../helpers/check';
import { type PatchCase, patchReference } from '../reference/patch-quadrature';

type Case = Omit<PatchCase, 'x' | 'y' | 'z' | 't'>;

function params(c: Case, gamma = 0): PatchParams {
  const R = c.R ?? 1;
  const v = c.v / R;
  return { v, Dx: c.ax * v, Dy: c.ay * v, Dz: c.az * v, lam: c.decay ?? 0, gamma, width: c.width, thickness: c.thickness };
}

function grid(c: Case, xs: number[], ys: number[], z: number | [number, number], t: number, gamma = 0) {
  const depth = typeof z === 'number' ? { zTop: z, zBottom: z } : { zTop: z[0], zBottom: z[1] };
  const out = new Float64Array(xs.length * ys.length);
  const report: SharedGridReport = { errorEstimate: 0, fallbackColumns: 0 };
  const shared = exactGridShared(xs, ys, depth, t, params(c, gamma), 0, out, ys.length, 0, {}, report);
  return { out, report, shared, depth };
}

function checkAgainstReference(log: MismatchLog, c: Case, xs: number[], ys: number[], z: number, t: number, tRef = t) {
  const g = grid(c, xs, ys, z, t);
  expect(g.shared).toBe(true);
  for (let i = 0; i < xs.length; i++) {
    const ref = ys.map((y) => patchReference({ ...c, x: xs[i], y, z, t: tRef }));
    const max = Math.max(...ref);
    for (let j = 0; j < ys.length; j++) {
      log.check('shared grid vs tanh-sinh reference', { ...c, x: xs[i], y: ys[j], z, t }, g.out[i * ys.length + j], ref[j], 1e-6 * max + 1e-9 * ref[j] + 1e-13);
    }
  }
  return g.report;
}

// invented scenarios: a sandy aquifer (the benchmark's), a nearly plug-flow one, a strongly dispersive one
const sandy: Case = { v: 0.24, ax: 10, ay: 1, az: 0.1, width: 30, thickness: 4, R: 1.8, decay: Math.LN2 / 730 };
const plug: Case = { v: 0.5, ax: 0.05, ay: 0.005, az: 0.0005, width: 8, thickness: 2, R: 1, decay: 0 };
const dispersive: Case = { v: 0.05, ax: 50, ay: 10, az: 2, width: 12, thickness: 6, R: 3, decay: 1e-4 };
const ysWide = [-150, -60, -15.5, -15, -14.5, -3, 0, 2, 15, 40, 150];

describe('edge cases first', () => {
  it('a horizon before any arrival worth 1e-14 gives zeros, finite, with no column handed on', () => {
    const g = grid(sandy, [400, 800], [0, 10], 1, 1);
    expect([...g.out]).toEqual([0, 0, 0, 0]);
    expect(g.report.fallbackColumns).toBe(0);
  });
  it('columns at x ≤ 0 are left to the caller (not written)', () => {
    const out = new Float64Array(4).fill(-7);
    exactGridShared([-5, 0], [0, 1], { zTop: 1, zBottom: 1 }, 100, params(sandy), 0, out, 2, 0);
    expect([...out]).toEqual([-7, -7, -7, -7]);
  });
  it('declines (returns false, writes nothing) where it does not apply: no dispersion, or steady state with no flow and no decay', () => {
    const out = new Float64Array(2).fill(-7);
    expect(exactGridShared([10], [0, 1], { zTop: 0, zBottom: 0 }, 100, { ...params(sandy), Dx: 0 }, 0, out, 2, 0)).toBe(false);
    expect(exactGridShared([10], [0, 1], { zTop: 0, zBottom: 0 }, Infinity, { ...params(sandy), v: 0, lam: 0 }, 0, out, 2, 0)).toBe(false);
    expect([...out]).toEqual([-7, -7]);
  });
});

describe('against the independent tanh-sinh reference, cell by cell (1e-6 × column max + 1e-13)', () => {
  it('sandy aquifer: early, passing and late fronts; at and below the water table; from 5 cm to 800 m', () => {
    const log = new MismatchLog();
    let fallback = 0;
    for (const t of [30, 400, 3652.5, 20000]) {
      for (const z of [0, 1, 6]) {
        fallback += checkAgainstReference(log, sandy, [0.05, 1, 12.5, 100, 400, 800], ysWide, z, t).fallbackColumns;
      }
    }
    log.assertNone();
    expect(fallback, 'columns handed to the per-column method').toBe(0);
  });
  it('nearly plug flow (αx = 5 cm over 500 m: the first-passage peak is 1.4 % of the travel time wide)', () => {
    const log = new MismatchLog();
    let fallback = 0;
    for (const t of [300, 1000, 1010, 5000]) {
      fallback += checkAgainstReference(log, plug, [0.5, 20, 250, 500], [-10, -4, -3.9, 0, 4.1, 30], 0.5, t).fallbackColumns;
    }
    log.assertNone();
    expect(fallback).toBe(0);
  });
  it('strongly dispersive (αx = 50 m, points well inside one dispersivity of the source)', () => {
    const log = new MismatchLog();
    for (const t of [10, 500, 50000]) checkAgainstReference(log, dispersive, [0.2, 5, 20, 60], [-80, -6, 0, 6.5, 25], 2, t);
    log.assertNone();
  });
  it('steady state equals the reference at a horizon where the late tail is below e^−50', () => {
    const log = new MismatchLog();
    // decay 1e-3/d for 5e4 d: e^{−50} of the late tail left; no decay: 200 travel times to 800 m
    checkAgainstReference(log, { ...sandy, decay: 1e-3 }, [1, 50, 300, 800], ysWide, 1, Infinity, 5e4);
    checkAgainstReference(log, { ...plug, v: 2 }, [1, 50, 300], [-10, 0, 4, 30], 0, Infinity, (200 * 300) / 2);
    log.assertNone();
  });
  it('its own error estimate stays within the stated accuracy of the largest value', () => {
    const g = grid(sandy, [12.5, 100, 400], ysWide, 1, 3652.5);
    const max = Math.max(...g.out);
    expect(g.report.errorEstimate).toBeLessThanOrEqual(1e-6 * max + 1e-13);
  });
});

describe('declining source and well screens: against the per-column Gauss–Kronrod method (a cross-check of two methods)', () => {
  it('γ = 1/(5 years) and a 3 m screen, at four horizons', () => {
    const log = new MismatchLog();
    const xs = [0.5, 25, 150, 600];
    const ys = [-40, -15, 0, 8, 15, 70];
    for (const t of [200, 1500, 3652.5, 9000]) {
      for (const z of [1, [0.5, 3.5]] as (number | [number, number])[]) {
        const gamma = 1 / 1826;
        const g = grid(sandy, xs, ys, z, t, gamma);
        expect(g.report.fallbackColumns).toBe(0);
        const col = new Float64Array(ys.length);
        for (let i = 0; i < xs.length; i++) {
          exactColumn(xs[i], ys, g.depth, t, params(sandy, gamma), 0, col, 0, 1);
          const max = Math.max(...col);
          for (let j = 0; j < ys.length; j++) {
            log.check('shared grid vs per-column method', { x: xs[i], y: ys[j], z, t }, g.out[i * ys.length + j], col[j], 2e-6 * max + 2e-13);
          }
        }
      }
    }
    log.assertNone();
  });
});
