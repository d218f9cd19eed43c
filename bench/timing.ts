/**
 * Timing rules of `npm run bench` (STYLE: inputs built before the clock starts, results consumed
 * into a sink, at least `minSeconds` of repetitions per figure, the median reported).
 * Several computations are timed in interleaved rounds (each round runs every one once, in turn),
 * so a change in the machine's load during the run touches all of them alike and the ratios
 * between them stay fair. A timer may be remote (the numpy process timing its own repetition).
 * Nothing here asserts on time.
 */

export interface TimingRules {
  /** keep going until every computation's repetitions add up to at least this many seconds */
  readonly minSeconds: number;
  /** and until every computation was timed at least this many times */
  readonly minReps: number;
  /** untimed warm-up rounds (JIT) for at least this long, seconds; 0: none */
  readonly warmupSeconds: number;
}

export const DEFAULT_RULES: TimingRules = { minSeconds: 0.5, minReps: 7, warmupSeconds: 0.15 };

export interface Timing {
  /** median seconds of one call (a repetition may batch several calls) */
  readonly medianSeconds: number;
  readonly reps: number;
  /** fastest and slowest repetition, seconds per call: the spread of the figure */
  readonly minSeconds: number;
  readonly maxSeconds: number;
  /** sum of every result, printed so no result can be optimised away */
  readonly sink: number;
  /** seconds per call of each timed repetition, in round order (for paired ratios) */
  readonly perRound: readonly number[];
}

/** One timed repetition of `calls` calls: its seconds and a number summed from its results. */
export interface Sample {
  readonly seconds: number;
  readonly calls: number;
  readonly sink: number;
}

export type Timer = () => Sample | Promise<Sample>;

/** A timed call returns its result: an array (summed into the sink) or a number. */
export type Result = ArrayLike<number> | number;

export function median(values: readonly number[]): number {
  if (values.length === 0) throw new RangeError('median of no values');
  const s = [...values].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 === 1 ? s[m] : 0.5 * (s[m - 1] + s[m]);
}

/** Sum of an array (consumes a result). */
export function sumOf(values: ArrayLike<number>): number {
  let s = 0;
  for (let i = 0; i < values.length; i++) s += values[i];
  return s;
}

const now = (): number => performance.now() / 1000;

/**
 * Times `calls` calls of `run` in this process. The last result is summed whole after the clock
 * stops, and one element of every other result (a different one each call) inside the loop, so no
 * call can be skipped; results are not kept across calls, so a batch does not hold tens of MB of
 * grids alive and the garbage collector sees what the app would.
 */
export function localTimer(run: () => Result, calls = 1): Timer {
  return () => {
    let probe = 0;
    let last: Result = 0;
    const t0 = now();
    for (let c = 0; c < calls; c++) {
      last = run();
      probe += typeof last === 'number' ? last : last[(c * 7919) % last.length];
    }
    const seconds = now() - t0;
    const sink = probe + (typeof last === 'number' ? last : sumOf(last));
    return { seconds, calls, sink };
  };
}

/**
 * A timer whose repetition takes about `repSeconds`: fast computations are batched, so a round of
 * interleaved figures is not dictated by the fastest one. `make(calls)` builds the timer; the
 * batch is as many single calls as fit in `repSeconds` (after two untimed calls).
 */
export async function batched(make: (calls: number) => Timer, repSeconds = 0.03): Promise<Timer> {
  const single = make(1);
  await single();
  await single();
  let calls = 0;
  let elapsed = 0;
  while (elapsed < repSeconds) {
    elapsed += (await single()).seconds;
    calls++;
  }
  return make(Math.max(1, calls));
}

/** Interleaved rounds over `timers` (see the header); every round is complete. */
export async function timeRounds<K extends string>(timers: Record<K, Timer>, rules: TimingRules = DEFAULT_RULES): Promise<Record<K, Timing>> {
  const keys = Object.keys(timers) as K[];
  const sinks = new Map<K, number>(keys.map((k) => [k, 0]));
  const times = new Map<K, number[]>(keys.map((k) => [k, []]));
  const warmEnd = now() + rules.warmupSeconds;
  while (now() < warmEnd) for (const k of keys) sinks.set(k, sinks.get(k)! + (await timers[k]()).sink);
  const totals = new Map<K, number>(keys.map((k) => [k, 0]));
  const done = (k: K) => times.get(k)!.length >= rules.minReps && totals.get(k)! >= rules.minSeconds;
  while (!keys.every(done)) {
    for (const k of keys) {
      const s = await timers[k]();
      times.get(k)!.push(s.seconds / s.calls);
      totals.set(k, totals.get(k)! + s.seconds);
      sinks.set(k, sinks.get(k)! + s.sink);
    }
  }
  const out = {} as Record<K, Timing>;
  for (const k of keys) {
    const ts = times.get(k)!;
    out[k] = { medianSeconds: median(ts), reps: ts.length, minSeconds: Math.min(...ts), maxSeconds: Math.max(...ts), sink: sinks.get(k)!, perRound: ts };
  }
  return out;
}

/**
 * The ratio of two figures timed in the same rounds, as the median over rounds of the per-round
 * ratio a/b: each round's pair saw nearly the same machine load, so a load that changes during the
 * run cancels better than in the ratio of the two medians.
 */
export function pairedRatio(a: Timing, b: Timing): number {
  const n = Math.min(a.perRound.length, b.perRound.length);
  if (n === 0) throw new RangeError('no rounds to pair');
  const r: number[] = [];
  for (let i = 0; i < n; i++) r.push(a.perRound[i] / b.perRound[i]);
  return median(r);
}
