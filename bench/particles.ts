/**
 * The particle-tracking part of `npm run bench`: the random walk (src/core/particles/walk.ts) of
 * the riverside demo (a supply well pumping 800 m³/d beside a river drawn as a constant-head
 * line: one well, its image, one boundary line), 100,000 particles over the case's 10-year
 * horizon, planned as the app plans it (src/case/particles.ts caseWalk, with the density grid).
 * Figures:
 *   - particle steps per second per core and the time for the 100,000 particles in this thread;
 *   - the same with all cores (worker_threads, bench/particleWorker.ts, the app's interleaved
 *     subsets handed to whichever worker is free), with the time to the first picture: the first
 *     subset back and its figures and density contours computed, as the app publishes them;
 *   - bench/numpy_particles.py, the same walk vectorised in numpy (one thread, a child process),
 *     its time for the same particles and its steps per second; the ratio JS per core / numpy
 *     is the median of per-round ratios of the times (rounds alternate JS and numpy);
 *   - the agreement of the two: the walks use different random numbers, so they agree within
 *     their statistical errors, not bit for bit (the receptors' figures at the horizon as a
 *     difference in combined standard errors, the mass balance, the steps per particle).
 * Nothing here asserts on time.
 */
import type { Worker } from 'node:worker_threads';
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { cpus } from 'node:os';
import { fileURLToPath } from 'node:url';
import { parseCaseFile } from '../src/case/io';
import { prepareCase, type PreparedCase } from '../src/case/prepare';
import { prepareCaseWells } from '../src/case/wells';
import { caseWalk, particleDensity, particleFigures, particleGrid, subsetStride, PARTICLE_SUBSET } from '../src/case/particles';
import { emptyTally, mergeTally, scaledTally, walkParticles, type PreparedWalk, type WalkTally } from '../src/core';
import { contourBands } from '../src/geo/contours';
import { bandThresholds } from '../src/worker/compute';
import { median } from './timing';
import { startWorkers } from './workers';
import { ratio, seconds, si, table, type Target } from './report';

const root = (p: string) => fileURLToPath(new URL(`../${p}`, import.meta.url));
const CASE_FILE = 'riverside-supply-well.json';
const PARTICLES = 100_000;
const SEED = 20261203;

class ParticlePool {
  private constructor(private readonly workers: Worker[]) {}
  static async start(n: number, text: string): Promise<ParticlePool> {
    return new ParticlePool(await startWorkers('bench-particle-worker.mjs', n, { type: 'plan', text, particles: PARTICLES, seed: SEED }));
  }

  /**
   * The whole run as the app does it: subsets to whichever worker is free; `onFirst` is called
   * with the first tally back (the app's first picture). Wall-clock seconds to the end.
   */
  async run(walk: PreparedWalk, onFirst: (t: WalkTally) => void): Promise<{ seconds: number; firstSeconds: number; tally: WalkTally }> {
    const stride = subsetStride(PARTICLES);
    const total = emptyTally(walk);
    const t0 = performance.now();
    let firstSeconds = 0;
    let next = 0;
    let back = 0;
    await new Promise<void>((resolve, reject) => {
      const give = (w: Worker) => {
        if (next < stride) w.postMessage({ type: 'subset', offset: next++, stride });
      };
      for (const w of this.workers) {
        w.removeAllListeners('message');
        w.on('message', (m: { tally: WalkTally }) => {
          mergeTally(total, m.tally);
          back++;
          give(w);
          if (back === 1) {
            onFirst(total);
            firstSeconds = (performance.now() - t0) / 1000;
          }
          if (back === stride) resolve();
        });
        w.once('error', reject);
        give(w);
      }
    });
    return { seconds: (performance.now() - t0) / 1000, firstSeconds, tally: total };
  }

  async stop(): Promise<void> {
    await Promise.all(this.workers.map((w) => w.terminate()));
  }
}

interface NumpyWalk {
  seconds: number;
  steps: number;
  obsMass: number[];
  obsMass2: number[];
  wellMass: number[];
  wellMass2: number[];
  aquiferMass: number[];
  released: number;
  captured: number;
  outflow: number;
  decayed: number;
  stalled: number;
  numpy: string;
  python: string;
}

