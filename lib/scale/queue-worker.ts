// `splitfield worker`: pulls jobs of the scaled mode's queue (SPLITFIELD_REDIS_URL) one at a time and works on the
// object store (SPLITFIELD_S3_*, or a storage folder shared with the web server). Run any number, on any machine
// that reaches Redis and the bucket. Bundled to dist/engine/queue-worker.js beside the pipeline's worker.js.
import { availableParallelism, hostname } from 'node:os';
import { parseArgs } from 'node:util';
import { Worker } from 'bullmq';
import { objectStore } from '@/lib/objects/config';
import { readQueueSettings } from './config';
import { processingQueue, QUEUE_NAME, redisConnection } from './queue';
import { runJob, scratchFolder, type WorkerContext } from './shard-job';

const HELP = `Usage: splitfield worker [--name NAME] [--threads N]

Works on the processing jobs of the scaled mode until stopped (SIGTERM or Ctrl-C: the job at hand is finished
first). Reads SPLITFIELD_REDIS_URL, the SPLITFIELD_S3_* variables (or SPLITFIELD_STORAGE) and the
SPLITFIELD_SHARD_* and SPLITFIELD_QUEUE_* variables of README "Running on many machines".
  --name NAME    how this worker is shown on the admin page (default: host name and process id)
  --threads N    pipeline threads of one shard (default: SPLITFIELD_JOB_THREADS, else the cores)
Exit codes: 0 stopped, 2 usage or configuration.`;

export async function main(argv: string[]): Promise<number> {
  let values: { name?: string; threads?: string; help?: boolean };
  try {
    values = parseArgs({ args: argv, options: { name: { type: 'string' }, threads: { type: 'string' }, help: { type: 'boolean' } } }).values;
  } catch (error) {
    process.stderr.write(`splitfield worker: ${(error as Error).message}\n${HELP}\n`);
    return 2;
  }
  if (values.help) {
    process.stdout.write(`${HELP}\n`);
    return 0;
  }
  const threadsText = values.threads ?? process.env.SPLITFIELD_JOB_THREADS;
  const threads = threadsText === undefined ? availableParallelism() : Number(threadsText);
  let settings;
  try {
    settings = readQueueSettings();
    if (!Number.isInteger(threads) || threads < 1) throw new Error(`--threads must be a whole number of at least 1 (got ${threadsText})`);
  } catch (error) {
    process.stderr.write(`splitfield worker: ${(error as Error).message}\n`);
    return 2;
  }
  if (!settings) {
    process.stderr.write('splitfield worker: set SPLITFIELD_REDIS_URL to the queue\'s Redis (redis://host:port)\n');
    return 2;
  }
  const name = values.name ?? `${hostname()}-${process.pid}`;
  const connection = redisConnection(settings.redisUrl);
  const queue = processingQueue(connection);
  const store = objectStore();
  const context: WorkerContext = { store, connection, queue, settings, threads, scratch: scratchFolder(name) };
  const worker = new Worker(QUEUE_NAME, (job) => runJob(job, context), {
    connection,
    name,
    concurrency: 1,
    lockDuration: settings.lockMs,
    stalledInterval: settings.lockMs,
    // A job whose worker died goes back to the queue this many times before it fails.
    maxStalledCount: settings.attempts,
  });
  worker.on('failed', (job, error) => console.error(`[worker ${name}] ${job?.id ?? 'a job'} failed: ${error.message}`));
  worker.on('error', (error) => console.error(`[worker ${name}] ${error.message}`));
  await worker.waitUntilReady();
  console.log(`worker ${name} ready: queue ${settings.redisUrl.replace(/\/\/[^@]*@/, '//')}, store ${store.description}, ${threads} thread(s)`);
  await new Promise<void>((resolve) => {
    process.once('SIGTERM', resolve);
    process.once('SIGINT', resolve);
  });
  await worker.close();
  await queue.close();
  connection.disconnect();
  return 0;
}
