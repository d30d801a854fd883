// Ingest benchmark, end to end through the server: a generated file of events (tests/support/test-events.ts via
// bench/generate-inputs.ts) is first run through the command line engine for reference, then uploaded to a real
// server (the built app in $NEXT_DIST_DIR under `next start`) by curl with a personal API token, polled until
// processed, and its plane asked for. Prints events/s end to end, the ratio to the command line, the time until the first plane is served, and the
// server's peak memory (its whole process tree, worker threads included: they share the process).
//
//   npm run bench:ingest [-- --events 2000] [-- --particles 300] [-- --threads N]
//
// Goals (issues 4 and 13): end to end within 1.15× the command line's time on the same threads; server memory < 600 MB.
import { execFileSync, spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, statSync } from 'node:fs';
import { loadavg } from 'node:os';
import path from 'node:path';
import { parseArgs } from 'node:util';
import { readSampleConfig } from '../lib/samples/config';
import { signIn, startTestServer } from '../tests/support/server';
import { cpuMs, curlUpload, peakKb, treeKb, waitForJobs, waitForSampleEnd } from './server-tools';

const ROOT = path.resolve(__dirname, '..');
const BIN = path.join(ROOT, 'node_modules/.bin/splitfield');
const GENERATOR = path.join(ROOT, 'bench/generate-inputs.ts');
const GOAL_RATIO = 1.15;
const GOAL_MEMORY_MB = 600;

const { values: args } = parseArgs({
  options: {
    events: { type: 'string', default: '20000' },
    particles: { type: 'string', default: '300' },
    threads: { type: 'string' },
  },
});
const events = Number(args.events);
const particles = Number(args.particles);
const threads = args.threads ? Number(args.threads) : readSampleConfig().jobThreads;
for (const [name, value] of Object.entries({ events, particles, threads })) {
  if (!Number.isInteger(value) || value < 1) throw new Error(`--${name} must be a whole number >= 1 (got ${value})`);
}

function log(text: string): void {
  process.stderr.write(`${text}\n`);
}

const seconds = (ms: number) => `${(ms / 1000).toFixed(2)} s`;
const rate = (count: number, ms: number) => `${Math.round(count / (ms / 1000)).toLocaleString('en')}/s`;

/** The input file, generated once and reused while it is newer than its generator. */
function inputFile(): string {
  const file = path.join(ROOT, 'bench/out', `events-${particles}-${events}.jsonl`);
  if (!existsSync(file) || statSync(file).mtimeMs < statSync(GENERATOR).mtimeMs) {
    mkdirSync(path.dirname(file), { recursive: true });
    log(`generating ${path.relative(ROOT, file)} (${events} events of about ${particles} particles)…`);
    const args = ['--kind', 'events', '--count', String(events), '--n', String(particles), '--seed', '20240', '--out', file];
    execFileSync(process.execPath, ['--import', 'tsx', GENERATOR, ...args], { stdio: 'inherit', cwd: ROOT });
  }
  return file;
}

/** Prints the process's CPU time (all threads) on its last line of stderr when it exits. */
const CPU_REPORT = `data:text/javascript,process.on('exit',()=>{const u=process.resourceUsage();process.stderr.write('cpu '+(u.userCPUTime+u.systemCPUTime)/1e3+'\\n')})`;

/** The installed command on the same file and threads; wall time of the whole process, as for the server. */
function runCli(file: string): { ms: number; cpuMs: number; jets: number } {
  const started = performance.now();
  const command = ['--import', CPU_REPORT, BIN, 'decluster', file, '--threads', String(threads), '--out', '/dev/null'];
  const run = spawnSync(process.execPath, command, { encoding: 'utf8' });
  const ms = performance.now() - started;
  if (run.status !== 0) throw new Error(`the command line failed: ${run.stderr}`);
  const jets = Number(/jets ([\d,]+)/.exec(run.stderr)?.[1].replace(/,/g, ''));
  return { ms, cpuMs: Number(/^cpu ([\d.]+)$/m.exec(run.stderr)?.[1]), jets };
}