/** The prepared walk as plain numbers for bench/numpy_particles.py. */
function numpyPayload(walk: PreparedWalk, reps: number): string {
  const inp = walk.input;
  const f = inp.field;
  return JSON.stringify({
    field: {
      q0: f.q0,
      nB: f.nB,
      porosity: f.porosity,
      sx: Array.from(f.sx),
      sy: Array.from(f.sy),
      ss: Array.from(f.ss),
      sr2: Array.from(f.sr2),
      lines: f.lines.map((l) => ({ kind: l.kind, px: l.px, py: l.py, nx: l.nx, ny: l.ny })),
    },
    source: { width: inp.source.width, thickness: inp.source.thickness, c0: inp.source.c0, sourceDecay: inp.source.sourceDecay },
    activeEnd: walk.activeEnd,
    ax: inp.ax,
    ay: inp.ay,
    dm: walk.dm,
    R: inp.R,
    lam: walk.lam,
    eps: walk.eps,
    times: Array.from(walk.times),
    sinks: walk.sinks.map((s) => ({ x: s.x, y: s.y, rc: s.rc })),
    observers: inp.observers ?? [],
    grid: inp.grid ? { ...inp.grid, every: inp.grid.every ?? 1 } : null,
    particles: inp.particles,
    seed: inp.seed,
    reps,
  });
}

function numpyRun(python: string, payload: string): NumpyWalk {
  const r = spawnSync(python, [root('bench/numpy_particles.py')], {
    input: payload,
    encoding: 'utf8',
    maxBuffer: 64 << 20,
    env: { ...process.env, OMP_NUM_THREADS: '1', OPENBLAS_NUM_THREADS: '1', MKL_NUM_THREADS: '1' },
  });
  if (r.status !== 0) throw new Error(`numpy particle walk failed: ${r.stderr || r.error?.message}`);
  return JSON.parse(r.stdout) as NumpyWalk;
}

/** numpy's tally in the walk's own form (no density grid), so the case layer's figures read it. */
function tallyOf(walk: PreparedWalk, n: NumpyWalk): WalkTally {
  const t = emptyTally(walk);
  t.obsMass.set(n.obsMass);
  t.obsMass2.set(n.obsMass2);
  t.wellMass.set(n.wellMass);
  t.wellMass2.set(n.wellMass2);
  t.aquiferMass.set(n.aquiferMass);
  return { ...t, released: n.released, captured: n.captured, outflow: n.outflow, decayed: n.decayed, stalled: n.stalled, steps: n.steps, particlesDone: walk.input.particles };
}

/** What the app computes for a picture: figures of the particles so far and the density contours. */
function picture(p: PreparedCase, walk: PreparedWalk, pumping: Map<number, number>, total: WalkTally): number {
  const scaled = scaledTally(total, walk.input.particles / total.particlesDone);
  const figures = particleFigures(p, walk, scaled, pumping);
  const d = particleDensity(walk, scaled, p.horizon);
  const bands = contourBands({ values: d.values, xs: d.xs, ys: d.ys, thresholds: bandThresholds(p.limit, p.model.c0) });
  return figures.length + bands.length;
}

/** |a − b| in combined standard errors */
const zOf = (a: number, sa: number, b: number, sb: number) => (a === b ? 0 : Math.abs(a - b) / Math.hypot(sa, sb));

