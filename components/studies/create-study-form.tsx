'use client';

import { useRouter } from 'next/navigation';
import { sendJson } from '@/lib/fetcher';
import { ActionForm, field, SubmitButton } from '../action-form';
import { Button } from '../button';
import { TextArea, TextField } from '../fields';
import { Panel } from '../panel';

/** Creates a study and opens it. */
export function CreateStudyForm({ onCancel }: { onCancel: () => void }) {
  const router = useRouter();
  async function submit(data: FormData) {
    const { study } = await sendJson<{ study: { id: string } }>('POST', '/api/studies', {
      title: field(data, 'title'),
      description: field(data, 'description'),
    });
    router.push(`/studies/${study.id}`);
  }
  return (
    <Panel title="New study" className="mb-6">
      <ActionForm onSubmit={submit} aria-label="Create a study">
        <TextField label="Title" name="title" required maxLength={200} autoFocus placeholder="e.g. Gluon-jet plane at 500 GeV" />
        <TextArea label="Description" name="description" rows={2} hint="Optional. What the study is for." />
        <div className="flex gap-2">
          <SubmitButton pendingLabel="Creating…">Create study</SubmitButton>
          <Button variant="ghost" onClick={onCancel}>
            Cancel
          </Button>
        </div>
      </ActionForm>
    </Panel>
  );
}
