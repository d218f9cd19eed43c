/**
 * Random-walk particle tracking (src/core/particles/walk.ts) against references outside it:
 *
 * - Einstein 1905 (Ann. Phys. 17): the variance of the displacement grows as 2·D·t; here per
 *   direction, D_L = (αL·v + De)/R along the flow and D_T = (αT·v + De)/R across, mean v·t/R.
 *   Band: 4 standard errors of a sample variance, 4·√(2/(N − 1)) relative.
 * - The exact rectangular-source solution (Wexler 1992, USGS TWRI 3-B7; the engine's
 *   patchSourceExact) and Ogata–Banks (1961, USGS PP 411-A; the engine's ogataBanks) for a very
 *   wide source. These hold C₀ on the source plane of a half-space; the walk injects the source's
 *   mass flux v·C₀ in the whole plane. The two differ by the dispersive part of the inflow, which
 *   near the front is about √(αL/(πx)) of C₀ (van Genuchten & Parker 1984, SSSAJ 48(4), on the two
 *   boundary conditions). The test therefore checks the particles (a) within 4 standard errors of
 *   the mass-flux form of the same Green's-function integral,
 *       C/C₀ = ∫₀ᵗ v/√(4πDₓs) · exp(−(x − vs)²/(4Dₓs) − λs) · Y(y, s) ds,
 *       Y = ½[erf((y + W/2)/(2√(D_y s))) − erf((y − W/2)/(2√(D_y s)))],
 *   evaluated here by composite Simpson on 40 000 panels with @stdlib's erf, and (b) within
 *   4 standard errors plus that form's difference to the engine's exact solution, so the engine's
 *   solution is met up to the stated boundary-condition difference and the statistics.
 * - Mass balance: released = in the aquifer + captured + left across boundaries + decayed, to
 *   round-off (1e-12 relative), with and without wells.
 * - A well capturing the whole plume at steady state: captured mass flux = source mass flux − λ·M,
 *   M the mass in the aquifer (d M/dt = 0), within 4 standard errors of the captured mass.
 */
import { describe, expect, it } from 'vitest';
import erfStd from '@stdlib/math-base-special-erf';
import { ogataBanks, patchSourceExact, prepareFlow } from '../../../src/core/index';
import {
  emptyTally,
  mergeTally,
  observerConcentrations,
  prepareWalk,
  walkParticles,
  wellConcentrations,
  type WalkInput,
} from '../../../src/core/particles/walk';

const q = 0.1;
const n = 0.25;
const B = 10;
const v = q / n;

function fluxForm(x: number, y: number, t: number, ax: number, ay: number, W: number, lam: number): number {
  const Dx = ax * v;
  const Dy = ay * v;
  const f = (s: number) => {
    if (s <= 0) return 0;
    const Y = W === Infinity ? 1 : 0.5 * (erfStd((y + W / 2) / (2 * Math.sqrt(Dy * s))) - erfStd((y - W / 2) / (2 * Math.sqrt(Dy * s))));
    return (v / Math.sqrt(4 * Math.PI * Dx * s)) * Math.exp(-((x - v * s) ** 2) / (4 * Dx * s) - lam * s) * Y;
  };
  const m = 40000;
  const h = t / m;
  let sum = f(0) + f(t);
  for (let i = 1; i < m; i++) sum += (i % 2 ? 4 : 2) * f(i * h);
  return (sum * h) / 3;
}

function run(input: WalkInput) {
  const p = prepareWalk(input);
  const tally = emptyTally(p);
  walkParticles(p, 0, input.particles, tally);
  return { p, tally };
}

