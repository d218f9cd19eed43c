/**
 * Trend statistics (src/core/trends) against outside references.
 *
 * - Gilbert (1987, Statistical Methods for Environmental Pollution Monitoring, Example 16.1 and
 *   Table A18 — recalled from memory, and checked here by exact enumeration): the series
 *   10, 15, 14, 20 gives S = 4 and P(S ≥ 4 | n = 4) = 0.167 (4 of the 24 orderings).
 * - SciPy 1.17 (scipy.stats.kendalltau, theilslopes, norm, t, linregress), through the committed
 *   generator test/fixtures/trends/generate.py and its fixture trends.json: S, τ_b, the
 *   tie-corrected Var(S), the continuity-corrected normal p, the exact p, and Sen's slope with its
 *   interval, on series with tied values, tied dates and non-detects at one and two limits.
 * Tolerances are written beside each check; integers (S, ranks) are exact.
 */
import { describe, expect, it } from 'vitest';
import fixture from '../../fixtures/trends/trends.json';
import {
  analyseTrend,
  censorAtHighestLimit,
  fitLine,
  mannKendall,
  mannKendallExactUpperTail,
  normalQuantile,
  studentTCentral,
  studentTQuantile,
  trendVerdict,
  type TimedResult,
} from '../../../src/core/index';
import { expectWithin } from '../helpers/check';

const quarterly = (values: number[], nd: boolean[] = []): TimedResult[] =>
  values.map((value, i) => ({ t: 91 * i, value, nonDetect: nd[i] ?? false }));

describe('edge cases first', () => {
  it('all values equal: S = 0, Var(S) = 0, p = 1 and the verdict is "stable" (CV = 0)', () => {
    const r = analyseTrend(quarterly([2, 2, 2, 2, 2, 2, 2, 2]));
    expect(r.mannKendall!.s).toBe(0);
    expect(r.mannKendall!.varS).toBe(0);
    expect(r.mannKendall!.p).toBe(1);
    expect(r.verdict).toBe('stable');
  });

  it('fewer than 4 rounds: no verdict, a warning naming the count', () => {
    const r = analyseTrend(quarterly([5, 4, 3]));
    expect(r.verdict).toBe('too few rounds');
    expect(r.mannKendall).toBeNull();
    expect(r.warnings[0].message).toMatch(/Only 3 sampling rounds/);
  });

  it('4 to 7 rounds: a verdict with a "few rounds" warning; every result below the limit says so', () => {
    const r = analyseTrend(quarterly([5, 4, 3, 2, 1]));
    expect(r.warnings.map((w) => w.code)).toContain('trend-few');
    const nd = analyseTrend(quarterly([1, 1, 0.5, 1, 1, 1, 1, 1], [true, true, true, true, true, true, true, true]));
    expect(nd.warnings.map((w) => w.code)).toContain('trend-all-censored');
    expect(nd.verdict).toBe('stable');
  });

  it('input order does not matter (sorted by date); a non-detect needs a limit > 0', () => {
    const a = quarterly([9, 7, 8, 5, 4, 4.5, 3, 2]);
    const b = [...a].reverse();
    expect(analyseTrend(b).mannKendall!.s).toBe(analyseTrend(a).mannKendall!.s);
    expect(() => analyseTrend([{ t: 0, value: 0, nonDetect: true }, ...a])).toThrow(/reporting limit/);
  });
});

describe('Gilbert 1987 worked example (from memory; exact enumeration confirms)', () => {
  it('10, 15, 14, 20: S = 4, one-sided exact P(S ≥ 4) = 4/24 = 0.167', () => {
    const r = mannKendall([10, 15, 14, 20]);
    expect(r.s).toBe(4);
    expect(r.pMethod).toBe('exact');
    expectWithin('P(S ≥ 4 | n = 4)', {}, mannKendallExactUpperTail(4, 4), 4 / 24, 1e-15);
    expect(mannKendallExactUpperTail(4, 4).toFixed(3)).toBe('0.167');
    expectWithin('two-sided p', {}, r.p, 8 / 24, 1e-15);
  });

  it('exact tails at the extremes: P(S = N₀) = 1/n! (only the sorted order), n = 5 and 10', () => {
    expectWithin('n=5', {}, mannKendallExactUpperTail(5, 10), 1 / 120, 1e-16);
    expectWithin('n=10', {}, mannKendallExactUpperTail(10, 45), 1 / 3628800, 1e-20);
    expect(mannKendallExactUpperTail(10, -45)).toBe(1);
  });
});

