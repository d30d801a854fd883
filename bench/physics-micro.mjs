// Physics-only micro benchmark: processParticles on generated records (no file reading, no export writing),
// CPU time (user + system, best of several rounds: steadier than wall time on a shared machine), per record,
// for the shapes of the engine benchmark's cases, plus the clustering work counted in pair distances.
//
//   node bench/physics-micro.mjs [--rounds 5] [--scale 1]      (profile: node --cpu-prof bench/physics-micro.mjs)
//
// The whole-process comparison with FastJet is bench/engine-bench.mjs (npm run bench).
import { build } from 'esbuild';
import { mkdirSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { parseArgs } from 'node:util';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const OUT = path.join(ROOT, 'bench/out');
const { values: args } = parseArgs({
  options: { rounds: { type: 'string', default: '5' }, scale: { type: 'string', default: '1' } },
});

mkdirSync(OUT, { recursive: true });
const bundle = path.join(OUT, 'physics-micro-lib.mjs');
await build({
  stdin: {
    contents: `export * from './lib/physics/process'; export * from './tests/support/test-events'; export * from './lib/physics/clustering';`,
    resolveDir: ROOT,
    loader: 'ts',
  },
  outfile: bundle,
  bundle: true,
  platform: 'node',
  format: 'esm',
  target: 'node20',
  logLevel: 'warning',
});
const P = await import(pathToFileURL(bundle).href);

const rounds = Number(args.rounds);
const scale = Number(args.scale);
const cpu = () => {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1e3; // ms
};
const settings = (content) => ({
  content,
  jet: { algorithm: 'antikt', R: 0.4, ptMin: content === 'jets' ? 0 : 20, yMax: content === 'jets' ? 10 : 2.5, maxJets: null },
  softDrop: { zCut: 0.1, beta: 0, R0: 0.4 },
  multiplicityKtCut: 1,
  fullTree: false,
});

// The engine benchmark's inputs (bench/generate-inputs.ts): ±20% particle counts, 30% massive particles.
function records(kind, n, count) {
  const rng = new P.Rng(20240);
  const out = [];
  for (let i = 0; i < count; i++) {
    const ni = Math.max(2, n + rng.int(-Math.round(0.2 * n), Math.round(0.2 * n)));
    out.push(kind === 'jets' ? P.generateJet(rng, { nConstituents: ni, massiveFraction: 0.3 }) : P.generateEvent(rng, { nParticles: ni, nJets: 4, massiveFraction: 0.3 }));
  }
  return out;
}

const cases = [
  ['(a) jets ~60 constituents', 'jets', 60, 20000],
  ['(b) events ~300 particles', 'events', 300, 3000],
  ['(b) events ~1000 particles', 'events', 1000, 800],
];
console.log(`physics only (processParticles), CPU time, best of ${rounds} rounds; Node ${process.version}`);
for (const [label, kind, n, count] of cases) {
  const recs = records(kind, n, Math.max(1, Math.round(count * scale)));
  const s = settings(kind);
  let best = Infinity, jets = 0;
  for (let r = 0; r < rounds; r++) {
    const t0 = cpu();
    jets = 0;
    for (const p of recs) jets += P.processParticles(p, s).jets.length;
    best = Math.min(best, cpu() - t0);
  }
  // Clustering work in pair distances (jet finding only, for events).
  const ws = new P.ClusterWorkspace();
  for (const p of recs.slice(0, 50)) {
    P.loadParticles(ws, p, p.length / 4);
    P.cluster(ws, kind === 'jets' ? { p: 0, R: Infinity } : { p: -1, R: 0.4 });
  }
  const perRec = (best / recs.length) * 1e3;
  console.log(
    `${label.padEnd(28)} ${perRec.toFixed(1).padStart(8)} µs/record  ${((jets / best) * 1e3).toFixed(0).padStart(7)} jets/s  ` +
      `${(ws.ops / Math.min(50, recs.length)).toFixed(0).padStart(7)} pair distances/record (${kind === 'jets' ? 'C/A' : 'anti-kt finding'})`,
  );
}
