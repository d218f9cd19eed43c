// Upgradient of the source plane (x < 0) both solutions represent no transport and must give 0 —
// on grids too, where the map lattice starts a little upgradient so the contours close along the
// source plane. (Domenico's x-term at x < 0 would otherwise evaluate its x → 0 limit, C0 inside the
// source strip.) Facts of the models' domains: Domenico 1987 and Wexler 1992 are posed for x ≥ 0.
import { describe, expect, it } from 'vitest';
import { concentration, concentrationGrid, type ScreeningModel } from '../../src/core/index';

const m: ScreeningModel = {
  v: 0.2, ax: 5, ay: 0.5, az: 0.05, diffusion: 0, R: 1.4, decay: 0, decayPhase: 'dissolved-and-sorbed',
  width: 10, thickness: 3, c0: 5, sourceDecay: 0, duration: Infinity, solution: 'domenico',
};

describe('upgradient of the source plane', () => {
  for (const solution of ['domenico', 'exact'] as const) {
    it(`${solution}: zero at x < 0 on a grid and at a point; C0 inside the source at x = 0`, () => {
      const mm = { ...m, solution };
      const xs = [-50, -1, 0, 10];
      const ys = [-2, 0, 2];
      for (const t of [1000, Infinity]) {
        const g = concentrationGrid(mm, xs, ys, 0, t);
        for (let j = 0; j < 3; j++) {
          expect(g[0 * 3 + j]).toBe(0);
          expect(g[1 * 3 + j]).toBe(0);
          expect(g[2 * 3 + j]).toBeCloseTo(5, 12);
          expect(g[3 * 3 + j]).toBeGreaterThan(0);
        }
        expect(concentration(mm, { x: -1, y: 0, z: 0 }, t)).toBe(0);
      }
    });
  }
});