describe('against SciPy (fixture trends.json, generator committed beside it)', () => {
  for (const ref of fixture.series) {
    it(ref.name, () => {
      const results = ref.results as TimedResult[];
      const cs = censorAtHighestLimit(results);
      expect(cs.censored.filter(Boolean).length).toBe(ref.censoredCount);
      const mk = mannKendall(cs.values, cs.times);
      expect(mk.s).toBe(ref.S); // integer, exact
      // Var(S) recovered by the generator from scipy's p through norm.isf: ~1e-12 relative
      expectWithin('Var(S)', ref.name, mk.varS, ref.varS, 1e-9 * ref.varS);
      expectWithin('tau_b', ref.name, mk.tau, ref.tau, 1e-13);
      if ('pExact' in ref && ref.pExact !== undefined) {
        expect(mk.pMethod).toBe(ref.results.length <= 10 ? 'exact' : 'normal');
        if (mk.pMethod === 'exact') expectWithin('exact p', ref.name, mk.p, ref.pExact, 1e-12 * ref.pExact);
      } else {
        expect(mk.pMethod).toBe('normal');
      }
      if (mk.pMethod === 'normal') expectWithin('p (continuity-corrected)', ref.name, mk.p, ref.pNormalContinuity, 1e-9 * ref.pNormalContinuity);
      const t = analyseTrend(results);
      for (const [key, conf] of [['sen95', 0.95], ['sen90', 0.9]] as const) {
        const sen = (ref as Record<string, unknown>)[key] as number[] | undefined;
        if (!sen) continue;
        const got = conf === 0.95 ? t.sen! : analyseTrend(results, conf).sen!;
        // the median and the interval limits are single pairwise slopes (or a mean of two): 4 ulp
        expectWithin(`${key} slope`, ref.name, got.slope, sen[0], 4 * Number.EPSILON * Math.abs(sen[0]));
        expectWithin(`${key} lower`, ref.name, got.lower, sen[1], 4 * Number.EPSILON * Math.abs(sen[1]));
        expectWithin(`${key} upper`, ref.name, got.upper, sen[2], 4 * Number.EPSILON * Math.abs(sen[2]));
      }
    });
  }

  it('normal quantile (scipy.stats.norm.ppf): 1e-14 relative', () => {
    for (const [p, z] of fixture.normalQuantile) expectWithin('Φ⁻¹', { p }, normalQuantile(p), z, 1e-14 * Math.max(1, Math.abs(z)));
  });

  it('Student t quantiles and central probabilities (scipy.stats.t): 1e-12 relative', () => {
    for (const [conf, nu, t] of fixture.studentT) expectWithin('t quantile', { conf, nu }, studentTQuantile(conf, nu), t, 1e-12 * t);
    for (const [tv, nu, a] of fixture.studentCentral) expectWithin('A(t|ν)', { tv, nu }, studentTCentral(tv, nu), a, 1e-13);
  });

  it('least-squares line and slope standard error (scipy.stats.linregress): 1e-12 relative', () => {
    const l = fixture.line;
    const fit = fitLine(l.x, l.y);
    expectWithin('slope', {}, fit.slope, l.slope, 1e-12 * Math.abs(l.slope));
    expectWithin('intercept', {}, fit.intercept, l.intercept, 1e-12 * Math.abs(l.intercept));
    expectWithin('stderr', {}, fit.slopeStdError!, l.stderr, 1e-10 * l.stderr);
    expectWithin('CI upper', {}, fit.slopeInterval![1], l.slope + l.t975 * l.stderr, 1e-10 * Math.abs(l.slope));
    expectWithin('R²', {}, fit.rSquared, l.rSquared, 1e-12);
  });
});

describe('verdict rule (common practice; thresholds in src/core/trends/trend.ts)', () => {
  it('maps p, the sign of S and the CV', () => {
    expect(trendVerdict(-20, 0.01, 0.5)).toBe('decreasing');
    expect(trendVerdict(20, 0.05, 0.5)).toBe('increasing');
    expect(trendVerdict(-20, 0.08, 0.5)).toBe('probably decreasing');
    expect(trendVerdict(12, 0.1, 2)).toBe('probably increasing');
    expect(trendVerdict(-3, 0.6, 0.4)).toBe('stable');
    expect(trendVerdict(-3, 0.6, 1.4)).toBe('no trend');
    expect(trendVerdict(3, 0.6, 0.1)).toBe('no trend'); // a weak rise is never "stable"
  });

  it('the SciPy series get the verdicts their p-values imply', () => {
    expect(analyseTrend(fixture.series[0].results as TimedResult[]).verdict).toBe('decreasing');
    expect(analyseTrend(fixture.series[1].results as TimedResult[]).verdict).toBe('increasing');
  });
});
