// A source whose concentration declines first-order, C0·e^{−γt}, and a release of finite duration.
// References: (1) Duhamel's principle gives, for a wide and thick source (the 1-D limit),
// C/C0 = e^{−γt}·F_{λ−γ}(x, t) with F the Ogata–Banks solution with decay (van Genuchten & Alves
// 1982, USDA Tech. Bull. 1661), evaluated here by the contract's ogataBanks when λ ≥ γ;
// (2) an independent brute-force midpoint rule in ln τ of the first-passage integral with the
// factor e^{−γ(t−τ)}, written in this test (2e5 nodes), where the decline is faster than
// Domenico's closed form admits. Tolerance: 1e-6 relative (the exact solution's stated accuracy).
import { describe, expect, it } from 'vitest';
import { concentration, ogataBanks, validateModel, ValidationError, type ScreeningModel } from '../../src/core/index';

const base: ScreeningModel = {
  v: 0.05, ax: 2, ay: 0.2, az: 0.02, diffusion: 0, R: 1.5, decay: 0.002, decayPhase: 'dissolved-and-sorbed',
  width: 1e7, thickness: 1e7, c0: 1, sourceDecay: 0.001, duration: Infinity, solution: 'exact',
};

function bruteForce1D(m: ScreeningModel, x: number, t: number): number {
  const v = m.v / m.R, D = (m.ax * m.v) / m.R, lam = m.decay, g = m.sourceDecay;
  const f = (tau: number) => (x / (2 * Math.sqrt(Math.PI * D * tau ** 3))) * Math.exp(-((x - v * tau) ** 2) / (4 * D * tau) - lam * tau);
  const N = 200_000, a = Math.log(1e-4), b = Math.log(t);
  let acc = 0;
  for (let i = 0; i < N; i++) {
    const s = a + ((b - a) * (i + 0.5)) / N;
    const tau = Math.exp(s);
    acc += tau * f(tau) * Math.exp(-g * (t - tau));
  }
  return (acc * (b - a)) / N;
}

describe('declining source', () => {
  it('1-D limit equals e^{−γt}·Ogata–Banks with decay λ − γ (λ ≥ γ), Duhamel', () => {
    for (const [x, t] of [[5, 100], [20, 400], [20, 2000], [60, 3000]]) {
      const got = concentration(base, { x, y: 0, z: 0 }, t);
      const want = Math.exp(-base.sourceDecay * t) * ogataBanks({ x, t, v: base.v, D: base.ax * base.v, R: base.R, decay: base.decay - base.sourceDecay });
      expect(Math.abs(got - want), `x=${x} t=${t}: ${got} vs ${want}`).toBeLessThanOrEqual(1e-6 * want + 1e-13);
      const dom = concentration({ ...base, solution: 'domenico' }, { x, y: 0, z: 0 }, t);
      expect(dom).toBeGreaterThan(0);
    }
  });

  it('faster than Domenico admits: exact is still computed and matches brute force; Domenico refuses with the limit', () => {
    const m: ScreeningModel = { ...base, v: 0.01, ax: 10, decay: 0, sourceDecay: 0.002 };
    for (const [x, t] of [[5, 500], [15, 3000]]) {
      const got = concentration(m, { x, y: 0, z: 0 }, t);
      const want = bruteForce1D(m, x, t);
      expect(Math.abs(got - want), `x=${x} t=${t}: ${got} vs ${want}`).toBeLessThanOrEqual(1e-6 * want + 1e-12);
    }
    expect(() => validateModel({ ...m, solution: 'domenico' })).toThrow(ValidationError);
    expect(() => validateModel({ ...m, solution: 'domenico' })).toThrow(/sourceDecay.*exact solution/);
  });

  it('a pulse of duration T: superposition U(t) − e^{−γT}U(t − T), and zero long after', () => {
    const m: ScreeningModel = { ...base, sourceDecay: 0, decay: 0, duration: 200 };
    const x = 10, t = 600;
    const cont = { ...m, duration: Infinity };
    const want = concentration(cont, { x, y: 0, z: 0 }, t) - concentration(cont, { x, y: 0, z: 0 }, t - 200);
    expect(concentration(m, { x, y: 0, z: 0 }, t)).toBeCloseTo(want, 12);
    expect(concentration(m, { x, y: 0, z: 0 }, Infinity)).toBe(0);
  });
});
