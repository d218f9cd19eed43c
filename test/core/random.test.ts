/**
 * Philox4x32-10 against the known-answer vectors of its authors: Random123, file tests/kat_vectors
 * (D. E. Shaw Research, https://github.com/DEShawResearch/random123), the three "philox4x32 10"
 * lines (counter words, key words → output words; exact, tolerance 0).
 */
import { describe, expect, it } from 'vitest';
import { CounterStream, checkSeed, counterUniform, philox4x32 } from '../../src/core/random';

const KAT: [number[], number[], number[]][] = [
  [[0, 0, 0, 0], [0, 0], [0x6627e8d5, 0xe169c58d, 0xbc57ac4c, 0x9b00dbd8]],
  [[0xffffffff, 0xffffffff, 0xffffffff, 0xffffffff], [0xffffffff, 0xffffffff], [0x408f276d, 0x41c83b0e, 0xa20bc7c6, 0x6d5451fd]],
  [[0x243f6a88, 0x85a308d3, 0x13198a2e, 0x03707344], [0xa4093822, 0x299f31d0], [0xd16cfe09, 0x94fdcceb, 0x5001e420, 0x24126ea1]],
];

describe('Philox4x32-10 (Random123 known answers)', () => {
  it.each(KAT)('counter %j key %j', (c, k, expected) => {
    const out = new Uint32Array(4);
    philox4x32(c[0], c[1], c[2], c[3], k[0], k[1], out);
    expect([...out]).toEqual(expected);
  });
});

describe('counter streams', () => {
  it('give doubles strictly inside (0, 1), the same again from the same seed, and differ between streams', () => {
    const a = new CounterStream(12345, 3, 7, 0);
    const b = new CounterStream(12345, 3, 7, 0);
    const c = new CounterStream(12345, 3, 8, 0);
    const xs = Array.from({ length: 1000 }, () => a.next());
    expect(xs.every((x) => x > 0 && x < 1)).toBe(true);
    expect(Array.from({ length: 1000 }, () => b.next())).toEqual(xs);
    expect(c.next()).not.toBe(xs[0]);
    expect(counterUniform(12345, 3, 7, 0)).toBe(xs[0]);
  });

  it('mean and variance of 200 000 draws are those of U(0, 1) within 5 standard errors (closed form: 1/2, 1/12)', () => {
    const s = new CounterStream(2 ** 40 + 3, 5, 0, 0);
    const n = 200_000;
    let sum = 0;
    let sq = 0;
    for (let i = 0; i < n; i++) {
      const x = s.next();
      sum += x;
      sq += (x - 0.5) ** 2;
    }
    expect(Math.abs(sum / n - 0.5)).toBeLessThan(5 * Math.sqrt(1 / 12 / n));
    // Var of (x − ½)² for U(0,1) is 1/80 − 1/144
    expect(Math.abs(sq / n - 1 / 12)).toBeLessThan(5 * Math.sqrt((1 / 80 - 1 / 144) / n));
  });

  it('refuses a seed that is not a whole number in [0, 2^53)', () => {
    expect(() => checkSeed(1.5)).toThrow(/seed = 1.5 is not accepted: must be a whole number/);
    expect(() => checkSeed(-1)).toThrow(/seed/);
    expect(() => checkSeed(2 ** 53)).toThrow(/seed/);
    expect(() => new CounterStream(Number.NaN, 1, 0, 0)).toThrow(/seed/);
    expect(checkSeed(0)).toBe(0);
  });
});
