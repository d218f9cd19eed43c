/**
 * patchSourceExact / patchSourceExactGrid (src/core/index.ts) against outside references.
 *
 * References
 *  1. Ogata–Banks in decimal.js (test/core/reference/ogata-banks-decimal.ts): for a source much
 *     wider and thicker than the spreading, the patch solution is the 1D solution on the axis.
 *  2. An independent tanh-sinh quadrature of the Wexler (1992, USGS TWRI 3-B7) patch-source integral
 *     (test/core/reference/patch-quadrature.ts), itself checked here against reference 1 to 1e-9.
 *  3. Monte Carlo on the integral's factorised structure: the x-part is the first-passage density
 *     of 1D advection–dispersion to distance x, an inverse-Gaussian law IG(μ = x/v, shape x²/2D)
 *     (Chhikara & Folks 1989, The Inverse Gaussian Distribution — recalled); the y and z factors
 *     are Gaussian spreading at that passage time. (a) passage times drawn from IG by the
 *     Michael–Schucany–Haas (1976, The American Statistician 30(2)) transformation; (b) passage
 *     times from a time-stepped random walk with the exact Brownian-bridge crossing probability
 *     exp(−2(x − X₀)(x − X₁)/(2DΔ)) between steps (e.g. Glasserman 2004, Monte Carlo Methods in
 *     Financial Engineering, §6.4 — recalled).
 *
 * Tolerances
 *  - engine: its stated accuracy (patchSource.ts header) 1e-6 × C + 1e-13, plus the reference's 1e-9 × C;
 *  - Monte Carlo: 4 standard errors of the sample mean (seeds written beside each run), plus the
 *    engine's 1e-6; for the random walk also the time-step bias bound Δ·(sup|g′| + f(t)·sup g),
 *    computed in the test from the integrand;
 *  - grid vs points: the stated accuracy relative to the column maximum, 1e-6 × max + 1e-13.
 */
import { describe, expect, it } from 'vitest';
import { ogataBanks, patchSourceExact, patchSourceExactGrid } from '../../../src/core/index';
import { MismatchLog, Prng, expectWithin } from '../helpers/check';
import { ogataBanksReference } from '../reference/ogata-banks-decimal';
import { type PatchCase, passageDensity, patchReference, retarded, spreadAt } from '../reference/patch-quadrature';

const ENGINE_REL = 1e-6;
const ENGINE_ABS = 1e-13;
const REF_REL = 1e-9;

const base: PatchCase = { x: 50, y: 0, z: 0, t: 1000, v: 0.1, ax: 5, ay: 0.5, az: 0.05, width: 20, thickness: 3 };

function engineTol(ref: number): number {
  return (ENGINE_REL + REF_REL) * Math.abs(ref) + ENGINE_ABS;
}

describe('edge cases first', () => {
  it('t = 0: nothing has left the source plane (C/C0 = 0 at x > 0)', () => {
    expect(patchSourceExact({ ...base, t: 0 })).toBe(0);
  });
  it('x = 0: the boundary condition, 1 inside the patch and 0 outside it', () => {
    expect(patchSourceExact({ ...base, x: 0, y: 3, z: 1 })).toBeCloseTo(1, 12);
    expect(patchSourceExact({ ...base, x: 0, y: 30, z: 1 })).toBeCloseTo(0, 12);
    expect(patchSourceExact({ ...base, x: 0, y: 0, z: 10 })).toBeCloseTo(0, 12);
  });
  it('symmetric in y (the source is centred on y = 0): C(y) = C(−y) to 1e-15 absolute', () => {
    for (const y of [1, 9, 10, 11, 35]) {
      expectWithin('y symmetry', { y }, patchSourceExact({ ...base, y }), patchSourceExact({ ...base, y: -y }), 1e-15);
    }
  });
});

describe('reduces to Ogata–Banks for a very wide and thick source', () => {
  it('the reference quadrature itself reproduces the decimal.js Ogata–Banks solution to 1e-9 (self-check of reference 2)', () => {
    const log = new MismatchLog();
    for (const [x, t, decay, R] of [
      [10, 50, 0, 1],
      [50, 1000, 1e-3, 1],
      [200, 3000, 0, 2],
      [200, 1500, 2e-4, 1],
      [5, 20, 0.05, 1],
    ]) {
      const p = { ...base, x, t, decay, R, width: 1e7, thickness: 1e7 };
      const ob = ogataBanksReference({ x, t, v: base.v, D: base.ax * base.v, R, decay });
      log.check('quadrature vs decimal Ogata–Banks', p, patchReference(p), ob.value, REF_REL * ob.value + 1e-300);
    }
    log.assertNone();
  });

  it('patchSourceExact with W = H = 1e7 m equals ogataBanks on the axis (stated tolerance 1e-6 × C + 1e-13)', () => {
    const log = new MismatchLog();
    for (const x of [1, 10, 50, 200, 800]) {
      for (const t of [30, 300, 3000, 3e4]) {
        for (const decay of [0, 5e-4]) {
          const p = { ...base, x, t, decay, width: 1e7, thickness: 1e7 };
          const expected = ogataBanks({ x, t, v: base.v, D: base.ax * base.v, decay });
          log.check('wide source vs ogataBanks', p, patchSourceExact(p), expected, ENGINE_REL * expected + ENGINE_ABS);
        }
      }
    }
    log.assertNone();
  });
});

