/**
 * A particle's own random numbers: xoshiro128** (Blackman & Vigna 2021, "Scrambled linear
 * pseudorandom number generators", ACM TOMS 47(4)) seeded with one Philox block
 * (seed, PARTICLE_PURPOSE, j) (random.ts), so particle j draws the same numbers however the walk
 * is split across workers.
 *
 * Uniform doubles: (k + ½)·2⁻⁵³ from 53 bits of two words, strictly inside (0, 1).
 *
 * Normal deviates by the ziggurat method (Marsaglia & Tsang 2000, "The ziggurat method for
 * generating random variables", J. Statistical Software 5(8): 128 layers, r = 3.442619855899,
 * layer area V = 9.91256303526217e-3 for f(x) = e^{−x²/2}), in the form of Doornik 2005 ("An
 * improved ziggurat method to generate normal random samples", Univ. of Oxford) that takes the
 * layer index and the value from separate bits, so they are independent: one 32-bit word gives
 * the layer (bits 0–6) and a signed value u in (−1, 1) from bits 7–31 (25 bits, spacing 2⁻²⁴ of
 * the layer's width). With probability ≈ 0.988 the value lies in the layer's rectangle under the
 * curve and is returned at once (one word, no logarithm); otherwise the wedge is tested against
 * e^{−x²/2} with a second uniform, and the base layer's tail beyond r is drawn by Marsaglia's
 * (1964, Technometrics 6(1)) exponential method. The method is exact in distribution; the only
 * departure is the 25-bit spacing of u inside a layer, far below any particle statistic. It
 * replaced Marsaglia's polar method here (2.5 words, a logarithm and a square root per deviate;
 * the largest single cost of a walk step, measured with node --cpu-prof): see DEVELOPERS.md.
 */
import { philox4x32 } from '../random';

export const PARTICLE_PURPOSE = 3;

const LAYERS = 128;
const R_TAIL = 3.442619855899;
const V_LAYER = 9.91256303526217e-3;

/**
 * Layer edges x[0] > x[1] = r > … > x[128] = 0 (x[0] = V/f(r), the base layer's width as if it
 * were a rectangle), f(x[i]) and the ratio x[i+1]/x[i] (the share of a layer under the curve
 * at every height). Built once, on first use.
 */
let tables: { x: Float64Array; f: Float64Array; ratio: Float64Array } | null = null;

export function zigguratTables(): { x: Float64Array; f: Float64Array; ratio: Float64Array } {
  if (tables) return tables;
  const x = new Float64Array(LAYERS + 1);
  const f = new Float64Array(LAYERS + 1);
  const fr = Math.exp(-0.5 * R_TAIL * R_TAIL);
  x[0] = V_LAYER / fr;
  x[1] = R_TAIL;
  f[0] = 0; // the base layer's wedge test is never used (its overflow is the tail)
  f[1] = fr;
  for (let i = 2; i < LAYERS; i++) {
    // the layer above has the same area V: f(x[i]) = f(x[i−1]) + V/x[i−1]
    f[i] = f[i - 1] + V_LAYER / x[i - 1];
    x[i] = Math.sqrt(-2 * Math.log(f[i]));
  }
  x[LAYERS] = 0;
  f[LAYERS] = 1;
  const ratio = new Float64Array(LAYERS);
  for (let i = 0; i < LAYERS; i++) ratio[i] = x[i + 1] / x[i];
  tables = { x, f, ratio };
  return tables;
}

/** xoshiro128** state seeded from one Philox block; next() a double in (0, 1), normal() N(0, 1). */
export class ParticleStream {
  private s0 = 0;
  private s1 = 0;
  private s2 = 0;
  private s3 = 0;
  private readonly block = new Uint32Array(4);
  private readonly zx: Float64Array;
  private readonly zf: Float64Array;
  private readonly zr: Float64Array;
  constructor(private readonly seed: number) {
    const t = zigguratTables();
    this.zx = t.x;
    this.zf = t.f;
    this.zr = t.ratio;
  }

  /** Starts particle j's stream. */
  reset(j: number): void {
    const b = this.block;
    philox4x32(0, j >>> 0, Math.floor(j / 4294967296) >>> 0, PARTICLE_PURPOSE, this.seed % 4294967296 >>> 0, Math.floor(this.seed / 4294967296) >>> 0, b);
    this.setState(b[0], b[1], b[2], b[3] | 1); // never the all-zero state
  }

  /** Sets the xoshiro128** state words (not all zero). */
  setState(s0: number, s1: number, s2: number, s3: number): void {
    this.s0 = s0 | 0;
    this.s1 = s1 | 0;
    this.s2 = s2 | 0;
    this.s3 = s3 | 0;
  }

  /** the next 32-bit word, unsigned */
  u32(): number {
    const result = Math.imul(rotl(Math.imul(this.s1, 5), 7), 9) >>> 0;
    const t = this.s1 << 9;
    this.s2 ^= this.s0;
    this.s3 ^= this.s1;
    this.s1 ^= this.s2;
    this.s0 ^= this.s3;
    this.s2 ^= t;
    this.s3 = rotl(this.s3, 11);
    return result;
  }

  /** (0, 1) from 53 bits */
  next(): number {
    const hi = this.u32() >>> 5;
    const lo = this.u32() >>> 6;
    return (hi * 67108864 + lo + 0.5) * 1.1102230246251565e-16;
  }

  /** A standard normal deviate (ziggurat, see the header). */
  normal(): number {
    for (;;) {
      const w = this.u32();
      const i = w & 127;
      const u = ((w >>> 7) - 16777215.5) * 5.9604644775390625e-8; // (k − (2²⁴ − ½))·2⁻²⁴ in (−1, 1)
      if (Math.abs(u) < this.zr[i]) return u * this.zx[i];
      if (i === 0) return u < 0 ? -this.tail() : this.tail();
      const x = u * this.zx[i];
      const fx = Math.exp(-0.5 * x * x);
      if (this.zf[i] + this.next() * (this.zf[i + 1] - this.zf[i]) < fx) return x;
    }
  }

  /** |X| beyond r given that it is (Marsaglia 1964) */
  private tail(): number {
    for (;;) {
      const a = -Math.log(this.next()) / R_TAIL;
      const b = -Math.log(this.next());
      if (b + b > a * a) return R_TAIL + a;
    }
  }
}

function rotl(x: number, k: number): number {
  return (x << k) | (x >>> (32 - k));
}