export async function measureParticles(opts: { withNumpy: boolean; python: string }): Promise<Target[]> {
  const cores = cpus().length;
  const text = readFileSync(root(`cases/${CASE_FILE}`), 'utf8');
  const parsed = parseCaseFile(text);
  if (!parsed.ok) throw new Error(parsed.errors.join('; '));
  const c = parsed.case;
  const p = prepareCase(c);
  const { walk, pumpingReceptors } = caseWalk(c, p, prepareCaseWells(c, p), { particles: PARTICLES, seed: SEED, grid: particleGrid(p) });
  const g = walk.input.grid!;
  console.log(
    `\nParticle tracking (random walk, src/core/particles/walk.ts): the riverside demo (${CASE_FILE}: one pumping well, its image across the river line), ${si(PARTICLES)}particles over the ${(p.horizon / 365.25).toPrecision(3)}-year horizon, ${walk.times.length} output times, ${g.nx}×${g.ny} density grid, seed ${SEED}`,
  );
  walkParticles(walk, 0, 2000, emptyTally(walk)); // warm-up (JIT), untimed
  const pool = await ParticlePool.start(cores, text);
  const payload = opts.withNumpy ? numpyPayload(walk, 1) : '';
  const rounds = 3;
  const one: number[] = [];
  const oneSteps: number[] = [];
  const all: number[] = [];
  const first: number[] = [];
  const np: NumpyWalk[] = [];
  const perRound: number[] = [];
  let numpyError: string | null = null;
  let js: WalkTally | null = null;
  let sink = 0;
  for (let r = 0; r < rounds; r++) {
    const tally = emptyTally(walk);
    const t0 = performance.now();
    walkParticles(walk, 0, PARTICLES, tally);
    const s = (performance.now() - t0) / 1000;
    one.push(s);
    oneSteps.push(tally.steps);
    js = tally;
    const a = await pool.run(walk, (t) => {
      sink += picture(p, walk, pumpingReceptors, t);
    });
    all.push(a.seconds);
    first.push(a.firstSeconds);
    sink += a.tally.steps;
    if (opts.withNumpy && !numpyError) {
      try {
        const n = numpyRun(opts.python, payload);
        np.push(n);
        perRound.push(n.seconds / s);
      } catch (e) {
        numpyError = (e as Error).message;
      }
    }
  }
  await pool.stop();
  const t1 = median(one);
  const steps = median(oneSteps);
  const rows = [
    ['JS, 1 thread', seconds(t1), si(steps), si(steps / t1), ''],
    [`JS, ${cores} workers (the app's pool: subsets of ${PARTICLE_SUBSET} handed to whichever is free)`, seconds(median(all)), '', si(steps / median(all)), seconds(median(first))],
  ];
  if (np.length) {
    const ns = median(np.map((n) => n.seconds));
    const nsteps = median(np.map((n) => n.steps));
    rows.push([`numpy ${np[0].numpy}, vectorised, 1 thread (python ${np[0].python})`, seconds(ns), si(nsteps), si(nsteps / ns), '']);
  }
  console.log(table([`${si(PARTICLES)}particles, riverside demo`, 'time', 'steps', 'steps/s', 'first picture'], rows));
  const npRatio = perRound.length ? median(perRound) : null;
  if (np.length && js) {
    const n = np[np.length - 1];
    const fj = particleFigures(p, walk, js, pumpingReceptors);
    const fn = particleFigures(p, walk, tallyOf(walk, n), pumpingReceptors);
    const last = walk.times.length - 1;
    const z = fj.map((f, i) =>
      `${p.receptors[i].name || p.receptors[i].id} ${f.concentrationAtHorizon.toPrecision(3)} ± ${f.standardError.toPrecision(2)} (JS) vs ${fn[i].concentrationAtHorizon.toPrecision(3)} ± ${fn[i].standardError.toPrecision(2)} (numpy) mg/L, ${zOf(f.c[last], f.se[last], fn[i].c[last], fn[i].se[last]).toFixed(1)} SE apart`,
    );
    const rel = (a: number, b: number) => (a === b ? 0 : Math.abs(a - b) / Math.max(Math.abs(a), Math.abs(b)));
    console.log(`JS per core against numpy: ${ratio(npRatio!)} (median of per-round ratios, numpy time / JS time for the same ${si(PARTICLES)}particles)`);
    console.log(`agreement (different random numbers, so within the statistical error): ${z.join('; ')}`);
    console.log(
      `  steps per particle ${(js.steps / PARTICLES).toFixed(2)} (JS) vs ${(n.steps / PARTICLES).toFixed(2)} (numpy); mass captured/released ${(js.captured / js.released).toFixed(4)} vs ${(n.captured / n.released).toFixed(4)}, out to the river ${(js.outflow / js.released).toFixed(4)} vs ${(n.outflow / n.released).toFixed(4)}; released ${rel(js.released, n.released).toExponential(1)} apart (relative)`,
    );
  } else if (numpyError) console.log(`numpy particle walk not run: ${numpyError}`);
  console.log(`(particle sink ${sink})`);
  const firstPicture = median(first);
  return [
    { name: 'Particle walk per core vs numpy', wanted: '≥ 2×', measured: npRatio === null ? '—' : ratio(npRatio), met: npRatio === null ? null : npRatio >= 2 },
    { name: `${si(PARTICLES)}particles, all cores: first picture`, wanted: 'within a second or two (≤ 2 s)', measured: seconds(firstPicture), met: firstPicture <= 2 },
  ];
}
