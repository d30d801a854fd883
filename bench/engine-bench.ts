// Engine benchmark: Splitfield against the fastest honest C++ program on FastJet 3.4.0 (Debian libfastjet-dev),
// tests/reference/fastjet-speed.cc (streaming hand-written reader with std::from_chars, std::to_chars output), on
// the same generated files. Whole processes are timed as users run them: the installed command
// `node_modules/.bin/splitfield decluster` (bin/splitfield.mjs). Per case it prints both times, the ratio
// (FastJet's time / ours: higher is better), the ratio of CPU times, stage times, peak memory, and for the
// physics cases the fitted growth exponent of the time per event with N on both sides.
//
//   npm run bench [-- --only physics,recluster,whole,json,threads,memory,language] [-- --quick] [-- --rounds 3]
//
// Sections (issue 13's goals in brackets):
//  physics    the physics alone (records in memory: jet finding, selection, C/A re-clustering, declustering,
//             observables): anti-kt, kt and C/A at R = 0.4, 0.8, 1.2 on events of 100 … 10 000 particles
//             [≥ 1.0×, exponent no larger than FastJet's]
//  recluster  the physics alone on single jets of 30 … 3 000 constituents (C/A re-clustering + declustering)
//             [≥ 1.0×, exponent no larger]
//  whole      whole processes, one thread, --all: 20 000 jets of 60 constituents [≥ 1.0×] and 1 500 events of
//             about 320 particles [≥ 0.8×]; stage times of both; the outputs compared number by number
//  json       the engine's JSON reading against JSON.parse of the same lines [≤ 1.3×]
//  threads    --threads 2 against --threads 1 on both files [≥ 1.8× on an idle machine; no single-threaded
//             stage above 1/16 of the work]
//  memory     peak RSS of the command on the events file and on a file 4 times larger [independent of size]
//  language   not a goal: the engine's C/A re-clustering loop against its line-for-line C++ port
//             (bench/same-loop/plain-ca.cc, g++ -O2) on the same jets: what the language costs on identical work
// Physics timings are CPU seconds of the fastest of several rounds on each side (steadier than wall time on a
// shared machine); whole processes are timed 3 times, the two programs of a comparison alternately, and the fastest
// wall time kept with its CPU time (the slowest is printed beside it).
import { execFileSync, spawn } from 'node:child_process';
import { createReadStream, existsSync, mkdirSync, readFileSync, statSync, unlinkSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import readline from 'node:readline';
import { parseArgs } from 'node:util';
import { build } from 'esbuild';
import { ensureReferenceProgram } from '../tests/reference/fastjet';

const ROOT = path.resolve(__dirname, '..');
const OUT = path.join(ROOT, 'bench/out');
const BIN = path.join(ROOT, 'node_modules/.bin/splitfield');
const SECTIONS = ['physics', 'recluster', 'whole', 'json', 'threads', 'memory', 'language'] as const;
type Section = (typeof SECTIONS)[number];

const { values: args } = parseArgs({
  options: {
    only: { type: 'string', default: SECTIONS.join(',') },
    quick: { type: 'boolean', default: false },
    rounds: { type: 'string', default: '3' },
  },
});
const only = new Set(args.only!.split(',').map((s) => s.trim()) as Section[]);
for (const s of only) if (!SECTIONS.includes(s)) throw new Error(`--only: unknown section ${s} (${SECTIONS.join(', ')})`);
const quick = !!args.quick;
const rounds = Number(args.rounds);

const log = (s: string) => process.stderr.write(s + '\n');
const out = (s = '') => process.stdout.write(s + '\n');
const fixed = (x: number, d = 2) => (Number.isFinite(x) ? x.toFixed(d) : '-');

// ---------------------------------------------------------------------------------------------------------
// Tools: the input generator and the engine timing tool, bundled from their TypeScript sources.

const GEN = path.join(OUT, 'generate-inputs.cjs');
const TIMING = path.join(OUT, 'engine-timing.cjs');

async function bundleTools(): Promise<void> {
  mkdirSync(OUT, { recursive: true });
  for (const [src, file] of [['bench/generate-inputs.ts', GEN], ['bench/engine-timing.ts', TIMING]]) {
    await build({ entryPoints: [path.join(ROOT, src)], outfile: file, bundle: true, platform: 'node', target: 'node20', format: 'cjs', logLevel: 'warning' });
  }
}

interface InputSpec {
  kind: 'events' | 'jets';
  n: number;
  count: number;
  vary: number;
  sprays?: number;
}

/** A generated input file (made once; kept while newer than the generator). */
function input(s: InputSpec): string {
  const file = path.join(OUT, `${s.kind}-${s.n}x${s.count}-v${s.vary}${s.sprays ? `-s${s.sprays}` : ''}.jsonl`);
  if (!existsSync(file) || statSync(file).mtimeMs < statSync(path.join(ROOT, 'bench/generate-inputs.ts')).mtimeMs) {
    log(`generating ${path.relative(ROOT, file)}…`);
    const a = ['--kind', s.kind, '--count', String(s.count), '--n', String(s.n), '--vary', String(s.vary), '--seed', '20240', '--out', file];
    if (s.sprays) a.push('--sprays', String(s.sprays));
    execFileSync(process.execPath, [GEN, ...a], { stdio: 'inherit' });
  }
  return file;
}

// ---------------------------------------------------------------------------------------------------------
// Running programs.

interface Measured {
  wall: number;
  cpu: number;
  rssMB: number;
  stderr: string;
  stdout: string;
}

/** Runs a command under /usr/bin/time: wall seconds, user+system CPU seconds, peak RSS (MB). */
function measure(cmd: string, cmdArgs: string[]): Promise<Measured> {
  return new Promise((resolve, reject) => {
    const statFile = path.join(OUT, `time-${process.pid}.txt`);
    const child = spawn('/usr/bin/time', ['-f', '%e %U %S %M', '-o', statFile, cmd, ...cmdArgs], { stdio: ['ignore', 'pipe', 'pipe'] });
    let stderr = '', stdout = '';
    child.stdout.on('data', (d) => (stdout += d));
    child.stderr.on('data', (d) => (stderr += d));
    child.on('error', reject);
    child.on('close', (code) => {
      if (code !== 0) return reject(new Error(`${cmd} ${cmdArgs.join(' ')} exited with ${code}\n${stderr}`));
      const [e, u, s, m] = readFileSync(statFile, 'utf8').trim().split('\n').pop()!.split(' ').map(Number);
      unlinkSync(statFile);
      resolve({ wall: e, cpu: u + s, rssMB: m / 1024, stderr, stdout });
    });
  });
}

/** The fastest run of a program (by wall time) and the range of its wall times over the rounds. */
interface Best extends Measured {
  slowest: number;
}

/**
 * Runs two programs alternately, `n` rounds of A then B, so that a change of the machine's speed during the
 * benchmark (other load on a shared machine) reaches both alike; the fastest run of each, with its range.
 */
async function bestOfPair(n: number, a: () => Promise<Measured>, b: () => Promise<Measured>): Promise<[Best, Best]> {
  const found: [Best | null, Best | null] = [null, null];
  for (let i = 0; i < n; i++) {
    for (const [k, run] of [a, b].entries()) {
      const m = await run();
      const f = found[k];
      found[k] = !f || m.wall < f.wall ? { ...m, slowest: Math.max(m.wall, f?.slowest ?? 0) } : { ...f, slowest: Math.max(f.slowest, m.wall) };
    }
  }
  return found as [Best, Best];
}

/** A fastest wall time with the range of the rounds: "2.69 (–2.95)". */
const withRange = (m: Best) => (m.slowest > m.wall + 0.005 ? `${fixed(m.wall)} (–${fixed(m.slowest)})` : fixed(m.wall));

let FJ = '';

interface PhysicsTiming {
  records: number;
  particles: number;
  jets: number;
  splittings: number;
  cpuSeconds: number;
  wallSeconds: number;
  strategy?: string;
}

async function physicsTimings(file: string, flags: string[]): Promise<{ ours: PhysicsTiming; fj: PhysicsTiming }> {
  const r = ['--rounds', String(Math.max(3, rounds)), '--min-seconds', quick ? '0.05' : '0.15'];
  const fj = JSON.parse((await measure(FJ, ['--physics-only', ...r, ...flags, file])).stdout) as PhysicsTiming;
  const ours = JSON.parse((await measure(process.execPath, [TIMING, 'physics', file, ...flags, ...r])).stdout) as PhysicsTiming;
  if (ours.jets !== fj.jets || ours.splittings !== fj.splittings) {
    throw new Error(`physics on ${file} ${flags.join(' ')}: ${ours.jets} jets / ${ours.splittings} splittings, FastJet ${fj.jets} / ${fj.splittings}`);
  }
  return { ours, fj };
}

/** Least-squares slope of ln(y) against ln(x). */
function exponent(xs: number[], ys: number[]): number {
  const lx = xs.map(Math.log), ly = ys.map(Math.log);
  const mx = lx.reduce((a, b) => a + b, 0) / lx.length, my = ly.reduce((a, b) => a + b, 0) / ly.length;
  let num = 0, den = 0;
  for (let i = 0; i < lx.length; i++) {
    num += (lx[i] - mx) * (ly[i] - my);
    den += (lx[i] - mx) ** 2;
  }
  return num / den;
}

function table(head: string[], rows: string[][]): void {
  const w = head.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i].length)));
  const line = (cells: string[]) => '| ' + cells.map((c, i) => c.padEnd(w[i])).join(' | ') + ' |';
  out(line(head));
  out('|' + w.map((x) => '-'.repeat(x + 2)).join('|') + '|');
  for (const r of rows) out(line(r));
}

