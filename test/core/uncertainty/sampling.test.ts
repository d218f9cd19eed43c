/**
 * Distributions, Latin hypercube sampling and Monte Carlo statistics against outside references:
 * scipy 1.17 / numpy 2.4 values in test/fixtures/uncertainty.json (generator committed:
 * scripts/reference/uncertainty-fixtures.py), @stdlib's erfc for the closed-form CDFs of the
 * Kolmogorov–Smirnov checks, and the defining property of a Latin hypercube (McKay, Beckman &
 * Conover 1979): one sample per stratum per input.
 */
import { describe, expect, it } from 'vitest';
import stdlibErfc from '@stdlib/math-base-special-erfc';
import fixtures from '../../fixtures/uncertainty.json';
import {
  LatinHypercube,
  exceedance,
  makeSampler,
  normalCdf,
  normalQuantile,
  percentiles,
  planeSlopeCovariance,
  samplePlaneSlope,
  spearman,
  stratumPermutation,
  thirdsExceedance,
  type Distribution,
  type PhysicalRange,
} from '../../../src/core/uncertainty';

const ANY: PhysicalRange = { min: -Infinity, max: Infinity, minOpen: true, maxOpen: true };
const POSITIVE: PhysicalRange = { min: 0, max: Infinity, minOpen: true, maxOpen: true };
const POROSITY: PhysicalRange = { min: 0, max: 1, minOpen: true, maxOpen: false };

describe('standard normal (scipy.special.ndtri / ndtr)', () => {
  // AS 241 states ~1e-16 relative; written tolerance 4e-15 relative (about 16 ulp) + 1e-300
  it.each(fixtures.ndtri)('Φ⁻¹(%s)', (p, expected) => {
    expect(Math.abs(normalQuantile(p) - expected)).toBeLessThanOrEqual(4e-15 * Math.abs(expected) + 1e-300);
  });
  // Cody's erfc: a few ulp; the rounding of z/√2 (ε/2 relative) grows by z² in Φ's relative
  // error, so the tolerance is (z² + 8)·ε relative
  it.each(fixtures.ndtr)('Φ(%s)', (z, expected) => {
    expect(Math.abs(normalCdf(z) - expected)).toBeLessThanOrEqual((z * z + 8) * Number.EPSILON * expected);
  });
});

describe('quantile functions against scipy.stats ppf', () => {
  for (const d of fixtures.distributions) {
    it(d.name, () => {
      const s = makeSampler('x', d.name, d.params as Distribution, ANY);
      d.q.forEach((q, j) => {
        // tolerance 1e-12 relative: the truncated forms subtract CDF values (scipy's own accuracy is similar)
        expect(Math.abs(s.sample(q) - d.ppf[j]), `${d.name} at q = ${q}: ${s.sample(q)} vs ${d.ppf[j]}`).toBeLessThanOrEqual(1e-12 * Math.abs(d.ppf[j]) + 1e-15);
      });
      d.cdfAt.forEach((x, j) => expect(s.cdf(x)).toBeCloseTo(d.cdf[j], 12));
    });
  }
});

/** Independent closed-form CDFs for the KS checks (normal family through @stdlib's erfc). */
const phi = (z: number) => 0.5 * stdlibErfc(-z / Math.SQRT2);
const KS_CASES: { d: Distribution; cdf: (x: number) => number; range: PhysicalRange }[] = [
  { d: { kind: 'uniform', low: 0.2, high: 0.35 }, cdf: (x) => (x - 0.2) / 0.15, range: POROSITY },
  { d: { kind: 'log-uniform', low: 1e-3, high: 10 }, cdf: (x) => Math.log(x / 1e-3) / Math.log(1e4), range: POSITIVE },
  { d: { kind: 'triangular', low: 0, mode: 1, high: 4 }, cdf: (x) => (x <= 1 ? (x * x) / 4 : 1 - ((4 - x) * (4 - x)) / 12), range: ANY },
  { d: { kind: 'normal', mean: 135, sd: 12 }, cdf: (x) => phi((x - 135) / 12), range: ANY },
  { d: { kind: 'lognormal', median: 8, gsd: 4 }, cdf: (x) => phi(Math.log(x / 8) / Math.log(4)), range: POSITIVE },
  {
    d: { kind: 'lognormal-range', low: 2, high: 50, percentile: 10 },
    cdf: (x) => phi(Math.log(x / 10) / (Math.log(25) / (2 * 1.2815515655446004))), // Φ⁻¹(0.9) from scipy.special.ndtri
    range: POSITIVE,
  },
  {
    d: { kind: 'normal', mean: 0.25, sd: 0.1, truncate: { low: 0.02, high: 0.45 } },
    cdf: (x) => (phi((x - 0.25) / 0.1) - phi(-2.3)) / (phi(2) - phi(-2.3)),
    range: POROSITY,
  },
];

