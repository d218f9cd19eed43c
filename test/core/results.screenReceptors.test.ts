// screenReceptorsInto (a Monte Carlo realisation's inner loop) against the receptor functions it
// stands for: for Domenico with a continuous constant source it evaluates the closed forms
// directly (no curve per receptor), otherwise it searches a curve; either way each figure must be
// the one screenAverage, peakConcentration and firstTimeAtLimit give for that receptor (those are
// checked against published and independent references in their own tests). Invented models,
// seeded (seed 1515), spanning points and screens, on and off the axis, upgradient, receptors
// that reach the limit early, late and never, with and without decay, a declining source and a
// finite release (the curve path), and breakthrough curves at given times.
import { describe, expect, it } from 'vitest';
import {
  breakthroughCurve,
  domenicoSourceDecayLimit,
  firstTimeAtLimit,
  peakConcentration,
  screenAverage,
  screenReceptorsInto,
  type Receptor,
  type ScreeningModel,
} from '../../src/core/index';

function rng(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return (s + 0.5) / 4294967296;
  };
}

const logUniform = (u: number, lo: number, hi: number) => lo * Math.pow(hi / lo, u);

function model(r: () => number, sourceDecay = 0, duration = Infinity): ScreeningModel {
  const ax = logUniform(r(), 0.5, 30);
  return {
    v: logUniform(r(), 0.005, 2),
    ax,
    ay: ax / 10,
    az: ax / 100,
    diffusion: r() < 0.3 ? 1e-5 : 0,
    R: 1 + 10 * r(),
    decay: r() < 0.3 ? 0 : logUniform(r(), 1e-5, 1e-2),
    decayPhase: r() < 0.5 ? 'dissolved-and-sorbed' : 'dissolved-only',
    width: logUniform(r(), 2, 60),
    thickness: logUniform(r(), 0.5, 6),
    c0: logUniform(r(), 0.1, 100),
    sourceDecay,
    duration,
    solution: 'domenico',
  };
}

function receptors(r: () => number): Receptor[] {
  const out: Receptor[] = [{ x: -20, y: 0, zTop: 0, zBottom: 0 }];
  for (let j = 0; j < 5; j++) {
    const zTop = r() < 0.5 ? 0 : 8 * r();
    out.push({ x: logUniform(r(), 1, 2000), y: (r() - 0.5) * 80, zTop, zBottom: r() < 0.5 ? zTop : zTop + 10 * r() });
  }
  return out;
}

describe('screenReceptorsInto gives each receptor the figures of the receptor functions', () => {
  const horizon = 30 * 365.25;
  const times = Array.from({ length: 12 }, (_, k) => (horizon * (k + 1)) / 12);
  const cases: [string, (r: () => number) => ScreeningModel][] = [
    ['continuous constant source (closed forms)', (r) => model(r)],
    ['declining source (curve search)', (r) => {
      const m = model(r);
      return { ...m, sourceDecay: 0.5 * domenicoSourceDecayLimit(m) }; // within the limit Domenico's closed form admits
    }],
    ['release of finite duration (curve search)', (r) => model(r, 0, 3000)],
  ];
  for (const [what, make] of cases) {
    it(what, () => {
      const r = rng(1515);
      let reached = 0;
      for (let n = 0; n < 40; n++) {
        const m = make(r);
        const rs = receptors(r);
        // a limit between a tenth and ten times a mid receptor's value at the horizon, so some reach it and some do not
        const limit = Math.max(1e-9, screenAverage(m, rs[1], horizon) * logUniform(r(), 0.1, 10));
        const out = {
          arrival: new Float64Array(rs.length + 2),
          atHorizon: new Float64Array(rs.length + 2),
          peak: new Float64Array(rs.length + 2),
          curves: new Float64Array((rs.length + 2) * times.length),
          times,
        };
        screenReceptorsInto(m, rs, limit, horizon, out, 2);
        rs.forEach((rec, j) => {
          const at = 2 + j;
          // tolerances: the same arithmetic gives the same value (1e-12 relative); the closed-form
          // arrival against firstTimeAtLimit's own evaluation of the same closed form (1e-9 of the horizon)
          const ref = screenAverage(m, rec, horizon);
          expect(Math.abs(out.atHorizon[at] - ref)).toBeLessThanOrEqual(1e-12 * ref);
          const peak = peakConcentration(m, rec, horizon).c;
          expect(Math.abs(out.peak[at] - peak)).toBeLessThanOrEqual(1e-12 * peak);
          const t = firstTimeAtLimit(m, rec, limit, horizon);
          if (t === null) expect(out.arrival[at]).toBe(Infinity);
          else {
            reached++;
            expect(Math.abs(out.arrival[at] - t)).toBeLessThanOrEqual(1e-9 * horizon);
          }
          const curve = breakthroughCurve(m, rec, times);
          for (let k = 0; k < times.length; k++) expect(Math.abs(out.curves[at * times.length + k] - curve[k])).toBeLessThanOrEqual(1e-12 * curve[k]);
        });
      }
      expect(reached).toBeGreaterThan(20); // the limits were chosen so that many receptors reach them
    });
  }
});