const verdict = (ok: boolean) => (ok ? 'met' : 'NOT met');
const results: Record<string, unknown> = {};

// ---------------------------------------------------------------------------------------------------------
// Sections.

const EVENT_SIZES = quick ? [100, 1000, 10000] : [100, 300, 1000, 3000, 10000];
const JET_SIZES = quick ? [30, 300, 3000] : [30, 100, 300, 1000, 3000];
/** Records per file: about 300 000 particles (30 000 in --quick), at least 10. */
const countFor = (n: number) => Math.max(10, Math.round((quick ? 30_000 : 300_000) / n));

/** Events grow as real ones do: more jets, not ever denser ones (one spray per 100 particles, at least 3). */
const eventFile = (n: number) => input({ kind: 'events', n, count: countFor(n), vary: 0, sprays: Math.max(3, Math.round(n / 100)) });

async function physicsSection(): Promise<void> {
  out('\n## Physics alone (records in memory), one thread: jet finding, selection (pt > 20 GeV, |y| < 2.5), C/A re-clustering, primary declustering, SoftDrop');
  out('Times per event (CPU, fastest round); ratio = FastJet / Splitfield (higher is better; goal ≥ 1.0). Events of N particles, one spray (jet) per 100 particles (at least 3), soft background in |y| < 4.');
  const rows: string[][] = [];
  const summary: string[][] = [];
  const all: Record<string, unknown>[] = [];
  for (const algorithm of ['antikt', 'kt', 'ca']) {
    for (const R of [0.4, 0.8, 1.2]) {
      const ours: number[] = [], fj: number[] = [];
      for (const n of EVENT_SIZES) {
        const file = eventFile(n);
        const t = await physicsTimings(file, ['--algorithm', algorithm, '--R', String(R)]);
        const a = (t.ours.cpuSeconds / t.ours.records) * 1e3, b = (t.fj.cpuSeconds / t.fj.records) * 1e3;
        const aw = (t.ours.wallSeconds / t.ours.records) * 1e3, bw = (t.fj.wallSeconds / t.fj.records) * 1e3;
        ours.push(a);
        fj.push(b);
        rows.push([`${algorithm} R=${R}`, String(n), fixed(aw, 3), fixed(bw, 3), fixed(bw / aw) + '×', fixed(b / a) + '×', t.fj.strategy ?? '', verdict(b / a >= 1)]);
        all.push({ algorithm, R, n, oursMs: a, fastjetMs: b, oursWallMs: aw, fastjetWallMs: bw, strategy: t.fj.strategy });
        log(`  physics ${algorithm} R=${R} N=${n}: ${a.toFixed(3)} ms vs ${b.toFixed(3)} ms (${(b / a).toFixed(2)}×)`);
      }
      const eo = exponent(EVENT_SIZES, ours), ef = exponent(EVENT_SIZES, fj);
      summary.push([`${algorithm} R=${R}`, fixed(eo), fixed(ef), verdict(eo <= ef + 0.02)]);
    }
  }
  table(['case', 'N', 'Splitfield ms/event (wall)', 'FastJet ms/event (wall)', 'ratio (wall)', 'ratio (CPU)', 'FastJet strategy', 'goal ≥ 1.0 (CPU)'], rows);
  out('\nGrowth of the time per event with N (fitted exponent of ms/event ∝ N^k over the sizes above):');
  table(['case', 'Splitfield k', 'FastJet k', 'goal: no larger (±0.02)'], summary);
  results.physics = all;
}

