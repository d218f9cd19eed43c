/**
 * erf, erfc, erfcx (src/core/special/erf.ts) against outside references.
 *
 * References
 *  (a) test/fixtures/erf.json — 40-digit values from an independent decimal.js computation
 *      (series / continued fraction, scripts/reference/erf-fixtures.mjs; generated, do not edit),
 *      at the exact binary64 arguments; ranges cut at Cody's branch points 0.46875 and 4.
 *  (b) @stdlib/math-base-special-erfc and @stdlib/math-base-special-erfcx (npm), a published
 *      reference library (FreeBSD msun / Cody-based code paths independent of ours).
 *
 * Tolerance policy
 *  - Against the decimal reference: |result − expected| ≤ k·ε·|expected| with k = 4 and
 *    ε = 2^-52 (Cody 1969 gives relative errors below 6e-19 for the approximations themselves, so
 *    what remains is a handful of roundings in double arithmetic). Where |expected| falls below the
 *    smallest normal double DBL_MIN the format itself has no relative precision left, and the
 *    check is absolute: |result − expected| ≤ DBL_MIN.
 *  - Against @stdlib: k = 4 + 4 = 8 (both sides may carry their few-ulp error). For erfcx at
 *    negative x the library forms exp(x²) from the rounded x², whose error is 2x²·ε relative (the
 *    condition number of exp(x²)); the bound there is (8 + 2x²)·ε. Measured beside it in a log.
 *  - Special values (NaN, ±0, ±Infinity, branch points) are exact.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import stdlibErfc from '@stdlib/math-base-special-erfc';
import stdlibErfcx from '@stdlib/math-base-special-erfcx';
import { erf, erfc, erfcx } from '../../../src/core/special/erf';
import { EPS, MismatchLog, Prng, relTol } from '../helpers/check';

interface FixtureCase {
  x: number;
  expected: string;
}
interface Fixtures {
  generated: string;
  functions: Record<'erf' | 'erfc' | 'erfcx', Record<string, FixtureCase[]>>;
}

const fixtures: Fixtures = JSON.parse(readFileSync(new URL('../../fixtures/erf.json', import.meta.url), 'utf8'));
const K_DECIMAL = 4;
const K_STDLIB = 8;

const engine = { erf, erfc, erfcx } as const;

describe('special values first (IEEE 754 conventions; exact)', () => {
  it('NaN in gives NaN out', () => {
    expect(erf(NaN)).toBeNaN();
    expect(erfc(NaN)).toBeNaN();
    expect(erfcx(NaN)).toBeNaN();
  });
  it('signed zeros: erf(±0) = ±0, erfc(±0) = 1, erfcx(±0) = 1', () => {
    expect(Object.is(erf(0), 0)).toBe(true);
    expect(Object.is(erf(-0), -0)).toBe(true);
    expect(erfc(0)).toBe(1);
    expect(erfc(-0)).toBe(1);
    expect(erfcx(0)).toBe(1);
    expect(erfcx(-0)).toBe(1);
  });
  it('infinities: erf(±∞) = ±1, erfc(+∞) = 0, erfc(−∞) = 2, erfcx(+∞) = 0, erfcx(−∞) = +∞', () => {
    expect(erf(Infinity)).toBe(1);
    expect(erf(-Infinity)).toBe(-1);
    expect(erfc(Infinity)).toBe(0);
    expect(erfc(-Infinity)).toBe(2);
    expect(erfcx(Infinity)).toBe(0);
    expect(erfcx(-Infinity)).toBe(Infinity);
  });
  it('saturation: erf(6) rounds to 1 within 1 ulp, erfc(−6) to 2 (true values 1 − 2.2e-17, 2 − 2.2e-17)', () => {
    expect(1 - erf(6)).toBeLessThanOrEqual(EPS);
    expect(2 - erfc(-6)).toBeLessThanOrEqual(2 * EPS);
  });
  it('fixture file is the generated one (provenance)', () => {
    expect(fixtures.generated).toMatch(/scripts\/reference\/erf-fixtures\.mjs — generated, do not edit/);
  });
});

describe('against the 40-digit decimal.js reference (k = 4)', () => {
  for (const name of ['erf', 'erfc', 'erfcx'] as const) {
    for (const [range, cases] of Object.entries(fixtures.functions[name])) {
      it(`${name} on ${range} (${cases.length} points)`, () => {
        expect(cases.length).toBeGreaterThan(5);
        const log = new MismatchLog();
        for (const c of cases) {
          const expected = Number(c.expected);
          log.check(name, c.x, engine[name](c.x), expected, relTol(K_DECIMAL, expected));
        }
        log.assertNone();
      });
    }
  }
  it('covers the required spans: erfc −6…27, erfcx up to 1e8 and down to −26', () => {
    const xs = (name: 'erfc' | 'erfcx') => Object.values(fixtures.functions[name]).flat().map((c) => c.x);
    expect(Math.min(...xs('erfc'))).toBeLessThanOrEqual(-6);
    expect(Math.max(...xs('erfc'))).toBeGreaterThanOrEqual(27);
    expect(Math.min(...xs('erfcx'))).toBeLessThanOrEqual(-26);
    expect(Math.max(...xs('erfcx'))).toBeGreaterThanOrEqual(1e8);
  });
});

describe('against @stdlib (published library, k = 8)', () => {
  const rng = new Prng(20240611);
  const sample = (a: number, b: number, n: number) => Array.from({ length: n }, () => rng.between(a, b));

  it('erfc at 4000 seeded random points on −6…27, split at the branch points', () => {
    const xs = [
      ...sample(-6, -4, 500),
      ...sample(-4, -0.46875, 500),
      ...sample(-0.46875, 0.46875, 1000),
      ...sample(0.46875, 4, 1000),
      ...sample(4, 27, 1000),
    ];
    const log = new MismatchLog();
    for (const x of xs) {
      const expected = stdlibErfc(x);
      log.check('erfc vs @stdlib', x, erfc(x), expected, relTol(K_STDLIB, expected));
    }
    log.assertNone();
  });

  it('erfcx at 4000 seeded random points on −26…1e8', () => {
    const xs = [
      ...sample(-26, -4, 500),
      ...sample(-4, -0.46875, 500),
      ...sample(-0.46875, 0.46875, 1000),
      ...sample(0.46875, 4, 1000),
      ...Array.from({ length: 1000 }, () => rng.logBetween(4, 1e8)),
    ];
    const log = new MismatchLog();
    for (const x of xs) {
      const expected = stdlibErfcx(x);
      const k = x < 0 ? K_STDLIB + 2 * x * x : K_STDLIB;
      log.check('erfcx vs @stdlib', x, erfcx(x), expected, relTol(k, expected));
    }
    log.assertNone();
  });

  it('erf(x) = 1 − erfc(x) of @stdlib where that difference is well conditioned (|x| ≥ 0.5)', () => {
    const xs = [...sample(-6, -0.5, 1000), ...sample(0.5, 6, 1000)];
    const log = new MismatchLog();
    for (const x of xs) {
      const expected = x > 0 ? 1 - stdlibErfc(x) : stdlibErfc(-x) - 1;
      log.check('erf vs 1 − @stdlib erfc', x, erf(x), expected, relTol(K_STDLIB, expected));
    }
    log.assertNone();
  });
});
