/**
 * The lattice folder (src/core/lattice): the table erf (erfTable.ts), the lattice erf (erfLattice.ts)
 * and the lateral rows (lateral.ts, the folder's entry point)
 * against a published reference library: @stdlib/math-base-special-erf and -erfc (npm; FDLIBM's
 * erf/erfc, a few ulp), which share no code with the engine.
 *
 * Tolerances (stated in the modules' headers):
 *  - table: a few ulp; checked at 8 ε relative (4 for the table, 4 for @stdlib);
 *  - the Taylor series near 0 (erfNearZero): a few ulp; checked at 8 ε relative as the table;
 *  - lattice: 5e-13 relative to each value, plus @stdlib's 4 ε.
 */
import { describe, expect, it } from 'vitest';
import stdlibErf from '@stdlib/math-base-special-erf';
import stdlibErfc from '@stdlib/math-base-special-erfc';
import { ERF_TABLE_SPLIT, splitValue } from '../../../src/core/lattice/erfTable';
import { erfLattice, erfNearZero, LATTICE_CUT } from '../../../src/core/lattice/erfLattice';
import { lateralLattice } from '../../../src/core/lattice';
import { DBL_MIN, EPS, MismatchLog, Prng } from '../helpers/check';

const S = ERF_TABLE_SPLIT;

/** the split value by @stdlib: signed erf below the split, erfc(|u|) from it on */
function splitRef(u: number): number {
  const y = Math.abs(u);
  return y < S ? stdlibErf(u) : stdlibErfc(y);
}

describe('table error function (erfTable.ts)', () => {
  it('split values at 20 000 seeded points on 0…27 (seed 7): within 8 ε relative', () => {
    const rng = new Prng(7);
    const log = new MismatchLog();
    for (let k = 0; k < 20000; k++) {
      const y = k < 10000 ? rng.uniform() * 1.5 : rng.uniform() * 27;
      const ref = splitRef(y);
      log.check('splitValue vs @stdlib', y, splitValue(y), ref, Math.max(8 * EPS * Math.abs(ref), DBL_MIN)); // Cody's erfc is 0 from 26.54 (subnormal range)
    }
    log.assertNone();
  });
});

describe('erf near 0 by its Taylor series (erfLattice.ts, erfNearZero)', () => {
  it('at 20 000 seeded points on −split…split (seed 13), down to 1e-300: within 8 ε relative', () => {
    const rng = new Prng(13);
    const log = new MismatchLog();
    for (let k = 0; k < 20000; k++) {
      const u = (k < 15000 ? 2 * rng.uniform() - 1 : (rng.uniform() < 0.5 ? -1 : 1) * 10 ** (-300 * rng.uniform())) * S;
      const ref = stdlibErf(u);
      log.check('erfNearZero vs @stdlib', u, erfNearZero(u), ref, Math.max(8 * EPS * Math.abs(ref), DBL_MIN));
    }
    log.assertNone();
    expect(Object.is(erfNearZero(-0), -0) && erfNearZero(0) === 0).toBe(true);
  });
});

describe('lattice error function (erfLattice.ts)', () => {
  it('edge cases: n = 0 writes nothing; short and coarse lattices are evaluated point by point, exactly as the table', () => {
    const out = new Float64Array(3).fill(7);
    erfLattice(0, 0.1, 0, out);
    expect([...out]).toEqual([7, 7, 7]);
    erfLattice(-1, 0.5, 3, out);
    expect([...out]).toEqual([-1, -0.5, 0].map((u) => (Math.abs(u) < S ? Math.sign(u) * splitValue(Math.abs(u)) : splitValue(Math.abs(u)))).map((v) => v + 0));
  });
  it('500 seeded lattices (seed 11) across −30…30 with steps 1e-4…2: every value within 5e-13 relative', () => {
    const rng = new Prng(11);
    const log = new MismatchLog();
    let values = 0;
    for (let k = 0; k < 500; k++) {
      const du = Math.exp(Math.log(1e-4) + rng.uniform() * Math.log(2e4));
      const n = 4 + Math.floor(rng.uniform() * 700);
      const centre = (rng.uniform() - 0.5) * 2 * (k % 5 === 0 ? 30 : 8);
      const u0 = centre - 0.5 * n * du * rng.uniform();
      const out = new Float64Array(n);
      erfLattice(u0, du, n, out);
      for (let j = 0; j < n; j++) {
        const u = u0 + j * du;
        const ref = splitRef(u);
        log.check('erfLattice vs @stdlib', { u0, du, n, j, u }, out[j], ref, Math.max((5e-13 + 4 * EPS) * Math.abs(ref), DBL_MIN));
        values++;
      }
    }
    log.assertNone();
    expect(values).toBeGreaterThan(100000);
  });
  it('lateral rows of map grids (spread.ts lateralLattice): ½[erf((y + W/2)/s) − erf((y − W/2)/s)] on 512 evenly spaced y, 64 columns, mirrored and not, within 1e-12 of the far-field value', () => {
    // stated 5e-13 per lattice value; the difference of two values within one tail carries both
    const log = new MismatchLog();
    const n = 512;
    const dy = 300 / (n - 1);
    const h = 15;
    const out = new Float64Array(n);
    for (const mirrored of [true, false]) {
      for (let i = 1; i <= 64; i++) {
        const s = 2 * Math.sqrt(1 * ((800 * i) / 64));
        lateralLattice(-150, dy, n, h, s, mirrored, mirrored ? n / 2 : 0, 0.5, out, 0);
        for (let j = 0; j < n; j++) {
          // the lattice's own arguments, and for the mirrored half their mirror images
          const jj = mirrored && j < n / 2 ? n - 1 - j : j;
          const y = -150 + jj * dy;
          const a = (y + h) / s;
          const b = (y - h) / s;
          let ref: number;
          let mag: number;
          if (b >= S) {
            ref = stdlibErfc(b) - stdlibErfc(a);
            mag = stdlibErfc(b);
          } else if (a <= -S) {
            ref = stdlibErfc(-a) - stdlibErfc(-b);
            mag = stdlibErfc(-a);
          } else {
            ref = stdlibErf(a) - stdlibErf(b);
            mag = 2;
          }
          log.check('lateralLattice', { mirrored, i, j, a, b }, out[j], 0.5 * ref, Math.max(0.5 * (1e-12 + 8 * EPS) * mag, DBL_MIN));
        }
      }
    }
    log.assertNone();
  });
  it('the cut: |u| beyond LATTICE_CUT is evaluated point by point, to the underflow of erfc', () => {
    const out = new Float64Array(200);
    erfLattice(LATTICE_CUT - 1, 0.1, 200, out);
    for (let j = 0; j < 200; j++) {
      const u = LATTICE_CUT - 1 + j * 0.1;
      const ref = stdlibErfc(u);
      expect(Math.abs(out[j] - ref)).toBeLessThanOrEqual(Math.max((5e-13 + 4 * EPS) * ref, DBL_MIN));
    }
  });
});
