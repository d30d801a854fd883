// Scaled-mode benchmark: redis-server, the fake S3 server and 1, then 2, `splitfield worker` processes (one
// pipeline thread each) on this machine, a web server in queue mode on that bucket, and one generated JSON Lines
// file of jets uploaded for each worker count. Prints the throughput end to end, the speed-up from the second
// worker, and where a sharded job's time goes (plan, shards, merge) against the command line on one thread,
// i.e. the overhead of sharding. Writes bench/out/scale-bench.json.
//
//   npm run bench:scale [-- --jets 60000] [-- --particles 60] [-- --shard-mb 4]
import { execFileSync, spawnSync } from 'node:child_process';
import { cpus, loadavg, totalmem } from 'node:os';
import { existsSync, mkdirSync, statSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { parseArgs } from 'node:util';
import { type Job, Queue } from 'bullmq';
import { jobIds, QUEUE_NAME, redisConnection, type RunRef } from '../lib/scale/queue';
import { type Service, startFakeS3, startRedis, startWorker } from '../tests/support/scale-services';
import { signIn, startTestServer } from '../tests/support/server';
import { curlUpload, waitForJobs, waitForSampleEnd } from './server-tools';

const ROOT = path.resolve(__dirname, '..');
const BIN = path.join(ROOT, 'node_modules/.bin/splitfield');
const GENERATOR = path.join(ROOT, 'bench/generate-inputs.ts');

const { values: args } = parseArgs({
  options: {
    jets: { type: 'string', default: '60000' },
    particles: { type: 'string', default: '60' },
    'shard-mb': { type: 'string', default: '4' },
  },
});
const jets = Number(args.jets);
const particles = Number(args.particles);
const shardBytes = Math.round(Number(args['shard-mb']) * 1024 * 1024);
for (const [name, value] of Object.entries({ jets, particles, shardBytes })) {
  if (!Number.isInteger(value) || value < 1) throw new Error(`--${name} must be a positive number (got ${value})`);
}

const log = (text: string) => process.stderr.write(`${text}\n`);
const seconds = (ms: number) => `${(ms / 1000).toFixed(2)} s`;
const perSecond = (count: number, ms: number) => Math.round(count / (ms / 1000));

function inputFile(): string {
  const file = path.join(ROOT, 'bench/out', `jets-${particles}-${jets}.jsonl`);
  if (!existsSync(file) || statSync(file).mtimeMs < statSync(GENERATOR).mtimeMs) {
    mkdirSync(path.dirname(file), { recursive: true });
    log(`generating ${path.relative(ROOT, file)}…`);
    const options = ['--kind', 'jets', '--count', String(jets), '--n', String(particles), '--seed', '31337', '--out', file];
    execFileSync(process.execPath, ['--import', 'tsx', GENERATOR, ...options], { stdio: 'inherit', cwd: ROOT });
  }
  return file;
}

function commandLineMs(file: string): number {
  const started = performance.now();
  const run = spawnSync(process.execPath, [BIN, 'decluster', file, '--threads', '1', '--out', '/dev/null', '--quiet'], { encoding: 'utf8' });
  if (run.status !== 0) throw new Error(`the command line failed: ${run.stderr}`);
  return performance.now() - started;
}

const busyMs = (job: Job | undefined) => (job?.processedOn && job.finishedOn ? job.finishedOn - job.processedOn : 0);

interface Round {
  workers: number;
  endToEndMs: number;
  jetsPerSecond: number;
  shards: number;
  planMs: number;
  /** Sum of the shards' working times (what one worker would spend on them in turn). */
  shardBusyMs: number;
  /** First shard started to last shard finished. */
  shardSpanMs: number;
  mergeMs: number;
}

async function main(): Promise<void> {
  const file = inputFile();
  const size = statSync(file).size;
  log(`input ${path.relative(ROOT, file)}: ${(size / 1048576).toFixed(1)} MB, ${jets} jets; shards of ${(shardBytes / 1048576).toFixed(1)} MB`);
  log('command line, one thread…');
  const cliMs = commandLineMs(file);
  const [fake, redis] = await Promise.all([startFakeS3('splitfield-bench'), startRedis()]);
  const env = {
    ...fake.env,
    SPLITFIELD_REDIS_URL: redis.url,
    SPLITFIELD_SHARD_BYTES: String(shardBytes),
    SPLITFIELD_JOB_THREADS: '1',
  };
  const connection = redisConnection(redis.url);
  const queue = new Queue(QUEUE_NAME, { connection });
  const server = await startTestServer({ env, demoJets: 200 });
  const workers: Service[] = [];
  const rounds: Round[] = [];
  try {
    const { email, password } = server.credentials.admin;
    const admin = await signIn(server.baseUrl, email, password);
    const token = (await admin.post('/api/tokens', { name: 'scale benchmark' })).body.secret as string;
    for (const count of [1, 2]) {
      while (workers.length < count) workers.push(await startWorker(env, `bench-${workers.length + 1}`));
      await waitForJobs(server, token, (samples) => samples.every((sample) => !['queued', 'running'].includes(sample.state)));
      log(`${count} worker(s)…`);
      const started = performance.now();
      const body = await curlUpload(server, token, file, { studyId: 1, name: `Scale benchmark, ${count} worker(s)`, force: true });
      const id = body.sample.id as number;
      const sample = await waitForSampleEnd(server, token, id);
      const endToEndMs = performance.now() - started;
      if (sample.state !== 'done') throw new Error(`the sample ended ${sample.state}: ${JSON.stringify(sample.error)}`);
      const ref: RunRef = { sampleId: id, attempt: 1 };
      const plan = await queue.getJob(jobIds.plan(ref));
      const shards = (plan?.returnvalue as { shards: number }).shards;
      const shardJobs = await Promise.all(Array.from({ length: shards }, (_, k) => queue.getJob(jobIds.shard(ref, k))));
      const merge = await queue.getJob(jobIds.merge(ref));
      const starts = shardJobs.map((job) => job?.processedOn ?? 0);
      const ends = shardJobs.map((job) => job?.finishedOn ?? 0);
      rounds.push({
        workers: count,
        endToEndMs,
        jetsPerSecond: perSecond(sample.counts.jets, endToEndMs),
        shards,
        planMs: busyMs(plan),
        shardBusyMs: shardJobs.reduce((sum, job) => sum + busyMs(job), 0),
        shardSpanMs: Math.max(...ends) - Math.min(...starts),
        mergeMs: busyMs(merge),
      });
    }
  } finally {
    await Promise.all([server.stop(), ...workers.map((worker) => worker.stop())]);
    await queue.close();
    connection.disconnect();
    await Promise.all([redis.stop(), fake.stop()]);
  }
  const machine = `${cpus()[0]?.model ?? 'unknown CPU'}, ${cpus().length} cores, ${(totalmem() / 1024 ** 3).toFixed(0)} GB; load average ${loadavg()[0].toFixed(1)}`;
  const [one, two] = rounds;
  const lines = [
    `scale benchmark: ${jets} jets of ${particles} particles (${(size / 1048576).toFixed(1)} MB), ${one.shards} shards; ${machine}`,
    `  command line, one thread: ${seconds(cliMs)}  ${perSecond(jets, cliMs)} jets/s`,
    ...rounds.map(
      (round) =>
        `  ${round.workers} worker(s): end to end ${seconds(round.endToEndMs)}  ${round.jetsPerSecond} jets/s  ` +
        `(plan ${seconds(round.planMs)}, shards ${seconds(round.shardSpanMs)} from first start to last end, merge ${seconds(round.mergeMs)})`,
    ),
    `  speed-up of the second worker: ${(one.endToEndMs / two.endToEndMs).toFixed(2)}×`,
    `  shard overhead: the shards' working time summed ${seconds(one.shardBusyMs)} against the command line's ${seconds(cliMs)} ` +
      `(${(one.shardBusyMs / cliMs).toFixed(2)}×: fetching ranges, worker threads' start, publishing columns); ` +
      `plan ${seconds(one.planMs)} and merge ${seconds(one.mergeMs)} are serial (${perSecond(jets, one.mergeMs)} jets/s merged)`,
  ];
  process.stdout.write(`${lines.join('\n')}\n`);
  writeFileSync(path.join(ROOT, 'bench/out/scale-bench.json'), JSON.stringify({ jets, particles, size, shardBytes, machine, cliMs, rounds }, null, 1));
}

main().catch((error: unknown) => {
  console.error(error);
  process.exitCode = 1;
});
