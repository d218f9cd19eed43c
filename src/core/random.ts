/**
 * Seeded, counter-based random numbers: Philox4x32-10 (Salmon, Moraes, Dror & Shaw 2011,
 * "Parallel random numbers: as easy as 1, 2, 3", Proc. SC'11; the Random123 library). A block of
 * four 32-bit words is a pure function of a 128-bit counter and a 64-bit key, so any number can
 * be computed alone: realisation i of a Monte Carlo run, or particle j of a walk, draws from a
 * stream that depends only on (seed, purpose, its own indices), never on how work is split
 * across workers or in which order it runs. Tested against Random123's known-answer vectors.
 *
 * Key = the seed (an integer 0 ≤ seed < 2^53, split into two 32-bit words).
 * Counter = (block n, a, b, purpose): `purpose` keeps unrelated uses of one seed apart, a and b
 * are the caller's indices (< 2^32), n counts blocks within the stream.
 * Purposes in use (add new ones here so no two uses share a stream):
 *   1  Latin hypercube: stratum permutation of one input        (a = input, b = runs)
 *   2  Latin hypercube: position within the stratum             (a = input, b = realisation)
 *   3  particle walk: seeds particle j's own stream (a = j mod 2^32, b = ⌊j / 2^32⌋; particles/stream.ts)
 *   4–15 free
 *
 * Doubles: two per block, each from 53 bits, (k + ½)·2⁻⁵³ for k in [0, 2⁵³), so every value
 * lies strictly inside (0, 1) and 0 and 1 never occur.
 */
import { ValidationError } from './validation';

const M0 = 0xd2511f53;
const M1 = 0xcd9e8d57;
const W0 = 0x9e3779b9;
const W1 = 0xbb67ae85;

/** High 32 bits of the 64-bit product of two unsigned 32-bit words (exact in doubles: both
 * partial products stay below 2^48). */
function mulhi(a: number, b: number): number {
  const p1 = (a >>> 16) * b;
  const p0 = (a & 0xffff) * b;
  return Math.floor((p1 + Math.floor(p0 / 65536)) / 65536) >>> 0;
}

/** One Philox4x32-10 block: counter (c0..c3), key (k0, k1) → four words written into `out`. */
export function philox4x32(c0: number, c1: number, c2: number, c3: number, k0: number, k1: number, out: Uint32Array): void {
  let x0 = c0 >>> 0;
  let x1 = c1 >>> 0;
  let x2 = c2 >>> 0;
  let x3 = c3 >>> 0;
  let key0 = k0 >>> 0;
  let key1 = k1 >>> 0;
  for (let round = 0; round < 10; round++) {
    const hi0 = mulhi(M0, x0);
    const lo0 = Math.imul(M0, x0) >>> 0;
    const hi1 = mulhi(M1, x2);
    const lo1 = Math.imul(M1, x2) >>> 0;
    x0 = (hi1 ^ x1 ^ key0) >>> 0;
    x1 = lo1;
    x2 = (hi0 ^ x3 ^ key1) >>> 0;
    x3 = lo0;
    key0 = (key0 + W0) >>> 0;
    key1 = (key1 + W1) >>> 0;
  }
  out[0] = x0;
  out[1] = x1;
  out[2] = x2;
  out[3] = x3;
}

const TWO_POW_32 = 4294967296;
const TWO_POW_NEG_53 = 1.1102230246251565e-16;

/** A double in (0, 1) from two 32-bit words: 27 + 26 bits, (k + ½)·2⁻⁵³. */
export function unitFromWords(hi: number, lo: number): number {
  return ((hi >>> 5) * 67108864 + (lo >>> 6) + 0.5) * TWO_POW_NEG_53;
}

/** Check a seed: an integer in [0, 2^53). `field` names it in the message. */
export function checkSeed(seed: unknown, field = 'seed'): number {
  if (typeof seed !== 'number' || !Number.isInteger(seed) || seed < 0 || seed > Number.MAX_SAFE_INTEGER)
    throw new ValidationError(field, seed, `a whole number from 0 to ${Number.MAX_SAFE_INTEGER}`);
  return seed;
}

function checkIndex(field: string, v: number): void {
  if (!Number.isInteger(v) || v < 0 || v >= TWO_POW_32) throw new ValidationError(field, v, 'a whole number from 0 to 2^32 − 1');
}

/**
 * A stream of doubles in (0, 1): blocks (n, a, b, purpose) for n = 0, 1, 2, …, two doubles per
 * block. Cheap to create; creating the same stream again gives the same numbers.
 */
export class CounterStream {
  private readonly k0: number;
  private readonly k1: number;
  private readonly buf = new Uint32Array(4);
  private block = 0;
  private half = 2;

  constructor(
    seed: number,
    private readonly purpose: number,
    private readonly a: number,
    private readonly b: number,
  ) {
    checkSeed(seed);
    checkIndex('purpose', purpose);
    checkIndex('stream index a', a);
    checkIndex('stream index b', b);
    this.k0 = seed % TWO_POW_32 >>> 0;
    this.k1 = Math.floor(seed / TWO_POW_32) >>> 0;
  }

  /** The next double in (0, 1). */
  next(): number {
    if (this.half === 2) {
      philox4x32(this.block, this.a, this.b, this.purpose, this.k0, this.k1, this.buf);
      this.block++;
      this.half = 0;
    }
    const j = this.half++ * 2;
    return unitFromWords(this.buf[j], this.buf[j + 1]);
  }
}

/** The first double of the stream (seed, purpose, a, b): one block, for a single draw. */
export function counterUniform(seed: number, purpose: number, a: number, b: number, scratch = new Uint32Array(4)): number {
  philox4x32(0, a, b, purpose, seed % TWO_POW_32 >>> 0, Math.floor(seed / TWO_POW_32) >>> 0, scratch);
  return unitFromWords(scratch[0], scratch[1]);
}
