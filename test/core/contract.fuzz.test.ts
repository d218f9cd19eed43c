/**
 * Fuzz: thousands of seeded random parameter sets, across and beyond the valid ranges (NaN,
 * ±Infinity, ±0, negatives, subnormals, huge, non-numbers), through the engine's public surface.
 * The property (DESIGN.md, "Numerical conventions"; DEVELOPERS.md): every call either returns
 * finite numbers — C/C0 in [0, 1] up to 1e-12, concentrations in [0, c0] up to 1e-9 relative — or
 * throws a ValidationError naming a field. Never NaN, never Infinity, never another exception.
 * Seeds are written beside each run, so any failure replays exactly.
 */
import { describe, expect, it } from 'vitest';
import {
  ValidationError,
  breakthroughCurve,
  concentration,
  domenico,
  domenicoGrid,
  evaluateReceptor,
  ogataBanks,
  patchSourceExact,
  patchSourceExactGrid,
  type ScreeningModel,
} from '../../src/core/index';
import { Prng } from './helpers/check';

const WILD: unknown[] = [NaN, Infinity, -Infinity, 0, -0, -1, -1e-300, 5e-324, 1e-300, 1e-12, 1e12, 1e300, Number.MAX_VALUE, '2', null, undefined, {}];

class Fuzzer {
  readonly rng: Prng;
  constructor(seed: number, private wildRate: number) {
    this.rng = new Prng(seed);
  }
  /** A value in the log-range [lo, hi], or (with the wild rate) something from WILD. */
  num(lo: number, hi: number): number {
    if (this.rng.uniform() < this.wildRate) return this.rng.pick(WILD) as number;
    if (lo === 0) return this.rng.uniform() < 0.1 ? 0 : this.rng.logBetween(Math.max(hi * 1e-12, 1e-300), hi);
    return this.rng.logBetween(lo, hi);
  }
  signed(hi: number): number {
    const v = this.num(0, hi);
    return typeof v === 'number' && this.rng.uniform() < 0.5 ? -v : v;
  }
}

interface Outcome {
  label: string;
  input: unknown;
  problem: string;
}

class Verdicts {
  readonly problems: Outcome[] = [];
  calls = 0;
  validationErrors = 0;
  /** run f; a returned value is checked by `check`, an exception must be a ValidationError */
  run<T>(label: string, input: unknown, f: () => T, check: (r: T) => string | null): void {
    this.calls++;
    let r: T;
    try {
      r = f();
    } catch (e) {
      if (e instanceof ValidationError && typeof e.field === 'string' && e.field.length > 0 && e.message.includes(e.field)) {
        this.validationErrors++;
        return;
      }
      this.problems.push({ label, input, problem: `threw ${(e as Error)?.name}: ${(e as Error)?.message}` });
      return;
    }
    const bad = check(r);
    if (bad) this.problems.push({ label, input, problem: bad });
  }
  assertNone(): void {
    const text = this.problems
      .slice(0, 15)
      .map((p) => `${p.label}: ${p.problem}; input ${safeJson(p.input)}`)
      .join('\n');
    expect(this.problems.length, `${this.problems.length} of ${this.calls} calls misbehaved:\n${text}`).toBe(0);
    // the fuzz must exercise both outcomes, or it tests nothing
    expect(this.validationErrors).toBeGreaterThan(0);
    expect(this.calls - this.validationErrors).toBeGreaterThan(this.calls / 10);
  }
}

function safeJson(v: unknown): string {
  return JSON.stringify(v, (_k, x) => (typeof x === 'number' && !Number.isFinite(x) ? String(x) : x === undefined ? 'undefined' : x));
}

const REL_SLACK = 1e-12;

function unitInterval(c: number): string | null {
  if (typeof c !== 'number' || !Number.isFinite(c)) return `result ${c} is not finite`;
  if (c < 0 || c > 1 + REL_SLACK) return `C/C0 = ${c} outside [0, 1]`;
  return null;
}

