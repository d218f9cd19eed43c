/**
 * `npm run bench`: throughput of the transport engine, printed from one run.
 *
 * Figures (cells per second, median of repetitions, ≥ 0.5 s of repetitions each, the JS ones in
 * interleaved rounds so their ratios see the same machine load; see timing.ts):
 *   - a bare loop of erf (src/core/special/erf.ts) over the very arguments the Domenico grid's
 *     lateral factor passes to it: the machine's unit of work;
 *   - domenicoGrid, 512 × 512, with y values mirrored about the axis (as a map grid centred on the
 *     plume is) and with y values that mirror nothing;
 *   - patchSourceExactGrid, 64 × 64, at its stated accuracy (relTol 1e-6);
 *   - breakthroughCurve, 10 wells × 500 times, Domenico and exact models;
 * each also as erf-times per cell (seconds per cell / seconds per erf call). Beside them the same
 * grids evaluated by bench/numpy_grids.py (vectorised numpy/scipy, run as a child process) and the
 * ratio JS/numpy, with the agreement of the JS grids with numpy's and numpy's own accuracy check.
 * Then the contour pipeline (bench/contourPipeline.ts), the Monte Carlo screening (bench/monteCarlo.ts)
 * and the particle walk (bench/particles.ts), each beside its numpy peer. Targets are printed with
 * whether they are met.
 * Beside the contract grid (a fresh result array per call) the mirrored Domenico grid is also timed
 * into a reused buffer, as the app's plume worker computes it, so the cost of the allocation shows.
 * The lateral rows of evenly spaced y values come from the lattice error function (src/core/lattice).
 *
 * Memory allocator: `npm run bench` starts this script (and so the numpy child, which inherits the
 * environment) with glibc's MALLOC_TRIM_THRESHOLD_, MALLOC_TOP_PAD_ and MALLOC_MMAP_THRESHOLD_
 * raised to 256 MiB / 64 MiB / 256 MiB. With glibc's defaults a freed 2 MB result array goes back
 * to the operating system and the next one is faulted in page by page; on these virtual machines
 * that cost more than the grid itself (measured 2026-12-02: 6.3 ms per 512² grid against 1.4 ms
 * into a reused buffer, while numpy, whose arrays are freed at once and reused, was unaffected).
 * The header line "allocator" says which settings a run had.
 * Options: --no-numpy (JS figures only), --python <command>
 * (python3 by default), --json <file> (also write every figure as JSON), --only montecarlo (the
 * Monte Carlo section alone, with its numpy peer: `npm run bench:engine -- --only montecarlo`;
 * --only particles: the particle walk alone, with its numpy peer, bench/particles.ts).
 * Nothing here asserts on time; tests never do.
 */
import { cpus, loadavg } from 'node:os';
import { writeFileSync } from 'node:fs';
import { erf } from '../src/core/special/erf';
import { breakthroughCurve, domenicoGrid, patchSourceExactGrid } from '../src/core/index';
import type { ScreeningModel } from '../src/core/model';
import { DEFAULT_RULES, batched, localTimer, pairedRatio, sumOf, timeRounds, type Result, type Timer, type Timing } from './timing';
import { NumpyProcess, type NumpyInfo, type NumpyGrid } from './numpyRunner';
import { ratio, sci, seconds, si, table, targetTable, type Target } from './report';
import { AX, AY, AZ, DECAY, R, T, THICKNESS, V, WIDTH, Z, benchModel, benchTimes, benchWells, gridXs, gridYs } from './scenario';
import { measureContourPipeline } from './contourPipeline';
import { measureMonteCarlo } from './monteCarlo';
import { measureParticles } from './particles';
import { relativeGrid } from '../src/core/transport';

const REL_TOL = 1e-6;
const ABS_TOL = 1e-13;
const FLOOR = 1e-12;

interface Figure {
  readonly label: string;
  readonly cells: number;
  readonly timing: Timing;
  readonly cellsPerSecond: number;
  /** seconds per cell / seconds per erf call */
  readonly erfTimesPerCell: number;
}

