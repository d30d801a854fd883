import Link from 'next/link';
import { Button, buttonClass } from '../button';
import { formatDate } from '../format';
import type { SampleSummary } from '@/lib/samples/shapes';

interface DuplicateNoticeProps {
  existing: SampleSummary;
  onProcessAnyway: () => void;
  onDismiss: () => void;
}

/** The server knows this file already: open that sample, or process the file again with these settings. */
export function DuplicateNotice({ existing, onProcessAnyway, onDismiss }: DuplicateNoticeProps) {
  return (
    <div role="alert" className="space-y-3 rounded-lg border border-warn/30 bg-warn-soft p-4 text-sm">
      <p className="text-ink">
        <span className="font-medium">This file was uploaded before</span>: “{existing.name}” in {existing.studyTitle}, on{' '}
        {formatDate(existing.createdAt)}. Open it, or process the file again (for instance with other settings).
      </p>
      <div className="flex flex-wrap gap-2">
        <Link href={`/samples/${existing.id}`} className={buttonClass('primary', 'sm')}>
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
