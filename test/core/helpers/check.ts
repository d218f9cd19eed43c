/**
 * Shared helpers for the reference tests: tolerance checks that print input, result, expected,
 * difference and tolerance on failure, and a seeded pseudo-random generator.
 */
import { expect } from 'vitest';

export const EPS = Number.EPSILON; // 2^-52
export const DBL_MIN = 2.2250738585072014e-308; // smallest normal double

export interface Mismatch {
  label: string;
  input: unknown;
  got: number;
  expected: number;
  diff: number;
  tol: number;
}

/** Relative tolerance k·ε·|expected|; below the normal range an absolute floor of DBL_MIN. */
export function relTol(k: number, expected: number): number {
  return Math.max(k * EPS * Math.abs(expected), DBL_MIN);
}

export function describeMismatch(m: Mismatch): string {
  return (
    `${m.label}: input ${JSON.stringify(m.input)} → result ${m.got}, expected ${m.expected}, ` +
    `difference ${m.diff.toExponential(3)}, tolerance ${m.tol.toExponential(3)}`
  );
}

/** Collects mismatches so one failing test reports every bad case (up to `max`), not just the first. */
export class MismatchLog {
  readonly items: Mismatch[] = [];
  worstRatio = 0;
  check(label: string, input: unknown, got: number, expected: number, tol: number): void {
    const diff = Math.abs(got - expected);
    const ok = got === expected || diff <= tol; // equal infinities pass; NaN never passes
    if (Number.isFinite(diff) && tol > 0) this.worstRatio = Math.max(this.worstRatio, diff / tol);
    if (!ok) this.items.push({ label, input, got, expected, diff, tol });
  }
  assertNone(max = 20): void {
    const text = this.items.slice(0, max).map(describeMismatch).join('\n');
    const more = this.items.length > max ? `\n… and ${this.items.length - max} more` : '';
    expect(this.items.length, `${this.items.length} mismatches:\n${text}${more}`).toBe(0);
  }
}

/** Single check with the standard message. */
export function expectWithin(label: string, input: unknown, got: number, expected: number, tol: number): void {
  const log = new MismatchLog();
  log.check(label, input, got, expected, tol);
  log.assertNone();
}

/**
 * Seeded generator: xoshiro128** (Blackman & Vigna 2018) seeded through splitmix32; uniform()
 * returns a double in [0, 1) with 53 random bits.
 */
export class Prng {
  private s = new Uint32Array(4);
  constructor(seed: number) {
    let z = seed >>> 0;
    for (let i = 0; i < 4; i++) {
      z = (z + 0x9e3779b9) >>> 0;
      let t = z;
      t = Math.imul(t ^ (t >>> 16), 0x85ebca6b) >>> 0;
      t = Math.imul(t ^ (t >>> 13), 0xc2b2ae35) >>> 0;
      this.s[i] = (t ^ (t >>> 16)) >>> 0;
    }
  }
  nextU32(): number {
    const s = this.s;
    const result = Math.imul(rotl(Math.imul(s[1], 5) >>> 0, 7), 9) >>> 0;
    const t = (s[1] << 9) >>> 0;
    s[2] ^= s[0];
    s[3] ^= s[1];
    s[1] ^= s[2];
    s[0] ^= s[3];
    s[2] ^= t;
    s[3] = rotl(s[3], 11);
    return result;
  }
  uniform(): number {
    const hi = this.nextU32() >>> 5; // 27 bits
    const lo = this.nextU32() >>> 6; // 26 bits
    return (hi * 67108864 + lo) / 9007199254740992;
  }
  /** standard normal by Box–Muller */
  normal(): number {
    let u = this.uniform();
    while (u === 0) u = this.uniform();
    return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * this.uniform());
  }
  between(a: number, b: number): number {
    return a + (b - a) * this.uniform();
  }
  logBetween(a: number, b: number): number {
    return Math.exp(this.between(Math.log(a), Math.log(b)));
  }
  pick<T>(items: readonly T[]): T {
    return items[Math.floor(this.uniform() * items.length)];
  }
}

function rotl(x: number, k: number): number {
  return ((x << k) | (x >>> (32 - k))) >>> 0;
}
