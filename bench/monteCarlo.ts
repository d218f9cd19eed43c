/**
 * The Monte Carlo part of `npm run bench`: realisations per second per core for the demo cases
 * that carry distributions (Domenico and exact), the speed-up from one worker to all cores
 * (worker_threads, each worker computing its own range of realisations as the app's web workers
 * do), the time for 10,000 realisations of a four-receptor case, and beside it a vectorised
 * numpy/scipy Monte Carlo of the same realisations and receptors (bench/numpy_montecarlo.py, a
 * child process; single-threaded, so compared with one JS worker, per core).
 *
 * The four-receptor case is the fuel-release demo with two receptors added for the benchmark (a
 * property line and a ditch, invented positions). The JS and numpy repetitions alternate in rounds
 * and the ratio is the median of per-round ratios. Nothing here asserts on time.
 */
import type { Worker } from 'node:worker_threads';
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { cpus } from 'node:os';
import { fileURLToPath } from 'node:url';
import { parseCaseFile } from '../src/case/io';
import type { Case } from '../src/case/schema';
import { designOf, joinBlocks, planUncertainty, realisationModel, realisationValues, runRealisations, type RealisationBlock } from '../src/case/uncertainty';
import { median } from './timing';
import { startWorkers } from './workers';
import { ratio, seconds, si, table, type Target } from './report';

const root = (p: string) => fileURLToPath(new URL(`../${p}`, import.meta.url));
const loadCase = (f: string): Case => {
  const r = parseCaseFile(readFileSync(root(`cases/${f}`), 'utf8'));
  if (!r.ok) throw new Error(r.errors.join('; '));
  return r.case;
};

/** The fuel demo with two more receptors, for the four-receptor figure (invented positions). */
export function fourReceptorCase(): Case {
  const c = loadCase('fuel-release-farm-well.json');
  const extra = (id: string, name: string, kind: 'property-line' | 'surface-water', position: [number, number]) => ({
    id,
    name,
    kind,
    position,
    screenTop: { value: 0, unit: 'm' },
    screenBottom: { value: 0, unit: 'm' },
    pumping: false,
    pumpingRate: null,
  });
  return {
    ...c,
    site: {
      ...c.site,
      receptors: [...c.site.receptors, extra('bench-line', 'Property line (bench)', 'property-line', [-2.72893, 52.41254]), extra('bench-ditch', 'Ditch (bench)', 'surface-water', [-2.72685, 52.41225])],
    },
  };
}

const withSolution = (c: Case, solution: 'domenico' | 'exact'): Case => ({ ...c, evaluation: { ...c.evaluation, solution } });

function timeSingle(c: Case, runs: number, reps: number): { perSecond: number; evalsPerSecond: number; receptors: number } {
  const plan = planUncertainty(c, { runs });
  const lhs = designOf(plan);
  runRealisations(plan, 0, Math.min(20, runs), lhs);
  const times: number[] = [];
  let sink = 0;
  for (let r = 0; r < reps; r++) {
    const t0 = performance.now();
    const b = runRealisations(plan, 0, runs, lhs);
    times.push((performance.now() - t0) / 1000);
    sink += b.peak[0] || 0;
  }
  const s = median(times);
  const receptors = plan.prepared.receptors.length;
  return { perSecond: runs / s + 0 * sink, evalsPerSecond: (runs * receptors) / s, receptors };
}

class Pool {
  private constructor(private readonly workers: Worker[]) {}
  static async start(n: number, text: string, runs: number, seed: number): Promise<Pool> {
    return new Pool(await startWorkers('bench-mc-worker.mjs', n, { type: 'init', text, runs, seed }));
  }
  /** realisations [0, runs) split in equal ranges over the first `use` workers; wall-clock seconds */
  async run(runs: number, use: number): Promise<{ seconds: number; blocks: RealisationBlock[] }> {
    const t0 = performance.now();
    const blocks = await Promise.all(
      this.workers.slice(0, use).map(
        (w, k) =>
          new Promise<RealisationBlock>((resolve, reject) => {
            w.once('message', (m: { block: RealisationBlock }) => resolve(m.block));
            w.once('error', reject);
            w.postMessage({ type: 'run', from: Math.floor((k * runs) / use), to: Math.floor(((k + 1) * runs) / use) });
          }),
      ),
    );
    return { seconds: (performance.now() - t0) / 1000, blocks };
  }
  async stop(): Promise<void> {
    await Promise.all(this.workers.map((w) => w.terminate()));
  }
}

interface NumpyMc {
  seconds: number;
  atHorizonMaxRel: number;
  arrivalMaxAbsDays: number;
  exceedMismatch: number;
  exceeding: number;
  numpy: string;
  scipy: string;
}

function numpyRun(python: string, payload: string): NumpyMc {
  const r = spawnSync(python, [root('bench/numpy_montecarlo.py')], { input: payload, encoding: 'utf8', maxBuffer: 64 << 20 });
  if (r.status !== 0) throw new Error(`numpy Monte Carlo failed: ${r.stderr || r.error?.message}`);
  return JSON.parse(r.stdout) as NumpyMc;
}

