/**
 * Latin hypercube sampling (McKay, Beckman & Conover 1979, "A comparison of three methods for
 * selecting values of input variables in the analysis of output from a computer code",
 * Technometrics 21(2), 239–245): the unit interval of each input is cut into `runs` equal strata;
 * each stratum is used by exactly one realisation, the pairing between inputs is a random
 * permutation per input, and the point within the stratum is uniform.
 *
 *   u(i, k) = (π_k(i) + w(i, k)) / runs
 *
 * π_k is a Fisher–Yates shuffle driven by the counter stream (seed, purpose 1, k, runs), so it
 * depends only on the seed, the run count and the input; w(i, k) in (0, 1) is the first double of
 * the stream (seed, purpose 2, k, i). Any worker can therefore compute realisation i alone, and a
 * run gives the same numbers whatever the number of workers (src/core/random.ts).
 * The shuffle draws an index as ⌊u·(j + 1)⌋ from a 53-bit u: its bias is below j·2⁻⁵³, far below
 * anything a run of at most 50 000 realisations can show.
 */
import { CounterStream, checkSeed, counterUniform } from '../random';
import { ValidationError } from '../validation';

export const PURPOSE_LHS_PERMUTATION = 1;
export const PURPOSE_LHS_POSITION = 2;
/** largest run count accepted */
export const MAX_RUNS = 50_000;

export function checkRuns(runs: unknown, field = 'runs'): number {
  if (typeof runs !== 'number' || !Number.isInteger(runs) || runs < 1 || runs > MAX_RUNS)
    throw new ValidationError(field, runs, `a whole number of realisations from 1 to ${MAX_RUNS}`);
  return runs;
}

/** π_k: the stratum of each realisation for input k (a permutation of 0 … runs − 1). */
export function stratumPermutation(seed: number, runs: number, input: number): Uint32Array {
  checkSeed(seed);
  checkRuns(runs);
  const perm = new Uint32Array(runs);
  for (let j = 0; j < runs; j++) perm[j] = j;
  const s = new CounterStream(seed, PURPOSE_LHS_PERMUTATION, input, runs);
  for (let j = runs - 1; j > 0; j--) {
    const r = Math.floor(s.next() * (j + 1));
    const t = perm[j];
    perm[j] = perm[r];
    perm[r] = t;
  }
  return perm;
}

const ONE_BELOW = 1 - 2 ** -53;

/**
 * A Latin hypercube design for `inputs` inputs: the permutations, made once per run (O(runs) per
 * input), and u(i, k) for any realisation i.
 */
export class LatinHypercube {
  private readonly perms: Uint32Array[];
  private readonly scratch = new Uint32Array(4);
  constructor(
    readonly seed: number,
    readonly runs: number,
    readonly inputs: number,
  ) {
    this.perms = Array.from({ length: inputs }, (_, k) => stratumPermutation(seed, runs, k));
  }

  /** the stratum of realisation i for input k */
  stratum(i: number, k: number): number {
    return this.perms[k][i];
  }

  /** u(i, k) in (0, 1) */
  uniform(i: number, k: number): number {
    if (!(Number.isInteger(i) && i >= 0 && i < this.runs)) throw new ValidationError('realisation', i, `a whole number in [0, ${this.runs})`);
    const w = counterUniform(this.seed, PURPOSE_LHS_POSITION, k, i, this.scratch);
    return Math.min(ONE_BELOW, (this.perms[k][i] + w) / this.runs);
  }

  /** all inputs of realisation i, into `out` */
  row(i: number, out: Float64Array = new Float64Array(this.inputs)): Float64Array {
    for (let k = 0; k < this.inputs; k++) out[k] = this.uniform(i, k);
    return out;
  }
}
