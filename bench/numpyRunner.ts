/**
 * bench/numpy_grids.py as a child process speaking lines of JSON (see its serve()): the first
 * line carries the grids (and the whole JS results, for the agreement check) and is answered with
 * the script's checks; then each request times one repetition in the numpy process, so its
 * repetitions can be interleaved with the JS ones (timing.ts).
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync } from 'node:fs';
import { createInterface } from 'node:readline';
import { fileURLToPath } from 'node:url';
import type { Sample, Timer } from './timing';

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

export type NumpyGrid = GridParams & { readonly label: string; readonly jsGrid: ArrayLike<number> };

export interface NumpyConfig {
  /** accuracy of the exact grids, as the JS exact grid states it: |err| ≤ relTol·column max + absTol */
  readonly relTol: number;
  readonly absTol: number;
  /** C/C0 below this counts as absolute in cell-by-cell relative differences */
  readonly floor: number;
  readonly domenico: readonly NumpyGrid[];
  readonly exact: readonly NumpyGrid[];
}

export interface NumpyDomenicoCheck {
  readonly label: string;
  readonly cells: number;
  /** the whole JS grid against numpy's: column-relative and cell-relative */
  readonly jsVsNumpyColumnRel: number | null;
  readonly jsVsNumpyCellRel: number | null;
}

export interface NumpyExactCheck {
  readonly label: string;
  readonly cells: number;
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

export interface NumpyInfo {
  readonly python: string;
  readonly numpy: string;
  readonly scipy: string;
  readonly relTol: number;
  readonly absTol: number;
  readonly floor: number;
  /** arguments of the scipy erf figure (the last Domenico grid's lateral factor) */
  readonly erfCalls: number;
  readonly domenico: NumpyDomenicoCheck[];
  readonly exact: NumpyExactCheck[];
}

export function numpyScriptPath(): string {
  // dist-cli/bench.mjs and bench/bench.ts both sit one folder below the repository root
  return fileURLToPath(new URL('../bench/numpy_grids.py', import.meta.url));
}

/** JSON cannot carry Infinity (a steady-state time): it goes as the string 'inf'. */
function encode(value: unknown): string {
  return JSON.stringify(value, (_k, v: unknown) => (v === Infinity ? 'inf' : ArrayBuffer.isView(v) ? Array.from(v as Float64Array) : v));
}

export class NumpyProcess {
  private readonly child: ChildProcess;
  private readonly waiting: ((line: string | Error) => void)[] = [];
  private stderr = '';
  private closed = false;

  private constructor(python: string, script: string) {
    // one thread, as the JS figures: no BLAS/OpenMP thread pools behind numpy's matmul
    const env = { ...process.env, OMP_NUM_THREADS: '1', OPENBLAS_NUM_THREADS: '1', MKL_NUM_THREADS: '1' };
    this.child = spawn(python, [script], { env, stdio: ['pipe', 'pipe', 'pipe'] });
    // a broken pipe (the script gone) surfaces through 'exit' below with the script's stderr
    this.child.stdin!.on('error', () => {});
    this.child.stderr!.setEncoding('utf8');
    this.child.stderr!.on('data', (d: string) => (this.stderr = (this.stderr + d).slice(-4000)));
    createInterface({ input: this.child.stdout! }).on('line', (line) => this.waiting.shift()?.(line));
    const fail = (why: string) => {
      this.closed = true;
      for (const w of this.waiting.splice(0)) w(new Error(`${why}${this.stderr ? `: ${this.stderr.trim()}` : ''}`));
    };
    this.child.on('error', (e) => fail(`could not run ${python}: ${e.message}`));
    this.child.on('exit', (code) => fail(`${python} ${script} exited with ${code}`));
  }

  private request(message: unknown): Promise<unknown> {
    if (this.closed) return Promise.reject(new Error(`the numpy process has ended${this.stderr ? `: ${this.stderr.trim()}` : ''}`));
    return new Promise((resolve, reject) => {
      this.waiting.push((line) => {
        if (line instanceof Error) return reject(line);
        try {
          resolve(JSON.parse(line));
        } catch (e) {
          reject(new Error(`unreadable answer from the numpy script: ${(e as Error).message}`));
        }
      });
      this.child.stdin!.write(`${encode(message)}\n`);
    });
  }

  /** Starts the script and sends the grids; resolves with its checks once it is ready. */
  static async start(config: NumpyConfig, python = 'python3'): Promise<{ proc: NumpyProcess; info: NumpyInfo }> {
    const script = numpyScriptPath();
    if (!existsSync(script)) throw new Error(`numpy script not found at ${script}`);
    const proc = new NumpyProcess(python, script);
    const answer = (await proc.request(config)) as { ready: NumpyInfo };
    return { proc, info: answer.ready };
  }

  /** A timer for `calls` calls of one of the script's computations: 'erf', 'domenico:<k>' or 'exact:<k>'. */
  timer(name: string, calls = 1): Timer {
    return () => this.request({ run: name, calls }) as Promise<Sample>;
  }

  async stop(): Promise<void> {
    if (this.closed) return;
    this.child.stdin!.end(`${encode({ quit: true })}\n`);
    await new Promise<void>((resolve) => (this.closed ? resolve() : this.child.once('exit', () => resolve())));
  }
}
