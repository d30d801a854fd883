// Bundles the engine's Node entry points (command line, worker threads) into dist/engine/ with esbuild,
// so that the CLI, the benchmark and the server's worker threads run plain JavaScript.
import { build } from 'esbuild';
import { existsSync } from 'node:fs';

const entries = ['lib/ingest/cli.ts', 'lib/ingest/worker.ts'].filter((f) => existsSync(f));
await build({
  entryPoints: entries,
  outdir: 'dist/engine',
  bundle: true,
  platform: 'node',
  target: 'node20',
  format: 'cjs',
  sourcemap: true,
  // zod is bundled (its own package start-up costs ~20 ms more per run); piscina stays a package so that its
  // worker-thread entry resolves as installed.
  external: ['piscina'],
  logLevel: 'warning',
});
