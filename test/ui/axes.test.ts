// Chart axes (src/ui/charts/axes.ts): tick steps of 1, 2 or 5 × 10ⁿ, decade ticks on log axes, and
// when the concentration axis goes logarithmic. Reference: arithmetic facts written out by hand.
import { describe, expect, it } from 'vitest';
import { niceStep, niceLinearTicks, logScale, concentrationScale } from '../../src/ui/charts/axes';

describe('axes', () => {
  it('nice steps are 1, 2 or 5 × 10ⁿ and give at most the asked number of steps', () => {
    expect(niceStep(30, 5)).toBe(10); // 30/5 = 6 → 10
    expect(niceStep(10, 5)).toBe(2);
    expect(niceStep(0.0042, 4)).toBeCloseTo(0.002, 15);
    expect(niceStep(1, 10)).toBeCloseTo(0.1, 15);
    expect(niceStep(7300, 6)).toBe(2000);
    for (const span of [0.37, 1, 9.99, 123, 5e4]) {
      const s = niceStep(span, 6);
      expect(span / s).toBeLessThanOrEqual(6 + 1e-9);
      const m = s / Math.pow(10, Math.floor(Math.log10(s) + 1e-12));
      expect([1, 2, 5].some((k) => Math.abs(m - k) < 1e-9)).toBe(true);
    }
  });

  it('linear ticks cover the range at the step', () => {
    expect(niceLinearTicks(0, 30)).toEqual([0, 10, 20, 30]);
    expect(niceLinearTicks(0, 10.95)).toEqual([0, 5, 10]); // 10.95/5 = 2.19 → step 5
    expect(niceLinearTicks(0, 12, 6)).toEqual([0, 2, 4, 6, 8, 10, 12]);
  });

  it('log scales run over whole decades and map each decade to equal lengths', () => {
    const s = logScale(0.0005, 13, 200, 0);
    const rel = (a: number, b: number) => Math.abs(a - b) / b;
    expect(rel(s.domain[0], 1e-4)).toBeLessThan(1e-12);
    expect(rel(s.domain[1], 100)).toBeLessThan(1e-12);
    [1e-4, 1e-3, 1e-2, 1e-1, 1, 10, 100].forEach((v, i) => expect(rel(s.ticks[i].value, v)).toBeLessThan(1e-12));
    expect(s.ticks.length).toBe(7);
    expect(s(1e-4)).toBe(200);
    expect(s(100)).toBe(0);
    expect(s(1)).toBeCloseTo(200 - (4 / 6) * 200, 9);
    expect(s(0)).toBe(200); // zero sits on the bottom edge, not at −∞
  });

  it('concentration axes go logarithmic only when the curve and the limit are > 100× apart', () => {
    expect(concentrationScale([0, 0.003, 0.008], 0.005, 100, 0).log).toBe(false);
    expect(concentrationScale([0, 1, 4.9], 0.005, 100, 0).log).toBe(true);
    expect(concentrationScale([0, 1e-6], 0.005, 100, 0).log).toBe(true);
    expect(concentrationScale([0, 0], 0.005, 100, 0).log).toBe(true);
  });
});
