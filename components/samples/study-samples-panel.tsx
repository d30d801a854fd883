'use client';

import Link from 'next/link';
import useSWR from 'swr';
import type { ApiError } from '@/lib/api/client';
import { buttonClass } from '../button';
import { LoadingBlock } from '../loading-block';
import { Notice } from '../notice';
import { Panel } from '../panel';
import { formatCount } from './numbers';
import { isProcessing } from './sample-state';
import type { SampleSummary } from '@/lib/samples/shapes';
import { StateBadge } from './state-badge';

/** The samples of one study, for the study page; editors get the way to upload another. */
export function StudySamplesPanel({ studyId, canEdit }: { studyId: string; canEdit: boolean }) {
  const { data, error } = useSWR<{ samples: SampleSummary[] }, ApiError>(`/api/samples?studyId=${encodeURIComponent(studyId)}`, {
    refreshInterval: (latest) => (latest?.samples.some(isProcessing) ? 2000 : 0),
  });
  return (
    <Panel title="Samples" aside={data && formatCount(data.samples.length)}>
      {error && <Notice tone="error">{error.message}</Notice>}
      {!data && !error && <LoadingBlock label="Loading samples…" />}
      {data && data.samples.length === 0 && <p className="text-sm text-ink-soft">No samples in this study yet.</p>}
      {data && data.samples.length > 0 && (
        <ul aria-label="Samples of this study" className="-mx-2 divide-y divide-ink/10">
          {data.samples.map((sample) => (
            <li key={sample.id} className="flex items-center justify-between gap-2 px-2 py-2">
              <Link href={`/samples/${sample.id}`} className="min-w-0 truncate text-sm font-medium text-accent-strong hover:underline" title={sample.name}>
                {sample.name}
              </Link>
              <StateBadge state={sample.state} />
            </li>
          ))}
        </ul>
      )}
      {canEdit && (
        <Link href={`/samples/new?studyId=${encodeURIComponent(studyId)}`} className={`${buttonClass('secondary', 'sm')} mt-3`}>
          Upload a sample
        </Link>
      )}
    </Panel>
  );
}
