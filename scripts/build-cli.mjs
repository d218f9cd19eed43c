// Bundles the command-line entries (Node 20 cannot run .ts directly) with esbuild into dist-cli/.
// Usage: node scripts/build-cli.mjs [--quiet]
import { build } from 'esbuild';
import { existsSync } from 'node:fs';

const quiet = process.argv.includes('--quiet');
const entries = { screen: 'src/cli/screen.ts', bench: 'bench/bench.ts' };
const entryPoints = Object.fromEntries(Object.entries(entries).filter(([, p]) => existsSync(p)));

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
