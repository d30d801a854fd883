'use client';

import Link from 'next/link';
import { useState } from 'react';
import useSWR from 'swr';
import type { ApiError } from '@/lib/api/client';
import type { SampleSummary } from '@/lib/samples/shapes';
import { Button, buttonClass } from '../button';
import { EmptyState } from '../empty-state';
import { LoadingBlock } from '../loading-block';
import { Notice } from '../notice';
import { PageHeader } from '../page-header';
import { NO_FILTER, SampleFilters, type SampleFilter } from './sample-filters';
import { FIRST_ORDER, sortedSamples, sortQuery, type SampleSort, type SampleSortKey } from './sample-sort';
import { isProcessing } from './sample-state';
import { SampleTable } from './sample-table';
import { nextSort } from './table';
import { useStudies } from './use-studies';

type SampleList = { samples: SampleSummary[] };


const uploadLink = (
  <Link href="/samples/new" className={buttonClass('primary')}>
    Upload a sample
  </Link>
);

function listUrl(filter: SampleFilter, sort: SampleSort): string {
  const query = new URLSearchParams(sortQuery(sort));
  for (const [key, value] of Object.entries(filter)) if (value) query.set(key, value);
  return `/api/samples?${query}`;
}

/** Sorted, distinct non-empty values. */
function distinct(values: string[]): string[] {
  return [...new Set(values.filter(Boolean))].sort((a, b) => a.localeCompare(b));
}

/** Every sample of the user's studies: filter, sort, and go to one. */
export function SamplesView({ initialStudyId = '' }: { initialStudyId?: string }) {
  const [filter, setFilter] = useState<SampleFilter>({ ...NO_FILTER, studyId: initialStudyId });
  const [sort, setSort] = useState<SampleSort>({ key: 'date', order: 'desc' });
  const { studies, editable } = useStudies();
  const canUpload = !!editable && editable.length > 0;
  // The unfiltered list supplies the filters' choices; the filtered one is what the table shows.
  const { data: everything } = useSWR<SampleList, ApiError>('/api/samples');
  const { data, error } = useSWR<SampleList, ApiError>(listUrl(filter, sort), {
    keepPreviousData: true,
    refreshInterval: (latest) => (latest?.samples.some(isProcessing) ? 2000 : 0),
  });

  function sortBy(key: SampleSortKey) {
    setSort((current) => nextSort(current, key, FIRST_ORDER[key]));
  }

  const filtered = Object.values(filter).some(Boolean);
  const none = everything?.samples.length === 0;
  return (
    <>
      <PageHeader title="Samples" lead="Uploaded particle files of your studies, after processing." actions={!none && canUpload && uploadLink} />
      {everything && !none && (
        <SampleFilters
          filter={filter}
          onChange={setFilter}
          studies={studies ?? []}
          labels={distinct(everything.samples.map((sample) => sample.label))}
          tags={distinct(everything.samples.flatMap((sample) => sample.tags))}
        />
      )}
      {error && <Notice tone="error">{error.message}</Notice>}
      {!data && !error && <LoadingBlock label="Loading samples…" />}
      {none && (
        <EmptyState title="No samples yet" action={canUpload && uploadLink}>
          {canUpload
            ? 'Upload a file of events or jets: each jet is declustered and its splittings fill the sample’s emission plane.'
            : 'Samples appear here once an editor of one of your studies uploads one.'}
        </EmptyState>
      )}
      {/* After a failed request the rows of the previous one would no longer match the filters. */}
      {data && !none && !error && data.samples.length > 0 && (
        <SampleTable samples={sortedSamples(data.samples, sort)} sort={sort} onSort={sortBy} />
      )}
      {data && !none && !error && data.samples.length === 0 && (
        <EmptyState
          title="No sample matches these filters"
          action={
            filtered && (
              <Button variant="secondary" onClick={() => setFilter(NO_FILTER)}>
                Clear filters
              </Button>
            )
          }
        />
      )}
    </>
  );
}
