'use client';

import { useRouter } from 'next/navigation';
import useSWR from 'swr';
import { sendJson, type ApiError } from '@/lib/api/client';
import { ConfirmButton } from '../confirm-button';
import { EmptyState } from '../empty-state';
import { useMe } from '../hooks/use-me';
import { LoadingBlock } from '../loading-block';
import { Notice } from '../notice';
import { Panel } from '../panel';
import { PlanePanel } from '../plane/plane-panel';
import { studyPermissions } from '../study/permissions';
import { ExportLinks } from './export-links';
import { FailurePanel } from './failure-panel';
import { JetTable } from './jet-table';
import { ProcessingPanel } from './processing-panel';
import { ProvenancePanel } from './provenance-panel';
import { SampleCountsPanel } from './sample-counts';
import { SampleHeading } from './sample-heading';
import { isProcessing } from './sample-state';
import type { SampleDetail } from '@/lib/samples/shapes';
import { useDocumentTitle } from '@/components/use-document-title';

/** How often a queued or running sample asks for news. */
const POLL_MS = 1000;

/** One sample: live progress while it is processed, then its counts, plane, jets, provenance and exports. */
export function SampleView({ sampleId }: { sampleId: string }) {
  const { me } = useMe();
  const router = useRouter();
  const url = `/api/samples/${sampleId}`;
  const { data, error, mutate } = useSWR<{ sample: SampleDetail }, ApiError>(url, {
    refreshInterval: (latest) => (latest && isProcessing(latest.sample) ? POLL_MS : 0),
  });
  useDocumentTitle(data?.sample.name);

  if (error) {
    return (
      <EmptyState title={error.status === 404 ? 'Sample not found' : 'This sample could not be opened'}>{error.message}</EmptyState>
    );
  }
  if (!data || !me) return <LoadingBlock label="Loading sample…" />;

  const { sample } = data;
  const { canEdit } = studyPermissions(me, sample.myRole);

  async function cancel() {
    await mutate(sendJson<{ sample: SampleDetail }>('POST', `${url}/cancel`), { revalidate: false });
  }

  async function remove() {
    await sendJson('DELETE', url);
    router.push('/samples');
  }

  return (
    <>
      <SampleHeading sample={sample} />
      <div className="space-y-6">
        {isProcessing(sample) && <ProcessingPanel sample={sample} onCancel={canEdit ? cancel : undefined} />}
        {sample.state === 'failed' && <FailurePanel failure={sample.error} />}
        {sample.state === 'cancelled' && <Notice>Processing was cancelled; nothing of this sample was kept.</Notice>}
        {sample.state === 'done' && (
          <>
            {sample.counts && <SampleCountsPanel counts={sample.counts} collision={sample.settings.collision} exclusive={sample.settings.jet.exclusive} />}
            <PlanePanel sampleId={sample.id} />
            <JetTable sampleId={sample.id} collision={sample.settings.collision} flavourTags={sample.settings.flavourTags} />
            <div className="grid items-start gap-6 lg:grid-cols-[minmax(0,2fr)_minmax(0,1fr)]">
              <ProvenancePanel provenance={sample.provenance} />
              <ExportLinks sampleId={sample.id} fullTree={sample.provenance.tree === 'full'} />
            </div>
          </>
        )}
        {canEdit && !isProcessing(sample) && (
          <Panel title="Delete sample" lead="Removes the sample, its jets and its plane for every member of the study." danger>
            <ConfirmButton label="Delete sample" question="Delete it for everyone?" confirmLabel="Delete" onConfirm={remove} />
          </Panel>
        )}
      </div>
    </>
  );
}