async function reclusterSection(): Promise<void> {
  out('\n## C/A re-clustering of single jets (physics alone, records in memory), one thread: re-clustering, primary declustering, SoftDrop');
  const rows: string[][] = [];
  const ours: number[] = [], fj: number[] = [];
  const all: Record<string, unknown>[] = [];
  for (const n of JET_SIZES) {
    const file = input({ kind: 'jets', n, count: countFor(n), vary: 0 });
    const t = await physicsTimings(file, ['--ptmin', '0', '--ymax', '10']);
    const a = (t.ours.cpuSeconds / t.ours.records) * 1e3, b = (t.fj.cpuSeconds / t.fj.records) * 1e3;
    const aw = (t.ours.wallSeconds / t.ours.records) * 1e3, bw = (t.fj.wallSeconds / t.fj.records) * 1e3;
    ours.push(a);
    fj.push(b);
    rows.push([String(n), fixed(aw, 4), fixed(bw, 4), fixed(bw / aw) + '×', fixed(b / a) + '×', t.fj.strategy ?? '', verdict(b / a >= 1)]);
    all.push({ n, oursMs: a, fastjetMs: b, oursWallMs: aw, fastjetWallMs: bw, strategy: t.fj.strategy });
    log(`  recluster N=${n}: ${a.toFixed(4)} ms vs ${b.toFixed(4)} ms (${(b / a).toFixed(2)}×)`);
  }
  table(['constituents', 'Splitfield ms/jet (wall)', 'FastJet ms/jet (wall)', 'ratio (wall)', 'ratio (CPU)', 'FastJet strategy', 'goal ≥ 1.0 (CPU)'], rows);
  const eo = exponent(JET_SIZES, ours), ef = exponent(JET_SIZES, fj);
  out(`Fitted exponent of ms/jet ∝ N^k: Splitfield ${fixed(eo)}, FastJet ${fixed(ef)} (goal: no larger: ${verdict(eo <= ef + 0.02)})`);
  results.recluster = { cases: all, exponent: { splitfield: eo, fastjet: ef } };
}

