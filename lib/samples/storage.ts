// Where samples live on disk: uploads wait in storage/uploads/ (under generated names) until their job ends;
// a done sample's columns are storage/samples/<id>/. Nothing else belongs there, so whatever a crash left
// behind can be recognised and removed at start.
import { randomUUID } from 'node:crypto';
import { readdir, rm } from 'node:fs/promises';
import path from 'node:path';
import { readConfig } from '@/lib/config/environment';

const UPLOAD_SUFFIX = '.upload';

export interface SampleStorage {
  uploadsDir: string;
  samplesDir: string;
}

export function sampleStorage(storageDir = readConfig().storageDir): SampleStorage {
  return { uploadsDir: path.join(storageDir, 'uploads'), samplesDir: path.join(storageDir, 'samples') };
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

async function entries(dir: string): Promise<string[]> {
  try {
    return await readdir(dir);
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code === 'ENOENT') return [];
    throw error;
  }
}

/** Removes a sample's columns, and any half-written copy of them (ColumnWriter's hidden staging folders). */
export async function removeSampleFiles(storage: SampleStorage, sampleId: number): Promise<void> {
  const staging = `.${sampleId}.partial-`;
  const names = (await entries(storage.samplesDir)).filter((name) => name === String(sampleId) || name.startsWith(staging));
  await Promise.all(names.map((name) => rm(path.join(storage.samplesDir, name), { recursive: true, force: true })));
}

export async function removeUpload(storage: SampleStorage, fileName: string | null): Promise<void> {
  if (fileName) await rm(uploadPath(storage, fileName), { force: true });
}

/**
 * Removes what no sample owns: uploads other than `keepUploads` (partial uploads included) and sample folders
 * other than those of `keepSamples` (staging folders included). Only safe while no upload or job is under way.
 */
export async function sweepUnowned(storage: SampleStorage, keepUploads: Set<string>, keepSamples: Set<number>) {
  const removed: string[] = [];
  for (const name of await entries(storage.uploadsDir)) {
    if (keepUploads.has(name)) continue;
    await rm(path.join(storage.uploadsDir, name), { recursive: true, force: true });
    removed.push(path.join('uploads', name));
  }
  for (const name of await entries(storage.samplesDir)) {
    if (/^\d+$/.test(name) && keepSamples.has(Number(name))) continue;
    await rm(path.join(storage.samplesDir, name), { recursive: true, force: true });
    removed.push(path.join('samples', name));
  }
  return removed;
}
