import { ConfirmButton } from '../confirm-button';
import { Panel } from '../panel';
import { formatBytes, formatCount, formatDuration } from './numbers';
import { ProgressBar } from './progress-bar';
import type { SampleDetail, SampleProgress } from './sample-types';
import { StatGrid } from './stat-grid';

/** Share of the file read, and the time left if the rest goes as fast; null while nothing is known. */
function outlook(progress: SampleProgress | null): { fraction: number | null; leftMs: number | null } {
  if (!progress?.bytesTotal || progress.bytesRead <= 0) return { fraction: null, leftMs: null };
  const fraction = Math.min(1, progress.bytesRead / progress.bytesTotal);
  return { fraction, leftMs: (progress.elapsedMs * (1 - fraction)) / fraction };
}

interface ProcessingPanelProps {
  sample: SampleDetail;
  /** Given to editors: stops the job. */
  onCancel?: () => Promise<unknown>;
}

/** Live news of a queued or running sample, refreshed by the page about once a second. */
export function ProcessingPanel({ sample, onCancel }: ProcessingPanelProps) {
  const { progress } = sample;
  const { fraction, leftMs } = outlook(progress);
  const seconds = (progress?.elapsedMs ?? 0) / 1000;
  const rate = progress && seconds > 0 ? `${formatCount(Math.round(progress.recordsRead / seconds))} records/s` : '–';
  const queued = sample.state === 'queued';
  return (
    <Panel title={queued ? 'Waiting to be processed' : 'Processing'} aside={fraction === null ? undefined : `${Math.round(fraction * 100)} %`}>
      <div className="space-y-4">
        <ProgressBar label="Processing progress" fraction={queued ? null : fraction} />
        {progress && (
          <p className="text-xs text-ink-soft">
            {formatBytes(progress.bytesRead)} of {progress.bytesTotal === null ? 'an unknown size' : formatBytes(progress.bytesTotal)} read
            {leftMs !== null && !queued ? ` · about ${formatDuration(leftMs)} left` : ''}
          </p>
        )}
        <StatGrid
          label="Progress"
          stats={[
            { label: 'Records read', value: formatCount(progress?.recordsRead ?? 0) },
            { label: 'Jets', value: formatCount(progress?.jets ?? 0) },
            { label: 'Splittings', value: formatCount(progress?.splittings ?? 0) },
            { label: 'Rate', value: rate },
          ]}
        />
        {onCancel && (
          <ConfirmButton label="Cancel processing" question="Stop and keep nothing of this sample?" confirmLabel="Stop processing" onConfirm={onCancel} />
        )}
      </div>
    </Panel>
  );
}
