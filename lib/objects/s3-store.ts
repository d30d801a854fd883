// The object store as an S3-compatible bucket, through the AWS SDK for JavaScript v3. Streams go up as multipart
// uploads (lib-storage), which the bucket makes visible only once complete; reads are ranged GETs.
import {
  DeleteObjectsCommand,
  GetObjectCommand,
  HeadObjectCommand,
  ListObjectsV2Command,
  NoSuchKey,
  NotFound,
  PutObjectCommand,
  S3Client,
} from '@aws-sdk/client-s3';
import { Upload } from '@aws-sdk/lib-storage';
import { Readable } from 'node:stream';
import type { S3Settings } from './config';
import { checkedKey } from './keys';
import { type ByteRange, ObjectMissingError, type ObjectStore, ObjectWriteError } from './object-store';

/** Most keys one DeleteObjects request may name (S3's limit). */
const DELETE_BATCH = 1000;
/** Part size of multipart uploads (S3's smallest is 5 MiB). */
const PART_BYTES = 8 * 1024 * 1024;

function isMissing(error: unknown): boolean {
  const status = (error as { $metadata?: { httpStatusCode?: number } }).$metadata?.httpStatusCode;
  return error instanceof NoSuchKey || error instanceof NotFound || status === 404;
}

export class S3ObjectStore implements ObjectStore {
  readonly kind = 's3';
  readonly description: string;
  private readonly client: S3Client;

  constructor(private readonly settings: S3Settings) {
    this.client = new S3Client({
      region: settings.region,
      endpoint: settings.endpoint,
      forcePathStyle: settings.pathStyle,
      credentials: settings.credentials,
    });
    this.description = `s3://${settings.bucket}/${settings.prefix}${settings.endpoint ? ` at ${settings.endpoint}` : ''}`;
  }

  private objectKey(key: string): string {
    return this.settings.prefix + checkedKey(key);
  }

  async put(key: string, body: Readable | Uint8Array | string): Promise<void> {
    const params = { Bucket: this.settings.bucket, Key: this.objectKey(key) };
    try {
      if (body instanceof Readable) {
        await new Upload({ client: this.client, params: { ...params, Body: body }, partSize: PART_BYTES, queueSize: 2 }).done();
      } else {
        await this.client.send(new PutObjectCommand({ ...params, Body: body }));
      }
    } catch (error) {
      if (body instanceof Readable) body.destroy();
      throw new ObjectWriteError(`cannot write ${key} to ${this.description}: ${(error as Error).message}`, { cause: error });
    }
  }

  async read(key: string, range?: ByteRange): Promise<Readable> {
    if (range && range.end <= range.start) return Readable.from([]);
    try {
      const answer = await this.client.send(
        new GetObjectCommand({
          Bucket: this.settings.bucket,
          Key: this.objectKey(key),
          Range: range ? `bytes=${range.start}-${range.end - 1}` : undefined,
        }),
      );
      return answer.Body as Readable;
    } catch (error) {
      if (isMissing(error)) throw new ObjectMissingError(key);
      throw new Error(`cannot read ${key} from ${this.description}: ${(error as Error).message}`, { cause: error });
    }
  }

  async size(key: string): Promise<number | null> {
    try {
      const head = await this.client.send(new HeadObjectCommand({ Bucket: this.settings.bucket, Key: this.objectKey(key) }));
      return head.ContentLength ?? 0;
    } catch (error) {
      if (isMissing(error)) return null;
      throw error;
    }
  }

  async list(prefix: string): Promise<string[]> {
    const keys: string[] = [];
    // Pages continue after the last key seen (StartAfter): every S3-compatible server reads it alike.
    let after: string | undefined;
    for (;;) {
      const page = await this.client
        .send(new ListObjectsV2Command({ Bucket: this.settings.bucket, Prefix: this.settings.prefix + prefix, StartAfter: after }))
        .catch((error: Error) => {
          throw new Error(`cannot list ${prefix} in ${this.description}: ${error.message}`, { cause: error });
        });
      const found = (page.Contents ?? []).map((object) => object.Key!);
      keys.push(...found.map((key) => key.slice(this.settings.prefix.length)));
      if (!page.IsTruncated || found.length === 0) break;
      after = found[found.length - 1];
    }
    return keys.sort();
  }

  async remove(keys: string[]): Promise<void> {
    for (let at = 0; at < keys.length; at += DELETE_BATCH) {
      const objects = keys.slice(at, at + DELETE_BATCH).map((key) => ({ Key: this.objectKey(key) }));
      const answer = await this.client.send(new DeleteObjectsCommand({ Bucket: this.settings.bucket, Delete: { Objects: objects, Quiet: true } }));
      if (answer.Errors && answer.Errors.length > 0) {
        const first = answer.Errors[0];
        throw new Error(`cannot remove ${answer.Errors.length} object(s) from ${this.description}, first ${first.Key}: ${first.Message}`);
      }
    }
  }
}
