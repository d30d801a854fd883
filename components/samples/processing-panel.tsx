import type { SampleDetail } from '@/lib/samples/shapes';
import { ConfirmButton } from '../confirm-button';
import { Panel } from '../panel';
import { formatBytes, formatCount, formatDuration } from './numbers';
import { ProgressBar } from './progress-bar';
import { StatGrid } from './stat-grid';

interface ProcessingPanelProps {
  sample: SampleDetail;
  /** Given to editors: stops the job. */
  onCancel?: () => Promise<unknown>;
}

/** Live news of a queued or running sample, refreshed by the page about once a second. */
export function ProcessingPanel({ sample, onCancel }: ProcessingPanelProps) {
  const { progress } = sample;
  const queued = sample.state === 'queued' || !progress;
  const percent = progress ? `${Math.round(progress.fraction * 100)} %` : undefined;
  return (
    <Panel title={queued ? 'Waiting to be processed' : 'Processing'} aside={percent}>
      <div className="space-y-4">
        <ProgressBar label="Processing progress" fraction={queued ? null : progress.fraction} />
        <p className="text-xs text-ink-soft">
          {queued
            ? 'Another sample is being processed; this one starts when it is done.'
            : `${formatBytes(progress.bytesRead)} of ${formatBytes(progress.bytesTotal)} read in ${formatDuration(progress.elapsedSeconds * 1000)}` +
              (progress.secondsLeft === null ? '' : ` · about ${formatDuration(progress.secondsLeft * 1000)} left`)}
        </p>
        <StatGrid
          label="Progress"
          stats={[
            { label: 'Records read', value: formatCount(progress?.records ?? 0) },
            { label: 'Jets', value: formatCount(progress?.jets ?? 0) },
            { label: 'Splittings', value: formatCount(progress?.splittings ?? 0) },
            { label: 'Rate', value: progress ? `${formatCount(Math.round(progress.jetsPerSecond))} jets/s` : '–' },
          ]}
        />
        {onCancel && (
          <ConfirmButton label="Cancel processing" question="Stop and keep nothing of this sample?" confirmLabel="Stop processing" onConfirm={onCancel} />
        )}
      </div>
    </Panel>
  );
}