describe('particles in uniform flow', () => {
  const field = prepareFlow({ darcyFlux: q, porosity: n, thickness: B, wells: [] });
  const source = { width: 20, thickness: B, c0: 1, sourceDecay: 0, duration: Infinity };

  it('displacement variance grows as 2·D·t per direction (Einstein 1905), mean v·t/R', () => {
    const N = 20000;
    const R = 2;
    const ax = 2;
    const ay = 0.2;
    const De = 0.01;
    const times = [20, 60, 100];
    const sx = times.map(() => [0, 0]);
    const sy = times.map(() => [0, 0]);
    run({
      field,
      source,
      ax,
      ay,
      diffusion: De,
      R,
      decay: 0,
      decayDissolvedOnly: false,
      times,
      particles: N,
      seed: 7,
      release: () => ({ x: 0, y: 0, t: 0, mass: 1 }),
      onPosition: (_j, k, x, y) => {
        sx[k][0] += x;
        sx[k][1] += x * x;
        sy[k][0] += y;
        sy[k][1] += y * y;
      },
    });
    times.forEach((t, k) => {
      const mx = sx[k][0] / N;
      const vx = (sx[k][1] - N * mx * mx) / (N - 1);
      const my = sy[k][0] / N;
      const vy = (sy[k][1] - N * my * my) / (N - 1);
      const DL = (ax * v + De) / R;
      const DT = (ay * v + De) / R;
      const band = 4 * Math.sqrt(2 / (N - 1));
      expect(Math.abs(vx / (2 * DL * t) - 1)).toBeLessThan(band);
      expect(Math.abs(vy / (2 * DT * t) - 1)).toBeLessThan(band);
      expect(Math.abs(mx - (v * t) / R)).toBeLessThan(4 * Math.sqrt((2 * DL * t) / N));
      expect(Math.abs(my)).toBeLessThan(4 * Math.sqrt((2 * DT * t) / N));
    });
  });

  it('a continuous rectangular source: particles vs the mass-flux integral and the exact solution (Wexler 1992)', () => {
    const ax = 1;
    const ay = 0.1;
    const lam = 0.002;
    const times = [150, 250];
    const points = [
      [60, 0],
      [60, 7],
      [40, 0],
      [90, 3],
    ];
    const { p, tally } = run({
      field,
      source,
      ax,
      ay,
      diffusion: 0,
      R: 1,
      decay: lam,
      decayDissolvedOnly: false,
      times,
      particles: 600_000,
      seed: 11,
      observers: points.map(([x, y]) => ({ x, y, radius: 1.5 })),
    });
    const est = observerConcentrations(p, tally);
    points.forEach(([x, y], o) =>
      times.forEach((t, k) => {
        const c = est[o].c[k];
        const se = est[o].se[k];
        const flux = fluxForm(x, y, t, ax, ay, 20, lam);
        const exact = patchSourceExact({ x, y, z: 5, t, v, ax, ay, az: 0, width: 20, thickness: B, decay: lam });
        const label = `(${x}, ${y}) at ${t} d: particles ${c.toFixed(4)} ± ${se.toFixed(4)}, flux form ${flux.toFixed(4)}, exact ${exact.toFixed(4)}`;
        expect(Math.abs(c - flux), label).toBeLessThanOrEqual(4 * se + 1e-6);
        expect(Math.abs(c - exact), label).toBeLessThanOrEqual(4 * se + Math.abs(exact - flux) + 1e-6);
      }),
    );
  });

  it('a very wide, thick source: particles vs Ogata–Banks (same allowance)', () => {
    const wide = { ...source, width: 4000 };
    const times = [100, 200];
    const xs = [30, 60];
    const { p, tally } = run({
      field,
      source: wide,
      ax: 1,
      ay: 0.1,
      diffusion: 0,
      R: 1,
      decay: 0,
      decayDissolvedOnly: false,
      times,
      particles: 400_000,
      seed: 3,
      observers: xs.map((x) => ({ x, y: 0, radius: 8 })),
    });
    const est = observerConcentrations(p, tally);
    xs.forEach((x, o) =>
      times.forEach((t, k) => {
        const c = est[o].c[k];
        const se = est[o].se[k];
        const flux = fluxForm(x, 0, t, 1, 0.1, Infinity, 0);
        const ob = ogataBanks({ x, t, v, D: v });
        const label = `x ${x} at ${t} d: particles ${c.toFixed(4)} ± ${se.toFixed(4)}, flux form ${flux.toFixed(4)}, Ogata–Banks ${ob.toFixed(4)}`;
        expect(Math.abs(c - flux), label).toBeLessThanOrEqual(4 * se + 1e-6);
        expect(Math.abs(c - ob), label).toBeLessThanOrEqual(4 * se + Math.abs(ob - flux) + 1e-6);
      }),
    );
  });

  it('is reproducible and independent of how particles are split (to round-off)', () => {
    const input: WalkInput = { field, source, ax: 1, ay: 0.1, diffusion: 0, R: 1, decay: 0.001, decayDissolvedOnly: false, times: [50, 100], particles: 2000, seed: 99, observers: [{ x: 20, y: 0, radius: 3 }] };
    const a = run(input);
    const b = run(input);
    expect(Array.from(b.tally.obsMass)).toEqual(Array.from(a.tally.obsMass));
    const p = prepareWalk(input);
    const t1 = emptyTally(p);
    const t2 = emptyTally(p);
    walkParticles(p, 0, 700, t1);
    walkParticles(p, 700, 2000, t2);
    mergeTally(t1, t2);
    a.tally.obsMass.forEach((m, i) => expect(t1.obsMass[i]).toBeCloseTo(m, 12));
    expect(t1.released / a.tally.released).toBeCloseTo(1, 13);
  });
});

