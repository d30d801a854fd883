// Which object store to use, from the environment: an S3-compatible bucket when SPLITFIELD_S3_BUCKET is set,
// otherwise the local storage folder (README "Running on many machines").
import { z } from 'zod';
import { checkedEnvironment, type Environment, readConfig } from '@/lib/config/environment';
import { LocalObjectStore } from './local-store';
import type { ObjectStore } from './object-store';
import { S3ObjectStore } from './s3-store';

export interface S3Settings {
  bucket: string;
  /** Prepended to every key, e.g. "splitfield/" (empty by default). */
  prefix: string;
  region: string;
  /** An S3-compatible server's address; the AWS endpoint of the region when absent. */
  endpoint?: string;
  /** Addresses objects as endpoint/bucket/key rather than bucket.endpoint/key (most self-hosted servers). */
  pathStyle: boolean;
  /** Given keys, or the SDK's usual chain (environment, profile, instance role) when absent. */
  credentials?: { accessKeyId: string; secretAccessKey: string };
}

const flag = z.enum(['0', '1']).transform((value) => value === '1');

const environmentSchema = z
  .object({
    SPLITFIELD_S3_BUCKET: z.string().trim().min(3).max(63).optional(),
    SPLITFIELD_S3_PREFIX: z
      .string()
      .trim()
      .regex(/^([A-Za-z0-9._-]+\/)*$/, 'must be empty or path segments each ending in "/"')
      .optional(),
    SPLITFIELD_S3_REGION: z.string().trim().min(1).optional(),
    SPLITFIELD_S3_ENDPOINT: z.url({ protocol: /^https?$/ }).optional(),
    SPLITFIELD_S3_PATH_STYLE: flag.optional(),
    SPLITFIELD_S3_ACCESS_KEY_ID: z.string().trim().min(1).optional(),
    SPLITFIELD_S3_SECRET_ACCESS_KEY: z.string().trim().min(1).optional(),
  })
  .refine((v) => (v.SPLITFIELD_S3_ACCESS_KEY_ID === undefined) === (v.SPLITFIELD_S3_SECRET_ACCESS_KEY === undefined), {
    message: 'must be set together with SPLITFIELD_S3_ACCESS_KEY_ID (both or neither)',
    path: ['SPLITFIELD_S3_SECRET_ACCESS_KEY'],
  });

/** The bucket's settings, or null when the local folder is the store. */
export function readS3Settings(env: Environment = process.env): S3Settings | null {
  const values = checkedEnvironment(environmentSchema, env);
  const bucket = values.SPLITFIELD_S3_BUCKET;
  if (!bucket) {
    const stray = Object.keys(env).filter((name) => name.startsWith('SPLITFIELD_S3_') && env[name]);
    if (stray.length > 0) throw new Error(`Invalid environment variable: ${stray.join(', ')} set without SPLITFIELD_S3_BUCKET`);
    return null;
  }
  const keyId = values.SPLITFIELD_S3_ACCESS_KEY_ID;
  const secret = values.SPLITFIELD_S3_SECRET_ACCESS_KEY;
  return {
    bucket,
    prefix: values.SPLITFIELD_S3_PREFIX ?? '',
    region: values.SPLITFIELD_S3_REGION ?? 'us-east-1',
    endpoint: values.SPLITFIELD_S3_ENDPOINT,
    pathStyle: values.SPLITFIELD_S3_PATH_STYLE ?? false,
    credentials: keyId && secret ? { accessKeyId: keyId, secretAccessKey: secret } : undefined,
  };
}

/** The bucket when one is configured, otherwise null (files stay in the storage folder). */
export function remoteStore(env: Environment = process.env): ObjectStore | null {
  const settings = readS3Settings(env);
  return settings ? new S3ObjectStore(settings) : null;
}

/** The store of this process: the bucket, or the storage folder. */
export function objectStore(env: Environment = process.env): ObjectStore {
  return remoteStore(env) ?? new LocalObjectStore(readConfig(env).storageDir);
}
