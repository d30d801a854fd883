import type { SampleSummary } from '@/lib/samples/shapes';

/** Queued or running: the page keeps asking the server for news. */
export function isProcessing(sample: Pick<SampleSummary, 'state'>): boolean {
  return sample.state === 'queued' || sample.state === 'running';
}
