/**
 * Runs bench/numpy_grids.py as a child process: writes the grid parameters (and the whole JS
 * results) as JSON to its stdin, reads its JSON answer from stdout. The script times its own
 * vectorised evaluation with the same rules as the JS side.
 */
import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import type { TimingRules } from './timing';

export interface GridParams {
  readonly xs: ArrayLike<number>;
  readonly ys: ArrayLike<number>;
  readonly z: number;
  readonly t: number;
  readonly v: number;
  readonly ax: number;
  readonly ay: number;
  readonly az: number;
  readonly width: number;
  readonly thickness: number;
  readonly R: number;
  readonly decay: number;
}

export interface NumpyDomenicoFigure {
  readonly label: string;
  readonly cells: number;
  readonly medianSeconds: number;
  readonly reps: number;
  readonly cellsPerSecond: number;
  /** the whole JS grid against numpy's: column-relative and cell-relative (null: none sent) */
  readonly jsVsNumpyColumnRel: number | null;
  readonly jsVsNumpyCellRel: number | null;
  readonly sink: number;
}

export interface NumpyExactFigure {
  readonly label: string;
  readonly cells: number;
  readonly medianSeconds: number;
  readonly reps: number;
  readonly cellsPerSecond: number;
  readonly sink: number;
  /** Gauss–Legendre nodes per column chosen for relTol, and the much finer rule checked against */
  readonly nodes: number;
  readonly fineNodes: number;
  /** column-relative error of the chosen rule against the fine rule (the JS grid's own measure) */
  readonly achievedRelError: number;
  /** cell-by-cell relative error of the chosen rule (C/C0 below floor counts as absolute) */
  readonly achievedCellRelError: number;
  readonly ladder: { nodes: number; relError: number; cellRelError: number }[];
  /** whole-plane source without decay against the Ogata–Banks closed form (cell-relative) */
  readonly ogataBanksCheck: number;
  /** the whole JS exact grid against the fine numpy rule: column-relative and cell-relative */
  readonly jsVsFineColumnRel: number | null;
  readonly jsVsFineCellRel: number | null;
}

export interface NumpyAnswer {
  readonly python: string;
  readonly numpy: string;
  readonly scipy: string;
  readonly relTol: number;
  readonly absTol: number;
  readonly floor: number;
  /** scipy.special.erf over the lateral-factor arguments of the last Domenico grid, one call */
  readonly erf: { calls: number; medianSeconds: number; reps: number; callsPerSecond: number; sink: number };
  readonly domenico: NumpyDomenicoFigure[];
  readonly exact: NumpyExactFigure[];
}

export type NumpyGrid = GridParams & { readonly label: string; readonly jsGrid: ArrayLike<number> };

export interface NumpyRequest {
  readonly rules: TimingRules;
  /** accuracy of the exact grids, as the JS exact grid states it: |err| ≤ relTol·column max + absTol */
  readonly relTol: number;
  readonly absTol: number;
  /** C/C0 below this counts as absolute in cell-by-cell relative differences */
  readonly floor: number;
  readonly domenico: readonly NumpyGrid[];
  readonly exact: readonly NumpyGrid[];
}

/** JSON cannot carry Infinity: a steady-state time is sent as null and read back as inf. */
function encode(req: NumpyRequest): string {
  return JSON.stringify(
    {
      minSeconds: req.rules.minSeconds,
      minReps: req.rules.minReps,
      relTol: req.relTol,
      absTol: req.absTol,
      floor: req.floor,
      domenico: req.domenico,
      exact: req.exact,
    },
    (_k, v: unknown) => (v === Infinity ? 'inf' : ArrayBuffer.isView(v) ? Array.from(v as Float64Array) : v),
  );
}

export function numpyScriptPath(): string {
  // dist-cli/bench.mjs and bench/bench.ts both sit one folder below the repository root
  return fileURLToPath(new URL('../bench/numpy_grids.py', import.meta.url));
}

/** Runs the script; returns its answer, or an error message (python missing, script failed). */
export function runNumpy(req: NumpyRequest, python = 'python3'): NumpyAnswer | { error: string } {
  const script = numpyScriptPath();
  if (!existsSync(script)) return { error: `numpy script not found at ${script}` };
  // one thread, as the JS figures: no BLAS/OpenMP thread pools behind numpy's matmul
  const env = { ...process.env, OMP_NUM_THREADS: '1', OPENBLAS_NUM_THREADS: '1', MKL_NUM_THREADS: '1' };
  const res = spawnSync(python, [script], { input: encode(req), encoding: 'utf8', env, maxBuffer: 64 << 20, timeout: 300_000 });
  if (res.error) return { error: `could not run ${python}: ${res.error.message}` };
  if (res.status !== 0) return { error: `${python} ${script} exited with ${res.status}: ${res.stderr.trim().slice(-2000)}` };
  try {
    return JSON.parse(res.stdout) as NumpyAnswer;
  } catch (e) {
    return { error: `unreadable answer from the numpy script: ${(e as Error).message}` };
  }
}
