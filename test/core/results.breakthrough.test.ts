// Breakthrough curves: the exact solution's one-pass accumulation over ascending times must equal
// the point-by-point evaluation (each an independent adaptive integral) within the stated accuracy
// (1e-6 of the value reached, plus 1e-13 absolute, for each; compared at 3e-6 relative + 1e-12).
// Pulses by superposition. Times given in any order.
import { describe, expect, it } from 'vitest';
import { breakthroughCurve, concentration, type ScreeningModel } from '../../src/core/index';

const m: ScreeningModel = {
  v: 0.08, ax: 4, ay: 0.4, az: 0.04, diffusion: 1e-5, R: 1.7, decay: 3e-4, decayPhase: 'dissolved-and-sorbed',
  width: 12, thickness: 3, c0: 25, sourceDecay: 0, duration: Infinity, solution: 'exact',
};

function check(model: ScreeningModel, r: { x: number; y: number; zTop: number; zBottom: number }, times: number[]) {
  const curve = breakthroughCurve(model, r, times);
  times.forEach((t, k) => {
    const z = 0.5 * (r.zTop + r.zBottom);
    const point = r.zTop === r.zBottom ? concentration(model, { x: r.x, y: r.y, z }, t) : NaN;
    if (Number.isNaN(point)) return;
    expect(Math.abs(curve[k] - point), `t=${t}: curve ${curve[k]} point ${point}`).toBeLessThanOrEqual(3e-6 * point + 1e-12);
  });
}

describe('breakthrough curves of the exact solution', () => {
  const times = Array.from({ length: 60 }, (_, k) => 5 + k * 120);
  it('on the axis, off the axis and below the source, ascending times', () => {
    check(m, { x: 40, y: 0, zTop: 0, zBottom: 0 }, times);
    check(m, { x: 40, y: 20, zTop: 0, zBottom: 0 }, times);
    check(m, { x: 90, y: 3, zTop: 6, zBottom: 6 }, times);
  });
  it('times in any order give the same curve', () => {
    const shuffled = [...times].reverse();
    const a = breakthroughCurve(m, { x: 40, y: 5, zTop: 1, zBottom: 1 }, times);
    const b = breakthroughCurve(m, { x: 40, y: 5, zTop: 1, zBottom: 1 }, shuffled);
    times.forEach((_, k) => expect(b[times.length - 1 - k]).toBeCloseTo(a[k], 12));
  });
  it('a pulse of 800 d rises and falls', () => {
    const pulse = { ...m, duration: 800 };
    check(pulse, { x: 40, y: 0, zTop: 0, zBottom: 0 }, times);
    const c = breakthroughCurve(pulse, { x: 40, y: 0, zTop: 0, zBottom: 0 }, times);
    const peak = Math.max(...c);
    expect(c[c.length - 1]).toBeLessThan(0.5 * peak);
  });
});
