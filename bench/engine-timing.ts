// Timings of parts of the engine for the benchmark (bench/engine-bench.ts bundles this file into
// bench/out/engine-timing.cjs and runs it with node). Each mode prints one JSON line on stdout.
//
//   node bench/out/engine-timing.cjs physics INPUT [the command line's options] [--rounds 5] [--min-seconds 0.2]
//     The physics alone, timed as tests/reference/fastjet-speed.cc --physics-only times FastJet's: every record
//     is read into memory first (the engine's own reader), then processParticles (jet finding, selection, C/A
//     re-clustering, declustering, observables) runs over all of them, in rounds; prints the fastest round's CPU
//     and wall seconds per pass: {"records","particles","jets","splittings","rounds","cpuSeconds","wallSeconds"}.
//   node bench/out/engine-timing.cjs json INPUT [--rounds 3]
//     JSON reading against its floor, on the same bytes: the engine's reading of a JSON Lines file (the
//     pipeline's own byte batches, record parsing and validation into typed arrays) against reading the same file
//     as string lines (the line source's string mode) and only JSON.parse of each line. Prints the fastest round's CPU seconds of each:
//     {"records","bytes","engineSeconds","jsonParseSeconds"}.
//   node bench/out/engine-timing.cjs ca-loop INPUT --dump PARTICLES.bin [--rounds 5] [--min-seconds 0.2]
//     The C/A re-clustering loop alone (the plain strategy, R = ∞) on every record of INPUT, timed as its C++ port
//     bench/same-loop/plain-ca.cc times itself; writes the records' particles to PARTICLES.bin for the port and
//     prints {"records","ops","checksum","cpuSeconds"} with the same checksum of the trees.
import { closeSync, openSync, writeSync } from 'node:fs';
import { parseCli } from '../lib/ingest/cli-options';
import { openLineSource } from '../lib/ingest/lines';
import { openParticleFile } from '../lib/ingest/reader';
import { ParticleScratch } from '../lib/ingest/particle-scratch';
import { parseRecordBytesInto } from '../lib/ingest/record';
import { ClusterWorkspace, cluster, loadParticles } from '../lib/physics/clustering';
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

/**
 * Runs `pass` in rounds, each repeated until it has taken `minSeconds` of CPU; the fastest round's CPU and wall
 * seconds per pass.
 */
function fastestPass(rounds: number, minSeconds: number, pass: () => void): { cpu: number; wall: number } {
  let cpu = Infinity, wall = Infinity;
  for (let round = 0; round < rounds; round++) {
    const c0 = cpuSeconds(), w0 = performance.now();
    let passes = 0;
    do {
      pass();
      passes++;
    } while (cpuSeconds() - c0 < minSeconds);
    cpu = Math.min(cpu, (cpuSeconds() - c0) / passes);
    wall = Math.min(wall, (performance.now() - w0) / 1000 / passes);
  }
  return { cpu, wall };
}

async function physics(argv: string[]): Promise<void> {
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
  let jets = 0, splittings = 0;
  const best = fastestPass(rounds, minSeconds, () => {
    jets = 0;
    splittings = 0;
    for (const p of records) {
      for (const j of processParticles(p, settings).jets) {
        jets++;
        splittings += (j.primary.length + (j.all ? j.all.length : 0)) / SPLIT_STRIDE;
      }
    }
  });
  process.stdout.write(JSON.stringify({ records: records.length, particles, jets, splittings, rounds, cpuSeconds: best.cpu, wallSeconds: best.wall }) + '\n');
}

/** One pass over a JSON Lines file: every record line (after the header) handed to `each`. */
async function eachRecordLine(file: string, each: (line: string) => void): Promise<void> {
  const src = await openLineSource(file);
  let header = true;
  for (;;) {
    const line = src.take();
    if (line === undefined) {
      if (!(await src.fill())) break;
      continue;
    }
    if (line.length === 0) continue;
    if (header) header = false;
    else {
      each(line);
    }
  }
  src.close();
}

