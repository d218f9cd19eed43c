/**
 * A particle's random numbers (src/core/particles/stream.ts) against references outside it:
 *
 * - xoshiro128**: the known-answer words of the reference C implementation
 *   (prng.di.unimi.it/xoshiro128starstar.c) for the state 0x964D4A0C, 0xD40AB895, 0xAD7FDECB,
 *   0x3006F0F0, as published with the test data of the edorfaus/xoshiro-6502 port
 *   (test-rom/testdata.asm, "VerifyValuesXoshiro128", the starstar column).
 * - The ziggurat's layers close: with Marsaglia & Tsang's (2000, J. Stat. Software 5(8)) r and V
 *   for 128 layers, the top layer reaches f(0) = 1: f(x₁₂₇) + V/x₁₂₇ = 1 (their constants are
 *   given to 13 and 15 digits; tolerance 1e-9).
 * - The normal deviates are N(0, 1): the Kolmogorov–Smirnov distance of 10⁶ deviates from Φ
 *   (Φ from @stdlib's erfc) below 1.949/√n, which a true N(0, 1) sample exceeds with probability
 *   at most 2·e^{−2·1.949²} = 0.001 (the Dvoretzky–Kiefer–Wolfowitz inequality with Massart's
 *   constant, Massart 1990, Annals of Probability 18(3));
 *   mean, variance within 4 standard errors; the tail beyond r (the tail algorithm's share) and the
 *   wedges (|x| between the inner and outer edge of a layer) at their exact probabilities within
 *   4 standard errors of a binomial count.
 */
import { describe, expect, it } from 'vitest';
import erfcStd from '@stdlib/math-base-special-erfc';
import { ParticleStream, zigguratTables } from '../../../src/core/particles/stream';

const Phi = (x: number) => 0.5 * erfcStd(-x / Math.SQRT2);

describe('particle stream', () => {
  it('xoshiro128** gives the reference implementation’s words (known answers)', () => {
    const s = new ParticleStream(1);
    s.setState(0x964d4a0c, 0xd40ab895, 0xad7fdecb, 0x3006f0f0);
    expect([s.u32(), s.u32(), s.u32(), s.u32()]).toEqual([0xf1391922, 0x6fe53806, 0xa5be2840, 0xf510ee70]);
  });

  it('the ziggurat’s 128 layers close at the top (Marsaglia & Tsang 2000 constants)', () => {
    const { x, f } = zigguratTables();
    const V = 9.91256303526217e-3;
    expect(x[1]).toBe(3.442619855899);
    expect(Math.abs(f[127] + V / x[127] - 1)).toBeLessThan(1e-9);
    for (let i = 1; i < 128; i++) expect(x[i + 1]).toBeLessThan(x[i]);
  });

  it('normal deviates are N(0, 1): KS distance, moments, tail and wedges', () => {
    const n = 1_000_000;
    const z = new Float64Array(n);
    const s = new ParticleStream(20261203);
    // 1000 particles' streams of 1000 deviates each, as the walk draws them
    for (let j = 0; j < 1000; j++) {
      s.reset(j);
      for (let i = 0; i < 1000; i++) z[j * 1000 + i] = s.normal();
    }
    let sum = 0;
    let sum2 = 0;
    let notFinite = 0;
    for (const v of z) {
      if (!Number.isFinite(v)) notFinite++;
      sum += v;
      sum2 += v * v;
    }
    expect(notFinite).toBe(0);
    const mean = sum / n;
    const variance = sum2 / n - mean * mean;
    expect(Math.abs(mean)).toBeLessThan(4 / Math.sqrt(n));
    expect(Math.abs(variance - 1)).toBeLessThan(4 * Math.sqrt(2 / n));
    const sorted = Float64Array.from(z).sort();
    let d = 0;
    for (let i = 0; i < n; i++) {
      const F = Phi(sorted[i]);
      d = Math.max(d, Math.abs(F - i / n), Math.abs((i + 1) / n - F));
    }
    expect(d).toBeLessThan(1.949 / Math.sqrt(n));
    const binomial = (count: number, p: number) => expect(Math.abs(count - n * p)).toBeLessThan(4 * Math.sqrt(n * p * (1 - p)));
    const { x } = zigguratTables();
    const r = x[1];
    binomial(
      z.reduce((c, v) => c + (Math.abs(v) > r ? 1 : 0), 0),
      2 * (1 - Phi(r)),
    );
    // wedges of the lowest layers (the slow path): |x| in [x[i+1], x[i]) for i = 1, 2, 3
    for (const i of [1, 2, 3]) {
      const lo = x[i + 1];
      const hi = x[i];
      binomial(
        z.reduce((c, v) => c + (Math.abs(v) >= lo && Math.abs(v) < hi ? 1 : 0), 0),
        2 * (Phi(hi) - Phi(lo)),
      );
    }
  });

  it('a particle’s stream depends only on (seed, j)', () => {
    const a = new ParticleStream(5);
    const b = new ParticleStream(5);
    b.reset(3);
    b.normal();
    a.reset(7);
    b.reset(7);
    for (let i = 0; i < 50; i++) expect(a.normal()).toBe(b.normal());
    const c = new ParticleStream(6);
    c.reset(7);
    a.reset(7);
    expect(c.next()).not.toBe(a.next());
  });
});
