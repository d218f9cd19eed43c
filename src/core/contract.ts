/**
 * The fixed external contract (any consistent units; metres and days in checks). Each function
 * validates its input and throws ValidationError for impossible values; results are finite.
 */
import { cdf } from './solutions/oneD';
import { relativeAt, relativeGrid } from './transport';
import type { ExactOptions } from './solutions/patchSource';
import type { ScreeningModel, SolutionKind } from './model';
import { ValidationError, optionalNonNegative, requireFinite, requireFiniteEach, requireNonNegative, requirePositive, requireRetardation, requireTime } from './validation';

export interface OgataBanksInput {
  x: number;
  t: number;
  v: number;
  D: number;
  R?: number;
  decay?: number;
}

/**
 * Ogata–Banks (1961) C/C0, both terms, constant concentration at x = 0 from t = 0, semi-infinite
 * column; R divides v and D, first-order decay λ acts on dissolved and sorbed mass (not divided).
 * t = Infinity gives the steady state. Accurate at any Peclet number (see solutions/oneD.ts).
 */
export function ogataBanks(p: OgataBanksInput): number {
  if (p === null || typeof p !== 'object') throw new ValidationError('input', p, 'an object');
  const x = requireNonNegative('x', p.x);
  const t = requireTime('t', p.t);
  const v = requireNonNegative('v', p.v);
  const D = requireNonNegative('D', p.D);
  const R = requireRetardation('R', p.R);
  const lam = optionalNonNegative('decay', p.decay);
  if (x === 0) return t > 0 ? 1 : 0;
  if (!(t > 0)) return 0;
  if (D === 0 && v === 0) return 0;
  if (t === Infinity && v === 0 && lam === 0) return 1;
  return Math.min(1, cdf(x, t, v / R, D / R, lam));
}

export interface PatchInput {
  x: number;
  y: number;
  z: number;
  t: number;
  v: number;
  ax: number;
  ay: number;
  az: number;
  width: number;
  thickness: number;
  R?: number;
  decay?: number;
}

export interface PatchGridInput extends Omit<PatchInput, 'x' | 'y'> {
  xs: ArrayLike<number>;
  ys: ArrayLike<number>;
}

function contractModel(p: Omit<PatchInput, 'x' | 'y' | 'z' | 't'>, solution: SolutionKind): ScreeningModel {
  if (p === null || typeof p !== 'object') throw new ValidationError('input', p, 'an object');
  const v = solution === 'domenico' ? requirePositive('v', p.v) : requireNonNegative('v', p.v);
  return {
    v,
    ax: requireNonNegative('ax', p.ax),
    ay: requireNonNegative('ay', p.ay),
    az: requireNonNegative('az', p.az),
    diffusion: 0,
    R: requireRetardation('R', p.R),
    decay: optionalNonNegative('decay', p.decay),
    decayPhase: 'dissolved-and-sorbed',
    width: requirePositive('width', p.width),
    thickness: requirePositive('thickness', p.thickness),
    c0: 1,
    sourceDecay: 0,
    duration: Infinity,
    solution,
  };
}

function pointDepth(z: unknown) {
  const d = requireNonNegative('z', z);
  return { zTop: d, zBottom: d };
}

/** Domenico (1987) C/C0 for the rectangular source (see solutions/domenico.ts). x < 0 gives 0. */
export function domenico(p: PatchInput): number {
  const m = contractModel(p, 'domenico');
  return clamp01(relativeAt(m, 'domenico', requireFinite('x', p.x), requireFinite('y', p.y), pointDepth(p.z), requireTime('t', p.t)));
}

/** Exact rectangular-source C/C0 (see solutions/patchSource.ts); by default within 1e-6 relative (+1e-18) of the true value, so 1e-6 relative for every value ≥ 1e-12. */
export function patchSourceExact(p: PatchInput, opts?: ExactOptions): number {
  const m = contractModel(p, 'exact');
  return clamp01(relativeAt(m, 'exact', requireFinite('x', p.x), requireFinite('y', p.y), pointDepth(p.z), requireTime('t', p.t), opts));
}

function gridAxes(p: PatchGridInput): { xs: ArrayLike<number>; ys: ArrayLike<number> } {
  const xs = p.xs;
  const ys = p.ys;
  if (!xs || typeof xs.length !== 'number' || xs.length === 0) throw new ValidationError('xs', xs, 'a non-empty array of numbers > 0');
  if (!ys || typeof ys.length !== 'number' || ys.length === 0) throw new ValidationError('ys', ys, 'a non-empty array of finite numbers');
  for (let i = 0; i < xs.length; i++) if (!(xs[i] > 0) || !Number.isFinite(xs[i])) throw new ValidationError(`xs[${i}]`, xs[i], 'a finite number > 0');
  requireFiniteEach('ys', ys);
  if (xs.length * ys.length > 16_777_216) throw new ValidationError('xs×ys', xs.length * ys.length, 'at most 16 777 216 cells');
  return { xs, ys };
}

/**
 * Grids of up to SCRATCH_CELLS cells are computed into one buffer kept from call to call and
 * returned as a copy: on the machines measured (npm run bench's hosts) writing a grid into freshly
 * allocated, zero-filled memory cost more than computing it into a buffer already in use and
 * copying that (5 % of a 512² Domenico grid, measured 2026-12-02). The buffer stays allocated (at
 * most 8 MB); callers get a fresh array either way.
 */
const SCRATCH_CELLS = 1 << 20;
let scratch: Float64Array | null = null;

/** Domenico C/C0 on the flow-aligned lattice, index i·ys.length + j. */
export function domenicoGrid(p: PatchGridInput): Float64Array {
  const m = contractModel(p, 'domenico');
  const { xs, ys } = gridAxes(p);
  const n = xs.length * ys.length;
  const t = requireTime('t', p.t);
  // in [0, 1] by construction (domenicoGridInto), so no clamping pass over the grid
  if (n > SCRATCH_CELLS) {
    const out = new Float64Array(n);
    relativeGrid(m, 'domenico', xs, ys, pointDepth(p.z), t, out);
    return out;
  }
  if (scratch === null || scratch.length < n) scratch = new Float64Array(Math.max(n, 65536));
  const into = scratch.subarray(0, n);
  relativeGrid(m, 'domenico', xs, ys, pointDepth(p.z), t, into);
  return new Float64Array(into);
}

/** Exact-solution C/C0 on the flow-aligned lattice, sharing quadrature nodes along each x column. */
export function patchSourceExactGrid(p: PatchGridInput, opts?: ExactOptions): Float64Array {
  const m = contractModel(p, 'exact');
  const { xs, ys } = gridAxes(p);
  const out = new Float64Array(xs.length * ys.length);
  relativeGrid(m, 'exact', xs, ys, pointDepth(p.z), requireTime('t', p.t), out, opts);
  return clampAll(out);
}

function clamp01(c: number): number {
  return c < 0 ? 0 : c > 1 ? 1 : c;
}

function clampAll(a: Float64Array): Float64Array {
  for (let i = 0; i < a.length; i++) a[i] = clamp01(a[i]);
  return a;
}
