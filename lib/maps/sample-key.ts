// The name of one processing of a sample in the view caches. SQLite may give a deleted sample's id to the next new
// one, so the id alone could serve the old sample's cached columns; with the file hash and the finishing time it
// cannot.
import type { Sample } from '@/models/sample';

export function sampleKey(sample: Sample): string {
  return `${sample.id}.${sample.fileHash.slice(0, 16)}.${sample.finishedAt?.getTime() ?? 0}`;
}
