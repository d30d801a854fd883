// A multer storage engine that streams an uploaded file to storage/uploads/ under a generated name and computes
// its SHA-256 and size on the way, so the file is never held in memory and never read twice.
import { createHash } from 'node:crypto';
import { createWriteStream } from 'node:fs';
import { rm } from 'node:fs/promises';
import path from 'node:path';
import { Transform } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import type { Request } from 'express';
import type { StorageEngine } from 'multer';
import { newUploadFileName } from './storage';

/** What the engine adds to multer's file object. */
export interface StoredUploadInfo {
  /** The generated name under the uploads folder. */
  storedName: string;
  path: string;
  size: number;
  sha256: string;
}

/** Thrown when writing to storage fails (as opposed to the client's side of the upload). */
export class StorageWriteError extends Error {
  override name = 'StorageWriteError';
}

export class HashingDiskStorage implements StorageEngine {
  /** Files this engine created for the request, kept until the caller takes them over. */
  readonly created = new Set<string>();

  constructor(private readonly dir: string) {}

  _handleFile(
    _request: Request,
    file: Express.Multer.File,
    callback: (error?: unknown, info?: Partial<Express.Multer.File>) => void,
  ): void {
    const storedName = newUploadFileName();
    const target = path.join(this.dir, storedName);
    this.created.add(target);
    const hash = createHash('sha256');
    let size = 0;
    const measure = new Transform({
      transform(chunk: Buffer, _encoding, done) {
        hash.update(chunk);
        size += chunk.length;
        done(null, chunk);
      },
    });
    const out = createWriteStream(target, { flags: 'wx' });
    let writeFailure: Error | null = null;
    out.once('error', (error) => (writeFailure = new StorageWriteError(error.message, { cause: error })));
    pipeline(file.stream, measure, out).then(
      () => callback(null, { storedName, path: target, size, sha256: hash.digest('hex') } as StoredUploadInfo),
      (error: unknown) => {
        rm(target, { force: true }).finally(() => callback(writeFailure ?? error));
      },
    );
  }

  _removeFile(_request: Request, file: Express.Multer.File, callback: (error: Error | null) => void): void {
    rm(file.path, { force: true }).then(() => callback(null), callback);
  }

  /** Removes every file this engine created (after a refused or broken upload). */
  async removeAll(): Promise<void> {
    await Promise.all([...this.created].map((file) => rm(file, { force: true })));
    this.created.clear();
  }
}
