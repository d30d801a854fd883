// Bundles the engine's Node entry points (command line, worker threads, the server's processing job, the scaled
// mode's queue worker) into
// dist/engine/ with esbuild, so that the CLI, the benchmark and the server's worker threads run plain JavaScript.
// Beside the bundles it writes sources.json, the list of files they were built from, so that bin/splitfield.mjs
// can tell a stale bundle from a fresh one without building again.
//   node scripts/build-engine.mjs [--outdir DIR]   (tests build into their own directory, so that parallel
//                                                   test files never overwrite a bundle another one is running)
import { build } from 'esbuild';
import { existsSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { parseArgs } from 'node:util';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const { values } = parseArgs({ options: { outdir: { type: 'string', default: path.join(root, 'dist/engine') } } });
const entries = ['lib/ingest/cli.ts', 'lib/ingest/worker.ts', 'lib/jobs/job-worker.ts', 'lib/scale/queue-worker.ts'].map((f) => path.join(root, f)).filter((f) => existsSync(f));
const result = await build({
  entryPoints: entries,
  outdir: values.outdir,
  // Flat: dist/engine/cli.js, worker.js, job-worker.js, queue-worker.js (jobs find worker.js beside themselves).
  entryNames: '[name]',
  bundle: true,
  platform: 'node',
  target: 'node20',
  format: 'cjs',
  sourcemap: true,
  metafile: true,
  // Input paths in the metafile are relative to this folder, wherever the build is started from.
  absWorkingDir: root,
  // zod and cli-progress are bundled (zod's own package start-up costs ~20 ms more per run); piscina stays a
  // package so that its worker-thread entry resolves as installed; so do BullMQ (its Lua scripts are files),
  // ioredis and the AWS SDK.
  external: ['piscina', 'bullmq', 'ioredis', '@aws-sdk/*'],
  logLevel: 'warning',
});
// The project's own sources (not node_modules: an `npm install` that changes them rebuilds through package-lock.json).
const sources = Object.keys(result.metafile.inputs).filter((f) => !f.includes('node_modules/'));
sources.push('package-lock.json', 'scripts/build-engine.mjs');
writeFileSync(path.join(values.outdir, 'sources.json'), JSON.stringify(sources));