describe('against the independent tanh-sinh quadrature of the Wexler integral', () => {
  it('designed screening cases: near and far, on and off the axis, at and below the water table, early and late', () => {
    const log = new MismatchLog();
    for (const x of [2, 10, 50, 200]) {
      for (const y of [0, 5, 10, 15, 40]) {
        for (const z of [0, 1, 3, 6]) {
          for (const t of [100, 1000, 1e4]) {
            for (const [decay, R] of [
              [0, 1],
              [1e-3, 2.5],
            ]) {
              const p = { ...base, x, y, z, t, decay, R };
              const ref = patchReference(p);
              log.check('vs quadrature', p, patchSourceExact(p), ref, engineTol(ref));
            }
          }
        }
      }
    }
    log.assertNone();
  });

  it('high Peclet number (αx = 0.05 m at x = 500 m, Pe = 1e4) and low (αx = 50 m at x = 5 m, Pe = 0.1)', () => {
    const log = new MismatchLog();
    for (const p of [
      { ...base, x: 500, ax: 0.05, ay: 0.005, az: 0.0005, t: 5000 },
      { ...base, x: 500, ax: 0.05, ay: 0.005, az: 0.0005, t: 5100, y: 10.2 },
      { ...base, x: 500, ax: 0.05, ay: 0.005, az: 0.0005, t: 4990, z: 2.9 },
      { ...base, x: 5, ax: 50, ay: 5, az: 0.5, t: 100 },
      { ...base, x: 5, ax: 50, ay: 5, az: 0.5, t: 100, y: 30, z: 8 },
    ]) {
      const ref = patchReference(p);
      log.check('extreme Peclet', p, patchSourceExact(p), ref, engineTol(ref));
    }
    log.assertNone();
  });

  it('steady state (t = Infinity) against the quadrature to a time T where the remaining passage mass is below e^-50', () => {
    const log = new MismatchLog();
    for (const p of [
      { ...base, x: 30, y: 6, z: 1, t: Infinity },
      { ...base, x: 120, y: 14, z: 0, t: Infinity, decay: 1e-3 },
      { ...base, x: 8, y: 0, z: 5, t: Infinity, R: 4 },
    ]) {
      const r = retarded(p);
      const mu = p.x / r.v;
      const pe = (p.x * r.v) / r.Dx;
      // tail of the passage density beyond T ~ exp(−Pe·(T/μ)/4) ≤ e^-50
      const T = mu * Math.max(200, 200 / pe);
      const ref = patchReference({ ...p, t: T });
      log.check('steady state', p, patchSourceExact(p), ref, engineTol(ref));
    }
    log.assertNone();
  });

  it('150 seeded random cases (seed 1992)', () => {
    const rng = new Prng(1992);
    const log = new MismatchLog();
    for (let i = 0; i < 150; i++) {
      const x = rng.logBetween(0.5, 2000);
      const ax = x * rng.logBetween(0.003, 1);
      const p: PatchCase = {
        x,
        y: rng.uniform() < 0.3 ? 0 : rng.between(-1, 1) * rng.logBetween(1, 300),
        z: rng.uniform() < 0.3 ? 0 : rng.logBetween(0.01, 30),
        v: rng.logBetween(1e-3, 3),
        ax,
        ay: ax * rng.logBetween(0.03, 0.5),
        az: ax * rng.logBetween(0.003, 0.1),
        width: rng.logBetween(1, 200),
        thickness: rng.logBetween(0.5, 20),
        R: rng.uniform() < 0.5 ? 1 : rng.logBetween(1, 50),
        decay: rng.uniform() < 0.4 ? 0 : rng.logBetween(1e-6, 1e-2),
        t: 0,
      };
      const arrival = (x * (p.R ?? 1)) / p.v;
      p.t = arrival * rng.logBetween(0.1, 30);
      const ref = patchReference(p);
      log.check(`random #${i}`, p, patchSourceExact(p), ref, engineTol(ref));
    }
    log.assertNone();
  });
});

/** Michael, Schucany & Haas (1976) draw from IG(mu, shape), written to avoid cancellation. */
function inverseGaussian(rng: Prng, mu: number, shape: number): number {
  const n = rng.normal();
  const w = (mu * n * n) / (2 * shape);
  const root = 1 / (1 + w + Math.sqrt(w * w + 2 * w)); // = 1 + w − √(w² + 2w)
  const candidate = mu * root;
  return rng.uniform() <= mu / (mu + candidate) ? candidate : (mu * mu) / candidate;
}

