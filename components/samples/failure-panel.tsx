import { Panel } from '../panel';
import type { SampleFailure } from './sample-types';

/** Why processing stopped: the reader's exact message, where in the file, and what it means in plain words. */
export function FailurePanel({ failure }: { failure: SampleFailure | null }) {
  const where = [failure?.line != null && `line ${failure.line}`, failure?.particle != null && `particle ${failure.particle}`].filter(Boolean);
  return (
    <Panel title="Processing failed" lead="Nothing of this sample was kept. Fix the file and upload it again." danger>
      <div className="space-y-3 text-sm">
        {where.length > 0 && (
          <p className="font-medium text-danger">
            At {where.join(', ')} of the file
          </p>
        )}
        <pre className="overflow-x-auto rounded-md bg-danger-soft px-3 py-2 font-mono text-xs whitespace-pre-wrap text-danger">
          {failure?.message ?? 'The server gave no reason.'}
        </pre>
        {failure?.explanation && <p className="text-ink">{failure.explanation}</p>}
      </div>
    </Panel>
  );
}
