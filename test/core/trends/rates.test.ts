/**
 * Attenuation rates (src/core/trends/rates.ts).
 *
 * Buscheck & Alcantar (1995), as set out by Newell et al. (2002, US EPA/540/S-02/500), invert the
 * steady one-dimensional advection–dispersion–decay solution, so on a centreline diluted only
 * along the flow they recover the decay rate exactly (up to rounding). The synthetic centreline is
 * the project's own steady-state Domenico solution (src/core) with a known λ:
 *   C(x, 0, 0) = C₀·exp[(x/2αx)(1 − √(1 + 4λαx/v_c))]·erf(W/(4√(αy·x)))·erf(Z/(2√(αz·x))).
 * - With a source far wider and thicker than the lateral and vertical spreading, the two erf
 *   factors are 1 to double precision and the method must return λ to 1e-9 relative (rounding of
 *   the logarithms and the regression only).
 * - With a finite width, the lateral erf factor falls with distance; the method reads that
 *   dilution as decay and OVERESTIMATES λ (Newell et al. 2002 say the method leaves out
 *   transverse dispersion). The test shows the bias is there, and that dividing the lateral factor
 *   out again returns λ to 1e-9: the whole bias is the finite width.
 * The point rate and the regression's interval are checked on exact exponentials and against
 * SciPy's linregress through the line fixture in test/core/trends/trend.test.ts.
 */
import { describe, expect, it } from 'vitest';
import {
  biodegradationRate,
  bulkAttenuationRate,
  buscheckAlcantar,
  concentration,
  erf,
  pointDecayRate,
  type ScreeningModel,
} from '../../../src/core/index';
import { expectWithin } from '../helpers/check';

const base: ScreeningModel = {
  v: 0.12,
  ax: 8,
  ay: 0.8,
  az: 0.08,
  diffusion: 0,
  R: 1.6,
  decay: 0.0015,
  decayPhase: 'dissolved-and-sorbed',
  width: 1e5,
  thickness: 1e5,
  c0: 5,
  sourceDecay: 0,
  duration: Infinity,
  solution: 'domenico',
};
const distances = [30, 60, 100, 150, 220, 300];

function centreline(m: ScreeningModel) {
  return distances.map((x) => ({ distance: x, value: concentration(m, { x, y: 0, z: 0 }, Infinity), nonDetect: false }));
}

describe('edge cases first', () => {
  it('λ = 0 when concentrations do not fall with distance; a flat line says so', () => {
    const flat = distances.map((d) => ({ distance: d, value: 1 + 1e-3 * d, nonDetect: false }));
    const bulk = bulkAttenuationRate(flat, 0.1);
    expect(bulk.perMetre).toBeLessThan(0);
    const bio = biodegradationRate(bulk, 5);
    expect(bio.rate).toBe(0);
    expect(bio.warnings.map((w) => w.code)).toContain('biodegradation-none');
  });

  it('αx·m → 0: λ → v_c·m (dispersion negligible), without cancellation', () => {
    const m = 1e-9;
    expectWithin('small αx·m', {}, buscheckAlcantar(m, 0.2, 1e-6), 0.2 * m, 1e-12 * 0.2 * m);
  });

  it('two wells: a rate without an interval, and a warning; non-detects are left out and counted', () => {
    const bulk = bulkAttenuationRate(
      [
        { distance: 10, value: 2, nonDetect: false },
        { distance: 50, value: 0.5, nonDetect: false },
        { distance: 90, value: 0.005, nonDetect: true },
      ],
      0.1,
    );
    expect(bulk.interval).toBeNull();
    expect(bulk.leftOut).toBe(1);
    expect(bulk.warnings.map((w) => w.code)).toEqual(expect.arrayContaining(['rate-two-points', 'rate-non-detects']));
  });
});

describe('Buscheck & Alcantar on the project\'s steady-state centreline', () => {
  it('wide source: recovers the known λ to 1e-9 relative (the derivation is exact in 1-D)', () => {
    const vc = base.v / base.R;
    const bulk = bulkAttenuationRate(centreline(base), vc);
    expect(bulk.rSquared).toBeGreaterThan(1 - 1e-12);
    const bio = biodegradationRate(bulk, base.ax);
    expectWithin('λ', base, bio.rate, base.decay, 1e-9 * base.decay);
    // interval collapses onto λ when the points lie exactly on the line
    expectWithin('λ lower', base, bio.interval![0], base.decay, 1e-6 * base.decay);
  });

  it('finite width (W = 12 m, αy = 0.8 m): λ is overestimated; dividing out the lateral factor recovers it', () => {
    const m: ScreeningModel = { ...base, width: 12 };
    const vc = m.v / m.R;
    const pts = centreline(m);
    const biased = biodegradationRate(bulkAttenuationRate(pts, vc), m.ax).rate;
    expect(biased).toBeGreaterThan(1.2 * m.decay); // lateral dilution read as decay
    const corrected = pts.map((p) => ({ ...p, value: p.value / erf(m.width / (4 * Math.sqrt(m.ay * p.distance))) }));
    const bio = biodegradationRate(bulkAttenuationRate(corrected, vc), m.ax);
    expectWithin('λ with the width factor divided out', m, bio.rate, m.decay, 1e-9 * m.decay);
  });

  it('noisy wells: the 95 % interval of λ covers the true λ', () => {
    // deterministic ±15 % scatter (alternating), six wells
    const vc = base.v / base.R;
    const noisy = centreline(base).map((p, i) => ({ ...p, value: p.value * (i % 2 === 0 ? 1.15 : 0.87) }));
    const bio = biodegradationRate(bulkAttenuationRate(noisy, vc), base.ax);
    expect(bio.interval![0]).toBeLessThan(base.decay);
    expect(bio.interval![1]).toBeGreaterThan(base.decay);
  });
});

describe('point decay rate', () => {
  it('an exact exponential decline returns its rate (1e-12) and carries the caution', () => {
    const k = 0.0011;
    const rows = [0, 90, 181, 273, 365, 455, 548].map((t) => ({ t, value: 4 * Math.exp(-k * t), nonDetect: false }));
    const r = pointDecayRate(rows);
    expectWithin('k_point', {}, r.rate, k, 1e-12 * k);
    expect(r.warnings.map((w) => w.code)).toContain('point-rate-not-biodegradation');
    expect(r.warnings.find((w) => w.code === 'point-rate-not-biodegradation')!.message).toMatch(/must not be used/);
  });
});
