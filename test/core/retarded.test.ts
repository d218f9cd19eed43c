/**
 * The retarded parameters (src/core/retarded.ts) against hand calculations: R divides v and every
 * D = α·v + De (Freeze & Cherry 1979, section 9.2), and decay of the dissolved phase only is λ/R
 * (Bear 1979, section 7.7; as the engine's convention in DEVELOPERS.md states).
 */
import { expect, test } from 'vitest';
import { retardedParameters } from '../../src/core/retarded';
import type { ScreeningModel } from '../../src/core';

const m: ScreeningModel = {
  v: 0.5, ax: 10, ay: 1, az: 0.1, diffusion: 1e-4, R: 2, decay: 0.01, decayPhase: 'dissolved-and-sorbed',
  width: 10, thickness: 3, c0: 1, sourceDecay: 0, duration: Infinity, solution: 'domenico',
};

test('v/R, (α·v + De)/R and the decay of both phases', () => {
  const r = retardedParameters(m);
  expect(r.v).toBe(0.25);
  expect(r.Dx).toBeCloseTo((10 * 0.5 + 1e-4) / 2, 15); // 2.50005
  expect(r.Dy).toBeCloseTo((1 * 0.5 + 1e-4) / 2, 15); // 0.25005
  expect(r.Dz).toBeCloseTo((0.1 * 0.5 + 1e-4) / 2, 15); // 0.02505
  expect(r.lam).toBe(0.01);
});

test('decay of the dissolved phase only is λ/R', () => {
  expect(retardedParameters({ ...m, decayPhase: 'dissolved-only' }).lam).toBe(0.005);
});
