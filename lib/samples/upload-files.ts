// Upload files between the storage folder and the bucket: a job on this server reads a local copy; workers of the
// scaled mode read the bucket, so a file written locally (the demo seed writes its files there) is moved up first.
import { createReadStream, createWriteStream } from 'node:fs';
import { readdir, rename, rm, stat } from 'node:fs/promises';
import { pipeline } from 'node:stream/promises';
import { uploadKey, UPLOADS_PREFIX } from '@/lib/objects/keys';
import type { SampleStorage } from './storage';
import { uploadPath } from './storage';

async function isFile(file: string): Promise<boolean> {
  return stat(file).then(
    (info) => info.isFile(),
    () => false,
  );
}

/** Names of the uploads kept, locally or in the bucket. */
export async function storedUploadNames(storage: SampleStorage): Promise<Set<string>> {
  const local = await readdir(storage.uploadsDir).catch(() => [] as string[]);
  const remote = storage.remote ? (await storage.remote.list(UPLOADS_PREFIX)).map((key) => key.slice(UPLOADS_PREFIX.length)) : [];
  return new Set([...local, ...remote]);
}

/** Makes sure the upload is in the local uploads folder (copied from the bucket unless already there). */
export async function fetchUpload(storage: SampleStorage, fileName: string): Promise<void> {
  const target = uploadPath(storage, fileName);
  if (!storage.remote || (await isFile(target))) return;
  const partial = `${target}.partial`;
  try {
    await pipeline(await storage.remote.read(uploadKey(fileName)), createWriteStream(partial));
    await rename(partial, target);
  } finally {
    await rm(partial, { force: true });
  }
}

/** Makes sure the upload is in the bucket: a local file is moved there. */
export async function raiseUpload(storage: SampleStorage, fileName: string): Promise<void> {
  const local = uploadPath(storage, fileName);
  if (!storage.remote || !(await isFile(local))) return;
  await storage.remote.put(uploadKey(fileName), createReadStream(local));
  await rm(local, { force: true });
}
