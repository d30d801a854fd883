// Engine benchmark: the command a user types, `splitfield decluster` (node_modules/.bin/splitfield, the installed
// bin), against the FastJet reference program (tests/reference/fastjet-ref.cc, FastJet 3.4.0 from Debian) on the
// same generated inputs, whole processes (reading the file and writing the export included on both sides), one
// core each (Splitfield --threads 1), plus Splitfield on all cores for information. Prints throughput, the ratio Splitfield/FastJet against the goals, and peak memory (max RSS).
//
//   npm run bench [-- --scale 0.2] [-- --cases a,b300,b1000] [-- --no-threads]
//
// Cases (issue 3): (a) pre-clustered jets of ~60 constituents: C/A re-clustering + primary declustering
// (goal ≥ 1.0× FastJet's jets/s); (b) anti-kt R = 0.4 jet finding + declustering of events of ~300 and ~1000
// particles (goal ≥ 0.5×). Case (a) uses 100 000 jets and is also the bounded-memory check of `npm run decluster`
// on a 100 000-jet file (compared with the same run on 10 000 jets).
import { execFileSync, spawn } from 'node:child_process';
import { createReadStream, existsSync, mkdirSync, readFileSync, statSync, unlinkSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import readline from 'node:readline';
import { fileURLToPath } from 'node:url';
import { parseArgs } from 'node:util';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const OUT = path.join(ROOT, 'bench/out');
const BIN = path.join(ROOT, 'node_modules/.bin/splitfield');
const REF_SRC = path.join(ROOT, 'tests/reference/fastjet-ref.cc');
const REF_BIN = path.join(ROOT, 'tests/reference/bin/fastjet-ref');
const GEN_SRC = path.join(ROOT, 'bench/generate-inputs.ts');
const GEN = path.join(OUT, 'generate-inputs.cjs');

const { values: args } = parseArgs({
  options: {
    scale: { type: 'string', default: '1' },
    cases: { type: 'string', default: 'a,b300,b1000' },
    'no-threads': { type: 'boolean', default: false },
    'no-memory': { type: 'boolean', default: false },
    keep: { type: 'boolean', default: false },
  },
});
const scale = Number(args.scale);
const cores = os.availableParallelism();

const CASES = {
  a: { label: '(a) jets ~60 const.: C/A + primary', kind: 'jets', n: 60, count: 100_000, goal: 1.0, flags: [] },
  b300: { label: '(b) events ~300: anti-kt 0.4 + decl.', kind: 'events', n: 300, count: 4000, goal: 0.5, flags: ['--R', '0.4', '--algorithm', 'antikt'] },
  b1000: { label: '(b) events ~1000: anti-kt 0.4 + decl.', kind: 'events', n: 1000, count: 1200, goal: 0.5, flags: ['--R', '0.4', '--algorithm', 'antikt'] },
};

function log(s) {
  process.stderr.write(s + '\n');
}

function newer(a, b) {
  return existsSync(a) && statSync(a).mtimeMs >= statSync(b).mtimeMs;
}

async function buildGenerator() {
  mkdirSync(OUT, { recursive: true });
  const { build } = await import('esbuild');
  await build({ entryPoints: [GEN_SRC], outfile: GEN, bundle: true, platform: 'node', target: 'node20', format: 'cjs', logLevel: 'warning' });
}

function ensureRef() {
  if (!existsSync(REF_SRC)) return { ok: false, why: 'tests/reference/fastjet-ref.cc is missing' };
  if (newer(REF_BIN, REF_SRC)) return { ok: true };
  if (!existsSync('/usr/include/fastjet/ClusterSequence.hh') || !existsSync('/usr/include/nlohmann/json.hpp')) {
    return { ok: false, why: 'FastJet headers missing: run scripts/ensure-debian-packages.sh (libfastjet-dev, nlohmann-json3-dev)' };
  }
  mkdirSync(path.dirname(REF_BIN), { recursive: true });
  log('building tests/reference/bin/fastjet-ref (g++ -O2)…');
  const tmp = `${REF_BIN}.${process.pid}.tmp`;
  execFileSync('g++', ['-O2', '-std=c++17', '-o', tmp, REF_SRC, '-lfastjettools', '-lfastjetplugins', '-lfastjet'], { stdio: 'inherit' });
  execFileSync('mv', [tmp, REF_BIN]);
  return { ok: true };
}

function input(c, count) {
  const file = path.join(OUT, `${c.kind}-${c.n}-${count}.jsonl`);
  if (!newer(file, GEN)) {
    log(`generating ${path.relative(ROOT, file)} (${count} ${c.kind} of ~${c.n} particles)…`);
    execFileSync(process.execPath, [GEN, '--kind', c.kind, '--count', String(count), '--n', String(c.n), '--seed', '20240', '--out', file], { stdio: 'inherit' });
  }
  return file;
}

const TIME = existsSync('/usr/bin/time') ? '/usr/bin/time' : null;

/** Runs a command; returns wall seconds, user+sys CPU seconds and peak RSS (MB) of the whole process. */
function measure(cmd, cmdArgs) {
  return new Promise((resolve, reject) => {
    const statFile = path.join(OUT, `time-${process.pid}.txt`);
    const t0 = performance.now();
    const child = TIME
      ? spawn(TIME, ['-f', '%e %U %S %M', '-o', statFile, cmd, ...cmdArgs], { stdio: ['ignore', 'ignore', 'pipe'] })
      : spawn(cmd, cmdArgs, { stdio: ['ignore', 'ignore', 'pipe'] });
    let stderr = '';
    child.stderr.on('data', (d) => (stderr += d));
    // Without /usr/bin/time: sample the high-water mark of the child's resident set.
    let hwm = 0;
    const poll = TIME
      ? null
      : setInterval(() => {
          try {
            const m = /VmHWM:\s+(\d+)/.exec(readFileSync(`/proc/${child.pid}/status`, 'utf8'));
            if (m) hwm = Math.max(hwm, Number(m[1]));
          } catch {}
        }, 20);
    child.on('error', reject);
    child.on('close', (code) => {
      if (poll) clearInterval(poll);
      const wall = (performance.now() - t0) / 1000;
      if (code !== 0) return reject(new Error(`${cmd} ${cmdArgs.join(' ')} exited with ${code}\n${stderr}`));
      if (TIME) {
        const [e, u, s, m] = readFileSync(statFile, 'utf8').trim().split('\n').pop().split(' ').map(Number);
        unlinkSync(statFile);
        resolve({ wall: e > 0 ? e : wall, cpu: u + s, rssMB: m / 1024, stderr });
      } else resolve({ wall, cpu: NaN, rssMB: hwm / 1024, stderr });
    });
  });
}

async function countLines(file) {
  let n = 0;
  await new Promise((res, rej) => {
    createReadStream(file)
      .on('data', (b) => {
        for (let i = b.indexOf(10); i !== -1; i = b.indexOf(10, i + 1)) n++;
      })
      .on('end', res)
      .on('error', rej);
  });
  return n;
}

/** Compares the first `limit` jets of two exports number by number; returns the largest relative difference. */
async function compareExports(a, b, limit = 3000) {
  const open = (f) => readline.createInterface({ input: createReadStream(f), crlfDelay: Infinity })[Symbol.asyncIterator]();
  const ia = open(a), ib = open(b);
  await ia.next();
  await ib.next();
  let maxRel = 0, n = 0, mismatch = null;
  const cmp = (x, y, where) => {
    if (x === null || y === null) {
      if (x !== y && !mismatch) mismatch = where;
      return;
    }
    const d = Math.abs(x - y) / Math.max(1, Math.abs(x), Math.abs(y));
    if (d > maxRel) maxRel = d;
  };
  while (n < limit) {
    const [ra, rb] = [await ia.next(), await ib.next()];
    if (ra.done || rb.done) break;
    const ja = JSON.parse(ra.value), jb = JSON.parse(rb.value);
    n++;
    if (ja.rec !== jb.rec || ja.jet !== jb.jet || ja.n !== jb.n || ja.primary.length !== jb.primary.length) {
      mismatch ??= `rec ${ja.rec} jet ${ja.jet}`;
      continue;
    }
    for (const k of ['pt', 'y', 'phi', 'm', 'weight']) cmp(ja[k], jb[k], `rec ${ja.rec} ${k}`);
    ja.primary.forEach((row, i) => row.forEach((x, q) => cmp(x, jb.primary[i][q], `rec ${ja.rec} primary`)));
    ja.sd.forEach((x, q) => cmp(x, jb.sd[q], `rec ${ja.rec} sd`));
    if (ja.mult !== jb.mult) mismatch ??= `rec ${ja.rec} mult`;
  }
  return { compared: n, maxRel, mismatch };
}

const fmt = (x, d = 0) => (Number.isFinite(x) ? x.toLocaleString('en-US', { maximumFractionDigits: d, minimumFractionDigits: d }) : '-');

async function main() {
  if (!existsSync(BIN)) throw new Error('node_modules/.bin/splitfield is missing: run npm install (it links the command)');
  // Builds the engine bundle now if it is stale, so that no timed run includes a build.
  execFileSync(BIN, ['decluster', '--version'], { stdio: 'ignore' });
  log('timing the installed command: node_modules/.bin/splitfield decluster …');
  await buildGenerator();
  const ref = ensureRef();
  if (!ref.ok) log(`FastJet reference unavailable (${ref.why}): Splitfield only.`);
  const load = os.loadavg()[0];
  log(`machine: ${cores} cores, ${os.cpus()[0]?.model ?? '?'}, load average ${load.toFixed(2)}; Node ${process.version}`);
  if (load > 0.5 * cores) log('note: the machine is busy (load average above half the cores): timings are noisy.');

  const rows = [];
  let memory = null;
  for (const key of args.cases.split(',')) {
    const c = CASES[key.trim()];
    if (!c) throw new Error(`unknown case ${key}`);
    const count = Math.max(10, Math.round(c.count * scale));
    const file = input(c, count);
    const sizeMB = statSync(file).size / 1048576;
    const outOurs = path.join(OUT, `${key}-splitfield.jsonl`);
    const outRef = path.join(OUT, `${key}-fastjet.jsonl`);
    log(`${c.label}: ${count} records, ${fmt(sizeMB)} MB`);
    const ours = await measure(BIN, ['decluster', file, '--threads', '1', '--out', outOurs, ...c.flags]);
    const jets = (await countLines(outOurs)) - 1;
    const oursRate = jets / ours.wall;
    log(`  splitfield --threads 1: ${ours.wall.toFixed(2)} s (CPU ${ours.cpu.toFixed(2)} s), ${fmt(oursRate)} jets/s, peak RSS ${fmt(ours.rssMB)} MB`);
    let fj = null, agree = null;
    if (ref.ok) {
      fj = await measure(REF_BIN, [file, '--out', outRef, ...c.flags]);
      const fjJets = (await countLines(outRef)) - 1;
      fj.rate = fjJets / fj.wall;
      fj.jets = fjJets;
      agree = await compareExports(outOurs, outRef);
      agree.sameCount = fjJets === jets;
      log(`  fastjet-ref:             ${fj.wall.toFixed(2)} s (CPU ${fj.cpu.toFixed(2)} s), ${fmt(fj.rate)} jets/s, peak RSS ${fmt(fj.rssMB)} MB`);
    }
    let multi = null;
    if (!args['no-threads'] && cores > 1) {
      multi = await measure(BIN, ['decluster', file, '--threads', String(cores), '--out', outOurs, ...c.flags]);
      multi.rate = jets / multi.wall;
      log(`  splitfield --threads ${cores}: ${multi.wall.toFixed(2)} s (CPU ${multi.cpu.toFixed(2)} s), ${fmt(multi.rate)} jets/s, peak RSS ${fmt(multi.rssMB)} MB`);
    }
    rows.push({ key, c, count, sizeMB, jets, ours, oursRate, fj, agree, multi });
    if (key === 'a' && !args['no-memory']) {
      const small = input(c, Math.max(10, Math.round(count / 10)));
      const m = await measure(BIN, ['decluster', small, '--threads', '1', '--out', outOurs]);
      memory = { smallCount: Math.round(count / 10), smallRss: m.rssMB, bigCount: count, bigRss: ours.rssMB, bigMB: sizeMB };
    }
    if (!args.keep) for (const f of [outOurs, outRef]) if (existsSync(f)) unlinkSync(f);
  }

  // Table
  const head = [
    'case',
    'records',
    'jets',
    'input MB',
    'Splitfield jets/s',
    'FastJet jets/s',
    'ratio',
    'goal',
    'ratio by CPU time',
    'Splitfield RSS MB',
    'FastJet RSS MB',
    `Splitfield ×${cores} threads jets/s`,
    'outputs agree',
  ];
  const body = rows.map((r) => {
    const ratio = r.fj ? r.oursRate / r.fj.rate : NaN;
    // jets per CPU second (user + system, all threads of the process): less sensitive to a busy machine
    const cpuRatio = r.fj ? r.jets / r.ours.cpu / (r.fj.jets / r.fj.cpu) : NaN;
    const agree = r.agree
      ? r.agree.sameCount && !r.agree.mismatch
        ? `yes (${r.agree.compared} jets, max rel. diff ${r.agree.maxRel.toExponential(1)})`
        : `NO (${r.agree.sameCount ? '' : 'jet counts differ; '}${r.agree.mismatch ?? ''})`
      : '-';
    return [
      r.c.label,
      fmt(r.count),
      fmt(r.jets),
      fmt(r.sizeMB),
      fmt(r.oursRate),
      r.fj ? fmt(r.fj.rate) : '-',
      Number.isFinite(ratio) ? ratio.toFixed(2) + '×' : '-',
      `≥ ${r.c.goal.toFixed(1)}× ${Number.isFinite(ratio) ? (ratio >= r.c.goal ? 'met' : 'NOT met') : ''}`,
      Number.isFinite(cpuRatio) ? cpuRatio.toFixed(2) + '×' : '-',
      fmt(r.ours.rssMB),
      r.fj ? fmt(r.fj.rssMB) : '-',
      r.multi ? `${fmt(r.multi.rate)} (${(r.multi.rate / r.oursRate).toFixed(2)}×, CPU ${r.multi.cpu.toFixed(1)} s vs ${r.ours.cpu.toFixed(1)} s)` : '-',
      agree,
    ];
  });
  const widths = head.map((h, i) => Math.max(h.length, ...body.map((b) => b[i].length)));
  const line = (cells) => '| ' + cells.map((c, i) => c.padEnd(widths[i])).join(' | ') + ' |';
  console.log('\nSplitfield engine benchmark: `splitfield decluster` (the installed command) against fastjet-ref, whole processes (read file + compute + write export; one core unless noted)');
  console.log('jets/s and the goal use wall-clock time; "ratio by CPU time" uses user+system CPU seconds of each process.');
  console.log(line(head));
  console.log('|' + widths.map((w) => '-'.repeat(w + 2)).join('|') + '|');
  for (const b of body) console.log(line(b));
  if (memory) {
    console.log(
      `\nBounded memory of \`splitfield decluster\` (--threads 1): peak RSS ${fmt(memory.smallRss)} MB on ${fmt(memory.smallCount)} jets, ` +
        `${fmt(memory.bigRss)} MB on ${fmt(memory.bigCount)} jets (input ${fmt(memory.bigMB)} MB): ` +
        (memory.bigRss < 1.5 * memory.smallRss + 50 ? 'bounded (does not grow with the file).' : 'GROWS with the file size!'),
    );
  }
  console.log(`Load average at the end: ${os.loadavg()[0].toFixed(2)} on ${cores} cores.`);
}

main().catch((e) => {
  console.error(e?.stack ?? e);
  process.exit(1);
});
