// The object store as a local folder (storage/): a key is a path under it. Writes go to a hidden sibling file
// renamed into place, so a reader never sees half an object.
import { randomUUID } from 'node:crypto';
import { createReadStream, createWriteStream } from 'node:fs';
import { mkdir, readdir, rename, rm, stat } from 'node:fs/promises';
import path from 'node:path';
import { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import { checkedKey } from './keys';
import { type ByteRange, ObjectMissingError, type ObjectStore, ObjectWriteError } from './object-store';

export class LocalObjectStore implements ObjectStore {
  readonly kind = 'local';
  readonly description: string;

  constructor(readonly root: string) {
    this.description = root;
  }

  /** The file of a key. */
  pathOf(key: string): string {
    return path.join(this.root, checkedKey(key));
  }

  async put(key: string, body: Readable | Uint8Array | string): Promise<void> {
    const target = this.pathOf(key);
    const partial = path.join(path.dirname(target), `.${path.basename(target)}.partial-${randomUUID()}`);
    try {
      await mkdir(path.dirname(target), { recursive: true });
      const source = body instanceof Readable ? body : Readable.from([typeof body === 'string' ? Buffer.from(body) : body]);
      await pipeline(source, createWriteStream(partial, { flags: 'wx' }));
      await rename(partial, target);
    } catch (error) {
      await rm(partial, { force: true });
      throw new ObjectWriteError(`cannot write ${key} in ${this.root}: ${(error as Error).message}`, { cause: error });
    }
  }

  async read(key: string, range?: ByteRange): Promise<Readable> {
    const file = this.pathOf(key);
    if ((await this.size(key)) === null) throw new ObjectMissingError(key);
    if (range && range.end <= range.start) return Readable.from([]);
    return createReadStream(file, range ? { start: range.start, end: range.end - 1 } : {});
  }

  async size(key: string): Promise<number | null> {
    try {
      const info = await stat(this.pathOf(key));
      return info.isFile() ? info.size : null;
    } catch (error) {
      if ((error as NodeJS.ErrnoException).code === 'ENOENT') return null;
      throw error;
    }
  }

  async list(prefix: string): Promise<string[]> {
    const dir = path.join(this.root, prefix);
    const names = await readdir(dir, { recursive: true, withFileTypes: true }).catch((error: NodeJS.ErrnoException) => {
      if (error.code === 'ENOENT') return [];
      throw error;
    });
    return names
      .filter((entry) => entry.isFile())
      .map((entry) => path.relative(this.root, path.join(entry.parentPath, entry.name)).split(path.sep).join('/'))
      .sort();
  }

  async remove(keys: string[]): Promise<void> {
    await Promise.all(keys.map((key) => rm(this.pathOf(key), { force: true })));
  }
}
