/**
 * The WebAssembly build of the lattice error function and lateral rows (src/core/wasm/lattice.as.ts,
 * loaded by src/core/special/latticeKernel.ts) against the TypeScript modules it ports
 * (special/erfLattice.ts, solutions/spread.ts). Those are checked against @stdlib and 40-digit
 * decimal.js values in erf-lattice.test.ts; here the claim is identity: the port performs the same
 * operations in the same order, with fdlibm's exp, which is V8's Math.exp (v8/src/base/ieee754.cc),
 * so on V8 every value must be the same double (tolerance 0, compared with Object.is).
 * Also: the committed module is what the AssemblyScript source compiles to.
 */
import { afterEach, describe, expect, it } from 'vitest';
import { latticeKernel, useLatticeKernel } from '../../src/core/special/latticeKernel';
import { erfLattice } from '../../src/core/special/erfLattice';
import { lateralLattice } from '../../src/core/solutions/spread';
import { domenicoGrid, patchSourceExactGrid } from '../../src/core/index';
import { MismatchLog, Prng } from './helpers/check';
// @ts-expect-error: a plain ES module script without type declarations
import { compileLattice, moduleText, TARGET } from '../../scripts/build-wasm.mjs';
import { readFileSync } from 'node:fs';

afterEach(() => useLatticeKernel(true));

function kernel() {
  const k = latticeKernel();
  // the identity checks below would pass vacuously without the kernel: its absence is a failure
  expect(k).not.toBeNull();
  return k!;
}

