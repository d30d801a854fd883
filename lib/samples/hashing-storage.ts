// A multer storage engine that streams an uploaded file to the store's uploads/ under a generated name (the local
// folder, or the bucket) and computes its SHA-256 and size on the way, so the file is never held in memory and
// never read twice.
import { createHash } from 'node:crypto';
import { createWriteStream } from 'node:fs';
import { Transform } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import type { Request } from 'express';
import type { StorageEngine } from 'multer';
import { uploadKey } from '@/lib/objects/keys';
import { newUploadFileName, removeUpload, type SampleStorage, uploadPath } from './storage';

/** Bytes of the upload queued for the disk at most (the memory this costs a running upload). */
const WRITE_BUFFER_BYTES = 4 << 20;

/** What the engine adds to multer's file object. */
export interface StoredUploadInfo {
  /** The generated name under uploads/. */
  storedName: string;
  /** The file, or the object's key in the bucket. */
  path: string;
  size: number;
  sha256: string;
}

/** Thrown when writing to storage fails (as opposed to the client's side of the upload). */
export class StorageWriteError extends Error {
  override name = 'StorageWriteError';
}

export class HashingUploadStorage implements StorageEngine {
  /** Upload names this engine created for the request, kept until the caller takes them over. */
  readonly created = new Set<string>();

  /** `onFileOpened`: told the generated name once the local file exists (its bytes then follow as they arrive). */
  constructor(
    private readonly storage: SampleStorage,
    private readonly onFileOpened?: (storedName: string) => void,
  ) {}

  _handleFile(
    _request: Request,
    file: Express.Multer.File,
    callback: (error?: unknown, info?: Partial<Express.Multer.File>) => void,
  ): void {
    const storedName = newUploadFileName();
    this.created.add(storedName);
    const hash = createHash('sha256');
    let size = 0;
    const measure = new Transform({
      transform(chunk: Buffer, _encoding, done) {
        hash.update(chunk);
        size += chunk.length;
        done(null, chunk);
      },
    });
    let clientFailure: unknown = null;
    file.stream.once('error', (error) => (clientFailure = error));
    this.store(file, measure, storedName).then(
      (where) => callback(null, { storedName, path: where, size, sha256: hash.digest('hex') } as StoredUploadInfo),
      (error: unknown) => {
        const failure = clientFailure ?? new StorageWriteError((error as Error).message, { cause: error });
        removeUpload(this.storage, storedName).finally(() => callback(failure));
      },
    );
  }

  /** Streams the file through `measure` to its place; resolves with the file or the object's key. */
  private async store(file: Express.Multer.File, measure: Transform, storedName: string): Promise<string> {
    const remote = this.storage.remote;
    if (remote) {
      const key = uploadKey(storedName);
      file.stream.once('error', (error) => measure.destroy(error));
      await remote.put(key, file.stream.pipe(measure));
      return key;
    }
    const target = uploadPath(this.storage, storedName);
    // A deep buffer lets the disk write while more of the body arrives (the default 16 KiB made each piece wait).
    const out = createWriteStream(target, { flags: 'wx', highWaterMark: WRITE_BUFFER_BYTES });
    out.once('open', () => this.onFileOpened?.(storedName));
    await pipeline(file.stream, measure, out);
    return target;
  }

  _removeFile(_request: Request, file: Express.Multer.File & Partial<StoredUploadInfo>, callback: (error: Error | null) => void): void {
    removeUpload(this.storage, file.storedName ?? null).then(() => callback(null), callback);
  }

  /** Removes every file this engine created (after a refused or broken upload). */
  async removeAll(): Promise<void> {
    await Promise.all([...this.created].map((name) => removeUpload(this.storage, name)));
    this.created.clear();
  }
}
