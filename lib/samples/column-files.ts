// A sample's column files and the object store: a job publishes the folder its ColumnWriter committed (the
// manifest last, so a column set without its manifest is never taken for complete), and a server reading a
// sample kept in the bucket works on a local copy fetched once into storage/cache/ (ColumnReader reads files at
// random places, which a bucket answers one request at a time).
import { randomUUID } from 'node:crypto';
import { createReadStream, createWriteStream } from 'node:fs';
import { mkdir, readdir, rename, rm, stat } from 'node:fs/promises';
import path from 'node:path';
import { pipeline } from 'node:stream/promises';
import { ColumnReader, MANIFEST_FILE } from '@/lib/ingest/columns';
import { samplePrefix } from '@/lib/objects/keys';
import type { ObjectStore } from '@/lib/objects/object-store';
import { cachedSampleDir, type SampleStorage, sampleDir } from './storage';

/** Files uploaded at once. */
const PARALLEL_FILES = 4;

async function inTurns<T>(items: T[], work: (item: T) => Promise<void>): Promise<void> {
  let next = 0;
  const lane = async () => {
    while (next < items.length) await work(items[next++]);
  };
  await Promise.all(Array.from({ length: Math.min(PARALLEL_FILES, items.length) }, lane));
}

/** Copies a committed column folder to `prefix` in the store, the manifest last. */
export async function publishColumnFolder(store: ObjectStore, folder: string, prefix: string): Promise<void> {
  const files = (await readdir(folder)).filter((name) => name !== MANIFEST_FILE);
  await inTurns(files, (name) => store.put(`${prefix}${name}`, createReadStream(path.join(folder, name))));
  await store.put(`${prefix}${MANIFEST_FILE}`, createReadStream(path.join(folder, MANIFEST_FILE)));
}

/** Copies the column set under `prefix` into a new local folder `target` (through a hidden staging folder). */
export async function fetchColumnFolder(store: ObjectStore, prefix: string, target: string): Promise<void> {
  const keys = await store.list(prefix);
  if (!keys.includes(`${prefix}${MANIFEST_FILE}`)) throw new Error(`the column set ${prefix} in ${store.description} has no ${MANIFEST_FILE}`);
  const staging = path.join(path.dirname(target), `.${path.basename(target)}.partial-${randomUUID()}`);
  await mkdir(staging, { recursive: true });
  try {
    await inTurns(keys, async (key) => {
      await pipeline(await store.read(key), createWriteStream(path.join(staging, key.slice(prefix.length)), { flags: 'wx' }));
    });
    await rename(staging, target);
  } catch (error) {
    await rm(staging, { recursive: true, force: true });
    // Another request fetched the same set first: theirs is complete.
    if ((error as NodeJS.ErrnoException).code === 'ENOTEMPTY' || (error as NodeJS.ErrnoException).code === 'EEXIST') return;
    throw error;
  }
}

/** Opens the columns of a sample folder (a done sample's `tablesId ?? id`), from the bucket's cached copy if there is one. */
export async function openColumnFolder(storage: SampleStorage, folder: number): Promise<ColumnReader> {
  if (!storage.remote) return ColumnReader.open(sampleDir(storage, folder));
  const local = cachedSampleDir(storage, folder);
  const present = await stat(path.join(local, MANIFEST_FILE)).then(
    () => true,
    () => false,
  );
  if (!present) await fetchColumnFolder(storage.remote, samplePrefix(folder), local);
  return ColumnReader.open(local);
}
