/**
 * The entry of scripts/fingerprint.mjs (bundled by it with esbuild): every figure a refactoring must
 * leave unchanged, as named lists of numbers, written to stdout as JSON.
 *  - per demo case (cases/*.json): the worker's evaluation (screening, receptor curves, centreline
 *    profile; timings left out) and the map grid (latticeFor + concentrationGrid at the view time)
 *    at 128² and 256², for the case's solution and the other one;
 *  - the contract's grids on the bench scenario (bench/scenario.ts): Domenico 256² (y symmetric and
 *    not) and the exact solution 48², plus exact point values on the advancing front.
 * The command line's JSON output is fingerprinted by the .mjs itself (it runs the built CLI).
 */
import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { parseCaseFile } from '../src/case/io';
import { prepareCase } from '../src/case/prepare';
import { evaluateCase, latticeFor } from '../src/worker/compute';
import { concentrationGrid, domenicoGrid, patchSourceExactGrid, patchSourceExact } from '../src/core';
import { AX, AY, AZ, DECAY, R, T, THICKNESS, V, WIDTH, Z, gridXs, gridYs } from '../bench/scenario';

type Figures = Record<string, number[]>;
const out: Figures = {};

/** every number in a JSON-like value, depth first, keys in their order, timing objects left out */
function numbers(v: unknown, acc: number[] = []): number[] {
  if (typeof v === 'number') acc.push(v);
  else if (Array.isArray(v)) for (const e of v) numbers(e, acc);
  else if (v && typeof v === 'object') for (const [k, e] of Object.entries(v)) if (k !== 'timing') numbers(e, acc);
  return acc;
}

const dir = process.argv[2] ?? 'cases';
for (const f of readdirSync(dir).filter((n) => n.endsWith('.json')).sort()) {
  const parsed = parseCaseFile(readFileSync(join(dir, f), 'utf8'));
  if (!parsed.ok) throw new Error(`${f}: ${JSON.stringify(parsed)}`);
  const c = parsed.case;
  out[`${f} evaluation`] = numbers(evaluateCase(c));
  const p = prepareCase(c);
  for (const size of [128, 256]) {
    const lat = latticeFor(p, size);
    for (const solution of ['domenico', 'exact'] as const) {
      if (solution === 'domenico' && !(p.model.v > 0)) continue;
      const g = concentrationGrid({ ...p.model, solution }, lat.xs, lat.ys, p.depth, p.viewTime);
      out[`${f} map ${size}² ${solution}`] = Array.from(g);
    }
  }
}

const base = { t: T, v: V, ax: AX, ay: AY, az: AZ, width: WIDTH, thickness: THICKNESS, R, decay: DECAY, z: Z };
out['domenicoGrid 256² symmetric'] = Array.from(domenicoGrid({ ...base, xs: gridXs(256), ys: gridYs(256, true) }));
out['domenicoGrid 256² shifted'] = Array.from(domenicoGrid({ ...base, xs: gridXs(256), ys: gridYs(256, false) }));
out['patchSourceExactGrid 48²'] = Array.from(patchSourceExactGrid({ ...base, xs: gridXs(48), ys: gridYs(48, true) }));
// point values on the advancing front (C/C0 from about 1e-3 down to 1e-12)
const front: number[] = [];
for (const x of [900, 1000, 1100, 1200, 1300]) for (const y of [0, 20, 60]) front.push(patchSourceExact({ ...base, x, y }));
out['patchSourceExact front points'] = front;

process.stdout.write(JSON.stringify(out));
