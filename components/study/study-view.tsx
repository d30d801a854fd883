'use client';

import { useRouter } from 'next/navigation';
import useSWR from 'swr';
import { sendJson, type ApiError } from '@/lib/api/client';
import type { StudyDetail } from '../api-types';
import { ConfirmButton } from '../confirm-button';
import { EmptyState } from '../empty-state';
import { useMe } from '../hooks/use-me';
import { LoadingBlock } from '../loading-block';
import { Panel } from '../panel';
import { StudyRegionsList } from '../regions/study-regions-list';
import { StudySamplesPanel } from '../samples/study-samples-panel';
import { ActivityPanel } from './activity-panel';
import { EntryList } from './entry-list';
import { MembersPanel } from './members-panel';
import { studyPermissions } from './permissions';
import { StudyHeading } from './study-heading';
import { useDocumentTitle } from '@/components/use-document-title';

/** A study: its heading and entries, with the members beside them (below them on narrow screens). */
export function StudyView({ studyId }: { studyId: string }) {
  const { me } = useMe();
  const router = useRouter();
  const { data, error, mutate } = useSWR<StudyDetail, ApiError>(`/api/studies/${studyId}`);
  useDocumentTitle(data?.study.title);

  if (error) {
    return (
      <EmptyState title={error.status === 404 ? 'Study not found' : 'This study could not be opened'}>
        {error.message}
      </EmptyState>
    );
  }
  if (!data || !me) return <LoadingBlock label="Loading study…" />;

  const { canEdit, canManage } = studyPermissions(me, data.myRole);

  async function deleteStudy() {
    await sendJson('DELETE', `/api/studies/${studyId}`);
    router.push('/studies');
  }

  return (
    <div className="grid gap-8 lg:grid-cols-[minmax(0,1fr)_18rem]">
      <div className="min-w-0">
        <StudyHeading studyId={studyId} study={data.study} myRole={data.myRole} canEdit={canEdit} onChanged={mutate} />
        <EntryList studyId={studyId} entries={data.entries} canEdit={canEdit} onChanged={mutate} />
        <StudyRegionsList studyId={data.study.id} />
      </div>
      <aside className="space-y-4">
        <ActivityPanel studyId={studyId} />
        <StudySamplesPanel studyId={studyId} canEdit={canEdit} />
        <MembersPanel studyId={studyId} members={data.members} myId={me.id} canManage={canManage} onChanged={mutate} />
        {canManage && (
          <Panel title="Delete study" lead="Removes the study and all its entries for every member." danger>
            <ConfirmButton label="Delete study" question="Delete for everyone?" confirmLabel="Delete" onConfirm={deleteStudy} />
          </Panel>
        )}
      </aside>
    </div>
  );
}
