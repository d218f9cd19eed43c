/**
 * The WebAssembly build of the lattice error function and of the lateral rows
 * (wasm/lattice.as.ts, compiled into latticeWasm.ts by scripts/build-wasm.mjs): the same
 * floating-point operations in the same order as erfLattice.ts and spread.ts's lateralLattice, and
 * fdlibm's exp (the algorithm of V8's Math.exp), so where the host is V8 (Node, Chromium) its
 * values are bit for bit theirs (test/core/lattice-wasm.test.ts); on another engine they may differ
 * in the last bits of an exponential, within the stated accuracy either way. It is only faster: two
 * runs of the lattice step side by side in the lanes of 128-bit SIMD, no bounds checks, no boxed
 * numbers.
 *
 * Instantiated synchronously on first use (the module is about 8 KB). Where WebAssembly or its SIMD
 * is missing or refused (a content security policy without 'wasm-unsafe-eval', say),
 * `latticeKernel` returns null and the callers use the TypeScript code: the same values, slower.
 */
import { LATTICE_WASM } from './latticeWasm';
import { ERF_TABLE } from './erfTable';
import { LATTICE_RULES, latticeStepMax } from './erfLattice';

// The pure core compiles without DOM or Node typings, so the few WebAssembly names it uses are
// declared here (ECMAScript hosts provide them: browsers, workers and Node alike).
interface WasmMemory {
  readonly buffer: ArrayBuffer;
  grow(pages: number): number;
}
interface LatticeExports {
  readonly memory: WasmMemory;
  setCapacity(n: number): void;
  reset(): void;
  workOffset(): number;
  tableOffset(): number;
  rulesOffset(): number;
  stepTableOffset(): number;
  lattice(u0: number, du: number, n: number): void;
  lateralRow(y0: number, dy: number, ny: number, h: number, s: number, mirrored: number, jStart: number, factor: number): void;
  fdlibmExp(x: number): number;
  expPairAt(a: number, b: number): void;
}
declare const WebAssembly: {
  Module: new (bytes: Uint8Array) => object;
  Instance: new (module: object, imports: object) => { readonly exports: unknown };
};

const PAGE = 65536;

export interface LatticeKernel {
  /** split values at u0 + j·du, j < n, as erfLattice; a view valid until the next call */
  lattice(u0: number, du: number, n: number): Float64Array;
  /** the row of spread.ts's lateralLattice, j in [0, ny); a view valid until the next call */
  lateralRow(y0: number, dy: number, ny: number, h: number, s: number, mirrored: boolean, jStart: number, factor: number): Float64Array;
  /** the module's own exp (fdlibm's), for the test that it is the host's Math.exp */
  exp(x: number): number;
  /** its two-lane exp (expPair), for the same test: [e^a, e^b] */
  expPair(a: number, b: number): [number, number];
}

class Kernel implements LatticeKernel {
  private cap = 0;
  private views: { b: Float64Array; row: Float64Array } | null = null;

  constructor(private readonly x: LatticeExports) {
    this.ensure(1024);
    const mem = new Float64Array(x.memory.buffer);
    mem.set(ERF_TABLE, x.tableOffset() / 8);
    const at = x.rulesOffset() / 8;
    LATTICE_RULES.forEach((r, k) => {
      mem.set(r.c, at + 16 * k);
      mem.set(r.w, at + 16 * k + 8);
    });
    mem.set(latticeStepMax(), x.stepTableOffset() / 8);
    x.reset();
  }

  /** room for n doubles in each work array (memory grows; old views are dropped) */
  private ensure(n: number): void {
    if (n <= this.cap) return;
    const cap = Math.max(n, 2 * this.cap);
    const need = this.x.workOffset() + 3 * 8 * cap;
    const have = this.x.memory.buffer.byteLength;
    if (need > have) this.x.memory.grow(Math.ceil((need - have) / PAGE));
    this.cap = cap;
    this.x.setCapacity(cap);
    this.views = null;
  }

  private viewsFor(n: number): { b: Float64Array; row: Float64Array } {
    this.ensure(n);
    // ensure() drops the views whenever memory grows (the only way the buffer changes)
    if (this.views === null || this.views.b.length !== n) {
      const buf = this.x.memory.buffer;
      const work = this.x.workOffset();
      this.views = { b: new Float64Array(buf, work + 8 * this.cap, n), row: new Float64Array(buf, work + 16 * this.cap, n) };
    }
    return this.views;
  }

  lattice(u0: number, du: number, n: number): Float64Array {
    const v = this.viewsFor(n);
    this.x.lattice(u0, du, n);
    return v.b;
  }

  lateralRow(y0: number, dy: number, ny: number, h: number, s: number, mirrored: boolean, jStart: number, factor: number): Float64Array {
    const v = this.viewsFor(ny);
    this.x.lateralRow(y0, dy, ny, h, s, mirrored ? 1 : 0, jStart, factor);
    return v.row;
  }

  exp(x: number): number {
    return this.x.fdlibmExp(x);
  }

  expPair(a: number, b: number): [number, number] {
    this.x.expPairAt(a, b);
    const at = this.x.workOffset() / 8;
    const mem = new Float64Array(this.x.memory.buffer);
    return [mem[at], mem[at + 1]];
  }
}

let kernel: Kernel | null | undefined;
let enabled = true;

function instantiate(): Kernel | null {
  try {
    if (typeof WebAssembly !== 'object' || WebAssembly === null) return null;
    const instance = new WebAssembly.Instance(new WebAssembly.Module(LATTICE_WASM), {});
    return new Kernel(instance.exports as LatticeExports);
  } catch {
    return null;
  }
}

/** The WebAssembly kernel, or null where it is unavailable or switched off. */
export function latticeKernel(): LatticeKernel | null {
  if (!enabled) return null;
  if (kernel === undefined) kernel = instantiate();
  return kernel;
}

/** Switches the WebAssembly kernel off (false) or back on; for tests and benchmarks. */
export function useLatticeKernel(on: boolean): void {
  enabled = on;
}
