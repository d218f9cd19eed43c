// Fingerprints of every figure a refactoring must leave unchanged: `npm run screen -- <case>
// --format json` for every demo case, the worker's evaluation and map grids of every case, and the
// contract's Domenico and exact grids (scripts/fingerprint-entry.ts lists them).
//
//   node scripts/fingerprint.mjs                  one SHA-256 (first 16 hex digits) per figure
//   node scripts/fingerprint.mjs --save f.json    also keep the numbers
//   node scripts/fingerprint.mjs --compare f.json and report, per figure that changed, the largest
//                                                 absolute and relative difference from the saved run
// Run it before and after a change; equal hashes mean bit-identical results.
import { build } from 'esbuild';
import { execFileSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { mkdtempSync, readFileSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

const arg = (name) => {
  const k = process.argv.indexOf(name);
  return k >= 0 ? process.argv[k + 1] : null;
};
const tmp = mkdtempSync(join(tmpdir(), 'dg-fingerprint-'));
try {
  await build({
    entryPoints: { fingerprint: 'scripts/fingerprint-entry.ts', screen: 'src/cli/screen.ts' },
    outdir: tmp,
    outExtension: { '.js': '.mjs' },
    bundle: true,
    platform: 'node',
    format: 'esm',
    target: 'node20',
    logLevel: 'error',
    banner: { js: "import { createRequire as __cr } from 'node:module'; const require = __cr(import.meta.url);" },
  });
  const figures = JSON.parse(execFileSync('node', [join(tmp, 'fingerprint.mjs'), 'cases'], { maxBuffer: 1 << 30 }).toString());
  const cli = {};
  for (const f of readdirSync('cases').filter((n) => n.endsWith('.json')).sort()) {
    const text = execFileSync('node', [join(tmp, 'screen.mjs'), join('cases', f), '--format', 'json']).toString();
    cli[`${f} screen --format json`] = text;
    figures[`${f} screen --format json`] = numbersOf(JSON.parse(text));
  }
  const hash = (s) => createHash('sha256').update(s).digest('hex').slice(0, 16);
  for (const [name, values] of Object.entries(figures)) {
    const h = name in cli ? hash(cli[name]) : hash(Buffer.from(new Float64Array(values).buffer));
    console.log(`${h}  ${name} (${values.length} numbers)`);
  }
  const save = arg('--save');
  if (save) writeFileSync(save, JSON.stringify(figures));
  const compare = arg('--compare');
  if (compare) {
    const old = JSON.parse(readFileSync(compare, 'utf8'));
    let same = 0;
    for (const [name, values] of Object.entries(figures)) {
      const was = old[name];
      if (!was || was.length !== values.length) {
        console.log(`CHANGED SHAPE  ${name}`);
        continue;
      }
      let abs = 0, rel = 0, relAbove = 0, n = 0;
      for (let i = 0; i < values.length; i++) {
        const a = was[i], b = values[i];
        if (a === b || (Number.isNaN(a) && Number.isNaN(b))) continue;
        n++;
        const d = Math.abs(a - b);
        abs = Math.max(abs, d);
        const r = d / Math.max(Math.abs(a), Math.abs(b));
        rel = Math.max(rel, r);
        if (Math.max(Math.abs(a), Math.abs(b)) >= 1e-6) relAbove = Math.max(relAbove, r);
      }
      if (n === 0) same++;
      else console.log(`differs  ${name}: ${n} of ${values.length} values; largest |Δ| ${abs.toExponential(2)}, relative ${rel.toExponential(2)} (values ≥ 1e-6: ${relAbove.toExponential(2)})`);
    }
    console.log(`${same} of ${Object.keys(figures).length} figures bit-identical to ${compare}`);
  }
} finally {
  rmSync(tmp, { recursive: true, force: true });
}

function numbersOf(v, acc = []) {
  if (typeof v === 'number') acc.push(v);
  else if (Array.isArray(v)) for (const e of v) numbersOf(e, acc);
  else if (v && typeof v === 'object') for (const e of Object.values(v)) numbersOf(e, acc);
  return acc;
}
