import Link from 'next/link';
import { formatDateTime } from '../format';
import { PageHeader } from '../page-header';
import type { SampleDetail } from '@/lib/samples/shapes';
import { StateBadge } from './state-badge';

/** The sample's name and state, where it belongs, who uploaded it and when. */
export function SampleHeading({ sample }: { sample: SampleDetail }) {
  return (
    <PageHeader
      title={
        <span className="inline-flex flex-wrap items-center gap-x-3 gap-y-1">
          {sample.name}
          <StateBadge state={sample.state} />
        </span>
      }
      lead={
        <div className="space-y-1">
          <p>
            In{' '}
            <Link href={`/studies/${sample.studyId}`} className="font-medium text-accent-strong hover:underline">
              {sample.studyTitle}
            </Link>
            {sample.label && (
              <>
                {' '}
                · label <span className="font-mono">{sample.label}</span>
              </>
            )}
            {' '}· uploaded {sample.uploadedBy ? `by ${sample.uploadedBy.name} ` : ''}on {formatDateTime(sample.createdAt)}
          </p>
          {sample.tags.length > 0 && <p className="text-xs">{sample.tags.map((tag) => `#${tag}`).join(' ')}</p>}
          {sample.description && <p className="max-w-2xl text-ink">{sample.description}</p>}
        </div>
      }
    />
  );
}
