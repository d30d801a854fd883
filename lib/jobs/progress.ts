// A running job's progress as the API shows it: fraction of the upload read, counts, rates and time left.
import type { PipelineProgress } from '@/lib/ingest/pipeline/sink';
import type { SampleProgress } from '@/models/sample-fields';

/** Below this fraction read, a time-left estimate says little. */
const ESTIMATE_FROM_FRACTION = 0.01;

export function progressView(p: PipelineProgress, fileSize: number, fullTree: boolean): SampleProgress {
  const bytesTotal = p.bytesTotal ?? fileSize;
  const fraction = p.done ? 1 : bytesTotal > 0 ? Math.min(1, p.bytesRead / bytesTotal) : 0;
  const seconds = p.elapsedMs / 1000;
  const perSecond = (n: number) => (seconds > 0 ? n / seconds : 0);
  return {
    fraction,
    bytesRead: p.bytesRead,
    bytesTotal,
    records: p.records,
    jets: p.jets,
    splittings: fullTree ? p.allSplittings : p.primarySplittings,
    jetsPerSecond: perSecond(p.jets),
    recordsPerSecond: perSecond(p.records),
    elapsedSeconds: seconds,
    secondsLeft: p.done ? 0 : fraction >= ESTIMATE_FROM_FRACTION ? (seconds * (1 - fraction)) / fraction : null,
  };
}