describe('marginals of a Latin hypercube run (Kolmogorov–Smirnov at the 1 % level, asymptotic critical value 1.628/√n from scipy.stats.kstwobign)', () => {
  const runs = 2000;
  const lhs = new LatinHypercube(42, runs, KS_CASES.length);
  it.each(KS_CASES.map((c, k) => [c.d.kind + (c.d.truncate ? ' (truncated)' : ''), k] as const))('%s', (_name, k) => {
    const c = KS_CASES[k];
    const s = makeSampler('x', 'x', c.d, c.range);
    const xs = Float64Array.from({ length: runs }, (_, i) => s.sample(lhs.uniform(i, k))).sort();
    let D = 0;
    xs.forEach((x, j) => {
      const F = c.cdf(x);
      D = Math.max(D, Math.abs(F - j / runs), Math.abs((j + 1) / runs - F));
    });
    expect(D).toBeLessThan(fixtures.ksAsymptotic01 / Math.sqrt(runs));
    // one sample per stratum: the empirical CDF never departs from F by more than 1/n (+ rounding)
    expect(D).toBeLessThanOrEqual(1 / runs + 1e-9);
  });
});

describe('Latin hypercube design', () => {
  it('puts exactly one sample in each stratum of each input', () => {
    const runs = 997;
    const lhs = new LatinHypercube(7, runs, 5);
    for (let k = 0; k < 5; k++) {
      const seen = new Uint8Array(runs);
      for (let i = 0; i < runs; i++) {
        const u = lhs.uniform(i, k);
        const stratum = Math.floor(u * runs);
        expect(u).toBeGreaterThan(0);
        expect(u).toBeLessThan(1);
        expect(stratum).toBe(lhs.stratum(i, k));
        seen[stratum]++;
      }
      expect(seen.every((c) => c === 1)).toBe(true);
    }
  });

  it('reproduces a run from its seed, and differs with another seed or run count', () => {
    const a = new LatinHypercube(123456789, 500, 3).row(17);
    expect(new LatinHypercube(123456789, 500, 3).row(17)).toEqual(a);
    expect(new LatinHypercube(123456790, 500, 3).row(17)).not.toEqual(a);
    expect(new LatinHypercube(123456789, 501, 3).row(17)).not.toEqual(a);
    // the permutation of an input does not depend on how many inputs there are
    expect(stratumPermutation(5, 300, 1)).toEqual(new LatinHypercube(5, 300, 4)['perms'][1]);
  });

  it('gives realisation i the same numbers whether one worker computes all or four share the range', () => {
    const runs = 1000;
    const one = new LatinHypercube(99, runs, 4);
    const all = Array.from({ length: runs }, (_, i) => [...one.row(i)]);
    const split = [0, 250, 500, 750, 1000];
    for (let w = 0; w < 4; w++) {
      const worker = new LatinHypercube(99, runs, 4); // each worker builds its own design
      for (let i = split[w + 1] - 1; i >= split[w]; i--) expect([...worker.row(i)]).toEqual(all[i]); // in any order
    }
  });

  it('pairs inputs without correlation (Spearman |ρ| < 4/√n between two inputs)', () => {
    const runs = 3000;
    const lhs = new LatinHypercube(1, runs, 2);
    const u0 = Float64Array.from({ length: runs }, (_, i) => lhs.uniform(i, 0));
    const u1 = Float64Array.from({ length: runs }, (_, i) => lhs.uniform(i, 1));
    expect(Math.abs(spearman(u0, u1))).toBeLessThan(4 / Math.sqrt(runs));
  });
});

describe('statistics', () => {
  it('percentiles as numpy.percentile (linear, Hyndman & Fan 7), to 1e-13 relative', () => {
    const got = percentiles(fixtures.percentiles.values, fixtures.percentiles.q);
    got.forEach((g, j) => expect(Math.abs(g! - fixtures.percentiles.expected[j])).toBeLessThanOrEqual(1e-13 * fixtures.percentiles.expected[j]));
  });

  it('counts "never" honestly: a percentile that reaches a realisation without arrival is null', () => {
    const arrivals = [10, 20, 30, 40, Infinity, Infinity];
    const [p5, p50, p95] = percentiles(arrivals, [0.05, 0.5, 0.95]);
    expect(p5).toBeCloseTo(10 + 0.25 * 10, 12); // h = 5·0.05 = 0.25
    expect(p50).toBeCloseTo(35, 12);
    expect(p95).toBeNull();
    expect(percentiles([Infinity, Infinity], [0.05])).toEqual([null]);
  });

  it('Spearman with tied values as scipy.stats.spearmanr, to 1e-12', () => {
    expect(spearman(fixtures.spearman.x, fixtures.spearman.y)).toBeCloseTo(fixtures.spearman.rho, 12);
  });

  it.each(fixtures.wilson)('Wilson 95 % interval as scipy.stats.binomtest(...).proportion_ci("wilson"): %j', ({ k, n, low, high }) => {
    const e = exceedance(k, n);
    expect(e.low).toBeCloseTo(low, 12);
    expect(e.high).toBeCloseTo(high, 12);
    expect(e.se).toBeCloseTo(Math.sqrt(((k / n) * (1 - k / n)) / n), 15);
  });

  it('exceedance in the low and high thirds of an input', () => {
    const u = [0.1, 0.2, 0.3, 0.5, 0.7, 0.8, 0.9];
    const ex = [0, 0, 1, 1, 1, 1, 0];
    const t = thirdsExceedance(u, ex);
    expect([t.low.k, t.low.n, t.high.k, t.high.n]).toEqual([1, 3, 2, 3]);
  });
});