function argValue(name: string): string | undefined {
  const k = process.argv.indexOf(name);
  return k >= 0 ? process.argv[k + 1] : undefined;
}

/** The arguments erf receives in the Domenico grid's lateral factor: (y ± W/2)/(2√(αy x)). */
function lateralArguments(xs: Float64Array, ys: Float64Array): Float64Array {
  const args = new Float64Array(2 * xs.length * ys.length);
  let k = 0;
  for (let i = 0; i < xs.length; i++) {
    const s = 2 * Math.sqrt(AY * xs[i]);
    for (let j = 0; j < ys.length; j++) {
      args[k++] = (ys[j] + WIDTH / 2) / s;
      args[k++] = (ys[j] - WIDTH / 2) / s;
    }
  }
  return args;
}

async function main(): Promise<void> {
  const withNumpy = !process.argv.includes('--no-numpy');
  const jsonPath = argValue('--json');
  const rules = DEFAULT_RULES;
  const started = performance.now();
  const phases: [string, number][] = [];
  let phaseStart = started;
  const phase = (name: string) => {
    const t = performance.now();
    phases.push([name, (t - phaseStart) / 1000]);
    phaseStart = t;
  };
  console.log('Downgradient benchmark: transport engine throughput');
  console.log(`node ${process.version}, ${cpus()[0]?.model ?? 'unknown CPU'} (${cpus().length} cores; all figures single-threaded)`);
  const loadAtStart = loadavg()[0];
  const mallocVars = ['MALLOC_TRIM_THRESHOLD_', 'MALLOC_TOP_PAD_', 'MALLOC_MMAP_THRESHOLD_'].filter((k) => process.env[k] !== undefined);
  console.log(`allocator: ${mallocVars.length ? mallocVars.map((k) => `${k}=${process.env[k]}`).join(' ') : "glibc's defaults"} (see bench/bench.ts)`);
  console.log(
    `timing: median of ≥ ${rules.minReps} repetitions and ≥ ${rules.minSeconds} s per figure after ${rules.warmupSeconds} s warm-up; JS and numpy repetitions interleaved in rounds; inputs built before the clock`,
  );
  console.log(
    `scenario (invented): v = ${V} m/d, R = ${R}, αx/αy/αz = ${AX}/${AY}/${AZ} m, half-life 730 d, source ${WIDTH} m × ${THICKNESS} m, z = ${Z} m, t = ${T} d\n`,
  );

  if (argValue('--only') === 'montecarlo') {
    console.log(targetTable(await measureMonteCarlo({ withNumpy, python: argValue('--python') ?? 'python3' })));
    return;
  }
  if (argValue('--only') === 'particles') {
    console.log(targetTable(await measureParticles({ withNumpy, python: argValue('--python') ?? 'python3' })));
    return;
  }

  // ---- inputs, all built before any clock starts
  const base = { z: Z, t: T, v: V, ax: AX, ay: AY, az: AZ, width: WIDTH, thickness: THICKNESS, R, decay: DECAY };
  const dXs = gridXs(512);
  const dYsSym = gridYs(512, true);
  const dYsAsym = gridYs(512, false);
  const eXs = gridXs(64);
  const eYs = gridYs(64, true);
  const erfArgs = lateralArguments(dXs, dYsAsym);
  const wells = benchWells();
  const times = benchTimes(500);
  const models: [string, ScreeningModel][] = [
    ['Domenico', benchModel('domenico')],
    ['exact', benchModel('exact')],
  ];
  const grids = {
    domSym: { ...base, xs: dXs, ys: dYsSym },
    domAsym: { ...base, xs: dXs, ys: dYsAsym },
    exact: { ...base, xs: eXs, ys: eYs },
  };

  // the mirrored grid again, into one buffer reused from call to call (relativeGrid gives C/C0)
  const intoModel = benchModel('domenico');
  const intoBuffer = new Float64Array(dXs.length * dYsSym.length);

  // ---- numpy: the same grids, with the JS results for the agreement check
  let numpy: { proc: NumpyProcess; info: NumpyInfo } | null = null;
  let numpyError: string | null = null;
  if (withNumpy) {
    const jsGrid = (label: string, p: typeof grids.domSym, values: Float64Array): NumpyGrid => ({ label, ...p, jsGrid: values });
    try {
      numpy = await NumpyProcess.start({
        relTol: REL_TOL,
        absTol: ABS_TOL,
        floor: FLOOR,
        domenico: [
          jsGrid('mirrored', grids.domSym, domenicoGrid(grids.domSym)),
          jsGrid('not mirrored', grids.domAsym, domenicoGrid(grids.domAsym)),
        ],
        exact: [jsGrid('mirrored', grids.exact, patchSourceExactGrid(grids.exact, { relTol: REL_TOL, absTol: ABS_TOL }))],
      }, argValue('--python'));
    } catch (e) {
      numpyError = (e as Error).message;
    }
  }

  // ---- the unit of work (a bare erf loop) and the figures, timed in interleaved rounds so the
  // erf-times-per-cell ratios see the same machine load
  const erfLoop = () => {
    let s = 0;
    for (let k = 0; k < erfArgs.length; k++) s += erf(erfArgs[k]);
    return s;
  };
  const curves = (model: ScreeningModel) => () => {
    let s = 0;
    for (const w of wells) s += sumOf(breakthroughCurve(model, w, times));
    return s;
  };
  // fast computations are batched to ≥ 30 ms per repetition so that every round stays short
  const local = (run: () => Result) => batched((calls) => localTimer(run, calls));
  const remote = (name: string) => batched((calls) => numpy!.proc.timer(name, calls));
  phase('numpy start and checks');
  const npTimers: Record<string, Timer> = numpy
    ? {
        npErf: await remote('erf'),
        npDomSym: await remote('domenico:0'),
        npDomAsym: await remote('domenico:1'),
        npExact: await remote('exact:0'),
      }
    : {};
  const timed: Record<string, Timing> = await timeRounds(
    {
      erf: await local(erfLoop),
      domSym: await local(() => domenicoGrid(grids.domSym)),
      domAsym: await local(() => domenicoGrid(grids.domAsym)),
      domSymInto: await local(() => {
        relativeGrid(intoModel, 'domenico', dXs, dYsSym, { zTop: Z, zBottom: Z }, T, intoBuffer);
        return intoBuffer;
      }),
      exact: await local(() => patchSourceExactGrid(grids.exact, { relTol: REL_TOL, absTol: ABS_TOL })),
      btcDomenico: await local(curves(models[0][1])),
      ...npTimers,
    },
    rules,
  );
  phase('grids, erf and Domenico curves (interleaved, with numpy)');
  // seconds per repetition for the exact model's curves: three repetitions make its median
  // (each round pairs them with ≥ 0.2 s of the erf loop, so three rounds cover its 0.5 s too)
  const slow = await timeRounds(
    { erf: await batched((calls) => localTimer(erfLoop, calls), 0.2), btcExact: localTimer(curves(models[1][1])) },
    { ...rules, minReps: 3, warmupSeconds: 0 },
  );
  const erfTiming = timed.erf;
  const erfPerSecond = erfArgs.length / erfTiming.medianSeconds;
  const figure = (label: string, cells: number, timing: Timing, erfPair: Timing): Figure => ({
    label,
    cells,
    timing,
    cellsPerSecond: cells / timing.medianSeconds,
    erfTimesPerCell: (pairedRatio(timing, erfPair) * erfArgs.length) / cells,
  });
  const domSym = figure('Domenico grid 512×512, y mirrored', dXs.length * dYsSym.length, timed.domSym, timed.erf);
  const domAsym = figure('Domenico grid 512×512, y not mirrored', dXs.length * dYsAsym.length, timed.domAsym, timed.erf);
  const domInto = figure('  the same mirrored, into a reused buffer', dXs.length * dYsSym.length, timed.domSymInto, timed.erf);
  const exact = figure(`exact grid 64×64 (relTol ${REL_TOL.toExponential(0)}), y mirrored`, eXs.length * eYs.length, timed.exact, timed.erf);
  const nValues = wells.length * times.length;
  const btc = [
    figure(`breakthrough ${wells.length} wells × ${times.length} times, ${models[0][0]}`, nValues, timed.btcDomenico, timed.erf),
    figure(`breakthrough ${wells.length} wells × ${times.length} times, ${models[1][0]}`, nValues, slow.btcExact, slow.erf),
  ];

  phase('exact curves');
  await numpy?.proc.stop();
  const np = numpy?.info ?? null;
  const npTiming = (key: string) => (np ? timed[key] : undefined);
  // JS/numpy as the paired ratio over rounds (numpy seconds / JS seconds, per cell alike)
  const npFigures = [npTiming('npDomSym'), npTiming('npDomAsym'), npTiming('npExact')].map((t, k) => {
    if (!t) return null;
    const js = [domSym, domAsym, exact][k];
    return { timing: t, cellsPerSecond: js.cells / t.medianSeconds, jsOverNumpy: pairedRatio(t, js.timing) };
  });

  // ---- contour pipeline (issue 3)
  const contour = await measureContourPipeline(benchModel('domenico'), { n: 256, z: Z, t: T, rules });

  phase('contour pipeline');

  // ---- print
  const spread = (t: { minSeconds: number; maxSeconds: number; medianSeconds: number }) =>
    `${((100 * (t.maxSeconds - t.minSeconds)) / t.medianSeconds).toFixed(0)} %`;
  const rows = [domSym, domAsym, exact].map((f, k) => {
    const n = npFigures[k];
    return [
      f.label,
      `${si(f.cellsPerSecond)}cells/s`,
      seconds(f.timing.medianSeconds),
      spread(f.timing),
      `${f.erfTimesPerCell.toFixed(2)}`,
      n ? `${si(n.cellsPerSecond)}cells/s` : '—',
      n ? spread(n.timing) : '',
      n ? ratio(n.jsOverNumpy) : '—',
    ];
  });
  rows.splice(2, 0, [domInto.label, `${si(domInto.cellsPerSecond)}cells/s`, seconds(domInto.timing.medianSeconds), spread(domInto.timing), domInto.erfTimesPerCell.toFixed(2), '', '', '']);
  for (const f of btc) {
    rows.push([f.label, `${si(f.cellsPerSecond)}values/s`, seconds(f.timing.medianSeconds), spread(f.timing), f.erfTimesPerCell.toFixed(2), '', '', '']);
  }
  console.log(`bare erf loop: ${si(erfPerSecond)}calls/s (${seconds(erfTiming.medianSeconds)} per ${erfArgs.length} calls on the Domenico grid's own arguments)\n`);
  console.log(table(['figure', 'JS rate', 'JS median', 'spread', 'erf-times/cell', 'numpy rate', 'spread', 'JS/numpy'], rows));
  console.log(
    `(JS/numpy and erf-times/cell: medians over rounds of the ratio within each round; spread: (slowest − fastest repetition)/median; load average ${loadAtStart.toFixed(1)} at the start, ${loadavg()[0].toFixed(1)} at the end on ${cpus().length} cores — other work on the machine moves the figures, compare ratios from one run)\n`,
  );

  if (numpyError) console.log(`numpy comparison not run: ${numpyError}\n`);
  if (np) {
    const e = np.exact[0];
    const npErfPerSecond = np.erfCalls / timed.npErf.medianSeconds;
    const jsErfOverScipy = (pairedRatio(timed.npErf, timed.erf) * erfArgs.length) / np.erfCalls;
    console.log(`numpy ${np.numpy}, scipy ${np.scipy}, python ${np.python} (bench/numpy_grids.py, one thread)`);
    console.log(
      `  scipy.special.erf on the same ${np.erfCalls} arguments: ${si(npErfPerSecond)}calls/s; JS erf / scipy erf = ${ratio(jsErfOverScipy)} (rate ratio, paired over rounds)`,
    );
    console.log(
      `  exact grid in numpy: ${e.nodes}-point Gauss–Legendre per column; against a ${e.fineNodes}-point rule: column-relative error ${sci(e.achievedRelError)} (wanted ≤ ${REL_TOL.toExponential(0)}), cell-relative ${sci(e.achievedCellRelError)} (floor ${FLOOR})`,
    );
    console.log(`  numpy's integral with a whole-plane source vs the Ogata–Banks closed form: ${sci(e.ogataBanksCheck)} (cell-relative)`);
    console.log(
      `  JS vs numpy, whole grids: Domenico mirrored ${sci(np.domenico[0].jsVsNumpyCellRel)}, not mirrored ${sci(np.domenico[1].jsVsNumpyCellRel)} (cell-relative, floor ${FLOOR});`,
    );
    console.log(
      `  exact ${sci(e.jsVsFineColumnRel)} column-relative, ${sci(e.jsVsFineCellRel)} cell-relative (JS at relTol ${REL_TOL.toExponential(0)} vs numpy's ${e.fineNodes}-point rule)\n`,
    );
  }

  console.log(
    `contour pipeline, ${contour.n}×${contour.n} Domenico grid, ${contour.thresholds.length} thresholds (${contour.thresholds.map((t) => `${t}`).join(', ')} mg/L):`,
  );
  console.log(
    `  concentrationGrid ${seconds(contour.compute.medianSeconds)}; + contourBands ${seconds(contour.total.medianSeconds)}; (compute + contour)/compute = ${ratio(contour.ratio)}; ${contour.rings} rings\n`,
  );

  const npRatio = (k: number) => npFigures[k]?.jsOverNumpy ?? null;
  const targets: Target[] = [
    { name: 'Domenico grid vs numpy (mirrored)', wanted: '≥ 3×', measured: ratio(npRatio(0) ?? NaN), met: npRatio(0) === null ? null : npRatio(0)! >= 3 },
    { name: 'Domenico grid vs numpy (not mirrored)', wanted: '≥ 3×', measured: ratio(npRatio(1) ?? NaN), met: npRatio(1) === null ? null : npRatio(1)! >= 3 },
    { name: `exact grid vs numpy at relTol ${REL_TOL.toExponential(0)}`, wanted: '≥ 5×', measured: ratio(npRatio(2) ?? NaN), met: npRatio(2) === null ? null : npRatio(2)! >= 5 },
    { name: 'Domenico grid cost (mirrored)', wanted: '≤ 2 erf-times/cell', measured: domSym.erfTimesPerCell.toFixed(2), met: domSym.erfTimesPerCell <= 2 },
    { name: 'Domenico grid cost (not mirrored)', wanted: '≤ 2 erf-times/cell', measured: domAsym.erfTimesPerCell.toFixed(2), met: domAsym.erfTimesPerCell <= 2 },
  ];
  targets.push(...(await measureMonteCarlo({ withNumpy, python: argValue('--python') ?? 'python3' })));
  phase('Monte Carlo');
  targets.push(...(await measureParticles({ withNumpy, python: argValue('--python') ?? 'python3' })));
  phase('particles');
  console.log('');
  console.log(targetTable(targets));

  const sink =
    Object.values(timed).reduce((s, t) => s + t.sink, 0) +
    slow.erf.sink +
    slow.btcExact.sink +
    contour.compute.sink +
    contour.total.sink;
  console.log(`\nsink (every result feeds it, so nothing is optimised away): ${sink}`);
  console.log(
    `bench ran in ${((performance.now() - started) / 1000).toFixed(1)} s (${phases.map(([n, t]) => `${n} ${t.toFixed(1)} s`).join('; ')})`,
  );

  if (jsonPath) {
    const out = { erfPerSecond, erf: erfTiming, figures: [domSym, domAsym, domInto, exact, ...btc], numpy: np, numpyTimings: npFigures, numpyError, contour, targets };
    writeFileSync(jsonPath, JSON.stringify(out, (_k, v: unknown) => (v === Infinity ? 'Infinity' : v), 2));
    console.log(`figures written to ${jsonPath}`);
  }
}

main().catch((e: unknown) => {
  console.error(e);
  process.exitCode = 1;
});
