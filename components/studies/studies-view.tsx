'use client';

import { useState } from 'react';
import useSWR from 'swr';
import type { ApiError } from '@/lib/api/client';
import type { StudySummary } from '../api-types';
import { Button } from '../button';
import { EmptyState } from '../empty-state';
import { LoadingBlock } from '../loading-block';
import { Notice } from '../notice';
import { PageHeader } from '../page-header';
import { CreateStudyForm } from './create-study-form';
import { StudyList } from './study-list';

export function StudiesView() {
  const { data, error } = useSWR<{ studies: StudySummary[] }, ApiError>('/api/studies');
  const [creating, setCreating] = useState(false);
  const openForm = () => setCreating(true);

  return (
    <>
      <PageHeader
        title="Studies"
        lead="Shared analysis documents you are a member of."
        actions={
          !creating &&
          data?.studies.length !== 0 && (
            <Button variant="primary" onClick={openForm}>
              New study
            </Button>
          )
        }
      />
      {creating && <CreateStudyForm onCancel={() => setCreating(false)} />}
      {error && <Notice tone="error">{error.message}</Notice>}
      {!data && !error && <LoadingBlock label="Loading studies…" />}
      {data && data.studies.length > 0 && <StudyList studies={data.studies} />}
      {data && data.studies.length === 0 && !creating && (
        <EmptyState
          title="No studies yet"
          action={
            <Button variant="primary" onClick={openForm}>
              Start a study
            </Button>
          }
        >
          A study is an ordered list of notes that you share with the collaborators you add.
        </EmptyState>
      )}
    </>
  );
}