describe('distributions that are refused, naming the input', () => {
  const bad: [string, Distribution, PhysicalRange, RegExp][] = [
    ['low above high', { kind: 'uniform', low: 5, high: 3 }, ANY, /K: the low value \(5\) is not below the high value \(3\)/],
    ['negative sd', { kind: 'normal', mean: 1, sd: -0.2 }, ANY, /K: the standard deviation must be above 0/],
    ['gsd below 1', { kind: 'lognormal', median: 1, gsd: 0.5 }, POSITIVE, /geometric standard deviation must be above 1/],
    ['normal porosity with a tail below 0', { kind: 'normal', mean: 0.3, sd: 0.1 }, POROSITY, /K: this normal distribution puts 0\.13 % of its probability below 0, outside the physical range \(in \(0, 1\]\); truncate it/],
    ['uniform porosity reaching 0', { kind: 'uniform', low: 0, high: 0.3 }, POROSITY, /puts values below 0/],
    ['lognormal porosity with a tail above 1', { kind: 'lognormal', median: 0.3, gsd: 2 }, POROSITY, /above 1/],
    ['mode outside', { kind: 'triangular', low: 1, mode: 5, high: 4 }, ANY, /most likely value \(5\) must lie between/],
    ['log-uniform from 0', { kind: 'log-uniform', low: 0, high: 1 }, POSITIVE, /log-uniform distribution needs a low value above 0/],
    ['empty truncation', { kind: 'normal', mean: 0, sd: 1, truncate: { low: 40 } }, ANY, /leave \(almost\) none/],
    ['percentile 60', { kind: 'lognormal-range', low: 1, high: 10, percentile: 60 }, POSITIVE, /percentile/],
    ['unknown kind', { kind: 'gamma' } as unknown as Distribution, ANY, /unknown distribution/],
  ];
  it.each(bad)('%s', (_n, d, range, msg) => {
    expect(() => makeSampler('uncertainty.inputs.K', 'K', d, range)).toThrow(msg);
  });
  it('accepts a normal porosity truncated inside (0, 1]', () => {
    const s = makeSampler('p', 'porosity', { kind: 'normal', mean: 0.3, sd: 0.1, truncate: { low: 0, high: 1 } }, POROSITY);
    expect(s.sample(1e-12)).toBeGreaterThan(0);
  });
});

describe('head-plane slope covariance', () => {
  it('equals s²(XᵀX)⁻¹ of the uncentred design from numpy.linalg (fixture), to 1e-10 relative', () => {
    const p = fixtures.plane;
    const c = planeSlopeCovariance(p.points.map(([x, y, head]) => ({ x, y, head })));
    expect(c.a).toBeCloseTo(p.a, 12);
    expect(c.b).toBeCloseTo(p.b, 12);
    for (const k of ['caa', 'cab', 'cbb'] as const) expect(Math.abs(c[k] - p[k])).toBeLessThanOrEqual(1e-10 * Math.abs(p[k]));
    expect(c.dof).toBe(2);
  });
  it('samples (a, b) with that covariance (sample covariance of 20 000 within 5 %)', () => {
    const p = fixtures.plane;
    const c = planeSlopeCovariance(p.points.map(([x, y, head]) => ({ x, y, head })));
    const lhs = new LatinHypercube(3, 20000, 2);
    let saa = 0;
    let sab = 0;
    let sbb = 0;
    for (let i = 0; i < 20000; i++) {
      const { a, b } = samplePlaneSlope(c, normalQuantile(lhs.uniform(i, 0)), normalQuantile(lhs.uniform(i, 1)));
      saa += (a - c.a) ** 2 / 20000;
      sab += ((a - c.a) * (b - c.b)) / 20000;
      sbb += (b - c.b) ** 2 / 20000;
    }
    expect(saa / c.caa).toBeCloseTo(1, 1);
    expect(sbb / c.cbb).toBeCloseTo(1, 1);
    expect(Math.abs(sab - c.cab)).toBeLessThan(0.05 * Math.sqrt(c.caa * c.cbb));
  });
  it('needs four readings', () => {
    expect(() => planeSlopeCovariance([{ x: 0, y: 0, head: 1 }, { x: 1, y: 0, head: 1 }, { x: 0, y: 1, head: 2 }])).toThrow(/at least 4 head readings/);
  });
});
