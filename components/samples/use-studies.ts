'use client';

import useSWR from 'swr';
import type { ApiError } from '@/lib/api/client';
import type { StudySummary } from '../api-types';
import { useMe } from '../hooks/use-me';
import { studyPermissions } from '../study/permissions';

/** The studies the user can see, and among them those they may upload into (editor, owner, or site admin). */
export function useStudies() {
  const { me } = useMe();
  const { data, error } = useSWR<{ studies: StudySummary[] }, ApiError>('/api/studies');
  const studies = data?.studies;
  const editable = me && studies ? studies.filter((study) => studyPermissions(me, study.myRole).canEdit) : undefined;
  return { studies, editable, error };
}
