// Plume length along the centreline (core plumeLength): the scan runs as one grid line and the
// bracket is confirmed with point values before Brent's method refines it.
// Checks:
//  - Steady state, source wide and thick enough that the lateral and vertical factors are 1 to
//    double precision: both solutions reduce to the one-dimensional steady state with first-order
//    decay, C = C0·exp(x·(v − √(v² + 4·D·λ·R))/(2D)) (the solution of D·C″ − v·C′ − λ·R·C = 0
//    bounded downgradient, derived here; it is the steady limit of Ogata–Banks with decay), so the
//    length to a limit is known in closed form.
//  - A pulse at a finite time: the profile rises to a peak downgradient and falls on both sides, so
//    the reported length must be the last crossing: the point value there equals the limit (Brent
//    tolerance 1e-6 relative in distance, checked in concentration at 1e-4), and every point
//    beyond it on a fine scan is below the limit.
import { describe, expect, it } from 'vitest';
import { concentration, plumeLength, type ScreeningModel } from '../../src/core/index';

const wide: ScreeningModel = {
  v: 0.1, ax: 5, ay: 0.5, az: 0.05, diffusion: 0, R: 2, decay: Math.LN2 / 400, decayPhase: 'dissolved-and-sorbed',
  width: 1e5, thickness: 1e5, c0: 10, sourceDecay: 0, duration: Infinity, solution: 'exact',
};

describe('plumeLength', () => {
  for (const solution of ['exact', 'domenico'] as const) {
    it(`steady state, wide and thick source, ${solution}: the 1D closed form`, () => {
      const m = { ...wide, solution };
      const D = m.ax * m.v;
      const k = (m.v - Math.sqrt(m.v * m.v + 4 * D * m.decay * m.R)) / (2 * D);
      const limit = 0.01;
      const expected = Math.log(limit / m.c0) / k;
      const L = plumeLength(m, limit, 0, Infinity);
      expect(L).not.toBeNull();
      expect(Math.abs(L! - expected) / expected).toBeLessThan(1e-5);
    });
  }

  for (const solution of ['exact', 'domenico'] as const) {
    it(`a pulse at a finite time, ${solution}: the last crossing, with nothing above the limit beyond it`, () => {
      const m: ScreeningModel = { ...wide, width: 20, thickness: 4, duration: 1500, decay: Math.LN2 / 3000, solution };
      const t = 6000;
      const limit = 0.05;
      const L = plumeLength(m, limit, 1, t);
      expect(L).not.toBeNull();
      const at = concentration(m, { x: L!, y: 0, z: 1 }, t);
      expect(Math.abs(at - limit) / limit).toBeLessThan(1e-4);
      // the pulse has left the source: the profile is below the limit near x = 0 and rises before it falls
      expect(concentration(m, { x: 1, y: 0, z: 1 }, t)).toBeLessThan(limit);
      for (let k = 1; k <= 400; k++) {
        const x = L! * (1 + k / 200);
        expect(concentration(m, { x, y: 0, z: 1 }, t), `x = ${x}`).toBeLessThan(limit);
      }
    });
  }

  it('a source plane below the limit gives null', () => {
    expect(plumeLength({ ...wide, c0: 0.001 }, 0.01, 0, Infinity)).toBeNull();
  });
});