async function json(argv: string[]): Promise<void> {
  const rounds = takeOption(argv, '--rounds', 3);
  const file = argv[0];
  const reader = await openParticleFile(file);
  const raw = reader.raw;
  if (!raw || raw.kind !== 'jsonl') throw new Error('json: a splitfield-particles JSON Lines file is needed');
  const context = raw.context;
  const bytes = reader.bytesTotal;
  reader.close();
  const scratch = new ParticleScratch();
  let engine = Infinity, floor = Infinity, records = 0;
  let sink = 0;
  for (let round = 0; round < rounds; round++) {
    let c0 = cpuSeconds();
    // The pipeline's own reading: byte batches from the reader, each record parsed and checked.
    const r = await openParticleFile(file);
    records = 0;
    for await (const b of r.raw!.rawBatches()) {
      if (b.kind !== 'jsonl') throw new Error('json: JSON Lines batches expected');
      for (let i = 0; i < b.lineNos.length; i++) sink += parseRecordBytesInto(b.bytes, b.starts[i], b.ends[i], b.lineNos[i], context, scratch).n;
      records += b.lineNos.length;
    }
    r.close();
    engine = Math.min(engine, cpuSeconds() - c0);
    c0 = cpuSeconds();
    await eachRecordLine(file, (line) => {
      sink += (JSON.parse(line) as { particles: unknown[] }).particles.length;
    });
    floor = Math.min(floor, cpuSeconds() - c0);
  }
  if (!(sink > 0)) throw new Error('json: no particles read');
  process.stdout.write(JSON.stringify({ records, bytes, engineSeconds: engine, jsonParseSeconds: floor }) + '\n');
}

async function caLoop(argv: string[]): Promise<void> {
  const rounds = takeOption(argv, '--rounds', 5);
  const minSeconds = takeOption(argv, '--min-seconds', 0.2);
  const at = argv.indexOf('--dump');
  if (at < 0 || !argv[at + 1]) throw new Error('ca-loop: --dump PARTICLES.bin is needed');
  const reader = await openParticleFile(argv[0]);
  const records: Float64Array[] = [];
  const fd = openSync(argv[at + 1], 'w');
  for await (const batch of reader.batches()) {
    for (const r of batch) {
      records.push(r.particles);
      writeSync(fd, new Int32Array([r.particles.length >> 2]));
      writeSync(fd, r.particles);
    }
  }
  closeSync(fd);
  reader.close();
  const ws = new ClusterWorkspace();
  let ops = 0, checksum = 0;
  const best = fastestPass(rounds, minSeconds, () => {
    ws.ops = 0;
    checksum = 0;
    for (const p of records) {
      const m = p.length >> 2;
      if (m === 0) continue;
      loadParticles(ws, p, m);
      cluster(ws, { p: 0, R: Infinity, strategy: 'plain' });
      // The tree's shape and the last merged jet's rapidity (as the C++ port sums them).
      for (let k = m; k < ws.nNodes; k++) checksum += (ws.parent1[k] + 2 * ws.parent2[k]) * 1e-6;
      checksum += ws.rap[ws.nNodes - 1];
    }
    ops = ws.ops;
  });
  process.stdout.write(JSON.stringify({ records: records.length, ops, checksum, cpuSeconds: best.cpu }) + '\n');
}

async function main(): Promise<void> {
  const [mode, ...argv] = process.argv.slice(2);
  if (mode === 'physics') await physics(argv);
  else if (mode === 'json') await json(argv);
  else if (mode === 'ca-loop') await caLoop(argv);
  else throw new Error('usage: engine-timing physics|json|ca-loop INPUT [options]');
}

main().catch((e) => {
  process.stderr.write(`engine-timing: ${e?.stack ?? e}\n`);
  process.exit(1);
});
