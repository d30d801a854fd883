import type { SampleDetail } from '@/lib/samples/shapes';
import type { SampleProgress } from '@/models/sample-fields';
import { ConfirmButton } from '../confirm-button';
import { Panel } from '../panel';
import { formatBytes, formatCount, formatDuration } from './numbers';
import { ProgressBar } from './progress-bar';
import { StatGrid } from './stat-grid';

/** How far the job is: share of the file read, time so far and left, and what it has found. */
function RunningProgress({ progress }: { progress: SampleProgress }) {
  const left = progress.secondsLeft === null ? '' : ` · about ${formatDuration(progress.secondsLeft * 1000)} left`;
  return (
    <>
      <ProgressBar label="Processing progress" fraction={progress.fraction} />
      <p className="text-xs text-ink-soft">
        {formatBytes(progress.bytesRead)} of {formatBytes(progress.bytesTotal)} read in {formatDuration(progress.elapsedSeconds * 1000)}
        {left}
      </p>
      <StatGrid
        label="Progress"
        stats={[
          { label: 'Records read', value: formatCount(progress.records) },
          { label: 'Jets', value: formatCount(progress.jets) },
          { label: 'Splittings', value: formatCount(progress.splittings) },
          { label: 'Rate', value: `${formatCount(Math.round(progress.jetsPerSecond))} jets/s` },
        ]}
      />
    </>
  );
}

interface ProcessingPanelProps {
  sample: SampleDetail;
  /** Given to editors: stops the job. */
  onCancel?: () => Promise<unknown>;
}

/** Live news of a queued or running sample, refreshed by the page about once a second; it says what the state badge says. */
export function ProcessingPanel({ sample, onCancel }: ProcessingPanelProps) {
  const { progress } = sample;
  const running = sample.state === 'running';
  return (
    <Panel
      title={running ? 'Processing' : 'Waiting to be processed'}
      aside={running && progress ? `${Math.round(progress.fraction * 100)} %` : undefined}
    >
      <div className="space-y-4">
        {running && progress ? (
          <RunningProgress progress={progress} />
        ) : running ? (
          <p className="text-sm text-ink-soft">Processing has started: the file is being opened. Progress appears in a moment.</p>
        ) : (
          <p className="text-sm text-ink-soft">Waiting for its turn in the processing queue. This page follows it by itself.</p>
        )}
        {onCancel && (
          <ConfirmButton label="Cancel processing" question="Stop and keep nothing of this sample?" confirmLabel="Stop processing" onConfirm={onCancel} />
        )}
      </div>
    </Panel>
  );
}