const WHOLE = {
  jets: { spec: { kind: 'jets', n: 60, count: 20000, vary: 0.2 } as InputSpec, goal: 1.0, flags: ['--all'] },
  events: { spec: { kind: 'events', n: 320, count: 1500, vary: 0.2, sprays: 4 } as InputSpec, goal: 0.8, flags: ['--all'] },
};

const ourTimings = (m: Measured) => JSON.parse(/decluster timings: (.*)/.exec(m.stderr)?.[1] ?? 'null') as Record<string, number> | null;
const fjTimings = (m: Measured) => (JSON.parse(/(\{"timings".*)/.exec(m.stderr)?.[1] ?? 'null') as { timings: Record<string, number> } | null)?.timings ?? null;
const stageText = (t: Record<string, number> | null, keys: string[]) => (t ? keys.filter((k) => t[k] > 0).map((k) => `${k} ${fixed(t[k])}`).join(', ') : '-');

function runOurs(file: string, flags: string[], threads: number, outFile: string): Promise<Measured> {
  return measure(BIN, ['decluster', file, '--threads', String(threads), '--out', outFile, '--timings', '--quiet', ...flags]);
}

/** Compares two exports number by number: the largest relative difference, or where they differ. */
async function compareExports(a: string, b: string): Promise<{ compared: number; maxRel: number; mismatch: string | null }> {
  const open = (f: string) => readline.createInterface({ input: createReadStream(f), crlfDelay: Infinity })[Symbol.asyncIterator]();
  const ia = open(a), ib = open(b);
  await ia.next();
  await ib.next();
  let maxRel = 0, compared = 0;
  let mismatch: string | null = null;
  const cmp = (x: unknown, y: unknown, where: string): void => {
    if (Array.isArray(x) && Array.isArray(y)) {
      if (x.length !== y.length) mismatch ??= `${where}: lengths ${x.length} and ${y.length}`;
      else x.forEach((v, i) => cmp(v, y[i], where));
    } else if (typeof x === 'number' && typeof y === 'number') {
      maxRel = Math.max(maxRel, Math.abs(x - y) / Math.max(1, Math.abs(x), Math.abs(y)));
    } else if (x !== y) mismatch ??= `${where}: ${JSON.stringify(x)} and ${JSON.stringify(y)}`;
  };
  for (;;) {
    const [ra, rb] = [await ia.next(), await ib.next()];
    if (ra.done || rb.done) {
      if (!ra.done || !rb.done) mismatch ??= 'the exports have different numbers of jets';
      break;
    }
    const ja = JSON.parse(ra.value), jb = JSON.parse(rb.value);
    compared++;
    for (const k of ['rec', 'jet', 'n', 'mult', 'pt', 'y', 'phi', 'm', 'weight', 'primary', 'all', 'sd']) cmp(ja[k], jb[k], `jet ${compared} ${k}`);
  }
  return { compared, maxRel, mismatch };
}

async function wholeSection(): Promise<void> {
  out('\n## Whole processes, one thread: read the file, compute, write the export (--all); the installed command against fastjet-speed');
  const rows: string[][] = [];
  const stages: string[][] = [];
  const all: Record<string, unknown> = {};
  for (const [key, c] of Object.entries(WHOLE)) {
    const file = input(c.spec);
    const mine = path.join(OUT, `whole-${key}-splitfield.jsonl`), theirs = path.join(OUT, `whole-${key}-fastjet.jsonl`);
    const [ours, fj] = await bestOfPair(
      rounds,
      () => runOurs(file, c.flags, 1, mine),
      () => measure(FJ, [file, '--out', theirs, '--timings', ...c.flags]),
    );
    const agree = await compareExports(mine, theirs);
    const label = `${c.spec.count} ${c.spec.kind} of ~${c.spec.n} (${fixed(statSync(file).size / 1048576, 0)} MB)`;
    const ratio = fj.wall / ours.wall, cpuRatio = fj.cpu / ours.cpu;
    rows.push([
      label, withRange(ours), withRange(fj), fixed(ratio) + '×', fixed(cpuRatio) + '×', `≥ ${c.goal} ${verdict(ratio >= c.goal)}`,
      `${fixed(ours.rssMB, 0)} / ${fixed(fj.rssMB, 0)}`,
      agree.mismatch ? `NO: ${agree.mismatch}` : `yes, ${agree.compared} jets, max rel. diff ${agree.maxRel.toExponential(1)}`,
    ]);
    stages.push([label, stageText(ourTimings(ours), ['read', 'parse', 'physics', 'format', 'delivery']), stageText(fjTimings(fj), ['read', 'parse', 'physics', 'write'])]);
    all[key] = { oursWall: ours.wall, oursCpu: ours.cpu, fastjetWall: fj.wall, fastjetCpu: fj.cpu, oursRssMB: ours.rssMB, fastjetRssMB: fj.rssMB, oursStages: ourTimings(ours), fastjetStages: fjTimings(fj), agree };
    log(`  whole ${key}: ${ours.wall.toFixed(2)} s vs ${fj.wall.toFixed(2)} s (${ratio.toFixed(2)}×, CPU ${cpuRatio.toFixed(2)}×)`);
    for (const f of [mine, theirs]) if (existsSync(f)) unlinkSync(f);
  }
  table(['input', 'Splitfield s (fastest, –slowest)', 'FastJet s (fastest, –slowest)', 'ratio', 'ratio (CPU)', 'goal', 'peak RSS MB (ours / FastJet)', 'outputs agree'], rows);
  out('Stage times (seconds; Splitfield: read = waiting for input and cutting it into batches, format = export text, delivery = writing it in order; FastJet: write = formatting and fwrite):');
  table(['input', 'Splitfield', 'FastJet'], stages);
  results.whole = all;
}

async function jsonSection(): Promise<void> {
  out('\n## JSON reading against JSON.parse of the same lines (CPU, fastest of the rounds)');
  const file = input(WHOLE.events.spec);
  const m = await measure(process.execPath, [TIMING, 'json', file, '--rounds', String(Math.max(3, rounds))]);
  const t = JSON.parse(m.stdout) as { records: number; bytes: number; engineSeconds: number; jsonParseSeconds: number };
  const ratio = t.engineSeconds / t.jsonParseSeconds;
  out(`The engine's reading (line source, record parsing and checks into typed arrays): ${fixed(t.engineSeconds, 3)} s; the same line source with JSON.parse of each line only: ${fixed(t.jsonParseSeconds, 3)} s.`);
  out(`${t.records} records, ${fixed(t.bytes / 1048576, 0)} MB: ${fixed((t.bytes / 1048576) / t.engineSeconds, 0)} MB/s; ratio ${fixed(ratio)}× (goal ≤ 1.3: ${verdict(ratio <= 1.3)})`);
  results.json = { ...t, ratio };
}

async function threadsSection(): Promise<void> {
  out('\n## Threads: --threads 2 against --threads 1, whole processes (--all)');
  const rows: string[][] = [];
  const all: Record<string, unknown> = {};
  for (const [key, c] of Object.entries(WHOLE)) {
    const file = input(c.spec);
    const o = path.join(OUT, `threads-${key}.jsonl`);
    const [one, two] = await bestOfPair(rounds, () => runOurs(file, c.flags, 1, o), () => runOurs(file, c.flags, 2, o));
    const t2 = ourTimings(two);
    // Single-threaded stages (the main thread's own work) against all the work done (CPU of every stage).
    const main = t2 ? { read: t2.read, dispatch: t2.dispatch, delivery: t2.delivery } : null;
    const work = t2 ? t2.read + t2.dispatch + t2.delivery + t2.parse + t2.physics + t2.format : NaN;
    const [worstName, worst] = main ? Object.entries(main).sort((a, b) => b[1] - a[1])[0] : ['-', NaN];
    const speedup = one.wall / two.wall;
    rows.push([
      key, withRange(one), withRange(two), `${fixed(speedup)}× (${verdict(speedup >= 1.8)})`, `${fixed(one.cpu)} / ${fixed(two.cpu)}`,
      stageText(t2, ['read', 'dispatch', 'wait', 'delivery', 'parse', 'physics', 'format']),
      `${worstName} ${fixed((100 * worst) / work, 1)} % (${verdict(worst / work <= 1 / 16)})`,
    ]);
    all[key] = { oneWall: one.wall, twoWall: two.wall, oneCpu: one.cpu, twoCpu: two.cpu, stages: t2 };
    log(`  threads ${key}: ${one.wall.toFixed(2)} s → ${two.wall.toFixed(2)} s (${speedup.toFixed(2)}×)`);
    if (existsSync(o)) unlinkSync(o);
  }
  table(['input', '1 thread s (fastest, –slowest)', '2 threads s (fastest, –slowest)', 'speed-up (goal ≥ 1.8)', 'CPU s (1 / 2)', 'stages with 2 threads (s; parse, physics, format summed over the workers)', 'largest single-threaded stage / all work (goal ≤ 6.25 %)'], rows);
  results.threads = all;
}

/** The C++ port of the re-clustering loop, built (g++ -O2) when missing or older than its source. */
function samePortProgram(): string {
  const source = path.join(ROOT, 'bench/same-loop/plain-ca.cc');
  const bin = path.join(OUT, 'plain-ca');
  if (!existsSync(bin) || statSync(bin).mtimeMs < statSync(source).mtimeMs) {
    execFileSync('g++', ['-O2', '-std=c++17', '-o', bin, source], { stdio: 'pipe' });
  }
  return bin;
}

interface LoopTiming {
  records: number;
  ops: number;
  checksum: number;
  cpuSeconds: number;
}

async function languageSection(): Promise<void> {
  out('\n## Same loop, two languages (not a goal): the C/A re-clustering loop (plain strategy) against its line-for-line C++ port');
  out('bench/same-loop/plain-ca.cc, g++ -O2: the same operations, order and tie-breaking on the same jets (pair distances counted and trees compared). CPU, fastest round.');
  const port = samePortProgram();
  const rows: string[][] = [];
  const all: Record<string, unknown>[] = [];
  for (const n of [30, 60, 100, 200]) {
    const file = input({ kind: 'jets', n, count: countFor(n), vary: 0 });
    const dump = path.join(OUT, `particles-${n}.bin`);
    const r = ['--rounds', String(Math.max(3, rounds)), '--min-seconds', quick ? '0.05' : '0.2'];
    const js = JSON.parse((await measure(process.execPath, [TIMING, 'ca-loop', file, '--dump', dump, ...r])).stdout) as LoopTiming;
    const cc = JSON.parse((await measure(port, [dump, ...r])).stdout) as LoopTiming;
    unlinkSync(dump);
    if (js.ops !== cc.ops || Math.abs(js.checksum - cc.checksum) > 1e-9 * Math.abs(cc.checksum)) {
      throw new Error(`the C++ port did other work on ${file}: ${cc.ops} distances, trees ${cc.checksum}; TypeScript ${js.ops}, ${js.checksum}`);
    }
    const a = (js.cpuSeconds / js.records) * 1e6, b = (cc.cpuSeconds / cc.records) * 1e6;
    rows.push([String(n), fixed(a), fixed(b), fixed(a / b) + '×', fixed((js.cpuSeconds / js.ops) * 1e9), fixed((cc.cpuSeconds / cc.ops) * 1e9)]);
    all.push({ n, typescriptUs: a, cppUs: b, ops: js.ops / js.records });
    log(`  same loop N=${n}: ${a.toFixed(2)} µs vs ${b.toFixed(2)} µs (${(a / b).toFixed(2)}×)`);
  }
  table(['constituents', 'TypeScript µs/jet', 'C++ µs/jet', 'TypeScript / C++', 'TypeScript ns/distance', 'C++ ns/distance'], rows);
  results.language = all;
}

async function memorySection(): Promise<void> {
  out('\n## Memory: peak RSS of the command (--threads 1, --all) on the events file and on a 4 times larger one');
  const small = input(WHOLE.events.spec);
  const big = input({ ...WHOLE.events.spec, count: 4 * WHOLE.events.spec.count });
  const o = path.join(OUT, 'memory.jsonl');
  const a = await runOurs(small, ['--all'], 1, o);
  const b = await runOurs(big, ['--all'], 1, o);
  if (existsSync(o)) unlinkSync(o);
  const grows = b.rssMB > 1.25 * a.rssMB + 20;
  out(`${fixed(statSync(small).size / 1048576, 0)} MB: ${fixed(a.rssMB, 0)} MB; ${fixed(statSync(big).size / 1048576, 0)} MB: ${fixed(b.rssMB, 0)} MB → ${grows ? 'GROWS with the file size' : 'independent of the file size'}`);
  results.memory = { smallMB: a.rssMB, bigMB: b.rssMB };
}

async function main(): Promise<void> {
  if (!existsSync(BIN)) throw new Error('node_modules/.bin/splitfield is missing: run npm install (it links the command)');
  if (!existsSync('/usr/bin/time')) throw new Error('the benchmark measures CPU time and peak memory with /usr/bin/time: apt-get install -y time');
  // Builds the engine bundle now if it is stale, so that no timed run includes a build.
  execFileSync(BIN, ['decluster', '--version'], { stdio: 'ignore' });
  await bundleTools();
  FJ = ensureReferenceProgram('fastjet-speed');
  const load = os.loadavg()[0];
  const cores = os.availableParallelism();
  const machine = `${cores} cores, ${os.cpus()[0]?.model ?? '?'}, Node ${process.version}, load average ${load.toFixed(2)} at the start`;
  out('# Splitfield engine benchmark');
  out(`Splitfield: node_modules/.bin/splitfield decluster (the installed command) and, for the physics alone, bench/engine-timing.ts on the same engine code.`);
  out(`Reference: tests/reference/fastjet-speed.cc on FastJet ${execFileSync('fastjet-config', ['--version']).toString().trim()} (Debian libfastjet-dev), g++ -O2: streaming hand-written reader (std::from_chars), std::to_chars output.`);
  out(`Machine: ${machine}.`);
  if (load > 0.5 * cores) out('Note: the machine is busy (load average above half the cores): wall times are noisy; CPU-time ratios are steadier.');
  const t0 = performance.now();
  if (only.has('physics')) await physicsSection();
  if (only.has('recluster')) await reclusterSection();
  if (only.has('whole')) await wholeSection();
  if (only.has('json')) await jsonSection();
  if (only.has('threads')) await threadsSection();
  if (only.has('memory')) await memorySection();
  if (only.has('language')) await languageSection();
  out(`\nLoad average at the end: ${os.loadavg()[0].toFixed(2)} on ${cores} cores; the benchmark took ${fixed((performance.now() - t0) / 60000, 1)} min.`);
  writeFileSync(path.join(OUT, 'engine-bench.json'), JSON.stringify({ machine, results }, null, 1));
}

main().catch((e) => {
  console.error(e?.stack ?? e);
  process.exit(1);
});
