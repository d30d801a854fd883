// What only a processed sample has: its columns in the store and its cached planes.
import { ApiError } from '@/lib/api/errors';
import type { ColumnReader } from '@/lib/ingest/columns';
import type { Sample } from '@/models/sample';
import { tablesFolderOf } from './sharing';
import { openColumnFolder } from './column-files';
import { sampleStorage } from './storage';

/** 409 unless the sample is done. */
export function requireDone(sample: Sample): void {
  if (sample.state === 'done') return;
  const why = sample.state === 'failed' || sample.state === 'cancelled' ? 'it has no results' : 'wait until it is done';
  throw new ApiError(409, 'not_ready', `Sample ${sample.id} is ${sample.state}: ${why}.`);
}

export async function openSampleColumns(sample: Sample): Promise<ColumnReader> {
  requireDone(sample);
  return openColumnFolder(sampleStorage(), tablesFolderOf(sample));
}
