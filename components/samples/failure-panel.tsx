import type { SampleError } from '@/models/sample-fields';
import { Panel } from '../panel';

/** Why processing stopped: the reader's exact message (it names the line and particle) and what it means. */
export function FailurePanel({ failure }: { failure: SampleError | null }) {
  return (
    <Panel title="Processing failed" lead="Nothing of this sample was kept. Fix the file and upload it again." danger>
      <div className="space-y-3 text-sm">
        {failure?.line != null && <p className="font-medium text-danger">At line {failure.line} of the file</p>}
        <pre className="overflow-x-auto rounded-md bg-danger-soft px-3 py-2 font-mono text-xs whitespace-pre-wrap text-danger">
          {failure?.message ?? 'The server gave no reason.'}
        </pre>
        {failure?.explanation && <p className="text-ink">{failure.explanation}</p>}
      </div>
    </Panel>
  );
}
