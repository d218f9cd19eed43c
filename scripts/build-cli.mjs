// Bundles the command-line entries (Node 20 cannot run .ts directly) with esbuild into dist-cli/.
// Usage: node scripts/build-cli.mjs [--quiet] [--only screen|bench]
import { build } from 'esbuild';
import { existsSync } from 'node:fs';

const quiet = process.argv.includes('--quiet');
const entries = { screen: 'src/cli/screen.ts', bench: 'bench/bench.ts', 'bench-mc-worker': 'bench/mcWorker.ts', 'bench-particle-worker': 'bench/particleWorker.ts' };
const k = process.argv.indexOf('--only');
const only = k >= 0 ? process.argv[k + 1] : null;
const entryPoints = Object.fromEntries(
  Object.entries(entries).filter(([name, p]) => existsSync(p) && (only === null || name === only || (only === 'bench' && name.startsWith('bench-')))),
);

await build({
  entryPoints,
  outdir: 'dist-cli',
  outExtension: { '.js': '.mjs' },
  bundle: true,
  platform: 'node',
  format: 'esm',
  target: 'node20',
  sourcemap: false,
  logLevel: quiet ? 'error' : 'info',
  banner: { js: "import { createRequire as __cr } from 'node:module'; const require = __cr(import.meta.url);" },
});
