'use client';

import { useRouter } from 'next/navigation';
import { sendJson } from '@/lib/api/client';
import { ActionForm, SubmitOrCancel } from '../action-form';
import { Panel } from '../panel';
import { readStudyFields, StudyFields } from './study-fields';

/** Creates a study and opens it. */
export function CreateStudyForm({ onCancel }: { onCancel: () => void }) {
  const router = useRouter();
  async function submit(data: FormData) {
    const { study } = await sendJson<{ study: { id: number } }>('POST', '/api/studies', readStudyFields(data));
    router.push(`/studies/${study.id}`);
  }
  return (
    <Panel title="New study" className="mb-6">
      <ActionForm onSubmit={submit} aria-label="Create a study">
        <StudyFields />
        <SubmitOrCancel label="Create study" pendingLabel="Creating…" onCancel={onCancel} />
      </ActionForm>
    </Panel>
  );
}
