import Link from 'next/link';
import { Button, buttonClass } from '../button';
import { formatDate } from '../format';
import type { SampleSummary } from '@/lib/samples/shapes';

interface DuplicateNoticeProps {
  existing: SampleSummary;
  /** The study chosen in the form; when the existing sample is in another one, it can be added there as it is. */
  targetStudyId: number;
  onAttach: () => void;
  onProcessAnyway: () => void;
  onDismiss: () => void;
}

/**
 * The server knows this file already: open that sample, add it to the chosen study without processing it again
 * (when it is in another study), or process the file again with these settings.
 */
export function DuplicateNotice({ existing, targetStudyId, onAttach, onProcessAnyway, onDismiss }: DuplicateNoticeProps) {
  const elsewhere = existing.studyId !== targetStudyId;
  return (
    <div role="alert" className="space-y-3 rounded-lg border border-warn/30 bg-warn-soft p-4 text-sm">
      <p className="text-ink">
        <span className="font-medium">This file was uploaded before</span>: “{existing.name}” in {existing.studyTitle}, on{' '}
        {formatDate(existing.createdAt)}.{' '}
        {elsewhere
          ? 'Add it to the study you chose as it is (no processing again), open it, or process the file again.'
          : 'Open it, or process the file again (for instance with other settings).'}
      </p>
      <div className="flex flex-wrap gap-2">
        {elsewhere && (
          <Button variant="primary" size="sm" onClick={onAttach}>
            Add it to this study
          </Button>
        )}
        <Link href={`/samples/${existing.id}`} className={buttonClass(elsewhere ? 'secondary' : 'primary', 'sm')}>
          Open the existing sample
        </Link>
        <Button size="sm" onClick={onProcessAnyway}>
          Process it again anyway
        </Button>
        <Button variant="ghost" size="sm" onClick={onDismiss}>
          Back to the form
        </Button>
      </div>
    </div>
  );
}
