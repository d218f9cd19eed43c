/**
 * Timing rules of `npm run bench` (STYLE: inputs built before the clock starts, results consumed
 * into a sink, at least `minSeconds` of repetitions per figure, the median reported).
 * Pure apart from reading the clock; nothing here asserts on time.
 */

export interface TimingRules {
  /** keep repeating until the repetitions add up to at least this many seconds */
  readonly minSeconds: number;
  /** and until at least this many repetitions were timed */
  readonly minReps: number;
  /** untimed warm-up (JIT), seconds */
  readonly warmupSeconds: number;
}

export const DEFAULT_RULES: TimingRules = { minSeconds: 0.5, minReps: 7, warmupSeconds: 0.15 };

export interface Timing {
  /** median seconds of one repetition */
  readonly medianSeconds: number;
  readonly reps: number;
  /** smallest and largest repetition, seconds: the spread of the figure */
  readonly minSeconds: number;
  readonly maxSeconds: number;
  /** sum of values taken from every result, printed so no result can be optimised away */
  readonly sink: number;
}

export function median(values: readonly number[]): number {
  if (values.length === 0) throw new RangeError('median of no values');
  const s = [...values].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 === 1 ? s[m] : 0.5 * (s[m - 1] + s[m]);
}

/** Sum of a typed array (consumes a result); plain loop, its cost is outside the timed call. */
export function sumOf(values: ArrayLike<number>): number {
  let s = 0;
  for (let i = 0; i < values.length; i++) s += values[i];
  return s;
}

const now = (): number => performance.now() / 1000;

/** A timed call returns its result: an array (summed into the sink) or a number. */
export type Result = ArrayLike<number> | number;

function consume(r: Result): number {
  return typeof r === 'number' ? r : sumOf(r);
}

/**
 * Time `run`. Each result is summed into the sink after the clock stops, so the clock covers the
 * computation only and no result can be optimised away.
 */
export function timeFigure(run: () => Result, rules: TimingRules = DEFAULT_RULES): Timing {
  let sink = 0;
  const warmEnd = now() + rules.warmupSeconds;
  do sink += consume(run());
  while (now() < warmEnd);
  const times: number[] = [];
  let total = 0;
  while (total < rules.minSeconds || times.length < rules.minReps) {
    const t0 = now();
    const r = run();
    const dt = now() - t0;
    sink += consume(r);
    times.push(dt);
    total += dt;
  }
  return {
    medianSeconds: median(times),
    reps: times.length,
    minSeconds: Math.min(...times),
    maxSeconds: Math.max(...times),
    sink,
  };
}