function meanAndError(scores: Float64Array): { mean: number; se: number } {
  // Neumaier-compensated sums (many small terms)
  let s = 0;
  let c = 0;
  for (const v of scores) {
    const t = s + v;
    c += Math.abs(s) >= Math.abs(v) ? s - t + v : v - t + s;
    s = t;
  }
  const mean = (s + c) / scores.length;
  let ss = 0;
  for (const v of scores) ss += (v - mean) ** 2;
  return { mean, se: Math.sqrt(ss / (scores.length - 1) / scores.length) };
}

describe('Monte Carlo on the factorised structure', () => {
  const cases: PatchCase[] = [
    { ...base, x: 20, y: 0, z: 0, t: 400 },
    { ...base, x: 20, y: 12, z: 0, t: 250 },
    { ...base, x: 60, y: 4, z: 2, t: 800, decay: 1e-3 },
    { ...base, x: 100, y: 0, z: 4, t: 3000, R: 2 },
  ];

  it('passage times drawn from the inverse-Gaussian law, 200 000 per case (seed 411), 4 standard errors', () => {
    const rng = new Prng(411);
    const log = new MismatchLog();
    const N = 200_000;
    for (const p of cases) {
      const r = retarded(p);
      const mu = p.x / r.v;
      const shape = (p.x * p.x) / (2 * r.Dx);
      const scores = new Float64Array(N);
      for (let k = 0; k < N; k++) {
        const tau = inverseGaussian(rng, mu, shape);
        scores[k] = tau <= p.t ? Math.exp(-r.lam * tau) * spreadAt(tau, p, r) : 0;
      }
      const { mean, se } = meanAndError(scores);
      expect(se).toBeGreaterThan(0);
      log.check('IG Monte Carlo', p, patchSourceExact(p), mean, 4 * se + ENGINE_REL * mean);
    }
    log.assertNone();
  });

  it('passage times from a random walk with Brownian-bridge crossing, 20 000 particles (seed 1976), 4 SE + step bias', () => {
    const rng = new Prng(1976);
    const p = cases[1];
    const r = retarded(p);
    const N = 20_000;
    const dt = 0.25; // d; μ = x/v = 200 d
    const steps = Math.ceil(p.t / dt);
    const sd = Math.sqrt(2 * r.Dx * dt);
    const scores = new Float64Array(N);
    for (let k = 0; k < N; k++) {
      let pos = 0;
      for (let s = 1; s <= steps; s++) {
        const next = pos + r.v * dt + sd * rng.normal();
        const crossed = next >= p.x || rng.uniform() < Math.exp((-2 * (p.x - pos) * (p.x - next)) / (sd * sd));
        if (crossed) {
          const tau = Math.min(s * dt, p.t);
          scores[k] = Math.exp(-r.lam * tau) * spreadAt(tau, p, r);
          break;
        }
        pos = next;
      }
    }
    const { mean, se } = meanAndError(scores);
    // Bias of reporting the crossing at the end of its step: E[g(τ_end) − g(τ)] with τ_end − τ ≤ Δ,
    // bounded by Δ·sup|g′| plus the mass within Δ of t times sup g, g(τ) = e^{−λτ}·Y·Z.
    const g = (tau: number) => Math.exp(-r.lam * tau) * spreadAt(tau, p, r);
    let supSlope = 0;
    let supG = 0;
    for (let tau = dt; tau <= p.t; tau += dt / 4) {
      supSlope = Math.max(supSlope, Math.abs(g(tau + dt / 8) - g(tau - dt / 8)) / (dt / 4));
      supG = Math.max(supG, g(tau));
    }
    const fNearT = Math.max(passageDensity(p.t, p.x, r), passageDensity(p.t - dt, p.x, r));
    const bias = dt * (supSlope + fNearT * supG);
    expectWithin('random-walk Monte Carlo', p, patchSourceExact(p), mean, 4 * se + bias + ENGINE_REL * mean);
  });
});

describe('patchSourceExactGrid', () => {
  it('equals pointwise patchSourceExact within the stated accuracy (1e-6 × column max + 1e-13)', () => {
    const xs = [1, 5, 25, 80, 250];
    const ys = [-40, -12, -10, -3, 0, 3, 10, 12, 40];
    const log = new MismatchLog();
    for (const z of [0, 2.5]) {
      for (const t of [200, 5000]) {
        const grid = patchSourceExactGrid({ ...base, xs, ys, z, t, decay: 2e-4 });
        expect(grid.length).toBe(xs.length * ys.length);
        for (let i = 0; i < xs.length; i++) {
          const col = ys.map((y) => patchSourceExact({ ...base, x: xs[i], y, z, t, decay: 2e-4 }));
          const max = Math.max(...col);
          for (let j = 0; j < ys.length; j++) {
            log.check('grid vs point', { x: xs[i], y: ys[j], z, t }, grid[i * ys.length + j], col[j], 1e-6 * max + 1e-13);
          }
        }
      }
    }
    log.assertNone();
  });
});
