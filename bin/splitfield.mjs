#!/usr/bin/env node
// The `splitfield` command. It runs the engine bundle in dist/engine/ directly (no npm, no bundler at start),
// building it first only when it is missing or older than one of the sources it was built from.
//   splitfield decluster INPUT [options]     (splitfield decluster --help)
//   splitfield worker [options]              (splitfield worker --help)
import { spawnSync } from 'node:child_process';
import { readFileSync, statSync } from 'node:fs';
import { createRequire } from 'node:module';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const engine = path.join(root, 'dist/engine');

const COMMANDS = {
  decluster: { bundle: 'cli.js', summary: 'cluster and decluster the jets of a particle file; write the declusterings' },
  worker: { bundle: 'queue-worker.js', summary: 'work on the processing jobs of the scaled mode (Redis queue, object store)' },
};

const USAGE = `Usage: splitfield COMMAND [options]

Commands:
${Object.entries(COMMANDS)
  .map(([name, c]) => `  ${name.padEnd(12)} ${c.summary}`)
  .join('\n')}

splitfield COMMAND --help shows a command's options, defaults and exit codes.`;

function mtime(file) {
  try {
    return statSync(file).mtimeMs;
  } catch {
    return Infinity; // a missing file: either the bundle is missing or a source was removed; build again
  }
}

/** Whether the bundle must be built: missing, or older than a source it was built from. */
function stale(bundle) {
  const built = mtime(bundle);
  if (built === Infinity) return true;
  let sources;
  try {
    sources = JSON.parse(readFileSync(path.join(engine, 'sources.json'), 'utf8'));
  } catch {
    return true;
  }
  return sources.some((f) => mtime(path.join(root, f)) > built);
}

const [command, ...rest] = process.argv.slice(2);
if (command === undefined || command === '--help' || command === '-h' || command === 'help') {
  process.stdout.write(USAGE + '\n');
  process.exit(command === undefined ? 2 : 0);
}
const spec = COMMANDS[command];
if (!spec) {
  process.stderr.write(`splitfield: unknown command "${command}"\n${USAGE}\n`);
  process.exit(2);
}
const bundle = path.join(engine, spec.bundle);
if (stale(bundle)) {
  const build = spawnSync(process.execPath, [path.join(root, 'scripts/build-engine.mjs')], { stdio: 'inherit' });
  if (build.status !== 0) {
    process.stderr.write('splitfield: building the engine failed (is `npm install` done?)\n');
    process.exit(1);
  }
}
const { main } = createRequire(import.meta.url)(bundle);
main(rest).then(
  (code) => {
    process.exitCode = code;
  },
  (e) => {
    process.stderr.write(`splitfield ${command}: ${e?.stack ?? e}\n`);
    process.exitCode = 1;
  },
);