function gridInterval(a: Float64Array, n: number): string | null {
  if (!(a instanceof Float64Array) || a.length !== n) return `grid length ${a?.length}, expected ${n}`;
  for (let i = 0; i < a.length; i++) {
    const bad = unitInterval(a[i]);
    if (bad) return `cell ${i}: ${bad}`;
  }
  return null;
}

function patchInput(fz: Fuzzer) {
  const x = fz.signed(5000);
  const ax = fz.num(0, 500);
  return {
    x,
    y: fz.signed(2000),
    z: fz.num(0, 100),
    t: fz.rng.uniform() < 0.05 ? Infinity : fz.num(0, 1e6),
    v: fz.num(0, 100),
    ax,
    ay: fz.num(0, 100),
    az: fz.num(0, 10),
    width: fz.num(1e-3, 1e4),
    thickness: fz.num(1e-3, 500),
    R: fz.rng.uniform() < 0.3 ? undefined : fz.num(1, 1e4),
    decay: fz.rng.uniform() < 0.3 ? undefined : fz.num(0, 10),
  };
}

describe('contract functions never return NaN/Infinity or throw anything but ValidationError', () => {
  it('ogataBanks: 5000 sets (seed 101, 15 % wild values per field)', () => {
    const fz = new Fuzzer(101, 0.15);
    const v = new Verdicts();
    for (let k = 0; k < 5000; k++) {
      const p = {
        x: fz.num(0, 1e5),
        t: fz.rng.uniform() < 0.05 ? Infinity : fz.num(0, 1e7),
        v: fz.num(0, 1e3),
        D: fz.num(0, 1e4),
        R: fz.rng.uniform() < 0.3 ? undefined : fz.num(1, 1e5),
        decay: fz.rng.uniform() < 0.3 ? undefined : fz.num(0, 100),
      };
      v.run('ogataBanks', p, () => ogataBanks(p), unitInterval);
    }
    v.assertNone();
  });

  for (const [name, f, n, seed] of [
    ['domenico', domenico, 5000, 102],
    ['patchSourceExact', patchSourceExact, 600, 103],
  ] as const) {
    it(`${name}: ${n} sets (seed ${seed}, 10 % wild values per field)`, () => {
      const fz = new Fuzzer(seed, 0.1);
      const v = new Verdicts();
      for (let k = 0; k < n; k++) {
        const p = patchInput(fz);
        v.run(name, p, () => f(p), unitInterval);
      }
      v.assertNone();
    });
  }

  it('domenicoGrid and patchSourceExactGrid: 200 small grids each (seed 104)', () => {
    const fz = new Fuzzer(104, 0.08);
    const v = new Verdicts();
    for (let k = 0; k < 200; k++) {
      const p = patchInput(fz);
      const xs = [fz.num(1e-3, 5000), fz.num(1e-3, 5000), fz.num(1e-3, 5000)];
      const ys = [fz.signed(1000), 0, fz.signed(1000)];
      const input = { ...p, xs, ys };
      v.run('domenicoGrid', input, () => domenicoGrid(input), (g) => gridInterval(g, 9));
      if (k % 2 === 0) v.run('patchSourceExactGrid', input, () => patchSourceExactGrid(input), (g) => gridInterval(g, 9));
    }
    v.assertNone();
  });
});

function model(fz: Fuzzer): ScreeningModel {
  const wildPick = <T>(valid: T[]): T => (fz.rng.uniform() < 0.03 ? (fz.rng.pick(WILD) as T) : fz.rng.pick(valid));
  return {
    v: fz.num(0, 50),
    ax: fz.num(0, 200),
    ay: fz.num(0, 50),
    az: fz.num(0, 5),
    diffusion: fz.rng.uniform() < 0.5 ? 0 : fz.num(0, 1e-3),
    R: fz.num(1, 1e3),
    decay: fz.rng.uniform() < 0.3 ? 0 : fz.num(0, 1),
    decayPhase: wildPick(['dissolved-and-sorbed', 'dissolved-only'] as const),
    width: fz.num(0.1, 1000),
    thickness: fz.num(0.1, 100),
    c0: fz.num(0, 1e4),
    sourceDecay: fz.rng.uniform() < 0.6 ? 0 : fz.num(0, 0.1),
    duration: fz.rng.uniform() < 0.6 ? Infinity : fz.num(1, 1e5),
    solution: wildPick(['domenico', 'exact'] as const),
  };
}

