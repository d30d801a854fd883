// Columnar input benchmark: the same generated sample as JSON Lines and as Parquet (and Arrow IPC), through the
// installed command (`splitfield decluster`, one thread, whole processes, best of --repeat runs) and through the
// upload route of a real server (curl with an API token, polled until done). Prints wall and CPU times and the
// ratios JSON Lines / columnar; goal (issue 12): the columnar path at least 3× faster end to end.
//
//   npm run bench:columnar [-- --kind jets|events] [-- --count N] [-- --n PARTICLES] [-- --repeat 3] [-- --no-server]
import { spawnSync } from 'node:child_process';
import { mkdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { loadavg } from 'node:os';
import path from 'node:path';
import { parseArgs } from 'node:util';
import { Rng } from '../lib/physics/random';
import { writeArrow, writeParquet, type ColumnarRecord } from '../tests/support/columnar-files';
import { generateEvent, generateJet } from '../tests/support/test-events';
import { signIn, startTestServer, type TestServer } from '../tests/support/server';
import { cpuMs, curlUpload, waitForJobs, waitForSampleEnd } from './server-tools';

const ROOT = path.resolve(__dirname, '..');
const BIN = path.join(ROOT, 'node_modules/.bin/splitfield');
const GOAL = 3;

const { values: args } = parseArgs({
  options: {
    kind: { type: 'string', default: 'jets' },
    count: { type: 'string', default: '40000' },
    n: { type: 'string', default: '30' },
    repeat: { type: 'string', default: '3' },
    'no-server': { type: 'boolean', default: false },
  },
});
const kind = args.kind === 'events' ? 'events' : 'jets';
const count = Number(args.count);
const n = Number(args.n);
const repeat = Number(args.repeat);

const log = (text: string) => process.stderr.write(`${text}\n`);
const secs = (ms: number) => `${(ms / 1000).toFixed(2)} s`;

/** The sample once, written in every format from the same numbers. */
function writeInputs(): Record<string, string> {
  const dir = path.join(ROOT, 'bench/out');
  mkdirSync(dir, { recursive: true });
  const base = path.join(dir, `columnar-${kind}-${n}-${count}`);
  const header = { format: 'splitfield-particles', version: 1, content: kind, sample: { name: `bench-${kind}` } };
  const rng = new Rng(4711);
  const records: ColumnarRecord[] = [];
  for (let i = 0; i < count; i++) {
    const ni = Math.max(2, n + rng.int(-Math.round(0.2 * n), Math.round(0.2 * n)));
    const p = kind === 'jets' ? generateJet(rng, { nConstituents: ni, massiveFraction: 0.3 }) : generateEvent(rng, { nParticles: ni, nJets: 4, massiveFraction: 0.3 });
    records.push({ id: `r${i}`, weight: 1, particles: p });
  }
  const lines = [JSON.stringify(header)];
  for (const r of records) {
    const parts: string[] = [];
    for (let k = 0; k < r.particles.length; k += 4) parts.push(`[${r.particles[k]},${r.particles[k + 1]},${r.particles[k + 2]},${r.particles[k + 3]}]`);
    lines.push(`{"id":"${r.id}","weight":1,"particles":[${parts.join(',')}]}`);
  }
  const files = {
    'JSON Lines': `${base}.jsonl`,
    'Parquet (lists)': `${base}-lists.parquet`,
    'Parquet (flat)': `${base}-flat.parquet`,
    'Arrow IPC (lists)': `${base}-lists.arrow`,
  };
  writeFileSync(files['JSON Lines'], lines.join('\n') + '\n');
  writeParquet(files['Parquet (lists)'], header, records, { layout: 'lists', rowGroupSize: 10000 });
  writeParquet(files['Parquet (flat)'], header, records, { layout: 'flat', rowGroupSize: 100000 });
  writeArrow(files['Arrow IPC (lists)'], header, records, { layout: 'lists', batchRows: 10000 });
  return files;
}

const CPU_REPORT = `data:text/javascript,process.on('exit',()=>{const u=process.resourceUsage();process.stderr.write('cpu '+(u.userCPUTime+u.systemCPUTime)/1e3+'\\n')})`;

/** Best of `repeat` runs of the installed command (one thread): wall and CPU time, and the export's digest. */
function runCli(file: string): { ms: number; cpuMs: number; jets: number; output: string } {
  let best = { ms: Infinity, cpuMs: Infinity, jets: 0, output: '' };
  for (let i = 0; i < repeat; i++) {
    const out = `${file}.out`;
    const started = performance.now();
    const run = spawnSync(process.execPath, ['--import', CPU_REPORT, BIN, 'decluster', file, '--threads', '1', '--out', out], { encoding: 'utf8' });
    const ms = performance.now() - started;
    if (run.status !== 0) throw new Error(`the command line failed on ${file}: ${run.stderr}`);
    const cpuMs = Number(/^cpu ([\d.]+)$/m.exec(run.stderr)?.[1]);
    const jets = Number(/jets ([\d,]+)/.exec(run.stderr)?.[1].replace(/,/g, ''));
    const output = readFileSync(out, 'utf8').split('\n').slice(1).join('\n');
    if (ms < best.ms) best = { ms, cpuMs: Math.min(cpuMs, best.cpuMs), jets, output };
  }
  return best;
}

/** Uploads a file with curl and waits until its sample ended. */
async function uploadUntilEnded(server: TestServer, token: string, file: string): Promise<any> {
  const { sample } = await curlUpload(server, token, file, { studyId: 1, name: 'Columnar benchmark', force: true });
  return waitForSampleEnd(server, token, sample.id);
}

async function main(): Promise<void> {
  const files = writeInputs();
  const load = loadavg()[0].toFixed(1);
  const lines = [`columnar benchmark: ${count} ${kind} of ~${n} particles; best of ${repeat}; load average at start ${load}`];
  const cli: Record<string, ReturnType<typeof runCli>> = {};
  for (const [name, file] of Object.entries(files)) {
    log(`command line: ${name}…`);
    cli[name] = runCli(file);
  }
  const ref = cli['JSON Lines'];
  lines.push('  command line (splitfield decluster --threads 1), whole process:');
  for (const [name, r] of Object.entries(cli)) {
    const size = statSync(files[name]).size / 1048576;
    const same = r.output === ref.output ? 'same export' : 'EXPORT DIFFERS';
    lines.push(`    ${name.padEnd(18)} ${size.toFixed(1).padStart(6)} MB  ${secs(r.ms)}  CPU ${secs(r.cpuMs)}  JSON Lines / this: ${(ref.ms / r.ms).toFixed(2)}× (CPU ${(ref.cpuMs / r.cpuMs).toFixed(2)}×)  ${same}`);
  }
  if (!args['no-server']) {
    const server = await startTestServer({ env: { SPLITFIELD_JOB_THREADS: '1' } });
    try {
      const admin = await signIn(server.baseUrl, server.credentials.admin.email, server.credentials.admin.password);
      const token = (await admin.post('/api/tokens', { name: 'columnar benchmark' })).body.secret as string;
      await waitForJobs(server, token, (samples) => samples.every((s) => !['queued', 'running'].includes(s.state)));
      lines.push('  upload route (curl, one job thread), end to end until done:');
      const results: Record<string, { ms: number; cpuMs: number }> = {};
      for (const [name, file] of Object.entries(files)) {
        let best = { ms: Infinity, cpuMs: Infinity };
        for (let i = 0; i < repeat; i++) {
          const cpu0 = cpuMs(server.pid);
          const started = performance.now();
          const sample = await uploadUntilEnded(server, token, file);
          const ms = performance.now() - started;
          if (sample.state !== 'done') throw new Error(`${name}: the sample ended ${sample.state}: ${JSON.stringify(sample.error)}`);
          if (sample.counts.jets !== ref.jets) throw new Error(`${name}: ${sample.counts.jets} jets, the command line ${ref.jets}`);
          const c = cpuMs(server.pid) - cpu0;
          if (ms < best.ms) best = { ms, cpuMs: Math.min(best.cpuMs, c) };
        }
        results[name] = best;
      }
      const r0 = results['JSON Lines'];
      for (const [name, r] of Object.entries(results)) {
        const ratio = r0.ms / r.ms;
        lines.push(`    ${name.padEnd(18)} ${secs(r.ms)}  server CPU ${secs(r.cpuMs)}  JSON Lines / this: ${ratio.toFixed(2)}× (CPU ${(r0.cpuMs / r.cpuMs).toFixed(2)}×)${name === 'JSON Lines' ? '' : `  goal ≥ ${GOAL}×: ${ratio >= GOAL ? 'met' : 'MISSED'}`}`);
      }
    } finally {
      await server.stop();
    }
  }
  process.stdout.write(`${lines.join('\n')}\n`);
}

main().catch((error) => {
  process.stderr.write(`columnar benchmark: ${error?.stack ?? error}\n`);
  process.exit(1);
});