export async function measureMonteCarlo(opts: { withNumpy: boolean; python: string }): Promise<Target[]> {
  const cores = cpus().length;
  console.log('\nMonte Carlo screening (Latin hypercube realisations, src/case/uncertainty.ts)');

  // ---- per core, in this thread
  const rows: string[][] = [];
  for (const [file, label] of [
    ['fuel-release-farm-well.json', 'fuel release (2 receptors)'],
    ['nitrate-field-supply.json', 'nitrate field (2 receptors, head fit)'],
  ] as const) {
    for (const solution of ['domenico', 'exact'] as const) {
      const runs = solution === 'domenico' ? 2000 : 200;
      const f = timeSingle(withSolution(loadCase(file), solution), runs, 3);
      rows.push([label, solution, String(runs), si(f.perSecond), si(f.evalsPerSecond)]);
    }
  }
  console.log(table(['case', 'solution', 'runs', 'realisations/s per core', 'receptor evaluations/s'], rows));

  // ---- 10,000 realisations of the four-receptor case: 1 worker against all, and numpy
  const runs = 10_000;
  const seed = 20261203;
  const c4 = fourReceptorCase();
  const text = JSON.stringify(c4);
  const pool = await Pool.start(cores, text, runs, seed);
  const plan = planUncertainty(c4, { runs, seed });
  let payload: string | null = null;
  const rounds = 3;
  const one: number[] = [];
  const all: number[] = [];
  const np: NumpyMc[] = [];
  const perRound: number[] = [];
  let numpyError: string | null = null;
  for (let r = 0; r < rounds; r++) {
    const a = await pool.run(runs, 1);
    one.push(a.seconds);
    const b = await pool.run(runs, cores);
    all.push(b.seconds);
    if (opts.withNumpy && !numpyError) {
      if (!payload) payload = numpyPayload(plan, joinBlocks(plan, a.blocks));
      try {
        const n = numpyRun(opts.python, payload);
        np.push(n);
        perRound.push(n.seconds / a.seconds);
      } catch (e) {
        numpyError = (e as Error).message;
      }
    }
  }
  await pool.stop();
  const t1 = median(one);
  const tAll = median(all);
  console.log(
    table(
      ['10,000 realisations, 4 receptors, Domenico', 'time', 'realisations/s'],
      [
        ['1 worker', seconds(t1), si(runs / t1)],
        [`${cores} workers (all cores)`, seconds(tAll), si(runs / tAll)],
        ...(np.length ? [[`numpy/scipy, vectorised, 1 thread (numpy ${np[0].numpy}, scipy ${np[0].scipy})`, seconds(median(np.map((n) => n.seconds))), si(runs / median(np.map((n) => n.seconds)))]] : []),
      ],
    ),
  );
  console.log(`speed-up 1 → ${cores} workers: ${ratio(t1 / tAll)}`);
  const npRatio = perRound.length ? median(perRound) : null;
  if (np.length) {
    const n = np[0];
    console.log(
      `JS per core against numpy: ${ratio(npRatio!)} (median of per-round ratios, numpy time / one JS worker's); agreement: concentration at the horizon within ${n.atHorizonMaxRel.toExponential(1)} relative, arrival within ${n.arrivalMaxAbsDays.toExponential(1)} d, ${n.exceedMismatch} of ${runs * 4} exceedance verdicts differ (${n.exceeding} exceed)`,
    );
  } else if (numpyError) console.log(`numpy Monte Carlo not run: ${numpyError}`);
  return [
    { name: 'Monte Carlo, Domenico, per core vs numpy', wanted: '≥ 2×', measured: npRatio === null ? '—' : ratio(npRatio), met: npRatio === null ? null : npRatio >= 2 },
    { name: '10,000 realisations × 4 receptors, all cores', wanted: 'before a user loses patience (≤ 10 s)', measured: seconds(tAll), met: tAll <= 10 },
  ];
}

/** Every realisation's model and receptor positions, with the JS results, for numpy. */
function numpyPayload(plan: ReturnType<typeof planUncertainty>, js: RealisationBlock): string {
  const lhs = designOf(plan);
  const keys = ['v', 'R', 'ax', 'ay', 'az', 'decay', 'c0', 'width', 'thickness'] as const;
  const models: Record<string, number[]> = Object.fromEntries(keys.map((k) => [k, []]));
  const receptors: Record<string, number[]> = { x: [], y: [], zTop: [], zBottom: [] };
  for (let i = 0; i < plan.runs; i++) {
    const { model, receptors: rs } = realisationModel(plan, realisationValues(plan, lhs, i));
    for (const k of keys) models[k].push(model[k]);
    for (const r of rs) {
      receptors.x.push(r.x);
      receptors.y.push(r.y);
      receptors.zTop.push(r.zTop);
      receptors.zBottom.push(r.zBottom);
    }
  }
  return JSON.stringify({
    limit: plan.prepared.limit,
    horizon: plan.prepared.horizon,
    reps: 1,
    receptorsPerRealisation: plan.prepared.receptors.length,
    models,
    receptors,
    js: { atHorizon: Array.from(js.atHorizon), arrival: Array.from(js.arrival, (t) => (Number.isFinite(t) ? t : null)) },
  });
}