describe('particles with a pumping well and a stream', () => {
  const balance = (t: ReturnType<typeof run>['tally']) => {
    const last = t.aquiferMass[t.aquiferMass.length - 1];
    return Math.abs(t.released - (last + t.captured + t.outflow + t.decayed)) / t.released;
  };

  it('mass is conserved apart from decay, capture and outflow to the stream (1e-12), with and without wells', () => {
    const withWell = prepareFlow({
      darcyFlux: q,
      porosity: n,
      thickness: B,
      wells: [{ x: 150, y: 20, rate: 300 }],
      boundaries: [{ kind: 'constant-head', x1: 260, y1: 0, x2: 260, y2: 1 }],
    });
    const noWell = prepareFlow({ darcyFlux: q, porosity: n, thickness: B, wells: [] });
    for (const field of [withWell, noWell]) {
      const { tally } = run({
        field,
        source: { width: 20, thickness: B, c0: 5, sourceDecay: 0.0005, duration: 1500 },
        ax: 5,
        ay: 0.5,
        diffusion: 1e-4,
        R: 1.5,
        decay: 0.0008,
        decayDissolvedOnly: false,
        times: [500, 1000, 2000, 3000],
        particles: 4000,
        seed: 5,
      });
      expect(tally.stalled).toBe(0);
      expect(balance(tally)).toBeLessThan(1e-12);
      if (field === withWell) expect(tally.captured).toBeGreaterThan(0);
    }
  });

  it('a well capturing the whole plume at steady state removes the source mass flux less what decays', () => {
    const Q = 500;
    const field = prepareFlow({ darcyFlux: q, porosity: n, thickness: B, wells: [{ x: 200, y: 0, rate: Q }] });
    const lam = 0.001;
    const times = [500, 1000, 1500, 1800, 2000, 2200];
    const { p, tally } = run({
      field,
      source: { width: 20, thickness: B, c0: 10, sourceDecay: 0, duration: Infinity },
      ax: 5,
      ay: 0.5,
      diffusion: 0,
      R: 1,
      decay: lam,
      decayDissolvedOnly: false,
      times,
      particles: 40_000,
      seed: 21,
    });
    expect(tally.outflow).toBe(0);
    expect(tally.stalled).toBe(0);
    const k = times.length - 1;
    const len = times[k] - times[k - 1];
    const captured = tally.wellMass[k] / len;
    const capturedSe = Math.sqrt(tally.wellMass2[k]) / len;
    const sourceRate = tally.released / times[k];
    const decayRate = lam * 0.5 * (tally.aquiferMass[k] + tally.aquiferMass[k - 1]);
    // statement of the balance: captured = source − λ·M (steady state: the mass in the aquifer no longer changes)
    expect(Math.abs(tally.aquiferMass[k] - tally.aquiferMass[k - 1]) / tally.aquiferMass[k]).toBeLessThan(0.03);
    expect(Math.abs(captured - (sourceRate - decayRate))).toBeLessThanOrEqual(4 * capturedSe);
    // the well's water carries that flux divided by its rate
    const wc = wellConcentrations(p, tally)[0];
    expect(wc.c[k]).toBeCloseTo(captured / Q, 12);
  });
});

describe('interleaved subsets (stride) and scaled partial tallies', () => {
  it('offsets 0 … S−1 with stride S merge into the whole run (round-off), and one offset scaled by S estimates it within its band', async () => {
    const { prepareFlow, prepareWalk, emptyTally, walkParticles, mergeTally, scaledTally, observerConcentrations } = await import('../../../src/core/index');
    const field = prepareFlow({ darcyFlux: 0.1, porosity: 0.25, thickness: 10, wells: [] });
    const input = {
      field,
      source: { width: 10, thickness: 10, c0: 100, sourceDecay: 0, duration: Infinity },
      ax: 5,
      ay: 0.5,
      diffusion: 0,
      R: 1,
      decay: 0,
      decayDissolvedOnly: false,
      times: [100, 200, 400],
      particles: 4000,
      seed: 9,
      observers: [{ x: 40, y: 0, radius: 3 }],
      grid: { x0: 0, y0: -20, dx: 5, dy: 5, nx: 40, ny: 8, every: 3 },
    };
    const p = prepareWalk(input);
    const whole = emptyTally(p);
    walkParticles(p, 0, 4000, whole);
    const S = 8;
    const parts = emptyTally(p);
    let first = null as ReturnType<typeof emptyTally> | null;
    for (let o = 0; o < S; o++) {
      const t = emptyTally(p);
      walkParticles(p, o, 4000, t, undefined, S);
      if (o === 0) first = t;
      mergeTally(parts, t);
    }
    // every particle walked once, from its own stream: the same sums up to summation order
    expect(parts.particlesDone).toBe(4000);
    expect(parts.released / whole.released).toBeCloseTo(1, 12);
    for (let i = 0; i < whole.obsMass.length; i++) expect(parts.obsMass[i]).toBeCloseTo(whole.obsMass[i], 9);
    expect(whole.gridMass.length).toBe(40 * 8); // one frame: output time 2 (every 3)
    // one interleaved subset, scaled by S: the whole run's estimate within 4 standard errors
    const est = observerConcentrations(p, scaledTally(first!, 4000 / first!.particlesDone))[0];
    const all = observerConcentrations(p, whole)[0];
    for (let k = 0; k < 3; k++) expect(Math.abs(est.c[k] - all.c[k])).toBeLessThan(4 * est.se[k] + 1e-12);
    expect(() => walkParticles(p, 0, 10, emptyTally(p), undefined, 0)).toThrow(/stride/);
  });
});