describe('WebAssembly lattice kernel', () => {
  it('the committed module is the compiled AssemblyScript source (node scripts/build-wasm.mjs)', async () => {
    const text = moduleText(await compileLattice());
    expect(readFileSync(TARGET, 'utf8')).toBe(text);
  }, 60_000);

  it("its exp is the host's Math.exp, bit for bit, on 300 000 seeded arguments and the edge cases", () => {
    const k = kernel();
    const rng = new Prng(3);
    const log = new MismatchLog();
    const special = [0, -0, 1, -1, 0.5, -0.5, 1e-300, -1e-300, 2 ** -28, -(2 ** -28), 0.34657359027997264, 1.0397207708399179,
      709.782712893384, 709.79, -745.1332191019411, -745.14, -708.4, -708.39641853226408, -720, 88.7, Infinity, -Infinity, NaN];
    const args: number[] = [...special];
    for (let i = 0; i < 300_000; i++) {
      const u = rng.uniform();
      args.push(i % 3 === 0 ? (u - 0.5) * 1500 : i % 3 === 1 ? -u * 40 : (u - 0.5) * 2);
    }
    for (const x of args) {
      const got = k.exp(x);
      const want = Math.exp(x);
      if (!Object.is(got, want)) log.check('exp', { x }, got, want, 0);
    }
    log.assertNone();
  });

  it('its two-lane exp gives the same bits as Math.exp in each lane, ordinary or not (300 000 seeded pairs and the branch edges)', () => {
    const k = kernel();
    const rng = new Prng(5);
    const log = new MismatchLog();
    const bits = (hi: number, lo: number) => new Float64Array(new BigUint64Array([(BigInt(hi) << 32n) | BigInt(lo)]).buffer)[0];
    // the edges of fdlibm's branches (high words 0x3fd62e42/3: ½ln2, 0x3ff0a2b2: 1.5·ln2, 2⁻²⁸), of the
    // vector path (|x| = 707), and points where the reduction's k changes (x near (n + ½)·ln2)
    const edges: number[] = [1, -1, 707, -707, 707.0000000000001, -707.0000000000001, 2 ** -28, -(2 ** -28), 2 ** -28 * (1 - 2 ** -53), 0];
    for (const hi of [0x3fd62e42, 0x3fd62e43, 0x3ff0a2b1, 0x3ff0a2b2]) for (const lo of [0, 1, 0xffffffff]) edges.push(bits(hi, lo), -bits(hi, lo));
    for (let n = -1020; n <= 1020; n += 7) {
      const x = (n + 0.5) * Math.LN2;
      edges.push(x, x * (1 + 2 ** -52), x * (1 - 2 ** -52));
    }
    const args: number[] = [...edges];
    for (let i = 0; i < 300_000; i++) {
      const u = rng.uniform();
      args.push(i % 3 === 0 ? (u - 0.5) * 1500 : i % 3 === 1 ? -u * 40 : (u - 0.5) * 2);
    }
    let vectorPath = 0;
    for (let i = 0; i < args.length; i++) {
      // neighbours, and every tenth argument paired with an edge, so both paths see every kind
      const a = args[i];
      const b = i % 10 === 0 ? edges[i % edges.length] : args[(i + 1) % args.length];
      const [ga, gb] = k.expPair(a, b);
      if (!Object.is(ga, Math.exp(a))) log.check('expPair lane 0', { a, b }, ga, Math.exp(a), 0);
      if (!Object.is(gb, Math.exp(b))) log.check('expPair lane 1', { a, b }, gb, Math.exp(b), 0);
      if (Math.abs(a) >= 2 ** -28 && Math.abs(a) <= 707 && Math.abs(b) >= 2 ** -28 && Math.abs(b) <= 707 && a !== 1 && b !== 1) vectorPath++;
    }
    log.assertNone();
    expect(vectorPath).toBeGreaterThan(150_000);
  });

  it('lattices: 3000 seeded lattices across −30…30, steps 1e-4…2, the same doubles as erfLattice.ts', () => {
    const k = kernel();
    const rng = new Prng(17);
    const log = new MismatchLog();
    let values = 0;
    for (let t = 0; t < 3000; t++) {
      const du = Math.exp(Math.log(1e-4) + rng.uniform() * Math.log(2e4));
      const n = 1 + Math.floor(rng.uniform() * 900);
      const centre = (rng.uniform() - 0.5) * 2 * (t % 5 === 0 ? 30 : 8);
      const u0 = centre - 0.5 * n * du * rng.uniform();
      const js = new Float64Array(n);
      erfLattice(u0, du, n, js);
      const w = k.lattice(u0, du, n);
      for (let j = 0; j < n; j++) {
        values++;
        if (!Object.is(w[j], js[j])) log.check('lattice', { u0, du, n, j }, w[j], js[j], 0);
      }
    }
    log.assertNone();
    expect(values).toBeGreaterThan(1_000_000);
  });

  it('lateral rows: 1500 seeded rows, mirrored and not, with and without a start index, the same doubles as spread.ts', () => {
    const rng = new Prng(23);
    const log = new MismatchLog();
    for (let t = 0; t < 1500; t++) {
      const ny = 4 + Math.floor(rng.uniform() * 700);
      const half = 10 + rng.uniform() * 400;
      const mirrored = t % 2 === 0;
      const dy = (2 * half) / (ny - 1);
      const y0 = mirrored ? -half : -half + 0.37 * dy;
      const h = 0.5 + rng.uniform() * 60;
      const s = Math.exp(Math.log(0.05) + rng.uniform() * Math.log(4000));
      const jStart = mirrored ? ny >> 1 : t % 3 === 0 ? Math.floor(rng.uniform() * ny) : 0;
      const factor = rng.uniform();
      const outW = new Float64Array(ny + 3).fill(-7);
      const outJ = new Float64Array(ny + 3).fill(-7);
      useLatticeKernel(true);
      kernel();
      lateralLattice(y0, dy, ny, h, s, mirrored, jStart, factor, outW, 2);
      useLatticeKernel(false);
      lateralLattice(y0, dy, ny, h, s, mirrored, jStart, factor, outJ, 2);
      for (let j = 0; j < outW.length; j++) if (!Object.is(outW[j], outJ[j])) log.check('lateral row', { t, ny, mirrored, jStart, s, j }, outW[j], outJ[j], 0);
    }
    log.assertNone();
  });

  it('whole grids: Domenico 384 × 384 and exact 48 × 48 (invented scenario), the same with and without the kernel', () => {
    kernel();
    const n = 384;
    const xs = Float64Array.from({ length: n }, (_, i) => (700 * (i + 1)) / n);
    const ys = Float64Array.from({ length: n }, (_, j) => (j - (n - 1) / 2) * (260 / (n - 1)));
    for (let j = 0; j < n >> 1; j++) ys[j] = -ys[n - 1 - j];
    const p = { xs, ys, z: 0.5, t: 3000, v: 0.3, ax: 12, ay: 1.2, az: 0.12, width: 24, thickness: 3, R: 1.6, decay: Math.LN2 / 900 };
    const ex = { ...p, xs: xs.filter((_, i) => i % 8 === 0), ys: ys.filter((_, j) => j % 8 === 0 || j % 8 === 7) };
    useLatticeKernel(true);
    const dw = domenicoGrid(p);
    const ew = patchSourceExactGrid(ex);
    useLatticeKernel(false);
    const dj = domenicoGrid(p);
    const ej = patchSourceExactGrid(ex);
    let differ = 0;
    for (let i = 0; i < dw.length; i++) if (!Object.is(dw[i], dj[i])) differ++;
    for (let i = 0; i < ew.length; i++) if (!Object.is(ew[i], ej[i])) differ++;
    expect(differ).toBe(0);
    expect(dw.some((v) => v > 0.01)).toBe(true);
  });
});
