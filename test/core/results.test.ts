/**
 * The one rule for showing both solutions (src/core/results.ts compareSolutions,
 * SOLUTIONS_DIFFER_ABOVE = 5 %): the other solution's figures are shown whenever the result, or
 * whether the limit is reached within the horizon, differs, or any figure (arrival, concentration
 * at the horizon, peak, time of the peak) differs by more than 5 % of the larger. The 5 % is the
 * project's own threshold (common practice for "agrees within screening accuracy"), so these are
 * checks of the rule as stated, on figures made up for each case; the cases the field trial
 * reported (issue 13: an 8 % difference in arrival that was not shown; a status that differed
 * while the concentrations were 2.7 % apart) are among them. The demo-case checks are in
 * test/case/screen.test.ts.
 */
import { describe, expect, test } from 'vitest';
import { compareSolutions, SOLUTIONS_DIFFER_ABOVE, type SolutionFigures } from '../../src/core/results';

const LIMIT = 10;

function figs(o: Partial<SolutionFigures> = {}): SolutionFigures {
  return { solution: 'domenico', status: 'reaches-limit', arrival: 1000, atHorizon: 20, peak: { c: 20, t: 5000 }, steady: 20, ...o };
}

describe('compareSolutions: one rule for every figure', () => {
  test('the threshold is 5 %', () => expect(SOLUTIONS_DIFFER_ABOVE).toBe(0.05));

  test('identical figures: nothing differs', () => {
    const c = compareSolutions(figs(), figs({ solution: 'exact' }), LIMIT);
    expect(c).toEqual({ relDiff: 0, differing: [], showBoth: false });
  });

  test('an 8 % difference in arrival alone is shown; 4 % is not', () => {
    const a = compareSolutions(figs(), figs({ solution: 'exact', arrival: 1000 / 0.92 }), LIMIT);
    expect(a.differing).toEqual(['arrival']);
    expect(a.showBoth).toBe(true);
    expect(a.relDiff).toBeCloseTo(0.08, 12);
    expect(compareSolutions(figs(), figs({ solution: 'exact', arrival: 1040 }), LIMIT).showBoth).toBe(false);
  });

  test('each concentration and the time of the peak are held to the same 5 %', () => {
    expect(compareSolutions(figs(), figs({ atHorizon: 21.2 }), LIMIT).differing).toEqual(['atHorizon']);
    expect(compareSolutions(figs(), figs({ peak: { c: 21.2, t: 5000 } }), LIMIT).differing).toEqual(['peak']);
    expect(compareSolutions(figs(), figs({ peak: { c: 20, t: 5300 } }), LIMIT).differing).toEqual(['peakTime']);
    expect(compareSolutions(figs(), figs({ peak: { c: 20.8, t: 5200 } }), LIMIT).showBoth).toBe(false);
  });

  test('a different result is shown even when every figure is within 5 % (the nitrate spring: 9.74 against 10.0 mg/L)', () => {
    const dom = figs({ status: 'below-limit', arrival: null, atHorizon: 9.74, peak: { c: 9.74, t: 14610 }, steady: 9.74 });
    const ex = figs({ solution: 'exact', status: 'reaches-limit', arrival: 1781, atHorizon: 10.003, peak: { c: 10.003, t: 14610 }, steady: 10.003 });
    const c = compareSolutions(dom, ex, LIMIT);
    expect(c.differing).toEqual(['status', 'arrival']);
    expect(c.showBoth).toBe(true);
    expect(c.relDiff).toBeLessThan(0.05);
  });

  test('reaching the limit within the horizon or not is a difference even with the same status word', () => {
    // both 'not-reached-in-horizon' is impossible with an arrival, so take a later-reaching one against one within
    const c = compareSolutions(figs({ status: 'reaches-limit', arrival: 14000 }), figs({ status: 'reaches-limit', arrival: null }), LIMIT);
    expect(c.differing).toContain('arrival');
  });

  test('concentrations negligible against the limit (below a thousandth of it) count as equal, and so do their peak times', () => {
    const tiny = figs({ status: 'below-limit', arrival: null, atHorizon: 1e-6, peak: { c: 1e-6, t: 100 }, steady: 1e-6 });
    const c = compareSolutions(tiny, { ...tiny, atHorizon: 3e-6, peak: { c: 3e-6, t: 9000 } }, LIMIT);
    expect(c).toEqual({ relDiff: 0, differing: [], showBoth: false });
  });

  test('the largest relative difference is reported, whichever figure carries it', () => {
    const c = compareSolutions(figs(), figs({ arrival: 1100, atHorizon: 30, peak: { c: 30, t: 5000 } }), LIMIT);
    expect(c.relDiff).toBeCloseTo(1 / 3, 12);
    expect(c.differing).toEqual(['arrival', 'atHorizon', 'peak']);
  });
});
