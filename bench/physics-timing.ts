// The physics alone, timed as tests/reference/fastjet-speed.cc --physics-only times FastJet's: every record of
// a splitfield-particles file is read into memory first (the engine's own reader), then processParticles (jet
// finding, selection, C/A re-clustering, declustering, observables) runs over all of them, in rounds; the fastest
// round's CPU and wall seconds per pass are printed as one JSON line on stdout:
//   {"records","particles","jets","splittings","rounds","cpuSeconds","wallSeconds"}
// Bundled by the benchmark (bench/engine-bench.ts) into bench/out/physics-timing.cjs and run with node.
//
//   node bench/out/physics-timing.cjs INPUT [the command line's options] [--rounds 5] [--min-seconds 0.2]
import { parseCli } from '../lib/ingest/cli-options';
import { openParticleFile } from '../lib/ingest/reader';
import { processParticles } from '../lib/physics/process';
import { SPLIT_STRIDE, type ProcessSettings } from '../lib/physics/types';

function cpuSeconds(): number {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1e6;
}

/** Takes `--name value` out of argv (the rest goes to the command line's parser). */
function takeOption(argv: string[], name: string, def: number): number {
  const i = argv.indexOf(name);
  if (i < 0) return def;
  const v = Number(argv[i + 1]);
  argv.splice(i, 2);
  if (!(v > 0)) throw new Error(`${name} must be a number > 0`);
  return v;
}

async function main(): Promise<void> {
  const argv = process.argv.slice(2);
  const rounds = takeOption(argv, '--rounds', 5);
  const minSeconds = takeOption(argv, '--min-seconds', 0.2);
  const cfg = parseCli(argv);
  if (typeof cfg === 'string') throw new Error('usage: physics-timing INPUT [options]');
  const reader = await openParticleFile(cfg.input);
  const records: Float64Array[] = [];
  let particles = 0;
  for await (const batch of reader.batches()) {
    for (const r of batch) {
      records.push(r.particles);
      particles += r.particles.length >> 2;
    }
  }
  reader.close();
  const settings: ProcessSettings = { ...cfg.settings, content: reader.header.content };
  let bestCpu = Infinity, bestWall = Infinity, jets = 0, splittings = 0;
  for (let round = 0; round < rounds; round++) {
    const c0 = cpuSeconds(), w0 = performance.now();
    let passes = 0;
    do {
      jets = 0;
      splittings = 0;
      for (const p of records) {
        for (const j of processParticles(p, settings).jets) {
          jets++;
          splittings += (j.primary.length + (j.all ? j.all.length : 0)) / SPLIT_STRIDE;
        }
      }
      passes++;
    } while (cpuSeconds() - c0 < minSeconds);
    bestCpu = Math.min(bestCpu, (cpuSeconds() - c0) / passes);
    bestWall = Math.min(bestWall, (performance.now() - w0) / 1000 / passes);
  }
  process.stdout.write(JSON.stringify({ records: records.length, particles, jets, splittings, rounds, cpuSeconds: bestCpu, wallSeconds: bestWall }) + '\n');
}

main().catch((e) => {
  process.stderr.write(`physics-timing: ${e?.stack ?? e}\n`);
  process.exit(1);
});
