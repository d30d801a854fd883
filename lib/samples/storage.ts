// Where samples live: uploads wait in uploads/ (under generated names) until their job ends; a done sample's
// columns are samples/<id>/. In the embedded default both are folders of storage/; with a bucket configured
// (SPLITFIELD_S3_*, lib/objects/config.ts) they are objects under the same keys, and storage/ keeps only a cache
// of the columns this server reads (cache/<id>/) and the files a job works on. Nothing else belongs there, so
// whatever a crash left behind can be recognised and removed at start.
import { randomUUID } from 'node:crypto';
import { readdir, rm } from 'node:fs/promises';
import path from 'node:path';
import { readConfig } from '@/lib/config/environment';
import { remoteStore } from '@/lib/objects/config';
import { samplePrefix, SAMPLES_PREFIX, uploadKey, UPLOADS_PREFIX, WORK_PREFIX } from '@/lib/objects/keys';
import { type ObjectStore, removePrefix } from '@/lib/objects/object-store';

const UPLOAD_SUFFIX = '.upload';

export interface SampleStorage {
  uploadsDir: string;
  samplesDir: string;
  /** Local copies of columns kept in the bucket, and a job's downloaded upload (only with a bucket). */
  cacheDir: string;
  /** The bucket, or null when the folders above are the store. */
  remote: ObjectStore | null;
}

export function sampleStorage(storageDir = readConfig().storageDir, remote = remoteStore()): SampleStorage {
  return {
    uploadsDir: path.join(storageDir, 'uploads'),
    samplesDir: path.join(storageDir, 'samples'),
    cacheDir: path.join(storageDir, 'cache'),
    remote,
  };
}

/** A fresh name for an upload file. */
export function newUploadFileName(): string {
  return `${randomUUID()}${UPLOAD_SUFFIX}`;
}

export function uploadPath(storage: SampleStorage, fileName: string): string {
  return path.join(storage.uploadsDir, path.basename(fileName));
}

export function sampleDir(storage: SampleStorage, sampleId: number): string {
  return path.join(storage.samplesDir, String(sampleId));
}

/** The local copy of a column set kept in the bucket. */
export function cachedSampleDir(storage: SampleStorage, folder: number): string {
  return path.join(storage.cacheDir, String(folder));
}

async function entries(dir: string): Promise<string[]> {
  try {
    return await readdir(dir);
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code === 'ENOENT') return [];
    throw error;
  }
}

/** Removes everything of a folder's name or of its hidden partial copies (`.<name>.partial-…`). */
async function removeNamed(dir: string, name: string): Promise<void> {
  const staging = `.${name}.partial-`;
  const names = (await entries(dir)).filter((entry) => entry === name || entry.startsWith(staging));
  await Promise.all(names.map((entry) => rm(path.join(dir, entry), { recursive: true, force: true })));
}

/** Removes a sample's columns, any half-written copy of them (ColumnWriter's staging folders), and their objects. */
export async function removeSampleFiles(storage: SampleStorage, sampleId: number): Promise<void> {
  await removeNamed(storage.samplesDir, String(sampleId));
  if (!storage.remote) return;
  await removePrefix(storage.remote, samplePrefix(sampleId));
  await removeNamed(storage.cacheDir, String(sampleId));
}

export async function removeUpload(storage: SampleStorage, fileName: string | null): Promise<void> {
  if (!fileName) return;
  await rm(uploadPath(storage, fileName), { force: true });
  await storage.remote?.remove([uploadKey(fileName)]);
}

/**
 * Removes what no sample owns: uploads other than `keepUploads` (partial uploads included), sample folders other
 * than those of `keepSamples` (staging folders included), and in a bucket the same objects and every job's work
 * objects but those of `keepWork` prefixes. Only safe while no upload or job is under way.
 */
export async function sweepUnowned(storage: SampleStorage, keepUploads: Set<string>, keepSamples: Set<number>, keepWork = new Set<string>()) {
  const removed: string[] = [];
  for (const name of await entries(storage.uploadsDir)) {
    if (keepUploads.has(name)) continue;
    await rm(path.join(storage.uploadsDir, name), { recursive: true, force: true });
    removed.push(path.join('uploads', name));
  }
  for (const dir of [storage.samplesDir, storage.cacheDir]) {
    for (const name of await entries(dir)) {
      if (/^\d+$/.test(name) && keepSamples.has(Number(name)) && dir === storage.samplesDir) continue;
      await rm(path.join(dir, name), { recursive: true, force: true });
      if (dir === storage.samplesDir) removed.push(path.join('samples', name));
    }
  }
  if (storage.remote) {
    const owned = (key: string) => {
      if (key.startsWith(UPLOADS_PREFIX)) return keepUploads.has(key.slice(UPLOADS_PREFIX.length));
      if (key.startsWith(SAMPLES_PREFIX)) return keepSamples.has(Number(key.slice(SAMPLES_PREFIX.length).split('/')[0]));
      return [...keepWork].some((prefix) => key.startsWith(prefix));
    };
    const keys = (await Promise.all([UPLOADS_PREFIX, SAMPLES_PREFIX, WORK_PREFIX].map((prefix) => storage.remote!.list(prefix)))).flat();
    const unowned = keys.filter((key) => !owned(key));
    await storage.remote.remove(unowned);
    removed.push(...unowned.map((key) => `${storage.remote!.description}${key}`));
  }
  return removed;
}
