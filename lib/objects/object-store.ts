// The object store: where uploaded files and samples' binary columns live. The local folder (storage/, the
// embedded default) or an S3-compatible bucket (SPLITFIELD_S3_*, config.ts). Keys are relative paths such as
// `uploads/<name>` and `samples/<id>/<file>` (keys.ts); the local folder holds them under the same names.
import type { Readable } from 'node:stream';

/** Bytes [start, end) of an object. */
export interface ByteRange {
  start: number;
  end: number;
}

export interface ObjectStore {
  readonly kind: 'local' | 's3';
  /** Where the store is, for messages (a folder, or s3://bucket/prefix at an endpoint). */
  readonly description: string;
  /** Writes `body` to `key`, streaming; the object is visible only once complete, and a failure leaves none. */
  put(key: string, body: Readable | Uint8Array | string): Promise<void>;
  /** The object's bytes (a range of them when given), streamed; rejects with ObjectMissingError if absent. */
  read(key: string, range?: ByteRange): Promise<Readable>;
  /** The object's size in bytes, or null if it does not exist. */
  size(key: string): Promise<number | null>;
  /** Keys under a prefix (ending in "/"), every level. */
  list(prefix: string): Promise<string[]>;
  /** Removes objects; absent ones are not an error. */
  remove(keys: string[]): Promise<void>;
}

export class ObjectMissingError extends Error {
  override name = 'ObjectMissingError';
  constructor(readonly key: string) {
    super(`object ${key} does not exist in the store`);
  }
}

/** Thrown when the store refuses or fails a write; the message names the key and the store's reason. */
export class ObjectWriteError extends Error {
  override name = 'ObjectWriteError';
}

/** Removes every object under a prefix. */
export async function removePrefix(store: ObjectStore, prefix: string): Promise<void> {
  await store.remove(await store.list(prefix));
}

/** Reads an object whole (small objects: manifests, shard plans). */
export async function readObjectBytes(store: ObjectStore, key: string, range?: ByteRange): Promise<Buffer> {
  const chunks: Buffer[] = [];
  for await (const chunk of await store.read(key, range)) chunks.push(chunk as Buffer);
  return Buffer.concat(chunks);
}