function concentrationCheck(m: ScreeningModel) {
  return (c: number): string | null => {
    if (typeof c !== 'number' || !Number.isFinite(c)) return `concentration ${c} is not finite`;
    if (c < 0) return `negative concentration ${c}`;
    if (c > m.c0 * (1 + 1e-9)) return `concentration ${c} above the source ${m.c0}`;
    return null;
  };
}

function receptor(fz: Fuzzer) {
  const zTop = fz.num(0, 30);
  const len = fz.rng.uniform() < 0.5 ? 0 : fz.num(0.1, 20);
  return { x: fz.signed(3000), y: fz.signed(500), zTop, zBottom: typeof zTop === 'number' && typeof len === 'number' ? zTop + len : zTop };
}

describe('richer API on random ScreeningModels', () => {
  it('concentration: 3000 models × point × time (seed 201)', () => {
    const fz = new Fuzzer(201, 0.05);
    const v = new Verdicts();
    for (let k = 0; k < 3000; k++) {
      const m = model(fz);
      const p = { x: fz.signed(3000), y: fz.signed(500), z: fz.num(0, 30) };
      const t = fz.rng.uniform() < 0.1 ? Infinity : fz.num(0, 1e6);
      v.run('concentration', { m, p, t }, () => concentration(m, p, t), concentrationCheck(m));
    }
    v.assertNone();
  });

  it('breakthroughCurve: 300 models, 6 times each (seed 202)', () => {
    const fz = new Fuzzer(202, 0.04);
    const v = new Verdicts();
    for (let k = 0; k < 300; k++) {
      const m = model(fz);
      const r = receptor(fz);
      const times = [fz.num(0, 10), fz.num(0, 1e3), fz.num(0, 1e5), 1, 365, fz.rng.uniform() < 0.2 ? Infinity : 3650];
      const check = concentrationCheck(m);
      v.run('breakthroughCurve', { m, r, times }, () => breakthroughCurve(m, r, times), (out) => {
        if (!(out instanceof Float64Array) || out.length !== times.length) return `length ${out?.length}`;
        for (let i = 0; i < out.length; i++) {
          const bad = check(out[i]);
          if (bad) return `times[${i}]: ${bad}`;
        }
        return null;
      });
    }
    v.assertNone();
  });

  it('evaluateReceptor: 120 models (seed 203) — every figure finite, arrival null or within the horizon', () => {
    const fz = new Fuzzer(203, 0.03);
    const v = new Verdicts();
    for (let k = 0; k < 120; k++) {
      const m = model(fz);
      const r = receptor(fz);
      const limit = fz.num(1e-6, 100);
      const horizon = fz.num(1, 36525);
      const check = concentrationCheck(m);
      v.run('evaluateReceptor', { m, r, limit, horizon }, () => evaluateReceptor(m, r, limit, horizon), (res) => {
        const figures = [res, ...(res.alternate ? [res.alternate] : [])];
        for (const f of figures) {
          if (f.arrival !== null && !(Number.isFinite(f.arrival) && f.arrival >= 0 && f.arrival <= horizon * (1 + 1e-9)))
            return `arrival ${f.arrival} outside [0, ${horizon}]`;
          for (const [name, c] of [
            ['atHorizon', f.atHorizon],
            ['peak.c', f.peak.c],
            ['steady', f.steady],
          ] as const) {
            const bad = check(c);
            if (bad) return `${name}: ${bad}`;
          }
          if (!(Number.isFinite(f.peak.t) && f.peak.t >= 0 && f.peak.t <= horizon * (1 + 1e-9))) return `peak time ${f.peak.t}`;
        }
        if (res.alternate && !Number.isFinite(res.alternate.relDiff)) return `relDiff ${res.alternate.relDiff}`;
        if (!['reaches-limit', 'below-limit', 'not-reached-in-horizon'].includes(res.status)) return `status ${res.status}`;
        return null;
      });
    }
    v.assertNone();
  });
});
