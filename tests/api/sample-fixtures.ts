// Samples made through the upload API itself, for the API tests: small generated files, the multipart form,
// and waiting for a job to reach a state.
import { existsSync, readdirSync } from 'node:fs';
import path from 'node:path';
import { expect } from 'vitest';
import { particlesFileLines } from '@/lib/ingest/generated-sample-file';
import { demoSampleSpec } from '@/lib/demo/scenario';
import type { Client } from '../support/server';

/** A splitfield-particles JSON Lines file of `count` generated quark-like jets (content "jets"), as text. */
export function jetsFileText(count: number, seed: number): string {
  return `${[...particlesFileLines(demoSampleSpec('quark'), count, seed)].join('\n')}\n`;
}

export interface UploadInput {
  studyId: number | string;
  name?: string;
  file: Blob | string;
  fileName?: string;
  /** Further text fields (label, tags, settings, force, ...). */
  fields?: Record<string, string>;
}

/** The upload form, fields before the file (as the pages send it). */
export function uploadForm(input: UploadInput): FormData {
  const form = new FormData();
  form.append('studyId', String(input.studyId));
  form.append('name', input.name ?? 'Test sample');
  for (const [name, value] of Object.entries(input.fields ?? {})) form.append(name, value);
  const file = typeof input.file === 'string' ? new Blob([input.file]) : input.file;
  form.append('file', file, input.fileName ?? 'sample.jsonl');
  return form;
}

export function upload(client: Client, input: UploadInput, headers?: Record<string, string>) {
  return client.send('POST', '/api/samples/upload', { multipart: uploadForm(input), headers });
}

const POLL_MS = 100;
const WAIT_LIMIT_MS = 120_000;

/** Polls the sample until `reached` holds; fails with its last state after a generous limit (not a speed check). */
export async function waitForSample(
  client: Client,
  sampleId: number,
  reached: (sample: any) => boolean,
  what = 'the expected state',
): Promise<any> {
  const deadline = Date.now() + WAIT_LIMIT_MS;
  let sample: any = null;
  while (Date.now() < deadline) {
    const response = await client.get(`/api/samples/${sampleId}`);
    expect(response.status, response.text).toBe(200);
    sample = response.body.sample;
    if (reached(sample)) return sample;
    await new Promise((resolve) => setTimeout(resolve, POLL_MS));
  }
  throw new Error(`sample ${sampleId} did not reach ${what}; last: ${JSON.stringify(sample)}`);
}

export const isFinished = (sample: { state: string }) => ['done', 'failed', 'cancelled'].includes(sample.state);

/** Uploads and waits for the job to finish; returns the sample, which must be done. */
export async function uploadDone(client: Client, input: UploadInput): Promise<any> {
  const response = await upload(client, input);
  expect(response.status, response.text).toBe(202);
  const sample = await waitForSample(client, response.body.sample.id, isFinished, 'the end of its job');
  expect(sample.state, JSON.stringify(sample.error)).toBe('done');
  return sample;
}

/** What the server keeps under storage/: upload files and sample folders (hidden staging folders included). */
export function storedFiles(storageDir: string): { uploads: string[]; samples: string[] } {
  const list = (dir: string) => (existsSync(dir) ? readdirSync(dir).sort() : []);
  return { uploads: list(path.join(storageDir, 'uploads')), samples: list(path.join(storageDir, 'samples')) };
}
