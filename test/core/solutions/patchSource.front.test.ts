/**
 * The exact rectangular-source solution (src/core/solutions/patchSource.ts) on the advancing front,
 * where C/C0 is between about 1e-12 and 1e-7, against an independent high-precision evaluation:
 * mpmath's tanh-sinh quadrature of the textbook travel-time integral (Wexler 1992), at 30 and 40
 * digits agreeing to 1e-15 (generator: scripts/reference/exact_front.py; fixture:
 * test/fixtures/exact-front.json).
 *
 * Tolerance: the stated accuracy, 1e-6 relative (EXACT_TOLERANCES.relTol) plus 1e-18 absolute
 * (absTol): 1e-6 relative for every value ≥ 1e-12. With the former absTol of 1e-13 these points
 * were only good to about 4e-3 relative.
 */
import { expect, test } from 'vitest';
import { readFileSync } from 'node:fs';
import { patchSourceExact } from '../../../src/core';
import { EXACT_TOLERANCES } from '../../../src/core/solutions/patchSource';

interface FrontPoint {
  v: number; ax: number; ay: number; az: number; R: number; decay: number; t: number;
  width: number; thickness: number; z: number; x: number; y: number; c: number;
}
const fixture = JSON.parse(readFileSync('test/fixtures/exact-front.json', 'utf8')) as { points: FrontPoint[] };

test('front points (C/C0 from 7e-8 down to 2.5e-13) within 1e-6 relative + 1e-18 of 40-digit mpmath values', () => {
  expect(EXACT_TOLERANCES.relTol).toBe(1e-6);
  expect(fixture.points.length).toBeGreaterThanOrEqual(16);
  let worst = 0;
  for (const p of fixture.points) {
    const got = patchSourceExact(p);
    const err = Math.abs(got - p.c);
    expect(err, `x = ${p.x}, y = ${p.y}: ${got} vs mpmath ${p.c}`).toBeLessThanOrEqual(1e-6 * p.c + 1e-18);
    if (p.c >= 1e-12) worst = Math.max(worst, err / p.c);
  }
  expect(worst).toBeLessThanOrEqual(1e-6);
});
