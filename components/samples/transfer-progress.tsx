import { Button } from '../button';
import { formatBytes } from './numbers';
import { ProgressBar } from './progress-bar';

/** How much of the file has gone to the server, with the way to stop. */
export function TransferProgress({ file, fraction, onCancel }: { file: File; fraction: number; onCancel: () => void }) {
  const finished = fraction >= 1;
  return (
    <div className="space-y-2 rounded-lg border border-ink/10 bg-paper-raised p-4">
      <div className="flex flex-wrap items-baseline justify-between gap-2 text-sm">
        <span className="font-medium text-ink">{finished ? 'File sent; the server is checking its header…' : 'Sending the file…'}</span>
        <span className="text-ink-soft tabular-nums">
          {formatBytes(fraction * file.size)} of {formatBytes(file.size)} · {Math.round(fraction * 100)} %
        </span>
      </div>
      <ProgressBar label="Upload progress" fraction={fraction} />
      <Button variant="secondary" size="sm" onClick={onCancel}>
        Cancel upload
      </Button>
    </div>
  );
}
