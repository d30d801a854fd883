// The outside services of the scaled mode, started by the project's own scripts for tests and the benchmark:
// the fake S3 server (scripts/fake-s3.mjs), redis-server (Debian, scripts/ensure-debian-packages.sh) and
// `splitfield worker` processes (bin/splitfield.mjs).
import { type ChildProcess, spawn } from 'node:child_process';
import { mkdtempSync } from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { createInterface } from 'node:readline';

const repoRoot = path.resolve(import.meta.dirname, '../..');

export interface Service {
  process: ChildProcess;
  stop(): Promise<void>;
}

function stopper(child: ChildProcess, signal: NodeJS.Signals = 'SIGTERM'): () => Promise<void> {
  return () =>
    new Promise((resolve) => {
      if (child.exitCode !== null || child.signalCode !== null) return resolve();
      child.once('exit', () => resolve());
      child.kill(signal);
    });
}

/** The first line of a child's standard output. */
function firstLine(child: ChildProcess, what: string): Promise<string> {
  return new Promise((resolve, reject) => {
    const lines = createInterface({ input: child.stdout! });
    lines.once('line', resolve);
    child.once('exit', (code) => reject(new Error(`${what} exited (${code}) before it was ready`)));
  });
}

export interface FakeS3 extends Service {
  endpoint: string;
  bucket: string;
  /** The folder the fake server keeps its buckets in. */
  directory: string;
  /** The SPLITFIELD_S3_* variables of this bucket. */
  env: Record<string, string>;
}

export async function startFakeS3(bucket = 'splitfield-test'): Promise<FakeS3> {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'splitfield-s3-'));
  // s3rver makes listing continuation tokens with a cipher OpenSSL 3 keeps in its legacy provider.
  const child = spawn(process.execPath, ['--openssl-legacy-provider', path.join(repoRoot, 'scripts/fake-s3.mjs'), '--dir', dir, '--bucket', bucket], {
    stdio: ['ignore', 'pipe', 'inherit'],
  });
  const { endpoint } = JSON.parse(await firstLine(child, 'the fake S3 server')) as { endpoint: string };
  return {
    process: child,
    endpoint,
    bucket,
    directory: dir,
    env: {
      SPLITFIELD_S3_BUCKET: bucket,
      SPLITFIELD_S3_ENDPOINT: endpoint,
      SPLITFIELD_S3_REGION: 'us-east-1',
      SPLITFIELD_S3_PATH_STYLE: '1',
      SPLITFIELD_S3_ACCESS_KEY_ID: 'S3RVER',
      SPLITFIELD_S3_SECRET_ACCESS_KEY: 'S3RVER',
    },
    stop: stopper(child),
  };
}

export async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = net.createServer();
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const { port } = server.address() as net.AddressInfo;
      server.close(() => resolve(port));
    });
  });
}

export interface Redis extends Service {
  url: string;
  port: number;
  /** Starts redis-server again on the same port and data folder (after stop()). */
  restart(): Promise<void>;
}

export async function startRedis(): Promise<Redis> {
  const port = await freePort();
  const dir = mkdtempSync(path.join(os.tmpdir(), 'splitfield-redis-'));
  const launch = async () => {
    // Append-only file: jobs survive a restart, as a production Redis should be set up (README).
    const child = spawn('redis-server', ['--port', String(port), '--bind', '127.0.0.1', '--dir', dir, '--appendonly', 'yes', '--save', ''], {
      stdio: ['ignore', 'pipe', 'inherit'],
    });
    await new Promise<void>((resolve, reject) => {
      const lines = createInterface({ input: child.stdout! });
      lines.on('line', (line) => {
        if (/Ready to accept connections/.test(line)) resolve();
      });
      child.once('exit', (code) => reject(new Error(`redis-server exited (${code}) before it was ready`)));
    });
    return child;
  };
  const redis: Redis = {
    process: await launch(),
    url: `redis://127.0.0.1:${port}`,
    port,
    stop: async () => stopper(redis.process)(),
    restart: async () => {
      redis.process = await launch();
    },
  };
  return redis;
}

/** A `splitfield worker` process with the given environment (Redis, bucket). */
export async function startWorker(env: Record<string, string>, name: string): Promise<Service> {
  const child = spawn(process.execPath, [path.join(repoRoot, 'bin/splitfield.mjs'), 'worker', '--name', name], {
    cwd: repoRoot,
    env: { ...process.env, ...env },
    stdio: ['ignore', 'pipe', 'inherit'],
  });
  await firstLine(child, `worker ${name}`);
  child.stdout!.resume();
  return { process: child, stop: stopper(child) };
}

/** The variables of the scaled mode on these services, with the small shards and short waits tests use. */
export function scaledEnv(fake: FakeS3, redis: Redis, shardBytes: number): Record<string, string> {
  return {
    ...fake.env,
    SPLITFIELD_REDIS_URL: redis.url,
    SPLITFIELD_SHARD_BYTES: String(shardBytes),
    SPLITFIELD_QUEUE_LOCK_MS: '2000',
    SPLITFIELD_RETRY_DELAY_MS: '200',
    SPLITFIELD_JOB_THREADS: '1',
  };
}
