// Limits of uploads and processing jobs, read from the environment (README "Configuration").
import { availableParallelism } from 'node:os';
import { z } from 'zod';
import { checkedEnvironment, type Environment, wholeNumberVariable } from '@/lib/config/environment';

export interface SampleConfig {
  /** Largest upload accepted, bytes (SPLITFIELD_UPLOAD_MAX_BYTES, default 2 GiB). */
  uploadMaxBytes: number;
  /** Jobs that run at once (SPLITFIELD_MAX_JOBS, default 1). */
  maxJobs: number;
  /** Worker threads of one job's pipeline (SPLITFIELD_JOB_THREADS, default cores − 1, at least 1). */
  jobThreads: number;
  /** Samples one person may have queued or running at once (SPLITFIELD_MAX_JOBS_PER_USER, default 5). */
  maxJobsPerUser: number;
  /** Records one sample may hold (SPLITFIELD_MAX_RECORDS, default 10 million). */
  maxRecords: number;
  /** Bytes of text a file may hold once decompressed (SPLITFIELD_MAX_DECOMPRESSED_BYTES, default 16 GiB). */
  maxDecompressedBytes: number;
}

const environmentSchema = z.object({
  SPLITFIELD_UPLOAD_MAX_BYTES: wholeNumberVariable(1).optional(),
  SPLITFIELD_MAX_JOBS: wholeNumberVariable(1).optional(),
  SPLITFIELD_JOB_THREADS: wholeNumberVariable(1).optional(),
  SPLITFIELD_MAX_JOBS_PER_USER: wholeNumberVariable(1).optional(),
  SPLITFIELD_MAX_RECORDS: wholeNumberVariable(1).optional(),
  SPLITFIELD_MAX_DECOMPRESSED_BYTES: wholeNumberVariable(1).optional(),
});

export function readSampleConfig(env: Environment = process.env): SampleConfig {
  const values = checkedEnvironment(environmentSchema, env);
  return {
    uploadMaxBytes: values.SPLITFIELD_UPLOAD_MAX_BYTES ?? 2 * 1024 ** 3,
    maxJobs: values.SPLITFIELD_MAX_JOBS ?? 1,
    // One core stays with the web server, so pages and API calls answer while a job runs.
    jobThreads: values.SPLITFIELD_JOB_THREADS ?? Math.max(1, availableParallelism() - 1),
    maxJobsPerUser: values.SPLITFIELD_MAX_JOBS_PER_USER ?? 5,
    maxRecords: values.SPLITFIELD_MAX_RECORDS ?? 10_000_000,
    maxDecompressedBytes: values.SPLITFIELD_MAX_DECOMPRESSED_BYTES ?? 16 * 1024 ** 3,
  };
}
