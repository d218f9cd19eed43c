// concentrationGrid's `into` buffer: the same values as a fresh grid (both solutions), the buffer
// itself returned, a buffer of the wrong size refused with a message naming it. (A consistency
// check of the API, not of the physics: the values are checked elsewhere against outside sources.)
import { describe, expect, it } from 'vitest';
import { concentrationGrid, type ScreeningModel } from '../../src/core/index';

const m: ScreeningModel = {
  v: 0.1, ax: 5, ay: 0.5, az: 0.05, diffusion: 0, R: 2, decay: Math.LN2 / 400, decayPhase: 'dissolved-and-sorbed',
  width: 20, thickness: 4, c0: 10, sourceDecay: 0, duration: Infinity, solution: 'exact',
};
const xs = Float64Array.from({ length: 24 }, (_, i) => -1 + i * 15);
const ys = Float64Array.from({ length: 17 }, (_, j) => -40 + j * 5);

describe('concentrationGrid into a buffer', () => {
  for (const solution of ['exact', 'domenico'] as const) {
    it(`${solution}: equals a fresh grid, and overwrites whatever the buffer held`, () => {
      const fresh = concentrationGrid(m, xs, ys, 1, 2000, { solution });
      const buf = new Float64Array(xs.length * ys.length).fill(123);
      const got = concentrationGrid(m, xs, ys, 1, 2000, { solution, into: buf });
      expect(got).toBe(buf);
      expect(Array.from(got)).toEqual(Array.from(fresh));
      expect(fresh.some((c) => c > 0.01)).toBe(true);
    });
  }
  it('refuses a buffer of the wrong size', () => {
    expect(() => concentrationGrid(m, xs, ys, 1, 2000, { into: new Float64Array(5) })).toThrow(/into must be a Float64Array of xs.length × ys.length = 408/);
  });
});