async function main(): Promise<void> {
  if (!existsSync(BIN)) throw new Error('node_modules/.bin/splitfield is missing: run npm install (it links the command)');
  const file = inputFile();
  const size = statSync(file).size;
  log(`input ${path.relative(ROOT, file)}: ${(size / 1048576).toFixed(0)} MB, ${events} events; ${threads} thread(s)`);

  const loadAtStart = loadavg()[0].toFixed(1);
  log('command line…');
  const cli = runCli(file);

  log('server…');
  const server = await startTestServer({ env: { SPLITFIELD_JOB_THREADS: String(threads) } });
  let peakTreeKb = 0;
  const sampler = setInterval(() => (peakTreeKb = Math.max(peakTreeKb, treeKb(server.pid))), 200);
  try {
    const { email, password } = server.credentials.admin;
    const admin = await signIn(server.baseUrl, email, password);
    const token = (await admin.post('/api/tokens', { name: 'ingest benchmark' })).body.secret as string;
    const auth = { authorization: `Bearer ${token}` };
    // The demo samples of the first start are processed before the clock starts.
    await waitForJobs(server, token, (samples) => samples.every((sample) => !['queued', 'running'].includes(sample.state)));

    const cpuBefore = cpuMs(server.pid);
    const started = performance.now();
    const body = await curlUpload(server, token, file, { studyId: 1, name: 'Ingest benchmark' });
    const uploadMs = performance.now() - started;
    const id = body.sample.id as number;
    const sample = await waitForSampleEnd(server, token, id);
    const doneMs = performance.now() - started;
    const serverCpuMs = cpuMs(server.pid) - cpuBefore;
    if (sample.state !== 'done') throw new Error(`the sample ended ${sample.state}: ${JSON.stringify(sample)}`);
    const plane = await fetch(`${server.baseUrl}/api/samples/${id}/plane`, { headers: auth });
    await plane.arrayBuffer();
    const planeMs = performance.now() - started;
    if (plane.status !== 200) throw new Error(`the plane answered ${plane.status}`);
    clearInterval(sampler);
    peakTreeKb = Math.max(peakTreeKb, treeKb(server.pid));
    const serverPeakKb = peakKb(server.pid);

    const ratio = doneMs / cli.ms;
    const memoryMb = Math.max(peakTreeKb, serverPeakKb) / 1024;
    const { timings } = (await (await fetch(`${server.baseUrl}/api/samples/${id}`, { headers: auth })).json()).sample.provenance;
    // The server's own figures must fit inside the end to end time the client measured: from the upload's start to
    // the job's end (the job may start while the upload arrives; 2 ms for the clocks' whole milliseconds).
    const uploadStart = Date.parse(timings.uploadedAt) - timings.uploadSeconds * 1000;
    const startMs = Date.parse(timings.startedAt) - uploadStart;
    const spanMs = startMs + timings.processingSeconds * 1000;
    const restMs = doneMs - spanMs;
    if (restMs < -2) throw new Error(`the figures do not add up: upload and processing exceed the end to end time by ${seconds(-restMs)}`);
    const overlapMs = timings.uploadSeconds * 1000 - startMs;
    const overlap = overlapMs > 0 ? `, started ${seconds(startMs)} after the upload began (${seconds(overlapMs)} of overlap)` : '';
    const lines = [
      `ingest benchmark: ${events} events of ~${particles} particles (${(size / 1048576).toFixed(0)} MB), ${threads} thread(s)`,
      `  command line:   ${seconds(cli.ms)}  ${rate(events, cli.ms)} events  (${cli.jets} jets)`,
      `  server, end to end (upload + queue + processing): ${seconds(doneMs)}  ${rate(events, doneMs)} events  (${sample.counts.jets} jets)`,
      `    of which upload ${seconds(timings.uploadSeconds * 1000)} (curl saw ${seconds(uploadMs)}), processing job ` +
        `${seconds(timings.processingSeconds * 1000)}${overlap}, the rest (queue, recording the end, answering) ${seconds(Math.max(0, restMs))}`,
      `  ratio server / command line (time): ${ratio.toFixed(2)}×  goal ≤ ${GOAL_RATIO}×  ${ratio <= GOAL_RATIO ? 'met' : 'MISSED'}`,
      `  CPU time: command line ${seconds(cli.cpuMs)}, server ${seconds(serverCpuMs)} (${(serverCpuMs / cli.cpuMs).toFixed(2)}×; ` +
        `less sensitive than wall time to other load; load average at start ${loadAtStart})`,
      `  first plane served ${seconds(planeMs)} after the upload started (${seconds(planeMs - doneMs)} after done)`,
      `  server peak memory: ${memoryMb.toFixed(0)} MB (process tree RSS ${(peakTreeKb / 1024).toFixed(0)} MB, ` +
        `VmHWM ${(serverPeakKb / 1024).toFixed(0)} MB)  goal < ${GOAL_MEMORY_MB} MB  ${memoryMb < GOAL_MEMORY_MB ? 'met' : 'MISSED'}`,
    ];
    if (sample.counts.jets !== cli.jets) lines.push(`  WARNING: the server kept ${sample.counts.jets} jets, the command line ${cli.jets}`);
    process.stdout.write(`${lines.join('\n')}\n`);
  } finally {
    clearInterval(sampler);
    await server.stop();
  }
}

main().catch((error) => {
  process.stderr.write(`ingest benchmark: ${error?.stack ?? error}\n`);
  process.exit(1);
});
