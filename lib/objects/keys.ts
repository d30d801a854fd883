// Names of objects in the store. Upload names are generated (storage.ts); sample folders are sample ids.
import path from 'node:path';

export const UPLOADS_PREFIX = 'uploads/';
export const SAMPLES_PREFIX = 'samples/';
/** Shard outputs of the scaled mode, kept only while their sample's job runs. */
export const WORK_PREFIX = 'work/';

export function uploadKey(fileName: string): string {
  return `${UPLOADS_PREFIX}${path.basename(fileName)}`;
}

export function samplePrefix(folder: number): string {
  return `${SAMPLES_PREFIX}${folder}/`;
}

/** The objects of one run of a sample's job (the attempt keeps a retried run's shards apart from an earlier one's). */
export function workPrefix(sampleId: number, attempt: number): string {
  return `${WORK_PREFIX}${sampleId}-${attempt}/`;
}

/** Refuses keys that could leave the store's folder or name nothing. */
export function checkedKey(key: string): string {
  const parts = key.split('/');
  if (key.length === 0 || key.startsWith('/') || parts.some((part) => part === '..' || part === '.' || part === '')) {
    throw new RangeError(`invalid object key "${key}"`);
  }
  return key;
}
